//! Fixed workload for instruction-count profiling of the fitter (load-independent).
//!
//! Run: `cargo build --release --no-default-features --example fit_profile`, then
//! `valgrind --tool=callgrind target/release/examples/fit_profile 1000 [same]`; the
//! count minus that of `fit_profile 0`, over 1000, is instructions per fit.
//! `perf stat -e task-clock` on it gives CPU time per fit on a shared machine.
//! Same invented data as `benches/fit.rs`.

use ebullio::fit::{fit_points, FitOptions, Point};

fn set(seed: usize) -> Vec<Point> {
    (0..10)
        .map(|i| {
            let t = 320.0 + 6.0 * i as f64;
            let e = 0.002 * ((i + seed) as f64 * 2.3).sin();
            Point {
                t_k: t,
                p_pa: (22.0 - 3500.0 / (t - 45.0) + e).exp(),
                u_t_k: None,
                u_p_pa: None,
            }
        })
        .collect()
}

fn main() {
    let n: usize = std::env::args()
        .nth(1)
        .and_then(|s| s.parse().ok())
        .unwrap_or(1000);
    // `same`: the one set of the single-fit benchmark, n times; default n different sets.
    let same = std::env::args().nth(2).as_deref() == Some("same");
    let sets: Vec<Vec<Point>> = (0..n).map(|i| set(if same { 0 } else { i })).collect();
    let opts = FitOptions::default();
    let mut ok = 0usize;
    let mut sum = 0.0;
    for s in &sets {
        if let Ok(r) = fit_points(None, s, &opts) {
            ok += 1;
            sum += r.normal_boiling_point_k.map_or(0.0, |i| i.value);
        }
    }
    println!(
        "{ok} of {n} fits converged; mean Tb {:.6} K",
        sum / ok.max(1) as f64
    );
}
