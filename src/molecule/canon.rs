//! Canonical SMILES: Morgan-style refined atom ranks, then a ranked depth-first walk.
//!
//! Atoms start from an invariant (element, aromaticity, charge, hydrogens,
//! degree, isotope, ring membership); ranks are refined by the sorted ranks of
//! neighbours until stable; remaining ties are broken one at a time (the
//! lowest tied class first) and refined again. The SMILES is then written by
//! a depth-first walk from the lowest-ranked atom, branches in rank order.
//!
//! Reference: H. L. Morgan, J. Chem. Doc. 5 (1965) 107 (iterative refinement);
//! D. Weininger, A. Weininger, J. L. Weininger, J. Chem. Inf. Comput. Sci. 29
//! (1989) 97 (ranking with tie breaking).

use super::{BondOrder, Element, Molecule};

fn bond_code(o: BondOrder) -> u8 {
    match o {
        BondOrder::Single => 1,
        BondOrder::Double => 2,
        BondOrder::Triple => 3,
        BondOrder::Quadruple => 4,
        BondOrder::Aromatic => 5,
    }
}

/// Dense ranks 0.. of `keys` (equal keys, equal ranks).
fn dense_ranks<K: Ord>(keys: &[K]) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..keys.len()).collect();
    idx.sort_by(|&a, &b| keys[a].cmp(&keys[b]));
    let mut ranks = vec![0; keys.len()];
    let mut r = 0;
    for w in 0..idx.len() {
        if w > 0 && keys[idx[w]] != keys[idx[w - 1]] {
            r += 1;
        }
        ranks[idx[w]] = r;
    }
    ranks
}

fn classes(r: &[usize]) -> usize {
    r.iter().max().map_or(0, |m| m + 1)
}

fn refine(m: &Molecule, mut ranks: Vec<usize>) -> Vec<usize> {
    loop {
        let keys: Vec<(usize, Vec<(usize, u8)>)> = (0..m.atoms.len())
            .map(|i| {
                let mut nb: Vec<(usize, u8)> = m.adj[i]
                    .iter()
                    .map(|&(j, k)| (ranks[j], bond_code(m.bonds[k].order)))
                    .collect();
                nb.sort_unstable();
                (ranks[i], nb)
            })
            .collect();
        let next = dense_ranks(&keys);
        if classes(&next) == classes(&ranks) {
            return next;
        }
        ranks = next;
    }
}

/// Canonical ranks: all distinct.
fn canonical_ranks(m: &Molecule) -> Vec<usize> {
    let inv: Vec<_> = (0..m.atoms.len())
        .map(|i| {
            let a = &m.atoms[i];
            (
                a.element.number(),
                a.aromatic,
                a.charge,
                m.total_hydrogens(i),
                m.adj[i].len(),
                a.isotope,
                a.in_ring,
            )
        })
        .collect();
    let mut ranks = refine(m, dense_ranks(&inv));
    while classes(&ranks) < ranks.len() {
        // Lowest rank shared by more than one atom: split off its first atom.
        let mut count = vec![0usize; ranks.len()];
        for &r in &ranks {
            count[r] += 1;
        }
        let Some(tied) = (0..count.len()).find(|&r| count[r] > 1) else {
            break;
        };
        let Some(pick) = (0..ranks.len()).find(|&i| ranks[i] == tied) else {
            break;
        };
        let keys: Vec<(usize, bool)> = (0..ranks.len()).map(|i| (ranks[i], i != pick)).collect();
        ranks = refine(m, dense_ranks(&keys));
    }
    ranks
}

/// Implicit hydrogens a reader would give atom `i` if written without brackets,
/// or `None` if it must be written in brackets.
fn bare_hydrogens(m: &Molecule, i: usize) -> Option<u8> {
    let a = &m.atoms[i];
    if a.charge != 0 || a.isotope.is_some() {
        return None;
    }
    let valences = a.element.organic_valences();
    if valences.is_empty() {
        return None;
    }
    let mut sum = 0u32;
    let mut exo_multiple = false;
    for &(_, k) in &m.adj[i] {
        let b = &m.bonds[k];
        match b.order {
            BondOrder::Aromatic => sum += 1,
            o => {
                if o != BondOrder::Single {
                    exo_multiple = true;
                }
                sum += o.integer() as u32;
            }
        }
    }
    if a.aromatic {
        if !matches!(a.element.number(), 5 | 6 | 7 | 8 | 15 | 16) {
            return None;
        }
        let lowest = valences[0] as u32;
        if !exo_multiple && sum < lowest {
            sum += 1; // the π bond the reader will assign
        }
        if a.element != Element::C && a.hydrogens > 0 {
            return None;
        }
    }
    let v = valences.iter().find(|&&v| v as u32 >= sum)?;
    Some((*v as u32 - sum) as u8)
}

