//! The result of screening: findings per row, the added columns, and a summary.

use super::finding::{CheckCode, Finding, Severity};
use super::row::row_label;
use super::Rows;
use serde::Serialize;
use std::cmp::Reverse;
use std::fmt;

/// Findings for every row of a screened table, in row order.
///
/// Kept compact: every message in one text per part of the table, each row's
/// messages back to back and joined by a space (so a row's diagnosis is one
/// slice of it), and per finding its code and where its message ends. A large
/// table's findings are then a few allocations, not three per flagged row.
/// Rows checked in parallel are kept in the parts their workers made (each
/// `chunk` rows), so nothing is copied to join them.
#[derive(Debug, Clone)]
pub struct ScreenReport {
    /// Rows per part, a power of two (all parts but the last are full):
    /// row `i` is in part `i >> shift`.
    shift: u32,
    parts: Vec<Part>,
    n: usize,
}

/// Rows of a [`ScreenReport`] in one text.
#[derive(Debug, Clone, Default)]
struct Part {
    /// Per row: the end of its findings in `items`.
    ends: Vec<usize>,
    items: Vec<Item>,
    text: String,
    lines: Vec<usize>,
}

/// One finding of a [`ScreenReport`]: its message is `text[start..end]`.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Item {
    code: crate::finding::Code,
    severity: Severity,
    start: usize,
    end: usize,
}

impl Part {
    fn push_row(&mut self, findings: &mut Vec<Finding>, line: usize) {
        for (k, f) in findings.drain(..).enumerate() {
            if k > 0 {
                self.text.push(' ');
            }
            let start = self.text.len();
            self.text.push_str(&f.message);
            self.items.push(Item {
                code: f.code,
                severity: f.severity,
                start,
                end: self.text.len(),
            });
            super::number_text::recycle(f.message);
        }
        self.ends.push(self.items.len());
        self.lines.push(line);
    }

    fn items(&self, i: usize) -> &[Item] {
        let Some(&end) = self.ends.get(i) else {
            return &[];
        };
        let start = if i == 0 { 0 } else { self.ends[i - 1] };
        &self.items[start..end]
    }

    fn diagnosis(&self, i: usize) -> &str {
        match self.items(i) {
            [] => "",
            [one] => &self.text[one.start..one.end],
            [first, .., last] => &self.text[first.start..last.end],
        }
    }
}

impl Default for ScreenReport {
    fn default() -> Self {
        ScreenReport {
            shift: usize::BITS - 1,
            parts: Vec::new(),
            n: 0,
        }
    }
}

/// Equal when every row has the same line and findings (however the rows are kept).
impl PartialEq for ScreenReport {
    fn eq(&self, other: &Self) -> bool {
        self.n == other.n
            && (0..self.n).all(|i| {
                let (a, b) = (self.items(i), other.items(i));
                self.line(i) == other.line(i)
                    && self.diagnosis_str(i) == other.diagnosis_str(i)
                    && a.len() == b.len()
                    && a.iter().zip(b).all(|(x, y)| {
                        x.code == y.code
                            && x.severity == y.severity
                            && x.end - x.start == y.end - y.start
                    })
            })
    }
}

impl ScreenReport {
    /// Build from findings per row and the rows' line numbers (the findings'
    /// subjects are not kept: each is about its row).
    pub fn new(findings: Vec<Vec<Finding>>, lines: Vec<usize>) -> Self {
        let mut r = ScreenReport::default();
        for (i, mut f) in findings.into_iter().enumerate() {
            r.push_row(&mut f, lines.get(i).copied().unwrap_or(0));
        }
        r
    }

    /// An empty report with room for `rows` rows and `text` bytes of messages.
    pub(crate) fn with_capacity(rows: usize, text: usize) -> Self {
        ScreenReport {
            shift: usize::BITS - 1,
            parts: vec![Part {
                ends: Vec::with_capacity(rows),
                items: Vec::with_capacity(rows),
                text: String::with_capacity(text),
                lines: Vec::with_capacity(rows),
            }],
            n: 0,
        }
    }

    /// Add one row after the others (its findings are taken out of
    /// `findings`, which is left empty for the next row). Only for a report
    /// built row by row, not one joined from parts.
    pub fn push_row(&mut self, findings: &mut Vec<Finding>, line: usize) {
        if self.parts.is_empty() {
            self.parts.push(Part::default());
        }
        if let Some(p) = self.parts.last_mut() {
            p.push_row(findings, line);
        }
        self.n += 1;
    }

    /// One report of `parts` in order, each of `chunk` rows (a power of
    /// two) but the last, each built row by row.
    pub(crate) fn joined(parts: Vec<ScreenReport>, chunk: usize) -> Self {
        debug_assert!(chunk.is_power_of_two());
        let mut r = ScreenReport {
            shift: chunk.trailing_zeros(),
            parts: Vec::with_capacity(parts.len()),
            n: 0,
        };
        for p in parts {
            debug_assert!(p.parts.len() <= 1 && r.n % chunk == 0);
            r.n += p.n;
            r.parts.extend(p.parts);
        }
        r
    }

