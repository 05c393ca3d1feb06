//! `ebullio estimate`: boiling points, critical constants and a vapor-pressure curve from structure.

use super::common::parse_pressure;
use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use ebullio::estimate::anchor::MeasuredPoint;
use ebullio::estimate::batch::at_pressures;
use ebullio::estimate::batch::EstimateRow as Row;
use ebullio::estimate::{
    estimate_groups, estimate_numbers_into, estimate_smiles, parse_groups, EstimateError,
};
use ebullio::molecule::Molecule;
use ebullio::table_io::estimates::EstimateRows;
use ebullio::table_io::read_text_table_with;
use ebullio::units::parse_temperature;
use ebullio::vapor::Curve;
use rayon::prelude::*;
use std::io::IsTerminal;
use std::path::PathBuf;

/// Estimate normal boiling points (Joback, Stein–Brown), critical constants,
/// ΔHvap and a Lee–Kesler vapor-pressure curve from structure (SMILES).
///
/// Estimates are not measurements. Each boiling point carries a 90 %
/// prediction interval calibrated on the bundled dev set.
///
/// Example: ebullio estimate --smiles "CCOC(C)=O" --at "20 mbar"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// A structure as SMILES (repeatable).
    #[arg(long, value_name = "SMILES")]
    pub smiles: Vec<String>,
    /// A CSV or Parquet table of structures (one estimate per row; a `compound` or `name` column is carried through).
    #[arg(long, value_name = "FILE")]
    pub input: Option<PathBuf>,
    /// --input is semicolon-separated with decimal commas.
    #[arg(long)]
    pub decimal_comma: bool,
    /// Column of --input that holds the SMILES.
    #[arg(long, value_name = "NAME", default_value = "smiles")]
    pub smiles_column: String,
    /// Joback groups given by hand, "ch3=2,ch2_chain=3" (ids as in the group table).
    #[arg(long, value_name = "ID=N,...")]
    pub groups: Option<String>,
    /// Also give the boiling point at this pressure, e.g. "20 mbar" (repeatable).
    #[arg(long, value_name = "PRESSURE")]
    pub at: Vec<String>,
    /// A measured boiling point, "95 degC at 0.5 mmHg", to anchor the curve (once or twice).
    #[arg(long, value_name = "T at P")]
    pub measured: Vec<String>,
    /// Also write one self-contained HTML report (values, intervals, group breakdown) to this file.
    #[arg(long, value_name = "FILE.html")]
    pub report: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

struct Job {
    compound: Option<String>,
    smiles: Option<String>,
    /// The row could not be read (file, line, reason).
    read_error: Option<String>,
}

fn parse_measured(s: &str) -> Result<MeasuredPoint, InputError> {
    let (t, p) = s.split_once(" at ").ok_or_else(|| {
        InputError(format!(
            "--measured '{s}': expected \"TEMPERATURE at PRESSURE\", e.g. \"95 degC at 0.5 mmHg\""
        ))
    })?;
    let t = parse_temperature(t).map_err(|e| InputError(format!("--measured '{s}': {e}")))?;
    let p = parse_pressure(p).map_err(|e| InputError(format!("--measured '{s}': {e}")))?;
    Ok(MeasuredPoint {
        t_k: t.kelvin(),
        p_pa: p.pa(),
    })
}

