//! A fit as its user writes it (model name, constants convention, quantities with units,
//! points to leave out) turned into [`FitOptions`]: the command line and the Python package
//! read the same text the same way.

use super::equation_fit::RobustLoss;
use super::options::{At, Exclude, FitOptions, ModelSelection};
use crate::units::{parse_pressure_at, parse_quantity_at, parse_temperature, Pressure, Quantity};
use crate::vapor::AntoineConvention;

/// The options of one fit as text, as given on the command line or in a Python call.
#[derive(Debug, Clone, Default)]
pub struct FitRequest<'a> {
    /// "antoine", "clapeyron", "riedel", "wagner" or "auto".
    pub model: &'a str,
    /// Antoine convention of the reported constants ("log10,mmHg,degC").
    pub constants: &'a str,
    /// Critical temperature with unit, for Wagner ("562.0 K").
    pub tc: Option<&'a str>,
    /// Critical pressure with unit, for Wagner ("48.9 bar").
    pub pc: Option<&'a str>,
    /// Refit with Tukey's biweight.
    pub robust: bool,
    /// Predictions: a pressure ("20 mbar") or a temperature ("85 degC") each.
    pub at: &'a [String],
    /// Points to leave out ("4", "line:5", "80 degC").
    pub exclude: &'a [String],
    /// Site barometric pressure, Pa, for gauge pressures in `pc` and `at`.
    pub barometric_pa: Option<f64>,
}

impl FitRequest<'_> {
    /// The options, or a message naming the option at fault. `name` spells an option as
    /// the caller's users write it (`--tc` on the command line, `tc` in Python).
    ///
    /// ```
    /// use ebullio::fit::{At, FitRequest, ModelSelection};
    /// let at = ["20 mbar".to_string()];
    /// let req = FitRequest { model: "auto", constants: "log10,mmHg,degC", at: &at, ..Default::default() };
    /// let o = req.resolve(&|n| format!("--{n}")).unwrap();
    /// assert_eq!(o.model, ModelSelection::Auto);
    /// assert_eq!(o.at, vec![At::PressurePa(2000.0)]);
    /// let bad = FitRequest { model: "wagner", constants: "log10,mmHg,degC", ..Default::default() };
    /// assert_eq!(bad.resolve(&|n| format!("--{n}")).unwrap_err(), "--model wagner needs --tc and --pc");
    /// ```
    pub fn resolve(&self, name: &dyn Fn(&str) -> String) -> Result<FitOptions, String> {
        let model: ModelSelection = self
            .model
            .parse()
            .map_err(|e| format!("{}: {e}", name("model")))?;
        let convention: AntoineConvention = self
            .constants
            .parse()
            .map_err(|e| format!("{}: {e}", name("constants")))?;
        let barometric = self
            .barometric_pa
            .map(Pressure::from_pa)
            .transpose()
            .map_err(|e| e.to_string())?;
        let critical = match (self.tc, self.pc) {
            (Some(tc), Some(pc)) => {
                let t = parse_temperature(tc).map_err(|e| format!("{} '{tc}': {e}", name("tc")))?;
                let p = parse_pressure_at(pc, barometric).map_err(|e| {
                    format!("{} '{pc}': {}", name("pc"), e.hint(&name("barometric")))
                })?;
                Some((t.kelvin(), p.pa()))
            }
            (None, None) => None,
            _ => {
                return Err(format!(
                    "{} and {} must be given together",
                    name("tc"),
                    name("pc")
                ))
            }
        };
        if model == ModelSelection::Wagner && critical.is_none() {
            return Err(format!(
                "{} wagner needs {} and {}",
                name("model"),
                name("tc"),
                name("pc")
            ));
        }
        let exclude = self
            .exclude
            .iter()
            .map(|s| {
                s.parse::<Exclude>()
                    .map_err(|e| format!("{} '{s}': {e}", name("exclude")))
            })
            .collect::<Result<Vec<_>, _>>()?;
        let mut at = Vec::new();
        for s in self.at {
            let q = parse_quantity_at(s, barometric)
                .map_err(|e| format!("{} '{s}': {}", name("at"), e.hint(&name("barometric"))))?;
            at.push(match q {
                Quantity::Pressure(p) => At::PressurePa(p.pa()),
                Quantity::Temperature(t) => At::TemperatureK(t.kelvin()),
            });
        }
        Ok(FitOptions {
            model,
            critical,
            robust: self.robust.then_some(RobustLoss::Tukey),
            convention,
            at,
            refit_without_outliers: true,
            exclude,
        })
    }
}
