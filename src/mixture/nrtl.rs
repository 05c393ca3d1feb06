//! The NRTL equation with user-given binary parameters.
//!
//! τ12 = b12/T, τ21 = b21/T (b in kelvin, (g12 − g22)/R and (g21 − g11)/R),
//! G12 = exp(−α τ12), G21 = exp(−α τ21), α the non-randomness parameter.
//!
//! Reference: H. Renon, J. M. Prausnitz, AIChE J. 14 (1968) 135–144.

use super::{ActivityModel, MixtureError};

/// The NRTL equation for a binary.
///
/// ```
/// use ebullio::mixture::{ActivityModel, Nrtl};
/// let m = Nrtl::new(200.0, 400.0, 0.3).unwrap();
/// let [g1, _] = m.ln_gamma(0.0, 350.0);
/// // At infinite dilution ln γ1 = τ21 + τ12·exp(−α τ12).
/// let (t12, t21) = (200.0 / 350.0, 400.0 / 350.0);
/// assert!((g1 - (t21 + t12 * (-0.3 * t12 as f64).exp())).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Nrtl {
    b12: f64,
    b21: f64,
    alpha: f64,
}

impl Nrtl {
    /// From b12, b21 (K) and α (commonly 0.2–0.47).
    pub fn new(b12_k: f64, b21_k: f64, alpha: f64) -> Result<Self, MixtureError> {
        for (name, value) in [("b12", b12_k), ("b21", b21_k)] {
            if !value.is_finite() {
                return Err(MixtureError::BadParameter {
                    model: "NRTL",
                    name,
                    value,
                    expected: "a finite number in kelvin",
                });
            }
        }
        if !(alpha.is_finite() && alpha > 0.0 && alpha <= 1.0) {
            return Err(MixtureError::BadParameter {
                model: "NRTL",
                name: "alpha",
                value: alpha,
                expected: "a non-randomness parameter above 0 and at most 1",
            });
        }
        Ok(Self {
            b12: b12_k,
            b21: b21_k,
            alpha,
        })
    }
}

impl Nrtl {
    /// The same mixture with the components numbered the other way round.
    pub fn swapped(&self) -> Self {
        Self {
            b12: self.b21,
            b21: self.b12,
            alpha: self.alpha,
        }
    }
}

impl ActivityModel for Nrtl {
    fn name(&self) -> &'static str {
        "nrtl"
    }

    fn ln_gamma_dx(&self, x1: f64, t_k: f64) -> ([f64; 2], [f64; 2]) {
        let (t12, t21) = (self.b12 / t_k, self.b21 / t_k);
        let g12 = (-self.alpha * t12).exp();
        let g21 = (-self.alpha * t21).exp();
        let x2 = 1.0 - x1;
        let a = x1 + x2 * g21;
        let b = x2 + x1 * g12;
        let (da, db) = (1.0 - g21, g12 - 1.0);
        let f1 = t21 * g21 * g21 / (a * a) + t12 * g12 / (b * b);
        let df1 = -2.0 * t21 * g21 * g21 * da / (a * a * a) - 2.0 * t12 * g12 * db / (b * b * b);
        let f2 = t12 * g12 * g12 / (b * b) + t21 * g21 / (a * a);
        let df2 = -2.0 * t12 * g12 * g12 * db / (b * b * b) - 2.0 * t21 * g21 * da / (a * a * a);
        (
            [x2 * x2 * f1, x1 * x1 * f2],
            [
                -2.0 * x2 * f1 + x2 * x2 * df1,
                2.0 * x1 * f2 + x1 * x1 * df2,
            ],
        )
    }
}
