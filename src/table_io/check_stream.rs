//! `check` on a table file read in batches: memory bounded by the batch size
//! and a few bytes per row, not by the table.
//!
//! Two passes over the file (see [`crate::screen::stream`]). The first keeps
//! per row four bytes in memory (its group in the union–find), eight more for
//! a residual against a structure estimate, and sixteen on disk (boiling point
//! and line); identity keys (valid CAS, structure key, normalised name) are
//! sorted in runs of bounded size, each run's first row per key written to
//! disk, and the runs merged, so rows of the same compound are linked however
//! far apart they are. The second pass screens each batch and hands it on
//! to be written. Scratch files go to a folder the caller names and are
//! removed as soon as they are read.

use super::error::ReadError;
use super::property_table::{ColumnScan, PropertyReadOptions, PropertyTable};
use super::table_batches::TableBatches;
use crate::screen::sources::{fast_hash, with_name_key, FastMap};
use crate::screen::stream::{
    batch_facts, screen_batch, EstimateCache, Groups, SortedLinker, TableVerdicts,
};
use crate::screen::{ScreenContext, ScreenReport, Summary, SummaryBuilder};
use rayon::prelude::*;
use std::cmp::Reverse;
use std::collections::hash_map::Entry;
use std::collections::BinaryHeap;
use std::io::{BufReader, BufWriter, Read, Write};
use std::path::{Path, PathBuf};

/// Rows per batch when not told otherwise.
pub const DEFAULT_BATCH_ROWS: usize = 65_536;

/// Bytes of identity keys held per key kind, per row of a batch, before a
/// sorted run goes to disk (10 MB per kind at the default batch size).
const KEY_BYTES_PER_BATCH_ROW: usize = 160;

/// Distinct SMILES whose structure estimates are kept, at least.
const MIN_CACHED_STRUCTURES: usize = 100_000;

/// How to screen a table file in batches.
#[derive(Debug, Clone)]
pub struct StreamOptions {
    /// How to read the table.
    pub read: PropertyReadOptions,
    /// Rows read, screened and written at a time.
    pub batch_rows: usize,
    /// Folder for scratch files (must exist; removed by the caller).
    pub scratch: PathBuf,
}

