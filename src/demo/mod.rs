//! The embedded demo scenario (invented Harrow Vale Fine Chemicals data) run end to end.
//!
//! [`run`] fits the in-house measurements, compares them with the reference
//! library, estimates the new structures (anchoring the one with a reported
//! reduced-pressure boiling point), checks the supplier table, gives boiling
//! points at the planned vacuum, plans the separation in `plan.json`, and
//! [`html`] builds the HTML report from the same sections the commands'
//! `--report` use. All data are INVENTED (see `reference-data/demo/README.md`).

use ebullio::boiling::{boiling_points, BoilResult};
use ebullio::estimate::anchor::MeasuredPoint;
use ebullio::estimate::batch::EstimateRow;
use ebullio::estimate::estimate_smiles;
use ebullio::fit::{FitOptions, FitReport, FittedCurve};
use ebullio::mixture::fit::report::ComponentInfo;
use ebullio::mixture::fit::{fit_binary, BinaryFitOptions, BinaryFitReport};
use ebullio::plan::{Component, Plan, PlanOptions, PressureRequest};
use ebullio::reference::compare::Tolerances;
use ebullio::reference::fit_check::check_fit;
use ebullio::reference::Library;
use ebullio::report::curve_plot::{CurvePlot, PlotCurve};
use ebullio::report::html::{Figure, FindingRow, Report, Severity, Table};
use ebullio::report::{binary_fit_section, estimate_section, fit_section, plan_section};
use ebullio::table_io::binary::{read_binary_bytes, BinaryReadOptions};
use ebullio::table_io::{fit_set, read_measured_bytes, ReadOptions};
use ebullio::units::{parse_pressure, parse_quantity, parse_temperature, Quantity};
use std::path::Path;

/// The embedded files: (name, text).
pub const FILES: [(&str, &str); 7] = [
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
    (
        "still-run-2026.csv",
        include_str!("../../reference-data/demo/still-run-2026.csv"),
    ),
];

/// The still run's pressure, Pa (the still runs at one atmosphere).
pub const STILL_PA: f64 = ebullio::units::ATM_PA;

/// The planned vacuum of the scenario, Pa (20 mbar).
pub const VACUUM_PA: f64 = 2000.0;

/// Name of the checked supplier table written into the demo folder.
pub const CHECKED_TABLE: &str = "supplier-properties-checked.csv";

/// The check of the supplier table.
#[cfg(feature = "tables")]
pub struct DemoCheck {
    /// The table as read.
    pub table: ebullio::table_io::property_table::PropertyTable,
    /// Findings per row.
    pub report: ebullio::screen::ScreenReport,
    /// The table with the `flags`, `severity` and `diagnosis` columns, as CSV.
    pub checked_csv: Vec<u8>,
}

/// The check of the supplier table (needs the `tables` feature; never built without it).
#[cfg(not(feature = "tables"))]
pub struct DemoCheck {
    _never: std::convert::Infallible,
}

/// The separation planned in `plan.json`.
pub struct DemoPlan {
    /// The plan.
    pub plan: Plan,
    /// Its components (curves from the fits), for the plot.
    pub components: Vec<Component>,
    /// The pot-temperature limit of the scenario, K.
    pub max_pot_k: Option<f64>,
}

/// Everything the demo computed.
pub struct DemoRun {
    /// Fit reports, one per measured compound.
    pub fits: Vec<FitReport>,
    /// Boiling points at the vacuum from each fit.
    pub fit_at_vacuum: Vec<(String, BoilResult)>,
    /// Estimates for the new structures (boiling point at the vacuum; anchored where a point was reported).
    pub estimates: Vec<EstimateRow>,
    /// The supplier-table check (None without the `tables` feature).
    pub check: Option<DemoCheck>,
    /// The plan (None with the reason in `findings` when it could not be made).
    pub plan: Option<DemoPlan>,
    /// The binary fit of still run SR-14 with its consistency tests.
    pub still: Option<BinaryFitReport>,
    /// Findings for the summary.
    pub findings: Vec<FindingRow>,
}

