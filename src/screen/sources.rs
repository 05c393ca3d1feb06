//! What the checks compare a row against: structure estimates and reference tables.
//!
//! Both are traits so `screen` does not care whether an estimate comes from
//! the Joback method, a test double, or nothing at all ([`NoStructure`]), nor
//! whether reference boiling points come from the bundled tables or a table
//! the user supplies ([`TableReference`]).

use std::collections::HashMap;

/// The structure-based estimate for one SMILES.
#[derive(Debug, Clone, PartialEq)]
pub enum StructureOutcome {
    /// The SMILES parsed and an estimate was made.
    Estimate {
        /// Estimated normal boiling point, K.
        tb_k: f64,
        /// The method's typical error at this estimate (1 sigma, K).
        typical_error_k: f64,
        /// Canonical structure key (same molecule, same key), when available.
        structure_key: Option<String>,
    },
    /// The SMILES parsed but no estimate is possible (a group the method lacks).
    NoEstimate {
        /// Canonical structure key.
        structure_key: Option<String>,
        /// Why no estimate.
        reason: String,
    },
    /// The SMILES does not parse.
    Unreadable {
        /// What the parser said.
        reason: String,
    },
}

impl StructureOutcome {
    /// The structure key, if the SMILES parsed.
    pub fn structure_key(&self) -> Option<&str> {
        match self {
            StructureOutcome::Estimate { structure_key, .. }
            | StructureOutcome::NoEstimate { structure_key, .. } => structure_key.as_deref(),
            StructureOutcome::Unreadable { .. } => None,
        }
    }
}

/// Something that turns a SMILES into a boiling-point estimate.
pub trait StructureEstimator: Sync {
    /// Estimate from one SMILES; `None` when this estimator offers nothing at
    /// all (structure checks are then skipped, not failed).
    fn estimate(&self, smiles: &str) -> Option<StructureOutcome>;
}

/// An estimator that offers nothing: structure checks are skipped.
#[derive(Debug, Clone, Copy, Default)]
pub struct NoStructure;

impl StructureEstimator for NoStructure {
    fn estimate(&self, _smiles: &str) -> Option<StructureOutcome> {
        None
    }
}

/// Structure estimates by the Joback method with the Stein & Brown
/// correction (`crate::estimate`), structure keys from `crate::molecule`.
#[derive(Debug, Clone, Copy, Default)]
pub struct JobackEstimator;

impl StructureEstimator for JobackEstimator {
    fn estimate(&self, smiles: &str) -> Option<StructureOutcome> {
        let m = match crate::molecule::parse_smiles(smiles) {
            Ok(m) => m,
            Err(e) => {
                return Some(StructureOutcome::Unreadable {
                    reason: e.to_string(),
                })
            }
        };
        let key = Some(m.structure_key());
        Some(match crate::estimate::estimate_molecule(&m) {
            Ok(e) => StructureOutcome::Estimate {
                tb_k: e.tb_k,
                typical_error_k: e.tb_typical_error_k,
                structure_key: key,
            },
            Err(e) => StructureOutcome::NoEstimate {
                structure_key: key,
                reason: e.to_string(),
            },
        })
    }
}

/// A reference boiling point for a compound.
#[derive(Debug, Clone, PartialEq)]
pub struct ReferenceEntry {
    /// Name in the reference.
    pub name: String,
    /// Reference normal boiling point, K.
    pub tb_k: f64,
    /// Where it comes from (short).
    pub source: String,
}

/// Identity of a row for reference lookup.
#[derive(Debug, Clone, Copy, Default)]
pub struct Identity<'a> {
    /// Compound name.
    pub name: Option<&'a str>,
    /// CAS number (already validated).
    pub cas: Option<&'a str>,
    /// Structure key from the estimator.
    pub structure_key: Option<&'a str>,
    /// [`name_hash`] of `name`, when the caller has it already (else None).
    pub name_hash: Option<u64>,
}

