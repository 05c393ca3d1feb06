//! Report sections for structure estimates: the values with their intervals, boiling points at pressures, the group breakdown.
//!
//! Shared by `ebullio estimate --report` and the demo. Formatting only.

use super::curve_plot::{CurvePlot, PlotCurve};
use super::fit_section::mbar;
use super::html::{Figure, FindingRow, Report, Section, Severity, Table};
use crate::estimate::batch::EstimateRow;
use crate::estimate::{calibration, group, Estimate, LeeKeslerCurve};
use crate::vapor::Curve;

fn label(r: &EstimateRow, i: usize) -> String {
    r.compound
        .clone()
        .filter(|c| !c.trim().is_empty())
        .or_else(|| r.smiles_given.clone())
        .unwrap_or_else(|| format!("structure {}", i + 1))
}

fn opt(v: Option<f64>, digits: usize) -> String {
    v.map_or(String::new(), |x| format!("{x:.digits$}"))
}

/// Findings about the estimates: structures that could not be handled,
/// anchoring shifts, widened intervals, and the estimates-not-measurements note.
pub fn estimate_findings(rows: &[EstimateRow]) -> Vec<FindingRow> {
    let mut out = Vec::new();
    for (i, r) in rows.iter().enumerate() {
        let n = label(r, i);
        if !r.error.is_empty() {
            out.push(FindingRow::new(
                Severity::Error,
                n.clone(),
                "estimate-failed",
                r.error.clone(),
            ));
        }
        if let Some(a) = &r.anchored {
            out.push(FindingRow::new(
                Severity::Info,
                n.clone(),
                "estimate-anchored",
                format!(
                    "The estimated curve was anchored to {} measured point(s); its normal boiling point moved by {:+.1} K to {:.1} K.",
                    a.deviations.len(),
                    a.tb_shift_k,
                    a.tb_k
                ),
            ));
        }
        if let Some(e) = &r.estimate {
            for d in &e.comfort.details {
                out.push(FindingRow::new(
                    Severity::Warning,
                    n.clone(),
                    "outside-calibration",
                    format!(
                        "The 90 % interval was widened ×{:.1}: {d}.",
                        e.comfort.factor
                    ),
                ));
            }
            if let Some(rf) = &r.reference {
                out.push(FindingRow::new(
                    Severity::Info,
                    n.clone(),
                    "reference-beside-estimate",
                    format!(
                        "The structure is the reference compound {} (Tb {:.2} K, {}); the estimate is {:+.1} K off. Use the reference value.",
                        rf.compound, rf.tb_k, rf.source, rf.estimate_error_k
                    ),
                ));
            }
        }
    }
    out
}

/// The estimates at a glance: one row per structure.
pub fn estimate_summary_table(rows: &[EstimateRow]) -> Table {
    let mut t = Table::new([
        "compound",
        "SMILES",
        "Tb/K",
        "90 % interval/K",
        "method",
        "Joback Tb/K",
        "Tc/K",
        "pc/bar",
        "ω",
        "anchored Tb/K",
    ])
    .caption(
        "Estimated normal boiling points and critical constants (estimates are not measurements)",
    );
    for (i, r) in rows.iter().enumerate() {
        match &r.estimate {
            Some(e) => {
                t.row([
                    label(r, i),
                    e.smiles
                        .clone()
                        .unwrap_or_else(|| "(groups by hand)".into()),
                    format!("{:.1}", e.tb_k),
                    format!("{:.1} to {:.1}", e.tb_pi90_low_k, e.tb_pi90_high_k),
                    e.tb_variant.name().to_string(),
                    opt(e.tb_joback_k, 1),
                    opt(e.tc_k, 1),
                    opt(e.pc_bar, 2),
                    opt(e.omega, 3),
                    opt(r.anchored.as_ref().map(|a| a.tb_k), 1),
                ]);
            }
            None => {
                t.flagged_row(
                    [
                        label(r, i),
                        r.smiles_given.clone().unwrap_or_default(),
                        format!("not estimated: {}", r.error),
                    ],
                    Some(Severity::Error),
                );
            }
        }
    }
    t
}

