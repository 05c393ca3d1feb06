//! Fit measured (T, p) points and report: statistics, diagnostics, predictions, findings.
//!
//! Outlier rule: a point is flagged when its externally studentized residual
//! exceeds the Bonferroni-corrected Student t quantile t(1 − 0.025/n, n − k − 1).
//! Model choice: AICc = n·ln(RSS/n) + 2k + 2k(k+1)/(n − k − 1).
//!
//! Reference: AICc — C. M. Hurvich & C.-L. Tsai, *Biometrika* 76, 297–307
//! (1989); Bonferroni outlier test — R. D. Cook & S. Weisberg, *Residuals and
//! Influence in Regression* (1982), section 2.2.

use super::curve::FittedCurve;
use super::equation_fit::{fit_equation, EquationFit, Point, RobustLoss};
use super::findings::{Finding, FitCode};
use super::options::{At, Exclude, FitOptions, ModelSelection};
use super::report::*;
use super::stats::{external_studentized, runs_test, t_quantile};
use crate::units::tidy;
use crate::units::ATM_PA;
use crate::vapor::{slope, Antoine, AntoineConvention, Curve, Equation, VaporEquation};
use crate::vapor::{Clapeyron, Riedel, Wagner};

/// Why a fit could not be made at all.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum FitError {
    /// Fewer points than the equation's constants + 2.
    #[error("too-few-points: {n} points cannot support the {model} equation ({k} constants needs at least {need})")]
    TooFewPoints {
        /// Points given.
        n: usize,
        /// Constants.
        k: usize,
        /// Points needed.
        need: usize,
        /// Equation.
        model: String,
    },
    /// An `--exclude` rule that names no point.
    #[error("exclude: --exclude {what} names no point: {why}")]
    Exclude {
        /// The rule as given.
        what: String,
        /// Why it matches nothing.
        why: String,
    },
    /// Too few distinct temperatures.
    #[error("too-few-temperatures: only {distinct} distinct temperature(s) among {n} points; a vapor-pressure curve needs at least {need}")]
    TooFewTemperatures {
        /// Distinct temperatures.
        distinct: usize,
        /// Points.
        n: usize,
        /// Needed.
        need: usize,
    },
    /// A point is not a physical (T, p) pair.
    #[error(
        "invalid-point: point {}{} has T = {t_k} K, p = {p_pa} Pa; both must be finite and positive{}",
        index + 1,
        line_note(*line),
        gauge_hint(*p_pa)
    )]
    InvalidPoint {
        /// 0-based index (the message counts from 1).
        index: usize,
        /// Source line (0 if unknown).
        line: u64,
        /// T.
        t_k: f64,
        /// p.
        p_pa: f64,
    },
    /// A given uncertainty is zero, negative or not finite.
    #[error("invalid-uncertainty: point {index} (line {line}) has a zero, negative or non-finite uncertainty")]
    InvalidUncertainty {
        /// 0-based index.
        index: usize,
        /// Source line.
        line: u64,
    },
    /// Wagner without Tc, pc, or data at or above Tc.
    #[error("wagner-needs-critical: {0}")]
    Critical(String),
    /// The start values could not be formed (degenerate data).
    #[error("no-start: the data are degenerate for the {0} equation (no start values)")]
    NoStart(String),
}

fn line_note(line: u64) -> String {
    if line > 0 {
        format!(" (line {line})")
    } else {
        String::new()
    }
}

fn gauge_hint(p_pa: f64) -> &'static str {
    if p_pa < 0.0 {
        " (a negative pressure looks like a gauge reading; vapor pressure must be absolute: add the atmospheric pressure at the time of measurement)"
    } else {
        ""
    }
}

fn equation_for(sel: ModelSelection, opts: &FitOptions) -> Result<Equation, FitError> {
    Ok(match sel {
        ModelSelection::Antoine | ModelSelection::Auto => Equation::Antoine(Antoine),
        ModelSelection::Clapeyron => Equation::Clapeyron(Clapeyron),
        ModelSelection::Riedel => Equation::Riedel(Riedel),
        ModelSelection::Wagner => {
            let (tc_k, pc_pa) = opts.critical.ok_or_else(|| {
                FitError::Critical("the Wagner equation needs the critical temperature and pressure (fit: --tc and --pc; convert: --critical)".into())
            })?;
            if !(tc_k > 0.0 && pc_pa > 0.0 && tc_k.is_finite() && pc_pa.is_finite()) {
                return Err(FitError::Critical(format!(
                    "Tc = {tc_k} K and pc = {pc_pa} Pa must be positive"
                )));
            }
            Equation::Wagner(Wagner { tc_k, pc_pa })
        }
    })
}

