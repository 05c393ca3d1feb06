//! A binary study as its user asks for it (components by reference name or structure,
//! pressure or temperature with units, an activity model by name with its parameters)
//! turned into curves, a model and a condition: `ebullio vle` and the Python package's
//! `vle` resolve the same request the same way.

use super::fit::BinaryFitReport;
use super::study::{vle_study, StudyComponent, StudyOptions, VleStudy};
use super::{ActivityModel, Binary, Condition, Ideal, MixtureError, Nrtl, Unifac, Wilson};
use super::{Finding, MixtureCode};
use crate::reference::curve_source::{
    by_name, by_structure, citation, smiles_and_name, variant_words, ByStructure,
};
use crate::reference::Library;
use crate::units::{parse_pressure_at, parse_temperature, Pressure, ATM_PA};
use crate::vapor::Curve;

/// One component with its vapor-pressure curve and where the curve came from.
pub struct Component {
    /// Name shown in output.
    pub name: String,
    /// Its SMILES, when known.
    pub smiles: Option<String>,
    /// Where the curve came from, with its uncertainty, in words.
    pub source: String,
    /// The curve.
    pub curve: Box<dyn Curve>,
}

impl Component {
    /// A bundled reference compound (name, synonym or CAS number) with its best curve.
    pub fn reference(name: &str) -> Result<Component, String> {
        let (c, curve) = by_name(Library::bundled(), name)?;
        Ok(Component {
            name: c.name.clone(),
            smiles: c.smiles.clone(),
            source: format!(
                "reference: {} (u(p)/p = {:.1} %)",
                citation(&curve.source),
                100.0 * curve.u_p_rel
            ),
            curve: Box::new(curve),
        })
    }

    /// "SMILES name": the reference curve when the bundled reference knows the structure
    /// (the better source), else the structure estimate's Lee–Kesler curve. Errors are
    /// prefixed with `'SMILES': ` (or are about the empty value).
    pub fn structure(text: &str) -> Result<Component, String> {
        let (smiles, given) = smiles_and_name(text)?;
        let name = given.unwrap_or_else(|| smiles.to_string());
        Ok(
            match by_structure(smiles).map_err(|e| format!("'{smiles}': {e}"))? {
                ByStructure::Reference(c, curve) => Component {
                    name,
                    smiles: Some(smiles.to_string()),
                    source: format!(
                        "reference, matched by structure to {}: {} (u(p)/p = {:.1} %)",
                        c.name,
                        citation(&curve.source),
                        100.0 * curve.u_p_rel
                    ),
                    curve: Box::new(curve),
                },
                ByStructure::Estimate(e) => Component {
                    name,
                    smiles: Some(smiles.to_string()),
                    source: format!(
                        "structure estimate ({} normal boiling point {:.1} K, typical error {:.1} K; Lee–Kesler curve)",
                        variant_words(e.variant),
                        e.tb_k,
                        e.typical_error_k
                    ),
                    curve: Box::new(e.curve),
                },
            },
        )
    }

    fn study(&self) -> StudyComponent<'_> {
        StudyComponent {
            name: &self.name,
            smiles: self.smiles.as_deref(),
            source: &self.source,
            curve: self.curve.as_ref(),
        }
    }
}

/// A binary study as text and numbers, as given on the command line or in a Python call.
#[derive(Clone, Copy, Default)]
pub struct VleRequest<'a> {
    /// Reference compounds (name, synonym or CAS number).
    pub compounds: &'a [String],
    /// Structures, "SMILES" or "SMILES name".
    pub smiles: &'a [String],
    /// System pressure with unit (default 1 atm).
    pub pressure: Option<&'a str>,
    /// Or a temperature with unit (isothermal diagram).
    pub temperature: Option<&'a str>,
    /// "unifac", "wilson", "nrtl" or "ideal"; default: Wilson or NRTL when their
    /// parameters are given, UNIFAC when both structures are known, else ideal.
    pub model: Option<&'a str>,
    /// Wilson a12, a21 (K) and optionally the molar volumes v1, v2.
    pub wilson: Option<&'a [f64]>,
    /// NRTL b12, b21 (K) and alpha.
    pub nrtl: Option<&'a [f64]>,
    /// Points along x1 (11 to 1001).
    pub points: usize,
    /// Site barometric pressure, Pa, for a gauge `pressure`.
    pub barometric_pa: Option<f64>,
    /// A binary VLE fit and how to name it (its file): its fitted model, its components
    /// (unless given) and its pressure or temperature (unless given).
    pub fitted: Option<(&'a BinaryFitReport, &'a str)>,
}

