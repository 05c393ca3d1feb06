//! The report of one fitted equation: parameters with intervals, points with
//! residuals and weights, predictions, the normal boiling point and ΔHvap.

use super::curve::FittedCurve;
use super::equation_fit::{EquationFit, Point, RobustLoss};
use super::fit_findings::*;
use super::options::{At, FitOptions};
use super::report::*;
use super::stats::{external_studentized, runs_test, t_quantile};
use crate::units::tidy;
use crate::units::ATM_PA;
use crate::vapor::{slope, Antoine, AntoineConvention, Curve, Equation, VaporEquation};

/// Constants in the reported convention with their SEs and intervals.
pub(super) fn report_parameters(
    f: &EquationFit,
    se: &[f64],
    t95: f64,
    conv: AntoineConvention,
) -> (Vec<ParameterEstimate>, AntoineConvention) {
    let th = &f.lsq.theta;
    let names = f.eq.param_names();
    let (vals, scale, convention): (Vec<f64>, Vec<f64>, AntoineConvention) = match f.eq {
        Equation::Antoine(_) => {
            // The exact conversion is affine and diagonal in (A, B, C).
            let k = Antoine::constants(th, conv);
            let z = Antoine::constants(&[0.0, 0.0, 0.0], conv);
            let o = Antoine::constants(&[1.0, 1.0, 1.0], conv);
            (
                vec![k.a, k.b, k.c],
                vec![(o.a - z.a).abs(), (o.b - z.b).abs(), (o.c - z.c).abs()],
                conv,
            )
        }
        _ => (th.clone(), vec![1.0; th.len()], AntoineConvention::SI),
    };
    let params = (0..th.len())
        .map(|i| {
            let s = se.get(i).copied().unwrap_or(f64::NAN) * scale[i];
            // 12 significant digits: the conversion to the convention leaves
            // noise in the last places (2420.639999999931).
            ParameterEstimate {
                name: names[i].into(),
                value: tidy(vals[i]),
                std_error: tidy(s),
                ci95_low: tidy(vals[i] - t95 * s),
                ci95_high: tidy(vals[i] + t95 * s),
            }
        })
        .collect();
    (params, convention)
}

pub(super) fn interval_t(curve: &FittedCurve, p_pa: f64) -> Option<Interval> {
    let (t, se) = curve.t_at_with_se(p_pa)?;
    let h = curve.t95() * se;
    let ext = curve.extrapolation_k(t);
    Some(Interval {
        value: t,
        ci95_low: t - h,
        ci95_high: t + h,
        std_error: se,
        extrapolated: ext > 0.0,
        extrapolation_k: ext,
    })
}

