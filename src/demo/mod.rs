//! The embedded demo scenario (invented Harrow Vale Fine Chemicals data) run end to end.
//!
//! [`run`] fits the in-house measurements, compares them with the reference
//! library, estimates the new structures (anchoring the one with a reported
//! reduced-pressure boiling point), gives boiling points at the planned vacuum,
//! and builds the HTML report. All data are INVENTED (see
//! `reference-data/demo/README.md`).

use crate::boiling::{boiling_points, BoilResult};
use crate::estimate::anchor::{anchor, MeasuredPoint};
use crate::estimate::{estimate_smiles, Estimate};
use crate::fit::{fit_set, FitOptions, FitReport, FittedCurve};
use crate::reference::compare::Tolerances;
use crate::reference::fit_check::check_fit;
use crate::reference::Library;
use crate::report::curve_plot::{CurvePlot, PlotCurve};
use crate::report::html::{Figure, Finding, Report, Severity, Table};
use crate::table_io::{read_measured_bytes, ReadOptions};
use crate::units::parse_quantity;
use crate::units::Quantity;
use std::path::Path;

/// The embedded files: (name, text).
pub const FILES: [(&str, &str); 6] = [
    (
        "ebulliometer-2026.csv",
        include_str!("../../reference-data/demo/ebulliometer-2026.csv"),
    ),
    (
        "rotavap-log-2026.csv",
        include_str!("../../reference-data/demo/rotavap-log-2026.csv"),
    ),
    (
        "supplier-properties.csv",
        include_str!("../../reference-data/demo/supplier-properties.csv"),
    ),
    (
        "new-structures.csv",
        include_str!("../../reference-data/demo/new-structures.csv"),
    ),
    (
        "plan.json",
        include_str!("../../reference-data/demo/plan.json"),
    ),
    (
        "README.md",
        include_str!("../../reference-data/demo/README.md"),
    ),
];

/// The planned vacuum of the scenario, Pa (20 mbar).
pub const VACUUM_PA: f64 = 2000.0;

/// One estimated structure.
#[derive(Debug, Clone, serde::Serialize)]
pub struct DemoEstimate {
    /// Name.
    pub compound: String,
    /// The estimate (None when the structure could not be handled).
    pub estimate: Option<Estimate>,
    /// Why not, when it could not.
    pub error: String,
    /// Anchored normal boiling point, K, when a reduced-pressure point was given.
    pub anchored_tb_k: Option<f64>,
    /// Boiling point at the vacuum, K (anchored curve when anchored).
    pub t_at_vacuum_k: Option<f64>,
}

/// Everything the demo computed.
#[derive(Debug, Clone)]
pub struct DemoRun {
    /// Fit reports, one per measured compound.
    pub fits: Vec<FitReport>,
    /// Boiling points at the vacuum from each fit.
    pub fit_at_vacuum: Vec<(String, BoilResult)>,
    /// Estimates for the new structures.
    pub estimates: Vec<DemoEstimate>,
    /// Findings for the summary.
    pub findings: Vec<Finding>,
}

/// Run the whole scenario. Errors only if the embedded data are broken.
pub fn run() -> Result<DemoRun, String> {
    let lib = Library::bundled();
    let mut fits = Vec::new();
    let mut findings = Vec::new();
    for (name, text) in &FILES[..2] {
        let data = read_measured_bytes(Path::new(name), text.as_bytes(), &ReadOptions::default())
            .map_err(|e| e.to_string())?;
        for set in &data.sets {
            let opts = FitOptions {
                at: vec![crate::fit::At::PressurePa(VACUUM_PA)],
                ..FitOptions::default()
            };
            match fit_set(set, &opts) {
                Ok(mut r) => {
                    check_fit(&mut r, lib, None, None, Tolerances::default());
                    fits.push(r);
                }
                Err(e) => findings.push(Finding::new(
                    Severity::Error,
                    set.compound.clone().unwrap_or_default(),
                    "fit-failed",
                    e.to_string(),
                )),
            }
        }
    }
    let mut fit_at_vacuum = Vec::new();
    for r in &fits {
        let name = r.compound.clone().unwrap_or_default();
        for f in &r.flags {
            let sev = match f.severity {
                crate::fit::Severity::Error => Severity::Error,
                crate::fit::Severity::Warning => Severity::Warning,
                crate::fit::Severity::Info => Severity::Info,
            };
            findings.push(Finding::new(
                sev,
                name.clone(),
                f.code.clone(),
                f.message.clone(),
            ));
        }
        let curve = FittedCurve::from_report(r);
        if let Some(b) = boiling_points(&curve, &[VACUUM_PA], 1.96)
            .into_iter()
            .next()
        {
            fit_at_vacuum.push((name, b));
        }
    }
    let mut estimates = Vec::new();
    let text = FILES[3].1;
    for line in text.lines().filter(|l| !l.starts_with('#')).skip(1) {
        let cells: Vec<&str> = line.splitn(3, ',').collect();
        let (Some(name), Some(smiles)) = (cells.first(), cells.get(1)) else {
            continue;
        };
        let reported = cells.get(2).copied().unwrap_or("").trim();
        let mut d = DemoEstimate {
            compound: name.to_string(),
            estimate: None,
            error: String::new(),
            anchored_tb_k: None,
            t_at_vacuum_k: None,
        };
        match estimate_smiles(smiles) {
            Ok(e) => {
                if let Some(curve) = e.curve() {
                    d.t_at_vacuum_k = crate::vapor::Curve::t_at(&curve, VACUUM_PA);
                    if let Some(point) = parse_reported(reported) {
                        if let Ok(a) = anchor(&curve, &[point]) {
                            d.anchored_tb_k = Some(a.tb_k);
                            d.t_at_vacuum_k = crate::vapor::Curve::t_at(&a.curve, VACUUM_PA);
                            findings.push(Finding::new(
                                Severity::Info,
                                name.to_string(),
                                "estimate-anchored",
                                format!(
                                    "The estimated curve was anchored to the reported {reported}; its normal boiling point moved by {:+.1} K to {:.1} K.",
                                    a.tb_shift_k, a.tb_k
                                ),
                            ));
                        }
                    }
                }
                d.estimate = Some(e);
            }
            Err(e) => d.error = e.to_string(),
        }
        estimates.push(d);
    }
    Ok(DemoRun {
        fits,
        fit_at_vacuum,
        estimates,
        findings,
    })
}

