//! The `plan` command's terminal report and pressure-table CSV.

use super::{celsius, mbar, opt, Csv};
use crate::plan::*;
use std::fmt::Write as _;

/// The pressure table as CSV (one row per pressure).
pub fn csv(p: &Plan) -> Result<String, csv::Error> {
    let mut head = vec!["p/Pa".to_string()];
    head.extend(p.components.iter().map(|c| format!("T_b({})/K", c.name)));
    head.extend(
        [
            "delta_T_b/K",
            "alpha",
            "fenske_min_stages",
            "extrapolated",
            "operating",
        ]
        .map(String::from),
    );
    let mut w = Csv::new(&head);
    for r in &p.pressure_table {
        let mut row = vec![format!("{}", r.p_pa)];
        row.extend(r.tb_k.iter().map(|t| format!("{t:.3}")));
        row.push(format!("{:.3}", r.delta_tb_k));
        row.push(format!("{:.5}", r.relative_volatility));
        row.push(opt(r.fenske_min_stages, 3).replace('—', ""));
        row.push(r.extrapolated.to_string());
        row.push(r.operating.to_string());
        w.row(&row);
    }
    w.finish()
}

/// The readable report.
pub fn table(p: &Plan) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "Separation plan (key pair liquid: {})",
        if p.activity_model == "ideal" {
            "ideal solution, Raoult's law".to_string()
        } else {
            format!("{} activity coefficients", p.activity_model.to_uppercase())
        }
    );
    let _ = write!(
        s,
        "Operating pressure: {} mbar ({:.1} Pa)",
        mbar(p.pressure_pa),
        p.pressure_pa
    );
    if let Some(m) = &p.pressure_choice.max_pot {
        let _ = write!(
            s,
            " — from max pot {:.1} °C: {} boils there at {} mbar; {}",
            celsius(m.max_pot_k),
            m.heaviest,
            mbar(m.unrounded_pa),
            crate::plan::pressure::ROUNDING_RULE
        );
    }
    let _ = writeln!(s, "\n");
    let _ = writeln!(
        s,
        "{:<24} {:>10} {:>12}  source",
        "component", "t_b/°C", "u(t_b)/K"
    );
    for k in &p.components {
        let _ = writeln!(
            s,
            "{:<24} {:>10.2} {:>12}  {}{}",
            k.name,
            celsius(k.tb_k),
            opt(k.u_tb_k, 2),
            k.source,
            if k.extrapolated {
                " [extrapolated]"
            } else {
                ""
            }
        );
    }
    let d = &p.relative_volatility_detail;
    let _ = writeln!(
        s,
        "\nKey pair: {} / {}   Δt_b = {:.2} K",
        d.pair.light, d.pair.heavy, d.pair.delta_tb_k
    );
    let _ = writeln!(
        s,
        "Relative volatility (Raoult): {:.4} at t_b({}), {:.4} at t_b({}), geometric mean {:.4} ({})",
        d.pair.at_light_tb,
        d.pair.light,
        d.pair.at_heavy_tb,
        d.pair.heavy,
        p.relative_volatility,
        if d.u_ln_alpha > 0.0 {
            format!("95 % {:.4}–{:.4}", d.ci95_low, d.ci95_high)
        } else {
            "no uncertainty stated by the sources".to_string()
        }
    );
    let no_u = d.u_ln_alpha <= 0.0;
    let f = &p.fenske_detail;
    let _ = writeln!(
        s,
        "Fenske minimum theoretical stages (x_D = {}, x_B = {}): {}{}",
        f.distillate_purity,
        f.bottoms_purity,
        opt(p.fenske_min_stages, 2),
        if no_u {
            String::new()
        } else {
            format!(
                " (95 % {}–{})",
                opt(f.ci95_low, 2),
                f.ci95_high
                    .map(|v| format!("{v:.2}"))
                    .unwrap_or_else(|| "unbounded".into())
            )
        }
    );
    if p.pairs.len() > 1 {
        let _ = writeln!(s, "\nAdjacent pairs:");
        for q in &p.pairs {
            let _ = writeln!(
                s,
                "  {:<20} {:<20} Δt_b {:>7.2} K  α {:>8.4}  N_min {}",
                q.light,
                q.heavy,
                q.delta_tb_k,
                q.relative_volatility,
                opt(q.fenske_min_stages, 2)
            );
        }
    }
    let _ = writeln!(s, "\nAcross pressures (key pair):");
    let _ = write!(s, "{:>12}", "p/mbar");
    for k in &p.components {
        let _ = write!(s, " {:>14}", format!("t_b {}", truncate(&k.name, 9)));
    }
    let _ = writeln!(s, " {:>9} {:>8} {:>7}", "Δt_b/K", "α", "N_min");
    for r in &p.pressure_table {
        let _ = write!(s, "{:>12}", mbar(r.p_pa));
        for t in &r.tb_k {
            let _ = write!(s, " {:>14.2}", celsius(*t));
        }
        let _ = writeln!(
            s,
            " {:>9.2} {:>8.4} {:>7}{}{}",
            r.delta_tb_k,
            r.relative_volatility,
            opt(r.fenske_min_stages, 2),
            if r.operating { "  <- operating" } else { "" },
            if r.extrapolated {
                "  (extrapolated)"
            } else {
                ""
            }
        );
    }
    if let Some(r) = &p.rayleigh {
        let _ = writeln!(
            s,
            "\nSimple batch distillation (Rayleigh, {}), charge x({}) = {}:",
            r.model, p.key_pair[0], r.feed_x_light
        );
        let _ = writeln!(
            s,
            "{:>10} {:>10} {:>12} {:>14} {:>10} {:>10}",
            "distilled", "pot x", "distillate y", "all distillate", "pot/°C", "head/°C"
        );
        for pt in r.points.iter().step_by(2) {
            let _ = writeln!(
                s,
                "{:>9.0}% {:>10.4} {:>12.4} {:>14.4} {:>10} {:>10}",
                100.0 * pt.fraction_distilled,
                pt.pot_x_light,
                pt.vapor_y_light,
                pt.distillate_avg_x_light,
                opt(pt.pot_t_k.map(celsius), 2),
                opt(pt.head_t_k.map(celsius), 2)
            );
        }
        if let Some(cut) = &r.cut_to_bottoms_target {
            let _ = writeln!(
                s,
                "Stripping the pot to x = {:.4}: {:.1} % of the charge distilled, mean distillate purity {:.4}",
                cut.pot_x_light,
                100.0 * cut.fraction_distilled,
                cut.distillate_avg_x_light
            );
        }
    }
    if !p.azeotropes.is_empty() {
        let _ = writeln!(s, "\nAzeotropes of the key pair ({}):", p.activity_model);
        for a in &p.azeotropes {
            let _ = writeln!(
                s,
                "  {} at x({}) = {:.3}{}",
                a.kind_str(),
                p.key_pair[0],
                a.x1,
                a.t_k
                    .map(|t| format!(", {:.2} °C", celsius(t)))
                    .unwrap_or_default()
            );
        }
    }
    if p.liquid_split.predicted {
        let _ = writeln!(
            s,
            "Two liquids predicted between x({}) = {} and {}",
            p.key_pair[0],
            opt(p.liquid_split.x1_low, 4),
            opt(p.liquid_split.x1_high, 4)
        );
    }
    if let Some(col) = &p.column {
        let _ = writeln!(
            s,
            "\nContinuous column for the key pair (McCabe–Thiele on the {} curve, feed x = {}, q = {}):",
            col.equilibrium, col.feed_x_light, col.feed_q
        );
        let _ = writeln!(
            s,
            "  minimum stages at total reflux {:.2}; minimum reflux ratio {:.3} ({:?} pinch at x = {:.4})",
            col.min_stages,
            col.min_reflux,
            col.pinch,
            col.pinch_x_light
        );
        let _ = writeln!(
            s,
            "  at R = {:.3} ({} × minimum): {:.2} theoretical stages ({} whole, reboiler counted), feed on stage {}",
            col.reflux_ratio, col.reflux_factor, col.stages, col.whole_stages, col.feed_stage
        );
        match &col.fug {
            Some(f) => {
                let _ = writeln!(
                    s,
                    "  Fenske–Underwood–Gilliland at α = {:.3}: N_min {:.2}, R_min {:.3}, N {:.2} at R = {:.3}, feed on stage {} (Kirkbride)",
                    f.alpha, f.n_min, f.r_min, f.gilliland.n, f.r, f.feed.feed_stage
                );
            }
            None => {
                let _ = writeln!(s, "  {}", col.fug_note);
            }
        }
    }
    let _ = writeln!(s, "\nVerdict: {}", p.verdict.message);
    for h in &p.verdict.hints {
        let _ = writeln!(s, "  - {h}");
    }
    let _ = writeln!(s, "{}", p.verdict.rule_of_thumb.message);
    if !p.findings.is_empty() {
        let _ = writeln!(s, "\nFindings:");
        for f in &p.findings {
            let _ = writeln!(s, "  [{}] {}: {}", f.severity, f.code, f.message);
        }
    }
    let _ = writeln!(s, "\nLimits: {}", p.limits);
    let _ = writeln!(s, "Cautions:");
    for k in p.cautions {
        let _ = writeln!(s, "  - {k}");
    }
    s
}

fn truncate(s: &str, n: usize) -> String {
    s.chars().take(n).collect()
}
