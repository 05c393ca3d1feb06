//! Generic weighted nonlinear least squares: Levenberg–Marquardt plus covariance.
//!
//! The solver minimises Σ ((y_i − f_i(θ))/σ_i)². The levenberg-marquardt crate
//! has no weights, so every residual and Jacobian row is divided by σ_i here.
//! The covariance is s²(JᵀJ)⁻¹ with s² = RSS/(m − n), formed from a singular
//! value decomposition of the column-scaled Jacobian for conditioning.
//! Termination is data ([`Termination`]), never a panic or a silent number.
//!
//! Reference: J. J. Moré, "The Levenberg–Marquardt algorithm: implementation
//! and theory", Lecture Notes in Mathematics 630 (1978); covariance definition
//! as on the NIST StRD nonlinear regression certification page.

use super::svd::thin_svd;
use levenberg_marquardt::{LeastSquaresProblem, LevenbergMarquardt, MinimizationReport};
use nalgebra::allocator::{Allocator, Reallocator};
use nalgebra::{
    Const, DMatrix, DVector, DefaultAllocator, Dim, DimMax, DimMaximum, DimMin, Dyn, OMatrix,
    OVector, Owned,
};

/// A least-squares model: observations y_i and model values f_i(θ) with gradients.
pub trait Problem {
    /// Number of observations m.
    fn n_obs(&self) -> usize;
    /// Number of parameters n.
    fn n_params(&self) -> usize;
    /// Observed value y_i.
    fn observed(&self, i: usize) -> f64;
    /// Model value f_i(θ), writing ∂f_i/∂θ into `grad`.
    fn model(&self, i: usize, theta: &[f64], grad: &mut [f64]) -> f64;
    /// Model value f_i(θ) alone; override when it is cheaper than [`Problem::model`].
    fn value(&self, i: usize, theta: &[f64]) -> f64 {
        with_grad(theta.len(), |g| self.model(i, theta, g))
    }
}

pub use super::termination::{StopReason, Termination};

/// Result of a least-squares solve.
#[derive(Debug, Clone)]
pub struct LsqResult {
    /// Parameters at the solver's best point.
    pub theta: Vec<f64>,
    /// Weighted residuals r_i = (y_i − f_i)/σ_i at `theta`.
    pub residuals: Vec<f64>,
    /// Weighted residual sum of squares.
    pub rss: f64,
    /// Degrees of freedom m − n.
    pub dof: usize,
    /// (JᵀJ)⁻¹ of the weighted Jacobian (unscaled by s²); `None` if singular.
    pub jtj_inv: Option<DMatrix<f64>>,
    /// Leverages h_ii of the weighted Jacobian.
    pub leverage: Vec<f64>,
    /// How the solver stopped.
    pub termination: Termination,
}

impl LsqResult {
    /// s² = RSS/(m − n) (NaN when m = n).
    pub fn s2(&self) -> f64 {
        if self.dof == 0 {
            f64::NAN
        } else {
            self.rss / self.dof as f64
        }
    }
    /// Covariance s²(JᵀJ)⁻¹.
    pub fn covariance(&self) -> Option<DMatrix<f64>> {
        self.jtj_inv.as_ref().map(|m| m * self.s2())
    }
    /// Standard errors sqrt(diag(s²(JᵀJ)⁻¹)).
    pub fn std_errors(&self) -> Option<Vec<f64>> {
        self.covariance()
            .map(|c| (0..c.nrows()).map(|i| c[(i, i)].max(0.0).sqrt()).collect())
    }
}

struct Wrapped<'a, P: Problem, N: Dim>
where
    DefaultAllocator: Allocator<N>,
{
    p: &'a P,
    sigma: &'a [f64],
    theta: OVector<f64, N>,
}

/// Up to this many parameters the per-point gradient lives on the stack.
const STACK_PARAMS: usize = 16;

/// Calls `f` with a zeroed scratch gradient of length `n` (stack for small n).
fn with_grad<R>(n: usize, f: impl FnOnce(&mut [f64]) -> R) -> R {
    if n <= STACK_PARAMS {
        let mut buf = [0.0; STACK_PARAMS];
        f(&mut buf[..n])
    } else {
        f(&mut vec![0.0; n])
    }
}

