//! Automatic original-UNIFAC subgroup assignment from a molecule read from SMILES.
//!
//! Every heavy atom goes to exactly one subgroup. Whole molecules that are
//! their own subgroup (water, methanol, formic acid, CS2, DMSO, DMF, NMP,
//! furfural, ethylene glycol, acrylonitrile, morpholine) are recognised by
//! structure. Simple (not fused) pyridine and thiophene rings are one subgroup
//! each, named by the hydrogens left on the ring. Then multi-atom functional subgroups take their atoms (acid,
//! ester, aldehyde, ketone, nitrile, nitro, amines, alcohol, ether, thiol and
//! sulfide, halogens), each taking the neighbouring alkyl carbon the published
//! subgroup includes (CH3 before CH2 before CH), then aromatic carbons (ACH,
//! ACCH3/ACCH2/ACCH, AC), double and triple bonds, and the remaining sp3
//! carbons. An atom left over is an error naming it; there is no fallback.
//!
//! Reference: the subgroup definitions of A. Fredenslund, R. L. Jones,
//! J. M. Prausnitz, AIChE J. 21 (1975) 1086 and Hansen et al., Ind. Eng.
//! Chem. Res. 30 (1991) 2352 (e.g. acetone = CH3 + CH3CO, ethyl acetate =
//! CH3COO + CH2 + CH3, toluene = 5 ACH + ACCH3).

use super::unifac_table::unifac_table;
use super::MixtureError;
use crate::molecule::{parse_smiles, BondOrder, Element, Molecule};
use std::collections::BTreeMap;
use std::sync::OnceLock;

/// Subgroup number → count.
pub type SubgroupCounts = BTreeMap<u16, u32>;

/// Molecules that are a subgroup of their own, by published subgroup name.
const WHOLE: &[(&str, &str)] = &[
    ("O", "H2O"),
    ("CO", "CH3OH"),
    ("OC=O", "HCOOH"),
    ("S=C=S", "CS2"),
    ("CS(C)=O", "DMSO"),
    ("CN(C)C=O", "DMF"),
    ("CN1CCCC1=O", "NMP"),
    ("O=Cc1ccco1", "FURFURAL"),
    ("OCCO", "DOH"),
    ("C=CC#N", "ACRY"),
    ("C1COCCN1", "MORPH"),
];

fn whole_keys() -> &'static [(String, u16)] {
    static K: OnceLock<Vec<(String, u16)>> = OnceLock::new();
    K.get_or_init(|| {
        let t = unifac_table();
        WHOLE
            .iter()
            .filter_map(|(s, name)| {
                let key = parse_smiles(s).ok()?.structure_key();
                Some((key, t.by_name(name)?.id))
            })
            .collect()
    })
}

