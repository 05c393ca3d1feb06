//! The command line's side of the library's curve-source resolver
//! ([`ebullio::reference::curve_source`]): the same lookups, errors naming the option.

use super::InputError;
use ebullio::reference::curve_source as lib;
pub use ebullio::reference::curve_source::{variant_words, ByStructure};
use ebullio::reference::{Compound, Library, ReferenceCurve};

/// The reference compound `query` names (name, synonym or CAS) and its best curve.
pub fn by_name<'a>(
    library: &'a Library,
    query: &str,
) -> Result<(&'a Compound, ReferenceCurve), InputError> {
    lib::by_name(library, query).map_err(|e| InputError(format!("--compound '{query}': {e}")))
}

/// The curve for a structure: reference first, else an estimate.
pub fn by_structure(smiles: &str) -> Result<ByStructure<'static>, InputError> {
    lib::by_structure(smiles).map_err(|e| InputError(format!("--smiles '{smiles}': {e}")))
}

/// `"SMILES name words"` split into the SMILES and the name (the SMILES when none).
pub fn smiles_and_name(text: &str) -> Result<(&str, Option<String>), InputError> {
    lib::smiles_and_name(text).map_err(|e| InputError(format!("--smiles: {e}")))
}
