//! The point-to-point consistency test: fit G^E to T–x (or p–x) alone, then compare y.
//!
//! A flexible Legendre series for G^E/RT is fitted to the bubble temperatures
//! (isobaric) or pressures (isothermal) without the vapor compositions
//! (Barker's method); y1 then follows from the Gibbs–Duhem-consistent model.
//! If the measured y1 agree with it, T–x–y are consistent with each other.
//! Criterion: mean |y1(measured) − y1(model)| < 0.01.
//!
//! Reference: H. C. Van Ness, S. M. Byer, R. E. Gibbs, AIChE J. 19 (1973)
//! 238–244; A. Fredenslund, J. Gmehling, P. Rasmussen, *Vapor–Liquid
//! Equilibria Using UNIFAC*, Elsevier 1977, Sec. 3.3 (the 0.01 criterion).

use super::data::BinaryData;
use super::model::FitModel;
use super::problem::{Obs, Uncertainties, VleProblem};
use super::report::ConsistencyTest;
use super::solve::fit_model;
use crate::vapor::Curve;

/// Mean |Δy1| above which the data fail.
pub const POINT_TEST_LIMIT: f64 = 0.01;

/// The point test's outcome with its per-point y residuals.
#[derive(Debug, Clone, PartialEq)]
pub struct PointTest {
    /// The test in output form.
    pub test: ConsistencyTest,
    /// (x1, y1 measured − y1 of the G^E fit) for each point with y1.
    pub residuals: Vec<(f64, f64)>,
}

/// Run the test; `None` without at least 3 points with y1 or when the fit fails.
pub fn point_test(
    data: &BinaryData,
    curves: [&dyn Curve; 2],
    u: Uncertainties,
) -> Option<PointTest> {
    let with_y = data
        .points
        .iter()
        .filter(|p| p.y1.is_some() && p.x1 > 0.0 && p.x1 < 1.0)
        .count();
    if with_y < 3 {
        return None;
    }
    let terms = data
        .distinct_inner_compositions()
        .saturating_sub(2)
        .clamp(1, 4);
    let model = FitModel::Legendre { terms };
    let keep = vec![true; data.points.len()];
    let f = fit_model(data, curves, model, u, &keep, false, None);
    if !f.converged() {
        return None;
    }
    // y1 of the G^E fit at every point (the problem with y observations added).
    let prob = VleProblem::new(data, curves, model, u, &keep, true);
    let evals = prob.evals(&f.lsq.theta);
    let mut residuals = Vec::new();
    for o in &prob.obs {
        if let Obs::Y(i) = *o {
            let p = data.points[i];
            if p.x1 > 0.0 && p.x1 < 1.0 {
                let calc = evals[i].as_ref()?.y1;
                residuals.push((p.x1, p.y1? - calc));
            }
        }
    }
    let mean = residuals.iter().map(|r| r.1.abs()).sum::<f64>() / residuals.len() as f64;
    Some(PointTest {
        test: ConsistencyTest {
            test: "point-to-point".into(),
            passed: mean < POINT_TEST_LIMIT,
            statistic: mean,
            criterion: "mean |dy1| < 0.01".into(),
            meaning: format!(
                "a {terms}-term Legendre G^E fitted to the {} alone predicts y1 within {mean:.4} on average; measured y1 farther than 0.01 from it cannot satisfy the Gibbs-Duhem equation together with the measured {}.",
                match data.kind {
                    super::data::DataKind::Isobaric => "temperatures",
                    super::data::DataKind::Isothermal => "pressures",
                },
                match data.kind {
                    super::data::DataKind::Isobaric => "T-x",
                    super::data::DataKind::Isothermal => "p-x",
                }
            ),
            needs_y: true,
        },
        residuals,
    })
}
