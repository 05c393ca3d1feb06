//! The Antoine fast path (separable least squares, `fit::separable`) against the general
//! Levenberg–Marquardt solver on the same data: the constants must agree to 1e-9
//! relative, and the fast path must be the one that ran. Data: the IAPWS-IF97
//! saturation line of water (IAPWS R7-97(2012), region 4, Eq. 30; the library's copy in
//! src/reference/water.rs), the published Antoine rows of
//! reference-data/antoine-published.csv (Smith, Van Ness & Abbott App. B Table B.2 and
//! the other sources named in its `source` column), and seeded sets drawn like the
//! benchmark's (bench/generate.py). `bench_sets_agree` (ignored) runs the comparison
//! over a file such as the benchmark's 10,000 sets.

use ebullio::fit::equation_fit::{
    antoine_start, fit_equation_using, AntoineSolver, EquationFit, VaporProblem, ANTOINE,
};
use ebullio::fit::lsq::{self, Settings};
use ebullio::fit::termination::StopReason;
use ebullio::fit::{separable, Point, RobustLoss};
use ebullio::reference::water::ps_pa;
use ebullio::vapor::{AntoineConstants, AntoineConvention, Curve};

fn rel(a: f64, b: f64) -> f64 {
    ((a - b) / b.abs().max(1e-300)).abs()
}

/// One unweighted solve both ways from the linearized start. Levenberg–Marquardt stops
/// when the relative reduction of the sum of squares falls below 30ε (`ftol`), which on
/// Antoine's long narrow valley leaves its constants up to about 1e-6 short of the
/// minimum (measured on the benchmark's sets); restarted from where it stopped it walks
/// on to the minimum. Returns the largest difference of the fast path's constants from
/// Levenberg–Marquardt run to its own fixed point (restarted until the constants stop
/// changing), relative and in units of their standard errors, and checks that the fast
/// path's sum of squares is never above either Levenberg–Marquardt point's (to rounding).
/// `None` when the fast path declines.
fn solver_difference(pts: &[Point]) -> Option<(f64, f64)> {
    let t: Vec<f64> = pts.iter().map(|p| p.t_k).collect();
    let y: Vec<f64> = pts.iter().map(|p| p.p_pa.ln()).collect();
    let sigma = vec![1.0; t.len()];
    let start = antoine_start(&t, &y, &sigma)?;
    let (fast, _) = separable::antoine(&t, &y, &sigma, start[2], 400).ok()?;
    let prob = VaporProblem {
        eq: &ANTOINE,
        t: &t,
        y: &y,
    };
    let once = lsq::solve(&prob, &sigma, &start, Settings::default());
    assert!(once.termination.is_success(), "{:?}", once.termination);
    let rss_once = lsq::finish(&prob, &sigma, fast.to_vec(), once.termination.clone()).rss;
    // Rounding floor: residuals of exact data are a few ε·|ln p| each.
    let ymax = y.iter().fold(0.0f64, |a, v| a.max(v.abs()));
    // and a sum of squares is known only to about 2·Σ|r_i|·(rounding of r_i).
    let delta = 64.0 * f64::EPSILON * ymax;
    let m = t.len() as f64;
    let floor = |rss: f64| 4.0 * (m * rss).sqrt() * delta + m * delta * delta;
    assert!(
        rss_once <= once.rss * (1.0 + 1e-12) + floor(once.rss),
        "fast path's sum of squares {rss_once:e} above Levenberg–Marquardt's {:e}",
        once.rss
    );
    let mut lm = once;
    for _ in 0..20 {
        let next = lsq::solve(&prob, &sigma, &lm.theta, Settings::default());
        let moved = (0..3)
            .map(|k| rel(next.theta[k], lm.theta[k]))
            .fold(0.0, f64::max);
        lm = next;
        if moved < 1e-13 {
            break;
        }
    }
    // On Antoine's narrowest valleys the sum of squares is flat to rounding over a
    // stretch of about 1e-8 in the constants: both points are minima as far as double
    // precision can tell, and the fast path's is never the higher.
    let rss_lm = lm.rss;
    let rss_fast = lsq::finish(&prob, &sigma, fast.to_vec(), lm.termination.clone()).rss;
    assert!(
        rss_fast <= rss_lm * (1.0 + 1e-12) + floor(rss_lm),
        "fast path's sum of squares {rss_fast:e} above Levenberg–Marquardt's {rss_lm:e}"
    );
    let d = (0..3)
        .map(|k| rel(fast[k], lm.theta[k]))
        .fold(0.0, f64::max);
    let se = lm.std_errors()?;
    let d_se = (0..3)
        .map(|k| ((fast[k] - lm.theta[k]) / se[k]).abs())
        .fold(0.0, f64::max);
    Some((d, d_se))
}

/// The agreement asked of the fast path: 1e-9 relative in every constant, or, where the
/// valley is flat to rounding over a longer stretch, 1e-5 standard errors (a difference
/// no statistic in the report can show).
fn agrees((d, d_se): (f64, f64)) -> bool {
    d < 1e-9 || d_se < 1e-5
}

