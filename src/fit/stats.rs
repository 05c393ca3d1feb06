//! Statistics for fit diagnostics: t quantiles, runs test, residual measures.
//!
//! Reference: runs test — A. Wald & J. Wolfowitz, *Ann. Math. Statist.* 11,
//! 147–162 (1940), normal approximation; externally studentized residuals,
//! leverage and Cook's distance — D. A. Belsley, E. Kuh & R. E. Welsch,
//! *Regression Diagnostics* (1980), ch. 2; R. D. Cook, *Technometrics* 19,
//! 15–18 (1977).

use serde::{Deserialize, Serialize};
use statrs::distribution::{ContinuousCDF, StudentsT};
use std::cell::RefCell;

/// Direct-mapped per-thread cache of quantiles: a batch meets only a few
/// (q, dof) pairs, and a cache slot costs far less than a hash map lookup.
const CACHE_SLOTS: usize = 256;

thread_local! {
    static T_CACHE: RefCell<[(u64, usize, f64); CACHE_SLOTS]> =
        const { RefCell::new([(0, 0, f64::NAN); CACHE_SLOTS]) };
}

/// Upper quantile t_{q, dof} of Student's t (q in (0,1)); cached per thread.
/// NaN for dof = 0.
pub fn t_quantile(q: f64, dof: usize) -> f64 {
    if dof == 0 || !(q > 0.0 && q < 1.0) {
        return f64::NAN;
    }
    let bits = q.to_bits();
    let slot = ((bits ^ (bits >> 29) ^ (dof as u64).wrapping_mul(0x9E37_79B9_7F4A_7C15)) >> 7)
        as usize
        % CACHE_SLOTS;
    // dof ≥ 1, so an empty slot (dof 0) never matches.
    if let Some(v) = T_CACHE.with(|c| {
        let (b, d, v) = c.borrow()[slot];
        (b == bits && d == dof).then_some(v)
    }) {
        return v;
    }
    let v = StudentsT::new(0.0, 1.0, dof as f64)
        .map(|d| d.inverse_cdf(q))
        .unwrap_or(f64::NAN);
    T_CACHE.with(|c| c.borrow_mut()[slot] = (bits, dof, v));
    v
}

/// Runs test on the signs of residuals ordered by temperature (the fitter
/// passes one mean residual per distinct temperature).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct RunsTest {
    /// Number of runs of equal sign.
    pub runs: usize,
    /// Expected number under randomness.
    pub expected: f64,
    /// Normal-approximation z score (negative: too few runs, systematic misfit).
    pub z: f64,
    /// True when z < −1.645 (one-sided 5 %): residuals look systematic.
    pub systematic: bool,
}

/// Runs test on residuals already ordered by temperature (zeros skipped).
pub fn runs_test(ordered_residuals: &[f64]) -> RunsTest {
    let signs: Vec<bool> = ordered_residuals
        .iter()
        .filter(|r| **r != 0.0)
        .map(|r| *r > 0.0)
        .collect();
    let n1 = signs.iter().filter(|s| **s).count() as f64;
    let n2 = signs.len() as f64 - n1;
    let runs = if signs.is_empty() {
        0
    } else {
        1 + signs.windows(2).filter(|w| w[0] != w[1]).count()
    };
    let n = n1 + n2;
    let expected = if n > 0.0 {
        2.0 * n1 * n2 / n + 1.0
    } else {
        0.0
    };
    let var = if n > 1.0 {
        2.0 * n1 * n2 * (2.0 * n1 * n2 - n) / (n * n * (n - 1.0))
    } else {
        0.0
    };
    let z = if var > 0.0 {
        (runs as f64 - expected) / var.sqrt()
    } else {
        0.0
    };
    RunsTest {
        runs,
        expected,
        z,
        systematic: z < -1.645,
    }
}

/// Externally studentized residual of point i: r_i / (s_(i) √(1 − h_i)),
/// s_(i)² = (RSS − r_i²/(1 − h_i))/(m − n − 1). NaN when undefined.
pub fn external_studentized(r: f64, h: f64, rss: f64, dof: usize) -> f64 {
    if dof < 2 || h >= 1.0 {
        return f64::NAN;
    }
    let s2 = (rss - r * r / (1.0 - h)) / (dof as f64 - 1.0);
    if s2 <= 0.0 {
        return f64::NAN;
    }
    r / (s2 * (1.0 - h)).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn t_quantile_matches_table() {
        // Student t table (any statistics text): t_{0.975, 10} = 2.228.
        assert!((t_quantile(0.975, 10) - 2.228).abs() < 1e-3);
        assert!(t_quantile(0.975, 0).is_nan());
        // Cached values are the computed ones, also when slots collide.
        for dof in 1..600 {
            let fresh = StudentsT::new(0.0, 1.0, dof as f64)
                .unwrap()
                .inverse_cdf(0.99);
            assert_eq!(t_quantile(0.99, dof), fresh);
            assert_eq!(t_quantile(0.99, dof), fresh);
        }
    }

    // Wald–Wolfowitz runs test by hand (issue 22: cargo-mutants changed n2 and n − 1
    // unnoticed). Signs + + + − − + + −: n1 = 5, n2 = 3, n = 8, 4 runs;
    // E = 2·5·3/8 + 1 = 4.75; Var = 2·15·(30 − 8)/(8²·7) = 660/448;
    // z = (4 − 4.75)/√(660/448).
    #[test]
    fn runs_test_statistics_by_hand() {
        let r = runs_test(&[0.3, 1.0, 0.2, -0.5, -1.0, 0.0, 2.0, 0.1, -0.4]);
        assert_eq!(r.runs, 4);
        assert!((r.expected - 4.75).abs() < 1e-12, "{}", r.expected);
        let z = -0.75 / (660.0_f64 / 448.0).sqrt();
        assert!((r.z - z).abs() < 1e-12, "{} vs {z}", r.z);
        assert!(!r.systematic);
    }

    #[test]
    fn runs_test_sees_a_bow() {
        let bow = [
            1.0, 1.0, 1.0, -1.0, -1.0, -1.0, -1.0, 1.0, 1.0, 1.0, 1.0, 1.0,
        ];
        assert!(runs_test(&bow).systematic);
        let alt: Vec<f64> = (0..12)
            .map(|i| if i % 2 == 0 { 1.0 } else { -1.0 })
            .collect();
        assert!(!runs_test(&alt).systematic);
    }
}
