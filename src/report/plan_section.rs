//! Report section for a separation plan: verdict, pressure, boiling points, volatility, stages, Rayleigh curve, limits.
//!
//! Used by the demo (and by any command that reports a plan). Formatting only.

use super::fit_section::mbar;
use super::html::{Figure, FindingRow, Report, Section, Severity, Table};
use crate::plan::{Component, Plan};

fn c(t_k: f64) -> String {
    format!("{:.1}", t_k - crate::units::CELSIUS_OFFSET)
}

fn opt(v: Option<f64>, digits: usize) -> String {
    v.map_or("—".to_string(), |x| format!("{x:.digits$}"))
}

/// The plan's verdict and findings as report findings, the key pair as subject.
pub fn plan_findings(plan: &Plan) -> Vec<FindingRow> {
    let subject = format!("{} / {}", plan.key_pair[0], plan.key_pair[1]);
    let code = serde_json::to_value(plan.verdict.code)
        .ok()
        .and_then(|v| v.as_str().map(String::from))
        .unwrap_or_default();
    let mut out = vec![FindingRow::new(
        Severity::Info,
        subject.clone(),
        format!("plan-{code}"),
        plan.verdict.message.clone(),
    )];
    out.extend(
        plan.findings
            .iter()
            .map(|f| FindingRow::of(f, subject.clone())),
    );
    out
}

