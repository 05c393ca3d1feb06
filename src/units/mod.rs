//! Typed temperatures and pressures, their units, and quantity parsing.
//!
//! Everything inside ebullio is SI: temperature in kelvin, pressure in pascal.
//! Units appear only at the edges (file headings, command-line quantities,
//! reported constants). This module is the one place that knows the factors.
//!
//! ```
//! use ebullio::units::{parse_pressure, parse_temperature};
//! let p = parse_pressure("20 mbar").unwrap();
//! assert!((p.pa() - 2000.0).abs() < 1e-9);
//! let t = parse_temperature("85 degC").unwrap();
//! assert!((t.kelvin() - 358.15).abs() < 1e-9);
//! ```
//!
//! Reference: NIST Special Publication 811 (2008), *Guide for the Use of the
//! International System of Units*, Appendix B (conversion factors).

mod pressure;
mod quantity;
mod temperature;

pub use pressure::{parse_pressure_scale, Pressure, PressureScale, PressureUnit};
pub use quantity::{
    parse_pressure, parse_pressure_at, parse_quantity, parse_quantity_at, parse_temperature,
    Quantity,
};
pub use temperature::{Temperature, TemperatureUnit};

/// Standard atmosphere in pascal (exact, NIST SP 811 App. B).
pub const ATM_PA: f64 = 101_325.0;

/// Offset between the Celsius and Kelvin scales (exact).
pub const CELSIUS_OFFSET: f64 = 273.15;

/// Pascal per millibar (exact).
pub const PA_PER_MBAR: f64 = 100.0;

/// A pressure in pascal expressed in millibar (for display and plot axes).
///
/// ```
/// assert_eq!(ebullio::units::pa_to_mbar(2_000.0), 20.0);
/// ```
pub fn pa_to_mbar(p_pa: f64) -> f64 {
    p_pa / PA_PER_MBAR
}

/// Significant digits kept by [`tidy`].
pub const TIDY_DIGITS: i32 = 12;

/// Round to [`TIDY_DIGITS`] (12) significant digits. Unit conversions leave
/// noise in the last places of a double (80.05 °C is 353.20000000000005 K,
/// 1 mbar is 100.00000000000001 Pa); 12 digits remove it while keeping a
/// thousand times more precision than any vapor-pressure measurement.
/// Non-finite values and zero pass through.
///
/// ```
/// use ebullio::units::tidy;
/// assert_eq!(tidy(80.05 + 273.15), 353.2);
/// assert_eq!(tidy(100.00000000000004), 100.0);
/// assert_eq!(tidy(2420.639999999931), 2420.64);
/// assert_eq!(tidy(1.0e-3 * 3.0), 0.003);
/// ```
pub fn tidy(x: f64) -> f64 {
    if !x.is_finite() || x == 0.0 {
        return x;
    }
    if let Some((m, k)) = tidy_parts(x) {
        return m / POW10[k];
    }
    if let Some(e) = decimal_exponent(x.abs()) {
        // 10^|k| ≤ 10^21 is exact, as 10f64.powi(|k|) below is: the same arithmetic.
        let s = POW10[(e + 1 - TIDY_DIGITS) as usize];
        return (x / s).round() * s;
    }
    tidy_by_log(x)
}

/// [`tidy`]`(x)` as `m / 10^k` (`m` a whole number of at most 13 digits, `0 ≤ k ≤ 22`), the
/// very division `tidy` ends with, for finite non-zero `x` below 10^12 in magnitude whose
/// decimal exponent the table settles; `None` for the others. A writer can take the
/// digits from `m` instead of searching for the shortest spelling of the result.
///
/// ```
/// let (m, k) = ebullio::units::tidy_parts(80.05 + 273.15).unwrap();
/// assert_eq!((m, k), (353_200_000_000.0, 9));
/// assert_eq!(m / 10f64.powi(k as i32), ebullio::units::tidy(80.05 + 273.15));
/// ```
pub fn tidy_parts(x: f64) -> Option<(f64, usize)> {
    if !x.is_finite() || x == 0.0 {
        return None;
    }
    let k = TIDY_DIGITS - 1 - decimal_exponent(x.abs())?;
    let k = usize::try_from(k).ok()?;
    Some(((x * POW10[k]).round(), k))
}

