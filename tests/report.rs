//! `--report FILE.html` on fit, estimate and check: runs the real binary on real files and scans the HTML.

use crate::support::{ebullio, ok, repo, scratch};

/// Headings h1–h4 in document order (a plain scan: the builder writes `<hN>text</hN>`).
fn headings(html: &str) -> Vec<String> {
    let mut out = Vec::new();
    let mut rest = html;
    while let Some(i) = rest.find("<h") {
        rest = &rest[i + 2..];
        let Some(level) = rest.chars().next().filter(|c| ('1'..='4').contains(c)) else {
            continue;
        };
        let Some(gt) = rest.find('>') else { break };
        let close = format!("</h{level}>");
        let Some(end) = rest.find(&close) else { break };
        out.push(rest[gt + 1..end].to_string());
        rest = &rest[end..];
    }
    out
}

/// The report must be self-contained (the only URL allowed is the SVG
/// namespace name, an identifier never fetched) and keep to the palette.
fn assert_self_contained(html: &str) {
    let stripped = html.replace("http://www.w3.org/2000/svg", "");
    let lower = stripped.to_ascii_lowercase();
    for bad in [
        "http:",
        "https:",
        "//",
        "src=",
        "<script",
        "<link",
        "<img",
        "<iframe",
        "@import",
        "url(",
        "xlink:href",
        "href=\"h",
        "href='h",
    ] {
        assert!(!lower.contains(bad), "report contains '{bad}'");
    }
    for a in lower.match_indices("href=\"").map(|(i, _)| &lower[i + 6..]) {
        assert!(
            a.starts_with('#'),
            "a link leaves the page: {}",
            &a[..a.len().min(40)]
        );
    }
    // Colours only from ebullio's palette (CSS and every plot).
    let foreign = ebullio::report::palette::foreign_colours(html);
    assert!(
        foreign.is_empty(),
        "colours outside the palette: {foreign:?}"
    );
}

fn inline_svgs(html: &str) -> usize {
    html.matches("<figure>\n<svg").count()
}

fn assert_command_line(html: &str, parts: &[&str]) {
    let footer = html[html.find("<footer>").expect("footer")..]
        .replace("&#39;", "'")
        .replace("&quot;", "\"")
        .replace("&lt;", "<")
        .replace("&gt;", ">")
        .replace("&amp;", "&");
    assert!(footer.contains("Produced by ebullio "), "version missing");
    for p in parts {
        assert!(footer.contains(p), "command line lacks {p}: {footer}");
    }
}

#[test]
fn fit_report_has_plots_constants_boiling_points_reference_and_the_command() {
    let dir = scratch();
    let html_path = dir.path().join("fit report.html");
    let o = ebullio()
        .arg("fit")
        .arg(repo("reference-data/demo/ebulliometer-2026.csv"))
        .args(["--at", "20 mbar", "--format", "json", "--report"])
        .arg(&html_path)
        .output()
        .unwrap();
    ok(&o);
    // stdout still carries the JSON of both fits.
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
    assert_eq!(v.as_array().unwrap().len(), 2);
    let html = std::fs::read_to_string(&html_path).unwrap();
    assert_self_contained(&html);
    // One fit-and-residual plot per compound (two compounds in the file).
    assert_eq!(inline_svgs(&html), 2, "one inline SVG per fitted compound");
    let h = headings(&html);
    let pos = |s: &str| {
        h.iter()
            .position(|x| x == s)
            .unwrap_or_else(|| panic!("no heading {s}: {h:?}"))
    };
    assert!(
        pos("Summary and findings") < pos("Fits"),
        "summary first: {h:?}"
    );
    assert!(pos("Fits") < pos("1-butanol") && pos("1-butanol") < pos("HV-12 ketone"));
    assert!(pos("HV-12 ketone") < pos("Cautions"));
    assert_eq!(h.iter().filter(|x| *x == "Reference comparison").count(), 2);
    for needle in [
        "Constants, convention log10,mmHg,degC",
        "Boiling points at chosen pressures",
        "20 mbar",
        "residuals",
        "outlier-point",
        "never distill to dryness",
        "Estimates are not measurements",
    ] {
        assert!(html.contains(needle), "report lacks {needle}");
    }
    // The flagged HV-12 point (the planted gross outlier) is a flagged row.
    assert!(html.contains("<tr class=\"sev-warning\"><td>warning</td><td>6</td>"));
    // The command line is shell-quoted: the path with a space is in quotes.
    assert_command_line(
        &html,
        &[
            "ebullio",
            " fit ",
            "--at '20 mbar'",
            "'",
            "fit report.html'",
        ],
    );
}

