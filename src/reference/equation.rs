//! Saturation curves of reference equations of state, stored as fitted forms.
//!
//! `reference-data/reference-equations.csv` is written by `reference-data/gen/generate.py`:
//! for each fluid it samples the saturation pressure of the fluid's published reference
//! equation of state from the triple point to 0.95 Tc and stores either ebullio's own
//! Wagner 2.5–5 form ([`crate::vapor::Wagner`]) or, where that misses the equation by more
//! than 0.003 % in p, the Chebyshev form of D. Ambrose, J. F. Counsell and A. J. Davenport,
//! *J. Chem. Thermodyn.* 2, 283–294 (1970) (from memory; here with the natural logarithm and
//! a₀ not halved):
//!
//! T ln(p/Pa) = Σₛ aₛ Tₛ(x),  x = (2T − (T_max + T_min)) / (T_max − T_min).
//!
//! Each row carries the largest deviation of the stored form from the equation at 200
//! check points (stored in `reference-equation-points.csv`, checked by a test) and the
//! equation's citation. The uncertainty given to the curve is the equation's stated one
//! where recorded, else [`REFERENCE_EQUATION_U_P_REL`].

use super::cas;
use super::table::{Origin, TableError};
use crate::vapor::{Curve, VaporEquation, Wagner};

/// Relative standard uncertainty in p given to a reference-equation curve whose equation's
/// own statement is not recorded here: 0.25 %, i.e. 0.5 % expanded (k = 2), the upper end of
/// the 0.1–0.5 % that reference equations of state typically state for vapor pressure
/// (common practice).
pub const REFERENCE_EQUATION_U_P_REL: f64 = 0.0025;

/// Most Chebyshev coefficients a stored curve may have.
pub const MAX_TERMS: usize = 32;

/// The stored form of a saturation curve.
#[derive(Debug, Clone, PartialEq)]
pub enum SaturationForm {
    /// ebullio's Wagner 2.5–5 form with the equation's Tc and pc; `n` = [a, b, c, d].
    Wagner {
        /// The form with its critical point.
        wagner: Wagner,
        /// Parameters a, b, c, d.
        n: [f64; 4],
    },
    /// Chebyshev series in T ln(p/Pa) over [lo, hi] K.
    Chebyshev {
        /// Lower end of the fitted range, K.
        lo: f64,
        /// Upper end of the fitted range, K.
        hi: f64,
        /// Coefficients a₀, a₁, …
        a: std::sync::Arc<[f64]>,
    },
}

impl SaturationForm {
    /// ln(p/Pa) at `t_k` (NaN where the form is undefined).
    pub fn ln_p(&self, t_k: f64) -> f64 {
        match self {
            SaturationForm::Wagner { wagner, n } => wagner.ln_p(n, t_k),
            SaturationForm::Chebyshev { lo, hi, a } => {
                if t_k.is_nan() || t_k <= 0.0 {
                    return f64::NAN;
                }
                // Outside the fitted range a polynomial runs away: continue instead along
                // ln p linear in 1/T from the nearer end (Clausius-Clapeyron), which is
                // monotone; callers flag such temperatures as extrapolated.
                let end = if t_k < *lo {
                    Some(*lo)
                } else if t_k > *hi {
                    Some(*hi)
                } else {
                    None
                };
                match end {
                    None => chebyshev(*lo, *hi, a, t_k),
                    Some(e) => {
                        let h = 1e-4 * e;
                        let (e0, e1) = if e == *lo { (e, e + h) } else { (e - h, e) };
                        let (f0, f1) = (chebyshev(*lo, *hi, a, e0), chebyshev(*lo, *hi, a, e1));
                        let slope = (f1 - f0) / (1.0 / e1 - 1.0 / e0);
                        chebyshev(*lo, *hi, a, e) + slope * (1.0 / t_k - 1.0 / e)
                    }
                }
            }
        }
    }

    /// Short name of the form (`wagner-2.5-5` or `chebyshev`).
    pub fn name(&self) -> &'static str {
        match self {
            SaturationForm::Wagner { .. } => "wagner-2.5-5",
            SaturationForm::Chebyshev { .. } => "chebyshev",
        }
    }
}

