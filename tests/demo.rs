//! `ebullio demo`: runs the real binary in a scratch folder and checks the report is self-contained.

use crate::support::{ebullio, scratch};

#[test]
fn demo_writes_a_self_contained_report_with_svg_plots() {
    let dir = scratch();
    let out = dir.path().join("demo");
    let o = ebullio()
        .args(["demo", "--output"])
        .arg(&out)
        .output()
        .unwrap();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let stdout = String::from_utf8_lossy(&o.stdout);
    assert!(stdout.contains("20 mbar") && stdout.contains("never distill to dryness"));
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(
        html.matches("<svg").count() >= 3,
        "expected several inline SVG plots"
    );
    let lower = html.to_ascii_lowercase();
    for bad in [
        "src=\"http",
        "href=\"http",
        "src='http",
        "href='http",
        "@import",
        "url(http",
        "<script",
        "<link",
        "<img",
    ] {
        assert!(!lower.contains(bad), "report contains {bad}");
    }
    assert!(html.contains("HV-12 ketone") && html.contains("Cautions"));
    // Still run SR-14 carries a planted y1 bias (reference-data/demo/README.md): both
    // consistency tests must catch it, in the summary and in the report.
    assert!(
        stdout.contains("herington-area FAILS, point-to-point FAILS"),
        "{stdout}"
    );
    assert!(html.contains("Still run SR-14") && html.contains("consistency-failed"));
    // Every colour in the report (CSS and every plot) is one of the palette's.
    let foreign = ebullio::report::palette::foreign_colours(&html);
    assert!(
        foreign.is_empty(),
        "colours outside the palette: {foreign:?}"
    );
    let fits: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("fits.json")).unwrap()).unwrap();
    assert_eq!(fits.as_array().unwrap().len(), 4);
}

#[test]
fn demo_refuses_a_non_empty_folder_without_force() {
    let dir = scratch();
    std::fs::write(dir.path().join("keep.txt"), "x").unwrap();
    let o = ebullio()
        .args(["demo", "--output"])
        .arg(dir.path())
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(dir.path().join("keep.txt").exists());
    let o = ebullio()
        .args(["demo", "--force", "--output"])
        .arg(dir.path())
        .output()
        .unwrap();
    assert!(o.status.success());
}

/// Split one CSV line (quoted fields may hold commas).
fn fields(line: &str) -> Vec<String> {
    let mut out = Vec::new();
    let mut cur = String::new();
    let mut quoted = false;
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '"' if quoted && chars.peek() == Some(&'"') => {
                cur.push('"');
                chars.next();
            }
            '"' => quoted = !quoted,
            ',' if !quoted => out.push(std::mem::take(&mut cur)),
            c => cur.push(c),
        }
    }
    out.push(cur);
    out
}