fn validate(points: &[Point], lines: &[u64], k: usize, model: &str) -> Result<(), FitError> {
    for (i, p) in points.iter().enumerate() {
        let line = lines.get(i).copied().unwrap_or(0);
        if !(p.t_k.is_finite() && p.t_k > 0.0 && p.p_pa.is_finite() && p.p_pa > 0.0) {
            return Err(FitError::InvalidPoint {
                index: i,
                line,
                t_k: p.t_k,
                p_pa: p.p_pa,
            });
        }
        let bad = |u: Option<f64>| u.is_some_and(|u| !(u.is_finite() && u >= 0.0));
        let both_zero = p.u_t_k.unwrap_or(0.0) == 0.0 && p.u_p_pa.unwrap_or(0.0) == 0.0;
        if bad(p.u_t_k) || bad(p.u_p_pa) || ((p.u_t_k.is_some() || p.u_p_pa.is_some()) && both_zero)
        {
            return Err(FitError::InvalidUncertainty { index: i, line });
        }
    }
    let n = points.len();
    if n < k + 2 {
        return Err(FitError::TooFewPoints {
            n,
            k,
            need: k + 2,
            model: model.to_string(),
        });
    }
    let mut ts: Vec<f64> = points.iter().map(|p| p.t_k).collect();
    ts.sort_by(f64::total_cmp);
    ts.dedup_by(|a, b| (*a - *b).abs() <= SAME_T_REL * b.abs());
    if ts.len() < k {
        return Err(FitError::TooFewTemperatures {
            distinct: ts.len(),
            n,
            need: k,
        });
    }
    Ok(())
}

/// Fit points in SI.
pub fn fit_points(
    compound: Option<String>,
    points: &[Point],
    opts: &FitOptions,
) -> Result<FitReport, FitError> {
    fit_points_with_lines(compound, points, &[], opts)
}

/// Fit points in SI whose source lines are known (`lines[i]` is the file line of
/// `points[i]`; empty when there are none), so that errors and findings can name them.
pub fn fit_points_with_lines(
    compound: Option<String>,
    points: &[Point],
    lines: &[u64],
    opts: &FitOptions,
) -> Result<FitReport, FitError> {
    if opts.exclude.is_empty() {
        let numbers: Vec<usize> = (1..=points.len()).collect();
        return fit_kept(compound, points, lines, &numbers, opts);
    }
    let left_out = excluded_indices(points, lines, &opts.exclude)?;
    let keep: Vec<usize> = (0..points.len())
        .filter(|i| !left_out.iter().any(|(j, _)| j == i))
        .collect();
    let kept: Vec<Point> = keep.iter().map(|&i| points[i]).collect();
    let kept_lines: Vec<u64> = keep.iter().filter_map(|&i| lines.get(i).copied()).collect();
    let numbers: Vec<usize> = keep.iter().map(|&i| i + 1).collect();
    let mut r = fit_kept(compound, &kept, &kept_lines, &numbers, opts)?;
    r.excluded = left_out
        .iter()
        .map(|&(i, by)| ExcludedPoint {
            number: i + 1,
            line: lines.get(i).copied().filter(|&l| l > 0),
            t_k: points[i].t_k,
            p_pa: points[i].p_pa,
            by: format!("user: --exclude {by}"),
        })
        .collect();
    let list: Vec<String> = r
        .excluded
        .iter()
        .map(|e| match e.line {
            Some(l) => format!("point {} (line {l})", e.number),
            None => format!("point {}", e.number),
        })
        .collect();
    r.flags.insert(
        0,
        Finding::new(
            FitCode::ExcludedPoints,
            format!(
                "Excluded by the user (--exclude): {}. The constants, intervals and predictions are from the remaining {} points; boil --from and plan --from use exactly this fit.",
                list.join(", "),
                kept.len()
            ),
        ),
    );
    Ok(r)
}

/// Temperatures closer than this are "the same" for `--exclude "80 degC"`, K.
const EXCLUDE_T_TOL_K: f64 = 0.005;