/// Something that knows reference boiling points.
pub trait ReferenceLookup: Sync {
    /// The reference entry for this identity, CAS first, then structure, then name.
    fn find(&self, id: &Identity<'_>) -> Option<&ReferenceEntry>;
}

/// No reference: reference checks are skipped.
#[derive(Debug, Clone, Copy, Default)]
pub struct NoReference;

impl ReferenceLookup for NoReference {
    fn find(&self, _id: &Identity<'_>) -> Option<&ReferenceEntry> {
        None
    }
}

/// Normalise a compound name for matching: lowercase, single spaces.
pub fn name_key(name: &str) -> String {
    name.split_whitespace()
        .collect::<Vec<_>>()
        .join(" ")
        .to_lowercase()
}

/// A fast, non-cryptographic 64-bit hash of `bytes` (multiply–rotate over
/// eight-byte words, in the manner of the hash rustc uses internally). For
/// grouping and lookups of table keys; callers confirm equal hashes by
/// comparing the keys.
pub fn fast_hash(bytes: &[u8]) -> u64 {
    const K: u64 = 0x517c_c1b7_2722_0a95;
    let mut h = (bytes.len() as u64).wrapping_mul(K);
    let mut words = bytes.chunks_exact(8);
    for w in &mut words {
        let mut b = [0u8; 8];
        b.copy_from_slice(w);
        h = (h.rotate_left(5) ^ u64::from_le_bytes(b)).wrapping_mul(K);
    }
    let rest = words.remainder();
    if !rest.is_empty() {
        let mut b = [0u8; 8];
        b[..rest.len()].copy_from_slice(rest);
        h = (h.rotate_left(5) ^ u64::from_le_bytes(b)).wrapping_mul(K);
    }
    // final mix so the low bits (used by hash tables) depend on every word
    h ^= h >> 29;
    h = h.wrapping_mul(0xbf58_476d_1ce4_e5b9);
    h ^ (h >> 32)
}

/// [`fast_hash`] of [`name_key`]`(name)`: rows with the same name key have
/// the same hash (the converse is confirmed by comparing keys).
pub fn name_hash(name: &str) -> u64 {
    with_name_key(name, |k| fast_hash(k.as_bytes()))
}

/// A [`std::hash::Hasher`] over [`fast_hash`], for maps keyed by table text.
#[derive(Debug, Default, Clone, Copy)]
pub struct FastHasher(u64);

impl std::hash::Hasher for FastHasher {
    fn write(&mut self, bytes: &[u8]) {
        self.0 = fast_hash(bytes) ^ self.0.rotate_left(17);
    }
    fn finish(&self) -> u64 {
        self.0
    }
}

/// A hash map keyed by table text, with [`FastHasher`].
pub type FastMap<K, V> = HashMap<K, V, std::hash::BuildHasherDefault<FastHasher>>;

/// Call `f` with [`name_key`] of `name`; short ASCII names are normalised on
/// the stack, so the per-row lookups of a large table do not allocate.
pub fn with_name_key<R>(name: &str, f: impl FnOnce(&str) -> R) -> R {
    let bytes = name.as_bytes();
    let mut buf = [0u8; 128];
    if name.is_ascii() && bytes.len() <= buf.len() {
        // ASCII: split_whitespace and to_lowercase reduce to this one pass,
        // except that a vertical tab (0x0B) is kept here.
        let mut n = 0;
        let mut gap = false;
        for &b in bytes {
            if b.is_ascii_whitespace() {
                gap = n > 0;
            } else {
                if gap {
                    buf[n] = b' ';
                    n += 1;
                    gap = false;
                }
                buf[n] = b.to_ascii_lowercase();
                n += 1;
            }
        }
        if let Ok(k) = std::str::from_utf8(&buf[..n]) {
            return f(k);
        }
    }
    f(&name_key(name))
}

/// A reference built from rows of a table (e.g. `--reference-table`).
#[derive(Debug, Clone, Default)]
pub struct TableReference {
    by_cas: HashMap<String, ReferenceEntry>,
    by_key: HashMap<String, ReferenceEntry>,
    by_name: HashMap<String, ReferenceEntry>,
}

impl TableReference {
    /// An empty reference.
    pub fn new() -> Self {
        Self::default()
    }

