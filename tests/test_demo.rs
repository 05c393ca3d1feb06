//! `ebullio demo`: runs the real binary in a scratch folder and checks the report is self-contained.

use std::process::Command;

fn bin() -> Command {
    Command::new(env!("CARGO_BIN_EXE_ebullio"))
}

#[test]
fn demo_writes_a_self_contained_report_with_svg_plots() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("demo");
    let o = bin().args(["demo", "--output"]).arg(&out).output().unwrap();
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
    let fits: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("fits.json")).unwrap()).unwrap();
    assert_eq!(fits.as_array().unwrap().len(), 4);
}

#[test]
fn demo_refuses_a_non_empty_folder_without_force() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("keep.txt"), "x").unwrap();
    let o = bin()
        .args(["demo", "--output"])
        .arg(dir.path())
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(dir.path().join("keep.txt").exists());
    let o = bin()
        .args(["demo", "--force", "--output"])
        .arg(dir.path())
        .output()
        .unwrap();
    assert!(o.status.success());
}