/// Why screening in batches stopped.
#[derive(Debug, thiserror::Error)]
pub enum StreamError {
    /// The table cannot be read.
    #[error(transparent)]
    Read(#[from] ReadError),
    /// A scratch file failed.
    #[error("scratch file in {dir}: {source}")]
    Scratch {
        /// The scratch folder.
        dir: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// The caller's output failed.
    #[error("{0}")]
    Output(String),
}

/// Identity keys of one kind, sorted in runs of bounded size; each run keeps
/// only the first row of each key (the others are linked at once).
///
/// A key already held in the run is linked to its first row as it arrives
/// (found by hash in `seen`), so a table that repeats a few thousand
/// structures a million times sorts a few thousand keys, not a million.
/// Kinds whose keys seldom repeat (names of lots) stop looking after
/// [`SEEN_TRIAL`] keys. Either way the groups are the same: a group's root is
/// its first row whatever order the rows are linked in.
struct KeySorter {
    kind: u8,
    arena: Vec<u8>,
    index: Vec<(u32, u32, u32)>,
    /// Hash of a key → its place in `index` (the first key with that hash).
    seen: Option<FastMap<u64, u32>>,
    added: usize,
    repeats: usize,
    budget: usize,
    runs: Vec<PathBuf>,
    dir: PathBuf,
}

/// Keys after which a sorter whose keys are mostly new stops looking for repeats.
const SEEN_TRIAL: usize = 65_536;

impl KeySorter {
    fn new(kind: u8, budget: usize, dir: &Path) -> Self {
        KeySorter {
            kind,
            arena: Vec::new(),
            index: Vec::new(),
            seen: Some(FastMap::default()),
            added: 0,
            repeats: 0,
            budget,
            runs: Vec::new(),
            dir: dir.to_path_buf(),
        }
    }

    /// Add `key` of `row`; `hash` is its [`fast_hash`] when the caller has it.
    fn add(
        &mut self,
        key: &[u8],
        hash: Option<u64>,
        row: u32,
        groups: &mut Groups,
    ) -> std::io::Result<()> {
        self.added += 1;
        if self.added == SEEN_TRIAL && self.repeats * 4 < self.added {
            self.seen = None;
        }
        if let Some(seen) = &mut self.seen {
            let at = self.index.len() as u32;
            match seen.entry(hash.unwrap_or_else(|| fast_hash(key))) {
                Entry::Occupied(e) => {
                    let first = self.index[*e.get() as usize];
                    if key_of(&self.arena, &first) == key {
                        self.repeats += 1;
                        groups.union(first.2, row);
                        return Ok(());
                    }
                }
                Entry::Vacant(e) => {
                    e.insert(at);
                }
            }
        }
        let start = self.arena.len();
        self.arena.extend_from_slice(key);
        self.index.push((start as u32, key.len() as u32, row));
        let seen_bytes = self.seen.as_ref().map_or(0, |m| 16 * m.len());
        if self.arena.len() + 12 * self.index.len() + seen_bytes >= self.budget
            || self.arena.len() > 1 << 31
        {
            self.spill(groups)?;
        }
        Ok(())
    }

    /// Sort what is held (by key, then row) and link equal keys; the first
    /// row of each key stays (in `index`).
    fn sort_and_link(&mut self, groups: &mut Groups) {
        let arena = &self.arena;
        self.index.par_sort_unstable_by(|a, b| {
            key_of(arena, a).cmp(key_of(arena, b)).then(a.2.cmp(&b.2))
        });
        let mut linker = SortedLinker::default();
        for e in &self.index {
            linker.push(groups, key_of(arena, e), e.2);
        }
        // keep the first row of each key only
        self.index
            .dedup_by(|b, a| key_of(arena, a) == key_of(arena, b));
    }

    fn spill(&mut self, groups: &mut Groups) -> std::io::Result<()> {
        self.sort_and_link(groups);
        let path = self.dir.join(format!(
            "keys-{}-{}.bin",
            self.kind as char,
            self.runs.len()
        ));
        let mut w = BufWriter::with_capacity(1 << 16, std::fs::File::create(&path)?);
        for &(s, l, row) in &self.index {
            w.write_all(&l.to_le_bytes())?;
            w.write_all(&self.arena[s as usize..(s + l) as usize])?;
            w.write_all(&row.to_le_bytes())?;
        }
        w.into_inner().map_err(|e| e.into_error())?;
        self.runs.push(path);
        self.arena.clear();
        self.index.clear();
        if let Some(seen) = &mut self.seen {
            seen.clear();
        }
        Ok(())
    }

    /// Link the keys of every run.
    fn finish(mut self, groups: &mut Groups) -> std::io::Result<()> {
        if self.runs.is_empty() {
            self.sort_and_link(groups);
            return Ok(());
        }
        if !self.index.is_empty() {
            self.spill(groups)?;
        }
        let mut readers = Vec::with_capacity(self.runs.len());
        for p in &self.runs {
            readers.push(RunReader(BufReader::with_capacity(
                1 << 16,
                std::fs::File::open(p)?,
            )));
        }
        let mut heap = BinaryHeap::new();
        for (k, r) in readers.iter_mut().enumerate() {
            if let Some((key, row)) = r.next()? {
                heap.push(Reverse((key, row, k)));
            }
        }
        let mut linker = SortedLinker::default();
        while let Some(Reverse((key, row, k))) = heap.pop() {
            linker.push(groups, &key, row);
            if let Some((key, row)) = readers[k].next()? {
                heap.push(Reverse((key, row, k)));
            }
        }
        for p in &self.runs {
            std::fs::remove_file(p)?;
        }
        Ok(())
    }
}

fn key_of<'a>(arena: &'a [u8], &(start, len, _): &(u32, u32, u32)) -> &'a [u8] {
    &arena[start as usize..(start + len) as usize]
}

struct RunReader(BufReader<std::fs::File>);

