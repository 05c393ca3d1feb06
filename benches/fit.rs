//! Fit throughput: one Antoine fit of 10 points with full statistics, and a batch of 10,000.
//!
//! Run: `cargo bench --no-default-features --bench fit`. Data are invented
//! (ln(p/Pa) = 22.0 − 3500/(T − 45) with a deterministic ±0.2 % wiggle).
//! Measured 2026-12-02 on the shared 2-core machine (load average about 7, so
//! wall-clock figures are high): one fit median 6.74 µs (~148,000 fits/s, was
//! 11.26 µs); batch of 10,000 on one core 178 ms wall-clock, but 9.1 µs of CPU
//! time per fit (~110,000 fits/s/core: `perf stat -e task-clock` on
//! `examples/fit_profile.rs`); the batch loses CPU to other processes over its
//! length, a single 7 µs sample rarely does. Instructions per fit (callgrind,
//! `examples/fit_profile.rs`): 98k over varied sets, 88k for this one (were 149k, 146k).
//! Rayon batch: CPU time per fit is the same with 1 and 2 threads (no contention).

use divan::black_box;
use ebullio::fit::{fit_points, FitOptions, Point};

fn main() {
    divan::main();
}

#[path = "common/fit_data.rs"]
mod fit_data;
use fit_data::set;

#[divan::bench]
fn antoine_10_points_full_statistics(b: divan::Bencher) {
    let pts = set(0);
    let opts = FitOptions::default();
    b.bench(|| fit_points(None, black_box(&pts), &opts).map(|r| r.rms_rel_dev_pct));
}

#[divan::bench(sample_count = 3)]
fn batch_10000_compounds_one_core(b: divan::Bencher) {
    let sets: Vec<Vec<Point>> = (0..10_000).map(set).collect();
    let opts = FitOptions::default();
    b.bench(|| {
        sets.iter()
            .filter_map(|s| fit_points(None, s, &opts).ok())
            .count()
    });
}

/// As the CLI runs a batch (rayon over compounds); set RAYON_NUM_THREADS=1 or 2.
#[divan::bench(sample_count = 3)]
fn batch_10000_compounds_rayon(b: divan::Bencher) {
    use rayon::prelude::*;
    let sets: Vec<Vec<Point>> = (0..10_000).map(set).collect();
    let opts = FitOptions::default();
    b.bench(|| {
        sets.par_iter()
            .filter_map(|s| fit_points(None, s, &opts).ok())
            .count()
    });
}
