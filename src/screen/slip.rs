//! Unit-slip diagnosis: which usual slip makes the constants and the listed Tb agree.
//!
//! When the Antoine-implied normal boiling point disagrees with the listed
//! one, the usual causes are few: constants in kPa labelled mmHg (or any other
//! pressure unit), constants for t in K labelled °C (C off by 273.15), natural
//! logarithm constants labelled log10, A and B swapped, or a boiling point in
//! °C written into a kelvin column. Each alternative is tried; the simplest
//! one that brings the implied Tb within tolerance of the listed Tb is named.

use super::finding::Code;
use crate::units::{PressureUnit, TemperatureUnit, ATM_PA, CELSIUS_OFFSET};
use crate::vapor::slope::{svap_j_mol_k, trouton_plausible};
use crate::vapor::{AntoineConstants, AntoineConvention, Curve, LogBase};

/// Pressure units tried as slips (the ones tables actually mix up).
pub const SLIP_PRESSURE_UNITS: [PressureUnit; 6] = [
    PressureUnit::KPa,
    PressureUnit::MmHg,
    PressureUnit::Bar,
    PressureUnit::Pa,
    PressureUnit::Atm,
    PressureUnit::Psi,
];

/// A slip that explains the disagreement.
#[derive(Debug, Clone, PartialEq)]
pub struct Slip {
    /// Which slip (one of the `slip-*` codes).
    pub code: Code,
    /// The boiling point the row gives once the slip is undone, K.
    pub corrected_tb_k: f64,
    /// The value it is compared with, K (listed Tb, or implied Tb for a Tb slip).
    pub matches_k: f64,
    /// One sentence naming the slip.
    pub message: String,
}

fn implied(k: &AntoineConstants) -> Option<f64> {
    k.t_at(ATM_PA)
}

fn t_unit_word(u: TemperatureUnit) -> &'static str {
    match u {
        TemperatureUnit::Kelvin => "K",
        TemperatureUnit::Celsius => "°C",
        TemperatureUnit::Fahrenheit => "°F",
        TemperatureUnit::Rankine => "°R",
    }
}

/// Try the usual slips on constants `k` and the listed boiling point
/// `listed_tb_k` (written in `tb_unit`). Returns the simplest slip whose
/// correction brings the two within `tol_k`, or `None`.
///
/// Some slips are arithmetically the same: 110.6 written in a kelvin column
/// matches °C constants read as if for kelvin. Such ties are broken by
/// physics: a candidate whose corrected curve gives an entropy of
/// vaporization outside the Trouton band at its boiling point counts as one
/// more change (Trouton's rule; the band is common practice).
///
/// ```
/// use ebullio::screen::slip::diagnose;
/// use ebullio::screen::Code;
/// use ebullio::units::TemperatureUnit;
/// use ebullio::vapor::AntoineConstants;
/// // Toluene ln(p/kPa) constants (Smith, Van Ness & Abbott, App. B Table B.2)
/// // labelled as ln(p/mmHg): the listed 383.8 K only fits with kPa.
/// let k = AntoineConstants::new(13.9320, 3056.96, 217.625, "ln,mmHg,degC".parse().unwrap());
/// let slip = diagnose(&k, 383.8, TemperatureUnit::Kelvin, 1.0).unwrap();
/// assert_eq!(slip.code, Code::SlipPressureUnit);
/// assert!(slip.message.contains("kPa, not mmHg"));
/// ```
pub fn diagnose(
    k: &AntoineConstants,
    listed_tb_k: f64,
    tb_unit: TemperatureUnit,
    tol_k: f64,
) -> Option<Slip> {
    let declared = k.convention;
    // (changes, residual, slip)
    let mut best: Option<(u8, f64, Slip)> = None;
    let mut offer = |changes: u8, residual: f64, curve: &AntoineConstants, slip: Slip| {
        if !(residual.is_finite() && residual <= tol_k) {
            return;
        }
        let plausible = trouton_plausible(svap_j_mol_k(curve, slip.corrected_tb_k));
        let changes = changes + u8::from(!plausible);
        let better = match &best {
            None => true,
            Some((c, r, _)) => changes < *c || (changes == *c && residual < *r),
        };
        if better {
            best = Some((changes, residual, slip));
        }
    };

    // 1. Another convention (pressure unit, log base, K vs °C), alone or combined.
    let t_units: Vec<TemperatureUnit> = match declared.t_unit {
        TemperatureUnit::Kelvin | TemperatureUnit::Celsius => {
            vec![TemperatureUnit::Kelvin, TemperatureUnit::Celsius]
        }
        other => vec![other],
    };
    for log_base in [LogBase::Ten, LogBase::E] {
        for &p_unit in &SLIP_PRESSURE_UNITS {
            for &t_unit in &t_units {
                let conv = AntoineConvention {
                    log_base,
                    p_unit,
                    t_unit,
                };
                if conv == declared {
                    continue;
                }
                let alt = AntoineConstants {
                    convention: conv,
                    ..*k
                };
                let Some(t) = implied(&alt) else { continue };
                let dp = u8::from(p_unit != declared.p_unit);
                let db = u8::from(log_base != declared.log_base);
                let dt = u8::from(t_unit != declared.t_unit);
                let changes = dp + db + dt;
                let tail =
                    format!("the implied Tb is {t:.1} K, matching the listed {listed_tb_k:.1} K");
                let (code, message) = match (dp, db, dt) {
                    (1, 0, 0) => (
                        Code::SlipPressureUnit,
                        format!(
                            "The constants look like {}, not {}: with {} {tail}.",
                            p_unit.symbol(),
                            declared.p_unit.symbol(),
                            p_unit.symbol()
                        ),
                    ),
                    (0, 1, 0) => (
                        Code::SlipLogBase,
                        format!(
                            "The constants look like {}, not {}: with {} {tail}.",
                            log_base.symbol(),
                            declared.log_base.symbol(),
                            log_base.symbol()
                        ),
                    ),
                    (0, 0, 1) => (
                        Code::SlipConstantsTemperatureUnit,
                        format!(
                            "The constants look like they are for t in {}, not {} (C = {}): read that way {tail}.",
                            t_unit_word(t_unit),
                            t_unit_word(declared.t_unit),
                            k.c
                        ),
                    ),
                    _ => (
                        Code::SlipConvention,
                        format!(
                            "The constants look like {conv}, not {declared}: with {conv} {tail}."
                        ),
                    ),
                };
                offer(
                    changes,
                    (t - listed_tb_k).abs(),
                    &alt,
                    Slip {
                        code,
                        corrected_tb_k: t,
                        matches_k: listed_tb_k,
                        message,
                    },
                );
            }
        }
    }

    // 2. A and B swapped.
    let swapped = AntoineConstants {
        a: k.b,
        b: k.a,
        ..*k
    };
    if let Some(t) = implied(&swapped) {
        offer(
            1,
            (t - listed_tb_k).abs(),
            &swapped,
            Slip {
                code: Code::SlipSwappedAB,
                corrected_tb_k: t,
                matches_k: listed_tb_k,
                message: format!(
                    "A and B look swapped: with A = {} and B = {} the implied Tb is {t:.1} K, matching the listed {listed_tb_k:.1} K.",
                    k.b, k.a
                ),
            },
        );
    }

    // 3. The listed Tb written in the wrong temperature unit.
    if let Some(t_impl) = implied(k) {
        let number = tb_unit.from_kelvin(listed_tb_k);
        let alternatives: &[(TemperatureUnit, f64)] = match tb_unit {
            TemperatureUnit::Kelvin => &[(TemperatureUnit::Celsius, number + CELSIUS_OFFSET)],
            TemperatureUnit::Celsius => &[(TemperatureUnit::Kelvin, number)],
            _ => &[],
        };
        for &(was, as_k) in alternatives {
            offer(
                1,
                (as_k - t_impl).abs(),
                k,
                Slip {
                    code: Code::SlipTbTemperatureUnit,
                    corrected_tb_k: as_k,
                    matches_k: t_impl,
                    message: format!(
                        "The listed boiling point looks like {} written as {}: {number} {} is {as_k:.1} K, matching the implied {t_impl:.1} K.",
                        t_unit_word(was),
                        t_unit_word(tb_unit),
                        t_unit_word(was)
                    ),
                },
            );
        }
    }
    best.map(|(_, _, s)| s)
}

