//! Every term an estimate counts (the 41 Joback groups, this project's three new groups and
//! its second-order corrections) by a fixed index, so the per-structure path counts in a
//! fixed array and looks contributions up by index instead of building maps keyed by text.
//!
//! [`GroupCounts`] (a map by id) stays the public view; [`TermCounts::to_map`] gives it.
//! Where sums run over the terms they run in the map's order (ids alphabetically,
//! [`SORTED`]), so every floating-point sum is added in the same order as over the map.

use super::groups::GroupCounts;

/// Number of published Joback groups (the first indices, in the table's order).
pub const N_JOBACK: usize = 41;
/// Number of terms.
pub const N_TERMS: usize = 58;

/// Every term id: the Joback groups in `reference-data/joback-groups.csv` order, then
/// [`super::tb_features::NEW_GROUPS`], then [`super::tb_features::CORRECTIONS`].
pub const IDS: [&str; N_TERMS] = join(
    &JOBACK_IDS,
    &super::tb_features::NEW_GROUPS,
    &super::tb_features::CORRECTIONS,
);

/// The published Joback groups, in `reference-data/joback-groups.csv` order.
const JOBACK_IDS: [&str; N_JOBACK] = [
    "ch3",
    "ch2_chain",
    "ch_chain",
    "c_chain",
    "eq_ch2",
    "eq_ch_chain",
    "eq_c_chain",
    "eq_c_eq",
    "tr_ch",
    "tr_c",
    "ch2_ring",
    "ch_ring",
    "c_ring",
    "eq_ch_ring",
    "eq_c_ring",
    "f",
    "cl",
    "br",
    "i",
    "oh_alcohol",
    "oh_phenol",
    "o_chain",
    "o_ring",
    "co_chain",
    "co_ring",
    "cho",
    "cooh",
    "coo",
    "eq_o",
    "nh2",
    "nh_chain",
    "nh_ring",
    "n_chain",
    "eq_n_chain",
    "eq_n_ring",
    "eq_nh",
    "cn",
    "no2",
    "sh",
    "s_chain",
    "s_ring",
];

const _: () = assert!(
    N_JOBACK + super::tb_features::NEW_GROUPS.len() + super::tb_features::CORRECTIONS.len()
        == N_TERMS
);

