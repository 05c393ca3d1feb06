//! One binary's complete vapor–liquid picture: diagram, azeotropes, liquid split, flags.
//!
//! This assembles the pieces (`diagram`, `azeotrope`, `stability`) into the
//! result that `ebullio vle` prints and that a plan can reuse. Numbers are
//! rounded here to what the models support, so output carries no
//! floating-point noise.

use super::{
    ActivityModel, Azeotrope, AzeotropeKind, Binary, Condition, MixtureError, ThreePhase, VlePoint,
};
use crate::vapor::Curve;
use serde::Serialize;

/// One component as the study needs it.
#[derive(Clone, Copy)]
pub struct StudyComponent<'a> {
    /// Name shown in output.
    pub name: &'a str,
    /// Its SMILES, when known.
    pub smiles: Option<&'a str>,
    /// Where its vapor-pressure curve came from, with its uncertainty, in words.
    pub source: &'a str,
    /// The curve.
    pub curve: &'a dyn Curve,
}

/// Options of a study.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StudyOptions {
    /// Fixed pressure or temperature.
    pub condition: Condition,
    /// Points in the diagram (x1 = 0 … 1).
    pub points: usize,
}

/// A component in the output.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ComponentOut {
    /// Name.
    pub name: String,
    /// SMILES, or null.
    pub smiles: Option<String>,
    /// Vapor-pressure source with its uncertainty.
    pub vapor_pressure_source: String,
}

/// One row of the diagram.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct DiagramRow {
    /// Liquid mole fraction of component 1 (overall, where two liquids form).
    pub x1: f64,
    /// Vapor mole fraction of component 1.
    pub y1: f64,
    /// Bubble temperature, K (isobaric diagrams).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub t_k: Option<f64>,
    /// Bubble pressure, Pa (isothermal diagrams).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub p_pa: Option<f64>,
    /// γ1 of one liquid of composition x1 (not a real phase where `liquids` is 2).
    pub gamma1: f64,
    /// γ2, likewise.
    pub gamma2: f64,
    /// Relative volatility α12 of the one-liquid model.
    pub alpha12: f64,
    /// Liquid phases at the bubble point: 1, or 2 inside the predicted split
    /// (then T or p and y1 are those of the three-phase point).
    pub liquids: u8,
}

/// One azeotrope in the output.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AzeotropeOut {
    /// Composition (of the vapor, for a heterogeneous azeotrope).
    pub x1: f64,
    /// Temperature, K (isobaric study).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub t_k: Option<f64>,
    /// Pressure, Pa (isothermal study).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub p_pa: Option<f64>,
    /// Kind.
    pub kind: AzeotropeKind,
}

impl AzeotropeOut {
    /// The kind as written in output.
    pub fn kind_str(&self) -> &'static str {
        self.kind.as_str()
    }
}

/// A homogeneous azeotrope recomputed at another pressure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ShiftRow {
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Azeotrope composition there, null when none is predicted.
    pub x1: Option<f64>,
    /// Its temperature, K.
    pub t_k: Option<f64>,
    /// A vapor-pressure curve is used outside its stated range.
    pub extrapolated: bool,
}

/// The predicted liquid–liquid split.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LiquidSplit {
    /// Two liquids predicted at the bubble point somewhere.
    pub predicted: bool,
    /// The liquid poorer in component 1.
    pub x1_low: Option<f64>,
    /// The liquid richer in component 1.
    pub x1_high: Option<f64>,
    /// Temperature of the three-phase point (isobaric), K.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub t_k: Option<f64>,
    /// Pressure of the three-phase point (isothermal), Pa.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub p_pa: Option<f64>,
    /// Vapor composition at the three-phase point.
    pub y1: Option<f64>,
}

pub use crate::finding::{Finding, MixtureCode, Subject};

