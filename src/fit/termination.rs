//! How a least-squares solve stopped: a reason enum with [`StopReason::is_success`],
//! written in JSON as `{converged, reason, evaluations}` (the report's stable shape).
//! The solver's own reasons keep its words; the fit's evaluation budget has its own.

use levenberg_marquardt::TerminationReason;
use serde::{Deserialize, Serialize};
use std::fmt;

/// Why the solver stopped.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum StopReason {
    /// The equation is linear in its constants: solved exactly, no iteration.
    ExactLinear,
    /// Antoine by separable least squares (variable projection over C with A, B
    /// solved exactly at each C): the step in C reached rounding level.
    Separable,
    /// The relative reduction of the sum of squares (`ftol`) or of the step (`xtol`) met
    /// its bound.
    Converged {
        /// The `ftol` criterion was met.
        ftol: bool,
        /// The `xtol` criterion was met.
        xtol: bool,
    },
    /// The residuals are exactly zero.
    ResidualsZero,
    /// The residuals are orthogonal to the Jacobian columns (`gtol`).
    Orthogonal,
    /// The evaluation budget was spent.
    LostPatience,
    /// The fit's own evaluation budget (scaled to its number of constants, summed over every
    /// solve of the fit, reweightings included) was spent before it converged.
    BudgetSpent {
        /// The budget, residual evaluations.
        budget: usize,
    },
    /// A success criterion was met, but at non-finite constants.
    NonFinite(Box<StopReason>),
    /// Any other reason, in the solver's words.
    Other(String),
}

impl StopReason {
    /// True when the solve reached a solution (a convergence criterion at finite constants).
    pub fn is_success(&self) -> bool {
        matches!(
            self,
            StopReason::ExactLinear
                | StopReason::Separable
                | StopReason::Converged { .. }
                | StopReason::ResidualsZero
                | StopReason::Orthogonal
        )
    }

    /// The reason the levenberg-marquardt crate gave; `finite` says whether the
    /// constants it stopped at are all finite.
    pub fn from_solver(t: &TerminationReason, finite: bool) -> Self {
        let r = match t {
            TerminationReason::Converged { ftol, xtol } => StopReason::Converged {
                ftol: *ftol,
                xtol: *xtol,
            },
            TerminationReason::Orthogonal => StopReason::Orthogonal,
            TerminationReason::ResidualsZero => StopReason::ResidualsZero,
            TerminationReason::LostPatience => StopReason::LostPatience,
            other => StopReason::Other(format!("{other:?}")),
        };
        if r.is_success() && !finite {
            StopReason::NonFinite(Box::new(r))
        } else {
            r
        }
    }

    /// Read back the words [`fmt::Display`] writes; `converged` false on a success
    /// word means it stopped at non-finite constants.
    fn parse(s: &str, converged: bool) -> Self {
        let r = match s {
            "exact linear least squares" => StopReason::ExactLinear,
            "separable least squares" => StopReason::Separable,
            "ResidualsZero" => StopReason::ResidualsZero,
            "Orthogonal" => StopReason::Orthogonal,
            "LostPatience" => StopReason::LostPatience,
            _ if s.starts_with(BUDGET_WORDS) => match s
                .strip_prefix(BUDGET_WORDS)
                .and_then(|r| r.strip_suffix(" evaluations)"))
                .and_then(|n| n.parse().ok())
            {
                Some(budget) => StopReason::BudgetSpent { budget },
                None => StopReason::Other(s.to_string()),
            },
            _ => match s
                .strip_prefix("Converged { ftol: ")
                .and_then(|r| r.strip_suffix(" }"))
                .and_then(|r| r.split_once(", xtol: "))
            {
                Some((f, x)) => StopReason::Converged {
                    ftol: f == "true",
                    xtol: x == "true",
                },
                None => StopReason::Other(s.to_string()),
            },
        };
        if r.is_success() && !converged {
            StopReason::NonFinite(Box::new(r))
        } else {
            r
        }
    }
}

/// The words of [`StopReason::BudgetSpent`] before its number.
const BUDGET_WORDS: &str = "evaluation budget spent (";

/// The solver's reason in words: the crate's own variant name and fields, as its
/// `Debug` prints them (a stable part of the fit report).
impl fmt::Display for StopReason {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            StopReason::ExactLinear => f.write_str("exact linear least squares"),
            StopReason::Separable => f.write_str("separable least squares"),
            StopReason::Converged { ftol, xtol } => {
                write!(f, "Converged {{ ftol: {ftol}, xtol: {xtol} }}")
            }
            StopReason::ResidualsZero => f.write_str("ResidualsZero"),
            StopReason::Orthogonal => f.write_str("Orthogonal"),
            StopReason::LostPatience => f.write_str("LostPatience"),
            StopReason::BudgetSpent { budget } => write!(f, "{BUDGET_WORDS}{budget} evaluations)"),
            StopReason::NonFinite(r) => r.fmt(f),
            StopReason::Other(s) => f.write_str(s),
        }
    }
}

/// How the solver stopped.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(into = "TerminationJson", from = "TerminationJson")]
pub struct Termination {
    /// Why it stopped.
    pub reason: StopReason,
    /// Residual evaluations used.
    pub evaluations: usize,
}

impl Termination {
    /// True when a convergence criterion was met at finite constants.
    pub fn is_success(&self) -> bool {
        self.reason.is_success()
    }
}

/// The JSON shape: `converged` (true on success), `reason` in words, `evaluations`.
#[derive(Serialize, Deserialize)]
struct TerminationJson {
    converged: bool,
    reason: String,
    evaluations: usize,
}

impl From<Termination> for TerminationJson {
    fn from(t: Termination) -> Self {
        TerminationJson {
            converged: t.is_success(),
            reason: t.reason.to_string(),
            evaluations: t.evaluations,
        }
    }
}

impl From<TerminationJson> for Termination {
    fn from(j: TerminationJson) -> Self {
        Termination {
            reason: StopReason::parse(&j.reason, j.converged),
            evaluations: j.evaluations,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn words_match_the_solvers_debug_text() {
        for t in [
            TerminationReason::Converged {
                ftol: false,
                xtol: true,
            },
            TerminationReason::Converged {
                ftol: true,
                xtol: false,
            },
            TerminationReason::Orthogonal,
            TerminationReason::LostPatience,
            TerminationReason::User("residuals"),
        ] {
            assert_eq!(
                StopReason::from_solver(&t, true).to_string(),
                format!("{t:?}")
            );
        }
    }

    #[test]
    fn json_keeps_its_shape_and_reads_back() {
        for (reason, ok) in [
            (StopReason::ExactLinear, true),
            (StopReason::Separable, true),
            (
                StopReason::Converged {
                    ftol: true,
                    xtol: false,
                },
                true,
            ),
            (StopReason::LostPatience, false),
            (StopReason::BudgetSpent { budget: 1200 }, false),
            (
                StopReason::NonFinite(Box::new(StopReason::Orthogonal)),
                false,
            ),
            (StopReason::Other("Numerical(\"jacobian\")".into()), false),
        ] {
            let t = Termination {
                reason,
                evaluations: 7,
            };
            let j = serde_json::to_value(&t).unwrap();
            assert_eq!(j["converged"], ok);
            assert_eq!(j["evaluations"], 7);
            assert_eq!(j["reason"], t.reason.to_string());
            assert_eq!(serde_json::from_value::<Termination>(j).unwrap(), t);
        }
    }
}
