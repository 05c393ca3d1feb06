//! The one integration-test binary (`autotests = false` in Cargo.toml): one module per
//! command run through the real binary, then the themed suites that call the library.
//! A new test file is added here as a `mod` line.

mod support;

// One file per command.
mod boil;
mod check;
mod convert;
mod demo;
mod estimate;
mod fit;
mod fit_binary;
#[cfg(unix)]
mod interrupt;
mod plan;
mod practitioner;
mod reference;
mod report;
mod vle;

// Themed suites.
mod antoine_published_and_statistics;
mod estimate_joback;
mod estimate_lee_kesler_published;
mod estimate_tb_model;
mod fit_hostile_data;
mod fit_separable;
mod fuzz_regressions;
mod iapws_if97;
mod layers;
mod mixture_dev_pairs;
mod readme_examples;
mod smiles_properties;
mod strd;
