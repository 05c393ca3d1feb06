//! The activity-coefficient interface every liquid model offers, and the ideal solution.

/// A liquid-phase activity-coefficient model for a binary mixture.
///
/// Compositions are the mole fraction `x1` of component 1 (`x2 = 1 − x1`),
/// temperatures in kelvin. `x1 = 0` and `x1 = 1` are allowed and give the
/// infinite-dilution values. Implementations must be thermodynamically
/// consistent (Gibbs–Duhem: `x1 dlnγ1/dx1 + x2 dlnγ2/dx1 = 0`), which the
/// tests check numerically for every model.
///
/// ```
/// use ebullio::mixture::{ActivityModel, Ideal};
/// assert_eq!(Ideal.ln_gamma(0.3, 350.0), [0.0, 0.0]);
/// ```
pub trait ActivityModel: Send + Sync {
    /// Short name used in output: `unifac`, `wilson`, `nrtl`, `ideal`.
    fn name(&self) -> &'static str;

    /// `[ln γ1, ln γ2]` at `x1` and `t_k`.
    fn ln_gamma(&self, x1: f64, t_k: f64) -> [f64; 2] {
        self.ln_gamma_dx(x1, t_k).0
    }

    /// `([ln γ1, ln γ2], [d ln γ1/dx1, d ln γ2/dx1])` at `x1` and `t_k`, with
    /// the derivatives analytic (used by the stability test and the
    /// liquid–liquid solver).
    fn ln_gamma_dx(&self, x1: f64, t_k: f64) -> ([f64; 2], [f64; 2]);

    /// Whether the model can predict two liquid phases at all (Wilson cannot).
    fn can_split(&self) -> bool {
        true
    }
}

/// The ideal solution: γ = 1, Raoult's law.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Ideal;

impl ActivityModel for Ideal {
    fn name(&self) -> &'static str {
        "ideal"
    }
    fn ln_gamma(&self, _x1: f64, _t_k: f64) -> [f64; 2] {
        [0.0, 0.0]
    }
    fn ln_gamma_dx(&self, _x1: f64, _t_k: f64) -> ([f64; 2], [f64; 2]) {
        ([0.0, 0.0], [0.0, 0.0])
    }
    fn can_split(&self) -> bool {
        false
    }
}
