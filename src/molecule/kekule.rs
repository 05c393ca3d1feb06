//! Kekulé form of aromatic systems, then implicit hydrogens by normal valence.
//!
//! Each aromatic atom that needs a π bond (an aromatic carbon, a pyridine-type
//! nitrogen, a cationic heteroatom) must get exactly one double bond to
//! another such atom: a perfect matching, found by forced moves and bounded
//! backtracking. Implicit hydrogens then follow OpenSMILES §3.1.1: the
//! smallest normal valence not below the sum of (Kekulé) bond orders.
//!
//! Reference: OpenSMILES specification, version 1.0, §3.1.1 (implicit
//! hydrogens) and §3.5 (aromaticity).

use super::error::SmilesErrorKind as K;
use super::{BondOrder, Molecule};

/// Largest number of branch points tried before giving up on a Kekulé form.
const BRANCH_BUDGET: usize = 20_000;

/// Whether aromatic atom `i` needs one double bond inside its aromatic system (what
/// [`kekulize`] finds for every atom at once from the bond list).
#[cfg(test)]
fn needs_pi(m: &Molecule, i: usize) -> bool {
    let mut sum = 0u32;
    for &(_, k) in &m.adj[i] {
        match m.bonds[k].order {
            BondOrder::Aromatic | BondOrder::Single => sum += 1,
            // An exocyclic double bond (pyridone C=O) already gives the π bond.
            _ => return false,
        }
    }
    needs_pi_with(&m.atoms[i], sum)
}

/// [`needs_pi`] for atom `a` with `single` single or aromatic bonds and no other bond.
fn needs_pi_with(a: &super::Atom, single: u32) -> bool {
    let sum = single;
    if !a.bracket {
        let lowest = a.element.organic_valences().first().copied().unwrap_or(0) as u32;
        return sum < lowest;
    }
    let target: i32 = match (a.element.number(), a.charge) {
        (6, 0) => 4,
        (6, _) => 3,
        (7 | 15 | 33, 0) => 3,
        (7 | 15 | 33, 1) => 4,
        (7 | 15 | 33, -1) => 2,
        (8 | 16 | 34 | 52, 0) => 2,
        (8 | 16 | 34 | 52, 1) => 3,
        (5, 0) => 3,
        (5, -1) => 4,
        _ => return false,
    };
    (sum as i32 + a.hydrogens as i32) < target
}

/// Give aromatic bonds Kekulé orders. Errors carry the 1-based position of an
/// atom that could not get its double bond.
pub(super) fn kekulize(m: &mut Molecule) -> Result<(), (K, usize)> {
    if !m.atoms.iter().any(|a| a.aromatic) {
        return Ok(());
    }
    let mut w = WORK.take();
    let done = kekulize_with(m, &mut w);
    WORK.set(w);
    done
}

/// The work lists of the quick matching, kept between molecules (only their storage).
#[derive(Default)]
struct Work {
    need: Vec<bool>,
    /// Per atom: single or aromatic bonds, and whether it has any other bond.
    single: Vec<(u32, bool)>,
    greedy: Greedy,
}

thread_local! {
    static WORK: std::cell::Cell<Work> = std::cell::Cell::new(Work::default());
}

