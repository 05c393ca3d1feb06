//! Parsing quantities written with their unit, such as `"20 mbar"` or `"85 °C"`.

use super::pressure::ACCEPTED_P;
use super::pressure::{parse_pressure_scale, PressureScale};
use super::temperature::ACCEPTED_T;
use super::{Pressure, Temperature, TemperatureUnit, UnitError};

/// A temperature or a pressure read from text.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Quantity {
    /// An absolute temperature.
    Temperature(Temperature),
    /// An absolute pressure.
    Pressure(Pressure),
}

/// Split `"  -5.5 degC "` into the number text and the unit text.
fn split_number(s: &str) -> (&str, &str) {
    let s = s.trim();
    let mut end = 0;
    let bytes = s.as_bytes();
    let mut seen_e = false;
    while end < bytes.len() {
        let c = bytes[end] as char;
        let ok = c.is_ascii_digit()
            || c == '.'
            || ((c == '-' || c == '+')
                && (end == 0 || matches!(bytes[end - 1] as char, 'e' | 'E')))
            || ((c == 'e' || c == 'E')
                && !seen_e
                && end > 0
                && bytes[end - 1].is_ascii_digit()
                && bytes
                    .get(end + 1)
                    .is_some_and(|n| n.is_ascii_digit() || *n == b'-' || *n == b'+'));
        if !ok {
            break;
        }
        if c == 'e' || c == 'E' {
            seen_e = true;
        }
        end += 1;
    }
    (&s[..end], s[end..].trim())
}

fn number(text: &str, num: &str, example: &'static str) -> Result<f64, UnitError> {
    let lower = text.trim().to_ascii_lowercase();
    if lower.starts_with("nan") || lower.starts_with("inf") || lower.starts_with("-inf") {
        return Err(UnitError::NotFinite {
            text: text.trim().to_string(),
        });
    }
    let v: f64 = num.parse().map_err(|_| UnitError::NotANumber {
        text: text.trim().to_string(),
        example,
    })?;
    if !v.is_finite() {
        return Err(UnitError::NotFinite {
            text: text.trim().to_string(),
        });
    }
    Ok(v)
}

/// Parse a temperature with its unit: `"300 K"`, `"85 °C"`, `"-5.5 C"`, `"212 degF"`.
///
/// ```
/// use ebullio::units::parse_temperature;
/// assert!((parse_temperature("-5.5 C").unwrap().kelvin() - 267.65).abs() < 1e-12);
/// assert!(parse_temperature("85").is_err()); // a unit is required
/// ```
pub fn parse_temperature(s: &str) -> Result<Temperature, UnitError> {
    const EX: &str = "\"85 degC\" or \"300 K\"";
    let (num, unit) = split_number(s);
    let v = number(s, num, EX)?;
    if unit.is_empty() {
        return Err(UnitError::MissingUnit {
            text: s.trim().to_string(),
            example: EX,
        });
    }
    let u = TemperatureUnit::parse(unit)?;
    Temperature::new(v, u)
}

/// Parse a pressure with its unit: `"20 mbar"`, `"0.5 mmHg"`, `"1 atm"`, `"14.7 psi"`.
/// A gauge pressure (`"0.5 barg"`) is refused with a hint: see [`parse_pressure_at`].
///
/// ```
/// use ebullio::units::parse_pressure;
/// assert!((parse_pressure("1 atm").unwrap().pa() - 101_325.0).abs() < 1e-9);
/// assert!(parse_pressure("0 mbar").is_err());
/// assert!(parse_pressure("0.5 barg").unwrap_err().to_string().contains("barometric pressure"));
/// ```
pub fn parse_pressure(s: &str) -> Result<Pressure, UnitError> {
    parse_pressure_at(s, None)
}

/// Parse a pressure, absolute or gauge; a gauge value is made absolute by
/// adding `barometric` (the site's barometric pressure), and refused without it.
///
/// ```
/// use ebullio::units::{parse_pressure, parse_pressure_at};
/// let site = parse_pressure("1013 mbar").unwrap();
/// let p = parse_pressure_at("0.5 barg", Some(site)).unwrap();
/// assert!((p.pa() - 151_300.0).abs() < 1e-6);
/// let vac = parse_pressure_at("-950 mbarg", Some(site)).unwrap();
/// assert!((vac.pa() - 6_300.0).abs() < 1e-6);
/// ```
pub fn parse_pressure_at(s: &str, barometric: Option<Pressure>) -> Result<Pressure, UnitError> {
    const EX: &str = "\"20 mbar\" or \"101.325 kPa\"";
    let (num, unit) = split_number(s);
    let v = number(s, num, EX)?;
    if unit.is_empty() {
        return Err(UnitError::MissingUnit {
            text: s.trim().to_string(),
            example: EX,
        });
    }
    match parse_pressure_scale(unit)? {
        PressureScale::Absolute(u) => Pressure::new(v, u),
        PressureScale::Gauge(u) => {
            let Some(b) = barometric else {
                return Err(UnitError::GaugePressure {
                    unit: unit.to_string(),
                    base: u.symbol().to_string(),
                });
            };
            let pa = u.to_pa(v) + b.pa();
            if pa <= 0.0 {
                return Err(UnitError::NonPositivePressure {
                    value: v,
                    unit: unit.to_string(),
                });
            }
            Pressure::from_pa(pa)
        }
    }
}