impl<P: Problem, N: Dim> LeastSquaresProblem<f64, Dyn, N> for Wrapped<'_, P, N>
where
    DefaultAllocator: Allocator<N> + Allocator<Dyn> + Allocator<Dyn, N>,
{
    type ResidualStorage = Owned<f64, Dyn>;
    type JacobianStorage = Owned<f64, Dyn, N>;
    type ParameterStorage = Owned<f64, N>;

    fn set_params(&mut self, x: &OVector<f64, N>) {
        self.theta.copy_from(x);
    }
    fn params(&self) -> OVector<f64, N> {
        self.theta.clone()
    }
    fn residuals(&self) -> Option<DVector<f64>> {
        let th = self.theta.as_slice();
        let r: Vec<f64> = (0..self.p.n_obs())
            .map(|i| (self.p.observed(i) - self.p.value(i, th)) / self.sigma[i])
            .collect();
        r.iter()
            .all(|v| v.is_finite())
            .then(|| DVector::from_vec(r))
    }
    fn jacobian(&self) -> Option<OMatrix<f64, Dyn, N>> {
        let (rows, cols) = (Dyn(self.p.n_obs()), self.theta.shape_generic().0);
        let mut j = OMatrix::<f64, Dyn, N>::zeros_generic(rows, cols);
        fill_weighted_jacobian(self.p, self.sigma, self.theta.as_slice(), |i, k, v| {
            j[(i, k)] = v
        });
        Some(j)
    }
}

/// Jacobian of the weighted residuals: J_ij = −(∂f_i/∂θ_j)/σ_i, written through `set`.
fn fill_weighted_jacobian<P: Problem>(
    p: &P,
    sigma: &[f64],
    theta: &[f64],
    mut set: impl FnMut(usize, usize, f64),
) {
    let n = theta.len();
    with_grad(n, |g| {
        for i in 0..p.n_obs() {
            p.model(i, theta, g);
            for k in 0..n {
                set(i, k, -g[k] / sigma[i]);
            }
        }
    })
}

/// Jacobian of the weighted residuals as a dynamic matrix.
fn weighted_jacobian<P: Problem>(p: &P, sigma: &[f64], theta: &[f64]) -> DMatrix<f64> {
    let mut j = DMatrix::zeros(p.n_obs(), theta.len());
    fill_weighted_jacobian(p, sigma, theta, |i, k, v| j[(i, k)] = v);
    j
}

/// Solver settings.
#[derive(Debug, Clone, Copy)]
pub struct Settings {
    /// Patience: the crate stops after patience·(n+1) evaluations.
    pub patience: usize,
    /// Relative tolerance on the objective and the step (ftol = xtol).
    pub tol: f64,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            patience: 500,
            tol: 30.0 * f64::EPSILON,
        }
    }
}

/// Minimise from `start` with standard uncertainties `sigma` (one per observation).
pub fn solve<P: Problem>(p: &P, sigma: &[f64], start: &[f64], s: Settings) -> LsqResult {
    // Fixed-size parameter vectors keep the solver's n-sized work off the heap
    // for the vapor-pressure equations (2–4 constants); the arithmetic is the same.
    let (theta, report) = match start.len() {
        2 => minimize(p, sigma, start, s, Const::<2>),
        3 => minimize(p, sigma, start, s, Const::<3>),
        4 => minimize(p, sigma, start, s, Const::<4>),
        n => minimize(p, sigma, start, s, Dyn(n)),
    };
    let finite = theta.iter().all(|v| v.is_finite());
    let termination = Termination {
        reason: StopReason::from_solver(&report.termination, finite),
        evaluations: report.number_of_evaluations,
    };
    finish(p, sigma, theta, termination)
}

fn minimize<P: Problem, N: Dim>(
    p: &P,
    sigma: &[f64],
    start: &[f64],
    s: Settings,
    n: N,
) -> (Vec<f64>, MinimizationReport<f64>)
where
    Dyn: DimMin<N> + DimMax<N>,
    DefaultAllocator: Allocator<N>
        + Allocator<Dyn, N>
        + Allocator<DimMaximum<Dyn, N>, N>
        + Reallocator<f64, Dyn, N, DimMaximum<Dyn, N>, N>,
{
    let w = Wrapped {
        p,
        sigma,
        theta: OVector::<f64, N>::from_iterator_generic(n, Const::<1>, start.iter().copied()),
    };
    let lm = LevenbergMarquardt::new()
        .with_ftol(s.tol)
        .with_xtol(s.tol)
        .with_patience(s.patience);
    let (w, report) = lm.minimize(w);
    (w.theta.iter().copied().collect(), report)
}

