//! `ebullio fit`: fit vapor-pressure equations to measured (T, p) data.

use super::common::{parse_pressure, parse_quantity};
use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::fit::{
    At, Exclude, FitError, FitOptions, FitReport, ModelSelection, PredictionKind, RobustLoss,
};
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
    /// Leave a point out of the fit: by its number in the points table ("4"), its
    /// line in the file ("line:5") or its temperature ("80 degC"). Repeatable. The
    /// output and the fit file record what was excluded; boil --from and plan --from
    /// use exactly this fit. The automatic outlier rule never excludes by itself.
    #[arg(long, allow_hyphen_values = true, value_name = "POINT")]
    pub exclude: Vec<String>,
    /// Units for the table output, "degC,mbar" (temperature, pressure); default:
    /// the units of the input columns. JSON is always SI with the unit in each name.
    #[arg(long, value_name = "T,P")]
    pub units: Option<String>,
    /// Also write one self-contained HTML report (plots, constants, points, findings) to this file.
    #[arg(long, value_name = "FILE.html")]
    pub report: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

struct Resolved {
    read: ReadOptions,
    fit: FitOptions,
    units: Option<(TemperatureUnit, PressureUnit)>,
}

/// `--exclude` text: "4" (point number), "line:5" / "line 5", or a temperature.
fn parse_exclude(s: &str) -> Result<Exclude, InputError> {
    let t = s.trim();
    let lower = t.to_ascii_lowercase();
    if let Some(rest) = lower.strip_prefix("line") {
        let n = rest.trim_start_matches([':', ' ', '=']).trim();
        return n
            .parse::<u64>()
            .map(Exclude::Line)
            .map_err(|_| InputError(format!("--exclude '{s}': write a line as \"line:5\"")));
    }
    if let Ok(n) = t.parse::<usize>() {
        return Ok(Exclude::Point(n));
    }
    parse_temperature(t)
        .map(|q| Exclude::TemperatureK(q.kelvin()))
        .map_err(|e| {
            InputError(format!(
                "--exclude '{s}': expected a point number (\"4\"), a line (\"line:5\") or a temperature (\"80 degC\"): {e}"
            ))
        })
}

/// `--units "degC,mbar"`.
fn parse_units(s: &str) -> Result<(TemperatureUnit, PressureUnit), InputError> {
    let (t, p) = s.split_once(',').ok_or_else(|| {
        InputError(format!(
            "--units '{s}': write it as \"degC,mbar\" (temperature, pressure)"
        ))
    })?;
    let t = TemperatureUnit::parse(t).map_err(|e| InputError(format!("--units: {e}")))?;
    let p = PressureUnit::parse(p).map_err(|e| InputError(format!("--units: {e}")))?;
    Ok((t, p))
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
    let exclude = a
        .exclude
        .iter()
        .map(|s| parse_exclude(s))
        .collect::<Result<Vec<_>, _>>()?;
    let units = a.units.as_deref().map(parse_units).transpose()?;
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
            exclude,
        },
        units,
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
                error: super::hints::fit_error(&e),
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
        Format::Table => {
            let units = r
                .units
                .or(data.units)
                .unwrap_or((TemperatureUnit::Kelvin, PressureUnit::KPa));
            rows.iter()
                .map(|row| table(row, units))
                .collect::<Vec<_>>()
                .join("\n")
        }
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
            .map(|v| format!("{}", ebullio::units::tidy(v)))
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
                    rep.model.to_string(),
                    rep.convention.to_string(),
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

/// A unit's symbol as a chemist writes it in a table.
fn t_sym(u: TemperatureUnit) -> &'static str {
    match u {
        TemperatureUnit::Kelvin => "K",
        TemperatureUnit::Celsius => "°C",
        TemperatureUnit::Fahrenheit => "°F",
        TemperatureUnit::Rankine => "°R",
    }
}

/// `x` to `sig` significant digits, as plain decimal text.
fn sig(x: f64, sig: i32) -> String {
    if !x.is_finite() {
        return "-".into();
    }
    if x == 0.0 {
        return "0".into();
    }
    let d = (sig - 1 - x.abs().log10().floor() as i32).clamp(0, 12) as usize;
    format!("{x:.d$}")
}

fn table(r: &Row, (tu, pu): (TemperatureUnit, PressureUnit)) -> String {
    let rep = match r {
        Row::Failed { compound, error } => {
            return format!(
                "{}: not fitted: {error}\n",
                compound.as_deref().unwrap_or("data")
            )
        }
        Row::Ok(rep) => rep,
    };
    let ts = t_sym(tu);
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
