//! A fitted curve rebuilt from a fit report: p(T), T(p) and their delta-method uncertainties.
//!
//! Var(ln p) = gᵀ Σ g with g = ∂ln p/∂θ; the temperature at a pressure has
//! u(T) = u(ln p)/|d ln p/dT| (implicit-function rule).
//!
//! Reference: delta method, e.g. JCGM 100:2008 (GUM), section 5.1.

use super::report::FitReport;
use super::stats::t_quantile;
use crate::vapor::{Curve, Equation, VaporEquation};

/// A fitted equation with its covariance, usable wherever a [`Curve`] is.
#[derive(Debug, Clone, PartialEq)]
pub struct FittedCurve {
    /// The equation (with Tc, pc for Wagner).
    pub equation: Equation,
    /// SI parameters.
    pub theta: Vec<f64>,
    /// Parameter covariance, row-major n×n (empty when unknown).
    pub covariance: Vec<f64>,
    /// Measured temperature range, K.
    pub t_range_k: (f64, f64),
    /// Residual degrees of freedom (for Student t intervals).
    pub dof: usize,
}

impl FittedCurve {
    /// Rebuild from a report (e.g. read back from `fit.json`).
    pub fn from_report(r: &FitReport) -> FittedCurve {
        FittedCurve {
            equation: r.equation,
            theta: r.si_parameters.clone(),
            covariance: r.covariance_si.iter().flatten().copied().collect(),
            t_range_k: (r.t_range_k[0], r.t_range_k[1]),
            dof: r.dof,
        }
    }

    /// ln(p/Pa) and its standard uncertainty at `t_k`.
    pub fn ln_p_with_se(&self, t_k: f64) -> (f64, f64) {
        let n = self.theta.len();
        let (mut stack, mut heap) = ([0.0; 8], Vec::new());
        let g: &mut [f64] = if n <= stack.len() {
            &mut stack[..n]
        } else {
            heap.resize(n, 0.0);
            &mut heap
        };
        let v = self.equation.gradient(&self.theta, t_k, g);
        (v, self.quad(g).sqrt())
    }

    fn quad(&self, g: &[f64]) -> f64 {
        let n = g.len();
        if self.covariance.len() != n * n {
            return f64::NAN;
        }
        let mut s = 0.0;
        for a in 0..n {
            for b in 0..n {
                s += g[a] * self.covariance[a * n + b] * g[b];
            }
        }
        s.max(0.0)
    }

    /// Temperature at `p_pa` and its standard uncertainty, K.
    pub fn t_at_with_se(&self, p_pa: f64) -> Option<(f64, f64)> {
        let t = self.t_at(p_pa)?;
        let (_, se) = self.ln_p_with_se(t);
        let slope = self.equation.d_ln_p_dt(&self.theta, t);
        Some((t, se / slope.abs()))
    }

    /// Two-sided 95 % Student t factor for this fit's degrees of freedom.
    pub fn t95(&self) -> f64 {
        t_quantile(0.975, self.dof)
    }

    /// Kelvin outside the measured range (0 inside).
    pub fn extrapolation_k(&self, t_k: f64) -> f64 {
        let (lo, hi) = self.t_range_k;
        (lo - t_k).max(t_k - hi).max(0.0)
    }
}

impl Curve for FittedCurve {
    fn ln_p(&self, t_k: f64) -> f64 {
        self.equation.ln_p(&self.theta, t_k)
    }
    fn d_ln_p_dt(&self, t_k: f64) -> f64 {
        self.equation.d_ln_p_dt(&self.theta, t_k)
    }
    fn valid_range_k(&self) -> Option<(f64, f64)> {
        Some(self.t_range_k)
    }
    fn t_uncertainty_k(&self, p_pa: f64) -> Option<f64> {
        self.t_at_with_se(p_pa)
            .map(|(_, se)| se)
            .filter(|s| s.is_finite())
    }
    fn t_at(&self, p_pa: f64) -> Option<f64> {
        if !(p_pa > 0.0 && p_pa.is_finite()) {
            return None;
        }
        let (lo, hi) = self.t_range_k;
        let span = (hi - lo).max(1.0);
        self.equation.t_at(
            &self.theta,
            p_pa.ln(),
            Some(((lo - span).max(1.0), hi + span)),
        )
    }
}