/// Boiling points at the requested pressures, one row per structure and pressure.
pub fn at_pressure_table(rows: &[EstimateRow]) -> Table {
    let mut t = Table::new([
        "compound",
        "p",
        "t/°C",
        "T/K",
        "90 % interval/K",
        "curve",
        "outside the curve's range",
    ])
    .caption("Boiling points at chosen pressures (Lee–Kesler curve from the estimate)");
    for (i, r) in rows.iter().enumerate() {
        for a in &r.at {
            let Some(tk) = a.t_k else { continue };
            t.flagged_row(
                [
                    label(r, i),
                    mbar(a.p_pa),
                    format!("{:.1}", tk - crate::units::CELSIUS_OFFSET),
                    format!("{tk:.1}"),
                    match (a.pi90_low_k, a.pi90_high_k) {
                        (Some(l), Some(h)) if r.anchored.is_none() => format!("{l:.1} to {h:.1}"),
                        _ => String::new(),
                    },
                    if r.anchored.is_some() {
                        "anchored"
                    } else {
                        "pure estimate"
                    }
                    .to_string(),
                    if a.extrapolated { "yes" } else { "no" }.to_string(),
                ],
                a.extrapolated.then_some(Severity::Warning),
            );
        }
    }
    t
}

/// The terms behind the recommended Tb: each group or correction, its count, the
/// project's fitted value with its standard error, how many calibration compounds
/// carry it, and the published Joback ΔTb where one exists.
pub fn tb_terms_table(e: &Estimate) -> Table {
    let mut t = Table::new([
        "term",
        "kind",
        "count",
        "fitted value",
        "standard error",
        "calibration compounds",
        "origin",
        "published Joback ΔTb/K",
    ])
    .caption(format!(
        "Terms of the recommended Tb ({}): values are this project's regression on its calibration set",
        e.tb_variant.name()
    ));
    for x in &e.tb_terms {
        t.row([
            x.id.clone(),
            x.kind.to_string(),
            x.count.to_string(),
            format!("{:.4}", x.value),
            opt(x.se, 4),
            x.n_compounds.to_string(),
            x.origin.to_string(),
            opt(x.published_joback_dtb_k, 2),
        ]);
    }
    t
}

/// The Joback group breakdown of one estimate: each group, its count, its
/// published ΔTb and its share of the Joback boiling point (198 K + Σ n·ΔTb).
pub fn group_table(e: &Estimate) -> Table {
    let mut t =
        Table::new(["group id", "group", "count", "ΔTb/K", "count × ΔTb/K"]).caption(format!(
            "Joback groups: Tb(Joback) = 198 K + Σ count × ΔTb = {}",
            e.tb_joback_k.map_or(
                "not defined (a group is not in the published table)".to_string(),
                |t| format!("{t:.1} K")
            )
        ));
    for (id, n) in &e.groups {
        let g = group(id);
        let dtb = g.and_then(|g| g.tb);
        t.row([
            id.clone(),
            g.map(|g| g.name.clone()).unwrap_or_default(),
            n.to_string(),
            opt(dtb, 2),
            opt(dtb.map(|d| d * *n as f64), 2),
        ]);
    }
    t
}

/// The estimated (anchored, where anchored) curves from 1 mbar to 1 atm in one plot.
fn curves_figure(rows: &[EstimateRow]) -> Option<Figure> {
    let curves: Vec<(String, LeeKeslerCurve)> = rows
        .iter()
        .enumerate()
        .filter_map(|(i, r)| {
            let c = match &r.anchored {
                Some(a) => Some(a.curve),
                None => r.estimate.as_ref().and_then(|e| e.curve()),
            }?;
            Some((label(r, i), c))
        })
        .collect();
    let lo = curves
        .iter()
        .filter_map(|(_, c)| c.t_at(100.0))
        .fold(f64::INFINITY, f64::min);
    let hi = curves
        .iter()
        .filter_map(|(_, c)| c.t_at(101_325.0))
        .fold(f64::NEG_INFINITY, f64::max);
    if !(lo.is_finite() && hi > lo) {
        return None;
    }
    let mut plot = CurvePlot::new(
        "Estimated vapor-pressure curves (Lee–Kesler)",
        (lo - 5.0, hi + 5.0),
    );
    for (n, c) in &curves {
        plot = plot.curve(PlotCurve::new(n.clone(), c));
    }
    for p in rows.first().map(|r| r.at.as_slice()).unwrap_or(&[]) {
        plot = plot.pressure_line(mbar(p.p_pa), p.p_pa);
    }
    let svg = plot.render_svg().ok()?;
    Figure::new(
        &svg,
        "Estimated curves from 1 mbar to 1 atm (anchored curves where a measured point was given); estimates, not measurements",
    )
    .ok()
}

