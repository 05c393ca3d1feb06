//! Parquet input through polars (feature `tables`), turned into text cells so the
//! same validator as for CSV applies.

use super::error::{ReadError, ReadErrorKind};
use super::headings::{classify, Role};
use polars::prelude::*;
use polars_io::parquet::read::ParquetReader;
use polars_io::SerReader;
use std::path::Path;

/// Rows of text cells, each with its 1-based row number.
pub type TextRows = Vec<(u64, Vec<String>)>;

/// Read a Parquet file into headings and rows of text cells (rows numbered from 1).
/// Columns that hold a temperature, pressure or uncertainty must be numeric.
pub fn read_as_text(path: &Path, bytes: &[u8]) -> Result<(Vec<String>, TextRows), ReadError> {
    let df = ParquetReader::new(std::io::Cursor::new(bytes))
        .finish()
        .map_err(|e| {
            ReadError::file(
                path,
                ReadErrorKind::Parquet,
                format!("cannot read as Parquet: {e}"),
            )
        })?;
    let headers: Vec<String> = df
        .get_column_names()
        .iter()
        .map(|s| s.to_string())
        .collect();
    let mut columns: Vec<Vec<String>> = Vec::with_capacity(headers.len());
    for (i, h) in headers.iter().enumerate() {
        let col = df.column(h.as_str()).map_err(|e| {
            ReadError::file(path, ReadErrorKind::Parquet, e.to_string()).at_column(i, h)
        })?;
        let numeric_role = matches!(
            classify(h),
            Ok(Role::Temperature(_)
                | Role::Pressure(_)
                | Role::UTemperature(_)
                | Role::UPressure(_))
        );
        let dtype = col.dtype().clone();
        if numeric_role && !dtype.is_primitive_numeric() {
            return Err(ReadError::file(
                path,
                ReadErrorKind::ColumnType,
                format!(
                    "column '{h}' has type {dtype}; expected a numeric (float or integer) column"
                ),
            )
            .at_column(i, h));
        }
        let s = col.cast(&DataType::String).map_err(|e| {
            ReadError::file(path, ReadErrorKind::ColumnType, e.to_string()).at_column(i, h)
        })?;
        let ca = s.str().map_err(|e| {
            ReadError::file(path, ReadErrorKind::ColumnType, e.to_string()).at_column(i, h)
        })?;
        columns.push(
            (0..ca.len())
                .map(|k| ca.get(k).unwrap_or("").to_string())
                .collect(),
        );
    }
    let n = df.height();
    let rows = (0..n)
        .map(|r| {
            (
                r as u64 + 1,
                columns.iter().map(|c| c[r].clone()).collect::<Vec<_>>(),
            )
        })
        .collect();
    Ok((headers, rows))
}
