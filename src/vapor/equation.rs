//! The fitting trait every vapor-pressure equation implements, and the closed set of equations.
//!
//! An equation maps a parameter vector θ and a temperature T (K) to ln(p/Pa),
//! with analytic derivatives with respect to θ and T and an inverse T(p). The
//! fitter (`crate::fit`) owns the loop; an equation only knows its formula.
//! Equations that are linear in their parameters also expose their basis, so
//! the fitter can solve them exactly by linear least squares.

use super::{Antoine, Clapeyron, Riedel, Wagner};
use serde::{Deserialize, Serialize};

/// A vapor-pressure equation with a parameter vector, in SI (T in K, ln(p/Pa)).
pub trait VaporEquation: Send + Sync {
    /// Short lower-case name used on the command line and in JSON (`antoine`).
    fn name(&self) -> &'static str;

    /// Parameter names, in the order of the parameter vector.
    fn param_names(&self) -> &'static [&'static str];

    /// Number of parameters.
    fn n_params(&self) -> usize {
        self.param_names().len()
    }

    /// ln(p/Pa) at `t_k` for parameters `theta`. NaN where undefined.
    fn ln_p(&self, theta: &[f64], t_k: f64) -> f64;

    /// Gradient of ln(p/Pa) with respect to the parameters, written into `grad`
    /// (length [`n_params`](Self::n_params)); returns ln(p/Pa) as well.
    fn gradient(&self, theta: &[f64], t_k: f64, grad: &mut [f64]) -> f64;

    /// d ln(p/Pa)/dT at `t_k`, in 1/K.
    fn d_ln_p_dt(&self, theta: &[f64], t_k: f64) -> f64;

    /// Linear basis when ln p = offset(T) + Σ θ_i φ_i(T): writes φ into `phi`
    /// and returns the offset. `None` for equations nonlinear in θ.
    fn linear_basis(&self, _t_k: f64, _phi: &mut [f64]) -> Option<f64> {
        None
    }

    /// Temperature (K) where ln(p/Pa) = `ln_p`. The default brackets around
    /// `hint` (a range in K) and bisects, then polishes by Newton steps that
    /// are kept only when they reduce the residual (safeguarded).
    fn t_at(&self, theta: &[f64], ln_p: f64, hint: Option<(f64, f64)>) -> Option<f64> {
        let t0 = super::invert_monotone(|t| self.ln_p(theta, t), ln_p, hint)?;
        Some(newton_polish(
            |t| self.ln_p(theta, t),
            |t| self.d_ln_p_dt(theta, t),
            ln_p,
            t0,
        ))
    }
}

/// A few safeguarded Newton steps on f(t) = target from `t0`.
pub(crate) fn newton_polish(
    f: impl Fn(f64) -> f64,
    df: impl Fn(f64) -> f64,
    target: f64,
    t0: f64,
) -> f64 {
    let mut t = t0;
    let mut g = f(t) - target;
    for _ in 0..4 {
        let d = df(t);
        if !(d.is_finite() && d != 0.0 && g.is_finite()) || g == 0.0 {
            break;
        }
        let tn = t - g / d;
        let gn = f(tn) - target;
        if gn.is_finite() && gn.abs() < g.abs() {
            t = tn;
            g = gn;
        } else {
            break;
        }
    }
    t
}

/// The equations ebullio fits, as data (serialisable, so a fit result file
/// can rebuild its curve).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "equation", rename_all = "lowercase")]
pub enum Equation {
    /// ln p = A − B/T.
    Clapeyron(Clapeyron),
    /// ln(p/Pa) = A − B/(T/K + C).
    Antoine(Antoine),
    /// ln p = A + B/T + C ln T + D T⁶.
    Riedel(Riedel),
    /// Wagner 2.5–5 form in reduced variables.
    Wagner(Wagner),
}

/// Which equation, by name: `antoine`, `clapeyron`, `riedel` or `wagner` in JSON and
/// on the command line.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Model {
    /// ln p = A − B/T.
    Clapeyron,
    /// ln(p/Pa) = A − B/(T/K + C).
    Antoine,
    /// ln p = A + B/T + C ln T + D T⁶.
    Riedel,
    /// Wagner 2.5–5 form.
    Wagner,
}

impl Model {
    /// The lower-case name.
    pub fn as_str(self) -> &'static str {
        match self {
            Model::Clapeyron => "clapeyron",
            Model::Antoine => "antoine",
            Model::Riedel => "riedel",
            Model::Wagner => "wagner",
        }
    }
}

impl std::fmt::Display for Model {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.as_str())
    }
}

impl PartialEq<&str> for Model {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

impl Equation {
    /// Which equation this is.
    pub fn model(&self) -> Model {
        match self {
            Equation::Clapeyron(_) => Model::Clapeyron,
            Equation::Antoine(_) => Model::Antoine,
            Equation::Riedel(_) => Model::Riedel,
            Equation::Wagner(_) => Model::Wagner,
        }
    }