/// The 0-based indices `exclude` names, each with the rule that named it;
/// a rule that names no point is an error (a typo must not pass silently).
fn excluded_indices(
    points: &[Point],
    lines: &[u64],
    exclude: &[Exclude],
) -> Result<Vec<(usize, Exclude)>, FitError> {
    let mut out: Vec<(usize, Exclude)> = Vec::new();
    for &e in exclude {
        let hits: Vec<usize> = match e {
            Exclude::Point(n) => (n >= 1 && n <= points.len())
                .then_some(n - 1)
                .into_iter()
                .collect(),
            Exclude::Line(l) => (0..points.len())
                .filter(|&i| lines.get(i) == Some(&l))
                .collect(),
            Exclude::TemperatureK(t) => (0..points.len())
                .filter(|&i| (points[i].t_k - t).abs() <= EXCLUDE_T_TOL_K)
                .collect(),
        };
        if hits.is_empty() {
            let why = match e {
                Exclude::Point(_) => format!("the data have points 1 to {}", points.len()),
                Exclude::Line(_) if lines.is_empty() => "the points carry no line numbers".into(),
                Exclude::Line(_) => format!(
                    "no point is on that line (the points are on lines {} to {})",
                    lines.iter().min().unwrap_or(&0),
                    lines.iter().max().unwrap_or(&0)
                ),
                Exclude::TemperatureK(t) => {
                    let near = (0..points.len())
                        .min_by(|&a, &b| {
                            (points[a].t_k - t)
                                .abs()
                                .total_cmp(&(points[b].t_k - t).abs())
                        })
                        .map(|i| {
                            format!(
                                "; the nearest is point {} at {} K",
                                i + 1,
                                tidy(points[i].t_k)
                            )
                        })
                        .unwrap_or_default();
                    format!("no point within {EXCLUDE_T_TOL_K} K of it{near}")
                }
            };
            return Err(FitError::Exclude {
                what: e.to_string(),
                why,
            });
        }
        for i in hits {
            if !out.iter().any(|(j, _)| *j == i) {
                out.push((i, e));
            }
        }
    }
    out.sort_by_key(|(i, _)| *i);
    Ok(out)
}

fn fit_kept(
    compound: Option<String>,
    points: &[Point],
    lines: &[u64],
    numbers: &[usize],
    opts: &FitOptions,
) -> Result<FitReport, FitError> {
    if opts.model != ModelSelection::Auto {
        let eq = equation_for(opts.model, opts)?;
        validate(points, lines, eq.n_params(), eq.name())?;
        check_critical(&eq, points)?;
        let f =
            fit_equation(&eq, points, opts.robust).ok_or(FitError::NoStart(eq.name().into()))?;
        let mut r = build_report(compound, points, &f, opts, true, (numbers, lines));
        outlier_refit(&mut r, points, &f, opts);
        return Ok(r);
    }
    // Auto: every equation the data can support, compared by AICc.
    let mut sels = vec![
        ModelSelection::Clapeyron,
        ModelSelection::Antoine,
        ModelSelection::Riedel,
    ];
    if opts.critical.is_some() {
        sels.push(ModelSelection::Wagner);
    }
    let n = points.len();
    let mut candidates = Vec::new();
    let mut best: Option<(f64, EquationFit)> = None;
    let mut first_err = None;
    for sel in sels {
        let eq = equation_for(sel, opts)?;
        let k = eq.n_params();
        let skip = |why: String| Candidate {
            model: eq.model(),
            n_params: k,
            aicc: None,
            skipped: Some(why),
        };
        if let Err(e) =
            validate(points, lines, k, eq.name()).and_then(|_| check_critical(&eq, points))
        {
            candidates.push(skip(e.to_string()));
            first_err.get_or_insert(e);
            continue;
        }
        if n < k + 3 {
            candidates.push(skip(format!("AICc needs more than {} points", k + 2)));
            continue;
        }
        let Some(f) = fit_equation(&eq, points, opts.robust) else {
            candidates.push(skip("no start values".into()));
            continue;
        };
        if !f.lsq.termination.is_success() {
            candidates.push(skip(format!(
                "did not converge ({})",
                f.lsq.termination.reason
            )));
            continue;
        }
        let rss = f.lsq.rss.max(1e-300);
        let nf = n as f64;
        let kf = k as f64;
        let aicc = nf * (rss / nf).ln() + 2.0 * kf + 2.0 * kf * (kf + 1.0) / (nf - kf - 1.0);
        candidates.push(Candidate {
            model: eq.model(),
            n_params: k,
            aicc: Some(aicc),
            skipped: None,
        });
        if best.as_ref().is_none_or(|(b, _)| aicc < *b) {
            best = Some((aicc, f));
        }
    }
    let Some((aicc, f)) = best else {
        return Err(first_err.unwrap_or(FitError::NoStart("any".into())));
    };
    let mut others: Vec<String> = candidates
        .iter()
        .filter(|c| c.model != f.eq.model())
        .filter_map(|c| c.aicc.map(|a| format!("{} {:+.1}", c.model, a - aicc)))
        .collect();
    if others.is_empty() {
        others.push("no other equation could be compared".into());
    }
    let reason = format!(
        "{} has the lowest AICc ({:.1}) on {} points; difference of the others: {}.",
        f.eq.name(),
        aicc,
        n,
        others.join(", ")
    );
    let mut r = build_report(compound, points, &f, opts, true, (numbers, lines));
    r.flags
        .push(Finding::new(FitCode::ModelChoice, reason.clone()));
    r.model_choice = Some(ModelChoice { candidates, reason });
    outlier_refit(&mut r, points, &f, opts);
    Ok(r)
}

