//! McCabe–Thiele stage stepping: minimum stages at total reflux, stages and optimal feed stage at a reflux ratio.
//!
//! From the top: the vapor leaving stage 1 has the distillate composition
//! (total condenser); the liquid leaving each stage is in equilibrium with its
//! vapor (`x = x(y)`, found by safe inversion of the curve); the vapor from
//! the stage below follows from the operating line in force at that liquid
//! (the diagonal at total reflux). The feed goes to the stage whose step
//! crosses the intersection of the operating lines (the optimal feed stage),
//! below which the stripping line is used. Stepping ends when the liquid is
//! at or below the bottoms composition; the last stage is the reboiler.
//!
//! The fractional count interpolates the last step in log-odds,
//! `ln(x/(1 − x))`: at total reflux on a constant-α curve each stage divides
//! the odds by α exactly, so the fractional count then equals Fenske's `N_min`.
//!
//! Reference: W. L. McCabe and E. W. Thiele, "Graphical design of
//! fractionating columns", *Ind. Eng. Chem.* 17 (1925) 605–611.

use super::super::rayleigh::Equilibrium;
use super::operating::OperatingLines;
use super::sampled::{logit, Sampled};
use super::{ColumnError, ColumnSpec, MAX_STAGES};
use serde::Serialize;

/// Which operating line gave a stage its vapor.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Section {
    /// The diagonal (total reflux).
    TotalReflux,
    /// The rectifying line (stage 1 takes the distillate composition).
    Rectifying,
    /// The stripping line (below the feed stage).
    Stripping,
}

/// One theoretical stage: the vapor leaving it and the liquid leaving it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Step {
    /// Stage number from the top (1 = top stage; the last is the reboiler).
    pub stage: u32,
    /// Vapor light fraction leaving the stage.
    pub y: f64,
    /// Liquid light fraction leaving the stage.
    pub x: f64,
    /// The operating line that gave the vapor.
    pub section: Section,
}

/// The result of stepping off stages.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Stepping {
    /// Reflux ratio L/D (None at total reflux).
    pub reflux_ratio: Option<f64>,
    /// Theoretical stages including the reboiler, with the last one fractional.
    pub stages: f64,
    /// Whole theoretical stages stepped (the fractional count rounded up).
    pub whole_stages: u32,
    /// The optimal feed stage from the top (None at total reflux).
    pub feed_stage: Option<u32>,
    /// Every stage, top first, for drawing.
    pub steps: Vec<Step>,
}

/// Minimum theoretical stages at total reflux (operating line = diagonal).
///
/// ```
/// use ebullio::plan::column::{mccabe_thiele, ColumnSpec};
/// use ebullio::plan::rayleigh::ConstantAlpha;
/// let spec = ColumnSpec::new(0.99, 0.01, 0.5, 1.0).unwrap();
/// let s = mccabe_thiele::total_reflux(&ConstantAlpha { alpha: 2.5 }, &spec).unwrap();
/// assert_eq!(s.whole_stages, 11);
/// ```
pub fn total_reflux(eq: &dyn Equilibrium, spec: &ColumnSpec) -> Result<Stepping, ColumnError> {
    let s = Sampled::new(eq, spec.x_b, spec.x_d)?;
    s.check_above_diagonal()?;
    step(&s, spec, None)
}

/// Stages and optimal feed stage at reflux ratio `r` (L/D).
pub fn at_reflux(eq: &dyn Equilibrium, spec: &ColumnSpec, r: f64) -> Result<Stepping, ColumnError> {
    let ops = OperatingLines::new(spec, r)?;
    let s = Sampled::new(eq, spec.x_b, spec.x_d)?;
    s.check_above_diagonal()?;
    step(&s, spec, Some(ops))
}