/// Add the estimates to `section`: the summary table, the boiling points at
/// pressures, then per structure its properties, anchoring and group breakdown,
/// and the dev-set calibration behind the intervals.
pub fn add_estimates(section: &mut Section, rows: &[EstimateRow]) {
    section.table(estimate_summary_table(rows));
    let at = at_pressure_table(rows);
    if !at.is_empty() {
        section.table(at);
    }
    if let Some(fig) = curves_figure(rows) {
        section.figure(fig);
    }
    let cal = calibration();
    section.paragraph(cal.summary());
    for (i, r) in rows.iter().enumerate() {
        let Some(e) = &r.estimate else { continue };
        let sub = section.subsection(label(r, i));
        sub.facts([
            ("SMILES", e.smiles.clone().unwrap_or_default()),
            ("formula", e.formula.clone().unwrap_or_default()),
            (
                "normal boiling point",
                format!(
                    "{:.1} K ({:.1} °C), 90 % interval {:.1} to {:.1} K, typical error {:.1} K ({})",
                    e.tb_k,
                    e.tb_k - crate::units::CELSIUS_OFFSET,
                    e.tb_pi90_low_k,
                    e.tb_pi90_high_k,
                    e.tb_typical_error_k,
                    e.tb_variant.name()
                ),
            ),
            (
                "Joback / Stein–Brown Tb",
                format!("{} K / {} K", opt(e.tb_joback_k, 1), opt(e.tb_stein_brown_k, 1)),
            ),
            (
                "Tc, pc, Vc",
                format!(
                    "{} K, {} bar, {} cm³/mol",
                    opt(e.tc_k, 1),
                    opt(e.pc_bar, 2),
                    opt(e.vc_cm3_mol, 1)
                ),
            ),
            ("acentric factor ω (Lee–Kesler)", opt(e.omega, 3)),
            ("Tm", format!("{} K", opt(e.tm_k, 1))),
            (
                "ΔHvap(Tb), ΔHfus",
                format!(
                    "{} kJ/mol, {} kJ/mol",
                    opt(e.hvap_tb_kj_mol, 2),
                    opt(e.hfus_kj_mol, 2)
                ),
            ),
        ]);
        if let Some(a) = &r.anchored {
            let mut t = Table::new([
                "measured T/K",
                "at",
                "pure estimate T/K",
                "estimate − measured/K",
            ])
            .caption(format!(
                "Anchoring: the curve was moved through the measured point(s); Tb {:.1} K ({:+.1} K)",
                a.tb_k, a.tb_shift_k
            ));
            for d in &a.deviations {
                t.row([
                    format!("{:.2}", d.measured.t_k),
                    mbar(d.measured.p_pa),
                    opt(d.estimate_t_k, 2),
                    opt(d.deviation_k, 2),
                ]);
            }
            sub.table(t);
        }
        sub.table(group_table(e));
        if !e.tb_terms.is_empty() {
            sub.table(tb_terms_table(e));
        }
    }
}

/// The whole report of `ebullio estimate`.
pub fn estimate_report(rows: &[EstimateRow], command_line: &str) -> Report {
    let mut r = Report::new("Structure estimates (Joback group contributions)");
    let ok = rows.iter().filter(|r| r.estimate.is_some()).count();
    r.subtitle(format!(
        "{ok} of {} structure(s) estimated. Estimates are not measurements: each boiling point carries a calibrated 90 % interval.",
        rows.len()
    ));
    r.command_line(command_line);
    r.section("Summary and findings")
        .findings(estimate_findings(rows));
    add_estimates(r.section("Estimates"), rows);
    r
}
