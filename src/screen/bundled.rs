//! The bundled reference tables as a [`ReferenceLookup`] for the screen.
//!
//! Every compound of [`crate::reference::Library::bundled`] with a tabulated
//! normal boiling point is indexed once by CAS number, by the structure key of
//! its SMILES and by its name and synonyms, so a row finds its reference
//! whichever of the three it carries. The entry names the reference row (file
//! and line) and its source, so a disagreement says what it disagrees with.

use super::sources::{
    name_hash, with_name_key, FastMap, Identity, ReferenceEntry, ReferenceLookup,
};
use crate::reference::Library;
use std::sync::OnceLock;

/// Reference boiling points from a [`Library`], indexed for row lookups.
#[derive(Debug, Clone, Default)]
pub struct BundledReference {
    entries: Vec<ReferenceEntry>,
    by_cas: FastMap<String, usize>,
    by_key: FastMap<String, usize>,
    /// Name keys by their [`name_hash`]: (key, entry).
    by_name: FastMap<u64, Vec<(String, usize)>>,
}

/// The source as a short phrase: the text before the first `;` (the bundled
/// sources continue with addresses).
fn short_source(s: &str) -> &str {
    s.split(';').next().unwrap_or(s).trim()
}

impl BundledReference {
    /// Index the compounds of `lib` that have a normal-boiling-point row.
    pub fn new(lib: &Library) -> Self {
        let mut r = BundledReference::default();
        for c in lib.compounds() {
            let Some(tb) = c.tb_row() else { continue };
            let i = r.entries.len();
            r.entries.push(ReferenceEntry {
                name: c.name.clone(),
                tb_k: tb.tb_k,
                source: format!(
                    "{} line {}: {}",
                    tb.origin.file,
                    tb.origin.line,
                    short_source(&tb.source)
                ),
            });
            if let Some(cas) = &c.cas {
                r.by_cas.entry(cas.trim().to_string()).or_insert(i);
            }
            // Compounds told apart only by geometry or chirality are found by CAS or name:
            // the structure key does not compare those.
            if let Some(key) = c
                .smiles
                .as_deref()
                .filter(|_| !c.has_stereo())
                .and_then(|s| crate::molecule::parse_smiles(s).ok())
                .map(|m| m.structure_key())
            {
                r.by_key.entry(key).or_insert(i);
            }
            for n in std::iter::once(&c.name).chain(&c.synonyms) {
                let list = r.by_name.entry(name_hash(n)).or_default();
                with_name_key(n, |k| {
                    if !list.iter().any(|(x, _)| x == k) {
                        list.push((k.to_string(), i));
                    }
                });
            }
        }
        r
    }

    /// The bundled tables, indexed once on first use.
    pub fn bundled() -> &'static BundledReference {
        static REF: OnceLock<BundledReference> = OnceLock::new();
        REF.get_or_init(|| BundledReference::new(Library::bundled()))
    }

    /// Number of compounds with a reference boiling point.
    pub fn len(&self) -> usize {
        self.entries.len()
    }

    /// Whether there are none.
    pub fn is_empty(&self) -> bool {
        self.entries.is_empty()
    }
}

impl ReferenceLookup for BundledReference {
    fn find(&self, id: &Identity<'_>) -> Option<&ReferenceEntry> {
        let i = id
            .cas
            .and_then(|c| self.by_cas.get(c.trim()).copied())
            .or_else(|| id.structure_key.and_then(|k| self.by_key.get(k).copied()))
            .or_else(|| {
                let n = id.name?;
                let list = self
                    .by_name
                    .get(&id.name_hash.unwrap_or_else(|| name_hash(n)))?;
                with_name_key(n, |k| list.iter().find(|(x, _)| x == k).map(|(_, i)| *i))
            })?;
        self.entries.get(i)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Lookups against the bundled tables: nitromethane (Tb 374.35 K, from
    // memory), ethanol by structure (Smith, Van Ness & Abbott B.2, 351.35 K),
    // hexane by its synonym, water by CAS 7732-18-5 if the table gives it.
    #[test]
    fn bundled_reference_finds_by_name_synonym_and_structure() {
        let r = BundledReference::bundled();
        assert!(r.len() > 50, "{}", r.len());
        let by_name = r
            .find(&Identity {
                name: Some("  Nitromethane "),
                ..Default::default()
            })
            .unwrap();
        assert_eq!(by_name.tb_k, 374.35);
        assert!(
            by_name
                .source
                .starts_with("reference-data/normal-boiling-points-dev.csv line "),
            "{}",
            by_name.source
        );
        let key = crate::molecule::parse_smiles("OCC")
            .unwrap()
            .structure_key();
        let by_key = r
            .find(&Identity {
                structure_key: Some(&key),
                ..Default::default()
            })
            .unwrap();
        assert_eq!(by_key.name, "ethanol");
        let by_synonym = r
            .find(&Identity {
                name: Some("HEXANE"),
                ..Default::default()
            })
            .unwrap();
        assert_eq!(by_synonym.name, "n-hexane");
        assert!(r
            .find(&Identity {
                name: Some("HV-0000001 benzene"),
                ..Default::default()
            })
            .is_none());
    }
}
