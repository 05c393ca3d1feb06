//! Screening a table batch by batch, with memory bounded by the batch and a few
//! bytes per row rather than by the table.
//!
//! The table-wide checks need every row: `duplicate-disagrees` compares rows
//! that may be far apart and `structure-outlier` scores a residual against
//! the median and MAD of all of them. So the table is read twice. The first
//! pass keeps per row only what those checks need ([`batch_facts`]: the
//! boiling point compared, the residual against the structure estimate, the
//! identity keys); the caller sorts the keys (on disk when they are many)
//! and links equal ones into [`Groups`], and [`TableVerdicts::new`] turns
//! the groups and residuals into each group's lowest and highest boiling
//! point and the outlier scale. The second pass runs every row check on each
//! batch and adds the table-wide findings ([`screen_batch`]), so each row gets
//! the findings [`super::screen`] gives it on the whole table.

use super::finding::Finding;
use super::sources::{fast_hash, FastMap, StructureEstimator, StructureOutcome};
use super::{duplicates, outliers, AntoineCell, Rows, ScreenContext, ScreenReport};
use crate::units::ATM_PA;
use crate::vapor::Curve;
use rayon::prelude::*;

/// Structure estimates by SMILES, kept from batch to batch (tables repeat
/// structures) up to a limit of distinct SMILES, then started afresh.
///
/// [`EstimateCache::fill`] also notes which estimate each row of the batch
/// has ([`BatchEstimates`]), so the checks of that batch find a row's
/// estimate by its place, not by hashing its SMILES again.
#[derive(Debug, Default)]
pub struct EstimateCache {
    map: FastMap<Box<str>, u32>,
    entries: Vec<Cached>,
    limit: usize,
}

/// One SMILES's estimate and the hash of its structure key.
#[derive(Debug)]
struct Cached {
    outcome: Option<StructureOutcome>,
    key_hash: u64,
}

/// The rows of one batch with each row's structure estimate, from
/// [`EstimateCache::fill`]: what [`batch_facts`] and [`screen_batch`] check.
pub struct BatchEstimates<'a> {
    rows: &'a dyn Rows,
    cache: &'a EstimateCache,
    /// Per row: its entry in the cache, or [`NO_ENTRY`].
    slots: Vec<u32>,
}

impl<'a> BatchEstimates<'a> {
    /// The estimate of row `i` and the hash of its structure key.
    fn at(&self, i: usize) -> Option<&'a Cached> {
        let cache: &'a EstimateCache = self.cache;
        cache.entries.get(*self.slots.get(i)? as usize)
    }
}

impl super::Estimates for BatchEstimates<'_> {
    fn outcome(&self, i: usize, _smiles: &str) -> Option<&StructureOutcome> {
        self.at(i).and_then(|c| c.outcome.as_ref())
    }
}

const NO_ENTRY: u32 = u32::MAX;

impl EstimateCache {
    /// A cache of at most about `limit` distinct SMILES (at least one batch's).
    pub fn new(limit: usize) -> Self {
        EstimateCache {
            limit,
            ..EstimateCache::default()
        }
    }

