//! Joback property equations from group sums: Tb, Tm, Tc, pc, Vc, ΔHf°, ΔGf°, Cp(T), ΔHvap, ΔHfus.
//!
//! Reference: K. G. Joback, R. C. Reid, Chem. Eng. Commun. 57 (1987) 233–243
//! (equations confirmed as listed in `reference-data/JOBACK.md` §3).

use super::groups::{group, table, Group, GroupCounts};
use super::terms::{TermCounts, N_JOBACK};

/// Sums of every group contribution; `None` where a present group has no value.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct GroupSums {
    /// ΣΔTc.
    pub tc: Option<f64>,
    /// ΣΔPc.
    pub pc: Option<f64>,
    /// ΣΔVc.
    pub vc: Option<f64>,
    /// ΣΔTb.
    pub tb: Option<f64>,
    /// ΣΔTm.
    pub tm: Option<f64>,
    /// ΣΔHf.
    pub hform: Option<f64>,
    /// ΣΔGf.
    pub gform: Option<f64>,
    /// Σa, Σb, Σc, Σd.
    pub cp: [Option<f64>; 4],
    /// ΣΔHfus.
    pub hfus: Option<f64>,
    /// ΣΔHvap.
    pub hvap: Option<f64>,
    /// Heavy atoms and hydrogens implied by the groups.
    pub atoms: (u32, u32),
}

fn acc(total: &mut Option<f64>, v: Option<f64>, n: f64) {
    *total = match (*total, v) {
        (Some(t), Some(x)) => Some(t + n * x),
        _ => None,
    };
}

/// Sum contributions over `groups` (unknown ids are skipped; callers validate ids).
pub fn sums(groups: &GroupCounts) -> GroupSums {
    sums_over(groups.iter().filter_map(|(id, &n)| Some((group(id)?, n))))
}

/// [`sums`] over counts by index (the Joback groups among them, in the same order).
pub fn sums_counts(c: &TermCounts) -> GroupSums {
    // The same additions as `sums_over`, in the same order, over a dense table: a missing
    // contribution is NaN, which stays NaN through the sum as `None` stays `None` there
    // (the contributions are finite, so no sum turns NaN otherwise).
    let d = dense();
    let mut s = [0.0f64; 14];
    let mut atoms = (0u32, 0u32);
    for &i in SORTED_JOBACK.iter() {
        let count = c.0[i as usize];
        if count == 0 {
            continue;
        }
        let n = count as f64;
        let row = &d.values[i as usize];
        for k in 0..14 {
            s[k] += n * row[k];
        }
        let a = d.atoms[i as usize];
        atoms.0 += count * a.0;
        atoms.1 += count * a.1;
    }
    let v = |k: usize| Some(s[k]).filter(|x| !x.is_nan());
    GroupSums {
        tc: v(0),
        pc: v(1),
        vc: v(2),
        tb: v(3),
        tm: v(4),
        hform: v(5),
        gform: v(6),
        cp: [v(7), v(8), v(9), v(10)],
        hfus: v(11),
        hvap: v(12),
        atoms,
    }
}

/// The Joback groups' term indices in [`crate::estimate::terms::SORTED`] order (the order
/// `sums_over` adds a map's groups in).
const SORTED_JOBACK: [u8; N_JOBACK] = {
    let mut out = [0u8; N_JOBACK];
    let (mut i, mut k) = (0, 0);
    while i < crate::estimate::terms::SORTED.len() {
        let t = crate::estimate::terms::SORTED[i];
        if (t as usize) < N_JOBACK {
            out[k] = t;
            k += 1;
        }
        i += 1;
    }
    assert!(k == N_JOBACK);
    out
};

/// The table's contributions by term index, NaN where none is published (order of
/// [`GroupSums`]' fields: tc, pc, vc, tb, tm, hform, gform, cp a–d, hfus, hvap; one spare).
struct Dense {
    values: [[f64; 14]; N_JOBACK],
    atoms: [(u32, u32); N_JOBACK],
}

