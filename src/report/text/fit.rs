//! The `fit` command's terminal table and CSV.

use super::{sig, t_symbol, Csv};
use crate::fit::PredictionKind;
use crate::units::{PressureUnit, TemperatureUnit};

pub use crate::table_io::FitRow;

/// The columns of [`csv()`].
pub const CSV_HEADINGS: [&str; 18] = [
    "compound",
    "model",
    "convention",
    "A",
    "B",
    "C",
    "D",
    "se_A",
    "se_B",
    "se_C",
    "se_D",
    "n_points",
    "rms_rel_dev_pct",
    "tb_k",
    "tb_ci95_low_k",
    "tb_ci95_high_k",
    "flags",
    "error",
];

/// The fits as CSV, one row per compound (a failed fit: its compound and error).
pub fn csv(rows: &[FitRow]) -> Result<String, csv::Error> {
    let mut out = Csv::new(CSV_HEADINGS).finish()?;
    for r in rows {
        out.push_str(&csv_line(r)?);
    }
    Ok(out)
}

/// One row of [`csv()`] with its line end: what a batch writes as each fit is done, built
/// in one buffer (text quoted as the csv crate quotes it, numbers as [`super::cell`]
/// writes them).
pub fn csv_line(r: &FitRow) -> Result<String, csv::Error> {
    use crate::table_io::estimates::push_csv_text;
    use std::fmt::Write as _;
    let mut line: Vec<u8> = Vec::with_capacity(256);
    let mut cell = String::with_capacity(48);
    let mut first = true;
    // One field from what `fill` writes into the cell buffer.
    let mut field = |line: &mut Vec<u8>, fill: &mut dyn FnMut(&mut String)| {
        if !first {
            line.push(b',');
        }
        first = false;
        cell.clear();
        fill(&mut cell);
        push_csv_text(line, cell.as_bytes());
    };
    match r {
        FitRow::Ok(rep) => {
            field(&mut line, &mut |c| {
                c.push_str(rep.compound.as_deref().unwrap_or_default())
            });
            field(&mut line, &mut |c| c.push_str(rep.model.as_str()));
            field(&mut line, &mut |c| {
                let _ = write!(c, "{}", rep.convention);
            });
            for i in 0..4 {
                let v = rep.parameters.get(i).map(|p| p.value);
                field(&mut line, &mut |c| super::push_cell(c, v));
            }
            for i in 0..4 {
                let v = rep.parameters.get(i).map(|p| p.std_error);
                field(&mut line, &mut |c| super::push_cell(c, v));
            }
            field(&mut line, &mut |c| {
                let _ = write!(c, "{}", rep.n_points);
            });
            let tb = rep.normal_boiling_point_k.as_ref();
            for v in [
                Some(rep.rms_rel_dev_pct),
                tb.map(|t| t.value),
                tb.map(|t| t.ci95_low),
                tb.map(|t| t.ci95_high),
            ] {
                field(&mut line, &mut |c| super::push_cell(c, v));
            }
            field(&mut line, &mut |c| {
                for (i, f) in rep.flags.iter().enumerate() {
                    if i > 0 {
                        c.push(';');
                    }
                    c.push_str(f.code.as_str());
                }
            });
            field(&mut line, &mut |_| {});
        }
        FitRow::Failed { compound, error } => {
            field(&mut line, &mut |c| {
                c.push_str(compound.as_deref().unwrap_or_default())
            });
            for _ in 0..16 {
                field(&mut line, &mut |_| {});
            }
            field(&mut line, &mut |c| c.push_str(error));
        }
    }
    line.push(b'\n');
    // Every field came from a &str, so the row is UTF-8.
    Ok(String::from_utf8(line).unwrap_or_default())
}

