//! `ebullio estimate` run as a real binary in a scratch folder.

use crate::support::{ebullio, scratch};

#[test]
fn json_has_the_design_fields_and_at_pressure() {
    let out = ebullio()
        .args([
            "estimate",
            "--smiles",
            "CCOC(C)=O",
            "--at",
            "20 mbar",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    for k in [
        "smiles",
        "tb_k",
        "tb_pi90_low_k",
        "tb_pi90_high_k",
        "tb_joback_k",
        "tb_variant",
        "tm_k",
        "tc_k",
        "pc_bar",
        "vc_cm3_mol",
        "hvap_tb_kj_mol",
        "omega",
        "groups",
        "error",
        "formula",
    ] {
        assert!(v.get(k).is_some(), "missing {k}");
    }
    assert_eq!(v["groups"]["coo"], 1);
    let t20 = v["at"][0]["t_k"].as_f64().unwrap();
    assert!(t20 < v["tb_k"].as_f64().unwrap() - 50.0);
}

#[test]
fn batch_csv_keeps_going_past_bad_rows() {
    let dir = scratch();
    let input = dir.path().join("in.csv");
    std::fs::write(
        &input,
        "compound,smiles\nethyl acetate,CCOC(C)=O\nbroken,C1CC\nsalt,CC(=O)[O-].[Na+]\ntoluene,Cc1ccccc1\n",
    )
    .unwrap();
    let output = dir.path().join("out.csv");
    let st = ebullio()
        .args(["estimate", "--input"])
        .arg(&input)
        .arg("--output")
        .arg(&output)
        .status()
        .unwrap();
    assert!(st.success());
    let text = std::fs::read_to_string(&output).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines.len(), 5, "{text}");
    assert!(lines[2].contains("unclosed ring 1 at position 2"));
    assert!(lines[3].contains("estimate each component"));
    assert!(lines[4].starts_with("toluene,Cc1ccccc1,C7H8,"));
}

#[test]
fn bad_smiles_is_exit_2_with_a_caret() {
    let out = ebullio()
        .args(["estimate", "--smiles", "CC[Xx]C"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("unknown element 'Xx' at position 4"), "{err}");
    assert!(err.contains("CC[Xx]C\n   ^"), "{err}");
}

#[test]
fn measured_point_anchors_the_curve() {
    let out = ebullio()
        .args([
            "estimate",
            "--smiles",
            "CCCCO",
            "--measured",
            "117.7 degC at 760 mmHg",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    assert!(out.status.success());
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let tb = v["anchored"]["tb_k"].as_f64().unwrap();
    assert!((tb - 390.85).abs() < 0.01, "{tb}");
}

/// The same structures as CSV and as Parquet give the same estimates; a ragged and a
/// non-UTF-8 row in the CSV become row errors naming the line, and the batch goes on.
#[test]
fn parquet_input_matches_csv_and_unreadable_rows_are_row_errors() {
    use polars::prelude::*;
    use polars_io::prelude::*;
    let dir = scratch();
    let names = ["ethyl acetate", "toluene", "isopropanol"];
    let smiles = ["CCOC(C)=O", "Cc1ccccc1", "CC(C)O"];
    let mut df = df!("compound" => &names, "structure" => &smiles).unwrap();
    let pq = dir.path().join("in.parquet");
    ParquetWriter::new(std::fs::File::create(&pq).unwrap())
        .finish(&mut df)
        .unwrap();
    let csv_in = dir.path().join("in.csv");
    let mut text = String::from("compound,structure\n");
    for (n, s) in names.iter().zip(smiles) {
        text.push_str(&format!("{n},{s}\n"));
    }
    let mut bytes = text.into_bytes();
    bytes.extend_from_slice(b"ragged\nlatin,C\xB0C\n");
    std::fs::write(&csv_in, bytes).unwrap();
    let run = |input: &std::path::Path, out: &str| {
        let output = dir.path().join(out);
        let o = ebullio()
            .args(["estimate", "--smiles-column", "structure", "--input"])
            .arg(input)
            .arg("--output")
            .arg(&output)
            .output()
            .unwrap();
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
        std::fs::read_to_string(&output).unwrap()
    };
    let from_pq = run(&pq, "pq.csv");
    let from_csv = run(&csv_in, "csv.csv");
    let pq_lines: Vec<&str> = from_pq.lines().collect();
    let csv_lines: Vec<&str> = from_csv.lines().collect();
    assert_eq!(pq_lines.len(), 4, "{from_pq}");
    assert_eq!(pq_lines[..], csv_lines[..4]);
    assert!(pq_lines[2].starts_with("toluene,Cc1ccccc1,C7H8,"));
    assert!(
        csv_lines[4].contains("line 5") && csv_lines[4].contains("fields"),
        "{}",
        csv_lines[4]
    );
    assert!(
        csv_lines[5].contains("line 6") && csv_lines[5].contains("UTF-8"),
        "{}",
        csv_lines[5]
    );
}

/// A missing structure column in a Parquet file is exit 2 naming the columns there are.
#[test]
fn parquet_without_the_structure_column_is_exit_2() {
    use polars::prelude::*;
    use polars_io::prelude::*;
    let dir = scratch();
    let mut df = df!("compound" => &["a"], "mol" => &["CCO"]).unwrap();
    let pq = dir.path().join("in.parquet");
    ParquetWriter::new(std::fs::File::create(&pq).unwrap())
        .finish(&mut df)
        .unwrap();
    let o = ebullio()
        .args(["estimate", "--input"])
        .arg(&pq)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(
        err.contains("no column 'smiles' (columns: compound, mol)"),
        "{err}"
    );
    assert!(err.contains("--smiles-column"), "{err}");
}
