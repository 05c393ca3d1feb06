//! Kirkbride's feed-stage location: the split of stages between rectifying and stripping sections.
//!
//! `N_R/N_S = [ (z_HK/z_LK) · (x_B,LK/x_D,HK)² · (B/D) ]^0.206`
//!
//! with N_R and N_S the stages above and below the feed, z the feed, x_B,LK
//! the light key in the bottoms, x_D,HK the heavy key in the distillate and
//! B/D the molar ratio of bottoms to distillate. Here the feed stage is
//! counted as the first stage of the stripping section, so it is `N_R + 1`
//! from the top (rounded to a whole stage).
//!
//! Reference: C. G. Kirkbride, "Process design procedure for multicomponent
//! fractionators", *Petroleum Refiner* 23 (9) (1944) 321–336.

use super::ColumnSpec;
use serde::Serialize;

/// Kirkbride's split of `n` stages.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct FeedLocation {
    /// `N_R/N_S`.
    pub ratio: f64,
    /// Stages above the feed.
    pub n_rectifying: f64,
    /// Stages from the feed stage down, the reboiler included.
    pub n_stripping: f64,
    /// Feed stage from the top, `round(N_R) + 1`.
    pub feed_stage: u32,
}

/// Locate the feed for a binary `spec` in a column of `n` theoretical stages.
///
/// ```
/// use ebullio::plan::column::{kirkbride, ColumnSpec};
/// // Symmetric split, equal products: the ratio is 1.
/// let f = kirkbride::feed_location(&ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap(), 20.0);
/// assert!((f.ratio - 1.0).abs() < 1e-12 && f.feed_stage == 11);
/// ```
pub fn feed_location(spec: &ColumnSpec, n: f64) -> FeedLocation {
    let d = spec.distillate_fraction();
    let b_over_d = (1.0 - d) / d;
    let ratio = ((1.0 - spec.z_f) / spec.z_f * (spec.x_b / (1.0 - spec.x_d)).powi(2) * b_over_d)
        .powf(0.206);
    let n_r = n * ratio / (1.0 + ratio);
    FeedLocation {
        ratio,
        n_rectifying: n_r,
        n_stripping: n - n_r,
        feed_stage: n_r.round().max(0.0) as u32 + 1,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand calculation: z_F 0.4, x_D 0.98, x_B 0.01 → D/F = 0.39/0.97 = 0.402062,
    /// B/D = 1.487179; (0.6/0.4)·(0.01/0.02)²·1.487179 = 0.557692; ^0.206 = 0.886660.
    #[test]
    fn matches_hand_calculation() {
        let spec = ColumnSpec::new(0.98, 0.01, 0.4, 1.0).unwrap();
        let f = feed_location(&spec, 15.0);
        assert!((f.ratio - 0.886_660).abs() < 1e-6, "{}", f.ratio);
        assert!((f.n_rectifying + f.n_stripping - 15.0).abs() < 1e-12);
    }
}
