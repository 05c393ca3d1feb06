//! The Fenske equation: minimum theoretical stages at total reflux for a binary split.
//!
//! `N_min = ln[ (x_D/(1 − x_D)) · (x_B/(1 − x_B)) ] / ln α`, with `x_D` the
//! mole fraction of the light component in the distillate, `x_B` the mole
//! fraction of the heavy component in the bottoms, and α the (constant)
//! relative volatility. N_min counts theoretical stages including the
//! reboiler (the still pot of a batch column). A real column at finite reflux
//! needs more; roughly twice N_min is a usual first guess (common practice).
//!
//! Reference: M. R. Fenske, "Fractionation of straight-run Pennsylvania
//! gasoline", *Ind. Eng. Chem.* 24 (1932) 482–485 (from memory).

use super::PlanError;

/// The separation factor `(x_D/(1 − x_D))·(x_B/(1 − x_B))`.
pub fn separation_factor(distillate_purity: f64, bottoms_purity: f64) -> Result<f64, PlanError> {
    check_purity("distillate purity", distillate_purity)?;
    check_purity("bottoms purity", bottoms_purity)?;
    Ok(distillate_purity / (1.0 - distillate_purity) * bottoms_purity / (1.0 - bottoms_purity))
}

/// Fenske minimum theoretical stages for relative volatility `alpha`.
/// Returns `None` when `alpha ≤ 1` (no separation by distillation at all).
///
/// ```
/// // α = 2.5, 99 % at both ends: ln(99·99)/ln 2.5 ≈ 10.03
/// let n = ebullio::plan::fenske::min_stages(2.5, 0.99, 0.99).unwrap().unwrap();
/// assert!((n - 10.03).abs() < 0.01);
/// ```
pub fn min_stages(
    alpha: f64,
    distillate_purity: f64,
    bottoms_purity: f64,
) -> Result<Option<f64>, PlanError> {
    let s = separation_factor(distillate_purity, bottoms_purity)?;
    if !(alpha.is_finite() && alpha > 1.0) {
        return Ok(None);
    }
    Ok(Some(s.ln() / alpha.ln()))
}

fn check_purity(what: &'static str, v: f64) -> Result<(), PlanError> {
    if v.is_finite() && v > 0.5 && v < 1.0 {
        Ok(())
    } else {
        Err(PlanError::BadPurity { what, value: v })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand calculation (written out here, no outside source):
    /// α = 2.5, x_D = 0.99, x_B = 0.98.
    /// x_D/(1 − x_D) = 0.99/0.01 = 99; x_B/(1 − x_B) = 0.98/0.02 = 49;
    /// S = 99 · 49 = 4851; ln 4851 = 8.486940; ln 2.5 = 0.916291;
    /// N_min = 8.486940 / 0.916291 = 9.26228.
    #[test]
    fn fenske_matches_hand_calculation() {
        let s = separation_factor(0.99, 0.98).unwrap();
        assert!((s - 4851.0).abs() < 1e-9);
        let n = min_stages(2.5, 0.99, 0.98).unwrap().unwrap();
        assert!((n - 9.26228).abs() < 1e-4, "{n}");
    }

    #[test]
    fn alpha_at_or_below_one_gives_no_stage_count() {
        assert_eq!(min_stages(1.0, 0.99, 0.99).unwrap(), None);
        assert_eq!(min_stages(0.8, 0.99, 0.99).unwrap(), None);
    }

    #[test]
    fn purities_outside_half_to_one_are_errors() {
        assert!(min_stages(2.0, 1.0, 0.99).is_err());
        assert!(min_stages(2.0, 0.99, 0.4).is_err());
        assert!(min_stages(2.0, f64::NAN, 0.99).is_err());
    }
}
