//! Fitting one vapor-pressure equation to (T, p) points: starts, weights, robust loss.
//!
//! Residuals are in ln p. Linear-in-parameter equations are solved exactly;
//! Antoine starts from its linearized form, T·ln p = A·T + (A·C − B) − C·ln p,
//! then separable least squares (variable projection over C, [`super::separable`])
//! finishes, or Levenberg–Marquardt when that cannot certify convergence. With
//! u(T), u(p) given the weights are
//! effective variances u_eff² = (u(p)/p)² + (d ln p/dT)²·u(T)², iterated until
//! they stop changing. `--robust` reweights by Huber's loss (IRLS).
//! Every solve of one equation fit draws on one evaluation budget that scales with the
//! number of constants ([`evaluation_budget`]), so no input can make a fit run long: a fit
//! that spends it ends with [`StopReason::BudgetSpent`], never with a silent number.
//!
//! Reference: effective variance — J. Orear, *Am. J. Phys.* 50, 912 (1982);
//! Huber loss and IRLS — P. J. Huber, *Ann. Math. Statist.* 35, 73–101 (1964),
//! tuning constant 1.345 (95 % efficiency at the normal), scale by the
//! normalized median absolute deviation.

use super::linear::solve_weighted_columns;
use super::lsq::{self, LsqResult, Problem, Settings, StopReason, Termination};
use super::separable;
use crate::vapor::{Antoine, Clapeyron, Equation, VaporEquation};
use nalgebra::DMatrix;

/// One point in SI, with optional standard uncertainties.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Point {
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// u(T), K.
    pub u_t_k: Option<f64>,
    /// u(p), Pa.
    pub u_p_pa: Option<f64>,
}

/// Robust loss for `--robust`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum RobustLoss {
    /// Huber's loss, c = 1.345.
    Huber,
    /// Tukey's biweight, c = 4.685 (started from the Huber solution).
    Tukey,
}

impl RobustLoss {
    /// IRLS weight for a scaled residual u = |r|/scale.
    pub fn weight(self, u: f64) -> f64 {
        match self {
            RobustLoss::Huber if u <= 1.345 => 1.0,
            RobustLoss::Huber => 1.345 / u,
            RobustLoss::Tukey if u < 4.685 => (1.0 - (u / 4.685).powi(2)).powi(2),
            RobustLoss::Tukey => 0.0,
        }
    }
}

/// The least-squares problem: observations ln p_i, model ln p(T_i; θ).
pub struct VaporProblem<'a> {
    /// The equation.
    pub eq: &'a Equation,
    /// Temperatures, K.
    pub t: &'a [f64],
    /// Observed ln(p/Pa).
    pub y: &'a [f64],
}

impl Problem for VaporProblem<'_> {
    fn n_obs(&self) -> usize {
        self.t.len()
    }
    fn n_params(&self) -> usize {
        self.eq.n_params()
    }
    fn observed(&self, i: usize) -> f64 {
        self.y[i]
    }
    fn model(&self, i: usize, theta: &[f64], grad: &mut [f64]) -> f64 {
        self.eq.gradient(theta, self.t[i], grad)
    }
    fn value(&self, i: usize, theta: &[f64]) -> f64 {
        self.eq.ln_p(theta, self.t[i])
    }
}

/// An equation fitted to points, before reporting.
#[derive(Debug, Clone)]
pub struct EquationFit {
    /// The equation.
    pub eq: Equation,
    /// Solver result (weighted residuals, (JᵀJ)⁻¹, leverage, termination).
    pub lsq: LsqResult,
    /// Per-point standard uncertainty of ln p used as σ (1 when unweighted),
    /// before robust reweighting.
    pub sigma: Vec<f64>,
    /// True when weights came from u(T), u(p).
    pub weighted: bool,
    /// Final robust weights, when a robust loss was used.
    pub robust_weights: Option<Vec<f64>>,
    /// Parameter covariance used for every uncertainty downstream.
    pub covariance: Option<DMatrix<f64>>,
}

fn linear_fit(eq: &Equation, t: &[f64], y: &[f64], sigma: &[f64]) -> Option<Vec<f64>> {
    let (m, n) = (t.len(), eq.n_params());
    let (mut stack, mut heap) = ([0.0; 8], Vec::new());
    let phi: &mut [f64] = if n <= stack.len() {
        &mut stack[..n]
    } else {
        heap.resize(n, 0.0);
        &mut heap
    };
    // Nonlinear equations say so at the first point, before any allocation.
    eq.linear_basis(*t.first()?, phi)?;
    let mut design = vec![0.0; m * n]; // column-major
    let mut rhs = vec![0.0; m];
    for i in 0..m {
        let off = eq.linear_basis(t[i], phi)?;
        for k in 0..n {
            design[k * m + i] = phi[k];
        }
        rhs[i] = y[i] - off;
    }
    solve_weighted_columns(design, m, n, &rhs, sigma)
}

