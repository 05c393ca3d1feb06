//! `ebullio vle` run as a real binary in a scratch folder, and the ideal case against `plan`.

use crate::support::ebullio;

fn run(args: &[&str]) -> std::process::Output {
    ebullio().args(args).output().unwrap()
}

/// Exit 2, a message containing `want`, and no output file.
fn refused(args: &[&str], want: &str) {
    let dir = tempfile::tempdir().unwrap();
    let out_path = dir.path().join("out.json");
    let plot = dir.path().join("plot.svg");
    let mut all: Vec<&str> = args.to_vec();
    let (o, p) = (out_path.to_str().unwrap(), plot.to_str().unwrap());
    all.extend(["--format", "json", "-o", o, "--plot", p]);
    let out = run(&all);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{args:?}: {err}");
    assert!(err.contains(want), "{args:?}: expected '{want}' in: {err}");
    assert!(!err.contains("panicked"), "{err}");
    assert!(
        !out_path.exists() && !plot.exists(),
        "{args:?} wrote a file"
    );
}

#[test]
fn bad_input_exits_2_with_a_clear_message_and_writes_nothing() {
    // An amide: no original-UNIFAC subgroup handled for its carbonyl.
    refused(
        &[
            "vle",
            "--smiles",
            "CC(N)=O acetamide",
            "--compound",
            "water",
        ],
        "atom C at position 2",
    );
    // Ester (CCOO) with a primary amine (CNH2): no published interaction parameter.
    refused(
        &[
            "vle",
            "--compound",
            "ethyl acetate",
            "--smiles",
            "CCCCCCN hexylamine",
        ],
        "CCOO (11) and CNH2 (14)",
    );
    refused(&["vle", "--compound", "water"], "exactly two components");
    refused(
        &[
            "vle",
            "--compound",
            "ethanol",
            "--compound",
            "water",
            "--x1",
            "1.5",
        ],
        "--x1 '1.5': expected a mole fraction from 0 to 1",
    );
    // 0.0001 Pa: below the water triple point (IF97 starts there) and below the
    // low end of the ethanol curve (its reference equation, Schroeder et al. 2014,
    // starts at the triple point 159.1 K, 0.0007 Pa).
    refused(
        &[
            "vle",
            "--compound",
            "water",
            "--compound",
            "ethanol",
            "--pressure",
            "0.0001 Pa",
        ],
        "Pa is outside the range of both vapor-pressure curves (water has no boiling point",
    );
    refused(
        &[
            "vle",
            "--compound",
            "ethanol",
            "--compound",
            "water",
            "--model",
            "wilson",
        ],
        "--model wilson needs --wilson",
    );
    refused(
        &[
            "vle",
            "--compound",
            "ethanol",
            "--compound",
            "water",
            "--nrtl",
            "1,2",
        ],
        "expected 3 finite numbers",
    );
}

