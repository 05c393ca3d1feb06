//! Bundled reference data: published Antoine constants, boiling points, the
//! IAPWS-IF97 water line, and lookup by name, CAS number and structure.
//!
//! The tables in `reference-data/` are embedded in the binary and parsed once,
//! on first use ([`Library::bundled`]). A user's table (same columns) can be
//! layered on top with [`Library::with_user_table`]; its rows take precedence
//! and are named (file and line) wherever they are used.
//!
//! ```
//! use ebullio::reference::Library;
//! use ebullio::vapor::Curve;
//! let lib = Library::bundled();
//! let ethanol = lib.find("Ethyl Alcohol").unwrap();
//! assert_eq!(ethanol.name, "ethanol");
//! let curve = ethanol.best_curve().unwrap();
//! assert!((curve.t_at(101_325.0).unwrap() - 351.4).abs() < 0.5);
//! // Structure lookup: any valid spelling.
//! assert_eq!(lib.find_smiles("OCC").unwrap().name, "ethanol");
//! ```

pub mod cas;
pub mod compare;
mod curve;
pub mod curve_source;
pub mod equation;
pub mod fit_check;
pub mod table;
pub mod water;

pub use curve::{ReferenceCurve, ReferenceCurveKind};
pub use table::{AntoineRow, Origin, TableError, TbRow, DEFAULT_U_P_REL};

use std::collections::BTreeMap;
use std::sync::OnceLock;

/// The bundled Antoine table (`reference-data/antoine-published.csv`).
pub const ANTOINE_CSV: &str = include_str!("../../reference-data/antoine-published.csv");
/// The bundled boiling-point table (`reference-data/normal-boiling-points-dev.csv`).
pub const TB_CSV: &str = include_str!("../../reference-data/normal-boiling-points-dev.csv");
/// The bundled process solvents without another source (`reference-data/process-solvents.csv`).
pub const SOLVENTS_CSV: &str = include_str!("../../reference-data/process-solvents.csv");
/// The bundled reference-equation curves (`reference-data/reference-equations.csv`).
pub const EQUATIONS_CSV: &str = include_str!("../../reference-data/reference-equations.csv");
/// The bundled synonyms (`reference-data/synonyms.csv`).
pub const SYNONYMS_CSV: &str = include_str!("../../reference-data/synonyms.csv");

/// One compound with every reference value and its source.
#[derive(Debug, Clone, PartialEq)]
pub struct Compound {
    /// Canonical name (the boiling-point table's, else the first table's).
    pub name: String,
    /// Other names it is found by.
    pub synonyms: Vec<String>,
    /// SMILES, when a table gives one.
    pub smiles: Option<String>,
    /// CAS number, only where a source gives one.
    pub cas: Option<String>,
    /// Normal boiling point rows (user rows first).
    pub tb: Vec<TbRow>,
    /// Antoine rows (user rows first).
    pub antoine: Vec<AntoineRow>,
    /// The stored saturation curve of the compound's reference equation of state, if any.
    pub equation: Option<equation::EquationRow>,
}

impl Compound {
    /// The preferred normal boiling point row (user's first, else the bundled one).
    pub fn tb_row(&self) -> Option<&TbRow> {
        self.tb.first()
    }

    /// True for water, whose reference curve is IAPWS-IF97.
    pub fn is_water(&self) -> bool {
        self.name.eq_ignore_ascii_case("water")
    }

    /// The best reference curve: a user's Antoine row if any; for water the
    /// IAPWS-IF97 saturation line; then the reference equation of state's stored
    /// curve; otherwise the bundled Antoine row with a stated range and no
    /// from-memory note, widest range first.
    pub fn best_curve(&self) -> Option<ReferenceCurve> {
        if let Some(r) = self.antoine.iter().find(|r| r.origin.user) {
            return Some(ReferenceCurve::antoine(r));
        }
        if self.is_water() {
            return Some(ReferenceCurve::water());
        }
        if let Some(e) = &self.equation {
            return Some(ReferenceCurve::equation(e));
        }
        let score = |r: &AntoineRow| {
            let width = r.constants.range_k.map_or(0.0, |(lo, hi)| hi - lo);
            let clean = !r.note.to_ascii_lowercase().contains("memory");
            (r.constants.range_k.is_some(), clean, width)
        };
        self.antoine
            .iter()
            .max_by(|a, b| {
                score(a)
                    .partial_cmp(&score(b))
                    .unwrap_or(std::cmp::Ordering::Equal)
            })
            .map(ReferenceCurve::antoine)
            .or_else(|| self.tb.iter().find_map(ReferenceCurve::lee_kesler))
    }