fn kekulize_with(m: &mut Molecule, w: &mut Work) -> Result<(), (K, usize)> {
    let n = m.atoms.len();
    // what `needs_pi` finds atom by atom, from one pass over the bonds
    w.single.clear();
    w.single.resize(n, (0, false));
    for b in &m.bonds {
        for x in [b.a, b.b] {
            match b.order {
                BondOrder::Aromatic | BondOrder::Single => w.single[x].0 += 1,
                _ => w.single[x].1 = true,
            }
        }
    }
    w.need.clear();
    w.need.extend(
        m.atoms
            .iter()
            .zip(&w.single)
            .map(|(a, &(single, other))| a.aromatic && !other && needs_pi_with(a, single)),
    );
    let need = &w.need[..];
    // Candidate edges: aromatic bonds between two atoms that both need a π bond.
    let cand = |m: &Molecule, k: usize| {
        let b = &m.bonds[k];
        b.order == BondOrder::Aromatic && need[b.a] && need[b.b]
    };
    // Usually forced moves and first choices find a matching at once; only when they do not
    // does the full search run. Any perfect matching gives every atom the same sum of bond
    // orders, so the hydrogens and the aromaticity that follow do not depend on which.
    if greedy_matching(m, need, &mut w.greedy) {
        set_orders(m, &w.greedy.partner);
        return Ok(());
    }
    let mut partner: Vec<usize> = vec![usize::MAX; n];
    // Stack of saved states for backtracking: (partner snapshot, atom, next option).
    let mut stack: Vec<(Vec<usize>, usize, usize)> = Vec::new();
    let mut branches = 0usize;
    loop {
        // Forced moves until none remain; detect dead ends.
        let mut dead: Option<usize> = None;
        let mut changed = true;
        while changed && dead.is_none() {
            changed = false;
            for i in 0..n {
                if !need[i] || partner[i] != usize::MAX {
                    continue;
                }
                let mut options = m.adj[i]
                    .iter()
                    .filter(|&&(j, k)| cand(m, k) && partner[j] == usize::MAX);
                match (options.next(), options.next()) {
                    (None, _) => {
                        dead = Some(i);
                        break;
                    }
                    (Some(&(j, _)), None) => {
                        partner[i] = j;
                        partner[j] = i;
                        changed = true;
                    }
                    _ => {}
                }
            }
        }
        if dead.is_none() {
            match (0..n).find(|&i| need[i] && partner[i] == usize::MAX) {
                None => break,
                Some(i) => {
                    branches += 1;
                    if branches > BRANCH_BUDGET {
                        return Err((K::Kekulize, m.atoms[i].position));
                    }
                    stack.push((partner.clone(), i, 0));
                }
            }
        }
        // Take the next option of the innermost branch point (backtracking on dead ends).
        loop {
            let Some((snap, i, next)) = stack.last_mut() else {
                let at = dead.map_or(0, |d| m.atoms[d].position);
                return Err((K::Kekulize, at));
            };
            let opts: Vec<usize> = m.adj[*i]
                .iter()
                .filter(|&&(j, k)| cand(m, k) && snap[j] == usize::MAX)
                .map(|&(j, _)| j)
                .collect();
            if let Some(&j) = opts.get(*next) {
                *next += 1;
                partner.clone_from(snap);
                partner[*i] = j;
                partner[j] = *i;
                break;
            }
            stack.pop();
        }
    }
    set_orders(m, &partner);
    Ok(())
}

fn set_orders(m: &mut Molecule, partner: &[usize]) {
    for b in &mut m.bonds {
        if b.order == BondOrder::Aromatic {
            b.kekule_order = if partner[b.a] == b.b { 2 } else { 1 };
        }
    }
}

/// A perfect matching of the atoms in `need` over their candidate bonds by forced moves
/// (an atom with one free candidate takes it) and, when none is forced, the lowest free
/// atom's first free candidate, into `w.partner`; false at a dead end (the full search
/// then decides).
fn greedy_matching(m: &Molecule, need: &[bool], w: &mut Greedy) -> bool {
    greedy_partners(m, need, w).is_some()
}

/// The quick matching's partners, free-candidate counts and forced atoms.
#[derive(Default)]
struct Greedy {
    partner: Vec<usize>,
    avail: Vec<u32>,
    forced: Vec<usize>,
}

fn greedy_partners(m: &Molecule, need: &[bool], w: &mut Greedy) -> Option<()> {
    let n = m.atoms.len();
    let free_cands = |i: usize, partner: &[usize]| {
        m.adj[i]
            .iter()
            .filter(|&&(j, k)| {
                m.bonds[k].order == BondOrder::Aromatic && need[j] && partner[j] == usize::MAX
            })
            .count()
    };
    let first_free = |i: usize, partner: &[usize]| {
        m.adj[i]
            .iter()
            .find(|&&(j, k)| {
                m.bonds[k].order == BondOrder::Aromatic && need[j] && partner[j] == usize::MAX
            })
            .map(|&(j, _)| j)
    };
    let (partner, avail, forced) = (&mut w.partner, &mut w.avail, &mut w.forced);
    partner.clear();
    partner.resize(n, usize::MAX);
    // free candidates left to each atom that needs a π bond
    avail.clear();
    avail.resize(n, 0);
    forced.clear();
    for i in (0..n).filter(|&i| need[i]) {
        avail[i] = free_cands(i, partner) as u32;
        match avail[i] {
            0 => return None,
            1 => forced.push(i),
            _ => {}
        }
    }
    let mut next_free = 0;
    loop {
        let (i, j) = if let Some(i) = forced.pop() {
            if partner[i] != usize::MAX {
                continue;
            }
            (i, first_free(i, partner)?)
        } else {
            while next_free < n && (!need[next_free] || partner[next_free] != usize::MAX) {
                next_free += 1;
            }
            if next_free == n {
                return Some(());
            }
            let i = next_free;
            (i, first_free(i, partner)?)
        };
        partner[i] = j;
        partner[j] = i;
        for x in [i, j] {
            for &(y, k) in &m.adj[x] {
                if m.bonds[k].order == BondOrder::Aromatic && need[y] && partner[y] == usize::MAX {
                    avail[y] -= 1;
                    match avail[y] {
                        0 => return None,
                        1 => forced.push(y),
                        _ => {}
                    }
                }
            }
        }
    }
}

