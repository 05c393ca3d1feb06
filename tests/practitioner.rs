//! The practitioner pass (issue 18), end to end through the real binary: units as
//! people write them, gauge pressures, `check` naming only causes the evidence
//! singles out, plausibility of the data as labelled, no NaN or conversion noise.
//! All data are invented (Harrow Vale Fine Chemicals) on published constants.

use crate::support::{ebullio, json, ok, scratch};
use ebullio::units::ATM_PA;
use ebullio::vapor::{AntoineConstants, Curve};
use std::path::Path;

// Toluene, Smith, Van Ness & Abbott, Introduction to Chemical Engineering
// Thermodynamics, App. B Table B.2: ln(p/kPa) = 13.9320 − 3056.96/(t/°C + 217.625).
fn toluene() -> AntoineConstants {
    AntoineConstants::new(13.9320, 3056.96, 217.625, "ln,kPa,degC".parse().unwrap())
}

fn write(dir: &Path, name: &str, text: &str) -> std::path::PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, text).unwrap();
    p
}

/// Toluene points at 40–100 °C, pressures written in `unit` (`per_pa` units per pascal).
fn toluene_csv(t_heading: &str, p_heading: &str, p_of_pa: impl Fn(f64) -> f64) -> String {
    let mut s = format!("compound,{t_heading},{p_heading}\n");
    for t in [40.0, 50.0, 60.0, 70.0, 80.0, 90.0, 100.0] {
        let p = toluene().p_pa(t + 273.15);
        s += &format!("toluene,{t},{:.4}\n", p_of_pa(p));
    }
    s
}

fn stderr(o: &std::process::Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

#[test]
fn units_as_people_write_them_in_headings_and_options() {
    let dir = scratch();
    // ºC is the ordinal sign (U+00BA) spreadsheets produce; mbar(a) an absolute marker.
    let f = write(
        dir.path(),
        "runs.csv",
        &toluene_csv("t/ºC", "p/mbar(a)", |p| p / 100.0),
    );
    let v = json(&["fit", f.to_str().unwrap()]);
    let tb = v["normal_boiling_point_k"]["value"].as_f64().unwrap();
    assert!((tb - 383.75).abs() < 0.5, "Tb {tb}");
    // Case variants and spaced forms on the command line.
    for p in [
        "760 TORR",
        "1013.25 MBAR",
        "101.325 Kpa",
        "760 mm Hg",
        "760 mmHg abs",
        "1.01325 bara",
    ] {
        let v = json(&["boil", "--compound", "toluene", "--pressure", p]);
        let t = v["results"][0]["t_k"].as_f64().unwrap();
        assert!((t - 383.75).abs() < 1.0, "{p}: {t}");
    }
}

#[test]
fn gauge_pressures_need_the_barometric_pressure() {
    let dir = scratch();
    // Gauge readings: absolute minus the site's 1013 mbar, in barg.
    let f = write(
        dir.path(),
        "gauge.csv",
        &toluene_csv("t/degC", "p/barg", |p| (p - 101_300.0) / 1e5),
    );
    let o = ebullio()
        .args(["fit", f.to_str().unwrap()])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    let e = stderr(&o);
    assert!(e.contains("gauge") && e.contains("--barometric"), "{e}");
    assert!(!e.contains("unknown"), "{e}");
    let v = json(&["fit", f.to_str().unwrap(), "--barometric", "1013 mbar"]);
    let tb = v["normal_boiling_point_k"]["value"].as_f64().unwrap();
    assert!((tb - 383.75).abs() < 0.5, "Tb {tb}");
    let p0 = v["points"][0]["p_pa"].as_f64().unwrap();
    // Written to 0.0001 bar: within 5 Pa.
    assert!((p0 - toluene().p_pa(313.15)).abs() < 6.0, "{p0}");
    // On the command line too.
    let o = ebullio()
        .args(["boil", "--compound", "toluene", "--pressure", "0.5 barg"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("--barometric"), "{}", stderr(&o));
    let v = json(&[
        "boil",
        "--compound",
        "water",
        "--pressure",
        "0 barg",
        "--barometric",
        "1013.25 mbar",
    ]);
    let t = v["results"][0]["t_k"].as_f64().unwrap();
    // IAPWS-IF97: water boils at 373.12 K at 101.325 kPa.
    assert!((t - 373.124).abs() < 0.01, "{t}");
}

/// xorshift64*, seeded: the same rows on every run.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        (self.0.wrapping_mul(0x2545_f491_4f6c_dd1d) >> 11) as f64 / (1u64 << 53) as f64
    }
    fn normal(&mut self) -> f64 {
        let (u1, u2) = (self.next().max(1e-300), self.next());
        (-2.0 * u1.ln()).sqrt() * (2.0 * std::f64::consts::PI * u2).cos()
    }
}

