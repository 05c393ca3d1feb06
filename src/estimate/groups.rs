//! The 41 Joback groups: the embedded table and the assignment of atoms to groups.
//!
//! Every heavy atom goes to exactly one group. Multi-atom groups are taken
//! first (nitro, nitrile, carboxylic acid, ester, aldehyde, ketone), then
//! single atoms by element, hydrogens, bond types and ring membership.
//! Aromatic atoms count as double-bonded ring atoms (Joback does not separate
//! aromatic from other rings); an OH on an aromatic carbon is a phenol OH.
//!
//! Reference: K. G. Joback, R. C. Reid, Chem. Eng. Commun. 57 (1987) 233–243,
//! group table as compiled in `reference-data/joback-groups.csv` (see
//! `reference-data/JOBACK.md` for what is confirmed and what is from memory).

use super::terms::{t, TermCounts};
use super::EstimateError;
use crate::molecule::{BondOrder, Element, Molecule};
use std::collections::BTreeMap;
use std::sync::OnceLock;

/// Group id (from the table) → number of occurrences.
pub type GroupCounts = BTreeMap<String, u32>;

/// One row of the Joback table: contributions, `None` where none is published.
#[derive(Debug, Clone, PartialEq)]
pub struct Group {
    /// Short id used in `--groups` and output (`ch3`, `ch2_ring`, …).
    pub id: String,
    /// Written formula as published (`-CH3`, `>C=O (ring)`).
    pub name: String,
    /// Counted only for ring atoms.
    pub ring: bool,
    /// ΔTc (dimensionless).
    pub tc: Option<f64>,
    /// ΔPc (bar^-1/2).
    pub pc: Option<f64>,
    /// ΔVc (cm³/mol).
    pub vc: Option<f64>,
    /// ΔTb (K).
    pub tb: Option<f64>,
    /// ΔTm (K).
    pub tm: Option<f64>,
    /// ΔHf° (kJ/mol).
    pub hform: Option<f64>,
    /// ΔGf° (kJ/mol).
    pub gform: Option<f64>,
    /// Cp terms a, b, c, d.
    pub cp: [Option<f64>; 4],
    /// ΔHfus (kJ/mol).
    pub hfus: Option<f64>,
    /// ΔHvap (kJ/mol).
    pub hvap: Option<f64>,
    /// Atoms in the group: (heavy atoms, hydrogens).
    pub atoms: (u32, u32),
}

const TABLE_CSV: &str = include_str!("../../reference-data/joback-groups.csv");

/// Heavy atoms and hydrogens of each group, from its written formula.
fn group_atoms(id: &str) -> (u32, u32) {
    match id {
        "ch3" => (1, 3),
        "ch2_chain" | "eq_ch2" | "ch2_ring" | "nh2" => (1, 2),
        "ch_chain" | "eq_ch_chain" | "tr_ch" | "ch_ring" | "eq_ch_ring" | "oh_alcohol"
        | "oh_phenol" | "nh_chain" | "nh_ring" | "eq_nh" | "sh" => (1, 1),
        "co_chain" | "co_ring" | "cn" => (2, 0),
        "cho" => (2, 1),
        "cooh" => (3, 1),
        "coo" | "no2" => (3, 0),
        _ => (1, 0),
    }
}

/// The embedded Joback table, parsed once.
pub fn table() -> &'static [Group] {
    static T: OnceLock<Vec<Group>> = OnceLock::new();
    T.get_or_init(|| {
        let mut rows = Vec::new();
        for line in TABLE_CSV.lines().skip(1) {
            let f: Vec<&str> = line.split(',').collect();
            if f.len() < 16 {
                continue;
            }
            let num = |i: usize| f.get(i).and_then(|s| s.trim().parse::<f64>().ok());
            rows.push(Group {
                id: f[0].to_string(),
                name: f[1].to_string(),
                ring: f[2] == "true",
                tc: num(3),
                pc: num(4),
                vc: num(5),
                tb: num(6),
                tm: num(7),
                hform: num(8),
                gform: num(9),
                cp: [num(10), num(11), num(12), num(13)],
                hfus: num(14),
                hvap: num(15),
                atoms: group_atoms(f[0]),
            });
        }
        rows
    })
}

/// The table row with this id.
pub fn group(id: &str) -> Option<&'static Group> {
    table().iter().find(|g| g.id == id)
}

