//! The one place that reads and writes tables and files.
//!
//! Measured (T, p) data come in through [`measured`]; every output file goes
//! out through [`atomic`], which writes a temporary file beside the target and
//! renames it, and refuses to write over an input. Commands never parse files
//! themselves.

pub mod atomic;
pub mod measured;
#[cfg(feature = "tables")]
pub mod property_table;

pub use atomic::{write_atomic, OutputError};
pub use measured::{
    read_measured, MeasuredData, MeasuredPoint, MeasuredSet, ReadError, ReadOptions, ReadWarning,
};
