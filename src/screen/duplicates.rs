//! The same compound listed more than once with disagreeing boiling points.
//!
//! Rows are the same compound when they share a valid CAS number, a
//! structure key, or a name (case and spacing ignored); the links are
//! transitive (union–find), so a row matched by CAS to one row and by name to
//! another joins both.

use super::finding::{CheckCode, Finding};
use super::number_text::Message;
use super::sources::{fast_hash, with_name_key, FastMap};
use rayon::prelude::*;

/// Identity keys and boiling point of one row, for grouping.
#[derive(Debug, Clone, Default)]
pub struct DupKey<'a> {
    /// Valid CAS number.
    pub cas: Option<&'a str>,
    /// Structure key.
    pub structure: Option<&'a str>,
    /// Compound name.
    pub name: Option<&'a str>,
    /// [`super::sources::name_hash`] of the name (any value when `name` is None).
    pub name_hash: u64,
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

#[derive(Clone, Copy)]
enum Part {
    Cas,
    Structure,
    Name,
}

fn part<'a>(k: &DupKey<'a>, p: Part) -> Option<&'a str> {
    match p {
        Part::Cas => k.cas,
        Part::Structure => k.structure,
        Part::Name => k.name.filter(|s| !s.trim().is_empty()),
    }
}

fn hash_of(k: &DupKey<'_>, s: &str, p: Part) -> u64 {
    match p {
        Part::Name => k.name_hash,
        _ => fast_hash(s.as_bytes()),
    }
}

fn same(a: &str, b: &str, p: Part) -> bool {
    match p {
        Part::Name => with_name_key(a, |ka| with_name_key(b, |kb| ka == kb)),
        _ => a == b,
    }
}

