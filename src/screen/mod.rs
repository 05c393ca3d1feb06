//! Screening a property table for slips and outliers before it reaches a plan.
//!
//! A property table collects boiling points, Antoine constants, SMILES and
//! critical constants from notebooks, suppliers and the literature. Each row
//! is checked on its own (implied vs listed Tb with a unit-slip diagnosis,
//! validity range, impossible constants, Trouton plausibility, critical
//! constants, CAS check digit, SMILES, structure estimate, reference table),
//! then the table as a whole (the same compound listed twice with different
//! values; robust outlier scores of residuals against the structure estimate).
//! Each check is one file and reports [`Finding`]s with a stable code.
//!
//! The structure estimate and the reference lookup come in through the
//! [`StructureEstimator`] and [`ReferenceLookup`] traits, so the checks never
//! depend on where they come from.
//!
//! ```
//! use ebullio::screen::{screen, CheckCode, RowInput, ScreenContext};
//! // Toluene (Smith, Van Ness & Abbott App. B Table B.2, ln/kPa/°C, tn 383.75 K)
//! // entered with its convention mislabelled as mmHg.
//! let conv = "ln,mmHg,degC".parse().unwrap();
//! let rows = vec![RowInput::at_line(2)
//!     .with_compound("toluene")
//!     .with_tb_k(383.75)
//!     .with_antoine(13.9320, 3056.96, 217.625, conv)];
//! let report = screen(&rows, None, &ScreenContext::default());
//! assert_eq!(report.flags(0), "tb-antoine-mismatch;slip-pressure-unit");
//! assert!(report.diagnosis(0).contains("kPa, not mmHg"));
//! ```

pub mod antoine_tb;
pub mod bundled;
pub mod constants;
pub mod critical;
pub mod duplicates;
#[cfg(test)]
mod false_cause;
mod finding;
pub mod identity;
mod number_text;
pub mod outliers;
pub mod reference;
mod report;
mod row;
pub mod slip;
pub mod sources;
pub mod stream;
pub mod structure;

pub use bundled::BundledReference;
pub use finding::{CheckCode, Finding, Severity};
pub use report::{ScreenReport, Summary, SummaryBuilder, WorstRow};
pub use row::{row_label, trimmed, AntoineCell, RowInput};
pub use sources::{
    Chain, Identity, JobackEstimator, NoReference, NoStructure, ReferenceEntry, ReferenceLookup,
    StructureEstimator, StructureOutcome, TableReference,
};

use crate::units::ATM_PA;
use crate::vapor::Curve;
use rayon::prelude::*;
use sources::FastMap;

/// Tunable limits of the checks.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ScreenOptions {
    /// Tolerance between boiling points that should agree (implied vs listed,
    /// duplicates, reference), K. Default [`antoine_tb::DEFAULT_TOLERANCE_K`].
    pub tolerance_k: f64,
}

impl Default for ScreenOptions {
    fn default() -> Self {
        ScreenOptions {
            tolerance_k: antoine_tb::DEFAULT_TOLERANCE_K,
        }
    }
}

/// What the checks compare against, and their limits.
pub struct ScreenContext<'a> {
    /// Limits.
    pub options: ScreenOptions,
    /// Structure estimates ([`NoStructure`] to skip).
    pub estimator: &'a dyn StructureEstimator,
    /// Reference boiling points ([`NoReference`] to skip).
    pub reference: &'a dyn ReferenceLookup,
    /// Told how many more rows are checked, chunk by chunk (for an
    /// interrupted run to say how far it got).
    pub progress: Option<&'a (dyn Fn(usize) + Sync)>,
}

impl Default for ScreenContext<'_> {
    fn default() -> Self {
        ScreenContext {
            options: ScreenOptions::default(),
            estimator: &NoStructure,
            reference: &NoReference,
            progress: None,
        }
    }
}

/// A table of rows the checks can read by index.
pub trait Rows: Sync {
    /// Number of rows.
    fn n_rows(&self) -> usize;
    /// Row `i` (0-based).
    fn row(&self, i: usize) -> RowInput<'_>;
    /// The SMILES of row `i` alone (tables override this to skip building the row).
    fn smiles(&self, i: usize) -> Option<&str> {
        self.row(i).smiles
    }
}

