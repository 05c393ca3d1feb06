//! Ideal relative volatility from Raoult's law: the ratio of pure-component vapor pressures.
//!
//! For an ideal liquid mixture obeying Raoult's law, `y_i P = x_i p_i°(T)`, so
//! the relative volatility of a light component L over a heavy one H is
//! `α = (y_L/x_L)/(y_H/x_H) = p_L°(T) / p_H°(T)`, independent of composition
//! but dependent on temperature. Over a distillation the temperature runs from
//! the light component's boiling point to the heavy one's, so α is reported at
//! both and as their geometric mean `√(α(T_L)·α(T_H))`, the value usually fed
//! to the Fenske equation.
//!
//! Reference: Raoult's law and the relative volatility as defined in any
//! unit-operations text, e.g. McCabe, Smith & Harriott, *Unit Operations of
//! Chemical Engineering*, chapter on distillation (from memory).

use super::{Component, PlanError};
use serde::Serialize;

/// Relative volatility `p_L°(T)/p_H°(T)` of `light` over `heavy` at `t_k`.
pub fn alpha_at(light: &Component, heavy: &Component, t_k: f64) -> Result<f64, PlanError> {
    Ok((light.ln_p(t_k)? - heavy.ln_p(t_k)?).exp())
}

/// Boiling points and relative volatility of a pair at one pressure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PairVolatility {
    /// Name of the more volatile component (lower boiling point).
    pub light: String,
    /// Name of the less volatile component.
    pub heavy: String,
    /// Boiling point of the light component at the pressure, K.
    pub light_tb_k: f64,
    /// Boiling point of the heavy component at the pressure, K.
    pub heavy_tb_k: f64,
    /// Boiling-point difference `heavy_tb_k − light_tb_k`, K.
    pub delta_tb_k: f64,
    /// α at the light component's boiling point.
    pub at_light_tb: f64,
    /// α at the heavy component's boiling point.
    pub at_heavy_tb: f64,
    /// Geometric mean of the two.
    pub geometric_mean: f64,
}

/// Boiling points and ideal relative volatility of two components at `p_pa`.
/// The components may be given in either order; the lower-boiling one is
/// reported as `light`.
pub fn pair_volatility(
    a: &Component,
    b: &Component,
    p_pa: f64,
) -> Result<PairVolatility, PlanError> {
    let (ta, tb) = (a.tb_k(p_pa)?, b.tb_k(p_pa)?);
    let (light, heavy, tl, th) = if ta <= tb {
        (a, b, ta, tb)
    } else {
        (b, a, tb, ta)
    };
    let at_l = alpha_at(light, heavy, tl)?;
    let at_h = alpha_at(light, heavy, th)?;
    Ok(PairVolatility {
        light: light.name.clone(),
        heavy: heavy.name.clone(),
        light_tb_k: tl,
        heavy_tb_k: th,
        delta_tb_k: th - tl,
        at_light_tb: at_l,
        at_heavy_tb: at_h,
        geometric_mean: (at_l * at_h).sqrt(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::vapor::AntoineConstants;

    fn svna(name: &str, a: f64, b: f64, c: f64) -> Component {
        let conv = "ln,kPa,degC".parse().unwrap();
        Component::new(name, Box::new(AntoineConstants::new(a, b, c, conv)), "test")
    }

    /// Benzene–toluene at 101.325 kPa from the published Antoine constants of
    /// Smith, Van Ness & Abbott, *Introduction to Chemical Engineering
    /// Thermodynamics*, App. B Table B.2 (the rows in
    /// reference-data/antoine-published.csv). The commonly quoted ideal
    /// relative volatility of this pair at atmospheric pressure is about
    /// 2.3–2.6 (common practice), falling from the benzene end to the toluene end.
    #[test]
    fn benzene_toluene_alpha_svna_app_b_within_common_practice_range() {
        let bz = svna("benzene", 13.7819, 2726.81, 217.572);
        let tol = svna("toluene", 13.9320, 3056.96, 217.625);
        let v = pair_volatility(&tol, &bz, 101_325.0).unwrap();
        assert_eq!(v.light, "benzene");
        assert!((v.light_tb_k - 353.2).abs() < 0.3, "{}", v.light_tb_k);
        assert!((v.heavy_tb_k - 383.8).abs() < 0.3, "{}", v.heavy_tb_k);
        for a in [v.at_light_tb, v.at_heavy_tb, v.geometric_mean] {
            assert!((2.3..=2.65).contains(&a), "alpha {a}");
        }
        assert!(v.at_light_tb > v.at_heavy_tb);
        let gm = (v.at_light_tb * v.at_heavy_tb).sqrt();
        assert!((v.geometric_mean - gm).abs() < 1e-12);
    }

    #[test]
    fn alpha_of_a_component_with_itself_is_one() {
        let bz = svna("benzene", 13.7819, 2726.81, 217.572);
        let a = alpha_at(&bz, &bz, 350.0).unwrap();
        assert!((a - 1.0).abs() < 1e-12);
    }
}
