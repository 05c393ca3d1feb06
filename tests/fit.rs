//! `ebullio fit` through the real binary: good data, reference comparison, and
//! every bad-input case (exit 2, file and line named, no panic, no output file).

use crate::support::{ebullio, run_in, scratch};

use std::path::Path;

/// Points generated from the published toluene row ln(p/kPa) = 13.9320 −
/// 3056.96/(t/°C + 217.625) (Smith, Van Ness & Abbott, App. B Table B.2).
fn toluene_csv(scale: f64) -> String {
    let mut s = String::from("compound,t/degC,p/kPa\n");
    for i in 0..10 {
        let t = 40.0 + 8.0 * i as f64;
        let p = (13.9320 - 3056.96 / (t + 217.625)).exp() * scale;
        s.push_str(&format!("toluene,{t},{p:.6}\n"));
    }
    s
}

fn codes(json: &serde_json::Value) -> Vec<String> {
    json["flags"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| f["code"].as_str().unwrap().to_string())
        .collect()
}

// Smith, Van Ness & Abbott App. B: a fit of points from the toluene row agrees
// with the bundled reference; the same points 5 % high in p disagree.
#[test]
fn svna_toluene_fit_matches_reference_and_shifted_data_does_not() {
    let dir = scratch();
    std::fs::write(dir.path().join("good.csv"), toluene_csv(1.0)).unwrap();
    std::fs::write(dir.path().join("high.csv"), toluene_csv(1.05)).unwrap();
    let out = run_in(dir.path(), &["fit", "good.csv", "--format", "json"]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let j: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let tb = j["normal_boiling_point_k"]["value"].as_f64().unwrap();
    assert!((tb - 383.75).abs() < 0.3, "{tb}");
    assert!(!codes(&j)
        .iter()
        .any(|c| c.starts_with("reference-") && c.ends_with("disagrees")));
    let out = run_in(dir.path(), &["fit", "high.csv", "--format", "json"]);
    let j: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(
        codes(&j)
            .iter()
            .any(|c| c.starts_with("reference-") && c.ends_with("disagrees")),
        "{:?}",
        codes(&j)
    );
}

#[test]
fn csv_output_and_refusal_to_overwrite_input() {
    let dir = scratch();
    std::fs::write(dir.path().join("d.csv"), toluene_csv(1.0)).unwrap();
    let out = run_in(dir.path(), &["fit", "d.csv", "--output", "fit.csv"]);
    assert!(out.status.success());
    let text = std::fs::read_to_string(dir.path().join("fit.csv")).unwrap();
    assert!(
        text.lines().count() == 2 && text.contains("toluene"),
        "{text}"
    );
    let out = run_in(
        dir.path(),
        &["fit", "d.csv", "--output", "d.csv", "--format", "json"],
    );
    assert_eq!(out.status.code(), Some(2));
    assert_eq!(
        std::fs::read_to_string(dir.path().join("d.csv")).unwrap(),
        toluene_csv(1.0)
    );
}

/// (name, file contents, text the message must contain besides the file name)
const BAD: &[(&str, &[u8], &str)] = &[
    ("empty", b"", "empty"),
    ("header-only", b"T/K,p/kPa\n", "no data rows"),
    ("no-temperature", b"x,p/kPa\n1,2\n", "no temperature column"),
    ("no-pressure", b"T/K,x\n300,2\n", "no pressure column"),
    (
        "two-temperatures",
        b"T/K,t/degC,p/kPa\n300,27,3\n",
        "line 1",
    ),
    ("unknown-unit", b"T/K,p/furlong\n300,2\n", "furlong"),
    ("unknown-t-unit", b"T/kelvins,p/kPa\n300,2\n", "kelvins"),
    ("no-unit", b"T,p/kPa\n300,2\n", "no unit"),
    ("text-cell", b"T/K,p/kPa\n300,2\n310,abc\n", "line 3"),
    ("empty-cell", b"T/K,p/kPa\n300,\n", "line 2"),
    ("nan", b"T/K,p/kPa\n300,NaN\n", "line 2"),
    ("inf", b"T/K,p/kPa\n300,inf\n", "line 2"),
    ("negative-pressure", b"T/K,p/kPa\n300,-2\n", "line 2"),
    ("zero-pressure", b"T/K,p/kPa\n300,0\n", "line 2"),
    ("below-absolute-zero", b"t/degC,p/kPa\n-300,2\n", "line 2"),
    ("negative-kelvin", b"T/K,p/kPa\n-5,2\n", "line 2"),
    (
        "negative-uncertainty",
        b"T/K,p/kPa,u(T)/K\n300,2,-0.1\n",
        "line 2",
    ),
    (
        "negative-u-p",
        b"T/K,p/kPa,u(p)/kPa\n300,2,-0.1\n",
        "line 2",
    ),
    (
        "semicolons",
        b"t/degC;p/kPa\n50,5;12,3\n",
        "--decimal-comma",
    ),
    (
        "decimal-comma-in-csv",
        b"T/K,p/kPa\n300,\"2,5\"\n",
        "line 2",
    ),
    ("ragged", b"T/K,p/kPa\n300,2\n310,3,4\n", "line 3"),
    ("not-utf8", b"t/\xb0C,p/kPa\n50,2\n", "UTF-8"),
    ("utf16", b"\xff\xfeT\x00/\x00K\x00", "UTF-16"),
    (
        "unknown-uncertainty-unit",
        b"T/K,p/kPa,u(p)/bananas\n300,2,1\n",
        "bananas",
    ),
    ("parquet-garbage", b"PAR1garbage", "Parquet"),
];

#[test]
fn every_bad_input_exits_2_naming_file_and_line_with_no_output() {
    let dir = scratch();
    for (name, bytes, needle) in BAD {
        let file = format!("{name}.csv");
        std::fs::write(dir.path().join(&file), bytes).unwrap();
        let out = run_in(dir.path(), &["fit", &file, "--output", "out.json"]);
        let err = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{name}: {err}");
        assert!(err.contains(&file), "{name}: file not named: {err}");
        assert!(
            err.contains(needle),
            "{name}: expected '{needle}' in: {err}"
        );
        assert!(!err.contains("panicked"), "{name}: {err}");
        assert!(!dir.path().join("out.json").exists(), "{name}: output left");
    }
    // a path that does not exist, and a directory
    for (arg, needle) in [("missing.csv", "no such file"), (".", "directory")] {
        let out = run_in(dir.path(), &["fit", arg, "--output", "out.json"]);
        let err = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{arg}: {err}");
        assert!(err.contains(needle), "{arg}: {err}");
        assert!(!dir.path().join("out.json").exists());
    }
}

/// The normal boiling point (K) a `--format json` fit printed.
fn tb_of(out: &std::process::Output) -> f64 {
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let j: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    j["normal_boiling_point_k"]["value"].as_f64().unwrap()
}

// Every accepted input form must read the same numbers as the plain CSV: the fit
// of each gives the plain fit's boiling point (a reader that kept "7,888" as 7, or
// dropped the first row with the byte-order mark, would not).
#[test]
fn bom_stdin_decimal_comma_and_duplicate_rows_read_the_same_numbers_as_plain_csv() {
    let dir = scratch();
    std::fs::write(dir.path().join("plain.csv"), toluene_csv(1.0)).unwrap();
    let plain = tb_of(&run_in(
        dir.path(),
        &["fit", "plain.csv", "--format", "json"],
    ));
    let same = |what: &str, tb: f64| {
        assert!(
            (tb - plain).abs() < 1e-9,
            "{what}: Tb {tb} K, plain CSV {plain} K"
        );
    };
    let mut bom = b"\xef\xbb\xbf".to_vec();
    bom.extend_from_slice(toluene_csv(1.0).as_bytes());
    std::fs::write(dir.path().join("bom.csv"), bom).unwrap();
    same(
        "byte-order mark",
        tb_of(&run_in(dir.path(), &["fit", "bom.csv", "--format", "json"])),
    );
    let semi = toluene_csv(1.0).replace(',', ";").replace('.', ",");
    assert!(semi.contains(';') && semi.contains(','), "{semi}");
    std::fs::write(dir.path().join("semi.csv"), semi).unwrap();
    same(
        "decimal comma",
        tb_of(&run_in(
            dir.path(),
            &["fit", "semi.csv", "--decimal-comma", "--format", "json"],
        )),
    );
    let mut dup = toluene_csv(1.0);
    dup.push_str(dup.clone().lines().last().unwrap());
    dup.push('\n');
    std::fs::write(dir.path().join("dup.csv"), dup).unwrap();
    let out = run_in(dir.path(), &["fit", "dup.csv", "--format", "json"]);
    assert!(String::from_utf8_lossy(&out.stderr).contains("repeated-row"));
    // A repeated row is kept (it weighs twice), so only close, not equal.
    assert!((tb_of(&out) - plain).abs() < 0.05);
    let mut child = ebullio()
        .args(["fit", "-", "--format", "json"])
        .stdin(std::process::Stdio::piped())
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    use std::io::Write;
    child
        .stdin
        .take()
        .unwrap()
        .write_all(toluene_csv(1.0).as_bytes())
        .unwrap();
    same("stdin", tb_of(&child.wait_with_output().unwrap()));
}

/// Writes a Parquet file with the given columns (polars, as a user's pipeline would).
#[cfg(feature = "tables")]
fn write_parquet(path: &Path, columns: Vec<polars::prelude::Column>) {
    use polars::prelude::*;
    use polars_io::prelude::*;
    let n = columns[0].len();
    let mut df = DataFrame::new(n, columns).unwrap();
    let mut f = std::fs::File::create(path).unwrap();
    ParquetWriter::new(&mut f).finish(&mut df).unwrap();
}

/// The toluene points of [`toluene_csv`] as numbers, parsed from the same text.
#[cfg(feature = "tables")]
fn toluene_columns() -> (Vec<String>, Vec<f64>, Vec<f64>) {
    let text = toluene_csv(1.0);
    let rows: Vec<Vec<&str>> = text
        .lines()
        .skip(1)
        .map(|l| l.split(',').collect())
        .collect();
    (
        rows.iter().map(|r| r[0].to_string()).collect(),
        rows.iter().map(|r| r[1].parse().unwrap()).collect(),
        rows.iter().map(|r| r[2].parse().unwrap()).collect(),
    )
}

// Smith, Van Ness & Abbott App. B toluene row: the same points as a Parquet file
// (float columns, as polars writes them) give exactly the CSV fit.
#[cfg(feature = "tables")]
#[test]
fn svna_toluene_parquet_gives_the_csv_fit() {
    use polars::prelude::Column;
    let dir = scratch();
    std::fs::write(dir.path().join("d.csv"), toluene_csv(1.0)).unwrap();
    let (names, t, p) = toluene_columns();
    write_parquet(
        &dir.path().join("d.parquet"),
        vec![
            Column::new("compound".into(), names),
            Column::new("t/degC".into(), t),
            Column::new("p/kPa".into(), p),
        ],
    );
    let run = |file: &str| -> serde_json::Value {
        let out = run_in(dir.path(), &["fit", file, "--format", "json"]);
        assert!(
            out.status.success(),
            "{file}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        serde_json::from_slice(&out.stdout).unwrap()
    };
    let (c, q) = (run("d.csv"), run("d.parquet"));
    assert_eq!(q["compound"], "toluene");
    assert_eq!(q["n_points"], 10);
    for key in [
        "si_parameters",
        "parameters",
        "normal_boiling_point_k",
        "covariance_si",
        "points",
        "flags",
    ] {
        assert_eq!(c[key], q[key], "{key} differs between CSV and Parquet");
    }
}

// A Parquet file whose pressure column holds text is refused: exit 2, the file and
// the column named, the type expected, no output written.
#[cfg(feature = "tables")]
#[test]
fn parquet_with_a_text_pressure_column_exits_2_naming_the_column() {
    use polars::prelude::Column;
    let dir = scratch();
    let (_, t, p) = toluene_columns();
    let p_text: Vec<String> = p.iter().map(|v| format!("{v} kPa")).collect();
    write_parquet(
        &dir.path().join("bad.parquet"),
        vec![
            Column::new("t/degC".into(), t),
            Column::new("p/kPa".into(), p_text),
        ],
    );
    let out = run_in(dir.path(), &["fit", "bad.parquet", "--output", "out.json"]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{err}");
    for needle in ["bad.parquet", "p/kPa", "numeric"] {
        assert!(err.contains(needle), "expected '{needle}' in: {err}");
    }
    assert!(!err.contains("panicked"), "{err}");
    assert!(!dir.path().join("out.json").exists());
}
