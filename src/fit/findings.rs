//! Findings about a fit: stable kebab-case codes, severity, one plain sentence.
//!
//! Codes are ebullio's own and stable (scripts match on them):
//! `too-few-points`, `narrow-range`, `extrapolated-prediction`, `outlier-point`,
//! `systematic-residuals`, `parameters-highly-correlated`, `poor-fit`,
//! `antoine-pole-near-range`, `trouton-implausible`, `not-converged`,
//! `hvap-near-critical`, `model-choice`, `without-flagged-points`, `duplicate-points`.

pub use crate::finding::{Finding, FitCode, Severity, Subject};
