//! Antoine constants and the convention they travel with.
//!
//! An Antoine row means nothing without its convention:
//! `log_base(p / p_unit) = A − B / (t / t_unit + C)`. ebullio never passes
//! bare A, B, C around; [`AntoineConstants`] always carries [`AntoineConvention`].
//!
//! ```
//! use ebullio::vapor::{AntoineConstants, AntoineConvention, Curve};
//! // Acetone, ln(p/kPa) = 14.3145 − 2756.22/(t/°C + 228.060)
//! // (Smith, Van Ness & Abbott, App. B Table B.2).
//! let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
//! let acetone = AntoineConstants::new(14.3145, 2756.22, 228.060, conv);
//! let tb = acetone.t_at(101_325.0).unwrap();
//! assert!((tb - 329.35).abs() < 0.2);
//! ```

use super::curve::Curve;
use crate::units::{PressureUnit, TemperatureUnit};
use serde::{Deserialize, Serialize};
use std::fmt;
use std::str::FromStr;

/// Logarithm base of an Antoine equation.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum LogBase {
    /// Common logarithm.
    #[serde(rename = "log10")]
    Ten,
    /// Natural logarithm.
    #[serde(rename = "ln")]
    E,
}

impl LogBase {
    /// ln(base): multiply a log-base value by this to get a natural log.
    pub fn ln_base(self) -> f64 {
        match self {
            LogBase::Ten => std::f64::consts::LN_10,
            LogBase::E => 1.0,
        }
    }
    /// Symbol: `log10` or `ln`.
    pub fn symbol(self) -> &'static str {
        match self {
            LogBase::Ten => "log10",
            LogBase::E => "ln",
        }
    }
    /// Parse `log10`/`log`/`10`, `ln`/`e`.
    pub fn parse(s: &str) -> Option<Self> {
        match s.trim().to_ascii_lowercase().as_str() {
            "log10" | "log" | "10" | "lg" => Some(LogBase::Ten),
            "ln" | "e" | "loge" => Some(LogBase::E),
            _ => None,
        }
    }
}

/// The convention of a set of Antoine constants: log base, pressure unit,
/// temperature unit. Written `"log10,mmHg,degC"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub struct AntoineConvention {
    /// Logarithm base.
    pub log_base: LogBase,
    /// Pressure unit inside the logarithm.
    pub p_unit: PressureUnit,
    /// Temperature unit of t and C.
    pub t_unit: TemperatureUnit,
}

/// Error reading a convention string.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("'{text}' is not an Antoine convention: {reason}; write it as \"log10,mmHg,degC\" (log base, pressure unit, temperature unit)")]
pub struct ConventionError {
    /// The text given.
    pub text: String,
    /// What was wrong.
    pub reason: String,
}

impl AntoineConvention {
    /// The SI convention used inside: ln, Pa, K.
    pub const SI: AntoineConvention = AntoineConvention {
        log_base: LogBase::E,
        p_unit: PressureUnit::Pa,
        t_unit: TemperatureUnit::Kelvin,
    };

    /// The default display convention, `log10,mmHg,degC`.
    pub const DISPLAY: AntoineConvention = AntoineConvention {
        log_base: LogBase::Ten,
        p_unit: PressureUnit::MmHg,
        t_unit: TemperatureUnit::Celsius,
    };
}

impl FromStr for AntoineConvention {
    type Err = ConventionError;
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let err = |reason: String| ConventionError {
            text: s.to_string(),
            reason,
        };
        let parts: Vec<&str> = s.split([',', ';', '/']).map(str::trim).collect();
        if parts.len() != 3 {
            return Err(err(format!("expected 3 parts, found {}", parts.len())));
        }
        let log_base = LogBase::parse(parts[0])
            .ok_or_else(|| err(format!("unknown log base '{}' (log10 or ln)", parts[0])))?;
        let p_unit = PressureUnit::parse(parts[1]).map_err(|e| err(e.to_string()))?;
        let t_unit = TemperatureUnit::parse(parts[2]).map_err(|e| err(e.to_string()))?;
        Ok(AntoineConvention {
            log_base,
            p_unit,
            t_unit,
        })
    }
}

impl fmt::Display for AntoineConvention {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{},{},{}",
            self.log_base.symbol(),
            self.p_unit.symbol(),
            self.t_unit.symbol()
        )
    }
}

/// Serde for a convention written as text (`log10,mmHg,degC`), as in fit reports:
/// `#[serde(with = "crate::vapor::convention::as_text")]`.
pub mod as_text {
    use super::AntoineConvention;
    use serde::{Deserialize, Deserializer, Serializer};

    /// Write the convention as `base,p_unit,t_unit`.
    pub fn serialize<S: Serializer>(c: &AntoineConvention, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(c)
    }

    /// Read `base,p_unit,t_unit`.
    pub fn deserialize<'de, D: Deserializer<'de>>(d: D) -> Result<AntoineConvention, D::Error> {
        let text = String::deserialize(d)?;
        text.parse().map_err(serde::de::Error::custom)
    }
}

/// Antoine constants with their convention and, optionally, validity range.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct AntoineConstants {
    /// A (dimensionless in the convention's log).
    pub a: f64,
    /// B (in the convention's temperature unit).
    pub b: f64,
    /// C (in the convention's temperature unit).
    pub c: f64,
    /// The convention.
    pub convention: AntoineConvention,
    /// Validity range in kelvin, when the source states one.
    pub range_k: Option<(f64, f64)>,
}

