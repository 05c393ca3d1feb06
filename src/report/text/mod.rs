//! Terminal tables and CSV for the commands: formatting only, no numerics.
//!
//! One CSV writer ([`Csv`]) and one set of quantity formatters ([`cell`],
//! [`sig`], [`t_symbol`], [`mbar`]) serve every command, so a number is written the
//! same way everywhere: to 12 significant digits ([`crate::units::tidy`]), and a
//! value that could not be computed is an empty cell, never `NaN` text.
//!
//! ```
//! use ebullio::report::text::{cell, sig, Csv};
//! let mut w = Csv::new(["x1", "t_k"]);
//! w.row([cell(Some(0.1 + 0.2)), cell(Some(f64::NAN))]);
//! assert_eq!(w.finish().unwrap(), "x1,t_k\n0.3,\n");
//! assert_eq!(sig(101.3251, 4), "101.3");
//! ```

pub mod binary_fit;
pub mod boil;
pub mod estimate;
pub mod fit;
pub mod plan;
pub mod reference;
pub mod vle;

use crate::units::TemperatureUnit;

/// The one CSV writer of the commands: a header, rows of text cells, the text.
pub struct Csv {
    w: csv::Writer<Vec<u8>>,
    err: Option<csv::Error>,
}

impl Csv {
    /// A table with these column headings.
    pub fn new<I: IntoIterator<Item = S>, S: AsRef<[u8]>>(head: I) -> Self {
        let mut c = Csv {
            w: csv::Writer::from_writer(Vec::new()),
            err: None,
        };
        c.row(head);
        c
    }

    /// One row (cells already formatted).
    pub fn row<I: IntoIterator<Item = S>, S: AsRef<[u8]>>(&mut self, cells: I) {
        if self.err.is_none() {
            if let Err(e) = self.w.write_record(cells) {
                self.err = Some(e);
            }
        }
    }

    /// The CSV text, or the first error (a row of the wrong length).
    pub fn finish(self) -> Result<String, csv::Error> {
        if let Some(e) = self.err {
            return Err(e);
        }
        let bytes = self
            .w
            .into_inner()
            .map_err(|e| csv::Error::from(e.into_error()))?;
        // Every cell is a Rust string, so the bytes are UTF-8.
        Ok(String::from_utf8_lossy(&bytes).into_owned())
    }
}

/// A number as a CSV cell: 12 significant digits, empty when absent or not finite.
pub fn cell(v: Option<f64>) -> String {
    let mut s = String::new();
    push_cell(&mut s, v);
    s
}

/// [`cell`] appended to `out`: no allocation of its own (the batch writers' form).
pub fn push_cell(out: &mut String, v: Option<f64>) {
    if let Some(v) = v.filter(|v| v.is_finite()) {
        if !push_tidy_digits(out, v) {
            push_plain(out, crate::units::tidy(v));
        }
    }
}

/// `tidy(x)` as [`push_plain`] writes it, from the whole number `tidy` rounds to
/// ([`crate::units::tidy_parts`]): its digits are the shortest spelling of the result, as no
/// other decimal of 13 digits or fewer lies within a rounding of it. `false` (nothing
/// written) where `tidy` takes another route.
fn push_tidy_digits(out: &mut String, x: f64) -> bool {
    let Some((m, k)) = crate::units::tidy_parts(x) else {
        return false;
    };
    if m == 0.0 || m.abs() >= 1e13 {
        return false;
    }
    let mut n = m.abs() as u64;
    let mut k = k as i64;
    while n % 10 == 0 && n > 0 {
        n /= 10;
        k -= 1;
    }
    let mut buf = [0u8; 20];
    let mut len = 0;
    while n > 0 {
        buf[19 - len] = b'0' + (n % 10) as u8;
        n /= 10;
        len += 1;
    }
    push_placed(out, m < 0.0, &buf[20 - len..], len as i64 - k);
    true
}

/// `x` (finite) as the standard library's `{}` writes it: the shortest digits that read
/// back as `x`, in plain decimal notation, never an exponent. The digits come from the
/// `ryu` crate (the same shortest round-trip digits, several times faster than `{}`);
/// only their placement is done here.
///
/// ```
/// let mut s = String::new();
/// ebullio::report::text::push_plain(&mut s, 1.5e-7);
/// assert_eq!(s, "0.00000015");
/// ```
pub fn push_plain(out: &mut String, x: f64) {
    let mut buf = ryu::Buffer::new();
    let s = buf.format_finite(x);
    // With 16 or 17 digits two shortest spellings can both read back as `x`, and `{}` may
    // choose the other one: leave those to `{}` itself (after `tidy`, cells have at most
    // 12 digits, where the shortest spelling is unique).
    if s.bytes().filter(u8::is_ascii_digit).count() >= 16 {
        use std::fmt::Write as _;
        let _ = write!(out, "{x}");
        return;
    }
    let Some(e) = s.find('e') else {
        out.push_str(s.strip_suffix(".0").unwrap_or(s));
        return;
    };
    let (mant, exp) = (&s[..e], s[e + 1..].parse::<i64>().unwrap_or(0));
    let (neg, mant) = match mant.strip_prefix('-') {
        Some(m) => (true, m),
        None => (false, mant),
    };
    let (int, frac) = mant.split_once('.').unwrap_or((mant, ""));
    let frac = frac.trim_end_matches('0');
    // at most 15 digits here (16 and more went to `{}` above)
    let mut digits = [0u8; 17];
    let n = int.len() + frac.len();
    digits[..int.len()].copy_from_slice(int.as_bytes());
    digits[int.len()..n].copy_from_slice(frac.as_bytes());
    push_placed(out, neg, &digits[..n], int.len() as i64 + exp);
}

