//! The boiling-point models compared by cross-validation, their committed
//! fitted contributions, and prediction.
//!
//! Two published forms are refitted on the project's calibration set:
//! - `log`: Tb = a · ln(Σ nᵢ tᵢ) with a = 204.359 K (the form and constant of
//!   L. Constantinou, R. Gani, AIChE J. 40 (1994) 1697–1710);
//! - `stein-brown`: Tb = SB(198.2 + Σ nᵢ gᵢ), SB the quadratic correction of
//!   S. E. Stein, R. L. Brown, J. Chem. Inf. Comput. Sci. 34 (1994) 581–587
//!   (see [`super::stein_brown`]).
//!
//! Each form is fitted twice: on the published Joback groups only
//! (`joback-groups-refit-*`), and on the extended groups with second-order
//! corrections (`extended-groups-*`, see [`super::tb_features`]). The fitted
//! values are in `reference-data/tb-model.csv`, written by
//! `cargo run --example fit_tb_model`; every value is this project's own.

use super::groups::GroupCounts;
use super::stein_brown;
use super::terms::{self, Present, N_TERMS};
use std::collections::BTreeMap;
use std::sync::OnceLock;

/// Constant a of the log form, K (Constantinou & Gani 1994).
pub const LOG_A_K: f64 = 204.359;
/// Intercept of the Stein–Brown form, K (Stein & Brown 1994).
pub const SB_INTERCEPT_K: f64 = 198.2;
/// Temperature at which published Joback ΔTb are mapped onto the log form's scale for priors, K.
pub const PRIOR_T_K: f64 = 400.0;

/// A model's functional form.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Form {
    /// Tb = a · ln S.
    Log,
    /// Tb = SB(198.2 + S).
    SteinBrown,
}

impl Form {
    /// Tb from the group sum S (NaN where undefined).
    pub fn tb(self, s: f64) -> f64 {
        match self {
            Form::Log => {
                if s > 0.0 {
                    LOG_A_K * s.ln()
                } else {
                    f64::NAN
                }
            }
            Form::SteinBrown => stein_brown::corrected_tb_k(SB_INTERCEPT_K + s),
        }
    }

    /// dTb/dS.
    pub fn slope(self, s: f64) -> f64 {
        match self {
            Form::Log => LOG_A_K / s,
            Form::SteinBrown => {
                let x = SB_INTERCEPT_K + s;
                if x <= 700.0 {
                    1.5577 - 2.0 * 0.0007705 * x
                } else {
                    1.0 - 0.5209
                }
            }
        }
    }

    /// The group sum S that gives `tb` (inverse of [`Form::tb`]).
    pub fn sum_for(self, tb: f64) -> f64 {
        match self {
            Form::Log => (tb / LOG_A_K).exp(),
            Form::SteinBrown => {
                let x = if tb <= stein_brown::corrected_tb_k(700.0) {
                    // 0.0007705 x² − 1.5577 x + (tb + 94.84) = 0, smaller root.
                    let (a, b, c) = (0.0007705, -1.5577, tb + 94.84);
                    (-b - (b * b - 4.0 * a * c).max(0.0).sqrt()) / (2.0 * a)
                } else {
                    (tb - 282.7) / (1.0 - 0.5209)
                };
                x - SB_INTERCEPT_K
            }
        }
    }

    /// A published Joback ΔTb (K) expressed on this form's scale (for priors).
    pub fn prior_from_joback(self, dtb_k: f64) -> f64 {
        match self {
            Form::Log => dtb_k / self.slope(self.sum_for(PRIOR_T_K)),
            Form::SteinBrown => dtb_k,
        }
    }
}

/// Which boiling-point variant a value is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum TbVariant {
    /// Joback & Reid (1987): Tb = 198 + ΣΔTb, published values.
    Joback,
    /// Stein & Brown (1994) correction applied to the published Joback Tb.
    SteinBrown,
    /// Joback groups, log form, refitted here.
    JobackGroupsRefitLog,
    /// Joback groups, Stein–Brown form, refitted here.
    JobackGroupsRefitSteinBrown,
    /// Extended groups and corrections, log form, fitted here.
    ExtendedGroupsLog,
    /// Extended groups and corrections, Stein–Brown form, fitted here.
    ExtendedGroupsSteinBrown,
}