impl AntoineConstants {
    /// Constants with no stated validity range.
    pub fn new(a: f64, b: f64, c: f64, convention: AntoineConvention) -> Self {
        Self {
            a,
            b,
            c,
            convention,
            range_k: None,
        }
    }

    /// With a validity range in kelvin.
    pub fn with_range_k(mut self, lo: f64, hi: f64) -> Self {
        self.range_k = Some((lo, hi));
        self
    }

    /// The value of the logarithm in the row's own convention at `t` (own unit).
    pub fn log_p_own(&self, t_own: f64) -> f64 {
        self.a - self.b / (t_own + self.c)
    }

    /// Temperature in the row's own unit where the row's log-pressure equals `y`.
    /// Closed form: t = B/(A − y) − C.
    pub fn t_own_at(&self, y: f64) -> f64 {
        self.b / (self.a - y) - self.c
    }

    /// The convention's log-pressure `y` at `p_pa` (what [`Curve::t_at`] solves for;
    /// the same for every set of constants in one convention).
    pub fn log_p_in_convention(&self, p_pa: f64) -> f64 {
        let conv = self.convention;
        (p_pa / conv.p_unit.pa_per_unit()).ln() / conv.log_base.ln_base()
    }

    /// [`Curve::t_at`] given the convention's log-pressure `y`
    /// ([`AntoineConstants::log_p_in_convention`]), in K; `None` where the
    /// equation gives no positive temperature.
    pub fn t_at_log_p(&self, y: f64) -> Option<f64> {
        if y >= self.a || self.b <= 0.0 {
            return None;
        }
        let t_own = self.t_own_at(y);
        let k = self.convention.t_unit.to_kelvin(t_own);
        (k > 0.0 && k.is_finite()).then_some(k)
    }

    /// True when `t + C` stays positive over `[lo, hi]` K, so the equation is
    /// defined and monotone there.
    pub fn denominator_positive_on(&self, lo_k: f64, hi_k: f64) -> bool {
        let u = self.convention.t_unit;
        u.from_kelvin(lo_k) + self.c > 0.0 && u.from_kelvin(hi_k) + self.c > 0.0
    }
}

impl Curve for AntoineConstants {
    fn ln_p(&self, t_k: f64) -> f64 {
        let conv = self.convention;
        let t = conv.t_unit.from_kelvin(t_k);
        let den = t + self.c;
        if den <= 0.0 {
            return f64::NAN;
        }
        let y = self.a - self.b / den;
        y * conv.log_base.ln_base() + conv.p_unit.pa_per_unit().ln()
    }

    fn d_ln_p_dt(&self, t_k: f64) -> f64 {
        let conv = self.convention;
        let t = conv.t_unit.from_kelvin(t_k);
        let den = t + self.c;
        conv.log_base.ln_base() * self.b / (den * den) / conv.t_unit.kelvin_per_degree()
    }

    fn valid_range_k(&self) -> Option<(f64, f64)> {
        self.range_k
    }

    fn t_at(&self, p_pa: f64) -> Option<f64> {
        if !(p_pa > 0.0 && p_pa.is_finite()) {
            return None;
        }
        self.t_at_log_p(self.log_p_in_convention(p_pa))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn convention_parses_and_prints() {
        let c: AntoineConvention = "log10, mmHg, °C".parse().unwrap();
        assert_eq!(c, AntoineConvention::DISPLAY);
        assert_eq!(c.to_string(), "log10,mmHg,degC");
        assert!("log10,mmHg".parse::<AntoineConvention>().is_err());
        assert!("log2,mmHg,K".parse::<AntoineConvention>().is_err());
        let e = "ln,furlong,K".parse::<AntoineConvention>().unwrap_err();
        assert!(e.to_string().contains("furlong"));
    }

    // Smith, Van Ness & Abbott, App. B Table B.2: benzene ln(p/kPa) = 13.7819 −
    // 2726.81/(t/°C + 217.572), tabulated normal boiling point 80.0 °C.
    #[test]
    fn svna_benzene_normal_boiling_point() {
        let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
        let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, conv);
        let tb = bz.t_at(101_325.0).unwrap();
        assert!((tb - 353.15).abs() < 0.2, "{tb}");
        // p(t_at(p)) == p
        assert!((bz.p_pa(tb) - 101_325.0).abs() < 1e-6);
        // analytic slope agrees with a finite difference
        let h = 1e-3;
        let fd = (bz.ln_p(tb + h) - bz.ln_p(tb - h)) / (2.0 * h);
        assert!((fd - bz.d_ln_p_dt(tb)).abs() < 1e-7);
    }

    // A kelvin-convention row with C = −40 K is defined where T > 40 K (issue 22: the
    // mutant `T · C > 0` for `T + C > 0` went unnoticed).
    #[test]
    fn denominator_positive_only_above_minus_c() {
        let row = AntoineConstants::new(9.0, 1500.0, -40.0, "ln,kPa,K".parse().unwrap());
        assert!(row.denominator_positive_on(250.0, 300.0));
        assert!(!row.denominator_positive_on(30.0, 300.0));
        assert!(!row.denominator_positive_on(250.0, 35.0));
    }

    #[test]
    fn undefined_below_minus_c() {
        let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap());
        assert!(bz.ln_p(crate::units::CELSIUS_OFFSET - 220.0).is_nan());
        assert!(bz.t_at(-5.0).is_none());
    }
}
