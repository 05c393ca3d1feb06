//! Output documents: SVG plots and HTML reports drawn from results; no numerics.

pub mod fit_plot;
pub mod plan_plot;