/// Parse `"ch3=2,ch2_chain=3"` into group counts (ids checked against the table).
///
/// ```
/// let g = ebullio::estimate::parse_groups("ch3=2, co_chain=1").unwrap();
/// assert_eq!(g["ch3"], 2);
/// assert!(ebullio::estimate::parse_groups("ch9=1").is_err());
/// ```
pub fn parse_groups(s: &str) -> Result<GroupCounts, EstimateError> {
    let mut out = GroupCounts::new();
    for part in s.split(',').map(str::trim).filter(|p| !p.is_empty()) {
        let (id, n) = part.split_once('=').unwrap_or((part, "1"));
        let id = id.trim().to_ascii_lowercase();
        if group(&id).is_none() {
            return Err(EstimateError::UnknownGroup { id });
        }
        let n: u32 = n.trim().parse().map_err(|_| EstimateError::BadGroupCount {
            text: part.to_string(),
        })?;
        if n > 0 {
            *out.entry(id).or_insert(0) += n;
        }
    }
    if out.is_empty() {
        return Err(EstimateError::NoGroups);
    }
    Ok(out)
}

fn no_group(m: &Molecule, i: usize, reason: impl Into<String>) -> EstimateError {
    let a = &m.atoms()[i];
    EstimateError::NoGroup {
        atom: a.element.symbol().to_string(),
        position: a.position,
        reason: reason.into(),
    }
}

/// Assign every heavy atom of `m` to one Joback group.
///
/// ```
/// use ebullio::molecule::parse_smiles;
/// let g = ebullio::estimate::assign_groups(&parse_smiles("CC(C)=O").unwrap()).unwrap();
/// assert_eq!(g["ch3"], 2);
/// assert_eq!(g["co_chain"], 1);
/// ```
pub fn assign_groups(m: &Molecule) -> Result<GroupCounts, EstimateError> {
    assign(m, false)
}

/// Groups of this project's boiling-point model: the published Joback groups,
/// plus three first-order groups the published table lacks: `n_ring_tert`
/// (a ring >N- with three heavy neighbours, not aromatic), `n_arom_sub` (an
/// aromatic N with three heavy neighbours, as in N-methylpyrrole) and `s_oxo`
/// (each terminal =O on sulfur, so a sulfoxide is -S- + one `s_oxo` and a sulfone
/// -S- + two). Second-order corrections are added by [`super::tb_features`].
///
/// ```
/// use ebullio::molecule::parse_smiles;
/// let g = ebullio::estimate::assign_tb_groups(&parse_smiles("CS(C)=O").unwrap()).unwrap();
/// assert_eq!((g["ch3"], g["s_chain"], g["s_oxo"]), (2, 1, 1));
/// ```
pub fn assign_tb_groups(m: &Molecule) -> Result<GroupCounts, EstimateError> {
    assign(m, true)
}

fn assign(m: &Molecule, extended: bool) -> Result<GroupCounts, EstimateError> {
    let mut c = TermCounts::new();
    assign_counts(m, extended, &mut c)?;
    Ok(c.to_map())
}

/// Terminal oxygens double-bonded (or nitro O-) to atom `i` by a bond of `order`.
fn terminal_o(m: &Molecule, i: usize, order: BondOrder) -> impl Iterator<Item = usize> + '_ {
    m.neighbours(i)
        .iter()
        .filter(move |&&(j, k)| {
            m.atoms()[j].element == Element::O
                && m.bonds()[k].order == order
                && m.heavy_degree(j) == 1
                && m.total_hydrogens(j) == 0
        })
        .map(|&(j, _)| j)
}

/// How many items `it` has, and its first two (what collecting and indexing would give).
fn first_two(it: impl Iterator<Item = usize>) -> (usize, [usize; 2]) {
    let mut first = [usize::MAX; 2];
    let mut n = 0;
    for j in it {
        if n < 2 {
            first[n] = j;
        }
        n += 1;
    }
    (n, first)
}

/// Per-atom marks of the assignment, kept between molecules (only their storage).
#[derive(Default)]
struct Work {
    used: Vec<bool>,
    s_oxo: Vec<usize>,
    /// Per atom: double, triple (a quadruple counting two) and aromatic bonds to heavy atoms.
    orders: Vec<[i32; 3]>,
}

thread_local! {
    static WORK: std::cell::Cell<Work> = std::cell::Cell::new(Work::default());
}

/// [`assign_groups`] (`extended` false) or [`assign_tb_groups`] (true) into `out`, by index.
pub(crate) fn assign_counts(
    m: &Molecule,
    extended: bool,
    out: &mut TermCounts,
) -> Result<(), EstimateError> {
    let mut w = WORK.take();
    let done = assign_with(m, extended, out, &mut w);
    WORK.set(w);
    done
}

