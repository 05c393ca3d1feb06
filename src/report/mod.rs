//! Reports: SVG plots (and later HTML) drawn from results; input/output only, no numerics.

pub mod plan_plot;
