//! The HTML report of a binary VLE fit: findings, the consistency verdict, parameters,
//! γ∞ and azeotropes, the plots and the points. Formatting only: every number comes
//! from the [`BinaryFitReport`].

use super::html::{Figure, FindingRow, Report, Section, Table};
use crate::mixture::fit::{BinaryFitReport, DataKind};
use crate::units::CELSIUS_OFFSET;

fn g(v: f64, d: usize) -> String {
    if v.is_finite() {
        format!("{v:.d$}")
    } else {
        "-".into()
    }
}

fn og(v: Option<f64>, d: usize) -> String {
    v.map_or("-".into(), |v| g(v, d))
}

/// The whole report for `ebullio fit DATA --report fit.html` on binary data.
pub fn binary_fit_report(source: &str, r: &BinaryFitReport, command_line: &str) -> Report {
    let pair = pair_name(r);
    let mut rep = Report::new(format!("Binary VLE fit: {pair}"));
    let cond = match (r.pressure_pa, r.temperature_k) {
        (Some(p), _) => format!("T-x-y at {} kPa", g(p / 1000.0, 3)),
        (_, Some(t)) => format!("p-x-y at {} °C", g(t - CELSIUS_OFFSET, 2)),
        _ => String::new(),
    };
    rep.subtitle(format!(
        "{} points from {source}, {cond}; model {}.",
        r.statistics.n_points, r.model
    ));
    rep.command_line(command_line);
    let mut cautions: Vec<String> = r.cautions.clone();
    cautions.extend(super::html::standard_cautions());
    cautions.dedup();
    rep.cautions(cautions);

    add_binary_fit(&mut rep, r);
    rep
}

/// The pair's name as the report writes it.
fn pair_name(r: &BinaryFitReport) -> String {
    let names: Vec<&str> = r.components.iter().map(|c| c.name.as_str()).collect();
    if names.len() == 2 {
        format!("{} (1) / {} (2)", names[0], names[1])
    } else {
        "binary".into()
    }
}

/// The fit's findings as report rows (for a summary).
pub fn binary_fit_findings(r: &BinaryFitReport) -> Vec<FindingRow> {
    let pair = pair_name(r);
    r.flags
        .iter()
        .map(|f| FindingRow::of(f, pair.clone()))
        .collect()
}

/// The three sections of a binary fit (findings and consistency, model, points) added
/// to `rep`, for the command's report and the demo.
pub fn add_binary_fit(rep: &mut Report, r: &BinaryFitReport) {
    add_consistency(rep.section("Findings and consistency"), r);
    add_model(rep.section("Model and parameters"), r);
    add_points(rep.section("Points"), r);
}

/// Findings and the consistency table into `s`.
pub fn add_consistency(s: &mut Section, r: &BinaryFitReport) {
    s.findings(binary_fit_findings(r));
    let mut t = Table::new(["test", "verdict", "statistic", "criterion", "what it means"])
        .caption("Thermodynamic-consistency tests (each needs measured y1)");
    for c in &r.consistency {
        t.row([
            c.test.clone(),
            if c.passed {
                "pass".into()
            } else {
                "FAIL".into()
            },
            g(c.statistic, 4),
            c.criterion.clone(),
            c.meaning.clone(),
        ]);
    }
    for c in &r.consistency_not_run {
        t.row([
            c.test.clone(),
            "not run".into(),
            "-".into(),
            "-".into(),
            c.reason.clone(),
        ]);
    }
    s.table(t);
}

