//! SVG plot of several vapor-pressure curves, p (log scale) against t/°C, with a pressure line.
//!
//! Any [`Curve`] can be drawn: a fit, a published Antoine row, an estimate.
//! Curve `i` takes series style `i` of the [`palette`]: colour,
//! line pattern and marker shape, so the figure survives greyscale printing. Measured points may be
//! overlaid; a horizontal line marks a planned pressure (e.g. the vacuum).
//!
//! ```
//! use ebullio::report::curve_plot::{CurvePlot, PlotCurve};
//! use ebullio::vapor::AntoineConstants;
//! // Acetone, Smith, Van Ness & Abbott App. B Table B.2 (ln, kPa, degC).
//! let acetone = AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,kPa,degC".parse().unwrap());
//! let plot = CurvePlot::new("Acetone", (250.0, 350.0))
//!     .curve(PlotCurve::new("acetone (published)", &acetone))
//!     .pressure_line("20 mbar", 2000.0);
//! let svg = plot.render_svg().unwrap();
//! assert!(svg.starts_with("<svg") && svg.contains("t/°C"));
//! ```

use super::palette::{self, draw, font, GRID, INK, PAPER, RULE, SHADE};
use crate::vapor::Curve;
use plotters::element::DashedPathElement;
use plotters::prelude::*;

/// Error drawing a plot.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("cannot draw plot '{title}': {reason}")]
pub struct PlotError {
    /// Plot title.
    pub title: String,
    /// What went wrong.
    pub reason: String,
}

/// One curve to draw, with optional measured points.
pub struct PlotCurve<'a> {
    label: String,
    curve: &'a dyn Curve,
    range_k: Option<(f64, f64)>,
    points: Vec<(f64, f64)>,
}

impl<'a> PlotCurve<'a> {
    /// A curve drawn over the plot's whole temperature range.
    pub fn new(label: impl Into<String>, curve: &'a dyn Curve) -> Self {
        Self {
            label: label.into(),
            curve,
            range_k: None,
            points: Vec::new(),
        }
    }

    /// Draw the curve only over `[lo, hi]` K (e.g. its validity range).
    pub fn over_k(mut self, lo: f64, hi: f64) -> Self {
        self.range_k = Some((lo, hi));
        self
    }

    /// Overlay measured points `(T/K, p/Pa)`.
    pub fn points(mut self, points: Vec<(f64, f64)>) -> Self {
        self.points = points;
        self
    }
}

/// A plot of several curves.
pub struct CurvePlot<'a> {
    title: String,
    range_k: (f64, f64),
    curves: Vec<PlotCurve<'a>>,
    lines: Vec<(String, f64)>,
    size: (u32, u32),
}

impl<'a> CurvePlot<'a> {
    /// A plot over the temperature range `(lo, hi)` in kelvin.
    pub fn new(title: impl Into<String>, range_k: (f64, f64)) -> Self {
        Self {
            title: title.into(),
            range_k,
            curves: Vec::new(),
            lines: Vec::new(),
            size: (760, 480),
        }
    }

    /// Add a curve.
    pub fn curve(mut self, c: PlotCurve<'a>) -> Self {
        self.curves.push(c);
        self
    }

    /// Mark a pressure (Pa) with a horizontal line and a label.
    pub fn pressure_line(mut self, label: impl Into<String>, p_pa: f64) -> Self {
        self.lines.push((label.into(), p_pa));
        self
    }

