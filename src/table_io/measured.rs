//! Measured temperature–pressure data: the in-memory form every reader produces.

use serde::Serialize;

/// One measured point, in SI.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MeasuredPoint {
    /// Temperature, K.
    pub t_k: f64,
    /// Absolute pressure, Pa.
    pub p_pa: f64,
    /// Standard uncertainty of T, K.
    pub u_t_k: Option<f64>,
    /// Standard uncertainty of p, Pa.
    pub u_p_pa: Option<f64>,
    /// 1-based line in the source file (for messages).
    pub line: u64,
}

/// The points of one compound, with the carried-through text columns.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct MeasuredSet {
    /// The `compound` column value, if any.
    pub compound: Option<String>,
    /// The `smiles` column value, if any.
    pub smiles: Option<String>,
    /// The points, in file order.
    pub points: Vec<MeasuredPoint>,
}

use crate::units::{PressureUnit, TemperatureUnit};
use std::path::{Path, PathBuf};

/// How to read a measured-data file.
#[derive(Debug, Clone, Default)]
pub struct ReadOptions {
    /// Override the temperature unit of the temperature column (`--t-unit`).
    pub t_unit: Option<TemperatureUnit>,
    /// Override the pressure unit of the pressure column (`--p-unit`).
    pub p_unit: Option<PressureUnit>,
    /// Semicolon-separated with decimal commas (`--decimal-comma`).
    pub decimal_comma: bool,
}

/// A non-fatal remark about the input (e.g. exact duplicate rows).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ReadWarning {
    /// File the remark is about.
    pub file: String,
    /// 1-based line.
    pub line: u64,
    /// Stable kebab-case code.
    pub code: String,
    /// One sentence.
    pub message: String,
}

/// Everything read from one measured-data source, grouped by compound.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct MeasuredData {
    /// Display name of the source (path, or `<stdin>`).
    pub source: String,
    /// One set per compound, in order of first appearance (one set if no `compound` column).
    pub sets: Vec<MeasuredSet>,
    /// Non-fatal remarks.
    pub warnings: Vec<ReadWarning>,
}

/// Error reading measured data: always names the file and, where it applies,
/// the line and column.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("{file}: {message}")]
pub struct ReadError {
    /// The file.
    pub file: PathBuf,
    /// 1-based line, where it applies.
    pub line: Option<u64>,
    /// Column heading, where it applies.
    pub column: Option<String>,
    /// What was wrong and what was expected.
    pub message: String,
}

/// Read measured (T, p) data from CSV, Parquet (by extension or magic bytes) or stdin (`-`).
pub fn read_measured(path: &Path, _opts: &ReadOptions) -> Result<MeasuredData, ReadError> {
    Err(ReadError {
        file: path.to_path_buf(),
        line: None,
        column: None,
        message: "the measured-data reader is not built yet".into(),
    })
}
