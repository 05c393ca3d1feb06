//! The least-squares problem of a binary fit: measured T (or ln p) and y1 against the model.
//!
//! Every point is one bubble-point calculation at the measured x1 and the
//! fixed variable (p for isobaric data, T for isothermal); its observations
//! are the bubble temperature (or ln of the bubble pressure) and, when the
//! vapor was analysed, y1. Each evaluation at a new parameter vector solves
//! all points once and caches them, so the per-observation calls of the
//! solver cost nothing. Derivatives with respect to the parameters come from
//! the implicit function theorem at the bubble point, with ∂ln γ/∂θ by central
//! differences of the (closed-form) activity model:
//! dT/dθ = −Σ yi ∂ln γi/∂θ / Σ yi (∂ln γi/∂T + d ln pi°/dT).
//!
//! Reference: J. A. Barker, Aust. J. Chem. 6 (1953) 207–210 (fitting a liquid
//! model to total-pressure data through bubble-point calculations).

use super::data::{BinaryData, DataKind};
use super::model::FitModel;
use crate::fit::lsq::Problem;
use crate::mixture::{ActivityModel, Binary};
use crate::vapor::Curve;
use std::cell::RefCell;

/// Standard uncertainties of the measurements (the weights of the fit).
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Uncertainties {
    /// Temperature, K.
    pub t_k: f64,
    /// Vapor mole fraction.
    pub y1: f64,
    /// Pressure, relative (0.005 = 0.5 %).
    pub p_rel: f64,
}

impl Default for Uncertainties {
    /// 0.1 K, 0.005 in y1, 0.5 % in p (common practice for a recirculating still
    /// with a calibrated probe and gas-chromatographic analysis).
    fn default() -> Self {
        Uncertainties {
            t_k: 0.1,
            y1: 0.005,
            p_rel: 0.005,
        }
    }
}

/// What an observation measures.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Obs {
    /// The bubble temperature (isobaric) or ln bubble pressure (isothermal) of point i.
    Primary(usize),
    /// The vapor composition y1 of point i.
    Y(usize),
}

/// One point solved at a parameter vector.
#[derive(Debug, Clone, PartialEq)]
pub struct PointEval {
    /// Bubble temperature, K (isobaric) or ln(bubble pressure / Pa) (isothermal).
    pub primary: f64,
    /// Vapor composition y1.
    pub y1: f64,
    /// ∂primary/∂θ.
    pub d_primary: Vec<f64>,
    /// ∂y1/∂θ.
    pub d_y1: Vec<f64>,
}

/// The last parameter vector and its solved points.
type Cached = (Vec<f64>, Vec<Option<PointEval>>);

/// The fit of one model to one data set.
pub struct VleProblem<'a> {
    data: &'a BinaryData,
    curves: [&'a dyn Curve; 2],
    model: FitModel,
    /// Observations in order.
    pub obs: Vec<Obs>,
    observed: Vec<f64>,
    /// Standard uncertainty of each observation.
    pub sigma: Vec<f64>,
    cache: RefCell<Option<Cached>>,
}

