//! Finding codes about a binary VLE data fit (`ebullio fit` on x1, y1, T or p data).

use super::finding_codes;

finding_codes! {
    /// Every finding of a binary fit besides the shared `not-converged` and
    /// `outlier-point` (fit) and `vapor-pressure-extrapolated` (mixture).
    pub enum BinaryFitCode {
        /// The residuals are several times the stated uncertainties.
        ScatterAboveStated = "scatter-above-stated", Warning;
        /// The fitted model has an azeotrope outside the measured compositions.
        AzeotropeOutsideData = "azeotrope-outside-data", Info;
        /// The fitted parameters split the liquid where the data show one liquid.
        FittedLiquidSplit = "fitted-liquid-split", Warning;
        /// A thermodynamic-consistency test fails.
        ConsistencyFailed = "consistency-failed", Warning;
        /// No vapor compositions: no consistency test can run.
        NoVaporComposition = "no-vapor-composition", Info;
    }
}
