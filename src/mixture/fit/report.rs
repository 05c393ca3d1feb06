//! The binary fit as data: what `ebullio fit` prints for VLE data and what `vle --from` reads.
//!
//! Stable public shape (serde): `model`, `parameters` (name, value,
//! std_error, ci95_low, ci95_high), `gamma_infinity`, `azeotropes`,
//! `consistency` (test, passed, statistic, criterion), `points` (with
//! `outlier`) and `flags`; the other fields add what is needed to rebuild the
//! model without the data. Numbers that do not exist are `null`.

use super::data::DataKind;
use super::model::FitModel;
use super::problem::Uncertainties;
use crate::finding::Finding;
use crate::fit::lsq::Termination;
use crate::fit::report::ParameterEstimate;
use crate::mixture::AzeotropeKind;
use serde::{Deserialize, Serialize};

/// A component as the fit knew it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ComponentInfo {
    /// Name.
    pub name: String,
    /// SMILES, when known.
    pub smiles: Option<String>,
    /// Where the pure vapor pressure came from, in words.
    pub vapor_pressure_source: String,
}

/// A parameter held fixed.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FixedParameter {
    /// Name.
    pub name: String,
    /// Value.
    pub value: f64,
}

/// Goodness of fit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FitStatistics {
    /// Points used.
    pub n_points: usize,
    /// Observations (T or p per point, plus y1 where measured).
    pub n_observations: usize,
    /// Degrees of freedom.
    pub dof: usize,
    /// Weighted residual sum of squares.
    pub rss: Option<f64>,
    /// RSS/dof: about 1 when the scatter matches the stated uncertainties.
    pub reduced_chi_square: Option<f64>,
    /// AICc of the weighted fit.
    pub aicc: Option<f64>,
    /// RMS of T(measured) − T(model), K (isobaric).
    pub rms_t_k: Option<f64>,
    /// RMS relative deviation of p, % (isothermal).
    pub rms_p_pct: Option<f64>,
    /// RMS of y1(measured) − y1(model).
    pub rms_y1: Option<f64>,
    /// How the solver stopped.
    pub termination: Termination,
}

/// One model tried under `--model auto`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Candidate {
    /// Model name (`nrtl-alpha` for NRTL with α fitted).
    pub model: String,
    /// Fitted parameters.
    pub n_params: usize,
    /// AICc, null when it did not converge.
    pub aicc: Option<f64>,
    /// Whether the solver converged.
    pub converged: bool,
}

/// Why this model.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ModelChoice {
    /// One sentence.
    pub reason: String,
    /// Every model tried.
    pub candidates: Vec<Candidate>,
}

/// A value with its 95 % interval.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Ranged {
    /// Value.
    pub value: f64,
    /// Lower end of the 95 % interval (null when the covariance is singular).
    pub ci95_low: Option<f64>,
    /// Upper end.
    pub ci95_high: Option<f64>,
}

/// An azeotrope of the fitted model at the data's fixed condition.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FittedAzeotrope {
    /// Composition.
    pub x1: f64,
    /// Temperature, K (isobaric data).
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub t_k: Option<f64>,
    /// Pressure, Pa (isothermal data).
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub p_pa: Option<f64>,
    /// Kind.
    pub kind: AzeotropeKind,
    /// 95 % interval of x1 (delta method on the parameter covariance).
    pub x1_ci95: Option<[f64; 2]>,
    /// 95 % interval of T (isobaric) or p (isothermal), same unit as the value.
    pub condition_ci95: Option<[f64; 2]>,
    /// Whether x1 lies inside the measured composition range.
    pub inside_data: bool,
}

/// Does the fitted model split the liquid where the data show one liquid?
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SplitCheck {
    /// Whether the model family can describe two liquids at all.
    pub model_can_split: bool,
    /// A split predicted with a measured composition inside it.
    pub inside_data: bool,
    /// The predicted liquids [x1 low, x1 high], where one is predicted.
    pub x1: Option<[f64; 2]>,
    /// Temperature of the check, K.
    pub t_k: Option<f64>,
}

/// One consistency test.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ConsistencyTest {
    /// `herington-area`, `redlich-kister-area` or `point-to-point`.
    pub test: String,
    /// Whether the data pass.
    pub passed: bool,
    /// The test statistic.
    pub statistic: f64,
    /// Pass limit, in words with its number (e.g. `D - J < 10`).
    pub criterion: String,
    /// What the statistic means, one sentence.
    pub meaning: String,
    /// Whether the test needs measured y1.
    pub needs_y: bool,
}