/// The whole fit (effective-variance and robust loops included) both ways: the largest
/// relative difference of the constants, the largest difference in units of their
/// standard errors, and whether the fast path ran (or `None` when either solver gave no
/// fit, or when neither converged).
fn compare(points: &[Point], robust: Option<RobustLoss>) -> Option<(f64, f64, bool)> {
    let fast = fit_equation_using(&ANTOINE, points, robust, AntoineSolver::Separable)?;
    let lm = fit_equation_using(&ANTOINE, points, robust, AntoineSolver::LevenbergMarquardt)?;
    assert_eq!(
        fast.lsq.termination.is_success(),
        lm.lsq.termination.is_success(),
        "{:?} vs {:?}",
        fast.lsq.termination,
        lm.lsq.termination
    );
    // Two unconverged fits stop wherever their budgets ran out: nothing to compare.
    if !lm.lsq.termination.is_success() {
        return None;
    }
    let dp = (0..3)
        .map(|k| rel(fast.lsq.theta[k], lm.lsq.theta[k]))
        .fold(0.0, f64::max);
    let se =
        |f: &EquationFit, k: usize| f.covariance.as_ref().map_or(f64::NAN, |c| c[(k, k)].sqrt());
    // The difference in units of the constant's standard error: what it means statistically.
    let in_se = (0..3)
        .map(|k| ((fast.lsq.theta[k] - lm.lsq.theta[k]) / se(&lm, k)).abs())
        .fold(0.0, f64::max);
    Some((
        dp,
        in_se,
        fast.lsq.termination.reason == StopReason::Separable,
    ))
}

fn point(t_k: f64, p_pa: f64) -> Point {
    Point {
        t_k,
        p_pa,
        u_t_k: None,
        u_p_pa: None,
    }
}

#[test]
fn iapws_if97_water_agrees_with_levenberg_marquardt() {
    // Antoine cannot follow the IF97 line over 280–370 K exactly: systematic residuals,
    // the case where a separable solver's steps are least like Newton's.
    for (lo, step, n) in [(280.0, 5.0, 19), (300.0, 10.0, 30), (275.0, 2.0, 10)] {
        let pts: Vec<Point> = (0..n)
            .map(|i| {
                let t = lo + step * i as f64;
                point(t, ps_pa(t))
            })
            .collect();
        let d = solver_difference(&pts).expect("the fast path certifies IF97");
        assert!(agrees(d), "IF97 from {lo} K: {d:?}");
        let (dp, in_se, fast) = compare(&pts, None).unwrap();
        assert!(fast, "the fast path did not run on IF97 from {lo} K");
        assert!(
            dp < 1e-9 || in_se < 1e-4,
            "IF97 from {lo} K: {dp:e} {in_se:e}"
        );
    }
}

