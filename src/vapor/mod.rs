//! Vapor-pressure equations: one equation per file, one trait for all.
//!
//! Two layers live here. [`Curve`] is what every vapor-pressure source offers
//! to the rest of the program (p at T, T at p, validity range). The fitting
//! layer (equations with parameter vectors, analytic derivatives) is what
//! `fit` drives. [`AntoineConstants`] carries published constants with their
//! convention; [`convert`] changes conventions exactly.

mod convention;
pub mod convert;
mod curve;
pub mod slope;

pub use convention::{AntoineConstants, AntoineConvention, ConventionError, LogBase};
pub use curve::{invert_monotone, Curve};