/// A resolved request: the two components, the model and the condition.
pub struct VleSetup {
    /// The two components, in order.
    pub components: Vec<Component>,
    /// The activity model.
    pub model: Box<dyn ActivityModel>,
    /// Isobaric or isothermal.
    pub condition: Condition,
    /// Points along x1.
    pub points: usize,
    /// Said when UNIFAC had to give way to an ideal liquid.
    pub note: Option<String>,
}

/// `v` when it has one of `counts` finite numbers, else a message in `form`.
fn numbers<'v>(v: &'v [f64], opt: &str, counts: &[usize], form: &str) -> Result<&'v [f64], String> {
    if !counts.contains(&v.len()) || v.iter().any(|x| !x.is_finite()) {
        let n: Vec<String> = counts.iter().map(|c| c.to_string()).collect();
        return Err(format!(
            "{opt}: expected {} finite numbers \"{form}\"",
            n.join(" or ")
        ));
    }
    Ok(v)
}

/// The model of a binary fit, numbered as the components given (swapped when they come
/// in the other order); refused when the fit is for another pair.
fn fitted_model(
    f: &BinaryFitReport,
    comps: &[Component],
) -> Result<Box<dyn ActivityModel>, String> {
    let m = f.fitted_model().map_err(|e| e.to_string())?;
    let fit: Vec<String> = f.components.iter().map(|c| c.name.to_lowercase()).collect();
    let given: Vec<String> = comps.iter().map(|c| c.name.to_lowercase()).collect();
    if fit.len() != 2 || fit == given {
        return Ok(Box::new(m));
    }
    if fit[0] == given[1] && fit[1] == given[0] {
        return Ok(Box::new(m.swapped().map_err(|e| e.to_string())?));
    }
    Err(format!(
        "the fit is for {} / {}, not {} / {}",
        f.components[0].name, f.components[1].name, comps[0].name, comps[1].name
    ))
}