/// Parse "77 degC at 0.5 mmHg".
fn parse_reported(s: &str) -> Option<MeasuredPoint> {
    let (t, p) = s.split_once(" at ")?;
    let t = match parse_quantity(t.trim()).ok()? {
        Quantity::Temperature(t) => t.kelvin(),
        _ => return None,
    };
    let p = match parse_quantity(p.trim()).ok()? {
        Quantity::Pressure(p) => p.pa(),
        _ => return None,
    };
    Some(MeasuredPoint { t_k: t, p_pa: p })
}

fn c(t_k: f64) -> String {
    format!("{:.1}", t_k - 273.15)
}

/// Build the self-contained HTML report of a run.
pub fn html(run: &DemoRun, command_line: &str) -> String {
    let mut r =
        Report::new("Harrow Vale Fine Chemicals — vapor pressures and boiling points (demo)");
    r.subtitle("INVENTED demo scenario: the site, compounds and measurements are fictional. Planned vacuum 20 mbar.");
    r.command_line(command_line);
    let s = r.section("Summary and findings");
    s.paragraph(format!(
        "{} measured compounds fitted, {} new structures estimated; boiling points at the planned 20 mbar below.",
        run.fits.len(),
        run.estimates.len()
    ));
    s.findings(run.findings.clone());
    let mut t = Table::new([
        "compound",
        "source",
        "t at 20 mbar/°C",
        "95 % interval/°C",
        "extrapolated",
    ]);
    for (name, b) in &run.fit_at_vacuum {
        let ci = match (b.ci95_low_k, b.ci95_high_k) {
            (Some(l), Some(h)) => format!("{} to {}", c(l), c(h)),
            _ => String::new(),
        };
        t.row([
            name.clone(),
            "in-house fit".into(),
            c(b.t_k),
            ci,
            b.extrapolated.to_string(),
        ]);
    }
    for e in &run.estimates {
        if let Some(tv) = e.t_at_vacuum_k {
            let src = if e.anchored_tb_k.is_some() {
                "estimate, anchored"
            } else {
                "estimate (Joback + Lee–Kesler)"
            };
            t.row([
                e.compound.clone(),
                src.into(),
                c(tv),
                String::new(),
                "estimate".into(),
            ]);
        }
    }
    s.table(t.caption("Boiling points at the planned vacuum (20 mbar)"));

    let curves: Vec<FittedCurve> = run.fits.iter().map(FittedCurve::from_report).collect();
    let mut plot = CurvePlot::new("Fitted vapor-pressure curves", (300.0, 480.0))
        .pressure_line("planned vacuum 20 mbar", VACUUM_PA);
    for (f, cv) in run.fits.iter().zip(&curves) {
        plot = plot.curve(
            PlotCurve::new(f.compound.clone().unwrap_or_default(), cv)
                .points(f.points.iter().map(|p| (p.t_k, p.p_pa)).collect()),
        );
    }
    if let Ok(svg) = plot.render_svg() {
        if let Ok(fig) = Figure::new(
            &svg,
            "All in-house fits with their points; the dashed line is the planned vacuum.",
        ) {
            s.figure(fig);
        }
    }

    let fs = r.section("Fits of the in-house measurements");
    for f in &run.fits {
        let name = f.compound.clone().unwrap_or_default();
        let sub = fs.subsection(name.clone());
        let tb = f.normal_boiling_point_k.as_ref();
        sub.facts([
            ("model", f.model.clone()),
            ("points", f.n_points.to_string()),
            ("RMS deviation of p", format!("{:.2} %", f.rms_rel_dev_pct)),
            (
                "measured range",
                format!("{:.1} to {:.1} K", f.t_range_k[0], f.t_range_k[1]),
            ),
            (
                "normal boiling point",
                tb.map(|i| {
                    format!(
                        "{:.2} K (95 %: {:.2} to {:.2}){}",
                        i.value,
                        i.ci95_low,
                        i.ci95_high,
                        if i.extrapolated { ", extrapolated" } else { "" }
                    )
                })
                .unwrap_or_else(|| "not reached".into()),
            ),
            ("weighting", f.weighting.clone()),
        ]);
        if let Ok(fig) = Figure::new(
            &crate::report::fit_plot::svg(f),
            format!("{name}: ln p against 1/T with the 95 % band, flagged points and residuals"),
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
        let mut pts = Table::new(["T/K", "p/kPa", "deviation/%", "studentized"])
            .caption("Points (flagged rows are outliers)");
        for p in &f.points {
            pts.flagged_row(
                [
                    format!("{:.2}", p.t_k),
                    format!("{:.4}", p.p_pa / 1000.0),
                    format!("{:+.2}", p.rel_dev_pct),
                    format!("{:+.2}", p.studentized),
                ],
                p.outlier.then_some(Severity::Warning),
            );
        }
        sub.table(pts);
        if let Some(v) = &f.reference_comparison {
            if let Some(rf) = v.get("reference").filter(|x| !x.is_null()) {
                let g = |k: &str| {
                    rf.get(k)
                        .and_then(|x| x.as_f64())
                        .map(|x| format!("{x:.3}"))
                        .unwrap_or_default()
                };
                sub.facts([
                    (
                        "reference compound",
                        rf.get("compound")
                            .and_then(|x| x.as_str())
                            .unwrap_or("")
                            .to_string(),
                    ),
                    (
                        "reference source",
                        rf.get("reference_source")
                            .and_then(|x| x.as_str())
                            .unwrap_or("")
                            .to_string(),
                    ),
                    (
                        "max |p fit / p ref − 1|",
                        format!("{} %", g("max_rel_diff_pct")),
                    ),
                    ("Tb fit − Tb reference", format!("{} K", g("tb_diff_k"))),
                ]);
            }
        }
    }

    let es = r.section("Estimates for the new structures");
    let mut et = Table::new([
        "compound",
        "SMILES",
        "Tb/K",
        "90 % interval/K",
        "Joback Tb/K",
        "Tc/K",
        "pc/bar",
        "anchored Tb/K",
        "groups",
    ]);
    for e in &run.estimates {
        match &e.estimate {
            Some(x) => {
                let groups = x
                    .groups
                    .iter()
                    .map(|(k, v)| format!("{k}×{v}"))
                    .collect::<Vec<_>>()
                    .join(", ");
                et.row([
                    e.compound.clone(),
                    x.smiles.clone().unwrap_or_default(),
                    format!("{:.1}", x.tb_k),
                    format!("{:.1} to {:.1}", x.tb_pi90_low_k, x.tb_pi90_high_k),
                    format!("{:.1}", x.tb_joback_k),
                    x.tc_k.map(|v| format!("{v:.1}")).unwrap_or_default(),
                    x.pc_bar.map(|v| format!("{v:.2}")).unwrap_or_default(),
                    e.anchored_tb_k
                        .map(|v| format!("{v:.1}"))
                        .unwrap_or_default(),
                    groups,
                ]);
            }
            None => {
                et.flagged_row([e.compound.clone(), e.error.clone()], Some(Severity::Error));
            }
        }
    }
    es.table(et.caption(
        "Joback group contributions with the published corrections; estimates are not measurements",
    ));
    r.render()
}

/// The short text summary printed by `ebullio demo`.
pub fn summary(run: &DemoRun) -> String {
    let mut s = String::from("Harrow Vale Fine Chemicals (INVENTED demo data)\n\nBoiling points at the planned vacuum (20 mbar):\n");
    for (n, b) in &run.fit_at_vacuum {
        s.push_str(&format!(
            "  {n:<28} {:>7} °C  (in-house fit{})\n",
            c(b.t_k),
            if b.extrapolated { ", extrapolated" } else { "" }
        ));
    }
    for e in &run.estimates {
        if let Some(t) = e.t_at_vacuum_k {
            s.push_str(&format!(
                "  {:<28} {:>7} °C  (estimate{})\n",
                e.compound,
                c(t),
                if e.anchored_tb_k.is_some() {
                    ", anchored"
                } else {
                    ""
                }
            ));
        }
    }
    s.push_str("\nMain findings:\n");
    let mut f = run.findings.clone();
    f.sort_by_key(|x| std::cmp::Reverse(x.severity));
    for x in f.iter().filter(|x| x.severity >= Severity::Warning).take(8) {
        s.push_str(&format!(
            "  [{}] {}: {}\n",
            x.severity.as_str(),
            x.subject,
            x.message
        ));
    }
    s.push_str("\nCautions:\n");
    for c in crate::report::html::standard_cautions() {
        s.push_str(&format!("  - {c}\n"));
    }
    s
}
