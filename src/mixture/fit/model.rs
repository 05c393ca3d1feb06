//! The activity models a binary fit can choose from, built from a parameter vector.
//!
//! Every model's parameters are temperature-independent: Margules and van Laar
//! in ln γ∞ (dimensionless), Wilson a12, a21 and NRTL b12, b21 in kelvin
//! (their T dependence is then that of the equation itself). NRTL's α is fixed
//! at 0.3 unless it is fitted as a third parameter.
//!
//! Reference for α = 0.3: H. Renon, J. M. Prausnitz, AIChE J. 14 (1968)
//! 135–144 (α12 between 0.2 and 0.47; 0.3 for many non-aqueous mixtures).

use super::super::{ActivityModel, Legendre, Margules, MixtureError, Nrtl, VanLaar, Wilson};
use serde::{Deserialize, Serialize};

/// NRTL's non-randomness parameter when it is not fitted.
pub const NRTL_ALPHA_DEFAULT: f64 = 0.3;

/// A model family and which of its parameters are fitted.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case", tag = "model")]
pub enum FitModel {
    /// Two-parameter Margules (A12, A21).
    Margules,
    /// van Laar (A12, A21).
    VanLaar,
    /// Wilson (a12, a21 in K, molar volumes folded in).
    Wilson,
    /// NRTL (b12, b21 in K) with α fixed.
    Nrtl {
        /// The fixed α.
        alpha: f64,
    },
    /// NRTL with α fitted as well (b12, b21, alpha).
    NrtlAlpha,
    /// Legendre G^E series with this many terms (the point test's model).
    Legendre {
        /// Number of terms, 1–5.
        terms: usize,
    },
}

/// A model with its parameters set: what the equilibrium solvers use.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Fitted {
    /// Margules.
    Margules(Margules),
    /// van Laar.
    VanLaar(VanLaar),
    /// Wilson.
    Wilson(Wilson),
    /// NRTL.
    Nrtl(Nrtl),
    /// Legendre series.
    Legendre(Legendre),
}

impl Fitted {
    fn inner(&self) -> &dyn ActivityModel {
        match self {
            Fitted::Margules(m) => m,
            Fitted::VanLaar(m) => m,
            Fitted::Wilson(m) => m,
            Fitted::Nrtl(m) => m,
            Fitted::Legendre(m) => m,
        }
    }
}

impl ActivityModel for Fitted {
    fn name(&self) -> &'static str {
        self.inner().name()
    }
    fn ln_gamma(&self, x1: f64, t_k: f64) -> [f64; 2] {
        self.inner().ln_gamma(x1, t_k)
    }
    fn ln_gamma_dx(&self, x1: f64, t_k: f64) -> ([f64; 2], [f64; 2]) {
        self.inner().ln_gamma_dx(x1, t_k)
    }
    fn can_split(&self) -> bool {
        self.inner().can_split()
    }
}

impl Fitted {
    /// The same mixture with the components numbered the other way round
    /// (component 1 becomes 2): A12 ↔ A21, a12 ↔ a21, b12 ↔ b21.
    pub fn swapped(&self) -> Result<Fitted, MixtureError> {
        Ok(match *self {
            Fitted::Margules(m) => {
                let [a, b] = [m.ln_gamma(0.0, 300.0)[0], m.ln_gamma(1.0, 300.0)[1]];
                Fitted::Margules(Margules::new(b, a)?)
            }
            Fitted::VanLaar(m) => {
                let [a, b] = [m.ln_gamma(0.0, 300.0)[0], m.ln_gamma(1.0, 300.0)[1]];
                Fitted::VanLaar(VanLaar::new(b, a)?)
            }
            Fitted::Wilson(w) => Fitted::Wilson(w.swapped()),
            Fitted::Nrtl(n) => Fitted::Nrtl(n.swapped()),
            Fitted::Legendre(l) => Fitted::Legendre(l.swapped()),
        })
    }
}

