//! Findings: what a check reports about one row, with a stable code and a severity.

use serde::Serialize;
use std::fmt;

pub use crate::severity::Severity;

/// Every finding `check` can raise. The kebab-case code is interface: scripts
/// filter on it, so a code is never renamed or reused for another meaning.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize)]
pub enum Code {
    /// The boiling point implied by the Antoine constants differs from the listed one.
    TbAntoineMismatch,
    /// The mismatch disappears with another pressure unit.
    SlipPressureUnit,
    /// The mismatch disappears with another log base (log10 vs ln).
    SlipLogBase,
    /// The mismatch disappears when the constants are read for t in K instead of °C (or back).
    SlipConstantsTemperatureUnit,
    /// The mismatch disappears with a convention differing in more than one part.
    SlipConvention,
    /// The listed boiling point looks like °C written in a kelvin column (or back).
    SlipTbTemperatureUnit,
    /// The mismatch disappears when A and B are swapped.
    SlipSwappedAB,
    /// The listed (or implied) boiling point lies outside the constants' validity range.
    TbOutsideRange,
    /// B is zero or negative: the curve would not rise with temperature.
    AntoineBNotPositive,
    /// t + C is zero or negative somewhere in the range: the equation is undefined there.
    AntoineDenominatorNotPositive,
    /// The constants never reach one atmosphere.
    AntoineNoBoilingPoint,
    /// Some but not all of A, B, C are given.
    AntoineIncomplete,
    /// The row's convention cell cannot be read.
    ConventionUnreadable,
    /// Entropy of vaporization at the implied boiling point outside the Trouton band.
    TroutonImplausible,
    /// Listed boiling point far from the structure estimate.
    TbStructureMismatch,
    /// Residual against the structure estimate is an outlier across the table.
    StructureOutlier,
    /// The SMILES does not parse.
    SmilesUnreadable,
    /// The boiling point is at or above the critical temperature.
    TbAboveTc,
    /// Tb/Tc far from Guldberg's ratio of about 2/3.
    GuldbergRatio,
    /// The critical pressure is not above one atmosphere.
    PcImplausible,
    /// The same compound appears more than once with disagreeing values.
    DuplicateDisagrees,
    /// The boiling point disagrees with the reference table.
    ReferenceMismatch,
    /// The CAS number's check digit is wrong.
    CasCheckDigit,
    /// The CAS number is not of the form digits-digits-digit.
    CasMalformed,
    /// A recognised numeric cell cannot be read.
    UnreadableCell,
    /// Tmin is not below Tmax.
    RangeInverted,
    /// The mismatch disappears when one digit or the decimal point of A, B, C or Tb is corrected.
    SlipDigit,
}

impl Code {
    /// Every code, in report order.
    pub const ALL: [Code; 27] = [
        Code::TbAntoineMismatch,
        Code::SlipPressureUnit,
        Code::SlipLogBase,
        Code::SlipConstantsTemperatureUnit,
        Code::SlipConvention,
        Code::SlipTbTemperatureUnit,
        Code::SlipSwappedAB,
        Code::SlipDigit,
        Code::TbOutsideRange,
        Code::AntoineBNotPositive,
        Code::AntoineDenominatorNotPositive,
        Code::AntoineNoBoilingPoint,
        Code::AntoineIncomplete,
        Code::ConventionUnreadable,
        Code::TroutonImplausible,
        Code::TbStructureMismatch,
        Code::StructureOutlier,
        Code::SmilesUnreadable,
        Code::TbAboveTc,
        Code::GuldbergRatio,
        Code::PcImplausible,
        Code::DuplicateDisagrees,
        Code::ReferenceMismatch,
        Code::CasCheckDigit,
        Code::CasMalformed,
        Code::UnreadableCell,
        Code::RangeInverted,
    ];

    /// The stable kebab-case code.
    pub fn as_str(self) -> &'static str {
        match self {
            Code::TbAntoineMismatch => "tb-antoine-mismatch",
            Code::SlipPressureUnit => "slip-pressure-unit",
            Code::SlipLogBase => "slip-log-base",
            Code::SlipConstantsTemperatureUnit => "slip-constants-temperature-unit",
            Code::SlipConvention => "slip-convention",
            Code::SlipTbTemperatureUnit => "slip-tb-temperature-unit",
            Code::SlipSwappedAB => "slip-swapped-a-b",
            Code::TbOutsideRange => "tb-outside-range",
            Code::AntoineBNotPositive => "antoine-b-not-positive",
            Code::AntoineDenominatorNotPositive => "antoine-denominator-not-positive",
            Code::AntoineNoBoilingPoint => "antoine-no-boiling-point",
            Code::AntoineIncomplete => "antoine-incomplete",
            Code::ConventionUnreadable => "convention-unreadable",
            Code::TroutonImplausible => "trouton-implausible",
            Code::TbStructureMismatch => "tb-structure-mismatch",
            Code::StructureOutlier => "structure-outlier",
            Code::SmilesUnreadable => "smiles-unreadable",
            Code::TbAboveTc => "tb-above-tc",
            Code::GuldbergRatio => "guldberg-ratio",
            Code::PcImplausible => "pc-implausible",
            Code::DuplicateDisagrees => "duplicate-disagrees",
            Code::ReferenceMismatch => "reference-mismatch",
            Code::CasCheckDigit => "cas-check-digit",
            Code::CasMalformed => "cas-malformed",
            Code::UnreadableCell => "unreadable-cell",
            Code::RangeInverted => "range-inverted",
            Code::SlipDigit => "slip-digit",
        }
    }

    /// The severity this code always carries.
    pub fn severity(self) -> Severity {
        use Code::*;
        match self {
            TbAntoineMismatch
            | SlipPressureUnit
            | SlipLogBase
            | SlipConstantsTemperatureUnit
            | SlipConvention
            | SlipTbTemperatureUnit
            | SlipSwappedAB
            | SlipDigit
            | AntoineBNotPositive
            | AntoineDenominatorNotPositive
            | AntoineNoBoilingPoint
            | ConventionUnreadable
            | SmilesUnreadable
            | TbAboveTc
            | PcImplausible
            | CasCheckDigit
            | CasMalformed
            | UnreadableCell
            | RangeInverted => Severity::Error,
            TbOutsideRange | AntoineIncomplete | TroutonImplausible | TbStructureMismatch
            | StructureOutlier | GuldbergRatio | DuplicateDisagrees | ReferenceMismatch => {
                Severity::Warning
            }
        }
    }
}

impl fmt::Display for Code {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

/// One finding about one row: a code, its severity and a one-sentence message.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Finding {
    /// Stable kebab-case code.
    pub code: Code,
    /// Severity (fixed per code).
    pub severity: Severity,
    /// One sentence a chemist understands.
    pub message: String,
}

impl Finding {
    /// A finding with the code's own severity.
    pub fn new(code: Code, message: impl Into<String>) -> Self {
        Finding {
            code,
            severity: code.severity(),
            message: message.into(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn codes_are_unique_kebab_case() {
        let mut seen = std::collections::HashSet::new();
        for c in Code::ALL {
            let s = c.as_str();
            assert!(seen.insert(s), "duplicate code {s}");
            assert!(s
                .bytes()
                .all(|b| b.is_ascii_lowercase() || b.is_ascii_digit() || b == b'-'));
        }
    }

    #[test]
    fn severity_orders_and_parses() {
        assert!(Severity::Error > Severity::Warning && Severity::Warning > Severity::Info);
        assert_eq!(Severity::parse("Warning"), Some(Severity::Warning));
        assert_eq!(Severity::parse("fatal"), None);
    }
}
