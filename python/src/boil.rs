//! `boil`: boiling temperatures at pressures, or vapor pressures at temperatures, from one source.
//!
//! The query and its source are resolved and computed by the library's
//! [`ebullio::boiling::BoilRequest`], as `ebullio boil` does; the report serialises with
//! the command's field names.

use crate::errors::plain;
use ebullio::boiling::BoilRequest;
use ebullio::fit::FitReport;
use ebullio::reference::Library;
use pyo3::prelude::*;

/// The boil report as JSON (the CLI's `--format json` fields).
#[pyfunction]
#[pyo3(signature = (pressure, temperature, antoine=None, constants=None, range=None, compound=None, reference_table=None, fit=None, smiles=None, pressure_range=None, temperature_range=None, steps=10, barometric=None))]
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
    barometric: Option<String>,
) -> PyResult<String> {
    let barometric_pa = crate::errors::barometric(py, barometric.as_deref())?;
    let owned;
    let library = match &reference_table {
        Some(p) => {
            let text =
                std::fs::read_to_string(p).map_err(|e| plain(py, format!("reading {p}: {e}")))?;
            owned = Library::with_user_table(p, &text).map_err(|e| plain(py, e.to_string()))?;
            Some(&owned)
        }
        None => None,
    };
    let report: Option<FitReport> = fit
        .as_deref()
        .map(serde_json::from_str)
        .transpose()
        .map_err(|e| plain(py, format!("fit: not an ebullio fit result: {e}")))?;
    let rep = BoilRequest {
        pressures: &pressure,
        pressure_range: pressure_range.as_deref(),
        temperatures: &temperature,
        temperature_range: temperature_range.as_deref(),
        steps,
        barometric_pa,
        antoine: antoine.map(|(a, b, c)| [a, b, c]),
        constants: constants.as_deref(),
        range: range.as_deref(),
        compound: compound.as_deref(),
        library,
        fit: report.as_ref().map(|r| (r, "")),
        smiles: smiles.as_deref(),
    }
    .run(&|n| if n == "from" { "fit".into() } else { n.into() })
    .map_err(|e| plain(py, e))?;
    ebullio::table_io::json_text(&rep).map_err(|e| plain(py, e.to_string()))
}