fn dense() -> &'static Dense {
    static D: std::sync::OnceLock<Dense> = std::sync::OnceLock::new();
    D.get_or_init(|| {
        let mut d = Dense {
            values: [[0.0; 14]; N_JOBACK],
            atoms: [(0, 0); N_JOBACK],
        };
        for (i, g) in table().iter().enumerate().take(N_JOBACK) {
            let x = |v: Option<f64>| v.unwrap_or(f64::NAN);
            d.values[i] = [
                x(g.tc),
                x(g.pc),
                x(g.vc),
                x(g.tb),
                x(g.tm),
                x(g.hform),
                x(g.gform),
                x(g.cp[0]),
                x(g.cp[1]),
                x(g.cp[2]),
                x(g.cp[3]),
                x(g.hfus),
                x(g.hvap),
                0.0,
            ];
            d.atoms[i] = g.atoms;
        }
        d
    })
}

fn sums_over<'a>(groups: impl Iterator<Item = (&'a Group, u32)>) -> GroupSums {
    let z = Some(0.0);
    let mut s = GroupSums {
        tc: z,
        pc: z,
        vc: z,
        tb: z,
        tm: z,
        hform: z,
        gform: z,
        cp: [z; 4],
        hfus: z,
        hvap: z,
        atoms: (0, 0),
    };
    for (g, count) in groups {
        let n = count as f64;
        acc(&mut s.tc, g.tc, n);
        acc(&mut s.pc, g.pc, n);
        acc(&mut s.vc, g.vc, n);
        acc(&mut s.tb, g.tb, n);
        acc(&mut s.tm, g.tm, n);
        acc(&mut s.hform, g.hform, n);
        acc(&mut s.gform, g.gform, n);
        for k in 0..4 {
            acc(&mut s.cp[k], g.cp[k], n);
        }
        acc(&mut s.hfus, g.hfus, n);
        acc(&mut s.hvap, g.hvap, n);
        s.atoms.0 += count * g.atoms.0;
        s.atoms.1 += count * g.atoms.1;
    }
    s
}

/// Normal boiling point, K: Tb = 198 + ΣΔTb.
pub fn tb_k(sum_tb: f64) -> f64 {
    198.0 + sum_tb
}

/// Melting point, K: Tm = 122.5 + ΣΔTm.
pub fn tm_k(sum_tm: f64) -> f64 {
    122.5 + sum_tm
}

/// Critical temperature, K: Tc = Tb / (0.584 + 0.965 ΣΔTc − (ΣΔTc)²).
///
/// ```
/// // Acetone, JOBACK.md §6 (computed from the table): ΣΔTc = 0.0662, Tb = 321.91 K.
/// let tc = ebullio::estimate::joback::tc_k(321.91, 0.0662);
/// assert!((tc - 500.248).abs() < 0.01);
/// ```
pub fn tc_k(tb_k: f64, sum_tc: f64) -> f64 {
    tb_k / (0.584 + 0.965 * sum_tc - sum_tc * sum_tc)
}

/// Critical pressure, bar: pc = (0.113 + 0.0032·Na − ΣΔPc)^−2, Na = all atoms incl. H.
pub fn pc_bar(n_atoms: u32, sum_pc: f64) -> f64 {
    let x = 0.113 + 0.0032 * n_atoms as f64 - sum_pc;
    1.0 / (x * x)
}

/// Critical volume, cm³/mol: Vc = 17.5 + ΣΔVc.
pub fn vc_cm3_mol(sum_vc: f64) -> f64 {
    17.5 + sum_vc
}

/// Ideal-gas enthalpy of formation at 298 K, kJ/mol: 68.29 + ΣΔHf.
pub fn hf_kj_mol(sum: f64) -> f64 {
    68.29 + sum
}

/// Ideal-gas Gibbs energy of formation at 298 K, kJ/mol: 53.88 + ΣΔGf.
pub fn gf_kj_mol(sum: f64) -> f64 {
    53.88 + sum
}

/// Ideal-gas Cp polynomial coefficients [a, b, c, d] (J/(mol·K), T in K), valid 273–1000 K.
pub fn cp_coefficients(s: [f64; 4]) -> [f64; 4] {
    [s[0] - 37.93, s[1] + 0.210, s[2] - 3.91e-4, s[3] + 2.06e-7]
}

