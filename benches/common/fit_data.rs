//! The invented ten-point sets shared by `benches/fit.rs` and `examples/fit_profile.rs`
//! (a smooth Antoine-like curve with a deterministic 0.2 % wiggle; not measurements).

use ebullio::fit::Point;

/// Set number `seed`: ten points from 320 K to 374 K.
pub fn set(seed: usize) -> Vec<Point> {
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