    /// Where the CAS number comes from: the row's `cas_source` (e.g. "from memory").
    pub fn cas_source(&self) -> Option<&str> {
        if let Some(e) = &self.equation {
            if self.cas.as_deref() == Some(e.cas.as_str()) {
                return Some("reference-equation table (library-provided)");
            }
        }
        self.tb
            .iter()
            .find(|r| r.cas.is_some() && !r.cas_source.is_empty())
            .map(|r| r.cas_source.as_str())
    }

    /// True when the SMILES carries geometry (cis/trans `/` `\`) or chirality (`@`), which
    /// the structure key does not compare.
    pub fn has_stereo(&self) -> bool {
        self.smiles
            .as_deref()
            .is_some_and(|s| s.contains(['/', '\\', '@']))
    }
}

/// Why a lookup failed.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum LookupError {
    /// A CAS-shaped query with a wrong check digit or format.
    #[error(transparent)]
    Cas(#[from] cas::CasError),
    /// Nothing matched.
    #[error("no reference compound '{query}'{}", suggest(.near))]
    NotFound {
        /// What was asked for.
        query: String,
        /// Names containing the query, to help.
        near: Vec<String>,
    },
    /// The structure matches compounds that differ only in geometry or chirality.
    #[error("'{smiles}' matches {}, which differ only in cis/trans geometry or chirality that ebullio's structure match does not compare; give the name or CAS number", .names.join(" and "))]
    Stereo {
        /// The SMILES.
        smiles: String,
        /// The compounds it matches.
        names: Vec<String>,
    },
    /// The SMILES could not be read.
    #[error("'{smiles}' is not a SMILES this program can read: {reason}")]
    BadSmiles {
        /// The SMILES.
        smiles: String,
        /// The reader's message.
        reason: String,
    },
}

fn suggest(near: &[String]) -> String {
    if near.is_empty() {
        "; `ebullio reference` lists them".into()
    } else {
        format!("; did you mean: {}?", near.join(", "))
    }
}

/// The reference library: bundled tables plus, optionally, a user's table.
#[derive(Debug, Clone, Default)]
pub struct Library {
    compounds: Vec<Compound>,
    index: BTreeMap<String, usize>,
    /// The user's table, if one was added.
    pub user_table: Option<String>,
    /// Structure key of each compound's SMILES, made on the first structure lookup.
    keys: OnceLock<Vec<Option<String>>>,
    /// Every formula among the compounds' structures, made on first use.
    formulas: OnceLock<std::collections::HashSet<String>>,
    /// Per index key: its character mask, length in characters, the key and its
    /// compound, made on the first name suggestion (scanned per unknown name).
    name_masks: OnceLock<NameMasks>,
}

/// Per query (character mask, length in characters): the names that pass the cheap filters.
type PassingNames = std::collections::HashMap<(u64, usize), std::sync::Arc<[u32]>>;

/// Character masks and lengths of every name key, side by side for a fast scan, and the
/// names that pass the cheap filters per query (mask, length), remembered.
#[derive(Debug, Default)]
struct NameMasks {
    masks: Vec<u64>,
    lens: Vec<usize>,
    names: Vec<(String, usize)>,
    passing: std::sync::Mutex<PassingNames>,
}

impl Clone for NameMasks {
    fn clone(&self) -> Self {
        NameMasks {
            masks: self.masks.clone(),
            lens: self.lens.clone(),
            names: self.names.clone(),
            passing: Default::default(), // a cache: the copy makes its own
        }
    }
}

