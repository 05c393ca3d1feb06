//! Separation planning: from vapor-pressure curves to a batch-distillation plan.
//!
//! Given two or more [`Component`]s (each a name, a vapor-pressure [`Curve`](crate::vapor::Curve)
//! and a description of where the curve came from), the plan answers the first
//! questions before a batch distillation:
//!
//! 1. **At what pressure?** Either given, or found from a maximum pot
//!    temperature ([`pressure::pressure_for_max_pot`]): the highest pressure at
//!    which the heaviest component boils at or below the limit, rounded down to
//!    a set-point a vacuum controller can hold ([`pressure::round_down_setpoint`]).
//! 2. **How hard is the separation?** Boiling points at that pressure, their
//!    difference, and the ideal relative volatility from Raoult's law
//!    ([`volatility`]), across a small ladder of pressures.
//! 3. **How many stages?** The Fenske minimum number of theoretical stages
//!    ([`fenske`]) for the target purities, with the uncertainty the property
//!    uncertainties imply ([`uncertainty`]).
//! 4. **Will a simple distillation do?** The Rayleigh batch-distillation curve
//!    ([`rayleigh`]) and a plain [`verdict`].
//!
//! The key pair's liquid is modelled by UNIFAC from structure when both
//! structures are known ([`activity`]), otherwise (or with
//! [`ActivityChoice::Ideal`]) as an ideal solution (Raoult's law, with
//! [`limits::IDEAL_SOLUTION`] on the output). On that equilibrium curve the
//! plan designs a column ([`column_plan`], [`column`](mod@column): McCabe–Thiele, and
//! Fenske–Underwood–Gilliland where α is nearly constant) and refuses targets
//! beyond an azeotrope ([`verdict`]).
//!
//! ```
//! use ebullio::plan::{Component, fenske};
//! use ebullio::vapor::AntoineConstants;
//! // Benzene and toluene, Smith, Van Ness & Abbott App. B Table B.2 (ln, kPa, degC).
//! let conv = "ln,kPa,degC".parse().unwrap();
//! let bz = Component::new("benzene", Box::new(AntoineConstants::new(13.7819, 2726.81, 217.572, conv)), "test");
//! let tol = Component::new("toluene", Box::new(AntoineConstants::new(13.9320, 3056.96, 217.625, conv)), "test");
//! let a = ebullio::plan::volatility::pair_volatility(&bz, &tol, 101_325.0).unwrap();
//! assert!(a.geometric_mean > 2.3 && a.geometric_mean < 2.6);
//! let n = fenske::min_stages(a.geometric_mean, 0.99, 0.99).unwrap().unwrap();
//! assert!(n > 9.0 && n < 11.0);
//! ```

pub mod activity;
pub mod column;
pub mod column_plan;
mod component;
pub mod fenske;
pub mod limits;
pub mod pressure;
pub mod rayleigh;
mod result;
mod study;
pub mod uncertainty;
pub mod verdict;
pub mod volatility;

pub use activity::ActivityChoice;
pub use component::Component;
pub use study::{
    plan, ComponentAtPressure, FenskeDetail, Finding, PairSummary, Plan, PlanOptions,
    PressureChoice, PressureRequest, PressureRow, RayleighModel, RayleighSummary, Severity,
    VolatilityDetail,
};

/// Why a plan could not be made.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum PlanError {
    /// Fewer than two components were given.
    #[error("a plan needs at least two components, {found} given")]
    TooFewComponents {
        /// How many were given.
        found: usize,
    },
    /// A component's curve does not reach the pressure.
    #[error(
        "the vapor-pressure curve of '{name}' does not reach {p_pa} Pa between 1 K and 5000 K"
    )]
    NoBoilingPoint {
        /// Component name.
        name: String,
        /// The pressure asked for, Pa.
        p_pa: f64,
    },
    /// A component's curve gives no finite vapor pressure at a temperature.
    #[error("the vapor-pressure curve of '{name}' is undefined at {t_k} K")]
    NoVaporPressure {
        /// Component name.
        name: String,
        /// The temperature, K.
        t_k: f64,
    },
    /// A purity outside (0.5, 1).
    #[error("{what} {value} must be a mole fraction above 0.5 and below 1 (e.g. 0.99)")]
    BadPurity {
        /// Which purity.
        what: &'static str,
        /// The value given.
        value: f64,
    },
    /// A feed composition outside (0, 1).
    #[error("feed mole fraction {value} of the lighter key must lie strictly between 0 and 1")]
    BadFeed {
        /// The value given.
        value: f64,
    },
    /// Two components with the same name.
    #[error("component '{name}' is given twice")]
    DuplicateName {
        /// The repeated name.
        name: String,
    },
    /// The vapor is no richer in the light component than the liquid (α ≤ 1).
    #[error("at pot mole fraction {x} the vapor is no richer in the lighter component than the liquid (relative volatility at or below 1): no separation by distillation")]
    NoEnrichment {
        /// Pot light-component mole fraction where it happened.
        x: f64,
    },
    /// UNIFAC was asked for but a component has no structure.
    #[error("the UNIFAC model needs a structure (SMILES) for {name}; give the component as a structure or choose the ideal-solution model")]
    NoStructure {
        /// The components without one.
        name: String,
    },
    /// The mixture model failed (unassigned group, missing interaction pair, no convergence).
    #[error("mixture model: {0}")]
    Mixture(String),
    /// A non-physical operating pressure.
    #[error("operating pressure {p_pa} Pa must be finite and positive")]
    BadPressure {
        /// The value given, Pa.
        p_pa: f64,
    },
}