#[cfg(test)]
mod tests {
    use super::*;

    // Toluene, Smith, Van Ness & Abbott App. B Table B.2: ln(p/kPa) = 13.9320 −
    // 3056.96/(t/°C + 217.625); tn = 110.6 °C = 383.75 K (C from memory, see
    // reference-data/SOURCES.md).
    const TOLUENE: (f64, f64, f64) = (13.9320, 3056.96, 217.625);
    const TOLUENE_TB_K: f64 = 383.75;

    fn toluene(conv: &str) -> AntoineConstants {
        AntoineConstants::new(TOLUENE.0, TOLUENE.1, TOLUENE.2, conv.parse().unwrap())
    }

    #[test]
    fn svna_toluene_kpa_labelled_mmhg_is_a_pressure_slip() {
        let s = diagnose(
            &toluene("ln,mmHg,degC"),
            TOLUENE_TB_K,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, Code::SlipPressureUnit);
        assert!(s.message.contains("kPa, not mmHg"), "{}", s.message);
        assert!((s.corrected_tb_k - TOLUENE_TB_K).abs() < 1.0);
    }

    #[test]
    fn svna_toluene_ln_labelled_log10_is_a_log_base_slip() {
        let s = diagnose(
            &toluene("log10,kPa,degC"),
            TOLUENE_TB_K,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, Code::SlipLogBase);
        assert!(s.message.contains("ln, not log10"), "{}", s.message);
    }

    #[test]
    fn svna_toluene_two_changes_is_a_convention_slip() {
        let s = diagnose(
            &toluene("log10,mmHg,degC"),
            TOLUENE_TB_K,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, Code::SlipConvention);
        assert!(s.message.contains("ln,kPa,degC"), "{}", s.message);
    }

    #[test]
    fn svna_toluene_swapped_and_celsius_tb() {
        let k = AntoineConstants::new(
            TOLUENE.1,
            TOLUENE.0,
            TOLUENE.2,
            "ln,kPa,degC".parse().unwrap(),
        );
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, Code::SlipSwappedAB);
        // 110.6 written into a K column
        let s = diagnose(&toluene("ln,kPa,degC"), 110.6, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, Code::SlipTbTemperatureUnit);
        assert!(s.message.contains("°C written as K"), "{}", s.message);
    }

    // Toluene in the ln(mmHg)/K form, Himmelblau App. H (after Reid, Prausnitz
    // & Sherwood): 16.0137, 3096.52, −53.67; labelled °C, C is off by 273.15.
    #[test]
    fn rps_toluene_kelvin_constants_labelled_celsius() {
        let k = AntoineConstants::new(16.0137, 3096.52, -53.67, "ln,mmHg,degC".parse().unwrap());
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, Code::SlipConstantsTemperatureUnit, "{}", s.message);
    }

    #[test]
    fn a_dropped_digit_is_not_explained() {
        // B with a digit dropped: 305.96 instead of 3056.96.
        let k = AntoineConstants::new(
            TOLUENE.0,
            305.696,
            TOLUENE.2,
            "ln,kPa,degC".parse().unwrap(),
        );
        assert!(diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).is_none());
    }
}
