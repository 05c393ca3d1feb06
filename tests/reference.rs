//! `ebullio reference` run as a real binary in a scratch folder.

use crate::support::{ebullio, scratch};

#[test]
fn list_filter_and_show_by_synonym_and_smiles() {
    let out = ebullio()
        .args(["reference", "--format", "json"])
        .output()
        .unwrap();
    assert!(out.status.success());
    let all: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(all.as_array().unwrap().len() > 60);
    let out = ebullio()
        .args(["reference", "--filter", "xylene", "--format", "csv"])
        .output()
        .unwrap();
    assert_eq!(String::from_utf8_lossy(&out.stdout).lines().count(), 4);
    for q in [
        vec!["reference", "Ethyl Alcohol"],
        vec!["reference", "--smiles", "OCC"],
    ] {
        let out = ebullio()
            .args(&q)
            .args(["--format", "json"])
            .output()
            .unwrap();
        assert!(out.status.success(), "{q:?}");
        let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        assert_eq!(v["name"], "ethanol");
        assert!(v["antoine"].as_array().unwrap().len() >= 3);
        // The preferred Tb is the reference equation's (Schroeder et al. 2014 for ethanol).
        assert!(v["tb_source"]
            .as_str()
            .unwrap()
            .contains("reference equation of state"));
    }
}

// CAS check digit (64-17-5 ethanol, from memory): a wrong digit is exit 2 with the expected digit.
#[test]
fn cas_lookup_with_user_table_and_bad_check_digit() {
    let out = ebullio().args(["reference", "64-17-4"]).output().unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("give 5"));
    let dir = scratch();
    let t = dir.path().join("mine.csv");
    std::fs::write(
        &t,
        "compound,cas,tb_k,source\nethanol,64-17-5,351.44,lab notebook 12\n",
    )
    .unwrap();
    let out = ebullio()
        .args([
            "reference",
            "64-17-5",
            "--reference-table",
            t.to_str().unwrap(),
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
    assert_eq!(v["tb_k"], 351.44);
    assert!(v["tb_source"].as_str().unwrap().contains("mine.csv"));
    let out = ebullio()
        .args(["reference", "unobtainium"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
}
