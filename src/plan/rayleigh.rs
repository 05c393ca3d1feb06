//! Simple batch (Rayleigh) distillation of a binary: pot and distillate composition against the fraction distilled.
//!
//! A simple still boils a charge of `L₀` mol with light-component mole
//! fraction `x₀`; the vapor, in equilibrium with the pot liquid, is condensed
//! and removed. The light-component balance gives the Rayleigh equation
//!
//! `ln(L₀/L) = ∫_x^{x₀} dx / (y(x) − x)`,
//!
//! integrated here numerically (Simpson's rule on each step in `u = ln x`,
//! where the integrand `x/(y − x)` stays smooth as `x → 0`). The equilibrium
//! `y(x)` comes from an [`Equilibrium`]: either constant α, or the ideal
//! binary by Raoult's law where α follows the pot's bubble-point temperature.
//! The mean composition of all distillate collected so far follows from the
//! balance, `x̄_D = (x₀ − (1 − f)·x)/f` with `f = 1 − L/L₀`, and the head
//! temperature is the bubble point of the pot liquid (the vapor's dew point
//! at equilibrium; heat losses ignored).
//!
//! For constant α the integral has the closed form ([`closed_form_ln_l0_over_l`])
//!
//! `ln(L₀/L) = [ln(x₀/x) + α·ln((1 − x)/(1 − x₀))] / (α − 1)`.
//!
//! Reference: Lord Rayleigh, "On the distillation of binary mixtures",
//! *Phil. Mag.* (6) 4 (1902) 521–537; the constant-α closed form as given in
//! unit-operations textbooks, e.g. McCabe, Smith & Harriott, *Unit Operations
//! of Chemical Engineering*, chapter on batch distillation (from memory).

use super::{Component, PlanError};
use crate::vapor::invert_monotone;
use serde::Serialize;

/// Vapor–liquid equilibrium of a binary: vapor composition and temperature
/// for a liquid of light-component mole fraction `x`.
pub trait Equilibrium {
    /// Light-component mole fraction in the vapor.
    fn y(&self, x: f64) -> Result<f64, PlanError>;
    /// Bubble-point temperature (K) of the liquid, when the model knows it.
    fn t_k(&self, x: f64) -> Result<Option<f64>, PlanError>;
    /// Short name for the output.
    fn model(&self) -> &'static str;
}

/// Constant relative volatility: `y = αx / (1 + (α − 1)x)`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ConstantAlpha {
    /// The relative volatility (> 1).
    pub alpha: f64,
}

impl Equilibrium for ConstantAlpha {
    fn y(&self, x: f64) -> Result<f64, PlanError> {
        Ok(self.alpha * x / (1.0 + (self.alpha - 1.0) * x))
    }
    fn t_k(&self, _x: f64) -> Result<Option<f64>, PlanError> {
        Ok(None)
    }
    fn model(&self) -> &'static str {
        "constant-alpha"
    }
}

/// The ideal binary by Raoult's law at a fixed pressure: the bubble point
/// `x·p_L°(T) + (1 − x)·p_H°(T) = P` fixes T, then `y = x·p_L°(T)/P`.
/// α varies with the temperature, hence with composition.
#[derive(Debug)]
pub struct IdealBinary<'a> {
    /// More volatile component.
    pub light: &'a Component,
    /// Less volatile component.
    pub heavy: &'a Component,
    /// Pressure, Pa.
    pub p_pa: f64,
}

impl IdealBinary<'_> {
    /// Bubble-point temperature (K) of a liquid with light fraction `x`.
    pub fn bubble_t_k(&self, x: f64) -> Result<f64, PlanError> {
        let tl = self.light.tb_k(self.p_pa)?;
        let th = self.heavy.tb_k(self.p_pa)?;
        let f = |t: f64| {
            let a = self.light.curve.ln_p(t);
            let b = self.heavy.curve.ln_p(t);
            // ln(x e^a + (1-x) e^b), computed stably.
            let m = a.max(b);
            m + (x * (a - m).exp() + (1.0 - x) * (b - m).exp()).ln()
        };
        let (lo, hi) = (tl.min(th) - 1e-6, tl.max(th) + 1e-6);
        invert_monotone(f, self.p_pa.ln(), Some((lo, hi))).ok_or_else(|| {
            PlanError::NoBoilingPoint {
                name: format!("{}/{} mixture", self.light.name, self.heavy.name),
                p_pa: self.p_pa,
            }
        })
    }
}