impl NameMasks {
    /// Lower bounds on the edit distance from a query: the difference in length, and the
    /// characters either name has that the other lacks (one edit each).
    fn near(&self, j: usize, mq: u64, len_q: usize, limit: usize) -> bool {
        let mk = self.masks[j];
        let missing = (mq & !mk).count_ones().max((mk & !mq).count_ones()) as usize;
        self.lens[j].abs_diff(len_q) <= limit && missing <= limit
    }

    /// The names a query with this mask and length can contain, be contained in, or be
    /// within `limit` edits of by the bounds above; a superset of the suggestions.
    fn candidates(&self, mq: u64, len_q: usize, limit: usize) -> std::sync::Arc<[u32]> {
        // A panicked holder leaves a valid cache.
        let lock = || self.passing.lock().unwrap_or_else(|p| p.into_inner());
        if let Some(c) = lock().get(&(mq, len_q)) {
            return c.clone();
        }
        let list: std::sync::Arc<[u32]> = (0..self.masks.len())
            .filter(|&j| {
                let (mk, len_k) = (self.masks[j], self.lens[j]);
                // Containment needs the shorter name's characters inside the longer's.
                let may_contain = len_q >= 3
                    && ((len_k >= len_q && mq & !mk == 0) || (len_k <= len_q && mk & !mq == 0));
                may_contain || self.near(j, mq, len_q, limit)
            })
            .map(|j| j as u32)
            .collect();
        let mut cache = lock();
        if cache.len() >= 4096 {
            cache.clear(); // bounded: a batch of arbitrary names cannot grow it without end
        }
        cache.insert((mq, len_q), list.clone());
        list
    }
}

/// Which characters occur in `s`, folded onto 64 bits: a character of one string whose
/// bit is missing from the other's mask occurs nowhere in the other.
fn char_mask(s: &str) -> u64 {
    s.chars().fold(0, |m, c| m | 1u64 << (c as u32 % 64))
}

fn key(name: &str) -> String {
    name.trim().to_lowercase()
}