/// Fill in implicit hydrogens of organic-subset atoms from their Kekulé bond orders, and
/// each atom's heavy degree and total hydrogens (`m.tally`): sums over the bond list in
/// one pass instead of over each atom's neighbours.
pub(super) fn implicit_hydrogens(m: &mut Molecule) -> Result<(), (K, usize)> {
    let n = m.atoms.len();
    // per atom: Kekulé bond orders, heavy neighbours, hydrogen-atom neighbours
    let mut sums = SUMS.take();
    sums.clear();
    sums.resize(n, (0, 0, 0));
    for b in &m.bonds {
        let order = b.kekule_order as u32;
        let h = |x: usize| m.atoms[x].element == super::Element::H;
        let (ha, hb) = (h(b.a), h(b.b));
        for (x, other_h) in [(b.a, hb), (b.b, ha)] {
            let s = &mut sums[x];
            s.0 += order;
            if other_h {
                s.2 += 1;
            } else {
                s.1 += 1;
            }
        }
    }
    m.tally.clear();
    let mut done = Ok(());
    for (a, &(sum, heavy, h_atoms)) in m.atoms.iter_mut().zip(&sums) {
        let valences = a.element.organic_valences();
        // bracket atoms keep their written count; the wildcard atom has no valence
        if !a.bracket && !valences.is_empty() {
            match valences.iter().find(|&&v| v as u32 >= sum) {
                Some(&v) => a.hydrogens = (v as u32 - sum) as u8,
                None => {
                    done = Err((
                        K::Valence {
                            element: a.element.name(),
                            bonds: sum,
                        },
                        a.position,
                    ));
                    break;
                }
            }
        }
        m.tally.push((heavy, h_atoms + a.hydrogens as u32));
    }
    SUMS.set(sums);
    done
}

thread_local! {
    /// The bond-order sums of [`implicit_hydrogens`] (storage kept between molecules).
    static SUMS: std::cell::Cell<Vec<(u32, u32, u32)>> = const { std::cell::Cell::new(Vec::new()) };
}

#[cfg(test)]
mod tests {
    use super::{greedy_matching, needs_pi, Greedy};
    use crate::molecule::parse_smiles;

    /// Where the quick matching answers, it is a perfect matching over candidate bonds, and
    /// the hydrogens that follow are the textbook ones (benzene CH, pyrrole NH, azulene CH).
    #[test]
    fn greedy_matching_is_a_perfect_matching() {
        for (smi, hydrogens) in [
            ("c1ccccc1", 6),
            ("c1ccc2ccccc2c1", 8),
            ("c1ccc2cccc2cc1", 8),
            ("c1cc[nH]c1", 5),
            ("c1ccc2[nH]ccc2c1", 7),
            ("c1ncc2nc[nH]c2n1", 4),
            ("c1cc2ccc3cccc4ccc(c1)c2c34", 10),
            ("O=c1cccc[nH]1", 5),
            ("Cc1ccc(cc1)-c1ccccc1", 12),
        ] {
            let m = parse_smiles(smi).unwrap();
            let h: u32 = (0..m.atoms.len()).map(|i| m.total_hydrogens(i)).sum();
            assert_eq!(h, hydrogens, "{smi}");
            // the quick matching on the parsed molecule's aromatic atoms
            let need: Vec<bool> = (0..m.atoms.len())
                .map(|i| m.atoms[i].aromatic && needs_pi(&m, i))
                .collect();
            let mut w = Greedy::default();
            if greedy_matching(&m, &need, &mut w) {
                let p = &w.partner;
                for i in (0..m.atoms.len()).filter(|&i| need[i]) {
                    let j = p[i];
                    assert!(j != usize::MAX && p[j] == i && need[j], "{smi}: atom {i}");
                    assert!(
                        m.adj[i].iter().any(|&(w, _)| w == j),
                        "{smi}: {i}-{j} not bonded"
                    );
                }
            }
        }
    }
}
