//! ebullio: vapor-pressure curves and boiling points a process chemist can trust.
//!
//! Three jobs share one library: **fit** vapor-pressure equations to measured
//! (T, p) points with honest uncertainties; **estimate** boiling points and
//! whole curves from structure (SMILES, Joback group contributions); **check**
//! property tables for slips and outliers before they reach a distillation plan.
//!
//! The module tree is the architecture: pure domain modules (`units`, `vapor`,
//! `fit`, `molecule`, `estimate`, `reference`, `screen`, `plan`) depend on
//! nothing outward; `table_io` and `report` do input and output; the binary's
//! `cli` depends on everything and nothing depends on it. SI inside (K, Pa,
//! ln p); units only at the edges.
//!
//! ```
//! use ebullio::units::parse_pressure;
//! use ebullio::vapor::{AntoineConstants, Curve};
//! // Benzene, Smith, Van Ness & Abbott App. B Table B.2 (ln, kPa, degC).
//! let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap());
//! let t = bz.t_at(parse_pressure("200 mbar").unwrap().pa()).unwrap();
//! assert!(t > 300.0 && t < 320.0);
//! ```
#![warn(missing_docs)]

pub mod boiling;
pub mod demo;
pub mod estimate;
pub mod fit;
pub mod molecule;
pub mod plan;
pub mod reference;
pub mod refit;
pub mod report;
pub mod screen;
pub mod severity;
pub mod table_io;
pub mod units;
pub mod vapor;