impl Library {
    /// The bundled library, parsed once on first use. The bundled tables are
    /// tested, so a parse failure here is a build defect (empty library + test failure).
    pub fn bundled() -> &'static Library {
        static LIB: OnceLock<Library> = OnceLock::new();
        LIB.get_or_init(|| Library::from_tables(None).unwrap_or_default())
    }

    /// Build from the bundled tables, plus a user table `(file name, text)`.
    pub fn from_tables(user: Option<(&str, &str)>) -> Result<Library, TableError> {
        let mut lib = Library::default();
        let syn = table::parse_synonyms(SYNONYMS_CSV, "reference-data/synonyms.csv")?;
        let bundled_tb = table::parse(
            TB_CSV,
            "reference-data/normal-boiling-points-dev.csv",
            false,
        )?;
        let bundled_a = table::parse(ANTOINE_CSV, "reference-data/antoine-published.csv", false)?;
        let user_rows = match user {
            Some((file, text)) => {
                lib.user_table = Some(file.to_string());
                Some(table::parse(text, file, true)?)
            }
            None => None,
        };
        let solvents = table::parse(SOLVENTS_CSV, "reference-data/process-solvents.csv", false)?;
        for r in bundled_tb.tb.into_iter().chain(solvents.tb) {
            lib.entry(&r.compound).tb.push(r);
        }
        for (c, s) in &syn {
            let i = lib.entry_index(c);
            lib.compounds[i].synonyms.push(s.clone());
            lib.index.entry(key(s)).or_insert(i);
        }
        for r in bundled_a.antoine {
            lib.entry(&r.compound).antoine.push(r);
        }
        let eqs = equation::parse(EQUATIONS_CSV, "reference-data/reference-equations.csv")?;
        for r in eqs {
            let i = lib.entry_index(&r.compound);
            for s in &r.synonyms {
                lib.index.entry(key(s)).or_insert(i);
                if !lib.compounds[i].synonyms.iter().any(|x| key(x) == key(s)) {
                    lib.compounds[i].synonyms.push(s.clone());
                }
            }
            let c = &mut lib.compounds[i];
            // Water keeps its IAPWS-IF97 boiling point first (IF97 stays the water reference).
            let water = key(&r.compound) == "water";
            if let (Some(tb), false) = (r.tb_k, water) {
                c.tb.insert(
                    0,
                    TbRow {
                        compound: r.compound.clone(),
                        smiles: Some(r.smiles.clone()),
                        cas: Some(r.cas.clone()),
                        cas_source: "reference-equation table (library-provided)".into(),
                        tb_k: tb,
                        critical: Some((r.tc_k, r.pc_pa)),
                        source_class: "reference-equation".into(),
                        source: format!("reference equation of state: {}", r.citation),
                        origin: r.origin.clone(),
                    },
                );
            }
            c.equation = Some(r);
        }
        if let Some(u) = user_rows {
            for r in u.tb.into_iter().rev() {
                lib.entry(&r.compound).tb.insert(0, r);
            }
            for r in u.antoine.into_iter().rev() {
                lib.entry(&r.compound).antoine.insert(0, r);
            }
        }
        for c in &mut lib.compounds {
            c.smiles = c.tb.iter().find_map(|r| r.smiles.clone());
            c.cas =
                c.tb.iter()
                    .find_map(|r| r.cas.clone())
                    .or_else(|| c.equation.as_ref().map(|e| e.cas.clone()));
        }
        // Drop empty entries created only by a synonym line.
        let keep: Vec<bool> = lib
            .compounds
            .iter()
            .map(|c| !(c.tb.is_empty() && c.antoine.is_empty() && c.equation.is_none()))
            .collect();
        if keep.iter().any(|k| !k) {
            let old = std::mem::take(&mut lib.compounds);
            lib.index.clear();
            for (c, k) in old.into_iter().zip(keep) {
                if k {
                    let i = lib.compounds.len();
                    lib.index.insert(key(&c.name), i);
                    for s in &c.synonyms {
                        lib.index.entry(key(s)).or_insert(i);
                    }
                    lib.compounds.push(c);
                }
            }
        }
        Ok(lib)
    }

    /// Bundled tables plus the user's table at `path` (read by the caller).
    pub fn with_user_table(file: &str, text: &str) -> Result<Library, TableError> {
        Library::from_tables(Some((file, text)))
    }

    fn entry_index(&mut self, name: &str) -> usize {
        if let Some(&i) = self.index.get(&key(name)) {
            return i;
        }
        let i = self.compounds.len();
        self.compounds.push(Compound {
            name: name.trim().to_string(),
            synonyms: Vec::new(),
            smiles: None,
            cas: None,
            tb: Vec::new(),
            antoine: Vec::new(),
            equation: None,
        });
        self.index.insert(key(name), i);
        self.name_masks = OnceLock::new();
        i
    }

    fn entry(&mut self, name: &str) -> &mut Compound {
        let i = self.entry_index(name);
        &mut self.compounds[i]
    }

    /// Every compound, in table order.
    pub fn compounds(&self) -> &[Compound] {
        &self.compounds
    }

    /// Like [`find`](Self::find) but without building the error (no suggestions): for batch
    /// callers that only need to know whether there is a reference compound.
    pub fn get(&self, query: &str) -> Option<&Compound> {
        let q = query.trim();
        let cas_like =
            !q.is_empty() && q.chars().all(|c| c.is_ascii_digit() || c == '-') && q.contains('-');
        if cas_like {
            let cas = cas::validate(q).ok()?;
            return self
                .compounds
                .iter()
                .find(|c| c.cas.as_deref() == Some(cas.as_str()));
        }
        self.index.get(&key(q)).map(|&i| &self.compounds[i])
    }

    /// Find by name or synonym (case-insensitive), or by CAS number when the
    /// query looks like one (digits-digits-digit; the check digit is validated).
    pub fn find(&self, query: &str) -> Result<&Compound, LookupError> {
        let q = query.trim();
        let cas_like =
            !q.is_empty() && q.chars().all(|c| c.is_ascii_digit() || c == '-') && q.contains('-');
        if cas_like {
            let cas = cas::validate(q)?;
            return self
                .compounds
                .iter()
                .find(|c| c.cas.as_deref() == Some(cas.as_str()))
                .ok_or_else(|| LookupError::NotFound {
                    query: q.to_string(),
                    near: Vec::new(),
                });
        }
        if let Some(&i) = self.index.get(&key(q)) {
            return Ok(&self.compounds[i]);
        }
        Err(LookupError::NotFound {
            query: q.to_string(),
            near: self.suggestions(q),
        })
    }

    /// Up to five names or synonyms near `query`: within a few edits (Levenshtein distance
    /// up to a third of the query's length, at least 1, at most 3), or containing it.
    pub fn suggestions(&self, query: &str) -> Vec<String> {
        let kq = key(query);
        if kq.is_empty() {
            return Vec::new();
        }
        let len_q = kq.chars().count();
        let limit = (len_q / 3).clamp(1, 3);
        let mq = char_mask(&kq);
        let names = self.name_masks.get_or_init(|| {
            let mut m = NameMasks::default();
            for (k, &i) in &self.index {
                m.masks.push(char_mask(k));
                m.lens.push(k.chars().count());
                m.names.push((k.clone(), i));
            }
            m
        });
        // Which names can be near the query depends only on its character mask and length:
        // the pass over every name runs once per (mask, length) and is remembered, so a batch
        // of unknown names with few distinct character sets scans the library a few times.
        let candidates = names.candidates(mq, len_q, limit);
        let mut scored: Vec<(usize, &str, usize)> = Vec::new();
        for &j in candidates.iter() {
            let j = j as usize;
            let (mk, len_k) = (names.masks[j], names.lens[j]);
            let (k, i) = (&names.names[j].0, names.names[j].1);
            let may_contain = len_q >= 3
                && ((len_k >= len_q && mq & !mk == 0) || (len_k <= len_q && mk & !mq == 0));
            let contains = may_contain && (k.contains(&kq) || kq.contains(k.as_str()));
            if !contains && (!names.near(j, mq, len_q, limit) || bag_distance(&kq, k) > limit) {
                continue;
            }
            let d = if contains {
                edit_distance(&kq, k)
            } else {
                match edit_distance_within(&kq, k, limit) {
                    Some(d) => d,
                    None => continue,
                }
            };
            if d <= limit || contains {
                scored.push((d, k.as_str(), i));
            }
        }
        scored.sort_by(|a, b| a.0.cmp(&b.0).then(a.1.cmp(b.1)));
        let mut out: Vec<String> = Vec::new();
        for (_, k, i) in scored {
            let name = &self.compounds[i].name;
            let shown = if key(name) == k {
                name.clone()
            } else {
                format!("{k} ({name})")
            };
            if !out.iter().any(|o| o == &shown) && out.len() < 5 {
                out.push(shown);
            }
        }
        out
    }

    /// Find by structure: any valid SMILES spelling of the same molecule
    /// (matched on [`crate::molecule::Molecule::structure_key`]).
    pub fn find_smiles(&self, smiles: &str) -> Result<&Compound, LookupError> {
        let k = structure_key(smiles).map_err(|reason| LookupError::BadSmiles {
            smiles: smiles.to_string(),
            reason,
        })?;
        let keys = self.keys.get_or_init(|| {
            self.compounds
                .iter()
                .map(|c| c.smiles.as_deref().and_then(|s| structure_key(s).ok()))
                .collect()
        });
        let hits: Vec<&Compound> = keys
            .iter()
            .zip(&self.compounds)
            .filter(|(ck, _)| ck.as_deref() == Some(k.as_str()))
            .map(|(_, c)| c)
            .collect();
        match hits.as_slice() {
            [] => Err(LookupError::NotFound {
                query: smiles.to_string(),
                near: Vec::new(),
            }),
            [c] if !c.has_stereo() => Ok(c),
            _ => Err(LookupError::Stereo {
                smiles: smiles.to_string(),
                names: hits.iter().map(|c| c.name.clone()).collect(),
            }),
        }
    }

    /// Whether any compound's structure has this molecular formula (as
    /// [`crate::molecule::Molecule::formula`] writes it). The same structure has the same
    /// formula, so a batch that knows its formulas skips [`Library::find_smiles`] (which
    /// reads the SMILES again) for every structure this says no to.
    pub fn has_structure_formula(&self, formula: &str) -> bool {
        self.formulas
            .get_or_init(|| {
                self.compounds
                    .iter()
                    .filter_map(|c| c.smiles.as_deref())
                    .filter_map(|s| crate::molecule::parse_smiles(s).ok())
                    .map(|m| m.formula())
                    .collect()
            })
            .contains(formula)
    }

    /// The reference compound and its best curve for a structure, when the structure
    /// matches exactly one reference compound that has a curve (reference first: callers
    /// use this before estimating from structure, and say so).
    pub fn reference_for_smiles(&self, smiles: &str) -> Option<(&Compound, ReferenceCurve)> {
        let c = self.find_smiles(smiles).ok()?;
        Some((c, c.best_curve()?))
    }
}

