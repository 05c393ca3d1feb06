//! `ebullio plan` run as a real binary in a scratch folder.

use crate::support::{ebullio, json, scratch};

// Benzene and toluene, Smith, Van Ness & Abbott, Introduction to Chemical
// Engineering Thermodynamics, App. B Table B.2 (reference-data/antoine-published.csv).
const BZ: &str = "benzene:13.7819,2726.81,217.572";
const TOL: &str = "toluene:13.9320,3056.96,217.625";

/// α of benzene–toluene at 101.325 kPa from SVNA App. B constants lies in
/// the commonly quoted 2.3–2.6 (common practice); the JSON has the DESIGN.md fields.
#[test]
fn benzene_toluene_svna_app_b_json_has_design_fields() {
    let v = json(&[
        "plan",
        "--antoine",
        BZ,
        "--antoine",
        TOL,
        "--constants",
        "ln,kPa,degC",
        "--pressure",
        "101.325 kPa",
    ]);
    for k in [
        "pressure_pa",
        "components",
        "relative_volatility",
        "fenske_min_stages",
        "verdict",
        "pressure_table",
        "rayleigh",
        "limits",
        "cautions",
    ] {
        assert!(v.get(k).is_some(), "missing {k}");
    }
    assert_eq!(v["pressure_pa"], 101_325.0);
    let a = v["relative_volatility"].as_f64().unwrap();
    assert!((2.3..=2.6).contains(&a), "{a}");
    let c = &v["components"][0];
    assert_eq!(c["name"], "benzene");
    assert!((c["tb_k"].as_f64().unwrap() - 353.2).abs() < 0.3);
    assert!(c["source"].as_str().unwrap().contains("Antoine"));
    assert_eq!(v["verdict"]["code"], "column-needed");
    assert!(v["limits"].as_str().unwrap().contains("azeotropes"));
}

/// `--max-pot` round trip through the binary: the set-point is at or below
/// the unrounded pressure, which puts toluene's boiling point at the limit.
#[test]
fn max_pot_round_trip_through_the_binary() {
    let v = json(&[
        "plan",
        "--antoine",
        BZ,
        "--antoine",
        TOL,
        "--constants",
        "ln,kPa,degC",
        "--max-pot",
        "60 degC",
    ]);
    let m = &v["pressure_choice"]["max_pot"];
    assert_eq!(m["heaviest"], "toluene");
    let raw = m["unrounded_pa"].as_f64().unwrap();
    let set = v["pressure_pa"].as_f64().unwrap();
    assert!(set <= raw && set > 0.9 * raw);
    let again = json(&[
        "plan",
        "--antoine",
        BZ,
        "--antoine",
        TOL,
        "--constants",
        "ln,kPa,degC",
        "--pressure",
        &format!("{raw} Pa"),
    ]);
    let t = again["components"][1]["tb_k"].as_f64().unwrap();
    assert!((t - 333.15).abs() < 0.1, "{t}");
    assert!(v["components"][1]["tb_k"].as_f64().unwrap() <= 333.15);
}

#[test]
fn separate_purities_change_the_stage_count() {
    let base = [
        "plan",
        "--antoine",
        BZ,
        "--antoine",
        TOL,
        "--constants",
        "ln,kPa,degC",
    ];
    let a = json(&base)["fenske_min_stages"].as_f64().unwrap();
    let mut looser = base.to_vec();
    looser.extend(["--distillate-purity", "0.95", "--bottoms-purity", "0.9"]);
    let b = json(&looser)["fenske_min_stages"].as_f64().unwrap();
    assert!(b < a, "{b} vs {a}");
}

