//! `ebullio check`: screen a property table for slips and outliers.

use super::{InputError, Outcome};
use std::path::PathBuf;

/// Screen a property table (CSV or Parquet) before it goes into a plan.
///
/// Writes the table back, every row and column kept in order, with three
/// added columns: `flags` (`;`-separated codes), `severity` (worst) and
/// `diagnosis` (what is probably wrong). The summary goes to stderr when the
/// table goes to stdout. Findings are screening aids, not measurements:
/// confirm before using any value for a distillation.
///
/// Example: ebullio check solvents.csv --constants "log10,mmHg,degC" -o checked.csv
#[derive(Debug, clap::Args)]
pub struct Args {
    /// The property table (CSV, or Parquet by its .parquet extension).
    pub table: PathBuf,
    /// Convention of A, B, C when the table has no convention column, e.g. "log10,mmHg,degC".
    #[arg(long, value_name = "CONVENTION")]
    pub constants: Option<String>,
    /// Tolerance between boiling points that should agree, K.
    #[arg(long, value_name = "K", default_value_t = 1.0)]
    pub tolerance: f64,
    /// A table of reference boiling points (same column rules; Tb listed or implied by A, B, C).
    #[arg(long, value_name = "FILE")]
    pub reference_table: Option<PathBuf>,
    /// Do not compare with the bundled reference boiling points (reference-data/).
    #[arg(long)]
    pub no_bundled_reference: bool,
    /// Skip the structure estimate (Joback) for rows with a SMILES.
    #[arg(long)]
    pub no_structure: bool,
    /// Exit with code 1 when any finding is at or above this severity.
    #[arg(long, value_enum, value_name = "SEVERITY")]
    pub fail_on: Option<FailOn>,
    /// Write the result to FILE, atomically: the checked table (.csv or .parquet) with
    /// --format csv (the default), else the JSON document or the summary table.
    #[arg(long, short = 'o', value_name = "FILE")]
    pub output: Option<PathBuf>,
    /// csv (default): the table back with flags, severity, diagnosis (summary on
    /// stderr); json: the summary and every flagged row with its findings; table:
    /// the summary as text.
    #[arg(long, value_enum)]
    pub format: Option<super::common::Format>,
    /// Rows listed in the summary.
    #[arg(long, value_name = "N", default_value_t = 10)]
    pub worst: usize,
    /// Also write one self-contained HTML report (counts per finding, flagged rows with diagnoses) to this file.
    /// The table is then read whole.
    #[arg(long, value_name = "FILE.html")]
    pub report: Option<PathBuf>,
    /// Rows read, screened and written at a time: memory grows with this,
    /// not with the table (which is read twice).
    #[arg(long, value_name = "N", default_value_t = 65_536,
          value_parser = clap::value_parser!(u64).range(1..))]
    pub batch_rows: u64,
}

/// `--fail-on` levels.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum FailOn {
    /// Fail on warnings and errors.
    Warning,
    /// Fail on errors only.
    Error,
}

#[cfg(not(feature = "tables"))]
pub fn run(_args: Args) -> anyhow::Result<Outcome> {
    Err(InputError(
        "'check' needs the `tables` feature (polars); rebuild with default features".into(),
    )
    .into())
}