/// A test that could not run.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TestNotRun {
    /// Test name.
    pub test: String,
    /// Why.
    pub reason: String,
}

/// One measured point against the model.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PointOut {
    /// 1-based number in the data.
    pub number: usize,
    /// File line, when known.
    pub line: Option<u64>,
    /// Liquid composition.
    pub x1: f64,
    /// Measured vapor composition.
    pub y1: Option<f64>,
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Model bubble temperature (isobaric) or pressure (isothermal) at x1.
    pub calc: Option<f64>,
    /// Measured − model: K (isobaric) or % of the model pressure (isothermal).
    pub deviation: Option<f64>,
    /// Model y1.
    pub y1_calc: Option<f64>,
    /// Measured − model y1.
    pub y1_deviation: Option<f64>,
    /// Externally studentized residual of T (or p).
    pub studentized: Option<f64>,
    /// Externally studentized residual of y1.
    pub y1_studentized: Option<f64>,
    /// Flagged by the outlier rule (either residual).
    pub outlier: bool,
}

/// The complete binary fit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BinaryFitReport {
    /// `isobaric` or `isothermal`.
    pub kind: DataKind,
    /// Fixed pressure, Pa (isobaric data, the mean when it varies a little).
    pub pressure_pa: Option<f64>,
    /// Fixed temperature, K (isothermal data).
    pub temperature_k: Option<f64>,
    /// The two components.
    pub components: Vec<ComponentInfo>,
    /// Model name: `margules`, `van-laar`, `wilson`, `nrtl`.
    pub model: String,
    /// The model with its fixed settings (rebuilds it with `parameters`).
    pub model_spec: FitModel,
    /// Fitted parameters with standard errors and 95 % intervals.
    pub parameters: Vec<ParameterEstimate>,
    /// Parameters held fixed (NRTL α).
    pub fixed_parameters: Vec<FixedParameter>,
    /// Parameter covariance (rows in `parameters` order).
    pub covariance: Option<Vec<Vec<f64>>>,
    /// Goodness of fit.
    pub statistics: FitStatistics,
    /// Present under `--model auto`.
    pub model_choice: Option<ModelChoice>,
    /// [γ1∞, γ2∞] of the fitted model.
    pub gamma_infinity: [f64; 2],
    /// Their 95 % intervals.
    pub gamma_infinity_ci95: [Option<[f64; 2]>; 2],
    /// Temperatures at which they are given, K (the other component's boiling point at the pressure, or the fixed T).
    pub gamma_infinity_t_k: [f64; 2],
    /// Azeotropes of the fitted model at the data's fixed condition.
    pub azeotropes: Vec<FittedAzeotrope>,
    /// Liquid-split check inside the data range.
    pub liquid_split: SplitCheck,
    /// Consistency tests that ran.
    pub consistency: Vec<ConsistencyTest>,
    /// Consistency tests that could not run, with the reason.
    pub consistency_not_run: Vec<TestNotRun>,
    /// Each point against the model.
    pub points: Vec<PointOut>,
    /// Findings.
    pub flags: Vec<Finding>,
    /// The fitted model's bubble line at the data's condition, 41 points from x1 = 0
    /// to 1: `[x1, y1, T/K or p/Pa]` (for plots).
    #[serde(default)]
    pub model_curve: Vec<[f64; 3]>,
    /// `[x1, ln(γ1/γ2)]` of each point with y1, from the data alone (the area tests' input).
    #[serde(default)]
    pub ln_gamma_ratio: Vec<[f64; 2]>,
    /// Coefficients (constant first) of the polynomial in x1 the area test integrates.
    #[serde(default)]
    pub ln_gamma_ratio_polynomial: Option<Vec<f64>>,
    /// The standard uncertainties used as weights.
    pub uncertainties: Uncertainties,
    /// Cautions.
    pub cautions: Vec<String>,
}

impl BinaryFitReport {
    /// The fitted model, rebuilt from `model_spec` and the parameter values (for
    /// `vle --from` and `plan --from`); refused when the fit did not converge.
    pub fn fitted_model(&self) -> Result<super::Fitted, crate::mixture::MixtureError> {
        let theta: Vec<f64> = self.parameters.iter().map(|p| p.value).collect();
        if !self.statistics.termination.is_success() || theta.iter().any(|v| !v.is_finite()) {
            return Err(crate::mixture::MixtureError::BadParameter {
                model: "fitted",
                name: "parameters",
                value: f64::NAN,
                expected: "a converged fit (this one did not converge)",
            });
        }
        self.model_spec.build(&theta)
    }
}
