//! Properties from structure: Joback group contributions, the Stein–Brown
//! boiling-point correction, a Lee–Kesler vapor-pressure curve, anchoring to
//! measured points, and a calibrated 90 % interval for the boiling point.
//!
//! Every heavy atom is assigned to one of the 41 Joback groups
//! ([`assign_groups`]); the group sums give Tb, Tm, Tc, pc, Vc, ΔHf°, ΔGf°,
//! Cp(T), ΔHvap(Tb) and ΔHfus ([`joback`]). The recommended `tb_k` comes from
//! the variant that cross-validated best on the project's calibration set
//! ([`tb_model`], [`tb_fit`], [`calibration`]): groups refitted in a published
//! form, with this project's extra groups and second-order corrections
//! ([`tb_features`]) for amides, carbamates, ureas, sulfoxides, sulfones, ring
//! tertiary amines, pyrrole-type N–H and fused aromatic rings. The published
//! Joback value stays available as `tb_joback_k`. Tc is computed from `tb_k`.
//! The acentric factor and curve follow from Tb, Tc, pc by Lee–Kesler
//! ([`Estimate::curve`]).
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
//! assert!((e.tb_joback_k.unwrap() - 336.68).abs() < 0.01); // 198 + 2·23.58 + 4·22.88
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
pub mod tb_features;
pub mod tb_fit;
pub mod tb_model;
pub mod terms;

pub use groups::{assign_groups, assign_tb_groups, group, parse_groups, table, Group, GroupCounts};
pub use interval::{calibration, Calibration, Comfort, TbVariant};
pub use lee_kesler::LeeKeslerCurve;
pub use tb_features::{Family, IntervalClass};

use crate::molecule::{parse_smiles, parse_smiles_into, Molecule, SmilesError};
use terms::TermCounts;

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
    /// Standard uncertainty of `tb_k` implied by the interval (half-width / 1.645), K.
    pub tb_typical_error_k: f64,
    /// Joback & Reid boiling point with the published values, K (None where the
    /// published table has no group for an atom, e.g. a sulfoxide or a ring >N-).
    pub tb_joback_k: Option<f64>,
    /// Stein & Brown correction of the published Joback value, K.
    pub tb_stein_brown_k: Option<f64>,
    /// Which variant `tb_k` is.
    pub tb_variant: TbVariant,
    /// Every variant's boiling point, K, by variant name.
    pub tb_variants: std::collections::BTreeMap<&'static str, f64>,
    /// Structural family.
    pub family: Family,
    /// Class whose calibrated interval applies (the family, halides split by fluorine).
    pub interval_class: IntervalClass,
    /// Groups and corrections behind `tb_k`, each with its value and origin.
    pub tb_terms: Vec<TbTerm>,
    /// Comfort-zone factor and reasons for a wider interval.
    pub comfort: Comfort,
    /// Caveats on how the values were obtained.
    pub notes: Vec<String>,
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

/// One group or correction behind `tb_k`.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct TbTerm {
    /// Group or correction id.
    pub id: String,
    /// `group` (first order) or `correction` (second order).
    pub kind: &'static str,
    /// Occurrences.
    pub count: u32,
    /// Value in the shipped model (on its form's scale), this project's regression.
    pub value: f64,
    /// Standard error of the value (None when not fitted).
    pub se: Option<f64>,
    /// Calibration compounds containing the term.
    pub n_compounds: u32,
    /// `project-fit` (regressed on the calibration set) or `prior-not-fitted`.
    pub origin: &'static str,
    /// The published Joback ΔTb of the group, K (None for this project's own terms).
    pub published_joback_dtb_k: Option<f64>,
}

/// Group-level result before the recommended variant is chosen (counts by term index).
#[derive(Debug, Clone)]
pub(crate) struct Raw {
    /// Joback groups for the published property equations (nearest published group
    /// standing in for this project's new groups; see `approximated`).
    pub groups: TermCounts,
    pub sums: joback::GroupSums,
    pub n_atoms: u32,
    pub tb_joback_k: Option<f64>,
    /// Extended terms of the boiling-point model.
    pub terms: TermCounts,
    pub family: Family,
    pub class: IntervalClass,
    pub polar: u32,
    /// New groups that stand in as their nearest published group.
    pub approximated: bool,
}

