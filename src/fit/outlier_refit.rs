//! The advisory refit without the flagged points (never replaces the fit).

use super::build::*;
use super::equation_fit::{fit_equation, EquationFit, Point};
use super::findings::{Finding, FitCode};
use super::options::FitOptions;
use super::report::*;
use crate::vapor::VaporEquation;

/// Refit without the flagged points and attach the result (never deleting them).
pub(super) fn outlier_refit(
    r: &mut FitReport,
    points: &[Point],
    f: &EquationFit,
    opts: &FitOptions,
) {
    if !opts.refit_without_outliers {
        return;
    }
    let excluded: Vec<usize> = (0..points.len()).filter(|&i| r.points[i].outlier).collect();
    if excluded.is_empty() {
        return;
    }
    let kept: Vec<Point> = (0..points.len())
        .filter(|i| !excluded.contains(i))
        .map(|i| points[i])
        .collect();
    if kept.len() < f.eq.n_params() + 2 {
        return;
    }
    let Some(g) = fit_equation(&f.eq, &kept, opts.robust) else {
        return;
    };
    let sub = build_report(None, &kept, &g, opts, false, (&[], &[]));
    if let (Some(a), Some(b)) = (&r.normal_boiling_point_k, &sub.normal_boiling_point_k) {
        r.flags.push(Finding::new(
            FitCode::WithoutFlaggedPoints,
            format!(
                "Without the {} flagged point(s) the normal boiling point would be {:.2} K instead of {:.2} K and the RMS deviation {:.3} % instead of {:.3} %.",
                excluded.len(),
                b.value,
                a.value,
                sub.rms_rel_dev_pct,
                r.rms_rel_dev_pct
            ),
        ));
    }
    r.without_flagged = Some(WithoutFlagged {
        excluded,
        parameters: sub.parameters,
        normal_boiling_point_k: sub.normal_boiling_point_k,
        rms_rel_dev_pct: sub.rms_rel_dev_pct,
    });
}
