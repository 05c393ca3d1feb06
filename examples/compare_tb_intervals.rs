//! Compares two shapes of the boiling-point 90 % interval on the out-of-fold
//! residuals of the shipped variant (fit split only; the held-out split is not read):
//! a half-width relative to Tb (`q · Tb`) and one in kelvin (`q`). The residuals of
//! folds 0–4 calibrate the quantile for folds 5–9 and the other way round; the table
//! gives the coverage and the mean half-width of each shape per family. This is how
//! the kelvin shape was chosen (`tb_fit::evaluate`).
//!
//! Run: `cargo run --example compare_tb_intervals --no-default-features`

use ebullio::estimate::tb_features::Family;
use ebullio::estimate::tb_fit::{fit, fold_of, load, outside, FOLDS, OUTSIDE_FACTOR};
use ebullio::estimate::tb_model::TbVariant;
use std::path::Path;

/// One out-of-fold prediction: family, fold, accepted Tb, predicted Tb, interval factor.
type Oof = (Family, u64, f64, f64, f64);

fn q90(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    let k = ((0.9 * (v.len() as f64 + 1.0)).ceil() as usize).clamp(1, v.len());
    v[k - 1]
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join("reference-data/tb-calibration.csv");
    let (rows, _) = load(&std::fs::read_to_string(path)?);
    let v = TbVariant::ExtendedGroupsSteinBrown;
    let fit_rows: Vec<_> = rows.iter().filter(|r| !r.heldout).collect();
    let mut oof: Vec<Oof> = Vec::new();
    for f in 0..FOLDS {
        let train: Vec<_> = fit_rows
            .iter()
            .copied()
            .filter(|r| fold_of(&r.key) != f)
            .collect();
        let m = fit(v, &train);
        for r in fit_rows.iter().filter(|r| fold_of(&r.key) == f) {
            let p = m.predict(&r.terms);
            if p.tb_k.is_finite() {
                let fac = if outside(&p.outside, r.polar) {
                    OUTSIDE_FACTOR
                } else {
                    1.0
                };
                oof.push((r.family, f, r.tb_k, p.tb_k, fac));
            }
        }
    }
    println!("| shape | family | inside | n | mean half-width |\n|---|---|---|---|---|");
    for relative in [true, false] {
        let shape = if relative { "q · Tb" } else { "q (K)" };
        let score = |x: &Oof| {
            let e = (x.2 - x.3).abs() / x.4;
            if relative {
                e / x.3
            } else {
                e
            }
        };
        let half = |x: &Oof, q: f64| if relative { q * x.3 * x.4 } else { q * x.4 };
        let (mut all_in, mut all_n, mut all_w) = (0, 0, 0.0);
        for fam in Family::ALL {
            let (mut inside, mut n, mut w) = (0, 0, 0.0);
            for first in [true, false] {
                let cal: Vec<f64> = oof
                    .iter()
                    .filter(|x| x.0 == fam && (x.1 < FOLDS / 2) == first)
                    .map(score)
                    .collect();
                if cal.is_empty() {
                    continue;
                }
                let q = q90(cal);
                for x in oof
                    .iter()
                    .filter(|x| x.0 == fam && (x.1 < FOLDS / 2) != first)
                {
                    let h = half(x, q);
                    n += 1;
                    w += h;
                    if (x.2 - x.3).abs() <= h {
                        inside += 1;
                    }
                }
            }
            println!(
                "| {shape} | {} | {inside} | {n} | {:.1} K |",
                fam.name(),
                w / n.max(1) as f64
            );
            all_in += inside;
            all_n += n;
            all_w += w;
        }
        println!(
            "| {shape} | all | {all_in} ({:.1} %) | {all_n} | {:.1} K |",
            100.0 * all_in as f64 / all_n.max(1) as f64,
            all_w / all_n.max(1) as f64
        );
    }
    Ok(())
}
