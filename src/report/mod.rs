//! Reports: SVG plots and one self-contained HTML file per run.
//!
//! Output only: this module formats results the domain modules computed. Plots
//! are drawn with plotters' SVG backend and inlined into the HTML by
//! [`html::Report`], which needs no script, font, style sheet or image from
//! anywhere else.

pub mod curve_plot;
pub mod html;
