//! Every plot keeps to the palette: no colour written outside it.

use super::{foreign_colours, SERIES};
use crate::fit::{fit_points, FitOptions, Point};
use crate::plan::{plan, Component, PlanOptions};
use crate::report::curve_plot::{CurvePlot, PlotCurve};
use crate::report::{fit_plot, plan_plot};
use crate::vapor::AntoineConstants;

fn assert_in_palette(what: &str, doc: &str) {
    let foreign = foreign_colours(doc);
    assert!(
        foreign.is_empty(),
        "{what} uses colours outside the palette: {foreign:?}"
    );
}

/// How many series colours `doc` uses (SVG writes them upper case).
fn series_used(doc: &str) -> usize {
    let up = doc.to_ascii_uppercase();
    SERIES
        .iter()
        .filter(|c| up.contains(&c.hex().to_ascii_uppercase()))
        .count()
}

/// Smith, Van Ness & Abbott App. B Table B.2 constants (ln, kPa, °C).
fn antoine(a: f64, b: f64, c: f64) -> AntoineConstants {
    AntoineConstants::new(a, b, c, "ln,kPa,degC".parse().unwrap())
}

#[test]
fn fit_plot_with_a_flagged_point_keeps_to_the_palette() {
    let pts: Vec<Point> = (0..12)
        .map(|i| {
            let t = 300.0 + 6.0 * i as f64;
            let bump = if i == 5 {
                0.2
            } else {
                0.002 * (i as f64).sin()
            };
            Point {
                t_k: t,
                p_pa: (22.0 - 3500.0 / (t - 45.0) + bump).exp(),
                u_t_k: None,
                u_p_pa: None,
            }
        })
        .collect();
    let r = fit_points(Some("HV-17".into()), &pts, &FitOptions::default()).unwrap();
    assert!(
        r.points.iter().any(|p| p.outlier),
        "test needs a flagged point"
    );
    let svg = fit_plot::svg(&r);
    assert_in_palette("fit plot", &svg);
    // Fit line and band in series 1, flagged points in the flag colour (series 2).
    assert_eq!(series_used(&svg), 2, "{svg}");
}

#[test]
fn curve_plot_with_more_curves_than_series_keeps_to_the_palette() {
    let c = antoine(14.3145, 2756.22, 228.060);
    let mut plot = CurvePlot::new("eight curves", (260.0, 340.0)).pressure_line("20 mbar", 2000.0);
    for i in 0..8 {
        let t = 270.0 + 8.0 * i as f64;
        plot = plot.curve(PlotCurve::new(format!("c{i}"), &c).points(vec![(t, 30_000.0)]));
    }
    let svg = plot.render_svg().unwrap();
    assert_in_palette("curve plot", &svg);
    assert_eq!(series_used(&svg), SERIES.len());
}

#[test]
fn plan_plot_keeps_to_the_palette() {
    let comps = vec![
        Component::new("benzene", Box::new(antoine(13.7819, 2726.81, 217.572)), "t"),
        Component::new("toluene", Box::new(antoine(13.9320, 3056.96, 217.625)), "t"),
        Component::new("acetone", Box::new(antoine(14.3145, 2756.22, 228.060)), "t"),
    ];
    let p = plan(&comps[..2], &PlanOptions::default()).unwrap();
    let svg = plan_plot::plan_svg(&p, &comps).unwrap();
    assert_in_palette("plan plot", &svg);
    assert!(series_used(&svg) >= 3);
}

// The demo report and each command's `--report` are scanned the same way by the
// integration tests (tests/demo.rs, tests/report.rs), which run the real binary.

#[test]
fn vle_plot_with_an_azeotrope_keeps_to_the_palette() {
    use crate::mixture::{vle_study, Condition, StudyComponent, StudyOptions, Unifac};
    // Ethanol and benzene (Smith, Van Ness & Abbott Table B.2 constants), UNIFAC:
    // a minimum-boiling azeotrope, so the azeotrope marks are drawn too.
    let etoh = antoine(16.8958, 3795.17, 230.918);
    let bz = antoine(13.7819, 2726.81, 217.572);
    let model = Unifac::from_smiles(["CCO", "c1ccccc1"]).unwrap();
    let comp = |name, curve| StudyComponent {
        name,
        smiles: None,
        source: "test",
        curve,
    };
    let study = vle_study(
        [comp("ethanol", &etoh), comp("benzene", &bz)],
        &model,
        &StudyOptions {
            condition: Condition::Pressure(101_325.0),
            points: 41,
        },
    )
    .unwrap();
    assert!(!study.azeotropes.is_empty(), "test needs an azeotrope");
    let svg = crate::report::vle_plot::vle_svg(&study).unwrap();
    assert_in_palette("vle plot", &svg);
    assert_eq!(series_used(&svg), 2);
}