    /// Estimate, in parallel, every distinct SMILES of `rows` not yet known;
    /// the rows with each row's estimate, for the checks of this batch.
    pub fn fill<'a>(
        &'a mut self,
        rows: &'a dyn Rows,
        estimator: &dyn StructureEstimator,
    ) -> BatchEstimates<'a> {
        let n = rows.n_rows();
        let mut slots = vec![NO_ENTRY; n];
        let mut missing: Vec<(usize, &str)> = Vec::new();
        for (i, slot) in slots.iter_mut().enumerate() {
            if let Some(s) = rows.smiles(i).map(super::trimmed).filter(|s| !s.is_empty()) {
                match self.map.get(s) {
                    Some(&e) => *slot = e,
                    None => missing.push((i, s)),
                }
            }
        }
        if missing.is_empty() {
            return BatchEstimates {
                rows,
                cache: self,
                slots,
            };
        }
        let mut distinct: FastMap<&str, ()> = FastMap::default();
        for &(_, s) in &missing {
            distinct.insert(s, ());
        }
        if self.map.len() + distinct.len() > self.limit {
            self.map.clear();
            self.entries.clear();
            slots.iter_mut().for_each(|e| *e = NO_ENTRY);
            missing.clear();
            for i in 0..n {
                if let Some(s) = rows.smiles(i).map(super::trimmed).filter(|s| !s.is_empty()) {
                    distinct.insert(s, ());
                    missing.push((i, s));
                }
            }
        }
        let new: Vec<(&str, Option<StructureOutcome>)> = distinct
            .into_keys()
            .collect::<Vec<_>>()
            .into_par_iter()
            .map(|s| (s, estimator.estimate(s)))
            .collect();
        for (s, outcome) in new {
            let key_hash = outcome
                .as_ref()
                .and_then(StructureOutcome::structure_key)
                .map_or(0, |k| fast_hash(k.as_bytes()));
            self.map.insert(s.into(), self.entries.len() as u32);
            self.entries.push(Cached { outcome, key_hash });
        }
        for (i, s) in missing {
            slots[i] = self.map.get(s).copied().unwrap_or(NO_ENTRY);
        }
        BatchEstimates {
            rows,
            cache: self,
            slots,
        }
    }
}

/// What the table-wide checks need of one row.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RowFacts<'a> {
    /// Line in the input.
    pub line: usize,
    /// Boiling point compared between rows (listed, else implied), K; NaN if none.
    pub tb_k: f64,
    /// Boiling point minus the structure estimate, K; NaN if none.
    pub residual: f64,
    /// Valid CAS number.
    pub cas: Option<&'a str>,
    /// Structure key of the SMILES.
    pub structure: Option<&'a str>,
    /// [`fast_hash`] of the structure key (0 when none).
    pub structure_hash: u64,
    /// Compound name.
    pub name: Option<&'a str>,
}

/// The facts of every row of a batch (first pass), in parallel.
pub fn batch_facts<'r>(batch: &BatchEstimates<'r>) -> Vec<RowFacts<'r>> {
    let rows = batch.rows;
    (0..rows.n_rows())
        .into_par_iter()
        .with_min_len(1024)
        .map(|i| {
            let row = rows.row(i);
            let implied = match &row.antoine {
                AntoineCell::Given(k) => k.t_at(ATM_PA),
                _ => None,
            };
            let tb = row.tb_k.or(implied);
            let cached = row
                .smiles
                .map(super::trimmed)
                .filter(|s| !s.is_empty())
                .and_then(|_| batch.at(i));
            let outcome = cached.and_then(|c| c.outcome.as_ref());
            let residual = match (outcome, tb) {
                (Some(StructureOutcome::Estimate { tb_k: est, .. }), Some(t)) => t - est,
                _ => f64::NAN,
            };
            let cas = row
                .cas
                .map(super::trimmed)
                .filter(|c| !c.is_empty() && crate::reference::cas::validate(c).is_ok());
            RowFacts {
                line: row.line,
                tb_k: tb.unwrap_or(f64::NAN),
                residual,
                cas,
                structure: outcome.and_then(StructureOutcome::structure_key),
                structure_hash: cached.map_or(0, |c| c.key_hash),
                name: row.compound,
            }
        })
        .collect()
}

/// Rows linked into groups of the same compound (union–find over row
/// indices, four bytes per row; each group's root is its first row).
#[derive(Debug, Clone, Default)]
pub struct Groups {
    parent: Vec<u32>,
}

impl Groups {
    /// No rows yet.
    pub fn new() -> Self {
        Self::default()
    }

    /// Make room for rows up to `n` (each its own group).
    pub fn grow(&mut self, n: usize) {
        let start = self.parent.len();
        if n > start {
            self.parent.extend((start..n).map(|i| i as u32));
        }
    }

    fn find(&mut self, mut i: u32) -> u32 {
        while self.parent[i as usize] != i {
            let p = self.parent[i as usize];
            self.parent[i as usize] = self.parent[p as usize];
            i = p;
        }
        i
    }

