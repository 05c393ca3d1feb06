//! Fitting vapor-pressure equations to measured data, with honest uncertainties.
//!
//! Layers, one file each: [`lsq`] (generic weighted Levenberg–Marquardt and
//! covariance), [`linear`] (exact linear least squares), then the vapor fit.

// Index loops mirror the formulas (matrix subscripts); iterator chains would hide them.
#![allow(clippy::needless_range_loop)]

pub mod linear;
pub mod lsq;
