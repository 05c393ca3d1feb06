//! Report sections for fits: per compound the plots, constants, boiling points, points and reference comparison.
//!
//! Shared by `ebullio fit --report` and the demo. Formatting only: every number
//! comes from the [`FitReport`] or from [`crate::boiling`] on its fitted curve.

use super::html::{Figure, FindingRow, Report, Section, Severity, Table};
use crate::boiling::boiling_points;
use crate::fit::{At, FitReport, FittedCurve};
use crate::table_io::FitRow;

/// Pressures (Pa) a fit report shows boiling points at when none were chosen:
/// 10, 20, 50, 100, 200 and 500 mbar and 1 atm (common vacuum set-points).
pub const DEFAULT_PRESSURES_PA: [f64; 7] = [
    1_000.0, 2_000.0, 5_000.0, 10_000.0, 20_000.0, 50_000.0, 101_325.0,
];

/// The pressures (Pa) a fit report tabulates boiling points at: the requested `at`
/// pressures, else [`DEFAULT_PRESSURES_PA`].
pub fn report_pressures(at: &[At]) -> Vec<f64> {
    let p: Vec<f64> = at
        .iter()
        .filter_map(|a| match a {
            At::PressurePa(p) => Some(*p),
            At::TemperatureK(_) => None,
        })
        .collect();
    if p.is_empty() {
        DEFAULT_PRESSURES_PA.to_vec()
    } else {
        p
    }
}

/// The report of a fit batch ([`crate::table_io::fit_batch()`]): [`fit_report`] of its
/// fitted and failed rows, at the `at` pressures (else the default set-points).
pub fn batch_report(source: &str, rows: &[FitRow], at: &[At], command_line: &str) -> Report {
    let fits: Vec<FitReport> = rows.iter().filter_map(|r| r.report().cloned()).collect();
    let failed: Vec<(Option<String>, String)> = rows
        .iter()
        .filter_map(|r| match r {
            FitRow::Failed { compound, error } => Some((compound.clone(), error.clone())),
            FitRow::Ok(_) => None,
        })
        .collect();
    fit_report(source, &fits, &failed, &report_pressures(at), command_line)
}

fn name(f: &FitReport) -> String {
    f.compound.clone().unwrap_or_else(|| "data".into())
}

fn c(t_k: f64) -> String {
    format!("{:.1}", t_k - crate::units::CELSIUS_OFFSET)
}

/// A pressure in mbar with sensible digits.
pub fn mbar(p_pa: f64) -> String {
    let m = crate::units::pa_to_mbar(p_pa);
    let s = if m >= 100.0 {
        format!("{m:.1}")
    } else if m >= 1.0 {
        format!("{m:.2}")
    } else {
        format!("{m:.4}")
    };
    let s = if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    };
    format!("{s} mbar")
}

/// `text` without its web addresses: a report links to nothing outside itself
/// (the full source, with its address, is in the fit JSON and `reference-data/SOURCES.md`).
pub fn without_urls(text: &str) -> String {
    let kept: Vec<String> = text
        .split(' ')
        .filter_map(|w| {
            if w.contains("://") || w.starts_with("www.") {
                // Keep closing punctuation the address carried.
                let tail: String = w
                    .chars()
                    .rev()
                    .take_while(|c| matches!(c, ')' | ',' | ';'))
                    .collect();
                (!tail.is_empty()).then_some(tail)
            } else {
                Some(w.to_string())
            }
        })
        .collect();
    kept.join(" ")
        .replace(" also at )", ")")
        .replace(" at )", ")")
        .replace(" )", ")")
        .replace(" ;", ";")
        .replace(" ,", ",")
        .replace(";;", ";")
}

/// Every fit's flags as report findings, with the compound as subject.
pub fn fit_findings(fits: &[FitReport]) -> Vec<FindingRow> {
    fits.iter()
        .flat_map(|f| {
            let n = name(f);
            f.flags.iter().map(move |x| FindingRow::of(x, n.clone()))
        })
        .collect()
}

/// One row per fit: model, points, RMS deviation, normal boiling point.
pub fn fit_summary_table(fits: &[FitReport]) -> Table {
    let mut t = Table::new([
        "compound",
        "model",
        "points",
        "RMS dev. of p/%",
        "measured range/K",
        "Tb/K",
        "Tb 95 % interval/K",
    ])
    .caption("Fits at a glance");
    for f in fits {
        let tb = f.normal_boiling_point_k.as_ref();
        let worst = f.flags.iter().map(|x| x.severity).max();
        t.flagged_row(
            [
                name(f),
                f.model.to_string(),
                f.n_points.to_string(),
                format!("{:.2}", f.rms_rel_dev_pct),
                format!("{:.1} to {:.1}", f.t_range_k[0], f.t_range_k[1]),
                tb.map(|i| {
                    format!(
                        "{:.2}{}",
                        i.value,
                        if i.extrapolated {
                            " (extrapolated)"
                        } else {
                            ""
                        }
                    )
                })
                .unwrap_or_else(|| "not reached".into()),
                tb.map(|i| format!("{:.2} to {:.2}", i.ci95_low, i.ci95_high))
                    .unwrap_or_default(),
            ],
            worst.filter(|s| *s >= Severity::Warning),
        );
    }
    t
}

