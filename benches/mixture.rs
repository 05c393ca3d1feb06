//! Mixture timings (divan): one UNIFAC evaluation, and a 101-point T–x–y diagram with the azeotrope search.
//!
//! Run: cargo bench --no-default-features --bench mixture
//! Targets (issue 15): γ of a binary at one state ≤ 1 µs; 101-point diagram + azeotrope search ≤ 2 ms.

use divan::black_box;
use ebullio::mixture::{ActivityModel, Binary, Condition, Unifac};
use ebullio::vapor::{AntoineConstants, AntoineConvention};

fn main() {
    divan::main();
}

fn ethanol_water() -> Unifac {
    Unifac::from_smiles(["CCO", "O"]).unwrap()
}

#[divan::bench]
fn unifac_ln_gamma_ethanol_water(b: divan::Bencher) {
    let m = ethanol_water();
    b.bench(|| m.ln_gamma(black_box(0.3), black_box(350.0)));
}

#[divan::bench]
fn unifac_ln_gamma_with_derivative_ethyl_acetate_ethanol(b: divan::Bencher) {
    let m = Unifac::from_smiles(["CCOC(C)=O", "CCO"]).unwrap();
    b.bench(|| m.ln_gamma_dx(black_box(0.3), black_box(345.0)));
}

/// Ethanol / water at 101.325 kPa with Antoine curves (Smith, Van Ness & Abbott,
/// App. B Table B.2: ethanol 16.8958, 3795.17, 230.918; water 16.3872, 3885.70, 230.170).
#[divan::bench]
fn txy_101_points_and_azeotrope_search_ethanol_water(b: divan::Bencher) {
    let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
    let etoh = AntoineConstants::new(16.8958, 3795.17, 230.918, conv);
    let water = AntoineConstants::new(16.3872, 3885.70, 230.170, conv);
    let m = ethanol_water();
    let bin = Binary {
        names: ["ethanol", "water"],
        curves: [&etoh, &water],
        model: &m,
    };
    let cond = Condition::Pressure(101_325.0);
    b.bench(|| {
        let d = bin.diagram(black_box(cond), 101).unwrap();
        bin.homogeneous_azeotropes(cond, &d).unwrap()
    });
}
