//! Antoine-implied normal boiling point against the listed one, with the slip diagnosis.
//!
//! The implied boiling point is where the constants give 101.325 kPa, in
//! closed form t = B/(A − log p) − C. When it differs from the listed value by
//! more than the tolerance (default 1 K: published Antoine sets reproduce
//! their source's normal boiling point to a few tenths of a kelvin), the row
//! gets `tb-antoine-mismatch` and, only when one usual slip explains it and
//! the evidence singles it out (far beyond the tolerance, the only candidate),
//! a second finding naming the slip ([`super::slip`]).

use super::finding::{CheckCode, Finding};
use super::number_text::Message;
use super::slip::diagnose;
use crate::units::TemperatureUnit;
use crate::vapor::AntoineConstants;

/// Default tolerance between implied and listed boiling points, K.
pub const DEFAULT_TOLERANCE_K: f64 = 1.0;

/// Compare implied and listed boiling points; push the mismatch and the slip.
pub fn check_implied_vs_listed(
    k: &AntoineConstants,
    implied_tb_k: f64,
    listed_tb_k: f64,
    tb_unit: TemperatureUnit,
    tol_k: f64,
    out: &mut Vec<Finding>,
) {
    let d = implied_tb_k - listed_tb_k;
    if d.abs() <= tol_k || d.is_nan() {
        return;
    }
    out.push(Finding::new(
        CheckCode::TbAntoineMismatch,
        Message::with_capacity(128)
            .text("The Antoine constants imply a normal boiling point of ")
            .d1(implied_tb_k)
            .text(" K; the listed ")
            .d1(listed_tb_k)
            .text(" K disagrees by ")
            .d1(d.abs())
            .text(" K (tolerance ")
            .shortest(tol_k)
            .text(" K).")
            .done(),
    ));
    if let Some(slip) = diagnose(k, listed_tb_k, tb_unit, tol_k) {
        out.push(Finding::new(slip.code, slip.message));
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::ATM_PA;
    use crate::vapor::Curve;

    // Acetone, Smith, Van Ness & Abbott App. B Table B.2, tn 56.2 °C = 329.35 K.
    #[test]
    fn svna_acetone_agrees_then_a_planted_mmhg_label_is_diagnosed() {
        let k = AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,kPa,degC".parse().unwrap());
        let t = k.t_at(ATM_PA).unwrap();
        let mut out = vec![];
        check_implied_vs_listed(&k, t, 329.35, TemperatureUnit::Kelvin, 1.0, &mut out);
        assert!(out.is_empty(), "{out:?}");

        let wrong =
            AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,mmHg,degC".parse().unwrap());
        let t = wrong.t_at(ATM_PA).unwrap();
        check_implied_vs_listed(&wrong, t, 329.35, TemperatureUnit::Kelvin, 1.0, &mut out);
        let codes: Vec<_> = out.iter().map(|f| f.code).collect();
        assert_eq!(
            codes,
            [CheckCode::TbAntoineMismatch, CheckCode::SlipPressureUnit]
        );
    }
}
