//! `check`: a property table in as Arrow columns, the CLI's three added columns and summary out.

use crate::arrow::{self, ArrowStream};
use crate::errors::plain;
use ebullio::screen::{
    screen, BundledReference, Chain, JobackEstimator, NoStructure, ReferenceLookup, ScreenContext,
    ScreenOptions, ScreenReport, StructureEstimator, TableReference,
};
use ebullio::table_io::property_table::{PropertyReadOptions, PropertyTable};
use ebullio::vapor::AntoineConvention;
use polars::prelude::{Column, DataFrame, NamedFrom, Series};
use pyo3::prelude::*;
use std::path::Path;

/// Line of the first data row: rows are numbered in findings as the same table's CSV lines
/// (row index + 2), so a Python check and `ebullio check` of the table as CSV say the same.
pub const LINE0: usize = 2;

/// A checked table, kept for the summary and the report.
#[pyclass(module = "ebullio._ebullio", frozen)]
pub struct CheckRun {
    table: PropertyTable,
    report: ScreenReport,
}

#[pymethods]
impl CheckRun {
    /// The summary the CLI prints, as JSON (rows, counts per code, the `worst` rows).
    fn summary_json(&self, worst: usize) -> PyResult<String> {
        ebullio::table_io::json_text(&self.report.summary(&self.table, worst))
            .map_err(|e| pyo3::exceptions::PyValueError::new_err(e.to_string()))
    }

    /// The summary as the CLI prints it.
    fn summary_text(&self, worst: usize) -> String {
        self.report.summary(&self.table, worst).to_string()
    }

    /// The `--report` HTML document.
    fn html(&self, table_name: &str, command_line: &str) -> String {
        ebullio::report::check_section::check_report(
            table_name,
            &self.table,
            &self.report,
            command_line,
        )
        .render()
    }

    /// The worst severity in the table ("info", "warning", "error"), None when clean.
    fn worst(&self) -> Option<&'static str> {
        self.report.worst().map(|s| s.as_str())
    }
}

/// Screen the table given as named Arrow columns. Returns the `flags`, `severity` and
/// `diagnosis` columns and the run (summary, report).
#[pyfunction]
#[pyo3(signature = (columns, constants=None, tolerance=1.0, reference_table=None, bundled_reference=true, structure=true))]
pub fn check(
    py: Python<'_>,
    columns: Vec<(String, Bound<'_, PyAny>)>,
    constants: Option<String>,
    tolerance: f64,
    reference_table: Option<String>,
    bundled_reference: bool,
    structure: bool,
) -> PyResult<(ArrowStream, CheckRun)> {
    let constants: Option<AntoineConvention> = constants
        .as_deref()
        .map(str::parse)
        .transpose()
        .map_err(|e| plain(py, format!("constants: {e}")))?;
    if !(tolerance.is_finite() && tolerance > 0.0) {
        return Err(plain(
            py,
            format!("tolerance must be a positive number of kelvin, not {tolerance}"),
        ));
    }
    let opts = PropertyReadOptions { constants };
    let frame = arrow::import_frame(&columns)?;
    let table = PropertyTable::from_frame(frame, Path::new("DataFrame"), LINE0, &opts)
        .map_err(|e| plain(py, e.to_string()))?;
    let user_reference = match &reference_table {
        Some(p) => {
            let rt =
                PropertyTable::read(Path::new(p), &opts).map_err(|e| plain(py, e.to_string()))?;
            let implied = rt.implied_tb_k();
            TableReference::from_rows(&rt, implied.as_deref(), p)
        }
        None => TableReference::new(),
    };
    let (cols, report) = py.detach(|| {
        let joback = JobackEstimator;
        let estimator: &dyn StructureEstimator = if structure { &joback } else { &NoStructure };
        let mut references: Vec<&dyn ReferenceLookup> = vec![&user_reference];
        if bundled_reference {
            references.push(BundledReference::bundled());
        }
        let reference = Chain(references);
        let ctx = ScreenContext {
            options: ScreenOptions {
                tolerance_k: tolerance,
            },
            estimator,
            reference: &reference as &dyn ReferenceLookup,
            progress: None,
        };
        let report = screen(&table, None, &ctx);
        let cols = report.columns();
        (cols, report)
    });
    let [flags, severity, diagnosis] = cols;
    let added: Vec<Column> = [
        ("flags", flags),
        ("severity", severity),
        ("diagnosis", diagnosis),
    ]
    .into_iter()
    .map(|(n, v)| Series::new(n.into(), v).into())
    .collect();
    let df = DataFrame::new_infer_height(added).map_err(|e| plain(py, e.to_string()))?;
    Ok((ArrowStream::from_frame(df), CheckRun { table, report }))
}
