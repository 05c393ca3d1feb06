//! Arrow C stream interface in both directions, through polars' own arrow (no second Arrow crate).
//!
//! Input: any Python object with `__arrow_c_stream__` (a polars Series or DataFrame, a pyarrow
//! Array, ChunkedArray or Table). Output: [`ArrowStream`], an object with `__arrow_c_stream__`
//! that `polars.DataFrame(...)` and `pyarrow.table(...)` take without copying.

use polars::prelude::{CompatLevel, DataFrame, IntoColumn, PlSmallStr, Series};
use polars_arrow::array::{Array, StructArray, Utf8ViewArray};
use polars_arrow::datatypes::{ArrowDataType, Field};
use polars_arrow::ffi::{export_iterator, ArrowArrayStream, ArrowArrayStreamReader};
use pyo3::exceptions::{PyTypeError, PyValueError};
use pyo3::prelude::*;
use pyo3::types::PyCapsule;
use std::ffi::CStr;

const STREAM: &CStr = c"arrow_array_stream";

/// Every chunk of `obj.__arrow_c_stream__()`, with the stream's field.
pub fn import(obj: &Bound<'_, PyAny>) -> PyResult<(Field, Vec<Box<dyn Array>>)> {
    if !obj.hasattr("__arrow_c_stream__")? {
        return Err(PyTypeError::new_err(format!(
            "expected an Arrow stream (a polars Series or a pyarrow array), not {}",
            obj.get_type().name()?
        )));
    }
    let capsule = obj.call_method0("__arrow_c_stream__")?;
    let capsule = capsule.cast::<PyCapsule>()?;
    let ptr = capsule
        .pointer_checked(Some(STREAM))?
        .cast::<ArrowArrayStream>();
    // Move the stream out of the capsule; the capsule keeps an empty (released) one.
    let stream = unsafe { std::ptr::replace(ptr.as_ptr(), ArrowArrayStream::empty()) };
    let mut reader = unsafe { ArrowArrayStreamReader::try_new(Box::new(stream)) }
        .map_err(|e| PyValueError::new_err(format!("reading an Arrow stream: {e}")))?;
    let field = reader.field().clone();
    let mut chunks = Vec::new();
    while let Some(chunk) = unsafe { reader.next() } {
        chunks.push(
            chunk.map_err(|e| PyValueError::new_err(format!("reading an Arrow stream: {e}")))?,
        );
    }
    Ok((field, chunks))
}

/// A polars Series from an Arrow stream (name given by the caller).
pub fn import_series(name: &str, obj: &Bound<'_, PyAny>) -> PyResult<Series> {
    let (_, chunks) = import(obj)?;
    Series::try_from((PlSmallStr::from(name), chunks))
        .map_err(|e| PyValueError::new_err(format!("column '{name}': {e}")))
}

/// A DataFrame from named columns, each an Arrow stream.
pub fn import_frame(columns: &[(String, Bound<'_, PyAny>)]) -> PyResult<DataFrame> {
    let cols = columns
        .iter()
        .map(|(n, o)| import_series(n, o).map(|s| s.into_column()))
        .collect::<PyResult<Vec<_>>>()?;
    DataFrame::new_infer_height(cols).map_err(|e| PyValueError::new_err(e.to_string()))
}

/// Text cells of a string stream, one `Option<&str>` per row, whatever the string layout
/// (Utf8View from polars, Utf8 or LargeUtf8 from pyarrow). Other types are refused.
pub fn strings(name: &str, chunks: &[Box<dyn Array>]) -> PyResult<Vec<Utf8ViewArray>> {
    chunks
        .iter()
        .map(|a| {
            let s = Series::try_from((PlSmallStr::from(name), a.clone()))
                .map_err(|e| PyTypeError::new_err(format!("column '{name}': {e}")))?;
            let s = match s.dtype() {
                polars::prelude::DataType::String => s,
                polars::prelude::DataType::Null => s
                    .cast(&polars::prelude::DataType::String)
                    .map_err(|e| PyTypeError::new_err(e.to_string()))?,
                other => {
                    return Err(PyTypeError::new_err(format!(
                        "column '{name}' holds {other}, expected text (SMILES strings)"
                    )))
                }
            };
            let ca = s.str().map_err(|e| PyTypeError::new_err(e.to_string()))?;
            let ca = ca.rechunk();
            Ok(ca.downcast_as_array().clone())
        })
        .collect()
}

/// An Arrow stream handed to Python: one struct array per chunk, one field per column.
#[pyclass(module = "ebullio._ebullio")]
pub struct ArrowStream {
    stream: std::sync::Mutex<Option<ArrowArrayStream>>,
}

impl ArrowStream {
    /// Export a DataFrame (moved, not copied).
    pub fn from_frame(mut df: DataFrame) -> Self {
        df.rechunk_mut_par();
        let compat = CompatLevel::newest();
        let fields: Vec<Field> = df
            .columns()
            .iter()
            .map(|c| c.field().to_arrow(compat))
            .collect();
        let dtype = ArrowDataType::Struct(fields.clone());
        let height = df.height();
        let arrays: Vec<Box<dyn Array>> = df
            .columns()
            .iter()
            .map(|c| c.as_materialized_series().to_arrow(0, compat))
            .collect();
        let batch: Box<dyn Array> = Box::new(StructArray::new(dtype.clone(), height, arrays, None));
        let field = Field::new(PlSmallStr::EMPTY, dtype, false);
        let stream = export_iterator(Box::new(std::iter::once(Ok(batch))), field);
        ArrowStream {
            stream: std::sync::Mutex::new(Some(stream)),
        }
    }
}

#[pymethods]
impl ArrowStream {
    /// The Arrow PyCapsule stream interface (can be taken once).
    #[pyo3(signature = (requested_schema=None))]
    fn __arrow_c_stream__<'py>(
        &self,
        py: Python<'py>,
        requested_schema: Option<Bound<'py, PyAny>>,
    ) -> PyResult<Bound<'py, PyCapsule>> {
        let _ = requested_schema;
        let stream = self
            .stream
            .lock()
            .map_err(|_| PyValueError::new_err("this Arrow stream is unusable"))?
            .take()
            .ok_or_else(|| PyValueError::new_err("this Arrow stream was already read"))?;
        PyCapsule::new_with_value(py, stream, STREAM)
    }
}
