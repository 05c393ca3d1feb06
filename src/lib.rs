//! ebullio: vapor-pressure curves and boiling points a process chemist can trust.
//!
//! Three jobs share one library: **fit** vapor-pressure equations to measured
//! (T, p) points with honest uncertainties; **estimate** boiling points and
//! whole curves from structure (SMILES, Joback group contributions); **check**
//! property tables for slips and outliers before they reach a distillation plan.
//!
//! # Layers
//!
//! The module tree is the architecture, in three layers; a module imports only from
//! its own layer or an inner one (checked by `tests/layers.rs`, run by `cargo test`):
//!
//! 1. **Domain** — `units`, `vapor`, `fit`, `molecule`, `estimate`, `reference`
//!    (data model), `screen`, `plan`, `mixture`, and `finding` (the one outcome
//!    vocabulary), `boiling`, `refit`, `severity`:
//!    numerics and data models, SI inside (K, Pa, ln p), no files, no polars, no
//!    command line.
//! 2. **Input/output** — `table_io` (every file read or written, polars behind the
//!    `tables` feature) and `report` (plots, HTML sections, text tables).
//! 3. **Application** — the binary's `cli` and `demo` (`src/main.rs`, behind the
//!    `cli` feature with clap, anyhow, indicatif and ctrlc). Nothing depends on it.
//!
//! Units appear only at the edges.
//!
//! ```
//! use ebullio::units::parse_pressure;
//! use ebullio::vapor::{AntoineConstants, Curve};
//! // Benzene, Smith, Van Ness & Abbott App. B Table B.2 (ln, kPa, degC).
//! let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap());
//! let t = bz.t_at(parse_pressure("200 mbar").unwrap().pa()).unwrap();
//! assert!(t > 300.0 && t < 320.0);
//! ```
// No unsafe code: the fuzz targets run without a memory sanitizer (fuzz/README.md).
#![forbid(unsafe_code)]
#![warn(missing_docs)]

pub mod boiling;
pub mod estimate;
pub mod finding;
pub mod fit;
pub mod mixture;
pub mod molecule;
pub mod plan;
pub mod reference;
pub mod refit;
pub mod report;
pub mod screen;
pub mod severity;
pub mod table_io;
pub mod units;
pub mod vapor;