    fn at(&self, i: usize) -> Option<(&Part, usize)> {
        if i >= self.n {
            return None;
        }
        let part = self.parts.get(i >> self.shift)?;
        Some((part, i & ((1 << self.shift) - 1)))
    }

    fn items(&self, i: usize) -> &[Item] {
        self.at(i).map_or(&[], |(p, k)| p.items(k))
    }

    /// Number of rows.
    pub fn len(&self) -> usize {
        self.n
    }

    /// Whether the table had no rows.
    pub fn is_empty(&self) -> bool {
        self.n == 0
    }

    /// Line in the input of row `i` (0 when unknown).
    pub fn line(&self, i: usize) -> usize {
        self.at(i)
            .and_then(|(p, k)| p.lines.get(k).copied())
            .unwrap_or(0)
    }

    /// Findings of row `i`.
    pub fn findings(&self, i: usize) -> Vec<Finding> {
        let Some((p, k)) = self.at(i) else {
            return Vec::new();
        };
        p.items(k)
            .iter()
            .map(|x| Finding {
                code: x.code,
                severity: x.severity,
                message: p.text[x.start..x.end].to_string(),
                subject: crate::finding::Subject::Whole,
            })
            .collect()
    }

    /// Number of findings of row `i`.
    pub fn n_findings(&self, i: usize) -> usize {
        self.items(i).len()
    }

    /// The `flags` column: codes of row `i`, `;`-separated (empty when clean).
    pub fn flags(&self, i: usize) -> String {
        let mut s = String::new();
        self.write_flags(i, &mut s);
        s
    }

    /// [`ScreenReport::flags`] of row `i` appended to `s` (no allocation of its own).
    pub fn write_flags(&self, i: usize, s: &mut String) {
        for (k, x) in self.items(i).iter().enumerate() {
            if k > 0 {
                s.push(';');
            }
            s.push_str(x.code.as_str());
        }
    }

    /// [`ScreenReport::diagnosis`] of row `i`, borrowed.
    pub fn diagnosis_str(&self, i: usize) -> &str {
        self.at(i).map_or("", |(p, k)| p.diagnosis(k))
    }

    /// [`ScreenReport::diagnosis`] of row `i` appended to `s`.
    pub fn write_diagnosis(&self, i: usize, s: &mut String) {
        s.push_str(self.diagnosis_str(i));
    }

    /// The worst severity of row `i`, if it has findings.
    pub fn severity(&self, i: usize) -> Option<Severity> {
        self.items(i).iter().map(|f| f.severity).max()
    }

    /// The `diagnosis` column: the messages of row `i`, space-separated.
    pub fn diagnosis(&self, i: usize) -> String {
        self.diagnosis_str(i).to_string()
    }

    /// The three added columns, `flags`, `severity` and `diagnosis`, one
    /// entry per row (empty for a clean row), built in parallel.
    pub fn columns(&self) -> [Vec<String>; 3] {
        use rayon::prelude::*;
        let n = self.len();
        let flags = (0..n).into_par_iter().map(|i| self.flags(i)).collect();
        let severity = (0..n)
            .into_par_iter()
            .map(|i| {
                self.severity(i)
                    .map(|s| s.as_str().to_string())
                    .unwrap_or_default()
            })
            .collect();
        let diagnosis = (0..n).into_par_iter().map(|i| self.diagnosis(i)).collect();
        [flags, severity, diagnosis]
    }

    /// The worst severity in the whole table.
    pub fn worst(&self) -> Option<Severity> {
        (0..self.len()).filter_map(|i| self.severity(i)).max()
    }

    /// How many rows carry each code, in code order, only codes that occur.
    pub fn counts(&self) -> Vec<(CheckCode, usize)> {
        let mut n = vec![0usize; CheckCode::ALL.len()];
        for x in self.parts.iter().flat_map(|p| &p.items) {
            if let Some(k) = check_index(x.code) {
                n[k] += 1;
            }
        }
        CheckCode::ALL
            .iter()
            .zip(n)
            .filter(|(_, k)| *k > 0)
            .map(|(c, k)| (*c, k))
            .collect()
    }

    /// A summary: counts per finding and the `n_worst` worst rows (most
    /// severe first, then most findings, then file order).
    pub fn summary(&self, rows: &dyn Rows, n_worst: usize) -> Summary {
        let mut b = SummaryBuilder::new(n_worst);
        b.add(self, rows, 0);
        b.finish()
    }
}

/// Where a check finding's code stands in [`CheckCode::ALL`] (declaration order).
fn check_index(code: crate::finding::Code) -> Option<usize> {
    match code {
        crate::finding::Code::Check(c) => Some(c as usize),
        _ => None,
    }
}