/// Levenshtein distance between two strings (by characters).
pub fn edit_distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    let mut cur = vec![0; b.len() + 1];
    for (i, ca) in a.chars().enumerate() {
        cur[0] = i + 1;
        for (j, &cb) in b.iter().enumerate() {
            let sub = prev[j] + usize::from(ca != cb);
            cur[j + 1] = sub.min(prev[j + 1] + 1).min(cur[j] + 1);
        }
        std::mem::swap(&mut prev, &mut cur);
    }
    prev[b.len()]
}

/// [`edit_distance`] when it is at most `limit`, else `None`: the rows stop as soon as
/// every entry exceeds the limit (the distance never falls along the rows), so an
/// unrelated name costs a few rows; short names stay on the stack.
/// A lower bound on the edit distance, far cheaper than it: the characters of either string
/// left over when the two are matched as multisets (each needs at least one edit).
/// Characters are folded onto 64 counters, which can only lower the bound.
fn bag_distance(a: &str, b: &str) -> usize {
    let mut count = [0i32; 64];
    for c in a.chars() {
        count[c as usize % 64] += 1;
    }
    for c in b.chars() {
        count[c as usize % 64] -= 1;
    }
    let (more_a, more_b) = count.iter().fold((0, 0), |(p, n), &c| {
        (p + c.max(0) as usize, n + (-c).max(0) as usize)
    });
    more_a.max(more_b)
}

