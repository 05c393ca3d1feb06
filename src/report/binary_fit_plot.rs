//! SVG for a binary VLE fit: data and model T–x–y (or p–x–y), the residuals, and the
//! consistency plot ln(γ1/γ2) against x1.

use super::palette::{self, draw, font, INK, PAPER, RULE};
use super::plan_plot::PlotError;
use crate::mixture::fit::area::poly as area_poly;
use crate::mixture::fit::{BinaryFitReport, DataKind};
use crate::units::CELSIUS_OFFSET;
use plotters::coord::Shift;
use plotters::prelude::*;

fn err<E: std::fmt::Display>(e: E) -> PlotError {
    PlotError(e.to_string())
}

fn span(v: impl Iterator<Item = f64>) -> Option<(f64, f64)> {
    let (lo, hi) = v
        .filter(|x| x.is_finite())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), x| {
            (a.min(x), b.max(x))
        });
    if !(lo.is_finite() && hi.is_finite()) {
        return None;
    }
    let pad = ((hi - lo) * 0.1).max(1e-3 * hi.abs().max(1.0));
    Some((lo - pad, hi + pad))
}

/// One panel: axes, then `lines` (series index, points, label) and `dots` (series index, points, label).
#[allow(clippy::type_complexity)]
fn panel<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    title: &str,
    y_desc: &str,
    lines: &[(usize, Vec<(f64, f64)>, Option<&str>)],
    dots: &[(usize, Vec<(f64, f64)>, Option<&str>)],
    zero_line: bool,
) -> Result<(), PlotError> {
    let ys = lines
        .iter()
        .chain(dots)
        .flat_map(|(_, p, _)| p.iter().map(|q| q.1))
        .chain(zero_line.then_some(0.0));
    let (lo, hi) = span(ys).unwrap_or((-1.0, 1.0));
    let mut ch = ChartBuilder::on(area)
        .caption(title, font(15))
        .margin(12)
        .x_label_area_size(38)
        .y_label_area_size(60)
        .build_cartesian_2d(0.0f64..1.0f64, lo..hi)
        .map_err(err)?;
    ch.configure_mesh()
        .x_desc("x1 (liquid mole fraction of component 1)")
        .y_desc(y_desc)
        .axis_style(INK.rgb())
        .bold_line_style(palette::GRID.rgb())
        .light_line_style(palette::SHADE.rgb())
        .label_style(font(12))
        .axis_desc_style(font(13))
        .draw()
        .map_err(err)?;
    if zero_line {
        ch.draw_series(LineSeries::new(
            vec![(0.0, 0.0), (1.0, 0.0)],
            RULE.rgb().stroke_width(1),
        ))
        .map_err(err)?;
    }
    let mut labelled = false;
    for (i, pts, label) in lines {
        draw::line(&mut ch, pts, palette::series(*i), *label).map_err(err)?;
        labelled |= label.is_some();
    }
    for (i, pts, label) in dots {
        let s = palette::series(*i);
        draw::markers(&mut ch, pts, s).map_err(err)?;
        if let Some(l) = label {
            // A legend entry for the markers: an invisible series carrying the label.
            ch.draw_series(std::iter::empty::<Circle<(f64, f64), i32>>())
                .map_err(err)?
                .label(*l)
                .legend(draw::legend(s));
            labelled = true;
        }
    }
    if labelled {
        ch.configure_series_labels()
            .background_style(PAPER.rgb().mix(0.85))
            .border_style(RULE.rgb())
            .label_font(font(11))
            .draw()
            .map_err(err)?;
    }
    Ok(())
}

/// The fit as one SVG document (1000 × 800 px): top left the data (markers) and the
/// fitted model's bubble and dew lines; top right ln(γ1/γ2) of the data against x1 with
/// the polynomial the area test integrates (the areas above and below zero should be
/// equal); bottom the residuals of T (or p) and of y1 against x1.
pub fn binary_fit_svg(r: &BinaryFitReport) -> Result<String, PlotError> {
    let iso = r.kind == DataKind::Isobaric;
    let val = |t_k: f64, p_pa: f64| {
        if iso {
            t_k - CELSIUS_OFFSET
        } else {
            p_pa / 1000.0
        }
    };
    let model_val = |v: f64| if iso { v - CELSIUS_OFFSET } else { v / 1000.0 };
    let bubble: Vec<(f64, f64)> = r
        .model_curve
        .iter()
        .map(|m| (m[0], model_val(m[2])))
        .collect();
    let mut dew: Vec<(f64, f64)> = r
        .model_curve
        .iter()
        .map(|m| (m[1], model_val(m[2])))
        .collect();
    dew.sort_by(|a, b| a.0.total_cmp(&b.0));
    let liquid: Vec<(f64, f64)> = r
        .points
        .iter()
        .map(|p| (p.x1, val(p.t_k, p.p_pa)))
        .collect();
    let vapor: Vec<(f64, f64)> = r
        .points
        .iter()
        .filter_map(|p| Some((p.y1?, val(p.t_k, p.p_pa))))
        .collect();
    let ratio: Vec<(f64, f64)> = r.ln_gamma_ratio.iter().map(|p| (p[0], p[1])).collect();
    let poly: Vec<(f64, f64)> = r
        .ln_gamma_ratio_polynomial
        .as_ref()
        .map(|c| {
            (0..=50)
                .map(|i| i as f64 / 50.0)
                .map(|x| (x, area_poly(c, x)))
                .collect()
        })
        .unwrap_or_default();
    let dev: Vec<(f64, f64)> = r
        .points
        .iter()
        .filter_map(|p| Some((p.x1, p.deviation?)))
        .collect();
    let ydev: Vec<(f64, f64)> = r
        .points
        .iter()
        .filter_map(|p| Some((p.x1, p.y1_deviation?)))
        .collect();
    let names: Vec<&str> = r.components.iter().map(|c| c.name.as_str()).collect();
    let pair = if names.len() == 2 {
        names.join(" / ")
    } else {
        "binary".into()
    };
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, (1000, 800)).into_drawing_area();
        root.fill(&PAPER.rgb()).map_err(err)?;
        let areas = root.split_evenly((2, 2));
        panel(
            &areas[0],
            &format!("{pair}: data and {} fit", r.model),
            if iso { "t / °C" } else { "p / kPa" },
            &[
                (0, bubble, Some("bubble (model)")),
                (1, dew, Some("dew (model)")),
            ],
            &[
                (0, liquid, Some("x1 measured")),
                (1, vapor, Some("y1 measured")),
            ],
            false,
        )?;
        panel(
            &areas[1],
            "consistency: ln(γ1/γ2) from the data",
            "ln(γ1/γ2)",
            &[(2, poly, Some("polynomial (area test)"))],
            &[(2, ratio, Some("points with y1"))],
            true,
        )?;
        panel(
            &areas[2],
            if iso {
                "residuals in T"
            } else {
                "residuals in p"
            },
            if iso {
                "T measured − model / K"
            } else {
                "p measured − model / %"
            },
            &[],
            &[(0, dev, None)],
            true,
        )?;
        panel(
            &areas[3],
            "residuals in y1",
            "y1 measured − model",
            &[],
            &[(1, ydev, None)],
            true,
        )?;
        root.present().map_err(err)?;
    }
    Ok(buf)
}
