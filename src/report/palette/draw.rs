//! Plotters drawing in the palette's styles: a series line, its markers and its legend sample.
//!
//! Every plot draws its series through these, so a series looks the same
//! (colour, dash, marker) in every figure ebullio makes.

use super::{Dash, Marker, SeriesStyle};
use plotters::coord::cartesian::Cartesian2d;
use plotters::coord::ranged1d::Ranged;
use plotters::drawing::DrawingAreaErrorKind;
use plotters::element::{
    Circle, Cross, DashedPathElement, Drawable, EmptyElement, PathElement, PointCollection,
    Rectangle, TriangleMarker,
};
use plotters::prelude::{ChartContext, DashedLineSeries, DrawingBackend, LineSeries};
use plotters::style::{Color, ShapeStyle};
use plotters_backend::DrawingErrorKind;

/// Line width of a series, px.
pub const LINE_WIDTH: u32 = 2;
/// Marker half-size, px.
pub const MARKER_SIZE: i32 = 4;

type Chart<'c, 'a, DB, X, Y> = &'c mut ChartContext<'a, DB, Cartesian2d<X, Y>>;
type Drawn<DB> = Result<(), DrawingAreaErrorKind<<DB as DrawingBackend>::ErrorType>>;

fn stroke(s: SeriesStyle, width: u32) -> ShapeStyle {
    s.colour.rgb().stroke_width(width)
}

/// Draw `points` (data coordinates) as a line in the series' colour and dash,
/// with a legend entry when `label` is given.
pub fn line<'a, DB, X, Y>(
    chart: Chart<'_, 'a, DB, X, Y>,
    points: &[(f64, f64)],
    s: SeriesStyle,
    label: Option<&str>,
) -> Drawn<DB>
where
    DB: DrawingBackend + 'a,
    X: Ranged<ValueType = f64>,
    Y: Ranged<ValueType = f64>,
{
    let style = stroke(s, LINE_WIDTH);
    let pts = points.to_vec();
    let anno = match s.dash {
        Dash::Solid => chart.draw_series(LineSeries::new(pts, style))?,
        Dash::Dashed { on, off } => {
            chart.draw_series(DashedLineSeries::new(pts, on, off, style))?
        }
    };
    if let Some(l) = label {
        anno.label(l).legend(legend(s));
    }
    Ok(())
}

/// Draw the series' marker at each of `points` (data coordinates).
pub fn markers<'a, DB, X, Y>(
    chart: Chart<'_, 'a, DB, X, Y>,
    points: &[(f64, f64)],
    s: SeriesStyle,
) -> Drawn<DB>
where
    DB: DrawingBackend + 'a,
    X: Ranged<ValueType = f64>,
    Y: Ranged<ValueType = f64>,
{
    let r = MARKER_SIZE;
    let c = s.colour.rgb();
    let open = c.stroke_width(1);
    let pts = points.iter().copied();
    match s.marker {
        Marker::Circle => chart.draw_series(pts.map(|p| Circle::new(p, r, open)))?,
        Marker::Disc => chart.draw_series(pts.map(|p| Circle::new(p, r, c.filled())))?,
        Marker::Triangle => chart.draw_series(pts.map(|p| TriangleMarker::new(p, r + 1, open)))?,
        Marker::Cross => chart.draw_series(pts.map(|p| Cross::new(p, r, c.stroke_width(2))))?,
        Marker::Square => chart.draw_series(
            pts.map(|p| EmptyElement::at(p) + Rectangle::new([(-r, -r), (r, r)], open)),
        )?,
        Marker::Diamond => {
            let d = r + 1;
            chart.draw_series(pts.map(|p| {
                EmptyElement::at(p)
                    + PathElement::new(vec![(0, -d), (d, 0), (0, d), (-d, 0), (0, -d)], open)
            }))?
        }
    };
    Ok(())
}

/// The legend entry of a series: a 24 px stretch of its line with its marker in the middle.
pub fn legend(s: SeriesStyle) -> impl Fn((i32, i32)) -> LegendSample {
    move |at| LegendSample { at, style: s }
}