impl TbVariant {
    /// Every variant, published first.
    pub const ALL: [TbVariant; 6] = [
        TbVariant::Joback,
        TbVariant::SteinBrown,
        TbVariant::JobackGroupsRefitLog,
        TbVariant::JobackGroupsRefitSteinBrown,
        TbVariant::ExtendedGroupsLog,
        TbVariant::ExtendedGroupsSteinBrown,
    ];

    /// The variants fitted on the calibration set.
    pub const FITTED: [TbVariant; 4] = [
        TbVariant::JobackGroupsRefitLog,
        TbVariant::JobackGroupsRefitSteinBrown,
        TbVariant::ExtendedGroupsLog,
        TbVariant::ExtendedGroupsSteinBrown,
    ];

    /// Stable name used in output and files.
    pub fn name(self) -> &'static str {
        match self {
            TbVariant::Joback => "joback",
            TbVariant::SteinBrown => "stein-brown",
            TbVariant::JobackGroupsRefitLog => "joback-groups-refit-log",
            TbVariant::JobackGroupsRefitSteinBrown => "joback-groups-refit-stein-brown",
            TbVariant::ExtendedGroupsLog => "extended-groups-log",
            TbVariant::ExtendedGroupsSteinBrown => "extended-groups-stein-brown",
        }
    }

    /// The variant written by [`TbVariant::name`].
    pub fn from_name(s: &str) -> Option<TbVariant> {
        TbVariant::ALL.into_iter().find(|v| v.name() == s)
    }

    /// Form of a fitted variant.
    pub fn form(self) -> Option<Form> {
        match self {
            TbVariant::JobackGroupsRefitLog | TbVariant::ExtendedGroupsLog => Some(Form::Log),
            TbVariant::JobackGroupsRefitSteinBrown | TbVariant::ExtendedGroupsSteinBrown => {
                Some(Form::SteinBrown)
            }
            _ => None,
        }
    }

    /// True for the variants that use the extended groups and corrections.
    pub fn extended(self) -> bool {
        matches!(
            self,
            TbVariant::ExtendedGroupsLog | TbVariant::ExtendedGroupsSteinBrown
        )
    }
}

/// The terms a variant uses: extended terms as they are, or mapped onto the
/// published Joback groups (new groups to their nearest published group,
/// corrections dropped).
pub fn terms_for(variant: TbVariant, extended_terms: &GroupCounts) -> GroupCounts {
    if variant.extended() {
        return extended_terms.clone();
    }
    let mut out = GroupCounts::new();
    for (id, &n) in extended_terms {
        if super::tb_features::CORRECTIONS.contains(&id.as_str()) {
            continue;
        }
        *out.entry(super::tb_features::nearest_published(id).to_string())
            .or_insert(0) += n;
    }
    out
}

/// One fitted contribution.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Contribution {
    /// Group or correction id.
    pub id: String,
    /// Value on the form's scale (log: dimensionless sum term; stein-brown: K).
    pub value: f64,
    /// Standard error of the value (None when not fitted).
    pub se: Option<f64>,
    /// Calibration compounds (fit split) that contain the term.
    pub n_compounds: u32,
    /// Fitted (at least three compounds); otherwise the value is the prior and the
    /// term puts a molecule outside the calibration.
    pub fitted: bool,
}

/// One fitted model.
#[derive(Debug, Clone, PartialEq)]
pub struct FittedModel {
    /// Which variant.
    pub variant: TbVariant,
    /// Contributions by id.
    pub contributions: BTreeMap<String, Contribution>,
}

/// A prediction and the terms that lie outside the calibration.
#[derive(Debug, Clone, PartialEq)]
pub struct Prediction {
    /// Boiling point, K (NaN if the sum leaves the form's domain).
    pub tb_k: f64,
    /// Terms present without a fitted value (fewer than three calibration compounds or unknown).
    pub outside: Vec<String>,
}

