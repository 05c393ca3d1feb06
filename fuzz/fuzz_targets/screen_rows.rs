//! Fuzz the table screener's row checks on arbitrary rows: a report for every row, never a panic.
#![no_main]

use arbitrary::Arbitrary;
use ebullio::screen::{screen, AntoineCell, JobackEstimator, RowInput, ScreenContext};
use ebullio::units::TemperatureUnit;
use ebullio::vapor::{AntoineConstants, AntoineConvention};
use libfuzzer_sys::fuzz_target;

#[derive(Debug, Arbitrary)]
struct Row {
    compound: Option<String>,
    smiles: Option<String>,
    cas: Option<String>,
    tb_k: Option<f64>,
    tb_unit: u8,
    antoine: u8,
    abc: (f64, f64, f64),
    convention: u8,
    range: Option<(f64, f64)>,
    tc_k: Option<f64>,
    pc_pa: Option<f64>,
}

const CONVENTIONS: [&str; 4] = ["log10,mmHg,degC", "ln,kPa,K", "log10,bar,K", "ln,Pa,degC"];

fuzz_target!(|rows: Vec<Row>| {
    if rows.len() > 32 {
        return;
    }
    let inputs: Vec<RowInput<'_>> = rows
        .iter()
        .enumerate()
        .map(|(i, r)| {
            let mut row = RowInput::at_line(i + 2);
            row.compound = r.compound.as_deref();
            row.smiles = r.smiles.as_deref().filter(|s| s.len() < 200);
            row.cas = r.cas.as_deref();
            row.tb_k = r.tb_k;
            row.tb_unit = TemperatureUnit::ALL[r.tb_unit as usize % TemperatureUnit::ALL.len()];
            row.antoine = match r.antoine % 4 {
                0 => AntoineCell::Absent,
                1 => AntoineCell::Incomplete,
                2 => AntoineCell::NoConvention,
                _ => {
                    let conv: AntoineConvention = CONVENTIONS[r.convention as usize % 4]
                        .parse()
                        .expect("fixed convention");
                    let k = AntoineConstants::new(r.abc.0, r.abc.1, r.abc.2, conv);
                    AntoineCell::Given(match r.range {
                        Some((lo, hi)) => k.with_range_k(lo, hi),
                        None => k,
                    })
                }
            };
            row.tc_k = r.tc_k;
            row.pc_pa = r.pc_pa;
            row
        })
        .collect();
    let ctx = ScreenContext {
        estimator: &JobackEstimator,
        ..ScreenContext::default()
    };
    let report = screen(&inputs, None, &ctx);
    let _ = format!("{report:?}");
});