/// Start values for Antoine from its linearized form; falls back to the
/// Clausius–Clapeyron line with C = 0 when the linear solution is unusable.
pub fn antoine_start(t: &[f64], y: &[f64], sigma: &[f64]) -> Option<Vec<f64>> {
    let m = t.len();
    let tmin = t.iter().copied().fold(f64::INFINITY, f64::min);
    // Columns T, 1, −ln p (column-major).
    let mut design = Vec::with_capacity(3 * m);
    design.extend_from_slice(t);
    design.extend(std::iter::repeat_n(1.0, m));
    design.extend(y.iter().map(|v| -v));
    let rhs: Vec<f64> = (0..m).map(|i| t[i] * y[i]).collect();
    if let Some(s) = solve_weighted_columns(design, m, 3, &rhs, sigma) {
        let (a, k2, c) = (s[0], s[1], s[2]);
        let b = a * c - k2;
        if b > 0.0 && tmin + c > 0.05 * tmin && c.is_finite() {
            return Some(vec![a, b, c]);
        }
    }
    let cl = linear_fit(&Equation::Clapeyron(Clapeyron), t, y, sigma)?;
    Some(vec![cl[0], cl[1], 0.0])
}

/// Residual evaluations one Levenberg–Marquardt solve may take, per constant plus one
/// (MINPACK's `lmder1` default, J. J. Moré, B. S. Garbow & K. E. Hillstrom, *User Guide for
/// MINPACK-1*, ANL-80-74 (1980)); fits of the tests and benchmarks need at most about 160.
const EVALS_PER_SOLVE: usize = 100;

/// Residual evaluations one equation fit may take over all its solves (the first and every
/// effective-variance or robust reweighting), per constant plus one; robust fits of the
/// tests need at most about 310 for Antoine's three constants, a third of this budget.
const EVALS_PER_FIT: usize = 300;

/// The evaluation budget of one fit of an equation with `k` constants: it scales with the
/// problem's size (each evaluation costs one pass over the points), so a hostile point set
/// costs at most a few hundred passes over its points per equation.
pub fn evaluation_budget(k: usize) -> usize {
    EVALS_PER_FIT * (k + 1)
}

/// What is left of one fit's evaluation budget.
struct Budget {
    left: usize,
    total: usize,
    k: usize,
}

impl Budget {
    fn new(k: usize) -> Self {
        let total = evaluation_budget(k);
        Budget {
            left: total,
            total,
            k,
        }
    }

    /// The patience for the next solve (evaluations = patience·(k+1)); `None` when the
    /// budget cannot pay for one.
    fn patience(&self) -> Option<usize> {
        let p = (self.left / (self.k + 1)).min(EVALS_PER_SOLVE);
        (p > 0).then_some(p)
    }

    /// Charge a finished solve; the crate's `LostPatience` means this bound was hit.
    fn charge(&mut self, r: &mut LsqResult) {
        self.left = self.left.saturating_sub(r.termination.evaluations);
        if r.termination.reason == StopReason::LostPatience {
            self.spent(r);
        }
    }

    /// Mark `r` as stopped by the budget.
    fn spent(&self, r: &mut LsqResult) {
        r.termination.reason = StopReason::BudgetSpent { budget: self.total };
    }
}

/// Which solver fits Antoine (every other equation is linear or uses Levenberg–Marquardt).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum AntoineSolver {
    /// Separable least squares over C ([`super::separable`]), falling back to
    /// Levenberg–Marquardt whenever it cannot certify convergence.
    #[default]
    Separable,
    /// Levenberg–Marquardt on all three constants (the general solver).
    LevenbergMarquardt,
}

fn solve_once(
    eq: &Equation,
    (t, y, sigma): (&[f64], &[f64], &[f64]),
    start: Option<&[f64]>,
    patience: usize,
    solver: AntoineSolver,
) -> Option<LsqResult> {
    let prob = VaporProblem { eq, t, y };
    if let Some(th) = linear_fit(eq, t, y, sigma) {
        let term = Termination {
            reason: StopReason::ExactLinear,
            evaluations: 1,
        };
        return Some(lsq::finish(&prob, sigma, th, term));
    }
    let start = match start {
        Some(s) => s.to_vec(),
        None => match eq {
            Equation::Antoine(_) => antoine_start(t, y, sigma)?,
            _ => return None,
        },
    };
    if matches!(eq, Equation::Antoine(_)) && solver == AntoineSolver::Separable {
        // The fast path and the Levenberg–Marquardt solve that follows when it declines
        // share one solve's evaluation bound: the fast path may take a quarter of it
        // (on vapor-pressure data it needs a few to a few dozen), the rest is left.
        let k1 = eq.n_params() + 1;
        match separable::antoine(t, y, sigma, start[2], patience * k1 / 4) {
            Ok((th, evaluations)) => {
                let term = Termination {
                    reason: StopReason::Separable,
                    evaluations,
                };
                return Some(lsq::finish(&prob, sigma, th.to_vec(), term));
            }
            Err(spent) => {
                let settings = Settings {
                    patience: patience.saturating_sub(spent.div_ceil(k1)).max(1),
                    ..Settings::default()
                };
                let mut r = lsq::solve(&prob, sigma, &start, settings);
                r.termination.evaluations += spent;
                return Some(r);
            }
        }
    }
    let settings = Settings {
        patience,
        ..Settings::default()
    };
    Some(lsq::solve(&prob, sigma, &start, settings))
}