fn missing_tb(groups: &TermCounts) -> EstimateError {
    let t = table();
    let g = groups
        .iter_sorted()
        .find(|&(i, _)| i < terms::N_JOBACK && t[i].tb.is_none())
        .map(|(i, _)| terms::IDS[i].to_string())
        .unwrap_or_default();
    EstimateError::MissingContribution {
        group: g,
        property: "boiling-point",
    }
}

fn raw_from_molecule(m: &Molecule) -> Result<Raw, EstimateError> {
    if m.components() > 1 {
        return Err(EstimateError::MultipleComponents {
            count: m.components(),
        });
    }
    let f = match tb_features::feature_counts(m) {
        Ok(f) => f,
        Err(e) => {
            // the published assignment's error when it fails too (it names the atom the
            // published table cannot place)
            let mut published = TermCounts::new();
            return Err(groups::assign_counts(m, false, &mut published)
                .err()
                .unwrap_or(e));
        }
    };
    // The extended assignment differs from the published one only by the new groups:
    // without them it is the published assignment; with them the published one fails and
    // each new group stands in as its nearest published group.
    let approximated = (terms::N_JOBACK..terms::FIRST_CORRECTION).any(|i| f.terms.get(i) > 0);
    let groups = f.terms.published();
    let sums = joback::sums_counts(&groups);
    if sums.tb.is_none() {
        return Err(missing_tb(&groups));
    }
    let tb_joback_k = if approximated {
        None
    } else {
        sums.tb.map(joback::tb_k)
    };
    Ok(Raw {
        groups,
        sums,
        n_atoms: m.atom_count_with_hydrogens(),
        tb_joback_k,
        terms: f.terms,
        family: f.family,
        class: f.class,
        polar: f.polar,
        approximated,
    })
}

/// The numbers of one estimate, computed without building any text, map or list: what
/// the CSV output holds. [`Estimate`] carries the same numbers with their explanations.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Numbers {
    /// Recommended normal boiling point, K.
    pub tb_k: f64,
    /// Half-width of the 90 % interval, K.
    pub half_width_k: f64,
    /// Published Joback boiling point, K.
    pub tb_joback_k: Option<f64>,
    /// Which variant `tb_k` is.
    pub tb_variant: TbVariant,
    /// Bit set over term indices of the shipped model's terms outside the calibration.
    outside: u64,
    /// The shipped model (index into the committed models), if any.
    shipped: Option<usize>,
    /// Melting point, K.
    pub tm_k: Option<f64>,
    /// Critical temperature, K.
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
    /// Acentric factor.
    pub omega: Option<f64>,
    /// Joback groups by term index (the published groups only).
    pub groups: TermCounts,
}

impl Numbers {
    /// Stein & Brown correction of the published Joback value, K.
    pub fn tb_stein_brown_k(&self) -> Option<f64> {
        self.tb_joback_k.map(stein_brown::corrected_tb_k)
    }

    /// The Lee–Kesler curve, as [`Estimate::curve`] gives it.
    pub fn curve(&self) -> Option<LeeKeslerCurve> {
        let (tc, pc) = (self.tc_k?, self.pc_bar?);
        let high = self.tb_k + self.half_width_k;
        Some(LeeKeslerCurve::from_tb(
            self.tb_k,
            tc,
            pc * 1e5,
            Some((high - self.tb_k) / 1.645),
        ))
    }
}

