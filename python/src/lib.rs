//! The native module of the `ebullio` Python package: thin glue from Python to the library.
//!
//! Each function calls what the matching CLI command calls and hands back the same
//! serde-serialised rows (JSON) or columns (Arrow C stream), so Python and CLI numbers agree
//! by construction. The Python layer (`ebullio/`) turns them into DataFrames and result objects.

mod arrow;
mod boil;
mod check;
mod errors;
mod estimate;
mod fit;
mod vle;

use pyo3::prelude::*;

/// Version of the library this module was built from.
#[pyfunction]
fn version() -> &'static str {
    env!("CARGO_PKG_VERSION")
}

/// Threads of the Rust pool that batch calls run on.
#[pyfunction]
fn threads() -> usize {
    rayon::current_num_threads()
}

#[pymodule]
fn _ebullio(m: &Bound<'_, PyModule>) -> PyResult<()> {
    m.add("InputError", m.py().get_type::<errors::InputError>())?;
    m.add_class::<arrow::ArrowStream>()?;
    m.add_class::<estimate::EstimateRun>()?;
    m.add_class::<fit::FitRun>()?;
    m.add_class::<check::CheckRun>()?;
    m.add_function(wrap_pyfunction!(estimate::estimate, m)?)?;
    m.add_function(wrap_pyfunction!(fit::fit, m)?)?;
    m.add_function(wrap_pyfunction!(check::check, m)?)?;
    m.add_function(wrap_pyfunction!(boil::boil, m)?)?;
    m.add_function(wrap_pyfunction!(vle::vle, m)?)?;
    m.add_function(wrap_pyfunction!(version, m)?)?;
    m.add_function(wrap_pyfunction!(threads, m)?)?;
    Ok(())
}
