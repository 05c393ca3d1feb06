//! One curve-source resolver for `boil`, `plan` and `vle` (command line and Python): a
//! reference compound by name or CAS, or a structure (reference first, else an estimate).
//! Errors say what is wrong without naming any front end's option; each caller adds it.

use crate::estimate::{estimate_smiles, LeeKeslerCurve, TbVariant};
use crate::reference::{Compound, Library, LookupError, ReferenceCurve};

/// A structure's vapor-pressure curve: the reference's when the structure is a
/// reference compound, else an estimate from the structure.
pub enum ByStructure<'a> {
    /// The structure is this reference compound.
    Reference(&'a Compound, ReferenceCurve),
    /// Estimated from the structure.
    Estimate(Box<StructureEstimate>),
}

/// An estimated curve and the figures to state beside it.
pub struct StructureEstimate {
    /// The Lee–Kesler curve through the estimated Tb, Tc, pc.
    pub curve: LeeKeslerCurve,
    /// Normal boiling point used, K.
    pub tb_k: f64,
    /// Which Tb variant.
    pub variant: TbVariant,
    /// Typical error of that Tb, K.
    pub typical_error_k: f64,
    /// 90 % interval of Tb, K.
    pub pi90_k: (f64, f64),
    /// Why the structure was not matched to a reference compound, when it nearly was.
    pub not_matched: Option<String>,
}

/// The reference compound `query` names (name, synonym or CAS) and its best curve.
pub fn by_name<'a>(
    lib: &'a Library,
    query: &str,
) -> Result<(&'a Compound, ReferenceCurve), String> {
    let c = lib.find(query).map_err(|e| e.to_string())?;
    let curve = c.best_curve().ok_or_else(|| {
        format!(
            "the reference has a boiling point but no vapor-pressure curve for {}",
            c.name
        )
    })?;
    Ok((c, curve))
}

/// The curve for a structure: reference first, else an estimate.
///
/// ```
/// use ebullio::reference::curve_source::{by_structure, ByStructure};
/// assert!(matches!(by_structure("Cc1ccccc1").unwrap(), ByStructure::Reference(c, _) if c.name == "toluene"));
/// ```
pub fn by_structure(smiles: &str) -> Result<ByStructure<'static>, String> {
    let lib = Library::bundled();
    if let Some((c, rc)) = lib.reference_for_smiles(smiles) {
        return Ok(ByStructure::Reference(c, rc));
    }
    let not_matched = match lib.find_smiles(smiles) {
        Err(e @ LookupError::Stereo { .. }) => Some(e.to_string()),
        _ => None,
    };
    let e = estimate_smiles(smiles).map_err(|e| e.to_string())?;
    let curve = e
        .curve()
        .ok_or("no critical constants could be estimated, so there is no vapor-pressure curve")?;
    Ok(ByStructure::Estimate(Box::new(StructureEstimate {
        curve,
        tb_k: e.tb_k,
        variant: e.tb_variant,
        typical_error_k: e.tb_typical_error_k,
        pi90_k: (e.tb_pi90_low_k, e.tb_pi90_high_k),
        not_matched,
    })))
}

/// `"SMILES name words"` split into the SMILES and the name (None when none is given).
pub fn smiles_and_name(text: &str) -> Result<(&str, Option<String>), String> {
    let mut parts = text.split_whitespace();
    let smiles = parts
        .next()
        .ok_or("empty value; give a SMILES such as \"CC(=O)C acetone\"")?;
    let rest: Vec<&str> = parts.collect();
    Ok((smiles, (!rest.is_empty()).then(|| rest.join(" "))))
}

/// The printed citation of a reference row without any web address the row's
/// notes carry (output names published works only), keeping file and line.
pub fn citation(source: &str) -> String {
    match source.find("; http") {
        Some(i) => {
            let tail = source
                .rfind(" (reference-data/")
                .or_else(|| source.rfind(" ("))
                .filter(|&j| j > i && !source[j..].contains("http"))
                .map_or("", |j| &source[j..]);
            format!("{}{tail}", &source[..i])
        }
        None => source.to_string(),
    }
}

/// The estimate variant in words.
pub fn variant_words(v: TbVariant) -> &'static str {
    match v {
        TbVariant::Joback => "Joback",
        TbVariant::SteinBrown => "Stein–Brown",
        TbVariant::JobackGroupsRefitLog => "Joback-group (refitted, log form)",
        TbVariant::JobackGroupsRefitSteinBrown => "Joback-group (refitted, Stein–Brown form)",
        TbVariant::ExtendedGroupsLog => "extended-group (log form)",
        TbVariant::ExtendedGroupsSteinBrown => "extended-group (Stein–Brown form)",
        #[allow(unreachable_patterns)]
        other => other.name(),
    }
}