#[cfg(feature = "tables")]
pub fn run(args: Args) -> anyhow::Result<Outcome> {
    use ebullio::screen::{
        screen, BundledReference, Chain, JobackEstimator, NoStructure, ReferenceLookup,
        ScreenContext, ScreenOptions, Severity, TableReference,
    };
    use ebullio::table_io::property_table::{
        is_parquet, with_added, write_frame, PropertyReadOptions, PropertyTable,
    };
    use ebullio::vapor::AntoineConvention;
    use std::io::Write;

    // Resolve options.
    let constants: Option<AntoineConvention> = match &args.constants {
        Some(s) => Some(
            s.parse()
                .map_err(|e| InputError(format!("--constants: {e}")))?,
        ),
        None => None,
    };
    if !(args.tolerance.is_finite() && args.tolerance > 0.0) {
        return Err(InputError(format!(
            "--tolerance must be a positive number of kelvin, not {}",
            args.tolerance
        ))
        .into());
    }
    let read_opts = PropertyReadOptions { constants };
    let joback = JobackEstimator;
    let estimator: &dyn ebullio::screen::StructureEstimator = if args.no_structure {
        &NoStructure
    } else {
        &joback
    };

    let user_reference = match &args.reference_table {
        Some(p) => {
            let rt = PropertyTable::read(p, &read_opts)
                .map_err(|e| InputError(super::hints::table_error(&e)))?;
            let implied = rt.implied_tb_k();
            TableReference::from_rows(&rt, implied.as_deref(), &p.display().to_string())
        }
        None => TableReference::new(),
    };
    let mut references: Vec<&dyn ReferenceLookup> = vec![&user_reference];
    if !args.no_bundled_reference {
        references.push(BundledReference::bundled());
    }
    let reference = Chain(references);
    let ctx = ScreenContext {
        options: ScreenOptions {
            tolerance_k: args.tolerance,
        },
        estimator,
        reference: &reference as &dyn ReferenceLookup,
        progress: Some(&super::common::batch_steps),
    };
    if args.report.is_none() {
        return streamed(&args, read_opts, &ctx);
    }
    let table = PropertyTable::read(&args.table, &read_opts)
        .map_err(|e| InputError(super::hints::table_error(&e)))?;
    super::common::batch_started(table.height());
    // The implied Tb is closed form: row by row it costs less than building
    // the bulk frame (measured: about 0.1 s per 1,000,000 rows for the frame).
    let report = screen(&table, None, &ctx);

    let [flags, severity, diagnosis] = report.columns();
    let parquet = args.output.as_deref().is_some_and(is_parquet);
    let out_name = args
        .output
        .clone()
        .unwrap_or_else(|| PathBuf::from("<stdout>"));
    let checked = with_added(
        &table.frame,
        vec![
            ("flags", flags),
            ("severity", severity),
            ("diagnosis", diagnosis),
        ],
        &out_name,
    )
    .map_err(|e| InputError(e.to_string()))?;
    let summary = report.summary(&table, args.worst);
    let format = args.format.unwrap_or(super::common::Format::Csv);
    if format != super::common::Format::Csv {
        let rows: Vec<serde_json::Value> = (0..report.len())
            .filter(|&i| format == super::common::Format::Json && !report.findings(i).is_empty())
            .map(|i| flagged_row(&report, i))
            .collect();
        let text = summary_text(&args, &summary, rows, format == super::common::Format::Json)?;
        let out = super::common::OutputArgs {
            format: Some(format),
            output: args.output.clone(),
        };
        let mut inputs = vec![args.table.as_path()];
        inputs.extend(args.reference_table.as_deref());
        out.emit(&text, &inputs)?;
    } else {
        match &args.output {
            Some(p) => {
                let mut inputs = vec![args.table.as_path()];
                if let Some(r) = &args.reference_table {
                    inputs.push(r.as_path());
                }
                super::common::write_file_atomic(p, &inputs, |w| {
                    write_frame(checked, parquet, w, p).map_err(std::io::Error::other)
                })?;
            }
            None => {
                let mut bytes = Vec::new();
                write_frame(checked, false, &mut bytes, &out_name)
                    .map_err(|e| InputError(e.to_string()))?;
                super::common::print_stdout(&String::from_utf8_lossy(&bytes))?
            }
        }
        let _ = write!(std::io::stderr(), "{summary}");
    }
    if let Some(path) = &args.report {
        let html = ebullio::report::check_section::check_report(
            &args.table.display().to_string(),
            &table,
            &report,
            &super::common::command_line(),
        )
        .render();
        let mut inputs = vec![args.table.as_path()];
        inputs.extend(args.reference_table.as_deref());
        super::common::write_report(path, &html, &inputs, args.output.as_deref())?;
    }
    let limit = match args.fail_on {
        Some(FailOn::Warning) => Some(Severity::Warning),
        Some(FailOn::Error) => Some(Severity::Error),
        None => None,
    };
    Ok(match (limit, report.worst()) {
        (Some(l), Some(w)) if w >= l => Outcome::Findings,
        _ => Outcome::Success,
    })
}