    /// Draw the plot as an SVG document (pressure axis in mbar, log scale).
    pub fn render_svg(&self) -> Result<String, PlotError> {
        let err = |reason: String| PlotError {
            title: self.title.clone(),
            reason,
        };
        let (lo_k, hi_k) = self.range_k;
        if !(lo_k.is_finite() && hi_k.is_finite() && lo_k > 0.0 && hi_k > lo_k) {
            return Err(err(format!("bad temperature range {lo_k}..{hi_k} K")));
        }
        // Sample every curve; gather the pressure span in mbar.
        let mut series: Vec<Vec<(f64, f64)>> = Vec::new();
        let (mut pmin, mut pmax) = (f64::INFINITY, f64::NEG_INFINITY);
        for c in &self.curves {
            let (a, b) = c.range_k.unwrap_or((lo_k, hi_k));
            let (a, b) = (a.max(lo_k), b.min(hi_k));
            let mut s = Vec::new();
            if b > a {
                for i in 0..=120 {
                    let t = a + (b - a) * i as f64 / 120.0;
                    let p = crate::units::pa_to_mbar(c.curve.p_pa(t));
                    if p.is_finite() && p > 0.0 {
                        s.push((t - crate::units::CELSIUS_OFFSET, p));
                    }
                }
            }
            let in_mbar = s.iter().map(|q| q.1);
            let pts_mbar = c.points.iter().map(|q| crate::units::pa_to_mbar(q.1));
            for p in in_mbar
                .chain(pts_mbar)
                .filter(|p| p.is_finite() && *p > 0.0)
            {
                pmin = pmin.min(p);
                pmax = pmax.max(p);
            }
            series.push(s);
        }
        for (_, p) in &self.lines {
            pmin = pmin.min(crate::units::pa_to_mbar(*p));
            pmax = pmax.max(crate::units::pa_to_mbar(*p));
        }
        if !(pmin.is_finite() && pmax.is_finite() && pmin > 0.0) {
            return Err(err("no curve has a finite pressure in range".into()));
        }
        let (pmin, pmax) = (pmin / 1.5, pmax * 1.5);
        let (tmin, tmax) = (
            lo_k - crate::units::CELSIUS_OFFSET,
            hi_k - crate::units::CELSIUS_OFFSET,
        );

        let mut svg = String::new();
        {
            let root = SVGBackend::with_string(&mut svg, self.size).into_drawing_area();
            root.fill(&PAPER.rgb()).map_err(|e| err(e.to_string()))?;
            let mut chart = ChartBuilder::on(&root)
                .caption(&self.title, font(22))
                .margin(12)
                .x_label_area_size(42)
                .y_label_area_size(64)
                .build_cartesian_2d(tmin..tmax, (pmin..pmax).log_scale())
                .map_err(|e| err(e.to_string()))?;
            chart
                .configure_mesh()
                .x_desc("t/°C")
                .y_desc("p/mbar (log scale)")
                .axis_style(INK.rgb())
                .bold_line_style(GRID.rgb())
                .light_line_style(SHADE.rgb())
                .label_style(font(16))
                .axis_desc_style(font(18))
                .draw()
                .map_err(|e| err(e.to_string()))?;

            for (label, p) in &self.lines {
                let p = crate::units::pa_to_mbar(*p);
                let style = ShapeStyle::from(&RULE.rgb()).stroke_width(1);
                chart
                    .draw_series(DashedLineSeries::new(
                        vec![(tmin, p), (tmax, p)],
                        3,
                        5,
                        style,
                    ))
                    .map_err(|e| err(e.to_string()))?
                    .label(label.clone())
                    .legend(move |(x, y)| {
                        DashedPathElement::new(vec![(x, y), (x + 24, y)], 3, 5, style)
                    });
            }

            for (i, (c, s)) in self.curves.iter().zip(&series).enumerate() {
                let style = palette::series(i);
                draw::line(&mut chart, s, style, Some(&c.label)).map_err(|e| err(e.to_string()))?;
                let pts: Vec<(f64, f64)> = c
                    .points
                    .iter()
                    .map(|&(t, p)| {
                        (
                            t - crate::units::CELSIUS_OFFSET,
                            crate::units::pa_to_mbar(p),
                        )
                    })
                    .filter(|&(t, p)| t >= tmin && t <= tmax && p > 0.0)
                    .collect();
                draw::markers(&mut chart, &pts, style).map_err(|e| err(e.to_string()))?;
            }
            chart
                .configure_series_labels()
                .position(SeriesLabelPosition::UpperLeft)
                .background_style(PAPER.rgb().mix(0.9))
                .border_style(RULE.rgb())
                .label_font(font(16))
                .draw()
                .map_err(|e| err(e.to_string()))?;
            root.present().map_err(|e| err(e.to_string()))?;
        }
        Ok(svg)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::vapor::AntoineConstants;

    #[test]
    fn plot_has_axis_labels_with_units_and_legend() {
        let c = AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,kPa,degC".parse().unwrap());
        let svg = CurvePlot::new("t", (260.0, 340.0))
            .curve(PlotCurve::new("first", &c).points(vec![(300.0, 30_000.0)]))
            .curve(PlotCurve::new("second", &c).over_k(280.0, 320.0))
            .pressure_line("20 mbar", 2000.0)
            .render_svg()
            .unwrap();
        assert!(svg.contains("t/°C"));
        assert!(svg.contains("p/mbar"));
        assert!(svg.contains("first") && svg.contains("second") && svg.contains("20 mbar"));
    }

    #[test]
    fn bad_range_is_an_error_not_a_panic() {
        let c = AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,kPa,degC".parse().unwrap());
        assert!(CurvePlot::new("t", (340.0, 260.0))
            .curve(PlotCurve::new("x", &c))
            .render_svg()
            .is_err());
    }
}