#[test]
fn published_antoine_rows_agree_with_levenberg_marquardt() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/reference-data/antoine-published.csv"
    );
    let mut rd = csv::Reader::from_path(path).unwrap();
    let (mut rows, mut fast_rows) = (0, 0);
    let mut state = 20261205u64;
    let mut noise = move || {
        // splitmix64, mapped to ±0.5 %
        state = state.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = state;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        (((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64 - 0.5) * 0.01
    };
    for rec in rd.records() {
        let r = rec.unwrap();
        let f = |i: usize| r[i].parse::<f64>().unwrap();
        let conv: AntoineConvention = format!("{},{},{}", &r[6], &r[7], &r[8]).parse().unwrap();
        let k = AntoineConstants::new(f(3), f(4), f(5), conv);
        let (Ok(lo), Ok(hi)) = (r[9].parse::<f64>(), r[10].parse::<f64>()) else {
            continue;
        };
        let (lo, hi) = (conv.t_unit.to_kelvin(lo), conv.t_unit.to_kelvin(hi));
        for noisy in [false, true] {
            let pts: Vec<Point> = (0..10)
                .map(|i| {
                    let t = lo + (hi - lo) * i as f64 / 9.0;
                    let e = if noisy { noise() } else { 0.0 };
                    point(t, k.p_pa(t) * (1.0 + e))
                })
                .collect();
            let Some(d) = solver_difference(&pts) else {
                panic!("the fast path declined {} (noisy {noisy})", &r[0]);
            };
            assert!(agrees(d), "{} (noisy {noisy}): {d:?}", &r[0]);
            let (dp, in_se, fast) = compare(&pts, None).unwrap();
            assert!(
                dp < 1e-9 || in_se < 1e-4,
                "{} (noisy {noisy}): {dp:e} {in_se:e}",
                &r[0]
            );
            rows += 1;
            fast_rows += usize::from(fast);
        }
    }
    assert!(rows > 40, "{rows}");
    // Exact published curves and their noisy copies: the fast path certifies them all.
    assert_eq!(fast_rows, rows);
}

/// Sets drawn like bench/generate.py (Tb 300–520 K, C −60 to −30 K, ΔSvap 80–105
/// J/(mol·K), 8–15 points between 2 and 150 kPa, 0.5 % noise, a gross outlier in some),
/// also with stated uncertainties (effective-variance loop) and robust refits.
#[test]
fn seeded_sets_agree_with_levenberg_marquardt() {
    let mut state = 7u64;
    let mut uniform = move || {
        state = state.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = state;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64
    };
    let (mut worst, mut worst_solver, mut fast_sets, mut sets) = (0.0f64, 0.0f64, 0, 0);
    for s in 0..300 {
        let tb = 300.0 + 220.0 * uniform();
        let c = -60.0 + 30.0 * uniform();
        let dsv = 80.0 + 25.0 * uniform();
        let b = dsv * (tb + c).powi(2) / (8.314462618 * tb);
        let a = 101_325f64.ln() + b / (tb + c);
        let (t_lo, t_hi) = (b / (a - 2_000f64.ln()) - c, b / (a - 150_000f64.ln()) - c);
        let n = 8 + (uniform() * 8.0) as usize;
        let mut pts: Vec<Point> = (0..n)
            .map(|i| {
                let t = t_lo + (t_hi - t_lo) * (i as f64 + 0.5 * uniform()) / n as f64;
                let p = (a - b / (t + c)).exp() * (1.0 + 0.01 * (uniform() - 0.5));
                point(t, p)
            })
            .collect();
        if s % 10 == 0 {
            pts[n / 2].p_pa *= 1.25;
        }
        let weighted = s % 3 == 1;
        if weighted {
            for p in &mut pts {
                p.u_t_k = Some(0.05);
                p.u_p_pa = Some(0.003 * p.p_pa);
            }
        }
        let robust = match s % 5 {
            2 => Some(RobustLoss::Huber),
            4 => Some(RobustLoss::Tukey),
            _ => None,
        };
        if !weighted {
            let d = solver_difference(&pts).expect("the fast path certifies the seeded sets");
            assert!(agrees(d), "set {s}: {d:?}");
            worst_solver = worst_solver.max(d.1);
        }
        let (dp, in_se, fast) = compare(&pts, robust).unwrap();
        assert!(dp < 1e-9 || in_se < 1e-4, "set {s}: {dp:e} {in_se:e}");
        worst = worst.max(in_se);
        sets += 1;
        fast_sets += usize::from(fast);
    }
    eprintln!(
        "{sets} sets: solver difference at most {worst_solver:e} standard errors, whole fit at most \
         {worst:e} standard errors; fast path on {fast_sets}"
    );
    assert_eq!(fast_sets, sets);
}

/// `EBULLIO_FIT_SETS=bench/out/data/fit.csv cargo test --release --test main fit_separable -- --ignored`:
/// the comparison over every compound of a `compound,T/K,p/kPa` file (the benchmark's).
#[test]
#[ignore]
fn bench_sets_agree() {
    let path = std::env::var("EBULLIO_FIT_SETS").expect("EBULLIO_FIT_SETS names the file");
    let mut rd = csv::Reader::from_path(&path).unwrap();
    let mut sets: Vec<(String, Vec<Point>)> = Vec::new();
    for rec in rd.records() {
        let r = rec.unwrap();
        let p = point(r[1].parse().unwrap(), r[2].parse::<f64>().unwrap() * 1000.0);
        match sets.last_mut() {
            Some((name, pts)) if name.as_str() == &r[0] => pts.push(p),
            _ => sets.push((r[0].to_string(), vec![p])),
        }
    }
    let (mut worst_solver, mut worst_solver_se, mut declined, mut solver_1e9) =
        (0.0f64, 0.0f64, 0, 0);
    let (mut worst_rel, mut worst_se, mut fast, mut compared) = (0.0f64, 0.0f64, 0, 0);
    let mut within_1e9 = 0;
    for (name, pts) in &sets {
        match solver_difference(pts) {
            Some(d) => {
                assert!(agrees(d), "{name}: {d:?}");
                worst_solver = worst_solver.max(d.0);
                worst_solver_se = worst_solver_se.max(d.1);
                solver_1e9 += usize::from(d.0 < 1e-9);
            }
            None => declined += 1,
        }
        let Some((dp, in_se, f)) = compare(pts, None) else {
            continue;
        };
        assert!(dp < 1e-9 || in_se < 1e-4, "{name}: {dp:e} {in_se:e}");
        worst_rel = worst_rel.max(dp);
        worst_se = worst_se.max(in_se);
        within_1e9 += usize::from(dp <= 1e-9);
        compared += 1;
        fast += usize::from(f);
    }
    eprintln!(
        "{} sets. Solver: the fast path declined {declined}; on the rest it agrees with \
         Levenberg–Marquardt run to its fixed point within 1e-9 relative on {solver_1e9}, \
         at most {worst_solver:e} relative or {worst_solver_se:e} standard errors. Whole \
         fit, {compared} compared: fast path ran on {fast}; constants within 1e-9 relative of \
         the single Levenberg–Marquardt run on {within_1e9}, at most {worst_rel:e} relative \
         or {worst_se:e} standard errors apart",
        sets.len()
    );
}