/// The three id lists end to end (each id is written once, where its kind is defined).
const fn join(
    a: &[&'static str],
    b: &[&'static str],
    c: &[&'static str],
) -> [&'static str; N_TERMS] {
    let mut out = [""; N_TERMS];
    let mut n = 0;
    let mut i = 0;
    while i < a.len() {
        out[n] = a[i];
        (n, i) = (n + 1, i + 1);
    }
    let mut i = 0;
    while i < b.len() {
        out[n] = b[i];
        (n, i) = (n + 1, i + 1);
    }
    let mut i = 0;
    while i < c.len() {
        out[n] = c[i];
        (n, i) = (n + 1, i + 1);
    }
    out
}

/// First index of the corrections.
pub const FIRST_CORRECTION: usize = N_JOBACK + 3;

/// The index of `id` (a compile-time constant where `id` is one: `const { idx("ch3") }`).
pub const fn idx(id: &str) -> usize {
    let mut i = 0;
    while i < N_TERMS {
        if bytes_eq(IDS[i].as_bytes(), id.as_bytes()) {
            return i;
        }
        i += 1;
    }
    panic!("not a term id")
}

/// The index of a term id known at compile time: `t!("ch3")`.
macro_rules! t {
    ($id:literal) => {
        const { $crate::estimate::terms::idx($id) }
    };
}
pub(crate) use t;

/// The index of `id`, if it is a term.
pub fn index(id: &str) -> Option<usize> {
    IDS.iter().position(|t| *t == id)
}

const fn bytes_eq(a: &[u8], b: &[u8]) -> bool {
    if a.len() != b.len() {
        return false;
    }
    let mut i = 0;
    while i < a.len() {
        if a[i] != b[i] {
            return false;
        }
        i += 1;
    }
    true
}

/// Byte order of two ids (the order of `String` keys in a map).
const fn bytes_less(a: &[u8], b: &[u8]) -> bool {
    let mut i = 0;
    while i < a.len() && i < b.len() {
        if a[i] != b[i] {
            return a[i] < b[i];
        }
        i += 1;
    }
    a.len() < b.len()
}

/// Term indices in the order of their ids (the order a [`GroupCounts`] map iterates in).
pub const SORTED: [u8; N_TERMS] = {
    let mut order = [0u8; N_TERMS];
    let mut i = 0;
    while i < N_TERMS {
        order[i] = i as u8;
        i += 1;
    }
    // insertion sort, at compile time
    let mut i = 1;
    while i < N_TERMS {
        let mut j = i;
        while j > 0
            && bytes_less(
                IDS[order[j] as usize].as_bytes(),
                IDS[order[j - 1] as usize].as_bytes(),
            )
        {
            let t = order[j];
            order[j] = order[j - 1];
            order[j - 1] = t;
            j -= 1;
        }
        i += 1;
    }
    order
};

/// Whether term `i` is a second-order correction.
pub fn is_correction(i: usize) -> bool {
    i >= FIRST_CORRECTION
}

/// Whether term `i` is one of this project's new first-order groups.
pub fn is_new_group(i: usize) -> bool {
    (N_JOBACK..FIRST_CORRECTION).contains(&i)
}

/// The published group whose contributions stand in for term `i` (itself for a Joback
/// group), as [`super::tb_features::nearest_published`].
pub fn nearest_published(i: usize) -> usize {
    const N_CHAIN: usize = idx("n_chain");
    const EQ_O: usize = idx("eq_o");
    const N_RING_TERT: usize = idx("n_ring_tert");
    const N_AROM_SUB: usize = idx("n_arom_sub");
    const S_OXO: usize = idx("s_oxo");
    match i {
        N_RING_TERT | N_AROM_SUB => N_CHAIN,
        S_OXO => EQ_O,
        other => other,
    }
}

/// Occurrences of each term, by index.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct TermCounts(pub [u32; N_TERMS]);

impl Default for TermCounts {
    fn default() -> Self {
        TermCounts([0; N_TERMS])
    }
}

impl TermCounts {
    /// No terms.
    pub fn new() -> Self {
        Self::default()
    }

    /// One more of term `i`.
    pub fn add(&mut self, i: usize) {
        self.0[i] += 1;
    }

    /// Count of term `i`.
    pub fn get(&self, i: usize) -> u32 {
        self.0[i]
    }

    /// No term present.
    pub fn is_empty(&self) -> bool {
        self.0.iter().all(|&n| n == 0)
    }

    /// The terms present as (index, count), ids in alphabetical order (a map's order).
    pub fn iter_sorted(&self) -> impl Iterator<Item = (usize, u32)> + '_ {
        SORTED
            .iter()
            .map(|&i| (i as usize, self.0[i as usize]))
            .filter(|&(_, n)| n > 0)
    }

    /// The terms present, in [`SORTED`] order, listed once for several passes.
    pub fn present(&self) -> Present {
        let mut p = Present {
            idx: [0; N_TERMS],
            n: [0; N_TERMS],
            len: 0,
        };
        for (i, n) in self.iter_sorted() {
            p.idx[p.len] = i as u8;
            p.n[p.len] = n;
            p.len += 1;
        }
        p
    }

    /// Bit set of the new groups present.
    pub fn new_groups(&self) -> u64 {
        (N_JOBACK..FIRST_CORRECTION)
            .filter(|&i| self.0[i] > 0)
            .fold(0, |m, i| m | 1 << i)
    }

    /// The map view: id → count for every term present.
    pub fn to_map(&self) -> GroupCounts {
        self.iter_sorted()
            .map(|(i, n)| (IDS[i].to_string(), n))
            .collect()
    }

    /// Counts from a map; `Err(id)` for an id that is not a term.
    pub fn from_map(g: &GroupCounts) -> Result<TermCounts, String> {
        let mut c = TermCounts::new();
        for (id, &n) in g {
            let i = index(id).ok_or_else(|| id.clone())?;
            c.0[i] += n;
        }
        Ok(c)
    }

    /// The counts with the new groups as their nearest published group and the corrections
    /// dropped (the published-group view, as [`super::tb_model::terms_for`] maps them).
    pub fn published(&self) -> TermCounts {
        let mut out = TermCounts::new();
        for (i, &n) in self.0[..FIRST_CORRECTION].iter().enumerate() {
            out.0[nearest_published(i)] += n;
        }
        out
    }
}

/// The terms present with their counts, ids in alphabetical order ([`TermCounts::present`]).
#[derive(Debug, Clone, Copy)]
pub struct Present {
    idx: [u8; N_TERMS],
    n: [u32; N_TERMS],
    len: usize,
}

impl Present {
    /// (index, count) of each term present, ids in alphabetical order.
    pub fn iter(&self) -> impl Iterator<Item = (usize, u32)> + '_ {
        self.idx[..self.len]
            .iter()
            .zip(&self.n[..self.len])
            .map(|(&i, &n)| (i as usize, n))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ids_match_the_group_table_and_the_feature_lists() {
        let table: Vec<&str> = super::super::table()
            .iter()
            .map(|g| g.id.as_str())
            .collect();
        assert_eq!(&IDS[..N_JOBACK], table.as_slice());
        assert_eq!(
            &IDS[N_JOBACK..FIRST_CORRECTION],
            &super::super::tb_features::NEW_GROUPS
        );
        assert_eq!(
            &IDS[FIRST_CORRECTION..],
            &super::super::tb_features::CORRECTIONS
        );
    }

    #[test]
    fn sorted_is_the_order_of_a_map_of_ids() {
        let mut ids: Vec<&str> = IDS.to_vec();
        ids.sort();
        let sorted: Vec<&str> = SORTED.iter().map(|&i| IDS[i as usize]).collect();
        assert_eq!(sorted, ids);
    }

    #[test]
    fn map_view_round_trips_and_published_merges_new_groups() {
        let mut c = TermCounts::new();
        c.add(idx("n_ring_tert"));
        c.add(idx("n_chain"));
        c.add(idx("s_oxo"));
        c.add(idx("amide_ring"));
        let m = c.to_map();
        assert_eq!(
            m.keys().collect::<Vec<_>>(),
            ["amide_ring", "n_chain", "n_ring_tert", "s_oxo"]
        );
        assert_eq!(TermCounts::from_map(&m), Ok(c));
        let p = c.published().to_map();
        assert_eq!(
            p.into_iter().collect::<Vec<_>>(),
            [("eq_o".to_string(), 1), ("n_chain".to_string(), 2)]
        );
        assert_eq!(
            TermCounts::from_map(&[("x".to_string(), 1)].into()),
            Err("x".to_string())
        );
    }
}
