//! `boil`: boiling temperatures at pressures, or vapor pressures at temperatures, from one source.
//!
//! The source is resolved as `ebullio boil` resolves its flags (--antoine/--constants/--range,
//! --compound with an optional --reference-table, a fit, --smiles); the numbers come from the
//! library's `boiling` functions, and the report serialises with the CLI's field names.

use crate::errors::plain;
use ebullio::boiling::{self, BoilResult, VACUUM_CAUTIONS};
use ebullio::fit::{FitReport, FittedCurve};
use ebullio::reference::Library;
use ebullio::units::{parse_pressure, parse_temperature, ATM_PA};
use ebullio::vapor::{AntoineConstants, AntoineConvention, Curve};
use pyo3::prelude::*;

#[derive(serde::Serialize)]
struct Report {
    source: String,
    mode: &'static str,
    results: Vec<BoilResult>,
    notes: Vec<String>,
    cautions: Vec<String>,
}

fn split_range(py: Python<'_>, r: &str, what: &str, example: &str) -> PyResult<(String, String)> {
    r.split_once("..")
        .map(|(a, b)| (a.trim().to_string(), b.trim().to_string()))
        .ok_or_else(|| {
            plain(
                py,
                format!("{what} '{r}': write it as \"LOW..HIGH\", e.g. {example}"),
            )
        })
}

fn range_k(py: Python<'_>, r: &str) -> PyResult<(f64, f64)> {
    let (lo, hi) = split_range(py, r, "range", "\"20 degC..110 degC\"")?;
    let lo = parse_temperature(&lo).map_err(|e| plain(py, format!("range: {e}")))?;
    let hi = parse_temperature(&hi).map_err(|e| plain(py, format!("range: {e}")))?;
    Ok((lo.kelvin(), hi.kelvin()))
}