    /// Add an entry under any identity parts that are known. The first entry
    /// for an identity wins.
    pub fn add(&mut self, id: &Identity<'_>, entry: ReferenceEntry) {
        if let Some(c) = id.cas {
            self.by_cas
                .entry(c.trim().to_string())
                .or_insert_with(|| entry.clone());
        }
        if let Some(k) = id.structure_key {
            self.by_key
                .entry(k.to_string())
                .or_insert_with(|| entry.clone());
        }
        if let Some(n) = id.name {
            self.by_name.entry(name_key(n)).or_insert(entry);
        }
    }

    /// A reference from the rows of a property table (`--reference-table`):
    /// each row's listed boiling point, else the one implied by its Antoine
    /// constants (`implied_tb_k`, NaN where none). Rows are found by valid
    /// CAS, SMILES structure key and name; `file` names them in findings.
    pub fn from_rows(rows: &dyn super::Rows, implied_tb_k: Option<&[f64]>, file: &str) -> Self {
        let mut reference = TableReference::new();
        for i in 0..rows.n_rows() {
            let r = rows.row(i);
            let tb = r.tb_k.or_else(|| {
                implied_tb_k
                    .and_then(|v| v.get(i).copied())
                    .filter(|t| t.is_finite())
            });
            let Some(tb) = tb else { continue };
            let cas = r.cas.filter(|c| crate::reference::cas::validate(c).is_ok());
            let key = r
                .smiles
                .and_then(|s| crate::molecule::parse_smiles(s).ok())
                .map(|m| m.structure_key());
            let name = r
                .compound
                .map(str::to_string)
                .unwrap_or_else(|| format!("line {}", r.line));
            reference.add(
                &Identity {
                    name: r.compound,
                    cas,
                    structure_key: key.as_deref(),
                    name_hash: None,
                },
                ReferenceEntry {
                    name,
                    tb_k: tb,
                    source: format!("{file} line {}", r.line),
                },
            );
        }
        reference
    }

    /// Number of distinct entries by name, CAS or structure.
    pub fn len(&self) -> usize {
        self.by_name
            .len()
            .max(self.by_cas.len())
            .max(self.by_key.len())
    }

    /// Whether there are no entries.
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }
}

impl ReferenceLookup for TableReference {
    fn find(&self, id: &Identity<'_>) -> Option<&ReferenceEntry> {
        if self.is_empty() {
            return None;
        }
        id.cas
            .and_then(|c| self.by_cas.get(c.trim()))
            .or_else(|| id.structure_key.and_then(|k| self.by_key.get(k)))
            .or_else(|| {
                id.name
                    .and_then(|n| with_name_key(n, |k| self.by_name.get(k)))
            })
    }
}

/// Several references, asked in order; the first that knows the compound answers.
pub struct Chain<'a>(pub Vec<&'a dyn ReferenceLookup>);

impl ReferenceLookup for Chain<'_> {
    fn find(&self, id: &Identity<'_>) -> Option<&ReferenceEntry> {
        self.0.iter().find_map(|r| r.find(id))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn table_reference_finds_by_cas_then_name() {
        let mut r = TableReference::new();
        let e = ReferenceEntry {
            name: "acetone".into(),
            tb_k: 329.35,
            source: "test".into(),
        };
        r.add(
            &Identity {
                name: Some("Acetone"),
                cas: Some("67-64-1"),
                ..Default::default()
            },
            e.clone(),
        );
        let by_cas = Identity {
            cas: Some("67-64-1"),
            ..Default::default()
        };
        assert_eq!(r.find(&by_cas), Some(&e));
        let by_name = Identity {
            name: Some("  acetone "),
            ..Default::default()
        };
        assert_eq!(r.find(&by_name), Some(&e));
        assert_eq!(name_key("  Ethyl   Acetate "), "ethyl acetate");
        with_name_key("  Ethyl \t Acetate ", |k| assert_eq!(k, "ethyl acetate"));
        with_name_key("Éthanol  X", |k| assert_eq!(k, "éthanol x"));
        assert!(r.find(&Identity::default()).is_none());
    }
}
