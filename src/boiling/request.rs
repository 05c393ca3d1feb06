//! A boil query as its user writes it (pressures or temperatures with units, one source:
//! Antoine constants, a reference compound, a fit, or a structure) turned into the
//! results, notes and cautions: `ebullio boil` and the Python package's `boil` both run it.

use super::{boiling_points, lin_spaced, log_spaced, vapor_pressures, BoilResult, VACUUM_CAUTIONS};
use crate::fit::{FitReport, FittedCurve};
use crate::reference::curve_source::{by_name, by_structure, ByStructure};
use crate::reference::Library;
use crate::units::{parse_pressure_at, parse_temperature, Pressure, ATM_PA};
use crate::vapor::{AntoineConstants, AntoineConvention, Curve};

/// The query and its one source, as given on the command line or in a Python call.
#[derive(Clone, Copy, Default)]
pub struct BoilRequest<'a> {
    /// Pressures with unit ("15 mbar"): boiling temperatures.
    pub pressures: &'a [String],
    /// "LOW..HIGH", log-spaced by `steps`.
    pub pressure_range: Option<&'a str>,
    /// Temperatures with unit ("85 degC"): vapor pressures.
    pub temperatures: &'a [String],
    /// "LOW..HIGH", evenly spaced by `steps`.
    pub temperature_range: Option<&'a str>,
    /// Points in a range.
    pub steps: usize,
    /// Site barometric pressure, Pa, for gauge pressures.
    pub barometric_pa: Option<f64>,
    /// Source: Antoine constants A, B, C in the `constants` convention.
    pub antoine: Option<[f64; 3]>,
    /// Convention of `antoine` ("log10,mmHg,degC").
    pub constants: Option<&'a str>,
    /// Validity range of `antoine`, "LOW..HIGH".
    pub range: Option<&'a str>,
    /// Source: a reference compound (name, synonym or CAS number) in `library`.
    pub compound: Option<&'a str>,
    /// The library `compound` is looked up in (default: the bundled one).
    pub library: Option<&'a Library>,
    /// Source: a fit, with how to name it ("out/fit.json"; may be empty).
    pub fit: Option<(&'a FitReport, &'a str)>,
    /// Source: a structure (SMILES): the reference curve when bundled, else the estimate.
    pub smiles: Option<&'a str>,
}

/// What `ebullio boil --format json` writes.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct BoilReport {
    /// The curve's source, in words.
    pub source: String,
    /// "boiling-temperature" or "vapor-pressure".
    pub mode: &'static str,
    /// One row per pressure or temperature.
    pub results: Vec<BoilResult>,
    /// What the reader must know about the source and the results.
    pub notes: Vec<String>,
    /// Vacuum-distillation cautions (when any pressure is below atmospheric).
    pub cautions: Vec<String>,
}

fn split_range(s: &str, opt: &str, example: &str) -> Result<(String, String), String> {
    s.split_once("..")
        .map(|(a, b)| (a.trim().to_string(), b.trim().to_string()))
        .ok_or_else(|| format!("{opt} '{s}': write it as \"LOW..HIGH\", e.g. \"{example}\""))
}

/// "; point 5 (line 6) excluded by the user" for a fit made with excluded points.
pub fn excluded_note(r: &FitReport) -> String {
    if r.excluded.is_empty() {
        return String::new();
    }
    format!("; {} excluded by the user", r.excluded_list())
}

type Source = (Box<dyn Curve>, String, f64);

