//! SVG of a column on the key pair's equilibrium curve: the McCabe–Thiele
//! construction (curve, diagonal, q-line, operating lines, the stages stepped).

use super::palette::{self, draw, font, PAPER, RULE};
use super::plan_plot::PlotError;
use crate::plan::column_plan::ColumnSummary;
use crate::plan::Plan;
use plotters::prelude::*;

fn err<E: std::fmt::Display>(e: E) -> PlotError {
    PlotError(e.to_string())
}

/// The staircase through the stages: from the distillate on the diagonal to each
/// stage's (x, y) on the curve, then down to the next stage's vapor on the operating
/// line, ending on the diagonal at the last liquid.
pub fn staircase(col: &ColumnSummary, x_d: f64) -> Vec<(f64, f64)> {
    let mut path = vec![(x_d, x_d)];
    for (i, s) in col.steps.iter().enumerate() {
        path.push((s.x, s.y));
        match col.steps.get(i + 1) {
            Some(next) => path.push((s.x, next.y)),
            None => path.push((s.x, s.x)),
        }
    }
    path
}

/// Draw the column of `plan` (700 × 560 px), or `None` when the plan has no column
/// or no equilibrium curve to draw it on.
pub fn mccabe_svg(plan: &Plan) -> Option<Result<String, PlotError>> {
    let col = plan.column.as_ref()?;
    if plan.equilibrium_curve.len() < 2 {
        return None;
    }
    Some(draw_column(plan, col))
}

fn draw_column(plan: &Plan, col: &ColumnSummary) -> Result<String, PlotError> {
    let x_d = plan.fenske_detail.distillate_purity;
    let x_b = 1.0 - plan.fenske_detail.bottoms_purity;
    let (z, q, r) = (col.feed_x_light, col.feed_q, col.reflux_ratio);
    // Rectifying line y = R/(R+1)·x + x_D/(R+1) meets the q-line y = q/(q−1)·x − z/(q−1)
    // at the feed; for a saturated liquid (q = 1) the q-line is vertical at z.
    let rect = |x: f64| r / (r + 1.0) * x + x_d / (r + 1.0);
    let x_meet = if (q - 1.0).abs() < 1e-9 {
        z
    } else {
        (z / (q - 1.0) + x_d / (r + 1.0)) / (q / (q - 1.0) - r / (r + 1.0))
    };
    let meet = (x_meet, rect(x_meet));
    let light = &plan.key_pair[0];
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, (700, 560)).into_drawing_area();
        root.fill(&PAPER.rgb()).map_err(err)?;
        let mut ch = ChartBuilder::on(&root)
            .caption(
                format!(
                    "{} / {}: {} theoretical stages at reflux {:.2} ({:.2} × minimum), feed stage {}",
                    plan.key_pair[0], plan.key_pair[1], col.whole_stages, r, col.reflux_factor, col.feed_stage
                ),
                font(15),
            )
            .margin(12)
            .x_label_area_size(40)
            .y_label_area_size(55)
            .build_cartesian_2d(0.0f64..1.0f64, 0.0f64..1.0f64)
            .map_err(err)?;
        draw::mesh(
            &mut ch,
            &format!("x (liquid mole fraction {light})"),
            &format!("y (vapor mole fraction {light})"),
        )
        .map_err(err)?;
        ch.draw_series(LineSeries::new(
            vec![(0.0, 0.0), (1.0, 1.0)],
            RULE.rgb().stroke_width(1),
        ))
        .map_err(err)?;
        draw::line(
            &mut ch,
            &plan.equilibrium_curve,
            palette::series(0),
            Some(&format!("equilibrium ({})", col.equilibrium)),
        )
        .map_err(err)?;
        draw::line(
            &mut ch,
            &[(x_d, x_d), meet, (x_b, x_b)],
            palette::series(1),
            Some("operating lines"),
        )
        .map_err(err)?;
        draw::line(
            &mut ch,
            &[(z, z), meet],
            palette::series(2),
            Some("feed (q-line)"),
        )
        .map_err(err)?;
        draw::line(
            &mut ch,
            &staircase(col, x_d),
            palette::series(3),
            Some("stages"),
        )
        .map_err(err)?;
        draw::legend_box(&mut ch, SeriesLabelPosition::LowerRight).map_err(err)?;
        root.present().map_err(err)?;
    }
    Ok(buf)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::{plan, Component, PlanOptions, PressureRequest};
    use crate::vapor::{AntoineConstants, AntoineConvention};

    fn ideal_plan() -> Plan {
        // Invented Harrow Vale intermediates, far enough apart for a short column.
        let conv: AntoineConvention = "log10,mmHg,degC".parse().unwrap();
        let a = Component::new(
            "HV-light",
            Box::new(AntoineConstants::new(7.0, 1300.0, 220.0, conv)),
            "demo",
        );
        let b = Component::new(
            "HV-heavy",
            Box::new(AntoineConstants::new(7.1, 1500.0, 210.0, conv)),
            "demo",
        );
        let opts = PlanOptions {
            pressure: PressureRequest::Given(101_325.0),
            activity: crate::plan::ActivityChoice::Ideal,
            ..PlanOptions::default()
        };
        plan(&[a, b], &opts).unwrap()
    }

    #[test]
    fn the_staircase_starts_on_the_diagonal_and_alternates_curve_and_operating_line() {
        let p = ideal_plan();
        let col = p.column.as_ref().expect("a column for a wide-boiling pair");
        let path = staircase(col, p.fenske_detail.distillate_purity);
        assert_eq!(path.len(), 1 + 2 * col.steps.len());
        assert_eq!(path[0].0, path[0].1);
        // Each step is horizontal (same y: the stage's vapor) then vertical (same x).
        for (k, w) in path.windows(2).enumerate() {
            let same = if k % 2 == 0 {
                (w[0].1, w[1].1)
            } else {
                (w[0].0, w[1].0)
            };
            assert!((same.0 - same.1).abs() < 1e-9, "segment {k}: {w:?}");
        }
        let last = path.last().unwrap();
        assert!((last.0 - last.1).abs() < 1e-12);
    }

    #[test]
    fn the_column_plot_keeps_to_the_palette() {
        let p = ideal_plan();
        let svg = mccabe_svg(&p).expect("a column to draw").unwrap();
        assert!(svg.contains("<svg") && svg.contains("polyline"));
        assert!(palette::foreign_colours(&svg).is_empty());
    }
}