/// Every variant's boiling point, K, in [`TbVariant::ALL`] order (what
/// [`Estimate::tb_variants`] lists; the CSV path needs only the shipped one).
fn variants(r: &Raw) -> [Option<f64>; 6] {
    let mut variants = [None; 6];
    let slot = |v: TbVariant| TbVariant::ALL.iter().position(|&x| x == v).unwrap_or(0);
    if let Some(j) = r.tb_joback_k {
        variants[slot(TbVariant::Joback)] = Some(j);
        variants[slot(TbVariant::SteinBrown)] = Some(stein_brown::corrected_tb_k(j));
    }
    let (extended, published) = (r.terms.present(), r.terms.published().present());
    let new_groups = r.terms.new_groups();
    for m in tb_model::indexed_models() {
        let p = m.predict_present(&extended, &published, new_groups);
        if p.tb_k.is_finite() {
            variants[slot(m.model.variant)] = Some(p.tb_k);
        }
    }
    variants
}

fn numbers(r: &Raw) -> Numbers {
    let cal = calibration();
    let mut shipped = None;
    let new_groups = r.terms.new_groups();
    // only the shipped variant's model is evaluated (the others are for `variants`)
    for (k, m) in tb_model::indexed_models().iter().enumerate() {
        if m.model.variant != cal.variant {
            continue;
        }
        // the model reads the extended or the published terms, by its variant
        let terms = if m.model.variant.extended() {
            r.terms.present()
        } else {
            r.terms.published().present()
        };
        let p = m.predict_present(&terms, &terms, new_groups);
        if p.tb_k.is_finite() {
            shipped = Some((k, p));
        }
    }
    // Without a committed model (or outside its domain) the published value ships.
    let (tb, variant, outside) = match &shipped {
        Some((k, p)) => (
            p.tb_k,
            tb_model::indexed_models()[*k].model.variant,
            p.outside,
        ),
        None => (
            joback::tb_k(r.sums.tb.unwrap_or(0.0)),
            TbVariant::Joback,
            new_groups,
        ),
    };
    let factor = interval::comfort_factor(outside != 0, r.polar);
    let hw = cal.q90_k(r.class) * factor;
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
    Numbers {
        tb_k: tb,
        half_width_k: hw,
        tb_joback_k: r.tb_joback_k,
        tb_variant: variant,
        outside,
        shipped: shipped.map(|(k, _)| k),
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
        groups: r.groups,
    }
}

/// The numbers of the estimate of `s` (what [`estimate_smiles`] gives, without its
/// texts), and the molecule they came from (for its formula).
pub fn estimate_numbers(s: &str) -> Result<(Numbers, Molecule), EstimateError> {
    let mut m = Molecule::empty();
    let n = estimate_numbers_into(s, &mut m)?;
    Ok((n, m))
}

/// [`estimate_numbers`] with the structure read into `m` (its storage reused: a batch
/// keeps one molecule for all its structures). The numbers and errors are the same;
/// after an error `m` holds nothing meaningful.
pub fn estimate_numbers_into(s: &str, m: &mut Molecule) -> Result<Numbers, EstimateError> {
    parse_smiles_into(s, m)?;
    let r = raw_from_molecule(m)?;
    Ok(numbers(&r))
}