fn atom_text(m: &Molecule, i: usize, out: &mut String) {
    let a = &m.atoms[i];
    let sym = a.element.symbol();
    let written = if a.aromatic {
        sym.to_lowercase()
    } else {
        sym.to_string()
    };
    if a.element.number() != 0 && bare_hydrogens(m, i) == Some(a.hydrogens) {
        out.push_str(&written);
        return;
    }
    if a.element.number() == 0 && a.hydrogens == 0 && a.charge == 0 && a.isotope.is_none() {
        out.push('*');
        return;
    }
    out.push('[');
    if let Some(iso) = a.isotope {
        out.push_str(&iso.to_string());
    }
    out.push_str(&written);
    if a.hydrogens > 0 {
        out.push('H');
        if a.hydrogens > 1 {
            out.push_str(&a.hydrogens.to_string());
        }
    }
    if a.charge != 0 {
        out.push(if a.charge > 0 { '+' } else { '-' });
        if a.charge.abs() > 1 {
            out.push_str(&a.charge.abs().to_string());
        }
    }
    out.push(']');
}

fn bond_text(m: &Molecule, k: usize) -> &'static str {
    let b = &m.bonds[k];
    let both_arom = m.atoms[b.a].aromatic && m.atoms[b.b].aromatic;
    match b.order {
        BondOrder::Single if both_arom => "-",
        BondOrder::Single => "",
        BondOrder::Double => "=",
        BondOrder::Triple => "#",
        BondOrder::Quadruple => "$",
        BondOrder::Aromatic if both_arom => "",
        BondOrder::Aromatic => ":",
    }
}

fn ring_label(n: usize, out: &mut String) {
    if n < 10 {
        out.push((b'0' + n as u8) as char);
    } else {
        out.push('%');
        out.push_str(&format!("{n:02}"));
    }
}

/// Canonical SMILES of the whole molecule (components sorted, joined by '.').
pub(super) fn canonical_smiles(m: &Molecule) -> String {
    let n = m.atoms.len();
    if n == 0 {
        return String::new();
    }
    let ranks = canonical_ranks(m);
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by_key(|&i| ranks[i]);
    // Depth-first tree: parent bond, children, ring-closure bonds per atom.
    let mut visited = vec![false; n];
    let mut parent_bond = vec![usize::MAX; n];
    let mut children: Vec<Vec<usize>> = vec![Vec::new(); n];
    let mut closures: Vec<Vec<(usize, usize)>> = vec![Vec::new(); n]; // (partner, bond)
    let mut tree_bond = vec![false; m.bonds.len()];
    let mut closure_bond = vec![false; m.bonds.len()];
    let mut roots = Vec::new();
    let sorted_nb = |v: usize| {
        let mut nb: Vec<(usize, usize)> = m.adj[v].to_vec();
        nb.sort_by_key(|&(j, _)| ranks[j]);
        nb
    };
    for &root in &order {
        if visited[root] {
            continue;
        }
        roots.push(root);
        visited[root] = true;
        #[allow(clippy::type_complexity)]
        let mut stack: Vec<(usize, Vec<(usize, usize)>, usize)> = vec![(root, sorted_nb(root), 0)];
        while let Some((v, nb, next)) = stack.last_mut() {
            let v = *v;
            if let Some(&(w, k)) = nb.get(*next) {
                *next += 1;
                if tree_bond[k] || closure_bond[k] {
                    continue;
                }
                if visited[w] {
                    closure_bond[k] = true;
                    closures[v].push((w, k));
                    closures[w].push((v, k));
                } else {
                    visited[w] = true;
                    tree_bond[k] = true;
                    parent_bond[w] = k;
                    children[v].push(w);
                    stack.push((w, sorted_nb(w), 0));
                }
            } else {
                stack.pop();
            }
        }
    }
    // Emit.
    enum Task {
        Atom(usize),
        Open,
        Close,
    }
    let mut parts: Vec<String> = Vec::new();
    let mut emitted = vec![false; n];
    for &root in &roots {
        let mut out = String::new();
        let mut open_labels: Vec<Option<usize>> = vec![None; 100]; // label -> bond
        let mut label_of_bond: std::collections::HashMap<usize, usize> = Default::default();
        let mut tasks = vec![Task::Atom(root)];
        while let Some(t) = tasks.pop() {
            match t {
                Task::Open => out.push('('),
                Task::Close => out.push(')'),
                Task::Atom(v) => {
                    if parent_bond[v] != usize::MAX {
                        out.push_str(bond_text(m, parent_bond[v]));
                    }
                    atom_text(m, v, &mut out);
                    emitted[v] = true;
                    let mut cl = closures[v].clone();
                    cl.sort_by_key(|&(w, _)| ranks[w]);
                    for (w, k) in cl {
                        if emitted[w] {
                            if let Some(lab) = label_of_bond.remove(&k) {
                                out.push_str(bond_text(m, k));
                                ring_label(lab, &mut out);
                                open_labels[lab] = None;
                            }
                        } else {
                            let lab = (1..100).find(|&l| open_labels[l].is_none()).unwrap_or(99);
                            open_labels[lab] = Some(k);
                            label_of_bond.insert(k, lab);
                            ring_label(lab, &mut out);
                        }
                    }
                    let ch = &children[v];
                    for (idx, &c) in ch.iter().enumerate().rev() {
                        if idx + 1 == ch.len() {
                            tasks.push(Task::Atom(c));
                        } else {
                            tasks.push(Task::Close);
                            tasks.push(Task::Atom(c));
                            tasks.push(Task::Open);
                        }
                    }
                }
            }
        }
        parts.push(out);
    }
    parts.sort();
    parts.join(".")
}
