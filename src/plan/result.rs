//! A plan's request and result: how the pressure is chosen, the options, and
//! everything the plan reports (serialised as the `plan` JSON).

use super::activity::ActivityChoice;
use super::column_plan::ColumnSummary;
use super::pressure::MaxPotPressure;
use super::rayleigh::RayleighPoint;
use super::verdict::Verdict;
use super::volatility::PairVolatility;
use crate::mixture::{AzeotropeOut, LiquidSplit, VleStudy};
use serde::Serialize;

/// How the operating pressure is chosen.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum PressureRequest {
    /// A given pressure, Pa.
    Given(f64),
    /// The highest pressure at which every component boils at or below this pot temperature, K.
    MaxPot(f64),
}

/// Which equilibrium the Rayleigh curve uses.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RayleighModel {
    /// Raoult's law with α following the pot temperature.
    Varying,
    /// Constant α (the key pair's geometric mean).
    Constant,
}

/// What the plan is asked for.
#[derive(Debug, Clone, PartialEq)]
pub struct PlanOptions {
    /// Operating pressure.
    pub pressure: PressureRequest,
    /// Light-component mole fraction wanted in the distillate.
    pub distillate_purity: f64,
    /// Heavy-component mole fraction wanted in the bottoms.
    pub bottoms_purity: f64,
    /// Light-component mole fraction in the charge (of the key pair).
    pub feed_x_light: f64,
    /// Equilibrium used for the Rayleigh curve.
    pub rayleigh_model: RayleighModel,
    /// Liquid model of the key pair.
    pub activity: ActivityChoice,
    /// Feed condition q of the continuous column (1 saturated liquid).
    pub feed_q: f64,
    /// Reflux as a multiple of the minimum for the column's stage count.
    pub reflux_factor: f64,
}

impl Default for PlanOptions {
    fn default() -> Self {
        Self {
            pressure: PressureRequest::Given(crate::units::ATM_PA),
            distillate_purity: 0.99,
            bottoms_purity: 0.99,
            feed_x_light: 0.5,
            rayleigh_model: RayleighModel::Varying,
            activity: ActivityChoice::Auto,
            feed_q: 1.0,
            reflux_factor: super::column::DEFAULT_REFLUX_FACTOR,
        }
    }
}

/// How the pressure was chosen, for the output.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PressureChoice {
    /// `given` or `max-pot`.
    pub mode: &'static str,
    /// The max-pot search, when used.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub max_pot: Option<MaxPotPressure>,
    /// The rounding rule, when used.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rounding_rule: Option<&'static str>,
}

/// One component at the operating pressure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ComponentAtPressure {
    /// Name.
    pub name: String,
    /// Boiling point at the operating pressure, K.
    pub tb_k: f64,
    /// Its standard uncertainty, K, when the source states one.
    pub u_tb_k: Option<f64>,
    /// 95 % interval low end, K (±1.96 u), when the uncertainty is known.
    pub tb_ci95_low_k: Option<f64>,
    /// 95 % interval high end, K.
    pub tb_ci95_high_k: Option<f64>,
    /// Where the curve came from.
    pub source: String,
    /// Whether the boiling point lies outside the source's stated validity range.
    pub extrapolated: bool,
}

/// Relative volatility of the key pair in detail.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct VolatilityDetail {
    /// Boiling points and α at both ends.
    #[serde(flatten)]
    pub pair: PairVolatility,
    /// Standard uncertainty of ln α (geometric mean).
    pub u_ln_alpha: f64,
    /// 95 % interval of α, low end.
    pub ci95_low: f64,
    /// 95 % interval of α, high end.
    pub ci95_high: f64,
    /// Components whose source states no uncertainty (counted as exact).
    pub uncertainty_not_stated: Vec<String>,
}

/// Fenske stages of the key pair in detail.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct FenskeDetail {
    /// Light-component purity of the distillate.
    pub distillate_purity: f64,
    /// Heavy-component purity of the bottoms.
    pub bottoms_purity: f64,
    /// `(x_D/(1−x_D))·(x_B/(1−x_B))`.
    pub separation_factor: f64,
    /// Standard uncertainty of N_min (delta method).
    pub u: Option<f64>,
    /// 95 % interval, low end.
    pub ci95_low: Option<f64>,
    /// 95 % interval, high end (null: unbounded, α may be 1).
    pub ci95_high: Option<f64>,
}

