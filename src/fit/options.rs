//! What to fit and how: model choice, critical point, robust loss, predictions.

use super::equation_fit::RobustLoss;
use crate::vapor::AntoineConvention;
use serde::{Deserialize, Serialize};

/// Which equation to fit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "lowercase")]
pub enum ModelSelection {
    /// Antoine (three constants).
    #[default]
    Antoine,
    /// Clausius–Clapeyron (two constants).
    Clapeyron,
    /// Riedel (four constants).
    Riedel,
    /// Wagner 2.5–5 (four constants; needs Tc and pc).
    Wagner,
    /// The equation with the lowest AICc among those the data support.
    Auto,
}

impl std::str::FromStr for ModelSelection {
    type Err = String;
    fn from_str(s: &str) -> Result<Self, String> {
        match s.trim().to_ascii_lowercase().as_str() {
            "antoine" => Ok(Self::Antoine),
            "clapeyron" | "clausius-clapeyron" => Ok(Self::Clapeyron),
            "riedel" => Ok(Self::Riedel),
            "wagner" => Ok(Self::Wagner),
            "auto" => Ok(Self::Auto),
            o => Err(format!(
                "unknown model '{o}' (antoine, clapeyron, riedel, wagner or auto)"
            )),
        }
    }
}

/// A requested prediction.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub enum At {
    /// Boiling temperature at this pressure (Pa).
    PressurePa(f64),
    /// Vapor pressure at this temperature (K).
    TemperatureK(f64),
}

/// A point the user left out of the fit (`--exclude`). The automatic outlier
/// rule never drops a point; only these are left out, and the report says so.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Exclude {
    /// By its 1-based number in the data, as the points table numbers them.
    Point(usize),
    /// By its line in the source file.
    Line(u64),
    /// By its temperature, K (every point within 0.005 K of it).
    TemperatureK(f64),
}

impl std::fmt::Display for Exclude {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Exclude::Point(n) => write!(f, "point {n}"),
            Exclude::Line(l) => write!(f, "line {l}"),
            Exclude::TemperatureK(t) => write!(f, "{} K", crate::units::tidy(*t)),
        }
    }
}

/// Options for one fit.
#[derive(Debug, Clone, PartialEq)]
pub struct FitOptions {
    /// Equation or `Auto`.
    pub model: ModelSelection,
    /// Critical temperature (K) and pressure (Pa), for Wagner.
    pub critical: Option<(f64, f64)>,
    /// Robust reweighting.
    pub robust: Option<RobustLoss>,
    /// Convention in which Antoine constants are reported.
    pub convention: AntoineConvention,
    /// Extra predictions.
    pub at: Vec<At>,
    /// Refit without each flagged point and report the difference (on by default).
    pub refit_without_outliers: bool,
    /// Points the user excluded (`--exclude`).
    pub exclude: Vec<Exclude>,
}

impl Default for FitOptions {
    fn default() -> Self {
        FitOptions {
            model: ModelSelection::Antoine,
            critical: None,
            robust: None,
            convention: AntoineConvention::DISPLAY,
            at: Vec::new(),
            refit_without_outliers: true,
            exclude: Vec::new(),
        }
    }
}
