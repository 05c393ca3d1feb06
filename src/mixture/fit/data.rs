//! Measured binary vapor–liquid equilibrium data: T–x–y at a pressure or p–x–y at a temperature.
//!
//! Each point carries its liquid composition, the vapor composition when it
//! was analysed, and the temperature and pressure of the equilibrium (one of
//! them fixed for the whole run). Validation here refuses what no fit can
//! use, naming the point and, when known, its file line.

use serde::{Deserialize, Serialize};
use thiserror::Error;

/// Whether the temperature or the pressure was held fixed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum DataKind {
    /// Fixed pressure: the still measures the bubble temperature (T–x–y).
    Isobaric,
    /// Fixed temperature: the cell measures the bubble pressure (p–x–y).
    Isothermal,
}

impl DataKind {
    /// `isobaric` or `isothermal`.
    pub fn as_str(self) -> &'static str {
        match self {
            DataKind::Isobaric => "isobaric",
            DataKind::Isothermal => "isothermal",
        }
    }
}

/// One measured equilibrium point (SI).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BinaryPoint {
    /// Liquid mole fraction of component 1.
    pub x1: f64,
    /// Vapor mole fraction of component 1, when analysed.
    pub y1: Option<f64>,
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// File line, when the point came from a file.
    pub line: Option<u64>,
}

/// A binary data set.
#[derive(Debug, Clone, PartialEq)]
pub struct BinaryData {
    /// Which variable was fixed.
    pub kind: DataKind,
    /// The points, in file order.
    pub points: Vec<BinaryPoint>,
}

/// Why a data set cannot be fitted.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum DataError {
    /// A value outside its physical range.
    #[error("point {point}{}: {what} = {value} is outside {expected}", line_note(*.line))]
    OutOfRange {
        /// 1-based point number.
        point: usize,
        /// File line, when known.
        line: Option<u64>,
        /// The quantity.
        what: &'static str,
        /// Its value.
        value: f64,
        /// The accepted range in words.
        expected: &'static str,
    },
    /// Fewer distinct liquid compositions than a two-parameter model needs.
    #[error("only {distinct} distinct liquid composition(s) between 0 and 1: a binary fit needs at least 3 (a two-parameter model with one degree of freedom)")]
    TooFewCompositions {
        /// Distinct x1 strictly between 0 and 1.
        distinct: usize,
    },
}

fn line_note(line: Option<u64>) -> String {
    line.map(|l| format!(" (line {l})")).unwrap_or_default()
}

impl BinaryData {
    /// Check every point and the set: compositions in 0–1, T and p positive,
    /// at least three distinct liquid compositions strictly between 0 and 1.
    ///
    /// ```
    /// use ebullio::mixture::fit::{BinaryData, BinaryPoint, DataKind};
    /// let pt = |x1| BinaryPoint { x1, y1: None, t_k: 350.0, p_pa: 101_325.0, line: None };
    /// let d = BinaryData { kind: DataKind::Isobaric, points: vec![pt(0.2), pt(0.2)] };
    /// assert!(d.validate().is_err());
    /// ```
    pub fn validate(&self) -> Result<(), DataError> {
        for (i, p) in self.points.iter().enumerate() {
            let bad = |what, value, expected| DataError::OutOfRange {
                point: i + 1,
                line: p.line,
                what,
                value,
                expected,
            };
            if !(p.x1.is_finite() && (0.0..=1.0).contains(&p.x1)) {
                return Err(bad("x1", p.x1, "0 to 1"));
            }
            if let Some(y) = p.y1 {
                if !(y.is_finite() && (0.0..=1.0).contains(&y)) {
                    return Err(bad("y1", y, "0 to 1"));
                }
            }
            if !(p.t_k.is_finite() && p.t_k > 0.0) {
                return Err(bad("T/K", p.t_k, "positive kelvin"));
            }
            if !(p.p_pa.is_finite() && p.p_pa > 0.0) {
                return Err(bad("p/Pa", p.p_pa, "positive pascal"));
            }
        }
        let distinct = self.distinct_inner_compositions();
        if distinct < 3 {
            return Err(DataError::TooFewCompositions { distinct });
        }
        Ok(())
    }

    /// Number of distinct x1 strictly between 0 and 1 (to 1e-6).
    pub fn distinct_inner_compositions(&self) -> usize {
        let mut xs: Vec<f64> = self
            .points
            .iter()
            .map(|p| p.x1)
            .filter(|&x| x > 0.0 && x < 1.0)
            .collect();
        xs.sort_by(f64::total_cmp);
        xs.dedup_by(|a, b| (*a - *b).abs() < 1e-6);
        xs.len()
    }

    /// Whether any point has a vapor composition.
    pub fn has_y(&self) -> bool {
        self.points.iter().any(|p| p.y1.is_some())
    }

    /// (lowest, highest) temperature, K.
    pub fn t_range(&self) -> (f64, f64) {
        range(self.points.iter().map(|p| p.t_k))
    }

    /// (lowest, highest) pressure, Pa.
    pub fn p_range(&self) -> (f64, f64) {
        range(self.points.iter().map(|p| p.p_pa))
    }

    /// (lowest, highest) liquid composition.
    pub fn x_range(&self) -> (f64, f64) {
        range(self.points.iter().map(|p| p.x1))
    }
}

fn range(v: impl Iterator<Item = f64>) -> (f64, f64) {
    v.fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), x| {
        (lo.min(x), hi.max(x))
    })
}
