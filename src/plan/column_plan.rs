//! The plan's column for the key pair: McCabe–Thiele on its equilibrium curve, and Fenske–Underwood–Gilliland where α is nearly constant.

use super::column::{self, ColumnError, ColumnSpec, Fug, PinchKind, Step};
use super::rayleigh::Equilibrium;
use serde::Serialize;

/// Largest ratio of the highest to the lowest α along the column for which the
/// constant-α short cut (FUG) is shown (our own threshold: the short cut
/// assumes one α).
pub const FUG_ALPHA_SPREAD: f64 = 1.2;

/// A continuous column for the key pair, fed with the charge.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ColumnSummary {
    /// The equilibrium curve stepped on (`raoult-varying-alpha`, `unifac`, …).
    pub equilibrium: &'static str,
    /// Feed light-component mole fraction (the charge).
    pub feed_x_light: f64,
    /// Feed condition q (1 saturated liquid).
    pub feed_q: f64,
    /// Minimum theoretical stages at total reflux (McCabe–Thiele, reboiler counted).
    pub min_stages: f64,
    /// Minimum reflux ratio L/D.
    pub min_reflux: f64,
    /// Where the minimum-reflux pinch lies.
    pub pinch: PinchKind,
    /// Liquid light fraction at the pinch.
    pub pinch_x_light: f64,
    /// Reflux as a multiple of the minimum.
    pub reflux_factor: f64,
    /// The reflux ratio stepped at.
    pub reflux_ratio: f64,
    /// Theoretical stages at that reflux (reboiler counted), last one fractional.
    pub stages: f64,
    /// Whole theoretical stages at that reflux.
    pub whole_stages: u32,
    /// Optimal feed stage from the top.
    pub feed_stage: u32,
    /// Lowest relative volatility along the column (between the product compositions).
    pub alpha_low: f64,
    /// Highest relative volatility along the column.
    pub alpha_high: f64,
    /// The constant-α short cut, when α varies little enough.
    pub fug: Option<Fug>,
    /// Why FUG is or is not given.
    pub fug_note: String,
    /// The stages at the chosen reflux, top first (for drawing).
    pub steps: Vec<Step>,
}

/// What came of designing the column.
#[derive(Debug, Clone, PartialEq)]
pub enum ColumnOutcome {
    /// A column design.
    Designed(Box<ColumnSummary>),
    /// The curve meets the diagonal between the product compositions (azeotrope or pinch).
    Beyond {
        /// Liquid light fraction where it does.
        x: f64,
    },
    /// No design, with the reason in words.
    Failed(String),
}

/// Design the column on `eq` for the targets.
pub fn column_for(
    eq: &dyn Equilibrium,
    distillate_purity: f64,
    bottoms_purity: f64,
    feed_x_light: f64,
    feed_q: f64,
    reflux_factor: f64,
) -> ColumnOutcome {
    let spec =
        match ColumnSpec::from_purities(distillate_purity, bottoms_purity, feed_x_light, feed_q) {
            Ok(s) => s,
            Err(e) => return ColumnOutcome::Failed(e.to_string()),
        };
    let d = match column::design(eq, &spec, Some(reflux_factor), None) {
        Ok(d) => d,
        Err(ColumnError::CurveMeetsDiagonal { x, .. }) => return ColumnOutcome::Beyond { x },
        Err(e) => return ColumnOutcome::Failed(e.to_string()),
    };
    // α along the column.
    let (mut lo, mut hi) = (f64::INFINITY, 0.0f64);
    for i in 0..=40 {
        let x = spec.x_b + (spec.x_d - spec.x_b) * i as f64 / 40.0;
        if let Ok(y) = eq.y(x) {
            let a = y * (1.0 - x) / (x * (1.0 - y));
            if a.is_finite() {
                lo = lo.min(a);
                hi = hi.max(a);
            }
        }
    }
    let (fug, fug_note) = if lo > 1.0 && hi / lo <= FUG_ALPHA_SPREAD {
        let alpha = (lo * hi).sqrt();
        match column::fug::fug(alpha, &spec, reflux_factor) {
            Ok(f) => (
                Some(f),
                format!(
                    "α varies from {lo:.3} to {hi:.3} along the column, so the constant-α short cut is given at their geometric mean {alpha:.3}."
                ),
            ),
            Err(e) => (None, format!("Short cut not computed: {e}")),
        }
    } else {
        (
            None,
            format!(
                "α varies from {lo:.3} to {hi:.3} along the column (more than a factor {FUG_ALPHA_SPREAD}), so the constant-α short cut (Fenske–Underwood–Gilliland) is not given."
            ),
        )
    };
    ColumnOutcome::Designed(Box::new(ColumnSummary {
        equilibrium: eq.model(),
        feed_x_light,
        feed_q,
        min_stages: d.total_reflux.stages,
        min_reflux: d.min_reflux.r_min,
        pinch: d.min_reflux.kind,
        pinch_x_light: d.min_reflux.pinch_x,
        reflux_factor,
        reflux_ratio: d.at_reflux.reflux_ratio.unwrap_or_default(),
        stages: d.at_reflux.stages,
        whole_stages: d.at_reflux.whole_stages,
        feed_stage: d.at_reflux.feed_stage.unwrap_or(1),
        alpha_low: lo,
        alpha_high: hi,
        fug,
        fug_note,
        steps: d.at_reflux.steps,
    }))
}

#[cfg(test)]
mod tests {
    use super::super::rayleigh::ConstantAlpha;
    use super::*;

    #[test]
    fn constant_alpha_column_gets_the_short_cut_too() {
        let ColumnOutcome::Designed(c) =
            column_for(&ConstantAlpha { alpha: 2.5 }, 0.99, 0.99, 0.5, 1.0, 1.3)
        else {
            panic!("no design")
        };
        assert!((c.alpha_high / c.alpha_low - 1.0).abs() < 1e-9);
        let f = c.fug.as_ref().unwrap();
        assert!((f.r_min - c.min_reflux).abs() < 1e-6);
        assert!((c.reflux_ratio - 1.3 * c.min_reflux).abs() < 1e-9);
        assert!(c.whole_stages as f64 >= c.stages && c.feed_stage < c.whole_stages);
    }
}