#[test]
fn table_csv_and_plot_are_written() {
    let dir = scratch();
    let svg = dir.path().join("plan.svg");
    let csv = dir.path().join("plan.csv");
    let out = ebullio()
        .args([
            "plan",
            "--antoine",
            BZ,
            "--antoine",
            TOL,
            "--constants",
            "ln,kPa,degC",
            "--pressure",
            "200 mbar",
        ])
        .args([
            "--plot",
            svg.to_str().unwrap(),
            "--output",
            csv.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let s = std::fs::read_to_string(&svg).unwrap();
    assert!(s.starts_with("<svg") && s.contains("benzene"));
    let c = std::fs::read_to_string(&csv).unwrap();
    assert!(c.lines().next().unwrap().starts_with("p/Pa,T_b(benzene)/K"));
    assert!(c.contains(",true\n"), "operating row marked");
    let t = ebullio()
        .args([
            "plan",
            "--antoine",
            BZ,
            "--antoine",
            TOL,
            "--constants",
            "ln,kPa,degC",
            "--format",
            "table",
        ])
        .output()
        .unwrap();
    let text = String::from_utf8(t.stdout).unwrap();
    for k in [
        "Verdict:",
        "Rule of thumb (common practice",
        "Rayleigh",
        "Limits:",
        "process-safety",
    ] {
        assert!(text.contains(k), "missing {k}");
    }
}

#[test]
fn structure_estimates_carry_their_uncertainty() {
    let v = json(&[
        "plan",
        "--smiles",
        "CCCCCCO hexan-1-ol",
        "--smiles",
        "CCCCCCCCO octan-1-ol",
        "--pressure",
        "20 mbar",
    ]);
    assert_eq!(v["components"][0]["name"], "hexan-1-ol");
    assert!(v["components"][0]["u_tb_k"].as_f64().unwrap() > 0.0);
    assert!(
        v["relative_volatility_detail"]["u_ln_alpha"]
            .as_f64()
            .unwrap()
            > 0.0
    );
}

#[test]
fn bad_input_exits_2_with_a_clear_message() {
    for (args, want) in [
        (
            vec!["plan", "--antoine", BZ, "--constants", "ln,kPa,degC"],
            "at least two components",
        ),
        (
            vec!["plan", "--antoine", BZ, "--antoine", TOL],
            "no convention",
        ),
        (
            vec![
                "plan",
                "--antoine",
                "benzene 13.7,2726,217",
                "--antoine",
                TOL,
                "--constants",
                "ln,kPa,degC",
            ],
            "NAME:A,B,C",
        ),
        (
            vec![
                "plan",
                "--antoine",
                BZ,
                "--antoine",
                TOL,
                "--constants",
                "ln,kPa,degC",
                "--purity",
                "1.2",
            ],
            "purity",
        ),
        (
            vec![
                "plan",
                "--antoine",
                BZ,
                "--antoine",
                TOL,
                "--constants",
                "ln,kPa,degC",
                "--pressure",
                "-3 mbar",
            ],
            "--pressure",
        ),
        (
            vec![
                "plan",
                "--antoine",
                BZ,
                "--from",
                "/nonexistent/fit.json",
                "--constants",
                "ln,kPa,degC",
            ],
            "no such file",
        ),
    ] {
        let out = ebullio().args(&args).output().unwrap();
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains(want), "{args:?}: {err}");
    }
}

#[test]
fn a_non_fit_json_file_is_refused_with_line_and_column() {
    let dir = scratch();
    let f = dir.path().join("fit.json");
    std::fs::write(&f, "{\n  \"compound\": 3\n}\n").unwrap();
    let out = ebullio()
        .args([
            "plan",
            "--antoine",
            BZ,
            "--constants",
            "ln,kPa,degC",
            "--from",
            f.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("line") && err.contains("column"), "{err}");
}

/// `--from`: a fit result JSON (FitReport, as `ebullio fit --format json`
/// writes it) becomes a component whose uncertainty comes from the fit.
/// The points are generated from the SVNA App. B benzene constants with a
/// deterministic ±0.2 % wiggle (invented data, not measurements).
#[test]
fn fit_result_file_is_a_component_with_fit_uncertainty() {
    use ebullio::fit::{fit_points, FitOptions, Point};
    use ebullio::vapor::{AntoineConstants, Curve};
    let conv = "ln,kPa,degC".parse().unwrap();
    let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, conv);
    let pts: Vec<Point> = (0..12)
        .map(|i| {
            let t = 300.0 + 5.0 * i as f64;
            let wiggle = 1.0 + 0.002 * if i % 2 == 0 { 1.0 } else { -1.0 };
            Point {
                t_k: t,
                p_pa: bz.p_pa(t) * wiggle,
                u_t_k: None,
                u_p_pa: None,
            }
        })
        .collect();
    let report = fit_points(Some("benzene".into()), &pts, &FitOptions::default()).unwrap();
    let dir = scratch();
    let f = dir.path().join("fit.json");
    std::fs::write(&f, serde_json::to_string(&report).unwrap()).unwrap();
    let v = json(&[
        "plan",
        "--from",
        f.to_str().unwrap(),
        "--antoine",
        TOL,
        "--constants",
        "ln,kPa,degC",
        "--pressure",
        "500 mbar",
    ]);
    let c = &v["components"][0];
    assert_eq!(c["name"], "benzene");
    assert!(c["u_tb_k"].as_f64().unwrap() > 0.0);
    assert!(c["source"].as_str().unwrap().contains("fit"));
    assert!(
        v["relative_volatility_detail"]["u_ln_alpha"]
            .as_f64()
            .unwrap()
            > 0.0
    );
}

/// Ethanol/water at 1 atm, 99 % distillate: UNIFAC (the default, both
/// structures are in the reference tables) predicts the minimum-boiling
/// azeotrope near x = 0.89 at about 78 °C (azeotrope compilations give about
/// 0.89 at 78.2 °C; from memory), so the plan refuses the target, names the
/// azeotrope, gives no stage count and lists ways round it.
#[test]
fn ethanol_water_99_percent_is_refused_beyond_the_azeotrope() {
    let v = json(&[
        "plan",
        "--compound",
        "ethanol",
        "--compound",
        "water",
        "--pressure",
        "1 atm",
        "--distillate-purity",
        "0.99",
    ]);
    assert_eq!(v["activity_model"], "unifac");
    assert_eq!(v["verdict"]["code"], "beyond-azeotrope");
    assert!(v["verdict"]["min_theoretical_stages"].is_null());
    assert!(v["fenske_min_stages"].is_null());
    assert!(v["column"].is_null());
    let az = &v["azeotropes"][0];
    assert_eq!(az["kind"], "minimum-boiling");
    let x = az["x1"].as_f64().unwrap();
    let t = az["t_k"].as_f64().unwrap();
    assert!(
        (x - 0.89).abs() < 0.05 && (t - 351.3).abs() < 3.0,
        "{x} {t}"
    );
    let msg = v["verdict"]["message"].as_str().unwrap();
    assert!(msg.contains(&format!("{x:.3}")), "{msg}");
    let hints = v["verdict"]["hints"].as_array().unwrap();
    assert!(hints
        .iter()
        .any(|h| h.as_str().unwrap().contains("entrainer")));
    assert!(v["cautions"].as_array().unwrap().iter().any(|c| c
        .as_str()
        .unwrap()
        .contains("confirmed with measured mixture data")));
    assert_eq!(v["liquid_split"]["predicted"], false);
}

/// Benzene/toluene (no azeotrope): the McCabe–Thiele numbers on the UNIFAC
/// curve, and the FUG short cut since α varies little along the column.
#[test]
fn benzene_toluene_gets_mccabe_thiele_numbers() {
    let v = json(&["plan", "--compound", "benzene", "--compound", "toluene"]);
    assert_eq!(v["verdict"]["code"], "column-needed");
    let c = &v["column"];
    let n_min = c["min_stages"].as_f64().unwrap();
    let n = c["stages"].as_f64().unwrap();
    let r_min = c["min_reflux"].as_f64().unwrap();
    assert!((9.0..12.0).contains(&n_min), "{n_min}");
    assert!(n > 1.5 * n_min && n < 3.0 * n_min, "{n}");
    assert!((c["reflux_ratio"].as_f64().unwrap() - 1.3 * r_min).abs() < 1e-9);
    let f = c["feed_stage"].as_u64().unwrap();
    assert!(f > 1 && f < c["whole_stages"].as_u64().unwrap());
    assert!(c["fug"]["gilliland"]["n"].as_f64().unwrap() > n_min);
    assert!(v["verdict"]["message"]
        .as_str()
        .unwrap()
        .contains("McCabe–Thiele"));
    assert!(v["rayleigh"]["points"][0]["pot_t_k"].as_f64().is_some());
}

/// The HTML of `plan SOURCES --pressure "1 atm" --distillate-purity 0.95 --report`.
fn plan_report_html(sources: &[&str]) -> String {
    let d = scratch();
    let html = d.path().join("plan.html");
    let mut args = vec!["plan"];
    args.extend_from_slice(sources);
    args.extend_from_slice(&[
        "--pressure",
        "1 atm",
        "--distillate-purity",
        "0.95",
        "--report",
    ]);
    args.push(html.to_str().unwrap());
    let o = ebullio().args(&args).output().unwrap();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    std::fs::read_to_string(&html).unwrap()
}

/// `plan --report` draws the column on the equilibrium curve and, with UNIFAC,
/// the key pair's T–x–y diagram, in the palette.
#[test]
fn plan_report_has_the_column_and_the_key_pair_diagram() {
    let text = plan_report_html(&["--compound", "benzene", "--compound", "toluene"]);
    assert_eq!(text.matches("<svg").count(), 3, "three drawings");
    assert!(text.contains("McCabe–Thiele"));
    assert!(text.contains("vapor–liquid equilibrium (unifac"));
    assert!(ebullio::report::palette::foreign_colours(&text).is_empty());
    // The ideal model has no T–x–y study to draw, but still the column.
    let text = plan_report_html(&[
        "--antoine",
        BZ,
        "--antoine",
        TOL,
        "--constants",
        "ln,kPa,degC",
    ]);
    assert_eq!(
        text.matches("<svg").count(),
        2,
        "boiling points and the column"
    );
    assert!(text.contains("McCabe–Thiele"));
}
