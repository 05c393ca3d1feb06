//! An equilibrium curve sampled on a grid, for safe inversion x(y) and pinch search.
//!
//! The grid is uniform in the log-odds `ln(x/(1 − x))` so that both
//! high-purity ends are resolved. The grid only brackets; every answer is
//! refined on the curve itself by bisection (inversion) or golden-section
//! search (pinch), so a curve that is not monotone (a predicted liquid split)
//! is never inverted across a fold.

use super::super::rayleigh::Equilibrium;
use super::ColumnError;

/// Log-odds of a mole fraction.
pub(crate) fn logit(x: f64) -> f64 {
    (x / (1.0 - x)).ln()
}

fn from_logit(u: f64) -> f64 {
    1.0 / (1.0 + (-u).exp())
}

/// Grid points per unit of log-odds (about 0.3 % in x near x = 0.5).
const PER_LOGIT: f64 = 90.0;

/// The curve and its samples on `[lo, hi]`.
pub(crate) struct Sampled<'a> {
    eq: &'a dyn Equilibrium,
    xs: Vec<f64>,
    ys: Vec<f64>,
}

impl<'a> Sampled<'a> {
    /// Sample `eq` on `[lo, hi]` (both strictly inside 0–1).
    pub fn new(eq: &'a dyn Equilibrium, lo: f64, hi: f64) -> Result<Self, ColumnError> {
        let (ul, uh) = (logit(lo), logit(hi));
        let n = (((uh - ul) * PER_LOGIT).ceil() as usize).clamp(200, 4000);
        let mut xs = Vec::with_capacity(n + 1);
        let mut ys = Vec::with_capacity(n + 1);
        for i in 0..=n {
            let x = if i == 0 {
                lo
            } else if i == n {
                hi
            } else {
                from_logit(ul + (uh - ul) * i as f64 / n as f64)
            };
            xs.push(x);
            ys.push(eq.y(x)?);
        }
        Ok(Self { eq, xs, ys })
    }

    /// The curve itself at `x`.
    pub fn y(&self, x: f64) -> Result<f64, ColumnError> {
        Ok(self.eq.y(x)?)
    }

