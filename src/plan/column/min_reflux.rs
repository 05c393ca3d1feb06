//! Minimum reflux from the pinch: where an operating line first touches the equilibrium curve.
//!
//! As the reflux ratio falls, both operating lines swing up towards the
//! equilibrium curve (they pivot on `(x_D, x_D)` and `(x_B, x_B)` and meet on
//! the feed line). The minimum reflux is the smallest ratio at which they
//! still lie below the curve everywhere between the bottoms and the
//! distillate; there the stages would be infinite (a pinch). For a curve
//! without an inflection the pinch is where the feed line meets the curve:
//! `R_min = (x_D − y*)/(y* − x*)`. A curve with an inflection (a strongly
//! non-ideal mixture) can be touched first elsewhere, tangentially, in either
//! section (a tangent pinch), which gives a larger R_min. Both are found here
//! by bisection on R of the smallest gap between curve and operating lines.
//!
//! Reference: McCabe & Thiele, *Ind. Eng. Chem.* 17 (1925) 605–611; the
//! tangent pinch as treated in unit-operations textbooks, e.g. McCabe, Smith &
//! Harriott, *Unit Operations of Chemical Engineering*, on minimum reflux for
//! non-ideal systems (from memory).

use super::super::rayleigh::Equilibrium;
use super::operating::{q_line, OperatingLines};
use super::sampled::Sampled;
use super::{ColumnError, ColumnSpec};
use serde::Serialize;

/// Where the minimum-reflux pinch lies.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum PinchKind {
    /// Where the feed line meets the curve.
    Feed,
    /// Tangent to the curve in the rectifying section.
    TangentRectifying,
    /// Tangent to the curve in the stripping section.
    TangentStripping,
}

/// The minimum reflux ratio and its pinch.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct MinReflux {
    /// Minimum reflux ratio L/D (0 when any reflux will do).
    pub r_min: f64,
    /// Where the pinch lies.
    pub kind: PinchKind,
    /// Liquid light fraction at the pinch.
    pub pinch_x: f64,
    /// Vapor light fraction at the pinch.
    pub pinch_y: f64,
    /// The ratio a feed pinch alone would give (equal to `r_min` unless the pinch is tangent).
    pub feed_pinch_r: f64,
}

/// Largest gap deficit still counted as touching (mole fraction).
const TOUCH: f64 = 1e-9;

/// The minimum reflux of `spec` on `eq`.
///
/// ```
/// use ebullio::plan::column::{min_reflux::{min_reflux, PinchKind}, ColumnSpec};
/// use ebullio::plan::rayleigh::ConstantAlpha;
/// let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
/// let m = min_reflux(&ConstantAlpha { alpha: 2.5 }, &spec).unwrap();
/// assert_eq!(m.kind, PinchKind::Feed);
/// // [x_D/x_F − α(1 − x_D)/(1 − x_F)]/(α − 1) = (1.9 − 0.25)/1.5 = 1.1
/// assert!((m.r_min - 1.1).abs() < 1e-9);
/// ```
pub fn min_reflux(eq: &dyn Equilibrium, spec: &ColumnSpec) -> Result<MinReflux, ColumnError> {
    let s = Sampled::new(eq, spec.x_b, spec.x_d)?;
    s.check_above_diagonal()?;
    let (xf, yf) = feed_line_meets_curve(&s, spec)?;
    let feed_r = (spec.x_d - yf) / (yf - xf);
    // The lowest ratio the operating lines can take at all.
    let floor = if spec.q > 0.0 { 0.0 } else { -spec.q + 1e-9 };
    let r_lo = feed_r.max(floor);
    let gap = |r: f64| -> Result<(f64, f64), ColumnError> {
        let ops = OperatingLines::new(spec, r)?;
        s.min_gap(|x, y| y - ops.y(x))
    };
    let (_, g_lo) = gap(r_lo)?;
    if g_lo >= -TOUCH {
        let (kind, px, py) = if feed_r >= floor {
            (PinchKind::Feed, xf, yf)
        } else {
            // Even the lowest ratio clears the curve: no pinch constrains it.
            let ops = OperatingLines::new(spec, r_lo)?;
            (PinchKind::Feed, ops.x_int, ops.y_int)
        };
        return Ok(MinReflux {
            r_min: r_lo,
            kind,
            pinch_x: px,
            pinch_y: py,
            feed_pinch_r: feed_r,
        });
    }
    // A tangent pinch: bracket, then bisect on the sign of the smallest gap.
    let mut lo = r_lo;
    let mut hi = (2.0 * r_lo).max(1.0);
    while gap(hi)?.1 < 0.0 {
        lo = hi;
        hi *= 2.0;
        if hi > 1e9 {
            return Err(ColumnError::TooManyStages {
                limit: super::MAX_STAGES,
            });
        }
    }
    for _ in 0..100 {
        let m = 0.5 * (lo + hi);
        if (hi - lo) <= 1e-12 * hi {
            break;
        }
        if gap(m)?.1 < 0.0 {
            lo = m;
        } else {
            hi = m;
        }
    }
    let ops = OperatingLines::new(spec, hi)?;
    let (px, _) = s.min_gap(|x, y| y - ops.y(x))?;
    let kind = if px >= ops.x_int {
        PinchKind::TangentRectifying
    } else {
        PinchKind::TangentStripping
    };
    Ok(MinReflux {
        r_min: hi,
        kind,
        pinch_x: px,
        pinch_y: s.y(px)?,
        feed_pinch_r: feed_r,
    })
}

