//! SVG for a plan: boiling points against pressure for each component, and the Rayleigh batch curve.

use super::palette::{self, draw, font, INK, PAPER, RULE};
use crate::plan::{Component, Plan};
use plotters::prelude::*;

/// Why a plot could not be drawn.
#[derive(Debug, thiserror::Error)]
#[error("could not draw the plan plot: {0}")]
pub struct PlotError(pub String);

fn err<E: std::fmt::Display>(e: E) -> PlotError {
    PlotError(e.to_string())
}

/// One named line of points in the style of series `usize`.
type Line<'a> = (&'a str, usize, Vec<(f64, f64)>);

/// Draw the plan as an SVG document (1000 × 450 px): on the left, each
/// component's boiling point (°C) against pressure (mbar, log scale) with the
/// operating pressure marked; on the right, the Rayleigh curve (light-component
/// mole fraction of the distillate now coming over and of all distillate
/// collected, and of the pot, against the fraction distilled).
pub fn plan_svg(plan: &Plan, components: &[Component]) -> Result<String, PlotError> {
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, (1000, 450)).into_drawing_area();
        root.fill(&PAPER.rgb()).map_err(err)?;
        let (left, right) = root.split_horizontally(500);

        // Left: boiling point against pressure.
        let (p_lo, p_hi) = (100.0f64, 101_325.0f64);
        let p_op = plan.pressure_pa;
        let (p_lo, p_hi) = (p_lo.min(p_op / 2.0), p_hi.max(p_op));
        let n = 60;
        let mut series: Vec<(String, Vec<(f64, f64)>)> = Vec::new();
        for c in components {
            let pts: Vec<(f64, f64)> = (0..=n)
                .filter_map(|i| {
                    let p = p_lo * (p_hi / p_lo).powf(i as f64 / n as f64);
                    c.curve.t_at(p).map(|t| {
                        (
                            crate::units::pa_to_mbar(p),
                            t - crate::units::CELSIUS_OFFSET,
                        )
                    })
                })
                .collect();
            series.push((c.name.clone(), pts));
        }
        let all_t: Vec<f64> = series
            .iter()
            .flat_map(|s| s.1.iter().map(|p| p.1))
            .collect();
        let t_min = all_t.iter().copied().fold(f64::INFINITY, f64::min);
        let t_max = all_t.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let (t_min, t_max) = if t_min.is_finite() && t_max > t_min {
            (t_min - 5.0, t_max + 5.0)
        } else {
            (0.0, 200.0)
        };
        let mut chart = ChartBuilder::on(&left)
            .caption("Boiling point against pressure", font(18))
            .margin(10)
            .x_label_area_size(40)
            .y_label_area_size(50)
            .build_cartesian_2d(
                (crate::units::pa_to_mbar(p_lo)..crate::units::pa_to_mbar(p_hi)).log_scale(),
                t_min..t_max,
            )
            .map_err(err)?;
        chart
            .configure_mesh()
            .x_desc("p / mbar")
            .y_desc("t / °C")
            .axis_style(INK.rgb())
            .bold_line_style(palette::GRID.rgb())
            .light_line_style(palette::SHADE.rgb())
            .label_style(font(12))
            .axis_desc_style(font(14))
            .draw()
            .map_err(err)?;
        for (i, (name, pts)) in series.iter().enumerate() {
            let style = palette::series(i);
            draw::line(&mut chart, pts, style, Some(name.as_str())).map_err(err)?;
            draw::markers(&mut chart, &every_nth(pts, 12), style).map_err(err)?;
        }
        chart
            .draw_series(LineSeries::new(
                vec![
                    (crate::units::pa_to_mbar(p_op), t_min),
                    (crate::units::pa_to_mbar(p_op), t_max),
                ],
                RULE.rgb().stroke_width(1),
            ))
            .map_err(err)?
            .label(format!(
                "operating {:.4} mbar",
                crate::units::pa_to_mbar(p_op)
            ))
            .legend(|(x, y)| PathElement::new(vec![(x, y), (x + 24, y)], RULE.rgb()));
        chart
            .configure_series_labels()
            .position(SeriesLabelPosition::UpperLeft)
            .background_style(PAPER.rgb().mix(0.85))
            .border_style(RULE.rgb())
            .label_font(font(12))
            .draw()
            .map_err(err)?;

        // Right: Rayleigh curve.
        let mut chart = ChartBuilder::on(&right)
            .caption("Simple batch distillation (Rayleigh)", font(18))
            .margin(10)
            .x_label_area_size(40)
            .y_label_area_size(50)
            .build_cartesian_2d(0.0f64..1.0, 0.0f64..1.0)
            .map_err(err)?;
        let light = &plan.key_pair[0];
        chart
            .configure_mesh()
            .x_desc("fraction of charge distilled")
            .y_desc(format!("mole fraction {light}"))
            .axis_style(INK.rgb())
            .bold_line_style(palette::GRID.rgb())
            .light_line_style(palette::SHADE.rgb())
            .label_style(font(12))
            .axis_desc_style(font(14))
            .draw()
            .map_err(err)?;
        if let Some(r) = &plan.rayleigh {
            let lines: [Line; 3] = [
                (
                    "distillate now",
                    0,
                    r.points
                        .iter()
                        .map(|p| (p.fraction_distilled, p.vapor_y_light))
                        .collect(),
                ),
                (
                    "all distillate so far",
                    1,
                    r.points
                        .iter()
                        .map(|p| (p.fraction_distilled, p.distillate_avg_x_light))
                        .collect(),
                ),
                (
                    "pot",
                    2,
                    r.points
                        .iter()
                        .map(|p| (p.fraction_distilled, p.pot_x_light))
                        .collect(),
                ),
            ];
            for (name, i, pts) in lines {
                let style = palette::series(i);
                draw::line(&mut chart, &pts, style, Some(name)).map_err(err)?;
                draw::markers(&mut chart, &every_nth(&pts, 8), style).map_err(err)?;
            }
            chart
                .configure_series_labels()
                .position(SeriesLabelPosition::UpperRight)
                .background_style(PAPER.rgb().mix(0.85))
                .border_style(RULE.rgb())
                .label_font(font(12))
                .draw()
                .map_err(err)?;
        }
        root.present().map_err(err)?;
    }
    Ok(buf)
}

/// Every `n`th point (from the first), for markers along a line.
fn every_nth(pts: &[(f64, f64)], n: usize) -> Vec<(f64, f64)> {
    pts.iter().step_by(n.max(1)).copied().collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::{plan, PlanOptions};
    use crate::vapor::AntoineConstants;

    #[test]
    fn svg_has_both_panels_and_every_component() {
        let conv = "ln,kPa,degC".parse().unwrap();
        // Smith, Van Ness & Abbott App. B Table B.2 constants.
        let comps = vec![
            Component::new(
                "benzene",
                Box::new(AntoineConstants::new(13.7819, 2726.81, 217.572, conv)),
                "t",
            ),
            Component::new(
                "toluene",
                Box::new(AntoineConstants::new(13.9320, 3056.96, 217.625, conv)),
                "t",
            ),
        ];
        let p = plan(&comps, &PlanOptions::default()).unwrap();
        let svg = plan_svg(&p, &comps).unwrap();
        assert!(svg.starts_with("<svg"));
        for s in ["benzene", "toluene", "Rayleigh", "pot", "p / mbar"] {
            assert!(svg.contains(s), "missing {s}");
        }
    }
}
