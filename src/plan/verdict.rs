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
//! 3. Otherwise **a column of at least ⌈N_min⌉ theoretical stages** (at total
//!    reflux, counting the still pot) is needed, with the McCabe–Thiele numbers
//!    of a continuous column at a workable reflux (and the FUG short cut where
//!    α is nearly constant) in the message.
//!
//! Before all of these, **beyond an azeotrope**: when the equilibrium curve
//! meets the diagonal between the bottoms and distillate targets (a predicted
//! azeotrope, or the flat vapor of a two-liquid region), no number of stages
//! reaches the targets; the verdict names the azeotrope, gives no stage count
//! and lists the usual ways round it (common practice).
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
    /// The target lies beyond an azeotrope (or across a two-liquid region):
    /// ordinary distillation cannot reach it.
    BeyondAzeotrope,
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
    /// Ways round an azeotrope (common practice), for a `beyond-azeotrope` verdict.
    pub hints: Vec<String>,
}

/// An azeotrope (or pinch) between the targets.
#[derive(Debug, Clone, PartialEq)]
pub struct Barrier {
    /// Light-component mole fraction where the curve meets the diagonal.
    pub x: f64,
    /// Its temperature, K, when known.
    pub t_k: Option<f64>,
    /// Its kind in words, e.g. `minimum-boiling azeotrope`.
    pub kind: String,
    /// Ways round it (common practice).
    pub hints: Vec<String>,
}

/// The column numbers the verdict quotes.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ColumnBrief<'a> {
    /// The design, when one could be made.
    pub summary: Option<&'a super::column_plan::ColumnSummary>,
    /// Why not, otherwise.
    pub failure: Option<&'a str>,
}

/// What the verdict looks at.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct VerdictInputs<'a> {
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
    /// The continuous-column numbers, when computed.
    pub column: Option<ColumnBrief<'a>>,
    /// An azeotrope between the targets.
    pub barrier: Option<&'a Barrier>,
}

/// Decide the verdict.
///
/// ```
/// use ebullio::plan::verdict::{decide, VerdictCode, VerdictInputs};
/// let v = decide(&VerdictInputs { alpha: 2.47, n_min: Some(10.2), delta_tb_k: 30.6,
///     distillate_purity: 0.99, simple_cut_distillate: Some(0.83), simple_cut_fraction: Some(0.6),
///     column: None, barrier: None });
/// assert_eq!(v.code, VerdictCode::ColumnNeeded);
/// assert_eq!(v.min_theoretical_stages, Some(11));
/// ```
pub fn decide(i: &VerdictInputs) -> Verdict {
    let rule_of_thumb = rule_of_thumb(i.delta_tb_k);
    let pct = |x: f64| format!("{:.1} %", 100.0 * x);
    if let Some(b) = i.barrier {
        let at = b
            .t_k
            .map(|t| format!(", {:.1} °C", t - crate::units::CELSIUS_OFFSET))
            .unwrap_or_default();
        return Verdict {
            code: VerdictCode::BeyondAzeotrope,
            min_theoretical_stages: None,
            message: format!(
                "Beyond the azeotrope: the {} at x = {:.3}{at} lies between the bottoms and distillate targets, so ordinary distillation cannot reach them with any number of stages (a column approaches the azeotrope, not the {} target).",
                b.kind,
                b.x,
                pct(i.distillate_purity)
            ),
            rule_of_thumb,
            hints: b.hints.clone(),
        };
    }
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
                        "A column of at least {need} theoretical stages (minimum {n:.1} at total reflux, counting the still pot) is needed.{}{simple}",
                        column_sentence(i.column)
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
        hints: Vec::new(),
    }
}

/// The McCabe–Thiele (and FUG) numbers in one sentence.
fn column_sentence(c: Option<ColumnBrief>) -> String {
    let Some(c) = c else {
        return String::new();
    };
    let Some(s) = c.summary else {
        return c
            .failure
            .map(|f| format!(" The stages at a workable reflux could not be stepped: {f}."))
            .unwrap_or_default();
    };
    let feed = if (s.feed_q - 1.0).abs() < 1e-12 {
        "saturated liquid".to_string()
    } else {
        format!("q = {}", s.feed_q)
    };
    let pinch = match s.pinch {
        super::column::PinchKind::Feed => "pinch at the feed",
        super::column::PinchKind::TangentRectifying => "tangent pinch above the feed",
        super::column::PinchKind::TangentStripping => "tangent pinch below the feed",
    };
    let fug = s
        .fug
        .map(|f| {
            format!(
                "; the Fenske–Underwood–Gilliland short cut gives {:.1} stages, feed on stage {} (Kirkbride)",
                f.gilliland.n, f.feed.feed_stage
            )
        })
        .unwrap_or_default();
    format!(
        " As a continuous column fed with the charge ({feed}): minimum reflux ratio {:.2} ({pinch}); at {} × that (R = {:.2}) McCabe–Thiele on the {} curve gives {:.1} theoretical stages ({} whole, still pot or reboiler counted), feed on stage {} from the top{fug}.",
        s.min_reflux, s.reflux_factor, s.reflux_ratio, s.equilibrium, s.stages, s.whole_stages, s.feed_stage
    )
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

    fn inputs(alpha: f64, n: Option<f64>, cut: f64) -> VerdictInputs<'static> {
        VerdictInputs {
            alpha,
            n_min: n,
            delta_tb_k: 10.0,
            distillate_purity: 0.95,
            simple_cut_distillate: Some(cut),
            simple_cut_fraction: Some(0.5),
            column: None,
            barrier: None,
        }
    }

    #[test]
    fn barrier_gives_no_stage_count_and_lists_hints() {
        let b = Barrier {
            x: 0.89,
            t_k: Some(351.3),
            kind: "minimum-boiling azeotrope".into(),
            hints: vec!["an entrainer".into()],
        };
        let mut i = inputs(2.0, Some(8.4), 0.8);
        i.barrier = Some(&b);
        let v = decide(&i);
        assert_eq!(v.code, VerdictCode::BeyondAzeotrope);
        assert_eq!(v.min_theoretical_stages, None);
        assert!(
            v.message.contains("x = 0.890") && v.message.contains("78.2 °C"),
            "{}",
            v.message
        );
        assert_eq!(v.hints.len(), 1);
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