/// 10^0 … 10^22, each exact in a double.
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// ⌊log10 a⌋ for 1e-10 ≤ a < 1e21 by comparison with exact powers of ten, where it
/// certainly equals `a.log10().floor()`: `None` within a relative 1e-12 of a power of ten
/// (where a rounded logarithm could land on either side) or outside that range.
fn decimal_exponent(a: f64) -> Option<i32> {
    if !(1e-10..1e21).contains(&a) {
        return None;
    }
    // Scale into [1, 1e21) without rounding the comparison: a·10^10 only for a < 1.
    let (b, shift) = if a < 1.0 { (a * 1e10, -10) } else { (a, 0) };
    // b ∈ [2^e2, 2^(e2+1)), so ⌊log10 b⌋ is ⌊e2·log10 2⌋ (78913/2^18 in exact integers
    // for these e2) or one more: one comparison instead of a search of the table.
    let e2 = ((b.to_bits() >> 52) & 0x7ff) as usize - 1023;
    let mut d = (e2 * 78913) >> 18;
    if POW10.get(d + 1).is_some_and(|&p| p <= b) {
        d += 1;
    }
    let i = d + 1; // POW10[i-1] ≤ b < POW10[i]
    let (lo, hi) = (POW10[i.checked_sub(1)?], *POW10.get(i)?);
    let margin = 1e-12;
    if b < lo * (1.0 + margin) || b > hi * (1.0 - margin) {
        return None;
    }
    Some(i as i32 - 1 + shift)
}

/// [`tidy`] by the logarithm: the rule itself, used where the table does not reach.
fn tidy_by_log(x: f64) -> f64 {
    let e = x.abs().log10().floor() as i32;
    let k = TIDY_DIGITS - 1 - e;
    if k >= 0 {
        if k > 22 {
            return x; // 10^k would not be exact; such tiny numbers come from no conversion
        }
        let s = 10f64.powi(k);
        (x * s).round() / s
    } else {
        let s = 10f64.powi(-k);
        (x / s).round() * s
    }
}

/// Error from reading a unit or a quantity.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum UnitError {
    /// A unit symbol that is not one of ours.
    #[error("unknown {kind} unit '{unit}'; accepted: {accepted}")]
    UnknownUnit {
        /// "temperature" or "pressure".
        kind: &'static str,
        /// The text that was given.
        unit: String,
        /// The accepted symbols, comma-separated.
        accepted: String,
    },
    /// A gauge pressure unit given where no barometric pressure is known.
    #[error(
        "'{unit}' is a gauge pressure (relative to the atmosphere); give the site's barometric pressure to convert it to absolute, or write the value in absolute {base}"
    )]
    GaugePressure {
        /// The unit as written.
        unit: String,
        /// The absolute unit it is a gauge form of.
        base: String,
    },
    /// A number with no unit after it.
    #[error("'{text}' has no unit; write it with one, e.g. {example}")]
    MissingUnit {
        /// The text that was given.
        text: String,
        /// An example of the expected form.
        example: &'static str,
    },
    /// Text that does not start with a number.
    #[error("'{text}' is not a number followed by a unit (e.g. {example})")]
    NotANumber {
        /// The text that was given.
        text: String,
        /// An example of the expected form.
        example: &'static str,
    },
    /// A value that is not finite.
    #[error("'{text}' is not a finite number")]
    NotFinite {
        /// The text that was given.
        text: String,
    },
    /// A temperature below absolute zero.
    #[error("{value} {unit} is below absolute zero")]
    BelowAbsoluteZero {
        /// The value as given.
        value: f64,
        /// The unit symbol as given.
        unit: String,
    },
    /// A zero or negative absolute pressure.
    #[error(
        "{value} {unit} is not a positive absolute pressure (a gauge reading needs a gauge unit such as barg and the barometric pressure)"
    )]
    NonPositivePressure {
        /// The value as given.
        value: f64,
        /// The unit symbol as given.
        unit: String,
    },
}

