//! The result of screening: findings per row, the added columns, and a summary.

use super::finding::{CheckCode, Finding, Severity};
use super::row::row_label;
use super::Rows;
use serde::Serialize;
use std::fmt;

/// Findings for every row of a screened table, in row order.
#[derive(Debug, Clone, PartialEq)]
pub struct ScreenReport {
    findings: Vec<Vec<Finding>>,
    lines: Vec<usize>,
}

impl ScreenReport {
    /// Build from findings per row and the rows' line numbers.
    pub fn new(findings: Vec<Vec<Finding>>, lines: Vec<usize>) -> Self {
        ScreenReport { findings, lines }
    }

    /// Number of rows.
    pub fn len(&self) -> usize {
        self.findings.len()
    }

    /// Whether the table had no rows.
    pub fn is_empty(&self) -> bool {
        self.findings.is_empty()
    }

    /// Line in the input of row `i` (0 when unknown).
    pub fn line(&self, i: usize) -> usize {
        self.lines.get(i).copied().unwrap_or(0)
    }

    /// Findings of row `i`.
    pub fn findings(&self, i: usize) -> &[Finding] {
        self.findings.get(i).map(Vec::as_slice).unwrap_or(&[])
    }

    /// The `flags` column: codes of row `i`, `;`-separated (empty when clean).
    pub fn flags(&self, i: usize) -> String {
        let f = self.findings(i);
        let mut s = String::new();
        for (k, x) in f.iter().enumerate() {
            if k > 0 {
                s.push(';');
            }
            s.push_str(x.code.as_str());
        }
        s
    }

    /// The worst severity of row `i`, if it has findings.
    pub fn severity(&self, i: usize) -> Option<Severity> {
        self.findings(i).iter().map(|f| f.severity).max()
    }

    /// The `diagnosis` column: the messages of row `i`, space-separated.
    pub fn diagnosis(&self, i: usize) -> String {
        let f = self.findings(i);
        let mut s = String::new();
        for (k, x) in f.iter().enumerate() {
            if k > 0 {
                s.push(' ');
            }
            s.push_str(&x.message);
        }
        s
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
        for f in &self.findings {
            for x in f {
                if let Some(k) = CheckCode::ALL.iter().position(|c| *c == x.code) {
                    n[k] += 1;
                }
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
        let mut flagged: Vec<usize> = (0..self.len())
            .filter(|&i| !self.findings(i).is_empty())
            .collect();
        let mut by_severity = [0usize; 3];
        for &i in &flagged {
            if let Some(s) = self.severity(i) {
                by_severity[s as usize] += 1;
            }
        }
        flagged.sort_by(|&a, &b| {
            self.severity(b)
                .cmp(&self.severity(a))
                .then(self.findings(b).len().cmp(&self.findings(a).len()))
                .then(a.cmp(&b))
        });
        let worst = flagged
            .iter()
            .take(n_worst)
            .map(|&i| WorstRow {
                line: self.lines.get(i).copied().unwrap_or(i + 2),
                label: row_label(&rows.row(i)),
                severity: self.severity(i).unwrap_or(Severity::Info),
                flags: self.flags(i),
                diagnosis: self.diagnosis(i),
            })
            .collect();
        Summary {
            rows: self.len(),
            rows_flagged: flagged.len(),
            errors: by_severity[Severity::Error as usize],
            warnings: by_severity[Severity::Warning as usize],
            infos: by_severity[Severity::Info as usize],
            counts: self
                .counts()
                .into_iter()
                .map(|(c, n)| CodeCount {
                    code: c.as_str(),
                    severity: c.severity(),
                    rows: n,
                })
                .collect(),
            worst,
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
