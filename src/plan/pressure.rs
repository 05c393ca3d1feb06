//! Choosing the operating pressure: from a maximum pot temperature, rounded to a holdable set-point.
//!
//! For heat-sensitive material the pot temperature is the constraint, and the
//! usual choice (common practice) is the *highest* pressure at which the
//! heaviest component still boils at or below the limit: higher pressure
//! means warmer condensing, smaller vapor volumes and an easier vacuum. That
//! pressure is simply the heaviest component's vapor pressure at the limit.
//!
//! **Rounding rule.** A vacuum controller cannot hold 47.318 mbar, so the
//! pressure is rounded *down* to two significant figures in millibar
//! (47.318 → 47 mbar, 432.9 → 430 mbar, 0.5678 → 0.56 mbar). Rounding down
//! always lands on the safe side: at a lower pressure the heaviest component
//! boils below the limit, never above it. The pressure is also capped at one
//! standard atmosphere: the plan never proposes a pressurised still.

use super::{Component, PlanError};
use crate::units::ATM_PA;
use serde::Serialize;

/// The rounding rule in words (shown in the output).
pub const ROUNDING_RULE: &str =
    "rounded down to 2 significant figures in mbar (always to the lower, safer pressure), capped at 1 atm";

/// Round a pressure down to two significant figures in millibar.
///
/// ```
/// use ebullio::plan::pressure::round_down_setpoint;
/// assert!((round_down_setpoint(4731.8) - 4700.0).abs() < 1e-9); // 47.318 mbar -> 47 mbar
/// assert!((round_down_setpoint(43_290.0) - 43_000.0).abs() < 1e-9);
/// assert!((round_down_setpoint(56.78) - 56.0).abs() < 1e-9); // 0.5678 mbar -> 0.56 mbar
/// ```
pub fn round_down_setpoint(p_pa: f64) -> f64 {
    if !(p_pa.is_finite() && p_pa > 0.0) {
        return p_pa;
    }
    let mbar = crate::units::pa_to_mbar(p_pa);
    let e = mbar.log10().floor() as i32 - 1;
    // Work with an exact integer power so 0.56 is 56/100, not 56*0.01.
    let (count, back): (f64, Box<dyn Fn(f64) -> f64>) = if e >= 0 {
        let s = 10f64.powi(e);
        ((mbar / s).floor(), Box::new(move |k| k * s))
    } else {
        let s = 10f64.powi(-e);
        ((mbar * s).floor(), Box::new(move |k| k / s))
    };
    let mut r = back(count);
    if r > mbar {
        r = back(count - 1.0);
    }
    r * crate::units::PA_PER_MBAR
}

/// The pressure found from a maximum pot temperature.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MaxPotPressure {
    /// The limit, K.
    pub max_pot_k: f64,
    /// The component with the lowest vapor pressure at the limit.
    pub heaviest: String,
    /// Its vapor pressure at the limit (capped at 1 atm), Pa, before rounding.
    pub unrounded_pa: f64,
    /// The set-point after [`round_down_setpoint`], Pa.
    pub setpoint_pa: f64,
    /// Whether the 1 atm cap applied (the heaviest boils below the limit even at 1 atm).
    pub capped_at_atmosphere: bool,
}

/// The highest pressure at which every component boils at or below `max_pot_k`,
/// i.e. the heaviest component's vapor pressure there, then rounded down.
pub fn pressure_for_max_pot(
    components: &[Component],
    max_pot_k: f64,
) -> Result<MaxPotPressure, PlanError> {
    let mut best: Option<(f64, &Component)> = None;
    for c in components {
        let lp = c.ln_p(max_pot_k)?;
        if best.is_none_or(|(b, _)| lp < b) {
            best = Some((lp, c));
        }
    }
    let (lp, heavy) = best.ok_or(PlanError::TooFewComponents { found: 0 })?;
    let raw = lp.exp();
    let capped = raw > ATM_PA;
    let unrounded = raw.min(ATM_PA);
    Ok(MaxPotPressure {
        max_pot_k,
        heaviest: heavy.name.clone(),
        unrounded_pa: unrounded,
        setpoint_pa: if capped {
            ATM_PA
        } else {
            round_down_setpoint(unrounded)
        },
        capped_at_atmosphere: capped,
    })
}

/// A small ladder of pressures (Pa) for the table of α against pressure:
/// 1 atm and the 1-2-5 steps from 500 mbar down to 1 mbar, plus `extra`
/// (the operating pressure), sorted from high to low without repeats.
pub fn ladder(extra: f64) -> Vec<f64> {
    let mut v: Vec<f64> = vec![
        ATM_PA, 50_000.0, 20_000.0, 10_000.0, 5_000.0, 2_000.0, 1_000.0, 500.0, 200.0, 100.0,
    ];
    if extra.is_finite() && extra > 0.0 && !v.iter().any(|p| (p - extra).abs() < 1e-6 * extra) {
        v.push(extra);
    }
    v.sort_by(|a, b| b.total_cmp(a));
    v
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::vapor::AntoineConstants;

    fn svna(name: &str, a: f64, b: f64, c: f64) -> Component {
        let conv = "ln,kPa,degC".parse().unwrap();
        Component::new(name, Box::new(AntoineConstants::new(a, b, c, conv)), "test")
    }

    #[test]
    fn rounding_is_always_down_and_two_significant_figures() {
        for (pa, want) in [
            (4731.8, 4700.0),
            (100.0, 100.0),
            (99_999.0, 99_000.0),
            (12.34, 12.0),
            (1234.0, 1200.0),
        ] {
            let r = round_down_setpoint(pa);
            assert!((r - want).abs() < 1e-9 * want, "{pa} -> {r}, want {want}");
            assert!(r <= pa);
        }
    }

    /// `--max-pot` round trip: the unrounded pressure puts the heaviest
    /// component's boiling point at the limit within 0.1 K, and the rounded
    /// set-point puts it at or below the limit.
    #[test]
    fn max_pot_round_trip_puts_heaviest_at_the_limit() {
        // Toluene and n-octane, Smith, Van Ness & Abbott App. B Table B.2.
        let comps = [
            svna("toluene", 13.9320, 3056.96, 217.625),
            svna("n-octane", 13.9346, 3123.13, 209.635),
        ];
        let limit = crate::units::CELSIUS_OFFSET + 80.0;
        let r = pressure_for_max_pot(&comps, limit).unwrap();
        assert_eq!(r.heaviest, "n-octane");
        let t = comps[1].tb_k(r.unrounded_pa).unwrap();
        assert!((t - limit).abs() < 0.1, "{t} vs {limit}");
        let t_set = comps[1].tb_k(r.setpoint_pa).unwrap();
        assert!(t_set <= limit, "{t_set}");
        assert!(r.setpoint_pa <= r.unrounded_pa && r.setpoint_pa >= 0.9 * r.unrounded_pa);
    }

    #[test]
    fn a_limit_above_the_normal_boiling_point_caps_at_one_atmosphere() {
        let comps = [
            svna("benzene", 13.7819, 2726.81, 217.572),
            svna("toluene", 13.9320, 3056.96, 217.625),
        ];
        let r = pressure_for_max_pot(&comps, crate::units::CELSIUS_OFFSET + 150.0).unwrap();
        assert!(r.capped_at_atmosphere);
        assert_eq!(r.setpoint_pa, ATM_PA);
    }
}