impl Equilibrium for IdealBinary<'_> {
    fn y(&self, x: f64) -> Result<f64, PlanError> {
        let t = self.bubble_t_k(x)?;
        Ok((x * (self.light.ln_p(t)? - self.p_pa.ln()).exp()).clamp(0.0, 1.0))
    }
    fn t_k(&self, x: f64) -> Result<Option<f64>, PlanError> {
        self.bubble_t_k(x).map(Some)
    }
    fn model(&self) -> &'static str {
        "raoult-varying-alpha"
    }
}

/// `ln(L₀/L)` for constant α when the pot has gone from `x0` to `x`.
///
/// ```
/// use ebullio::plan::rayleigh::closed_form_ln_l0_over_l;
/// assert_eq!(closed_form_ln_l0_over_l(2.0, 0.5, 0.5), 0.0);
/// assert!(closed_form_ln_l0_over_l(2.0, 0.5, 0.2) > 0.0);
/// ```
pub fn closed_form_ln_l0_over_l(alpha: f64, x0: f64, x: f64) -> f64 {
    ((x0 / x).ln() + alpha * ((1.0 - x) / (1.0 - x0)).ln()) / (alpha - 1.0)
}

/// One state of the batch.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct RayleighPoint {
    /// Fraction of the charge (moles) distilled so far, `1 − L/L₀`.
    pub fraction_distilled: f64,
    /// Light-component mole fraction left in the pot.
    pub pot_x_light: f64,
    /// Light-component mole fraction of the distillate coming over now.
    pub vapor_y_light: f64,
    /// Mean light-component mole fraction of all distillate collected so far.
    pub distillate_avg_x_light: f64,
    /// Head (and pot) temperature, K, when the model knows it.
    pub head_t_k: Option<f64>,
    /// Pot temperature, K: the boiling point of the pot liquid (at
    /// equilibrium the head reads the same, heat losses ignored).
    pub pot_t_k: Option<f64>,
}

/// Integrate the Rayleigh equation from `x0` down to `x_end` in `steps`
/// Simpson steps on `ln x`; returns `(x, ln(L₀/L))` at every step, starting
/// with `(x0, 0)`.
pub fn integrate(
    eq: &dyn Equilibrium,
    x0: f64,
    x_end: f64,
    steps: usize,
) -> Result<Vec<(f64, f64)>, PlanError> {
    if !(x0 > 0.0 && x0 < 1.0) {
        return Err(PlanError::BadFeed { value: x0 });
    }
    let steps = steps.max(1);
    let (u0, u1) = (x0.ln(), x_end.clamp(1e-12, x0).ln());
    let h = (u1 - u0) / steps as f64; // negative: x decreases
                                      // d ln(L0/L)/du = -x/(y - x) ... with u decreasing, ln(L0/L) grows.
    let g = |u: f64| -> Result<f64, PlanError> {
        let x = u.exp();
        let y = eq.y(x)?;
        let d = y - x;
        if d <= 0.0 {
            return Err(PlanError::NoEnrichment { x });
        }
        Ok(-x / d)
    };
    let mut out = Vec::with_capacity(steps + 1);
    out.push((x0, 0.0));
    let mut acc = 0.0;
    let mut g_a = g(u0)?;
    for i in 0..steps {
        let a = u0 + h * i as f64;
        let b = if i + 1 == steps { u1 } else { a + h };
        let g_m = g(0.5 * (a + b))?;
        let g_b = g(b)?;
        acc += (b - a) / 6.0 * (g_a + 4.0 * g_m + g_b);
        out.push((b.exp(), acc));
        g_a = g_b;
    }
    Ok(out)
}

/// The state of the batch when the pot has reached `x`, given `ln(L₀/L)`.
pub fn point_at(
    eq: &dyn Equilibrium,
    x0: f64,
    x: f64,
    ln_l0_l: f64,
) -> Result<RayleighPoint, PlanError> {
    let f = 1.0 - (-ln_l0_l).exp();
    let y = eq.y(x)?;
    let avg = if f > 1e-12 {
        (x0 - (1.0 - f) * x) / f
    } else {
        y
    };
    let t = eq.t_k(x)?;
    Ok(RayleighPoint {
        fraction_distilled: f,
        pot_x_light: x,
        vapor_y_light: y,
        distillate_avg_x_light: avg,
        head_t_k: t,
        pot_t_k: t,
    })
}

