//! Aromaticity of Kekulé rings by the Hückel rule (4n + 2 π electrons).
//!
//! Each small ring (up to 8 atoms) that is not yet aromatic is tested on its
//! own: every atom must contribute to the π system. An atom with a double bond
//! along a ring bond gives 1 electron; a neutral N, P with three single bonds
//! (or two and an H), O, S or Se with two, and a carbanion give 2; a carbon
//! with an exocyclic double bond to O, N or S, a carbocation or a boron gives
//! 0. Any other atom (an sp3 carbon) makes the ring non-aromatic. Atoms that
//! are already aromatic count 1. Fused systems such as naphthalene pass ring
//! by ring because a double bond in the neighbouring ring counts.
//!
//! Reference: E. Hückel, Z. Phys. 70 (1931) 204 (the 4n+2 rule); OpenSMILES
//! specification, version 1.0, §3.5 (aromaticity in SMILES).

use super::rings::small_rings;
use super::{BondOrder, Molecule};

/// π electrons atom `i` gives to a ring, or `None` if it breaks conjugation.
fn pi_electrons(m: &Molecule, i: usize) -> Option<u32> {
    let a = &m.atoms[i];
    if a.aromatic {
        return Some(1);
    }
    let mut ring_double = false;
    let mut exo_double_hetero = false;
    let mut degree_sum = 0u32;
    for &(j, k) in &m.adj[i] {
        let b = &m.bonds[k];
        degree_sum += b.kekule_order as u32;
        match b.order {
            BondOrder::Double if b.in_ring => ring_double = true,
            BondOrder::Double => {
                if matches!(m.atoms[j].element.number(), 7 | 8 | 16) && a.element.number() == 6 {
                    exo_double_hetero = true
                } else {
                    return None;
                }
            }
            BondOrder::Triple | BondOrder::Quadruple => return None,
            _ => {}
        }
    }
    if ring_double {
        return Some(1);
    }
    if exo_double_hetero {
        return Some(0);
    }
    let total = degree_sum + a.hydrogens as u32;
    match (a.element.number(), a.charge) {
        (7 | 15, 0) if total == 3 => Some(2),
        (8 | 16 | 34, 0) if total == 2 => Some(2),
        (6, -1) if total == 3 => Some(2),
        (6, 1) if total == 3 => Some(0),
        (5, 0) if total == 3 => Some(0),
        _ => None,
    }
}

/// Mark Hückel-aromatic Kekulé rings (atoms and ring bonds) as aromatic.
pub(super) fn perceive(m: &mut Molecule) {
    // Only rings with a double bond in them can become aromatic.
    let any = m
        .bonds
        .iter()
        .any(|b| b.in_ring && b.order == BondOrder::Double);
    if !any {
        return;
    }
    let rings = small_rings(m, 8);
    let mut to_mark: Vec<Vec<usize>> = Vec::new();
    for ring in &rings {
        if ring.len() < 3 || ring.iter().all(|&i| m.atoms[i].aromatic) {
            continue;
        }
        let mut total = 0u32;
        let mut ok = true;
        for &i in ring {
            match pi_electrons(m, i) {
                Some(e) => total += e,
                None => {
                    ok = false;
                    break;
                }
            }
        }
        if ok && total % 4 == 2 {
            to_mark.push(ring.clone());
        }
    }
    for ring in to_mark {
        let len = ring.len();
        for (p, &i) in ring.iter().enumerate() {
            m.atoms[i].aromatic = true;
            let j = ring[(p + 1) % len];
            if let Some(&(_, k)) = m.adj[i].iter().find(|&&(w, _)| w == j) {
                m.bonds[k].order = BondOrder::Aromatic;
            }
        }
    }
}