fn read_jobs(args: &Args) -> anyhow::Result<Vec<Job>> {
    let mut jobs: Vec<Job> = args
        .smiles
        .iter()
        .map(|s| Job {
            compound: None,
            smiles: Some(s.clone()),
            read_error: None,
        })
        .collect();
    if let Some(path) = &args.input {
        let table = read_text_table_with(path, args.decimal_comma)?;
        let col = table.require_column(
            &args.smiles_column,
            "choose the structure column with --smiles-column",
        )?;
        let name_col = table.column("compound").or_else(|| table.column("name"));
        jobs.reserve(table.rows.len());
        for row in table.rows {
            match row.cells {
                // the cells are moved out, not copied (unless one column is both)
                Ok(mut cells) => jobs.push(Job {
                    compound: match name_col {
                        Some(c) if c == col => cells.get(c).cloned(),
                        Some(c) => cells.get_mut(c).map(std::mem::take),
                        None => None,
                    },
                    smiles: Some(cells.get_mut(col).map(std::mem::take).unwrap_or_default()),
                    read_error: None,
                }),
                Err(e) => jobs.push(Job {
                    compound: None,
                    smiles: None,
                    read_error: Some(e.to_string()),
                }),
            }
        }
    }
    Ok(jobs)
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let ps: Vec<f64> = args
        .at
        .iter()
        .map(|s| {
            parse_pressure(s)
                .map(|p| p.pa())
                .map_err(|e| InputError(format!("--at '{s}': {e}")))
        })
        .collect::<Result<_, _>>()?;
    let measured: Vec<MeasuredPoint> = args
        .measured
        .iter()
        .map(|s| parse_measured(s))
        .collect::<Result<_, _>>()?;
    if measured.len() > 2 {
        return Err(InputError("--measured takes one or two points".into()).into());
    }
    let mut rows: Vec<Row> = Vec::new();
    if let Some(g) = &args.groups {
        let g = parse_groups(g).map_err(|e| InputError(format!("--groups: {e}")))?;
        rows.push(Row::new(estimate_groups(&g), None, None, &ps, &measured));
    }
    let jobs = read_jobs(&args)?;
    if jobs.is_empty() && rows.is_empty() {
        return Err(InputError("give --smiles, --input FILE or --groups".into()).into());
    }
    let bar = (jobs.len() > 1 && std::io::stderr().is_terminal()).then(|| {
        let b = indicatif::ProgressBar::new(jobs.len() as u64);
        b.set_style(
            indicatif::ProgressStyle::with_template("{bar:40} {pos}/{len} structures {eta}")
                .unwrap_or_else(|_| indicatif::ProgressStyle::default_bar()),
        );
        b
    });
    super::common::batch_started(jobs.len());
    // CSV of a table is streamed: each row written as it is estimated, no row kept.
    if args.out.format() == Format::Csv
        && args.report.is_none()
        && rows.is_empty()
        && args.input.is_some()
    {
        let inputs: Vec<&std::path::Path> = args.input.iter().map(|p| p.as_path()).collect();
        let write = |w: &mut dyn std::io::Write| {
            stream_csv(w, &jobs, &ps, &measured, bar.as_ref()).map_err(csv_io)
        };
        match &args.out.output {
            Some(p) => super::common::write_file_atomic_streamed(p, &inputs, write)?,
            None => super::common::print_stdout_with(write)?,
        }
        if let Some(b) = bar {
            b.finish_and_clear();
        }
        return Ok(Outcome::Success);
    }
    let done: Vec<Row> = jobs
        .into_par_iter()
        .map(|j| {
            let mut r = match j.smiles {
                Some(s) => Row::new(estimate_smiles(&s), j.compound, Some(s), &ps, &measured),
                None => Row::new(
                    Err(EstimateError::NoGroups),
                    j.compound,
                    None,
                    &ps,
                    &measured,
                ),
            };
            if let Some(e) = j.read_error {
                r.error = e;
            }
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
    rows.extend(done);
    // A single --smiles that cannot be read is a usage error with a caret line.
    if rows.len() == 1 && rows[0].estimate.is_none() && args.input.is_none() {
        if let Some(s) = &rows[0].smiles_given {
            if let Err(EstimateError::Smiles(e)) = estimate_smiles(s) {
                return Err(InputError(format!("{e}\n{}", e.caret())).into());
            }
        }
        return Err(InputError(rows[0].error.clone()).into());
    }
    let inputs: Vec<&std::path::Path> = args.input.iter().map(|p| p.as_path()).collect();
    let text = match args.out.format() {
        Format::Json => {
            if rows.len() == 1 {
                super::common::json_text(&rows[0])? + "\n"
            } else {
                super::common::json_text(&rows)? + "\n"
            }
        }
        // CSV is streamed (no text of the whole table; it writes no NaN or inf text itself)
        Format::Csv => String::new(),
        Format::Table => ebullio::report::text::estimate::table(&rows),
    };
    if args.out.format() == Format::Csv {
        let write = |w: &mut dyn std::io::Write| {
            ebullio::table_io::write_estimates_csv(w, &rows, &ps).map_err(csv_io)
        };
        match &args.out.output {
            Some(p) => super::common::write_file_atomic(p, &inputs, write)?,
            None => super::common::print_stdout_with(write)?,
        }
    } else {
        args.out.emit(&text, &inputs)?;
    }
    if let Some(path) = &args.report {
        let html = ebullio::report::estimate_section::estimate_report(
            &rows,
            &super::common::command_line(),
        )
        .render();
        super::common::write_report(path, &html, &inputs, args.out.output.as_deref())?;
    }
    Ok(Outcome::Success)
}

/// Structures estimated and written per chunk: chunks are estimated in parallel into
/// their own buffers and written in input order.
const CHUNK: usize = 1024;

/// The CSV of `jobs` into `out`, row by row as they are estimated (the rows
/// `write_estimates_csv` writes for the same jobs, byte for byte).
fn stream_csv(
    out: &mut dyn std::io::Write,
    jobs: &[Job],
    ps: &[f64],
    measured: &[MeasuredPoint],
    bar: Option<&indicatif::ProgressBar>,
) -> Result<(), csv::Error> {
    ebullio::table_io::estimates::write_estimates_header(&mut *out, ps)?;
    // a few chunks per thread at a time, so memory stays bounded by the chunk size
    let group = CHUNK * 4 * rayon::current_num_threads();
    for part in jobs.chunks(group) {
        let texts: Vec<Result<Vec<u8>, csv::Error>> = part
            .par_chunks(CHUNK)
            .map(|chunk| {
                let mut w = EstimateRows::new(Vec::with_capacity(200 * chunk.len()));
                // one molecule's storage for the chunk's structures
                let mut m = Molecule::empty();
                for j in chunk {
                    write_job(&mut w, &mut m, j, ps, measured)?;
                    if let Some(b) = bar {
                        b.inc(1);
                    }
                    super::common::batch_step();
                }
                w.into_inner()
            })
            .collect();
        for t in texts {
            out.write_all(&t?)?;
        }
    }
    out.flush()?;
    Ok(())
}

/// One job's row, as `Row::new` and `write_estimates_csv` would give it.
fn write_job(
    w: &mut EstimateRows<Vec<u8>>,
    m: &mut Molecule,
    j: &Job,
    ps: &[f64],
    measured: &[MeasuredPoint],
) -> Result<(), csv::Error> {
    let compound = j.compound.as_deref().unwrap_or_default();
    let Some(s) = &j.smiles else {
        let e = j
            .read_error
            .clone()
            .unwrap_or_else(|| EstimateError::NoGroups.to_string());
        return w.error_row(compound, "", ps.len(), &e);
    };
    if !measured.is_empty() {
        let r = Row::new(
            estimate_smiles(s),
            j.compound.clone(),
            Some(s.clone()),
            ps,
            measured,
        );
        return w.row(&r, ps.len());
    }
    match estimate_numbers_into(s, m) {
        Ok(n) => {
            // the curve only when there are pressures to take from it
            let curve = if ps.is_empty() { None } else { n.curve() };
            let at = at_pressures(curve.as_ref().map(|c| c as &dyn Curve), ps);
            w.numbers_row(compound, m, &n, &at)
        }
        Err(e) => w.error_row(compound, s, ps.len(), &e.to_string()),
    }
}

/// A CSV write error as the I/O error it wraps (so a closed pipe is still a closed pipe).
fn csv_io(e: csv::Error) -> std::io::Error {
    match e.into_kind() {
        csv::ErrorKind::Io(e) => e,
        other => std::io::Error::other(format!("{other:?}")),
    }
}
