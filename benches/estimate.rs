//! Throughput of parse + Joback group assignment + all properties (divan).
//!
//! Run: cargo bench --no-default-features --bench estimate

use ebullio::estimate::estimate_smiles;

fn main() {
    divan::main();
}

/// A mix of dev-set-like structures (solvents, aromatics, acids, esters, nitriles).
const MIX: &[&str] = &[
    "CC(C)=O",
    "CCO",
    "Cc1ccccc1",
    "CCOC(C)=O",
    "CCCCCCCC",
    "ClC(Cl)Cl",
    "OCCOCCO",
    "CC(=O)O",
    "CC#N",
    "C[N+](=O)[O-]",
    "c1ccsc1",
    "CN(C)C=O",
    "Oc1ccccc1",
    "CC(C)c1ccccc1",
    "C1CCCCC1",
    "CCCCOC(C)=O",
];

#[divan::bench(sample_count = 50, sample_size = 200)]
fn parse_groups_properties_16_molecules() -> usize {
    let mut ok = 0;
    for s in MIX {
        if divan::black_box(estimate_smiles(divan::black_box(s))).is_ok() {
            ok += 1;
        }
    }
    ok
}

#[divan::bench(sample_count = 50, sample_size = 200)]
fn parse_only_16_molecules() -> usize {
    MIX.iter()
        .filter(|s| ebullio::molecule::parse_smiles(divan::black_box(s)).is_ok())
        .count()
}
