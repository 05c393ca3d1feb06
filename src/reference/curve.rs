//! The reference curve of a compound: a reference equation's stored saturation curve, an
//! Antoine row or the IF97 water line, with its source and uncertainty.

use super::equation::{EquationRow, SaturationForm};
use super::table::AntoineRow;
use super::water::If97Saturation;
use crate::estimate::lee_kesler::LeeKeslerCurve;
use crate::vapor::{AntoineConstants, Curve};

/// Assumed relative standard uncertainty in p of the IF97 saturation line as
/// used here: 0.1 %. A deliberately generous allowance (common practice); the
/// release states its own, smaller, uncertainties, which are not reproduced.
pub const IF97_U_P_REL: f64 = 0.001;

/// Relative standard uncertainty in p of a Lee–Kesler curve drawn through a boiling point
/// with critical constants from memory: 10 % (common practice for a corresponding-states
/// curve away from its anchor; the from-memory class, documented in SOURCES.md).
pub const FROM_MEMORY_CURVE_U_P_REL: f64 = 0.10;

/// What a reference curve is made of.
#[derive(Debug, Clone, PartialEq)]
pub enum ReferenceCurveKind {
    /// A published (or user's) Antoine row.
    Antoine(AntoineConstants),
    /// IAPWS-IF97 region 4.
    Water(If97Saturation),
    /// A reference equation of state's saturation curve, in its stored form, with the
    /// fitted range (K) and the triple point (K, Pa) when the range starts there.
    Equation(SaturationForm, (f64, f64), Option<(f64, f64)>),
    /// A Lee–Kesler curve through a tabulated boiling point with tabulated Tc and pc.
    LeeKesler(LeeKeslerCurve),
}

/// A reference curve with its source and assumed uncertainty.
#[derive(Debug, Clone, PartialEq)]
pub struct ReferenceCurve {
    /// The equation.
    pub kind: ReferenceCurveKind,
    /// Where it comes from (with file and line for table rows).
    pub source: String,
    /// Relative standard uncertainty in p.
    pub u_p_rel: f64,
    /// Caveat carried from the row, empty if none.
    pub note: String,
}

impl ReferenceCurve {
    /// From an Antoine row.
    pub fn antoine(r: &AntoineRow) -> Self {
        ReferenceCurve {
            kind: ReferenceCurveKind::Antoine(r.constants),
            source: format!("{} ({}, line {})", r.source, r.origin.file, r.origin.line),
            u_p_rel: r.u_p_rel,
            note: r.note.clone(),
        }
    }

    /// The IAPWS-IF97 saturation line.
    pub fn water() -> Self {
        ReferenceCurve {
            kind: ReferenceCurveKind::Water(If97Saturation),
            source: "IAPWS-IF97 region 4, Eqs. 30-31 (IAPWS R7-97(2012))".into(),
            u_p_rel: IF97_U_P_REL,
            note: String::new(),
        }
    }

    /// A reference equation's stored saturation curve.
    pub fn equation(r: &EquationRow) -> Self {
        let mut note = format!(
            "stored {} form, within {:.4} % of the equation from {:.2} K to {:.2} K",
            r.form.name(),
            100.0 * r.max_dev_rel,
            r.range_k.0,
            r.range_k.1
        );
        match r.stated_u_p_rel {
            Some(u) => note.push_str(&format!(
                "; the equation's stated uncertainty in p: {:.3} % (k = 2, {})",
                100.0 * u,
                r.stated_u_note
            )),
            None => note.push_str(&format!(
                "; the equation's own uncertainty statement is not recorded here, so {:.2} % (k = 2) is assumed",
                200.0 * super::equation::REFERENCE_EQUATION_U_P_REL
            )),
        }
        if !r.range_note.is_empty() {
            note.push_str(&format!("; range {}", r.range_note));
        }
        ReferenceCurve {
            kind: ReferenceCurveKind::Equation(
                r.form.clone(),
                r.range_k,
                (r.range_k.0 <= r.t_triple_k + 1e-9)
                    .then(|| (r.t_triple_k, r.form.ln_p(r.t_triple_k).exp())),
            ),
            source: format!(
                "reference equation of state: {} ({}, line {})",
                r.citation, r.origin.file, r.origin.line
            ),
            u_p_rel: r.u_p_rel(),
            note,
        }
    }