#[test]
fn check_names_no_false_cause_on_clean_rows_and_still_names_planted_slips() {
    // Clean rows in the manner of bench/gen_check_table.py (published constants,
    // listed Tb = implied Tb + noise), with the noise widened to a normal 1 K.
    let rows = ebullio::reference::table::parse(
        ebullio::reference::ANTOINE_CSV,
        "antoine-published.csv",
        false,
    )
    .unwrap();
    let mut rng = Rng(20261205);
    let mut text = String::from("compound,Tb/K,A,B,C,convention,planted\n");
    let mut n = 0;
    while n < 600 {
        let r = &rows.antoine[(rng.next() * rows.antoine.len() as f64) as usize];
        let k = r.constants;
        let Some(tb) = k.t_at(ATM_PA) else { continue };
        let listed = ((tb + rng.normal()) * 100.0).round() / 100.0;
        text += &format!(
            "\"HV-{n:04} {}\",{listed},{},{},{},\"{}\",\n",
            r.compound, k.a, k.b, k.c, k.convention
        );
        n += 1;
    }
    // Planted: B 3056.96 typed 3506.96 (transposed digits); bar constants
    // labelled mmHg (bar and atm both fit); and a row simply 1.5 K off.
    text += "HV-P1 toluene,383.75,13.9320,3506.96,217.625,\"ln,kPa,degC\",slip-digit\n";
    text += &format!(
        "HV-P2 toluene,383.75,{},3056.96,217.625,\"ln,mmHg,degC\",slip-pressure-unit\n",
        13.9320 - 100f64.ln()
    );
    text += "HV-P3 toluene,385.25,13.9320,3056.96,217.625,\"ln,kPa,degC\",\n";
    let dir = scratch();
    let input = write(dir.path(), "sheet.csv", &text);
    let out = dir.path().join("checked.csv");
    let o = ebullio()
        .args([
            "check",
            input.to_str().unwrap(),
            "-o",
            out.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    assert!(o.status.code().is_some_and(|c| c <= 1), "{}", stderr(&o));
    let mut rd = csv::Reader::from_path(&out).unwrap();
    let h = rd.headers().unwrap().clone();
    let col = |n: &str| h.iter().position(|x| x == n).unwrap();
    let (fl, dg, pl) = (col("flags"), col("diagnosis"), col("planted"));
    let recs: Vec<csv::StringRecord> = rd.records().map(|r| r.unwrap()).collect();
    let clean = &recs[..600];
    let false_causes = clean.iter().filter(|r| r[fl].contains("slip-")).count();
    let mismatched = clean
        .iter()
        .filter(|r| r[fl].contains("tb-antoine-mismatch"))
        .count();
    eprintln!("false causes: {false_causes} of 600 clean rows ({mismatched} mismatched)");
    assert!(mismatched > 100, "the noise should make many rows mismatch");
    assert!(
        false_causes * 100 <= 600,
        "{false_causes} false causes in 600 rows"
    );
    let p1 = &recs[600];
    assert!(p1[fl].contains(&p1[pl]), "{:?}", p1);
    assert!(
        p1[dg].contains("B = 3056.96 instead of 3506.96"),
        "{}",
        &p1[dg]
    );
    let p2 = &recs[601];
    assert!(p2[fl].contains("slip-pressure-unit"), "{:?}", p2);
    assert!(p2[dg].contains("bar or atm"), "{}", &p2[dg]);
    let p3 = &recs[602];
    assert_eq!(&p3[fl], "tb-antoine-mismatch", "{:?}", p3);
    assert!(p3[dg].contains("disagrees by 1.5 K"), "{}", &p3[dg]);
}

#[test]
fn swapped_columns_and_mislabelled_units_are_named_with_evidence() {
    let dir = scratch();
    // Water near 100 °C (IAPWS-IF97 saturation pressures, rounded) typed into
    // the wrong columns: the kPa values under t/°C, the °C values under p/kPa.
    let f = write(
        dir.path(),
        "swapped.csv",
        "t/degC,p/kPa\n47.4,80\n70.2,90\n101.4,100\n143.4,110\n198.7,120\n",
    );
    let v = json(&["fit", f.to_str().unwrap()]);
    let flags = v["flags"].to_string();
    assert!(flags.contains("columns-swapped"), "{flags}");
    assert!(flags.contains("Columns swapped?"), "{flags}");
    // mmHg numbers under a kPa heading, for toluene (compared with the reference).
    let f = write(
        dir.path(),
        "mmhg.csv",
        &toluene_csv("t/degC", "p/kPa", |p| p / 133.322_387_415),
    );
    let v = json(&["fit", f.to_str().unwrap()]);
    let flags = v["flags"].to_string();
    assert!(
        flags.contains("pressure-unit-mislabelled")
            && flags.contains("look like mmHg under a kPa heading"),
        "{flags}"
    );
    // As labelled, correct data raise neither.
    let f = write(dir.path(), "ok.csv", &toluene_csv("t/degC", "p/Pa", |p| p));
    let v = json(&["fit", f.to_str().unwrap()]);
    let flags = v["flags"].to_string();
    assert!(
        !flags.contains("columns-swapped") && !flags.contains("mislabelled"),
        "{flags}"
    );
}

#[test]
fn fitted_tb_against_the_structure_interval_is_printed_and_flagged() {
    let dir = scratch();
    // Toluene points scaled by 3 in p: Tb moves about 25 K below 383.75 K,
    // outside the structure estimate's 90 % interval for Cc1ccccc1C.
    let text = toluene_csv("t/degC", "p/Pa", |p| p * 3.0).replace("toluene,", "HV-7,");
    let f = write(dir.path(), "shifted.csv", &text);
    let o = ebullio()
        .args([
            "fit",
            f.to_str().unwrap(),
            "--smiles",
            "Cc1ccccc1C",
            "--format",
            "table",
        ])
        .output()
        .unwrap();
    ok(&o);
    let t = String::from_utf8_lossy(&o.stdout);
    assert!(t.contains("structure estimate: Tb"), "{t}");
    assert!(t.contains("OUTSIDE it"), "{t}");
    assert!(t.contains("structure-tb-disagrees"), "{t}");
}

#[test]
fn below_the_triple_point_is_said_in_words_and_never_nan() {
    for fmt in ["json", "csv", "table"] {
        let o = ebullio()
            .args([
                "boil",
                "--compound",
                "water",
                "--pressure",
                "1 Pa",
                "--format",
                fmt,
            ])
            .output()
            .unwrap();
        let text = format!("{}{}", String::from_utf8_lossy(&o.stdout), stderr(&o));
        assert!(
            text.contains("below the triple point (611.657 Pa at 273.16 K)"),
            "{fmt}: {text}"
        );
        assert!(
            !text.contains("NaN") && !text.contains("inf"),
            "{fmt}: {text}"
        );
    }
}

#[test]
fn boil_headings_follow_the_quantity() {
    // Vapor pressure at temperatures: the interval is in mbar, and says so.
    let o = ebullio()
        .args([
            "boil",
            "--compound",
            "toluene",
            "--temperature",
            "80 degC",
            "--format",
            "table",
        ])
        .output()
        .unwrap();
    ok(&o);
    let t = String::from_utf8_lossy(&o.stdout);
    assert!(
        t.contains("t / degC     p / mbar    95 % interval / mbar"),
        "{t}"
    );
    assert!(!t.contains("interval / degC"), "{t}");
    let o = ebullio()
        .args([
            "boil",
            "--compound",
            "toluene",
            "--pressure",
            "20 mbar",
            "--format",
            "table",
        ])
        .output()
        .unwrap();
    let t = String::from_utf8_lossy(&o.stdout);
    assert!(
        t.contains("p / mbar     t / degC    95 % interval / degC"),
        "{t}"
    );
}

#[test]
fn converted_input_values_carry_no_floating_point_noise() {
    let dir = scratch();
    // 80.05 °C is 353.20000000000005 K in plain double arithmetic.
    let f = write(
        dir.path(),
        "runs.csv",
        "t/degC,p/mbar\n60.05,100\n70.05,160\n80.05,250\n90.05,380\n100.05,560\n",
    );
    let o = ebullio()
        .args(["fit", f.to_str().unwrap(), "--format", "json"])
        .output()
        .unwrap();
    ok(&o);
    let text = String::from_utf8_lossy(&o.stdout);
    assert!(
        text.contains("353.2,") || text.contains("353.2\n"),
        "{text}"
    );
    assert!(!text.contains("0000000"), "noise in {text}");
    assert!(!text.contains("9999999"), "noise in {text}");
}
