//! Anchoring an estimated Lee–Kesler curve to one or two measured (T, p) points.
//!
//! One point: the curve is moved so it passes through the point, keeping the
//! estimated Tc/Tb ratio and pc (so ω is unchanged): a one-dimensional root in
//! Tc. Two points: pc stays, Tc and ω are both solved so the curve passes
//! through both. The report says how far the pure estimate was at each point.
//!
//! Reference: the Lee–Kesler form of [`super::lee_kesler`]; the anchoring rule
//! is this program's own (common practice for converting a reduced-pressure
//! boiling point to another pressure).

use super::lee_kesler::{f0, f1, LeeKeslerCurve};
use super::EstimateError;
use crate::units::ATM_PA;
use crate::vapor::Curve;

/// A measured boiling point: temperature (K) at pressure (Pa).
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct MeasuredPoint {
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
}

/// How one measured point compared with the pure estimate.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct AnchorDeviation {
    /// The measured point.
    pub measured: MeasuredPoint,
    /// Temperature the pure estimate gives at the measured pressure, K.
    pub estimate_t_k: Option<f64>,
    /// estimate − measured, K.
    pub deviation_k: Option<f64>,
}

/// The anchored curve and what changed.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Anchored {
    /// Curve through the measured point(s).
    pub curve: LeeKeslerCurve,
    /// Normal boiling point of the anchored curve, K.
    pub tb_k: f64,
    /// Shift of the normal boiling point from the pure estimate, K.
    pub tb_shift_k: f64,
    /// Per measured point: the pure estimate's deviation.
    pub deviations: Vec<AnchorDeviation>,
}

fn bisect(f: impl Fn(f64) -> f64, mut lo: f64, mut hi: f64) -> Option<f64> {
    let (mut flo, fhi) = (f(lo), f(hi));
    if !(flo.is_finite() && fhi.is_finite()) || flo * fhi > 0.0 {
        return None;
    }
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        let fm = f(mid);
        if !fm.is_finite() {
            return None;
        }
        if (fm < 0.0) == (flo < 0.0) {
            lo = mid;
            flo = fm;
        } else {
            hi = mid;
        }
        if hi - lo < 1e-10 * hi {
            break;
        }
    }
    Some(0.5 * (lo + hi))
}

fn check(p: &MeasuredPoint) -> Result<(), EstimateError> {
    if !(p.t_k > 0.0 && p.p_pa > 0.0 && p.t_k.is_finite() && p.p_pa.is_finite()) {
        return Err(EstimateError::Anchor(format!(
            "measured point {} K at {} Pa is not a positive finite temperature and pressure",
            p.t_k, p.p_pa
        )));
    }
    Ok(())
}

