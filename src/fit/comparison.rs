//! A fit held against reference data: the record of what the comparison found, kept
//! in the fit report (`reference_comparison`). Computed by `reference::fit_check`.

use crate::finding::Finding;
use serde::{Deserialize, Serialize};

/// Tolerances for the reference's own uncertainty.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Tolerances {
    /// Relative tolerance in p (0.02 = 2 %).
    pub p_rel: f64,
    /// Tolerance in normal boiling point, K.
    pub tb_k: f64,
}

impl Default for Tolerances {
    fn default() -> Self {
        Tolerances {
            p_rel: 0.02,
            tb_k: 0.5,
        }
    }
}

/// The result of holding a fitted curve against a reference compound.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Comparison {
    /// Reference compound name.
    pub compound: String,
    /// The reference curve's source.
    pub reference_source: String,
    /// Overlap of the temperature ranges, K (None: no overlap).
    pub overlap_k: Option<(f64, f64)>,
    /// Gap between the ranges, K, when they do not overlap.
    pub gap_k: Option<f64>,
    /// Maximum |p_fit/p_ref − 1| over the overlap, percent.
    pub max_rel_diff_pct: Option<f64>,
    /// RMS of p_fit/p_ref − 1 over the overlap, percent.
    pub rms_rel_diff_pct: Option<f64>,
    /// Fitted minus reference normal boiling point, K.
    pub tb_diff_k: Option<f64>,
    /// Reference normal boiling point used, K.
    pub tb_reference_k: Option<f64>,
    /// Findings.
    pub findings: Vec<Finding>,
}

/// What the check found, stored in a report's `reference_comparison`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FitCheck {
    /// Tolerances used.
    pub tolerances: Tolerances,
    /// The reference comparison, when a reference compound was found.
    pub reference: Option<Comparison>,
    /// Structure estimate Tb (K) and its typical error, when compared.
    pub structure_tb_k: Option<(f64, f64)>,
    /// The structure estimate's calibrated 90 % prediction interval, K, and
    /// whether the fitted Tb lies inside it.
    pub structure_tb_pi90_k: Option<(f64, f64, bool)>,
    /// Findings (also appended to the report's flags).
    pub findings: Vec<Finding>,
}
