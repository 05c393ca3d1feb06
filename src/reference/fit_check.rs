//! Hold a fit report against the reference library and the structure estimate.
//!
//! The compound is identified by name (the data's `compound` column or
//! `--compound`) or by structure (`--smiles`). With a reference compound the
//! fitted curve is compared over the common range ([`super::compare`]); with
//! only a structure, the fitted Tb is compared with the Joback estimate and
//! flagged beyond three times the method's typical error.

use super::compare::{compare, compare_structure, Comparison, Finding, Tolerances};
use super::Library;
use crate::fit::findings::{Finding as FitFinding, Severity};
use crate::fit::report::FitReport;
use crate::fit::FittedCurve;

/// What the check found, stored in a report's `reference_comparison`.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct FitCheck {
    /// Tolerances used.
    pub tolerances: Tolerances,
    /// The reference comparison, when a reference compound was found.
    pub reference: Option<Comparison>,
    /// Structure estimate Tb (K) and its typical error, when compared.
    pub structure_tb_k: Option<(f64, f64)>,
    /// Findings (also appended to the report's flags).
    pub findings: Vec<Finding>,
}

fn to_fit(f: &Finding) -> FitFinding {
    FitFinding::new(&f.code, f.severity, f.message.clone())
}

/// Compare `report` with the reference (by `name`, else the report's
/// compound, else `smiles`) and with the structure estimate; store the
/// result in `report.reference_comparison` and append findings to its flags.
pub fn check_fit(
    report: &mut FitReport,
    lib: &Library,
    name: Option<&str>,
    smiles: Option<&str>,
    tol: Tolerances,
) -> FitCheck {
    let curve = FittedCurve::from_report(report);
    let range = (report.t_range_k[0], report.t_range_k[1]);
    let mut out = FitCheck {
        tolerances: tol,
        reference: None,
        structure_tb_k: None,
        findings: Vec::new(),
    };
    let name = name.or(report.compound.as_deref());
    let found = name
        .and_then(|n| lib.get(n))
        .or_else(|| smiles.and_then(|s| lib.find_smiles(s).ok()));
    match found {
        Some(c) => {
            out.reference = compare(&curve, range, c, tol);
            if let Some(cmp) = &out.reference {
                out.findings.extend(cmp.findings.iter().cloned());
            }
        }
        None if name.is_some() || smiles.is_some() => out.findings.push(Finding {
            code: "reference-not-found".into(),
            severity: Severity::Info,
            message: format!(
                "No reference compound matches {}, so the fit was not compared with reference data.",
                name.or(smiles).unwrap_or_default()
            ),
        }),
        None => {}
    }
    if let (Some(s), Some(tb)) = (smiles, report.normal_boiling_point_k.as_ref()) {
        if let Ok(e) = crate::estimate::estimate_smiles(s) {
            out.structure_tb_k = Some((e.tb_k, e.tb_typical_error_k));
            if let Some(f) = compare_structure(tb.value, e.tb_k, e.tb_typical_error_k, s) {
                out.findings.push(f);
            }
        }
    }
    report.flags.extend(out.findings.iter().map(to_fit));
    report.reference_comparison = serde_json::to_value(&out).ok();
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fit::equation_fit::Point;
    use crate::fit::options::FitOptions;
    use crate::fit::vapor_fit::fit_points;
    use crate::vapor::Curve;

    fn points_from(c: &dyn Curve, lo: f64, hi: f64, factor: f64) -> Vec<Point> {
        (0..12)
            .map(|i| {
                let t = lo + (hi - lo) * i as f64 / 11.0;
                // Small seeded-free deterministic scatter (±0.1 %) so the fit has residuals.
                let wiggle = 1.0 + 0.001 * if i % 2 == 0 { 1.0 } else { -1.0 };
                Point {
                    t_k: t,
                    p_pa: c.p_pa(t) * factor * wiggle,
                    u_t_k: None,
                    u_p_pa: None,
                }
            })
            .collect()
    }

    // Points generated from toluene's reference row (Himmelblau App. H Table H.1 / RPS,
    // 280-410 K): a fit raises no disagreement; the same points ×1.05 in p raise one.
    #[test]
    fn fit_of_reference_points_agrees_and_five_percent_shift_disagrees() {
        let lib = Library::bundled();
        let tol = Tolerances::default();
        let ref_curve = lib.find("toluene").unwrap().best_curve().unwrap();
        let (lo, hi) = ref_curve.valid_range_k().unwrap();
        for (factor, expect) in [(1.0, false), (1.05, true)] {
            let pts = points_from(&ref_curve, lo + 5.0, hi - 5.0, factor);
            let mut r = fit_points(Some("toluene".into()), &pts, &FitOptions::default()).unwrap();
            let chk = check_fit(&mut r, lib, None, None, tol);
            let flagged = chk
                .findings
                .iter()
                .any(|f| f.code == "reference-pressure-disagrees");
            assert_eq!(flagged, expect, "factor {factor}: {:?}", chk.findings);
            assert!(r.reference_comparison.is_some());
        }
    }

    #[test]
    fn structure_only_comparison_and_unknown_name() {
        let lib = Library::bundled();
        let ref_curve = lib.find("ethyl acetate").unwrap().best_curve().unwrap();
        let pts = points_from(&ref_curve, 280.0, 370.0, 1.0);
        let mut r = fit_points(None, &pts, &FitOptions::default()).unwrap();
        // A structure not in the library: only the estimate comparison applies.
        let chk = check_fit(&mut r, lib, None, Some("CCCOC(C)=O"), Tolerances::default());
        assert!(chk.structure_tb_k.is_some());
        assert!(chk.findings.iter().any(|f| f.code == "reference-not-found"));
        // The flag is raised exactly when the difference exceeds three typical errors.
        let (tb_e, err) = chk.structure_tb_k.unwrap();
        let tb_fit = r.normal_boiling_point_k.as_ref().unwrap().value;
        let flagged = chk
            .findings
            .iter()
            .any(|f| f.code == "structure-tb-disagrees");
        assert_eq!(flagged, (tb_fit - tb_e).abs() > 3.0 * err);
    }
}
