//! Finding codes about a vapor-pressure fit.

use super::finding_codes;

finding_codes! {
    /// Every finding a fit can raise (the report's `flags`).
    pub enum FitCode {
        /// The solver did not converge; the constants are its last point.
        NotConverged = "not-converged", Error;
        /// Points repeat exactly and narrow the intervals.
        DuplicatePoints = "duplicate-points", Warning;
        /// The data span less than 20 K.
        NarrowRange = "narrow-range", Warning;
        /// A prediction (or the normal boiling point) lies outside the measured range.
        ExtrapolatedPrediction = "extrapolated-prediction", Warning;
        /// Entropy of vaporization at Tb outside the Trouton band.
        TroutonImplausible = "trouton-implausible", Warning;
        /// A point fails the Bonferroni outlier test.
        OutlierPoint = "outlier-point", Warning;
        /// Residual signs form too few runs.
        SystematicResiduals = "systematic-residuals", Warning;
        /// Constants correlated beyond |r| = 0.999.
        ParametersHighlyCorrelated = "parameters-highly-correlated", Info;
        /// Scatter much larger than the stated uncertainties, or RMS over 2 %.
        PoorFit = "poor-fit", Warning;
        /// Antoine C puts the pole inside or near the range.
        AntoinePoleNearRange = "antoine-pole-near-range", Warning;
        /// ΔHvap taken where Clausius–Clapeyron degrades.
        HvapNearCritical = "hvap-near-critical", Info;
        /// Why the equation was chosen (auto).
        ModelChoice = "model-choice", Info;
        /// What the fit would be without the flagged points.
        WithoutFlaggedPoints = "without-flagged-points", Info;
        /// Points the user excluded with `exclude`.
        ExcludedPoints = "excluded-points", Info;
        /// A point the robust loss rejected (final weight near zero).
        RobustRejectedPoint = "robust-rejected-point", Info;
        /// Pressure falls as temperature rises.
        PressureFallsWithTemperature = "pressure-falls-with-temperature", Error;
        /// The temperature and pressure columns look swapped.
        ColumnsSwapped = "columns-swapped", Error;
        /// ΔHvap (or Trouton's ratio) outside what liquids show.
        HvapImplausible = "hvap-implausible", Warning;
        /// The pressure unit looks mislabelled against the reference or structure Tb.
        PressureUnitMislabelled = "pressure-unit-mislabelled", Error;
    }
}