/// The readable report of one fit, in the chosen display units.
pub fn table(r: &FitRow, (tu, pu): (TemperatureUnit, PressureUnit)) -> String {
    let rep = match r {
        FitRow::Failed { compound, error } => {
            return format!(
                "{}: not fitted: {error}\n",
                compound.as_deref().unwrap_or("data")
            )
        }
        FitRow::Ok(rep) => rep,
    };
    let ts = t_symbol(tu);
    let ps = pu.symbol();
    // Temperatures in the display unit; differences need only the degree size.
    let t = |k: f64| format!("{:.2} {ts}", tu.from_kelvin(k));
    let dt = |k: f64| k / tu.kelvin_per_degree();
    let p = |pa: f64| format!("{} {ps}", sig(pu.from_pa(pa), 6));
    let mut s = String::new();
    let name = rep.compound.as_deref().unwrap_or("data");
    s += &format!(
        "{name}: {} fit to {} points, {} to {} ({}; {})\n",
        rep.model,
        rep.n_points,
        t(rep.t_range_k[0]),
        t(rep.t_range_k[1]),
        rep.weighting,
        if rep.termination.is_success() {
            "converged"
        } else {
            "NOT CONVERGED"
        }
    );
    s += &format!("  constants ({}):\n", rep.convention);
    for p in &rep.parameters {
        s += &format!(
            "    {:<2} = {:>14.6e}  ± {:.3e}   95 % CI [{:.6e}, {:.6e}]\n",
            p.name, p.value, p.std_error, p.ci95_low, p.ci95_high
        );
    }
    s += &format!(
        "  deviations: RMS {:.3} % in p (max {:.3} %), RMS {:.3} {ts} in T (max {:.3} {ts})\n",
        rep.rms_rel_dev_pct,
        rep.max_rel_dev_pct,
        dt(rep.rms_dev_t_k),
        dt(rep.max_dev_t_k)
    );
    if let Some(tb) = &rep.normal_boiling_point_k {
        s += &format!(
            "  normal boiling point: {} ({:.2} K), 95 % CI [{}, {}]{}\n",
            t(tb.value),
            tb.value,
            t(tb.ci95_low),
            t(tb.ci95_high),
            if tb.extrapolated {
                format!(", extrapolated {:.1} {ts}", dt(tb.extrapolation_k))
            } else {
                String::new()
            }
        );
    }
    for q in &rep.predictions {
        let ext = if q.extrapolated {
            format!("  (extrapolated {:.1} {ts})", dt(q.extrapolation_k))
        } else {
            String::new()
        };
        if q.kind == PredictionKind::TAtP {
            s += &format!(
                "  at {}: t = {}, 95 % CI [{}, {}]{ext}\n",
                p(q.p_pa),
                t(q.t_k),
                t(q.ci95_low),
                t(q.ci95_high)
            );
        } else {
            s += &format!(
                "  at {}: p = {}, 95 % CI [{}, {}]{ext}\n",
                t(q.t_k),
                p(q.p_pa),
                p(q.ci95_low),
                p(q.ci95_high)
            );
        }
    }
    if let Some(h) = &rep.hvap {
        s += &format!(
            "  ΔHvap at {}: {:.2} kJ/mol, 95 % CI [{:.2}, {:.2}] ({})\n",
            t(h.t_k),
            h.value_kj_mol,
            h.ci95_low,
            h.ci95_high,
            h.note
        );
    }
    let robust = rep.points.iter().any(|p| p.robust_weight.is_some());
    let tcol = format!("t/{ts}");
    let pcol = format!("p/{ps}");
    let dcol = format!("dT/{ts}");
    s += &format!(
        "  points:  #  {tcol:>10} {pcol:>12}   dev/% {dcol:>8}  int.stud.  ext.stud.  lever.{}\n",
        if robust { "  weight" } else { "" }
    );
    for q in &rep.points {
        let mut mark = String::new();
        if q.robust_rejected {
            mark += "  REJECTED by the robust loss";
        }
        if q.outlier {
            mark += "  OUTLIER (kept)";
        }
        // A point the robust loss rejected has no studentized residual to speak of.
        let stud = |x: f64| {
            if q.robust_rejected {
                "-".to_string()
            } else {
                format!("{x:.2}")
            }
        };
        s += &format!(
            "    {:>5}  {:>10.3} {:>12} {:>7.3} {:>8.3} {:>10} {:>10} {:>7.3}{}{mark}\n",
            q.number,
            tu.from_kelvin(q.t_k),
            sig(pu.from_pa(q.p_pa), 6),
            q.rel_dev_pct,
            dt(q.t_dev_k),
            stud(q.studentized),
            stud(q.ext_studentized),
            q.leverage,
            q.robust_weight
                .map_or(String::new(), |w| format!(" {w:>7.3}"))
        );
    }
    for e in &rep.excluded {
        s += &format!(
            "    {:>5}  {:>10.3} {:>12}   excluded ({}{})\n",
            e.number,
            tu.from_kelvin(e.t_k),
            sig(pu.from_pa(e.p_pa), 6),
            e.by,
            e.line.map_or(String::new(), |l| format!(", line {l}"))
        );
    }
    s += "  (int.stud. = internally studentized residual; ext.stud. = externally studentized, which the outlier rule uses)\n";
    if let (Some(tb), Some(v)) = (&rep.normal_boiling_point_k, &rep.reference_comparison) {
        if let (Some((e, _)), Some((lo, hi, _))) = (v.structure_tb_k, v.structure_tb_pi90_k) {
            if e.is_finite() && lo.is_finite() && hi.is_finite() {
                let inside = (lo..=hi).contains(&tb.value);
                s += &format!(
                    "  structure estimate: Tb {e:.1} K, 90 % interval {lo:.1}–{hi:.1} K; the fitted {:.2} K lies {}\n",
                    tb.value,
                    if inside { "inside it" } else { "OUTSIDE it" }
                );
            }
        }
    }
    for f in &rep.flags {
        s += &format!("  [{}] {}: {}\n", f.severity, f.code, f.message);
    }
    s += "  Fitted constants are not measurements; review before any distillation (local codes, process-safety review).\n";
    s
}
