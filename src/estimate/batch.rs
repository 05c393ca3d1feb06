//! One estimate row as `ebullio estimate` reports it: the estimate, boiling points at pressures, anchoring.
//!
//! Shared by the command, the demo and the HTML report so all three say the
//! same thing about the same structure.

use super::anchor::{anchor, Anchored, MeasuredPoint};
use super::{Estimate, EstimateError};
use crate::vapor::Curve;

/// Boiling point of the (anchored, when anchored) estimated curve at one pressure.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct AtPressure {
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Boiling point, K (None when the curve does not reach the pressure).
    pub t_k: Option<f64>,
    /// 90 % interval low end, K (±1.645 u of the curve).
    pub pi90_low_k: Option<f64>,
    /// 90 % interval high end, K.
    pub pi90_high_k: Option<f64>,
    /// Outside the curve's stated range (or no range known).
    pub extrapolated: bool,
}

/// The bundled reference compound with the same structure, beside the estimate.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct ReferenceMatch {
    /// Reference compound name.
    pub compound: String,
    /// Its reference normal boiling point, K.
    pub tb_k: f64,
    /// Where that value comes from.
    pub source: String,
    /// The structure estimate's error against it (tb_k estimate − reference), K.
    pub estimate_error_k: f64,
}

impl ReferenceMatch {
    /// The bundled reference compound with this estimate's structure, if any.
    pub fn find(e: &Estimate) -> Option<ReferenceMatch> {
        let smiles = e.smiles.as_deref()?;
        let lib = crate::reference::Library::bundled();
        // Most structures share no formula with a bundled compound: no second parse for them.
        if e.formula
            .as_deref()
            .is_some_and(|f| !lib.has_structure_formula(f))
        {
            return None;
        }
        let c = lib.find_smiles(smiles).ok()?;
        let row = c.tb_row()?;
        Some(ReferenceMatch {
            compound: c.name.clone(),
            tb_k: row.tb_k,
            // Sources are cited as published works: any web-address part is left out.
            source: row
                .source
                .split(';')
                .filter(|p| !p.contains("http"))
                .map(str::trim)
                .collect::<Vec<_>>()
                .join("; "),
            estimate_error_k: e.tb_k - row.tb_k,
        })
    }
}

/// One structure's result: the estimate or why there is none.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct EstimateRow {
    /// Name carried through from the input.
    pub compound: Option<String>,
    /// The estimate (flattened into the row's JSON).
    #[serde(flatten)]
    pub estimate: Option<Estimate>,
    /// The SMILES as given.
    pub smiles_given: Option<String>,
    /// The reference compound of the same structure, when one is bundled.
    pub reference: Option<ReferenceMatch>,
    /// Boiling points at the requested pressures.
    pub at: Vec<AtPressure>,
    /// The curve anchored to measured points, when given.
    pub anchored: Option<Anchored>,
    /// The cautions every estimate carries.
    pub cautions: Vec<&'static str>,
    /// Empty unless the structure could not be handled.
    pub error: String,
}

/// Boiling points of `curve` at each pressure in `ps` (Pa), with the 90 % interval the curve carries.
pub fn at_pressures(curve: Option<&dyn Curve>, ps: &[f64]) -> Vec<AtPressure> {
    ps.iter()
        .map(|&p| {
            let t = curve.and_then(|c| c.t_at(p));
            let u = curve.and_then(|c| c.t_uncertainty_k(p));
            let extrapolated = match (curve.and_then(|c| c.valid_range_k()), t) {
                (Some((lo, hi)), Some(t)) => t < lo || t > hi,
                _ => true,
            };
            AtPressure {
                p_pa: p,
                t_k: t,
                pi90_low_k: t.zip(u).map(|(t, u)| t - 1.645 * u),
                pi90_high_k: t.zip(u).map(|(t, u)| t + 1.645 * u),
                extrapolated,
            }
        })
        .collect()
}

impl EstimateRow {
    /// Build the row from an estimate result: anchor to `measured` (0–2 points) when given,
    /// then give boiling points at `ps` (Pa) from the anchored or pure curve.
    pub fn new(
        est: Result<Estimate, EstimateError>,
        compound: Option<String>,
        given: Option<String>,
        ps: &[f64],
        measured: &[MeasuredPoint],
    ) -> Self {
        let mut row = EstimateRow {
            compound,
            estimate: None,
            smiles_given: given,
            reference: None,
            at: Vec::new(),
            anchored: None,
            cautions: Estimate::cautions().to_vec(),
            error: String::new(),
        };
        match est {
            Err(e) => row.error = e.to_string(),
            Ok(e) => {
                let pure = e.curve();
                if !measured.is_empty() {
                    match pure.as_ref() {
                        None => {
                            row.error =
                                "no critical constants for this structure, so no curve to anchor"
                                    .into()
                        }
                        Some(c) => match anchor(c, measured) {
                            Ok(a) => row.anchored = Some(a),
                            Err(err) => row.error = err.to_string(),
                        },
                    }
                }
                let curve: Option<&dyn Curve> = match (&row.anchored, &pure) {
                    (Some(a), _) => Some(&a.curve),
                    (None, Some(c)) => Some(c),
                    _ => None,
                };
                row.at = at_pressures(curve, ps);
                row.reference = ReferenceMatch::find(&e);
                row.estimate = Some(e);
            }
        }
        row
    }
}
