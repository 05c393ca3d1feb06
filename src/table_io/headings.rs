//! Column headings: the IUPAC quantity/unit form (`T/K`, `p/kPa`, `u(T)/K`) and
//! the bracket forms (`T [K]`, `p (kPa)`), mapped to roles and units.

use crate::units::{parse_pressure_scale, PressureScale, PressureUnit, TemperatureUnit};

/// What a column holds.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Role {
    /// Temperature, with its unit when the heading gives one.
    Temperature(Option<TemperatureUnit>),
    /// Pressure, with its unit when the heading gives one.
    Pressure(Option<PressureUnit>),
    /// Gauge pressure (`p/barg`, `p (kPa(g))`): needs the barometric pressure.
    GaugePressure(PressureUnit),
    /// Standard uncertainty of temperature.
    UTemperature(Option<TemperatureUnit>),
    /// Standard uncertainty of pressure.
    UPressure(Option<PressureUnit>),
    /// The compound name.
    Compound,
    /// A SMILES string.
    Smiles,
    /// Carried-through text (`source`, `note`) or any unrecognised column.
    Other,
}

/// Why a heading could not be read.
#[derive(Debug, Clone, PartialEq)]
pub struct HeadingError {
    /// What was wrong and what was expected.
    pub message: String,
}

/// Split `"p/kPa"`, `"p [kPa]"`, `"p (kPa)"` into quantity and unit text.
pub fn split_heading(h: &str) -> (String, Option<String>) {
    let h = h.trim();
    // u(T)/K: the quantity itself holds parentheses, so split on the last '/'.
    if let Some(i) = h.rfind('/') {
        let (q, u) = (h[..i].trim(), h[i + 1..].trim());
        if !q.is_empty() {
            return (q.to_string(), Some(u.to_string()));
        }
    }
    for (open, close) in [('[', ']'), ('(', ')')] {
        if h.ends_with(close) {
            if let Some(i) = h.rfind(open) {
                let q = h[..i].trim();
                // "u(T)" alone is a quantity, not "u" in unit "T".
                let is_u_of = q == "u" && open == '(';
                if !q.is_empty() && !is_u_of {
                    return (
                        q.to_string(),
                        Some(h[i + 1..h.len() - 1].trim().to_string()),
                    );
                }
            }
        }
    }
    (h.to_string(), None)
}

fn t_unit(u: &Option<String>) -> Result<Option<TemperatureUnit>, HeadingError> {
    match u {
        None => Ok(None),
        Some(s) => TemperatureUnit::parse(s)
            .map(Some)
            .map_err(|e| HeadingError {
                message: e.to_string(),
            }),
    }
}

fn p_unit(u: &Option<String>) -> Result<Option<PressureUnit>, HeadingError> {
    match u {
        None => Ok(None),
        Some(s) => PressureUnit::parse(s).map(Some).map_err(|e| HeadingError {
            message: e.to_string(),
        }),
    }
}

/// Classify one heading.
///
/// ```
/// use ebullio::table_io::headings::{classify, Role};
/// use ebullio::units::{PressureUnit, TemperatureUnit};
/// assert_eq!(classify("t/°C").unwrap(), Role::Temperature(Some(TemperatureUnit::Celsius)));
/// assert_eq!(classify("p (kPa)").unwrap(), Role::Pressure(Some(PressureUnit::KPa)));
/// assert_eq!(classify("u(T)/K").unwrap(), Role::UTemperature(Some(TemperatureUnit::Kelvin)));
/// assert!(classify("p/furlongs").is_err());
/// ```
pub fn classify(h: &str) -> Result<Role, HeadingError> {
    let (q, u) = split_heading(h);
    let ql = q.to_ascii_lowercase();
    let role = match ql.as_str() {
        "t" | "temperature" | "temp" => Role::Temperature(t_unit(&u)?),
        "p" | "pressure" | "p_sat" | "psat" => match u.as_deref().map(parse_pressure_scale) {
            Some(Ok(PressureScale::Gauge(g))) => Role::GaugePressure(g),
            _ => Role::Pressure(p_unit(&u)?),
        },
        "u(t)" => Role::UTemperature(t_unit(&u)?),
        "u(p)" => Role::UPressure(p_unit(&u)?),
        "compound" | "name" => Role::Compound,
        "smiles" => Role::Smiles,
        _ => Role::Other,
    };
    Ok(role)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn iupac_and_bracket_forms() {
        use PressureUnit as P;
        use TemperatureUnit as T;
        let cases = [
            ("T/K", Role::Temperature(Some(T::Kelvin))),
            ("t/degC", Role::Temperature(Some(T::Celsius))),
            ("T [K]", Role::Temperature(Some(T::Kelvin))),
            ("p/mmHg", Role::Pressure(Some(P::MmHg))),
            ("p (kPa)", Role::Pressure(Some(P::KPa))),
            ("u(p)/kPa", Role::UPressure(Some(P::KPa))),
            ("u(T) [K]", Role::UTemperature(Some(T::Kelvin))),
            ("p/mbar(a)", Role::Pressure(Some(P::MBar))),
            ("p (mm Hg)", Role::Pressure(Some(P::MmHg))),
            ("p/TORR", Role::Pressure(Some(P::Torr))),
            ("t/ºC", Role::Temperature(Some(T::Celsius))),
            ("p/barg", Role::GaugePressure(P::Bar)),
            ("p [kPa(g)]", Role::GaugePressure(P::KPa)),
            ("T", Role::Temperature(None)),
            ("compound", Role::Compound),
            ("note", Role::Other),
        ];
        for (h, want) in cases {
            assert_eq!(classify(h).unwrap(), want, "{h}");
        }
    }
}