/// The boil report as JSON (the CLI's `--format json` fields).
#[pyfunction]
#[pyo3(signature = (pressure, temperature, antoine=None, constants=None, range=None, compound=None, reference_table=None, fit=None, smiles=None, pressure_range=None, temperature_range=None, steps=10))]
#[allow(clippy::too_many_arguments)]
pub fn boil(
    py: Python<'_>,
    pressure: Vec<String>,
    temperature: Vec<String>,
    antoine: Option<(f64, f64, f64)>,
    constants: Option<String>,
    range: Option<String>,
    compound: Option<String>,
    reference_table: Option<String>,
    fit: Option<String>,
    smiles: Option<String>,
    pressure_range: Option<String>,
    temperature_range: Option<String>,
    steps: usize,
) -> PyResult<String> {
    let pressures = pressure
        .iter()
        .map(|s| {
            parse_pressure(s)
                .map(|p| p.pa())
                .map_err(|e| plain(py, format!("pressure: {e}")))
        })
        .collect::<PyResult<Vec<f64>>>()?;
    let temps = temperature
        .iter()
        .map(|s| {
            parse_temperature(s)
                .map(|t| t.kelvin())
                .map_err(|e| plain(py, format!("temperature: {e}")))
        })
        .collect::<PyResult<Vec<f64>>>()?;
    let (mut pressures, mut temps) = (pressures, temps);
    if let Some(r) = &pressure_range {
        let (lo, hi) = split_range(py, r, "pressure_range", "\"1 mbar..1 atm\"")?;
        let lo = parse_pressure(&lo).map_err(|e| plain(py, format!("pressure_range: {e}")))?;
        let hi = parse_pressure(&hi).map_err(|e| plain(py, format!("pressure_range: {e}")))?;
        pressures.extend(boiling::log_spaced(lo.pa(), hi.pa(), steps.max(2)));
    }
    if let Some(r) = &temperature_range {
        let (lo, hi) = split_range(py, r, "temperature_range", "\"20 degC..110 degC\"")?;
        let lo =
            parse_temperature(&lo).map_err(|e| plain(py, format!("temperature_range: {e}")))?;
        let hi =
            parse_temperature(&hi).map_err(|e| plain(py, format!("temperature_range: {e}")))?;
        temps.extend(boiling::lin_spaced(lo.kelvin(), hi.kelvin(), steps.max(2)));
    }
    if pressures.is_empty() == temps.is_empty() {
        return Err(plain(
            py,
            "give pressures or temperatures, not both or neither",
        ));
    }
    let n_sources = [
        antoine.is_some(),
        compound.is_some() && fit.is_none(),
        fit.is_some(),
        smiles.is_some(),
    ]
    .iter()
    .filter(|x| **x)
    .count();
    if n_sources != 1 {
        return Err(plain(
            py,
            "give exactly one source: antoine (with constants), compound, fit or smiles",
        ));
    }
    let mut notes: Vec<String> = Vec::new();
    let (curve, source, k95): (Box<dyn Curve>, String, f64) = if let Some((a, b, c)) = antoine {
        let conv: AntoineConvention = constants
            .as_deref()
            .ok_or_else(|| plain(py, "antoine needs constants, e.g. \"log10,mmHg,degC\""))?
            .parse()
            .map_err(|e| plain(py, format!("constants: {e}")))?;
        let mut k = AntoineConstants::new(a, b, c, conv);
        if let Some(r) = &range {
            let (lo, hi) = range_k(py, r)?;
            k = k.with_range_k(lo, hi);
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
    } else if let Some(json) = &fit {
        let report: FitReport = serde_json::from_str(json)
            .map_err(|e| plain(py, format!("fit: not an ebullio fit result: {e}")))?;
        let fc = FittedCurve::from_report(&report);
        let k = fc.t95();
        let name = report.compound.clone().unwrap_or_else(|| "unnamed".into());
        (
            Box::new(fc),
            format!(
                "fit ({}, {}, {} points)",
                name, report.model, report.n_points
            ),
            k,
        )
    } else if let Some(name) = &compound {
        let owned;
        let lib = match &reference_table {
            Some(p) => {
                let text = std::fs::read_to_string(p)
                    .map_err(|e| plain(py, format!("reading {p}: {e}")))?;
                owned = Library::with_user_table(p, &text).map_err(|e| plain(py, e.to_string()))?;
                &owned
            }
            None => Library::bundled(),
        };
        let c = lib.find(name).map_err(|e| plain(py, e.to_string()))?;
        let rc = c.best_curve().ok_or_else(|| {
            plain(
                py,
                format!(
                    "reference compound '{}' has a boiling point but no vapor-pressure curve",
                    c.name
                ),
            )
        })?;
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
    } else if let Some((c, rc)) = smiles
        .as_deref()
        .and_then(|s| Library::bundled().reference_for_smiles(s))
    {
        // Reference first: a structure that is a reference compound uses its reference curve.
        let s = smiles.as_deref().unwrap_or_default();
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
    } else {
        let s = smiles.as_deref().unwrap_or_default();
        if let Err(e @ ebullio::reference::LookupError::Stereo { .. }) =
            Library::bundled().find_smiles(s)
        {
            notes.push(format!("Not matched to a reference compound: {e}."));
        }
        let e = ebullio::estimate::estimate_smiles(s)
            .map_err(|e| plain(py, format!("smiles '{s}': {e}")))?;
        let c = e.curve().ok_or_else(|| {
            plain(
                py,
                format!("smiles '{s}': no critical constants for this structure, so no curve"),
            )
        })?;
        notes.push(format!(
            "Structure estimate (Tb {:.1} K, {}, 90 % interval {:.1}-{:.1} K; Lee-Kesler curve): not a measurement.",
            e.tb_k,
            e.tb_variant.name(),
            e.tb_pi90_low_k,
            e.tb_pi90_high_k
        ));
        (Box::new(c), format!("structure estimate for {s}"), 1.96)
    };
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
    serde_json::to_string(&Report {
        source,
        mode,
        results,
        notes,
        cautions,
    })
    .map_err(|e| plain(py, e.to_string()))
}