/// Add one subsection per fit to `section`: facts, the fit and residual plot,
/// the constants with their convention, boiling points at `pressures_pa`, the
/// predictions asked for, the points (outliers flagged), the reference comparison
/// and the fit's findings.
pub fn add_fits(section: &mut Section, fits: &[FitReport], pressures_pa: &[f64]) {
    for f in fits {
        add_fit(section.subsection(name(f)), f, pressures_pa);
    }
}

fn add_fit(sub: &mut Section, f: &FitReport, pressures_pa: &[f64]) {
    let n = name(f);
    let tb = f.normal_boiling_point_k.as_ref();
    let mut facts = vec![
        ("model".to_string(), f.model.to_string()),
        ("points".to_string(), f.n_points.to_string()),
        (
            "RMS deviation of p".to_string(),
            format!(
                "{:.2} % (max {:.2} %); in T {:.3} K",
                f.rms_rel_dev_pct, f.max_rel_dev_pct, f.rms_dev_t_k
            ),
        ),
        (
            "measured range".to_string(),
            format!(
                "{:.1} to {:.1} K ({} to {} °C)",
                f.t_range_k[0],
                f.t_range_k[1],
                c(f.t_range_k[0]),
                c(f.t_range_k[1])
            ),
        ),
        (
            "normal boiling point".to_string(),
            tb.map(|i| {
                format!(
                    "{:.2} K (95 %: {:.2} to {:.2} K){}",
                    i.value,
                    i.ci95_low,
                    i.ci95_high,
                    if i.extrapolated {
                        format!(", extrapolated {:.1} K beyond the data", i.extrapolation_k)
                    } else {
                        String::new()
                    }
                )
            })
            .unwrap_or_else(|| "not reached by the curve".into()),
        ),
        ("weighting".to_string(), f.weighting.clone()),
    ];
    if let Some(h) = &f.hvap {
        facts.push((
            "ΔHvap".to_string(),
            format!(
                "{:.2} kJ/mol at {:.1} K (95 %: {:.2} to {:.2}; {})",
                h.value_kj_mol, h.t_k, h.ci95_low, h.ci95_high, h.note
            ),
        ));
    }
    if let Some(m) = &f.model_choice {
        facts.push(("model choice".to_string(), m.reason.clone()));
    }
    sub.facts(facts);
    if let Ok(fig) = Figure::new(
        &super::fit_plot::svg(f),
        format!("{n}: ln p against 1/T with the fit, its 95 % band and flagged points (top); residuals in % of p (bottom)"),
    ) {
        sub.figure(fig);
    }

    let mut pt = Table::new([
        "parameter",
        "value",
        "standard error",
        "95 % low",
        "95 % high",
    ])
    .caption(format!("Constants, convention {}", f.convention));
    for p in &f.parameters {
        pt.row([
            p.name.clone(),
            format!("{:.6}", p.value),
            format!("{:.3e}", p.std_error),
            format!("{:.6}", p.ci95_low),
            format!("{:.6}", p.ci95_high),
        ]);
    }
    sub.table(pt);

    let curve = FittedCurve::from_report(f);
    let mut bt = Table::new([
        "p",
        "t/°C",
        "T/K",
        "95 % interval/K",
        "outside the measured range",
    ])
    .caption("Boiling points at chosen pressures (from the fitted curve)");
    for b in boiling_points(&curve, pressures_pa, 1.96) {
        let ci = match (b.ci95_low_k, b.ci95_high_k) {
            (Some(l), Some(h)) => format!("{l:.2} to {h:.2}"),
            _ => String::new(),
        };
        bt.flagged_row(
            [
                mbar(b.p_pa),
                c(b.t_k),
                format!("{:.2}", b.t_k),
                ci,
                if b.extrapolated { "yes" } else { "no" }.to_string(),
            ],
            b.extrapolated.then_some(Severity::Warning),
        );
    }
    if !bt.is_empty() {
        sub.table(bt);
    }

    if !f.predictions.is_empty() {
        let mut pr = Table::new(["asked for", "result", "95 % interval", "extrapolated"])
            .caption("Predictions asked for");
        for p in &f.predictions {
            let (asked, res, ci) = if p.kind == crate::fit::report::PredictionKind::TAtP {
                (
                    format!("boiling point at {}", mbar(p.p_pa)),
                    format!("{:.2} K ({} °C)", p.t_k, c(p.t_k)),
                    format!("{:.2} to {:.2} K", p.ci95_low, p.ci95_high),
                )
            } else {
                (
                    format!("vapor pressure at {:.2} K ({} °C)", p.t_k, c(p.t_k)),
                    format!("{:.4} kPa", p.p_pa / 1000.0),
                    format!(
                        "{:.4} to {:.4} kPa",
                        p.ci95_low / 1000.0,
                        p.ci95_high / 1000.0
                    ),
                )
            };
            pr.flagged_row(
                [
                    asked,
                    res,
                    ci,
                    if p.extrapolated {
                        format!("yes, {:.1} K", p.extrapolation_k)
                    } else {
                        "no".into()
                    },
                ],
                p.extrapolated.then_some(Severity::Warning),
            );
        }
        sub.table(pr);
    }

    let mut pts = Table::new([
        "#",
        "T/K",
        "p/kPa",
        "deviation of p/%",
        "internally studentized",
        "externally studentized",
        "leverage",
        "Cook's distance",
        "robust weight",
    ])
    .caption("Points (flagged rows are outliers; the outlier rule uses the externally studentized residual)");
    for (i, p) in f.points.iter().enumerate() {
        let number = if p.number > 0 { p.number } else { i + 1 };
        pts.flagged_row(
            [
                number.to_string(),
                format!("{:.2}", p.t_k),
                format!("{:.4}", p.p_pa / 1000.0),
                format!("{:+.2}", p.rel_dev_pct),
                format!("{:+.2}", p.studentized),
                format!("{:+.2}", p.ext_studentized),
                format!("{:.3}", p.leverage),
                format!("{:.3}", p.cooks_distance),
                match (p.robust_weight, p.robust_rejected) {
                    (Some(w), true) => format!("{w:.3} (rejected)"),
                    (Some(w), false) => format!("{w:.3}"),
                    (None, _) => "-".into(),
                },
            ],
            p.outlier.then_some(Severity::Warning),
        );
    }
    for e in &f.excluded {
        pts.flagged_row(
            [
                e.number.to_string(),
                format!("{:.2}", e.t_k),
                format!("{:.4}", e.p_pa / 1000.0),
                format!("excluded ({})", e.by),
                "-".into(),
                "-".into(),
                "-".into(),
                "-".into(),
                "-".into(),
            ],
            Some(Severity::Info),
        );
    }
    sub.table(pts);
    add_reference(sub, f);
    sub.findings(fit_findings(std::slice::from_ref(f)));
}