/// Anchor `pure` to one or two measured points.
///
/// ```
/// use ebullio::estimate::anchor::{anchor, MeasuredPoint};
/// use ebullio::estimate::lee_kesler::LeeKeslerCurve;
/// use ebullio::vapor::Curve;
/// let pure = LeeKeslerCurve::from_tb(400.0, 600.0, 35e5, None);
/// let pt = MeasuredPoint { t_k: 330.0, p_pa: 2000.0 };
/// let a = anchor(&pure, &[pt]).unwrap();
/// assert!((a.curve.t_at(2000.0).unwrap() - 330.0).abs() < 1e-6);
/// ```
pub fn anchor(pure: &LeeKeslerCurve, points: &[MeasuredPoint]) -> Result<Anchored, EstimateError> {
    for p in points {
        check(p)?;
    }
    let curve = match points {
        [p] => {
            let ratio = pure.tc_k / pure.tb_k;
            let w = pure.omega;
            let ln_pc = pure.pc_pa.ln();
            let g = |tc: f64| ln_pc + f0(p.t_k / tc) + w * f1(p.t_k / tc) - p.p_pa.ln();
            let tc = bisect(g, p.t_k * 1.000_001, p.t_k * 50.0).ok_or_else(|| {
                EstimateError::Anchor(format!(
                    "no Lee–Kesler curve with the estimated pc passes through {:.2} K at {:.4} Pa (is the point above the critical pressure?)",
                    p.t_k, p.p_pa
                ))
            })?;
            LeeKeslerCurve {
                tc_k: tc,
                pc_pa: pure.pc_pa,
                omega: w,
                tb_k: tc / ratio,
                tb_sigma_k: None,
            }
        }
        [p1, p2] => {
            if (p1.t_k - p2.t_k).abs() < 1e-6 || (p1.p_pa - p2.p_pa).abs() < 1e-9 * p1.p_pa {
                return Err(EstimateError::Anchor(
                    "the two measured points must differ in temperature and pressure".into(),
                ));
            }
            let ln_pc = pure.pc_pa.ln();
            let om = |p: &MeasuredPoint, tc: f64| {
                ((p.p_pa.ln() - ln_pc) - f0(p.t_k / tc)) / f1(p.t_k / tc)
            };
            let h = |tc: f64| om(p1, tc) - om(p2, tc);
            let lo = p1.t_k.max(p2.t_k) * 1.0001;
            // Scan for a sign change (ω from each point equal), closest to the pure Tc.
            let mut best: Option<f64> = None;
            let steps = 400;
            let hi = lo * 20.0;
            let mut prev = (lo, h(lo));
            for s in 1..=steps {
                let tc = lo + (hi - lo) * s as f64 / steps as f64;
                let v = h(tc);
                if prev.1.is_finite() && v.is_finite() && prev.1 * v <= 0.0 {
                    if let Some(root) = bisect(h, prev.0, tc) {
                        let better = best
                            .is_none_or(|b: f64| (root - pure.tc_k).abs() < (b - pure.tc_k).abs());
                        if better {
                            best = Some(root);
                        }
                    }
                }
                prev = (tc, v);
            }
            let tc = best.ok_or_else(|| {
                EstimateError::Anchor(
                    "no Lee–Kesler curve with the estimated pc passes through both measured points"
                        .into(),
                )
            })?;
            let w = om(p1, tc);
            let mut c = LeeKeslerCurve {
                tc_k: tc,
                pc_pa: pure.pc_pa,
                omega: w,
                tb_k: f64::NAN,
                tb_sigma_k: None,
            };
            c.tb_k = c.t_at(ATM_PA).ok_or_else(|| {
                EstimateError::Anchor("the anchored curve does not reach 1 atm".into())
            })?;
            c
        }
        _ => {
            return Err(EstimateError::Anchor(format!(
                "anchoring takes one or two measured points, got {}",
                points.len()
            )))
        }
    };
    let deviations = points
        .iter()
        .map(|p| {
            let t = pure.t_at(p.p_pa);
            AnchorDeviation {
                measured: *p,
                estimate_t_k: t,
                deviation_k: t.map(|t| t - p.t_k),
            }
        })
        .collect();
    Ok(Anchored {
        tb_k: curve.tb_k,
        tb_shift_k: curve.tb_k - pure.tb_k,
        curve,
        deviations,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn two_points_recover_the_curve_they_came_from() {
        let truth = LeeKeslerCurve::from_tb(420.0, 640.0, 30e5, None);
        let pts = [
            MeasuredPoint {
                t_k: 330.0,
                p_pa: truth.p_pa(330.0),
            },
            MeasuredPoint {
                t_k: 380.0,
                p_pa: truth.p_pa(380.0),
            },
        ];
        let pure = LeeKeslerCurve::from_tb(400.0, 610.0, 30e5, None);
        let a = anchor(&pure, &pts).unwrap();
        assert!((a.curve.tc_k - 640.0).abs() < 0.01, "{:?}", a.curve);
        assert!((a.tb_k - 420.0).abs() < 0.01);
        assert!((a.curve.omega - truth.omega).abs() < 1e-4);
    }
}