#[test]
fn demo_writes_estimates_checked_table_and_plan_into_the_report_folder() {
    let dir = scratch();
    let out = dir.path().join("demo");
    let o = ebullio()
        .args(["demo", "--output"])
        .arg(&out)
        .output()
        .unwrap();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let stdout = String::from_utf8_lossy(&o.stdout);
    assert!(
        stdout.contains("Supplier table: 12 rows checked"),
        "{stdout}"
    );
    assert!(
        stdout.contains("Plan: 1-butanol / HV-12 ketone at 20 mbar"),
        "{stdout}"
    );
    assert!(stdout.contains("Ideal solution assumed"), "{stdout}");

    // estimates.csv: the columns of `ebullio estimate --format csv`, one row per new structure.
    let est = std::fs::read_to_string(out.join("estimates.csv")).unwrap();
    let mut lines = est.lines();
    let head = fields(lines.next().unwrap());
    for col in [
        "compound",
        "smiles",
        "tb_k",
        "tb_pi90_low_k",
        "tb_pi90_high_k",
        "tb_joback_k",
        "tc_k",
        "pc_bar",
        "groups",
        "t_k_at_2000_pa",
        "anchored_tb_k",
        "error",
    ] {
        assert!(
            head.iter().any(|h| h == col),
            "estimates.csv lacks {col}: {head:?}"
        );
    }
    let rows: Vec<Vec<String>> = lines.map(fields).collect();
    assert_eq!(
        rows.len(),
        5,
        "five new structures (reference-data/demo/new-structures.csv)"
    );
    let col = |n: &str| head.iter().position(|h| h == n).unwrap();
    let anchored: Vec<&Vec<String>> = rows
        .iter()
        .filter(|r| !r[col("anchored_tb_k")].is_empty())
        .collect();
    assert_eq!(anchored.len(), 1);
    assert_eq!(anchored[0][col("compound")], "HV-36 benzyloxy acetate");
    for r in &rows {
        let tb: f64 = r[col("tb_k")].parse().unwrap();
        let lo: f64 = r[col("tb_pi90_low_k")].parse().unwrap();
        let hi: f64 = r[col("tb_pi90_high_k")].parse().unwrap();
        assert!(lo < tb && tb < hi, "{r:?}");
        assert!(r[col("error")].is_empty());
    }

    // The checked table keeps every input row and column and adds the three check columns.
    let input = include_str!("../reference-data/demo/supplier-properties.csv");
    let input_rows: Vec<&str> = input.lines().filter(|l| !l.starts_with('#')).collect();
    let checked = std::fs::read_to_string(out.join("supplier-properties-checked.csv")).unwrap();
    let checked_rows: Vec<Vec<String>> = checked.lines().map(fields).collect();
    assert_eq!(checked_rows.len(), input_rows.len());
    let in_head = fields(input_rows[0]);
    assert_eq!(checked_rows[0][..in_head.len()], in_head[..]);
    assert_eq!(
        checked_rows[0][in_head.len()..],
        ["flags", "severity", "diagnosis"]
    );
    for (a, b) in input_rows.iter().zip(&checked_rows).skip(1) {
        assert_eq!(fields(a)[..], b[..in_head.len()], "row changed");
    }
    let flags_of = |name: &str| -> Vec<String> {
        checked_rows
            .iter()
            .filter(|r| r[0] == name)
            .map(|r| r[in_head.len()].clone())
            .collect()
    };
    // Planted faults (reference-data/demo/README.md).
    assert!(flags_of("acetone")[0].contains("slip-pressure-unit"));
    assert!(flags_of("cyclohexane")[0].contains("slip-swapped-a-b"));
    assert!(flags_of("methanol")[0].contains("slip-log-base"));
    assert!(flags_of("1-butanol")[0].contains("slip-tb-temperature-unit"));
    assert!(flags_of("dichloromethane")[0].contains("cas-check-digit"));
    assert!(flags_of("acetonitrile")
        .iter()
        .all(|f| f.contains("duplicate-disagrees")));
    assert!(flags_of("toluene")[0].is_empty());

    // The plan: JSON per the contract, and its section in the report.
    let plan: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("plan-result.json")).unwrap())
            .unwrap();
    assert_eq!(plan["pressure_pa"].as_f64(), Some(2000.0));
    // α worked by hand from the fitted constants in fits.json (Raoult's law:
    // α = p_light/p_heavy at each key component's boiling point, geometric mean),
    // not from the library's curves.
    let fits: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("fits.json")).unwrap()).unwrap();
    let p_pa = |name: &str, t_k: f64| -> f64 {
        let f = fits
            .as_array()
            .unwrap()
            .iter()
            .find(|f| f["compound"] == name)
            .unwrap_or_else(|| panic!("no fit for {name}"));
        assert_eq!(f["model"], "antoine");
        assert_eq!(f["convention"], "log10,mmHg,degC");
        let k = |i: usize| f["parameters"][i]["value"].as_f64().unwrap();
        // 1 mmHg = 133.322 387 415 Pa (NIST SP 811 App. B).
        10f64.powf(k(0) - k(1) / (t_k - 273.15 + k(2))) * 133.322_387_415
    };
    let d = &plan["relative_volatility_detail"];
    let (light, heavy) = (d["light"].as_str().unwrap(), d["heavy"].as_str().unwrap());
    let (tl, th) = (
        d["light_tb_k"].as_f64().unwrap(),
        d["heavy_tb_k"].as_f64().unwrap(),
    );
    let near = |a: f64, b: f64| (a - b).abs() <= 1e-6 * b.abs();
    assert!(near(p_pa(light, tl), 2000.0) && near(p_pa(heavy, th), 2000.0));
    let alpha_l = p_pa(light, tl) / p_pa(heavy, tl);
    let alpha_h = p_pa(light, th) / p_pa(heavy, th);
    assert!(near(d["at_light_tb"].as_f64().unwrap(), alpha_l), "{d}");
    assert!(near(d["at_heavy_tb"].as_f64().unwrap(), alpha_h), "{d}");
    let alpha = plan["relative_volatility"].as_f64().unwrap();
    assert!(near(alpha, (alpha_l * alpha_h).sqrt()), "α {alpha}");
    assert!(alpha > 1.0);
    assert!(plan["verdict"]["code"].is_string());
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    for h in [
        "<h2>Summary and findings</h2>",
        "<h2>Fits of the in-house measurements</h2>",
        "<h2>Estimates for the new structures</h2>",
        "<h2>Check of the supplier table</h2>",
        "<h2>Separation plan</h2>",
        "<h2>Cautions</h2>",
    ] {
        assert!(html.contains(h), "report lacks {h}");
    }
    let plan_part = &html[html.find("<h2>Separation plan</h2>").unwrap()..];
    assert!(plan_part.contains("Verdict:") && plan_part.contains("Fenske"));
    assert!(plan_part.contains("<svg"), "plan plot inline");
    assert!(html.contains("Rows per finding") && html.contains("Joback groups"));
    assert!(html.contains("Ideal solution assumed"));
}
