//! Output documents: SVG plots and one self-contained HTML report per run; no numerics.
//!
//! Output only: this module formats results the domain modules computed. Plots
//! are drawn with plotters' SVG backend and inlined into the HTML by
//! [`html::Report`], which needs no script, font, style sheet or image from
//! anywhere else. The `*_section` modules build the report sections of each
//! job (fit, estimate, check, plan); the commands' `--report` and the demo share them.

pub mod binary_fit_plot;
pub mod binary_fit_section;
pub mod check_section;
pub mod curve_plot;
pub mod estimate_section;
pub mod fit_plot;
pub mod fit_section;
pub mod html;
pub mod mccabe_plot;
pub mod palette;
pub mod plan_plot;
pub mod plan_section;
pub mod text;
pub mod vle_plot;
