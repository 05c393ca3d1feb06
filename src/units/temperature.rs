//! Temperature units and the absolute-temperature type.

use super::{UnitError, CELSIUS_OFFSET};
use serde::{Deserialize, Serialize};
use std::fmt;

/// A temperature unit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum TemperatureUnit {
    /// Kelvin.
    #[serde(rename = "K")]
    Kelvin,
    /// Degree Celsius.
    #[serde(rename = "degC")]
    Celsius,
    /// Degree Fahrenheit.
    #[serde(rename = "degF")]
    Fahrenheit,
    /// Degree Rankine.
    #[serde(rename = "degR")]
    Rankine,
}

/// Symbols accepted for temperature, for error messages.
pub(crate) const ACCEPTED_T: &str = "K, °C (degC, C, ºC), °F (degF, F), °R (degR, R), in any case";

impl TemperatureUnit {
    /// All units, in display order.
    pub const ALL: [TemperatureUnit; 4] = [
        TemperatureUnit::Kelvin,
        TemperatureUnit::Celsius,
        TemperatureUnit::Fahrenheit,
        TemperatureUnit::Rankine,
    ];

    /// Parse a unit symbol as people write it: `K`, `°C`/`degC`/`C`,
    /// `°F`/`degF`/`F`, `°R`/`degR`/`R`, in any case, with the degree sign,
    /// the ordinal sign `º` many spreadsheets produce, or a ring `˚`; `°K`
    /// (an old form of kelvin) is read as kelvin.
    ///
    /// ```
    /// use ebullio::units::TemperatureUnit;
    /// assert_eq!(TemperatureUnit::parse("degC").unwrap(), TemperatureUnit::Celsius);
    /// assert_eq!(TemperatureUnit::parse("ºC").unwrap(), TemperatureUnit::Celsius);
    /// assert_eq!(TemperatureUnit::parse("°K").unwrap(), TemperatureUnit::Kelvin);
    /// assert!(TemperatureUnit::parse("kelvins?").is_err());
    /// ```
    pub fn parse(s: &str) -> Result<Self, UnitError> {
        let t = s.trim();
        let key: String = t
            .chars()
            .filter(|c| !c.is_whitespace())
            .map(|c| match c {
                'º' | '˚' | 'o' | 'O' => '°',
                c => c.to_ascii_lowercase(),
            })
            .collect();
        let key = key
            .strip_prefix("deg")
            .map_or(key.clone(), |r| format!("°{r}"));
        let u = match key.as_str() {
            "k" | "°k" | "kelvin" => Self::Kelvin,
            "°c" | "℃" | "c" | "celsius" | "°celsius" => Self::Celsius,
            "°f" | "℉" | "f" | "fahrenheit" | "°fahrenheit" => Self::Fahrenheit,
            "°r" | "r" | "rankine" | "°rankine" => Self::Rankine,
            _ => {
                return Err(UnitError::UnknownUnit {
                    kind: "temperature",
                    unit: t.to_string(),
                    accepted: ACCEPTED_T.to_string(),
                })
            }
        };
        Ok(u)
    }

    /// The ASCII symbol used in ebullio's own output (`K`, `degC`, `degF`, `degR`).
    pub fn symbol(self) -> &'static str {
        match self {
            Self::Kelvin => "K",
            Self::Celsius => "degC",
            Self::Fahrenheit => "degF",
            Self::Rankine => "degR",
        }
    }

    /// Convert a value in this unit to kelvin.
    pub fn to_kelvin(self, v: f64) -> f64 {
        match self {
            Self::Kelvin => v,
            Self::Celsius => v + CELSIUS_OFFSET,
            Self::Fahrenheit => (v + 459.67) * 5.0 / 9.0,
            Self::Rankine => v * 5.0 / 9.0,
        }
    }

    /// Convert kelvin to a value in this unit.
    pub fn from_kelvin(self, k: f64) -> f64 {
        match self {
            Self::Kelvin => k,
            Self::Celsius => k - CELSIUS_OFFSET,
            Self::Fahrenheit => k * 9.0 / 5.0 - 459.67,
            Self::Rankine => k * 9.0 / 5.0,
        }
    }

    /// Size of one degree of this unit in kelvin (for uncertainties and differences).
    pub fn kelvin_per_degree(self) -> f64 {
        match self {
            Self::Kelvin | Self::Celsius => 1.0,
            Self::Fahrenheit | Self::Rankine => 5.0 / 9.0,
        }
    }
}

impl fmt::Display for TemperatureUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

/// An absolute temperature, stored in kelvin; never below 0 K.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Serialize, Deserialize)]
pub struct Temperature(f64);

impl Temperature {
    /// Build from kelvin; fails below 0 K or when not finite.
    pub fn from_kelvin(k: f64) -> Result<Self, UnitError> {
        Self::new(k, TemperatureUnit::Kelvin)
    }

    /// Build from a value in a unit; fails below absolute zero or when not finite.
    ///
    /// ```
    /// use ebullio::units::{Temperature, TemperatureUnit};
    /// let t = Temperature::new(-5.5, TemperatureUnit::Celsius).unwrap();
    /// assert!((t.kelvin() - 267.65).abs() < 1e-12);
    /// assert!(Temperature::new(-300.0, TemperatureUnit::Celsius).is_err());
    /// ```
    pub fn new(v: f64, unit: TemperatureUnit) -> Result<Self, UnitError> {
        if !v.is_finite() {
            return Err(UnitError::NotFinite {
                text: v.to_string(),
            });
        }
        let k = unit.to_kelvin(v);
        // Tolerate rounding at exactly absolute zero in the Fahrenheit/Rankine paths.
        if k < -1e-9 {
            return Err(UnitError::BelowAbsoluteZero {
                value: v,
                unit: unit.symbol().to_string(),
            });
        }
        Ok(Self(super::tidy(k.max(0.0))))
    }

    /// The value in kelvin.
    pub fn kelvin(self) -> f64 {
        self.0
    }

    /// The value in a given unit.
    pub fn in_unit(self, unit: TemperatureUnit) -> f64 {
        unit.from_kelvin(self.0)
    }
}