/// ln(p/Pa) = Σ a_s T_s(x) / T by the Clenshaw recurrence.
fn chebyshev(lo: f64, hi: f64, a: &[f64], t_k: f64) -> f64 {
    let x = (2.0 * t_k - (hi + lo)) / (hi - lo);
    let (mut b1, mut b2) = (0.0, 0.0);
    for &c in a[1..].iter().rev() {
        let b0 = 2.0 * x * b1 - b2 + c;
        b2 = b1;
        b1 = b0;
    }
    (a[0] + x * b1 - b2) / t_k
}

/// One fluid's stored reference-equation saturation curve and constants.
#[derive(Debug, Clone, PartialEq)]
pub struct EquationRow {
    /// Compound name (ebullio's canonical name).
    pub compound: String,
    /// Synonyms given with the row.
    pub synonyms: Vec<String>,
    /// CAS number (check digit validated).
    pub cas: String,
    /// SMILES.
    pub smiles: String,
    /// Critical temperature of the equation, K.
    pub tc_k: f64,
    /// Critical pressure of the equation, Pa.
    pub pc_pa: f64,
    /// Acentric factor.
    pub omega: f64,
    /// Triple-point temperature, K.
    pub t_triple_k: f64,
    /// Normal boiling point from the equation, K (None: no liquid at 1 atm below 0.95 Tc).
    pub tb_k: Option<f64>,
    /// Range the stored form was fitted over, K.
    pub range_k: (f64, f64),
    /// Why the range starts above the triple point, empty if it does not.
    pub range_note: String,
    /// The stored form.
    pub form: SaturationForm,
    /// Largest |p_form/p_equation − 1| at the 200 check points.
    pub max_dev_rel: f64,
    /// The equation's stated expanded (k = 2) uncertainty in p, relative, when recorded.
    pub stated_u_p_rel: Option<f64>,
    /// How the stated uncertainty is known (e.g. "from memory of ...").
    pub stated_u_note: String,
    /// Citation of the equation of state (authors, title, journal, volume, pages, year).
    pub citation: String,
    /// File and line.
    pub origin: Origin,
}

impl EquationRow {
    /// Relative standard uncertainty in p of the stored curve: the equation's stated
    /// expanded uncertainty halved (else [`REFERENCE_EQUATION_U_P_REL`]), combined with the
    /// form's largest deviation taken as a rectangular bound (÷√3).
    pub fn u_p_rel(&self) -> f64 {
        let eq = self
            .stated_u_p_rel
            .map_or(REFERENCE_EQUATION_U_P_REL, |u| u / 2.0);
        (eq * eq + (self.max_dev_rel / 3f64.sqrt()).powi(2)).sqrt()
    }
}

/// The stored curve as a [`Curve`] (validity: the fitted range).
impl Curve for EquationRow {
    fn ln_p(&self, t_k: f64) -> f64 {
        self.form.ln_p(t_k)
    }
    fn valid_range_k(&self) -> Option<(f64, f64)> {
        Some(self.range_k)
    }
}

