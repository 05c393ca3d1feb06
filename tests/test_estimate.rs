//! `ebullio estimate` run as a real binary in a scratch folder.

use std::process::Command;

fn ebullio() -> Command {
    Command::new(env!("CARGO_BIN_EXE_ebullio"))
}

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
    let dir = tempfile::tempdir().unwrap();
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
