//! Antoine constants into another equation form (Clausius–Clapeyron, Riedel, Wagner) by refitting.
//!
//! No exact transformation exists between equation forms, so the Antoine
//! curve is sampled at 60 temperatures evenly spread over the validity range,
//! the target equation is fitted to those points by the fitter
//! ([`crate::fit::vapor_fit::fit_points`], least squares in ln p), and the
//! largest relative deviation in p between the two curves over 241
//! temperatures in the range is reported: the error the conversion introduced.

use crate::fit::equation_fit::Point;
use crate::fit::options::{FitOptions, ModelSelection};
use crate::fit::report::FitReport;
use crate::fit::vapor_fit::fit_points;
use crate::fit::FittedCurve;
use crate::vapor::{AntoineConstants, Curve};

/// The outcome of a refit.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Refit {
    /// Target equation name.
    pub model: String,
    /// Parameters as the fitter reports them (name, value).
    pub parameters: Vec<(String, f64)>,
    /// Convention of the parameters.
    pub convention: String,
    /// Range used, K.
    pub range_k: (f64, f64),
    /// Largest |p_new/p_antoine − 1| over the range, percent.
    pub max_rel_dev_pct: f64,
    /// The full fit report (for `boil --from`).
    #[serde(skip)]
    pub report: Box<FitReport>,
}

/// Why a refit failed.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RefitError {
    /// No validity range: nothing to refit over.
    #[error("the constants carry no validity range to refit over")]
    NoRange,
    /// The Antoine curve is undefined somewhere in the range.
    #[error("the Antoine equation is undefined at {0:.2} K inside the range (t + C <= 0)")]
    Undefined(f64),
    /// The fitter failed.
    #[error("refit failed: {0}")]
    Fit(String),
}

/// Refit `k` over its validity range as `model`.
///
/// ```
/// use ebullio::fit::options::ModelSelection;
/// use ebullio::vapor::AntoineConstants;
/// // Benzene, Smith, Van Ness & Abbott App. B Table B.2, 6-104 degC.
/// let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap())
///     .with_range_k(279.15, 377.15);
/// let r = ebullio::refit::refit(&bz, ModelSelection::Riedel, None).unwrap();
/// assert!(r.max_rel_dev_pct < 0.5);
/// ```
pub fn refit(
    k: &AntoineConstants,
    model: ModelSelection,
    critical: Option<(f64, f64)>,
) -> Result<Refit, RefitError> {
    let (lo, hi) = k.range_k.ok_or(RefitError::NoRange)?;
    let pts: Vec<Point> = (0..60)
        .map(|i| {
            let t = lo + (hi - lo) * i as f64 / 59.0;
            Point {
                t_k: t,
                p_pa: k.p_pa(t),
                u_t_k: None,
                u_p_pa: None,
            }
        })
        .collect();
    if let Some(p) = pts.iter().find(|p| !(p.p_pa.is_finite() && p.p_pa > 0.0)) {
        return Err(RefitError::Undefined(p.t_k));
    }
    let opts = FitOptions {
        model,
        critical,
        refit_without_outliers: false,
        ..FitOptions::default()
    };
    let report = fit_points(None, &pts, &opts).map_err(|e| RefitError::Fit(e.to_string()))?;
    let curve = FittedCurve::from_report(&report);
    let max = (0..=240)
        .map(|i| {
            let t = lo + (hi - lo) * i as f64 / 240.0;
            ((curve.ln_p(t) - k.ln_p(t)).exp() - 1.0).abs()
        })
        .fold(0.0f64, f64::max);
    Ok(Refit {
        model: report.model.to_string(),
        parameters: report
            .parameters
            .iter()
            .map(|p| (p.name.clone(), p.value))
            .collect(),
        convention: report.convention.to_string(),
        range_k: (lo, hi),
        max_rel_dev_pct: 100.0 * max,
        report: Box::new(report),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    // Smith, Van Ness & Abbott B.2 acetone (-26..77 degC): Clausius-Clapeyron (two constants)
    // cannot follow the curvature as well as Riedel, and both deviations are reported.
    #[test]
    fn svna_acetone_refit_deviation_ranks_models() {
        let k = AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,kPa,degC".parse().unwrap())
            .with_range_k(247.15, 350.15);
        let cc = refit(&k, ModelSelection::Clapeyron, None).unwrap();
        let rd = refit(&k, ModelSelection::Riedel, None).unwrap();
        assert!(
            cc.max_rel_dev_pct > rd.max_rel_dev_pct,
            "{} vs {}",
            cc.max_rel_dev_pct,
            rd.max_rel_dev_pct
        );
        assert!(cc.max_rel_dev_pct > 0.5 && rd.max_rel_dev_pct < 0.5);
        // An Antoine refit of an Antoine curve reproduces it.
        let an = refit(&k, ModelSelection::Antoine, None).unwrap();
        assert!(an.max_rel_dev_pct < 1e-6, "{}", an.max_rel_dev_pct);
        assert_eq!(
            refit(
                &AntoineConstants { range_k: None, ..k },
                ModelSelection::Riedel,
                None
            ),
            Err(RefitError::NoRange)
        );
    }
}
