//! Properties from structure: Joback group contributions, the Stein–Brown
//! boiling-point correction, a Lee–Kesler vapor-pressure curve, anchoring to
//! measured points, and a calibrated 90 % interval for the boiling point.
//!
//! Every heavy atom is assigned to one of the 41 Joback groups
//! ([`assign_groups`]); the group sums give Tb, Tm, Tc, pc, Vc, ΔHf°, ΔGf°,
//! Cp(T), ΔHvap(Tb) and ΔHfus ([`joback`]). The recommended `tb_k` is the
//! variant that measured best on the embedded dev set ([`calibration`]); Tc is
//! computed from that Tb. The acentric factor and curve follow from Tb, Tc,
//! pc by Lee–Kesler ([`Estimate::curve`]).
//!
//! Estimates are not measurements: check them against data before a
//! distillation is planned on them.
//!
//! Reference: K. G. Joback, R. C. Reid, Chem. Eng. Commun. 57 (1987) 233–243;
//! S. E. Stein, R. L. Brown, J. Chem. Inf. Comput. Sci. 34 (1994) 581–587;
//! B. I. Lee, M. G. Kesler, AIChE J. 21 (1975) 510–527.
//!
//! ```
//! let e = ebullio::estimate::estimate_smiles("CCCCCC").unwrap();
//! assert!((e.tb_joback_k - 336.68).abs() < 0.01); // 198 + 2·23.58 + 4·22.88
//! assert!(e.tb_pi90_low_k < e.tb_k && e.tb_k < e.tb_pi90_high_k);
//! use ebullio::vapor::Curve;
//! let t = e.curve().unwrap().t_at(101_325.0).unwrap();
//! assert!((t - e.tb_k).abs() < 1e-6);
//! ```

pub mod anchor;
pub mod batch;
mod groups;
pub mod interval;
pub mod joback;
pub mod lee_kesler;
pub mod stein_brown;

pub use groups::{assign_groups, group, parse_groups, table, Group, GroupCounts};
pub use interval::{calibration, Calibration, Comfort, TbVariant};
pub use lee_kesler::LeeKeslerCurve;

use crate::molecule::{parse_smiles, Element, Molecule, SmilesError};

/// Why a structure could not be estimated.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum EstimateError {
    /// The SMILES could not be read.
    #[error(transparent)]
    Smiles(#[from] SmilesError),
    /// Several dot-separated components (a salt or mixture).
    #[error("the SMILES has {count} dot-separated components (a salt or mixture); estimate each component separately")]
    MultipleComponents {
        /// Number of components.
        count: usize,
    },
    /// An atom that fits no Joback group.
    #[error("no Joback group for {atom} at position {position}: {reason}")]
    NoGroup {
        /// Element symbol.
        atom: String,
        /// 1-based character position in the SMILES.
        position: usize,
        /// Why.
        reason: String,
    },
    /// A group id not in the table.
    #[error("unknown Joback group id '{id}' (see `reference-data/joback-groups.csv` for the ids)")]
    UnknownGroup {
        /// The id given.
        id: String,
    },
    /// A malformed `id=count` entry.
    #[error("'{text}' is not 'group_id=count' with a whole count")]
    BadGroupCount {
        /// The entry.
        text: String,
    },
    /// No groups at all.
    #[error("no groups given")]
    NoGroups,
    /// A group present without a published boiling-point contribution.
    #[error("group '{group}' has no published {property} contribution")]
    MissingContribution {
        /// Group id.
        group: String,
        /// Property.
        property: &'static str,
    },
    /// Anchoring to measured points failed.
    #[error("{0}")]
    Anchor(String),
}

/// Ideal-gas heat capacity Cp(T) = a + bT + cT² + dT³ (J/(mol·K), T in K).
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct CpPolynomial {
    /// a, J/(mol·K).
    pub a: f64,
    /// b, J/(mol·K²).
    pub b: f64,
    /// c, J/(mol·K³).
    pub c: f64,
    /// d, J/(mol·K⁴).
    pub d: f64,
    /// Stated validity, K.
    pub valid_k: (f64, f64),
}

impl CpPolynomial {
    /// Cp at `t_k`, J/(mol·K).
    pub fn at(&self, t_k: f64) -> f64 {
        joback::cp_j_mol_k([self.a, self.b, self.c, self.d], t_k)
    }
}

