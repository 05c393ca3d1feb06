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

/// Text with every `xmlns="http..."` namespace declaration of inline SVG removed: a namespace
/// name identifies the SVG vocabulary and is not a web address of a source.
fn without_svg_namespaces(s: &str) -> String {
    s.replace("xmlns=\"http://www.w3.org/2000/svg\"", "")
        .replace("xmlns:xlink=\"http://www.w3.org/1999/xlink\"", "")
}

fn assert_no_address(what: &str, text: &str) {
    let t = without_svg_namespaces(text).to_ascii_lowercase();
    for bad in ["http", "www."] {
        assert!(!t.contains(bad), "{what} contains '{bad}'");
    }
}

// Primary sources only: no web address in any bundled data file (reference-data/, except the
// estimate method's own notes JOBACK.md, which are not bundled into the program) ...
#[test]
fn no_web_address_in_bundled_data() {
    fn walk(dir: &std::path::Path, out: &mut Vec<std::path::PathBuf>) {
        for e in std::fs::read_dir(dir).unwrap().flatten() {
            let p = e.path();
            if p.is_dir() {
                if !p.ends_with("gen") {
                    walk(&p, out);
                }
            } else {
                out.push(p);
            }
        }
    }
    let mut files = Vec::new();
    walk(
        &std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("reference-data"),
        &mut files,
    );
    assert!(files.len() >= 10);
    for f in files {
        if f.ends_with("JOBACK.md") {
            continue;
        }
        let text = std::fs::read_to_string(&f).unwrap();
        assert_no_address(&f.display().to_string(), &text);
    }
}

// ... and none in any output of `reference --all`, `boil`, `plan`, `check`, the demo and its
// report (every file the demo writes).
#[test]
fn no_web_address_in_any_output() {
    let run = |args: &[&str]| {
        let o = ebullio().args(args).output().unwrap();
        assert!(
            o.status.success(),
            "{args:?}: {}",
            String::from_utf8_lossy(&o.stderr)
        );
        format!(
            "{}{}",
            String::from_utf8_lossy(&o.stdout),
            String::from_utf8_lossy(&o.stderr)
        )
    };
    for f in ["table", "json", "csv"] {
        assert_no_address(
            "reference --all",
            &run(&["reference", "--all", "--format", f]),
        );
    }
    for c in [
        "toluene",
        "acetonitrile",
        "water",
        "dimethyl sulfoxide",
        "formic acid",
        "chloroform",
    ] {
        for f in ["table", "json"] {
            let out = run(&[
                "boil",
                "--compound",
                c,
                "--pressure",
                "20 mbar",
                "--format",
                f,
            ]);
            assert_no_address(&format!("boil {c}"), &out);
        }
    }
    assert_no_address(
        "boil --smiles",
        &run(&["boil", "--smiles", "CN(C)C=O", "-p", "20 mbar"]),
    );
    let plan = run(&[
        "plan",
        "--compound",
        "toluene",
        "--compound",
        "ethylbenzene",
        "--compound",
        "acetic acid",
        "--pressure",
        "100 mbar",
        "--format",
        "json",
    ]);
    assert_no_address("plan", &plan);
    let dir = tempfile::tempdir().unwrap();
    for table in [
        "normal-boiling-points-dev.csv",
        "antoine-published.csv",
        "process-solvents.csv",
    ] {
        let src = std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
            .join("reference-data")
            .join(table);
        let out = dir.path().join(format!("checked-{table}"));
        let o = ebullio()
            .arg("check")
            .arg(&src)
            .arg("-o")
            .arg(&out)
            .output()
            .unwrap();
        assert!(o.status.code().is_some_and(|c| c <= 1), "check {table}");
        assert_no_address(
            &format!("check {table}"),
            &String::from_utf8_lossy(&o.stdout),
        );
        assert_no_address(
            &format!("check {table}"),
            &std::fs::read_to_string(&out).unwrap(),
        );
    }
    let demo = dir.path().join("demo");
    let o = ebullio()
        .args(["demo", "--output"])
        .arg(&demo)
        .output()
        .unwrap();
    assert!(o.status.success());
    assert_no_address("demo stdout", &String::from_utf8_lossy(&o.stdout));
    for e in std::fs::read_dir(&demo).unwrap().flatten() {
        if let Ok(text) = std::fs::read_to_string(e.path()) {
            assert_no_address(&e.path().display().to_string(), &text);
        }
    }
}

// The must-holds of the reference basis: toluene at 1 atm within ±0.1 K (95 %), lookup by CAS,
// a did-you-mean for a misspelling, and DMF by structure uses its reference boiling point.
#[test]
fn reference_basis_must_holds() {
    let o = ebullio()
        .args([
            "boil",
            "--compound",
            "toluene",
            "--pressure",
            "1 atm",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
    let r = &v["results"][0];
    let half = (r["ci95_high_k"].as_f64().unwrap() - r["ci95_low_k"].as_f64().unwrap()) / 2.0;
    assert!(half <= 0.1, "{half}");
    // Lemmon & Span (2006) equation: Tb 383.75 K.
    assert!((r["t_k"].as_f64().unwrap() - 383.75).abs() < 0.05);
    let o = ebullio()
        .args([
            "boil",
            "--compound",
            "108-88-3",
            "--pressure",
            "1 atm",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    assert!(o.status.success());
    assert!(String::from_utf8_lossy(&o.stdout).contains("reference toluene"));
    let o = ebullio()
        .args(["boil", "--compound", "tolune", "--pressure", "1 atm"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("did you mean: toluene"));
    let o = ebullio()
        .args([
            "boil",
            "--smiles",
            "CN(C)C=O",
            "--pressure",
            "1 atm",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
    // National Academies App. D: DMF boils at 153 degC.
    assert!((v["results"][0]["t_k"].as_f64().unwrap() - 426.15).abs() < 0.01);
    let notes = v["notes"].to_string();
    assert!(
        notes.contains("reference compound N,N-dimethylformamide"),
        "{notes}"
    );
    let o = ebullio()
        .args(["reference", "--filter", "", "--format", "csv"])
        .output()
        .unwrap();
    let mut rdr = csv::Reader::from_reader(o.stdout.as_slice());
    let with_cas = rdr
        .records()
        .filter(|r| {
            r.as_ref()
                .is_ok_and(|r| r.get(2).is_some_and(|c| !c.is_empty()))
        })
        .count();
    assert!(with_cas >= 150, "{with_cas}");
}