/// Cp(T) in J/(mol·K) from the coefficients of [`cp_coefficients`].
pub fn cp_j_mol_k(c: [f64; 4], t_k: f64) -> f64 {
    c[0] + t_k * (c[1] + t_k * (c[2] + t_k * c[3]))
}

/// Validity range of the Cp polynomial, K.
pub const CP_VALID_K: (f64, f64) = (273.0, 1000.0);

/// Enthalpy of vaporization at Tb, kJ/mol: 15.30 + ΣΔHvap.
pub fn hvap_kj_mol(sum: f64) -> f64 {
    15.30 + sum
}

/// Enthalpy of fusion, kJ/mol: −0.88 + ΣΔHfus.
pub fn hfus_kj_mol(sum: f64) -> f64 {
    -0.88 + sum
}

#[cfg(test)]
mod tests {
    use super::*;

    fn counts(list: &[(&str, u32)]) -> GroupCounts {
        list.iter().map(|(id, n)| (id.to_string(), *n)).collect()
    }

    // Acetone, CH3–CO–CH3: 2 × −CH3 + 1 × >C=O (non-ring). Contributions of Joback &
    // Reid (1987) as in reference-data/joback-groups.csv (ΔTb 23.58 and 76.75 K, ΔTc
    // 0.0141 and 0.0380, ΔPc −0.0012 and 0.0031, ΔVc 65 and 62 cm³/mol), summed by hand.
    #[test]
    fn acetone_group_sums_by_hand() {
        let s = sums(&counts(&[("ch3", 2), ("co_chain", 1)]));
        let near = |a: Option<f64>, b: f64| (a.unwrap() - b).abs() < 1e-9;
        assert!(near(s.tb, 2.0 * 23.58 + 76.75), "{:?}", s.tb);
        assert!(near(s.tc, 2.0 * 0.0141 + 0.0380), "{:?}", s.tc);
        assert!(near(s.pc, 2.0 * -0.0012 + 0.0031), "{:?}", s.pc);
        assert!(near(s.vc, 2.0 * 65.0 + 62.0), "{:?}", s.vc);
        // Tb = 198 + ΣΔTb = 321.91 K (Joback's estimate; measured 329.2 K).
        assert!((tb_k(s.tb.unwrap()) - 321.91).abs() < 1e-9);
        // C3H6O: three carbons and the oxygen are heavy atoms, six hydrogens.
        assert_eq!(s.atoms, (4, 6));
    }

    /// The dense sums by index equal the sums over the map, bit for bit, for every group
    /// alone, with missing contributions (None), and for seeded mixtures of groups.
    #[test]
    fn sums_by_index_equal_sums_over_the_map() {
        let ids: Vec<&str> = table().iter().map(|g| g.id.as_str()).collect();
        let mut cases: Vec<GroupCounts> = ids.iter().map(|id| counts(&[(id, 3)])).collect();
        let mut x: u64 = 0x9E37_79B9_7F4A_7C15;
        for _ in 0..2000 {
            let mut c = GroupCounts::new();
            for _ in 0..6 {
                x ^= x << 13;
                x ^= x >> 7;
                x ^= x << 17;
                let id = ids[(x % ids.len() as u64) as usize];
                *c.entry(id.to_string()).or_insert(0) += 1 + (x >> 40) as u32 % 5;
            }
            cases.push(c);
        }
        let mut with_none = 0;
        for c in &cases {
            let by_map = sums(c);
            let by_index = sums_counts(&TermCounts::from_map(c).unwrap());
            assert_eq!(format!("{by_map:?}"), format!("{by_index:?}"), "{c:?}");
            with_none += usize::from(by_map.tb.is_none() || by_map.hfus.is_none());
        }
        assert!(with_none > 0);
    }

