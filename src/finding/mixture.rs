//! Finding codes about a two-component vapor-liquid study (`ebullio vle`).

use super::finding_codes;

finding_codes! {
    /// Every finding a VLE study can raise (its `flags`).
    pub enum MixtureCode {
        /// A component's structure is unknown, so UNIFAC cannot be used.
        NoStructure = "no-structure", Warning;
        /// Ideal liquid assumed: no azeotrope or liquid split can appear.
        IdealSolution = "ideal-solution", Warning;
        /// Activity coefficients estimated from structure (UNIFAC).
        ActivityFromStructure = "activity-from-structure", Info;
        /// Activity coefficients from given model parameters.
        ActivityFromParameters = "activity-from-parameters", Info;
        /// The predicted azeotrope lies inside the two-liquid region.
        AzeotropeInTwoLiquidRegion = "azeotrope-in-two-liquid-region", Warning;
        /// A vapor-pressure curve is used outside its range.
        VaporPressureExtrapolated = "vapor-pressure-extrapolated", Warning;
        /// An azeotrope is predicted.
        AzeotropePredicted = "azeotrope-predicted", Warning;
        /// The azeotrope lies close to a pure end.
        AzeotropeNearPureEnd = "azeotrope-near-pure-end", Warning;
        /// Two liquid phases are predicted.
        TwoLiquidsPredicted = "two-liquids-predicted", Warning;
        /// The azeotrope shifts enough with pressure for pressure-swing distillation.
        PressureSwingCandidate = "pressure-swing-candidate", Info;
        /// The azeotrope barely moves with pressure.
        PressureInsensitiveAzeotrope = "pressure-insensitive-azeotrope", Info;
    }
}