/// One adjacent pair (by boiling point) of a multi-component mixture.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PairSummary {
    /// Light member.
    pub light: String,
    /// Heavy member.
    pub heavy: String,
    /// Boiling-point difference, K.
    pub delta_tb_k: f64,
    /// Geometric-mean α.
    pub relative_volatility: f64,
    /// Fenske minimum stages for the purity targets.
    pub fenske_min_stages: Option<f64>,
}

/// A row of the pressure table.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PressureRow {
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Boiling point of each component (in the order of `components`), K.
    pub tb_k: Vec<f64>,
    /// Key-pair boiling-point difference, K.
    pub delta_tb_k: f64,
    /// Key-pair geometric-mean α.
    pub relative_volatility: f64,
    /// Key-pair Fenske minimum stages.
    pub fenske_min_stages: Option<f64>,
    /// Whether any boiling point is outside its source's validity range.
    pub extrapolated: bool,
    /// Whether this is the operating pressure.
    pub operating: bool,
}

/// The Rayleigh batch curve of the key pair.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RayleighSummary {
    /// Equilibrium model used.
    pub model: &'static str,
    /// Light-component mole fraction in the charge.
    pub feed_x_light: f64,
    /// The curve, every 5 % of the charge distilled up to 90 % (never to dryness).
    pub points: Vec<RayleighPoint>,
    /// The single cut that strips the pot to the bottoms target.
    pub cut_to_bottoms_target: Option<RayleighPoint>,
}

pub use crate::finding::{Finding, PlanCode, Severity, Subject};

/// The complete plan.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Plan {
    /// Operating pressure, Pa.
    pub pressure_pa: f64,
    /// How it was chosen.
    pub pressure_choice: PressureChoice,
    /// Components at that pressure, lightest first.
    pub components: Vec<ComponentAtPressure>,
    /// The key pair: the adjacent pair hardest to separate.
    pub key_pair: [String; 2],
    /// Key-pair geometric-mean relative volatility at the operating pressure.
    pub relative_volatility: f64,
    /// Its detail.
    pub relative_volatility_detail: VolatilityDetail,
    /// Fenske minimum theoretical stages for the key pair (null when α ≤ 1).
    pub fenske_min_stages: Option<f64>,
    /// Its detail.
    pub fenske_detail: FenskeDetail,
    /// Every adjacent pair (one for a binary).
    pub pairs: Vec<PairSummary>,
    /// Key-pair figures across pressures.
    pub pressure_table: Vec<PressureRow>,
    /// The Rayleigh batch curve.
    pub rayleigh: Option<RayleighSummary>,
    /// Liquid model of the key pair: `unifac` or `ideal`.
    pub activity_model: &'static str,
    /// Azeotropes of the key pair predicted at the operating pressure
    /// (`x1` is the light key's mole fraction).
    pub azeotropes: Vec<AzeotropeOut>,
    /// The key pair's predicted liquid–liquid split.
    pub liquid_split: LiquidSplit,
    /// A continuous column for the key pair on its equilibrium curve (null
    /// beyond an azeotrope or when it could not be designed).
    pub column: Option<ColumnSummary>,
    /// The verdict.
    pub verdict: Verdict,
    /// Findings.
    pub findings: Vec<Finding>,
    /// The ideal-solution limits.
    pub limits: &'static str,
    /// The usual cautions.
    pub cautions: &'static [&'static str],
    /// The key pair's equilibrium curve as the column was stepped on: (x, y) of
    /// the light key at 101 liquid compositions, for drawing (not in the JSON).
    #[serde(skip)]
    pub equilibrium_curve: Vec<(f64, f64)>,
    /// The key pair's T–x–y study with a liquid model, for drawing (not in the JSON).
    #[serde(skip)]
    pub key_pair_vle: Option<VleStudy>,
}