/// Read the reference-equation table (lines starting with `#` are comments).
pub fn parse(text: &str, file: &str) -> Result<Vec<EquationRow>, TableError> {
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .from_reader(text.as_bytes());
    let csv_err = |e: csv::Error| TableError::Csv {
        file: file.to_string(),
        message: e.to_string(),
    };
    let headers = rdr.headers().map_err(csv_err)?.clone();
    let col = |name: &str| headers.iter().position(|h| h == name);
    let comments_before = text.lines().take_while(|l| l.starts_with('#')).count();
    let mut out = Vec::new();
    for (k, rec) in rdr.records().enumerate() {
        let rec = rec.map_err(csv_err)?;
        let line = comments_before + k + 2;
        let cell = |name: &str| col(name).and_then(|i| rec.get(i)).unwrap_or("").trim();
        let bad = |name: &str, expected: &str| TableError::Cell {
            file: file.to_string(),
            line,
            column: name.to_string(),
            value: cell(name).to_string(),
            expected: expected.to_string(),
        };
        let num = |name: &str| -> Result<f64, TableError> {
            cell(name)
                .parse::<f64>()
                .ok()
                .filter(|x| x.is_finite())
                .ok_or_else(|| bad(name, "a number"))
        };
        let opt = |name: &str| -> Result<Option<f64>, TableError> {
            if cell(name).is_empty() {
                Ok(None)
            } else {
                num(name).map(Some)
            }
        };
        let (tc_k, pc_pa) = (num("tc_k")?, num("pc_pa")?);
        let range_k = (num("t_min_k")?, num("t_max_k")?);
        if !(range_k.0 > 0.0 && range_k.1 > range_k.0 && range_k.1 < tc_k && pc_pa > 0.0) {
            return Err(bad("t_max_k", "a range 0 < t_min_k < t_max_k < tc_k"));
        }
        let coef: Vec<f64> = cell("coefficients")
            .split(';')
            .map(|s| s.trim().parse::<f64>().ok().filter(|x| x.is_finite()))
            .collect::<Option<_>>()
            .ok_or_else(|| bad("coefficients", "numbers separated by ';'"))?;
        let form = match cell("form") {
            "wagner-2.5-5" if coef.len() == 4 => SaturationForm::Wagner {
                wagner: Wagner { tc_k, pc_pa },
                n: [coef[0], coef[1], coef[2], coef[3]],
            },
            "chebyshev" if (2..=MAX_TERMS).contains(&coef.len()) => SaturationForm::Chebyshev {
                lo: range_k.0,
                hi: range_k.1,
                a: coef.into(),
            },
            _ => {
                return Err(bad(
                    "form",
                    "'wagner-2.5-5' with 4 coefficients or 'chebyshev' with 2 to 32",
                ))
            }
        };
        let cas = cas::validate(cell("cas")).map_err(|e| bad("cas", &e.to_string()))?;
        out.push(EquationRow {
            compound: cell("compound").to_string(),
            synonyms: cell("synonyms")
                .split(';')
                .map(|s| s.trim().to_string())
                .filter(|s| !s.is_empty())
                .collect(),
            cas,
            smiles: cell("smiles").to_string(),
            tc_k,
            pc_pa,
            omega: num("omega")?,
            t_triple_k: num("t_triple_k")?,
            tb_k: opt("tb_k")?,
            range_k,
            range_note: cell("range_note").to_string(),
            form,
            max_dev_rel: num("max_dev_pct")? / 100.0,
            stated_u_p_rel: opt("eos_u_p_pct")?.map(|u| u / 100.0),
            stated_u_note: cell("eos_u_note").to_string(),
            citation: cell("eos_citation").to_string(),
            origin: Origin {
                file: file.to_string(),
                line,
                user: false,
            },
        });
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{water, Library};
    use crate::units::ATM_PA;
    use std::collections::BTreeMap;

    /// Check points written by `reference-data/gen/generate.py` from each fluid's reference
    /// equation of state (evaluated with the open-source CoolProp library); not the points
    /// the stored forms were fitted to.
    const POINTS_CSV: &str = include_str!("../../reference-data/reference-equation-points.csv");

    fn rows() -> Vec<EquationRow> {
        parse(
            super::super::EQUATIONS_CSV,
            "reference-data/reference-equations.csv",
        )
        .unwrap()
    }

    fn points() -> BTreeMap<String, Vec<(f64, f64)>> {
        let mut m: BTreeMap<String, Vec<(f64, f64)>> = BTreeMap::new();
        for line in POINTS_CSV.lines().filter(|l| !l.starts_with('#')).skip(1) {
            let (name, rest) = line
                .rsplit_once(',')
                .and_then(|(a, p)| {
                    let (n, t) = a.rsplit_once(',')?;
                    Some((
                        n.trim_matches('"').to_string(),
                        (t.parse().ok()?, p.parse().ok()?),
                    ))
                })
                .unwrap();
            m.entry(name).or_default().push(rest);
        }
        m
    }

    // Each stored curve against the 200 stored points of its reference equation: within the
    // deviation the row states (the generator's target is 0.02 % in p).
    #[test]
    fn stored_curves_reproduce_their_reference_equation_points() {
        let pts = points();
        let rows = rows();
        assert!(rows.len() >= 120, "{}", rows.len());
        let mut largest = 0.0f64;
        for r in &rows {
            let p = pts.get(&r.compound).expect("points for every row");
            assert_eq!(p.len(), 200, "{}", r.compound);
            assert!(
                r.max_dev_rel <= 2e-4,
                "{} states {}",
                r.compound,
                r.max_dev_rel
            );
            let mut worst = 0.0f64;
            for &(t, p_ref) in p {
                assert!((r.range_k.0 - 1e-6..=r.range_k.1 + 1e-6).contains(&t));
                worst = worst.max((r.p_pa(t) / p_ref - 1.0).abs());
            }
            // Points are stored to 10 significant digits and the deviation rounded up to
            // 1e-8 by the generator, which evaluates the stored figures: allow 1e-8.
            assert!(
                worst <= r.max_dev_rel + 1e-8,
                "{}: {worst} > stated {}",
                r.compound,
                r.max_dev_rel
            );
            largest = largest.max(worst);
        }
        assert!(largest <= 2e-4, "{largest}");
    }

    // IAPWS-IF97 (R7-97(2012), Eq. 30) stays the water reference; the stored curve of the
    // IAPWS-95 formulation (Wagner & Pruss 2002) reproduces it within 0.02 % in p.
    #[test]
    fn water_equation_curve_reproduces_if97() {
        let r = rows().into_iter().find(|r| r.compound == "water").unwrap();
        let (lo, hi) = r.range_k;
        let mut worst = 0.0f64;
        for i in 0..=200 {
            let t = lo.max(water::T_MIN_K) + (hi - lo.max(water::T_MIN_K)) * i as f64 / 200.0;
            worst = worst.max((r.p_pa(t) / water::ps_pa(t) - 1.0).abs());
        }
        assert!(worst < 2e-4, "{worst}");
        let lib = Library::bundled();
        let w = lib.find("water").unwrap();
        assert!(matches!(
            w.best_curve().unwrap().kind,
            crate::reference::ReferenceCurveKind::Water(_)
        ));
    }

    // Every SMILES of the table is read by ebullio's own reader, and its CAS number passed
    // the check-digit rule while parsing.
    #[test]
    fn smiles_parse_and_names_are_unique() {
        let rows = rows();
        let mut seen = std::collections::BTreeSet::new();
        for r in &rows {
            crate::molecule::parse_smiles(&r.smiles)
                .unwrap_or_else(|e| panic!("{}: {} {e}", r.compound, r.smiles));
            assert!(seen.insert(r.compound.clone()), "{}", r.compound);
            assert!(!r.citation.is_empty() && !r.citation.contains("http"));
        }
    }

    // The Wagner rows evaluate ebullio's own Wagner 2.5-5 form; a Chebyshev row continues
    // monotonically outside its range (no polynomial run-away).
    #[test]
    fn forms_evaluate_and_extrapolate_monotonically() {
        for r in rows() {
            let (lo, hi) = r.range_k;
            let mut last = f64::NEG_INFINITY;
            for i in 0..=60 {
                let t = lo - 20.0 + (hi - lo + 40.0) * i as f64 / 60.0;
                if t >= r.tc_k || t <= 0.0 {
                    continue;
                }
                let l = r.ln_p(t);
                assert!(l.is_finite() && l > last, "{} at {t}", r.compound);
                last = l;
            }
        }
    }

    // Toluene (Lemmon & Span 2006): boiling point at 1 atm with a 95 % interval within
    // ±0.1 K, through the library's best curve.
    #[test]
    fn toluene_normal_boiling_point_is_tight() {
        let c = Library::bundled().find("toluene").unwrap();
        let rc = c.best_curve().unwrap();
        assert!(matches!(
            rc.kind,
            crate::reference::ReferenceCurveKind::Equation(..)
        ));
        let t = rc.t_at(ATM_PA).unwrap();
        assert!((t - 383.75).abs() < 0.05, "{t}");
        let u95 = 1.96 * rc.t_uncertainty_k(ATM_PA).unwrap();
        assert!(u95 <= 0.1, "{u95}");
    }
}
