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
    v.filter(|v| v.is_finite())
        .map(|v| format!("{}", crate::units::tidy(v)))
        .unwrap_or_default()
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
