//! The plain verdict: simple distillation will do, a column of at least N stages, or impractical.
//!
//! Stage-based reasoning decides:
//!
//! 1. **Impractical by distillation** when the geometric-mean α is at or below
//!    [`IMPRACTICAL_ALPHA`] or the Fenske minimum exceeds [`IMPRACTICAL_STAGES`]
//!    theoretical stages (common practice: such separations are rarely
//!    worked by ordinary distillation; consider extractive or azeotropic
//!    distillation, crystallisation or chromatography).
//! 2. **Simple distillation will do** when a single Rayleigh cut meets both
//!    targets: stripping the pot to the bottoms specification leaves a
//!    distillate whose mean purity meets the distillate specification.
//! 3. Otherwise **a column of at least ⌈N_min⌉ theoretical stages** (Fenske,
//!    at total reflux, counting the still pot) is needed; at a workable
//!    reflux ratio expect about twice that (common practice).
//!
//! Beside it, the boiling-point-difference rule of thumb (common practice,
//! no source): boiling points more than about [`RULE_SIMPLE_K`] K apart can
//! often be roughly separated by simple distillation, closer ones need a
//! fractionating column, and within about [`RULE_CLOSE_K`] K distillation is
//! rarely practical. The two can disagree (the rule ignores purity targets);
//! the stage-based verdict is the one to plan with.

use serde::Serialize;

/// α at or below which distillation is called impractical (common practice).
pub const IMPRACTICAL_ALPHA: f64 = 1.05;
/// Fenske minimum above which distillation is called impractical (common practice).
pub const IMPRACTICAL_STAGES: f64 = 100.0;
/// Rule of thumb: boiling-point difference (K) above which simple distillation often suffices (common practice).
pub const RULE_SIMPLE_K: f64 = 25.0;
/// Rule of thumb: boiling-point difference (K) below which distillation is rarely practical (common practice).
pub const RULE_CLOSE_K: f64 = 5.0;

/// The verdict's stable code.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum VerdictCode {
    /// A simple (single-stage) batch distillation meets the targets.
    SimpleDistillation,
    /// A fractionating column is needed.
    ColumnNeeded,
    /// Distillation is not a practical route.
    ImpracticalByDistillation,
}

/// The rule-of-thumb reading of the boiling-point difference.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RuleOfThumb {
    /// Which band the difference falls in.
    pub code: VerdictCode,
    /// The boiling-point difference used, K.
    pub delta_tb_k: f64,
    /// The rule in words, marked as common practice.
    pub message: String,
}

/// The plan's verdict.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Verdict {
    /// Stable code.
    pub code: VerdictCode,
    /// Theoretical stages needed at least (⌈N_min⌉), for a column verdict.
    pub min_theoretical_stages: Option<u32>,
    /// One or two sentences a chemist can act on.
    pub message: String,
    /// The boiling-point-difference rule of thumb, beside the stage-based reasoning.
    pub rule_of_thumb: RuleOfThumb,
}

/// What the verdict looks at.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct VerdictInputs {
    /// Geometric-mean α of the key pair.
    pub alpha: f64,
    /// Fenske minimum stages (None when α ≤ 1).
    pub n_min: Option<f64>,
    /// Boiling-point difference of the key pair at the operating pressure, K.
    pub delta_tb_k: f64,
    /// Target light-component purity of the distillate.
    pub distillate_purity: f64,
    /// Mean distillate purity of one Rayleigh cut stripped to the bottoms target
    /// (None when the cut could not be computed).
    pub simple_cut_distillate: Option<f64>,
    /// Fraction of the charge distilled in that cut.
    pub simple_cut_fraction: Option<f64>,
}