impl FittedModel {
    /// Predict from extended terms.
    pub fn predict(&self, extended_terms: &GroupCounts) -> Prediction {
        let form = self.variant.form().unwrap_or(Form::Log);
        let mut s = 0.0;
        let mut outside = Vec::new();
        for (id, &n) in &terms_for(self.variant, extended_terms) {
            match self.contributions.get(id) {
                Some(c) => {
                    s += n as f64 * c.value;
                    if !c.fitted {
                        outside.push(id.clone());
                    }
                }
                None => outside.push(id.clone()),
            }
        }
        if !self.variant.extended() {
            // Structures the published table cannot describe are outside this variant too.
            for id in extended_terms.keys() {
                if super::tb_features::NEW_GROUPS.contains(&id.as_str()) && !outside.contains(id) {
                    outside.push(id.clone());
                }
            }
        }
        Prediction {
            tb_k: form.tb(s),
            outside,
        }
    }
}

/// A fitted model's contributions by term index (built once from [`FittedModel`]).
#[derive(Debug, Clone)]
pub(crate) struct IndexedModel {
    /// The model it indexes.
    pub model: &'static FittedModel,
    value: [f64; N_TERMS],
    /// 0: no contribution, 1: a prior (not fitted), 2: fitted.
    state: [u8; N_TERMS],
}

/// [`Prediction`] with the outside terms as a bit set over term indices.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct IndexedPrediction {
    pub tb_k: f64,
    /// Bit `i`: term `i` is outside the calibration.
    pub outside: u64,
}

impl IndexedModel {
    fn new(model: &'static FittedModel) -> Self {
        let mut m = IndexedModel {
            model,
            value: [0.0; N_TERMS],
            state: [0; N_TERMS],
        };
        for (id, c) in &model.contributions {
            if let Some(i) = terms::index(id) {
                m.value[i] = c.value;
                m.state[i] = if c.fitted { 2 } else { 1 };
            }
        }
        m
    }

    /// [`FittedModel::predict`] by index: the same sum in the same order.
    #[cfg(test)]
    pub fn predict(&self, extended_terms: &terms::TermCounts) -> IndexedPrediction {
        self.predict_present(
            &extended_terms.present(),
            &extended_terms.published().present(),
            extended_terms.new_groups(),
        )
    }

    /// [`IndexedModel::predict`] from the terms present listed once for every model:
    /// `extended` ([`TermCounts::present`]), `published` (of [`TermCounts::published`]) and
    /// the bit set of new groups ([`TermCounts::new_groups`]).
    pub fn predict_present(
        &self,
        extended: &Present,
        published: &Present,
        new_groups: u64,
    ) -> IndexedPrediction {
        let variant = self.model.variant;
        let form = variant.form().unwrap_or(Form::Log);
        let terms = if variant.extended() {
            extended
        } else {
            published
        };
        let mut s = 0.0;
        let mut outside = 0u64;
        for (i, n) in terms.iter() {
            if self.state[i] > 0 {
                s += n as f64 * self.value[i];
            }
            if self.state[i] < 2 {
                outside |= 1 << i;
            }
        }
        if !variant.extended() {
            outside |= new_groups;
        }
        IndexedPrediction {
            tb_k: form.tb(s),
            outside,
        }
    }

    /// The outside terms of a prediction as ids, in the order [`FittedModel::predict`] lists them.
    pub fn outside_ids(&self, outside: u64) -> Vec<String> {
        let listed = |i: usize| outside & (1 << i) != 0;
        let mut ids: Vec<String> = Vec::new();
        let extended = self.model.variant.extended();
        for &i in terms::SORTED.iter() {
            let i = i as usize;
            if listed(i) && (extended || !terms::is_new_group(i)) {
                ids.push(terms::IDS[i].to_string());
            }
        }
        if !extended {
            for &i in terms::SORTED.iter() {
                let i = i as usize;
                if listed(i) && terms::is_new_group(i) {
                    ids.push(terms::IDS[i].to_string());
                }
            }
        }
        ids
    }
}

