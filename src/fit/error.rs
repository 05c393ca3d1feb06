//! Why a fit could not be made at all: the one error of the fit domain.

/// Why a fit could not be made at all.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum FitError {
    /// Fewer points than the equation's constants + 2.
    #[error("too-few-points: {n} points cannot support the {model} equation ({k} constants needs at least {need})")]
    TooFewPoints {
        /// Points given.
        n: usize,
        /// Constants.
        k: usize,
        /// Points needed.
        need: usize,
        /// Equation.
        model: String,
    },
    /// An exclusion rule that names no point.
    #[error("exclusion '{what}' names no point: {why}")]
    Exclude {
        /// The rule as given.
        what: String,
        /// Why it matches nothing.
        why: String,
    },
    /// Too few distinct temperatures.
    #[error("too-few-temperatures: only {distinct} distinct temperature(s) among {n} points; a vapor-pressure curve needs at least {need}")]
    TooFewTemperatures {
        /// Distinct temperatures.
        distinct: usize,
        /// Points.
        n: usize,
        /// Needed.
        need: usize,
    },
    /// A point is not a physical (T, p) pair.
    #[error(
        "invalid-point: point {}{} has T = {t_k} K, p = {p_pa} Pa; both must be finite and positive{}",
        index + 1,
        line_note(*line),
        gauge_hint(*p_pa)
    )]
    InvalidPoint {
        /// 0-based index (the message counts from 1).
        index: usize,
        /// Source line (0 if unknown).
        line: u64,
        /// T.
        t_k: f64,
        /// p.
        p_pa: f64,
    },
    /// A given uncertainty is zero, negative or not finite.
    #[error("invalid-uncertainty: point {index} (line {line}) has a zero, negative or non-finite uncertainty")]
    InvalidUncertainty {
        /// 0-based index.
        index: usize,
        /// Source line.
        line: u64,
    },
    /// Wagner without Tc, pc, or data at or above Tc.
    #[error("wagner-needs-critical: {0}")]
    Critical(String),
    /// The start values could not be formed (degenerate data).
    #[error("no-start: the data are degenerate for the {0} equation (no start values)")]
    NoStart(String),
}

pub(super) fn line_note(line: u64) -> String {
    if line > 0 {
        format!(" (line {line})")
    } else {
        String::new()
    }
}

pub(super) fn gauge_hint(p_pa: f64) -> &'static str {
    if p_pa < 0.0 {
        " (a negative pressure looks like a gauge reading; vapor pressure must be absolute: add the atmospheric pressure at the time of measurement)"
    } else {
        ""
    }
}
