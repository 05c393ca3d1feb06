//! Output documents: SVG plots (and, later, HTML reports).

pub mod fit_plot;