/// The batch curve sampled every `df` of fraction distilled, from 0 up to
/// `f_max` (never to dryness), from a fine integration.
pub fn curve(
    eq: &dyn Equilibrium,
    x0: f64,
    df: f64,
    f_max: f64,
) -> Result<Vec<RayleighPoint>, PlanError> {
    let fine = integrate(eq, x0, 1e-6, 600)?;
    let mut out = vec![point_at(eq, x0, x0, 0.0)?];
    let mut k = 1;
    loop {
        let f_t = df * k as f64;
        if f_t > f_max + 1e-12 {
            break;
        }
        let target = -(1.0 - f_t).ln(); // ln(L0/L)
        let Some(j) = fine.iter().position(|&(_, l)| l >= target) else {
            break; // the light component is used up before this cut
        };
        let (x_a, l_a) = fine[j.saturating_sub(1)];
        let (x_b, l_b) = fine[j];
        let w = if l_b > l_a {
            (target - l_a) / (l_b - l_a)
        } else {
            1.0
        };
        // Interpolate in ln x, in which the integration grid is uniform.
        let x = (x_a.ln() + w * (x_b.ln() - x_a.ln())).exp();
        out.push(point_at(eq, x0, x, target)?);
        k += 1;
    }
    Ok(out)
}

/// The state when the pot has been stripped to `x_target` (the bottoms
/// specification): how much has been distilled and how pure it is on average.
pub fn cut_at_pot(
    eq: &dyn Equilibrium,
    x0: f64,
    x_target: f64,
) -> Result<RayleighPoint, PlanError> {
    let x_target = x_target.min(x0);
    let fine = integrate(eq, x0, x_target, 400)?;
    let (x, l) = fine.last().copied().unwrap_or((x0, 0.0));
    point_at(eq, x0, x, l)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Numerical Rayleigh integration against the constant-α closed form
    /// (the standard analytic solution of unit-operations textbooks, here
    /// written from memory and derived by partial fractions in the module docs).
    #[test]
    fn rayleigh_integration_matches_constant_alpha_closed_form() {
        for alpha in [1.2, 2.5, 8.0] {
            for x0 in [0.1, 0.5, 0.9] {
                let eq = ConstantAlpha { alpha };
                // 400 steps: within 1e-6; 4000 steps: within 1e-9 (Simpson, h^4).
                for (steps, tol) in [(400, 1e-6), (4000, 1e-9)] {
                    let pts = integrate(&eq, x0, 1e-3, steps).unwrap();
                    for &(x, l) in pts.iter().step_by(37) {
                        let exact = closed_form_ln_l0_over_l(alpha, x0, x);
                        assert!(
                            (l - exact).abs() < tol * (1.0 + exact),
                            "α {alpha} x0 {x0} x {x}: {l} vs {exact}"
                        );
                    }
                }
            }
        }
    }

    #[test]
    fn curve_obeys_the_material_balance_and_enriches_the_first_cut() {
        let eq = ConstantAlpha { alpha: 3.0 };
        let pts = curve(&eq, 0.5, 0.1, 0.9).unwrap();
        assert_eq!(pts.len(), 10);
        let first = pts[0];
        assert!((first.vapor_y_light - 0.75).abs() < 1e-12); // 3·0.5/(1+2·0.5)
        for p in &pts[1..] {
            let bal = (1.0 - p.fraction_distilled) * p.pot_x_light
                + p.fraction_distilled * p.distillate_avg_x_light;
            assert!((bal - 0.5).abs() < 1e-12);
            assert!(p.distillate_avg_x_light <= first.vapor_y_light + 1e-12);
            assert!(p.pot_x_light < 0.5);
        }
        assert!((pts[9].fraction_distilled - 0.9).abs() < 1e-9);
    }

    #[test]
    fn bad_feed_is_an_error() {
        let eq = ConstantAlpha { alpha: 2.0 };
        assert!(integrate(&eq, 1.0, 0.1, 10).is_err());
        assert!(integrate(&eq, 0.0, 0.1, 10).is_err());
    }
}