/// Decide the verdict.
///
/// ```
/// use ebullio::plan::verdict::{decide, VerdictCode, VerdictInputs};
/// let v = decide(&VerdictInputs { alpha: 2.47, n_min: Some(10.2), delta_tb_k: 30.6,
///     distillate_purity: 0.99, simple_cut_distillate: Some(0.83), simple_cut_fraction: Some(0.6) });
/// assert_eq!(v.code, VerdictCode::ColumnNeeded);
/// assert_eq!(v.min_theoretical_stages, Some(11));
/// ```
pub fn decide(i: &VerdictInputs) -> Verdict {
    let rule_of_thumb = rule_of_thumb(i.delta_tb_k);
    let pct = |x: f64| format!("{:.1} %", 100.0 * x);
    let (code, stages, message) = match i.n_min {
        _ if i.alpha <= IMPRACTICAL_ALPHA => (
            VerdictCode::ImpracticalByDistillation,
            None,
            format!(
                "Impractical by distillation: the relative volatility {:.3} is too close to 1; look at another separation route.",
                i.alpha
            ),
        ),
        None => (
            VerdictCode::ImpracticalByDistillation,
            None,
            "Impractical by distillation: the relative volatility is at or below 1.".to_string(),
        ),
        Some(n) if n > IMPRACTICAL_STAGES => (
            VerdictCode::ImpracticalByDistillation,
            None,
            format!(
                "Impractical by distillation: at least {n:.0} theoretical stages would be needed even at total reflux."
            ),
        ),
        Some(n) => match (i.simple_cut_distillate, i.simple_cut_fraction) {
            (Some(d), Some(f)) if d >= i.distillate_purity => (
                VerdictCode::SimpleDistillation,
                None,
                format!(
                    "Simple distillation will do: one cut of {} of the charge gives distillate of {} mean purity, meeting the {} target (Fenske minimum {n:.1} stages, which the still pot provides).",
                    pct(f), pct(d), pct(i.distillate_purity)
                ),
            ),
            (d, _) => {
                let need = n.ceil().max(1.0) as u32;
                let simple = d
                    .map(|d| format!(" A simple distillation stripped to the bottoms target gives only {} mean distillate purity.", pct(d)))
                    .unwrap_or_default();
                (
                    VerdictCode::ColumnNeeded,
                    Some(need),
                    format!(
                        "A column of at least {need} theoretical stages (Fenske minimum {n:.1} at total reflux, counting the still pot) is needed; at a workable reflux ratio expect about twice that.{simple}"
                    ),
                )
            }
        },
    };
    Verdict {
        code,
        min_theoretical_stages: stages,
        message,
        rule_of_thumb,
    }
}

/// The boiling-point-difference rule of thumb (common practice).
pub fn rule_of_thumb(delta_tb_k: f64) -> RuleOfThumb {
    let d = delta_tb_k.abs();
    let (code, reading) = if d >= RULE_SIMPLE_K {
        (
            VerdictCode::SimpleDistillation,
            "a rough separation by simple distillation is often possible",
        )
    } else if d >= RULE_CLOSE_K {
        (
            VerdictCode::ColumnNeeded,
            "a fractionating column is usually needed",
        )
    } else {
        (
            VerdictCode::ImpracticalByDistillation,
            "distillation is rarely practical",
        )
    };
    RuleOfThumb {
        code,
        delta_tb_k: d,
        message: format!(
            "Rule of thumb (common practice, not a design method): boiling points {d:.1} K apart, so {reading} (bands: ≥ {RULE_SIMPLE_K} K simple, {RULE_CLOSE_K}–{RULE_SIMPLE_K} K column, < {RULE_CLOSE_K} K rarely practical)."
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn inputs(alpha: f64, n: Option<f64>, cut: f64) -> VerdictInputs {
        VerdictInputs {
            alpha,
            n_min: n,
            delta_tb_k: 10.0,
            distillate_purity: 0.95,
            simple_cut_distillate: Some(cut),
            simple_cut_fraction: Some(0.5),
        }
    }

    #[test]
    fn each_branch_is_reached() {
        assert_eq!(
            decide(&inputs(1.03, Some(300.0), 0.5)).code,
            VerdictCode::ImpracticalByDistillation
        );
        assert_eq!(
            decide(&inputs(1.08, Some(120.0), 0.5)).code,
            VerdictCode::ImpracticalByDistillation
        );
        assert_eq!(
            decide(&inputs(50.0, Some(1.5), 0.97)).code,
            VerdictCode::SimpleDistillation
        );
        let c = decide(&inputs(2.0, Some(8.4), 0.8));
        assert_eq!(c.code, VerdictCode::ColumnNeeded);
        assert_eq!(c.min_theoretical_stages, Some(9));
    }

    #[test]
    fn rule_of_thumb_bands() {
        assert_eq!(rule_of_thumb(40.0).code, VerdictCode::SimpleDistillation);
        assert_eq!(rule_of_thumb(12.0).code, VerdictCode::ColumnNeeded);
        assert_eq!(
            rule_of_thumb(2.0).code,
            VerdictCode::ImpracticalByDistillation
        );
        assert!(rule_of_thumb(12.0).message.contains("common practice"));
    }
}
