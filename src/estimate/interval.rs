//! Calibrated 90 % prediction interval for the boiling point, from the dev set.
//!
//! The method's error is measured on `reference-data/normal-boiling-points-dev.csv`
//! (embedded). Relative errors grow with Tb, so the half-width is
//! `q · Tb · f`, where `f` is the comfort factor of the structure:
//! 1, plus 0.5 for a very small molecule (three heavy atoms or fewer),
//! plus 0.5 for an amide-like N–C=O (scored by Joback only as a sum of simpler
//! groups), plus 0.5 for two or more strongly polar groups (OH, COOH, NH2, NH,
//! CN, NO2). `q` is the smallest value that puts 90 % of the dev-set compounds
//! inside their interval. The recommended variant (Joback, Stein–Brown, or
//! Joback below 500 K and Stein–Brown above) is the one with the lowest mean
//! absolute error on the same set. Coverage is reported in-sample and by
//! leave-one-out (q refitted without each compound in turn).
//!
//! Reference: the rule is this program's own (common practice for empirical
//! prediction intervals); the data set's sources are listed in its `source` column.

use super::{raw_from_smiles, Raw};
use std::sync::OnceLock;

const DEV_CSV: &str = include_str!("../../reference-data/normal-boiling-points-dev.csv");

/// Which boiling-point variant `tb_k` is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum TbVariant {
    /// Joback & Reid (1987): Tb = 198 + ΣΔTb.
    Joback,
    /// Stein & Brown (1994) correction applied to the Joback Tb.
    SteinBrown,
    /// Joback below [`SWITCH_K`], Stein & Brown at and above.
    JobackThenSteinBrown,
}

/// Switching point of [`TbVariant::JobackThenSteinBrown`], K (fixed before measuring).
pub const SWITCH_K: f64 = 500.0;

impl TbVariant {
    /// Stable name used in output.
    pub fn name(self) -> &'static str {
        match self {
            TbVariant::Joback => "joback",
            TbVariant::SteinBrown => "stein-brown",
            TbVariant::JobackThenSteinBrown => "joback-below-500K-stein-brown-above",
        }
    }

    /// The recommended Tb from the two raw values.
    pub fn pick(self, joback: f64, stein_brown: f64) -> f64 {
        match self {
            TbVariant::Joback => joback,
            TbVariant::SteinBrown => stein_brown,
            TbVariant::JobackThenSteinBrown => {
                if joback < SWITCH_K {
                    joback
                } else {
                    stein_brown
                }
            }
        }
    }
}

/// Comfort factor of a structure and the reasons for widening.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Comfort {
    /// Multiplier of the interval half-width (1 = inside the comfort zone).
    pub factor: f64,
    /// Why the interval was widened (stable kebab-case codes).
    pub reasons: Vec<&'static str>,
}

/// The comfort rule (see the module text).
pub fn comfort(heavy_atoms: u32, amide_like: bool, strongly_polar: u32) -> Comfort {
    let mut c = Comfort {
        factor: 1.0,
        reasons: Vec::new(),
    };
    if heavy_atoms <= 3 {
        c.factor += 0.5;
        c.reasons.push("very-small-molecule");
    }
    if amide_like {
        c.factor += 0.5;
        c.reasons.push("amide-scored-as-sum");
    }
    if strongly_polar >= 2 {
        c.factor += 0.5;
        c.reasons.push("several-polar-groups");
    }
    c
}

/// One dev-set compound as estimated.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct DevRow {
    /// Compound name.
    pub compound: String,
    /// SMILES.
    pub smiles: String,
    /// Measured normal boiling point, K.
    pub measured_k: f64,
    /// Joback Tb, K (None if the structure could not be estimated).
    pub joback_k: Option<f64>,
    /// Stein–Brown Tb, K.
    pub stein_brown_k: Option<f64>,
    /// Comfort factor.
    pub factor: f64,
    /// Why not estimated, if not.
    pub error: Option<String>,
}

/// The measured calibration of the boiling-point estimate.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Calibration {
    /// Compounds in the dev set.
    pub n_total: usize,
    /// Compounds the estimator could handle.
    pub n_estimated: usize,
    /// Mean absolute error of the Joback Tb, K.
    pub mae_joback_k: f64,
    /// Mean absolute error of the Stein–Brown Tb, K.
    pub mae_stein_brown_k: f64,
    /// Mean absolute error of the switched variant, K.
    pub mae_switched_k: f64,
    /// The recommended variant (lowest MAE).
    pub variant: TbVariant,
    /// Mean absolute error of the recommended variant, K.
    pub mae_recommended_k: f64,
    /// Mean signed error (estimate − measured) of the recommended variant, K.
    pub bias_recommended_k: f64,
    /// Relative half-width coefficient q (half-width = q · Tb · factor).
    pub q90: f64,
    /// Mean of |error| / (Tb · factor): the typical relative error per unit factor.
    pub typical_rel: f64,
    /// Share of dev-set compounds inside their own 90 % interval (in-sample).
    pub coverage_in_sample: f64,
    /// Share inside when q is refitted without the compound (leave-one-out).
    pub coverage_leave_one_out: f64,
    /// Every dev-set row.
    pub rows: Vec<DevRow>,
}