/// Where the feed line meets the equilibrium curve, `(x*, y*)`.
fn feed_line_meets_curve(s: &Sampled, spec: &ColumnSpec) -> Result<(f64, f64), ColumnError> {
    let outside = ColumnError::FeedLineOutside { q: spec.q };
    let h = |x: f64, y: f64| q_line(spec, x).map_or(0.0, |ql| y - ql);
    if q_line(spec, spec.z_f).is_none() {
        return Ok((spec.z_f, s.y(spec.z_f)?));
    }
    // Above the feed point the curve lies above the line; walk the grid away
    // from z_F (down for q < 1, up for q > 1) to the first sign change.
    let pts: Vec<(f64, f64)> = s.points().collect();
    let mut prev = (spec.z_f, s.y(spec.z_f)?);
    let walk: Box<dyn Iterator<Item = &(f64, f64)>> = if spec.q < 1.0 {
        Box::new(pts.iter().rev().filter(|p| p.0 < spec.z_f))
    } else {
        Box::new(pts.iter().filter(|p| p.0 > spec.z_f))
    };
    for &(x, y) in walk {
        if h(x, y) <= 0.0 {
            let (mut a, mut b) = (prev.0, x); // h(a) > 0 ≥ h(b)
            for _ in 0..100 {
                let m = 0.5 * (a + b);
                if h(m, s.y(m)?) > 0.0 {
                    a = m;
                } else {
                    b = m;
                }
            }
            let xm = 0.5 * (a + b);
            return Ok((xm, s.y(xm)?));
        }
        prev = (x, y);
    }
    Err(outside)
}

#[cfg(test)]
pub(crate) mod tests {
    use super::super::super::rayleigh::ConstantAlpha;
    use super::super::super::PlanError;
    use super::super::mccabe_thiele;
    use super::*;

