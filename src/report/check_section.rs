//! Report sections for a screened property table: counts per finding and the flagged rows with their diagnoses.
//!
//! Shared by `ebullio check --report` and the demo. Formatting only.

use super::html::{FindingRow, Report, Section, Table};
use crate::screen::{Rows, ScreenReport};

/// Flagged rows listed in a report at most (worst first); the checked table holds them all.
pub const MAX_ROWS_SHOWN: usize = 500;

/// The worst rows as report findings (subject: compound and line; code: the
/// row's codes; message: its diagnosis), at most `n`.
pub fn check_findings(rows: &dyn Rows, report: &ScreenReport, n: usize) -> Vec<FindingRow> {
    report
        .summary(rows, n)
        .worst
        .into_iter()
        .map(|w| FindingRow::new(w.severity, w.label, w.flags, w.diagnosis))
        .collect()
}

/// Add the check results to `section`: the row counts, a table of rows per
/// finding code, and the flagged rows (worst first, at most [`MAX_ROWS_SHOWN`])
/// with line, compound, codes and diagnosis.
pub fn add_check(section: &mut Section, table_name: &str, rows: &dyn Rows, report: &ScreenReport) {
    let s = report.summary(rows, MAX_ROWS_SHOWN);
    section.facts([
        ("table", table_name.to_string()),
        ("rows checked", s.rows.to_string()),
        ("rows flagged", s.rows_flagged.to_string()),
        (
            "worst finding per row",
            format!(
                "{} error, {} warning, {} info",
                s.errors, s.warnings, s.infos
            ),
        ),
    ]);
    let mut counts =
        Table::new(["code", "rows", "first diagnosis with this code"]).caption("Rows per finding");
    for c in &s.counts {
        let meaning = (0..report.len())
            .flat_map(|i| report.findings(i))
            .find(|f| f.code.as_str() == c.code)
            .map(|f| f.message.clone())
            .unwrap_or_default();
        counts.flagged_row(
            [c.code.to_string(), c.rows.to_string(), meaning],
            Some(c.severity),
        );
    }
    if counts.is_empty() {
        section.paragraph("No row was flagged.");
    } else {
        section.table(counts);
    }
    if s.worst.is_empty() {
        return;
    }
    let caption = if s.rows_flagged > s.worst.len() {
        format!(
            "Flagged rows, worst first ({} of {} shown; the checked table lists them all)",
            s.worst.len(),
            s.rows_flagged
        )
    } else {
        "Flagged rows, worst first".to_string()
    };
    let mut t = Table::new(["line", "row", "codes", "diagnosis"]).caption(caption);
    for w in &s.worst {
        t.flagged_row(
            [
                w.line.to_string(),
                w.label.clone(),
                w.flags.replace(';', "; "),
                w.diagnosis.clone(),
            ],
            Some(w.severity),
        );
    }
    section.table(t);
}

/// The whole report of `ebullio check`: summary and findings, the flagged
/// rows, the cautions and the command line.
pub fn check_report(
    table_name: &str,
    rows: &dyn Rows,
    report: &ScreenReport,
    command_line: &str,
) -> Report {
    let mut r = Report::new(format!("Property-table check: {table_name}"));
    let s = report.summary(rows, 0);
    r.subtitle(format!(
        "{} rows checked, {} flagged. Findings are screening aids, not measurements: confirm a value before it goes into a plan.",
        s.rows, s.rows_flagged
    ));
    r.command_line(command_line);
    let sum = r.section("Summary and findings");
    sum.findings(check_findings(rows, report, 10));
    let sec = r.section("Check of the table");
    add_check(sec, table_name, rows, report);
    r
}
