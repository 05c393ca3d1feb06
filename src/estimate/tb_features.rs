//! What the project's boiling-point model sees in a structure: extended
//! first-order groups, second-order corrections, structural family and the
//! number of strongly polar groups.
//!
//! Corrections (each counted once per occurrence): `amide_primary`,
//! `amide_secondary`, `amide_tertiary` (chain C(=O)–N with 2, 1, 0 H on N),
//! `amide_ring` (lactam: the C–N bond in a ring), `carbamate` (O–C(=O)–N),
//! `urea` (N–C(=O)–N), `sulfonamide` (S(=O)–N), `nh_aromatic` (pyrrole-type
//! N–H), `fused_aromatic` (an aromatic atom shared by two aromatic rings),
//! `ester_ring` (lactone or cyclic carbonate: the ester C–O bond in a ring),
//! `sulfoxide` (a sulfur with exactly one =O, on top of its `s_oxo`);
//! `perhalo_c` (a carbon with two or more halogens and no hydrogen, as in CF3
//! or CCl2F) and `halo_ch` (a carbon with a halogen and a hydrogen, as in CH2Cl
//! or CHF2): the published table gives a halogen one value wherever it sits, these
//! let the fit tell the carbon environments apart (an aryl halide carries
//! neither); and `arom_o_s` (an aromatic O or S,
//! as in furan or thiophene, which the published `o_ring`/`s_ring` groups do
//! not tell apart from the saturated ring).
//!
//! Reference: the idea of second-order corrections on top of first-order
//! groups follows L. Constantinou, R. Gani, AIChE J. 40 (1994) 1697–1710; the
//! choice of corrections and their values are this project's own.

use super::groups::{assign_counts, GroupCounts};
use super::terms::{t, TermCounts};
use super::EstimateError;
use crate::molecule::{BondOrder, Element, Molecule};

/// Ids of the corrections, in output order.
pub const CORRECTIONS: [&str; 14] = [
    "amide_primary",
    "amide_secondary",
    "amide_tertiary",
    "amide_ring",
    "carbamate",
    "urea",
    "sulfonamide",
    "nh_aromatic",
    "fused_aromatic",
    "ester_ring",
    "sulfoxide",
    "perhalo_c",
    "halo_ch",
    "arom_o_s",
];

/// First-order groups this project adds to the published table.
pub const NEW_GROUPS: [&str; 3] = ["n_ring_tert", "n_arom_sub", "s_oxo"];

/// The published group whose critical-property contributions stand in for a new group.
pub fn nearest_published(id: &str) -> &str {
    match id {
        "n_ring_tert" | "n_arom_sub" => "n_chain",
        "s_oxo" => "eq_o",
        other => other,
    }
}

/// Structural family used for the calibrated interval.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Family {
    /// Carbon and hydrogen only.
    Hydrocarbon,
    /// Halogen as the only heteroatom class.
    Halide,
    /// Oxygen as the only heteroatom class.
    Oxygen,
    /// Nitrogen as the only heteroatom class.
    Nitrogen,
    /// Sulfur as the only heteroatom class.
    Sulfur,
    /// Two or more heteroatom classes.
    Multifunctional,
}

impl Family {
    /// Every family, in table order.
    pub const ALL: [Family; 6] = [
        Family::Hydrocarbon,
        Family::Halide,
        Family::Oxygen,
        Family::Nitrogen,
        Family::Sulfur,
        Family::Multifunctional,
    ];

    /// Stable name used in files and output.
    pub fn name(self) -> &'static str {
        match self {
            Family::Hydrocarbon => "hydrocarbon",
            Family::Halide => "halide",
            Family::Oxygen => "oxygen",
            Family::Nitrogen => "nitrogen",
            Family::Sulfur => "sulfur",
            Family::Multifunctional => "multifunctional",
        }
    }

    /// The family of a name written by [`Family::name`].
    pub fn from_name(s: &str) -> Option<Family> {
        Family::ALL.into_iter().find(|f| f.name() == s)
    }

    /// Family from which heteroatom classes are present (halogen, O, N, S).
    pub fn from_classes(halogen: bool, o: bool, n: bool, s: bool) -> Family {
        match (halogen, o, n, s) {
            (false, false, false, false) => Family::Hydrocarbon,
            (true, false, false, false) => Family::Halide,
            (false, true, false, false) => Family::Oxygen,
            (false, false, true, false) => Family::Nitrogen,
            (false, false, false, true) => Family::Sulfur,
            _ => Family::Multifunctional,
        }
    }
}

