//! Liquid–liquid split: the stability test, the two coexisting liquids, and the three-phase point.
//!
//! A binary liquid is locally unstable where d ln(x1 γ1)/dx1 < 0 (equivalently
//! the second derivative of the Gibbs energy of mixing is negative). The two
//! coexisting liquids are found from the lower convex hull of
//! Δg/RT = x1 ln x1 + x2 ln x2 + x1 ln γ1 + x2 ln γ2 on a grid fine near both
//! ends (so that solubilities of 1e-4 are seen), then polished by Newton on
//! equal activities, x1ᵅγ1ᵅ = x1ᵝγ1ᵝ and x2ᵅγ2ᵅ = x2ᵝγ2ᵝ. With a vapor, the
//! three-phase temperature (or pressure) is where the two liquids boil.
//!
//! Reference: M. L. Michelsen, Fluid Phase Equilib. 9 (1982) 1–19 (stability
//! and the tangent plane); J. M. Prausnitz, R. N. Lichtenthaler, E. Gomes de
//! Azevedo, *Molecular Thermodynamics of Fluid-Phase Equilibria*, 3rd ed., Ch. 6
//! (the binary stability criterion).

use super::{ActivityModel, Binary};

/// d ln(x1 γ1)/dx1 at (x1, T): negative means the liquid cannot stay one phase.
pub fn stability_slope(model: &dyn ActivityModel, x1: f64, t_k: f64) -> f64 {
    let (_, d) = model.ln_gamma_dx(x1, t_k);
    1.0 / x1 + d[0]
}

/// Whether a single liquid of composition `x1` is locally unstable at `t_k`.
pub fn is_unstable(model: &dyn ActivityModel, x1: f64, t_k: f64) -> bool {
    x1 > 0.0 && x1 < 1.0 && stability_slope(model, x1, t_k) < 0.0
}

fn logistic(u: f64) -> f64 {
    1.0 / (1.0 + (-u).exp())
}

/// Δg/RT of mixing.
fn g_mix(model: &dyn ActivityModel, x1: f64, t_k: f64) -> f64 {
    let x2 = 1.0 - x1;
    let lg = model.ln_gamma(x1, t_k);
    x1 * (x1.ln() + lg[0]) + x2 * (x2.ln() + lg[1])
}

/// The two coexisting liquids `[x1 low, x1 high]` at `t_k`, or `None` when one
/// liquid is stable at every composition.
///
/// ```
/// use ebullio::mixture::{liquid_split_at, Unifac};
/// let m = Unifac::from_smiles(["Cc1ccccc1", "O"]).unwrap();
/// let [lo, hi] = liquid_split_at(&m, 360.0).unwrap();
/// assert!(lo < 0.01 && hi > 0.95);
/// ```
pub fn liquid_split_at(model: &dyn ActivityModel, t_k: f64) -> Option<[f64; 2]> {
    if !model.can_split() {
        return None;
    }
    // Grid in u = logit(x1): dense near both ends.
    const N: usize = 321;
    let pts: Vec<(f64, f64)> = (0..N)
        .map(|j| {
            let u = -32.0 + 64.0 * j as f64 / (N - 1) as f64;
            let x = logistic(u);
            (x, g_mix(model, x, t_k))
        })
        .filter(|p| p.1.is_finite() && p.0 > 0.0 && p.0 < 1.0)
        .collect();
    // Lower convex hull (monotone chain); points are in increasing x.
    let mut hull: Vec<usize> = Vec::new();
    for k in 0..pts.len() {
        while hull.len() >= 2 {
            let (a, b) = (pts[hull[hull.len() - 2]], pts[hull[hull.len() - 1]]);
            let c = pts[k];
            let cross = (b.0 - a.0) * (c.1 - a.1) - (b.1 - a.1) * (c.0 - a.0);
            if cross <= 0.0 {
                hull.pop();
            } else {
                break;
            }
        }
        hull.push(k);
    }
    // The hull edge that skips the most grid points is the tie line.
    let (a, b) = hull
        .windows(2)
        .map(|w| (w[0], w[1]))
        .max_by_key(|&(a, b)| b - a)?;
    if b - a < 3 {
        return None;
    }
    polish_split(model, t_k, [pts[a].0, pts[b].0])
}