impl<'a> VleProblem<'a> {
    /// Observations from `data` (points in `keep` only), weighted by `u`.
    pub fn new(
        data: &'a BinaryData,
        curves: [&'a dyn Curve; 2],
        model: FitModel,
        u: Uncertainties,
        keep: &[bool],
        use_y: bool,
    ) -> Self {
        let (mut obs, mut observed, mut sigma) = (Vec::new(), Vec::new(), Vec::new());
        for (i, p) in data.points.iter().enumerate() {
            if !keep[i] {
                continue;
            }
            obs.push(Obs::Primary(i));
            match data.kind {
                DataKind::Isobaric => {
                    observed.push(p.t_k);
                    sigma.push(u.t_k);
                }
                DataKind::Isothermal => {
                    observed.push(p.p_pa.ln());
                    sigma.push(u.p_rel);
                }
            }
            if let (Some(y), true) = (p.y1, use_y) {
                obs.push(Obs::Y(i));
                observed.push(y);
                sigma.push(u.y1);
            }
        }
        VleProblem {
            data,
            curves,
            model,
            obs,
            observed,
            sigma,
            cache: RefCell::new(None),
        }
    }

    /// Solve every point at `theta` (cached for the last `theta`).
    pub fn evals(&self, theta: &[f64]) -> Vec<Option<PointEval>> {
        if let Some((t, e)) = self.cache.borrow().as_ref() {
            if t.as_slice() == theta {
                return e.clone();
            }
        }
        let e: Vec<Option<PointEval>> = (0..self.data.points.len())
            .map(|i| self.solve_point(i, theta))
            .collect();
        *self.cache.borrow_mut() = Some((theta.to_vec(), e.clone()));
        e
    }

    fn with_evals<R>(&self, theta: &[f64], f: impl FnOnce(&[Option<PointEval>]) -> R) -> R {
        let fresh = !matches!(self.cache.borrow().as_ref(), Some((t, _)) if t.as_slice() == theta);
        if fresh {
            self.evals(theta);
        }
        let c = self.cache.borrow();
        f(&c.as_ref().expect("filled above").1)
    }

    /// Bubble point of point `i` at `theta` with its parameter derivatives.
    pub fn solve_point(&self, i: usize, theta: &[f64]) -> Option<PointEval> {
        let model = self.model.build(theta).ok()?;
        let p = self.data.points[i];
        let b = Binary {
            names: ["component 1", "component 2"],
            curves: self.curves,
            model: &model,
        };
        let pt = match self.data.kind {
            DataKind::Isobaric => b.bubble_t_near(p.x1, p.p_pa, p.t_k).ok()?,
            DataKind::Isothermal => b.bubble_p(p.x1, p.t_k).ok()?,
        };
        let (x1, t) = (p.x1, pt.t_k);
        let y = [pt.y1, 1.0 - pt.y1];
        // ∂ln γ/∂θ_k by central differences of the closed-form model.
        let n = theta.len();
        let mut dg = vec![[0.0; 2]; n];
        let mut th = theta.to_vec();
        for k in 0..n {
            let h = 1e-6 * theta[k].abs().max(1.0);
            th[k] = theta[k] + h;
            let up = self.model.build(&th).ok()?.ln_gamma(x1, t);
            th[k] = theta[k] - h;
            let dn = self.model.build(&th).ok()?.ln_gamma(x1, t);
            th[k] = theta[k];
            dg[k] = [(up[0] - dn[0]) / (2.0 * h), (up[1] - dn[1]) / (2.0 * h)];
        }
        let (d_primary, d_y1) = match self.data.kind {
            DataKind::Isobaric => {
                let ht = 1e-3;
                let up = model.ln_gamma(x1, t + ht);
                let dn = model.ln_gamma(x1, t - ht);
                let dlt = [
                    (up[0] - dn[0]) / (2.0 * ht) + self.curves[0].d_ln_p_dt(t),
                    (up[1] - dn[1]) / (2.0 * ht) + self.curves[1].d_ln_p_dt(t),
                ];
                let f_t = y[0] * dlt[0] + y[1] * dlt[1];
                let dt: Vec<f64> = dg
                    .iter()
                    .map(|g| -(y[0] * g[0] + y[1] * g[1]) / f_t)
                    .collect();
                let dy = dg
                    .iter()
                    .zip(&dt)
                    .map(|(g, d)| y[0] * (g[0] + dlt[0] * d))
                    .collect();
                (dt, dy)
            }
            DataKind::Isothermal => {
                let dlp: Vec<f64> = dg.iter().map(|g| y[0] * g[0] + y[1] * g[1]).collect();
                let dy = dg
                    .iter()
                    .zip(&dlp)
                    .map(|(g, d)| y[0] * (g[0] - d))
                    .collect();
                (dlp, dy)
            }
        };
        let primary = match self.data.kind {
            DataKind::Isobaric => pt.t_k,
            DataKind::Isothermal => pt.p_pa.ln(),
        };
        [primary, pt.y1]
            .iter()
            .chain(&d_primary)
            .chain(&d_y1)
            .all(|v| v.is_finite())
            .then_some(PointEval {
                primary,
                y1: pt.y1,
                d_primary,
                d_y1,
            })
    }
}

impl Problem for VleProblem<'_> {
    fn n_obs(&self) -> usize {
        self.obs.len()
    }
    fn n_params(&self) -> usize {
        self.model.n_params()
    }
    fn observed(&self, i: usize) -> f64 {
        self.observed[i]
    }
    fn model(&self, i: usize, theta: &[f64], grad: &mut [f64]) -> f64 {
        let o = self.obs[i];
        self.with_evals(theta, |e| match o {
            Obs::Primary(j) => match &e[j] {
                Some(pe) => {
                    grad.copy_from_slice(&pe.d_primary);
                    pe.primary
                }
                None => f64::NAN,
            },
            Obs::Y(j) => match &e[j] {
                Some(pe) => {
                    grad.copy_from_slice(&pe.d_y1);
                    pe.y1
                }
                None => f64::NAN,
            },
        })
    }
    fn value(&self, i: usize, theta: &[f64]) -> f64 {
        let o = self.obs[i];
        self.with_evals(theta, |e| match (o, e) {
            (Obs::Primary(j), e) => e[j].as_ref().map_or(f64::NAN, |p| p.primary),
            (Obs::Y(j), e) => e[j].as_ref().map_or(f64::NAN, |p| p.y1),
        })
    }
}