/// Cautions printed with every mixture result.
pub const CAUTIONS: &[&str] = &[
    "Predicted azeotropes and liquid splits must be confirmed with measured mixture data before they are used to design or run a distillation.",
    "UNIFAC is a group-contribution estimate: activity coefficients can be off by tens of per cent, and liquid-liquid predictions with its vapor-liquid parameters are qualitative.",
    "Not for electrolytes, polymers or reacting systems; the vapor is taken as ideal (modified Raoult's law), so not for high pressures or associating vapors (e.g. carboxylic acids).",
    "Output that feeds a physical operation must be reviewed under local codes and by qualified process-safety staff.",
];

/// The full result.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct VleStudy {
    /// Fixed pressure, Pa (isobaric study).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub pressure_pa: Option<f64>,
    /// Fixed temperature, K (isothermal study).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub temperature_k: Option<f64>,
    /// `unifac`, `wilson`, `nrtl` or `ideal`.
    pub activity_model: &'static str,
    /// The two components.
    pub components: Vec<ComponentOut>,
    /// Bubble points from x1 = 0 to 1.
    pub diagram: Vec<DiagramRow>,
    /// Every azeotrope found.
    pub azeotropes: Vec<AzeotropeOut>,
    /// Homogeneous azeotropes recomputed at other pressures (isobaric studies).
    pub azeotrope_pressure_shift: Vec<ShiftRow>,
    /// The liquid–liquid split.
    pub liquid_split: LiquidSplit,
    /// Flags.
    pub flags: Vec<Finding>,
    /// Cautions.
    pub cautions: &'static [&'static str],
}

fn round(v: f64, decimals: i32) -> f64 {
    let f = 10f64.powi(decimals);
    (v * f).round() / f
}

fn sig(v: f64, digits: i32) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let d = digits - 1 - v.abs().log10().floor() as i32;
    round(v, d)
}

/// Composition to 6 decimals, T to 3, p to 1 Pa decimal, γ and α to 5 significant digits.
fn rx(v: f64) -> f64 {
    round(v, 6)
}

/// Factors applied to the pressure to see how an azeotrope moves.
pub const SHIFT_FACTORS: [f64; 6] = [0.1, 0.2, 0.5, 2.0, 5.0, 10.0];

/// Composition shift (mole fraction) over the pressures tried above which a
/// pressure swing is worth a look (common practice: about 5 mol %).
pub const SWING_SHIFT: f64 = 0.05;

fn outside(c: &dyn Curve, t: f64) -> bool {
    c.valid_range_k().is_some_and(|(lo, hi)| t < lo || t > hi)
}

