//! Fitting activity models to measured binary VLE data, and testing the data for
//! thermodynamic consistency.
//!
//! One concept per file: [`data`] (the measured set and its validation),
//! [`model`] (Margules, van Laar, Wilson, NRTL built from a parameter vector),
//! [`problem`] (the least-squares problem: bubble points against measured T or
//! p and y1), [`solve`] (starts and the solver), [`derived`] (γ∞, azeotropes,
//! liquid split, with delta-method intervals), [`area`] (Herington and
//! Redlich–Kister area tests), [`point_test`] (the point-to-point test),
//! [`run`] (model choice, statistics, findings) and [`report`] (the result).
//!
//! ```
//! use ebullio::mixture::fit::{fit_binary, BinaryData, BinaryPoint, BinaryFitOptions, DataKind};
//! use ebullio::mixture::{Binary, Margules};
//! use ebullio::vapor::{AntoineConstants, AntoineConvention};
//! let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
//! let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, conv);
//! let tol = AntoineConstants::new(13.9320, 3056.96, 217.625, conv);
//! let truth = Margules::new(0.3, 0.2).unwrap();
//! let b = Binary { names: ["benzene", "toluene"], curves: [&bz, &tol], model: &truth };
//! let points = (1..10).map(|i| {
//!     let pt = b.bubble_t(i as f64 / 10.0, 101_325.0).unwrap();
//!     BinaryPoint { x1: pt.x1, y1: Some(pt.y1), t_k: pt.t_k, p_pa: 101_325.0, line: None }
//! }).collect();
//! let data = BinaryData { kind: DataKind::Isobaric, points };
//! let r = fit_binary(&data, [&bz, &tol], vec![], &BinaryFitOptions::default()).unwrap();
//! assert!(r.statistics.termination.is_success());
//! assert!(r.consistency.iter().all(|t| t.passed));
//! ```

pub mod area;
pub mod data;
pub mod derived;
pub mod model;
pub mod point_test;
pub mod problem;
pub mod report;
pub mod run;
pub mod solve;

pub use data::{BinaryData, BinaryPoint, DataError, DataKind};
pub use model::{FitModel, Fitted, NRTL_ALPHA_DEFAULT};
pub use problem::Uncertainties;
pub use report::BinaryFitReport;
pub use run::{fit_binary, BinaryFitOptions, BinaryModelSelection, FIT_CAUTIONS};

#[cfg(test)]
mod tests;