impl Calibration {
    /// One sentence on the measured calibration, for reports and the terminal.
    pub fn summary(&self) -> String {
        format!(
            "Calibrated on the bundled dev set: {} of {} compounds estimated, mean absolute error {:.1} K ({}), Joback alone {:.1} K; {:.0} % of the dev set lie inside their 90 % interval ({:.0} % leave-one-out).",
            self.n_estimated,
            self.n_total,
            self.mae_recommended_k,
            self.variant.name(),
            self.mae_joback_k,
            100.0 * self.coverage_in_sample,
            100.0 * self.coverage_leave_one_out
        )
    }
}

fn quantile90(mut v: Vec<f64>) -> f64 {
    if v.is_empty() {
        return f64::NAN;
    }
    v.sort_by(f64::total_cmp);
    let k = ((0.9 * v.len() as f64).ceil() as usize).clamp(1, v.len());
    v[k - 1]
}

fn mae(rows: &[(f64, f64)]) -> f64 {
    rows.iter().map(|(e, m)| (e - m).abs()).sum::<f64>() / rows.len().max(1) as f64
}

fn compute() -> Calibration {
    let mut rdr = csv::Reader::from_reader(DEV_CSV.as_bytes());
    let mut rows = Vec::new();
    for rec in rdr.records().flatten() {
        let (Some(name), Some(smiles), Some(tb)) = (rec.get(0), rec.get(1), rec.get(2)) else {
            continue;
        };
        let Ok(measured_k) = tb.trim().parse::<f64>() else {
            continue;
        };
        let raw: Result<Raw, _> = raw_from_smiles(smiles);
        rows.push(match raw {
            Ok(r) => DevRow {
                compound: name.to_string(),
                smiles: smiles.to_string(),
                measured_k,
                joback_k: Some(r.tb_joback_k),
                stein_brown_k: Some(r.tb_stein_brown_k),
                factor: r.comfort.factor,
                error: None,
            },
            Err(e) => DevRow {
                compound: name.to_string(),
                smiles: smiles.to_string(),
                measured_k,
                joback_k: None,
                stein_brown_k: None,
                factor: 1.0,
                error: Some(e.to_string()),
            },
        });
    }
    let ok: Vec<&DevRow> = rows.iter().filter(|r| r.joback_k.is_some()).collect();
    let pairs = |v: TbVariant| -> Vec<(f64, f64)> {
        ok.iter()
            .map(|r| {
                (
                    v.pick(
                        r.joback_k.unwrap_or(f64::NAN),
                        r.stein_brown_k.unwrap_or(f64::NAN),
                    ),
                    r.measured_k,
                )
            })
            .collect()
    };
    let mj = mae(&pairs(TbVariant::Joback));
    let ms = mae(&pairs(TbVariant::SteinBrown));
    let mw = mae(&pairs(TbVariant::JobackThenSteinBrown));
    let variant = if mj <= ms && mj <= mw {
        TbVariant::Joback
    } else if ms <= mw {
        TbVariant::SteinBrown
    } else {
        TbVariant::JobackThenSteinBrown
    };
    let p = pairs(variant);
    let scaled: Vec<f64> = p
        .iter()
        .zip(&ok)
        .map(|((e, m), r)| (e - m).abs() / (e * r.factor))
        .collect();
    let q90 = quantile90(scaled.clone());
    let inside = scaled.iter().filter(|&&s| s <= q90).count();
    let mut loo_inside = 0;
    for i in 0..scaled.len() {
        let rest: Vec<f64> = scaled
            .iter()
            .enumerate()
            .filter(|&(j, _)| j != i)
            .map(|(_, &s)| s)
            .collect();
        if scaled[i] <= quantile90(rest) {
            loo_inside += 1;
        }
    }
    let n = ok.len().max(1) as f64;
    Calibration {
        n_total: rows.len(),
        n_estimated: ok.len(),
        mae_joback_k: mj,
        mae_stein_brown_k: ms,
        mae_switched_k: mw,
        variant,
        mae_recommended_k: mae(&p),
        bias_recommended_k: p.iter().map(|(e, m)| e - m).sum::<f64>() / n,
        q90,
        typical_rel: scaled.iter().sum::<f64>() / n,
        coverage_in_sample: inside as f64 / n,
        coverage_leave_one_out: loo_inside as f64 / n,
        rows,
    }
}

/// The calibration, measured once on the embedded dev set.
pub fn calibration() -> &'static Calibration {
    static C: OnceLock<Calibration> = OnceLock::new();
    C.get_or_init(compute)
}
