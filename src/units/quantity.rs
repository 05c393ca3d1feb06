//! Parsing quantities written with their unit, such as `"20 mbar"` or `"85 °C"`.

use super::pressure::ACCEPTED_P;
use super::temperature::ACCEPTED_T;
use super::{Pressure, PressureUnit, Temperature, TemperatureUnit, UnitError};

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
///
/// ```
/// use ebullio::units::parse_pressure;
/// assert!((parse_pressure("1 atm").unwrap().pa() - 101_325.0).abs() < 1e-9);
/// assert!(parse_pressure("0 mbar").is_err());
/// ```
pub fn parse_pressure(s: &str) -> Result<Pressure, UnitError> {
    const EX: &str = "\"20 mbar\" or \"101.325 kPa\"";
    let (num, unit) = split_number(s);
    let v = number(s, num, EX)?;
    if unit.is_empty() {
        return Err(UnitError::MissingUnit {
            text: s.trim().to_string(),
            example: EX,
        });
    }
    let u = PressureUnit::parse(unit)?;
    Pressure::new(v, u)
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
    if let Ok(u) = PressureUnit::parse(unit) {
        return Ok(Quantity::Pressure(Pressure::new(v, u)?));
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

#[cfg(test)]
mod tests {
    use super::*;
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
            prop_assert!(((q2.pa() - q.pa()) / q.pa()).abs() < 1e-14);
        }

        #[test]
        fn temperature_round_trip(k in 0.0f64..5000.0, u in any_t_unit()) {
            let t = Temperature::from_kelvin(k).unwrap();
            let text = format!("{} {}", t.in_unit(u), u.symbol());
            let q = parse_temperature(&text).unwrap();
            prop_assert!((q.kelvin() - k).abs() < 1e-9 * (1.0 + k));
        }

        #[test]
        fn arbitrary_text_never_panics(s in ".{0,40}") {
            let _ = parse_quantity(&s);
            let _ = parse_pressure(&s);
            let _ = parse_temperature(&s);
        }
    }
}
