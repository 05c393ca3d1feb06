//! A continuous binary column on an equilibrium curve: McCabe–Thiele and Fenske–Underwood–Gilliland.
//!
//! Every method here works on any binary equilibrium curve `y(x)` at fixed
//! pressure (an [`Equilibrium`]: constant α, Raoult's law, or an
//! activity-coefficient model), with `x` and `y` the light-component mole
//! fractions of liquid and vapor. Constant molar overflow is assumed, with a
//! total condenser (not a stage) and a partial reboiler (counted as a stage,
//! as Fenske's `N_min` counts it).
//!
//! - [`operating`]: the feed line (q-line) and the two operating lines;
//! - [`mccabe_thiele`]: stage stepping at total reflux (minimum stages) and at
//!   a reflux ratio, with the optimal feed stage;
//! - [`min_reflux`]: the minimum reflux from the pinch, at the feed or
//!   tangent to the curve anywhere in either section;
//! - for a constant-α binary, [`underwood`], [`gilliland`], [`kirkbride`]
//!   and their assembly [`fug`].
//!
//! [`design`] runs them together at a workable reflux (by default
//! [`DEFAULT_REFLUX_FACTOR`] × the minimum).
//!
//! ```
//! use ebullio::plan::column::{design, ColumnSpec};
//! use ebullio::plan::rayleigh::ConstantAlpha;
//! // α = 2.5, saturated-liquid feed of 50 %, 99 % at both ends.
//! let spec = ColumnSpec::from_purities(0.99, 0.99, 0.5, 1.0).unwrap();
//! let d = design(&ConstantAlpha { alpha: 2.5 }, &spec, None, Some(2.5)).unwrap();
//! assert!((d.total_reflux.stages - 10.03).abs() < 0.01); // Fenske: ln(99²)/ln 2.5
//! assert!(d.at_reflux.whole_stages > d.total_reflux.whole_stages);
//! let fug = d.fug.unwrap();
//! assert!((fug.r_min - d.min_reflux.r_min).abs() < 1e-6);
//! ```

pub mod fug;
pub mod gilliland;
pub mod kirkbride;
pub mod mccabe_thiele;
pub mod min_reflux;
pub mod operating;
mod sampled;
pub mod underwood;

use super::rayleigh::Equilibrium;
use super::PlanError;
use serde::Serialize;

pub use fug::Fug;
pub use mccabe_thiele::{Section, Step, Stepping};
pub use min_reflux::{MinReflux, PinchKind};

/// Workable reflux as a multiple of the minimum (common practice: 1.2–1.5 × R_min).
pub const DEFAULT_REFLUX_FACTOR: f64 = 1.3;

/// Stage count above which stepping gives up (the reflux is too close to the minimum).
pub const MAX_STAGES: u32 = 1000;

/// What the column must do: compositions (light-component mole fractions) and the feed condition.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ColumnSpec {
    /// Distillate light-component mole fraction.
    pub x_d: f64,
    /// Bottoms light-component mole fraction.
    pub x_b: f64,
    /// Feed light-component mole fraction.
    pub z_f: f64,
    /// Feed thermal condition q: moles of liquid flow added to the stripping
    /// section per mole of feed (1 saturated liquid, 0 saturated vapor).
    pub q: f64,
}

impl ColumnSpec {
    /// A spec from compositions; requires `0 < x_b < z_f < x_d < 1` and finite q.
    pub fn new(x_d: f64, x_b: f64, z_f: f64, q: f64) -> Result<Self, ColumnError> {
        let ok = |v: f64| v.is_finite() && v > 0.0 && v < 1.0;
        for (what, v) in [("distillate", x_d), ("bottoms", x_b), ("feed", z_f)] {
            if !ok(v) {
                return Err(ColumnError::BadSpec {
                    what,
                    value: v,
                    expected: "a mole fraction strictly between 0 and 1",
                });
            }
        }
        if !(x_b < z_f && z_f < x_d) {
            return Err(ColumnError::BadSpec {
                what: "feed",
                value: z_f,
                expected: "a light-component fraction between the bottoms and the distillate",
            });
        }
        if !q.is_finite() {
            return Err(ColumnError::BadSpec {
                what: "feed condition q",
                value: q,
                expected: "a finite number (1 saturated liquid, 0 saturated vapor)",
            });
        }
        Ok(Self { x_d, x_b, z_f, q })
    }

    /// A spec from the purities a plan asks for: light fraction of the
    /// distillate, heavy fraction of the bottoms.
    pub fn from_purities(
        distillate_purity: f64,
        bottoms_purity: f64,
        z_f: f64,
        q: f64,
    ) -> Result<Self, ColumnError> {
        Self::new(distillate_purity, 1.0 - bottoms_purity, z_f, q)
    }

    /// Distillate per mole of feed, `D/F = (z_F − x_B)/(x_D − x_B)` (light-component balance).
    pub fn distillate_fraction(&self) -> f64 {
        (self.z_f - self.x_b) / (self.x_d - self.x_b)
    }
}