    /// The equation as a trait object.
    pub fn as_dyn(&self) -> &dyn VaporEquation {
        match self {
            Equation::Clapeyron(e) => e,
            Equation::Antoine(e) => e,
            Equation::Riedel(e) => e,
            Equation::Wagner(e) => e,
        }
    }
}

macro_rules! delegate {
    ($($fn:ident($($a:ident: $t:ty),*) -> $r:ty;)*) => {
        $(fn $fn(&self, $($a: $t),*) -> $r { self.as_dyn().$fn($($a),*) })*
    };
}

impl VaporEquation for Equation {
    delegate! {
        name() -> &'static str;
        param_names() -> &'static [&'static str];
        ln_p(theta: &[f64], t_k: f64) -> f64;
        gradient(theta: &[f64], t_k: f64, grad: &mut [f64]) -> f64;
        d_ln_p_dt(theta: &[f64], t_k: f64) -> f64;
        linear_basis(t_k: f64, phi: &mut [f64]) -> Option<f64>;
        t_at(theta: &[f64], ln_p: f64, hint: Option<(f64, f64)>) -> Option<f64>;
    }
}

/// Finite-difference helpers for checking analytic derivatives (tests, debugging).
pub mod check {
    use super::VaporEquation;

    /// Central-difference gradient of ln p with respect to the parameters.
    pub fn fd_gradient(eq: &dyn VaporEquation, theta: &[f64], t_k: f64) -> Vec<f64> {
        let mut out = vec![0.0; theta.len()];
        let mut th = theta.to_vec();
        for i in 0..theta.len() {
            let h = 1e-6 * theta[i].abs().max(1e-30);
            th[i] = theta[i] + h;
            let up = eq.ln_p(&th, t_k);
            th[i] = theta[i] - h;
            let dn = eq.ln_p(&th, t_k);
            th[i] = theta[i];
            out[i] = (up - dn) / (2.0 * h);
        }
        out
    }

    /// Central-difference d ln p / dT.
    pub fn fd_dt(eq: &dyn VaporEquation, theta: &[f64], t_k: f64) -> f64 {
        let h = 1e-5 * t_k;
        (eq.ln_p(theta, t_k + h) - eq.ln_p(theta, t_k - h)) / (2.0 * h)
    }
}

#[cfg(test)]
mod tests {
    use super::check::*;
    use super::*;
    use proptest::prelude::*;

    fn close(a: f64, b: f64, scale: f64) -> bool {
        (a - b).abs() <= 1e-5 * scale.max(a.abs()).max(b.abs())
    }

    fn assert_derivatives(eq: &dyn VaporEquation, theta: &[f64], t: f64) {
        let mut g = vec![0.0; theta.len()];
        let v = eq.gradient(theta, t, &mut g);
        assert!(close(v, eq.ln_p(theta, t), 1.0));
        let fd = fd_gradient(eq, theta, t);
        for (i, (a, b)) in g.iter().zip(&fd).enumerate() {
            // scale by the parameter's contribution so tiny D·T⁶ terms compare fairly
            let scale = (a * theta[i]).abs().max(1e-3) / theta[i].abs().max(1e-300);
            assert!(
                close(*a, *b, scale),
                "{} d/d{}: {a} vs {b}",
                eq.name(),
                eq.param_names()[i]
            );
        }
        let dt = eq.d_ln_p_dt(theta, t);
        assert!(
            close(dt, fd_dt(eq, theta, t), 1e-3),
            "{} dT: {dt}",
            eq.name()
        );
        let tb = eq.t_at(theta, v, Some((t - 30.0, t + 30.0))).unwrap();
        assert!(
            (tb - t).abs() < 1e-7 * t,
            "{} inverse {tb} vs {t}",
            eq.name()
        );
    }

    proptest! {
        #[test]
        fn clapeyron_derivatives_match_finite_differences(a in 18.0..26.0f64, b in 2000.0..6000.0f64, t in 250.0..450.0f64) {
            assert_derivatives(&Clapeyron, &[a, b], t);
        }

        #[test]
        fn antoine_derivatives_match_finite_differences(a in 18.0..26.0f64, b in 2000.0..5000.0f64, c in -80.0..0.0f64, t in 250.0..450.0f64) {
            assert_derivatives(&Antoine, &[a, b, c], t);
        }

        #[test]
        fn riedel_derivatives_match_finite_differences(a in 60.0..80.0f64, b in -8000.0..-6000.0f64, c in -8.0..-6.0f64, d in 1e-18..5e-17f64, t in 250.0..450.0f64) {
            assert_derivatives(&Riedel, &[a, b, c, d], t);
        }

        #[test]
        fn wagner_derivatives_match_finite_differences(a in -8.0..-6.0f64, b in 1.0..2.0f64, c in -3.0..-1.0f64, d in -4.0..-1.0f64, t in 280.0..450.0f64) {
            let w = Wagner { tc_k: 562.0, pc_pa: 4.9e6 };
            assert_derivatives(&w, &[a, b, c, d], t);
        }
    }

    #[test]
    fn equation_enum_round_trips_through_json() {
        let e = Equation::Wagner(Wagner {
            tc_k: 647.096,
            pc_pa: 22.064e6,
        });
        let s = serde_json::to_string(&e).unwrap();
        let back: Equation = serde_json::from_str(&s).unwrap();
        assert_eq!(e, back);
        assert_eq!(back.n_params(), 4);
    }
}
