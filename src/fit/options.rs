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

impl std::str::FromStr for Exclude {
    type Err = String;
    /// "4" (point number), "line:5" / "line 5" (line in the file), or a temperature
    /// with its unit ("80 degC").
    ///
    /// ```
    /// use ebullio::fit::Exclude;
    /// assert_eq!("4".parse::<Exclude>(), Ok(Exclude::Point(4)));
    /// assert_eq!("line:5".parse::<Exclude>(), Ok(Exclude::Line(5)));
    /// let Ok(Exclude::TemperatureK(t)) = "80 degC".parse::<Exclude>() else { panic!() };
    /// assert!((t - 353.15).abs() < 1e-9);
    /// assert!("line x".parse::<Exclude>().is_err());
    /// ```
    fn from_str(s: &str) -> Result<Self, String> {
        let t = s.trim();
        if let Some(rest) = t.to_ascii_lowercase().strip_prefix("line") {
            let n = rest.trim_start_matches([':', ' ', '=']).trim();
            return n
                .parse::<u64>()
                .map(Exclude::Line)
                .map_err(|_| "write a line as \"line:5\"".to_string());
        }
        if let Ok(n) = t.parse::<usize>() {
            return Ok(Exclude::Point(n));
        }
        crate::units::parse_temperature(t)
            .map(|q| Exclude::TemperatureK(q.kelvin()))
            .map_err(|e| {
                format!(
                    "expected a point number (\"4\"), a line (\"line:5\") or a temperature (\"80 degC\"): {e}"
                )
            })
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
