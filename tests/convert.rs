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
    // Worked by hand: log10(p/mmHg) = ln(p/kPa)/ln 10 + log10(1000/133.322387415)
    // (1 mmHg = 133.322 387 415 Pa, NIST SP 811 App. B), so A = 14.3145/ln 10 +
    // 0.875097 = 7.091805, B = 2756.22/ln 10 = 1197.0111 and C is unchanged.
    let a_hand = 14.3145 / std::f64::consts::LN_10 + (1000.0f64 / 133.322_387_415).log10();
    let b_hand = 2756.22 / std::f64::consts::LN_10;
    assert!((a_hand - 7.091805).abs() < 5e-7 && (b_hand - 1197.0111).abs() < 5e-5);
    let got = |k: &str| v[k].as_f64().unwrap();
    assert!((got("A") - a_hand).abs() < 1e-9, "A = {}", got("A"));
    assert!((got("B") - b_hand).abs() < 1e-6, "B = {}", got("B"));
    assert!((got("C") - 228.06).abs() < 1e-9);
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
