//! The fit result as data: what `ebullio fit` prints and what `boil --from fit.json` reads.
//!
//! Stable public shape (serde). Besides the fields in DESIGN.md it carries
//! everything needed to rebuild the curve without the data: the equation
//! (with Tc, pc for Wagner), SI parameters, covariance, degrees of freedom and
//! the measured range. New optional fields may be added; none are removed.

use super::findings::Finding;
use super::lsq::Termination;
use super::stats::RunsTest;
use crate::vapor::{AntoineConvention, Equation, Model};
use serde::{Deserialize, Serialize};

/// JSON has no NaN: serde_json writes a NaN as `null`; these read `null` back as NaN.
mod nan_null {
    use serde::{Deserialize, Deserializer};
    pub fn f64<'de, D: Deserializer<'de>>(d: D) -> Result<f64, D::Error> {
        Ok(Option::<f64>::deserialize(d)?.unwrap_or(f64::NAN))
    }
    pub fn matrix<'de, D: Deserializer<'de>>(d: D) -> Result<Vec<Vec<f64>>, D::Error> {
        let m = Vec::<Vec<Option<f64>>>::deserialize(d)?;
        Ok(m.into_iter()
            .map(|r| r.into_iter().map(|v| v.unwrap_or(f64::NAN)).collect())
            .collect())
    }
}

/// One reported constant with its uncertainty (in the reported convention).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ParameterEstimate {
    /// Name (`A`, `B`, `C`, ...).
    pub name: String,
    /// Value.
    #[serde(deserialize_with = "nan_null::f64")]
    pub value: f64,
    /// Standard error.
    #[serde(deserialize_with = "nan_null::f64")]
    pub std_error: f64,
    /// Lower end of the 95 % confidence interval (Student t).
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_low: f64,
    /// Upper end of the 95 % confidence interval.
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_high: f64,
}

/// A value with its 95 % interval.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Interval {
    /// Value.
    #[serde(deserialize_with = "nan_null::f64")]
    pub value: f64,
    /// Lower end of the 95 % confidence interval.
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_low: f64,
    /// Upper end.
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_high: f64,
    /// Standard uncertainty (1 sigma).
    #[serde(deserialize_with = "nan_null::f64")]
    pub std_error: f64,
    /// True when outside the measured temperature range.
    pub extrapolated: bool,
    /// Kelvin outside the measured range (0 inside).
    #[serde(deserialize_with = "nan_null::f64")]
    pub extrapolation_k: f64,
}

/// What a prediction predicts.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum PredictionKind {
    /// The boiling temperature at a given pressure.
    #[serde(rename = "t_at_p")]
    TAtP,
    /// The vapor pressure at a given temperature.
    #[serde(rename = "p_at_t")]
    PAtT,
}

/// A requested prediction (`--at`).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Prediction {
    /// `t_at_p` (boiling temperature at a pressure) or `p_at_t`.
    pub kind: PredictionKind,
    /// Pressure, Pa (given or predicted).
    #[serde(deserialize_with = "nan_null::f64")]
    pub p_pa: f64,
    /// Temperature, K (given or predicted).
    #[serde(deserialize_with = "nan_null::f64")]
    pub t_k: f64,
    /// 95 % interval of the predicted quantity (K for `t_at_p`, Pa for `p_at_t`).
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_low: f64,
    /// Upper end.
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_high: f64,
    /// True when outside the measured temperature range.
    pub extrapolated: bool,
    /// Kelvin outside the measured range (0 inside).
    #[serde(deserialize_with = "nan_null::f64")]
    pub extrapolation_k: f64,
}

/// Enthalpy of vaporization from the slope (Clausius–Clapeyron).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct HvapEstimate {
    /// Temperature, K (mean of the data).
    #[serde(deserialize_with = "nan_null::f64")]
    pub t_k: f64,
    /// ΔHvap, kJ/mol.
    #[serde(deserialize_with = "nan_null::f64")]
    pub value_kj_mol: f64,
    /// 95 % interval, kJ/mol.
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_low: f64,
    /// Upper end.
    #[serde(deserialize_with = "nan_null::f64")]
    pub ci95_high: f64,
    /// The assumption behind it.
    pub note: String,
}

/// One measured point with its diagnostics.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PointReport {
    /// 1-based number in the data as given (excluded points keep their numbers).
    #[serde(default)]
    pub number: usize,
    /// Line (CSV) or data row (Parquet) in the source, for the text output; not
    /// written, so a CSV and a Parquet copy of the same data give the same points.
    #[serde(skip)]
    pub line: Option<u64>,
    /// Temperature, K.
    #[serde(deserialize_with = "nan_null::f64")]
    pub t_k: f64,
    /// Pressure, Pa.
    #[serde(deserialize_with = "nan_null::f64")]
    pub p_pa: f64,
    /// 100·(p_measured − p_fit)/p_fit.
    #[serde(deserialize_with = "nan_null::f64")]
    pub rel_dev_pct: f64,
    /// T_measured − T_fit(p_measured), K.
    #[serde(deserialize_with = "nan_null::f64")]
    pub t_dev_k: f64,
    /// Internally studentized residual.
    #[serde(deserialize_with = "nan_null::f64")]
    pub studentized: f64,
    /// Externally studentized residual (used by the outlier rule).
    #[serde(deserialize_with = "nan_null::f64")]
    pub ext_studentized: f64,
    /// Leverage h_ii.
    #[serde(deserialize_with = "nan_null::f64")]
    pub leverage: f64,
    /// Cook's distance.
    #[serde(deserialize_with = "nan_null::f64")]
    pub cooks_distance: f64,
    /// Flagged by the outlier rule.
    pub outlier: bool,
    /// Rejected by the robust loss (final weight below 0.001): it no longer
    /// pulls on the constants, though it stays in the report.
    #[serde(default)]
    pub robust_rejected: bool,
    /// Final robust weight (with `--robust`).
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub robust_weight: Option<f64>,
}