/// Class whose 90 % interval applies: the structural family, with the halides split
/// in two. Fluorine makes group additivity fail more often (weak dispersion forces: the
/// out-of-fold errors of fluorine-containing halides have a 90 % quantile of 36 K
/// against 24.5 K for the other halides), so the two get their own half-widths.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum IntervalClass {
    /// Carbon and hydrogen only.
    Hydrocarbon,
    /// Halides with chlorine, bromine or iodine and no fluorine.
    Halide,
    /// Halides with at least one fluorine atom.
    FluorinatedHalide,
    /// Oxygen as the only heteroatom class.
    Oxygen,
    /// Nitrogen as the only heteroatom class.
    Nitrogen,
    /// Sulfur as the only heteroatom class.
    Sulfur,
    /// Two or more heteroatom classes.
    Multifunctional,
}

impl IntervalClass {
    /// Every class, in table order.
    pub const ALL: [IntervalClass; 7] = [
        IntervalClass::Hydrocarbon,
        IntervalClass::Halide,
        IntervalClass::FluorinatedHalide,
        IntervalClass::Oxygen,
        IntervalClass::Nitrogen,
        IntervalClass::Sulfur,
        IntervalClass::Multifunctional,
    ];

    /// The class of a molecule of `family` (`fluorinated`: it has a fluorine atom).
    ///
    /// ```
    /// use ebullio::estimate::tb_features::{Family, IntervalClass};
    /// assert_eq!(IntervalClass::of(Family::Halide, true), IntervalClass::FluorinatedHalide);
    /// assert_eq!(IntervalClass::of(Family::Oxygen, true), IntervalClass::Oxygen);
    /// ```
    pub fn of(family: Family, fluorinated: bool) -> IntervalClass {
        match family {
            Family::Hydrocarbon => IntervalClass::Hydrocarbon,
            Family::Halide if fluorinated => IntervalClass::FluorinatedHalide,
            Family::Halide => IntervalClass::Halide,
            Family::Oxygen => IntervalClass::Oxygen,
            Family::Nitrogen => IntervalClass::Nitrogen,
            Family::Sulfur => IntervalClass::Sulfur,
            Family::Multifunctional => IntervalClass::Multifunctional,
        }
    }

    /// The structural family the class belongs to.
    pub fn family(self) -> Family {
        match self {
            IntervalClass::Hydrocarbon => Family::Hydrocarbon,
            IntervalClass::Halide | IntervalClass::FluorinatedHalide => Family::Halide,
            IntervalClass::Oxygen => Family::Oxygen,
            IntervalClass::Nitrogen => Family::Nitrogen,
            IntervalClass::Sulfur => Family::Sulfur,
            IntervalClass::Multifunctional => Family::Multifunctional,
        }
    }

    /// Stable name used in files and output.
    pub fn name(self) -> &'static str {
        match self {
            IntervalClass::FluorinatedHalide => "fluorinated-halide",
            other => other.family().name(),
        }
    }

    /// The class of a name written by [`IntervalClass::name`].
    pub fn from_name(s: &str) -> Option<IntervalClass> {
        IntervalClass::ALL.into_iter().find(|c| c.name() == s)
    }
}

/// The model's view of one structure.
#[derive(Debug, Clone, PartialEq)]
pub struct TbFeatures {
    /// Extended first-order groups and corrections → count.
    pub terms: GroupCounts,
    /// Structural family.
    pub family: Family,
    /// Class whose interval applies.
    pub class: IntervalClass,
    /// Strongly polar groups (OH, COOH, CN, NO2, amine N–H, amide-type C(=O)N, S=O).
    pub polar: u32,
}

