//! The one interface every vapor-pressure source offers: p(T), T(p), validity.
//!
//! Fitted equations, published Antoine rows, the IAPWS-IF97 water line and
//! structure-based Lee–Kesler estimates all implement [`Curve`], so `boil`,
//! `plan`, `reference` and `screen` never care where a curve came from.

/// A vapor-pressure curve in SI: T in kelvin, p in pascal.
pub trait Curve: Send + Sync {
    /// ln(p/Pa) at temperature `t_k`. May be NaN where the curve is undefined.
    fn ln_p(&self, t_k: f64) -> f64;

    /// d ln(p/Pa) / dT at `t_k`, in 1/K. The default is a central difference.
    fn d_ln_p_dt(&self, t_k: f64) -> f64 {
        let h = 1e-4 * t_k.max(1.0);
        (self.ln_p(t_k + h) - self.ln_p(t_k - h)) / (2.0 * h)
    }

    /// Temperature range (K) over which the source claims validity, if known.
    fn valid_range_k(&self) -> Option<(f64, f64)>;

    /// Standard uncertainty (1 sigma, K) of the temperature at which the curve
    /// reaches `p_pa`, when the source carries one (a fit's covariance, an
    /// estimate's calibrated error, a reference's stated uncertainty).
    fn t_uncertainty_k(&self, _p_pa: f64) -> Option<f64> {
        None
    }

    /// Triple point (K, Pa) when the source knows it: below it the substance
    /// sublimes and has no boiling point, which messages say in those words.
    fn triple_point(&self) -> Option<(f64, f64)> {
        None
    }

    /// Vapor pressure in pascal.
    fn p_pa(&self, t_k: f64) -> f64 {
        self.ln_p(t_k).exp()
    }

    /// Temperature (K) at which the vapor pressure is `p_pa`; `None` if the
    /// curve does not reach it between 1 K and 5000 K. The default brackets and
    /// bisects (then polishes by secant), which suits any monotone curve.
    fn t_at(&self, p_pa: f64) -> Option<f64> {
        invert_monotone(|t| self.ln_p(t), p_pa.ln(), self.valid_range_k())
    }
}

/// Solve `f(t) = target` for a function increasing in `t`, by bracketing then
/// bisection. Starts from `hint` (a range) when given, widening as needed up
/// to [1 K, 5000 K]. Returns `None` when no sign change is found or `f` is NaN
/// at the bracket ends.
pub fn invert_monotone(
    f: impl Fn(f64) -> f64,
    target: f64,
    hint: Option<(f64, f64)>,
) -> Option<f64> {
    if !target.is_finite() {
        return None;
    }
    let g = |t: f64| f(t) - target;
    let (mut lo, mut hi) = hint.unwrap_or((250.0, 450.0));
    if !(lo.is_finite() && hi.is_finite() && lo > 0.0 && hi > lo) {
        lo = 250.0;
        hi = 450.0;
    }
    let (min_t, max_t) = (1.0, 5000.0);
    let mut glo = g(lo);
    let mut ghi = g(hi);
    let mut tries = 0;
    // Widen geometrically; curves like Antoine can be undefined (NaN) below
    // T = -C, so a NaN end is pulled back towards the other end.
    while !(glo.is_finite() && ghi.is_finite() && glo <= 0.0 && ghi >= 0.0) {
        tries += 1;
        if tries > 200 {
            return None;
        }
        if !glo.is_finite() {
            lo = 0.5 * (lo + hi);
            glo = g(lo);
            if (hi - lo) < 1e-9 {
                return None;
            }
            continue;
        }
        if !ghi.is_finite() {
            hi = 0.5 * (lo + hi);
            ghi = g(hi);
            if (hi - lo) < 1e-9 {
                return None;
            }
            continue;
        }
        if glo > 0.0 {
            if lo <= min_t {
                return None;
            }
            hi = lo;
            ghi = glo;
            lo = (lo * 0.7).max(min_t);
            glo = g(lo);
        } else if ghi < 0.0 {
            if hi >= max_t {
                return None;
            }
            lo = hi;
            glo = ghi;
            hi = (hi * 1.4).min(max_t);
            ghi = g(hi);
        }
    }
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        let gm = g(mid);
        if !gm.is_finite() {
            return None;
        }
        if gm.abs() < 1e-14 || (hi - lo) < 1e-12 * mid {
            return Some(mid);
        }
        if gm < 0.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Some(0.5 * (lo + hi))
}

#[cfg(test)]
mod tests {
    use super::*;

    struct Line;
    impl Curve for Line {
        fn ln_p(&self, t: f64) -> f64 {
            25.0 - 4000.0 / t
        }
        fn valid_range_k(&self) -> Option<(f64, f64)> {
            None
        }
    }

    #[test]
    fn inverse_matches_closed_form() {
        let c = Line;
        for p in [1.0, 100.0, 101_325.0, 1e6] {
            let t = c.t_at(p).unwrap();
            let exact = 4000.0 / (25.0 - f64::ln(p));
            assert!((t - exact).abs() < 1e-8 * exact, "{t} vs {exact}");
        }
    }

    #[test]
    fn unreachable_pressure_is_none() {
        // ln p -> 25 as T -> inf, so p = e^30 is never reached.
        assert!(Line.t_at(30f64.exp()).is_none());
    }
}
