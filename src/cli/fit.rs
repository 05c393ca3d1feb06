//! `ebullio fit`: fit vapor-pressure equations to measured (T, p) data.

use super::common::{parse_pressure, parse_quantity};
use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::fit::{At, FitError, FitOptions, FitReport, ModelSelection, RobustLoss};
use ebullio::table_io::{fit_set, read_measured, ReadOptions};
use ebullio::units::{parse_temperature, PressureUnit, Quantity, TemperatureUnit};
use ebullio::vapor::AntoineConvention;
use rayon::prelude::*;
use std::io::IsTerminal;
use std::path::PathBuf;

/// Fit a vapor-pressure equation to measured temperature–pressure points.
///
/// DATA is CSV or Parquet (or `-` for CSV on stdin) with a temperature and a
/// pressure column (`T/K`, `t/degC`, `p/kPa`, `p/mmHg` ...), optional `u(T)/K`
/// and `u(p)/kPa` columns, and an optional `compound` column (one fit per
/// compound). Example: ebullio fit runs.csv --at "20 mbar" --at "85 degC"
///
/// Fitted constants are not measurements: check them before planning a
/// distillation, and follow local codes and process-safety review.
#[derive(Debug, clap::Args)]
pub struct Args {
    /// Measured data file (CSV or Parquet), or `-` for CSV on stdin.
    pub data: PathBuf,
    /// Temperature unit of the temperature column, overriding its heading.
    #[arg(long)]
    pub t_unit: Option<String>,
    /// Pressure unit of the pressure column, overriding its heading.
    #[arg(long)]
    pub p_unit: Option<String>,
    /// Semicolon-separated values with decimal commas.
    #[arg(long)]
    pub decimal_comma: bool,
    /// Equation: antoine, clapeyron, riedel, wagner or auto (lowest AICc).
    #[arg(long, default_value = "antoine")]
    pub model: String,
    /// Critical temperature for the Wagner equation, with unit ("562.0 K").
    #[arg(long)]
    pub tc: Option<String>,
    /// Critical pressure for the Wagner equation, with unit ("48.9 bar").
    #[arg(long)]
    pub pc: Option<String>,
    /// Refit with a robust loss (Tukey's biweight started from Huber) and report the weights.
    #[arg(long)]
    pub robust: bool,
    /// Convention of the reported Antoine constants.
    #[arg(long, default_value = "log10,mmHg,degC")]
    pub constants: String,
    /// Also predict at this pressure ("20 mbar": boiling point) or temperature ("85 degC": vapor pressure). Repeatable.
    #[arg(long, allow_hyphen_values = true)]
    pub at: Vec<String>,
    /// Draw ln p against 1/T with the fit, its 95 % band and residuals to this SVG file.
    #[arg(long, value_name = "FILE.svg")]
    pub plot: Option<PathBuf>,
    /// Compare with this bundled reference compound (else the `compound` column is tried).
    #[arg(long)]
    pub compound: Option<String>,
    /// Structure (SMILES) for the reference lookup and the Joback comparison.
    #[arg(long)]
    pub smiles: Option<String>,
    /// Allowed relative difference in p from the reference curve, in percent.
    #[arg(long, default_value_t = 2.0)]
    pub ref_p_tolerance_pct: f64,
    /// Allowed difference in normal boiling point from the reference, in K.
    #[arg(long, default_value_t = 0.5)]
    pub ref_tb_tolerance_k: f64,
    /// Also write one self-contained HTML report (plots, constants, points, findings) to this file.
    #[arg(long, value_name = "FILE.html")]
    pub report: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

struct Resolved {
    read: ReadOptions,
    fit: FitOptions,
}

fn resolve(a: &Args) -> Result<Resolved, InputError> {
    let t_unit = a
        .t_unit
        .as_deref()
        .map(TemperatureUnit::parse)
        .transpose()
        .map_err(|e| InputError(format!("--t-unit: {e}")))?;
    let p_unit = a
        .p_unit
        .as_deref()
        .map(PressureUnit::parse)
        .transpose()
        .map_err(|e| InputError(format!("--p-unit: {e}")))?;
    let model: ModelSelection = a
        .model
        .parse()
        .map_err(|e| InputError(format!("--model: {e}")))?;
    let convention: AntoineConvention = a
        .constants
        .parse()
        .map_err(|e| InputError(format!("--constants: {e}")))?;
    let critical = match (&a.tc, &a.pc) {
        (Some(tc), Some(pc)) => {
            let tc = parse_temperature(tc).map_err(|e| InputError(format!("--tc '{tc}': {e}")))?;
            let pc = parse_pressure(pc).map_err(|e| InputError(format!("--pc '{pc}': {e}")))?;
            Some((tc.kelvin(), pc.pa()))
        }
        (None, None) => None,
        _ => return Err(InputError("--tc and --pc must be given together".into())),
    };
    if model == ModelSelection::Wagner && critical.is_none() {
        return Err(InputError("--model wagner needs --tc and --pc".into()));
    }
    let mut at = Vec::new();
    for s in &a.at {
        match parse_quantity(s).map_err(|e| InputError(format!("--at '{s}': {e}")))? {
            Quantity::Pressure(p) => at.push(At::PressurePa(p.pa())),
            Quantity::Temperature(t) => at.push(At::TemperatureK(t.kelvin())),
        }
    }
    Ok(Resolved {
        read: ReadOptions {
            t_unit,
            p_unit,
            decimal_comma: a.decimal_comma,
            barometric_pa: super::common::barometric().map(|p| p.pa()),
        },
        fit: FitOptions {
            model,
            critical,
            robust: a.robust.then_some(RobustLoss::Tukey),
            convention,
            at,
            refit_without_outliers: true,
        },
    })
}

/// One row of a batch: a report or the reason there is none.
#[derive(serde::Serialize)]
#[serde(untagged)]
enum Row {
    Ok(Box<FitReport>),
    Failed {
        compound: Option<String>,
        error: String,
    },
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let r = resolve(&args)?;
    let data = read_measured(&args.data, &r.read).map_err(|e| InputError(e.to_string()))?;
    for w in &data.warnings {
        eprintln!("warning: {}:{}: {} ({})", w.file, w.line, w.message, w.code);
    }
    if data.sets.is_empty() {
        return Err(InputError(format!("{}: no data rows", data.source)).into());
    }
    let bar = (data.sets.len() >= 50 && std::io::stderr().is_terminal())
        .then(|| indicatif::ProgressBar::new(data.sets.len() as u64));
    super::common::batch_started(data.sets.len());
    let results: Vec<Result<FitReport, FitError>> = data
        .sets
        .par_iter()
        .map(|set| {
            let r = fit_set(set, &r.fit);
            if let Some(b) = &bar {
                b.inc(1);
            }
            super::common::batch_step();
            r
        })
        .collect();
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    let tol = ebullio::reference::compare::Tolerances {
        p_rel: args.ref_p_tolerance_pct / 100.0,
        tb_k: args.ref_tb_tolerance_k,
    };
    let lib = ebullio::reference::Library::bundled();
    let rows: Vec<Row> = results
        .into_iter()
        .zip(&data.sets)
        .map(|(r, s)| match r {
            Ok(mut rep) => {
                let smiles = args.smiles.as_deref().or(s.smiles.as_deref());
                let chk = ebullio::reference::fit_check::check_fit(
                    &mut rep,
                    lib,
                    args.compound.as_deref(),
                    smiles,
                    tol,
                );
                if let Some(units) = data.units {
                    let pts: Vec<ebullio::fit::Point> = s
                        .points
                        .iter()
                        .map(|p| ebullio::fit::Point {
                            t_k: p.t_k,
                            p_pa: p.p_pa,
                            u_t_k: p.u_t_k,
                            u_p_pa: p.u_p_pa,
                        })
                        .collect();
                    ebullio::reference::fit_check::check_labels(&mut rep, &chk, &pts, units);
                }
                Row::Ok(Box::new(rep))
            }
            Err(e) => Row::Failed {
                compound: s.compound.clone(),
                error: e.to_string(),
            },
        })
        .collect();
    if let Some(path) = &args.plot {
        let first = rows.iter().find_map(|r| match r {
            Row::Ok(rep) => Some(rep),
            _ => None,
        });
        if let Some(rep) = first {
            let svg = ebullio::report::fit_plot::svg(rep);
            ebullio::table_io::write_atomic(path, svg.as_bytes(), &[args.data.as_path()])
                .with_context(|| format!("writing {}", path.display()))?;
        }
    }
    // Nothing could be fitted: an error (exit 2) and no output file, as for bad input.
    if rows.iter().all(|r| matches!(r, Row::Failed { .. })) {
        let why = rows
            .iter()
            .filter_map(|r| match r {
                Row::Failed { error, .. } => Some(error.as_str()),
                _ => None,
            })
            .next()
            .unwrap_or("no fit");
        return Err(InputError(if rows.len() > 1 {
            format!(
                "{}: none of the {} compounds could be fitted; the first: {why}",
                data.source,
                rows.len()
            )
        } else {
            format!("{}: {why}", data.source)
        })
        .into());
    }
    let text = match args.out.format() {
        Format::Json if rows.len() == 1 => super::common::json_text(&rows[0])? + "\n",
        Format::Json => super::common::json_text(&rows)? + "\n",
        Format::Csv => csv_rows(&rows)?,
        Format::Table => rows.iter().map(table).collect::<Vec<_>>().join("\n"),
    };
    args.out.emit(&text, &[args.data.as_path()])?;
    if let Some(path) = &args.report {
        let fits: Vec<FitReport> = rows
            .iter()
            .filter_map(|r| match r {
                Row::Ok(rep) => Some((**rep).clone()),
                _ => None,
            })
            .collect();
        let failed: Vec<(Option<String>, String)> = rows
            .iter()
            .filter_map(|r| match r {
                Row::Failed { compound, error } => Some((compound.clone(), error.clone())),
                _ => None,
            })
            .collect();
        let mut pressures: Vec<f64> = r
            .fit
            .at
            .iter()
            .filter_map(|a| match a {
                At::PressurePa(p) => Some(*p),
                At::TemperatureK(_) => None,
            })
            .collect();
        if pressures.is_empty() {
            pressures = ebullio::report::fit_section::DEFAULT_PRESSURES_PA.to_vec();
        }
        let html = ebullio::report::fit_section::fit_report(
            &data.source.to_string(),
            &fits,
            &failed,
            &pressures,
            &super::common::command_line(),
        )
        .render();
        super::common::write_report(
            path,
            &html,
            &[args.data.as_path()],
            args.out.output.as_deref(),
        )?;
    }
    Ok(Outcome::Success)
}

fn csv_rows(rows: &[Row]) -> anyhow::Result<String> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
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
    ])?;
    let f = |v: Option<f64>| {
        v.filter(|v| v.is_finite())
            .map(|v| format!("{v}"))
            .unwrap_or_default()
    };
    for r in rows {
        match r {
            Row::Ok(rep) => {
                let p = |i: usize| f(rep.parameters.get(i).map(|p| p.value));
                let s = |i: usize| f(rep.parameters.get(i).map(|p| p.std_error));
                let tb = rep.normal_boiling_point_k.as_ref();
                let codes: Vec<&str> = rep.flags.iter().map(|x| x.code.as_str()).collect();
                w.write_record([
                    rep.compound.clone().unwrap_or_default(),
                    rep.model.clone(),
                    rep.convention.clone(),
                    p(0),
                    p(1),
                    p(2),
                    p(3),
                    s(0),
                    s(1),
                    s(2),
                    s(3),
                    rep.n_points.to_string(),
                    f(Some(rep.rms_rel_dev_pct)),
                    f(tb.map(|t| t.value)),
                    f(tb.map(|t| t.ci95_low)),
                    f(tb.map(|t| t.ci95_high)),
                    codes.join(";"),
                    String::new(),
                ])?;
            }
            Row::Failed { compound, error } => {
                let mut rec = vec![compound.clone().unwrap_or_default()];
                rec.extend(std::iter::repeat_n(String::new(), 16));
                rec.push(error.clone());
                w.write_record(rec)?;
            }
        }
    }
    Ok(String::from_utf8(w.into_inner()?)?)
}