/// Features of a molecule (errors as [`crate::estimate::assign_tb_groups`]).
///
/// ```
/// use ebullio::molecule::parse_smiles;
/// let f = ebullio::estimate::tb_features::features(&parse_smiles("CN(C)C=O").unwrap()).unwrap();
/// assert_eq!(f.terms["amide_tertiary"], 1);
/// let f = ebullio::estimate::tb_features::features(&parse_smiles("c1ccc2[nH]ccc2c1").unwrap()).unwrap();
/// assert_eq!((f.terms["nh_aromatic"], f.terms["fused_aromatic"]), (1, 2));
/// ```
pub fn features(m: &Molecule) -> Result<TbFeatures, EstimateError> {
    let f = feature_counts(m)?;
    Ok(TbFeatures {
        terms: f.terms.to_map(),
        family: f.family,
        class: f.class,
        polar: f.polar,
    })
}

/// [`features`] with the terms counted by index.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct FeatureCounts {
    pub terms: TermCounts,
    pub family: Family,
    pub class: IntervalClass,
    pub polar: u32,
}

thread_local! {
    /// Amide nitrogens of the molecule at hand (storage kept between molecules).
    static AMIDE_N: std::cell::Cell<Vec<bool>> = const { std::cell::Cell::new(Vec::new()) };
}