/// Add a plan to `section`: the verdict first, then the operating pressure,
/// the components at it, the key pair's volatility and stages, the plot of
/// boiling points against pressure and the Rayleigh curve, the table across
/// pressures, the simple-distillation table, the findings and the ideal-solution limits.
pub fn add_plan(section: &mut Section, plan: &Plan, components: &[Component]) {
    section.paragraph(format!("Verdict: {}", plan.verdict.message));
    for h in &plan.verdict.hints {
        section.paragraph(format!("Way round: {h}"));
    }
    section.paragraph(plan.verdict.rule_of_thumb.message.clone());
    let d = &plan.relative_volatility_detail;
    let f = &plan.fenske_detail;
    let mut pressure = mbar(plan.pressure_pa);
    if let Some(m) = &plan.pressure_choice.max_pot {
        pressure.push_str(&format!(
            " (from the pot limit {} °C: {} boils there at {}; {})",
            c(m.max_pot_k),
            m.heaviest,
            mbar(m.unrounded_pa),
            plan.pressure_choice.rounding_rule.unwrap_or("")
        ));
    } else {
        pressure.push_str(" (given)");
    }
    section.facts([
        ("operating pressure", pressure),
        (
            "key pair",
            format!(
                "{} / {}, Δt_b = {:.2} K",
                d.pair.light, d.pair.heavy, d.pair.delta_tb_k
            ),
        ),
        (
            "relative volatility (Raoult)",
            format!(
                "{:.3} at t_b({}), {:.3} at t_b({}), geometric mean {:.3}{}",
                d.pair.at_light_tb,
                d.pair.light,
                d.pair.at_heavy_tb,
                d.pair.heavy,
                plan.relative_volatility,
                if d.u_ln_alpha > 0.0 {
                    format!(" (95 %: {:.3} to {:.3})", d.ci95_low, d.ci95_high)
                } else {
                    " (no uncertainty stated by the sources)".to_string()
                }
            ),
        ),
        (
            "Fenske minimum theoretical stages",
            format!(
                "{} for x_D = {}, x_B = {}{}",
                opt(plan.fenske_min_stages, 2),
                f.distillate_purity,
                f.bottoms_purity,
                match (f.ci95_low, f.ci95_high) {
                    (Some(l), Some(h)) => format!(" (95 %: {l:.2} to {h:.2})"),
                    (Some(l), None) => format!(" (95 %: {l:.2} to unbounded)"),
                    _ => String::new(),
                }
            ),
        ),
    ]);
    let mut ct = Table::new(["component", "t_b/°C", "95 % interval/°C", "source"]).caption(
        format!("Components at {}, lightest first", mbar(plan.pressure_pa)),
    );
    for k in &plan.components {
        ct.flagged_row(
            [
                k.name.clone(),
                c(k.tb_k),
                match (k.tb_ci95_low_k, k.tb_ci95_high_k) {
                    (Some(l), Some(h)) => format!("{} to {}", c(l), c(h)),
                    _ => "not stated".into(),
                },
                format!(
                    "{}{}",
                    k.source,
                    if k.extrapolated {
                        " (extrapolated)"
                    } else {
                        ""
                    }
                ),
            ],
            k.extrapolated.then_some(Severity::Warning),
        );
    }
    section.table(ct);
    if let Ok(svg) = super::plan_plot::plan_svg(plan, components) {
        if let Ok(fig) = Figure::new(
            &svg,
            "Boiling points against pressure with the operating pressure marked (left); simple batch (Rayleigh) distillation of the key pair (right)",
        ) {
            section.figure(fig);
        }
    }
    if let Some(Ok(svg)) = super::mccabe_plot::mccabe_svg(plan) {
        if let Ok(fig) = Figure::new(
            &svg,
            "The column on the key pair's equilibrium curve (McCabe–Thiele, constant molar overflow): stages stepped between the operating lines and the curve",
        ) {
            section.figure(fig);
        }
    }
    if let Some(study) = &plan.key_pair_vle {
        if let Ok(svg) = super::vle_plot::vle_svg(study) {
            if let Ok(fig) = Figure::new(
                &svg,
                format!(
                    "The key pair's predicted vapor–liquid equilibrium ({}; an estimate: confirm azeotropes with mixture data)",
                    study.activity_model
                ),
            ) {
                section.figure(fig);
            }
        }
    }
    let mut head = vec!["p".to_string()];
    head.extend(plan.components.iter().map(|k| format!("t_b {}/°C", k.name)));
    head.extend(["Δt_b/K", "α", "N_min"].map(String::from));
    let mut pt =
        Table::new(head).caption("The key pair across pressures (operating pressure marked)");
    for r in &plan.pressure_table {
        let mut row = vec![format!(
            "{}{}",
            mbar(r.p_pa),
            if r.operating { " (operating)" } else { "" }
        )];
        row.extend(r.tb_k.iter().map(|t| c(*t)));
        row.push(format!("{:.2}", r.delta_tb_k));
        row.push(format!("{:.3}", r.relative_volatility));
        row.push(opt(r.fenske_min_stages, 2));
        pt.flagged_row(row, r.extrapolated.then_some(Severity::Warning));
    }
    section.table(pt);
    if let Some(ray) = &plan.rayleigh {
        let mut rt = Table::new([
            "distilled/%",
            "pot x",
            "distillate now y",
            "all distillate x",
            "pot/°C",
            "head/°C",
        ])
        .caption(format!(
            "Simple batch distillation (Rayleigh, {}), charge x({}) = {}",
            ray.model, plan.key_pair[0], ray.feed_x_light
        ));
        for p in ray.points.iter().step_by(2) {
            rt.row([
                format!("{:.0}", 100.0 * p.fraction_distilled),
                format!("{:.4}", p.pot_x_light),
                format!("{:.4}", p.vapor_y_light),
                format!("{:.4}", p.distillate_avg_x_light),
                p.pot_t_k.map(c).unwrap_or_default(),
                p.head_t_k.map(c).unwrap_or_default(),
            ]);
        }
        section.table(rt);
        if let Some(cut) = &ray.cut_to_bottoms_target {
            section.paragraph(format!(
                "Stripping the pot to x = {:.4} takes {:.1} % of the charge overhead, with a mean distillate purity of {:.4}.",
                cut.pot_x_light,
                100.0 * cut.fraction_distilled,
                cut.distillate_avg_x_light
            ));
        }
    }
    section.findings(
        plan.findings
            .iter()
            .map(|f| FindingRow::of(f, format!("{} / {}", plan.key_pair[0], plan.key_pair[1])))
            .collect(),
    );
    section.paragraph(format!("Limits: {}", plan.limits));
}
/// The whole report of `ebullio plan`: findings, then the plan with its drawings
/// (boiling points and Rayleigh curve, the column on the equilibrium curve, the
/// key pair's T–x–y diagram with a liquid model), tables and cautions.
pub fn plan_report(plan: &Plan, components: &[Component], command_line: &str) -> Report {
    let mut r = Report::new(format!(
        "Separation plan: {} / {}",
        plan.key_pair[0], plan.key_pair[1]
    ));
    r.subtitle(
        "A plan is a starting point, not a design: confirm the equilibrium with mixture data, and follow local codes and a qualified process-safety review before anything is heated.",
    );
    r.command_line(command_line);
    r.section("Summary and findings")
        .findings(plan_findings(plan));
    add_plan(r.section("Plan"), plan, components);
    r
}
