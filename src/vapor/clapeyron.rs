//! Clausius–Clapeyron two-constant form, ln(p/Pa) = A − B/T.
//!
//! Reference: integrated Clausius–Clapeyron equation with constant ΔHvap
//! (B = ΔHvap/R), e.g. Poling, Prausnitz & O'Connell, *The Properties of Gases
//! and Liquids*, 5th ed., eq. 7-2.1.

use super::equation::VaporEquation;
use serde::{Deserialize, Serialize};

/// ln(p/Pa) = A − B/(T/K); parameters `[A, B]`. Linear in its parameters.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Clapeyron;

impl VaporEquation for Clapeyron {
    fn name(&self) -> &'static str {
        "clapeyron"
    }
    fn param_names(&self) -> &'static [&'static str] {
        &["A", "B"]
    }
    fn ln_p(&self, th: &[f64], t: f64) -> f64 {
        th[0] - th[1] / t
    }
    fn gradient(&self, th: &[f64], t: f64, g: &mut [f64]) -> f64 {
        g[0] = 1.0;
        g[1] = -1.0 / t;
        self.ln_p(th, t)
    }
    fn d_ln_p_dt(&self, th: &[f64], t: f64) -> f64 {
        th[1] / (t * t)
    }
    fn linear_basis(&self, t: f64, phi: &mut [f64]) -> Option<f64> {
        phi[0] = 1.0;
        phi[1] = -1.0 / t;
        Some(0.0)
    }
    /// Closed form T = B/(A − ln p).
    fn t_at(&self, th: &[f64], ln_p: f64, _hint: Option<(f64, f64)>) -> Option<f64> {
        let t = th[1] / (th[0] - ln_p);
        (t.is_finite() && t > 0.0).then_some(t)
    }
}