fn table(r: &Row) -> String {
    let rep = match r {
        Row::Failed { compound, error } => {
            return format!(
                "{}: not fitted: {error}\n",
                compound.as_deref().unwrap_or("data")
            )
        }
        Row::Ok(rep) => rep,
    };
    let mut s = String::new();
    let name = rep.compound.as_deref().unwrap_or("data");
    s += &format!(
        "{name}: {} fit to {} points, {:.2}–{:.2} K ({}; {})\n",
        rep.model,
        rep.n_points,
        rep.t_range_k[0],
        rep.t_range_k[1],
        rep.weighting,
        if rep.termination.converged {
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
        "  deviations: RMS {:.3} % in p (max {:.3} %), RMS {:.3} K in T (max {:.3} K)\n",
        rep.rms_rel_dev_pct, rep.max_rel_dev_pct, rep.rms_dev_t_k, rep.max_dev_t_k
    );
    if let Some(tb) = &rep.normal_boiling_point_k {
        s += &format!(
            "  normal boiling point: {:.2} K ({:.2} °C), 95 % CI [{:.2}, {:.2}] K{}\n",
            tb.value,
            tb.value - ebullio::units::CELSIUS_OFFSET,
            tb.ci95_low,
            tb.ci95_high,
            if tb.extrapolated {
                format!(", extrapolated {:.1} K", tb.extrapolation_k)
            } else {
                String::new()
            }
        );
    }
    for p in &rep.predictions {
        let ext = if p.extrapolated {
            format!("  (extrapolated {:.1} K)", p.extrapolation_k)
        } else {
            String::new()
        };
        if p.kind == "t_at_p" {
            s += &format!(
                "  at {:.4} kPa: T = {:.2} K ({:.2} °C), 95 % CI [{:.2}, {:.2}] K{ext}\n",
                p.p_pa / 1000.0,
                p.t_k,
                p.t_k - ebullio::units::CELSIUS_OFFSET,
                p.ci95_low,
                p.ci95_high
            );
        } else {
            s += &format!(
                "  at {:.2} K: p = {:.4} kPa, 95 % CI [{:.4}, {:.4}] kPa{ext}\n",
                p.t_k,
                p.p_pa / 1000.0,
                p.ci95_low / 1000.0,
                p.ci95_high / 1000.0
            );
        }
    }
    if let Some(h) = &rep.hvap {
        s += &format!(
            "  ΔHvap at {:.1} K: {:.2} kJ/mol, 95 % CI [{:.2}, {:.2}] ({})\n",
            h.t_k, h.value_kj_mol, h.ci95_low, h.ci95_high, h.note
        );
    }
    s += "  points:      T/K        p/kPa   dev/%    dT/K   stud.  lever.\n";
    for (i, p) in rep.points.iter().enumerate() {
        s += &format!(
            "    {:>3} {:>10.3} {:>12.5} {:>7.3} {:>7.3} {:>6.2} {:>6.3}{}\n",
            i + 1,
            p.t_k,
            p.p_pa / 1000.0,
            p.rel_dev_pct,
            p.t_dev_k,
            p.studentized,
            p.leverage,
            if p.outlier { "  OUTLIER" } else { "" }
        );
    }
    if let (Some(tb), Some(v)) = (&rep.normal_boiling_point_k, &rep.reference_comparison) {
        let est = v.get("structure_tb_k").and_then(|x| x.as_array());
        let pi = v.get("structure_tb_pi90_k").and_then(|x| x.as_array());
        if let (Some(est), Some(pi)) = (est, pi) {
            let f = |a: &Vec<serde_json::Value>, i: usize| a.get(i).and_then(|x| x.as_f64());
            if let (Some(e), Some(lo), Some(hi)) = (f(est, 0), f(pi, 0), f(pi, 1)) {
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
