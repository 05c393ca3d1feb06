//! The binary fit from data to report: model choice by AICc, statistics, outliers,
//! derived quantities, consistency tests and findings.
//!
//! Outlier rule (as for vapor pressures): an observation is flagged when its
//! externally studentized residual exceeds the Bonferroni-corrected Student t
//! quantile t(1 − 0.025/n, n − k − 1); flagged points are kept (advice only).
//!
//! Reference: R. D. Cook, S. Weisberg, *Residuals and Influence in Regression*
//! (1982), Sec. 2.2; AICc — C. M. Hurvich, C.-L. Tsai, Biometrika 76 (1989) 297–307.

use super::area::{herington, redlich_kister};
use super::data::{BinaryData, DataError, DataKind};
use super::derived::{
    condition, delta, fitted_azeotropes, gamma_inf_temperatures, ln_gamma_inf, split_check,
};
use super::model::{FitModel, NRTL_ALPHA_DEFAULT};
use super::point_test::point_test;
use super::problem::{Obs, Uncertainties, VleProblem};
use super::report::*;
use super::solve::{fit_model, ModelFit};
use crate::finding::{BinaryFitCode, Finding, FitCode, MixtureCode};
use crate::fit::report::ParameterEstimate;
use crate::fit::stats::{external_studentized, t_quantile};
use crate::mixture::Condition;
use crate::vapor::Curve;

/// Which model to fit.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum BinaryModelSelection {
    /// Every model the data support, the lowest AICc wins.
    Auto,
    /// One model.
    Fixed(FitModel),
}

/// Options of a binary fit.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BinaryFitOptions {
    /// Model choice.
    pub model: BinaryModelSelection,
    /// Standard uncertainties (the weights).
    pub u: Uncertainties,
}

impl Default for BinaryFitOptions {
    fn default() -> Self {
        BinaryFitOptions {
            model: BinaryModelSelection::Auto,
            u: Uncertainties::default(),
        }
    }
}

/// Cautions printed with every binary fit.
pub const FIT_CAUTIONS: &[&str] = &[
    "Fitted parameters describe the measured range; azeotropes and liquid splits outside it are extrapolations.",
    "The vapor is taken as ideal (modified Raoult's law) and the pure vapor pressures as exact: an error in a pure curve goes into the activity coefficients.",
    "Output that feeds a physical operation must be reviewed under local codes and by qualified process-safety staff.",
];

/// Round to `d` significant digits (output carries no floating-point noise).
fn sig(v: f64, d: i32) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let e = d - 1 - v.abs().log10().floor() as i32;
    let f = 10f64.powi(e);
    (v * f).round() / f
}

fn opt(v: f64, d: i32) -> Option<f64> {
    v.is_finite().then(|| sig(v, d))
}

fn candidates(data: &BinaryData) -> Vec<FitModel> {
    let mut c = vec![
        FitModel::Margules,
        FitModel::VanLaar,
        FitModel::Wilson,
        FitModel::Nrtl {
            alpha: NRTL_ALPHA_DEFAULT,
        },
    ];
    // α is only identifiable with vapor compositions over a good spread of x.
    if data.has_y() && data.distinct_inner_compositions() >= 8 {
        c.push(FitModel::NrtlAlpha);
    }
    c
}

fn label(m: FitModel) -> String {
    match m {
        FitModel::NrtlAlpha => "nrtl-alpha".into(),
        other => other.name().into(),
    }
}

