//! Critical constants against the boiling point: Tb < Tc, Guldberg's ratio, pc > 1 atm.
//!
//! Reference: Guldberg's rule, Tb/Tc ≈ 2/3 for most liquids. The band used
//! here, 0.5–0.85, is common practice: it holds from water (0.58) to long
//! alkanes (about 0.8), so a ratio outside it points at a wrong entry.

use super::finding::{CheckCode, Finding};
use crate::units::ATM_PA;

/// Band of Tb/Tc accepted as plausible (common practice).
pub const GULDBERG_BAND: (f64, f64) = (0.5, 0.85);

/// Check `tb_k` (listed, or implied when `listed` is false) against Tc and pc.
pub fn check_critical(
    tb_k: Option<f64>,
    listed: bool,
    tc_k: Option<f64>,
    pc_pa: Option<f64>,
    out: &mut Vec<Finding>,
) {
    if let Some(pc) = pc_pa {
        if pc <= ATM_PA || pc.is_nan() {
            out.push(Finding::new(
                CheckCode::PcImplausible,
                format!(
                    "The critical pressure {:.3} bar is not above one atmosphere, so no normal boiling point could exist.",
                    pc / 1e5
                ),
            ));
        }
    }
    let (Some(tb), Some(tc)) = (tb_k, tc_k) else {
        return;
    };
    let which = if listed { "listed" } else { "implied" };
    if tb >= tc {
        out.push(Finding::new(
            CheckCode::TbAboveTc,
            format!(
                "The {which} boiling point {tb:.1} K is not below the critical temperature {tc:.1} K."
            ),
        ));
        return;
    }
    let r = tb / tc;
    let (lo, hi) = GULDBERG_BAND;
    if !(lo..=hi).contains(&r) {
        out.push(Finding::new(
            CheckCode::GuldbergRatio,
            format!(
                "Tb/Tc = {r:.2} ({which} Tb {tb:.1} K, Tc {tc:.1} K) is far from Guldberg's ratio of about 2/3 (accepted {lo}–{hi}, common practice)."
            ),
        ));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Water: Tb 373.124 K, Tc 647.096 K, pc 22.064 MPa (IAPWS-IF97 constants
    // as recorded in reference-data/IAPWS-IF97-saturation.md).
    #[test]
    fn iapws_water_is_plausible_and_faults_are_found() {
        let mut out = vec![];
        check_critical(Some(373.124), true, Some(647.096), Some(22.064e6), &mut out);
        assert!(out.is_empty(), "{out:?}");
        check_critical(Some(700.0), true, Some(647.096), Some(50_000.0), &mut out);
        let codes: Vec<_> = out.iter().map(|f| f.code).collect();
        assert_eq!(codes, [CheckCode::PcImplausible, CheckCode::TbAboveTc]);
        out.clear();
        check_critical(Some(373.124), true, Some(1200.0), None, &mut out);
        assert_eq!(out[0].code, CheckCode::GuldbergRatio);
    }
}