/// The subgroup counts of `m`.
///
/// ```
/// use ebullio::molecule::parse_smiles;
/// use ebullio::mixture::{assign_subgroups, subgroup_names};
/// let g = assign_subgroups(&parse_smiles("CCOC(C)=O").unwrap()).unwrap();
/// assert_eq!(subgroup_names(&g), "CH3COO 1, CH3 1, CH2 1");
/// ```
pub fn assign_subgroups(m: &Molecule) -> Result<SubgroupCounts, MixtureError> {
    let t = unifac_table();
    let smiles = m.smiles().to_string();
    let err = |i: usize, reason: &str| {
        let a = &m.atoms()[i];
        MixtureError::UnassignedAtom {
            smiles: smiles.clone(),
            atom: a.element.symbol().to_string(),
            position: a.position,
            reason: reason.to_string(),
        }
    };
    let heavy: Vec<usize> = (0..m.atoms().len()).filter(|&i| m.is_heavy(i)).collect();
    if heavy.is_empty() {
        return Err(MixtureError::Smiles {
            smiles,
            message: "no heavy atom".into(),
        });
    }
    if m.components() > 1 {
        return Err(err(
            heavy[0],
            "more than one molecule in the SMILES; give each component separately",
        ));
    }
    let mut out = SubgroupCounts::new();
    let key = m.structure_key();
    if let Some((_, id)) = whole_keys().iter().find(|(k, _)| *k == key) {
        out.insert(*id, 1);
        return Ok(out);
    }
    let id = |name: &str| t.by_name(name).map(|s| s.id).unwrap_or(0);
    let mut a = Assigner {
        m,
        used: vec![false; m.atoms().len()],
        out,
    };
    // Nitro charges are part of the pattern; any other charge is refused.
    for &i in &heavy {
        if m.atoms()[i].charge != 0 && !a.is_nitro_atom(i) {
            return Err(err(
                i,
                "charged atom: electrolytes and salts are outside UNIFAC",
            ));
        }
    }
    a.hetero_rings(&id);
    a.functional(&id).map_err(|(i, r)| err(i, r))?;
    a.aromatic_carbons(&id);
    a.multiple_bonds(&id).map_err(|(i, r)| err(i, r))?;
    a.sp3_carbons(&id).map_err(|(i, r)| err(i, r))?;
    // Name a hetero atom first when one is left: it is usually the cause.
    let left = heavy
        .iter()
        .find(|&&i| !a.used[i] && m.atoms()[i].element != Element::C)
        .or_else(|| heavy.iter().find(|&&i| !a.used[i]));
    if let Some(&i) = left {
        let reason = match m.atoms()[i].element {
            Element::N if m.atoms()[i].aromatic => {
                "aromatic nitrogen other than in a simple pyridine ring is not covered"
            }
            Element::N => {
                "nitrogen in an environment with no original-UNIFAC subgroup (amide, imine, …)"
            }
            Element::O => "oxygen in an environment with no original-UNIFAC subgroup",
            Element::S => "sulfur in an environment with no original-UNIFAC subgroup",
            Element::C => "carbon in an environment with no original-UNIFAC subgroup",
            _ => "element not covered by the original-UNIFAC subgroups handled here",
        };
        return Err(err(i, reason));
    }
    Ok(a.out)
}

/// `"CH3COO 1, CH3 1, CH2 1"`: subgroup names with counts, in subgroup-number order.
pub fn subgroup_names(g: &SubgroupCounts) -> String {
    let t = unifac_table();
    let mut v: Vec<(u16, u32)> = g.iter().map(|(&k, &v)| (k, v)).collect();
    // Functional groups are easier to read first; keep the table order otherwise.
    v.sort_by_key(|&(k, _)| (k <= 4, k));
    v.iter()
        .map(|&(k, n)| format!("{} {}", t.subgroup(k).map_or("?", |s| s.name), n))
        .collect::<Vec<_>>()
        .join(", ")
}

struct Assigner<'a> {
    m: &'a Molecule,
    used: Vec<bool>,
    out: SubgroupCounts,
}

