//! Azeotropes predicted by UNIFAC + the bundled vapor-pressure curves against the
//! dev list `reference-data/azeotropes-dev.csv` (14 pairs at 101.325 kPa; values
//! from memory of the CRC Handbook "Azeotropic data for binary mixtures" and
//! Horsley, *Azeotropic Data*, ACS Advances in Chemistry; see
//! `reference-data/azeotropes-dev.md`). The list checks; it calibrates nothing.

use ebullio::mixture::{vle_study, Condition, StudyComponent, StudyOptions, Unifac};
use ebullio::reference::Library;

const DEV: &str = include_str!("../reference-data/azeotropes-dev.csv");

#[test]
fn unifac_azeotropes_against_the_dev_list_at_one_atmosphere() {
    let lib = Library::bundled();
    let mut right_kind = 0;
    let mut homogeneous = 0;
    let mut homogeneous_close = 0;
    println!("pair | listed kind, T/°C, x1 | predicted kind, T/°C, x1 | split");
    for line in DEV.lines().skip(1) {
        let f: Vec<&str> = line.split(',').collect();
        let (n1, s1, n2, s2, kind) = (f[0], f[1], f[2], f[3], f[4]);
        let x_listed: Option<f64> = f[6].parse().ok();
        let t_listed: Option<f64> = f[7].parse().ok();
        let c1 = lib.find(n1).unwrap().best_curve().unwrap();
        let c2 = lib.find(n2).unwrap().best_curve().unwrap();
        let model = Unifac::from_smiles([s1, s2]).unwrap();
        let study = vle_study(
            [
                StudyComponent {
                    name: n1,
                    smiles: Some(s1),
                    source: &c1.source,
                    curve: &c1,
                },
                StudyComponent {
                    name: n2,
                    smiles: Some(s2),
                    source: &c2.source,
                    curve: &c2,
                },
            ],
            &model,
            &StudyOptions {
                condition: Condition::Pressure(101_325.0),
                points: 101,
            },
        )
        .unwrap();
        let predicted = if study.azeotropes.is_empty() {
            "none".to_string()
        } else {
            study
                .azeotropes
                .iter()
                .map(|a| a.kind_str().to_string())
                .collect::<Vec<_>>()
                .join("+")
        };
        let first = study.azeotropes.first();
        let ok_kind = predicted == kind;
        right_kind += ok_kind as u32;
        let mut close = false;
        if let (Some(x), Some(t)) = (x_listed, t_listed) {
            if kind != "heterogeneous" {
                homogeneous += 1;
                if let Some(a) = first.filter(|_| ok_kind) {
                    close = (a.t_k.unwrap() - 273.15 - t).abs() <= 3.0 && (a.x1 - x).abs() <= 0.1;
                    homogeneous_close += close as u32;
                }
            }
        }
        println!(
            "{n1} / {n2} | {kind}, {}, {} | {predicted}, {}, {} | {}{}{}",
            t_listed.map_or("-".into(), |t| format!("{t:.1}")),
            x_listed.map_or("-".into(), |x| format!("{x:.3}")),
            first.map_or("-".into(), |a| format!("{:.1}", a.t_k.unwrap() - 273.15)),
            first.map_or("-".into(), |a| format!("{:.3}", a.x1)),
            if study.liquid_split.predicted {
                format!(
                    "{:.4}-{:.4}",
                    study.liquid_split.x1_low.unwrap(),
                    study.liquid_split.x1_high.unwrap()
                )
            } else {
                "none".into()
            },
            if ok_kind { "" } else { "  <- wrong kind" },
            if close { "  (T, x close)" } else { "" },
        );
    }
    println!("right kind {right_kind}/14; homogeneous within 3 K and 0.1: {homogeneous_close}/{homogeneous}");
    assert!(right_kind >= 12, "right kind for {right_kind} of 14");
    assert!(
        homogeneous_close >= 7,
        "{homogeneous_close} of {homogeneous} homogeneous within 3 K and 0.1"
    );
}