pub(crate) fn feature_counts(m: &Molecule) -> Result<FeatureCounts, EstimateError> {
    // Group contributions describe organic compounds: H2, N2, Cl2 and the like would get
    // the bare intercept (about 198 K), far from the truth, so they are refused.
    if !m.atoms().iter().any(|a| a.element == Element::C) {
        return Err(EstimateError::NoGroup {
            atom: m.atoms().first().map_or("?".into(), |a| a.element.symbol().to_string()),
            position: 1,
            reason: "the molecule has no carbon atom; the group-contribution methods describe organic compounds only".into(),
        });
    }
    let mut terms = TermCounts::new();
    assign_counts(m, true, &mut terms)?;
    let atoms = m.atoms();
    let el = |i: usize| atoms[i].element;
    let is_terminal_o = |j: usize, k: usize| {
        el(j) == Element::O
            && m.bonds()[k].order == BondOrder::Double
            && m.heavy_degree(j) == 1
            && atoms[j].charge == 0
    };
    let mut amide_n = AMIDE_N.take();
    amide_n.clear();
    amide_n.resize(atoms.len(), false);
    let mut polar = 0u32;
    for i in 0..atoms.len() {
        let a = &atoms[i];
        if a.charge != 0 {
            continue;
        }
        let nb = m.neighbours(i);
        match a.element {
            e if e == Element::C => {
                // one walk over the neighbours: halogens, a terminal =O, single-bonded
                // neutral N (how many, the first), single-bonded O, one of them in a ring
                let (mut hal, mut oxo, mut o_single, mut ring_ester) = (0, false, 0, false);
                let (mut n_count, mut first_n) = (0, (0, 0));
                for &(j, k) in nb {
                    let b = &m.bonds()[k];
                    match el(j).number() {
                        9 | 17 | 35 | 53 => hal += 1,
                        8 => match b.order {
                            BondOrder::Double => oxo |= is_terminal_o(j, k),
                            BondOrder::Single => {
                                o_single += 1;
                                ring_ester |= b.in_ring;
                            }
                            _ => {}
                        },
                        7 if atoms[j].charge == 0 && b.order == BondOrder::Single => {
                            if n_count == 0 {
                                first_n = (j, k);
                            }
                            n_count += 1;
                        }
                        _ => {}
                    }
                }
                if hal >= 2 && m.total_hydrogens(i) == 0 {
                    terms.add(t!("perhalo_c"));
                }
                if hal >= 1 && m.total_hydrogens(i) > 0 {
                    terms.add(t!("halo_ch"));
                }
                if !oxo {
                    continue;
                }
                if n_count == 0 && ring_ester {
                    terms.add(t!("ester_ring"));
                }
                let id = match (n_count, o_single) {
                    (0, _) => None,
                    (1, 0) => {
                        let (nn, k) = first_n;
                        Some(if m.bonds()[k].in_ring {
                            t!("amide_ring")
                        } else {
                            match m.total_hydrogens(nn) {
                                0 => t!("amide_tertiary"),
                                1 => t!("amide_secondary"),
                                _ => t!("amide_primary"),
                            }
                        })
                    }
                    (1, _) => Some(t!("carbamate")),
                    _ => Some(t!("urea")),
                };
                if let Some(id) = id {
                    terms.add(id);
                    polar += 1;
                    for &(j, k) in nb {
                        if el(j) == Element::N
                            && atoms[j].charge == 0
                            && m.bonds()[k].order == BondOrder::Single
                        {
                            amide_n[j] = true;
                        }
                    }
                }
            }
            e if e == Element::S => {
                let oxo = nb.iter().filter(|&&(j, k)| is_terminal_o(j, k)).count();
                if oxo == 1 {
                    terms.add(t!("sulfoxide"));
                }
                if oxo > 0 {
                    polar += 1;
                    for &(j, _) in nb {
                        if el(j) == Element::N && atoms[j].charge == 0 {
                            terms.add(t!("sulfonamide"));
                            amide_n[j] = true;
                        }
                    }
                }
            }
            _ => {}
        }
    }
    // which of the family's elements occur (what `m.has_element` tells), in the same pass:
    // fluorine, another halogen, O, N, S
    let mut has = [false; 5];
    for i in 0..atoms.len() {
        let a = &atoms[i];
        match a.element.number() {
            9 => has[0] = true,
            17 | 35 | 53 => has[1] = true,
            8 => has[2] = true,
            7 => has[3] = true,
            16 => has[4] = true,
            _ => {}
        }
        if a.aromatic && (a.element == Element::O || a.element == Element::S) {
            terms.add(t!("arom_o_s"));
        }
        if a.element == Element::N && a.aromatic && m.total_hydrogens(i) > 0 {
            terms.add(t!("nh_aromatic"));
        }
        if a.aromatic {
            let fused = m
                .neighbours(i)
                .iter()
                .filter(|&&(j, k)| atoms[j].aromatic && m.bonds()[k].in_ring)
                .count();
            if fused >= 3 {
                terms.add(t!("fused_aromatic"));
            }
        }
        if a.element == Element::N && !amide_n[i] && m.total_hydrogens(i) > 0 && a.charge == 0 {
            polar += 1;
        }
    }
    for id in [
        t!("oh_alcohol"),
        t!("oh_phenol"),
        t!("cooh"),
        t!("cn"),
        t!("no2"),
    ] {
        polar += terms.get(id);
    }
    AMIDE_N.set(amide_n);
    let family = Family::from_classes(has[0] || has[1], has[2], has[3], has[4]);
    let fluorinated = has[0];
    Ok(FeatureCounts {
        terms,
        family,
        class: IntervalClass::of(family, fluorinated),
        polar,
    })
}

/// Interval class of hand-given Joback groups (fluorinated when an `f` group is present).
pub fn class_of_groups(g: &GroupCounts) -> IntervalClass {
    IntervalClass::of(family_of_groups(g), g.get("f").is_some_and(|&n| n > 0))
}

/// Family of hand-given Joback groups (from the heteroatoms their ids imply).
pub fn family_of_groups(g: &GroupCounts) -> Family {
    let any = |ids: &[&str]| g.keys().any(|k| ids.contains(&k.as_str()));
    Family::from_classes(
        any(&["f", "cl", "br", "i"]),
        any(&[
            "oh_alcohol",
            "oh_phenol",
            "o_chain",
            "o_ring",
            "co_chain",
            "co_ring",
            "cho",
            "cooh",
            "coo",
            "eq_o",
            "no2",
            "s_oxo",
        ]),
        any(&[
            "nh2",
            "nh_chain",
            "nh_ring",
            "n_chain",
            "eq_n_chain",
            "eq_n_ring",
            "eq_nh",
            "cn",
            "no2",
            "n_ring_tert",
            "n_arom_sub",
        ]),
        any(&["sh", "s_chain", "s_ring"]),
    )
}