/// Vapor-pressure sources, model choice, parameters, γ∞, azeotropes and the figure into `s`.
pub fn add_model(s: &mut Section, r: &BinaryFitReport) {
    for c in &r.components {
        s.paragraph(format!(
            "Vapor pressure of {}: {}.",
            c.name, c.vapor_pressure_source
        ));
    }
    if let Some(mc) = &r.model_choice {
        s.paragraph(format!("Model choice: {}", mc.reason));
    }
    let mut t = Table::new(["parameter", "value", "standard error", "95 % interval"])
        .caption("Fitted parameters (temperature-independent)");
    for p in &r.parameters {
        t.row([
            p.name.clone(),
            g(p.value, 5),
            g(p.std_error, 3),
            format!("{} to {}", g(p.ci95_low, 4), g(p.ci95_high, 4)),
        ]);
    }
    for f in &r.fixed_parameters {
        t.row([f.name.clone(), g(f.value, 3), "fixed".into(), "-".into()]);
    }
    s.table(t);
    let mut facts: Vec<(String, String)> = Vec::new();
    for j in 0..2 {
        facts.push((
            format!(
                "γ{}∞ at {} °C",
                j + 1,
                g(r.gamma_infinity_t_k[j] - CELSIUS_OFFSET, 2)
            ),
            format!(
                "{}{}",
                g(r.gamma_infinity[j], 3),
                r.gamma_infinity_ci95[j].map_or(String::new(), |[a, b]| format!(
                    " (95 %: {} to {})",
                    g(a, 3),
                    g(b, 3)
                ))
            ),
        ));
    }
    for a in &r.azeotropes {
        let at = match (a.t_k, a.p_pa) {
            (Some(t), _) => format!("{} °C", g(t - CELSIUS_OFFSET, 2)),
            (_, Some(p)) => format!("{} kPa", g(p / 1000.0, 3)),
            _ => String::new(),
        };
        facts.push((
            format!("{} azeotrope", a.kind.as_str()),
            format!(
                "x1 = {}{} at {at}{}",
                g(a.x1, 3),
                a.x1_ci95.map_or(String::new(), |[l, h]| format!(
                    " (95 %: {} to {})",
                    g(l, 3),
                    g(h, 3)
                )),
                if a.inside_data {
                    ""
                } else {
                    ", outside the measured compositions"
                }
            ),
        ));
    }
    facts.push((
        "reduced chi-square".into(),
        format!(
            "{} (u(T) = {} K, u(y1) = {}, u(p) = {} %)",
            og(r.statistics.reduced_chi_square, 2),
            r.uncertainties.t_k,
            r.uncertainties.y1,
            100.0 * r.uncertainties.p_rel
        ),
    ));
    s.facts(facts);
    match super::binary_fit_plot::binary_fit_svg(r)
        .ok()
        .and_then(|svg| {
            Figure::new(
                &svg,
                "Data and model; ln(γ1/γ2) against x1 (consistency); residuals.",
            )
            .ok()
        }) {
        Some(f) => {
            s.figure(f);
        }
        None => {
            s.paragraph("The plot could not be drawn (no converged model curve).");
        }
    }
}

/// The points table into `s`.
pub fn add_points(s: &mut Section, r: &BinaryFitReport) {
    let iso = r.kind == DataKind::Isobaric;
    let mut t = Table::new([
        "#",
        "line",
        "x1",
        "y1",
        if iso { "t/°C" } else { "p/kPa" },
        if iso { "t model/°C" } else { "p model/kPa" },
        if iso { "dT/K" } else { "dp/%" },
        "y1 model",
        "dy1",
        "outlier",
    ]);
    for p in &r.points {
        let (m, c) = if iso {
            (
                g(p.t_k - CELSIUS_OFFSET, 2),
                p.calc.map_or("-".into(), |v| g(v - CELSIUS_OFFSET, 2)),
            )
        } else {
            (
                g(p.p_pa / 1000.0, 3),
                p.calc.map_or("-".into(), |v| g(v / 1000.0, 3)),
            )
        };
        t.row([
            p.number.to_string(),
            p.line.map_or("-".into(), |l| l.to_string()),
            g(p.x1, 4),
            og(p.y1, 4),
            m,
            c,
            og(p.deviation, 2),
            og(p.y1_calc, 4),
            og(p.y1_deviation, 4),
            if p.outlier {
                "yes".into()
            } else {
                String::new()
            },
        ]);
    }
    s.table(t);
}
