//! Assembling a plan: operating pressure, boiling points, volatility, stages, Rayleigh curve, verdict.

use super::activity::{self, ModelCurve};
use super::column_plan::{self, ColumnOutcome};
use super::pressure::{self};
use super::rayleigh::{self, ConstantAlpha, Equilibrium, IdealBinary};
use super::uncertainty::{self, K95};
use super::verdict::{self, VerdictInputs};
use super::verdict::{Barrier, ColumnBrief};
use super::volatility::{self, PairVolatility};
use super::{fenske, limits, Component, PlanError};
use crate::mixture::{LiquidSplit, VleStudy, SWING_SHIFT};

pub use super::result::*;

/// Make a plan for `components` under `opts`.
pub fn plan(components: &[Component], opts: &PlanOptions) -> Result<Plan, PlanError> {
    if components.len() < 2 {
        return Err(PlanError::TooFewComponents {
            found: components.len(),
        });
    }
    for (i, c) in components.iter().enumerate() {
        if components[..i].iter().any(|d| d.name == c.name) {
            return Err(PlanError::DuplicateName {
                name: c.name.clone(),
            });
        }
    }
    fenske::separation_factor(opts.distillate_purity, opts.bottoms_purity)?;
    if !(opts.feed_x_light > 0.0 && opts.feed_x_light < 1.0) {
        return Err(PlanError::BadFeed {
            value: opts.feed_x_light,
        });
    }
    let mut findings = Vec::new();

    // 1. Operating pressure.
    let (p, pressure_choice) = match opts.pressure {
        PressureRequest::Given(p) => {
            if !(p.is_finite() && p > 0.0) {
                return Err(PlanError::BadPressure { p_pa: p });
            }
            let choice = PressureChoice {
                mode: "given",
                max_pot: None,
                rounding_rule: None,
            };
            (p, choice)
        }
        PressureRequest::MaxPot(t) => {
            let m = pressure::pressure_for_max_pot(components, t)?;
            if m.capped_at_atmosphere {
                findings.push(Finding {
                    code: PlanCode::MaxPotAboveNormalBoiling.into(),
                    severity: PlanCode::MaxPotAboveNormalBoiling.severity(),
                    message: format!(
                        "Every component boils below the pot limit even at atmospheric pressure, so the plan uses 1 atm (no vacuum needed; a pressurised still is never proposed); {} boils at {:.1} °C there.",
                        m.heaviest,
                        components.iter().find(|c| c.name == m.heaviest).and_then(|c| c.tb_k(m.setpoint_pa).ok()).unwrap_or(f64::NAN) - crate::units::CELSIUS_OFFSET
                    ),
                    subject: Subject::Whole,
                });
            }
            let p = m.setpoint_pa;
            let choice = PressureChoice {
                mode: "max-pot",
                max_pot: Some(m),
                rounding_rule: Some(pressure::ROUNDING_RULE),
            };
            (p, choice)
        }
    };

    // 2. Boiling points, lightest first.
    let mut order: Vec<(usize, f64)> = components
        .iter()
        .enumerate()
        .map(|(i, c)| c.tb_k(p).map(|t| (i, t)))
        .collect::<Result<_, _>>()?;
    order.sort_by(|a, b| a.1.total_cmp(&b.1));
    let sorted: Vec<&Component> = order.iter().map(|&(i, _)| &components[i]).collect();
    let mut at_p = Vec::new();
    for (&(_, t), c) in order.iter().zip(&sorted) {
        let u = c
            .curve
            .t_uncertainty_k(p)
            .filter(|u| u.is_finite() && *u >= 0.0);
        let extrapolated = c.extrapolated(t);
        if extrapolated {
            findings.push(Finding {
                code: PlanCode::OutsideValidRange.into(),
                severity: PlanCode::OutsideValidRange.severity(),
                message: format!(
                    "The boiling point of {} at this pressure ({:.1} °C) lies outside the temperature range its source claims for its curve, so it is an extrapolation.",
                    c.name,
                    t - crate::units::CELSIUS_OFFSET
                ),
                subject: Subject::Whole,
            });
        }
        if u.is_none() {
            findings.push(Finding {
                code: PlanCode::UncertaintyNotStated.into(),
                severity: PlanCode::UncertaintyNotStated.severity(),
                message: format!(
                    "The source of {} states no uncertainty, so the uncertainty of α and of the stage count leaves it out.",
                    c.name
                ),
                subject: Subject::Whole,
            });
        }
        at_p.push(ComponentAtPressure {
            name: c.name.clone(),
            tb_k: t,
            u_tb_k: u,
            tb_ci95_low_k: u.map(|u| t - K95 * u),
            tb_ci95_high_k: u.map(|u| t + K95 * u),
            source: c.source.clone(),
            extrapolated,
        });
    }
    if let Some(first) = at_p.first() {
        if first.tb_k < 283.15 {
            findings.push(Finding {
                code: PlanCode::CondensateNeedsColdTrap.into(),
                severity: PlanCode::CondensateNeedsColdTrap.severity(),
                message: format!(
                    "{} boils at {:.1} °C at this pressure, below what a tap-water condenser can condense: plan a chilled condenser or cold trap, or use a higher pressure.",
                    first.name,
                    first.tb_k - crate::units::CELSIUS_OFFSET
                ),
                subject: Subject::Whole,
            });
        }
    }

    // 3. Adjacent pairs; the key pair is the one with the smallest α.
    let (xd, xb) = (opts.distillate_purity, opts.bottoms_purity);
    let mut pairs = Vec::new();
    let mut key: Option<(usize, PairVolatility)> = None;
    for i in 0..sorted.len() - 1 {
        let v = volatility::pair_volatility(sorted[i], sorted[i + 1], p)?;
        pairs.push(PairSummary {
            light: v.light.clone(),
            heavy: v.heavy.clone(),
            delta_tb_k: v.delta_tb_k,
            relative_volatility: v.geometric_mean,
            fenske_min_stages: fenske::min_stages(v.geometric_mean, xd, xb)?,
        });
        if key
            .as_ref()
            .is_none_or(|(_, k)| v.geometric_mean < k.geometric_mean)
        {
            key = Some((i, v));
        }
    }
    let Some((ki, kv)) = key else {
        return Err(PlanError::TooFewComponents {
            found: sorted.len(),
        });
    };
    let (light, heavy) = (sorted[ki], sorted[ki + 1]);
    if sorted.len() > 2 {
        findings.push(Finding {
            code: PlanCode::KeyPairOnly.into(),
            severity: PlanCode::KeyPairOnly.severity(),
            message: format!(
                "With {} components the stage count, Rayleigh curve and verdict are for the hardest adjacent pair, {} / {}, treated as a binary; the others are listed under pairs.",
                sorted.len(),
                light.name,
                heavy.name
            ),
            subject: Subject::Whole,
        });
    }

    // 4. Uncertainty and Fenske.
    let au = uncertainty::alpha_uncertainty(light, heavy, p, kv.light_tb_k, kv.heavy_tb_k)?;
    let alpha = kv.geometric_mean;
    let n_min = fenske::min_stages(alpha, xd, xb)?;
    let nu = uncertainty::stages_uncertainty(alpha, au.u_ln_alpha, xd, xb)?;
    let fenske_detail = FenskeDetail {
        distillate_purity: xd,
        bottoms_purity: xb,
        separation_factor: fenske::separation_factor(xd, xb)?,
        u: nu.map(|n| n.u),
        ci95_low: nu.map(|n| n.ci95_low),
        ci95_high: nu.and_then(|n| n.ci95_high),
    };
    let detail = VolatilityDetail {
        ci95_low: (alpha.ln() - K95 * au.u_ln_alpha).exp(),
        ci95_high: (alpha.ln() + K95 * au.u_ln_alpha).exp(),
        u_ln_alpha: au.u_ln_alpha,
        uncertainty_not_stated: au.not_stated,
        pair: kv.clone(),
    };

    // 5. Pressure table.
    let mut table: Vec<PressureRow> = Vec::new();
    for q in pressure::ladder(p) {
        let tbs: Result<Vec<f64>, _> = sorted.iter().map(|c| c.tb_k(q)).collect();
        let Ok(tbs) = tbs else { continue };
        let Ok(v) = volatility::pair_volatility(light, heavy, q) else {
            continue;
        };
        let extrapolated = sorted.iter().zip(&tbs).any(|(c, &t)| c.extrapolated(t));
        table.push(PressureRow {
            p_pa: q,
            delta_tb_k: v.delta_tb_k,
            relative_volatility: v.geometric_mean,
            fenske_min_stages: fenske::min_stages(v.geometric_mean, xd, xb)?,
            tb_k: tbs,
            extrapolated,
            operating: (q - p).abs() <= 1e-9 * p,
        });
    }

    // 6. The key pair's liquid model, azeotropes and equilibrium curve.
    let chosen = activity::choose_model(opts.activity.clone(), light, heavy)?;
    if let Some(why) = &chosen.fallback {
        findings.push(Finding::new(
            PlanCode::IdealSolutionAssumed,
            format!("For {} / {}: {why}.", light.name, heavy.name),
        ));
    }
    let ideal_model = chosen.model.name() == "ideal";
    let study: Option<VleStudy> = if ideal_model {
        None
    } else {
        let st = activity::key_pair_study(light, heavy, &*chosen.model, p)?;
        findings.extend(st.flags.iter().cloned());
        Some(st)
    };
    let ideal = IdealBinary {
        light,
        heavy,
        p_pa: p,
    };
    let model_curve = study
        .as_ref()
        .map(|st| ModelCurve::new(light, heavy, &*chosen.model, p, st));
    let curve: &dyn Equilibrium = match &model_curve {
        Some(m) => m,
        None => &ideal,
    };

    // 7. Rayleigh curve of the key pair.
    let constant = ConstantAlpha { alpha };
    let eq: &dyn Equilibrium = match opts.rayleigh_model {
        RayleighModel::Varying => curve,
        RayleighModel::Constant => &constant,
    };
    let ray = if alpha > 1.0 || !ideal_model {
        let points = rayleigh::curve(eq, opts.feed_x_light, 0.05, 0.9);
        let cut = rayleigh::cut_at_pot(eq, opts.feed_x_light, 1.0 - xb).ok();
        match points {
            Ok(mut points) => {
                if opts.rayleigh_model == RayleighModel::Constant {
                    // Head temperature from the curves even when y(x) uses constant α.
                    for pt in &mut points {
                        pt.head_t_k = curve.t_k(pt.pot_x_light).ok().flatten();
                        pt.pot_t_k = pt.head_t_k;
                    }
                }
                Some(RayleighSummary {
                    model: eq.model(),
                    feed_x_light: opts.feed_x_light,
                    points,
                    cut_to_bottoms_target: cut,
                })
            }
            Err(_) => None,
        }
    } else {
        None
    };

    // 8. The column on the key pair's curve.
    let outcome = if opts.feed_x_light > 1.0 - xb && opts.feed_x_light < xd {
        column_plan::column_for(
            curve,
            xd,
            xb,
            opts.feed_x_light,
            opts.feed_q,
            opts.reflux_factor,
        )
    } else {
        ColumnOutcome::Failed(format!(
            "the charge (x = {}) must lie between the bottoms and distillate targets",
            opts.feed_x_light
        ))
    };
    let azeotropes = study
        .as_ref()
        .map(|s| s.azeotropes.clone())
        .unwrap_or_default();
    let liquid_split = study
        .as_ref()
        .map(|s| s.liquid_split.clone())
        .unwrap_or(LiquidSplit {
            predicted: false,
            x1_low: None,
            x1_high: None,
            t_k: None,
            p_pa: None,
            y1: None,
        });
    let barrier = match &outcome {
        ColumnOutcome::Beyond { x } => Some(barrier(*x, curve, study.as_ref(), p)),
        _ => None,
    };
    let (column, failure) = match outcome {
        ColumnOutcome::Designed(c) => (Some(*c), None),
        ColumnOutcome::Failed(f) => (None, Some(f)),
        ColumnOutcome::Beyond { .. } => (None, None),
    };

    // 9. Verdict: with a liquid model the curve's own figures decide.
    /// Above this ratio of the α interval's ends the data cannot decide.
    const WIDE_ALPHA_RATIO: f64 = 3.0;
    let (v_alpha, v_n_min) = match (&column, ideal_model) {
        (Some(c), false) => ((c.alpha_low * c.alpha_high).sqrt(), Some(c.min_stages)),
        _ => (alpha, n_min),
    };
    let cut = ray.as_ref().and_then(|r| r.cut_to_bottoms_target);
    let mut verdict = verdict::decide(&VerdictInputs {
        alpha: v_alpha,
        n_min: v_n_min,
        delta_tb_k: kv.delta_tb_k,
        distillate_purity: xd,
        simple_cut_distillate: cut.map(|c| c.distillate_avg_x_light),
        simple_cut_fraction: cut.map(|c| c.fraction_distilled),
        column: Some(ColumnBrief {
            summary: column.as_ref(),
            failure: failure.as_deref(),
        }),
        barrier: barrier.as_ref(),
    });
    // An α interval that spans "no separation" or a factor of three cannot
    // carry a verdict: say so first, with the interval (common practice).
    let (alo, ahi) = (detail.ci95_low, detail.ci95_high);
    if alo <= 1.0 || ahi / alo > WIDE_ALPHA_RATIO {
        verdict.message = format!(
            "The data cannot decide: the 95 % interval of the relative volatility is {alo:.2}–{ahi:.2}{}, so the verdict below rests on the central value {alpha:.2} alone; firm up the vapor-pressure data first. Provisional: {}",
            if alo <= 1.0 {
                ", which includes no separation at all (α ≤ 1)"
            } else {
                ""
            },
            verdict.message
        );
    }
    if verdict.rule_of_thumb.code != verdict.code
        && verdict.code != verdict::VerdictCode::BeyondAzeotrope
    {
        findings.push(Finding {
            code: PlanCode::RuleOfThumbDisagrees.into(),
            severity: PlanCode::RuleOfThumbDisagrees.severity(),
            message: "The boiling-point-difference rule of thumb reads differently from the stage count for these purity targets; plan with the stage count.".to_string(),
            subject: Subject::Whole,
        });
    }
    // No stage count for an impossible target.
    let beyond = barrier.is_some();
    let n_min = if beyond { None } else { n_min };
    if beyond {
        for r in &mut table {
            r.fenske_min_stages = None;
        }
        if let Some(pair) = pairs.get_mut(ki) {
            pair.fenske_min_stages = None;
        }
    }

    // The curve the column was stepped on, for drawing.
    let equilibrium_curve: Vec<(f64, f64)> = (0..=100)
        .filter_map(|i| {
            let x = f64::from(i) / 100.0;
            curve.y(x).ok().filter(|y| y.is_finite()).map(|y| (x, y))
        })
        .collect();
    Ok(Plan {
        pressure_pa: p,
        pressure_choice,
        components: at_p,
        key_pair: [light.name.clone(), heavy.name.clone()],
        relative_volatility: alpha,
        relative_volatility_detail: detail,
        fenske_min_stages: n_min,
        fenske_detail,
        pairs,
        pressure_table: table,
        rayleigh: ray,
        activity_model: chosen.model.name(),
        azeotropes,
        liquid_split,
        column,
        verdict,
        findings,
        limits: if ideal_model {
            limits::IDEAL_SOLUTION
        } else {
            limits::MIXTURE_MODEL
        },
        cautions: if ideal_model {
            limits::CAUTIONS
        } else {
            limits::CAUTIONS_MIXTURE
        },
        equilibrium_curve,
        key_pair_vle: study,
    })
}

