//! Riedel four-constant form, ln(p/Pa) = A + B/T + C ln T + D T⁶.
//!
//! Reference: L. Riedel, *Chem.-Ing.-Tech.* 26, 83–89 (1954); the four-term
//! form with the T⁶ term as in Poling, Prausnitz & O'Connell, *The Properties
//! of Gases and Liquids*, 5th ed., section 7-3.

use super::equation::VaporEquation;
use serde::{Deserialize, Serialize};

/// ln(p/Pa) = A + B/T + C ln(T/K) + D (T/K)⁶; parameters `[A, B, C, D]`.
/// Linear in its parameters.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Riedel;

impl VaporEquation for Riedel {
    fn name(&self) -> &'static str {
        "riedel"
    }
    fn param_names(&self) -> &'static [&'static str] {
        &["A", "B", "C", "D"]
    }
    fn ln_p(&self, th: &[f64], t: f64) -> f64 {
        if t <= 0.0 {
            return f64::NAN;
        }
        th[0] + th[1] / t + th[2] * t.ln() + th[3] * t.powi(6)
    }
    fn gradient(&self, th: &[f64], t: f64, g: &mut [f64]) -> f64 {
        self.linear_basis(t, g);
        self.ln_p(th, t)
    }
    fn d_ln_p_dt(&self, th: &[f64], t: f64) -> f64 {
        -th[1] / (t * t) + th[2] / t + 6.0 * th[3] * t.powi(5)
    }
    fn linear_basis(&self, t: f64, phi: &mut [f64]) -> Option<f64> {
        phi[0] = 1.0;
        phi[1] = 1.0 / t;
        phi[2] = t.ln();
        phi[3] = t.powi(6);
        Some(0.0)
    }
}