/// Why a column calculation has no answer.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ColumnError {
    /// A composition or feed condition out of range.
    #[error("{what} {value} is not valid: expected {expected}")]
    BadSpec {
        /// Which quantity.
        what: &'static str,
        /// The value given.
        value: f64,
        /// What was expected.
        expected: &'static str,
    },
    /// The equilibrium curve could not be evaluated.
    #[error(transparent)]
    Equilibrium(#[from] PlanError),
    /// The curve meets or falls below the diagonal between the bottoms and
    /// the distillate: no number of stages gets past it (an azeotrope or a pinch).
    #[error("the equilibrium curve meets the diagonal near x = {x:.4} (y = {y:.4}), between the bottoms and distillate compositions: no number of stages reaches the target by ordinary distillation")]
    CurveMeetsDiagonal {
        /// Liquid light fraction where the vapor is no richer than the liquid.
        x: f64,
        /// The vapor there.
        y: f64,
    },
    /// The feed line meets the equilibrium curve outside the column's range.
    #[error("the feed line (q = {q}) meets the equilibrium curve outside the range between the bottoms and the distillate")]
    FeedLineOutside {
        /// The feed condition.
        q: f64,
    },
    /// The reflux is at or below the minimum: the steps pinch.
    #[error("reflux ratio {r} is at or below the minimum: the stages pinch near x = {x:.4}")]
    Pinched {
        /// The reflux ratio asked for.
        r: f64,
        /// Where the steps stopped advancing.
        x: f64,
    },
    /// More than [`MAX_STAGES`] stages.
    #[error("more than {limit} theoretical stages: the reflux is too close to the minimum")]
    TooManyStages {
        /// The limit.
        limit: u32,
    },
}

/// Minimum stages, minimum reflux and stages at a workable reflux, on one curve.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ColumnDesign {
    /// The spec.
    pub spec: ColumnSpec,
    /// McCabe–Thiele at total reflux: the minimum number of stages.
    pub total_reflux: Stepping,
    /// The minimum reflux ratio and its pinch.
    pub min_reflux: MinReflux,
    /// Reflux as a multiple of the minimum.
    pub reflux_factor: f64,
    /// McCabe–Thiele at `reflux_factor × R_min`.
    pub at_reflux: Stepping,
    /// Fenske–Underwood–Gilliland with Kirkbride, when a constant α was given.
    pub fug: Option<Fug>,
}

/// Design a column on `eq`: minimum stages, minimum reflux and the stages at
/// `reflux_factor × R_min` (default [`DEFAULT_REFLUX_FACTOR`]); with `alpha`
/// (a constant relative volatility describing the same curve) also FUG.
pub fn design(
    eq: &dyn Equilibrium,
    spec: &ColumnSpec,
    reflux_factor: Option<f64>,
    alpha: Option<f64>,
) -> Result<ColumnDesign, ColumnError> {
    let factor = reflux_factor.unwrap_or(DEFAULT_REFLUX_FACTOR);
    if !(factor.is_finite() && factor > 1.0) {
        return Err(ColumnError::BadSpec {
            what: "reflux factor",
            value: factor,
            expected: "a multiple of the minimum reflux above 1 (e.g. 1.3)",
        });
    }
    let total_reflux = mccabe_thiele::total_reflux(eq, spec)?;
    let min_reflux = min_reflux::min_reflux(eq, spec)?;
    let r = factor * min_reflux.r_min.max(0.0);
    let at_reflux = if r > 0.0 {
        mccabe_thiele::at_reflux(eq, spec, r)?
    } else {
        // A zero minimum: any reflux works; step at a small one.
        mccabe_thiele::at_reflux(eq, spec, 0.1)?
    };
    let fug = match alpha {
        Some(a) => Some(fug::fug(a, spec, factor)?),
        None => None,
    };
    Ok(ColumnDesign {
        spec: *spec,
        total_reflux,
        min_reflux,
        reflux_factor: factor,
        at_reflux,
        fug,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn spec_checks_order_and_ranges() {
        assert!(ColumnSpec::new(0.99, 0.01, 0.5, 1.0).is_ok());
        assert!(ColumnSpec::new(1.0, 0.01, 0.5, 1.0).is_err());
        assert!(ColumnSpec::new(0.99, 0.6, 0.5, 1.0).is_err());
        assert!(ColumnSpec::new(0.99, 0.01, f64::NAN, 1.0).is_err());
        assert!(ColumnSpec::new(0.99, 0.01, 0.5, f64::INFINITY).is_err());
        let s = ColumnSpec::from_purities(0.95, 0.98, 0.4, 1.0).unwrap();
        assert!((s.x_b - 0.02).abs() < 1e-15);
        // D/F = (0.4 − 0.02)/(0.95 − 0.02)
        assert!((s.distillate_fraction() - 0.38 / 0.93).abs() < 1e-12);
    }

    #[test]
    fn reflux_factor_must_exceed_one() {
        let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
        let eq = super::super::rayleigh::ConstantAlpha { alpha: 2.0 };
        assert!(design(&eq, &spec, Some(1.0), None).is_err());
        assert!(design(&eq, &spec, Some(f64::NAN), None).is_err());
    }
}