/// One candidate in `--model auto`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Candidate {
    /// Equation name.
    pub model: Model,
    /// Number of constants.
    pub n_params: usize,
    /// AICc (lower is better); null when the data cannot support the equation.
    pub aicc: Option<f64>,
    /// Why it was skipped, if it was.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub skipped: Option<String>,
}

/// How `--model auto` chose.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ModelChoice {
    /// Candidates compared.
    pub candidates: Vec<Candidate>,
    /// The reason, in one sentence.
    pub reason: String,
}

/// What the fit would be without the flagged points.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct WithoutFlagged {
    /// 0-based indices of the excluded points.
    pub excluded: Vec<usize>,
    /// Constants in the reported convention.
    pub parameters: Vec<ParameterEstimate>,
    /// Normal boiling point without them.
    pub normal_boiling_point_k: Option<Interval>,
    /// RMS relative deviation in p without them, %.
    #[serde(deserialize_with = "nan_null::f64")]
    pub rms_rel_dev_pct: f64,
}

/// A point left out of the fit, and by whom.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ExcludedPoint {
    /// 1-based number in the data as given.
    pub number: usize,
    /// Line in the source file, when read from one.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub line: Option<u64>,
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Who left it out and how: "user: --exclude point 4".
    pub by: String,
}

impl FitReport {
    /// The excluded points in words, "point 5 (line 6), point 9".
    pub fn excluded_list(&self) -> String {
        let list: Vec<String> = self
            .excluded
            .iter()
            .map(|e| match e.line {
                Some(l) => format!("point {} (line {l})", e.number),
                None => format!("point {}", e.number),
            })
            .collect();
        list.join(", ")
    }
}

/// The whole result of fitting one compound.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FitReport {
    /// Compound name, when the data had one.
    pub compound: Option<String>,
    /// Equation name (`antoine`, `clapeyron`, `riedel`, `wagner`).
    pub model: Model,
    /// Reported constants with standard errors and 95 % intervals.
    pub parameters: Vec<ParameterEstimate>,
    /// Convention of `parameters` (`log10,mmHg,degC` for Antoine; `ln,Pa,K` otherwise).
    #[serde(with = "crate::vapor::convention::as_text")]
    pub convention: AntoineConvention,
    /// Number of points fitted.
    pub n_points: usize,
    /// RMS relative deviation in p, %.
    #[serde(deserialize_with = "nan_null::f64")]
    pub rms_rel_dev_pct: f64,
    /// Maximum absolute relative deviation in p, %.
    #[serde(deserialize_with = "nan_null::f64")]
    pub max_rel_dev_pct: f64,
    /// RMS deviation in T, K.
    #[serde(deserialize_with = "nan_null::f64")]
    pub rms_dev_t_k: f64,
    /// Maximum absolute deviation in T, K.
    #[serde(deserialize_with = "nan_null::f64")]
    pub max_dev_t_k: f64,
    /// Normal boiling point (101.325 kPa) with its 95 % interval.
    pub normal_boiling_point_k: Option<Interval>,
    /// Measured temperature range, K.
    pub t_range_k: [f64; 2],
    /// Measured points with diagnostics.
    pub points: Vec<PointReport>,
    /// Findings.
    pub flags: Vec<Finding>,
    /// Equation with its fixed constants, to rebuild the curve.
    pub equation: Equation,
    /// SI parameters (ln(p/Pa), T in K), in the equation's order.
    pub si_parameters: Vec<f64>,
    /// Covariance of the SI parameters.
    #[serde(deserialize_with = "nan_null::matrix")]
    pub covariance_si: Vec<Vec<f64>>,
    /// Correlation matrix of the parameters.
    #[serde(deserialize_with = "nan_null::matrix")]
    pub correlation: Vec<Vec<f64>>,
    /// Residual degrees of freedom.
    pub dof: usize,
    /// `unweighted`, `effective-variance` or `huber` (robust).
    pub weighting: String,
    /// Reduced chi-square (weighted fits).
    pub reduced_chi_square: Option<f64>,
    /// Residual standard deviation of ln p (unweighted fits).
    #[serde(deserialize_with = "nan_null::f64")]
    pub residual_sd_ln_p: f64,
    /// Runs test on residual signs ordered by T.
    pub runs_test: RunsTest,
    /// How the solver stopped.
    pub termination: Termination,
    /// `--at` predictions.
    pub predictions: Vec<Prediction>,
    /// ΔHvap at the mean temperature.
    pub hvap: Option<HvapEstimate>,
    /// `--model auto` comparison.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub model_choice: Option<ModelChoice>,
    /// Points the user excluded (`--exclude`); the constants, intervals and
    /// predictions are from the remaining points.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub excluded: Vec<ExcludedPoint>,
    /// The fit without the flagged points.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub without_flagged: Option<WithoutFlagged>,
    /// Comparison with a reference table (filled by the reference comparison, when asked).
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub reference_comparison: Option<super::comparison::FitCheck>,
}
