//! Ring membership (a bond is in a ring unless it is a bridge) and small rings.
//!
//! Reference: R. E. Tarjan, "A note on finding the bridges of a graph",
//! Inf. Process. Lett. 2 (1974) 160–161 (depth-first search with low links,
//! written iteratively here so long chains cannot overflow the stack).

use super::Molecule;
use std::collections::VecDeque;

/// Mark `in_ring` on every bond that is not a bridge and on the atoms of those bonds.
pub(super) fn mark_ring_bonds(m: &mut Molecule) {
    let n = m.atoms.len();
    // A forest (bonds = atoms − pieces, every piece counted at least once) has no ring.
    if m.bonds.len() + m.components <= n {
        return;
    }
    let mut disc = vec![usize::MAX; n];
    let mut low = vec![0usize; n];
    let mut time = 0usize;
    let mut is_bridge = vec![false; m.bonds.len()];
    for root in 0..n {
        if disc[root] != usize::MAX {
            continue;
        }
        // Stack of (atom, bond used to enter it, next neighbour index).
        let mut stack: Vec<(usize, usize, usize)> = Vec::with_capacity(n);
        stack.push((root, usize::MAX, 0));
        disc[root] = time;
        low[root] = time;
        time += 1;
        while let Some(&mut (v, via, ref mut next)) = stack.last_mut() {
            if let Some(&(w, k)) = m.adj[v].get(*next) {
                *next += 1;
                if k == via {
                    continue;
                }
                if disc[w] == usize::MAX {
                    disc[w] = time;
                    low[w] = time;
                    time += 1;
                    stack.push((w, k, 0));
                } else {
                    low[v] = low[v].min(disc[w]);
                }
            } else {
                stack.pop();
                if let Some(&(p, _, _)) = stack.last() {
                    low[p] = low[p].min(low[v]);
                    if low[v] > disc[p] {
                        is_bridge[via] = true;
                    }
                }
            }
        }
    }
    for (k, b) in m.bonds.iter_mut().enumerate() {
        b.in_ring = !is_bridge[k];
    }
    for k in 0..m.bonds.len() {
        if m.bonds[k].in_ring {
            let (a, b) = (m.bonds[k].a, m.bonds[k].b);
            m.atoms[a].in_ring = true;
            m.atoms[b].in_ring = true;
        }
    }
}

/// Small rings (at most `max_size` atoms), each as its atoms in ring order:
/// for every ring bond, the shortest cycle through it. Duplicates removed.
/// For simple and fused ring systems this is the smallest set of smallest rings.
pub(super) fn small_rings(m: &Molecule, max_size: usize) -> Vec<Vec<usize>> {
    let mut rings: Vec<Vec<usize>> = Vec::new();
    let mut seen: std::collections::HashSet<Vec<usize>> = std::collections::HashSet::new();
    let n = m.atoms.len();
    let mut prev = vec![usize::MAX; n];
    let mut dist = vec![usize::MAX; n];
    for (k, bond) in m.bonds.iter().enumerate() {
        if !bond.in_ring {
            continue;
        }
        // BFS from a to b avoiding bond k, ring bonds only, depth-limited.
        let (s, t) = (bond.a, bond.b);
        let mut touched = vec![s];
        dist[s] = 0;
        let mut q = VecDeque::from([s]);
        let mut found = false;
        while let Some(v) = q.pop_front() {
            if v == t {
                found = true;
                break;
            }
            if dist[v] + 1 >= max_size {
                continue;
            }
            for &(w, kk) in &m.adj[v] {
                if kk == k || !m.bonds[kk].in_ring || dist[w] != usize::MAX {
                    continue;
                }
                dist[w] = dist[v] + 1;
                prev[w] = v;
                touched.push(w);
                q.push_back(w);
            }
        }
        if found {
            let mut path = vec![t];
            let mut v = t;
            while v != s {
                v = prev[v];
                path.push(v);
            }
            let mut key = path.clone();
            key.sort_unstable();
            if seen.insert(key) {
                rings.push(path);
            }
        }
        for v in touched {
            dist[v] = usize::MAX;
            prev[v] = usize::MAX;
        }
    }
    rings
}
