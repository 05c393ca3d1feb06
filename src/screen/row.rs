//! One table row as the checks see it: SI values, borrowed text, nothing else.

use crate::units::TemperatureUnit;
use crate::vapor::{AntoineConstants, AntoineConvention};

/// The Antoine part of a row, as far as it could be read.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum AntoineCell {
    /// No Antoine constants on this row.
    Absent,
    /// Some of A, B, C are given, not all.
    Incomplete,
    /// A, B, C given but the row's convention cannot be read.
    NoConvention,
    /// Complete constants with their convention (and range in K, if given).
    Given(AntoineConstants),
}

/// One row of a property table. Temperatures in kelvin, pressures in pascal.
#[derive(Debug, Clone, PartialEq)]
pub struct RowInput<'a> {
    /// Line number in the input file (header is line 1), or row number + 1 for Parquet.
    pub line: usize,
    /// Compound name.
    pub compound: Option<&'a str>,
    /// SMILES string.
    pub smiles: Option<&'a str>,
    /// CAS number as written.
    pub cas: Option<&'a str>,
    /// Listed normal boiling point, K.
    pub tb_k: Option<f64>,
    /// The unit the listed boiling point was written in (for the °C/K slip).
    pub tb_unit: TemperatureUnit,
    /// Antoine constants.
    pub antoine: AntoineCell,
    /// Critical temperature, K.
    pub tc_k: Option<f64>,
    /// Critical pressure, Pa.
    pub pc_pa: Option<f64>,
    /// Names of recognised columns whose cell on this row could not be read.
    pub unreadable: Vec<(&'a str, String)>,
}

impl<'a> RowInput<'a> {
    /// An empty row (only the line number), for building rows in code and tests.
    pub fn at_line(line: usize) -> Self {
        RowInput {
            line,
            compound: None,
            smiles: None,
            cas: None,
            tb_k: None,
            tb_unit: TemperatureUnit::Kelvin,
            antoine: AntoineCell::Absent,
            tc_k: None,
            pc_pa: None,
            unreadable: Vec::new(),
        }
    }

    /// The complete Antoine constants, if the row has them.
    pub fn constants(&self) -> Option<&AntoineConstants> {
        match &self.antoine {
            AntoineCell::Given(k) => Some(k),
            _ => None,
        }
    }

    /// Builder: set the compound name.
    pub fn with_compound(mut self, name: &'a str) -> Self {
        self.compound = Some(name);
        self
    }

    /// Builder: set the listed boiling point in kelvin.
    pub fn with_tb_k(mut self, tb_k: f64) -> Self {
        self.tb_k = Some(tb_k);
        self
    }

    /// Builder: set Antoine constants with a convention.
    pub fn with_antoine(mut self, a: f64, b: f64, c: f64, conv: AntoineConvention) -> Self {
        self.antoine = AntoineCell::Given(AntoineConstants::new(a, b, c, conv));
        self
    }
}

/// Short label for a row in messages: its compound name, else its line.
pub fn row_label(row: &RowInput<'_>) -> String {
    match row.compound {
        Some(n) if !n.trim().is_empty() => format!("{} (line {})", n.trim(), row.line),
        _ => format!("line {}", row.line),
    }
}

/// `s.trim()`, answered at once for the usual cell that starts and ends with
/// a visible ASCII character (the same result: `char::is_whitespace` holds
/// for no such character).
///
/// ```
/// use ebullio::screen::trimmed;
/// assert_eq!(trimmed("  CCO\t"), "CCO");
/// assert_eq!(trimmed("CCO"), "CCO");
/// assert_eq!(trimmed("\u{a0}x\u{2003}"), "x");
/// ```
pub fn trimmed(s: &str) -> &str {
    match (s.as_bytes().first(), s.as_bytes().last()) {
        (Some(&a), Some(&b)) if (0x21..0x7f).contains(&a) && (0x21..0x7f).contains(&b) => s,
        _ => s.trim(),
    }
}
