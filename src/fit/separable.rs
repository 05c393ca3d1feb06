//! Antoine by separable least squares (variable projection): ln p = A − B/(T + C) is
//! linear in A and B once C is fixed, so the fit is a search over C alone, each step a
//! closed-form weighted 2×2 solve on the stack.
//!
//! At each C the optimal A, B come from the weighted regression of ln p on
//! x = 1/(T + C) (centred sums, so no cancellation). The step in C is the
//! Gauss–Newton step of the full three-constant problem at that (A(C), B(C), C):
//! the derivative column d = ∂ln p/∂C = B·x² projected off the span of (1, x), which
//! is the Schur complement of the 3×3 normal equations; from the second step on, the
//! curvature comes from the last two gradients instead (a secant Newton step, which
//! stays fast where large residuals slow Gauss–Newton). Steps that raise the sum of
//! squares (beyond rounding) are halved. The search is declared converged only when a
//! full Newton step has shrunk to rounding level of C, with C between −0.95·Tmin and
//! Tmin; anything else (a pole near the data, a valley running flat towards C → ∞,
//! non-finite values, the iteration or evaluation bound) returns an error and the
//! caller runs Levenberg–Marquardt instead.
//!
//! Reference: G. H. Golub & V. Pereyra, "The differentiation of pseudo-inverses and
//! nonlinear least squares problems whose variables separate", *SIAM J. Numer. Anal.*
//! 10, 413–432 (1973); L. Kaufman, *BIT* 15, 49–57 (1975) (the Gauss–Newton step used
//! here).

/// Largest number of points kept on the stack; longer sets use the general solver.
pub const MAX_POINTS: usize = 64;

/// Iteration bound: Gauss–Newton on C converges in a handful of steps on vapor-pressure
/// data; more than this means a valley the general solver should handle.
const MAX_ITER: usize = 60;

/// Antoine constants [A, B, C] (SI: ln(p/Pa), K, K) minimising Σ((y_i − ln p(T_i))/σ_i)²
/// from the starting C, with the number of sum-of-squares evaluations (each one pass over
/// the points), at most `max_evals`; `Err` with the evaluations spent when convergence
/// cannot be certified (the caller then uses Levenberg–Marquardt).
pub fn antoine(
    t: &[f64],
    y: &[f64],
    sigma: &[f64],
    c_start: f64,
    max_evals: usize,
) -> Result<([f64; 3], usize), usize> {
    let m = t.len();
    if !(4..=MAX_POINTS).contains(&m) || y.len() != m || sigma.len() != m {
        return Err(0);
    }
    let mut w = [0.0; MAX_POINTS];
    for i in 0..m {
        let s = sigma[i];
        if !(s.is_finite() && s > 0.0 && t[i].is_finite() && y[i].is_finite()) {
            return Err(0);
        }
        w[i] = 1.0 / (s * s);
    }
    let w = &w[..m];
    let tmin = t.iter().copied().fold(f64::INFINITY, f64::min);
    // The pole T + C = 0 must stay clear of every point (the linearized start asks
    // the same margin); a minimum closer to it is left to the general solver, and so
    // is one beyond C = Tmin, where Antoine turns into Clausius–Clapeyron and the
    // valley in C runs flat towards infinity (the general solver reports that).
    let (c_floor, c_ceiling) = (-0.95 * tmin, tmin);
    if !(c_start.is_finite() && c_start > c_floor) {
        return Err(0);
    }
    // Rounding of one weighted residual, for the sum-of-squares test.
    let ymax = (0..m).fold(0.0f64, |a, i| a.max(y[i].abs() * w[i].sqrt()));
    let (delta, mf) = (16.0 * f64::EPSILON * ymax, m as f64);
    let mut evals = 1;
    let mut cur = Eval::at(t, y, w, c_start).ok_or(evals)?;
    // The previous accepted C and its Σ w r d, for the secant estimate of the curvature.
    let mut prev: Option<(f64, f64)> = None;
    for _ in 0..MAX_ITER {
        let gn = cur.gn_step();
        if !gn.is_finite() {
            return Err(evals);
        }
        // Newton's step on the reduced sum of squares with the curvature from the last
        // two gradients (secant): superlinear even where the residuals are large and
        // Gauss–Newton alone crawls. Gauss–Newton when the secant is unusable.
        let (mut step, mut secant) = (gn, false);
        if let Some((cp, gp)) = prev {
            let curvature = (gp - cur.wrd) / (cur.c - cp);
            let s = cur.wrd / curvature;
            if curvature > 0.0 && s * gn > 0.0 && s.abs() <= 100.0 * gn.abs() {
                (step, secant) = (s, true);
            }
        }
        let scale = tmin + cur.c.abs();
        if step.abs() <= 1e-14 * scale {
            return (cur.c < c_ceiling)
                .then_some((cur.theta(), evals))
                .ok_or(evals);
        }
        // Backtrack until the sum of squares does not rise, or rises no more than rounding
        // of the residuals accounts for while the gradient shrinks: on Antoine's narrow
        // valleys the sum is flat to rounding over a stretch of C, and there the gradient,
        // not the sum, locates the minimum.
        let tol = 4.0 * (mf * cur.rss).sqrt() * delta + mf * delta * delta;
        let mut h = step;
        let mut next = None;
        for _ in 0..40 {
            let c = cur.c + h;
            if evals >= max_evals {
                return Err(evals);
            }
            if c > c_floor && c < c_ceiling {
                evals += 1;
                if let Some(e) = Eval::at(t, y, w, c) {
                    let lower = e.rss <= cur.rss;
                    if lower || (e.rss <= cur.rss + tol && e.wrd.abs() < cur.wrd.abs()) {
                        next = Some(e);
                        break;
                    }
                }
            }
            h *= 0.5;
            if h.abs() <= 1e-14 * scale {
                break;
            }
        }
        match next {
            // A full Newton step at rounding level of C: converged.
            Some(e) if secant && h == step && h.abs() <= 1e-12 * scale => {
                return Ok((e.theta(), evals))
            }
            Some(e) => {
                prev = Some((cur.c, cur.wrd));
                cur = e;
            }
            // No lower point along the step within rounding of C: converged when the
            // step itself was already at rounding level.
            None if step.abs() <= 1e-10 * scale && cur.c < c_ceiling => {
                return Ok((cur.theta(), evals))
            }
            None => return Err(evals),
        }
    }
    Err(evals)
}