impl UnitError {
    /// The message as a front end gives it: a gauge pressure says which of the caller's
    /// options supplies the barometric pressure (`--barometric` on the command line).
    ///
    /// ```
    /// let e = ebullio::units::parse_pressure("0.5 barg").unwrap_err();
    /// assert!(e.hint("--barometric").ends_with("(give it with --barometric, e.g. --barometric \"1013 mbar\")"));
    /// ```
    pub fn hint(&self, barometric_option: &str) -> String {
        match self {
            UnitError::GaugePressure { .. } => format!(
                "{self} (give it with {barometric_option}, e.g. {barometric_option} \"1013 mbar\")"
            ),
            _ => self.to_string(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    // The table path of `tidy` gives what the logarithm gives, bit for bit: at and next to
    // every power of ten it reaches, and anywhere (property below).
    #[test]
    fn tidy_table_path_is_the_rule() {
        for k in -12..23 {
            let p = 10f64.powi(k);
            let mut x = p;
            let mut y = p;
            for _ in 0..40 {
                x = f64::from_bits(x.to_bits() + 1);
                y = f64::from_bits(y.to_bits() - 1);
                for v in [
                    p,
                    x,
                    y,
                    -x,
                    -y,
                    p * (1.0 + 1e-12),
                    p * (1.0 - 1e-12),
                    p * 1.5,
                ] {
                    assert_eq!(tidy(v).to_bits(), tidy_by_log(v).to_bits(), "{v:e}");
                }
            }
        }
    }

    // The integer estimate of ⌊e2·log10 2⌋ in decimal_exponent, for every binary exponent
    // of 1 ≤ b < 1e21, and the exponent it gives next to every power of two there.
    #[test]
    fn decimal_exponent_from_the_binary_exponent() {
        for e2 in 0..70usize {
            assert_eq!(
                (e2 * 78913) >> 18,
                (e2 as f64 * 2f64.log10()).floor() as usize
            );
            let p = 2f64.powi(e2 as i32);
            for b in [
                p,
                f64::from_bits(p.to_bits() - 1),
                f64::from_bits(p.to_bits() + 1),
            ] {
                if let Some(d) = decimal_exponent(b) {
                    assert_eq!(d, b.log10().floor() as i32, "{b:e}");
                }
            }
        }
    }

    proptest! {
        #[test]
        fn tidy_matches_the_logarithm(m in 1.0f64..10.0, e in -14i32..24, neg in any::<bool>()) {
            let x = if neg { -m } else { m } * 10f64.powi(e);
            prop_assert_eq!(tidy(x).to_bits(), tidy_by_log(x).to_bits());
        }

        #[test]
        fn tidy_matches_the_logarithm_on_any_bits(bits in any::<u64>()) {
            let x = f64::from_bits(bits);
            // non-finite values and zero pass through `tidy` before either path
            prop_assume!(x.is_finite() && x != 0.0);
            prop_assert_eq!(tidy(x).to_bits(), tidy_by_log(x).to_bits());
        }
    }

    // Conversion factors from NIST Special Publication 811 (2008), Appendix B.
    #[test]
    fn nist_sp811_pressure_factors() {
        let cases = [
            (PressureUnit::Atm, 101_325.0),          // exact
            (PressureUnit::Torr, 101_325.0 / 760.0), // exact
            (PressureUnit::MmHg, 133.322_387_415),   // conventional
            (PressureUnit::Bar, 100_000.0),          // exact
            (PressureUnit::Psi, 6_894.757_293),      // NIST SP 811 value
            (PressureUnit::InHg, 3_386.389),         // conventional, 0 degC
            (PressureUnit::KPa, 1000.0),
            (PressureUnit::HPa, 100.0),
            (PressureUnit::MBar, 100.0),
            (PressureUnit::MPa, 1.0e6),
            (PressureUnit::Pa, 1.0),
        ];
        for (u, pa) in cases {
            let got = u.to_pa(1.0);
            assert!(
                ((got - pa) / pa).abs() < 1e-9,
                "NIST SP 811: 1 {} = {pa} Pa, got {got}",
                u.symbol()
            );
            assert!((u.from_pa(pa) - 1.0).abs() < 1e-12);
        }
    }

    // NIST SP 811 App. B: T/K = t/degC + 273.15 and T/K = (t/degF + 459.67) * 5/9 (exact).
    #[test]
    fn nist_sp811_temperature_relations() {
        assert_eq!(TemperatureUnit::Celsius.to_kelvin(0.0), 273.15);
        assert!((TemperatureUnit::Celsius.to_kelvin(100.0) - 373.15).abs() < 1e-12);
        assert!((TemperatureUnit::Fahrenheit.to_kelvin(32.0) - 273.15).abs() < 1e-12);
        assert!((TemperatureUnit::Fahrenheit.to_kelvin(-459.67)).abs() < 1e-12);
        assert!((TemperatureUnit::Fahrenheit.to_kelvin(212.0) - 373.15).abs() < 1e-12);
        assert!((TemperatureUnit::Rankine.to_kelvin(491.67) - 273.15).abs() < 1e-12);
        assert_eq!(TemperatureUnit::Kelvin.to_kelvin(300.0), 300.0);
    }
}
