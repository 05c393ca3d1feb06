//! The two-parameter Margules equation (temperature-independent, dimensionless).
//!
//! G^E/(RT x1 x2) = A21 x1 + A12 x2, so ln γ1 = x2²[A12 + 2(A21 − A12) x1],
//! ln γ2 = x1²[A21 + 2(A12 − A21) x2], and ln γ1∞ = A12, ln γ2∞ = A21.
//!
//! Reference: J. M. Smith, H. C. Van Ness, M. M. Abbott, *Introduction to
//! Chemical Engineering Thermodynamics*, 7th ed., Sec. 12.1 (Margules equation).

use super::{ActivityModel, MixtureError};

/// The two-parameter Margules equation for a binary.
///
/// ```
/// use ebullio::mixture::{ActivityModel, Margules};
/// let m = Margules::new(0.8, 1.2).unwrap();
/// let [g1, _] = m.ln_gamma(0.0, 350.0);
/// assert!((g1 - 0.8).abs() < 1e-12); // ln γ1∞ = A12
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Margules {
    a12: f64,
    a21: f64,
}

impl Margules {
    /// From A12 and A21 (dimensionless, ln γ∞ of component 1 and 2).
    pub fn new(a12: f64, a21: f64) -> Result<Self, MixtureError> {
        for (name, value) in [("A12", a12), ("A21", a21)] {
            if !value.is_finite() {
                return Err(MixtureError::BadParameter {
                    model: "Margules",
                    name,
                    value,
                    expected: "a finite dimensionless number",
                });
            }
        }
        Ok(Self { a12, a21 })
    }
}

impl ActivityModel for Margules {
    fn name(&self) -> &'static str {
        "margules"
    }

    fn ln_gamma_dx(&self, x1: f64, _t_k: f64) -> ([f64; 2], [f64; 2]) {
        let (a, b) = (self.a12, self.a21);
        let x2 = 1.0 - x1;
        let f1 = a + 2.0 * (b - a) * x1;
        let f2 = b + 2.0 * (a - b) * x2;
        (
            [x2 * x2 * f1, x1 * x1 * f2],
            [
                -2.0 * x2 * f1 + x2 * x2 * 2.0 * (b - a),
                2.0 * x1 * f2 - x1 * x1 * 2.0 * (a - b),
            ],
        )
    }
}
