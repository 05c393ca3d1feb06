//! `vle`: a binary's T–x–y (or p–x–y) diagram, azeotropes and liquid split, as `ebullio vle`.
//!
//! Components and the activity model are resolved as the command resolves its flags
//! (--compound, --smiles "SMILES name", --model/--wilson/--nrtl); the study is the library's
//! `mixture::vle_study`, serialised with the command's field names.

use crate::errors::plain;
use ebullio::mixture::{
    self, ActivityModel, Condition, Ideal, Nrtl, StudyComponent, StudyOptions, Unifac, Wilson,
};
use ebullio::units::{parse_pressure, parse_temperature, ATM_PA};
use ebullio::vapor::Curve;
use pyo3::prelude::*;

struct Comp {
    name: String,
    smiles: Option<String>,
    source: String,
    curve: Box<dyn Curve>,
}

/// The citation of a reference row without the web address some rows' notes carry.
fn citation(source: &str) -> String {
    match source.find("; http") {
        Some(i) => {
            let tail = source
                .rfind(" (reference-data/")
                .or_else(|| source.rfind(" ("))
                .filter(|&j| j > i && !source[j..].contains("http"))
                .map_or("", |j| &source[j..]);
            format!("{}{tail}", &source[..i])
        }
        None => source.to_string(),
    }
}

