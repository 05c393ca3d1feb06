//! Ring membership (a bond is in a ring unless it is a bridge) and small rings.
//!
//! Reference: R. E. Tarjan, "A note on finding the bridges of a graph",
//! Inf. Process. Lett. 2 (1974) 160–161 (depth-first search with low links,
//! written iteratively here so long chains cannot overflow the stack).

use super::Molecule;
use std::collections::VecDeque;

/// The depth-first search's arrays, kept between molecules (only their storage).
#[derive(Default)]
struct Work {
    disc: Vec<usize>,
    low: Vec<usize>,
    is_bridge: Vec<bool>,
    /// (atom, bond used to enter it, next neighbour index)
    stack: Vec<(usize, usize, usize)>,
}

thread_local! {
    static WORK: std::cell::Cell<Work> = std::cell::Cell::new(Work::default());
}

/// Mark `in_ring` on every bond that is not a bridge and on the atoms of those bonds.
pub(super) fn mark_ring_bonds(m: &mut Molecule) {
    let n = m.atoms.len();
    // A forest (bonds = atoms − pieces, every piece counted at least once) has no ring.
    if m.bonds.len() + m.components <= n {
        return;
    }
    let mut w = WORK.take();
    bridges(m, &mut w);
    for (b, &bridge) in m.bonds.iter_mut().zip(&w.is_bridge) {
        b.in_ring = !bridge;
    }
    for k in 0..m.bonds.len() {
        if m.bonds[k].in_ring {
            let (a, b) = (m.bonds[k].a, m.bonds[k].b);
            m.atoms[a].in_ring = true;
            m.atoms[b].in_ring = true;
        }
    }
    WORK.set(w);
}

/// Tarjan's bridges of `m` into `w.is_bridge`.
fn bridges(m: &Molecule, w: &mut Work) {
    let n = m.atoms.len();
    let (disc, low, is_bridge, stack) = (&mut w.disc, &mut w.low, &mut w.is_bridge, &mut w.stack);
    disc.clear();
    disc.resize(n, usize::MAX);
    low.clear();
    low.resize(n, 0);
    is_bridge.clear();
    is_bridge.resize(m.bonds.len(), false);
    let mut time = 0usize;
    for root in 0..n {
        if disc[root] != usize::MAX {
            continue;
        }
        stack.clear();
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