impl Rows for Vec<RowInput<'_>> {
    fn n_rows(&self) -> usize {
        self.len()
    }
    fn row(&self, i: usize) -> RowInput<'_> {
        self[i].clone()
    }
}

/// Per-row facts the table-level checks need.
struct Facts<'a> {
    line: usize,
    tb_k: f64,
    residual: f64,
    cas: Option<&'a str>,
    structure: Option<&'a str>,
    name: Option<&'a str>,
    name_hash: u64,
}

/// Rows checked by one worker and not yet told to the progress hook.
struct Tally<'a> {
    pending: usize,
    progress: Option<&'a (dyn Fn(usize) + Sync)>,
}

/// Rows per progress report of one worker.
const PROGRESS_ROWS: usize = 4096;

impl Tally<'_> {
    fn step(&mut self) {
        self.pending += 1;
        if self.pending == PROGRESS_ROWS {
            self.flush();
        }
    }
    fn flush(&mut self) {
        if let (Some(p), true) = (self.progress, self.pending > 0) {
            p(self.pending);
        }
        self.pending = 0;
    }
}

impl Drop for Tally<'_> {
    fn drop(&mut self) {
        self.flush();
    }
}

/// Structure outcomes by SMILES (trimmed), as the row checks look them up.
trait Estimates: Sync {
    /// The outcome for row `i`, whose SMILES is `smiles`.
    fn outcome(&self, i: usize, smiles: &str) -> Option<&StructureOutcome>;
}

impl Estimates for FastMap<&str, StructureOutcome> {
    fn outcome(&self, _i: usize, smiles: &str) -> Option<&StructureOutcome> {
        self.get(smiles)
    }
}

/// Estimate every distinct SMILES once, in parallel.
fn estimate_all<'r>(
    rows: &'r dyn Rows,
    estimator: &dyn StructureEstimator,
) -> FastMap<&'r str, StructureOutcome> {
    let mut distinct: FastMap<&'r str, ()> = FastMap::default();
    for i in 0..rows.n_rows() {
        if let Some(s) = rows.smiles(i) {
            let s = trimmed(s);
            if !s.is_empty() {
                distinct.insert(s, ());
            }
        }
    }
    let distinct: Vec<&str> = distinct.into_keys().collect();
    distinct
        .par_iter()
        .filter_map(|s| estimator.estimate(s).map(|o| (*s, o)))
        .collect()
}

/// All row-level checks of row `i`.
fn check_row<'r, E: Estimates + ?Sized>(
    rows: &'r dyn Rows,
    i: usize,
    implied_tb_k: Option<&[f64]>,
    estimates: &'r E,
    ctx: &ScreenContext<'_>,
    out: &mut Vec<Finding>,
) -> Facts<'r> {
    let tol = ctx.options.tolerance_k;
    let row = rows.row(i);
    identity::check_unreadable(&row.unreadable, row.line, out);
    let cas = row.cas.and_then(|c| identity::check_cas(c, out));

    let mut implied = None;
    match &row.antoine {
        AntoineCell::Absent => {}
        AntoineCell::Incomplete => out.push(Finding::new(
            CheckCode::AntoineIncomplete,
            "Only some of the Antoine constants A, B, C are given, so the row's curve cannot be checked.",
        )),
        AntoineCell::NoConvention => {}
        AntoineCell::Given(k) => {
            implied = match implied_tb_k {
                Some(v) => v.get(i).copied().filter(|t| t.is_finite()),
                None => k.t_at(ATM_PA),
            };
            constants::check_constants(k, implied, row.tb_k, out);
            match (implied, row.tb_k) {
                (Some(t), Some(listed)) => {
                    antoine_tb::check_implied_vs_listed(
                        k, t, listed, row.tb_unit, tol, out,
                    );
                    constants::check_range(k, listed, true, out);
                }
                (Some(t), None) => constants::check_range(k, t, false, out),
                _ => {}
            }
        }
    }
    let (tb, listed) = match (row.tb_k, implied) {
        (Some(t), _) => (Some(t), true),
        (None, Some(t)) => (Some(t), false),
        _ => (None, false),
    };
    critical::check_critical(tb, listed, row.tc_k, row.pc_pa, out);

    let mut residual = f64::NAN;
    let mut structure_key = None;
    if let Some(s) = row.smiles.map(trimmed).filter(|s| !s.is_empty()) {
        if let Some(o) = estimates.outcome(i, s) {
            structure_key = o.structure_key();
            if let Some(r) = structure::check_structure(s, o, tb, listed, out) {
                residual = r;
            }
        }
    }
    // The name's key is hashed once per row, for the reference lookup and
    // the duplicate grouping.
    let name_hash = row.compound.map(sources::name_hash).unwrap_or(0);
    let id = Identity {
        name: row.compound,
        cas,
        structure_key,
        name_hash: row.compound.map(|_| name_hash),
    };
    if let Some(t) = tb {
        reference::check_reference(ctx.reference, &id, t, listed, tol, out);
    }
    Facts {
        line: row.line,
        tb_k: tb.unwrap_or(f64::NAN),
        residual,
        cas,
        structure: structure_key,
        name: row.compound,
        name_hash,
    }
}

