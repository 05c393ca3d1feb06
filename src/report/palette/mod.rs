//! ebullio's own colours, line patterns and markers: the one palette every plot and the report's CSS draw from.
//!
//! Six series colours ([`SERIES`]) chosen for this project so that any two stay
//! apart for people with protanopia, deuteranopia or tritanopia (checked in
//! `vision.rs` with the Machado, Oliveira & Fernandes 2009 simulation: CIEDE2000
//! ≥ 15 between every two series colours and the ink, under normal vision and
//! each simulation). Series never rely on colour alone: series `i` also has its
//! own dash pattern [`DASHES`]`[i]` and marker [`MARKERS`]`[i]`, so a greyscale
//! print still tells them apart. Neutrals ([`INK`], [`PAPER`], ...) are for
//! text, axes, grids, borders and shading.
//!
//! ```
//! use ebullio::report::palette::{self, Dash, SERIES};
//! let s = palette::series(7); // wraps around the six
//! assert_eq!(s.colour, SERIES[1]);
//! assert_eq!(SERIES[0].hex(), "#1848d8");
//! assert!(matches!(palette::DASHES[0], Dash::Solid));
//! ```

pub mod draw;
#[cfg(test)]
mod plots_test;
mod scan;
#[cfg(test)]
mod vision;

pub use scan::foreign_colours;

use plotters::style::{IntoFont, RGBColor, TextStyle};

/// An opaque sRGB colour (8 bits a channel).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub struct Colour(pub u8, pub u8, pub u8);

impl Colour {
    /// As a plotters colour.
    pub const fn rgb(self) -> RGBColor {
        RGBColor(self.0, self.1, self.2)
    }

    /// `#rrggbb`, lower case (the form the report's CSS uses).
    pub fn hex(self) -> String {
        format!("#{:02x}{:02x}{:02x}", self.0, self.1, self.2)
    }
}

/// Page and plot background.
pub const PAPER: Colour = Colour(0xff, 0xff, 0xff);
/// Text, axes, measured points: a blue-black.
pub const INK: Colour = Colour(0x1e, 0x23, 0x29);
/// Secondary text: captions, notes, footers.
pub const INK_SOFT: Colour = Colour(0x4a, 0x52, 0x5c);
/// Borders, rules and reference lines (e.g. a planned pressure).
pub const RULE: Colour = Colour(0x8c, 0x93, 0x9b);
/// Grid lines and light borders.
pub const GRID: Colour = Colour(0xdf, 0xe3, 0xe8);
/// Light shading: table headings, code blocks, warning rows.
pub const SHADE: Colour = Colour(0xee, 0xf1, 0xf4);
/// Deeper shading: error rows.
pub const SHADE_DEEP: Colour = Colour(0xd9, 0xde, 0xe4);

/// The series colours, in the order plots hand them out: cobalt, rust, pine,
/// plum, ochre, periwinkle.
pub const SERIES: [Colour; 6] = [
    Colour(0x18, 0x48, 0xd8),
    Colour(0xb4, 0x3a, 0x08),
    Colour(0x0a, 0x7c, 0x60),
    Colour(0x7a, 0x30, 0x68),
    Colour(0xc0, 0x8a, 0x14),
    Colour(0x8a, 0x8f, 0xd0),
];

/// Flagged points (outliers) and error-level findings: the rust series colour.
pub const FLAG: Colour = SERIES[1];
/// Warning-level findings: the ochre series colour.
pub const CAUTION: Colour = SERIES[4];

/// A line pattern.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Dash {
    /// Unbroken line.
    Solid,
    /// Dashes of `on` px separated by `off` px.
    Dashed {
        /// Dash length, px.
        on: u32,
        /// Gap length, px.
        off: u32,
    },
}

/// A point marker shape.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Marker {
    /// Open circle.
    Circle,
    /// Open upward triangle.
    Triangle,
    /// Open square.
    Square,
    /// Diagonal cross.
    Cross,
    /// Filled circle.
    Disc,
    /// Open diamond.
    Diamond,
}

/// Line pattern of series `i` (solid, long dash, dots, dash, long-short, fine dash).
pub const DASHES: [Dash; 6] = [
    Dash::Solid,
    Dash::Dashed { on: 10, off: 4 },
    Dash::Dashed { on: 2, off: 3 },
    Dash::Dashed { on: 6, off: 6 },
    Dash::Dashed { on: 16, off: 4 },
    Dash::Dashed { on: 4, off: 2 },
];

/// Marker of series `i`.
pub const MARKERS: [Marker; 6] = [
    Marker::Circle,
    Marker::Triangle,
    Marker::Square,
    Marker::Cross,
    Marker::Disc,
    Marker::Diamond,
];

/// Colour, line pattern and marker of one series.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct SeriesStyle {
    /// Line and marker colour.
    pub colour: Colour,
    /// Line pattern.
    pub dash: Dash,
    /// Marker shape.
    pub marker: Marker,
}

/// The style of series `i`; past the sixth the styles repeat.
pub fn series(i: usize) -> SeriesStyle {
    let k = i % SERIES.len();
    SeriesStyle {
        colour: SERIES[k],
        dash: DASHES[k],
        marker: MARKERS[k],
    }
}

/// Every colour of the palette with its CSS custom-property name.
pub const NAMED: [(&str, Colour); 13] = [
    ("paper", PAPER),
    ("ink", INK),
    ("ink-soft", INK_SOFT),
    ("rule", RULE),
    ("grid", GRID),
    ("shade", SHADE),
    ("shade-deep", SHADE_DEEP),
    ("series-1", SERIES[0]),
    ("series-2", SERIES[1]),
    ("series-3", SERIES[2]),
    ("series-4", SERIES[3]),
    ("series-5", SERIES[4]),
    ("series-6", SERIES[5]),
];

/// Is `c` one of the palette's colours?
pub fn contains(c: Colour) -> bool {
    NAMED.iter().any(|(_, k)| *k == c)
}

/// The palette as CSS custom properties (`:root { --ink: #1e2329; ... }`) for
/// the report's style sheet, which refers to them as `var(--ink)` and so on.
pub fn css_custom_properties() -> String {
    let mut s = String::from(":root {");
    for (name, c) in NAMED {
        s.push_str(&format!(" --{name}: {};", c.hex()));
    }
    s.push_str(" }\n");
    s
}

/// Plot text of `size` px in [`INK`].
pub fn font(size: u32) -> TextStyle<'static> {
    ("sans-serif", size).into_font().color(&INK.rgb())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_series_differs_from_every_other_in_colour_dash_and_marker() {
        for i in 0..SERIES.len() {
            for j in i + 1..SERIES.len() {
                let (a, b) = (series(i), series(j));
                assert_ne!(a.colour, b.colour, "colour {i} {j}");
                assert_ne!(a.dash, b.dash, "dash {i} {j}");
                assert_ne!(a.marker, b.marker, "marker {i} {j}");
            }
        }
        assert_eq!(series(6), series(0));
    }

    #[test]
    fn css_names_every_colour_once() {
        let css = css_custom_properties();
        for (name, c) in NAMED {
            assert_eq!(css.matches(&format!("--{name}:")).count(), 1, "{name}");
            assert!(css.contains(&c.hex()));
        }
        let mut seen: Vec<Colour> = NAMED.iter().map(|n| n.1).collect();
        seen.sort_by_key(|c| (c.0, c.1, c.2));
        seen.dedup();
        assert_eq!(seen.len(), NAMED.len(), "two names for one colour");
    }
}
