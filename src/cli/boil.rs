//! `ebullio boil`: boiling temperature at pressures, or vapor pressure at temperatures.

use super::common::parse_pressure;
use super::common::{Format, OutputArgs};
use super::convert::parse_abc;
use super::curve_source::{self, ByStructure};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::boiling::{self, VACUUM_CAUTIONS};
use ebullio::fit::FittedCurve;
use ebullio::reference::Library;
use ebullio::report::text::boil::{self as boil_text, BoilReport};
use ebullio::units::{parse_temperature, ATM_PA};
use ebullio::vapor::{AntoineConstants, AntoineConvention, Curve};
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

fn split_range(s: &str, what: &str) -> Result<(String, String), InputError> {
    s.split_once("..")
        .map(|(a, b)| (a.trim().to_string(), b.trim().to_string()))
        .ok_or_else(|| {
            InputError(format!(
                "--{what}-range '{s}': write it as \"LOW..HIGH\", e.g. \"1 mbar..1 atm\""
            ))
        })
}

fn read_text(p: &Path) -> anyhow::Result<String> {
    std::fs::read_to_string(p).with_context(|| format!("reading {}", p.display()))
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    // 1. Resolve the query.
    let mut pressures = Vec::new();
    for s in &args.pressure {
        pressures.push(
            parse_pressure(s)
                .map_err(|e| InputError(format!("--pressure: {e}")))?
                .pa(),
        );
    }
    if let Some(r) = &args.pressure_range {
        let (a, b) = split_range(r, "pressure")?;
        let lo = parse_pressure(&a).map_err(|e| InputError(format!("--pressure-range: {e}")))?;
        let hi = parse_pressure(&b).map_err(|e| InputError(format!("--pressure-range: {e}")))?;
        pressures.extend(boiling::log_spaced(lo.pa(), hi.pa(), args.steps.max(2)));
    }
    let mut temps = Vec::new();
    for s in &args.temperature {
        temps.push(
            parse_temperature(s)
                .map_err(|e| InputError(format!("--temperature: {e}")))?
                .kelvin(),
        );
    }
    if let Some(r) = &args.temperature_range {
        let (a, b) = split_range(r, "temperature")?;
        let lo =
            parse_temperature(&a).map_err(|e| InputError(format!("--temperature-range: {e}")))?;
        let hi =
            parse_temperature(&b).map_err(|e| InputError(format!("--temperature-range: {e}")))?;
        temps.extend(boiling::lin_spaced(
            lo.kelvin(),
            hi.kelvin(),
            args.steps.max(2),
        ));
    }
    if pressures.is_empty() == temps.is_empty() {
        return Err(InputError("give pressures (--pressure, --pressure-range) or temperatures (--temperature, --temperature-range), not both or neither".into()).into());
    }
    // 2. Resolve the source into one curve.
    // With --from, --compound picks one fit of a multi-compound fit file.
    let n_sources = [
        args.antoine.is_some(),
        args.compound.is_some() && args.from.is_none(),
        args.from.is_some(),
        args.smiles.is_some(),
    ]
    .iter()
    .filter(|x| **x)
    .count();
    if n_sources != 1 {
        return Err(InputError(
            "give exactly one source: --antoine (with --constants), --compound, --from or --smiles"
                .into(),
        )
        .into());
    }
    let mut notes = Vec::new();
    let mut inputs: Vec<&Path> = Vec::new();
    let (curve, source, k95): (Box<dyn Curve>, String, f64) = if let Some(abc) = &args.antoine {
        let [a, b, c] = parse_abc(abc)?;
        let conv: AntoineConvention = args
            .constants
            .as_deref()
            .ok_or_else(|| {
                InputError("--antoine needs --constants, e.g. \"log10,mmHg,degC\"".into())
            })?
            .parse()
            .map_err(|e| InputError(format!("--constants: {e}")))?;
        let mut k = AntoineConstants::new(a, b, c, conv);
        if let Some(r) = &args.range {
            let (lo, hi) = split_range(r, "temperature")?;
            let lo = parse_temperature(&lo).map_err(|e| InputError(format!("--range: {e}")))?;
            let hi = parse_temperature(&hi).map_err(|e| InputError(format!("--range: {e}")))?;
            k = k.with_range_k(lo.kelvin(), hi.kelvin());
        } else {
            notes.push(
                "No validity range given (--range), so extrapolation cannot be flagged.".into(),
            );
        }
        notes.push(
            "Constants given on the command line carry no uncertainty; no interval is shown."
                .into(),
        );
        (
            Box::new(k),
            format!("Antoine constants {a}, {b}, {c} ({conv})"),
            1.96,
        )
    } else if let (Some(name), None) = (&args.compound, &args.from) {
        let lib_owned;
        let lib = match &args.reference_table {
            Some(p) => {
                let text = read_text(p)?;
                inputs.push(p);
                lib_owned = Library::with_user_table(&p.display().to_string(), &text)?;
                &lib_owned
            }
            None => Library::bundled(),
        };
        let (c, rc) = curve_source::by_name(lib, name)?;
        if !rc.note.is_empty() {
            notes.push(format!("Reference row note: {}", rc.note));
        }
        if rc.valid_range_k().is_none() {
            notes.push(
                "The reference row states no validity range, so extrapolation cannot be flagged."
                    .into(),
            );
        }
        notes.push(format!(
            "Interval from a {:.2} % standard uncertainty in p of the reference.",
            100.0 * rc.u_p_rel
        ));
        (
            Box::new(rc.clone()),
            format!("reference {}: {}", c.name, rc.source),
            1.96,
        )
    } else if let Some(path) = &args.from {
        inputs.push(path);
        let reports = ebullio::table_io::read_fit_reports(path)?;
        let report = ebullio::table_io::pick_fit(path, &reports, args.compound.as_deref())?;
        let fc = FittedCurve::from_report(report);
        let k = fc.t95();
        let name = report.compound.clone().unwrap_or_else(|| "unnamed".into());
        (
            Box::new(fc),
            format!(
                "fit {} ({}, {}, {} points{})",
                path.display(),
                name,
                report.model,
                report.n_points,
                boil_text::excluded_note(report)
            ),
            k,
        )
    } else {
        let s = args.smiles.as_deref().unwrap_or_default();
        match curve_source::by_structure(s)? {
            // Reference first: a structure that is a reference compound uses its reference curve.
            ByStructure::Reference(c, rc) => {
                notes.push(format!(
                    "The structure {s} is the reference compound {}: its reference curve is used, not a structure estimate.",
                    c.name
                ));
                if !rc.note.is_empty() {
                    notes.push(format!("Reference note: {}", rc.note));
                }
                notes.push(format!(
                    "Interval from a {:.2} % standard uncertainty in p of the reference.",
                    100.0 * rc.u_p_rel
                ));
                (
                    Box::new(rc.clone()),
                    format!(
                        "reference {} (matched by structure {s}): {}",
                        c.name, rc.source
                    ),
                    1.96,
                )
            }
            ByStructure::Estimate(e) => {
                if let Some(why) = &e.not_matched {
                    notes.push(format!("Not matched to a reference compound: {why}."));
                }
                notes.push(format!(
                    "Structure estimate (Tb {:.1} K, {}, 90 % interval {:.1}-{:.1} K; Lee-Kesler curve): not a measurement.",
                    e.tb_k, e.variant.name(), e.pi90_k.0, e.pi90_k.1
                ));
                (
                    Box::new(e.curve),
                    format!("structure estimate for {s}"),
                    1.96,
                )
            }
        }
    };
    // 3. Compute (library) and print.
    let (mode, results) = if pressures.is_empty() {
        (
            "vapor-pressure",
            boiling::vapor_pressures(curve.as_ref(), &temps, k95),
        )
    } else {
        (
            "boiling-temperature",
            boiling::boiling_points(curve.as_ref(), &pressures, k95),
        )
    };
    if results.iter().any(|r| r.extrapolated) {
        notes.push("Some results lie outside the source's validity range (extrapolated): treat them as rough.".into());
    }
    let vacuum = results
        .iter()
        .any(|r| r.p_pa.is_finite() && r.p_pa < ATM_PA);
    let cautions = if vacuum {
        VACUUM_CAUTIONS.iter().map(|s| s.to_string()).collect()
    } else {
        Vec::new()
    };
    let rep = BoilReport {
        source,
        mode,
        results,
        notes,
        cautions,
    };
    let text = match args.out.format() {
        Format::Json => super::common::json_text(&rep)? + "\n",
        Format::Csv => boil_text::csv(&rep)?,
        Format::Table => boil_text::table(&rep),
    };
    args.out.emit(&text, &inputs)?;
    Ok(Outcome::Success)
}