fn add_reference(sub: &mut Section, f: &FitReport) {
    let Some(v) = &f.reference_comparison else {
        sub.paragraph("Reference comparison: not run.");
        return;
    };
    let num = |x: Option<f64>, unit: &str| {
        x.filter(|x| x.is_finite())
            .map(|x| format!("{x:.3} {unit}"))
            .unwrap_or_else(|| "—".into())
    };
    let mut facts = Vec::new();
    match &v.reference {
        Some(rf) => {
            facts.push(("reference compound", rf.compound.clone()));
            facts.push(("reference source", without_urls(&rf.reference_source)));
            facts.push(("max |p fit / p ref − 1|", num(rf.max_rel_diff_pct, "%")));
            facts.push(("RMS of p fit / p ref − 1", num(rf.rms_rel_diff_pct, "%")));
            facts.push(("reference Tb", num(rf.tb_reference_k, "K")));
            facts.push(("Tb fit − Tb reference", num(rf.tb_diff_k, "K")));
        }
        None => facts.push((
            "reference compound",
            "none found in the bundled tables".to_string(),
        )),
    }
    if let Some((tb, e)) = v
        .structure_tb_k
        .filter(|(a, b)| a.is_finite() && b.is_finite())
    {
        facts.push((
            "structure estimate Tb",
            format!("{tb:.1} K (typical error {e:.1} K)"),
        ));
    }
    let sub = sub.subsection("Reference comparison");
    sub.facts(facts);
}

/// The whole report of `ebullio fit`: summary and findings, then one
/// subsection per compound, then the cautions and the command line.
/// `failed` lists the compounds that could not be fitted and why.
pub fn fit_report(
    source: &str,
    fits: &[FitReport],
    failed: &[(Option<String>, String)],
    pressures_pa: &[f64],
    command_line: &str,
) -> Report {
    let mut r = Report::new(format!("Vapor-pressure fit: {source}"));
    r.subtitle(format!(
        "{} compound(s) fitted from {source}{}.",
        fits.len(),
        if failed.is_empty() {
            String::new()
        } else {
            format!(", {} not fitted", failed.len())
        }
    ));
    r.command_line(command_line);
    let s = r.section("Summary and findings");
    let mut findings = fit_findings(fits);
    for (c, e) in failed {
        findings.push(FindingRow::new(
            Severity::Error,
            c.clone().unwrap_or_else(|| "data".into()),
            "fit-failed",
            e.clone(),
        ));
    }
    s.findings(findings);
    s.table(fit_summary_table(fits));
    let fs = r.section("Fits");
    add_fits(fs, fits, pressures_pa);
    r
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn addresses_are_dropped_and_the_citation_kept() {
        let s = "Smith, App. B; https://example.org/b.pdf (columns A,B also at https://example.org/x.html) (file, line 8)";
        assert_eq!(
            without_urls(s),
            "Smith, App. B; (columns A,B) (file, line 8)"
        );
        assert_eq!(without_urls("no address"), "no address");
    }

    #[test]
    fn mbar_has_sensible_digits() {
        assert_eq!(mbar(2000.0), "20 mbar");
        assert_eq!(mbar(101_325.0), "1013.2 mbar");
        assert_eq!(mbar(66.66), "0.6666 mbar");
    }
}