/// The table read, screened and written in batches of `--batch-rows`.
#[cfg(feature = "tables")]
fn streamed(
    args: &Args,
    read: ebullio::table_io::property_table::PropertyReadOptions,
    ctx: &ebullio::screen::ScreenContext<'_>,
) -> anyhow::Result<Outcome> {
    use ebullio::screen::Severity;
    use ebullio::table_io::check_stream::{screen_file, StreamError, StreamOptions};
    use ebullio::table_io::property_table::{is_parquet, BatchWriter};
    use std::io::Write;

    let scratch = super::common::ScratchDir::new("check")?;
    let opts = StreamOptions {
        read,
        batch_rows: usize::try_from(args.batch_rows).unwrap_or(usize::MAX),
        scratch: scratch.path().to_path_buf(),
    };
    let format = args.format.unwrap_or(super::common::Format::Csv);
    let out_name = args
        .output
        .clone()
        .unwrap_or_else(|| PathBuf::from("<stdout>"));
    let mut inputs = vec![args.table.as_path()];
    inputs.extend(args.reference_table.as_deref());
    let stream_err = |e: StreamError| -> anyhow::Error {
        match e {
            StreamError::Read(e) => InputError(super::hints::table_error(&e)).into(),
            StreamError::Output(m) => anyhow::anyhow!(m),
            e => e.into(),
        }
    };
    let mut started = |n: usize| super::common::batch_started(n);
    let summary = if format == super::common::Format::Csv {
        let parquet = args.output.as_deref().is_some_and(is_parquet);
        // Each batch goes out as soon as it is screened.
        let mut run = |w: &mut dyn Write| -> Result<_, StreamError> {
            let mut writer = BatchWriter::new(w, parquet, &out_name);
            let summary = screen_file(
                &args.table,
                &opts,
                ctx,
                args.worst,
                &mut started,
                &mut |table, report, _| {
                    writer
                        .write_checked(&table.frame, report)
                        .map_err(|e| e.to_string())
                },
            )?;
            writer
                .finish()
                .map_err(|e| StreamError::Output(e.to_string()))?;
            Ok(summary)
        };
        match &args.output {
            Some(p) => {
                let mut failed: Option<StreamError> = None;
                let mut summary = None;
                let r = super::common::write_file_atomic_streamed(p, &inputs, |w| match run(w) {
                    Ok(s) => {
                        summary = Some(s);
                        Ok(())
                    }
                    Err(e) => {
                        let m = e.to_string();
                        failed = Some(e);
                        Err(std::io::Error::other(m))
                    }
                });
                if let Some(e) = failed {
                    return Err(stream_err(e));
                }
                r?;
                summary
                    .ok_or_else(|| anyhow::anyhow!("writing {}: nothing written", p.display()))?
            }
            None => super::common::to_stdout(|w| run(w))?.map_err(stream_err)?,
        }
    } else {
        // json and table: the summary (and, for json, every flagged row) after the last batch
        let mut rows: Vec<serde_json::Value> = Vec::new();
        let json = format == super::common::Format::Json;
        let summary = screen_file(
            &args.table,
            &opts,
            ctx,
            args.worst,
            &mut started,
            &mut |_, report, _| {
                if json {
                    rows.extend(
                        (0..report.len())
                            .filter(|&i| !report.findings(i).is_empty())
                            .map(|i| flagged_row(report, i)),
                    );
                }
                Ok(())
            },
        )
        .map_err(stream_err)?;
        let text = summary_text(args, &summary, rows, json)?;
        let out = super::common::OutputArgs {
            format: Some(format),
            output: args.output.clone(),
        };
        out.emit(&text, &inputs)?;
        summary
    };
    drop(scratch);
    if format == super::common::Format::Csv {
        let _ = write!(std::io::stderr(), "{summary}");
    }
    let worst = if summary.errors > 0 {
        Some(Severity::Error)
    } else if summary.warnings > 0 {
        Some(Severity::Warning)
    } else if summary.infos > 0 {
        Some(Severity::Info)
    } else {
        None
    };
    let limit = match args.fail_on {
        Some(FailOn::Warning) => Some(Severity::Warning),
        Some(FailOn::Error) => Some(Severity::Error),
        None => None,
    };
    Ok(match (limit, worst) {
        (Some(l), Some(w)) if w >= l => Outcome::Findings,
        _ => Outcome::Success,
    })
}

/// One flagged row of `--format json`.
#[cfg(feature = "tables")]
fn flagged_row(report: &ebullio::screen::ScreenReport, i: usize) -> serde_json::Value {
    serde_json::json!({
        "line": report.line(i),
        "severity": report.severity(i).map(|s| s.to_string()),
        "findings": report.findings(i).iter().map(|f| serde_json::json!({
            "code": f.code.as_str(),
            "severity": f.severity.to_string(),
            "message": f.message,
        })).collect::<Vec<_>>(),
    })
}

/// The text `check` prints for table and JSON output: the summary, and for JSON the
/// flagged rows beside it.
fn summary_text(
    args: &Args,
    summary: &ebullio::screen::Summary,
    rows: Vec<serde_json::Value>,
    json: bool,
) -> anyhow::Result<String> {
    Ok(if json {
        super::common::json_text(&serde_json::json!({
            "table": args.table.display().to_string(),
            "tolerance_k": args.tolerance,
            "summary": summary,
            "flagged_rows": rows,
        }))? + "\n"
    } else {
        summary.to_string()
    })
}