    /// Put rows `a` and `b` in one group.
    pub fn union(&mut self, a: u32, b: u32) {
        let (ra, rb) = (self.find(a), self.find(b));
        if ra != rb {
            self.parent[ra.max(rb) as usize] = ra.min(rb);
        }
    }

    /// The group (its first row) of every row.
    pub fn roots(mut self) -> Vec<u32> {
        for i in 0..self.parent.len() {
            let r = self.find(i as u32);
            self.parent[i] = r;
        }
        self.parent
    }
}

/// Links rows whose keys are equal, fed keys in sorted order (by key, then
/// row): each row is linked to the first row of its key.
#[derive(Debug, Default)]
pub struct SortedLinker {
    key: Vec<u8>,
    first: Option<u32>,
}

impl SortedLinker {
    /// The next key in sorted order and its row.
    pub fn push(&mut self, groups: &mut Groups, key: &[u8], row: u32) {
        match self.first {
            Some(f) if self.key == key => groups.union(f, row),
            _ => {
                self.key.clear();
                self.key.extend_from_slice(key);
                self.first = Some(row);
            }
        }
    }
}

/// Lowest and highest boiling point of one group ((K, line); the first
/// lowest and the last highest in file order, as the whole-table check).
#[derive(Debug, Clone, Copy)]
struct Spread {
    n: u32,
    lo: (f64, usize),
    hi: (f64, usize),
}

/// What the first pass found for the table-wide checks.
#[derive(Debug, Clone)]
pub struct TableVerdicts {
    roots: Vec<u32>,
    spread: FastMap<u32, Spread>,
    scale: Option<(f64, f64)>,
    tol_k: f64,
}

impl TableVerdicts {
    /// From every row's group, the rows' (boiling point, line) in row order,
    /// and the finite residuals (reordered here); `tol_k` as in
    /// [`super::ScreenOptions`].
    pub fn new(
        roots: Vec<u32>,
        facts: impl IntoIterator<Item = (f64, usize)>,
        residuals: &mut [f64],
        tol_k: f64,
    ) -> Self {
        let n = roots.len();
        // groups of more than one row: a bit per row
        let mut multi = vec![0u64; n.div_ceil(64)];
        for (i, &r) in roots.iter().enumerate() {
            if r as usize != i {
                multi[r as usize / 64] |= 1 << (r % 64);
            }
        }
        let mut spread: FastMap<u32, Spread> = FastMap::default();
        for (i, (tb, line)) in facts.into_iter().enumerate().take(n) {
            let r = roots[i];
            if multi[r as usize / 64] & (1 << (r % 64)) == 0 || !tb.is_finite() {
                continue;
            }
            let s = spread.entry(r).or_insert(Spread {
                n: 0,
                lo: (tb, line),
                hi: (tb, line),
            });
            s.n += 1;
            if tb.total_cmp(&s.lo.0).is_lt() {
                s.lo = (tb, line);
            }
            if tb.total_cmp(&s.hi.0).is_ge() {
                s.hi = (tb, line);
            }
        }
        spread.retain(|_, s| s.n > 1);
        TableVerdicts {
            roots,
            spread,
            scale: outliers::robust_scale(residuals),
            tol_k,
        }
    }

    /// Rows in the table.
    pub fn n_rows(&self) -> usize {
        self.roots.len()
    }

    /// The table-wide findings of row `i` (0-based in the table), whose
    /// compared boiling point is `tb_k` and residual `residual` (NaN if none).
    pub fn findings(&self, i: usize, tb_k: f64, residual: f64, out: &mut Vec<Finding>) {
        if tb_k.is_finite() {
            if let Some(s) = self.roots.get(i).and_then(|r| self.spread.get(r)) {
                out.extend(duplicates::disagreement(tb_k, s.lo, s.hi, self.tol_k));
            }
        }
        if let Some((med, mad)) = self.scale {
            out.extend(outliers::outlier(residual, med, mad));
        }
    }
}

