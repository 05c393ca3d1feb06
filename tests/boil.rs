//! `ebullio boil` run as a real binary in a scratch folder.

use crate::support::{ebullio, json, scratch};

// IAPWS-IF97 Table 36: Ts(1 MPa) = 453.035632 K, via the bundled water curve.
#[test]
fn iapws_if97_table36_water_at_10_bar() {
    let v = json(&["boil", "--compound", "water", "--pressure", "10 bar"]);
    let t = v["results"][0]["t_k"].as_f64().unwrap();
    assert!((t - 453.035632).abs() < 1e-6, "{t}");
    assert!(v["source"].as_str().unwrap().contains("IAPWS-IF97"));
    assert_eq!(v["cautions"].as_array().unwrap().len(), 0);
}

// Smith, Van Ness & Abbott B.2 benzene constants given directly: Tb 80.0 degC at 1 atm;
// a log-spaced range from 1 mbar is flagged extrapolated below the stated range and
// carries the vacuum cautions.
#[test]
fn svna_benzene_constants_range_and_cautions() {
    let v = json(&[
        "boil",
        "--antoine",
        "13.7819,2726.81,217.572",
        "--constants",
        "ln,kPa,degC",
        "--range",
        "6 degC..104 degC",
        "--pressure-range",
        "1 mbar..1 atm",
        "--steps",
        "5",
    ]);
    let r = v["results"].as_array().unwrap();
    assert_eq!(r.len(), 5);
    assert!((r[4]["t_k"].as_f64().unwrap() - 353.2).abs() < 0.2);
    assert_eq!(r[0]["extrapolated"], true);
    assert_eq!(r[4]["extrapolated"], false);
    let c = v["cautions"].as_array().unwrap();
    assert!(c.iter().any(|s| s.as_str().unwrap().contains("implode")));
    assert!(c.iter().any(|s| s.as_str().unwrap().contains("dryness")));
}

#[test]
fn structure_source_and_vapor_pressure_mode() {
    let v = json(&["boil", "--smiles", "CCOC(C)=O", "--pressure", "100 mbar"]);
    let r = &v["results"][0];
    assert!(r["ci95_high_k"].as_f64().unwrap() > r["ci95_low_k"].as_f64().unwrap());
    let v = json(&[
        "boil",
        "--compound",
        "toluene",
        "--temperature",
        "110.6 degC",
    ]);
    let p = v["results"][0]["p_pa"].as_f64().unwrap();
    assert!((p / 101_325.0 - 1.0).abs() < 0.03, "{p}");
}

#[test]
fn bad_input_is_exit_2_with_a_clear_message() {
    let out = ebullio()
        .args(["boil", "--compound", "toluene", "--pressure", "15"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("unit"));
    let out = ebullio()
        .args(["boil", "--pressure", "1 atm"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    let dir = scratch();
    let bad = dir.path().join("fit.json");
    std::fs::write(&bad, "{}").unwrap();
    let out = ebullio()
        .args([
            "boil",
            "--from",
            bad.to_str().unwrap(),
            "--pressure",
            "1 atm",
        ])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("not a fit result"));
}

/// A multi-compound fit file (`fit --format json` on a table with a compound column):
/// `--compound` picks one; without it, or with a name not in the file, exit 2 naming the
/// compounds there are. The picked fit gives the same boiling point as a file holding it alone.
#[test]
fn from_a_multi_compound_fit_file_picks_by_compound() {
    let dir = scratch();
    let data = dir.path().join("runs.csv");
    let mut text = String::from("compound,T/K,p/kPa\n");
    // Invented points on two smooth curves (test data only).
    for i in 0..8 {
        let t = 320.0 + 8.0 * i as f64;
        let pa = (16.0 - 3800.0 / t).exp();
        let pb = (17.0 - 4600.0 / t).exp();
        text.push_str(&format!("light,{t},{pa:.6}\nheavy,{t},{pb:.6}\n"));
    }
    std::fs::write(&data, text).unwrap();
    let fits = dir.path().join("fits.json");
    let st = ebullio()
        .arg("fit")
        .arg(&data)
        .args(["--format", "json", "--output"])
        .arg(&fits)
        .status()
        .unwrap();
    assert!(st.success());
    let f = fits.to_str().unwrap();
    let v = json(&["boil", "--from", f, "--compound", "Heavy", "-p", "20 kPa"]);
    assert!(v["source"].as_str().unwrap().contains("heavy"), "{v}");
    let t = v["results"][0]["t_k"].as_f64().unwrap();
    // ln p = 17 - 4600/T with p in kPa: T = 4600 / (17 - ln 20).
    assert!((t - 4600.0 / (17.0 - 20f64.ln())).abs() < 0.05, "{t}");
    for extra in [&[][..], &["--compound", "nope"][..]] {
        let out = ebullio()
            .args(["boil", "--from", f, "-p", "20 kPa"])
            .args(extra)
            .output()
            .unwrap();
        assert_eq!(out.status.code(), Some(2));
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains("light, heavy"), "{err}");
    }
}
