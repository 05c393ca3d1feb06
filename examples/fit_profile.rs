//! Fixed workload for instruction-count profiling of the fitter (load-independent).
//!
//! Run: `cargo build --release --no-default-features --example fit_profile`, then
//! `valgrind --tool=callgrind target/release/examples/fit_profile 1000 [same]`; the
//! count minus that of `fit_profile 0`, over 1000, is instructions per fit.
//! `perf stat -e task-clock` on it gives CPU time per fit on a shared machine.
//! Same invented data as `benches/fit.rs`.

use ebullio::fit::{fit_points, FitOptions, Point};

#[path = "../benches/common/fit_data.rs"]
mod fit_data;
use fit_data::set;

fn main() {
    let n: usize = std::env::args()
        .nth(1)
        .and_then(|s| s.parse().ok())
        .unwrap_or(1000);
    // `same`: the one set of the single-fit benchmark, n times; default n different
    // sets; `par`: the different sets through rayon, as the CLI batch runs them
    // (RAYON_NUM_THREADS=1 or 2).
    let mode = std::env::args().nth(2);
    let same = mode.as_deref() == Some("same");
    let sets: Vec<Vec<Point>> = (0..n).map(|i| set(if same { 0 } else { i })).collect();
    let opts = FitOptions::default();
    let tb = |s: &Vec<Point>| {
        fit_points(None, s, &opts)
            .ok()
            .map(|r| r.normal_boiling_point_k.map_or(0.0, |i| i.value))
    };
    let tbs: Vec<Option<f64>> = if mode.as_deref() == Some("par") {
        use rayon::prelude::*;
        sets.par_iter().map(tb).collect()
    } else {
        sets.iter().map(tb).collect()
    };
    let ok = tbs.iter().flatten().count();
    let sum: f64 = tbs.iter().flatten().sum();
    println!(
        "{ok} of {n} fits converged; mean Tb {:.6} K",
        sum / ok.max(1) as f64
    );
}
