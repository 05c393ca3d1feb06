//! Antoine equation in the SI fitting form, ln(p/Pa) = A − B/(T/K + C).
//!
//! Constants are fitted in this form and reported in any convention through
//! [`crate::vapor::convert::exact`] (see [`Antoine::constants`]).
//!
//! Reference: C. Antoine, *Comptes Rendus* 107, 681–684 (1888); form as in
//! Poling, Prausnitz & O'Connell, *The Properties of Gases and Liquids*, 5th
//! ed., eq. 7-3.1.

use super::equation::VaporEquation;
use super::{AntoineConstants, AntoineConvention};
use serde::{Deserialize, Serialize};

/// ln(p/Pa) = A − B/(T/K + C); parameters `[A, B, C]` (B, C in K).
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Antoine;

impl Antoine {
    /// The SI parameters as [`AntoineConstants`] converted exactly to `to`.
    ///
    /// ```
    /// use ebullio::vapor::{Antoine, Curve};
    /// let k = Antoine::constants(&[21.0, 3000.0, -50.0], "log10,mmHg,degC".parse().unwrap());
    /// assert!((k.c - 223.15).abs() < 1e-9);
    /// assert!((k.ln_p(350.0) - (21.0 - 3000.0 / 300.0)).abs() < 1e-12);
    /// ```
    pub fn constants(theta: &[f64], to: AntoineConvention) -> AntoineConstants {
        let si = AntoineConstants::new(theta[0], theta[1], theta[2], AntoineConvention::SI);
        super::convert::exact(&si, to)
    }
}

impl VaporEquation for Antoine {
    fn name(&self) -> &'static str {
        "antoine"
    }
    fn param_names(&self) -> &'static [&'static str] {
        &["A", "B", "C"]
    }
    fn ln_p(&self, th: &[f64], t: f64) -> f64 {
        let den = t + th[2];
        if den <= 0.0 {
            return f64::NAN;
        }
        th[0] - th[1] / den
    }
    fn gradient(&self, th: &[f64], t: f64, g: &mut [f64]) -> f64 {
        let den = t + th[2];
        g[0] = 1.0;
        g[1] = -1.0 / den;
        g[2] = th[1] / (den * den);
        if den <= 0.0 {
            return f64::NAN;
        }
        th[0] - th[1] / den
    }
    fn d_ln_p_dt(&self, th: &[f64], t: f64) -> f64 {
        let den = t + th[2];
        th[1] / (den * den)
    }
    /// Closed form T = B/(A − ln p) − C.
    fn t_at(&self, th: &[f64], ln_p: f64, _hint: Option<(f64, f64)>) -> Option<f64> {
        if th[1] <= 0.0 || ln_p >= th[0] {
            return None;
        }
        let t = th[1] / (th[0] - ln_p) - th[2];
        (t.is_finite() && t > 0.0 && t + th[2] > 0.0).then_some(t)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Antoine is nonlinear in C, so it offers no linear basis: the fitter must iterate,
    // not solve it as linear (issue 22: the default `linear_basis` → `Some(1.0)` went
    // unnoticed by the library tests).
    #[test]
    fn antoine_has_no_linear_basis() {
        let mut phi = [0.0; 3];
        assert_eq!(Antoine.linear_basis(350.0, &mut phi), None);
    }
}