fn reference_comp(py: Python<'_>, name: &str) -> PyResult<Comp> {
    let c = ebullio::reference::Library::bundled()
        .find(name)
        .map_err(|e| plain(py, format!("compound '{name}': {e}")))?;
    let curve = c.best_curve().ok_or_else(|| {
        plain(
            py,
            format!(
                "compound '{name}': the reference has no vapor-pressure curve for {}",
                c.name
            ),
        )
    })?;
    Ok(Comp {
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

fn smiles_comp(py: Python<'_>, text: &str) -> PyResult<Comp> {
    let mut parts = text.split_whitespace();
    let smiles = parts.next().ok_or_else(|| {
        plain(
            py,
            "smiles: empty value; give a SMILES such as \"CC(=O)C acetone\"",
        )
    })?;
    let rest: Vec<&str> = parts.collect();
    let name = if rest.is_empty() {
        smiles.to_string()
    } else {
        rest.join(" ")
    };
    let e = ebullio::estimate::estimate_smiles(smiles)
        .map_err(|e| plain(py, format!("smiles '{smiles}': {e}")))?;
    let curve = e.curve().ok_or_else(|| {
        plain(
            py,
            format!("smiles '{smiles}': no critical constants could be estimated, so there is no vapor-pressure curve"),
        )
    })?;
    Ok(Comp {
        name,
        smiles: Some(smiles.to_string()),
        source: format!(
            "structure estimate (Joback normal boiling point {:.1} K, typical error {:.1} K; Lee–Kesler curve)",
            e.tb_k, e.tb_typical_error_k
        ),
        curve: Box::new(curve),
    })
}

fn sc(c: &Comp) -> StudyComponent<'_> {
    StudyComponent {
        name: &c.name,
        smiles: c.smiles.as_deref(),
        source: &c.source,
        curve: c.curve.as_ref(),
    }
}

/// The study as JSON (the fields `ebullio vle --format json` writes, without `at_x1`).
#[pyfunction]
#[pyo3(signature = (compound, smiles, pressure=None, temperature=None, model=None, wilson=None, nrtl=None, points=101))]
#[allow(clippy::too_many_arguments)]
pub fn vle(
    py: Python<'_>,
    compound: Vec<String>,
    smiles: Vec<String>,
    pressure: Option<String>,
    temperature: Option<String>,
    model: Option<String>,
    wilson: Option<Vec<f64>>,
    nrtl: Option<(f64, f64, f64)>,
    points: usize,
) -> PyResult<String> {
    let mut comps = Vec::new();
    for c in &compound {
        comps.push(reference_comp(py, c)?);
    }
    for s in &smiles {
        comps.push(smiles_comp(py, s)?);
    }
    if comps.len() != 2 {
        return Err(plain(
            py,
            format!(
                "vle needs exactly two components (compound or smiles); {} given",
                comps.len()
            ),
        ));
    }
    if !(11..=1001).contains(&points) {
        return Err(plain(py, format!("points {points}: expected 11 to 1001")));
    }
    let condition = match (&pressure, &temperature) {
        (Some(_), Some(_)) => return Err(plain(py, "give a pressure or a temperature, not both")),
        (None, Some(t)) => Condition::Temperature(
            parse_temperature(t)
                .map_err(|e| plain(py, format!("temperature: {e}")))?
                .kelvin(),
        ),
        (Some(p), None) => Condition::Pressure(
            parse_pressure(p)
                .map_err(|e| plain(py, format!("pressure: {e}")))?
                .pa(),
        ),
        (None, None) => Condition::Pressure(ATM_PA),
    };
    let chosen = match model.as_deref() {
        Some(m @ ("unifac" | "wilson" | "nrtl" | "ideal")) => m,
        Some(m) => {
            return Err(plain(
                py,
                format!("model '{m}': expected unifac, wilson, nrtl or ideal"),
            ))
        }
        None if wilson.is_some() => "wilson",
        None if nrtl.is_some() => "nrtl",
        None if comps.iter().all(|c| c.smiles.is_some()) => "unifac",
        None => "ideal",
    };
    let note = (model.is_none() && chosen == "ideal").then(|| {
        let missing: Vec<&str> = comps
            .iter()
            .filter(|c| c.smiles.is_none())
            .map(|c| c.name.as_str())
            .collect();
        format!(
            "No structure is known for {}, so UNIFAC cannot be used: ideal liquid assumed.",
            missing.join(", ")
        )
    });
    let m: Box<dyn ActivityModel> = match chosen {
        "unifac" => {
            let s: Vec<&str> = comps
                .iter()
                .map(|c| {
                    c.smiles.as_deref().ok_or_else(|| {
                        plain(
                            py,
                            format!("model unifac: no structure (SMILES) is known for {}; give it with smiles", c.name),
                        )
                    })
                })
                .collect::<PyResult<_>>()?;
            Box::new(
                Unifac::from_smiles([s[0], s[1]]).map_err(|e| plain(py, format!("UNIFAC: {e}")))?,
            )
        }
        "wilson" => {
            let v = wilson
                .ok_or_else(|| plain(py, "model wilson needs wilson=(a12, a21) in kelvin"))?;
            if !(v.len() == 2 || v.len() == 4) || v.iter().any(|x| !x.is_finite()) {
                return Err(plain(
                    py,
                    "wilson: expected 2 or 4 finite numbers (a12, a21[, v1, v2])",
                ));
            }
            let vol = if v.len() == 4 {
                [v[2], v[3]]
            } else {
                [1.0, 1.0]
            };
            Box::new(Wilson::new(v[0], v[1], vol).map_err(|e| plain(py, format!("wilson: {e}")))?)
        }
        "nrtl" => {
            let (b12, b21, alpha) = nrtl
                .ok_or_else(|| plain(py, "model nrtl needs nrtl=(b12, b21, alpha), b in kelvin"))?;
            Box::new(Nrtl::new(b12, b21, alpha).map_err(|e| plain(py, format!("nrtl: {e}")))?)
        }
        _ => Box::new(Ideal),
    };
    let opts = StudyOptions { condition, points };
    // One binary is milliseconds of work: kept under the GIL.
    let mut study = mixture::vle_study([sc(&comps[0]), sc(&comps[1])], m.as_ref(), &opts)
        .map_err(|e| plain(py, e.to_string()))?;
    if let Some(n) = note {
        study.flags.insert(
            0,
            mixture::Flag {
                code: "no-structure",
                severity: ebullio::severity::Severity::Warning,
                message: n,
            },
        );
    }
    serde_json::to_string(&study).map_err(|e| plain(py, e.to_string()))
}