/// Everything estimated for one structure. Optional fields are `None` where
/// a group present has no published contribution.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Estimate {
    /// The SMILES given (None for manual groups).
    pub smiles: Option<String>,
    /// Molecular formula (None for manual groups).
    pub formula: Option<String>,
    /// Recommended normal boiling point, K (variant in `tb_variant`).
    pub tb_k: f64,
    /// Lower end of the calibrated 90 % prediction interval, K.
    pub tb_pi90_low_k: f64,
    /// Upper end of the calibrated 90 % prediction interval, K.
    pub tb_pi90_high_k: f64,
    /// Typical error of `tb_k` for this structure, K (mean absolute error scaled to its Tb and comfort factor).
    pub tb_typical_error_k: f64,
    /// Joback & Reid boiling point, K (always given).
    pub tb_joback_k: f64,
    /// Stein & Brown corrected boiling point, K.
    pub tb_stein_brown_k: f64,
    /// Which variant `tb_k` is.
    pub tb_variant: TbVariant,
    /// Comfort-zone factor and reasons for a wider interval.
    pub comfort: Comfort,
    /// Melting point, K.
    pub tm_k: Option<f64>,
    /// Critical temperature, K (from `tb_k`).
    pub tc_k: Option<f64>,
    /// Critical pressure, bar.
    pub pc_bar: Option<f64>,
    /// Critical volume, cm³/mol.
    pub vc_cm3_mol: Option<f64>,
    /// Ideal-gas ΔHf° at 298 K, kJ/mol.
    pub hf_kj_mol: Option<f64>,
    /// Ideal-gas ΔGf° at 298 K, kJ/mol.
    pub gf_kj_mol: Option<f64>,
    /// Ideal-gas Cp polynomial.
    pub cp: Option<CpPolynomial>,
    /// Enthalpy of vaporization at Tb, kJ/mol.
    pub hvap_tb_kj_mol: Option<f64>,
    /// Enthalpy of fusion, kJ/mol.
    pub hfus_kj_mol: Option<f64>,
    /// Acentric factor (Lee–Kesler from Tb, Tc, pc).
    pub omega: Option<f64>,
    /// Total atoms, hydrogens included (Na of the pc equation).
    pub n_atoms: u32,
    /// Joback group id → count.
    pub groups: GroupCounts,
}

/// Group-level result before the recommended variant is chosen.
#[derive(Debug, Clone)]
pub(crate) struct Raw {
    pub groups: GroupCounts,
    pub sums: joback::GroupSums,
    pub n_atoms: u32,
    pub tb_joback_k: f64,
    pub tb_stein_brown_k: f64,
    pub comfort: Comfort,
    pub smiles: Option<String>,
    pub formula: Option<String>,
}

const STRONGLY_POLAR: [&str; 8] = [
    "oh_alcohol",
    "oh_phenol",
    "cooh",
    "nh2",
    "nh_chain",
    "nh_ring",
    "cn",
    "no2",
];

fn polar_count(g: &GroupCounts) -> u32 {
    STRONGLY_POLAR.iter().filter_map(|id| g.get(*id)).sum()
}

fn raw_from_groups(
    groups: GroupCounts,
    n_atoms: u32,
    heavy: u32,
    amide_like: bool,
) -> Result<Raw, EstimateError> {
    let sums = joback::sums(&groups);
    let Some(stb) = sums.tb else {
        let g = groups
            .keys()
            .find(|id| group(id).is_some_and(|g| g.tb.is_none()))
            .cloned()
            .unwrap_or_default();
        return Err(EstimateError::MissingContribution {
            group: g,
            property: "boiling-point",
        });
    };
    let tb = joback::tb_k(stb);
    let comfort = interval::comfort(heavy, amide_like, polar_count(&groups));
    Ok(Raw {
        groups,
        sums,
        n_atoms,
        tb_joback_k: tb,
        tb_stein_brown_k: stein_brown::corrected_tb_k(tb),
        comfort,
        smiles: None,
        formula: None,
    })
}

fn raw_from_molecule(m: &Molecule) -> Result<Raw, EstimateError> {
    if m.components() > 1 {
        return Err(EstimateError::MultipleComponents {
            count: m.components(),
        });
    }
    let groups = assign_groups(m)?;
    let heavy = (0..m.atoms().len()).filter(|&i| m.is_heavy(i)).count() as u32;
    // Amide-like: a nitrogen bonded to a carbon that carries a double-bonded oxygen.
    let amide_like = (0..m.atoms().len()).any(|i| {
        m.atoms()[i].element == Element::N
            && m.neighbours(i).iter().any(|&(c, _)| {
                m.atoms()[c].element == Element::C
                    && m.neighbours(c).iter().any(|&(o, k)| {
                        m.atoms()[o].element == Element::O
                            && m.bonds()[k].order == crate::molecule::BondOrder::Double
                    })
            })
    });
    let mut r = raw_from_groups(groups, m.atom_count_with_hydrogens(), heavy, amide_like)?;
    r.smiles = Some(m.smiles().to_string());
    r.formula = Some(m.formula());
    Ok(r)
}

