//! Inputs found by the cargo-fuzz targets in fuzz/ (run 2026-12-02, 10 minutes per target),
//! kept as tests so they stay fixed. Each test applies the same contract as its fuzz target.

use ebullio::fit::{fit_points, FitOptions, ModelSelection, Point, RobustLoss};

/// Time a slow regression may take: the slow fit below took 23.9 s in a debug build on the
/// shared 2-core machine at a load average of 20 before the fit's evaluation budget, 0.05 s
/// after it (load 6); the limit leaves room for a loaded machine, so only a hang fails.
const TIME_LIMIT: std::time::Duration = std::time::Duration::from_secs(30);

/// Run `f` on its own thread; fail if it panics or is still running after `limit`.
fn within(limit: std::time::Duration, f: impl FnOnce() + Send + 'static) {
    let (tx, rx) = std::sync::mpsc::channel();
    let start = std::time::Instant::now();
    std::thread::spawn(move || {
        f();
        let _ = tx.send(());
    });
    match rx.recv_timeout(limit) {
        Ok(()) => eprintln!("finished in {:.2} s", start.elapsed().as_secs_f64()),
        Err(std::sync::mpsc::RecvTimeoutError::Timeout) => {
            panic!("still running after {} s", limit.as_secs())
        }
        Err(std::sync::mpsc::RecvTimeoutError::Disconnected) => panic!("the check panicked"),
    }
}

/// The fit_points target's contract: an error, or a report with a termination reason whose
/// parameters are finite when it says it converged.
fn assert_fit_contract(points: &[Point], opts: &FitOptions) {
    if let Ok(r) = fit_points(None, points, opts) {
        assert!(
            !r.termination.reason.to_string().is_empty(),
            "no termination reason"
        );
        if r.termination.is_success() {
            assert!(
                r.si_parameters.iter().all(|v| v.is_finite()),
                "converged with non-finite parameters {:?}",
                r.si_parameters
            );
        }
    }
}

/// fuzz/artifacts/fit_points/slow-unit-05aa2c14…: temperatures and pressures near 1e-23
/// with subnormal pressure uncertainties (3e-310 Pa, so 1/u² overflows). libFuzzer reported
/// it as its slowest unit (11 s under the sanitizer build on a loaded machine); on main
/// 68c59ae it ended unconverged after 87 Levenberg–Marquardt solves and 160,178 residual
/// evaluations. Since the fit's evaluation budget (issue 20) it ends after one solve of 400
/// evaluations, reported as the budget spent, not as a solution.
#[test]
fn fuzz_fit_points_subnormal_uncertainties_tukey_antoine() {
    let p = |t_k, p_pa, u_t_k, u_p_pa| Point {
        t_k,
        p_pa,
        u_t_k,
        u_p_pa,
    };
    let points = [
        p(
            2.812414082670612e-23,
            2.252526342575774e-23,
            Some(2.252526342575774e-23),
            Some(2.252526342575774e-23),
        ),
        p(
            2.236307114878656e-23,
            2.252526342575774e-23,
            Some(2.252526342575774e-23),
            Some(3.21763131499815e-310),
        ),
        p(
            2.252526342575774e-23,
            2.252526342575774e-23,
            Some(2.235401118821697e-23),
            Some(2.252526342575774e-23),
        ),
        p(
            2.2525263463461408e-23,
            2.252526342575774e-23,
            Some(2.2502645205883244e-23),
            None,
        ),
        p(
            2.252526342575774e-23,
            1.0503209742121367e-19,
            Some(2.2525263425905195e-23),
            Some(1.1951619082204e-310),
        ),
    ];
    let opts = FitOptions {
        model: ModelSelection::Antoine,
        robust: Some(RobustLoss::Tukey),
        ..FitOptions::default()
    };
    // Kept for having been slow: it must also end in time. The fit runs on its own
    // thread so a hang fails the test instead of stalling the suite.
    within(TIME_LIMIT, move || {
        assert_fit_contract(&points, &opts);
        let r = fit_points(None, &points, &opts).expect("a report");
        assert_eq!(
            r.termination.reason.to_string(),
            "evaluation budget spent (1200 evaluations)"
        );
        assert!(r.flags.iter().any(|f| f.code == "not-converged"));
    });
}