/// Fit a binary VLE data set and test it for consistency.
///
/// `components` names the two components and their vapor-pressure sources;
/// `curves` are their pure vapor pressures.
pub fn fit_binary(
    data: &BinaryData,
    curves: [&dyn Curve; 2],
    components: Vec<ComponentInfo>,
    opts: &BinaryFitOptions,
) -> Result<BinaryFitReport, DataError> {
    data.validate()?;
    let keep = vec![true; data.points.len()];
    let u = opts.u;
    let use_y = data.has_y();
    let margules = fit_model(data, curves, FitModel::Margules, u, &keep, use_y, None);
    let hint = margules
        .converged()
        .then(|| [margules.lsq.theta[0], margules.lsq.theta[1]]);
    let (chosen, choice) = match opts.model {
        BinaryModelSelection::Fixed(FitModel::Margules) => (margules, None),
        BinaryModelSelection::Fixed(m) => (fit_model(data, curves, m, u, &keep, use_y, hint), None),
        BinaryModelSelection::Auto => {
            let mut fits: Vec<ModelFit> = vec![margules];
            for m in candidates(data).into_iter().skip(1) {
                fits.push(fit_model(data, curves, m, u, &keep, use_y, hint));
            }
            let cands: Vec<Candidate> = fits
                .iter()
                .map(|f| Candidate {
                    model: label(f.model),
                    n_params: f.model.n_params(),
                    aicc: opt(f.aicc, 6),
                    converged: f.converged(),
                })
                .collect();
            let best = fits
                .iter()
                .enumerate()
                .filter(|(_, f)| f.aicc.is_finite())
                .min_by(|a, b| a.1.aicc.total_cmp(&b.1.aicc))
                .map(|(i, _)| i);
            let reason = match best {
                Some(i) => {
                    let others: Vec<String> = fits
                        .iter()
                        .filter(|f| f.aicc.is_finite() && f.model != fits[i].model)
                        .map(|f| format!("{} {:+.1}", label(f.model), f.aicc - fits[i].aicc))
                        .collect();
                    format!(
                        "{} has the lowest AICc ({:.1}) on {} observations; difference of the others: {}.",
                        label(fits[i].model),
                        fits[i].aicc,
                        fits[i].lsq.residuals.len(),
                        if others.is_empty() { "none converged".into() } else { others.join(", ") }
                    )
                }
                None => "no model converged; the Margules attempt is reported.".into(),
            };
            let i = best.unwrap_or(0);
            (
                fits.swap_remove(i),
                Some(ModelChoice {
                    reason,
                    candidates: cands,
                }),
            )
        }
    };
    Ok(build_report(data, curves, components, chosen, choice, u))
}