/// Residuals, covariance and leverages at `theta` (no iteration).
pub fn finish<P: Problem>(
    p: &P,
    sigma: &[f64],
    theta: Vec<f64>,
    termination: Termination,
) -> LsqResult {
    let (m, n) = (p.n_obs(), p.n_params());
    let residuals: Vec<f64> = (0..m)
        .map(|i| (p.observed(i) - p.value(i, &theta)) / sigma[i])
        .collect();
    let rss = residuals.iter().map(|r| r * r).sum();
    let j = weighted_jacobian(p, sigma, &theta);
    let (jtj_inv, leverage) = inverse_and_leverage(j);
    LsqResult {
        theta,
        residuals,
        rss,
        dof: m.saturating_sub(n),
        jtj_inv,
        leverage,
        termination,
    }
}

/// (JᵀJ)⁻¹ and the hat-matrix diagonal of J, by SVD of the column-scaled J.
pub fn inverse_and_leverage(j: DMatrix<f64>) -> (Option<DMatrix<f64>>, Vec<f64>) {
    let (m, n) = j.shape();
    let mut a: Vec<f64> = j.data.into();
    let mut scale = vec![1.0; n];
    for k in 0..n {
        let col = &mut a[k * m..(k + 1) * m];
        let norm = col.iter().map(|x| x * x).sum::<f64>().sqrt();
        if norm > 0.0 && norm.is_finite() {
            scale[k] = norm;
            col.iter_mut().for_each(|x| *x /= norm);
        }
    }
    let Some(svd) = thin_svd(a, m, n) else {
        return (None, vec![f64::NAN; m]);
    };
    let sv = &svd.s;
    let smax = svd.s_max();
    let rank_ok = sv.iter().all(|&s| s > smax * 1e-15 && s > 0.0);
    let leverage = (0..m)
        .map(|i| {
            (0..n)
                .filter(|&k| sv[k] > smax * 1e-15)
                .map(|k| svd.u(i, k).powi(2))
                .sum()
        })
        .collect();
    if !rank_ok {
        return (None, leverage);
    }
    let mut inv = DMatrix::zeros(n, n);
    for a in 0..n {
        for b in 0..n {
            let mut s = 0.0;
            for k in 0..n {
                s += svd.v(a, k) * svd.v(b, k) / (sv[k] * sv[k]);
            }
            inv[(a, b)] = s / (scale[a] * scale[b]);
        }
    }
    (Some(inv), leverage)
}

#[cfg(test)]
mod tests {
    use super::*;

    // y = b1 * exp(b2 x), exact data: the solver must recover the parameters.
    struct Exp {
        x: Vec<f64>,
        y: Vec<f64>,
    }
    impl Problem for Exp {
        fn n_obs(&self) -> usize {
            self.x.len()
        }
        fn n_params(&self) -> usize {
            2
        }
        fn observed(&self, i: usize) -> f64 {
            self.y[i]
        }
        fn model(&self, i: usize, th: &[f64], g: &mut [f64]) -> f64 {
            let e = (th[1] * self.x[i]).exp();
            g[0] = e;
            g[1] = th[0] * self.x[i] * e;
            th[0] * e
        }
    }

    #[test]
    fn recovers_exact_exponential() {
        let x: Vec<f64> = (0..10).map(|i| i as f64 * 0.3).collect();
        let y = x.iter().map(|x| 2.0 * (0.7 * x).exp()).collect();
        let p = Exp { x, y };
        let r = solve(&p, &[1.0; 10], &[1.0, 0.1], Settings::default());
        assert!(r.termination.is_success(), "{:?}", r.termination);
        assert!((r.theta[0] - 2.0).abs() < 1e-9 && (r.theta[1] - 0.7).abs() < 1e-9);
        let lev: f64 = r.leverage.iter().sum();
        assert!(
            (lev - 2.0).abs() < 1e-9,
            "trace of the hat matrix is n: {lev}"
        );
    }

    #[test]
    fn nan_model_is_not_converged() {
        let p = Exp {
            x: vec![1e308, 2.0, 3.0],
            y: vec![1.0, 2.0, 3.0],
        };
        let r = solve(&p, &[1.0; 3], &[1.0, 1.0], Settings::default());
        assert!(!r.termination.is_success());
    }
}