fn assign_with(
    m: &Molecule,
    extended: bool,
    out: &mut TermCounts,
    w: &mut Work,
) -> Result<(), EstimateError> {
    let atoms = m.atoms();
    let n = atoms.len();
    let used = &mut w.used;
    used.clear();
    used.resize(n, false);
    let mut add = |id: usize| out.add(id);
    let el = |i: usize| atoms[i].element;
    // every atom's bond orders to heavy atoms, from one pass over the bonds (the atom
    // passes below look at an atom's neighbours only when its orders allow a match)
    let orders = &mut w.orders;
    orders.clear();
    orders.resize(n, [0; 3]);
    for b in m.bonds() {
        let (slot, by) = match b.order {
            BondOrder::Single => continue,
            BondOrder::Double => (0, 1),
            BondOrder::Triple => (1, 1),
            BondOrder::Quadruple => (1, 2),
            BondOrder::Aromatic => (2, 1),
        };
        if el(b.b) != Element::H {
            orders[b.a][slot] += by;
        }
        if el(b.a) != Element::H {
            orders[b.b][slot] += by;
        }
    }
    let orders = &w.orders[..];
    // Charged atoms other than the nitro pattern are refused below.
    // 1. Nitro: N with two terminal O (N+ with =O and O-, or N(=O)=O).
    for i in 0..n {
        // a nitro N has three heavy neighbours (checked first: no other N is one)
        if el(i) != Element::N || used[i] || m.heavy_degree(i) != 3 || orders[i][0] == 0 {
            continue;
        }
        let (n_dbl, dbl) = first_two(terminal_o(m, i, BondOrder::Double));
        let (n_sgl, sgl) =
            first_two(terminal_o(m, i, BondOrder::Single).filter(|&j| atoms[j].charge == -1));
        let pair = if atoms[i].charge == 1 && n_dbl == 1 && n_sgl == 1 {
            Some((dbl[0], sgl[0]))
        } else if atoms[i].charge == 0 && n_dbl == 2 {
            Some((dbl[0], dbl[1]))
        } else {
            None
        };
        if let Some((o1, o2)) = pair {
            used[i] = true;
            used[o1] = true;
            used[o2] = true;
            add(t!("no2"));
        }
    }
    // 2. Nitrile: C#N with a terminal N.
    for i in 0..n {
        // a nitrile C has two heavy neighbours (checked once per atom, not per neighbour)
        if el(i) != Element::C || used[i] || m.heavy_degree(i) != 2 || orders[i][1] == 0 {
            continue;
        }
        for &(j, k) in m.neighbours(i) {
            if el(j) == Element::N
                && !used[j]
                && m.bonds()[k].order == BondOrder::Triple
                && m.heavy_degree(j) == 1
                && atoms[j].charge == 0
            {
                used[i] = true;
                used[j] = true;
                add(t!("cn"));
                break;
            }
        }
    }
    // 3. Carbonyl groups: acid, ester, aldehyde, ketone.
    for i in 0..n {
        if el(i) != Element::C || used[i] || atoms[i].charge != 0 || orders[i][0] == 0 {
            continue;
        }
        let Some(o) = terminal_o(m, i, BondOrder::Double).find(|&o| !used[o]) else {
            continue;
        };
        if atoms[o].charge != 0 {
            continue;
        }
        let h = m.total_hydrogens(i);
        // Single-bonded oxygens on the carbonyl carbon.
        let singles = || {
            m.neighbours(i)
                .iter()
                .filter(|&&(j, k)| {
                    el(j) == Element::O
                        && !used[j]
                        && m.bonds()[k].order == BondOrder::Single
                        && atoms[j].charge == 0
                })
                .map(|&(j, _)| j)
        };
        if let Some(oh) = singles().find(|&j| m.total_hydrogens(j) == 1 && m.heavy_degree(j) == 1) {
            used[i] = true;
            used[o] = true;
            used[oh] = true;
            add(t!("cooh"));
            continue;
        }
        if let Some(oe) = singles().find(|&j| m.heavy_degree(j) == 2) {
            used[i] = true;
            used[o] = true;
            used[oe] = true;
            add(t!("coo"));
            continue;
        }
        if h == 1 {
            used[i] = true;
            used[o] = true;
            add(t!("cho"));
            continue;
        }
        if h == 0 && m.heavy_degree(i) == 3 {
            used[i] = true;
            used[o] = true;
            add(if atoms[i].in_ring {
                t!("co_ring")
            } else {
                t!("co_chain")
            });
            continue;
        }
    }
    // 3b. Sulfur oxo groups (project's extension only): each terminal =O on S.
    let s_oxo = &mut w.s_oxo;
    s_oxo.clear();
    s_oxo.resize(n, 0);
    if extended {
        for i in 0..n {
            if el(i) != Element::S || atoms[i].charge != 0 || orders[i][0] == 0 {
                continue;
            }
            for o in terminal_o(m, i, BondOrder::Double) {
                if !used[o] && atoms[o].charge == 0 {
                    used[o] = true;
                    s_oxo[i] += 1;
                    add(t!("s_oxo"));
                }
            }
        }
    }
    // 4. Single atoms.
    for i in 0..n {
        if used[i] || el(i) == Element::H {
            continue;
        }
        let a = &atoms[i];
        if a.charge != 0 {
            return Err(no_group(
                m,
                i,
                format!(
                    "charged {} (charge {:+}); Joback covers charges only in nitro groups",
                    a.element.name(),
                    a.charge
                ),
            ));
        }
        let h = m.total_hydrogens(i);
        let deg = m.heavy_degree(i);
        let ring = a.in_ring;
        let [mut double, triple, aromatic_bonds] = orders[i];
        // An aromatic atom counts as carrying one ring double bond.
        if a.aromatic && aromatic_bonds > 0 && double == 0 && el(i) == Element::C {
            double = 1;
        }
        let id: usize = match a.element {
            e if e == Element::C => match (double, triple, h) {
                (0, 0, 4) => return Err(no_group(m, i, "methane (CH4) has no Joback group")),
                (0, 0, 3) => t!("ch3"),
                (0, 0, 2) => if ring { t!("ch2_ring") } else { t!("ch2_chain") },
                (0, 0, 1) => if ring { t!("ch_ring") } else { t!("ch_chain") },
                (0, 0, 0) => if ring { t!("c_ring") } else { t!("c_chain") },
                (1, 0, 2) => t!("eq_ch2"),
                (1, 0, 1) => if ring { t!("eq_ch_ring") } else { t!("eq_ch_chain") },
                (1, 0, 0) => if ring { t!("eq_c_ring") } else { t!("eq_c_chain") },
                (2, 0, 0) => t!("eq_c_eq"),
                (0, 1, 1) => t!("tr_ch"),
                (0, 1, 0) => t!("tr_c"),
                _ => return Err(no_group(m, i, format!("carbon with {double} double, {triple} triple bonds and {h} H fits no group"))),
            },
            e if e == Element::O => {
                let arom_nb = m.neighbours(i).iter().any(|&(j, _)| atoms[j].aromatic);
                match (double, h, deg) {
                    (0, 1, 1) => if arom_nb { t!("oh_phenol") } else { t!("oh_alcohol") },
                    (0, 0, 2) => if ring { t!("o_ring") } else { t!("o_chain") },
                    (1, 0, 1) => t!("eq_o"),
                    (0, 2, 0) => return Err(no_group(m, i, "water has no Joback group")),
                    _ => return Err(no_group(m, i, "oxygen bonded in a way the table does not cover")),
                }
            }
            e if e == Element::N => {
                let arom = a.aromatic;
                match (double, h, deg, arom) {
                    (0, 2, 1, false) => t!("nh2"),
                    (0, 1, 2, false) => if ring { t!("nh_ring") } else { t!("nh_chain") },
                    (_, 1, 2, true) => t!("nh_ring"),
                    (0, 0, 3, false) if !ring => t!("n_chain"),
                    (0, 0, 3, false) if extended => t!("n_ring_tert"),
                    (0, 0, 3, true) if extended => t!("n_arom_sub"),
                    (0, 0, 3, _) => return Err(no_group(m, i, "ring tertiary nitrogen >N-: the table has >N- only outside rings")),
                    (1, 0, 2, false) => if ring { t!("eq_n_ring") } else { t!("eq_n_chain") },
                    (0, 0, 2, true) => t!("eq_n_ring"),
                    (1, 1, 1, false) => t!("eq_nh"),
                    _ => return Err(no_group(m, i, "nitrogen bonded in a way the table does not cover")),
                }
            }
            e if e == Element::S => match (double - s_oxo[i] as i32, h, deg - s_oxo[i]) {
                (0, 1, 1) => t!("sh"),
                (0, 0, 2) => if ring { t!("s_ring") } else { t!("s_chain") },
                _ => return Err(no_group(m, i, "sulfur other than -SH or -S- (e.g. sulfoxide, sulfone) has no Joback group")),
            },
            e if e == Element::F || e == Element::CL || e == Element::BR || e == Element::I => {
                if deg == 1 && double == 0 && triple == 0 {
                    match a.element.number() {
                        9 => t!("f"),
                        17 => t!("cl"),
                        35 => t!("br"),
                        _ => t!("i"),
                    }
                } else {
                    return Err(no_group(m, i, "halogen must have exactly one single bond"));
                }
            }
            e => {
                return Err(no_group(
                    m,
                    i,
                    format!("{} has no Joback group (the table covers C, H, O, N, S and halogens)", e.name()),
                ))
            }
        };
        used[i] = true;
        add(id);
    }
    Ok(())
}