impl RunReader {
    fn next(&mut self) -> std::io::Result<Option<(Vec<u8>, u32)>> {
        let mut len = [0u8; 4];
        match self.0.read_exact(&mut len) {
            Err(e) if e.kind() == std::io::ErrorKind::UnexpectedEof => return Ok(None),
            r => r?,
        }
        let mut key = vec![0u8; u32::from_le_bytes(len) as usize];
        self.0.read_exact(&mut key)?;
        let mut row = [0u8; 4];
        self.0.read_exact(&mut row)?;
        Ok(Some((key, u32::from_le_bytes(row))))
    }
}

/// Every row's compared boiling point and line, written in row order and read back once.
struct FactSpill {
    path: PathBuf,
    w: BufWriter<std::fs::File>,
}

impl FactSpill {
    fn new(dir: &Path) -> std::io::Result<Self> {
        let path = dir.join("facts.bin");
        let w = BufWriter::with_capacity(1 << 16, std::fs::File::create(&path)?);
        Ok(FactSpill { path, w })
    }

    fn push(&mut self, tb_k: f64, line: usize) -> std::io::Result<()> {
        self.w.write_all(&tb_k.to_le_bytes())?;
        self.w.write_all(&(line as u64).to_le_bytes())
    }

    /// The facts in row order (the file is removed when they are read).
    fn read_back(self) -> std::io::Result<impl Iterator<Item = (f64, usize)>> {
        self.w.into_inner().map_err(|e| e.into_error())?;
        let f = std::fs::File::open(&self.path)?;
        std::fs::remove_file(&self.path)?;
        let mut r = BufReader::with_capacity(1 << 16, f);
        Ok(std::iter::from_fn(move || {
            let mut b = [0u8; 16];
            r.read_exact(&mut b).ok()?;
            let tb = f64::from_le_bytes(b[..8].try_into().ok()?);
            let line = u64::from_le_bytes(b[8..].try_into().ok()?);
            Some((tb, line as usize))
        }))
    }
}