/// The number `digits × 10^(point − digits.len())` in plain decimal notation, as `{}` writes
/// it (`digits` ASCII, no leading or trailing zero; `point` digits stand before the decimal
/// point), with a minus sign when `neg`.
fn push_placed(out: &mut String, neg: bool, digits: &[u8], point: i64) {
    // ASCII digits, so always UTF-8
    let text = |d| std::str::from_utf8(d).unwrap_or_default();
    let len = digits.len() as i64;
    if neg {
        out.push('-');
    }
    if point <= 0 {
        out.push_str("0.");
        out.extend(std::iter::repeat_n('0', (-point) as usize));
        out.push_str(text(digits));
    } else if point >= len {
        out.push_str(text(digits));
        out.extend(std::iter::repeat_n('0', (point - len) as usize));
    } else {
        let (int, frac) = digits.split_at(point as usize);
        out.push_str(text(int));
        out.push('.');
        out.push_str(text(frac));
    }
}

/// `x` to `digits` significant digits as plain decimal text ("-" when not finite).
pub fn sig(x: f64, digits: i32) -> String {
    if !x.is_finite() {
        return "-".into();
    }
    if x == 0.0 {
        return "0".into();
    }
    let d = (digits - 1 - x.abs().log10().floor() as i32).clamp(0, 12) as usize;
    format!("{x:.d$}")
}

/// A temperature unit's symbol as a chemist writes it in a table.
pub fn t_symbol(u: TemperatureUnit) -> &'static str {
    match u {
        TemperatureUnit::Kelvin => "K",
        TemperatureUnit::Celsius => "°C",
        TemperatureUnit::Fahrenheit => "°F",
        TemperatureUnit::Rankine => "°R",
    }
}

/// A pressure in mbar with digits that suit its size.
pub fn mbar(p_pa: f64) -> String {
    let m = crate::units::pa_to_mbar(p_pa);
    if m >= 100.0 {
        format!("{m:.2}")
    } else if m >= 1.0 {
        format!("{m:.3}")
    } else {
        format!("{m:.4}")
    }
}

/// Kelvin to degrees Celsius.
pub fn celsius(t_k: f64) -> f64 {
    t_k - crate::units::CELSIUS_OFFSET
}

/// An optional number to `digits` decimals, or "—".
pub fn opt(v: Option<f64>, digits: usize) -> String {
    v.map(|x| format!("{x:.digits$}"))
        .unwrap_or_else(|| "—".to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rows_of_the_wrong_length_are_an_error_not_a_panic() {
        let mut w = Csv::new(["a", "b"]);
        w.row(["1"]);
        assert!(w.finish().is_err());
    }

    #[test]
    fn significant_digits_and_missing_values() {
        assert_eq!(sig(0.0012345, 3), "0.00123");
        assert_eq!(sig(f64::INFINITY, 3), "-");
        assert_eq!(cell(None), "");
        assert_eq!(mbar(2000.0), "20.000");
    }
}

#[cfg(test)]
mod plain_tests {
    use super::push_plain;
    use proptest::prelude::*;

    fn plain(x: f64) -> String {
        let mut s = String::new();
        push_plain(&mut s, x);
        s
    }

    #[test]
    fn matches_display_at_the_edges() {
        for x in [
            0.0,
            -0.0,
            1.0,
            -1.0,
            0.1,
            0.3,
            1e-5,
            1e-6,
            1.5e-7,
            123456.0,
            1e15,
            1e16,
            1.25e16,
            1e21,
            1e22,
            1.7976931348623157e308,
            5e-324,
            2.2250738585072014e-308,
            383.097718552,
            662198611100560.2, // two 16-digit spellings read back as this one
            f64::from_bits(4828652789802605698),
        ] {
            assert_eq!(plain(x), format!("{x}"), "{x:e}");
        }
    }

    proptest! {
        #[test]
        fn matches_display(bits in any::<u64>()) {
            let x = f64::from_bits(bits);
            prop_assume!(x.is_finite());
            prop_assert_eq!(plain(x), format!("{}", x));
        }

        // A cell's digits from tidy's whole number are what `{}` writes of tidy's result.
        #[test]
        fn cell_digits_match_display_of_the_tidy_value(
            m in -1e13f64..1e13,
            e in -25i32..25,
            bits in any::<u64>(),
        ) {
            for x in [m * 10f64.powi(e), f64::from_bits(bits)] {
                prop_assume!(x.is_finite());
                let mut s = String::new();
                crate::report::text::push_cell(&mut s, Some(x));
                prop_assert_eq!(s, format!("{}", crate::units::tidy(x)));
            }
        }

        #[test]
        fn matches_display_for_tidy_numbers(m in -1e12f64..1e12, e in -30i32..30) {
            let x = crate::units::tidy(m * 10f64.powi(e));
            prop_assert_eq!(plain(x), format!("{}", x));
        }
    }
}
