//! The embedded original-UNIFAC parameter table: subgroups (R, Q) and main-group interactions.
//!
//! Reference: A. Fredenslund, R. L. Jones, J. M. Prausnitz, AIChE J. 21 (1975)
//! 1086–1099 (the method); H. K. Hansen, P. Rasmussen, Aa. Fredenslund,
//! M. Schiller, J. Gmehling, Ind. Eng. Chem. Res. 30 (1991) 2352–2355 and
//! R. Wittig, J. Lohmann, J. Gmehling, Ind. Eng. Chem. Res. 42 (2003) 183–188
//! (the parameter tables). How the files were made: `reference-data/unifac/SOURCES.md`.

use std::collections::HashMap;
use std::sync::OnceLock;

const SUBGROUPS_CSV: &str = include_str!("../../reference-data/unifac/subgroups.csv");
const INTERACTIONS_CSV: &str = include_str!("../../reference-data/unifac/interactions.csv");

/// One original-UNIFAC subgroup.
#[derive(Debug, Clone, PartialEq)]
pub struct Subgroup {
    /// Subgroup number as published.
    pub id: u16,
    /// Subgroup name as published (`CH3`, `CH3CO`, `ACH`, …).
    pub name: &'static str,
    /// Main group number.
    pub main_id: u16,
    /// Main group name.
    pub main_name: &'static str,
    /// Van der Waals volume parameter R.
    pub r: f64,
    /// Van der Waals area parameter Q.
    pub q: f64,
}

/// The parsed table.
#[derive(Debug)]
pub struct UnifacTable {
    subgroups: Vec<Subgroup>,
    a: HashMap<(u16, u16), f64>,
}

/// The embedded table, parsed once.
pub fn unifac_table() -> &'static UnifacTable {
    static T: OnceLock<UnifacTable> = OnceLock::new();
    T.get_or_init(|| {
        let mut subgroups = Vec::new();
        for line in SUBGROUPS_CSV
            .lines()
            .skip(1)
            .filter(|l| !l.trim().is_empty())
        {
            let f: Vec<&'static str> = line.split(',').map(str::trim).collect();
            // The embedded file is checked by the tests; a malformed row would fail them.
            let num = |i: usize| f.get(i).and_then(|s| s.parse::<f64>().ok());
            if let (Some(id), Some(main_id), Some(r), Some(q)) = (
                f.first().and_then(|s| s.parse().ok()),
                f.get(2).and_then(|s| s.parse().ok()),
                num(4),
                num(5),
            ) {
                subgroups.push(Subgroup {
                    id,
                    name: f[1],
                    main_id,
                    main_name: f[3],
                    r,
                    q,
                });
            }
        }
        let mut a = HashMap::new();
        for line in INTERACTIONS_CSV
            .lines()
            .skip(1)
            .filter(|l| !l.trim().is_empty())
        {
            let f: Vec<&str> = line.split(',').map(str::trim).collect();
            if let (Some(m), Some(n), Some(v)) = (
                f.first().and_then(|s| s.parse().ok()),
                f.get(1).and_then(|s| s.parse().ok()),
                f.get(2).and_then(|s| s.parse::<f64>().ok()),
            ) {
                a.insert((m, n), v);
            }
        }
        UnifacTable { subgroups, a }
    })
}

impl UnifacTable {
    /// All subgroups in table order.
    pub fn subgroups(&self) -> &[Subgroup] {
        &self.subgroups
    }

    /// The subgroup with this number.
    pub fn subgroup(&self, id: u16) -> Option<&Subgroup> {
        self.subgroups.iter().find(|s| s.id == id)
    }

    /// The subgroup with this name (case-insensitive).
    pub fn by_name(&self, name: &str) -> Option<&Subgroup> {
        self.subgroups
            .iter()
            .find(|s| s.name.eq_ignore_ascii_case(name))
    }

    /// a_mn (K) between main groups `m` and `n`; 0 for m = n; `None` when unpublished.
    pub fn a(&self, m: u16, n: u16) -> Option<f64> {
        if m == n {
            Some(0.0)
        } else {
            self.a.get(&(m, n)).copied()
        }
    }

    /// Number of directed main-group pairs with a published parameter.
    pub fn pair_count(&self) -> usize {
        self.a.len()
    }

    /// Name of main group `m`.
    pub fn main_name(&self, m: u16) -> &'static str {
        self.subgroups
            .iter()
            .find(|s| s.main_id == m)
            .map_or("?", |s| s.main_name)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Counts stated in `reference-data/unifac/SOURCES.md`: 113 subgroups, 1,270 pairs.
    #[test]
    fn embedded_table_has_the_counts_its_source_note_states() {
        let t = unifac_table();
        assert_eq!(t.subgroups().len(), 113);
        assert_eq!(t.pair_count(), 1270);
        let ch3co = t.by_name("CH3CO").unwrap();
        // Hansen et al. (1991): CH3CO R = 1.6724, Q = 1.488.
        assert_eq!((ch3co.r, ch3co.q, ch3co.main_id), (1.6724, 1.488, 9));
        // Every pair listed both ways, every subgroup's main group has a name.
        for &(m, n) in t.a.keys() {
            assert!(t.a(n, m).is_some(), "pair ({m},{n}) listed one way only");
        }
    }
}
