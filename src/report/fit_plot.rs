//! SVG plot of a fit: ln p against 1000/T with data, curve, 95 % band, flagged points, residuals.
//!
//! Pure-Rust plotters SVG backend: text is written as SVG `<text>`, so no
//! system fonts are needed. [`svg`] returns the document as a `String` so an
//! HTML report can inline it.

use super::palette::{self, draw, font, FLAG, GRID, INK, PAPER, RULE, SHADE};
use crate::fit::{FitReport, FittedCurve};
use plotters::prelude::*;

/// The plot as an SVG document. Never fails: a drawing error yields an SVG
/// that says so.
pub fn svg(r: &FitReport) -> String {
    let mut buf = String::new();
    if let Err(e) = draw(r, &mut buf) {
        return format!(
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"640\" height=\"80\"><text x=\"10\" y=\"40\" fill=\"{}\">plot failed: {}</text></svg>",
            INK.hex(),
            e.to_string().replace('<', "&lt;")
        );
    }
    buf
}

type DrawResult = Result<(), Box<dyn std::error::Error>>;

fn draw(r: &FitReport, buf: &mut String) -> DrawResult {
    let curve = FittedCurve::from_report(r);
    let t95 = curve.t95();
    let (lo, hi) = (r.t_range_k[0], r.t_range_k[1]);
    let pad = 0.05 * (hi - lo).max(1.0);
    let (t_lo, t_hi) = ((lo - pad).max(1.0), hi + pad);
    let x = |t: f64| 1000.0 / t;
    let n = 120;
    let line: Vec<(f64, f64, f64)> = (0..=n)
        .map(|i| {
            let t = t_lo + (t_hi - t_lo) * i as f64 / n as f64;
            let (v, se) = curve.ln_p_with_se(t);
            (x(t), v, t95 * se)
        })
        .filter(|(_, v, _)| v.is_finite())
        .collect();
    let ys: Vec<f64> = r.points.iter().map(|p| p.p_pa.ln()).collect();
    let ymin = ys
        .iter()
        .chain(line.iter().map(|l| &l.1))
        .copied()
        .fold(f64::INFINITY, f64::min);
    let ymax = ys
        .iter()
        .chain(line.iter().map(|l| &l.1))
        .copied()
        .fold(f64::NEG_INFINITY, f64::max);
    let ypad = 0.05 * (ymax - ymin).max(0.1);
    let root = SVGBackend::with_string(buf, (720, 640)).into_drawing_area();
    root.fill(&PAPER.rgb())?;
    let (top, bottom) = root.split_vertically(440);
    let title = format!(
        "{}: {} fit, {} points",
        r.compound.as_deref().unwrap_or("data"),
        r.model,
        r.n_points
    );
    let mut ch = ChartBuilder::on(&top)
        .caption(title, font(18))
        .margin(10)
        .x_label_area_size(35)
        .y_label_area_size(55)
        .build_cartesian_2d(x(t_hi)..x(t_lo), (ymin - ypad)..(ymax + ypad))?;
    ch.configure_mesh()
        .x_desc("1000 K / T")
        .y_desc("ln(p/Pa)")
        .axis_style(INK.rgb())
        .bold_line_style(GRID.rgb())
        .light_line_style(SHADE.rgb())
        .label_style(font(12))
        .axis_desc_style(font(14))
        .draw()?;
    let band: Vec<(f64, f64)> = line
        .iter()
        .map(|(a, v, h)| (*a, v + h))
        .chain(line.iter().rev().map(|(a, v, h)| (*a, v - h)))
        .filter(|(_, v)| v.is_finite())
        .collect();
    let fit = palette::series(0);
    let band_fill = fit.colour.rgb().mix(0.18);
    ch.draw_series(std::iter::once(Polygon::new(band, band_fill)))?
        .label("95 % band")
        .legend(move |(x, y)| Rectangle::new([(x, y - 5), (x + 24, y + 5)], band_fill.filled()));
    let fit_line: Vec<(f64, f64)> = line.iter().map(|(a, v, _)| (*a, *v)).collect();
    draw::line(&mut ch, &fit_line, fit, Some("fit"))?;
    let ink = INK.rgb();
    ch.draw_series(
        r.points
            .iter()
            .filter(|p| !p.outlier)
            .map(|p| Circle::new((x(p.t_k), p.p_pa.ln()), 4, ink.filled())),
    )?
    .label("measured")
    .legend(move |(x, y)| Circle::new((x + 12, y), 4, ink.filled()));
    let flag = FLAG.rgb().stroke_width(2);
    ch.draw_series(
        r.points
            .iter()
            .filter(|p| p.outlier)
            .map(|p| Cross::new((x(p.t_k), p.p_pa.ln()), 7, flag)),
    )?
    .label("flagged")
    .legend(move |(x, y)| Cross::new((x + 12, y), 5, flag));
    ch.configure_series_labels()
        .background_style(PAPER.rgb().mix(0.85))
        .border_style(RULE.rgb())
        .label_font(font(12))
        .draw()?;
    let dev: Vec<f64> = r.points.iter().map(|p| p.rel_dev_pct).collect();
    let dmax = dev.iter().map(|d| d.abs()).fold(0.0, f64::max).max(1e-3) * 1.15;
    let mut rc = ChartBuilder::on(&bottom)
        .margin(10)
        .x_label_area_size(35)
        .y_label_area_size(55)
        .build_cartesian_2d(x(t_hi)..x(t_lo), -dmax..dmax)?;
    rc.configure_mesh()
        .x_desc("1000 K / T")
        .y_desc("100 (p - p_fit)/p_fit")
        .axis_style(INK.rgb())
        .bold_line_style(GRID.rgb())
        .light_line_style(SHADE.rgb())
        .label_style(font(12))
        .axis_desc_style(font(14))
        .draw()?;
    draw::line(&mut rc, &[(x(t_hi), 0.0), (x(t_lo), 0.0)], fit, None)?;
    rc.draw_series(
        r.points
            .iter()
            .filter(|p| !p.outlier)
            .map(|p| Circle::new((x(p.t_k), p.rel_dev_pct), 4, ink.filled())),
    )?;
    rc.draw_series(
        r.points
            .iter()
            .filter(|p| p.outlier)
            .map(|p| Cross::new((x(p.t_k), p.rel_dev_pct), 7, flag)),
    )?;
    root.present()?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use crate::fit::{fit_points, FitOptions, Point};

    #[test]
    fn plot_is_svg_with_labels_and_points() {
        let pts: Vec<Point> = (0..10)
            .map(|i| {
                let t = 300.0 + 7.0 * i as f64;
                let bump = if i == 4 {
                    0.1
                } else {
                    0.001 * (i as f64).sin()
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
        let s = super::svg(&r);
        assert!(s.starts_with("<svg"), "{}", &s[..s.len().min(200)]);
        assert!(s.contains("HV-17") && s.contains("ln(p/Pa)"));
        assert!(s.matches("<circle").count() >= 10);
    }
}