fn finish(r: Raw, smiles: Option<String>, formula: Option<String>) -> Estimate {
    let n = numbers(&r);
    let mut notes = Vec::new();
    let approximated: Vec<String> = (terms::N_JOBACK..terms::FIRST_CORRECTION)
        .filter(|&i| r.approximated && r.terms.get(i) > 0)
        .map(|i| terms::IDS[i])
        .collect::<std::collections::BTreeSet<_>>()
        .into_iter()
        .map(str::to_string)
        .collect();
    let (outside, terms) = match n.shipped {
        Some(k) => {
            let im = &tb_model::indexed_models()[k];
            let m = im.model;
            let used = if m.variant.extended() {
                r.terms
            } else {
                r.terms.published()
            };
            let terms = used
                .iter_sorted()
                .map(|(i, count)| {
                    let id = terms::IDS[i];
                    let c = m.contributions.get(id);
                    TbTerm {
                        kind: if terms::is_correction(i) {
                            "correction"
                        } else {
                            "group"
                        },
                        count,
                        value: c.map_or(0.0, |c| c.value),
                        se: c.and_then(|c| c.se),
                        n_compounds: c.map_or(0, |c| c.n_compounds),
                        origin: if c.is_some_and(|c| c.fitted) {
                            "project-fit"
                        } else {
                            "prior-not-fitted"
                        },
                        published_joback_dtb_k: group(id).and_then(|g| g.tb),
                        id: id.to_string(),
                    }
                })
                .collect();
            (im.outside_ids(n.outside), terms)
        }
        None => {
            if r.tb_joback_k.is_none() {
                notes.push("no fitted model covers this structure: tb_k is Joback with the nearest published groups".into());
            }
            (approximated.clone(), Vec::new())
        }
    };
    let comfort = interval::comfort(&outside, r.polar);
    if !approximated.is_empty() {
        notes.push(format!(
            "the published Joback table has no group for {}: Tc, pc, Vc and the other Joback properties use the nearest published group ({}), an approximation of this project",
            approximated.join(", "),
            approximated
                .iter()
                .map(|id| format!("{id} as {}", tb_features::nearest_published(id)))
                .collect::<Vec<_>>()
                .join(", ")
        ));
    }
    let hw = n.half_width_k;
    let tb = n.tb_k;
    Estimate {
        smiles,
        formula,
        tb_k: tb,
        tb_pi90_low_k: tb - hw,
        tb_pi90_high_k: tb + hw,
        tb_typical_error_k: hw / 1.645,
        tb_joback_k: r.tb_joback_k,
        tb_stein_brown_k: n.tb_stein_brown_k(),
        tb_variant: n.tb_variant,
        tb_variants: TbVariant::ALL
            .iter()
            .zip(variants(&r))
            .filter_map(|(v, t)| Some((v.name(), t?)))
            .collect(),
        family: r.family,
        interval_class: r.class,
        tb_terms: terms,
        comfort,
        notes,
        tm_k: n.tm_k,
        tc_k: n.tc_k,
        pc_bar: n.pc_bar,
        vc_cm3_mol: n.vc_cm3_mol,
        hf_kj_mol: n.hf_kj_mol,
        gf_kj_mol: n.gf_kj_mol,
        cp: n.cp,
        hvap_tb_kj_mol: n.hvap_tb_kj_mol,
        hfus_kj_mol: n.hfus_kj_mol,
        omega: n.omega,
        n_atoms: r.n_atoms,
        groups: r.groups.to_map(),
    }
}

fn finish_molecule(r: Raw, m: &Molecule) -> Estimate {
    finish(r, Some(m.smiles().to_string()), Some(m.formula()))
}

/// Estimate from a SMILES string.
pub fn estimate_smiles(s: &str) -> Result<Estimate, EstimateError> {
    estimate_molecule(&parse_smiles(s)?)
}

/// Estimate from a parsed molecule.
pub fn estimate_molecule(m: &Molecule) -> Result<Estimate, EstimateError> {
    raw_from_molecule(m).map(|r| finish_molecule(r, m))
}

/// Estimate from group counts given by hand (ids from the table). Atom
/// counts come from the groups' written formulas.
///
/// ```
/// let g = ebullio::estimate::parse_groups("ch3=2,co_chain=1").unwrap();
/// let e = ebullio::estimate::estimate_groups(&g).unwrap();
/// assert!((e.tb_joback_k.unwrap() - 321.91).abs() < 1e-9); // acetone, JOBACK.md §6
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
    let counts = TermCounts::from_map(g).map_err(|id| EstimateError::UnknownGroup { id })?;
    let s = joback::sums_counts(&counts);
    let Some(stb) = s.tb else {
        return Err(missing_tb(&counts));
    };
    let polar = [
        "oh_alcohol",
        "oh_phenol",
        "cooh",
        "nh2",
        "nh_chain",
        "nh_ring",
        "cn",
        "no2",
    ]
    .iter()
    .filter_map(|id| g.get(*id))
    .sum();
    Ok(finish(
        Raw {
            groups: counts,
            sums: s,
            n_atoms: s.atoms.0 + s.atoms.1,
            tb_joback_k: Some(joback::tb_k(stb)),
            terms: counts,
            family: tb_features::family_of_groups(g),
            class: tb_features::class_of_groups(g),
            polar,
            approximated: false,
        },
        None,
        None,
    ))
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
