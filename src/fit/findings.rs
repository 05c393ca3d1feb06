//! Findings about a fit: stable kebab-case codes, severity, one plain sentence.
//!
//! Codes are ebullio's own and stable (scripts match on them):
//! `too-few-points`, `narrow-range`, `extrapolated-prediction`, `outlier-point`,
//! `systematic-residuals`, `parameters-highly-correlated`, `poor-fit`,
//! `antoine-pole-near-range`, `trouton-implausible`, `not-converged`,
//! `hvap-near-critical`, `model-choice`, `without-flagged-points`, `duplicate-points`.

use serde::{Deserialize, Serialize};

pub use crate::severity::Severity;

/// One finding.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Finding {
    /// Stable kebab-case code.
    pub code: String,
    /// Severity.
    pub severity: Severity,
    /// One sentence a chemist understands.
    pub message: String,
}

impl Finding {
    /// A finding.
    pub fn new(code: &str, severity: Severity, message: impl Into<String>) -> Self {
        Finding {
            code: code.to_string(),
            severity,
            message: message.into(),
        }
    }
}
