//! SVG for a binary's vapor–liquid equilibrium: the T–x–y (or p–x–y) diagram and the y–x curve.

use super::plan_plot::PlotError;
use crate::mixture::VleStudy;
use plotters::prelude::*;

fn err<E: std::fmt::Display>(e: E) -> PlotError {
    PlotError(e.to_string())
}

/// Liquid (bubble) line, vapor (dew) line, diagonal, markers: our own muted set.
const LIQUID: RGBColor = RGBColor(38, 70, 110);
const VAPOR: RGBColor = RGBColor(176, 96, 40);
const GUIDE: RGBColor = RGBColor(150, 150, 150);
const MARK: RGBColor = RGBColor(30, 30, 30);

/// Draw the study as one SVG document (1000 × 450 px): on the left the bubble
/// and dew lines (t/°C against x1, y1 at a pressure; p/kPa at a temperature)
/// with azeotropes marked; on the right y1 against x1 with the diagonal.
pub fn vle_svg(study: &VleStudy) -> Result<String, PlotError> {
    let isobaric = study.pressure_pa.is_some();
    let val = |r: &crate::mixture::DiagramRow| {
        if isobaric {
            r.t_k.unwrap_or(f64::NAN) - crate::units::CELSIUS_OFFSET
        } else {
            r.p_pa.unwrap_or(f64::NAN) / 1000.0
        }
    };
    let liquid: Vec<(f64, f64)> = study.diagram.iter().map(|r| (r.x1, val(r))).collect();
    let mut vapor: Vec<(f64, f64)> = study.diagram.iter().map(|r| (r.y1, val(r))).collect();
    vapor.sort_by(|a, b| a.0.total_cmp(&b.0));
    let lo = liquid.iter().map(|p| p.1).fold(f64::INFINITY, f64::min);
    let hi = liquid.iter().map(|p| p.1).fold(f64::NEG_INFINITY, f64::max);
    if !(lo.is_finite() && hi.is_finite()) {
        return Err(PlotError("the diagram has no finite points".into()));
    }
    let pad = ((hi - lo) * 0.08).max(0.5);
    let names = study
        .components
        .iter()
        .map(|c| c.name.as_str())
        .collect::<Vec<_>>();
    let n1 = names.first().copied().unwrap_or("1");
    let fixed = match (study.pressure_pa, study.temperature_k) {
        (Some(p), _) => format!("at {:.2} kPa", p / 1000.0),
        (_, Some(t)) => format!("at {:.2} °C", t - crate::units::CELSIUS_OFFSET),
        _ => String::new(),
    };
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, (1000, 450)).into_drawing_area();
        root.fill(&WHITE).map_err(err)?;
        let (left, right) = root.split_horizontally(500);
        let ylabel = if isobaric { "t / °C" } else { "p / kPa" };
        let mut ch = ChartBuilder::on(&left)
            .caption(
                format!("{} {fixed} ({})", names.join(" / "), study.activity_model),
                ("sans-serif", 16),
            )
            .margin(12)
            .x_label_area_size(40)
            .y_label_area_size(55)
            .build_cartesian_2d(0.0f64..1.0f64, (lo - pad)..(hi + pad))
            .map_err(err)?;
        ch.configure_mesh()
            .x_desc(format!("x1, y1 (mole fraction {n1})"))
            .y_desc(ylabel)
            .light_line_style(WHITE)
            .draw()
            .map_err(err)?;
        ch.draw_series(LineSeries::new(liquid.clone(), LIQUID.stroke_width(2)))
            .map_err(err)?
            .label("bubble (liquid)")
            .legend(|(x, y)| PathElement::new(vec![(x, y), (x + 18, y)], LIQUID.stroke_width(2)));
        ch.draw_series(LineSeries::new(vapor, VAPOR.stroke_width(2)))
            .map_err(err)?
            .label("dew (vapor)")
            .legend(|(x, y)| PathElement::new(vec![(x, y), (x + 18, y)], VAPOR.stroke_width(2)));
        let marks: Vec<(f64, f64)> = study
            .azeotropes
            .iter()
            .filter_map(|a| {
                let v = if isobaric {
                    a.t_k? - crate::units::CELSIUS_OFFSET
                } else {
                    a.p_pa? / 1000.0
                };
                Some((a.x1, v))
            })
            .collect();
        if !marks.is_empty() {
            ch.draw_series(marks.iter().map(|&p| Circle::new(p, 5, MARK.filled())))
                .map_err(err)?
                .label("azeotrope (predicted)")
                .legend(|(x, y)| Circle::new((x + 9, y), 4, MARK.filled()));
        }
        ch.configure_series_labels()
            .border_style(GUIDE)
            .background_style(WHITE.mix(0.9))
            .draw()
            .map_err(err)?;

        let mut ch = ChartBuilder::on(&right)
            .caption("equilibrium curve y1(x1)", ("sans-serif", 16))
            .margin(12)
            .x_label_area_size(40)
            .y_label_area_size(55)
            .build_cartesian_2d(0.0f64..1.0f64, 0.0f64..1.0f64)
            .map_err(err)?;
        ch.configure_mesh()
            .x_desc("x1 (liquid)")
            .y_desc("y1 (vapor)")
            .light_line_style(WHITE)
            .draw()
            .map_err(err)?;
        ch.draw_series(LineSeries::new(
            vec![(0.0, 0.0), (1.0, 1.0)],
            GUIDE.stroke_width(1),
        ))
        .map_err(err)?;
        let yx: Vec<(f64, f64)> = study.diagram.iter().map(|r| (r.x1, r.y1)).collect();
        ch.draw_series(LineSeries::new(yx, LIQUID.stroke_width(2)))
            .map_err(err)?;
        ch.draw_series(
            marks
                .iter()
                .map(|&(x, _)| Circle::new((x, x), 5, MARK.filled())),
        )
        .map_err(err)?;
        root.present().map_err(err)?;
    }
    Ok(buf)
}