/// Parse either kind of quantity, deciding by the unit.
///
/// ```
/// use ebullio::units::{parse_quantity, Quantity};
/// assert!(matches!(parse_quantity("20 mbar").unwrap(), Quantity::Pressure(_)));
/// assert!(matches!(parse_quantity("85 degC").unwrap(), Quantity::Temperature(_)));
/// ```
pub fn parse_quantity(s: &str) -> Result<Quantity, UnitError> {
    const EX: &str = "\"20 mbar\" or \"85 degC\"";
    let (num, unit) = split_number(s);
    let v = number(s, num, EX)?;
    if unit.is_empty() {
        return Err(UnitError::MissingUnit {
            text: s.trim().to_string(),
            example: EX,
        });
    }
    match parse_pressure_scale(unit) {
        Ok(PressureScale::Absolute(u)) => return Ok(Quantity::Pressure(Pressure::new(v, u)?)),
        Ok(PressureScale::Gauge(u)) => {
            return Err(UnitError::GaugePressure {
                unit: unit.to_string(),
                base: u.symbol().to_string(),
            })
        }
        Err(_) => {}
    }
    if let Ok(u) = TemperatureUnit::parse(unit) {
        return Ok(Quantity::Temperature(Temperature::new(v, u)?));
    }
    Err(UnitError::UnknownUnit {
        kind: "temperature or pressure",
        unit: unit.to_string(),
        accepted: format!("{ACCEPTED_T}; {ACCEPTED_P}"),
    })
}