/// Fit still run SR-14 (ethyl acetate / ethanol, T-x-y at 1 atm) as `ebullio fit` does.
fn fit_still_run() -> Result<BinaryFitReport, String> {
    let (name, text) = FILES[6];
    let opts = BinaryReadOptions {
        pressure_pa: Some(STILL_PA),
        ..Default::default()
    };
    let t =
        read_binary_bytes(Path::new(name), text.as_bytes(), &opts).map_err(|e| e.to_string())?;
    let (names, _) = t
        .components
        .clone()
        .ok_or("the still run names no components")?;
    let lib = Library::bundled();
    let mut curves = Vec::new();
    let mut info = Vec::new();
    for n in &names {
        let c = lib.find(n).map_err(|e| e.to_string())?;
        let curve = c.best_curve().ok_or("no reference curve")?;
        info.push(ComponentInfo {
            name: c.name.clone(),
            smiles: c.smiles.clone(),
            vapor_pressure_source: format!(
                "reference: {}",
                fit_section::without_urls(&curve.source)
            ),
        });
        curves.push(curve);
    }
    fit_binary(
        &t.data,
        [&curves[0], &curves[1]],
        info,
        &BinaryFitOptions::default(),
    )
    .map_err(|e| e.to_string())
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
                at: vec![ebullio::fit::At::PressurePa(VACUUM_PA)],
                ..FitOptions::default()
            };
            match fit_set(set, &opts) {
                Ok(mut r) => {
                    check_fit(&mut r, lib, None, None, Tolerances::default());
                    fits.push(r);
                }
                Err(e) => findings.push(FindingRow::new(
                    Severity::Error,
                    set.compound.clone().unwrap_or_default(),
                    "fit-failed",
                    e.to_string(),
                )),
            }
        }
    }
    findings.extend(fit_section::fit_findings(&fits));
    let mut fit_at_vacuum = Vec::new();
    for r in &fits {
        let curve = FittedCurve::from_report(r);
        if let Some(b) = boiling_points(&curve, &[VACUUM_PA], 1.96)
            .into_iter()
            .next()
        {
            fit_at_vacuum.push((r.compound.clone().unwrap_or_default(), b));
        }
    }

    let mut estimates = Vec::new();
    for line in FILES[3].1.lines().filter(|l| !l.starts_with('#')).skip(1) {
        let cells: Vec<&str> = line.splitn(3, ',').collect();
        let (Some(name), Some(smiles)) = (cells.first(), cells.get(1)) else {
            continue;
        };
        let reported = cells.get(2).copied().unwrap_or("").trim();
        let measured: Vec<MeasuredPoint> = parse_reported(reported).into_iter().collect();
        estimates.push(EstimateRow::new(
            estimate_smiles(smiles),
            Some(name.to_string()),
            Some(smiles.to_string()),
            &[VACUUM_PA],
            &measured,
        ));
    }
    findings.extend(estimate_section::estimate_findings(&estimates));

    let still = match fit_still_run() {
        Ok(r) => {
            findings.extend(binary_fit_section::binary_fit_findings(&r));
            Some(r)
        }
        Err(e) => {
            findings.push(FindingRow::new(
                Severity::Error,
                FILES[6].0,
                "fit-failed",
                e,
            ));
            None
        }
    };

    let check = check_supplier_table()?;
    #[cfg(feature = "tables")]
    if let Some(c) = &check {
        findings.extend(ebullio::report::check_section::check_findings(
            &c.table, &c.report, 10,
        ));
    }

    let plan = match plan_from_json(&fits) {
        Ok(p) => {
            findings.extend(plan_section::plan_findings(&p.plan));
            if let Some(t) = p.max_pot_k {
                if let Some(h) = p.plan.components.last().filter(|h| h.tb_k > t) {
                    findings.push(FindingRow::new(
                        Severity::Warning,
                        h.name.clone(),
                        "above-pot-limit",
                        format!(
                            "{} boils at {:.1} °C at the planned pressure, above the pot limit of {:.1} °C: lower the pressure.",
                            h.name,
                            h.tb_k - ebullio::units::CELSIUS_OFFSET,
                            t - ebullio::units::CELSIUS_OFFSET
                        ),
                    ));
                }
            }
            Some(p)
        }
        Err(e) => {
            findings.push(FindingRow::new(
                Severity::Error,
                "plan.json",
                "plan-failed",
                e,
            ));
            None
        }
    };
    Ok(DemoRun {
        fits,
        fit_at_vacuum,
        estimates,
        check,
        plan,
        still,
        findings,
    })
}

