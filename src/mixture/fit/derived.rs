//! What follows from the fitted parameters: γ∞ of both components, azeotropes and the
//! liquid-split check, each with its 95 % interval by the delta method.
//!
//! The delta method propagates the parameter covariance C through a derived
//! quantity q(θ): var q = gᵀ C g with g = ∂q/∂θ by central differences (steps
//! of 1 % of each standard error); the interval is q ± t(0.975, dof)·√var.
//!
//! Reference: e.g. G. A. F. Seber, C. J. Wild, *Nonlinear Regression*, Wiley
//! 1989, Sec. 5.1 (the delta method for functions of the estimates).

use super::data::{BinaryData, DataKind};
use super::model::FitModel;
use super::report::{FittedAzeotrope, SplitCheck};
use crate::mixture::{liquid_split_at, ActivityModel, Azeotrope, Binary, Condition};
use crate::vapor::Curve;
use nalgebra::DMatrix;

/// Value and 95 % half-width of q(θ) by the delta method (`None` when q fails at θ).
pub fn delta(
    q: impl Fn(&[f64]) -> Option<f64>,
    theta: &[f64],
    cov: Option<&DMatrix<f64>>,
    t95: f64,
) -> Option<(f64, Option<f64>)> {
    let v = q(theta)?;
    let Some(c) = cov else {
        return Some((v, None));
    };
    let n = theta.len();
    let mut g = vec![0.0; n];
    let mut th = theta.to_vec();
    for k in 0..n {
        let se = c[(k, k)].max(0.0).sqrt();
        let h = if se > 0.0 {
            0.01 * se
        } else {
            1e-6 * theta[k].abs().max(1.0)
        };
        th[k] = theta[k] + h;
        let up = q(&th);
        th[k] = theta[k] - h;
        let dn = q(&th);
        th[k] = theta[k];
        match (up, dn) {
            (Some(a), Some(b)) => g[k] = (a - b) / (2.0 * h),
            _ => return Some((v, None)),
        }
    }
    let mut var = 0.0;
    for a in 0..n {
        for b in 0..n {
            var += g[a] * c[(a, b)] * g[b];
        }
    }
    let hw = t95 * var.max(0.0).sqrt();
    Some((v, (hw.is_finite() && t95.is_finite()).then_some(hw)))
}

/// The fixed condition of the data (mean pressure, or mean temperature).
pub fn condition(data: &BinaryData) -> Condition {
    let n = data.points.len() as f64;
    match data.kind {
        DataKind::Isobaric => {
            Condition::Pressure(data.points.iter().map(|p| p.p_pa).sum::<f64>() / n)
        }
        DataKind::Isothermal => {
            Condition::Temperature(data.points.iter().map(|p| p.t_k).sum::<f64>() / n)
        }
    }
}

/// Temperatures at which γ1∞ and γ2∞ are given: the boiling point of the other
/// component at the pressure (isobaric), or the fixed temperature.
pub fn gamma_inf_temperatures(curves: [&dyn Curve; 2], cond: Condition) -> [f64; 2] {
    match cond {
        Condition::Temperature(t) => [t, t],
        Condition::Pressure(p) => {
            let t2 = curves[1].t_at(p).unwrap_or(f64::NAN);
            let t1 = curves[0].t_at(p).unwrap_or(f64::NAN);
            [t2, t1]
        }
    }
}

/// [ln γ1∞, ln γ2∞] of `model` at θ and the temperatures given.
pub fn ln_gamma_inf(model: FitModel, theta: &[f64], t: [f64; 2]) -> Option<[f64; 2]> {
    let m = model.build(theta).ok()?;
    let a = m.ln_gamma(0.0, t[0])[0];
    let b = m.ln_gamma(1.0, t[1])[1];
    (a.is_finite() && b.is_finite()).then_some([a, b])
}

fn azeotropes_at(
    model: FitModel,
    theta: &[f64],
    curves: [&dyn Curve; 2],
    cond: Condition,
) -> Option<Vec<Azeotrope>> {
    let m = model.build(theta).ok()?;
    let b = Binary {
        names: ["component 1", "component 2"],
        curves,
        model: &m,
    };
    let d = b.diagram(cond, 101).ok()?;
    b.homogeneous_azeotropes(cond, &d).ok()
}

/// Azeotropes of the fitted model with delta-method intervals of x1 and T (or p).
pub fn fitted_azeotropes(
    data: &BinaryData,
    model: FitModel,
    theta: &[f64],
    cov: Option<&DMatrix<f64>>,
    curves: [&dyn Curve; 2],
    t95: f64,
) -> Vec<FittedAzeotrope> {
    let cond = condition(data);
    let Some(found) = azeotropes_at(model, theta, curves, cond) else {
        return Vec::new();
    };
    let (xlo, xhi) = data.x_range();
    found
        .iter()
        .map(|az| {
            // The azeotrope of the perturbed model nearest this one.
            let near = |th: &[f64]| -> Option<Azeotrope> {
                azeotropes_at(model, th, curves, cond)?
                    .into_iter()
                    .min_by(|a, b| (a.x1 - az.x1).abs().total_cmp(&(b.x1 - az.x1).abs()))
            };
            let isobaric = matches!(cond, Condition::Pressure(_));
            let x = delta(|th| near(th).map(|a| a.x1), theta, cov, t95);
            let c = delta(
                |th| near(th).map(|a| if isobaric { a.t_k } else { a.p_pa }),
                theta,
                cov,
                t95,
            );
            let band =
                |v: Option<(f64, Option<f64>)>| v.and_then(|(v, hw)| hw.map(|h| [v - h, v + h]));
            FittedAzeotrope {
                x1: az.x1,
                t_k: isobaric.then_some(az.t_k),
                p_pa: (!isobaric).then_some(az.p_pa),
                kind: az.kind,
                x1_ci95: band(x).map(|[a, b]| [a.max(0.0), b.min(1.0)]),
                condition_ci95: band(c),
                inside_data: az.x1 >= xlo && az.x1 <= xhi,
            }
        })
        .collect()
}

/// Whether the fitted model splits the liquid at a measured composition
/// (checked at the lowest, middle and highest measured temperature).
pub fn split_check(data: &BinaryData, model: &dyn ActivityModel) -> SplitCheck {
    let (lo, hi) = data.t_range();
    let mut out = SplitCheck {
        model_can_split: model.can_split(),
        inside_data: false,
        x1: None,
        t_k: None,
    };
    if !model.can_split() {
        return out;
    }
    for t in [lo, 0.5 * (lo + hi), hi] {
        if let Some([a, b]) = liquid_split_at(model, t) {
            let inside = data.points.iter().any(|p| p.x1 > a && p.x1 < b);
            if out.x1.is_none() || inside {
                out.x1 = Some([a, b]);
                out.t_k = Some(t);
                out.inside_data = inside;
            }
            if inside {
                break;
            }
        }
    }
    out
}
