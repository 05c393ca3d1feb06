//! Finding codes about a row of a property table (`ebullio check`).

use super::finding_codes;

finding_codes! {
    /// Every finding `check` can raise.
    pub enum CheckCode {
        /// The boiling point implied by the Antoine constants differs from the listed one.
        TbAntoineMismatch = "tb-antoine-mismatch", Error;
        /// The mismatch disappears with another pressure unit.
        SlipPressureUnit = "slip-pressure-unit", Error;
        /// The mismatch disappears with another log base (log10 vs ln).
        SlipLogBase = "slip-log-base", Error;
        /// The mismatch disappears when the constants are read for t in K instead of °C (or back).
        SlipConstantsTemperatureUnit = "slip-constants-temperature-unit", Error;
        /// The mismatch disappears with a convention differing in more than one part.
        SlipConvention = "slip-convention", Error;
        /// The listed boiling point looks like °C written in a kelvin column (or back).
        SlipTbTemperatureUnit = "slip-tb-temperature-unit", Error;
        /// The mismatch disappears when A and B are swapped.
        SlipSwappedAB = "slip-swapped-a-b", Error;
        /// The mismatch disappears when one digit or the decimal point of A, B, C or Tb is corrected.
        SlipDigit = "slip-digit", Error;
        /// The listed (or implied) boiling point lies outside the constants' validity range.
        TbOutsideRange = "tb-outside-range", Warning;
        /// B is zero or negative: the curve would not rise with temperature.
        AntoineBNotPositive = "antoine-b-not-positive", Error;
        /// t + C is zero or negative somewhere in the range: the equation is undefined there.
        AntoineDenominatorNotPositive = "antoine-denominator-not-positive", Error;
        /// The constants never reach one atmosphere.
        AntoineNoBoilingPoint = "antoine-no-boiling-point", Error;
        /// Some but not all of A, B, C are given.
        AntoineIncomplete = "antoine-incomplete", Warning;
        /// The row's convention cell cannot be read.
        ConventionUnreadable = "convention-unreadable", Error;
        /// Entropy of vaporization at the implied boiling point outside the Trouton band.
        TroutonImplausible = "trouton-implausible", Warning;
        /// Listed boiling point far from the structure estimate.
        TbStructureMismatch = "tb-structure-mismatch", Warning;
        /// Residual against the structure estimate is an outlier across the table.
        StructureOutlier = "structure-outlier", Warning;
        /// The SMILES does not parse.
        SmilesUnreadable = "smiles-unreadable", Error;
        /// The boiling point is at or above the critical temperature.
        TbAboveTc = "tb-above-tc", Error;
        /// Tb/Tc far from Guldberg's ratio of about 2/3.
        GuldbergRatio = "guldberg-ratio", Warning;
        /// The critical pressure is not above one atmosphere.
        PcImplausible = "pc-implausible", Error;
        /// The same compound appears more than once with disagreeing values.
        DuplicateDisagrees = "duplicate-disagrees", Warning;
        /// The boiling point disagrees with the reference table.
        ReferenceMismatch = "reference-mismatch", Warning;
        /// The CAS number's check digit is wrong.
        CasCheckDigit = "cas-check-digit", Error;
        /// The CAS number is not of the form digits-digits-digit.
        CasMalformed = "cas-malformed", Error;
        /// A recognised numeric cell cannot be read.
        UnreadableCell = "unreadable-cell", Error;
        /// Tmin is not below Tmax.
        RangeInverted = "range-inverted", Error;
    }
}