/// Pairs (first row with this key, later row with the same key) for one
/// identity part. Rows are sorted by the hash of their key, in parallel, and
/// rows sharing a hash are compared by the key itself, so a hash collision
/// never links two different compounds.
fn links(keys: &[DupKey<'_>], p: Part, out: &mut Vec<(usize, usize)>) {
    // Few distinct keys (structures of a handful of compounds): one map of
    // first rows, small enough to stay in cache. Many distinct keys (names
    // of lots): sort by hash instead of growing a map over all rows.
    const SMALL: usize = 4096;
    let mut first: FastMap<&str, usize> = FastMap::default();
    let mut found = Vec::new();
    // names are hashed already, and usually many: straight to the sort
    let mut small = !matches!(p, Part::Name);
    let candidates = if small { keys } else { &keys[..0] };
    for (i, k) in candidates.iter().enumerate() {
        let Some(s) = part(k, p) else { continue };
        let norm = |f: &mut dyn FnMut(&str)| match p {
            Part::Name => with_name_key(s, |x| f(x)),
            _ => f(s),
        };
        let mut hit = None;
        norm(&mut |x| hit = first.get(x).copied());
        match hit {
            Some(j) => found.push((j, i)),
            None if first.len() < SMALL => {
                // keys borrowed from the rows; names are kept as written and
                // matched by their normal form below
                if matches!(p, Part::Name) && with_name_key(s, |x| x != s) {
                    small = false;
                    break;
                }
                first.insert(s, i);
            }
            None => {
                small = false;
                break;
            }
        }
    }
    if small {
        out.extend(found);
        return;
    }
    let mut hashed: Vec<(u64, usize)> = keys
        .par_iter()
        .enumerate()
        .filter_map(|(i, k)| part(k, p).map(|s| (hash_of(k, s, p), i)))
        .collect();
    if hashed.len() < 2 {
        return;
    }
    hashed.par_sort_unstable();
    let mut reps: Vec<usize> = Vec::new();
    for run in hashed.chunk_by(|x, y| x.0 == y.0).filter(|r| r.len() > 1) {
        reps.clear();
        for &(_, i) in run {
            let Some(si) = part(&keys[i], p) else {
                continue;
            };
            match reps
                .iter()
                .find(|&&r| part(&keys[r], p).is_some_and(|sr| same(sr, si, p)))
            {
                Some(&r) => out.push((r, i)),
                None => reps.push(i),
            }
        }
    }
}

/// Findings per row index (`(row, finding)`) for groups whose boiling points
/// spread by more than `tol_k`.
pub fn check_duplicates(keys: &[DupKey<'_>], tol_k: f64) -> Vec<(usize, Finding)> {
    let n = keys.len();
    let mut pairs = Vec::new();
    for p in [Part::Cas, Part::Structure, Part::Name] {
        links(keys, p, &mut pairs);
    }
    if pairs.is_empty() {
        return Vec::new();
    }
    let mut parent: Vec<usize> = (0..n).collect();
    for (a, b) in pairs {
        let (ra, rb) = (find(&mut parent, a), find(&mut parent, b));
        if ra != rb {
            parent[ra.max(rb)] = ra.min(rb);
        }
    }
    // Members of groups with more than one row, in file order per group.
    let roots: Vec<usize> = (0..n).map(|i| find(&mut parent, i)).collect();
    let mut size = vec![0u32; n];
    for &r in &roots {
        size[r] += 1;
    }
    // Counting sort by root: each group's members in file order, no map.
    let mut start = vec![0usize; n];
    let mut total = 0usize;
    for r in 0..n {
        if size[r] > 1 {
            start[r] = total;
            total += size[r] as usize;
        }
    }
    let mut order = vec![0usize; total];
    let mut fill = start.clone();
    for (i, &r) in roots.iter().enumerate() {
        if size[r] > 1 {
            order[fill[r]] = i;
            fill[r] += 1;
        }
    }
    let groups = (0..n)
        .filter(|&r| size[r] > 1)
        .map(|r| order[start[r]..start[r] + size[r] as usize].to_vec());
    let mut out = Vec::new();
    for members in groups {
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
            let lo = (keys[lo].tb_k, keys[lo].line);
            let hi = (keys[hi].tb_k, keys[hi].line);
            if let Some(f) = disagreement(keys[i].tb_k, lo, hi, tol_k) {
                out.push((i, f));
            }
        }
    }
    out.sort_by_key(|(i, _)| *i);
    out
}

/// The `duplicate-disagrees` finding of a row with boiling point `v` in a
/// group whose lowest and highest boiling points are `lo` and `hi` ((K,
/// line)): against the farther of the two, if more than `tol_k` away.
pub fn disagreement(v: f64, lo: (f64, usize), hi: (f64, usize), tol_k: f64) -> Option<Finding> {
    let far = if (hi.0 - v).abs() >= (v - lo.0).abs() {
        hi
    } else {
        lo
    };
    let d = (far.0 - v).abs();
    (d > tol_k).then(|| {
        Finding::new(
            CheckCode::DuplicateDisagrees,
            Message::with_capacity(120)
                .text("The same compound is also on line ")
                .int(far.1)
                .text(" with a boiling point ")
                .d1(d)
                .text(" K different (")
                .d1(far.0)
                .text(" K there, ")
                .d1(v)
                .text(" K here).")
                .done(),
        )
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn key<'a>(name: &'a str, cas: Option<&'a str>, tb: f64, line: usize) -> DupKey<'a> {
        DupKey {
            name: Some(name),
            name_hash: crate::screen::sources::name_hash(name),
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

    // Both ways of finding equal keys (a small map, or sorting by hash when
    // keys are many or need normalising) give the same groups.
    #[test]
    fn small_map_and_sorted_paths_agree() {
        let lower = [
            key("acetone", None, 329.4, 2),
            key("benzene", None, 353.2, 3),
            key("acetone", None, 339.4, 4),
        ];
        let mixed = [
            key("acetone", None, 329.4, 2),
            key("benzene", None, 353.2, 3),
            key("ACETONE ", None, 339.4, 4),
        ];
        let rows = |k: &[DupKey<'_>]| -> Vec<usize> {
            check_duplicates(k, 1.0).iter().map(|(i, _)| *i).collect()
        };
        assert_eq!(rows(&lower), [0, 2]);
        assert_eq!(rows(&mixed), [0, 2]);
        let many: Vec<String> = (0..5000).map(|i| format!("lot {i}")).collect();
        let mut keys: Vec<DupKey<'_>> = many
            .iter()
            .enumerate()
            .map(|(i, n)| key(n, None, 300.0, i + 2))
            .collect();
        keys.push(key("lot 7", None, 320.0, 5002));
        assert_eq!(rows(&keys), [7, 5000]);
    }

    #[test]
    fn agreeing_duplicates_pass() {
        let keys = [key("water", None, 373.15, 2), key("Water", None, 373.12, 3)];
        assert!(check_duplicates(&keys, 1.0).is_empty());
    }
}