/// Screen the table at `path` batch by batch. `started(rows)` is called
/// once the first pass has read every row; then `emit(batch, report,
/// first_row)` once per batch in row order, with the batch's findings.
/// Returns the summary of the whole table.
pub fn screen_file(
    path: &Path,
    opts: &StreamOptions,
    ctx: &ScreenContext<'_>,
    n_worst: usize,
    started: &mut dyn FnMut(usize),
    emit: &mut dyn FnMut(&PropertyTable, &ScreenReport, usize) -> Result<(), String>,
) -> Result<Summary, StreamError> {
    let scratch = |source| StreamError::Scratch {
        dir: opts.scratch.clone(),
        source,
    };
    let mut batches = TableBatches::open(path, opts.batch_rows)?;
    let mut scan = ColumnScan::new();
    let mut cache = EstimateCache::new(opts.batch_rows.max(MIN_CACHED_STRUCTURES));
    let budget = opts.batch_rows.saturating_mul(KEY_BYTES_PER_BATCH_ROW);
    // First pass (twice when a column's unit is only settled by a later batch).
    let (groups, spill, mut residuals) = loop {
        let mut groups = Groups::new();
        let mut sorters = [b'c', b's', b'n'].map(|k| KeySorter::new(k, budget, &opts.scratch));
        let mut spill = FactSpill::new(&opts.scratch).map_err(scratch)?;
        let mut residuals = Vec::new();
        while let Some(b) = batches.next_batch() {
            let (frame, start) = b?;
            let table = PropertyTable::from_batch(
                frame,
                path,
                batches.line0() + start,
                &opts.read,
                &mut scan,
            )?;
            if start + table.height() > u32::MAX as usize {
                return Err(ReadError::file(
                    path,
                    super::ReadErrorKind::Io,
                    format!("has more than {} rows, the most `check` reads", u32::MAX),
                )
                .into());
            }
            let facts = batch_facts(&cache.fill(&table, ctx.estimator));
            groups.grow(start + facts.len());
            for (k, f) in facts.iter().enumerate() {
                let row = (start + k) as u32;
                spill.push(f.tb_k, f.line).map_err(scratch)?;
                if f.residual.is_finite() {
                    residuals.push(f.residual);
                }
                let [cas, structure, name] = &mut sorters;
                if let Some(c) = f.cas {
                    cas.add(c.as_bytes(), None, row, &mut groups)
                        .map_err(scratch)?;
                }
                if let Some(s) = f.structure {
                    structure
                        .add(s.as_bytes(), Some(f.structure_hash), row, &mut groups)
                        .map_err(scratch)?;
                }
                if let Some(n) = f.name {
                    with_name_key(n, |k| name.add(k.as_bytes(), None, row, &mut groups))
                        .map_err(scratch)?;
                }
            }
        }
        if scan.finish(path)? {
            batches.rewind()?;
            continue;
        }
        for s in sorters {
            s.finish(&mut groups).map_err(scratch)?;
        }
        break (groups, spill, residuals);
    };
    let verdicts = TableVerdicts::new(
        groups.roots(),
        spill.read_back().map_err(scratch)?,
        &mut residuals,
        ctx.options.tolerance_k,
    );
    drop(residuals);
    started(verdicts.n_rows());

    // Second pass.
    batches.rewind()?;
    let mut summary = SummaryBuilder::new(n_worst);
    while let Some(b) = batches.next_batch() {
        let (frame, start) = b?;
        let table =
            PropertyTable::from_batch(frame, path, batches.line0() + start, &opts.read, &mut scan)?;
        let report = screen_batch(&cache.fill(&table, ctx.estimator), start, &verdicts, ctx);
        summary.add(&report, &table, start);
        emit(&table, &report, start).map_err(StreamError::Output)?;
    }
    Ok(summary.finish())
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every row's group when rows with equal keys are linked directly.
    fn naive(keys: &[Vec<u8>]) -> Vec<u32> {
        let mut g = Groups::new();
        g.grow(keys.len());
        for i in 0..keys.len() {
            if let Some(j) = keys[..i].iter().position(|k| *k == keys[i]) {
                g.union(j as u32, i as u32);
            }
        }
        g.roots()
    }

    // Repeated keys linked as they arrive, unique keys (which stop the
    // lookup after the trial), and runs spilled to disk by a small budget:
    // each gives the groups of linking equal keys directly.
    #[test]
    fn key_sorter_groups_equal_keys_however_they_arrive() {
        let dir = std::env::temp_dir().join(format!("ebullio-keysorter-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let mut s: u64 = 0x2545_F491_4F6C_DD1D;
        let mut next = || {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            s
        };
        let repeated: Vec<Vec<u8>> = (0..3000)
            .map(|_| format!("key{}", next() % 37).into_bytes())
            .collect();
        let unique: Vec<Vec<u8>> = (0..70_000u32)
            .map(|i| format!("lot {}", (i * 7919) % 70_001).into_bytes())
            .chain([b"lot 5".to_vec(), b"lot 5".to_vec()])
            .collect();
        for (keys, budgets) in [
            (&repeated, [64, 4096, 1 << 30]),
            (&unique, [100_000, 400_000, 1 << 30]),
        ] {
            let want = if keys.len() < 5000 {
                naive(keys)
            } else {
                // unique but for the two trailing copies of "lot 5"
                let first = keys.iter().position(|k| k == b"lot 5").unwrap() as u32;
                let mut r: Vec<u32> = (0..keys.len() as u32).collect();
                let n = r.len();
                r[n - 2] = first;
                r[n - 1] = first;
                r
            };
            for budget in budgets {
                let mut groups = Groups::new();
                groups.grow(keys.len());
                let mut sorter = KeySorter::new(b'k', budget, &dir);
                for (i, k) in keys.iter().enumerate() {
                    let hash = (i % 2 == 0).then(|| fast_hash(k));
                    sorter.add(k, hash, i as u32, &mut groups).unwrap();
                }
                sorter.finish(&mut groups).unwrap();
                assert_eq!(groups.roots(), want, "budget {budget}");
            }
        }
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