/// A [`Summary`] built batch by batch (a table screened in batches), the
/// same as [`ScreenReport::summary`] on the whole table.
#[derive(Debug, Clone)]
pub struct SummaryBuilder {
    n_worst: usize,
    rows: usize,
    by_severity: [usize; 3],
    counts: Vec<usize>,
    /// (severity, findings, row in the table, the row): the worst so far, in order.
    worst: Vec<(Severity, usize, usize, WorstRow)>,
}

impl SummaryBuilder {
    /// Nothing seen yet; `n_worst` rows will be listed.
    pub fn new(n_worst: usize) -> Self {
        SummaryBuilder {
            n_worst,
            rows: 0,
            by_severity: [0; 3],
            counts: vec![0; CheckCode::ALL.len()],
            worst: Vec::new(),
        }
    }

    /// Add one batch: `report` of `rows`, whose first row is row `first_row` of the table.
    pub fn add(&mut self, report: &ScreenReport, rows: &dyn Rows, first_row: usize) {
        self.rows += report.len();
        for i in 0..report.len() {
            let f = report.items(i);
            let Some(sev) = f.iter().map(|x| x.severity).max() else {
                continue;
            };
            self.by_severity[sev as usize] += 1;
            for x in f {
                if let Some(k) = check_index(x.code) {
                    self.counts[k] += 1;
                }
            }
            // most severe first, then most findings, then file order
            let rank = |s: Severity, n: usize, at: usize| (Reverse(s), Reverse(n), at);
            let me = rank(sev, f.len(), first_row + i);
            if self.worst.len() == self.n_worst
                && self.worst.last().is_none_or(|w| rank(w.0, w.1, w.2) < me)
            {
                continue;
            }
            let at = self.worst.partition_point(|w| rank(w.0, w.1, w.2) < me);
            let row = WorstRow {
                line: report
                    .at(i)
                    .and_then(|(p, k)| p.lines.get(k).copied())
                    .unwrap_or(first_row + i + 2),
                label: row_label(&rows.row(i)),
                severity: sev,
                flags: report.flags(i),
                diagnosis: report.diagnosis(i),
            };
            self.worst.insert(at, (sev, f.len(), first_row + i, row));
            self.worst.truncate(self.n_worst);
        }
    }

    /// The summary of every row added.
    pub fn finish(self) -> Summary {
        Summary {
            rows: self.rows,
            rows_flagged: self.by_severity.iter().sum(),
            errors: self.by_severity[Severity::Error as usize],
            warnings: self.by_severity[Severity::Warning as usize],
            infos: self.by_severity[Severity::Info as usize],
            counts: CheckCode::ALL
                .iter()
                .zip(self.counts)
                .filter(|(_, k)| *k > 0)
                .map(|(c, n)| CodeCount {
                    code: c.as_str(),
                    severity: c.severity(),
                    rows: n,
                })
                .collect(),
            worst: self.worst.into_iter().map(|w| w.3).collect(),
        }
    }
}

/// How many rows carry one code.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CodeCount {
    /// The code.
    pub code: &'static str,
    /// Its severity.
    pub severity: Severity,
    /// Rows carrying it.
    pub rows: usize,
}

/// One of the worst rows, for the summary.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WorstRow {
    /// Line in the input.
    pub line: usize,
    /// Compound name and line.
    pub label: String,
    /// Worst severity.
    pub severity: Severity,
    /// Codes.
    pub flags: String,
    /// Messages.
    pub diagnosis: String,
}

/// Summary of a screened table.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Summary {
    /// Rows checked.
    pub rows: usize,
    /// Rows with at least one finding.
    pub rows_flagged: usize,
    /// Rows whose worst finding is an error.
    pub errors: usize,
    /// Rows whose worst finding is a warning.
    pub warnings: usize,
    /// Rows whose worst finding is info.
    pub infos: usize,
    /// Rows per code.
    pub counts: Vec<CodeCount>,
    /// The worst rows.
    pub worst: Vec<WorstRow>,
}

impl fmt::Display for Summary {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "checked {} rows: {} flagged ({} error, {} warning, {} info)",
            self.rows, self.rows_flagged, self.errors, self.warnings, self.infos
        )?;
        if !self.counts.is_empty() {
            writeln!(f, "\nfindings (rows):")?;
            let w = self.counts.iter().map(|c| c.code.len()).max().unwrap_or(0);
            for c in &self.counts {
                writeln!(
                    f,
                    "  {:<w$}  {:<7}  {}",
                    c.code,
                    c.severity.as_str(),
                    c.rows
                )?;
            }
        }
        if !self.worst.is_empty() {
            writeln!(f, "\nworst rows:")?;
            for r in &self.worst {
                writeln!(f, "  {} [{}] {}", r.label, r.severity, r.flags)?;
                writeln!(f, "      {}", r.diagnosis)?;
            }
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // The counts index codes by declaration order: it must be their place in ALL.
    #[test]
    fn check_index_is_the_place_in_all() {
        for (k, c) in CheckCode::ALL.iter().enumerate() {
            assert_eq!(check_index((*c).into()), Some(k), "{c}");
        }
        assert_eq!(check_index(crate::finding::FitCode::ALL[0].into()), None);
    }
}