    /// The grid.
    pub fn points(&self) -> impl Iterator<Item = (f64, f64)> + '_ {
        self.xs.iter().copied().zip(self.ys.iter().copied())
    }

    /// Fail when the vapor is no richer than the liquid anywhere on the grid
    /// (an azeotrope or a pinch on the diagonal); the place is refined by bisection.
    pub fn check_above_diagonal(&self) -> Result<(), ColumnError> {
        let Some(i) = self.points().position(|(x, y)| y <= x) else {
            return Ok(());
        };
        let (mut a, mut b) = (if i == 0 { self.xs[0] } else { self.xs[i - 1] }, self.xs[i]);
        if i > 0 {
            for _ in 0..60 {
                let m = 0.5 * (a + b);
                if self.y(m)? <= m {
                    b = m;
                } else {
                    a = m;
                }
            }
        }
        let x = if i == 0 { a } else { 0.5 * (a + b) };
        Err(ColumnError::CurveMeetsDiagonal { x, y: self.y(x)? })
    }

    /// The largest `x < x_hi` with `y(x) = target`, scanning down from `x_hi`
    /// (the liquid on a stage whose vapor is `target`, when the stage below
    /// starts from `x_hi`). Below the grid the curve is taken as monotone and
    /// bisected towards 0.
    pub fn x_below(&self, target: f64, x_hi: f64) -> Result<f64, ColumnError> {
        // Last grid index with x < x_hi.
        let mut j = self.xs.partition_point(|&x| x < x_hi);
        let mut upper = x_hi;
        while j > 0 {
            j -= 1;
            if self.ys[j] <= target {
                return self.bisect(target, self.xs[j], upper);
            }
            upper = self.xs[j];
        }
        self.bisect(target, 1e-300_f64.max(upper * 1e-12), upper)
    }

    /// Bisection for `y(x) = target` on `[a, b]` with `y(a) ≤ target < y(b)` expected.
    fn bisect(&self, target: f64, mut a: f64, mut b: f64) -> Result<f64, ColumnError> {
        for _ in 0..100 {
            let m = 0.5 * (a + b);
            if m <= a || m >= b {
                break;
            }
            if self.y(m)? <= target {
                a = m;
            } else {
                b = m;
            }
        }
        Ok(0.5 * (a + b))
    }

    /// Minimum over the grid of `gap(x, y(x))`, refined by golden-section
    /// search on the curve between the grid neighbours; returns `(x, gap)`.
    pub fn min_gap(&self, gap: impl Fn(f64, f64) -> f64) -> Result<(f64, f64), ColumnError> {
        let mut best = (0usize, f64::INFINITY);
        for (i, (x, y)) in self.points().enumerate() {
            let g = gap(x, y);
            if g < best.1 {
                best = (i, g);
            }
        }
        let i = best.0;
        let (mut a, mut b) = (
            self.xs[i.saturating_sub(1)],
            self.xs[(i + 1).min(self.xs.len() - 1)],
        );
        let f = |x: f64| -> Result<f64, ColumnError> { Ok(gap(x, self.y(x)?)) };
        const INV_PHI: f64 = 0.618_033_988_749_894_9;
        let mut c = b - INV_PHI * (b - a);
        let mut d = a + INV_PHI * (b - a);
        let (mut fc, mut fd) = (f(c)?, f(d)?);
        for _ in 0..80 {
            if (b - a) < 1e-14 {
                break;
            }
            if fc < fd {
                b = d;
                d = c;
                fd = fc;
                c = b - INV_PHI * (b - a);
                fc = f(c)?;
            } else {
                a = c;
                c = d;
                fc = fd;
                d = a + INV_PHI * (b - a);
                fd = f(d)?;
            }
        }
        let (x, g) = if fc < fd { (c, fc) } else { (d, fd) };
        Ok(if g < best.1 {
            (x, g)
        } else {
            (self.xs[i], best.1)
        })
    }
}

#[cfg(test)]
mod tests {
    use super::super::super::rayleigh::ConstantAlpha;
    use super::*;

    #[test]
    fn inversion_recovers_x_on_a_constant_alpha_curve() {
        let eq = ConstantAlpha { alpha: 2.5 };
        let s = Sampled::new(&eq, 0.001, 0.999).unwrap();
        for x in [0.0005, 0.002, 0.3, 0.77, 0.998] {
            let y = eq.y(x).unwrap();
            let back = s.x_below(y, 0.9995).unwrap();
            assert!((back - x).abs() < 1e-12 * (1.0 + 1.0 / x), "{x} -> {back}");
        }
        assert!(s.check_above_diagonal().is_ok());
    }

    /// A curve that crosses the diagonal at x = 0.6 (a made-up azeotrope).
    struct Crossing;
    impl Equilibrium for Crossing {
        fn y(&self, x: f64) -> Result<f64, crate::plan::PlanError> {
            Ok(x + x * (1.0 - x) * (0.6 - x))
        }
        fn t_k(&self, _x: f64) -> Result<Option<f64>, crate::plan::PlanError> {
            Ok(None)
        }
        fn model(&self) -> &'static str {
            "test"
        }
    }

    #[test]
    fn a_crossing_of_the_diagonal_is_found_and_placed() {
        let s = Sampled::new(&Crossing, 0.01, 0.99).unwrap();
        match s.check_above_diagonal() {
            Err(ColumnError::CurveMeetsDiagonal { x, .. }) => assert!((x - 0.6).abs() < 1e-9),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn golden_refinement_finds_a_smooth_minimum_between_grid_points() {
        let eq = ConstantAlpha { alpha: 2.0 };
        let s = Sampled::new(&eq, 0.01, 0.99).unwrap();
        let (x, g) = s.min_gap(|x, _| (x - 0.123_456_7).powi(2)).unwrap();
        assert!((x - 0.123_456_7).abs() < 1e-6 && g < 1e-12);
    }
}