pub(super) fn build_report(
    compound: Option<String>,
    points: &[Point],
    f: &EquationFit,
    opts: &FitOptions,
    with_flags: bool,
    (numbers, lines): (&[usize], &[u64]),
) -> FitReport {
    let n = points.len();
    let k = f.eq.n_params();
    let th = &f.lsq.theta;
    let cov = &f.covariance;
    let dof = f.lsq.dof;
    let t95 = t_quantile(0.975, dof);
    let se: Vec<f64> = match cov {
        Some(c) => (0..k).map(|i| c[(i, i)].max(0.0).sqrt()).collect(),
        None => vec![f64::NAN; k],
    };
    let (parameters, convention) = report_parameters(f, &se, t95, opts.convention);
    let covariance_si: Vec<Vec<f64>> = match cov {
        Some(c) => (0..k)
            .map(|i| (0..k).map(|j| c[(i, j)]).collect())
            .collect(),
        None => vec![vec![f64::NAN; k]; k],
    };
    let correlation: Vec<Vec<f64>> = (0..k)
        .map(|i| {
            (0..k)
                .map(|j| covariance_si[i][j] / (se[i] * se[j]))
                .collect()
        })
        .collect();
    let tmin = points.iter().map(|p| p.t_k).fold(f64::INFINITY, f64::min);
    let tmax = points
        .iter()
        .map(|p| p.t_k)
        .fold(f64::NEG_INFINITY, f64::max);
    let curve = FittedCurve {
        equation: f.eq,
        theta: th.clone(),
        covariance: covariance_si.iter().flatten().copied().collect(),
        t_range_k: (tmin, tmax),
        dof,
    };
    let converged = f.lsq.termination.is_success();
    // Point diagnostics. Weighted residuals r_i; s² = RSS/dof.
    let rss = f.lsq.rss;
    let s2 = f.lsq.s2();
    let rw = f.robust_weights.as_deref();
    let bonf = t_quantile(1.0 - 0.025 / n as f64, dof.saturating_sub(1));
    let mut pts = Vec::with_capacity(n);
    let (mut sum_rel2, mut max_rel, mut sum_dt2, mut max_dt) = (0.0, 0.0f64, 0.0, 0.0f64);
    for (i, p) in points.iter().enumerate() {
        let calc = curve.p_pa(p.t_k);
        let rel = 100.0 * (p.p_pa - calc) / calc;
        let t_fit = curve.t_at(p.p_pa).unwrap_or(f64::NAN);
        let dt = p.t_k - t_fit;
        sum_rel2 += rel * rel;
        max_rel = max_rel.max(rel.abs());
        sum_dt2 += dt * dt;
        max_dt = max_dt.max(dt.abs());
        let r = f.lsq.residuals[i];
        let h = f.lsq.leverage[i];
        let stud = r / (s2 * (1.0 - h)).sqrt();
        let ext = external_studentized(r, h, rss, dof);
        let cook = r * r * h / (k as f64 * s2 * (1.0 - h).powi(2));
        pts.push(PointReport {
            number: numbers.get(i).copied().unwrap_or(i + 1),
            line: lines.get(i).copied().filter(|&l| l > 0),
            t_k: p.t_k,
            p_pa: p.p_pa,
            rel_dev_pct: rel,
            t_dev_k: dt,
            studentized: stud,
            ext_studentized: ext,
            leverage: h,
            cooks_distance: cook,
            outlier: converged && ext.abs() > bonf,
            robust_weight: rw.map(|w| w[i]),
            robust_rejected: rw.is_some_and(|w| w[i] < ROBUST_REJECTED_BELOW),
        });
    }
    let runs = runs_test(&residuals_by_temperature(points, &f.lsq.residuals));
    let nbp = if converged {
        interval_t(&curve, ATM_PA)
    } else {
        None
    };
    let mut predictions = Vec::new();
    if converged {
        for at in &opts.at {
            match *at {
                At::PressurePa(p) => {
                    if let Some(iv) = interval_t(&curve, p) {
                        predictions.push(Prediction {
                            kind: PredictionKind::TAtP,
                            p_pa: p,
                            t_k: iv.value,
                            ci95_low: iv.ci95_low,
                            ci95_high: iv.ci95_high,
                            extrapolated: iv.extrapolated,
                            extrapolation_k: iv.extrapolation_k,
                        });
                    }
                }
                At::TemperatureK(t) => {
                    let (lp, se) = curve.ln_p_with_se(t);
                    let ext = curve.extrapolation_k(t);
                    predictions.push(Prediction {
                        kind: PredictionKind::PAtT,
                        p_pa: lp.exp(),
                        t_k: t,
                        ci95_low: (lp - t95 * se).exp(),
                        ci95_high: (lp + t95 * se).exp(),
                        extrapolated: ext > 0.0,
                        extrapolation_k: ext,
                    });
                }
            }
        }
    }
    let t_mean = points.iter().map(|p| p.t_k).sum::<f64>() / n as f64;
    let hvap = converged.then(|| hvap_at(&curve, t_mean, t95));
    let weighting = match (opts.robust, f.weighted) {
        (Some(RobustLoss::Huber), _) => "huber",
        (Some(RobustLoss::Tukey), _) => "tukey",
        (None, true) => "effective-variance",
        _ => "unweighted",
    };
    let mut r = FitReport {
        compound,
        model: f.eq.model(),
        parameters,
        convention,
        n_points: n,
        rms_rel_dev_pct: (sum_rel2 / n as f64).sqrt(),
        max_rel_dev_pct: max_rel,
        rms_dev_t_k: (sum_dt2 / n as f64).sqrt(),
        max_dev_t_k: max_dt,
        normal_boiling_point_k: nbp,
        t_range_k: [tmin, tmax],
        points: pts,
        flags: Vec::new(),
        equation: f.eq,
        si_parameters: th.clone(),
        covariance_si,
        correlation,
        dof,
        weighting: weighting.into(),
        reduced_chi_square: f.weighted.then_some(s2),
        residual_sd_ln_p: if f.weighted { f64::NAN } else { s2.sqrt() },
        runs_test: runs,
        termination: f.lsq.termination.clone(),
        predictions,
        hvap,
        model_choice: None,
        without_flagged: None,
        excluded: Vec::new(),
        reference_comparison: None,
    };
    if with_flags {
        r.flags = findings(&r, &curve, opts);
    }
    r
}