/// Run the study.
pub fn vle_study(
    comps: [StudyComponent<'_>; 2],
    model: &dyn ActivityModel,
    opts: &StudyOptions,
) -> Result<VleStudy, MixtureError> {
    let b = Binary {
        names: [comps[0].name, comps[1].name],
        curves: [comps[0].curve, comps[1].curve],
        model,
    };
    let cond = opts.condition;
    match cond {
        Condition::Pressure(p) => {
            if !(p.is_finite() && p > 0.0) {
                return Err(MixtureError::BadCondition {
                    what: "pressure",
                    value: p,
                });
            }
            below_both(&comps, p)?;
        }
        Condition::Temperature(t) => {
            if !(t.is_finite() && t > 0.0) {
                return Err(MixtureError::BadCondition {
                    what: "temperature",
                    value: t,
                });
            }
        }
    }
    let pts = b.diagram(cond, opts.points.max(11))?;
    let homogeneous = b.homogeneous_azeotropes(cond, &pts)?;
    let mut flags = Vec::new();
    let three = split_search(&b, cond, &pts);
    let isobaric = matches!(cond, Condition::Pressure(_));
    let mut azeotropes = Vec::new();
    for az in &homogeneous {
        if let Some(tp) = three.filter(|tp| az.x1 > tp.x1_low && az.x1 < tp.x1_high) {
            flags.push(Finding {
                code: MixtureCode::AzeotropeInTwoLiquidRegion.into(),
                severity: MixtureCode::AzeotropeInTwoLiquidRegion.severity(),
                message: format!(
                    "The one-liquid model has y1 = x1 at x1 = {:.3}, inside the predicted two-liquid range {:.4}–{:.4}; it is not reported as a single-liquid azeotrope.",
                    az.x1, tp.x1_low, tp.x1_high
                ),
                subject: Subject::Whole,
            });
        } else {
            azeotropes.push(*az);
        }
    }
    if let Some(tp) = three.filter(ThreePhase::is_heterogeneous_azeotrope) {
        azeotropes.push(Azeotrope {
            x1: tp.y1,
            t_k: tp.t_k,
            p_pa: tp.p_pa,
            kind: AzeotropeKind::Heterogeneous,
        });
    }
    azeotropes.sort_by(|a, b| a.x1.total_cmp(&b.x1));
    // Flags about the model and the curves.
    flags.push(model_flag(model));
    let diagram: Vec<DiagramRow> = pts
        .iter()
        .map(|pt| diagram_row(pt, three.as_ref(), isobaric))
        .collect();
    for (i, c) in comps.iter().enumerate() {
        let ts: Vec<f64> = match cond {
            Condition::Pressure(_) => diagram.iter().filter_map(|r| r.t_k).collect(),
            Condition::Temperature(t) => vec![t],
        };
        if let Some(t) = ts.iter().find(|&&t| outside(c.curve, t)) {
            let (lo, hi) = c.curve.valid_range_k().unwrap_or((f64::NAN, f64::NAN));
            flags.push(Finding {
                code: MixtureCode::VaporPressureExtrapolated.into(),
                severity: MixtureCode::VaporPressureExtrapolated.severity(),
                message: format!(
                    "The vapor-pressure curve of {} is used outside its stated range {:.1}–{:.1} K (e.g. at {:.1} K).",
                    comps[i].name, lo, hi, t
                ),
                subject: Subject::Whole,
            });
        }
    }
    for az in &azeotropes {
        flags.push(Finding {
            code: MixtureCode::AzeotropePredicted.into(),
            severity: MixtureCode::AzeotropePredicted.severity(),
            message: format!(
                "{} azeotrope predicted at x1 = {:.3}{}: ordinary distillation cannot cross it; confirm with measured mixture data.",
                az.kind.as_str(),
                az.x1,
                match cond {
                    Condition::Pressure(_) => format!(", {:.2} °C", az.t_k - crate::units::CELSIUS_OFFSET),
                    Condition::Temperature(_) => format!(", {:.0} Pa", az.p_pa),
                }
            ),
            subject: Subject::Whole,
        });
        if az.kind != AzeotropeKind::Heterogeneous && (az.x1 < 0.02 || az.x1 > 0.98) {
            flags.push(Finding {
                code: MixtureCode::AzeotropeNearPureEnd.into(),
                severity: MixtureCode::AzeotropeNearPureEnd.severity(),
                message: format!(
                    "The azeotrope at x1 = {:.4} lies within 2 mol % of a pure component, where the model's small errors decide whether it exists at all; treat it as uncertain.",
                    az.x1
                ),
                subject: Subject::Whole,
            });
        }
    }
    let mut shift = Vec::new();
    if let (Condition::Pressure(p), Some(first)) = (cond, homogeneous.first().filter(|_| isobaric))
    {
        if azeotropes
            .iter()
            .any(|a| a.kind != AzeotropeKind::Heterogeneous)
        {
            shift = pressure_shift(&b, p, first);
            flags.extend(swing_flag(&shift, first));
        }
    }
    let split = match three {
        Some(tp) => {
            flags.push(Finding {
                code: MixtureCode::TwoLiquidsPredicted.into(),
                severity: MixtureCode::TwoLiquidsPredicted.severity(),
                message: format!(
                    "Two liquid phases predicted at the boiling point between x1 = {:.4} and {:.4}{}; liquid-liquid predictions are qualitative (a decanter may help: common practice).",
                    tp.x1_low,
                    tp.x1_high,
                    if tp.is_heterogeneous_azeotrope() { ", with a heterogeneous azeotrope" } else { "" }
                ),
                subject: Subject::Whole,
            });
            LiquidSplit {
                predicted: true,
                x1_low: Some(rx(tp.x1_low)),
                x1_high: Some(rx(tp.x1_high)),
                t_k: isobaric.then(|| round(tp.t_k, 3)),
                p_pa: (!isobaric).then(|| round(tp.p_pa, 1)),
                y1: Some(rx(tp.y1)),
            }
        }
        None => LiquidSplit {
            predicted: false,
            x1_low: None,
            x1_high: None,
            t_k: None,
            p_pa: None,
            y1: None,
        },
    };
    let (pressure_pa, temperature_k) = match cond {
        Condition::Pressure(p) => (Some(p), None),
        Condition::Temperature(t) => (None, Some(t)),
    };
    Ok(VleStudy {
        pressure_pa,
        temperature_k,
        activity_model: model.name(),
        components: comps
            .iter()
            .map(|c| ComponentOut {
                name: c.name.to_string(),
                smiles: c.smiles.map(str::to_string),
                vapor_pressure_source: c.source.to_string(),
            })
            .collect(),
        diagram,
        azeotropes: azeotropes
            .iter()
            .map(|a| AzeotropeOut {
                x1: rx(a.x1),
                t_k: isobaric.then(|| round(a.t_k, 3)),
                p_pa: (!isobaric).then(|| round(a.p_pa, 1)),
                kind: a.kind,
            })
            .collect(),
        azeotrope_pressure_shift: shift,
        liquid_split: split,
        flags,
        cautions: CAUTIONS,
    })
}

fn below_both(comps: &[StudyComponent<'_>; 2], p: f64) -> Result<(), MixtureError> {
    let mut detail = Vec::new();
    for c in comps {
        let lo = c.curve.valid_range_k().map(|r| r.0);
        match (c.curve.t_at(p), lo) {
            (Some(t), Some(lo)) if t < lo => detail.push(format!(
                "{} would boil at {:.1} K, below its curve's low end {:.1} K",
                c.name, t, lo
            )),
            (None, _) => detail.push(format!(
                "{} has no boiling point at that pressure on its curve",
                c.name
            )),
            _ => return Ok(()),
        }
    }
    Err(MixtureError::OutsideBothCurves {
        p_pa: p,
        detail: detail.join("; "),
    })
}

fn model_flag(model: &dyn ActivityModel) -> Finding {
    match model.name() {
        "ideal" => Finding::new(
            MixtureCode::IdealSolution,
            "Ideal liquid assumed (γ = 1, Raoult's law): azeotropes and liquid splits cannot appear.",
        ),
        "unifac" => Finding::new(
            MixtureCode::ActivityFromStructure,
            "Activity coefficients estimated from structure by original UNIFAC (Fredenslund, Jones & Prausnitz 1975; parameters of Hansen et al. 1991): an estimate, not a measurement.",
        ),
        other => Finding::new(
            MixtureCode::ActivityFromParameters,
            format!("Activity coefficients from the {other} parameters given; they hold only over the range they were fitted on."),
        ),
    }
}

/// Where the three-phase point is, if the liquid splits at the bubble point.
fn split_search(b: &Binary<'_>, cond: Condition, pts: &[VlePoint]) -> Option<ThreePhase> {
    if !b.model.can_split() {
        return None;
    }
    let worst = pts
        .iter()
        .filter(|p| p.x1 > 0.0 && p.x1 < 1.0)
        .map(|p| (super::stability_slope(b.model, p.x1, p.t_k), p))
        .filter(|(s, _)| *s < 0.0)
        .min_by(|a, b| a.0.total_cmp(&b.0))?;
    match cond {
        Condition::Pressure(p) => b.three_phase_at_p(p, worst.1.t_k),
        Condition::Temperature(t) => b.three_phase_at_t(t),
    }
}

fn diagram_row(pt: &VlePoint, three: Option<&ThreePhase>, isobaric: bool) -> DiagramRow {
    let inside = three.filter(|tp| pt.x1 > tp.x1_low && pt.x1 < tp.x1_high);
    let (y1, t, p) = match inside {
        Some(tp) => (tp.y1, tp.t_k, tp.p_pa),
        None => (pt.y1, pt.t_k, pt.p_pa),
    };
    DiagramRow {
        x1: rx(pt.x1),
        y1: rx(y1),
        t_k: isobaric.then(|| round(t, 3)),
        p_pa: (!isobaric).then(|| round(p, 1)),
        gamma1: sig(pt.gamma[0], 5),
        gamma2: sig(pt.gamma[1], 5),
        alpha12: sig(pt.alpha(), 5),
        liquids: if inside.is_some() { 2 } else { 1 },
    }
}

fn pressure_shift(b: &Binary<'_>, p: f64, az: &Azeotrope) -> Vec<ShiftRow> {
    let mut rows = Vec::new();
    for f in SHIFT_FACTORS {
        let pp = p * f;
        let cond = Condition::Pressure(pp);
        let Ok(pts) = b.diagram(cond, 41) else {
            continue;
        };
        let extrapolated = pts
            .iter()
            .any(|pt| b.curves.iter().any(|c| outside(*c, pt.t_k)));
        let found = b.homogeneous_azeotropes(cond, &pts).ok().and_then(|v| {
            v.into_iter()
                .filter(|a| a.kind == az.kind)
                .min_by(|x, y| (x.x1 - az.x1).abs().total_cmp(&(y.x1 - az.x1).abs()))
        });
        rows.push(ShiftRow {
            p_pa: round(pp, 1),
            x1: found.map(|a| rx(a.x1)),
            t_k: found.map(|a| round(a.t_k, 3)),
            extrapolated,
        });
    }
    rows
}

fn swing_flag(rows: &[ShiftRow], az: &Azeotrope) -> Option<Finding> {
    let gone: Vec<&ShiftRow> = rows.iter().filter(|r| r.x1.is_none()).collect();
    let best = rows
        .iter()
        .filter_map(|r| r.x1.map(|x| (r, (x - az.x1).abs())))
        .max_by(|a, b| a.1.total_cmp(&b.1));
    if let Some(r) = gone.first() {
        return Some(Finding {
            code: MixtureCode::PressureSwingCandidate.into(),
            severity: MixtureCode::PressureSwingCandidate.severity(),
            message: format!(
                "The azeotrope is not predicted at {:.0} Pa: a change of pressure may remove it (pressure-swing distillation; common practice){}.",
                r.p_pa,
                if r.extrapolated { ", though a vapor-pressure curve is extrapolated there" } else { "" }
            ),
            subject: Subject::Whole,
        });
    }
    match best {
        Some((r, d)) if d >= SWING_SHIFT => Some(Finding {
            code: MixtureCode::PressureSwingCandidate.into(),
            severity: MixtureCode::PressureSwingCandidate.severity(),
            message: format!(
                "The azeotrope moves from x1 = {:.3} to {:.3} at {:.0} Pa: a shift of {:.0} mol %, enough for pressure-swing distillation to be worth a look (common practice: about 5 mol % or more){}.",
                az.x1,
                r.x1.unwrap_or(f64::NAN),
                r.p_pa,
                100.0 * d,
                if r.extrapolated { "; a vapor-pressure curve is extrapolated there" } else { "" }
            ),
            subject: Subject::Whole,
        }),
        Some((_, d)) => Some(Finding {
            code: MixtureCode::PressureInsensitiveAzeotrope.into(),
            severity: MixtureCode::PressureInsensitiveAzeotrope.severity(),
            message: format!(
                "The azeotrope moves by at most {:.1} mol % between {:.0} and {:.0} times the pressure: pressure swing is unlikely to help (common practice: about 5 mol % or more is needed).",
                100.0 * d,
                SHIFT_FACTORS[0],
                SHIFT_FACTORS[SHIFT_FACTORS.len() - 1]
            ),
            subject: Subject::Whole,
        }),
        None => None,
    }
}
