//! The findings raised on a finished fit (codes in `crate::finding::FitCode`).

use super::build::*;
use super::curve::FittedCurve;
use super::findings::{Finding, FitCode};
use super::options::FitOptions;
use super::report::*;
use super::termination::StopReason;
use crate::vapor::{slope, Equation};

pub(super) fn findings(r: &FitReport, curve: &FittedCurve, opts: &FitOptions) -> Vec<Finding> {
    let mut v = Vec::new();
    if !r.termination.is_success() {
        // A spent budget says the data fight the equation, not that more iterations would help.
        let hint = match r.termination.reason {
            StopReason::BudgetSpent { .. } => " The budget grows with the number of constants and is ample for data the equation describes: check the units, the columns and any gross outliers.",
            _ => "",
        };
        v.push(Finding::new(
            FitCode::NotConverged,
            format!(
                "The fit did not converge ({}); the constants are the solver's last point, not a solution.{hint}",
                r.termination.reason
            ),
        ));
        return v;
    }
    let repeats = exact_repeats(&r.points);
    if repeats > 0 {
        v.push(Finding::new(
            FitCode::DuplicatePoints,
            format!("{repeats} point(s) repeat another point exactly (same T and p); each copy counts as an independent measurement and narrows the intervals, so remove copies that are not genuine repeat measurements."),
        ));
    }
    let span = r.t_range_k[1] - r.t_range_k[0];
    if span < 20.0 {
        v.push(Finding::new(
            FitCode::NarrowRange,
            format!("The data span only {span:.1} K; constants and any extrapolation are poorly determined."),
        ));
    }
    if let Some(nbp) = &r.normal_boiling_point_k {
        if nbp.extrapolated {
            v.push(Finding::new(
                FitCode::ExtrapolatedPrediction,
                format!(
                    "The normal boiling point {:.2} K lies {:.1} K outside the measured range.",
                    nbp.value, nbp.extrapolation_k
                ),
            ));
        }
        let s = slope::svap_j_mol_k(curve, nbp.value);
        if !slope::trouton_plausible(s) {
            let (lo, hi) = slope::TROUTON_BAND_J_MOL_K;
            v.push(Finding::new(
            FitCode::TroutonImplausible,
                format!("The entropy of vaporization at Tb is {s:.0} J/(mol·K), outside the {lo:.0}–{hi:.0} band of Trouton's rule (common practice); check units and data."),
            ));
        }
    }
    for p in &r.predictions {
        if p.extrapolated {
            v.push(Finding::new(
            FitCode::ExtrapolatedPrediction,
                format!(
                    "The prediction at {:.2} K / {:.4} kPa lies {:.1} K outside the measured range.",
                    p.t_k,
                    p.p_pa / 1000.0,
                    p.extrapolation_k
                ),
            ));
        }
    }
    for p in r.points.iter().filter(|p| p.robust_rejected) {
        v.push(Finding::new(
            FitCode::RobustRejectedPoint,
            format!(
                "Point {} ({:.2} K, {:.4} kPa, deviation {:+.2} %) was rejected by the robust loss (final weight {:.3}); the constants do not rest on it.",
                p.number,
                p.t_k,
                p.p_pa / 1000.0,
                p.rel_dev_pct,
                p.robust_weight.unwrap_or(0.0)
            ),
        ));
    }
    for p in &r.points {
        if p.outlier {
            v.push(Finding::new(
            FitCode::OutlierPoint,
                format!(
                    "Point {n} ({:.2} K, {:.4} kPa) deviates {:+.2} % (externally studentized residual {:.1}); it was kept: the automatic rule only advises (see without_flagged). To leave it out of the fit, rerun with --exclude {n}.",
                    p.t_k,
                    p.p_pa / 1000.0,
                    p.rel_dev_pct,
                    p.ext_studentized,
                    n = p.number
                ),
            ));
        }
    }
    if r.runs_test.systematic {
        v.push(Finding::new(
            FitCode::SystematicResiduals,
            format!(
                "Residual signs form {} runs where about {:.1} are expected; the equation may not follow the data's curvature.",
                r.runs_test.runs, r.runs_test.expected
            ),
        ));
    }
    let k = r.correlation.len();
    let max_r = (0..k)
        .flat_map(|i| (0..i).map(move |j| (i, j)))
        .map(|(i, j)| r.correlation[i][j].abs())
        .fold(0.0, f64::max);
    if max_r > 0.999 {
        v.push(Finding::new(
            FitCode::ParametersHighlyCorrelated,
            format!("Constants are correlated up to |r| = {max_r:.5}; individual constants are not meaningful on their own, predictions still are."),
        ));
    }
    // With --robust, fit quality is judged on the weighted residuals: a point the
    // loss rejected does not make the fit "poor".
    let robust = r.points.iter().any(|p| p.robust_weight.is_some());
    let rms = if robust {
        weighted_rms_pct(&r.points)
    } else {
        r.rms_rel_dev_pct
    };
    let poor = match r.reduced_chi_square {
        Some(c) => r.dof > 0 && c > 1.0 + 3.0 * (2.0 / r.dof as f64).sqrt() + 1.0,
        None => rms > 2.0,
    };
    if poor {
        v.push(Finding::new(
            FitCode::PoorFit,
            match r.reduced_chi_square {
                Some(c) => format!("Reduced chi-square is {c:.1}: the scatter is much larger than the stated uncertainties."),
                None if robust => format!("RMS deviation in pressure, weighted by the robust weights, is {rms:.2} % (over 2 %, common practice)."),
                None => format!("RMS deviation in pressure is {rms:.2} % (over 2 %, common practice)."),
            },
        ));
    }
    if let Equation::Antoine(_) = r.equation {
        let c = r.si_parameters[2];
        let near = r.t_range_k[0] - 0.5 * span.max(20.0);
        if near + c <= 0.0 {
            v.push(Finding::new(
            FitCode::AntoinePoleNearRange,
                format!("Antoine C puts the equation's pole at {:.1} K, inside or near the measured range; the curve is unusable there.", -c),
            ));
        }
    }
    if let (Some((tc, _)), Some(h)) = (opts.critical, &r.hvap) {
        if h.t_k / tc > slope::TR_CLAPEYRON_LIMIT {
            v.push(Finding::new(
            FitCode::HvapNearCritical,
                format!("ΔHvap is taken at Tr = {:.2}, where the ideal-vapor assumption of Clausius–Clapeyron degrades.", h.t_k / tc),
            ));
        }
    }
    v
}
