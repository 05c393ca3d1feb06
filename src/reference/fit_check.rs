//! Hold a fit report against the reference library and the structure estimate.
//!
//! The compound is identified by name (the data's `compound` column or
//! `--compound`) or by structure (`--smiles`). With a reference compound the
//! fitted curve is compared over the common range ([`super::compare`]); with
//! only a structure, the fitted Tb is compared with the Joback estimate and
//! flagged beyond three times the method's typical error.

use super::compare::{compare, compare_structure, Tolerances};
use super::Library;
use crate::finding::{Finding, ReferenceCode, Subject};
pub use crate::fit::comparison::FitCheck;
use crate::fit::report::FitReport;
use crate::fit::FittedCurve;

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
        structure_tb_pi90_k: None,
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
            code: ReferenceCode::ReferenceNotFound.into(),
            severity: ReferenceCode::ReferenceNotFound.severity(),
            message: {
                let q = name.or(smiles).unwrap_or_default();
                let near = name.map(|n| lib.suggestions(n)).unwrap_or_default();
                let hint = if near.is_empty() {
                    String::new()
                } else {
                    format!(" (did you mean: {}?)", near.join(", "))
                };
                format!(
                    "No reference compound matches {q}{hint}, so the fit was not compared with reference data."
                )
            },
            subject: Subject::Whole,
        }),
        None => {}
    }
    if let (Some(s), Some(tb)) = (smiles, report.normal_boiling_point_k.as_ref()) {
        if let Ok(e) = crate::estimate::estimate_smiles(s) {
            out.structure_tb_k = Some((e.tb_k, e.tb_typical_error_k));
            let pi = (e.tb_pi90_low_k, e.tb_pi90_high_k);
            let inside = tb.value >= pi.0 && tb.value <= pi.1;
            out.structure_tb_pi90_k = Some((pi.0, pi.1, inside));
            if let Some(f) = compare_structure(tb.value, e.tb_k, pi, e.tb_typical_error_k, s) {
                out.findings.push(f);
            }
        }
    }
    report.flags.extend(out.findings.iter().cloned());
    report.reference_comparison = Some(out.clone());
    out
}

/// Plausibility of the data as labelled ([`crate::fit::plausibility`]):
/// swapped columns, pressure falling with temperature, ΔHvap outside what
/// liquids show, and a pressure column that meets the reference (or the
/// structure estimate's 90 % interval) only in another unit. `units` are the
/// units the columns were read in. Findings go to the report's flags.
pub fn check_labels(
    report: &mut FitReport,
    chk: &FitCheck,
    points: &[crate::fit::Point],
    units: (crate::units::TemperatureUnit, crate::units::PressureUnit),
) {
    use crate::fit::plausibility::{check_columns, check_pressure_unit};
    let mut found = check_columns(points, units.0, units.1);
    if found.is_empty() {
        // A Clausius–Clapeyron extrapolation to Tb is good to a few kelvin
        // over a typical range (common practice): allow 2 % of Tb, at least 3 K.
        let known = match (&chk.reference, chk.structure_tb_k, chk.structure_tb_pi90_k) {
            (Some(c), _, _) if c.tb_reference_k.is_some() => c.tb_reference_k.map(|t| {
                (
                    t,
                    (0.02 * t).max(3.0),
                    format!("the reference Tb of {}", c.compound),
                )
            }),
            (_, Some((tb, _)), Some((lo, hi, _))) => Some((
                tb,
                (0.5 * (hi - lo)).max(3.0),
                "the structure estimate's Tb".to_string(),
            )),
            _ => None,
        };
        if let Some((tb, tol, what)) = known {
            found.extend(check_pressure_unit(points, units.1, tb, tol, &what));
        }
    }
    report.flags.extend(found);
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

    // Points generated from toluene's reference curve (Lemmon & Span 2006 equation of state,
    // stored form) over 280-410 K: a fit raises no disagreement; the same points ×1.05 in p
    // raise one.
    #[test]
    fn fit_of_reference_points_agrees_and_five_percent_shift_disagrees() {
        let lib = Library::bundled();
        let tol = Tolerances::default();
        let ref_curve = lib.find("toluene").unwrap().best_curve().unwrap();
        let (lo, hi) = (280.0, 410.0);
        for (factor, expect) in [(1.0, false), (1.05, true)] {
            let pts = points_from(&ref_curve, lo, hi, factor);
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
        // The flag is raised exactly when the fitted Tb leaves the 90 % interval.
        let (lo, hi, inside) = chk.structure_tb_pi90_k.unwrap();
        let tb_fit = r.normal_boiling_point_k.as_ref().unwrap().value;
        assert_eq!(inside, (lo..=hi).contains(&tb_fit));
        let flagged = chk
            .findings
            .iter()
            .any(|f| f.code == "structure-tb-disagrees");
        assert_eq!(flagged, !inside);
    }

    // Ethyl acetate points shifted 30 % in p: the fitted Tb moves about 8 K,
    // inside three typical errors of the estimate but outside its 90 % interval.
    #[test]
    fn fitted_tb_outside_the_structure_90_percent_interval_is_a_finding() {
        let lib = Library::bundled();
        let ref_curve = lib.find("ethyl acetate").unwrap().best_curve().unwrap();
        let e = crate::estimate::estimate_smiles("CCOC(C)=O").unwrap();
        let mut hit = false;
        for factor in [0.3, 0.5, 0.7, 1.4, 2.0, 3.0] {
            let pts = points_from(&ref_curve, 280.0, 370.0, factor);
            let mut r = fit_points(None, &pts, &FitOptions::default()).unwrap();
            let chk = check_fit(
                &mut r,
                lib,
                Some("no such compound"),
                Some("CCOC(C)=O"),
                Tolerances::default(),
            );
            let tb = r.normal_boiling_point_k.as_ref().unwrap().value;
            let outside = tb < e.tb_pi90_low_k || tb > e.tb_pi90_high_k;
            let f = chk
                .findings
                .iter()
                .find(|f| f.code == "structure-tb-disagrees");
            assert_eq!(f.is_some(), outside, "factor {factor}: Tb {tb}");
            if let Some(f) = f {
                assert!(f.message.contains("90 % interval"), "{}", f.message);
                hit = true;
            }
        }
        assert!(hit, "no shift left the interval");
    }
}
