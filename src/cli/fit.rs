//! `ebullio fit`: fit vapor-pressure equations to measured (T, p) data.

use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::fit::FitOptions;
use ebullio::report::text::fit as fit_text;
use ebullio::table_io::{
    fit_batch, fit_batch_map, none_fitted, none_fitted_by, read_measured_bytes, FitCheckOptions,
    FitRow, ReadOptions,
};
use ebullio::units::{PressureUnit, TemperatureUnit};
use std::io::IsTerminal;
use std::path::PathBuf;

/// Fit a vapor-pressure equation to measured temperature–pressure points.
///
/// DATA is CSV or Parquet (or `-` for CSV on stdin) with a temperature and a
/// pressure column (`T/K`, `t/degC`, `p/kPa`, `p/mmHg` ...), optional `u(T)/K`
/// and `u(p)/kPa` columns, and an optional `compound` column (one fit per
/// compound). Example: ebullio fit runs.csv --at "20 mbar" --at "85 degC"
///
/// Binary VLE data (an `x1` column, optional `y1`, and `t/degC` or `T/K` and/or
/// `p/kPa`) are fitted with an activity model (Margules, van Laar, Wilson, NRTL)
/// and tested for thermodynamic consistency (Herington or Redlich–Kister area
/// test, point-to-point test). Example:
/// ebullio fit still.csv --pressure "1 atm" --compound "ethyl acetate" --compound ethanol
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
    /// Equation: antoine, clapeyron, riedel, wagner or auto (lowest AICc)
    /// [default: antoine]. For binary VLE data (an x1 column): margules,
    /// van-laar, wilson, nrtl (α = 0.3), nrtl-alpha (α fitted) or auto [default: auto].
    #[arg(long)]
    pub model: Option<String>,
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
    /// For binary VLE data give it twice (component 1 first), or name the
    /// components in a "# components: A, B" line above the header.
    #[arg(long)]
    pub compound: Vec<String>,
    /// Structure (SMILES) for the reference lookup and the Joback comparison
    /// (for binary data, a component: "CCO ethanol"; repeatable).
    #[arg(long)]
    pub smiles: Vec<String>,
    /// Binary VLE data: the still's pressure when the file has no pressure column
    /// ("1 atm", "200 mbar"); checked against a pressure column when there is one.
    #[arg(long, allow_hyphen_values = true)]
    pub pressure: Option<String>,
    /// Binary VLE data: standard uncertainty of the measured temperatures, K [default: 0.1].
    #[arg(long, value_name = "K", allow_hyphen_values = true)]
    pub u_t: Option<f64>,
    /// Binary VLE data: standard uncertainty of the vapor mole fractions y1 [default: 0.005].
    #[arg(long, value_name = "Y", allow_hyphen_values = true)]
    pub u_y: Option<f64>,
    /// Binary VLE data: standard uncertainty of the measured pressures, % [default: 0.5].
    #[arg(long, value_name = "PCT", allow_hyphen_values = true)]
    pub u_p: Option<f64>,
    /// Binary VLE data: the cell's temperature for p-x-y data without a temperature column.
    #[arg(long, allow_hyphen_values = true)]
    pub temperature: Option<String>,
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
    let barometric_pa = super::common::barometric().map(|p| p.pa());
    let fit = ebullio::fit::FitRequest {
        model: a.model.as_deref().unwrap_or("antoine"),
        constants: &a.constants,
        tc: a.tc.as_deref(),
        pc: a.pc.as_deref(),
        robust: a.robust,
        at: &a.at,
        exclude: &a.exclude,
        barometric_pa,
    }
    .resolve(&|n| format!("--{n}"))
    .map_err(InputError)?;
    let units = a.units.as_deref().map(parse_units).transpose()?;
    Ok(Resolved {
        read: ReadOptions {
            t_unit,
            p_unit,
            decimal_comma: a.decimal_comma,
            barometric_pa,
        },
        fit,
        units,
    })
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let bytes =
        ebullio::table_io::source::read_bytes(&args.data).map_err(|e| InputError(e.to_string()))?;
    let plain = ReadOptions {
        decimal_comma: args.decimal_comma,
        ..Default::default()
    };
    if ebullio::table_io::binary::looks_binary(&args.data, &bytes, &plain) {
        return super::fit_binary::run(&args, &bytes);
    }
    if args.compound.len() > 1 || args.smiles.len() > 1 {
        return Err(InputError(
            "--compound and --smiles are given once for vapor-pressure data (twice only for binary VLE data with an x1 column)".into(),
        )
        .into());
    }
    if args.pressure.is_some()
        || args.temperature.is_some()
        || args.u_t.is_some()
        || args.u_y.is_some()
        || args.u_p.is_some()
    {
        return Err(InputError(
            "--pressure, --temperature, --u-t, --u-y and --u-p apply to binary VLE data (an x1 column); this file has none".into(),
        )
        .into());
    }
    let r = resolve(&args)?;
    let data =
        read_measured_bytes(&args.data, &bytes, &r.read).map_err(|e| InputError(e.to_string()))?;
    for w in &data.warnings {
        eprintln!("warning: {}:{}: {} ({})", w.file, w.line, w.message, w.code);
    }
    if data.sets.is_empty() {
        return Err(InputError(format!("{}: no data rows", data.source)).into());
    }
    let bar = (data.sets.len() >= 50 && std::io::stderr().is_terminal())
        .then(|| indicatif::ProgressBar::new(data.sets.len() as u64));
    super::common::batch_started(data.sets.len());
    let check = FitCheckOptions {
        compound: args.compound.first().cloned(),
        smiles: args.smiles.first().cloned(),
        tolerances: ebullio::reference::compare::Tolerances {
            p_rel: args.ref_p_tolerance_pct / 100.0,
            tb_k: args.ref_tb_tolerance_k,
        },
    };
    let step = || {
        if let Some(b) = &bar {
            b.inc(1);
        }
        super::common::batch_step();
    };
    if args.out.format() == Format::Csv && args.plot.is_none() && args.report.is_none() {
        // Only the rows' text is needed: each report becomes its row where it was fitted.
        let lines = fit_batch_map(
            &data,
            &r.fit,
            &check,
            &super::hints::fit_error,
            &step,
            &|row| {
                let error = match &row {
                    FitRow::Failed { error, .. } => Some(error.clone()),
                    FitRow::Ok(_) => None,
                };
                (error, fit_text::csv_line(&row))
            },
        );
        if let Some(b) = bar {
            b.finish_and_clear();
        }
        if let Some(why) = none_fitted_by(&data.source, lines.iter().map(|(e, _)| e.as_deref())) {
            return Err(InputError(why).into());
        }
        let mut text = fit_text::csv(&[])?;
        for (_, line) in lines {
            text.push_str(&line?);
        }
        args.out.emit(&text, &[args.data.as_path()])?;
        return Ok(Outcome::Success);
    }
    let rows = fit_batch(&data, &r.fit, &check, &super::hints::fit_error, &step);
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    if let Some(path) = &args.plot {
        let first = rows.iter().find_map(FitRow::report);
        if let Some(rep) = first {
            let svg = ebullio::report::fit_plot::svg(rep);
            ebullio::table_io::write_atomic(path, svg.as_bytes(), &[args.data.as_path()])
                .with_context(|| format!("writing {}", path.display()))?;
        }
    }
    // Nothing could be fitted: an error (exit 2) and no output file, as for bad input.
    if let Some(why) = none_fitted(&data.source, &rows) {
        return Err(InputError(why).into());
    }
    let text = match args.out.format() {
        Format::Json if rows.len() == 1 => super::common::json_text(&rows[0])? + "\n",
        Format::Json => super::common::json_text(&rows)? + "\n",
        Format::Csv => fit_text::csv(&rows)?,
        Format::Table => {
            let units = r
                .units
                .or(data.units)
                .unwrap_or((TemperatureUnit::Kelvin, PressureUnit::KPa));
            rows.iter()
                .map(|row| fit_text::table(row, units))
                .collect::<Vec<_>>()
                .join("\n")
        }
    };
    args.out.emit(&text, &[args.data.as_path()])?;
    if let Some(path) = &args.report {
        let html = ebullio::report::fit_section::batch_report(
            &data.source,
            &rows,
            &r.fit.at,
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
