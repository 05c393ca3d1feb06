//! Input errors as Python exceptions that carry the row, column and code of the problem.

use ebullio::table_io::ReadError;
use pyo3::prelude::*;

pyo3::create_exception!(
    _ebullio,
    InputError,
    pyo3::exceptions::PyValueError,
    "Bad input: the message names the row (or file and line), the column and what was expected."
);

/// Where an input error points; attributes of the raised `InputError` (None where not known).
#[derive(Default)]
pub struct Place {
    pub file: Option<String>,
    pub line: Option<u64>,
    pub row: Option<u64>,
    pub column: Option<String>,
    pub code: Option<String>,
}

/// Raise `InputError(message)` with the place as attributes.
pub fn input_error(py: Python<'_>, message: String, place: Place) -> PyErr {
    let err = InputError::new_err(message);
    let v = err.value(py);
    let _ = v.setattr("file", place.file);
    let _ = v.setattr("line", place.line);
    let _ = v.setattr("row", place.row);
    let _ = v.setattr("column", place.column);
    let _ = v.setattr("code", place.code);
    err
}

/// An error message without place attributes.
pub fn plain(py: Python<'_>, message: impl Into<String>) -> PyErr {
    input_error(py, message.into(), Place::default())
}

/// A table reader's error. For a DataFrame handed over as CSV text (`frame` true), the CSV
/// line is turned back into the DataFrame's 0-based row (line 1 is the header).
pub fn read_error(py: Python<'_>, e: &ReadError, frame: bool) -> PyErr {
    let column = e.column.clone();
    if frame {
        let row = e.line.filter(|&l| l >= 2).map(|l| l - 2);
        let mut msg = String::from("DataFrame");
        if let Some(r) = row {
            msg += &format!(", row {r}");
        }
        if let Some(c) = &column {
            msg += &format!(", column '{c}'");
        }
        msg += &format!(": {}", e.message);
        input_error(
            py,
            msg,
            Place {
                file: None,
                line: None,
                row,
                column,
                code: Some(e.kind.code().into()),
            },
        )
    } else {
        input_error(
            py,
            e.to_string(),
            Place {
                file: Some(e.file.display().to_string()),
                line: e.line,
                row: None,
                column,
                code: Some(e.kind.code().into()),
            },
        )
    }
}

/// The `barometric` argument ("1013 mbar") in Pa.
pub fn barometric(py: Python<'_>, text: Option<&str>) -> PyResult<Option<f64>> {
    text.map(|b| {
        ebullio::units::parse_pressure(b)
            .map(|p| p.pa())
            .map_err(|e| plain(py, format!("barometric '{b}': {e}")))
    })
    .transpose()
}