fn edit_distance_within(a: &str, b: &str, limit: usize) -> Option<usize> {
    const STACK: usize = 64;
    let (mut bs, mut pv, mut cv) = ([' '; STACK], [0usize; STACK + 1], [0usize; STACK + 1]);
    let nb = b.chars().count();
    if nb > STACK {
        let d = edit_distance(a, b);
        return (d <= limit).then_some(d);
    }
    for (slot, c) in bs.iter_mut().zip(b.chars()) {
        *slot = c;
    }
    let (b, mut prev, mut cur) = (&bs[..nb], &mut pv[..=nb], &mut cv[..=nb]);
    for (j, v) in prev.iter_mut().enumerate() {
        *v = j;
    }
    for (i, ca) in a.chars().enumerate() {
        cur[0] = i + 1;
        let mut row_min = cur[0];
        for (j, &cb) in b.iter().enumerate() {
            let sub = prev[j] + usize::from(ca != cb);
            cur[j + 1] = sub.min(prev[j + 1] + 1).min(cur[j] + 1);
            row_min = row_min.min(cur[j + 1]);
        }
        if row_min > limit {
            return None;
        }
        std::mem::swap(&mut prev, &mut cur);
    }
    Some(prev[nb]).filter(|&d| d <= limit)
}

fn structure_key(smiles: &str) -> Result<String, String> {
    crate::molecule::parse_smiles(smiles)
        .map(|m| m.structure_key())
        .map_err(|e| e.to_string())
}

#[cfg(test)]
mod tests;