    /// A two-suffix Margules liquid (`ln γ₁ = A(1 − x)²`, `ln γ₂ = A x²`) with a
    /// constant pure-component vapor-pressure ratio `alpha0`: an inflected
    /// curve, azeotropic when `|ln alpha0| < A`, at `x = (1 + ln alpha0 / A)/2`.
    /// (Margules' equation as in any thermodynamics text; the parameters are made up.)
    pub(crate) struct Margules {
        pub alpha0: f64,
        pub a: f64,
    }
    impl Equilibrium for Margules {
        fn y(&self, x: f64) -> Result<f64, PlanError> {
            let g1 = (self.a * (1.0 - x).powi(2)).exp();
            let g2 = (self.a * x * x).exp();
            let num = self.alpha0 * g1 * x;
            Ok(num / (num + g2 * (1.0 - x)))
        }
        fn t_k(&self, _x: f64) -> Result<Option<f64>, PlanError> {
            Ok(None)
        }
        fn model(&self) -> &'static str {
            "margules-test"
        }
    }

    /// Feed pinch on a constant-α curve against the closed form of the
    /// binary saturated-liquid case (Underwood, Chem. Eng. Prog. 44 (1948) 603;
    /// equal to the feed-pinch construction of McCabe & Thiele 1925).
    #[test]
    fn constant_alpha_feed_pinch_matches_closed_form() {
        for alpha in [1.3, 2.5, 7.0] {
            for (xd, xb, zf) in [(0.95, 0.05, 0.5), (0.99, 0.01, 0.3), (0.999, 0.2, 0.6)] {
                let spec = ColumnSpec::new(xd, xb, zf, 1.0).unwrap();
                let m = min_reflux(&ConstantAlpha { alpha }, &spec).unwrap();
                let closed = (xd / zf - alpha * (1.0 - xd) / (1.0 - zf)) / (alpha - 1.0);
                assert_eq!(m.kind, PinchKind::Feed);
                assert!(
                    (m.r_min - closed).abs() < 1e-9 * (1.0 + closed),
                    "{alpha} {xd}"
                );
            }
        }
    }

    #[test]
    fn feed_line_intersection_lies_on_both_lines_for_any_q() {
        let eq = ConstantAlpha { alpha: 2.5 };
        for q in [-0.2, 0.0, 0.5, 1.4] {
            let spec = ColumnSpec::new(0.95, 0.05, 0.5, q).unwrap();
            let m = min_reflux(&eq, &spec).unwrap();
            assert!((m.pinch_y - eq.y(m.pinch_x).unwrap()).abs() < 1e-12);
            assert!(
                (m.pinch_y - q_line(&spec, m.pinch_x).unwrap()).abs() < 1e-9,
                "q {q}"
            );
        }
    }

    /// A tangent pinch: on an inflected curve (Margules A = 1.4, α₀ = 4.5, no
    /// azeotrope since ln 4.5 > 1.4) the rectifying line touches the curve
    /// above the feed before it reaches the feed line. At R_min the line from
    /// (x_D, x_D) to the pinch has the curve's slope there.
    #[test]
    fn inflected_curve_gives_a_tangent_pinch_above_the_feed() {
        let eq = Margules {
            alpha0: 4.5,
            a: 1.4,
        };
        let spec = ColumnSpec::new(0.95, 0.02, 0.2, 1.0).unwrap();
        let m = min_reflux(&eq, &spec).unwrap();
        assert_eq!(m.kind, PinchKind::TangentRectifying, "{m:?}");
        assert!(m.r_min > m.feed_pinch_r * 1.05, "{m:?}");
        assert!(m.pinch_x > 0.3 && m.pinch_x < 0.95);
        let slope_line = (spec.x_d - m.pinch_y) / (spec.x_d - m.pinch_x);
        let h = 1e-6;
        let dydx = (eq.y(m.pinch_x + h).unwrap() - eq.y(m.pinch_x - h).unwrap()) / (2.0 * h);
        assert!((slope_line - dydx).abs() < 1e-5, "{slope_line} vs {dydx}");
        assert!((slope_line - m.r_min / (m.r_min + 1.0)).abs() < 1e-9);
        // Stepping works just above R_min and pinches just below it.
        assert!(mccabe_thiele::at_reflux(&eq, &spec, 1.02 * m.r_min).is_ok());
        assert!(mccabe_thiele::at_reflux(&eq, &spec, 0.98 * m.r_min).is_err());
        // The feed-pinch ratio alone would cross the curve.
        assert!(mccabe_thiele::at_reflux(&eq, &spec, m.feed_pinch_r * 1.01).is_err());
    }

    /// The mirror case: a curve that is inflected near the bottom gives a
    /// tangent pinch in the stripping section.
    #[test]
    fn mirrored_curve_gives_a_tangent_pinch_below_the_feed() {
        struct Mirror(Margules);
        impl Equilibrium for Mirror {
            fn y(&self, x: f64) -> Result<f64, PlanError> {
                // Made up: hugs the diagonal at the bottom (α(0) = α₀/e^A ≈ 1.11)
                // and is steep at the top (α(1) = α₀·e^A ≈ 18).
                let g1 = (self.0.a * (1.0 - x).powi(2)).exp();
                let g2 = (self.0.a * x * x).exp();
                let num = self.0.alpha0 * g2 * x;
                Ok(num / (num + g1 * (1.0 - x)))
            }
            fn t_k(&self, _x: f64) -> Result<Option<f64>, PlanError> {
                Ok(None)
            }
            fn model(&self) -> &'static str {
                "mirror-test"
            }
        }
        let eq = Mirror(Margules {
            alpha0: 4.5,
            a: 1.4,
        });
        let spec = ColumnSpec::new(0.98, 0.02, 0.5, 1.0).unwrap();
        let m = min_reflux(&eq, &spec).unwrap();
        assert_eq!(m.kind, PinchKind::TangentStripping, "{m:?}");
        assert!(m.pinch_x < 0.5 && m.r_min > m.feed_pinch_r * 1.05);
        // Tangency: the stripping line from (x_B, x_B) has the curve's slope at the pinch.
        let slope_line = (m.pinch_y - spec.x_b) / (m.pinch_x - spec.x_b);
        let h = 1e-6;
        let dydx = (eq.y(m.pinch_x + h).unwrap() - eq.y(m.pinch_x - h).unwrap()) / (2.0 * h);
        assert!((slope_line - dydx).abs() < 1e-5, "{slope_line} vs {dydx}");
        assert!(mccabe_thiele::at_reflux(&eq, &spec, 1.02 * m.r_min).is_ok());
    }

    /// Past a (made-up) Margules azeotrope at x = (1 + ln 2.3 / 1.4)/2 = 0.7974
    /// the target is unreachable, and the place is named.
    #[test]
    fn target_beyond_an_azeotrope_is_refused_with_its_place() {
        let eq = Margules {
            alpha0: 2.3,
            a: 1.4,
        };
        let spec = ColumnSpec::new(0.95, 0.02, 0.3, 1.0).unwrap();
        let x_az = (1.0 + 2.3f64.ln() / 1.4) / 2.0;
        for e in [
            min_reflux(&eq, &spec).unwrap_err(),
            mccabe_thiele::total_reflux(&eq, &spec).unwrap_err(),
        ] {
            match e {
                ColumnError::CurveMeetsDiagonal { x, y } => {
                    assert!((x - x_az).abs() < 1e-9 && (y - x).abs() < 1e-9)
                }
                other => panic!("{other:?}"),
            }
        }
        // Below the azeotrope the column works.
        let below = ColumnSpec::new(0.75, 0.02, 0.3, 1.0).unwrap();
        assert!(min_reflux(&eq, &below).is_ok());
    }
}
