//! Fitting vapor-pressure equations to measured data, with honest uncertainties.
//!
//! Layers, one concern per file: [`lsq`] (generic weighted Levenberg–Marquardt
//! and covariance), [`separable`] (Antoine by variable projection, the fast path
//! before Levenberg–Marquardt), [`linear`] (exact linear least squares), [`svd`] (thin
//! one-sided Jacobi SVD used by both), [`equation_fit`]
//! (one equation to points: starts, effective-variance weights, robust loss),
//! [`vapor_fit`] (statistics, diagnostics, predictions, findings, model
//! choice), [`report`] (the serialisable result) and [`curve`] (a fitted curve
//! rebuilt from a report, usable as a [`crate::vapor::Curve`]).
//!
//! ```
//! use ebullio::fit::{fit_points, FitOptions, Point};
//! use ebullio::vapor::{Antoine, VaporEquation};
//! let pts: Vec<Point> = (0..8).map(|i| {
//!     let t = 300.0 + 10.0 * i as f64;
//!     Point { t_k: t, p_pa: Antoine.ln_p(&[21.5, 3100.0, -52.0], t).exp(), u_t_k: None, u_p_pa: None }
//! }).collect();
//! let r = fit_points(None, &pts, &FitOptions::default()).unwrap();
//! assert!(r.termination.is_success());
//! let tb = r.normal_boiling_point_k.unwrap().value;
//! assert!((tb - (3100.0 / (21.5 - 101_325f64.ln()) + 52.0)).abs() < 1e-6);
//! ```

// Index loops mirror the formulas (matrix subscripts); iterator chains would hide them.
#![allow(clippy::needless_range_loop)]

mod build;
pub mod comparison;
pub mod curve;
pub mod equation_fit;
pub mod error;
pub mod findings;
mod fit_findings;
pub mod linear;
pub mod lsq;
pub mod options;
mod outlier_refit;
pub mod plausibility;
pub mod report;
pub mod request;
pub mod separable;
pub mod stats;
pub mod svd;
pub mod termination;
mod validate;
pub mod vapor_fit;

pub use curve::FittedCurve;
pub use equation_fit::{Point, RobustLoss};
pub use error::FitError;
pub use findings::{Finding, FitCode, Severity};
pub use options::{At, Exclude, FitOptions, ModelSelection};
pub use report::{FitReport, PredictionKind};
pub use request::FitRequest;
pub use vapor_fit::{fit_points, fit_points_with_lines};