fn check_critical(eq: &Equation, points: &[Point]) -> Result<(), FitError> {
    if let Equation::Wagner(w) = eq {
        if let Some(p) = points.iter().find(|p| p.t_k >= w.tc_k) {
            return Err(FitError::Critical(format!(
                "a point at {} K is at or above Tc = {} K",
                p.t_k, w.tc_k
            )));
        }
    }
    Ok(())
}

/// Constants in the reported convention with their SEs and intervals.
fn report_parameters(
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

fn interval_t(curve: &FittedCurve, p_pa: f64) -> Option<Interval> {
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

fn build_report(
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
fn weighted_rms_pct(points: &[PointReport]) -> f64 {
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
const SAME_T_REL: f64 = 1e-9;

/// Residuals ordered by temperature, one per distinct temperature (replicates
/// averaged), for the runs test: the order among replicates is arbitrary, and
/// a repeated point would otherwise make a run of its own.
fn residuals_by_temperature(points: &[Point], residuals: &[f64]) -> Vec<f64> {
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
fn exact_repeats(points: &[PointReport]) -> usize {
    let mut tp: Vec<(f64, f64)> = points.iter().map(|p| (p.t_k, p.p_pa)).collect();
    tp.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.1.total_cmp(&b.1)));
    tp.windows(2).filter(|w| w[0] == w[1]).count()
}

fn hvap_at(curve: &FittedCurve, t: f64, t95: f64) -> HvapEstimate {
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

fn findings(r: &FitReport, curve: &FittedCurve, opts: &FitOptions) -> Vec<Finding> {
    let mut v = Vec::new();
    if !r.termination.is_success() {
        v.push(Finding::new(
            FitCode::NotConverged,
            format!(
                "The fit did not converge ({}); the constants are the solver's last point, not a solution.",
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

/// Refit without the flagged points and attach the result (never deleting them).
fn outlier_refit(r: &mut FitReport, points: &[Point], f: &EquationFit, opts: &FitOptions) {
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

#[cfg(test)]
mod tests {
    use super::*;

    fn synthetic(n: usize, bump: Option<(usize, f64)>) -> Vec<Point> {
        // Invented Harrow Vale intermediate: ln(p/Pa) = 22.0 − 3500/(T − 45).
        (0..n)
            .map(|i| {
                let t = 310.0 + 6.0 * i as f64;
                // deterministic small wiggle standing in for noise (±0.2 %)
                let e = 0.002 * ((i as f64) * 2.3).sin();
                let b = bump.filter(|b| b.0 == i).map_or(0.0, |b| b.1);
                Point {
                    t_k: t,
                    p_pa: (22.0 - 3500.0 / (t - 45.0) + e + b).exp(),
                    u_t_k: None,
                    u_p_pa: None,
                }
            })
            .collect()
    }

    #[test]
    fn too_few_points_is_refused_with_numbers() {
        let e = fit_points(None, &synthetic(4, None), &FitOptions::default()).unwrap_err();
        assert!(
            matches!(
                e,
                FitError::TooFewPoints {
                    n: 4,
                    k: 3,
                    need: 5,
                    ..
                }
            ),
            "{e}"
        );
        assert!(e.to_string().starts_with("too-few-points"));
    }

    #[test]
    fn gross_outlier_is_flagged_and_refit_without_it() {
        let r = fit_points(
            None,
            &synthetic(12, Some((5, 0.08))),
            &FitOptions::default(),
        )
        .unwrap();
        let flagged: Vec<usize> = (0..12).filter(|&i| r.points[i].outlier).collect();
        assert_eq!(flagged, vec![5]);
        let w = r.without_flagged.as_ref().unwrap();
        assert_eq!(w.excluded, vec![5]);
        assert!(w.rms_rel_dev_pct < r.rms_rel_dev_pct);
        assert!(r.flags.iter().any(|f| f.code == "outlier-point"));
    }

    #[test]
    fn robust_fit_downweights_the_outlier() {
        let opts = FitOptions {
            robust: Some(RobustLoss::Huber),
            ..FitOptions::default()
        };
        let r = fit_points(None, &synthetic(12, Some((5, 0.08))), &opts).unwrap();
        // Huber bounds the outlier's influence; Tukey's biweight removes it.
        assert!(r.points[5].robust_weight.unwrap() < 0.5);
        assert_eq!(r.weighting, "huber");
        let opts = FitOptions {
            robust: Some(RobustLoss::Tukey),
            ..FitOptions::default()
        };
        let r = fit_points(None, &synthetic(12, Some((5, 0.08))), &opts).unwrap();
        assert!(r.points[5].robust_weight.unwrap() < 1e-6);
        assert!(r
            .points
            .iter()
            .enumerate()
            .all(|(i, p)| i == 5 || p.robust_weight.unwrap() > 0.5));
        assert!(r.rms_rel_dev_pct > 0.0);
    }

    #[test]
    fn report_round_trips_and_rebuilds_the_curve() {
        let r = fit_points(None, &synthetic(10, None), &FitOptions::default()).unwrap();
        let json = serde_json::to_string(&r).unwrap();
        let back: FitReport =
            serde_json::from_str(&json.replace("NaN", "null")).expect("the report reads back");
        let c = FittedCurve::from_report(&back);
        let tb = r.normal_boiling_point_k.as_ref().unwrap();
        assert!((c.t_at(ATM_PA).unwrap() - tb.value).abs() < 1e-9);
        let u = c.t_uncertainty_k(ATM_PA).unwrap();
        assert!((u - tb.std_error).abs() < 1e-12);
    }

    #[test]
    fn auto_reports_its_reason() {
        let r = fit_points(
            None,
            &synthetic(12, None),
            &FitOptions {
                model: ModelSelection::Auto,
                ..FitOptions::default()
            },
        )
        .unwrap();
        let mc = r.model_choice.unwrap();
        assert_eq!(mc.candidates.len(), 3);
        assert!(mc.reason.contains("lowest AICc"));
    }

    #[test]
    fn weighted_fit_reports_reduced_chi_square() {
        let mut p = synthetic(10, None);
        for q in &mut p {
            q.u_t_k = Some(0.05);
            q.u_p_pa = Some(0.002 * q.p_pa);
        }
        let r = fit_points(None, &p, &FitOptions::default()).unwrap();
        assert_eq!(r.weighting, "effective-variance");
        // NaN fields (residual SD of an unweighted fit) survive JSON as null
        let back: FitReport = serde_json::from_str(&serde_json::to_string(&r).unwrap()).unwrap();
        assert!(back.residual_sd_ln_p.is_nan());
        assert!(r.reduced_chi_square.unwrap() > 0.0);
    }

    // With scatter drawn at exactly the stated uncertainties, reduced chi-square
    // follows χ²(ν)/ν with mean 1 (ν = n − 3): over 400 seeded sets of 10 points
    // the mean must be 1 within 0.1 (its standard error is √(2/7)/20 = 0.027).
    // Stated uncertainties that were mis-weighted (u(T) term dropped, u² for u,
    // wrong dof) move it well outside.
    #[test]
    fn reduced_chi_square_averages_one_when_scatter_matches_the_stated_uncertainties() {
        let mut state = 20261205u64;
        let mut uniform = move || {
            state = state.wrapping_add(0x9E37_79B9_7F4A_7C15);
            let mut z = state;
            z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
            z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
            ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64
        };
        let mut normal = move || {
            let u = uniform().max(1e-300);
            (-2.0 * u.ln()).sqrt() * (2.0 * std::f64::consts::PI * uniform()).cos()
        };
        let (u_t, u_rel_p) = (0.05, 0.002);
        let (sets, mut sum) = (400, 0.0);
        for _ in 0..sets {
            let pts: Vec<Point> = (0..10)
                .map(|i| {
                    let t_true = 310.0 + 6.0 * i as f64;
                    let t = t_true + u_t * normal();
                    let ln_p = 22.0 - 3500.0 / (t_true - 45.0) + u_rel_p * normal();
                    Point {
                        t_k: t,
                        p_pa: ln_p.exp(),
                        u_t_k: Some(u_t),
                        u_p_pa: Some(u_rel_p * ln_p.exp()),
                    }
                })
                .collect();
            let r = fit_points(None, &pts, &FitOptions::default()).unwrap();
            sum += r.reduced_chi_square.unwrap();
        }
        let mean = sum / sets as f64;
        eprintln!("mean reduced chi-square over {sets} sets: {mean:.3}");
        assert!((mean - 1.0).abs() < 0.1, "{mean}");
    }
}
