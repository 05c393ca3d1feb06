//! Underwood's minimum reflux for a binary of constant relative volatility.
//!
//! With α the light component's volatility relative to the heavy one, the
//! root θ (1 < θ < α) of
//!
//! `α·z_F/(α − θ) + (1 − z_F)/(1 − θ) = 1 − q`
//!
//! gives `R_min + 1 = α·x_D/(α − θ) + (1 − x_D)/(1 − θ)`. For a binary this
//! is exact under constant molar overflow and constant α; for a saturated
//! liquid (q = 1) it reduces to the closed form
//! `R_min = [x_D/z_F − α(1 − x_D)/(1 − z_F)]/(α − 1)` ([`closed_form_saturated_liquid`]).
//!
//! Reference: A. J. V. Underwood, "Fractional distillation of multicomponent
//! mixtures", *Chem. Eng. Prog.* 44 (1948) 603–614; the binary closed form as
//! given in separation-process textbooks, e.g. J. D. Seader, E. J. Henley and
//! D. K. Roper, *Separation Process Principles*, 3rd ed., Wiley (2011),
//! chapter on binary distillation (from memory).

use super::{ColumnError, ColumnSpec};
use serde::Serialize;

/// Underwood's result for a binary.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Underwood {
    /// The root θ, between 1 and α.
    pub theta: f64,
    /// Minimum reflux ratio L/D.
    pub r_min: f64,
}

/// Underwood's minimum reflux for `spec` at constant relative volatility `alpha > 1`.
///
/// ```
/// use ebullio::plan::column::{underwood, ColumnSpec};
/// let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
/// let u = underwood::min_reflux(2.5, &spec).unwrap();
/// assert!((u.r_min - 1.1).abs() < 1e-9);
/// ```
pub fn min_reflux(alpha: f64, spec: &ColumnSpec) -> Result<Underwood, ColumnError> {
    if !(alpha.is_finite() && alpha > 1.0) {
        return Err(ColumnError::BadSpec {
            what: "relative volatility",
            value: alpha,
            expected: "a constant α above 1",
        });
    }
    let z = spec.z_f;
    // f rises monotonically from −∞ (θ → 1⁺) to +∞ (θ → α⁻): one root.
    let f = |t: f64| alpha * z / (alpha - t) + (1.0 - z) / (1.0 - t) - (1.0 - spec.q);
    let (mut lo, mut hi) = (1.0, alpha);
    for _ in 0..200 {
        let m = 0.5 * (lo + hi);
        if m <= lo || m >= hi {
            break;
        }
        if f(m) < 0.0 {
            lo = m;
        } else {
            hi = m;
        }
    }
    let theta = 0.5 * (lo + hi);
    let r_min = alpha * spec.x_d / (alpha - theta) + (1.0 - spec.x_d) / (1.0 - theta) - 1.0;
    Ok(Underwood { theta, r_min })
}

/// The binary saturated-liquid closed form `[x_D/z_F − α(1 − x_D)/(1 − z_F)]/(α − 1)`.
pub fn closed_form_saturated_liquid(alpha: f64, x_d: f64, z_f: f64) -> f64 {
    (x_d / z_f - alpha * (1.0 - x_d) / (1.0 - z_f)) / (alpha - 1.0)
}

#[cfg(test)]
mod tests {
    use super::super::super::rayleigh::ConstantAlpha;
    use super::super::min_reflux;
    use super::*;

    /// Underwood's equations for a saturated-liquid feed against the binary
    /// closed form (Underwood 1948; Seader, Henley & Roper, 3rd ed.).
    #[test]
    fn saturated_liquid_matches_closed_form() {
        for alpha in [1.1, 1.8, 2.5, 10.0] {
            for (xd, zf) in [(0.95, 0.5), (0.99, 0.3), (0.999, 0.7), (0.9, 0.1)] {
                let spec = ColumnSpec::new(xd, 0.01, zf, 1.0).unwrap();
                let u = min_reflux(alpha, &spec).unwrap();
                let c = closed_form_saturated_liquid(alpha, xd, zf);
                assert!(
                    (u.r_min - c).abs() < 1e-9 * (1.0 + c),
                    "α {alpha}: {} vs {c}",
                    u.r_min
                );
                assert!(u.theta > 1.0 && u.theta < alpha);
            }
        }
    }

    /// Hand calculation for q = 1: θ solves α z/(α − θ) = −(1 − z)/(1 − θ);
    /// α = 2.5, z = 0.5: 2.5(1 − θ) = −(2.5 − θ) → θ = 5/3.5 = 1.428571.
    #[test]
    fn theta_matches_hand_calculation() {
        let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
        let u = min_reflux(2.5, &spec).unwrap();
        assert!((u.theta - 5.0 / 3.5).abs() < 1e-12);
    }

    /// For a constant-α binary Underwood is exact, so it equals the
    /// McCabe–Thiele feed pinch for any feed condition.
    #[test]
    fn equals_mccabe_thiele_pinch_for_any_q() {
        let eq = ConstantAlpha { alpha: 2.2 };
        for q in [-0.2, 0.0, 0.5, 1.0, 1.3] {
            let spec = ColumnSpec::new(0.97, 0.03, 0.45, q).unwrap();
            let u = min_reflux(2.2, &spec).unwrap();
            let m = min_reflux::min_reflux(&eq, &spec).unwrap();
            assert!(
                (u.r_min - m.r_min).abs() < 1e-7 * (1.0 + u.r_min),
                "q {q}: {} vs {}",
                u.r_min,
                m.r_min
            );
        }
    }

    #[test]
    fn alpha_at_or_below_one_is_an_error() {
        let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
        assert!(min_reflux(1.0, &spec).is_err());
        assert!(min_reflux(f64::NAN, &spec).is_err());
    }
}