/// The linear constants and sum of squares at one C, with the Gauss–Newton data.
struct Eval {
    c: f64,
    a: f64,
    b: f64,
    rss: f64,
    /// Σ w r d (half the negative gradient of the sum of squares in C).
    wrd: f64,
    /// Σ w d⊥² (the Schur complement: Gauss–Newton curvature in C).
    dd: f64,
}

impl Eval {
    fn at(t: &[f64], y: &[f64], w: &[f64], c: f64) -> Option<Eval> {
        let m = t.len();
        let mut x = [0.0; MAX_POINTS];
        let (mut sw, mut swx, mut swy) = (0.0, 0.0, 0.0);
        for i in 0..m {
            let den = t[i] + c;
            if den <= 0.0 {
                return None;
            }
            x[i] = 1.0 / den;
            sw += w[i];
            swx += w[i] * x[i];
            swy += w[i] * y[i];
        }
        let (xm, ym) = (swx / sw, swy / sw);
        let (mut sxx, mut sxy) = (0.0, 0.0);
        for i in 0..m {
            let dx = x[i] - xm;
            sxx += w[i] * dx * dx;
            sxy += w[i] * dx * (y[i] - ym);
        }
        if sxx.is_nan() || sxx <= 0.0 {
            return None;
        }
        // y = A − B·x: the slope on x is −B.
        let b = -sxy / sxx;
        let a = ym + b * xm;
        // Residuals r = y − A + B·x and the derivative column d = B·x², centred.
        let mut d = [0.0; MAX_POINTS];
        let (mut rss, mut wrd, mut swd) = (0.0, 0.0, 0.0);
        for i in 0..m {
            let r = y[i] - a + b * x[i];
            d[i] = b * x[i] * x[i];
            rss += w[i] * r * r;
            wrd += w[i] * r * d[i];
            swd += w[i] * d[i];
        }
        let dm = swd / sw;
        let mut sxd = 0.0;
        for i in 0..m {
            sxd += w[i] * (x[i] - xm) * (d[i] - dm);
        }
        let beta = sxd / sxx;
        let mut dd = 0.0;
        for i in 0..m {
            let p = (d[i] - dm) - beta * (x[i] - xm);
            dd += w[i] * p * p;
        }
        (rss.is_finite() && a.is_finite() && b.is_finite()).then_some(Eval {
            c,
            a,
            b,
            rss,
            wrd,
            dd,
        })
    }

    /// Gauss–Newton step in C (residual r = y − f, ∂f/∂C = d).
    fn gn_step(&self) -> f64 {
        if self.dd > 0.0 {
            self.wrd / self.dd
        } else {
            f64::NAN
        }
    }

    fn theta(&self) -> [f64; 3] {
        [self.a, self.b, self.c]
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_data_gives_the_constants() {
        let th = [21.5, 3100.0, -52.0];
        let t: Vec<f64> = (0..10).map(|i| 300.0 + 8.0 * i as f64).collect();
        let y: Vec<f64> = t.iter().map(|t| th[0] - th[1] / (t + th[2])).collect();
        let (got, evals) = antoine(&t, &y, &[1.0; 10], 0.0, 400).unwrap();
        for k in 0..3 {
            assert!(((got[k] - th[k]) / th[k]).abs() < 1e-9, "{got:?}");
        }
        assert!(evals < 40, "{evals}");
    }

    #[test]
    fn pole_inside_the_data_is_left_to_the_general_solver() {
        let t = [300.0, 310.0, 320.0, 330.0, 340.0];
        let y = [1.0, 2.0, 3.0, 4.0, 5.0];
        assert!(antoine(&t, &y, &[1.0; 5], -290.0, 400).is_err());
        assert!(antoine(&t[..3], &y[..3], &[1.0; 3], 0.0, 400).is_err());
    }
}