impl VleRequest<'_> {
    /// Curves, model and condition, or a message naming the option at fault. `name` spells
    /// an option as the caller's users write it (`--smiles` on the command line, `smiles`
    /// in Python).
    ///
    /// ```
    /// use ebullio::mixture::VleRequest;
    /// let c = ["ethanol".to_string(), "water".to_string()];
    /// let s = VleRequest { compounds: &c, points: 21, ..Default::default() }
    ///     .resolve(&|n| format!("--{n}")).unwrap().study().unwrap();
    /// assert_eq!(s.azeotropes.len(), 1); // the ethanol–water azeotrope
    /// ```
    pub fn resolve(&self, name: &dyn Fn(&str) -> String) -> Result<VleSetup, String> {
        let mut components = Vec::new();
        let from = |e: &dyn std::fmt::Display| {
            let file = self.fitted.map_or("", |f| f.1);
            format!("{} {file}: {e}", name("from"))
        };
        if let Some((f, _)) = self.fitted {
            if self.model.is_some() || self.wilson.is_some() || self.nrtl.is_some() {
                return Err(format!(
                    "{} brings its fitted model: give no {}, {} or {}",
                    name("from"),
                    name("model"),
                    name("wilson"),
                    name("nrtl")
                ));
            }
            if self.compounds.is_empty() && self.smiles.is_empty() {
                for c in &f.components {
                    components.push(match (Component::reference(&c.name), &c.smiles) {
                        (Ok(comp), _) => comp,
                        (Err(_), Some(s)) => Component::structure(&format!("{s} {}", c.name))
                            .map_err(|e| format!("{} {e}", name("smiles")))?,
                        (Err(e), None) => {
                            return Err(format!("{} '{}': {e}", name("compound"), c.name))
                        }
                    });
                }
            }
        }
        for c in self.compounds {
            components.push(
                Component::reference(c).map_err(|e| format!("{} '{c}': {e}", name("compound")))?,
            );
        }
        for s in self.smiles {
            components.push(Component::structure(s).map_err(|e| {
                // "--smiles 'CCX': ..." names the structure; an empty value has none.
                let sep = if s.trim().is_empty() { ":" } else { "" };
                format!("{}{sep} {e}", name("smiles"))
            })?);
        }
        if components.len() != 2 {
            return Err(format!(
                "vle needs exactly two components ({} or {}); {} given",
                name("compound"),
                name("smiles"),
                components.len()
            ));
        }
        if !(11..=1001).contains(&self.points) {
            return Err(format!(
                "{} {}: expected 11 to 1001",
                name("points"),
                self.points
            ));
        }
        let condition = match (self.pressure, self.temperature) {
            (Some(_), Some(_)) => {
                return Err(format!(
                    "give {} or {}, not both",
                    name("pressure"),
                    name("temperature")
                ))
            }
            (None, Some(t)) => Condition::Temperature(
                parse_temperature(t)
                    .map_err(|e| format!("{}: {e}", name("temperature")))?
                    .kelvin(),
            ),
            (Some(p), None) => {
                let barometric = self
                    .barometric_pa
                    .map(Pressure::from_pa)
                    .transpose()
                    .map_err(|e| e.to_string())?;
                Condition::Pressure(
                    parse_pressure_at(p, barometric)
                        .map_err(|e| {
                            format!("{}: {}", name("pressure"), e.hint(&name("barometric")))
                        })?
                        .pa(),
                )
            }
            (None, None) => match self.fitted.map(|(f, _)| (f.pressure_pa, f.temperature_k)) {
                Some((Some(p), _)) => Condition::Pressure(p),
                Some((None, Some(t))) => Condition::Temperature(t),
                _ => Condition::Pressure(ATM_PA),
            },
        };
        if let Some((f, _)) = self.fitted {
            let model = fitted_model(f, &components).map_err(|e| from(&e))?;
            return Ok(VleSetup {
                components,
                model,
                condition,
                points: self.points,
                note: None,
            });
        }
        let chosen = match self.model {
            Some(m) => m.trim().to_ascii_lowercase(),
            None if self.wilson.is_some() => "wilson".into(),
            None if self.nrtl.is_some() => "nrtl".into(),
            None if components.iter().all(|c| c.smiles.is_some()) => "unifac".into(),
            None => "ideal".into(),
        };
        let note = (self.model.is_none() && chosen == "ideal").then(|| {
            let missing: Vec<&str> = components
                .iter()
                .filter(|c| c.smiles.is_none())
                .map(|c| c.name.as_str())
                .collect();
            format!(
                "No structure is known for {}, so UNIFAC cannot be used: ideal liquid assumed.",
                missing.join(", ")
            )
        });
        let model: Box<dyn ActivityModel> = match chosen.as_str() {
            "ideal" => Box::new(Ideal),
            "unifac" => {
                let s: Vec<&str> = components
                    .iter()
                    .map(|c| {
                        c.smiles.as_deref().ok_or_else(|| {
                            format!(
                                "{} unifac: no structure (SMILES) is known for {}; give it with {}",
                                name("model"),
                                c.name,
                                name("smiles")
                            )
                        })
                    })
                    .collect::<Result<_, _>>()?;
                Box::new(Unifac::from_smiles([s[0], s[1]]).map_err(|e| format!("UNIFAC: {e}"))?)
            }
            "wilson" => {
                let v = self.wilson.ok_or_else(|| {
                    format!(
                        "{} wilson needs {} \"a12,a21\" (kelvin)",
                        name("model"),
                        name("wilson")
                    )
                })?;
                let v = numbers(v, &name("wilson"), &[2, 4], "a12,a21[,v1,v2]")?;
                let vol = if v.len() == 4 {
                    [v[2], v[3]]
                } else {
                    [1.0, 1.0]
                };
                Box::new(
                    Wilson::new(v[0], v[1], vol).map_err(|e| format!("{}: {e}", name("wilson")))?,
                )
            }
            "nrtl" => {
                let v = self.nrtl.ok_or_else(|| {
                    format!(
                        "{} nrtl needs {} \"b12,b21,alpha\" (b in kelvin)",
                        name("model"),
                        name("nrtl")
                    )
                })?;
                let v = numbers(v, &name("nrtl"), &[3], "b12,b21,alpha")?;
                Box::new(Nrtl::new(v[0], v[1], v[2]).map_err(|e| format!("{}: {e}", name("nrtl")))?)
            }
            m => {
                return Err(format!(
                    "{} '{m}': expected unifac, wilson, nrtl or ideal",
                    name("model")
                ))
            }
        };
        Ok(VleSetup {
            components,
            model,
            condition,
            points: self.points,
            note,
        })
    }
}

impl VleSetup {
    /// The study ([`vle_study`]), with a warning first when UNIFAC gave way to an ideal liquid.
    pub fn study(&self) -> Result<VleStudy, MixtureError> {
        let opts = StudyOptions {
            condition: self.condition,
            points: self.points,
        };
        let c = &self.components;
        let mut study = vle_study([c[0].study(), c[1].study()], self.model.as_ref(), &opts)?;
        if let Some(n) = &self.note {
            study
                .flags
                .insert(0, Finding::new(MixtureCode::NoStructure, n.clone()));
        }
        Ok(study)
    }

    /// The binary, for points off the diagram's grid.
    pub fn binary(&self) -> Binary<'_> {
        let c = &self.components;
        Binary {
            names: [&c[0].name, &c[1].name],
            curves: [c[0].curve.as_ref(), c[1].curve.as_ref()],
            model: self.model.as_ref(),
        }
    }
}
