//! Impossible or implausible Antoine constants: B ≤ 0, t + C ≤ 0, no boiling
//! point, an inverted range, and the Trouton plausibility of ΔSvap at Tb.
//!
//! Reference: Trouton's rule (ΔSvap at the normal boiling point is roughly
//! constant for non-associating liquids); the band used is common practice,
//! see [`crate::vapor::slope::TROUTON_BAND_J_MOL_K`].

use super::finding::{CheckCode, Finding};
use super::number_text::OneDecimal as D1;
use crate::vapor::slope::{svap_j_mol_k, trouton_plausible, TROUTON_BAND_J_MOL_K};
use crate::vapor::AntoineConstants;

/// Check the constants themselves. `implied_tb_k` is the temperature where
/// they give one atmosphere (None when they never do); `listed_tb_k` is used
/// for the denominator test when no range is given.
pub fn check_constants(
    k: &AntoineConstants,
    implied_tb_k: Option<f64>,
    listed_tb_k: Option<f64>,
    out: &mut Vec<Finding>,
) {
    if k.b <= 0.0 || k.b.is_nan() {
        out.push(Finding::new(
            CheckCode::AntoineBNotPositive,
            format!(
                "B = {} is not positive, so the vapor pressure would not rise with temperature.",
                k.b
            ),
        ));
        return;
    }
    let (lo, hi) = match k.range_k {
        Some((lo, hi)) => (
            if lo.is_finite() { lo } else { hi },
            if hi.is_finite() { hi } else { lo },
        ),
        None => match listed_tb_k.or(implied_tb_k) {
            Some(t) => (t, t),
            None => (f64::NAN, f64::NAN),
        },
    };
    if let Some((rlo, rhi)) = k.range_k {
        if rlo.is_finite() && rhi.is_finite() && rlo >= rhi {
            out.push(Finding::new(
                CheckCode::RangeInverted,
                format!(
                    "The validity range {rlo:.1}–{rhi:.1} K is empty: Tmin must be below Tmax."
                ),
            ));
        }
    }
    if lo.is_finite() && hi.is_finite() && !k.denominator_positive_on(lo, hi) {
        let u = k.convention.t_unit;
        let worst = (u.from_kelvin(lo) + k.c).min(u.from_kelvin(hi) + k.c);
        out.push(Finding::new(
            CheckCode::AntoineDenominatorNotPositive,
            format!(
                "t + C falls to {} (C = {}) within {}–{} K, where the Antoine equation is undefined.",
                D1(worst),
                k.c,
                D1(lo),
                D1(hi)
            ),
        ));
        return;
    }
    let Some(tb) = implied_tb_k else {
        out.push(Finding::new(
            CheckCode::AntoineNoBoilingPoint,
            format!(
                "The constants never reach one atmosphere (A = {} is too small for the {} convention), so they imply no normal boiling point.",
                k.a, k.convention
            ),
        ));
        return;
    };
    let s = svap_j_mol_k(k, tb);
    if !trouton_plausible(s) {
        let (blo, bhi) = TROUTON_BAND_J_MOL_K;
        out.push(Finding::new(
            CheckCode::TroutonImplausible,
            format!(
                "The constants imply an entropy of vaporization of {s:.0} J/(mol·K) at {tb:.1} K, outside the usual {blo:.0}–{bhi:.0} (Trouton's rule, common practice)."
            ),
        ));
    }
}

/// Whether `t_k` lies outside the constants' validity range; pushes
/// `tb-outside-range` naming whether the listed or the implied value is meant.
pub fn check_range(k: &AntoineConstants, t_k: f64, listed: bool, out: &mut Vec<Finding>) {
    let Some((lo, hi)) = k.range_k else { return };
    if !t_k.is_finite() || (t_k >= lo && t_k <= hi) {
        return;
    }
    let which = if listed { "listed" } else { "implied" };
    let range = match (lo.is_finite(), hi.is_finite()) {
        (true, true) => format!("{lo:.1}–{hi:.1} K"),
        (true, false) => format!("from {lo:.1} K up"),
        (false, true) => format!("up to {hi:.1} K"),
        (false, false) => return,
    };
    out.push(Finding::new(
        CheckCode::TbOutsideRange,
        format!(
            "The {which} boiling point {t_k:.1} K lies outside the constants' validity range ({range}), so using them there is an extrapolation."
        ),
    ));
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::ATM_PA;
    use crate::vapor::Curve;

    fn codes(v: &[Finding]) -> Vec<crate::finding::Code> {
        v.iter().map(|f| f.code).collect()
    }

    // Benzene, Smith, Van Ness & Abbott App. B Table B.2, ln/kPa/°C, 6–104 °C.
    fn benzene() -> AntoineConstants {
        AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap())
            .with_range_k(279.15, 377.15)
    }

    #[test]
    fn svna_benzene_is_plausible() {
        let k = benzene();
        let tb = k.t_at(ATM_PA);
        let mut out = vec![];
        check_constants(&k, tb, Some(353.15), &mut out);
        check_range(&k, 353.15, true, &mut out);
        assert!(out.is_empty(), "{out:?}");
    }

    #[test]
    fn impossible_constants_are_errors() {
        let mut k = benzene();
        k.b = -2726.81;
        let mut out = vec![];
        check_constants(&k, None, Some(353.15), &mut out);
        assert_eq!(codes(&out), [CheckCode::AntoineBNotPositive]);

        let mut k = benzene();
        k.c = -217.572; // t + C < 0 across 6–104 °C
        let mut out = vec![];
        check_constants(&k, k.t_at(ATM_PA), Some(353.15), &mut out);
        assert_eq!(codes(&out), [CheckCode::AntoineDenominatorNotPositive]);

        let mut k = benzene();
        k.a = 3.0; // never reaches 1 atm
        let mut out = vec![];
        check_constants(&k, k.t_at(ATM_PA), None, &mut out);
        assert_eq!(codes(&out), [CheckCode::AntoineNoBoilingPoint]);
    }

    #[test]
    fn halved_b_breaks_trouton_and_range_is_checked() {
        let mut k = benzene();
        k.b /= 2.0;
        k.a -= 6.0;
        let mut out = vec![];
        check_constants(&k, k.t_at(ATM_PA), None, &mut out);
        assert!(
            codes(&out).contains(&CheckCode::TroutonImplausible.into()),
            "{out:?}"
        );
        let mut out = vec![];
        check_range(&benzene(), 400.0, true, &mut out);
        assert_eq!(codes(&out), [CheckCode::TbOutsideRange]);
    }
}
