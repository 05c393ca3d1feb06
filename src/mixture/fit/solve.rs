//! One activity model fitted to one binary data set: starts, Levenberg–Marquardt, the best solution.

use super::data::BinaryData;
use super::model::FitModel;
use super::problem::{Uncertainties, VleProblem};
use crate::fit::lsq::{self, LsqResult, Settings};
use crate::vapor::Curve;

/// A solved model with what the statistics need.
#[derive(Debug, Clone)]
pub struct ModelFit {
    /// The model.
    pub model: FitModel,
    /// The solver's result at the best start.
    pub lsq: LsqResult,
    /// AICc = n ln(RSS/n) + 2k + 2k(k+1)/(n − k − 1), NaN when not converged
    /// or when n ≤ k + 1 (C. M. Hurvich & C.-L. Tsai, Biometrika 76 (1989) 297–307).
    pub aicc: f64,
}

impl ModelFit {
    /// Whether the solver converged at a finite point.
    pub fn converged(&self) -> bool {
        self.lsq.termination.is_success()
    }
}

/// Solver settings for binary fits: each evaluation solves every bubble point.
fn settings() -> Settings {
    Settings {
        patience: 60,
        tol: 1e-10,
    }
}

/// Fit `model` to the points in `keep`, trying its starts (`hint`: ln γ∞ from a
/// Margules fit) and keeping the converged solution with the lowest RSS.
pub fn fit_model(
    data: &BinaryData,
    curves: [&dyn Curve; 2],
    model: FitModel,
    u: Uncertainties,
    keep: &[bool],
    use_y: bool,
    hint: Option<[f64; 2]>,
) -> ModelFit {
    let prob = VleProblem::new(data, curves, model, u, keep, use_y);
    let (tlo, thi) = data.t_range();
    let starts = model.starts(hint, 0.5 * (tlo + thi));
    // Rank the starts by their RSS and run the solver from the best two.
    let mut ranked: Vec<(f64, Vec<f64>)> = starts
        .into_iter()
        .map(|s| {
            let r = lsq::finish(&prob, &prob.sigma, s.clone(), not_started());
            (
                if r.rss.is_finite() {
                    r.rss
                } else {
                    f64::INFINITY
                },
                s,
            )
        })
        .collect();
    ranked.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut best: Option<LsqResult> = None;
    for (_, s) in ranked.into_iter().take(2) {
        let r = lsq::solve(&prob, &prob.sigma, &s, settings());
        let better = match &best {
            None => true,
            Some(b) => match (r.termination.is_success(), b.termination.is_success()) {
                (true, false) => true,
                (false, true) => false,
                _ => r.rss < b.rss || !b.rss.is_finite(),
            },
        };
        if better {
            best = Some(r);
        }
    }
    let lsq = best.expect("every model has at least one start");
    let (n, k) = (lsq.residuals.len() as f64, model.n_params() as f64);
    let aicc = if lsq.termination.is_success() && n > k + 1.0 && lsq.rss > 0.0 {
        n * (lsq.rss / n).ln() + 2.0 * k + 2.0 * k * (k + 1.0) / (n - k - 1.0)
    } else {
        f64::NAN
    };
    ModelFit { model, lsq, aicc }
}

fn not_started() -> lsq::Termination {
    lsq::Termination {
        reason: crate::fit::termination::StopReason::Other("start".into()),
        evaluations: 0,
    }
}