/// [`parse_quantity`], with gauge pressures made absolute by `barometric` (refused without).
///
/// ```
/// use ebullio::units::{parse_pressure, parse_quantity_at, Quantity};
/// let site = parse_pressure("1000 mbar").unwrap();
/// let Quantity::Pressure(p) = parse_quantity_at("-980 mbarg", Some(site)).unwrap() else { panic!() };
/// assert!((p.pa() - 2_000.0).abs() < 1e-6);
/// assert!(parse_quantity_at("-980 mbarg", None).is_err());
/// ```
pub fn parse_quantity_at(s: &str, barometric: Option<Pressure>) -> Result<Quantity, UnitError> {
    match parse_quantity(s) {
        Err(UnitError::GaugePressure { .. }) if barometric.is_some() => {
            parse_pressure_at(s, barometric).map(Quantity::Pressure)
        }
        r => r,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::{tidy, PressureUnit};
    use proptest::prelude::*;

    #[test]
    fn examples_from_the_contract() {
        let p = |s| parse_pressure(s).unwrap().pa();
        let t = |s| parse_temperature(s).unwrap().kelvin();
        assert!((p("20 mbar") - 2000.0).abs() < 1e-9);
        assert!((p("14.7 psi") - 14.7 * 6894.757293).abs() < 1e-6);
        assert!((p("0.5 mmHg") - 66.661_193_707_5).abs() < 1e-9);
        assert!((p("1 atm") - 101_325.0).abs() < 1e-9);
        assert!((t("85 °C") - 358.15).abs() < 1e-9);
        assert!((t("85 degC") - 358.15).abs() < 1e-9);
        assert!((t("-5.5 C") - 267.65).abs() < 1e-9);
        assert!((t("300 K") - 300.0).abs() < 1e-12);
        assert!((t("1e2 degC") - 373.15).abs() < 1e-9);
        assert!((t("300K") - 300.0).abs() < 1e-12);
    }

    #[test]
    fn errors_are_specific() {
        assert!(matches!(
            parse_pressure("20 bananas"),
            Err(UnitError::UnknownUnit { .. })
        ));
        let msg = parse_pressure("20 bananas").unwrap_err().to_string();
        assert!(msg.contains("mmHg") && msg.contains("bananas"), "{msg}");
        assert!(matches!(
            parse_pressure("20"),
            Err(UnitError::MissingUnit { .. })
        ));
        assert!(matches!(
            parse_temperature("-300 degC"),
            Err(UnitError::BelowAbsoluteZero { .. })
        ));
        assert!(matches!(
            parse_pressure("-1 bar"),
            Err(UnitError::NonPositivePressure { .. })
        ));
        assert!(matches!(
            parse_pressure("NaN kPa"),
            Err(UnitError::NotFinite { .. })
        ));
        assert!(matches!(
            parse_pressure("abc kPa"),
            Err(UnitError::NotANumber { .. })
        ));
        assert!(parse_quantity("3 parsecs").is_err());
    }

    // Units as people write them (spreadsheets, lab notebooks, supplier sheets).
    #[test]
    fn units_as_people_write_them() {
        let p = |s: &str| {
            parse_pressure(s)
                .unwrap_or_else(|e| panic!("{s}: {e}"))
                .pa()
        };
        let t = |s: &str| {
            parse_temperature(s)
                .unwrap_or_else(|e| panic!("{s}: {e}"))
                .kelvin()
        };
        assert!((t("85 ºC") - 358.15).abs() < 1e-9); // U+00BA ordinal sign
        assert!((t("85 ˚C") - 358.15).abs() < 1e-9);
        assert!((t("300 °K") - 300.0).abs() < 1e-12);
        assert!((t("85 DEGC") - 358.15).abs() < 1e-9);
        assert!((t("85 °c") - 358.15).abs() < 1e-9);
        for (text, pa) in [
            ("760 TORR", 101_325.0),
            ("20 MBAR", 2000.0),
            ("20 Mbar", 2000.0),
            ("101.325 Kpa", 101_325.0),
            ("101.325 KPA", 101_325.0),
            ("20 mbar(a)", 2000.0),
            ("20 mbara", 2000.0),
            ("1.01325 bara", 101_325.0),
            ("1.01325 bar(abs)", 101_325.0),
            (
                "760 mm Hg",
                101_325.0 * 133.322_387_415 / (101_325.0 / 760.0),
            ),
            (
                "760 mmHg abs",
                101_325.0 * 133.322_387_415 / (101_325.0 / 760.0),
            ),
            ("14.7 PSIA", 14.7 * 6_894.757_293),
            ("2 MPa", 2.0e6),
        ] {
            assert!(
                (p(text) - pa).abs() < 1e-6 * pa,
                "{text}: {} vs {pa}",
                p(text)
            );
        }
        // mPa is millipascal, never read as MPa.
        assert!(parse_pressure("2 mPa").is_err());
    }

    #[test]
    fn gauge_units_need_a_barometric_pressure() {
        for text in [
            "0.5 barg",
            "7 psig",
            "50 kPa(g)",
            "50 kPag",
            "-900 mbarg",
            "0.2 bar gauge",
        ] {
            let e = parse_pressure(text).unwrap_err();
            assert!(matches!(e, UnitError::GaugePressure { .. }), "{text}: {e}");
            let msg = e.to_string();
            assert!(
                msg.contains("gauge") && msg.contains("barometric pressure"),
                "{msg}"
            );
            assert!(!msg.contains("unknown"), "{msg}");
            assert!(matches!(
                parse_quantity(text),
                Err(UnitError::GaugePressure { .. })
            ));
        }
        let site = parse_pressure("1013 mbar").unwrap();
        let at = |s: &str| parse_pressure_at(s, Some(site)).unwrap().pa();
        assert!((at("0.5 barg") - 151_300.0).abs() < 1e-6);
        assert!((at("7 psig") - (7.0 * 6_894.757_293 + 101_300.0)).abs() < 1e-6);
        assert!((at("50 kPa(g)") - 151_300.0).abs() < 1e-6);
        // A vacuum below the site's pressure: -1013 mbarg is no pressure at all.
        assert!(parse_pressure_at("-1013 mbarg", Some(site)).is_err());
        // Absolute units ignore the barometric pressure.
        assert!((at("20 mbar") - 2000.0).abs() < 1e-9);
    }

    fn any_t_unit() -> impl Strategy<Value = TemperatureUnit> {
        prop::sample::select(TemperatureUnit::ALL.to_vec())
    }
    fn any_p_unit() -> impl Strategy<Value = PressureUnit> {
        prop::sample::select(PressureUnit::ALL.to_vec())
    }

    proptest! {
        // Round trip: parse(format(q)) == q, in every unit.
        #[test]
        fn pressure_round_trip(v in 1e-6f64..1e8, u in any_p_unit()) {
            let text = format!("{v:e} {}", u.symbol());
            let q = parse_pressure(&text).unwrap();
            prop_assert_eq!(q, Pressure::new(v, u).unwrap());
            let back = format!("{} {}", q.in_unit(u), u.symbol());
            let q2 = parse_pressure(&back).unwrap();
            prop_assert!(((q2.pa() - q.pa()) / q.pa()).abs() < 1e-11);
        }

        #[test]
        fn temperature_round_trip(k in 0.0f64..5000.0, u in any_t_unit()) {
            let t = Temperature::from_kelvin(k).unwrap();
            let text = format!("{} {}", t.in_unit(u), u.symbol());
            let q = parse_temperature(&text).unwrap();
            prop_assert!((q.kelvin() - k).abs() < 1e-9 * (1.0 + k));
        }

        #[test]
        fn tidy_is_within_its_digits_and_idempotent(x in -1e12f64..1e12) {
            let t = tidy(x);
            prop_assert!((t - x).abs() <= 1e-11 * x.abs() + f64::MIN_POSITIVE);
            prop_assert_eq!(tidy(t), t);
        }

        #[test]
        fn arbitrary_text_never_panics(s in ".{0,40}") {
            let _ = parse_quantity(&s);
            let _ = parse_pressure(&s);
            let _ = parse_temperature(&s);
        }
    }
}
