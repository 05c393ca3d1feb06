//! Wagner "2.5–5" form in reduced variables, with the critical point given by the user.
//!
//! ln(p/pc) = (Tc/T)(a τ + b τ^1.5 + c τ^2.5 + d τ^5), τ = 1 − T/Tc. Defined
//! only below Tc.
//!
//! Reference: W. Wagner, *Cryogenics* 13, 470–482 (1973); the 2.5–5 exponent
//! set as in Poling, Prausnitz & O'Connell, *The Properties of Gases and
//! Liquids*, 5th ed., eq. 7-3.3.

use super::equation::VaporEquation;
use serde::{Deserialize, Serialize};

/// Wagner 2.5–5 equation; parameters `[a, b, c, d]`, critical point fixed.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Wagner {
    /// Critical temperature, K.
    pub tc_k: f64,
    /// Critical pressure, Pa.
    pub pc_pa: f64,
}

const EXPONENTS: [f64; 4] = [1.0, 1.5, 2.5, 5.0];

impl VaporEquation for Wagner {
    fn name(&self) -> &'static str {
        "wagner"
    }
    fn param_names(&self) -> &'static [&'static str] {
        &["a", "b", "c", "d"]
    }
    fn ln_p(&self, th: &[f64], t: f64) -> f64 {
        let mut phi = [0.0; 4];
        match self.linear_basis(t, &mut phi) {
            Some(off) => off + phi.iter().zip(th).map(|(p, c)| p * c).sum::<f64>(),
            None => f64::NAN,
        }
    }
    fn gradient(&self, th: &[f64], t: f64, g: &mut [f64]) -> f64 {
        let mut phi = [0.0; 4];
        let off = self.linear_basis(t, &mut phi);
        g[..4].copy_from_slice(&phi);
        match off {
            Some(o) => o + phi.iter().zip(th).map(|(p, c)| p * c).sum::<f64>(),
            None => f64::NAN,
        }
    }
    fn d_ln_p_dt(&self, th: &[f64], t: f64) -> f64 {
        // ln p = ln pc + x f(τ), x = Tc/T: d/dT = −(x f + f'(τ))/T.
        let tau = 1.0 - t / self.tc_k;
        if tau <= 0.0 || t <= 0.0 {
            return f64::NAN;
        }
        let x = self.tc_k / t;
        let mut f = 0.0;
        let mut fp = 0.0;
        for (c, e) in th.iter().zip(EXPONENTS) {
            f += c * tau.powf(e);
            fp += c * e * tau.powf(e - 1.0);
        }
        -(x * f + fp) / t
    }
    fn linear_basis(&self, t: f64, phi: &mut [f64]) -> Option<f64> {
        let tau = 1.0 - t / self.tc_k;
        if tau <= 0.0 || t <= 0.0 || self.pc_pa <= 0.0 {
            phi[..4].fill(f64::NAN);
            return None;
        }
        let x = self.tc_k / t;
        let s = tau.sqrt();
        phi[0] = x * tau;
        phi[1] = x * tau * s;
        phi[2] = x * tau * tau * s;
        phi[3] = x * tau.powi(5);
        Some(self.pc_pa.ln())
    }
    fn t_at(&self, th: &[f64], ln_p: f64, hint: Option<(f64, f64)>) -> Option<f64> {
        let hi = self.tc_k * (1.0 - 1e-9);
        let h = hint.map(|(a, b)| (a.min(hi * 0.99), b.min(hi)));
        let f = |t: f64| {
            if t >= hi {
                self.pc_pa.ln() + 1e-9 * (t - hi + 1.0)
            } else {
                self.ln_p(th, t)
            }
        };
        let t0 = super::invert_monotone(f, ln_p, h)?;
        let t = super::equation::newton_polish(
            |t| self.ln_p(th, t),
            |t| self.d_ln_p_dt(th, t),
            ln_p,
            t0,
        );
        (t < self.tc_k).then_some(t)
    }
}
