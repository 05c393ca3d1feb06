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

pub(crate) const ACCEPTED_P: &str = "Pa, hPa, kPa, MPa, bar, mbar, atm, mmHg, Torr, psi, inHg (any case; absolute markers bara, psia, mbar(a), mmHg abs; gauge barg, psig, kPa(g) with a barometric pressure)";

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

    /// Parse an absolute-pressure unit as people write it: any case except
    /// where SI prefixes matter (`mPa` is not `MPa`), with an absolute marker
    /// (`bara`, `psia`, `mbar(a)`, `mmHg abs`) or a space (`mm Hg`). Gauge
    /// units (`barg`, `psig`, `kPa(g)`) are refused with
    /// [`UnitError::GaugePressure`]: they need the barometric pressure
    /// ([`parse_pressure_scale`] reads them).
    ///
    /// ```
    /// use ebullio::units::PressureUnit;
    /// assert_eq!(PressureUnit::parse("mmHg").unwrap(), PressureUnit::MmHg);
    /// assert_eq!(PressureUnit::parse("TORR").unwrap(), PressureUnit::Torr);
    /// assert_eq!(PressureUnit::parse("mbar(a)").unwrap(), PressureUnit::MBar);
    /// assert_eq!(PressureUnit::parse("mmHg abs").unwrap(), PressureUnit::MmHg);
    /// assert!(PressureUnit::parse("barg").is_err());
    /// assert!(PressureUnit::parse("furlong").is_err());
    /// ```
    pub fn parse(s: &str) -> Result<Self, UnitError> {
        match parse_pressure_scale(s)? {
            PressureScale::Absolute(u) => Ok(u),
            PressureScale::Gauge(u) => Err(UnitError::GaugePressure {
                unit: s.trim().to_string(),
                base: u.symbol().to_string(),
            }),
        }
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

/// A pressure unit as written: absolute, or gauge (relative to the barometric pressure).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PressureScale {
    /// An absolute unit (`bar`, `bara`, `mbar(a)`, `mmHg abs`).
    Absolute(PressureUnit),
    /// A gauge unit (`barg`, `psig`, `kPa(g)`, `bar gauge`): add the barometric pressure.
    Gauge(PressureUnit),
}

impl PressureScale {
    /// The unit, absolute or gauge.
    pub fn unit(self) -> PressureUnit {
        match self {
            Self::Absolute(u) | Self::Gauge(u) => u,
        }
    }

    /// Absolute pascal from a value in this scale; a gauge value needs the
    /// barometric pressure in pascal, else [`UnitError::GaugePressure`].
    pub fn to_absolute_pa(self, v: f64, barometric_pa: Option<f64>) -> Result<f64, UnitError> {
        match self {
            Self::Absolute(u) => Ok(u.to_pa(v)),
            Self::Gauge(u) => match barometric_pa {
                Some(b) => Ok(u.to_pa(v) + b),
                None => Err(UnitError::GaugePressure {
                    unit: format!("{}g", u.symbol()),
                    base: u.symbol().to_string(),
                }),
            },
        }
    }
}

/// Read a pressure unit as people write it, absolute or gauge.
///
/// Case is ignored except for the `Pa` prefixes (`MPa`, and `mPa` is refused
/// rather than guessed). Absolute markers: a trailing `a` on `bara`, `mbara`,
/// `psia`, `(a)`, `(abs)`, ` abs`, ` absolute`. Gauge markers: a trailing `g`
/// on `barg`, `mbarg`, `psig`, `kPag`, `(g)`, ` g`, ` gauge`, `(gauge)`.
///
/// ```
/// use ebullio::units::{parse_pressure_scale, PressureScale, PressureUnit};
/// assert_eq!(parse_pressure_scale("barg").unwrap(), PressureScale::Gauge(PressureUnit::Bar));
/// assert_eq!(parse_pressure_scale("kPa(g)").unwrap(), PressureScale::Gauge(PressureUnit::KPa));
/// assert_eq!(parse_pressure_scale("Kpa").unwrap(), PressureScale::Absolute(PressureUnit::KPa));
/// ```
pub fn parse_pressure_scale(s: &str) -> Result<PressureScale, UnitError> {
    let t = s.trim();
    let unknown = || UnitError::UnknownUnit {
        kind: "pressure",
        unit: t.to_string(),
        accepted: ACCEPTED_P.to_string(),
    };
    // Marker words and bracketed markers first, then the unit itself.
    let lower = t.to_ascii_lowercase();
    let (body, gauge) = strip_marker(t, &lower);
    if let Some(u) = base_unit(body) {
        return Ok(if gauge {
            PressureScale::Gauge(u)
        } else {
            PressureScale::Absolute(u)
        });
    }
    if body.len() == t.len() {
        // A glued suffix: bara, psia, mbara, kPaa; barg, psig, mbarg, kPag.
        for (suffix, g) in [('a', false), ('g', true), ('A', false), ('G', true)] {
            if let Some(stem) = t.strip_suffix(suffix) {
                if let Some(u) = base_unit(stem) {
                    // "Pa"+"a" etc. fine; but never read a plain unit ending in a/g twice.
                    return Ok(if g {
                        PressureScale::Gauge(u)
                    } else {
                        PressureScale::Absolute(u)
                    });
                }
            }
        }
    }
    Err(unknown())
}

/// Strip an absolute or gauge marker written apart from the unit:
/// `(a)`, `(abs)`, ` abs`, ` absolute`, `(g)`, `(gauge)`, ` g`, ` gauge`.
fn strip_marker<'a>(t: &'a str, lower: &str) -> (&'a str, bool) {
    const ABS: [&str; 5] = ["(a)", "(abs)", "(absolute)", " absolute", " abs"];
    const GAUGE: [&str; 4] = ["(g)", "(gauge)", " gauge", " g"];
    for m in ABS {
        if lower.ends_with(m) && t.len() >= m.len() {
            return (t[..t.len() - m.len()].trim_end(), false);
        }
    }
    for m in GAUGE {
        if lower.ends_with(m) && t.len() >= m.len() {
            return (t[..t.len() - m.len()].trim_end(), true);
        }
    }
    (t, false)
}

/// The plain unit: case-insensitive except the pascal prefixes.
fn base_unit(t: &str) -> Option<PressureUnit> {
    let t = t.trim();
    // Pascal family: the prefix decides, so case matters for M/m.
    match t {
        "MPa" | "Mpa" | "MPA" => return Some(PressureUnit::MPa),
        "mPa" | "mpa" => return None, // millipascal: never a vapor-pressure unit, never guessed
        _ => {}
    }
    let squeezed: String = t
        .chars()
        .filter(|c| !c.is_whitespace() && *c != '.')
        .collect::<String>()
        .to_lowercase();
    let u = match squeezed.as_str() {
        "pa" => PressureUnit::Pa,
        "hpa" => PressureUnit::HPa,
        "kpa" => PressureUnit::KPa,
        "bar" => PressureUnit::Bar,
        "mbar" => PressureUnit::MBar,
        "atm" => PressureUnit::Atm,
        "mmhg" => PressureUnit::MmHg,
        "torr" => PressureUnit::Torr,
        "psi" => PressureUnit::Psi,
        "inhg" => PressureUnit::InHg,
        _ => return None,
    };
    Some(u)
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
        Ok(Self(super::tidy(unit.to_pa(v))))
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