/// A robust weight below this means the loss rejected the point.
const ROBUST_REJECTED_BELOW: f64 = 1e-3;

/// RMS relative deviation in p, %, each point weighted by its robust weight
/// (all 1 without `--robust`): the fit quality the robust fit itself claims.
pub(super) fn weighted_rms_pct(points: &[PointReport]) -> f64 {
    let (mut sw, mut s) = (0.0, 0.0);
    for p in points {
        let w = p.robust_weight.unwrap_or(1.0);
        sw += w;
        s += w * p.rel_dev_pct * p.rel_dev_pct;
    }
    if sw > 0.0 {
        (s / sw).sqrt()
    } else {
        f64::NAN
    }
}

/// Two temperatures closer than this (relative) are the same setting.
pub(super) const SAME_T_REL: f64 = 1e-9;

/// Residuals ordered by temperature, one per distinct temperature (replicates
/// averaged), for the runs test: the order among replicates is arbitrary, and
/// a repeated point would otherwise make a run of its own.
pub(super) fn residuals_by_temperature(points: &[Point], residuals: &[f64]) -> Vec<f64> {
    let mut order: Vec<usize> = (0..points.len()).collect();
    order.sort_by(|a, b| points[*a].t_k.total_cmp(&points[*b].t_k));
    let mut out = Vec::with_capacity(order.len());
    let (mut sum, mut count, mut t_group) = (0.0, 0usize, f64::NAN);
    for &i in &order {
        let t = points[i].t_k;
        if count > 0 && (t - t_group).abs() > SAME_T_REL * t_group.abs() {
            out.push(sum / count as f64);
            (sum, count) = (0.0, 0);
        }
        if count == 0 {
            t_group = t;
        }
        sum += residuals[i];
        count += 1;
    }
    if count > 0 {
        out.push(sum / count as f64);
    }
    out
}

/// Points that repeat an earlier point exactly (same T and p).
pub(super) fn exact_repeats(points: &[PointReport]) -> usize {
    let mut tp: Vec<(f64, f64)> = points.iter().map(|p| (p.t_k, p.p_pa)).collect();
    tp.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.1.total_cmp(&b.1)));
    tp.windows(2).filter(|w| w[0] == w[1]).count()
}

pub(super) fn hvap_at(curve: &FittedCurve, t: f64, t95: f64) -> HvapEstimate {
    let h = slope::hvap_j_mol(curve, t);
    // Delta method on the slope: gradient of d ln p/dT by central differences in θ.
    let n = curve.theta.len();
    let mut g = vec![0.0; n];
    let mut th = curve.theta.clone();
    for i in 0..n {
        let step = 1e-6 * th[i].abs().max(1e-12);
        th[i] = curve.theta[i] + step;
        let up = curve.equation.d_ln_p_dt(&th, t);
        th[i] = curve.theta[i] - step;
        let dn = curve.equation.d_ln_p_dt(&th, t);
        th[i] = curve.theta[i];
        g[i] = slope::R_J_MOL_K * t * t * (up - dn) / (2.0 * step);
    }
    let mut var = 0.0;
    for a in 0..n {
        for b in 0..n {
            var += g[a] * curve.covariance.get(a * n + b).copied().unwrap_or(f64::NAN) * g[b];
        }
    }
    let u = var.max(0.0).sqrt();
    HvapEstimate {
        t_k: t,
        value_kj_mol: h / 1000.0,
        ci95_low: (h - t95 * u) / 1000.0,
        ci95_high: (h + t95 * u) / 1000.0,
        note: "Clausius–Clapeyron slope: assumes an ideal vapor and negligible liquid volume"
            .into(),
    }
}