fn step(
    s: &Sampled,
    spec: &ColumnSpec,
    ops: Option<OperatingLines>,
) -> Result<Stepping, ColumnError> {
    let mut steps = Vec::new();
    let mut feed_stage = None;
    let mut section = if ops.is_some() {
        Section::Rectifying
    } else {
        Section::TotalReflux
    };
    let (mut x_prev, mut y) = (spec.x_d, spec.x_d);
    for n in 1..=MAX_STAGES {
        let x = s.x_below(y, x_prev)?;
        steps.push(Step {
            stage: n,
            y,
            x,
            section,
        });
        if x <= spec.x_b {
            let (up, lo, target) = (logit(x_prev), logit(x), logit(spec.x_b));
            let frac = if up > lo {
                ((up - target) / (up - lo)).clamp(0.0, 1.0)
            } else {
                1.0
            };
            return Ok(Stepping {
                reflux_ratio: ops.map(|o| o.r),
                stages: f64::from(n - 1) + frac,
                whole_stages: n,
                feed_stage: ops.map(|_| feed_stage.unwrap_or(n)),
                steps,
            });
        }
        let next = match ops {
            None => x,
            Some(o) => {
                if section == Section::Rectifying && x < o.x_int {
                    feed_stage = Some(n);
                    section = Section::Stripping;
                }
                if section == Section::Stripping {
                    o.stripping(x)
                } else {
                    o.rectifying(x)
                }
            }
        };
        // The next vapor must be leaner than the vapor in equilibrium with
        // this liquid, or the steps stop advancing (a pinch).
        if next >= s.y(x)? {
            return Err(ColumnError::Pinched {
                r: ops.map_or(f64::INFINITY, |o| o.r),
                x,
            });
        }
        x_prev = x;
        y = next;
    }
    Err(ColumnError::TooManyStages { limit: MAX_STAGES })
}

#[cfg(test)]
mod tests {
    use super::super::super::fenske;
    use super::super::super::rayleigh::ConstantAlpha;
    use super::*;

    /// McCabe–Thiele at total reflux on a constant-α curve equals the Fenske
    /// equation (Fenske, Ind. Eng. Chem. 24 (1932) 482): each stage divides
    /// the odds by α, so ⌈N_min⌉ whole stages are stepped, and the log-odds
    /// fraction of the last makes the counts equal.
    #[test]
    fn total_reflux_on_constant_alpha_equals_fenske() {
        for alpha in [1.15, 1.5, 2.5, 6.0, 40.0] {
            for (xd, xb, zf) in [(0.99, 0.01, 0.5), (0.999, 0.05, 0.3), (0.9, 0.002, 0.6)] {
                let spec = ColumnSpec::new(xd, xb, zf, 1.0).unwrap();
                let s = total_reflux(&ConstantAlpha { alpha }, &spec).unwrap();
                let n = fenske::min_stages(alpha, xd, 1.0 - xb).unwrap().unwrap();
                assert!(
                    (s.stages - n).abs() < 1e-6 * n,
                    "α {alpha}: stepped {} vs Fenske {n}",
                    s.stages
                );
                assert_eq!(s.whole_stages, n.ceil() as u32);
                assert_eq!(s.steps.len() as u32, s.whole_stages);
                assert!(s.feed_stage.is_none());
            }
        }
    }

    /// Hand check of the first steps (α = 2, x_D = 0.9, total reflux):
    /// x₁ = y/(α − (α − 1)y) = 0.9/1.1 = 0.818182; x₂ = 0.818182/1.181818 = 0.692308.
    #[test]
    fn first_steps_match_hand_inversion() {
        let spec = ColumnSpec::new(0.9, 0.1, 0.5, 1.0).unwrap();
        let s = total_reflux(&ConstantAlpha { alpha: 2.0 }, &spec).unwrap();
        assert!((s.steps[0].x - 0.818_181_818).abs() < 1e-8);
        assert!((s.steps[1].y - s.steps[0].x).abs() < 1e-15);
        assert!((s.steps[1].x - 0.692_307_692).abs() < 1e-8);
    }

    #[test]
    fn more_reflux_needs_fewer_stages_and_feed_stage_is_inside() {
        let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
        let eq = ConstantAlpha { alpha: 2.5 };
        let a = at_reflux(&eq, &spec, 1.5).unwrap();
        let b = at_reflux(&eq, &spec, 3.0).unwrap();
        let t = total_reflux(&eq, &spec).unwrap();
        assert!(a.stages > b.stages && b.stages > t.stages);
        for s in [&a, &b] {
            let f = s.feed_stage.unwrap();
            assert!(f > 1 && f < s.whole_stages, "{f} of {}", s.whole_stages);
            // The feed stage's liquid is the first below the feed (q = 1).
            assert!(s.steps[f as usize - 1].x < 0.5 && s.steps[f as usize - 2].x >= 0.5);
            assert_eq!(s.steps[f as usize].section, Section::Stripping);
        }
    }

    #[test]
    fn reflux_below_minimum_pinches() {
        // Closed-form minimum for this case (α 2.5, q 1): about 1.0667.
        let spec = ColumnSpec::new(0.95, 0.05, 0.5, 1.0).unwrap();
        let e = at_reflux(&ConstantAlpha { alpha: 2.5 }, &spec, 0.9).unwrap_err();
        assert!(
            matches!(
                e,
                ColumnError::Pinched { .. } | ColumnError::TooManyStages { .. }
            ),
            "{e:?}"
        );
    }
}