/// Ethanol / water at 1 atm: minimum-boiling azeotrope near x = 0.89, 78.2 °C
/// (azeotrope compilations, from memory; reference-data/azeotropes-dev.csv);
/// the JSON has the contract's fields.
#[test]
fn ethanol_water_json_contract_and_plot() {
    let dir = tempfile::tempdir().unwrap();
    let plot = dir.path().join("ew.svg");
    let out = run(&[
        "vle",
        "--compound",
        "ethanol",
        "--compound",
        "water",
        "--pressure",
        "1 atm",
        "--format",
        "json",
        "--plot",
        plot.to_str().unwrap(),
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(v["pressure_pa"], 101325.0);
    assert!(v.get("temperature_k").is_none());
    assert_eq!(v["activity_model"], "unifac");
    let c = &v["components"][0];
    assert_eq!(c["name"], "ethanol");
    assert_eq!(c["smiles"], "CCO");
    assert!(c["vapor_pressure_source"]
        .as_str()
        .unwrap()
        .starts_with("reference: "));
    let d = v["diagram"].as_array().unwrap();
    assert_eq!(d.len(), 101);
    for k in ["x1", "y1", "t_k", "gamma1", "gamma2"] {
        assert!(d[50][k].is_number(), "{k}");
    }
    let az = &v["azeotropes"][0];
    assert_eq!(az["kind"], "minimum-boiling");
    assert!((az["x1"].as_f64().unwrap() - 0.895).abs() < 0.05);
    assert!((az["t_k"].as_f64().unwrap() - 351.35).abs() < 1.0);
    assert_eq!(v["liquid_split"]["predicted"], false);
    assert!(v["flags"]
        .as_array()
        .unwrap()
        .iter()
        .any(|f| f["code"] == "azeotrope-predicted"));
    let svg = std::fs::read_to_string(&plot).unwrap();
    assert!(svg.starts_with("<svg") && svg.contains("azeotrope (predicted)"));
}

/// At a temperature: p–x–y with p_pa rows; acetone / chloroform is maximum-boiling,
/// so a pressure minimum (azeotrope compilations, from memory).
#[test]
fn isothermal_diagram_and_csv() {
    let out = run(&[
        "vle",
        "--compound",
        "acetone",
        "--compound",
        "chloroform",
        "--temperature",
        "50 degC",
        "--format",
        "json",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(v["temperature_k"], 323.15);
    assert!(v["diagram"][10]["p_pa"].is_number());
    assert_eq!(v["azeotropes"][0]["kind"], "maximum-boiling");
    assert!(v["azeotropes"][0]["p_pa"].is_number());
    let out = run(&[
        "vle",
        "--compound",
        "acetone",
        "--compound",
        "chloroform",
        "--format",
        "csv",
    ]);
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(text.starts_with("x1,y1,t_k,gamma1,gamma2,alpha12,liquids\n"));
    assert_eq!(text.lines().count(), 102);
    assert!(!text.contains("NaN") && !text.contains("inf"));
}

/// Toluene / water: two liquids and a heterogeneous azeotrope at 84.1 °C
/// (azeotrope compilations, from memory), never a single-liquid azeotrope inside the split.
#[test]
fn toluene_water_heterogeneous_and_not_reported_homogeneous_inside_the_split() {
    let out = run(&[
        "vle",
        "--compound",
        "toluene",
        "--compound",
        "water",
        "--format",
        "json",
    ]);
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let az = v["azeotropes"].as_array().unwrap();
    assert_eq!(az.len(), 1);
    assert_eq!(az[0]["kind"], "heterogeneous");
    assert!((az[0]["t_k"].as_f64().unwrap() - 357.25).abs() < 3.0);
    let ls = &v["liquid_split"];
    assert_eq!(ls["predicted"], true);
    assert!(ls["x1_low"].as_f64().unwrap() < 0.01 && ls["x1_high"].as_f64().unwrap() > 0.95);
    assert!(v["flags"]
        .as_array()
        .unwrap()
        .iter()
        .any(|f| f["code"] == "azeotrope-in-two-liquid-region"));
}

/// With γ = 1 the relative volatility is Raoult's exactly, as `plan` computes it.
#[test]
fn ideal_model_equals_the_raoult_plan() {
    use ebullio::mixture::{Binary, Ideal};
    use ebullio::plan::{volatility::alpha_at, Component};
    use ebullio::vapor::{AntoineConstants, AntoineConvention};
    let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
    // Smith, Van Ness & Abbott, App. B Table B.2.
    let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, conv);
    let tol = AntoineConstants::new(13.9320, 3056.96, 217.625, conv);
    let b = Binary {
        names: ["benzene", "toluene"],
        curves: [&bz, &tol],
        model: &Ideal,
    };
    let light = Component::new("benzene", Box::new(bz), "test");
    let heavy = Component::new("toluene", Box::new(tol), "test");
    for x in [0.0, 0.3, 0.7, 1.0] {
        let pt = b.bubble_t(x, 101_325.0).unwrap();
        assert_eq!(pt.alpha(), alpha_at(&light, &heavy, pt.t_k).unwrap());
    }
}

/// A structure the bundled reference knows takes the reference curve (water has
/// no Joback estimate at all), and says so.
#[test]
fn smiles_in_the_reference_use_the_reference_curve() {
    let out = ebullio()
        .args([
            "vle",
            "--smiles",
            "CCO ethanol",
            "--smiles",
            "O water",
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
    let src = v["components"][1]["vapor_pressure_source"]
        .as_str()
        .unwrap();
    assert!(
        src.starts_with("reference, matched by structure to water: IAPWS-IF97"),
        "{src}"
    );
    assert!(!src.contains("http"));
    assert_eq!(v["azeotropes"][0]["kind"], "minimum-boiling");
}