type Refusal = (usize, &'static str);

impl Assigner<'_> {
    fn el(&self, i: usize) -> Element {
        self.m.atoms()[i].element
    }
    fn h(&self, i: usize) -> u32 {
        self.m.total_hydrogens(i)
    }
    fn heavy_nb(&self, i: usize) -> Vec<(usize, BondOrder)> {
        self.m
            .neighbours(i)
            .iter()
            .filter(|&&(j, _)| self.m.is_heavy(j))
            .map(|&(j, k)| (j, self.m.bonds()[k].order))
            .collect()
    }
    fn add(&mut self, id: u16, atoms: &[usize]) {
        for &i in atoms {
            // Every pass checks `used` before taking an atom: each is taken once.
            debug_assert!(!self.used[i], "atom {i} assigned twice");
            self.used[i] = true;
        }
        *self.out.entry(id).or_insert(0) += 1;
    }
    /// A non-aromatic carbon with single bonds only.
    fn sp3_c(&self, i: usize) -> bool {
        self.el(i) == Element::C
            && !self.m.atoms()[i].aromatic
            && self
                .heavy_nb(i)
                .iter()
                .all(|&(_, o)| o == BondOrder::Single)
    }
    /// Terminal O double-bonded to `i`.
    fn carbonyl_o(&self, i: usize) -> Option<usize> {
        self.heavy_nb(i).into_iter().find_map(|(j, o)| {
            (o == BondOrder::Double && self.el(j) == Element::O && self.m.heavy_degree(j) == 1)
                .then_some(j)
        })
    }
    fn is_nitro_atom(&self, i: usize) -> bool {
        let n = if self.el(i) == Element::N {
            i
        } else if let Some(&(j, _)) = self.heavy_nb(i).first() {
            j
        } else {
            return false;
        };
        self.el(n) == Element::N
            && self
                .heavy_nb(n)
                .iter()
                .filter(|&&(j, _)| self.el(j) == Element::O && self.m.heavy_degree(j) == 1)
                .count()
                == 2
    }
    /// The unused sp3 carbon neighbour of `i` (other than `skip`) with the most
    /// hydrogens, among those with at least `min_h`.
    fn alpha(&self, i: usize, skip: &[usize], min_h: u32) -> Option<usize> {
        self.heavy_nb(i)
            .into_iter()
            .filter(|&(j, o)| {
                o == BondOrder::Single
                    && !skip.contains(&j)
                    && !self.used[j]
                    && self.sp3_c(j)
                    && self.h(j) >= min_h
                    && self.h(j) <= 3
            })
            .max_by_key(|&(j, _)| (self.h(j), std::cmp::Reverse(j)))
            .map(|(j, _)| j)
    }

    fn functional(&mut self, id: &dyn Fn(&str) -> u16) -> Result<(), Refusal> {
        let n = self.m.atoms().len();
        // Carbonyl compounds: acid, ester, aldehyde, ketone.
        for c in 0..n {
            if self.used[c] || self.el(c) != Element::C || self.m.atoms()[c].aromatic {
                continue;
            }
            let Some(o1) = self.carbonyl_o(c) else {
                continue;
            };
            let nb = self.heavy_nb(c);
            let single_o: Vec<usize> = nb
                .iter()
                .filter(|&&(j, o)| o == BondOrder::Single && self.el(j) == Element::O)
                .map(|&(j, _)| j)
                .collect();
            let others: Vec<usize> = nb
                .iter()
                .filter(|&&(j, _)| j != o1 && !single_o.contains(&j))
                .map(|&(j, _)| j)
                .collect();
            if others.iter().any(|&j| self.el(j) == Element::N) {
                return Err((
                    c,
                    "amide or carbamate carbonyl: no original-UNIFAC subgroup handled here",
                ));
            }
            if single_o.len() > 1 {
                return Err((
                    c,
                    "carbonate or similar: no original-UNIFAC subgroup handled here",
                ));
            }
            if let Some(&o2) = single_o.first() {
                if self.h(o2) == 1 {
                    self.add(id("COOH"), &[c, o1, o2]);
                    continue;
                }
                if self.m.heavy_degree(o2) != 2 {
                    return Err((o2, "ester oxygen with an unexpected neighbour"));
                }
                if self.h(c) == 1 {
                    self.add(id("HCOO"), &[c, o1, o2]);
                } else if let Some(al) = self.alpha(c, &[o2], 2) {
                    let g = if self.h(al) == 3 { "CH3COO" } else { "CH2COO" };
                    self.add(id(g), &[al, c, o1, o2]);
                } else {
                    self.add(id("COO"), &[c, o1, o2]);
                }
                continue;
            }
            if others.iter().any(|&j| self.el(j) != Element::C) {
                return Err((c, "carbonyl bonded to an atom other than carbon"));
            }
            match (self.h(c), others.len()) {
                (1, 1) => self.add(id("HCO"), &[c, o1]),
                (0, 2) => {
                    let Some(al) = self.alpha(c, &[], 2) else {
                        return Err((c, "ketone with no CH3 or CH2 beside it: original UNIFAC has no subgroup for it"));
                    };
                    let g = if self.h(al) == 3 { "CH3CO" } else { "CH2CO" };
                    self.add(id(g), &[al, c, o1]);
                }
                _ => return Err((c, "carbonyl not in an acid, ester, aldehyde or ketone")),
            }
        }
        // Nitriles.
        for c in 0..n {
            if self.used[c] || self.el(c) != Element::C {
                continue;
            }
            let nb = self.heavy_nb(c);
            let Some(&(nn, _)) = nb
                .iter()
                .find(|&&(j, o)| o == BondOrder::Triple && self.el(j) == Element::N)
            else {
                continue;
            };
            let Some(al) = self.alpha(c, &[], 2) else {
                return Err((
                    c,
                    "nitrile with no CH3 or CH2 beside it: original UNIFAC has no subgroup for it",
                ));
            };
            let g = if self.h(al) == 3 { "CH3CN" } else { "CH2CN" };
            self.add(id(g), &[al, c, nn]);
        }
        // Nitro groups.
        for nn in 0..n {
            if self.used[nn] || self.el(nn) != Element::N || !self.is_nitro_atom(nn) {
                continue;
            }
            let nb = self.heavy_nb(nn);
            let os: Vec<usize> = nb
                .iter()
                .filter(|&&(j, _)| self.el(j) == Element::O)
                .map(|&(j, _)| j)
                .collect();
            let Some(&(c, _)) = nb.iter().find(|&&(j, _)| self.el(j) == Element::C) else {
                return Err((nn, "nitro group not on carbon"));
            };
            let g = if self.m.atoms()[c].aromatic {
                "ACNO2"
            } else if self.sp3_c(c) && (1..=3).contains(&self.h(c)) {
                ["", "CHNO2", "CH2NO2", "CH3NO2"][self.h(c) as usize]
            } else {
                return Err((
                    nn,
                    "nitro group on a carbon with no original-UNIFAC subgroup",
                ));
            };
            let mut atoms = vec![c, nn];
            atoms.extend(os);
            self.add(id(g), &atoms);
        }
        // Amines (not aromatic N, not amides: those are refused above or left over).
        for nn in 0..n {
            if self.used[nn] || self.el(nn) != Element::N || self.m.atoms()[nn].aromatic {
                continue;
            }
            let nb = self.heavy_nb(nn);
            if nb
                .iter()
                .any(|&(j, o)| o != BondOrder::Single || self.el(j) != Element::C)
            {
                continue;
            }
            match (self.h(nn), nb.len()) {
                (2, 1) => {
                    let c = nb[0].0;
                    if self.m.atoms()[c].aromatic {
                        self.add(id("ACNH2"), &[c, nn]);
                    } else if let Some(al) = self.alpha(nn, &[], 1) {
                        let g = ["", "CHNH2", "CH2NH2", "CH3NH2"][self.h(al) as usize];
                        self.add(id(g), &[al, nn]);
                    }
                }
                (1, 2) => {
                    if let Some(al) = self.alpha(nn, &[], 1) {
                        let g = ["", "CHNH", "CH2NH", "CH3NH"][self.h(al) as usize];
                        self.add(id(g), &[al, nn]);
                    }
                }
                (0, 3) => {
                    if let Some(al) = self.alpha(nn, &[], 2) {
                        let g = if self.h(al) == 3 { "CH3N" } else { "CH2N" };
                        self.add(id(g), &[al, nn]);
                    }
                }
                _ => {}
            }
        }
        // Oxygen: alcohols, phenols, ethers.
        for o in 0..n {
            if self.used[o] || self.el(o) != Element::O {
                continue;
            }
            let nb = self.heavy_nb(o);
            if nb.iter().any(|&(j, b)| {
                b != BondOrder::Single && !(b == BondOrder::Aromatic && self.el(j) == Element::C)
            }) {
                continue;
            }
            if self.h(o) == 1 && nb.len() == 1 && self.el(nb[0].0) == Element::C {
                let c = nb[0].0;
                if self.m.atoms()[c].aromatic {
                    self.add(id("ACOH"), &[c, o]);
                } else {
                    self.add(id("OH"), &[o]);
                }
            } else if self.h(o) == 0
                && nb.len() == 2
                && nb.iter().all(|&(j, _)| self.el(j) == Element::C)
                && !self.m.atoms()[o].aromatic
            {
                let Some(al) = self.alpha(o, &[], 1) else {
                    return Err((o, "ether with no CH3, CH2 or CH beside it: original UNIFAC has no subgroup for it"));
                };
                let g = match self.h(al) {
                    3 => "CH3O",
                    2 if self.m.atoms()[o].in_ring && self.m.atoms()[al].in_ring => "THF",
                    2 => "CH2O",
                    _ => "CHO",
                };
                self.add(id(g), &[al, o]);
            }
        }
        // Sulfur: thiols and sulfides.
        for s in 0..n {
            if self.used[s] || self.el(s) != Element::S || self.m.atoms()[s].aromatic {
                continue;
            }
            let nb = self.heavy_nb(s);
            if nb
                .iter()
                .any(|&(j, o)| o != BondOrder::Single || self.el(j) != Element::C)
            {
                continue;
            }
            match (self.h(s), nb.len()) {
                (1, 1) => {
                    if let Some(al) = self.alpha(s, &[], 2) {
                        let g = if self.h(al) == 3 { "CH3SH" } else { "CH2SH" };
                        self.add(id(g), &[al, s]);
                    }
                }
                (0, 2) => {
                    if let Some(al) = self.alpha(s, &[], 1) {
                        let g = ["", "CHS", "CH2S", "CH3S"][self.h(al) as usize];
                        self.add(id(g), &[al, s]);
                    }
                }
                _ => {}
            }
        }
        self.halogens(id)
    }

    fn halogens(&mut self, id: &dyn Fn(&str) -> u16) -> Result<(), Refusal> {
        let n = self.m.atoms().len();
        for c in 0..n {
            if self.used[c] || self.el(c) != Element::C {
                continue;
            }
            let nb = self.heavy_nb(c);
            let cl: Vec<usize> = nb
                .iter()
                .filter(|&&(j, _)| self.el(j) == Element::CL)
                .map(|&(j, _)| j)
                .collect();
            let f: Vec<usize> = nb
                .iter()
                .filter(|&&(j, _)| self.el(j) == Element::F)
                .map(|&(j, _)| j)
                .collect();
            if cl.is_empty() && f.is_empty() {
                continue;
            }
            if !cl.is_empty() && !f.is_empty() {
                return Err((
                    c,
                    "carbon with both Cl and F: the chlorofluoro subgroups are not handled here",
                ));
            }
            let aromatic = self.m.atoms()[c].aromatic;
            if aromatic {
                let g = if cl.is_empty() { "ACF" } else { "ACCL" };
                let x = if cl.is_empty() { f[0] } else { cl[0] };
                self.add(id(g), &[c, x]);
                continue;
            }
            if !self.sp3_c(c) {
                // Cl on a double-bonded carbon is its own subgroup; the carbon stays for C=C.
                if f.is_empty() {
                    for &x in &cl {
                        self.add(id("CL-(C=C)"), &[x]);
                    }
                    continue;
                }
                return Err((
                    f[0],
                    "fluorine on a double-bonded carbon: no original-UNIFAC subgroup",
                ));
            }
            let h = self.h(c);
            let g =
                if f.is_empty() {
                    match (cl.len(), h) {
                        (1, 2) => "CH2CL",
                        (1, 1) => "CHCL",
                        (1, 0) => "CCL",
                        (2, 2) => "CH2CL2",
                        (2, 1) => "CHCL2",
                        (2, 0) => "CCL2",
                        (3, 1) => "CHCL3",
                        (3, 0) => "CCL3",
                        (4, 0) => "CCL4",
                        _ => return Err((
                            cl[0],
                            "chlorine on a carbon with no original-UNIFAC subgroup (e.g. CH3Cl)",
                        )),
                    }
                } else {
                    match (f.len(), h) {
                    (3, 0) => "CF3",
                    (2, 0) => "CF2",
                    (1, 0) => "CF",
                    _ => return Err((
                        f[0],
                        "fluorine on a carbon that carries hydrogen: no original-UNIFAC subgroup",
                    )),
                }
                };
            let mut atoms = vec![c];
            atoms.extend(cl);
            atoms.extend(f);
            self.add(id(g), &atoms);
        }
        for x in 0..n {
            if self.used[x] {
                continue;
            }
            match self.el(x) {
                Element::BR if self.m.heavy_degree(x) == 1 => self.add(id("BR"), &[x]),
                Element::I if self.m.heavy_degree(x) == 1 => self.add(id("I"), &[x]),
                _ => {}
            }
        }
        Ok(())
    }

    /// Pyridine (aromatic N in a six-ring of five carbons) and thiophene
    /// (aromatic S in a five-ring of four carbons), not fused: the ring is one
    /// subgroup named by the hydrogens left on its carbons (C5H4N = one
    /// substituent); substituents are assigned by the later passes.
    fn hetero_rings(&mut self, id: &dyn Fn(&str) -> u16) {
        let n = self.m.atoms().len();
        for h in 0..n {
            let (size, names): (usize, [&str; 3]) = match self.el(h) {
                Element::N => (6, ["C5H5N", "C5H4N", "C5H3N"]),
                Element::S => (5, ["C4H4S", "C4H3S", "C4H2S"]),
                _ => continue,
            };
            if self.used[h] || !self.m.atoms()[h].aromatic || self.h(h) != 0 {
                continue;
            }
            let Some(ring) = self.simple_aromatic_ring(h, size) else {
                continue;
            };
            let hydrogens: u32 = ring[1..].iter().map(|&c| self.h(c)).sum();
            let full = (size - 1) as u32;
            let k = full.saturating_sub(hydrogens) as usize;
            if hydrogens > full || k > 2 {
                continue;
            }
            self.add(id(names[k]), &ring);
        }
    }

    /// The ring `[h, c1, …]` of `size` atoms through `h` whose other atoms are
    /// aromatic carbons each with exactly two aromatic ring neighbours (no fusion).
    fn simple_aromatic_ring(&self, h: usize, size: usize) -> Option<Vec<usize>> {
        let arom = |i: usize| -> Vec<usize> {
            self.heavy_nb(i)
                .into_iter()
                .filter(|&(j, o)| o == BondOrder::Aromatic && self.m.atoms()[j].aromatic)
                .map(|(j, _)| j)
                .collect()
        };
        let start = arom(h);
        if start.len() != 2 {
            return None;
        }
        let mut ring = vec![h, start[0]];
        while ring.len() < size {
            let cur = ring[ring.len() - 1];
            let prev = ring[ring.len() - 2];
            let nb = arom(cur);
            if self.el(cur) != Element::C || nb.len() != 2 || self.used[cur] {
                return None;
            }
            ring.push(*nb.iter().find(|&&j| j != prev)?);
        }
        let last = ring[size - 1];
        let closes = self.el(last) == Element::C
            && !self.used[last]
            && arom(last).len() == 2
            && arom(last).contains(&h)
            && ring.iter().filter(|&&a| a == h).count() == 1;
        closes.then_some(ring)
    }

    fn aromatic_carbons(&mut self, id: &dyn Fn(&str) -> u16) {
        let n = self.m.atoms().len();
        for c in 0..n {
            if self.used[c] || self.el(c) != Element::C || !self.m.atoms()[c].aromatic {
                continue;
            }
            // Aromatic rings holding anything but carbon are left to the leftover check.
            let hetero_ring = self
                .heavy_nb(c)
                .iter()
                .any(|&(j, o)| o == BondOrder::Aromatic && self.el(j) != Element::C);
            if hetero_ring {
                continue;
            }
            if self.h(c) == 1 {
                self.add(id("ACH"), &[c]);
            } else if let Some(al) = self.alpha(c, &[], 1) {
                let g = ["", "ACCH", "ACCH2", "ACCH3"][self.h(al) as usize];
                self.add(id(g), &[c, al]);
            } else {
                self.add(id("AC"), &[c]);
            }
        }
    }

    fn multiple_bonds(&mut self, id: &dyn Fn(&str) -> u16) -> Result<(), Refusal> {
        let bonds: Vec<(usize, usize, BondOrder)> =
            self.m.bonds().iter().map(|b| (b.a, b.b, b.order)).collect();
        for (a, b, order) in bonds {
            if self.el(a) != Element::C || self.el(b) != Element::C || self.used[a] || self.used[b]
            {
                continue;
            }
            let (ha, hb) = (self.h(a), self.h(b));
            let (hi, lo) = (ha.max(hb), ha.min(hb));
            let g = match order {
                BondOrder::Double => match (hi, lo) {
                    (2, 1) => "CH2=CH",
                    (1, 1) => "CH=CH",
                    (2, 0) => "CH2=C",
                    (1, 0) => "CH=C",
                    (0, 0) => "C=C",
                    _ => return Err((a, "C=C with no original-UNIFAC subgroup (e.g. ethylene)")),
                },
                BondOrder::Triple => match (hi, lo) {
                    (1, 0) => "CH=-C",
                    (0, 0) => "C=-C",
                    _ => return Err((a, "C≡C with no original-UNIFAC subgroup (e.g. acetylene)")),
                },
                _ => continue,
            };
            self.add(id(g), &[a, b]);
        }
        Ok(())
    }

    fn sp3_carbons(&mut self, id: &dyn Fn(&str) -> u16) -> Result<(), Refusal> {
        for c in 0..self.m.atoms().len() {
            if self.used[c] || !self.sp3_c(c) {
                continue;
            }
            let g = match self.h(c) {
                3 => "CH3",
                2 => "CH2",
                1 => "CH",
                0 => "C",
                _ => return Err((c, "methane has no original-UNIFAC subgroup")),
            };
            self.add(id(g), &[c]);
        }
        Ok(())
    }
}