pub(crate) fn raw_from_smiles(s: &str) -> Result<Raw, EstimateError> {
    raw_from_molecule(&parse_smiles(s)?)
}

fn finish(r: Raw) -> Estimate {
    let cal = calibration();
    let variant = cal.variant;
    let tb = variant.pick(r.tb_joback_k, r.tb_stein_brown_k);
    let hw = cal.q90 * tb * r.comfort.factor;
    let s = &r.sums;
    let tc =
        s.tc.map(|x| joback::tc_k(tb, x))
            .filter(|t| t.is_finite() && *t > tb);
    let pc =
        s.pc.map(|x| joback::pc_bar(r.n_atoms, x))
            .filter(|p| p.is_finite() && *p > 0.0);
    let omega = match (tc, pc) {
        (Some(tc), Some(pc)) => Some(lee_kesler::omega(tb, tc, pc * 1e5)),
        _ => None,
    };
    let cp = match s.cp {
        [Some(a), Some(b), Some(c), Some(d)] => {
            let k = joback::cp_coefficients([a, b, c, d]);
            Some(CpPolynomial {
                a: k[0],
                b: k[1],
                c: k[2],
                d: k[3],
                valid_k: joback::CP_VALID_K,
            })
        }
        _ => None,
    };
    Estimate {
        smiles: r.smiles,
        formula: r.formula,
        tb_k: tb,
        tb_pi90_low_k: tb - hw,
        tb_pi90_high_k: tb + hw,
        tb_typical_error_k: cal.typical_rel * tb * r.comfort.factor,
        tb_joback_k: r.tb_joback_k,
        tb_stein_brown_k: r.tb_stein_brown_k,
        tb_variant: variant,
        comfort: r.comfort,
        tm_k: s.tm.map(joback::tm_k),
        tc_k: tc,
        pc_bar: pc,
        vc_cm3_mol: s.vc.map(joback::vc_cm3_mol),
        hf_kj_mol: s.hform.map(joback::hf_kj_mol),
        gf_kj_mol: s.gform.map(joback::gf_kj_mol),
        cp,
        hvap_tb_kj_mol: s.hvap.map(joback::hvap_kj_mol),
        hfus_kj_mol: s.hfus.map(joback::hfus_kj_mol),
        omega,
        n_atoms: r.n_atoms,
        groups: r.groups,
    }
}

/// Estimate from a SMILES string.
pub fn estimate_smiles(s: &str) -> Result<Estimate, EstimateError> {
    raw_from_smiles(s).map(finish)
}

/// Estimate from a parsed molecule.
pub fn estimate_molecule(m: &Molecule) -> Result<Estimate, EstimateError> {
    raw_from_molecule(m).map(finish)
}

/// Estimate from group counts given by hand (ids from the table). Atom
/// counts come from the groups' written formulas.
///
/// ```
/// let g = ebullio::estimate::parse_groups("ch3=2,co_chain=1").unwrap();
/// let e = ebullio::estimate::estimate_groups(&g).unwrap();
/// assert!((e.tb_joback_k - 321.91).abs() < 1e-9); // acetone, JOBACK.md §6
/// ```
pub fn estimate_groups(g: &GroupCounts) -> Result<Estimate, EstimateError> {
    if g.is_empty() {
        return Err(EstimateError::NoGroups);
    }
    for id in g.keys() {
        if group(id).is_none() {
            return Err(EstimateError::UnknownGroup { id: id.clone() });
        }
    }
    let s = joback::sums(g);
    let has_n = g.keys().any(|k| k.starts_with("nh") || k.contains("n_"));
    let has_co = g.keys().any(|k| k.starts_with("co") || k == "cho");
    raw_from_groups(g.clone(), s.atoms.0 + s.atoms.1, s.atoms.0, has_n && has_co).map(finish)
}

impl Estimate {
    /// The Lee–Kesler vapor-pressure curve through (tb_k, 1 atm), if Tc and pc exist.
    /// Its `t_uncertainty_k` is the calibrated typical error scaled by T/Tb.
    pub fn curve(&self) -> Option<LeeKeslerCurve> {
        let (tc, pc) = (self.tc_k?, self.pc_bar?);
        Some(LeeKeslerCurve::from_tb(
            self.tb_k,
            tc,
            pc * 1e5,
            Some((self.tb_pi90_high_k - self.tb_k) / 1.645),
        ))
    }

    /// The standard cautions that go with any estimate.
    pub fn cautions() -> &'static [&'static str] {
        &[
            "Estimates are not measurements: confirm boiling points on a small scale before relying on them.",
            "Vapors of most organic liquids are flammable; vacuum glassware can implode; watch for bumping and peroxide formers; never distill to dryness.",
            "Defer to local codes and qualified process-safety review before any physical operation.",
        ]
    }
}