/// Newton on equal activities from a guess `[x_low, x_high]`, in logit variables.
pub fn polish_split(model: &dyn ActivityModel, t_k: f64, guess: [f64; 2]) -> Option<[f64; 2]> {
    let logit = |x: f64| (x / (1.0 - x)).ln();
    let mut u = [logit(guess[0]), logit(guess[1])];
    for _ in 0..60 {
        let xa = logistic(u[0]);
        let xb = logistic(u[1]);
        let (la, da) = model.ln_gamma_dx(xa, t_k);
        let (lb, db) = model.ln_gamma_dx(xb, t_k);
        let f1 = xa.ln() + la[0] - xb.ln() - lb[0];
        let f2 = (1.0 - xa).ln() + la[1] - (1.0 - xb).ln() - lb[1];
        // Jacobian in x, then chain rule dx/du = x(1 − x).
        let (sa, sb) = (xa * (1.0 - xa), xb * (1.0 - xb));
        let j11 = (1.0 / xa + da[0]) * sa;
        let j12 = -(1.0 / xb + db[0]) * sb;
        let j21 = (-1.0 / (1.0 - xa) + da[1]) * sa;
        let j22 = -(-1.0 / (1.0 - xb) + db[1]) * sb;
        let det = j11 * j22 - j12 * j21;
        if !det.is_finite() || det.abs() < 1e-300 {
            return None;
        }
        let du0 = (f1 * j22 - f2 * j12) / det;
        let du1 = (j11 * f2 - j21 * f1) / det;
        let lim = |d: f64| d.clamp(-2.0, 2.0);
        u[0] -= lim(du0);
        u[1] -= lim(du1);
        if !(u[0].is_finite() && u[1].is_finite()) {
            return None;
        }
        if f1.abs() < 1e-12 && f2.abs() < 1e-12 && du0.abs() < 1e-10 && du1.abs() < 1e-10 {
            let (xa, xb) = (logistic(u[0]), logistic(u[1]));
            // Collapsed onto one composition: no split.
            if (xb - xa).abs() < 1e-6 {
                return None;
            }
            return Some([xa.min(xb), xa.max(xb)]);
        }
    }
    None
}

/// Vapor in equilibrium with two liquids.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ThreePhase {
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// The liquid poorer in component 1.
    pub x1_low: f64,
    /// The liquid richer in component 1.
    pub x1_high: f64,
    /// The vapor.
    pub y1: f64,
}

impl ThreePhase {
    /// The vapor lies between the two liquids: a heterogeneous azeotrope.
    pub fn is_heterogeneous_azeotrope(&self) -> bool {
        self.y1 > self.x1_low && self.y1 < self.x1_high
    }
}

impl Binary<'_> {
    /// Bubble pressure of the two-liquid system at `t_k`, if the liquid splits there.
    pub fn three_phase_at_t(&self, t_k: f64) -> Option<ThreePhase> {
        let split = liquid_split_at(self.model, t_k)?;
        self.three_phase_from(t_k, split)
    }

    fn three_phase_from(&self, t_k: f64, split: [f64; 2]) -> Option<ThreePhase> {
        let pt = self.bubble_p(split[0], t_k).ok()?;
        Some(ThreePhase {
            t_k,
            p_pa: pt.p_pa,
            x1_low: split[0],
            x1_high: split[1],
            y1: pt.y1,
        })
    }

    /// The three-phase temperature at `p_pa`, searched from `t_start` (e.g. the
    /// lowest bubble temperature of the one-liquid model); `None` when the
    /// liquids are miscible where they boil.
    pub fn three_phase_at_p(&self, p_pa: f64, t_start: f64) -> Option<ThreePhase> {
        let mut t = t_start;
        let mut split = liquid_split_at(self.model, t)?;
        let ln_p = p_pa.ln();
        for _ in 0..60 {
            let tp = self.three_phase_from(t, split)?;
            let g = tp.p_pa.ln() - ln_p;
            if g.abs() < 1e-11 {
                return Some(tp);
            }
            let s =
                tp.y1 * self.curves[0].d_ln_p_dt(t) + (1.0 - tp.y1) * self.curves[1].d_ln_p_dt(t);
            if !(s.is_finite() && s > 0.0) {
                return None;
            }
            t -= (g / s).clamp(-20.0, 20.0);
            split =
                polish_split(self.model, t, split).or_else(|| liquid_split_at(self.model, t))?;
        }
        None
    }
}
