//! `ebullio boil`: boiling temperature at pressures, or vapor pressure at temperatures.

use super::common::{Format, OutputArgs};
use super::convert::parse_abc;
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::boiling::BoilRequest;
use ebullio::reference::Library;
use ebullio::report::text::boil as boil_text;
use std::path::{Path, PathBuf};

/// Boiling temperature at one or more pressures, or vapor pressure at temperatures.
///
/// Source: --antoine with --constants, --compound (bundled reference), --from
/// fit.json, or --smiles (structure estimate, with its expected error).
///
/// Example: ebullio boil --compound toluene --pressure "15 mbar"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// Antoine constants "A,B,C" (with --constants).
    #[arg(long, allow_hyphen_values = true)]
    pub antoine: Option<String>,
    /// Convention of --antoine, e.g. "log10,mmHg,degC".
    #[arg(long)]
    pub constants: Option<String>,
    /// Validity range of --antoine, e.g. "20 degC..110 degC".
    #[arg(long, allow_hyphen_values = true)]
    pub range: Option<String>,
    /// A reference compound (name, synonym or CAS number); with --from, the compound to
    /// take from a fit file that holds several.
    #[arg(long)]
    pub compound: Option<String>,
    /// A fit result written by `ebullio fit --format json`.
    #[arg(long, value_name = "FIT.json")]
    pub from: Option<PathBuf>,
    /// A structure (SMILES): Joback/Lee-Kesler estimate.
    #[arg(long)]
    pub smiles: Option<String>,
    /// Your own reference table (CSV, same columns as the bundled ones); takes precedence.
    #[arg(long, value_name = "FILE")]
    pub reference_table: Option<PathBuf>,
    /// Pressure with unit, e.g. "15 mbar" (repeatable).
    #[arg(long, short = 'p')]
    pub pressure: Vec<String>,
    /// Pressure range "LOW..HIGH", log-spaced by --steps.
    #[arg(long, allow_hyphen_values = true)]
    pub pressure_range: Option<String>,
    /// Temperature with unit, e.g. "85 degC" (repeatable): gives vapor pressure.
    #[arg(long, short = 't', allow_hyphen_values = true)]
    pub temperature: Vec<String>,
    /// Temperature range "LOW..HIGH", evenly spaced by --steps.
    #[arg(long, allow_hyphen_values = true)]
    pub temperature_range: Option<String>,
    /// Number of points in a range.
    #[arg(long, default_value_t = 10)]
    pub steps: usize,
    #[command(flatten)]
    pub out: OutputArgs,
}

fn read_text(p: &Path) -> anyhow::Result<String> {
    std::fs::read_to_string(p).with_context(|| format!("reading {}", p.display()))
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let mut inputs: Vec<&Path> = Vec::new();
    let antoine = args.antoine.as_deref().map(parse_abc).transpose()?;
    let lib_owned;
    let library = match &args.reference_table {
        Some(p) => {
            let text = read_text(p)?;
            inputs.push(p);
            lib_owned = Library::with_user_table(&p.display().to_string(), &text)?;
            Some(&lib_owned)
        }
        None => None,
    };
    // With --from, --compound picks one fit of a multi-compound fit file.
    let reports;
    let label;
    let fit = match &args.from {
        Some(path) => {
            inputs.push(path);
            reports = ebullio::table_io::read_fit_reports(path)?;
            label = path.display().to_string();
            let report = ebullio::table_io::pick_fit(path, &reports, args.compound.as_deref())?;
            Some((report, label.as_str()))
        }
        None => None,
    };
    let rep = BoilRequest {
        pressures: &args.pressure,
        pressure_range: args.pressure_range.as_deref(),
        temperatures: &args.temperature,
        temperature_range: args.temperature_range.as_deref(),
        steps: args.steps,
        barometric_pa: super::common::barometric().map(|p| p.pa()),
        antoine,
        constants: args.constants.as_deref(),
        range: args.range.as_deref(),
        compound: args.compound.as_deref().filter(|_| fit.is_none()),
        library,
        fit,
        smiles: args.smiles.as_deref(),
    }
    .run(&|n| format!("--{}", n.replace('_', "-")))
    .map_err(InputError)?;
    let text = match args.out.format() {
        Format::Json => super::common::json_text(&rep)? + "\n",
        Format::Csv => boil_text::csv(&rep)?,
        Format::Table => boil_text::table(&rep),
    };
    args.out.emit(&text, &inputs)?;
    Ok(Outcome::Success)
}
