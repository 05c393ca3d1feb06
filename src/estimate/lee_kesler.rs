//! Lee–Kesler vapor-pressure curve and acentric factor from Tb, Tc, pc.
//!
//! ln(p/pc) = f0(Tr) + ω f1(Tr), with
//! f0 = 5.92714 − 6.09648/Tr − 1.28862 ln Tr + 0.169347 Tr⁶ and
//! f1 = 15.2518 − 15.6875/Tr − 13.4721 ln Tr + 0.43577 Tr⁶;
//! ω follows from requiring p(Tb) = 1 atm.
//!
//! Reference: B. I. Lee, M. G. Kesler, AIChE J. 21 (1975) 510–527; as given
//! in Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids, 5th
//! ed. (2001), ch. 7 (from memory).

use crate::units::ATM_PA;
use crate::vapor::Curve;

/// f0(Tr).
pub fn f0(tr: f64) -> f64 {
    5.92714 - 6.09648 / tr - 1.28862 * tr.ln() + 0.169347 * tr.powi(6)
}

/// f1(Tr).
pub fn f1(tr: f64) -> f64 {
    15.2518 - 15.6875 / tr - 13.4721 * tr.ln() + 0.43577 * tr.powi(6)
}

/// Acentric factor from Tb (K), Tc (K), pc (Pa).
///
/// ```
/// // Benzene: Tb 353.2 K, Tc 562.0 K, pc 48.98 bar gives ω ≈ 0.21 (from memory).
/// let w = ebullio::estimate::lee_kesler::omega(353.2, 562.0, 48.98e5);
/// assert!((w - 0.21).abs() < 0.02);
/// ```
pub fn omega(tb_k: f64, tc_k: f64, pc_pa: f64) -> f64 {
    let tr = tb_k / tc_k;
    ((ATM_PA / pc_pa).ln() - f0(tr)) / f1(tr)
}

/// A Lee–Kesler vapor-pressure curve.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct LeeKeslerCurve {
    /// Critical temperature, K.
    pub tc_k: f64,
    /// Critical pressure, Pa.
    pub pc_pa: f64,
    /// Acentric factor.
    pub omega: f64,
    /// Normal boiling point the curve passes through, K.
    pub tb_k: f64,
    /// Standard uncertainty (1σ, K) of the normal boiling point, if known.
    pub tb_sigma_k: Option<f64>,
}

impl LeeKeslerCurve {
    /// Curve through (Tb, 1 atm) with critical point (Tc, pc).
    pub fn from_tb(tb_k: f64, tc_k: f64, pc_pa: f64, tb_sigma_k: Option<f64>) -> Self {
        LeeKeslerCurve {
            tc_k,
            pc_pa,
            omega: omega(tb_k, tc_k, pc_pa),
            tb_k,
            tb_sigma_k,
        }
    }
}

impl Curve for LeeKeslerCurve {
    fn ln_p(&self, t_k: f64) -> f64 {
        if t_k.is_nan() || t_k <= 0.0 {
            return f64::NAN;
        }
        let tr = t_k / self.tc_k;
        self.pc_pa.ln() + f0(tr) + self.omega * f1(tr)
    }

    /// Reduced temperatures 0.3 to 1 (common practice for this correlation).
    fn valid_range_k(&self) -> Option<(f64, f64)> {
        Some((0.3 * self.tc_k, self.tc_k))
    }

    /// The normal-boiling-point uncertainty, scaled by T/Tb at other pressures.
    fn t_uncertainty_k(&self, p_pa: f64) -> Option<f64> {
        let s = self.tb_sigma_k?;
        let t = self.t_at(p_pa)?;
        Some(s * t / self.tb_k)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn passes_through_normal_boiling_point() {
        let c = LeeKeslerCurve::from_tb(350.0, 550.0, 40e5, None);
        assert!((c.p_pa(350.0) - ATM_PA).abs() < 1e-6 * ATM_PA);
        assert!((c.t_at(ATM_PA).unwrap() - 350.0).abs() < 1e-6);
        assert!((c.p_pa(550.0) - 40e5).abs() < 1e-3 * 40e5);
    }
}