#[test]
fn estimate_report_has_group_breakdown_intervals_and_curves() {
    let dir = scratch();
    let html_path = dir.path().join("est.html");
    let o = ebullio()
        .args([
            "estimate",
            "--smiles",
            "CCOC(C)=O",
            "--smiles",
            "COCCOCCC(C)=O",
            "--at",
            "20 mbar",
            "--format",
            "csv",
            "--report",
        ])
        .arg(&html_path)
        .output()
        .unwrap();
    ok(&o);
    let html = std::fs::read_to_string(&html_path).unwrap();
    assert_self_contained(&html);
    assert_eq!(inline_svgs(&html), 1, "one plot of the estimated curves");
    let h = headings(&html);
    assert_eq!(h[1], "Summary and findings", "{h:?}");
    assert!(h.contains(&"Estimates".to_string()) && h.contains(&"CCOC(C)=O".to_string()));
    for needle in [
        "90 % interval",
        "Joback groups: Tb(Joback) = 198 K",
        "count × ΔTb/K",
        "Boiling points at chosen pressures",
        "Calibration: 10-fold cross-validated",
        "Estimates are not measurements",
    ] {
        assert!(html.contains(needle), "report lacks {needle}");
    }
    // Ethyl acetate: 2 -CH3, 1 -CH2-, 1 ester group (Joback & Reid 1987 group set).
    assert!(
        html.contains("<td>ch3</td><td>-CH3</td><td>2</td>"),
        "ch3 row"
    );
    assert_command_line(&html, &["estimate", "--smiles", "'CCOC(C)=O'", "est.html"]);
}

#[test]
fn check_report_lists_counts_per_finding_and_flagged_rows_with_diagnoses() {
    let dir = scratch();
    // The invented supplier table of the demo, read as shipped (its two `#` provenance
    // lines count in the line numbers); reference-data/demo/README.md lists its planted faults.
    let table = repo("reference-data/demo/supplier-properties.csv");
    let html_path = dir.path().join("check.html");
    let out = dir.path().join("checked.csv");
    let o = ebullio()
        .arg("check")
        .arg(&table)
        .arg("-o")
        .arg(&out)
        .arg("--report")
        .arg(&html_path)
        .output()
        .unwrap();
    ok(&o);
    let html = std::fs::read_to_string(&html_path).unwrap();
    assert_self_contained(&html);
    assert_eq!(inline_svgs(&html), 0);
    let h = headings(&html);
    assert_eq!(
        h[1..],
        ["Summary and findings", "Check of the table", "Cautions"],
        "{h:?}"
    );
    for needle in [
        "Rows per finding",
        "Flagged rows, worst first",
        "slip-pressure-unit",
        "slip-log-base",
        "slip-swapped-a-b",
        "duplicate-disagrees",
        "cas-check-digit",
        "acetone (line 7)",
    ] {
        assert!(html.contains(needle), "report lacks {needle}");
    }
    // Counts per finding: two acetonitrile rows carry duplicate-disagrees.
    assert!(
        html.contains(
            "<tr class=\"sev-warning\"><td>warning</td><td>duplicate-disagrees</td><td>2</td>"
        ),
        "duplicate-disagrees count"
    );
    assert_command_line(
        &html,
        &["check", "supplier-properties.csv", "--report", "check.html"],
    );
    // The checked table keeps every data row (12) under its header.
    assert_eq!(std::fs::read_to_string(&out).unwrap().lines().count(), 13);
}

#[test]
fn report_refuses_to_overwrite_an_input_or_the_output() {
    let dir = scratch();
    let data = dir.path().join("data.csv");
    std::fs::copy(repo("reference-data/demo/ebulliometer-2026.csv"), &data).unwrap();
    let before = std::fs::read(&data).unwrap();
    let o = ebullio()
        .arg("fit")
        .arg(&data)
        .args(["--format", "json", "--report"])
        .arg(&data)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("input"));
    assert_eq!(std::fs::read(&data).unwrap(), before);
    let out = dir.path().join("fit.json");
    let o = ebullio()
        .arg("fit")
        .arg(&data)
        .args(["--format", "json", "-o"])
        .arg(&out)
        .arg("--report")
        .arg(&out)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    let v: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&out).unwrap()).unwrap();
    assert!(
        v.is_array(),
        "the JSON output was kept, not replaced by the report"
    );
}