fn build_report(
    data: &BinaryData,
    curves: [&dyn Curve; 2],
    components: Vec<ComponentInfo>,
    f: ModelFit,
    model_choice: Option<ModelChoice>,
    u: Uncertainties,
) -> BinaryFitReport {
    let converged = f.converged();
    let theta = f.lsq.theta.clone();
    let dof = f.lsq.dof;
    let cov = if converged { f.lsq.covariance() } else { None };
    let t95 = t_quantile(0.975, dof);
    let mut flags = Vec::new();
    if !converged {
        flags.push(Finding::new(
            FitCode::NotConverged,
            format!(
                "the {} fit did not converge ({}); its parameters are not estimates and no interval is given.",
                f.model.name(),
                f.lsq.termination.reason
            ),
        ));
    }
    let se: Vec<f64> = match &cov {
        Some(c) => (0..theta.len())
            .map(|i| c[(i, i)].max(0.0).sqrt())
            .collect(),
        None => vec![f64::NAN; theta.len()],
    };
    let parameters = f
        .model
        .param_names()
        .iter()
        .enumerate()
        .map(|(i, name)| ParameterEstimate {
            name: name.to_string(),
            value: sig(theta[i], 6),
            std_error: sig(se[i], 3),
            ci95_low: sig(theta[i] - t95 * se[i], 6),
            ci95_high: sig(theta[i] + t95 * se[i], 6),
        })
        .collect();

    // Points, residuals, outliers.
    let keep = vec![true; data.points.len()];
    let prob = VleProblem::new(data, curves, f.model, u, &keep, data.has_y());
    let evals = prob.evals(&theta);
    let n_obs = prob.obs.len();
    let bonf = t_quantile(1.0 - 0.025 / n_obs as f64, dof.saturating_sub(1));
    let mut points: Vec<PointOut> = data
        .points
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let e = evals[i].as_ref();
            let (calc, dev) = match (data.kind, e) {
                (DataKind::Isobaric, Some(e)) => {
                    (Some(sig(e.primary, 7)), Some(sig(p.t_k - e.primary, 3)))
                }
                (DataKind::Isothermal, Some(e)) => {
                    let pc = e.primary.exp();
                    (Some(sig(pc, 6)), Some(sig(100.0 * (p.p_pa - pc) / pc, 3)))
                }
                _ => (None, None),
            };
            let y_calc = e.map(|e| e.y1);
            PointOut {
                number: i + 1,
                line: p.line,
                x1: p.x1,
                y1: p.y1,
                t_k: sig(p.t_k, 9),
                p_pa: sig(p.p_pa, 9),
                calc,
                deviation: dev,
                y1_calc: y_calc.map(|v| sig(v, 5)),
                y1_deviation: match (p.y1, y_calc) {
                    (Some(a), Some(b)) => Some(sig(a - b, 3)),
                    _ => None,
                },
                studentized: None,
                y1_studentized: None,
                outlier: false,
            }
        })
        .collect();
    for (k, o) in prob.obs.iter().enumerate() {
        let r = f.lsq.residuals[k];
        let ext = external_studentized(r, f.lsq.leverage[k], f.lsq.rss, dof);
        let (i, slot) = match *o {
            Obs::Primary(i) => (i, 0),
            Obs::Y(i) => (i, 1),
        };
        let v = opt(ext, 3);
        if slot == 0 {
            points[i].studentized = v;
        } else {
            points[i].y1_studentized = v;
        }
        if converged && ext.abs() > bonf {
            points[i].outlier = true;
        }
    }
    for p in points.iter().filter(|p| p.outlier) {
        flags.push(Finding::new(
            FitCode::OutlierPoint,
            format!(
                "point {}{} (x1 = {}) deviates beyond the Bonferroni limit {:.2} of the externally studentized residuals (T or p: {}, y1: {}); it was kept: check the analysis and the still's steady state.",
                p.number,
                p.line.map(|l| format!(" (line {l})")).unwrap_or_default(),
                p.x1,
                bonf,
                p.studentized.map_or("-".into(), |v| format!("{v:.1}")),
                p.y1_studentized.map_or("-".into(), |v| format!("{v:.1}")),
            ),
        ));
    }

    // Statistics.
    let rms = |v: Vec<f64>| -> Option<f64> {
        (!v.is_empty()).then(|| (v.iter().map(|d| d * d).sum::<f64>() / v.len() as f64).sqrt())
    };
    let prim: Vec<f64> = points.iter().filter_map(|p| p.deviation).collect();
    let ydev: Vec<f64> = points.iter().filter_map(|p| p.y1_deviation).collect();
    let s2 = f.lsq.s2();
    let statistics = FitStatistics {
        n_points: data.points.len(),
        n_observations: n_obs,
        dof,
        rss: opt(f.lsq.rss, 6),
        reduced_chi_square: opt(s2, 4),
        aicc: opt(f.aicc, 6),
        rms_t_k: if data.kind == DataKind::Isobaric {
            rms(prim.clone()).map(|v| sig(v, 3))
        } else {
            None
        },
        rms_p_pct: if data.kind == DataKind::Isothermal {
            rms(prim).map(|v| sig(v, 3))
        } else {
            None
        },
        rms_y1: rms(ydev).map(|v| sig(v, 3)),
        termination: f.lsq.termination.clone(),
    };
    if converged && dof >= 3 && s2 > 4.0 {
        flags.push(Finding::new(
            BinaryFitCode::ScatterAboveStated,
            format!(
                "the residuals are {:.1} times the stated uncertainties (reduced chi-square {:.1}): either the uncertainties are understated or the model does not describe the data; the intervals use the observed scatter.",
                s2.sqrt(),
                s2
            ),
        ));
    }

    // Derived quantities.
    let cond = condition(data);
    let tg = gamma_inf_temperatures(curves, cond);
    let mut gamma_infinity = [f64::NAN; 2];
    let mut gamma_infinity_ci95 = [None, None];
    for j in 0..2 {
        if let Some((v, hw)) = delta(
            |th| ln_gamma_inf(f.model, th, tg).map(|g| g[j]),
            &theta,
            cov.as_ref(),
            t95,
        ) {
            gamma_infinity[j] = sig(v.exp(), 5);
            gamma_infinity_ci95[j] = hw.map(|h| [sig((v - h).exp(), 4), sig((v + h).exp(), 4)]);
        }
    }
    let mut azeotropes = if converged {
        fitted_azeotropes(data, f.model, &theta, cov.as_ref(), curves, t95)
    } else {
        Vec::new()
    };
    for a in &mut azeotropes {
        a.x1 = sig(a.x1, 4);
        a.t_k = a.t_k.map(|v| sig(v, 6));
        a.p_pa = a.p_pa.map(|v| sig(v, 5));
        a.x1_ci95 = a.x1_ci95.map(|[l, h]| [sig(l, 3), sig(h, 3)]);
        a.condition_ci95 = a.condition_ci95.map(|[l, h]| [sig(l, 6), sig(h, 6)]);
        if !a.inside_data {
            flags.push(Finding::new(
                BinaryFitCode::AzeotropeOutsideData,
                format!(
                    "the fitted model puts a {} azeotrope at x1 = {}, outside the measured compositions: it is an extrapolation until measured.",
                    a.kind.as_str(),
                    a.x1
                ),
            ));
        }
    }
    let liquid_split = match f.model.build(&theta) {
        Ok(m) if converged => split_check(data, &m),
        _ => SplitCheck {
            model_can_split: f.model.name() != "wilson",
            inside_data: false,
            x1: None,
            t_k: None,
        },
    };
    if liquid_split.inside_data {
        let [a, b] = liquid_split.x1.unwrap_or([f64::NAN; 2]);
        flags.push(Finding::new(
            BinaryFitCode::FittedLiquidSplit,
            format!(
                "the fitted {} parameters split the liquid between x1 = {:.3} and {:.3} at {:.1} K, where the data show one liquid: the parameters are not usable for distillation there; try another model.",
                f.model.name(),
                a,
                b,
                liquid_split.t_k.unwrap_or(f64::NAN)
            ),
        ));
    }

    // Consistency.
    let (consistency, consistency_not_run) = consistency(data, curves, cond, u);
    for t in consistency.iter().filter(|t| !t.passed) {
        flags.push(Finding::new(
            BinaryFitCode::ConsistencyFailed,
            format!(
                "the {} test fails ({} = {:.3}, needs {}): the data are not thermodynamically consistent; look for a bias in the vapor analysis, the temperature probe or the still's pressure.",
                t.test, "statistic", t.statistic, t.criterion
            ),
        ));
    }
    if !data.has_y() {
        flags.push(Finding::new(
            BinaryFitCode::NoVaporComposition,
            "no y1 column: the parameters rest on T (or p) alone and no consistency test can run (all three need measured y1).",
        ));
    }
    for (i, c) in curves.iter().enumerate() {
        let (lo, hi) = data.t_range();
        if let Some((a, b)) = c.valid_range_k() {
            if lo < a || hi > b {
                flags.push(Finding::new(
                    MixtureCode::VaporPressureExtrapolated,
                    format!(
                        "the vapor pressure of {} is used outside its stated range ({:.1}-{:.1} K).",
                        components.get(i).map_or("a component", |c| c.name.as_str()),
                        a,
                        b
                    ),
                ));
            }
        }
    }
    let model_curve = match f.model.build(&theta) {
        Ok(m) if converged => {
            let b = crate::mixture::Binary {
                names: ["1", "2"],
                curves,
                model: &m,
            };
            b.diagram(cond, 41)
                .map(|d| {
                    d.iter()
                        .map(|v| {
                            let c = match cond {
                                Condition::Pressure(_) => sig(v.t_k, 7),
                                Condition::Temperature(_) => sig(v.p_pa, 7),
                            };
                            [sig(v.x1, 6), sig(v.y1, 6), c]
                        })
                        .collect()
                })
                .unwrap_or_default()
        }
        _ => Vec::new(),
    };
    let ratio = super::area::ln_gamma_ratio(data, curves);
    let ln_gamma_ratio_polynomial =
        super::area::ratio_polynomial(&ratio).map(|c| c.into_iter().map(|v| sig(v, 6)).collect());
    let ln_gamma_ratio = ratio.iter().map(|&(x, r)| [x, sig(r, 5)]).collect();
    let (pressure_pa, temperature_k) = match cond {
        Condition::Pressure(p) => (Some(sig(p, 6)), None),
        Condition::Temperature(t) => (None, Some(sig(t, 6))),
    };
    BinaryFitReport {
        kind: data.kind,
        pressure_pa,
        temperature_k,
        components,
        model: f.model.name().into(),
        model_spec: f.model,
        parameters,
        fixed_parameters: f
            .model
            .fixed()
            .into_iter()
            .map(|(n, v)| FixedParameter {
                name: n.into(),
                value: v,
            })
            .collect(),
        covariance: cov.map(|c| {
            (0..c.nrows())
                .map(|i| (0..c.ncols()).map(|j| sig(c[(i, j)], 6)).collect())
                .collect()
        }),
        statistics,
        model_choice,
        gamma_infinity,
        gamma_infinity_ci95,
        gamma_infinity_t_k: tg.map(|t| sig(t, 6)),
        azeotropes,
        liquid_split,
        consistency,
        consistency_not_run,
        points,
        flags,
        model_curve,
        ln_gamma_ratio,
        ln_gamma_ratio_polynomial,
        uncertainties: u,
        cautions: FIT_CAUTIONS.iter().map(|s| s.to_string()).collect(),
    }
}

