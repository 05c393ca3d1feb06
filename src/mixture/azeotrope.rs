//! Azeotropes of a binary: where y1 = x1 (α12 = 1), their kind, and how they move with pressure.
//!
//! An azeotrope is a root of ln α12(x1) in 0 < x1 < 1; α12 = γ1 p1°/(γ2 p2°)
//! is finite at both ends (infinite dilution), so a root close to a pure end is
//! not missed between the last grid point and the end. Where component 1 is
//! the more volatile below the root (ln α12 > 0 on the left), the bubble
//! temperature has a minimum there (Gibbs–Konovalov): minimum-boiling.
//!
//! Reference: M. F. Doherty, M. F. Malone, *Conceptual Design of Distillation
//! Systems*, McGraw-Hill 2001, Ch. 2 (azeotropes of binary mixtures).

use super::{Binary, Condition, MixtureError, VlePoint};
use serde::{Deserialize, Serialize};

/// The kind of azeotrope.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum AzeotropeKind {
    /// Positive deviation: boils below both neighbours.
    MinimumBoiling,
    /// Negative deviation: boils above both neighbours.
    MaximumBoiling,
    /// Vapor in equilibrium with two liquids, its composition between them.
    Heterogeneous,
}

impl AzeotropeKind {
    /// `minimum-boiling`, `maximum-boiling`, `heterogeneous`.
    pub fn as_str(self) -> &'static str {
        match self {
            AzeotropeKind::MinimumBoiling => "minimum-boiling",
            AzeotropeKind::MaximumBoiling => "maximum-boiling",
            AzeotropeKind::Heterogeneous => "heterogeneous",
        }
    }
}

/// One azeotrope (SI units).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Azeotrope {
    /// Composition (liquid = vapor for a homogeneous one; the vapor for a heterogeneous one).
    pub x1: f64,
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Its kind.
    pub kind: AzeotropeKind,
}

impl Binary<'_> {
    fn ln_alpha(
        &self,
        x1: f64,
        cond: Condition,
        t_near: Option<f64>,
    ) -> Result<(f64, VlePoint), MixtureError> {
        let pt = self.point(x1, cond, t_near)?;
        Ok((pt.ln_alpha, pt))
    }

    /// Every one-liquid azeotrope, given the diagram on an even grid from x1 = 0 to 1.
    pub fn homogeneous_azeotropes(
        &self,
        cond: Condition,
        diagram: &[VlePoint],
    ) -> Result<Vec<Azeotrope>, MixtureError> {
        let mut out = Vec::new();
        for w in diagram.windows(2) {
            let (fa, fb) = (w[0].ln_alpha, w[1].ln_alpha);
            if !(fa.is_finite() && fb.is_finite()) || fa == 0.0 || fa.signum() == fb.signum() {
                continue;
            }
            // Illinois (modified regula falsi) on ln α(x1).
            let (mut a, mut b, mut ga, mut gb) = (w[0].x1, w[1].x1, fa, fb);
            let mut pt = w[0];
            let mut side = 0;
            for _ in 0..100 {
                let x = (a * gb - b * ga) / (gb - ga);
                let (g, p) = self.ln_alpha(x, cond, Some(pt.t_k))?;
                pt = p;
                if g.abs() < 1e-12 || (b - a).abs() < 1e-12 {
                    break;
                }
                if g.signum() == ga.signum() {
                    a = x;
                    ga = g;
                    if side == -1 {
                        gb *= 0.5;
                    }
                    side = -1;
                } else {
                    b = x;
                    gb = g;
                    if side == 1 {
                        ga *= 0.5;
                    }
                    side = 1;
                }
            }
            let kind = if fa > 0.0 {
                AzeotropeKind::MinimumBoiling
            } else {
                AzeotropeKind::MaximumBoiling
            };
            out.push(Azeotrope {
                x1: pt.x1,
                t_k: pt.t_k,
                p_pa: pt.p_pa,
                kind,
            });
        }
        Ok(out)
    }
}
