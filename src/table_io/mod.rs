//! The one place that reads and writes tables and files.
//!
//! Measured (T, p) data come in through [`measured`] (CSV via the csv crate
//! with exact line and column in every error; Parquet via polars behind the
//! `tables` feature); every output file goes out through [`atomic`], which
//! writes a temporary file beside the target and renames it, and refuses to
//! write over an input. Commands never parse files themselves.

pub mod atomic;
pub mod binary;
#[cfg(feature = "tables")]
pub mod check_stream;
pub mod decimal;
pub mod error;
pub mod estimates;
pub mod fit_batch;
pub mod fit_file;
#[cfg(feature = "tables")]
pub mod frame;
pub mod headings;
pub mod json;
pub mod measured;
pub mod non_finite;
#[cfg(feature = "tables")]
pub mod parquet;
mod plain_number;
#[cfg(feature = "tables")]
pub mod property_table;
pub mod source;
#[cfg(feature = "tables")]
pub mod table_batches;
pub mod text_table;

pub use atomic::{write_atomic, write_atomic_with, OutputError};
pub use error::{Locus, ReadError, ReadErrorKind};
pub use estimates::{estimates_csv, write_estimates_csv};
pub use fit_batch::{
    fit_batch, fit_batch_map, none_fitted, none_fitted_by, FitCheckOptions, FitRow,
};
pub use fit_file::{is_binary_fit, pick_fit, read_binary_fit, read_fit_reports};
pub use json::json_text;
pub use measured::{
    fit_set, read_measured, read_measured_bytes, MeasuredData, MeasuredPoint, MeasuredSet,
    ReadOptions, ReadWarning,
};
pub use non_finite::without_non_finite;
pub use text_table::{read_text_table, read_text_table_with, TextRow, TextTable};
