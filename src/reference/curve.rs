//! The reference curve of a compound: an Antoine row or the IF97 water line, with its source.

use super::table::AntoineRow;
use super::water::If97Saturation;
use crate::vapor::{AntoineConstants, Curve};

/// Assumed relative standard uncertainty in p of the IF97 saturation line as
/// used here: 0.1 %. A deliberately generous allowance (common practice); the
/// release states its own, smaller, uncertainties, which are not reproduced.
pub const IF97_U_P_REL: f64 = 0.001;

/// What a reference curve is made of.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ReferenceCurveKind {
    /// A published (or user's) Antoine row.
    Antoine(AntoineConstants),
    /// IAPWS-IF97 region 4.
    Water(If97Saturation),
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

    fn curve(&self) -> &dyn Curve {
        match &self.kind {
            ReferenceCurveKind::Antoine(k) => k,
            ReferenceCurveKind::Water(w) => w,
        }
    }
}

impl Curve for ReferenceCurve {
    fn ln_p(&self, t_k: f64) -> f64 {
        self.curve().ln_p(t_k)
    }
    fn d_ln_p_dt(&self, t_k: f64) -> f64 {
        self.curve().d_ln_p_dt(t_k)
    }
    fn valid_range_k(&self) -> Option<(f64, f64)> {
        self.curve().valid_range_k()
    }
    /// u(T) = u(ln p) / (d ln p/dT), with u(ln p) ≈ the relative uncertainty in p.
    fn t_uncertainty_k(&self, p_pa: f64) -> Option<f64> {
        let t = self.t_at(p_pa)?;
        let s = self.d_ln_p_dt(t);
        (s > 0.0).then(|| self.u_p_rel / s)
    }
    fn t_at(&self, p_pa: f64) -> Option<f64> {
        self.curve().t_at(p_pa)
    }
    fn triple_point(&self) -> Option<(f64, f64)> {
        self.curve().triple_point()
    }
}