impl FitModel {
    /// Name in output: `margules`, `van-laar`, `wilson`, `nrtl`, `legendre`.
    pub fn name(&self) -> &'static str {
        match self {
            FitModel::Margules => "margules",
            FitModel::VanLaar => "van-laar",
            FitModel::Wilson => "wilson",
            FitModel::Nrtl { .. } | FitModel::NrtlAlpha => "nrtl",
            FitModel::Legendre { .. } => "legendre",
        }
    }

    /// Fitted parameter names with their unit in brackets where they have one.
    pub fn param_names(&self) -> Vec<&'static str> {
        match self {
            FitModel::Margules | FitModel::VanLaar => vec!["A12", "A21"],
            FitModel::Wilson => vec!["a12/K", "a21/K"],
            FitModel::Nrtl { .. } => vec!["b12/K", "b21/K"],
            FitModel::NrtlAlpha => vec!["b12/K", "b21/K", "alpha"],
            FitModel::Legendre { terms } => ["a0", "a1", "a2", "a3", "a4"][..*terms].to_vec(),
        }
    }

    /// Number of fitted parameters.
    pub fn n_params(&self) -> usize {
        self.param_names().len()
    }

    /// Parameters held fixed, with their values.
    pub fn fixed(&self) -> Vec<(&'static str, f64)> {
        match self {
            FitModel::Nrtl { alpha } => vec![("alpha", *alpha)],
            _ => vec![],
        }
    }

    /// The model at `theta`.
    pub fn build(&self, theta: &[f64]) -> Result<Fitted, MixtureError> {
        Ok(match self {
            FitModel::Margules => Fitted::Margules(Margules::new(theta[0], theta[1])?),
            FitModel::VanLaar => Fitted::VanLaar(VanLaar::new(theta[0], theta[1])?),
            FitModel::Wilson => Fitted::Wilson(Wilson::new(theta[0], theta[1], [1.0, 1.0])?),
            FitModel::Nrtl { alpha } => Fitted::Nrtl(Nrtl::new(theta[0], theta[1], *alpha)?),
            FitModel::NrtlAlpha => Fitted::Nrtl(Nrtl::new(theta[0], theta[1], theta[2])?),
            FitModel::Legendre { .. } => Fitted::Legendre(Legendre::new(theta)?),
        })
    }

    /// Starting points for the solver, given the ln γ∞ pair of a Margules fit
    /// (or `None`) and a typical temperature.
    pub fn starts(&self, ln_gamma_inf: Option<[f64; 2]>, t_k: f64) -> Vec<Vec<f64>> {
        let [g1, g2] = ln_gamma_inf.unwrap_or([0.5, 0.5]);
        match self {
            FitModel::Margules => vec![vec![g1, g2], vec![0.0, 0.0]],
            FitModel::VanLaar => {
                let s = if g1 + g2 >= 0.0 { 1.0 } else { -1.0 };
                vec![vec![s * g1.abs().max(0.05), s * g2.abs().max(0.05)]]
            }
            // To first order in the non-ideality ln γ1∞ ≈ ln γ2∞ ≈ (a12 + a21)/T
            // (likewise for NRTL), so the first start splits the sum evenly; then a spread.
            FitModel::Wilson => vec![
                vec![t_k * (g1 + g2) / 4.0, t_k * (g1 + g2) / 4.0],
                vec![0.0, 0.0],
                vec![300.0, 300.0],
                vec![-100.0, 600.0],
                vec![600.0, -100.0],
            ],
            FitModel::Nrtl { .. } | FitModel::NrtlAlpha => {
                let mut v = vec![
                    vec![t_k * (g1 + g2) / 4.0, t_k * (g1 + g2) / 4.0],
                    vec![0.0, 0.0],
                    vec![300.0, 300.0],
                    vec![-100.0, 600.0],
                    vec![600.0, -100.0],
                ];
                if matches!(self, FitModel::NrtlAlpha) {
                    v.iter_mut().for_each(|s| s.push(NRTL_ALPHA_DEFAULT));
                }
                v
            }
            FitModel::Legendre { terms } => {
                let mut s = vec![0.0; *terms];
                s[0] = 0.5 * (g1 + g2);
                vec![s]
            }
        }
    }
}