/// The committed models by index, in the order of [`models`].
pub(crate) fn indexed_models() -> &'static [IndexedModel] {
    static M: OnceLock<Vec<IndexedModel>> = OnceLock::new();
    M.get_or_init(|| models().iter().map(IndexedModel::new).collect())
}

const MODEL_CSV: &str = include_str!("../../reference-data/tb-model.csv");

/// Parse the committed model file (lines starting with `#` are comments).
pub fn parse_models(text: &str) -> Result<Vec<FittedModel>, String> {
    let mut by: BTreeMap<TbVariant, FittedModel> = BTreeMap::new();
    let mut header = true;
    for (i, line) in text.lines().enumerate() {
        if line.starts_with('#') || line.trim().is_empty() {
            continue;
        }
        if header {
            header = false;
            continue;
        }
        let f: Vec<&str> = line.split(',').collect();
        let bad = || {
            format!(
                "tb-model.csv line {}: expected variant,id,value,se,n_compounds,fitted",
                i + 1
            )
        };
        if f.len() != 6 {
            return Err(bad());
        }
        let variant = TbVariant::from_name(f[0]).ok_or_else(bad)?;
        let c = Contribution {
            id: f[1].to_string(),
            value: f[2].parse().map_err(|_| bad())?,
            se: f[3].parse().ok(),
            n_compounds: f[4].parse().map_err(|_| bad())?,
            fitted: f[5] == "true",
        };
        by.entry(variant)
            .or_insert_with(|| FittedModel {
                variant,
                contributions: BTreeMap::new(),
            })
            .contributions
            .insert(c.id.clone(), c);
    }
    Ok(by.into_values().collect())
}

/// The committed fitted models (empty if the file holds none).
pub fn models() -> &'static [FittedModel] {
    static M: OnceLock<Vec<FittedModel>> = OnceLock::new();
    M.get_or_init(|| parse_models(MODEL_CSV).unwrap_or_default())
}

/// The committed model of one variant.
pub fn model(v: TbVariant) -> Option<&'static FittedModel> {
    models().iter().find(|m| m.variant == v)
}

#[cfg(test)]
mod tests {
    use super::{indexed_models, models};
    use crate::estimate::tb_features::{feature_counts, features};
    use crate::molecule::parse_smiles;

    /// The indexed prediction is the map prediction: the same boiling point to the bit
    /// and the same outside terms in the same order, on structures with new groups,
    /// corrections and terms without a fitted value.
    #[test]
    fn indexed_prediction_is_the_map_prediction() {
        let mut outside_seen = 0;
        for smi in [
            "CCO",
            "CS(C)=O",
            "CS(=O)(=O)N",
            "CN1CCCC1",
            "Cn1cccc1",
            "c1ccc2[nH]ccc2c1",
            "CN(C)C=O",
            "O=C1CCCN1",
            "NC(=O)N",
            "COC(=O)N",
            "FC(F)(F)c1ccccc1Cl",
            "C1CC(=O)OC1",
            "c1ccsc1",
            "CC(=O)OCC[N+](=O)[O-]",
            "ClC(Cl)Cl",
            "O=S1(=O)CCCC1",
        ] {
            let m = parse_smiles(smi).unwrap();
            let by_map = features(&m).unwrap();
            let by_index = feature_counts(&m).unwrap();
            assert_eq!(by_index.terms.to_map(), by_map.terms, "{smi}");
            for (fm, im) in models().iter().zip(indexed_models()) {
                let want = fm.predict(&by_map.terms);
                let got = im.predict(&by_index.terms);
                assert_eq!(
                    got.tb_k.to_bits(),
                    want.tb_k.to_bits(),
                    "{smi} {:?}",
                    fm.variant
                );
                assert_eq!(
                    im.outside_ids(got.outside),
                    want.outside,
                    "{smi} {:?}",
                    fm.variant
                );
                outside_seen += want.outside.len();
            }
        }
        assert!(
            outside_seen > 0,
            "no structure had a term outside the calibration"
        );
    }
}