/// Every check on one batch of rows whose first row is row `first_row` of
/// the table (second pass): the row checks, then the table-wide findings.
/// Rows are checked in parallel in chunks, each chunk's findings moved into
/// one compact report as they are made, so a finding's message is freed
/// (and its memory reused by the next) at once.
pub fn screen_batch(
    batch: &BatchEstimates<'_>,
    first_row: usize,
    verdicts: &TableVerdicts,
    ctx: &ScreenContext<'_>,
) -> ScreenReport {
    let rows = batch.rows;
    const CHUNK: usize = super::PROGRESS_ROWS;
    let n = rows.n_rows();
    let parts: Vec<ScreenReport> = (0..n.div_ceil(CHUNK))
        .into_par_iter()
        .map(|c| {
            let end = ((c + 1) * CHUNK).min(n);
            // room for a flagged table's usual message text (grows if more)
            let mut part = ScreenReport::with_capacity(end - c * CHUNK, 256 * (end - c * CHUNK));
            let mut f = Vec::new();
            for i in c * CHUNK..end {
                let facts = super::check_row(rows, i, None, batch, ctx, &mut f);
                verdicts.findings(first_row + i, facts.tb_k, facts.residual, &mut f);
                part.push_row(&mut f, facts.line);
            }
            if let Some(p) = ctx.progress {
                p(end - c * CHUNK);
            }
            part
        })
        .collect();
    ScreenReport::joined(parts, CHUNK)
}

#[cfg(test)]
mod tests {
    use super::super::{screen, RowInput, ScreenOptions};
    use super::*;