/// Fit `eq` to `points` (already validated: finite, positive, enough of them).
/// Returns `None` only when the start values cannot be formed (degenerate data).
pub fn fit_equation(
    eq: &Equation,
    points: &[Point],
    robust: Option<RobustLoss>,
) -> Option<EquationFit> {
    fit_equation_using(eq, points, robust, AntoineSolver::default())
}

/// [`fit_equation`] with the Antoine solver chosen (the fast path is checked against
/// Levenberg–Marquardt with this).
pub fn fit_equation_using(
    eq: &Equation,
    points: &[Point],
    robust: Option<RobustLoss>,
    solver: AntoineSolver,
) -> Option<EquationFit> {
    let t: Vec<f64> = points.iter().map(|p| p.t_k).collect();
    let y: Vec<f64> = points.iter().map(|p| p.p_pa.ln()).collect();
    let weighted = points
        .iter()
        .any(|p| p.u_t_k.is_some() || p.u_p_pa.is_some());
    let u_lnp: Vec<f64> = points
        .iter()
        .map(|p| p.u_p_pa.map_or(0.0, |u| u / p.p_pa))
        .collect();
    let u_t: Vec<f64> = points.iter().map(|p| p.u_t_k.unwrap_or(0.0)).collect();
    let mut sigma = vec![1.0; t.len()];
    let mut budget = Budget::new(eq.n_params());
    let mut r = solve_once(eq, (&t, &y, &sigma), None, EVALS_PER_SOLVE, solver)?;
    budget.charge(&mut r);
    // Reweighting from a point where the solver failed is not worth its cost: stop there.
    let mut stopped = !r.termination.is_success();
    if weighted && !stopped {
        // Effective variance, iterated to consistency with the fitted slope.
        for _ in 0..30 {
            let new: Vec<f64> = (0..t.len())
                .map(|i| {
                    let s = eq.d_ln_p_dt(&r.theta, t[i]);
                    (u_lnp[i].powi(2) + (s * u_t[i]).powi(2)).sqrt()
                })
                .collect();
            if new.iter().any(|s| !(s.is_finite() && *s > 0.0)) {
                break;
            }
            let change = new
                .iter()
                .zip(&sigma)
                .map(|(a, b)| ((a - b) / b).abs())
                .fold(0.0, f64::max);
            let Some(patience) = budget.patience() else {
                budget.spent(&mut r);
                stopped = true;
                break;
            };
            sigma = new;
            let th = r.theta.clone();
            r = solve_once(eq, (&t, &y, &sigma), Some(&th), patience, solver)?;
            budget.charge(&mut r);
            if !r.termination.is_success() {
                stopped = true;
                break;
            }
            if change < 1e-9 {
                break;
            }
        }
    }
    let mut robust_weights = None;
    if let Some(loss) = robust.filter(|_| !stopped) {
        let mut w: Vec<f64> = vec![1.0; t.len()];
        let stages: &[RobustLoss] = match loss {
            RobustLoss::Huber => &[RobustLoss::Huber],
            RobustLoss::Tukey => &[RobustLoss::Huber, RobustLoss::Tukey],
        };
        'stages: for &stage in stages {
            for _ in 0..50 {
                let mut abs: Vec<f64> = (0..t.len())
                    .map(|i| (r.residuals[i] / w[i].max(1e-12).sqrt()).abs())
                    .collect();
                abs.sort_by(f64::total_cmp);
                let scale = median(&abs) / 0.6745;
                if scale.is_nan() || scale <= 0.0 {
                    break;
                }
                // residuals are already divided by the robust σ: recover plain ones
                let new: Vec<f64> = (0..t.len())
                    .map(|i| {
                        let u = (r.residuals[i] / w[i].max(1e-12).sqrt()).abs() / scale;
                        stage.weight(u)
                    })
                    .collect();
                let change = new
                    .iter()
                    .zip(&w)
                    .map(|(a, b)| (a - b).abs())
                    .fold(0.0, f64::max);
                let Some(patience) = budget.patience() else {
                    budget.spent(&mut r);
                    break 'stages;
                };
                w = new;
                // a zero weight is a very large σ (the point stays in the report)
                let s: Vec<f64> = (0..t.len())
                    .map(|i| sigma[i] / w[i].max(1e-12).sqrt())
                    .collect();
                let th = r.theta.clone();
                r = solve_once(eq, (&t, &y, &s), Some(&th), patience, solver)?;
                budget.charge(&mut r);
                if !r.termination.is_success() {
                    break 'stages;
                }
                if change < 1e-8 {
                    break;
                }
            }
        }
        robust_weights = Some(w);
    }
    let covariance = r.jtj_inv.as_ref().map(|m| {
        // Unweighted or robust: s²(JᵀJ)⁻¹. Weighted: (JᵀJ)⁻¹ scaled by the
        // reduced chi-square when it exceeds 1 (Birge ratio; common practice).
        let s2 = r.s2();
        let f = if weighted && robust.is_none() {
            s2.max(1.0)
        } else {
            s2
        };
        m * f
    });
    Some(EquationFit {
        eq: *eq,
        lsq: r,
        sigma,
        weighted,
        robust_weights,
        covariance,
    })
}

