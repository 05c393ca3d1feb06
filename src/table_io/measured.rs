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