/// Name what stops the column at `x` and list the ways round it (common practice).
fn barrier(x: f64, curve: &dyn Equilibrium, study: Option<&VleStudy>, p: f64) -> Barrier {
    let near = study.and_then(|s| {
        s.azeotropes
            .iter()
            .min_by(|a, b| (a.x1 - x).abs().total_cmp(&(b.x1 - x).abs()))
    });
    let (ax, t_k, kind) = match near {
        Some(a) => (
            a.x1,
            a.t_k.or_else(|| curve.t_k(a.x1).ok().flatten()),
            format!("predicted {} azeotrope", a.kind.as_str()),
        ),
        None => (
            x,
            curve.t_k(x).ok().flatten(),
            "point where the vapor is no richer than the liquid (a pinch on the diagonal)"
                .to_string(),
        ),
    };
    let mut hints = Vec::new();
    if let Some(st) = study {
        let moves: Vec<(f64, f64)> = st
            .azeotrope_pressure_shift
            .iter()
            .filter_map(|r| r.x1.map(|x1| (r.p_pa, x1)))
            .collect();
        if let Some(&(pp, xx)) = moves
            .iter()
            .max_by(|a, b| (a.1 - ax).abs().total_cmp(&(b.1 - ax).abs()))
        {
            let d = (xx - ax).abs();
            if d >= SWING_SHIFT {
                hints.push(format!(
                    "Pressure-swing distillation: the predicted azeotrope moves from x = {ax:.3} here to x = {xx:.3} at {:.0} mbar, a shift of {d:.3} (worth a look from about {SWING_SHIFT} in mole fraction; common practice).",
                    pp / 100.0
                ));
            } else {
                hints.push(format!(
                    "A pressure swing is unlikely to help: the predicted azeotrope moves by at most {d:.3} in mole fraction between the pressures tried ({:.0} to {:.0} mbar; common practice: worth a look from about {SWING_SHIFT}).",
                    moves.iter().map(|m| m.0).fold(f64::INFINITY, f64::min) / 100.0,
                    moves.iter().map(|m| m.0).fold(0.0, f64::max) / 100.0
                ));
            }
        }
    }
    hints.push("An entrainer: a third component that breaks the azeotrope, by azeotropic distillation or by extractive distillation with a high-boiling solvent (common practice).".to_string());
    if let Some(s) = study.map(|s| &s.liquid_split).filter(|s| s.predicted) {
        hints.push(format!(
            "A decanter: two liquids are predicted between x = {:.3} and {:.3}, so the condensate can be split by settling and each layer distilled on its own side of the azeotrope (common practice).",
            s.x1_low.unwrap_or(f64::NAN),
            s.x1_high.unwrap_or(f64::NAN)
        ));
    }
    hints.push(format!(
        "Ordinary distillation can take the product up to about the azeotrope (x = {ax:.3}); another step (e.g. adsorption or a membrane) can finish it (common practice)."
    ));
    let _ = p;
    Barrier {
        x: ax,
        t_k,
        kind,
        hints,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::ActivityChoice;
    use crate::vapor::AntoineConstants;

    fn svna(name: &str, a: f64, b: f64, c: f64) -> Component {
        let conv = "ln,kPa,degC".parse().unwrap();
        Component::new(name, Box::new(AntoineConstants::new(a, b, c, conv)), "test")
    }

    /// Benzene/toluene, Smith, Van Ness & Abbott App. B Table B.2 constants.
    fn bz_tol() -> Vec<Component> {
        vec![
            svna("toluene", 13.9320, 3056.96, 217.625),
            svna("benzene", 13.7819, 2726.81, 217.572),
        ]
    }

    #[test]
    fn benzene_toluene_plan_at_one_atmosphere_needs_a_column() {
        let p = plan(&bz_tol(), &PlanOptions::default()).unwrap();
        assert_eq!(p.components[0].name, "benzene");
        assert_eq!(p.verdict.code, verdict::VerdictCode::ColumnNeeded);
        let n = p.fenske_min_stages.unwrap();
        assert_eq!(p.verdict.min_theoretical_stages, Some(n.ceil() as u32));
        assert!(p.pressure_table.iter().any(|r| r.operating));
        // Lower pressure raises α for this pair.
        let first = &p.pressure_table[0];
        let last = p.pressure_table.last().unwrap();
        assert!(last.p_pa < first.p_pa && last.relative_volatility > first.relative_volatility);
        let r = p.rayleigh.unwrap();
        assert_eq!(r.points.len(), 19);
        assert!(r.points[0].head_t_k.unwrap() > p.components[0].tb_k);
    }

    /// `ActivityChoice::Ideal` is today's Raoult plan: the Rayleigh curve is
    /// the ideal binary's, the stage count Fenske's on the geometric-mean α,
    /// and structures make no difference.
    #[test]
    fn ideal_model_reproduces_the_raoult_plan() {
        let with_smiles: Vec<Component> = bz_tol()
            .into_iter()
            .zip(["Cc1ccccc1", "c1ccccc1"])
            .map(|(c, s)| c.with_smiles(s))
            .collect();
        let opts = PlanOptions {
            activity: ActivityChoice::Ideal,
            ..PlanOptions::default()
        };
        let a = plan(&with_smiles, &opts).unwrap();
        let b = plan(&bz_tol(), &opts).unwrap();
        assert_eq!(a, b);
        assert_eq!(a.activity_model, "ideal");
        assert_eq!(a.limits, limits::IDEAL_SOLUTION);
        let (l, h) = (&bz_tol()[1], &bz_tol()[0]);
        let ideal = IdealBinary {
            light: l,
            heavy: h,
            p_pa: a.pressure_pa,
        };
        let pts = rayleigh::curve(&ideal, 0.5, 0.05, 0.9).unwrap();
        assert_eq!(a.rayleigh.as_ref().unwrap().points, pts);
        let v = volatility::pair_volatility(l, h, a.pressure_pa).unwrap();
        let n = fenske::min_stages(v.geometric_mean, 0.99, 0.99)
            .unwrap()
            .unwrap();
        assert_eq!(a.fenske_min_stages, Some(n));
        assert_eq!(a.verdict.min_theoretical_stages, Some(n.ceil() as u32));
        assert!(a.azeotropes.is_empty() && !a.liquid_split.predicted);
        // Without structures, the default falls back to the same plan and says so.
        let c = plan(&bz_tol(), &PlanOptions::default()).unwrap();
        assert_eq!(c.rayleigh, a.rayleigh);
        assert_eq!(c.column, a.column);
        assert!(c
            .findings
            .iter()
            .any(|f| f.code == "ideal-solution-assumed"));
        // UNIFAC with structures gives a near-ideal answer for this pair.
        let u = plan(&with_smiles, &PlanOptions::default()).unwrap();
        assert_eq!(u.activity_model, "unifac");
        let (cu, ci) = (u.column.unwrap(), a.column.unwrap());
        assert!(
            (cu.min_stages - ci.min_stages).abs() < 1.0,
            "{} {}",
            cu.min_stages,
            ci.min_stages
        );
    }

    #[test]
    fn max_pot_plan_uses_the_rounded_setpoint() {
        let opts = PlanOptions {
            pressure: PressureRequest::MaxPot(crate::units::CELSIUS_OFFSET + 60.0),
            ..PlanOptions::default()
        };
        let p = plan(&bz_tol(), &opts).unwrap();
        let m = p.pressure_choice.max_pot.as_ref().unwrap();
        assert_eq!(m.heaviest, "toluene");
        assert_eq!(p.pressure_pa, m.setpoint_pa);
        assert!(p.components[1].tb_k <= crate::units::CELSIUS_OFFSET + 60.0);
    }

    #[test]
    fn varying_and_constant_alpha_rayleigh_curves_are_close_for_a_near_ideal_pair() {
        let mut opts = PlanOptions::default();
        let a = plan(&bz_tol(), &opts).unwrap().rayleigh.unwrap();
        opts.rayleigh_model = RayleighModel::Constant;
        let b = plan(&bz_tol(), &opts).unwrap().rayleigh.unwrap();
        for (pa, pb) in a.points.iter().zip(&b.points) {
            assert!((pa.distillate_avg_x_light - pb.distillate_avg_x_light).abs() < 0.03);
        }
    }

    #[test]
    fn widely_separated_pair_is_a_simple_distillation() {
        // Acetone and n-decane by Smith, Van Ness & Abbott App. B constants
        // (a real mixture is non-ideal; this checks only the verdict branch).
        let comps = vec![
            svna("acetone", 14.3145, 2756.22, 228.060),
            svna("n-decane", 13.9748, 3442.76, 193.858),
        ];
        let opts = PlanOptions {
            distillate_purity: 0.90,
            bottoms_purity: 0.90,
            ..PlanOptions::default()
        };
        let p = plan(&comps, &opts).unwrap();
        assert_eq!(
            p.verdict.code,
            verdict::VerdictCode::SimpleDistillation,
            "{}",
            p.verdict.message
        );
    }

    #[test]
    fn bad_inputs_are_typed_errors() {
        let one = vec![svna("benzene", 13.7819, 2726.81, 217.572)];
        assert!(matches!(
            plan(&one, &PlanOptions::default()),
            Err(PlanError::TooFewComponents { found: 1 })
        ));
        let mut dup = bz_tol();
        dup.push(svna("benzene", 13.7819, 2726.81, 217.572));
        assert!(matches!(
            plan(&dup, &PlanOptions::default()),
            Err(PlanError::DuplicateName { .. })
        ));
        let opts = PlanOptions {
            feed_x_light: 1.2,
            ..PlanOptions::default()
        };
        assert!(matches!(
            plan(&bz_tol(), &opts),
            Err(PlanError::BadFeed { .. })
        ));
    }
}
