//! Pressure units and the absolute-pressure type.

use super::UnitError;
use serde::{Deserialize, Serialize};
use std::fmt;

/// A pressure unit. Factors from NIST SP 811 (2008), Appendix B.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum PressureUnit {
    /// Pascal.
    Pa,
    /// Hectopascal.
    #[serde(rename = "hPa")]
    HPa,
    /// Kilopascal.
    #[serde(rename = "kPa")]
    KPa,
    /// Megapascal.
    MPa,
    /// Bar (exactly 100 kPa).
    #[serde(rename = "bar")]
    Bar,
    /// Millibar (exactly 100 Pa).
    #[serde(rename = "mbar")]
    MBar,
    /// Standard atmosphere (exactly 101 325 Pa).
    #[serde(rename = "atm")]
    Atm,
    /// Conventional millimetre of mercury (133.322 387 415 Pa).
    #[serde(rename = "mmHg")]
    MmHg,
    /// Torr (exactly 101 325/760 Pa).
    Torr,
    /// Pound-force per square inch (6 894.757 293 Pa).
    #[serde(rename = "psi")]
    Psi,
    /// Conventional inch of mercury at 0 °C (3 386.389 Pa).
    #[serde(rename = "inHg")]
    InHg,
}

pub(crate) const ACCEPTED_P: &str = "Pa, hPa, kPa, MPa, bar, mbar, atm, mmHg, Torr, psi, inHg";

impl PressureUnit {
    /// All units, in display order.
    pub const ALL: [PressureUnit; 11] = [
        PressureUnit::Pa,
        PressureUnit::HPa,
        PressureUnit::KPa,
        PressureUnit::MPa,
        PressureUnit::Bar,
        PressureUnit::MBar,
        PressureUnit::Atm,
        PressureUnit::MmHg,
        PressureUnit::Torr,
        PressureUnit::Psi,
        PressureUnit::InHg,
    ];

    /// Parse a unit symbol (case-sensitive where SI prefixes matter: `mPa` is not `MPa`).
    ///
    /// ```
    /// use ebullio::units::PressureUnit;
    /// assert_eq!(PressureUnit::parse("mmHg").unwrap(), PressureUnit::MmHg);
    /// assert_eq!(PressureUnit::parse("torr").unwrap(), PressureUnit::Torr);
    /// assert!(PressureUnit::parse("furlong").is_err());
    /// ```
    pub fn parse(s: &str) -> Result<Self, UnitError> {
        let t = s.trim();
        let u = match t {
            "Pa" | "pa" => Self::Pa,
            "hPa" => Self::HPa,
            "kPa" | "kpa" | "KPa" => Self::KPa,
            "MPa" | "Mpa" => Self::MPa,
            "bar" | "Bar" | "bara" => Self::Bar,
            "mbar" | "mBar" | "mbara" => Self::MBar,
            "atm" | "Atm" | "ATM" => Self::Atm,
            "mmHg" | "mmhg" | "mm Hg" | "MMHG" => Self::MmHg,
            "Torr" | "torr" => Self::Torr,
            "psi" | "psia" | "PSI" | "PSIA" => Self::Psi,
            "inHg" | "inhg" | "in Hg" => Self::InHg,
            _ => {
                return Err(UnitError::UnknownUnit {
                    kind: "pressure",
                    unit: t.to_string(),
                    accepted: ACCEPTED_P.to_string(),
                })
            }
        };
        Ok(u)
    }

    /// The symbol used in ebullio's own output.
    pub fn symbol(self) -> &'static str {
        match self {
            Self::Pa => "Pa",
            Self::HPa => "hPa",
            Self::KPa => "kPa",
            Self::MPa => "MPa",
            Self::Bar => "bar",
            Self::MBar => "mbar",
            Self::Atm => "atm",
            Self::MmHg => "mmHg",
            Self::Torr => "Torr",
            Self::Psi => "psi",
            Self::InHg => "inHg",
        }
    }

    /// Pascal per one of this unit.
    pub fn pa_per_unit(self) -> f64 {
        match self {
            Self::Pa => 1.0,
            Self::HPa => 100.0,
            Self::KPa => 1000.0,
            Self::MPa => 1.0e6,
            Self::Bar => 1.0e5,
            Self::MBar => 100.0,
            Self::Atm => 101_325.0,
            Self::MmHg => 133.322_387_415,
            Self::Torr => 101_325.0 / 760.0,
            Self::Psi => 6_894.757_293,
            Self::InHg => 3_386.389,
        }
    }

    /// Convert a value in this unit to pascal.
    pub fn to_pa(self, v: f64) -> f64 {
        v * self.pa_per_unit()
    }

    /// Convert pascal to this unit.
    pub fn from_pa(self, pa: f64) -> f64 {
        pa / self.pa_per_unit()
    }
}

impl fmt::Display for PressureUnit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol())
    }
}

/// An absolute pressure, stored in pascal; always finite and positive.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Serialize, Deserialize)]
pub struct Pressure(f64);

impl Pressure {
    /// Build from pascal.
    pub fn from_pa(pa: f64) -> Result<Self, UnitError> {
        Self::new(pa, PressureUnit::Pa)
    }

    /// Build from a value in a unit; zero, negative and non-finite values are errors.
    ///
    /// ```
    /// use ebullio::units::{Pressure, PressureUnit};
    /// let p = Pressure::new(1.0, PressureUnit::Atm).unwrap();
    /// assert_eq!(p.pa(), 101_325.0);
    /// assert!(Pressure::new(-0.2, PressureUnit::Bar).is_err());
    /// ```
    pub fn new(v: f64, unit: PressureUnit) -> Result<Self, UnitError> {
        if !v.is_finite() {
            return Err(UnitError::NotFinite {
                text: v.to_string(),
            });
        }
        if v <= 0.0 {
            return Err(UnitError::NonPositivePressure {
                value: v,
                unit: unit.symbol().to_string(),
            });
        }
        Ok(Self(unit.to_pa(v)))
    }

    /// The value in pascal.
    pub fn pa(self) -> f64 {
        self.0
    }

    /// The value in a given unit.
    pub fn in_unit(self, unit: PressureUnit) -> f64 {
        unit.from_pa(self.0)
    }
}