/// A legend sample (see [`legend`]), drawn in backend pixels.
pub struct LegendSample {
    at: (i32, i32),
    style: SeriesStyle,
}

impl<'a> PointCollection<'a, (i32, i32)> for &'a LegendSample {
    type Point = &'a (i32, i32);
    type IntoIter = std::iter::Once<&'a (i32, i32)>;
    fn point_iter(self) -> Self::IntoIter {
        std::iter::once(&self.at)
    }
}

impl<DB: DrawingBackend> Drawable<DB> for LegendSample {
    fn draw<I: Iterator<Item = (i32, i32)>>(
        &self,
        mut pos: I,
        backend: &mut DB,
        dim: (u32, u32),
    ) -> Result<(), DrawingErrorKind<DB::ErrorType>> {
        let Some((x, y)) = pos.next() else {
            return Ok(());
        };
        let s = self.style;
        let line = stroke(s, LINE_WIDTH);
        let ends = vec![(x, y), (x + 24, y)];
        match s.dash {
            Dash::Solid => {
                PathElement::new(ends.clone(), line).draw(ends.into_iter(), backend, dim)?
            }
            // Shorter dashes than in the plot so the pattern shows within 24 px.
            Dash::Dashed { on, off } => {
                DashedPathElement::new(ends.clone(), on.min(8), off.min(4), line).draw(
                    ends.into_iter(),
                    backend,
                    dim,
                )?
            }
        }
        let (r, m) = (MARKER_SIZE, (x + 12, y));
        let c = s.colour.rgb();
        let open = c.stroke_width(1);
        let one = std::iter::once(m);
        match s.marker {
            Marker::Circle => Circle::new(m, r, open).draw(one, backend, dim),
            Marker::Disc => Circle::new(m, r, c.filled()).draw(one, backend, dim),
            Marker::Triangle => TriangleMarker::new(m, r + 1, open).draw(one, backend, dim),
            Marker::Cross => Cross::new(m, r, c.stroke_width(2)).draw(one, backend, dim),
            Marker::Square => {
                let corners = [(m.0 - r, m.1 - r), (m.0 + r, m.1 + r)];
                Rectangle::new(corners, open).draw(corners.into_iter(), backend, dim)
            }
            Marker::Diamond => {
                let d = r + 1;
                let path = vec![
                    (m.0, m.1 - d),
                    (m.0 + d, m.1),
                    (m.0, m.1 + d),
                    (m.0 - d, m.1),
                    (m.0, m.1 - d),
                ];
                PathElement::new(path.clone(), open).draw(path.into_iter(), backend, dim)
            }
        }
    }
}

/// The project's mesh on a chart of numbers: ink axes, grid and shade lines,
/// label and axis-title fonts, and the two axis titles.
pub fn mesh<'a, DB, X, Y>(chart: Chart<'_, 'a, DB, X, Y>, x_desc: &str, y_desc: &str) -> Drawn<DB>
where
    DB: DrawingBackend + 'a,
    X: Ranged<ValueType = f64> + plotters::coord::ranged1d::ValueFormatter<f64>,
    Y: Ranged<ValueType = f64> + plotters::coord::ranged1d::ValueFormatter<f64>,
{
    chart
        .configure_mesh()
        .x_desc(x_desc)
        .y_desc(y_desc)
        .axis_style(super::INK.rgb())
        .bold_line_style(super::GRID.rgb())
        .light_line_style(super::SHADE.rgb())
        .label_style(super::font(12))
        .axis_desc_style(super::font(14))
        .draw()
}

/// The legend box in the palette, at `position`.
pub fn legend_box<'a, DB, X, Y>(
    chart: Chart<'_, 'a, DB, X, Y>,
    position: plotters::chart::SeriesLabelPosition,
) -> Drawn<DB>
where
    DB: DrawingBackend + 'a,
    X: Ranged<ValueType = f64>,
    Y: Ranged<ValueType = f64>,
{
    chart
        .configure_series_labels()
        .position(position)
        .background_style(super::PAPER.rgb().mix(0.85))
        .border_style(super::RULE.rgb())
        .label_font(super::font(12))
        .draw()
}
