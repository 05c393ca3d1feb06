//! `ebullio convert` run as a real binary: exact unit changes and refits into other forms.

use crate::support::{ebullio, json};

// Smith, Van Ness & Abbott B.2 acetone (ln kPa degC, -26..77 degC).
#[test]
fn svna_acetone_exact_and_refit() {
    let base = [
        "convert",
        "--antoine",
        "14.3145,2756.22,228.060",
        "--constants",
        "ln,kPa,degC",
    ];
    let mut a = base.to_vec();
    a.extend(["--to", "log10,mmHg,degC"]);
    let v = json(&a);
    assert_eq!(v["exact"], true);
    assert!((v["C"].as_f64().unwrap() - 228.06).abs() < 1e-9);
    let mut r = base.to_vec();
    r.extend(["--model", "riedel", "--range", "-26 degC..77 degC"]);
    let v = json(&r);
    assert_eq!(v["exact"], false);
    assert_eq!(v["parameters"].as_array().unwrap().len(), 4);
    assert!(v["max_rel_dev_pct"].as_f64().unwrap() < 0.5);
    let out = ebullio()
        .args(base)
        .args(["--model", "riedel"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("validity range"));
}