    /// A Lee–Kesler curve through the row's boiling point: with the row's critical constants
    /// when it gives them, else with Joback's Tc (taken from the row's Tb: Joback's Tc is Tb
    /// times a group factor) and pc for the row's SMILES. The from-memory class in either case.
    pub fn lee_kesler(r: &super::TbRow) -> Option<Self> {
        let (tc, pc, crit_from) = match r.critical {
            Some((tc, pc)) => (tc, pc, "Tc and pc from the row".to_string()),
            None => {
                let e = crate::estimate::estimate_smiles(r.smiles.as_deref()?).ok()?;
                let (tc_e, pc_bar) = (e.tc_k?, e.pc_bar?);
                let tc = r.tb_k * tc_e / e.tb_k;
                (
                    tc,
                    pc_bar * 1e5,
                    "Tc and pc by Joback's group contributions (structure estimate)".to_string(),
                )
            }
        };
        if !(tc > r.tb_k && pc > crate::units::ATM_PA) {
            return None;
        }
        Some(ReferenceCurve {
            kind: ReferenceCurveKind::LeeKesler(LeeKeslerCurve::from_tb(r.tb_k, tc, pc, None)),
            source: format!(
                "Lee-Kesler curve (Lee & Kesler, AIChE J. 21, 510-527, 1975) through the boiling point {:.2} K, with Tc {tc:.1} K and pc {:.3} MPa ({crit_from}); boiling point: {} ({}, line {})",
                r.tb_k,
                pc / 1e6,
                r.source,
                r.origin.file,
                r.origin.line
            ),
            u_p_rel: FROM_MEMORY_CURVE_U_P_REL,
            note: "from-memory class: a corresponding-states curve through a boiling point, not a measured curve".into(),
        })
    }

    fn curve(&self) -> Option<&dyn Curve> {
        match &self.kind {
            ReferenceCurveKind::LeeKesler(k) => Some(k),
            ReferenceCurveKind::Antoine(k) => Some(k),
            ReferenceCurveKind::Water(w) => Some(w),
            ReferenceCurveKind::Equation(..) => None,
        }
    }
}

impl Curve for ReferenceCurve {
    fn ln_p(&self, t_k: f64) -> f64 {
        match (&self.kind, self.curve()) {
            (ReferenceCurveKind::Equation(f, _, _), _) => f.ln_p(t_k),
            (_, Some(c)) => c.ln_p(t_k),
            _ => f64::NAN,
        }
    }
    fn d_ln_p_dt(&self, t_k: f64) -> f64 {
        match self.curve() {
            Some(c) => c.d_ln_p_dt(t_k),
            None => {
                let h = 1e-4 * t_k.max(1.0);
                (self.ln_p(t_k + h) - self.ln_p(t_k - h)) / (2.0 * h)
            }
        }
    }
    fn valid_range_k(&self) -> Option<(f64, f64)> {
        match (&self.kind, self.curve()) {
            (ReferenceCurveKind::Equation(_, r, _), _) => Some(*r),
            (_, Some(c)) => c.valid_range_k(),
            _ => None,
        }
    }
    /// u(T) = u(ln p) / (d ln p/dT), with u(ln p) ≈ the relative uncertainty in p.
    fn t_uncertainty_k(&self, p_pa: f64) -> Option<f64> {
        let t = self.t_at(p_pa)?;
        let s = self.d_ln_p_dt(t);
        (s > 0.0).then(|| self.u_p_rel / s)
    }
    fn t_at(&self, p_pa: f64) -> Option<f64> {
        match self.curve() {
            Some(c) => c.t_at(p_pa),
            None => {
                crate::vapor::invert_monotone(|t| self.ln_p(t), p_pa.ln(), self.valid_range_k())
            }
        }
    }
    fn triple_point(&self) -> Option<(f64, f64)> {
        match (&self.kind, self.curve()) {
            (ReferenceCurveKind::Equation(_, _, tp), _) => *tp,
            (_, Some(c)) => c.triple_point(),
            _ => None,
        }
    }
}
