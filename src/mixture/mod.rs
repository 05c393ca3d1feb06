//! Mixtures: liquid activity coefficients (original UNIFAC from structure, Wilson,
//! NRTL, ideal), vapor–liquid equilibrium by modified Raoult's law, azeotropes,
//! and the liquid–liquid split.
//!
//! The public surface is small:
//! - [`ActivityModel`] (ln γ and its x-derivative for a binary) with [`Unifac`],
//!   [`Wilson`], [`Nrtl`], [`Ideal`]; [`assign_subgroups`] for the UNIFAC groups.
//! - [`Binary`] (two `vapor::Curve`s and a model) with bubble/dew points
//!   ([`Binary::bubble_t`], [`Binary::bubble_p`], [`Binary::dew_t`],
//!   [`Binary::dew_p`]), diagrams ([`Binary::diagram`]), azeotropes
//!   ([`Binary::homogeneous_azeotropes`]) and the three-phase point
//!   ([`Binary::three_phase_at_p`]).
//! - [`vle_study`], which puts it all together for `ebullio vle`.
//!
//! ```
//! use ebullio::mixture::{Binary, Condition, Unifac};
//! use ebullio::vapor::{AntoineConstants, AntoineConvention};
//! // Acetone / chloroform, Antoine constants (ln, kPa, °C) of Smith, Van Ness & Abbott, Table B.2.
//! let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
//! let acetone = AntoineConstants::new(14.3145, 2756.22, 228.060, conv);
//! let chloroform = AntoineConstants::new(13.7324, 2548.74, 218.552, conv);
//! let model = Unifac::from_smiles(["CC(C)=O", "ClC(Cl)Cl"]).unwrap();
//! let b = Binary { names: ["acetone", "chloroform"], curves: [&acetone, &chloroform], model: &model };
//! let cond = Condition::Pressure(101_325.0);
//! let d = b.diagram(cond, 101).unwrap();
//! let az = b.homogeneous_azeotropes(cond, &d).unwrap();
//! assert_eq!(az.len(), 1);
//! assert_eq!(az[0].kind.as_str(), "maximum-boiling");
//! ```

mod activity;
mod azeotrope;
mod diagram;
mod equilibrium;
mod error;
pub mod fit;
mod legendre;
mod margules;
mod nrtl;
mod request;
mod stability;
mod study;
mod unifac;
mod unifac_groups;
mod unifac_table;
mod van_laar;
mod wilson;

pub use activity::{ActivityModel, Ideal};
pub use azeotrope::{Azeotrope, AzeotropeKind};
pub use diagram::Condition;
pub use equilibrium::{Binary, VlePoint};
pub use error::MixtureError;
pub use legendre::{Legendre, MAX_LEGENDRE_TERMS};
pub use margules::Margules;
pub use nrtl::Nrtl;
pub use request::{Component, VleRequest, VleSetup};
pub use stability::{is_unstable, liquid_split_at, polish_split, stability_slope, ThreePhase};
pub use study::{
    vle_study, AzeotropeOut, ComponentOut, DiagramRow, Finding, LiquidSplit, MixtureCode, ShiftRow,
    StudyComponent, StudyOptions, VleStudy, CAUTIONS, SHIFT_FACTORS, SWING_SHIFT,
};
pub use unifac::{Unifac, MAX_SUBGROUPS};
pub use unifac_groups::{assign_subgroups, subgroup_names, SubgroupCounts};
pub use unifac_table::{unifac_table, Subgroup, UnifacTable};
pub use van_laar::VanLaar;
pub use wilson::Wilson;

#[cfg(test)]
mod tests;
