//! Joback property equations from group sums: Tb, Tm, Tc, pc, Vc, ΔHf°, ΔGf°, Cp(T), ΔHvap, ΔHfus.
//!
//! Reference: K. G. Joback, R. C. Reid, Chem. Eng. Commun. 57 (1987) 233–243
//! (equations confirmed as listed in `reference-data/JOBACK.md` §3).

use super::groups::{group, GroupCounts};

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
    for (id, &count) in groups {
        let Some(g) = group(id) else { continue };
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

    // A group with no published ΔVc (=N− in a chain) leaves ΣΔVc unknown, not zero;
    // the sums it has are still added.
    #[test]
    fn a_missing_contribution_makes_its_sum_unknown() {
        let s = sums(&counts(&[("ch3", 1), ("eq_n_chain", 1)]));
        assert_eq!(s.vc, None);
        assert!((s.tb.unwrap() - (23.58 + 74.60)).abs() < 1e-9);
    }
}