fn median(sorted: &[f64]) -> f64 {
    let n = sorted.len();
    if n == 0 {
        return f64::NAN;
    }
    if n % 2 == 1 {
        sorted[n / 2]
    } else {
        0.5 * (sorted[n / 2 - 1] + sorted[n / 2])
    }
}

/// Convenience: the Antoine equation value.
pub const ANTOINE: Equation = Equation::Antoine(Antoine);

#[cfg(test)]
mod tests {
    use super::*;

    fn pts(theta: &[f64]) -> Vec<Point> {
        (0..10)
            .map(|i| {
                let t = 300.0 + 8.0 * i as f64;
                Point {
                    t_k: t,
                    p_pa: ANTOINE.ln_p(theta, t).exp(),
                    u_t_k: None,
                    u_p_pa: None,
                }
            })
            .collect()
    }

    #[test]
    fn antoine_recovers_exact_constants() {
        let th = [21.5, 3100.0, -52.0];
        let f = fit_equation(&ANTOINE, &pts(&th), None).unwrap();
        assert!(f.lsq.termination.is_success(), "{:?}", f.lsq.termination);
        for k in 0..3 {
            assert!(
                ((f.lsq.theta[k] - th[k]) / th[k]).abs() < 1e-7,
                "{:?}",
                f.lsq.theta
            );
        }
    }

    // The slow input of the 2026-12-02 fuzz run (tests/fuzz_regressions.rs): temperatures
    // and pressures near 1e-23 with subnormal u(p), Tukey reweighting. Its first solve took
    // 2,000 evaluations and then 86 reweightings 158,000 more; it must end within the budget
    // of its three constants and say so.
    #[test]
    fn a_hostile_point_set_ends_with_the_budget_spent() {
        let p = |t_k, p_pa, u_t_k, u_p_pa| Point {
            t_k,
            p_pa,
            u_t_k,
            u_p_pa,
        };
        let pts = [
            p(
                2.812414082670612e-23,
                2.252526342575774e-23,
                Some(2.252526342575774e-23),
                Some(2.252526342575774e-23),
            ),
            p(
                2.236307114878656e-23,
                2.252526342575774e-23,
                Some(2.252526342575774e-23),
                Some(3.21763131499815e-310),
            ),
            p(
                2.252526342575774e-23,
                2.252526342575774e-23,
                Some(2.235401118821697e-23),
                Some(2.252526342575774e-23),
            ),
            p(
                2.2525263463461408e-23,
                2.252526342575774e-23,
                Some(2.2502645205883244e-23),
                None,
            ),
            p(
                2.252526342575774e-23,
                1.0503209742121367e-19,
                Some(2.2525263425905195e-23),
                Some(1.1951619082204e-310),
            ),
        ];
        let f = fit_equation(&ANTOINE, &pts, Some(RobustLoss::Tukey)).unwrap();
        let term = &f.lsq.termination;
        assert_eq!(
            term.reason,
            StopReason::BudgetSpent {
                budget: evaluation_budget(3)
            }
        );
        assert!(term.evaluations <= EVALS_PER_SOLVE * 4, "{term:?}");
        assert_eq!(
            term.reason.to_string(),
            "evaluation budget spent (1200 evaluations)"
        );
    }

    #[test]
    fn linearized_start_is_exact_on_exact_data() {
        let th = [21.5, 3100.0, -52.0];
        let p = pts(&th);
        let t: Vec<f64> = p.iter().map(|p| p.t_k).collect();
        let y: Vec<f64> = p.iter().map(|p| p.p_pa.ln()).collect();
        let s = antoine_start(&t, &y, &[1.0; 10]).unwrap();
        assert!((s[2] - th[2]).abs() < 1e-4, "{s:?}");
    }
}
