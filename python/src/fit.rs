//! `fit`: measured (T, p) data in (a DataFrame as CSV text, or a file), the CLI's fit rows out.
//!
//! Options, the batch and the report are the library's ([`ebullio::fit::FitRequest`],
//! [`ebullio::table_io::fit_batch`], [`ebullio::report::fit_section::batch_report`]), the
//! same calls `ebullio fit` makes.

use crate::errors::{plain, read_error};
use ebullio::fit::{At, FitError, FitRequest};
use ebullio::table_io::{
    fit_batch, json_text, none_fitted, read_measured, read_measured_bytes, FitCheckOptions, FitRow,
    ReadOptions,
};
use ebullio::units::{PressureUnit, TemperatureUnit};
use pyo3::prelude::*;
use std::path::Path;

/// The fits of one call, kept for the JSON and the report.
#[pyclass(module = "ebullio._ebullio", frozen)]
pub struct FitRun {
    source: String,
    rows: Vec<FitRow>,
    at: Vec<At>,
    warnings: Vec<(Option<u64>, String, String)>,
}

#[pymethods]
impl FitRun {
    /// The rows as the CLI's `--format json` writes them (always a list).
    fn json(&self) -> PyResult<String> {
        json_text(&self.rows).map_err(|e| pyo3::exceptions::PyValueError::new_err(e.to_string()))
    }

    /// Non-fatal remarks on the input: (row or line, code, message).
    fn warnings(&self) -> Vec<(Option<u64>, String, String)> {
        self.warnings.clone()
    }

    /// The `--report` HTML document of these fits.
    fn html(&self, command_line: &str) -> String {
        ebullio::report::fit_section::batch_report(&self.source, &self.rows, &self.at, command_line)
            .render()
    }
}

/// A fit error with the arguments of `ebullio.fit` that fix it (as the CLI names its options).
fn describe(e: &FitError) -> String {
    match e {
        FitError::Exclude { .. } => format!("exclude: {e}"),
        FitError::Critical(_) => format!("{e} (give tc and pc)"),
        _ => e.to_string(),
    }
}

/// Fit every compound of the data. `csv` is a DataFrame written as CSV (errors then name its
/// rows); otherwise `path` is read as the CLI reads it. Options mean what the CLI's flags mean.
#[pyfunction]
#[pyo3(signature = (csv, path, model, at, robust, constants, tc, pc, compound, smiles, t_unit, p_unit, ref_p_tolerance_pct, ref_tb_tolerance_k, exclude, barometric))]
#[allow(clippy::too_many_arguments)]
pub fn fit(
    py: Python<'_>,
    csv: Option<Vec<u8>>,
    path: Option<String>,
    model: &str,
    at: Vec<String>,
    robust: bool,
    constants: &str,
    tc: Option<String>,
    pc: Option<String>,
    compound: Option<String>,
    smiles: Option<String>,
    t_unit: Option<String>,
    p_unit: Option<String>,
    ref_p_tolerance_pct: f64,
    ref_tb_tolerance_k: f64,
    exclude: Vec<String>,
    barometric: Option<String>,
) -> PyResult<FitRun> {
    let t_unit = t_unit
        .as_deref()
        .map(TemperatureUnit::parse)
        .transpose()
        .map_err(|e| plain(py, format!("t_unit: {e}")))?;
    let p_unit = p_unit
        .as_deref()
        .map(PressureUnit::parse)
        .transpose()
        .map_err(|e| plain(py, format!("p_unit: {e}")))?;
    let barometric_pa = crate::errors::barometric(py, barometric.as_deref())?;
    let opts = FitRequest {
        model,
        constants,
        tc: tc.as_deref(),
        pc: pc.as_deref(),
        robust,
        at: &at,
        exclude: &exclude,
        barometric_pa,
    }
    .resolve(&|n| n.to_string())
    .map_err(|e| plain(py, e))?;
    let read = ReadOptions {
        t_unit,
        p_unit,
        decimal_comma: false,
        barometric_pa,
    };
    let frame = csv.is_some();
    let data = match (&csv, &path) {
        (Some(bytes), _) => read_measured_bytes(Path::new("<DataFrame>.csv"), bytes, &read),
        (None, Some(p)) => read_measured(Path::new(p), &read),
        (None, None) => return Err(plain(py, "give a DataFrame or a file")),
    }
    .map_err(|e| read_error(py, &e, frame))?;
    let source = if frame {
        "DataFrame".to_string()
    } else {
        data.source.clone()
    };
    if data.sets.is_empty() {
        return Err(plain(py, format!("{source}: no data rows")));
    }
    let check = FitCheckOptions {
        compound,
        smiles,
        tolerances: ebullio::reference::compare::Tolerances {
            p_rel: ref_p_tolerance_pct / 100.0,
            tb_k: ref_tb_tolerance_k,
        },
    };
    let rows = py.detach(|| fit_batch(&data, &opts, &check, &describe, &|| {}));
    if let Some(why) = none_fitted(&source, &rows) {
        return Err(plain(py, why));
    }
    let warnings = data
        .warnings
        .iter()
        .map(|w| {
            let place = if frame {
                w.line.checked_sub(2)
            } else {
                Some(w.line)
            };
            (place, w.code.clone(), w.message.clone())
        })
        .collect();
    Ok(FitRun {
        source,
        rows,
        at: opts.at,
        warnings,
    })
}
