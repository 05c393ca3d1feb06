//! The same compound listed more than once with disagreeing boiling points.
//!
//! Rows are the same compound when they share a valid CAS number, a
//! structure key, or a name (case and spacing ignored); the links are
//! transitive (union–find), so a row matched by CAS to one row and by name to
//! another joins both.

use super::finding::{Code, Finding};
use super::sources::{name_key, with_name_key};
use std::collections::HashMap;
use std::hash::{Hash, Hasher};

/// 64-bit hash of a row's name key, without allocating for short ASCII names.
fn name_hash(name: &str) -> u64 {
    with_name_key(name, |k| {
        let mut h = std::collections::hash_map::DefaultHasher::new();
        k.hash(&mut h);
        h.finish()
    })
}

fn same_name(a: &str, b: &str) -> bool {
    with_name_key(a, |ka| with_name_key(b, |kb| ka == kb))
}

/// Identity keys and boiling point of one row, for grouping.
#[derive(Debug, Clone, Default)]
pub struct DupKey<'a> {
    /// Valid CAS number.
    pub cas: Option<&'a str>,
    /// Structure key.
    pub structure: Option<&'a str>,
    /// Compound name.
    pub name: Option<&'a str>,
    /// Boiling point to compare (listed, else implied), K; NaN if none.
    pub tb_k: f64,
    /// Line number.
    pub line: usize,
}

fn find(parent: &mut [usize], mut i: usize) -> usize {
    while parent[i] != i {
        parent[i] = parent[parent[i]];
        i = parent[i];
    }
    i
}

/// Findings per row index (`(row, finding)`) for groups whose boiling points
/// spread by more than `tol_k`.
pub fn check_duplicates(keys: &[DupKey<'_>], tol_k: f64) -> Vec<(usize, Finding)> {
    let n = keys.len();
    let mut parent: Vec<usize> = (0..n).collect();
    let mut cas: HashMap<&str, usize> = HashMap::new();
    let mut structure: HashMap<&str, usize> = HashMap::new();
    // Names are grouped by the hash of their key; a hash shared by two
    // different names (rare) falls back to the keys themselves.
    let mut names: HashMap<u64, usize> = HashMap::new();
    let mut collided: HashMap<String, usize> = HashMap::new();
    let union = |parent: &mut Vec<usize>, a: usize, b: usize| {
        let (ra, rb) = (find(parent, a), find(parent, b));
        if ra != rb {
            parent[ra.max(rb)] = ra.min(rb);
        }
    };
    let mut linked = false;
    for (i, k) in keys.iter().enumerate() {
        if let Some(c) = k.cas {
            if let Some(&j) = cas.get(c) {
                union(&mut parent, i, j);
                linked = true;
            } else {
                cas.insert(c, i);
            }
        }
        if let Some(s) = k.structure {
            if let Some(&j) = structure.get(s) {
                union(&mut parent, i, j);
                linked = true;
            } else {
                structure.insert(s, i);
            }
        }
        if let Some(nm) = k.name.filter(|s| !s.trim().is_empty()) {
            let h = name_hash(nm);
            match names.get(&h) {
                None => {
                    names.insert(h, i);
                }
                Some(&j) if keys[j].name.is_some_and(|o| same_name(o, nm)) => {
                    union(&mut parent, i, j);
                    linked = true;
                }
                Some(_) => match collided.entry(name_key(nm)) {
                    std::collections::hash_map::Entry::Occupied(e) => {
                        union(&mut parent, i, *e.get());
                        linked = true;
                    }
                    std::collections::hash_map::Entry::Vacant(e) => {
                        e.insert(i);
                    }
                },
            }
        }
    }
    if !linked {
        return Vec::new();
    }
    // Members of groups with more than one row, without a map over all rows.
    let roots: Vec<usize> = (0..n).map(|i| find(&mut parent, i)).collect();
    let mut size = vec![0u32; n];
    for &r in &roots {
        size[r] += 1;
    }
    let mut groups: HashMap<usize, Vec<usize>> = HashMap::new();
    for (i, &r) in roots.iter().enumerate() {
        if size[r] > 1 {
            groups.entry(r).or_default().push(i);
        }
    }
    let mut out = Vec::new();
    for members in groups.into_values().filter(|m| m.len() > 1) {
        let with_tb: Vec<usize> = members
            .iter()
            .copied()
            .filter(|&i| keys[i].tb_k.is_finite())
            .collect();
        if with_tb.len() < 2 {
            continue;
        }
        // The farthest member from any value is the group's minimum or maximum,
        // so the whole group is O(n), not O(n²).
        let by_tb = |a: &&usize, b: &&usize| keys[**a].tb_k.total_cmp(&keys[**b].tb_k);
        let (Some(&lo), Some(&hi)) = (with_tb.iter().min_by(by_tb), with_tb.iter().max_by(by_tb))
        else {
            continue;
        };
        for &i in &with_tb {
            let v = keys[i].tb_k;
            let far = if (keys[hi].tb_k - v).abs() >= (v - keys[lo].tb_k).abs() {
                hi
            } else {
                lo
            };
            let d = (keys[far].tb_k - v).abs();
            if d > tol_k {
                out.push((
                    i,
                    Finding::new(
                        Code::DuplicateDisagrees,
                        format!(
                            "The same compound is also on line {} with a boiling point {d:.1} K different ({:.1} K there, {v:.1} K here).",
                            keys[far].line, keys[far].tb_k
                        ),
                    ),
                ));
            }
        }
    }
    out.sort_by_key(|(i, _)| *i);
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn key<'a>(name: &'a str, cas: Option<&'a str>, tb: f64, line: usize) -> DupKey<'a> {
        DupKey {
            name: Some(name),
            cas,
            structure: None,
            tb_k: tb,
            line,
        }
    }

    #[test]
    fn links_by_cas_and_name_transitively() {
        let keys = [
            key("acetone", Some("67-64-1"), 329.4, 2),
            key("propan-2-one", Some("67-64-1"), 329.2, 3),
            key("Propan-2-one", None, 339.0, 4),
            key("benzene", None, 353.2, 5),
        ];
        let f = check_duplicates(&keys, 1.0);
        let rows: Vec<usize> = f.iter().map(|(i, _)| *i).collect();
        assert_eq!(rows, [0, 1, 2]);
        assert!(f[2].1.message.contains("line 3"), "{}", f[2].1.message);
    }

    #[test]
    fn agreeing_duplicates_pass() {
        let keys = [key("water", None, 373.15, 2), key("Water", None, 373.12, 3)];
        assert!(check_duplicates(&keys, 1.0).is_empty());
    }
}
