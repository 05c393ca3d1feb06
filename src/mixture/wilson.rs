//! The Wilson equation with user-given binary parameters.
//!
//! Λ12 = (v2/v1)·exp(−a12/T), Λ21 = (v1/v2)·exp(−a21/T), with a12, a21 in
//! kelvin ((λ12 − λ11)/R and (λ21 − λ22)/R) and v1, v2 the liquid molar
//! volumes (any one unit; their ratio only). With the volumes left at 1 the
//! ratio is folded into the a's.
//!
//! Reference: G. M. Wilson, J. Am. Chem. Soc. 86 (1964) 127–130.

use super::{ActivityModel, MixtureError};

/// Wilson's equation for a binary.
///
/// ```
/// use ebullio::mixture::{ActivityModel, Wilson};
/// let w = Wilson::new(300.0, 500.0, [1.0, 1.0]).unwrap();
/// let [g1, g2] = w.ln_gamma(0.5, 350.0);
/// assert!(g1 > 0.0 && g2 > 0.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Wilson {
    a12: f64,
    a21: f64,
    v: [f64; 2],
}

impl Wilson {
    /// From a12, a21 (K) and the molar volumes `[v1, v2]` (same unit; `[1, 1]` to fold them in).
    pub fn new(a12_k: f64, a21_k: f64, v: [f64; 2]) -> Result<Self, MixtureError> {
        for (name, value) in [("a12", a12_k), ("a21", a21_k)] {
            if !value.is_finite() {
                return Err(MixtureError::BadParameter {
                    model: "Wilson",
                    name,
                    value,
                    expected: "a finite number in kelvin",
                });
            }
        }
        for (name, value) in [("v1", v[0]), ("v2", v[1])] {
            if !(value.is_finite() && value > 0.0) {
                return Err(MixtureError::BadParameter {
                    model: "Wilson",
                    name,
                    value,
                    expected: "a positive molar volume",
                });
            }
        }
        Ok(Self {
            a12: a12_k,
            a21: a21_k,
            v,
        })
    }

    /// The same mixture with the components numbered the other way round.
    pub fn swapped(&self) -> Self {
        Self {
            a12: self.a21,
            a21: self.a12,
            v: [self.v[1], self.v[0]],
        }
    }

    /// [Λ12, Λ21] at `t_k`.
    pub fn lambdas(&self, t_k: f64) -> [f64; 2] {
        [
            self.v[1] / self.v[0] * (-self.a12 / t_k).exp(),
            self.v[0] / self.v[1] * (-self.a21 / t_k).exp(),
        ]
    }
}

impl ActivityModel for Wilson {
    fn name(&self) -> &'static str {
        "wilson"
    }

    fn ln_gamma_dx(&self, x1: f64, t_k: f64) -> ([f64; 2], [f64; 2]) {
        let [l12, l21] = self.lambdas(t_k);
        let x2 = 1.0 - x1;
        let s1 = x1 + l12 * x2;
        let s2 = x2 + l21 * x1;
        let d = l12 / s1 - l21 / s2;
        let ds1 = 1.0 - l12;
        let ds2 = l21 - 1.0;
        let dd = -l12 * ds1 / (s1 * s1) + l21 * ds2 / (s2 * s2);
        let g1 = -s1.ln() + x2 * d;
        let g2 = -s2.ln() - x1 * d;
        let dg1 = -ds1 / s1 - d + x2 * dd;
        let dg2 = -ds2 / s2 - d - x1 * dd;
        ([g1, g2], [dg1, dg2])
    }

    /// Wilson's equation cannot describe two liquid phases.
    fn can_split(&self) -> bool {
        false
    }
}