    /// The whole table screened in batches of `size`, keys linked in memory.
    fn in_batches(rows: &[RowInput<'_>], size: usize, ctx: &ScreenContext<'_>) -> ScreenReport {
        let mut cache = EstimateCache::new(1000);
        let mut groups = Groups::new();
        let mut keys: Vec<(Vec<u8>, u32)> = vec![];
        let mut facts = vec![];
        let mut residuals = vec![];
        for start in (0..rows.len()).step_by(size) {
            let batch: Vec<RowInput<'_>> = rows[start..(start + size).min(rows.len())].to_vec();
            let filled = cache.fill(&batch, ctx.estimator);
            groups.grow(start + batch.len());
            for (k, f) in batch_facts(&filled).iter().enumerate() {
                let row = (start + k) as u32;
                facts.push((f.tb_k, f.line));
                residuals.extend(Some(f.residual).filter(|r| r.is_finite()));
                for (part, key) in [(b'c', f.cas), (b's', f.structure)] {
                    if let Some(key) = key {
                        keys.push(([&[part][..], key.as_bytes()].concat(), row));
                    }
                }
                if let Some(n) = f.name {
                    let key = super::super::sources::name_key(n);
                    keys.push(([&b"n"[..], key.as_bytes()].concat(), row));
                }
            }
        }
        keys.sort();
        let mut linker = SortedLinker::default();
        for (k, r) in &keys {
            linker.push(&mut groups, k, *r);
        }
        let verdicts = TableVerdicts::new(
            groups.roots(),
            facts,
            &mut residuals,
            ctx.options.tolerance_k,
        );
        let mut findings = vec![];
        let mut lines = vec![];
        for start in (0..rows.len()).step_by(size) {
            let batch: Vec<RowInput<'_>> = rows[start..(start + size).min(rows.len())].to_vec();
            let filled = cache.fill(&batch, ctx.estimator);
            let r = screen_batch(&filled, start, &verdicts, ctx);
            for i in 0..r.len() {
                findings.push(r.findings(i));
                lines.push(r.line(i));
            }
        }
        ScreenReport::new(findings, lines)
    }

    struct Fixed;
    impl StructureEstimator for Fixed {
        fn estimate(&self, smiles: &str) -> Option<StructureOutcome> {
            // an invented estimate per structure: 300 K plus 20 K per letter
            Some(StructureOutcome::Estimate {
                tb_k: 300.0 + 20.0 * smiles.len() as f64,
                typical_error_k: 2.0,
                structure_key: Some(smiles.to_ascii_uppercase()),
            })
        }
    }

    // A duplicate split across two batches is still found, with the other
    // row's line; every batch size gives the whole-table findings.
    // Benzene and toluene: Smith, Van Ness & Abbott App. B Table B.2
    // (ln/kPa/°C), tn 353.15 K and 383.75 K.
    #[test]
    fn batches_give_the_whole_table_findings() {
        let conv = "ln,kPa,degC".parse().unwrap();
        let names = [
            "benzene", "toluene", "lot 7", "Benzene ", "x", "y", "z", "w",
        ];
        let mut rows: Vec<RowInput<'_>> = (0..40)
            .map(|i| {
                let r = RowInput::at_line(i + 2).with_compound(names[i % names.len()]);
                if i % 3 == 0 {
                    r.with_antoine(13.7819, 2726.81, 217.572, conv)
                } else {
                    r.with_tb_k(350.0 + (i % 7) as f64 * 0.4)
                }
            })
            .collect();
        let smiles = ["CCO", "cco", "CCCC", "C"];
        for (i, r) in rows.iter_mut().enumerate() {
            r.smiles = Some(smiles[i % smiles.len()]);
        }
        // row 1 and row 38 are the same compound only by CAS
        rows[1].cas = Some("71-43-2");
        rows[1].compound = Some("solo-a");
        rows[1].smiles = None;
        rows[38].cas = Some("71-43-2");
        rows[38].compound = Some("solo-b");
        rows[38].tb_k = Some(383.75);
        rows[38].smiles = None;
        rows[39].tb_k = Some(900.0);
        let est = Fixed;
        let ctx = ScreenContext {
            options: ScreenOptions { tolerance_k: 1.0 },
            estimator: &est,
            ..ScreenContext::default()
        };
        let whole = screen(&rows, None, &ctx);
        let cas_dup = whole.findings(38);
        assert!(
            cas_dup
                .iter()
                .any(|f| f.code == super::super::CheckCode::DuplicateDisagrees
                    && f.message.contains("line 3 ")),
            "{cas_dup:?}"
        );
        assert!(whole.flags(39).contains("structure-outlier"));
        for size in [1, 2, 7, 39, 40, 100] {
            assert_eq!(in_batches(&rows, size, &ctx), whole, "batch size {size}");
        }
    }

    // Batches of more rows than a worker's chunk: the report joined from
    // the chunks reads back every row as the whole-table report does.
    // Benzene, Smith, Van Ness & Abbott App. B Table B.2 (ln/kPa/°C), tn 353.15 K.
    #[test]
    fn chunked_batches_read_back_every_row() {
        let conv = "ln,kPa,degC".parse().unwrap();
        let names: Vec<String> = (0..9000).map(|i| format!("lot {}", i % 700)).collect();
        let smiles = ["CCO", "CCCC", "c1ccccc1", "C(", ""];
        let rows: Vec<RowInput<'_>> = names
            .iter()
            .enumerate()
            .map(|(i, n)| {
                let mut r = RowInput::at_line(i + 2)
                    .with_compound(n)
                    .with_tb_k(340.0 + (i % 29) as f64 * 0.7)
                    .with_antoine(13.7819, 2726.81, 217.572, conv);
                r.smiles = Some(smiles[i % smiles.len()]);
                r
            })
            .collect();
        let est = Fixed;
        let ctx = ScreenContext {
            estimator: &est,
            ..ScreenContext::default()
        };
        let whole = screen(&rows, None, &ctx);
        assert!(whole.n_findings(8999) > 0);
        for size in [9000, 5000] {
            let b = in_batches(&rows, size, &ctx);
            assert_eq!(b, whole, "batch size {size}");
            for i in [0, 4095, 4096, 4097, 8191, 8192, 8999] {
                assert_eq!(b.diagnosis(i), whole.diagnosis(i), "row {i}");
                assert_eq!(b.line(i), i + 2);
            }
        }
    }

    #[test]
    fn groups_link_transitively_to_the_first_row() {
        let mut g = Groups::new();
        g.grow(6);
        g.union(4, 2);
        g.union(5, 4);
        g.union(1, 3);
        assert_eq!(g.roots(), [0, 1, 2, 1, 2, 2]);
    }
}
