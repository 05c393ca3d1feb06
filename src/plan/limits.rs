//! The limits of an ideal-solution plan and the usual distillation cautions, stated on every output.

/// What the model leaves out, in one paragraph.
pub const IDEAL_SOLUTION: &str = "Ideal solution assumed (Raoult's law, pure-component vapor pressures only): azeotropes, \
non-ideal mixtures, entrainment and column efficiency are not modelled. Check the pair against measured mixture \
(vapor-liquid equilibrium) data before relying on this plan.";

/// The usual cautions for a distillation, each one sentence.
pub const CAUTIONS: &[&str] = &[
    "Boiling points and volatilities here are estimates from pure-component curves, not measurements of your mixture.",
    "Most organic vapors are flammable: exclude ignition sources and vent the vacuum pump exhaust safely.",
    "Vacuum glassware can implode: inspect it for star cracks, shield it, and never heat a closed system.",
    "Heating under vacuum can bump: stir or use a capillary bleed, and reach the working vacuum before heating.",
    "Test ethers and other peroxide formers for peroxides before distilling, and never distill to dryness.",
    "Check the plan against local codes and have it reviewed by qualified process-safety staff before use.",
];

/// What a plan with an activity-coefficient model leaves out.
pub const MIXTURE_MODEL: &str = "Liquid non-ideality of the key pair estimated by UNIFAC from structure (modified Raoult's law, ideal vapor): \
an estimate, not a measurement; liquid-liquid predictions are qualitative; entrainment and column efficiency are not modelled. \
The relative volatility, Fenske counts and pressure table use the pure-component curves (Raoult's law); the column, the \
simple-distillation curve and the verdict use the UNIFAC curve.";

/// The cautions of a plan with an activity-coefficient model: the usual ones and the mixture's own.
pub const CAUTIONS_MIXTURE: &[&str] = &[
    "Boiling points and volatilities here are estimates from pure-component curves, not measurements of your mixture.",
    "Predicted azeotropes and liquid splits must be confirmed with measured mixture data before they are used to design or run a distillation.",
    "Most organic vapors are flammable: exclude ignition sources and vent the vacuum pump exhaust safely.",
    "Vacuum glassware can implode: inspect it for star cracks, shield it, and never heat a closed system.",
    "Heating under vacuum can bump: stir or use a capillary bleed, and reach the working vacuum before heating.",
    "Test ethers and other peroxide formers for peroxides before distilling, and never distill to dryness.",
    "Check the plan against local codes and have it reviewed by qualified process-safety staff before use.",
];