/// Run every check on every row. `implied_tb_k`, when given, holds the
/// Antoine-implied boiling point per row (NaN where none), computed in bulk
/// (see `table_io::frame`); otherwise it is computed row by row.
pub fn screen(
    rows: &dyn Rows,
    implied_tb_k: Option<&[f64]>,
    ctx: &ScreenContext<'_>,
) -> ScreenReport {
    let n = rows.n_rows();
    let tol = ctx.options.tolerance_k;
    let estimates = estimate_all(rows, ctx.estimator);

    // Straight into the four columns (no per-row intermediate), in
    // parallel; progress is told every PROGRESS_ROWS rows per worker.
    type Cols<'r> = (
        Vec<Vec<Finding>>,
        (Vec<duplicates::DupKey<'r>>, (Vec<f64>, Vec<usize>)),
    );
    let (mut findings, (keys, (residuals, lines))): Cols<'_> = (0..n)
        .into_par_iter()
        .with_min_len(1024)
        .map_init(
            || Tally {
                pending: 0,
                progress: ctx.progress,
            },
            |tally, i| {
                let mut f = Vec::new();
                let facts = check_row(rows, i, implied_tb_k, &estimates, ctx, &mut f);
                tally.step();
                let key = duplicates::DupKey {
                    cas: facts.cas,
                    structure: facts.structure,
                    name: facts.name,
                    name_hash: facts.name_hash,
                    tb_k: facts.tb_k,
                    line: facts.line,
                };
                (f, (key, (facts.residual, facts.line)))
            },
        )
        .unzip();
    for (i, f) in duplicates::check_duplicates(&keys, tol) {
        findings[i].push(f);
    }
    for (i, f) in outliers::check_outliers(&residuals) {
        findings[i].push(f);
    }
    ScreenReport::new(findings, lines)
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::sync::atomic::{AtomicUsize, Ordering};

    // Every row is told to the progress hook exactly once. Benzene, Smith,
    // Van Ness & Abbott App. B Table B.2 (ln/kPa/°C), tn 353.15 K.
    #[test]
    fn progress_counts_every_row_once() {
        let conv = "ln,kPa,degC".parse().unwrap();
        let rows: Vec<RowInput<'_>> = (0..10_000)
            .map(|i| {
                RowInput::at_line(i + 2)
                    .with_compound("benzene")
                    .with_tb_k(353.15)
                    .with_antoine(13.7819, 2726.81, 217.572, conv)
            })
            .collect();
        let done = AtomicUsize::new(0);
        let hook = |k: usize| {
            done.fetch_add(k, Ordering::Relaxed);
        };
        let ctx = ScreenContext {
            progress: Some(&hook),
            ..ScreenContext::default()
        };
        let report = screen(&rows, None, &ctx);
        assert_eq!(done.load(Ordering::Relaxed), rows.len());
        assert_eq!(report.len(), rows.len());
        assert!(report.worst().is_none());
    }
}