/// Screen the embedded supplier table as `ebullio check` does (structure
/// estimate on, no reference table) and write it back with the three columns.
#[cfg(feature = "tables")]
fn check_supplier_table() -> Result<Option<DemoCheck>, String> {
    use ebullio::screen::{screen, JobackEstimator, ScreenContext};
    use ebullio::table_io::property_table::{table_bytes, PropertyReadOptions, PropertyTable};
    let (name, text) = FILES[2];
    let table = PropertyTable::from_csv_bytes(
        text.as_bytes(),
        Path::new(name),
        &PropertyReadOptions::default(),
    )
    .map_err(|e| e.to_string())?;
    let ctx = ScreenContext {
        estimator: &JobackEstimator,
        ..ScreenContext::default()
    };
    let implied = table.implied_tb_k();
    let report = screen(&table, implied.as_deref(), &ctx);
    let n = report.len();
    let columns = vec![
        ("flags", (0..n).map(|i| report.flags(i)).collect()),
        (
            "severity",
            (0..n)
                .map(|i| {
                    report
                        .severity(i)
                        .map(|s| s.as_str().to_string())
                        .unwrap_or_default()
                })
                .collect(),
        ),
        ("diagnosis", (0..n).map(|i| report.diagnosis(i)).collect()),
    ];
    let checked_csv = table_bytes(&table.frame, columns, false, Path::new(CHECKED_TABLE))
        .map_err(|e| e.to_string())?;
    Ok(Some(DemoCheck {
        table,
        report,
        checked_csv,
    }))
}

#[cfg(not(feature = "tables"))]
fn check_supplier_table() -> Result<Option<DemoCheck>, String> {
    Ok(None)
}

