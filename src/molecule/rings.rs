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
    /// Closure walk: each atom's link towards the root, past bonds already in a ring.
    link: Vec<usize>,
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
    if !closure_paths(m, &mut w) {
        bridges(m, &mut w);
    }
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

/// Bridges from the forest as written: a bond is in a ring exactly when it is a ring
/// closure or lies on the forest path between a closure's two atoms (the fundamental
/// cycles span every cycle). Each closure walks up from its deeper end, and bonds
/// already found in a ring are jumped over (union-find links), so the work stays
/// linear. False (nothing decided) when a closure joins two pieces written apart
/// (`C1.C1`); the depth-first search then decides.
fn closure_paths(m: &Molecule, w: &mut Work) -> bool {
    let (tree, link, is_bridge) = (&m.tree, &mut w.link, &mut w.is_bridge);
    link.clear();
    link.extend(0..m.atoms.len());
    is_bridge.clear();
    is_bridge.resize(m.bonds.len(), true);
    let find = |link: &mut Vec<usize>, mut v: usize| {
        while link[v] != v {
            link[v] = link[link[v]];
            v = link[v];
        }
        v
    };
    for &k in &tree.closures {
        is_bridge[k] = false;
        let (mut x, mut y) = (find(link, m.bonds[k].a), find(link, m.bonds[k].b));
        while x != y {
            if tree.depth[x] < tree.depth[y] {
                std::mem::swap(&mut x, &mut y);
            }
            let (p, via) = tree.up[x];
            if p == usize::MAX {
                return false; // two first atoms: the closure joins two pieces
            }
            is_bridge[via] = false;
            link[x] = p;
            x = find(link, p);
        }
    }
    true
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

#[cfg(test)]
mod tests {
    use super::{bridges, closure_paths, Work};
    use crate::molecule::parse_smiles;

    /// The walk along the written forest finds exactly the bonds the depth-first search
    /// (Tarjan) finds in rings, on fused, bridged, spiro, nested and reused-number rings.
    #[test]
    fn closure_walk_agrees_with_the_depth_first_search() {
        let mut seeded = Vec::new();
        // chains with rings hung at varying places, grown from a fixed seed (LCG)
        let mut x: u64 = 0x2545_f491_4f6c_dd1d;
        let parts = [
            "C",
            "C1CCCCC1",
            "C1CC1",
            "(C)",
            "O",
            "C2CCC(C)C2",
            "N",
            "C1CCC2CCCCC2C1",
        ];
        for _ in 0..300 {
            let mut s = String::new();
            for _ in 0..6 {
                x = x
                    .wrapping_mul(6364136223846793005)
                    .wrapping_add(1442695040888963407);
                let p = parts[(x >> 33) as usize % parts.len()];
                if s.is_empty() && p.starts_with('(') {
                    continue;
                }
                s.push_str(p);
            }
            seeded.push(s);
        }
        let fixed = [
            "C1CCCCC1",
            "C12CCC1CC2",
            "C1CC2CCC1C2",
            "C12(CCC1)CCC2",
            "C1CC(CC1)C1CCCC1",
            "c1ccc2cc3ccccc3cc2c1",
            "C1CCC2(CC1)CCCC2",
            "C1C2CC3CC1CC(C2)C3",
            "C1CCCC(CCC1)C1CC1CCC2CC2",
            "OC1C(O)C(O)C(O)C(O)C1O",
            "C1CC1.C1CCC1",
            "CC.C1CC1CC",
            "C%10CCCCC%10C1CC1",
            "C1CCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCC1",
            "[H]C1([H])CC1",
        ];
        let mut checked = 0;
        let fixed = fixed.iter().map(|s| (s.to_string(), true));
        for (s, must) in fixed.chain(seeded.into_iter().map(|s| (s, false))) {
            // a seeded chain may give an atom too many bonds: those are skipped
            let m = match parse_smiles(&s) {
                Ok(m) => m,
                Err(e) if !must => {
                    assert!(e.to_string().contains("bonds"), "{s}: {e}");
                    continue;
                }
                Err(e) => panic!("{s}: {e}"),
            };
            let (mut walk, mut dfs) = (Work::default(), Work::default());
            bridges(&m, &mut dfs);
            if m.tree.closures.is_empty() {
                assert!(dfs.is_bridge.iter().all(|&b| b), "{s}");
                continue;
            }
            assert!(closure_paths(&m, &mut walk), "{s}");
            assert_eq!(walk.is_bridge, dfs.is_bridge, "{s}");
            checked += 1;
        }
        assert!(checked > 100, "{checked}");
        // a closure joining two pieces written apart: the walk declines, the search decides
        let m = parse_smiles("C1CC.C1").unwrap();
        assert!(!closure_paths(&m, &mut Work::default()));
        assert_eq!(m.bonds().iter().filter(|b| b.in_ring).count(), 0);
        let m = parse_smiles("C1CC2.C12").unwrap();
        assert!(!closure_paths(&m, &mut Work::default()));
        assert_eq!(m.bonds().iter().filter(|b| b.in_ring).count(), 4);
    }
}
