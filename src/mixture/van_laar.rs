//! The van Laar equation (temperature-independent, dimensionless parameters).
//!
//! ln γ1 = A12 (A21 x2)²/(A12 x1 + A21 x2)², ln γ2 = A21 (A12 x1)²/(A12 x1 + A21 x2)²,
//! so ln γ1∞ = A12 and ln γ2∞ = A21. A12 and A21 must have the same sign
//! (otherwise the denominator vanishes inside 0 < x1 < 1).
//!
//! Reference: J. M. Smith, H. C. Van Ness, M. M. Abbott, *Introduction to
//! Chemical Engineering Thermodynamics*, 7th ed., Sec. 12.1 (van Laar equation).

use super::{ActivityModel, MixtureError};

/// The van Laar equation for a binary.
///
/// ```
/// use ebullio::mixture::{ActivityModel, VanLaar};
/// let m = VanLaar::new(0.8, 1.2).unwrap();
/// let [_, g2] = m.ln_gamma(1.0, 350.0);
/// assert!((g2 - 1.2).abs() < 1e-12); // ln γ2∞ = A21
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct VanLaar {
    a12: f64,
    a21: f64,
}

impl VanLaar {
    /// From A12 and A21 (dimensionless, same sign, neither zero unless both are).
    pub fn new(a12: f64, a21: f64) -> Result<Self, MixtureError> {
        for (name, value) in [("A12", a12), ("A21", a21)] {
            if !value.is_finite() {
                return Err(MixtureError::BadParameter {
                    model: "van Laar",
                    name,
                    value,
                    expected: "a finite dimensionless number",
                });
            }
        }
        if a12 * a21 <= 0.0 && !(a12 == 0.0 && a21 == 0.0) {
            return Err(MixtureError::BadParameter {
                model: "van Laar",
                name: "A21",
                value: a21,
                expected: "the same sign as A12 (the equation is singular otherwise)",
            });
        }
        Ok(Self { a12, a21 })
    }
}

impl ActivityModel for VanLaar {
    fn name(&self) -> &'static str {
        "van-laar"
    }

    fn ln_gamma_dx(&self, x1: f64, _t_k: f64) -> ([f64; 2], [f64; 2]) {
        let (a, b) = (self.a12, self.a21);
        if a == 0.0 && b == 0.0 {
            return ([0.0, 0.0], [0.0, 0.0]);
        }
        let x2 = 1.0 - x1;
        let d = a * x1 + b * x2;
        let dd = a - b;
        let (d2, d3) = (d * d, d * d * d);
        (
            [a * b * b * x2 * x2 / d2, b * a * a * x1 * x1 / d2],
            [
                a * b * b * (-2.0 * x2 / d2 - 2.0 * x2 * x2 * dd / d3),
                b * a * a * (2.0 * x1 / d2 - 2.0 * x1 * x1 * dd / d3),
            ],
        )
    }
}
