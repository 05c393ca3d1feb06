//! How the components' boiling-point uncertainties carry into α and the Fenske stage count.
//!
//! Each source states a standard uncertainty `u_i` (K) of the temperature at
//! which its curve reaches a pressure ([`crate::vapor::Curve::t_uncertainty_k`]).
//! Read as a shift of the whole curve along the temperature axis by `δ_i`,
//! it changes `ln p_i°(T)` by `−s_i·δ_i` (with `s_i = d ln p_i°/dT`) and moves
//! its own boiling point by `δ_i`. The geometric-mean α is
//! `ln α = ½[ln α(T_L) + ln α(T_H)]` with `d ln α/dT = s_L − s_H`, so to first
//! order both shifts have the same sensitivity
//! `|∂ ln α/∂δ_L| = |∂ ln α/∂δ_H| = ½[s_L(T_H) + s_H(T_L)]`, and by the delta
//! method (sources independent)
//!
//! `u(ln α) = ½[s_L(T_H) + s_H(T_L)] · √(u_L² + u_H²)`.
//!
//! For the Fenske count `N = ln S / ln α`, `u(N) = N · u(ln α) / ln α`.
//! Because N is far from linear in α near 1, the 95 % interval is taken by
//! mapping `ln α ± 1.96·u(ln α)` through the Fenske equation (a monotone
//! map), and is open-ended when the lower α bound reaches 1.
//!
//! The sources are treated as independent. Structure estimates of related
//! compounds (homologues) share much of their error, so for them this
//! overstates the uncertainty of α; a fit or reference value for at least
//! one component narrows it.
//!
//! A source with no stated uncertainty (constants typed in) contributes zero
//! and is named in the result so the output can say so.
//!
//! Reference: JCGM 100:2008 (GUM), section 5.1, law of propagation of
//! uncertainty (first-order Taylor expansion).

use super::{fenske, Component, PlanError};
use serde::Serialize;

/// Coverage factor for an approximately 95 % interval (normal distribution).
pub const K95: f64 = 1.959_963_984_540_054;

/// Uncertainty of ln α for a pair at one pressure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AlphaUncertainty {
    /// Standard uncertainty of ln α (dimensionless).
    pub u_ln_alpha: f64,
    /// Standard uncertainty of the light component's boiling point, K (0 when not stated).
    pub u_light_tb_k: f64,
    /// Standard uncertainty of the heavy component's boiling point, K (0 when not stated).
    pub u_heavy_tb_k: f64,
    /// Components whose source states no uncertainty (counted as zero).
    pub not_stated: Vec<String>,
}

/// Propagate the boiling-point uncertainties of `light` and `heavy` at `p_pa`
/// (boiling points `tl`, `th` K) to ln of the geometric-mean α.
pub fn alpha_uncertainty(
    light: &Component,
    heavy: &Component,
    p_pa: f64,
    tl: f64,
    th: f64,
) -> Result<AlphaUncertainty, PlanError> {
    let mut not_stated = Vec::new();
    let mut u_of = |c: &Component| match c.curve.t_uncertainty_k(p_pa) {
        Some(u) if u.is_finite() && u >= 0.0 => u,
        _ => {
            not_stated.push(c.name.clone());
            0.0
        }
    };
    let ul = u_of(light);
    let uh = u_of(heavy);
    let sens = 0.5 * (light.curve.d_ln_p_dt(th) + heavy.curve.d_ln_p_dt(tl));
    if !sens.is_finite() {
        return Err(PlanError::NoVaporPressure {
            name: format!("{}/{}", light.name, heavy.name),
            t_k: tl,
        });
    }
    Ok(AlphaUncertainty {
        u_ln_alpha: sens.abs() * (ul * ul + uh * uh).sqrt(),
        u_light_tb_k: ul,
        u_heavy_tb_k: uh,
        not_stated,
    })
}

