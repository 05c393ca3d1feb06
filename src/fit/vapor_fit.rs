//! Fit measured (T, p) points and report: statistics, diagnostics, predictions, findings.
//!
//! Outlier rule: a point is flagged when its externally studentized residual
//! exceeds the Bonferroni-corrected Student t quantile t(1 − 0.025/n, n − k − 1).
//! Model choice: AICc = n·ln(RSS/n) + 2k + 2k(k+1)/(n − k − 1).
//!
//! Reference: AICc — C. M. Hurvich & C.-L. Tsai, *Biometrika* 76, 297–307
//! (1989); Bonferroni outlier test — R. D. Cook & S. Weisberg, *Residuals and
//! Influence in Regression* (1982), section 2.2.

use super::equation_fit::{fit_equation, EquationFit, Point};
use super::findings::{Finding, FitCode};
use super::options::{FitOptions, ModelSelection};
use super::report::*;
use crate::vapor::VaporEquation;

use super::build::*;
use super::error::*;
use super::outlier_refit::*;
use super::validate::*;

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
    let list = r.excluded_list();
    r.flags.insert(
        0,
        Finding::new(
            FitCode::ExcludedPoints,
            format!(
                "Excluded by the user (--exclude): {}. The constants, intervals and predictions are from the remaining {} points; boil --from and plan --from use exactly this fit.",
                list,
                kept.len()
            ),
        ),
    );
    Ok(r)
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
#[cfg(test)]
mod tests {
    use super::*;
    use crate::fit::{FittedCurve, RobustLoss};
    use crate::units::ATM_PA;
    use crate::vapor::Curve;

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