    // Every Joback property equation for acetone (2 × −CH3, 1 × >C=O non-ring), with the
    // group values of reference-data/joback-groups.csv and the equations of Joback & Reid
    // (1987) evaluated by hand below (independent of the functions under test; issue 22:
    // cargo-mutants found tm_k, tc_k and pc_bar unchecked by the library's tests).
    #[test]
    fn acetone_property_equations_by_hand() {
        let s = sums(&counts(&[("ch3", 2), ("co_chain", 1)]));
        let close = |got: f64, want: f64| {
            assert!(
                (got - want).abs() <= 1e-9 * want.abs().max(1.0),
                "{got} vs {want}"
            )
        };
        // Tm = 122.5 + (2 × −5.10 + 61.20) = 173.5 K.
        close(tm_k(s.tm.unwrap()), 173.5);
        // Tc = 321.91 / (0.584 + 0.965 × 0.0662 − 0.0662²) = 321.91 / 0.64350056.
        close(tc_k(321.91, 0.0662), 321.91 / 0.643_500_56);
        // A second point, so no mutant matches both: ΣΔTc = 0.2, Tb = 400 K:
        // 400 / (0.584 + 0.193 − 0.04) = 400 / 0.737.
        close(tc_k(400.0, 0.2), 400.0 / 0.737);
        // pc = (0.113 + 0.0032 × 10 − 0.0007)⁻² = 0.1443⁻² bar (C3H6O: 10 atoms).
        close(
            pc_bar(s.atoms.0 + s.atoms.1, s.pc.unwrap()),
            1.0 / 0.020_822_49,
        );
        // Vc = 17.5 + (2 × 65 + 62) = 209.5 cm³/mol.
        close(vc_cm3_mol(s.vc.unwrap()), 209.5);
        // ΔHf = 68.29 + (2 × −76.45 − 133.22) = −217.83 kJ/mol.
        close(hf_kj_mol(s.hform.unwrap()), -217.83);
        // ΔGf = 53.88 + (2 × −43.96 − 120.50) = −154.54 kJ/mol.
        close(gf_kj_mol(s.gform.unwrap()), -154.54);
        // Cp: a = 2 × 19.5 + 6.45 − 37.93 = 7.52; b = 2 × −8.08e-3 + 6.70e-2 + 0.210 =
        // 0.26084; c = 2 × 1.53e-4 − 3.57e-5 − 3.91e-4 = −1.207e-4;
        // d = 2 × −9.67e-8 + 2.86e-9 + 2.06e-7 = 1.546e-8.
        let k = cp_coefficients([
            s.cp[0].unwrap(),
            s.cp[1].unwrap(),
            s.cp[2].unwrap(),
            s.cp[3].unwrap(),
        ]);
        for (got, want) in k.iter().zip([7.52, 0.26084, -1.207e-4, 1.546e-8]) {
            close(*got, want);
        }
        // Cp(300 K) = 7.52 + 78.252 − 10.863 + 0.41742 = 75.32642 J/(mol·K).
        close(cp_j_mol_k(k, 300.0), 75.32642);
        // ΔHvap = 15.30 + (2 × 2.373 + 8.972) = 29.018 kJ/mol.
        close(hvap_kj_mol(s.hvap.unwrap()), 29.018);
        // ΔHfus = −0.88 + (2 × 0.908 + 4.189) = 5.125 kJ/mol.
        close(hfus_kj_mol(s.hfus.unwrap()), 5.125);
    }

    // Toluene (5 × =CH– ring, 1 × =C< ring, 1 × −CH3): a second molecule for the group
    // sums, with counts other than 1 and 2 (kills `count + atoms` for `count * atoms`).
    #[test]
    fn toluene_group_sums_by_hand() {
        let s = sums(&counts(&[("eq_ch_ring", 5), ("eq_c_ring", 1), ("ch3", 1)]));
        // ΔTb: 5 × 26.73 + 31.01 + 23.58 = 188.24 K.
        assert!((s.tb.unwrap() - 188.24).abs() < 1e-9, "{:?}", s.tb);
        // C7H8: 7 heavy atoms, 8 hydrogens.
        assert_eq!(s.atoms, (7, 8));
    }

    // A group with no published ΔVc (=N− in a chain) leaves ΣΔVc unknown, not zero;
    // the sums it has are still added.
    #[test]
    fn a_missing_contribution_makes_its_sum_unknown() {
        let s = sums(&counts(&[("ch3", 1), ("eq_n_chain", 1)]));
        assert_eq!(s.vc, None);
        assert!((s.tb.unwrap() - (23.58 + 74.60)).abs() < 1e-9);
    }
}
