//! SVG for a binary's vapor–liquid equilibrium: the T–x–y (or p–x–y) diagram and the y–x curve.

use super::palette::{self, draw, font, INK, PAPER, RULE};
use super::plan_plot::PlotError;
use crate::mixture::{DiagramRow, VleStudy};
use crate::units::CELSIUS_OFFSET;
use plotters::prelude::*;

fn err<E: std::fmt::Display>(e: E) -> PlotError {
    PlotError(e.to_string())
}

/// Draw the study as one SVG document (1000 × 450 px): on the left the bubble
/// (series 1) and dew (series 2) lines, t/°C against x1 and y1 at a pressure or
/// p/kPa at a temperature, azeotropes as ink discs; on the right y1 against x1
/// with the diagonal as a rule line.
pub fn vle_svg(study: &VleStudy) -> Result<String, PlotError> {
    let isobaric = study.pressure_pa.is_some();
    let val = |r: &DiagramRow| {
        if isobaric {
            r.t_k.unwrap_or(f64::NAN) - CELSIUS_OFFSET
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
    let names: Vec<&str> = study.components.iter().map(|c| c.name.as_str()).collect();
    let n1 = names.first().copied().unwrap_or("1");
    let fixed = match (study.pressure_pa, study.temperature_k) {
        (Some(p), _) => format!("at {:.2} kPa", p / 1000.0),
        (_, Some(t)) => format!("at {:.2} °C", t - CELSIUS_OFFSET),
        _ => String::new(),
    };
    let marks: Vec<(f64, f64)> = study
        .azeotropes
        .iter()
        .filter_map(|a| {
            let v = if isobaric {
                a.t_k? - CELSIUS_OFFSET
            } else {
                a.p_pa? / 1000.0
            };
            Some((a.x1, v))
        })
        .collect();
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, (1000, 450)).into_drawing_area();
        root.fill(&PAPER.rgb()).map_err(err)?;
        let (left, right) = root.split_horizontally(500);
        let mut ch = ChartBuilder::on(&left)
            .caption(
                format!("{} {fixed} ({})", names.join(" / "), study.activity_model),
                font(16),
            )
            .margin(12)
            .x_label_area_size(40)
            .y_label_area_size(55)
            .build_cartesian_2d(0.0f64..1.0f64, (lo - pad)..(hi + pad))
            .map_err(err)?;
        draw::mesh(
            &mut ch,
            &format!("x1, y1 (mole fraction {n1})"),
            if isobaric { "t / °C" } else { "p / kPa" },
        )
        .map_err(err)?;
        draw::line(
            &mut ch,
            &liquid,
            palette::series(0),
            Some("bubble (liquid)"),
        )
        .map_err(err)?;
        draw::line(&mut ch, &vapor, palette::series(1), Some("dew (vapor)")).map_err(err)?;
        if !marks.is_empty() {
            ch.draw_series(marks.iter().map(|&p| Circle::new(p, 5, INK.rgb().filled())))
                .map_err(err)?
                .label("azeotrope (predicted)")
                .legend(|(x, y)| Circle::new((x + 12, y), 4, INK.rgb().filled()));
        }
        ch.configure_series_labels()
            .background_style(PAPER.rgb().mix(0.85))
            .border_style(RULE.rgb())
            .label_font(font(12))
            .draw()
            .map_err(err)?;

        let mut ch = ChartBuilder::on(&right)
            .caption("equilibrium curve y1(x1)", font(16))
            .margin(12)
            .x_label_area_size(40)
            .y_label_area_size(55)
            .build_cartesian_2d(0.0f64..1.0f64, 0.0f64..1.0f64)
            .map_err(err)?;
        draw::mesh(&mut ch, "x1 (liquid)", "y1 (vapor)").map_err(err)?;
        ch.draw_series(LineSeries::new(
            vec![(0.0, 0.0), (1.0, 1.0)],
            RULE.rgb().stroke_width(1),
        ))
        .map_err(err)?;
        let yx: Vec<(f64, f64)> = study.diagram.iter().map(|r| (r.x1, r.y1)).collect();
        draw::line(&mut ch, &yx, palette::series(0), None).map_err(err)?;
        ch.draw_series(
            marks
                .iter()
                .map(|&(x, _)| Circle::new((x, x), 5, INK.rgb().filled())),
        )
        .map_err(err)?;
        root.present().map_err(err)?;
    }
    Ok(buf)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::mixture::{vle_study, Condition, StudyComponent, StudyOptions, Unifac};
    use crate::vapor::{AntoineConstants, AntoineConvention};

    /// Ethanol / water with Smith, Van Ness & Abbott App. B Table B.2 constants:
    /// the drawing keeps to the palette and marks the azeotrope.
    #[test]
    fn vle_plot_keeps_to_the_palette() {
        let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
        let e = AntoineConstants::new(16.8958, 3795.17, 230.918, conv);
        let w = AntoineConstants::new(16.3872, 3885.70, 230.170, conv);
        let m = Unifac::from_smiles(["CCO", "O"]).unwrap();
        let c = |name, curve| StudyComponent {
            name,
            smiles: None,
            source: "test",
            curve,
        };
        let s = vle_study(
            [c("ethanol", &e), c("water", &w)],
            &m,
            &StudyOptions {
                condition: Condition::Pressure(crate::units::ATM_PA),
                points: 51,
            },
        )
        .unwrap();
        let svg = vle_svg(&s).unwrap();
        let foreign = palette::foreign_colours(&svg);
        assert!(foreign.is_empty(), "{foreign:?}");
        assert!(svg.contains("azeotrope (predicted)"));
    }
}