/// Fenske stages with their propagated uncertainty.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct StagesUncertainty {
    /// Standard uncertainty of N by the delta method.
    pub u: f64,
    /// Lower end of the 95 % interval (from the upper α bound).
    pub ci95_low: f64,
    /// Upper end of the 95 % interval; `None` when the lower α bound is ≤ 1.
    pub ci95_high: Option<f64>,
}

/// Uncertainty of the Fenske count for α = `alpha` with `u(ln α)` = `u_ln_alpha`.
/// `None` when α ≤ 1.
pub fn stages_uncertainty(
    alpha: f64,
    u_ln_alpha: f64,
    distillate_purity: f64,
    bottoms_purity: f64,
) -> Result<Option<StagesUncertainty>, PlanError> {
    let Some(n) = fenske::min_stages(alpha, distillate_purity, bottoms_purity)? else {
        return Ok(None);
    };
    let la = alpha.ln();
    let hi_alpha = (la + K95 * u_ln_alpha).exp();
    let lo_alpha = (la - K95 * u_ln_alpha).exp();
    let ci95_low = fenske::min_stages(hi_alpha, distillate_purity, bottoms_purity)?.unwrap_or(n);
    let ci95_high = fenske::min_stages(lo_alpha, distillate_purity, bottoms_purity)?;
    Ok(Some(StagesUncertainty {
        u: n * u_ln_alpha / la,
        ci95_low,
        ci95_high,
    }))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::volatility::pair_volatility;
    use crate::vapor::{AntoineConstants, Curve};

    /// A curve shifted along T by `shift` K, claiming uncertainty `u` K.
    struct Shifted {
        inner: AntoineConstants,
        shift: f64,
        u: Option<f64>,
    }
    impl Curve for Shifted {
        fn ln_p(&self, t: f64) -> f64 {
            self.inner.ln_p(t - self.shift)
        }
        fn valid_range_k(&self) -> Option<(f64, f64)> {
            None
        }
        fn t_uncertainty_k(&self, _p: f64) -> Option<f64> {
            self.u
        }
    }

    fn comp(name: &str, abc: (f64, f64, f64), shift: f64, u: Option<f64>) -> Component {
        let conv = "ln,kPa,degC".parse().unwrap();
        let inner = AntoineConstants::new(abc.0, abc.1, abc.2, conv);
        Component::new(name, Box::new(Shifted { inner, shift, u }), "test")
    }

    const BZ: (f64, f64, f64) = (13.7819, 2726.81, 217.572);
    const TOL: (f64, f64, f64) = (13.9320, 3056.96, 217.625);

    /// The delta-method slope agrees with actually shifting one curve by u.
    #[test]
    fn delta_method_matches_a_finite_shift_of_one_curve() {
        let p = 20_000.0;
        let u = 0.5;
        let bz = comp("benzene", BZ, 0.0, Some(u));
        let tol = comp("toluene", TOL, 0.0, None);
        let base = pair_volatility(&bz, &tol, p).unwrap();
        let au = alpha_uncertainty(&bz, &tol, p, base.light_tb_k, base.heavy_tb_k).unwrap();
        assert_eq!(au.not_stated, vec!["toluene".to_string()]);
        let bz_up = comp("benzene", BZ, u, None);
        let moved = pair_volatility(&bz_up, &tol, p).unwrap();
        let d = (base.geometric_mean.ln() - moved.geometric_mean.ln()).abs();
        assert!(
            (d - au.u_ln_alpha).abs() < 0.05 * au.u_ln_alpha,
            "{d} vs {}",
            au.u_ln_alpha
        );
    }

    #[test]
    fn stage_interval_brackets_the_value_and_opens_near_alpha_one() {
        let n = fenske::min_stages(1.5, 0.99, 0.99).unwrap().unwrap();
        let s = stages_uncertainty(1.5, 0.02, 0.99, 0.99).unwrap().unwrap();
        assert!(s.ci95_low < n && s.ci95_high.unwrap() > n);
        assert!(s.u > 0.0);
        let wide = stages_uncertainty(1.02, 0.05, 0.99, 0.99).unwrap().unwrap();
        assert!(wide.ci95_high.is_none());
    }
}