/// The separation in `plan.json`, with the components' curves from the fits
/// (or the bundled reference when a name was not measured).
fn plan_from_json(fits: &[FitReport]) -> Result<DemoPlan, String> {
    let v: serde_json::Value = serde_json::from_str(FILES[4].1).map_err(|e| e.to_string())?;
    let sep = v
        .get("separation")
        .ok_or("plan.json has no \"separation\"")?;
    let names: Vec<&str> = sep
        .get("components")
        .and_then(|c| c.as_array())
        .ok_or("plan.json: separation has no \"components\" list")?
        .iter()
        .filter_map(|x| x.as_str())
        .collect();
    let p_text = sep
        .get("pressure")
        .or_else(|| v.get("vacuum"))
        .and_then(|x| x.as_str())
        .ok_or("plan.json: no pressure")?;
    let p = parse_pressure(p_text)
        .map_err(|e| format!("plan.json: pressure '{p_text}': {e}"))?
        .pa();
    let max_pot_k = v
        .get("max_pot_temperature")
        .and_then(|x| x.as_str())
        .map(|t| parse_temperature(t).map(|t| t.kelvin()))
        .transpose()
        .map_err(|e| format!("plan.json: max_pot_temperature: {e}"))?;
    let mut components = Vec::new();
    for n in names {
        if let Some(r) = fits.iter().find(|f| f.compound.as_deref() == Some(n)) {
            components.push(Component::new(
                n,
                Box::new(FittedCurve::from_report(r)),
                format!(
                    "in-house {} fit of {} measured points (uncertainty from the fit covariance)",
                    r.model, r.n_points
                ),
            ));
        } else {
            let c = Library::bundled().find(n).map_err(|e| e.to_string())?;
            let curve = c
                .best_curve()
                .ok_or_else(|| format!("no vapor-pressure curve for {n}"))?;
            let source = format!("reference: {}", curve.source);
            components.push(Component::new(n, Box::new(curve), source));
        }
    }
    let opts = PlanOptions {
        pressure: PressureRequest::Given(p),
        ..PlanOptions::default()
    };
    let plan = ebullio::plan::plan(&components, &opts).map_err(|e| e.to_string())?;
    Ok(DemoPlan {
        plan,
        components,
        max_pot_k,
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
    format!("{:.1}", t_k - ebullio::units::CELSIUS_OFFSET)
}

/// The cautions of the demo: the standard ones and the plan's ideal-solution limits.
pub fn cautions() -> Vec<String> {
    let mut v = ebullio::report::html::standard_cautions();
    v.push(ebullio::plan::limits::IDEAL_SOLUTION.to_string());
    v
}

/// Build the self-contained HTML report of a run.
pub fn html(run: &DemoRun, command_line: &str) -> String {
    let mut r =
        Report::new("Harrow Vale Fine Chemicals — vapor pressures and boiling points (demo)");
    r.subtitle("INVENTED demo scenario: the site, compounds and measurements are fictional. Planned vacuum 20 mbar.");
    r.command_line(command_line);
    r.cautions(cautions());
    let s = r.section("Summary and findings");
    s.paragraph(format!(
        "{} measured compounds fitted, {} new structures estimated{}{}; boiling points at the planned 20 mbar below.",
        run.fits.len(),
        run.estimates.len(),
        match &run.check {
            Some(_) => ", the supplier table checked",
            None => "",
        },
        match &run.plan {
            Some(_) => ", one separation planned",
            None => "",
        }
    ));
    if let Some(p) = &run.plan {
        s.paragraph(format!(
            "Plan ({} / {} at {}): {}",
            p.plan.key_pair[0],
            p.plan.key_pair[1],
            fit_section::mbar(p.plan.pressure_pa),
            p.plan.verdict.message
        ));
    }
    let mut t = Table::new([
        "compound",
        "source",
        "t at 20 mbar/°C",
        "interval/°C",
        "outside the data",
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
            if b.extrapolated { "yes" } else { "no" }.to_string(),
        ]);
    }
    for e in &run.estimates {
        if let Some(a) = e.at.first().filter(|a| a.t_k.is_some()) {
            let src = if e.anchored.is_some() {
                "estimate, anchored"
            } else {
                "estimate (Joback + Lee–Kesler)"
            };
            let ci = match (a.pi90_low_k, a.pi90_high_k) {
                (Some(l), Some(h)) if e.anchored.is_none() => {
                    format!("{} to {} (90 %)", c(l), c(h))
                }
                _ => String::new(),
            };
            t.row([
                e.compound.clone().unwrap_or_default(),
                src.into(),
                c(a.t_k.unwrap_or(f64::NAN)),
                ci,
                "estimate".into(),
            ]);
        }
    }
    s.table(t.caption(
        "Boiling points at the planned vacuum (20 mbar); intervals 95 % for fits, 90 % for estimates",
    ));
    s.paragraph("Warnings and errors below, worst first; every finding, information included, is in its section.");
    s.findings(
        run.findings
            .iter()
            .filter(|f| f.severity >= Severity::Warning)
            .cloned()
            .collect(),
    );

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

    fit_section::add_fits(
        r.section("Fits of the in-house measurements"),
        &run.fits,
        &[VACUUM_PA, 101_325.0],
    );
    estimate_section::add_estimates(
        r.section("Estimates for the new structures"),
        &run.estimates,
    );
    #[cfg(feature = "tables")]
    if let Some(ch) = &run.check {
        let sec = r.section("Check of the supplier table");
        sec.paragraph(format!(
            "The checked table, with the flags, severity and diagnosis columns, is {CHECKED_TABLE}."
        ));
        ebullio::report::check_section::add_check(sec, FILES[2].0, &ch.table, &ch.report);
    }
    if let Some(st) = &run.still {
        let sec = r.section("Still run SR-14: ethyl acetate / ethanol at 1 atm");
        sec.paragraph(
            "The site's recirculating still (T-x-y, 12 points): the activity model fitted to it, and whether the data are thermodynamically consistent.",
        );
        binary_fit_section::add_consistency(sec, st);
        binary_fit_section::add_model(sec.subsection("Model and parameters"), st);
        binary_fit_section::add_points(sec.subsection("Points"), st);
    }
    if let Some(p) = &run.plan {
        let sec = r.section("Separation plan");
        sec.paragraph(format!(
            "From plan.json: separate {} at the planned vacuum; pot limit {}.",
            p.plan.key_pair.join(" and "),
            p.max_pot_k
                .map(|t| format!("{} °C", c(t)))
                .unwrap_or_else(|| "not given".into())
        ));
        plan_section::add_plan(sec, &p.plan, &p.components);
    }
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
        if let Some(t) = e.at.first().and_then(|a| a.t_k) {
            s.push_str(&format!(
                "  {:<28} {:>7} °C  (estimate{})\n",
                e.compound.clone().unwrap_or_default(),
                c(t),
                if e.anchored.is_some() {
                    ", anchored"
                } else {
                    ""
                }
            ));
        }
    }
    if let Some(st) = &run.still {
        let verdict: Vec<String> = st
            .consistency
            .iter()
            .map(|t| format!("{} {}", t.test, if t.passed { "passes" } else { "FAILS" }))
            .collect();
        s.push_str(&format!(
            "\nStill run SR-14 (ethyl acetate / ethanol, 1 atm): {} fit; {}.\n",
            st.model,
            verdict.join(", ")
        ));
    }
    s.push_str("\nMain findings of the fits and estimates:\n");
    let mut f: Vec<FindingRow> = fit_section::fit_findings(&run.fits);
    f.extend(estimate_section::estimate_findings(&run.estimates));
    f.sort_by_key(|x| std::cmp::Reverse(x.severity));
    // The terminal gets the first few; the report has them all, and says so.
    const SHOWN: usize = 6;
    let serious: Vec<&FindingRow> = f
        .iter()
        .filter(|x| x.severity >= Severity::Warning)
        .collect();
    for x in serious.iter().take(SHOWN) {
        s.push_str(&format!(
            "  [{}] {}: {}\n",
            x.severity.as_str(),
            x.subject,
            x.message
        ));
    }
    if serious.len() > SHOWN {
        s.push_str(&format!(
            "  ... and {} more warning(s) or error(s); see report.html\n",
            serious.len() - SHOWN
        ));
    }
    #[cfg(feature = "tables")]
    if let Some(ch) = &run.check {
        let sum = ch.report.summary(&ch.table, 8);
        s.push_str(&format!(
            "\nSupplier table: {} rows checked, {} flagged ({} error, {} warning):\n",
            sum.rows, sum.rows_flagged, sum.errors, sum.warnings
        ));
        for w in &sum.worst {
            s.push_str(&format!("  [{}] {}: {}\n", w.severity, w.label, w.flags));
        }
        if sum.rows_flagged > sum.worst.len() {
            s.push_str(&format!(
                "  ... and {} more flagged row(s); see report.html\n",
                sum.rows_flagged - sum.worst.len()
            ));
        }
    }
    if let Some(p) = &run.plan {
        s.push_str(&format!(
            "\nPlan: {} / {} at {}: {}\n",
            p.plan.key_pair[0],
            p.plan.key_pair[1],
            fit_section::mbar(p.plan.pressure_pa),
            p.plan.verdict.message
        ));
    }
    for x in run
        .findings
        .iter()
        .filter(|x| x.code == "plan-failed" || x.code == "above-pot-limit")
    {
        s.push_str(&format!("  [{}] {}\n", x.severity.as_str(), x.message));
    }
    s.push_str("\nCautions:\n");
    for c in cautions() {
        s.push_str(&format!("  - {c}\n"));
    }
    s
}
