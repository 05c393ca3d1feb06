//! Vapor-pressure equations: one equation per file, one trait for all.
//!
//! Two layers live here. [`Curve`] is what every vapor-pressure source offers
//! to the rest of the program (p at T, T at p, validity range). The fitting
//! layer ([`VaporEquation`]: parameter vectors, analytic derivatives, inverse)
//! is what `fit` drives. [`AntoineConstants`] carries published constants with
//! their convention; [`convert`] changes conventions exactly.

mod antoine;
mod clapeyron;
pub mod convention;
pub mod convert;
mod curve;
pub mod equation;
mod riedel;
pub mod slope;
mod wagner;

pub use antoine::Antoine;
pub use clapeyron::Clapeyron;
pub use convention::{AntoineConstants, AntoineConvention, ConventionError, LogBase};
pub use curve::{invert_monotone, Curve};
pub use equation::{Equation, Model, VaporEquation};
pub use riedel::Riedel;
pub use wagner::Wagner;