impl BoilRequest<'_> {
    /// Results, notes and cautions, or a message naming the option at fault. `name` spells
    /// an option as the caller's users write it (`pressure_range` becomes `--pressure-range`
    /// on the command line).
    ///
    /// ```
    /// use ebullio::boiling::BoilRequest;
    /// let p = ["1 atm".to_string()];
    /// let r = BoilRequest { pressures: &p, compound: Some("toluene"), ..Default::default() }
    ///     .run(&|n| n.to_string())
    ///     .unwrap();
    /// assert!((r.results[0].t_k - 383.75).abs() < 0.2); // toluene's normal boiling point
    /// ```
    pub fn run(&self, name: &dyn Fn(&str) -> String) -> Result<BoilReport, String> {
        let barometric = self
            .barometric_pa
            .map(Pressure::from_pa)
            .transpose()
            .map_err(|e| e.to_string())?;
        let pressure = |s: &str, opt: &str| {
            parse_pressure_at(s, barometric)
                .map(|p| p.pa())
                .map_err(|e| format!("{}: {}", name(opt), e.hint(&name("barometric"))))
        };
        let temperature = |s: &str, opt: &str| {
            parse_temperature(s)
                .map(|t| t.kelvin())
                .map_err(|e| format!("{}: {e}", name(opt)))
        };
        let steps = self.steps.max(2);
        let mut pressures = Vec::new();
        for s in self.pressures {
            pressures.push(pressure(s, "pressure")?);
        }
        if let Some(r) = self.pressure_range {
            let (a, b) = split_range(r, &name("pressure_range"), "1 mbar..1 atm")?;
            let (lo, hi) = (
                pressure(&a, "pressure_range")?,
                pressure(&b, "pressure_range")?,
            );
            pressures.extend(log_spaced(lo, hi, steps));
        }
        let mut temps = Vec::new();
        for s in self.temperatures {
            temps.push(temperature(s, "temperature")?);
        }
        if let Some(r) = self.temperature_range {
            let (a, b) = split_range(r, &name("temperature_range"), "20 degC..110 degC")?;
            let (lo, hi) = (
                temperature(&a, "temperature_range")?,
                temperature(&b, "temperature_range")?,
            );
            temps.extend(lin_spaced(lo, hi, steps));
        }
        if pressures.is_empty() == temps.is_empty() {
            return Err(format!(
                "give pressures ({}, {}) or temperatures ({}, {}), not both or neither",
                name("pressure"),
                name("pressure_range"),
                name("temperature"),
                name("temperature_range")
            ));
        }
        let mut notes = Vec::new();
        let (curve, source, k95) = self.source(name, &mut notes)?;
        let (mode, results) = if pressures.is_empty() {
            (
                "vapor-pressure",
                vapor_pressures(curve.as_ref(), &temps, k95),
            )
        } else {
            (
                "boiling-temperature",
                boiling_points(curve.as_ref(), &pressures, k95),
            )
        };
        if results.iter().any(|r| r.extrapolated) {
            notes.push("Some results lie outside the source's validity range (extrapolated): treat them as rough.".into());
        }
        let vacuum = results
            .iter()
            .any(|r| r.p_pa.is_finite() && r.p_pa < ATM_PA);
        let cautions = if vacuum {
            VACUUM_CAUTIONS.iter().map(|s| s.to_string()).collect()
        } else {
            Vec::new()
        };
        Ok(BoilReport {
            source,
            mode,
            results,
            notes,
            cautions,
        })
    }

    /// The one curve, how it is named, and the factor of its 95 % interval.
    fn source(
        &self,
        name: &dyn Fn(&str) -> String,
        notes: &mut Vec<String>,
    ) -> Result<Source, String> {
        let n_sources = [
            self.antoine.is_some(),
            self.compound.is_some(),
            self.fit.is_some(),
            self.smiles.is_some(),
        ]
        .iter()
        .filter(|x| **x)
        .count();
        if n_sources != 1 {
            return Err(format!(
                "give exactly one source: {} (with {}), {}, {} or {}",
                name("antoine"),
                name("constants"),
                name("compound"),
                name("from"),
                name("smiles")
            ));
        }
        if let Some([a, b, c]) = self.antoine {
            let conv: AntoineConvention = self
                .constants
                .ok_or_else(|| {
                    format!(
                        "{} needs {}, e.g. \"log10,mmHg,degC\"",
                        name("antoine"),
                        name("constants")
                    )
                })?
                .parse()
                .map_err(|e| format!("{}: {e}", name("constants")))?;
            let mut k = AntoineConstants::new(a, b, c, conv);
            if let Some(r) = self.range {
                let (lo, hi) = split_range(r, &name("range"), "20 degC..110 degC")?;
                let lo = parse_temperature(&lo).map_err(|e| format!("{}: {e}", name("range")))?;
                let hi = parse_temperature(&hi).map_err(|e| format!("{}: {e}", name("range")))?;
                k = k.with_range_k(lo.kelvin(), hi.kelvin());
            } else {
                notes.push(format!(
                    "No validity range given ({}), so extrapolation cannot be flagged.",
                    name("range")
                ));
            }
            notes
                .push("Constants given by hand carry no uncertainty; no interval is shown.".into());
            return Ok((
                Box::new(k),
                format!("Antoine constants {a}, {b}, {c} ({conv})"),
                1.96,
            ));
        }
        if let Some(query) = self.compound {
            let lib = self.library.unwrap_or_else(|| Library::bundled());
            let (c, rc) =
                by_name(lib, query).map_err(|e| format!("{} '{query}': {e}", name("compound")))?;
            if !rc.note.is_empty() {
                notes.push(format!("Reference row note: {}", rc.note));
            }
            if rc.valid_range_k().is_none() {
                notes.push(
                    "The reference row states no validity range, so extrapolation cannot be flagged."
                        .into(),
                );
            }
            notes.push(format!(
                "Interval from a {:.2} % standard uncertainty in p of the reference.",
                100.0 * rc.u_p_rel
            ));
            let source = format!("reference {}: {}", c.name, rc.source);
            return Ok((Box::new(rc), source, 1.96));
        }
        if let Some((report, label)) = self.fit {
            let fc = FittedCurve::from_report(report);
            let k = fc.t95();
            let who = report.compound.as_deref().unwrap_or("unnamed");
            let label = if label.is_empty() {
                String::new()
            } else {
                format!(" {label}")
            };
            let source = format!(
                "fit{label} ({who}, {}, {} points{})",
                report.model,
                report.n_points,
                excluded_note(report)
            );
            return Ok((Box::new(fc), source, k));
        }
        let s = self.smiles.unwrap_or_default();
        match by_structure(s).map_err(|e| format!("{} '{s}': {e}", name("smiles")))? {
            // Reference first: a structure that is a reference compound uses its reference curve.
            ByStructure::Reference(c, rc) => {
                notes.push(format!(
                    "The structure {s} is the reference compound {}: its reference curve is used, not a structure estimate.",
                    c.name
                ));
                if !rc.note.is_empty() {
                    notes.push(format!("Reference note: {}", rc.note));
                }
                notes.push(format!(
                    "Interval from a {:.2} % standard uncertainty in p of the reference.",
                    100.0 * rc.u_p_rel
                ));
                let source = format!(
                    "reference {} (matched by structure {s}): {}",
                    c.name, rc.source
                );
                Ok((Box::new(rc), source, 1.96))
            }
            ByStructure::Estimate(e) => {
                if let Some(why) = &e.not_matched {
                    notes.push(format!("Not matched to a reference compound: {why}."));
                }
                notes.push(format!(
                    "Structure estimate (Tb {:.1} K, {}, 90 % interval {:.1}-{:.1} K; Lee-Kesler curve): not a measurement.",
                    e.tb_k,
                    e.variant.name(),
                    e.pi90_k.0,
                    e.pi90_k.1
                ));
                Ok((
                    Box::new(e.curve),
                    format!("structure estimate for {s}"),
                    1.96,
                ))
            }
        }
    }
}
