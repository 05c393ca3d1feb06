//! `fit`: measured (T, p) data in (a DataFrame as CSV text, or a file), the CLI's fit rows out.

use crate::errors::{plain, read_error};
use ebullio::fit::{At, FitOptions, FitReport, ModelSelection, RobustLoss};
use ebullio::table_io::{fit_set, read_measured, read_measured_bytes, ReadOptions};
use ebullio::units::{
    parse_pressure, parse_quantity, parse_temperature, PressureUnit, Quantity, TemperatureUnit,
};
use ebullio::vapor::AntoineConvention;
use pyo3::prelude::*;
use rayon::prelude::*;
use std::path::Path;

/// One row of a batch, serialised exactly as `ebullio fit --format json` does.
#[derive(serde::Serialize)]
#[serde(untagged)]
enum Row {
    Ok(Box<FitReport>),
    Failed {
        compound: Option<String>,
        error: String,
    },
}

/// The fits of one call, kept for the JSON and the report.
#[pyclass(module = "ebullio._ebullio", frozen)]
pub struct FitRun {
    source: String,
    rows: Vec<Row>,
    pressures: Vec<f64>,
    warnings: Vec<(Option<u64>, String, String)>,
}

#[pymethods]
impl FitRun {
    /// The rows as the CLI's `--format json` writes them (always a list).
    fn json(&self) -> PyResult<String> {
        serde_json::to_string(&self.rows)
            .map_err(|e| pyo3::exceptions::PyValueError::new_err(e.to_string()))
    }

    /// Non-fatal remarks on the input: (row or line, code, message).
    fn warnings(&self) -> Vec<(Option<u64>, String, String)> {
        self.warnings.clone()
    }

    /// The `--report` HTML document of these fits.
    fn html(&self, command_line: &str) -> String {
        let fits: Vec<FitReport> = self
            .rows
            .iter()
            .filter_map(|r| match r {
                Row::Ok(rep) => Some((**rep).clone()),
                _ => None,
            })
            .collect();
        let failed: Vec<(Option<String>, String)> = self
            .rows
            .iter()
            .filter_map(|r| match r {
                Row::Failed { compound, error } => Some((compound.clone(), error.clone())),
                _ => None,
            })
            .collect();
        ebullio::report::fit_section::fit_report(
            &self.source,
            &fits,
            &failed,
            &self.pressures,
            command_line,
        )
        .render()
    }
}

/// Fit every compound of the data. `csv` is a DataFrame written as CSV (errors then name its
/// rows); otherwise `path` is read as the CLI reads it. Options mean what the CLI's flags mean.
#[pyfunction]
#[pyo3(signature = (csv, path, model, at, robust, constants, tc, pc, compound, smiles, t_unit, p_unit, ref_p_tolerance_pct, ref_tb_tolerance_k))]
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
    let model: ModelSelection = model
        .parse()
        .map_err(|e| plain(py, format!("model: {e}")))?;
    let convention: AntoineConvention = constants
        .parse()
        .map_err(|e| plain(py, format!("constants: {e}")))?;
    let critical = match (&tc, &pc) {
        (Some(tc), Some(pc)) => {
            let t = parse_temperature(tc).map_err(|e| plain(py, format!("tc '{tc}': {e}")))?;
            let p = parse_pressure(pc).map_err(|e| plain(py, format!("pc '{pc}': {e}")))?;
            Some((t.kelvin(), p.pa()))
        }
        (None, None) => None,
        _ => return Err(plain(py, "tc and pc must be given together")),
    };
    if model == ModelSelection::Wagner && critical.is_none() {
        return Err(plain(py, "model 'wagner' needs tc and pc"));
    }
    let mut at_q = Vec::new();
    for s in &at {
        match parse_quantity(s).map_err(|e| plain(py, format!("at '{s}': {e}")))? {
            Quantity::Pressure(p) => at_q.push(At::PressurePa(p.pa())),
            Quantity::Temperature(t) => at_q.push(At::TemperatureK(t.kelvin())),
        }
    }
    let read = ReadOptions {
        t_unit,
        p_unit,
        decimal_comma: false,
        // Gauge pressures need the CLI's --barometric; a DataFrame's pressures are absolute.
        barometric_pa: None,
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
    let opts = FitOptions {
        model,
        critical,
        robust: robust.then_some(RobustLoss::Tukey),
        convention,
        at: at_q.clone(),
        refit_without_outliers: true,
    };
    let tol = ebullio::reference::compare::Tolerances {
        p_rel: ref_p_tolerance_pct / 100.0,
        tb_k: ref_tb_tolerance_k,
    };
    let rows: Vec<Row> = py.detach(|| {
        let lib = ebullio::reference::Library::bundled();
        data.sets
            .par_iter()
            .map(|s| match fit_set(s, &opts) {
                Ok(mut rep) => {
                    let smiles = smiles.as_deref().or(s.smiles.as_deref());
                    ebullio::reference::fit_check::check_fit(
                        &mut rep,
                        lib,
                        compound.as_deref(),
                        smiles,
                        tol,
                    );
                    Row::Ok(Box::new(rep))
                }
                Err(e) => Row::Failed {
                    compound: s.compound.clone(),
                    error: e.to_string(),
                },
            })
            .collect()
    });
    if rows.iter().all(|r| matches!(r, Row::Failed { .. })) {
        let why = rows
            .iter()
            .find_map(|r| match r {
                Row::Failed { error, .. } => Some(error.clone()),
                _ => None,
            })
            .unwrap_or_else(|| "no fit".into());
        return Err(plain(
            py,
            if rows.len() > 1 {
                format!(
                    "{source}: none of the {} compounds could be fitted; the first: {why}",
                    rows.len()
                )
            } else {
                format!("{source}: {why}")
            },
        ));
    }
    let mut pressures: Vec<f64> = at_q
        .iter()
        .filter_map(|a| match a {
            At::PressurePa(p) => Some(*p),
            At::TemperatureK(_) => None,
        })
        .collect();
    if pressures.is_empty() {
        pressures = ebullio::report::fit_section::DEFAULT_PRESSURES_PA.to_vec();
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
        pressures,
        warnings,
    })
}
