//! Writes `reference-data/demo/still-run-2026.csv`: the invented Harrow Vale still run
//! (ethyl acetate (1) / ethanol (2) at 1 atm) for `ebullio demo` and the README.
//!
//! INVENTED data: an NRTL "truth" of this project's choosing on the bundled
//! reference vapor-pressure curves, seeded normal noise (0.1 K in T, 0.005 in
//! y1) and one planted fault: the vapor analysis reads y1 0.02 high below
//! x1 = 0.5 (a gas-chromatograph calibration bias), which the consistency tests
//! must catch. Run: `cargo run --example make_still_run --no-default-features`.

use ebullio::mixture::{Binary, Nrtl};
use ebullio::reference::Library;
use std::fmt::Write as _;

/// SplitMix64 with Box–Muller normals (seeded: the same file on every run).
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }
    fn uniform(&mut self) -> f64 {
        ((self.next() >> 11) as f64 + 0.5) / (1u64 << 53) as f64
    }
    fn normal(&mut self) -> f64 {
        let (u, v) = (self.uniform(), self.uniform());
        (-2.0 * u.ln()).sqrt() * (2.0 * std::f64::consts::PI * v).cos()
    }
}

/// The invented truth (kelvin), the planted bias and the compositions sampled.
pub const TRUTH_B12_K: f64 = 120.0;
pub const TRUTH_B21_K: f64 = 160.0;
pub const Y_BIAS: f64 = 0.02;
const X1: [f64; 12] = [
    0.05, 0.1, 0.18, 0.25, 0.33, 0.42, 0.5, 0.58, 0.67, 0.76, 0.85, 0.93,
];

fn main() {
    let lib = Library::bundled();
    let c1 = lib.find("ethyl acetate").unwrap().best_curve().unwrap();
    let c2 = lib.find("ethanol").unwrap().best_curve().unwrap();
    let truth = Nrtl::new(TRUTH_B12_K, TRUTH_B21_K, 0.3).unwrap();
    let b = Binary {
        names: ["ethyl acetate", "ethanol"],
        curves: [&c1, &c2],
        model: &truth,
    };
    let mut rng = Rng(20_260_317);
    let mut out = String::from(
        "# INVENTED demo data (Harrow Vale Fine Chemicals, fictional): still run SR-14, recirculating still at 1 atm.\n# components: ethyl acetate, ethanol\nx1,y1,t/°C\n",
    );
    for x in X1 {
        let pt = b.bubble_t(x, 101_325.0).unwrap();
        let bias = if x < 0.5 { Y_BIAS } else { 0.0 };
        let y = pt.y1 + 0.005 * rng.normal() + bias;
        let t = pt.t_k - ebullio::units::CELSIUS_OFFSET + 0.1 * rng.normal();
        let _ = writeln!(out, "{x:.3},{y:.4},{t:.2}");
    }
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/reference-data/demo/still-run-2026.csv"
    );
    std::fs::write(path, out).unwrap();
    println!("wrote {path}");
}
