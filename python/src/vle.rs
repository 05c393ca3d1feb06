//! `vle`: a binary's T–x–y (or p–x–y) diagram, azeotropes and liquid split, as `ebullio vle`.
//!
//! Components, model and condition are resolved by the library's
//! [`ebullio::mixture::VleRequest`] and the study is its `VleSetup::study`: the calls the
//! command makes, serialised with the command's field names.

use crate::errors::plain;
use ebullio::mixture::VleRequest;
use pyo3::prelude::*;

/// The study as JSON (the fields `ebullio vle --format json` writes, without `at_x1`).
#[pyfunction]
#[pyo3(signature = (compound, smiles, pressure=None, temperature=None, model=None, wilson=None, nrtl=None, points=101, barometric=None))]
#[allow(clippy::too_many_arguments)]
pub fn vle(
    py: Python<'_>,
    compound: Vec<String>,
    smiles: Vec<String>,
    pressure: Option<String>,
    temperature: Option<String>,
    model: Option<String>,
    wilson: Option<Vec<f64>>,
    nrtl: Option<Vec<f64>>,
    points: usize,
    barometric: Option<String>,
) -> PyResult<String> {
    let barometric_pa = crate::errors::barometric(py, barometric.as_deref())?;
    let setup = VleRequest {
        compounds: &compound,
        smiles: &smiles,
        pressure: pressure.as_deref(),
        temperature: temperature.as_deref(),
        model: model.as_deref(),
        wilson: wilson.as_deref(),
        nrtl: nrtl.as_deref(),
        points,
        barometric_pa,
        fitted: None,
    }
    .resolve(&|n| n.to_string())
    .map_err(|e| plain(py, e))?;
    // One binary is milliseconds of work: kept under the GIL.
    let study = setup.study().map_err(|e| plain(py, e.to_string()))?;
    ebullio::table_io::json_text(&study).map_err(|e| plain(py, e.to_string()))
}
