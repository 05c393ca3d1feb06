//! The feed line (q-line) and the rectifying and stripping operating lines under constant molar overflow.
//!
//! Rectifying section (total condenser, reflux ratio `R = L/D`):
//! `y = R/(R + 1)·x + x_D/(R + 1)`. Feed line: `y = q/(q − 1)·x − z_F/(q − 1)`
//! (vertical at `x = z_F` for a saturated liquid, q = 1). The two operating
//! lines meet on the feed line at
//! `x = [z_F·(R + 1) + x_D·(q − 1)]/(R + q)`; the stripping line runs from
//! there to `(x_B, x_B)`.
//!
//! Reference: W. L. McCabe and E. W. Thiele, "Graphical design of
//! fractionating columns", *Ind. Eng. Chem.* 17 (1925) 605–611; the feed
//! line as in unit-operations textbooks (from memory).

use super::{ColumnError, ColumnSpec};
use serde::Serialize;

/// The feed line `y(x)`, or `None` for the vertical line of a saturated liquid (q = 1).
pub fn q_line(spec: &ColumnSpec, x: f64) -> Option<f64> {
    let q = spec.q;
    if (q - 1.0).abs() < 1e-12 {
        None
    } else {
        Some((q * x - spec.z_f) / (q - 1.0))
    }
}

/// The two operating lines at a reflux ratio.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct OperatingLines {
    /// Reflux ratio L/D.
    pub r: f64,
    /// Distillate light fraction.
    pub x_d: f64,
    /// Bottoms light fraction.
    pub x_b: f64,
    /// Liquid light fraction where the lines meet (on the feed line).
    pub x_int: f64,
    /// Vapor light fraction where they meet.
    pub y_int: f64,
}

impl OperatingLines {
    /// The lines for `spec` at reflux ratio `r ≥ 0`.
    ///
    /// ```
    /// use ebullio::plan::column::{ColumnSpec, operating::OperatingLines};
    /// let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
    /// let ops = OperatingLines::new(&spec, 2.0).unwrap();
    /// assert!((ops.x_int - 0.5).abs() < 1e-12); // saturated liquid: at the feed
    /// assert!((ops.y(0.95) - 0.95).abs() < 1e-12 && (ops.y(0.05) - 0.05).abs() < 1e-12);
    /// ```
    pub fn new(spec: &ColumnSpec, r: f64) -> Result<Self, ColumnError> {
        let q = spec.q;
        if !(r.is_finite() && r >= 0.0 && r + q > 0.0) {
            return Err(ColumnError::BadSpec {
                what: "reflux ratio",
                value: r,
                expected: "a finite ratio ≥ 0 whose operating line meets the feed line",
            });
        }
        let x_int = (spec.z_f * (r + 1.0) + spec.x_d * (q - 1.0)) / (r + q);
        let y_int = (r * x_int + spec.x_d) / (r + 1.0);
        if !(x_int > spec.x_b && x_int < spec.x_d && y_int > x_int) {
            return Err(ColumnError::FeedLineOutside { q });
        }
        Ok(Self {
            r,
            x_d: spec.x_d,
            x_b: spec.x_b,
            x_int,
            y_int,
        })
    }

    /// Rectifying line at `x`.
    pub fn rectifying(&self, x: f64) -> f64 {
        (self.r * x + self.x_d) / (self.r + 1.0)
    }

    /// Stripping line at `x`.
    pub fn stripping(&self, x: f64) -> f64 {
        self.x_b + (self.y_int - self.x_b) / (self.x_int - self.x_b) * (x - self.x_b)
    }

    /// Slope of the stripping line, `L'/V'`.
    pub fn stripping_slope(&self) -> f64 {
        (self.y_int - self.x_b) / (self.x_int - self.x_b)
    }

    /// The operating line in force at `x`: rectifying above the intersection,
    /// stripping below (the lower of the two, since their slopes straddle 1).
    pub fn y(&self, x: f64) -> f64 {
        if x >= self.x_int {
            self.rectifying(x)
        } else {
            self.stripping(x)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The intersection lies on both the rectifying line and the feed line
    /// (algebra of the module docs, checked for several q).
    #[test]
    fn lines_meet_on_the_feed_line() {
        for q in [-0.3, 0.0, 0.4, 1.0, 1.3] {
            let spec = ColumnSpec::new(0.9, 0.1, 0.45, q).unwrap();
            let ops = OperatingLines::new(&spec, 3.0).unwrap();
            assert!((ops.rectifying(ops.x_int) - ops.y_int).abs() < 1e-12);
            assert!((ops.stripping(ops.x_int) - ops.y_int).abs() < 1e-12);
            match q_line(&spec, ops.x_int) {
                Some(y) => assert!((y - ops.y_int).abs() < 1e-12, "q {q}"),
                None => assert!((ops.x_int - 0.45).abs() < 1e-12),
            }
            // Below the intersection the stripping line is the lower one.
            let x = 0.5 * (ops.x_int + 0.1);
            assert!(ops.y(x) <= ops.rectifying(x));
            assert!(ops.stripping_slope() > 1.0);
        }
    }

    #[test]
    fn impossible_reflux_is_an_error() {
        let spec = ColumnSpec::new(0.9, 0.1, 0.45, 1.0).unwrap();
        assert!(OperatingLines::new(&spec, -1.0).is_err());
        assert!(OperatingLines::new(&spec, f64::NAN).is_err());
    }
}