/// Run every consistency test the data allow.
pub fn consistency(
    data: &BinaryData,
    curves: [&dyn Curve; 2],
    cond: Condition,
    u: Uncertainties,
) -> (Vec<ConsistencyTest>, Vec<TestNotRun>) {
    let mut ran = Vec::new();
    let mut not = Vec::new();
    let area_name = match data.kind {
        DataKind::Isobaric => "herington-area",
        DataKind::Isothermal => "redlich-kister-area",
    };
    if !data.has_y() {
        for t in [area_name, "point-to-point"] {
            not.push(TestNotRun {
                test: t.into(),
                reason: "needs measured vapor compositions y1".into(),
            });
        }
        return (ran, not);
    }
    let area = match (data.kind, cond) {
        (DataKind::Isobaric, Condition::Pressure(p)) => {
            herington(data, curves, [curves[0].t_at(p), curves[1].t_at(p)])
        }
        _ => redlich_kister(data, curves),
    };
    match area {
        Some(mut t) => {
            t.statistic = sig(t.statistic, 4);
            ran.push(t)
        }
        None => not.push(TestNotRun {
            test: area_name.into(),
            reason: "needs at least 3 points with y1 strictly between 0 and 1".into(),
        }),
    }
    match point_test(data, curves, u) {
        Some(mut p) => {
            p.test.statistic = sig(p.test.statistic, 3);
            ran.push(p.test)
        }
        None => not.push(TestNotRun {
            test: "point-to-point".into(),
            reason:
                "needs at least 3 points with y1 and a converged G^E fit to the T-x (or p-x) data"
                    .into(),
        }),
    }
    (ran, not)
}
