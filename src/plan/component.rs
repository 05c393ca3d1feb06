//! A component of a mixture to be separated: a name, a curve, and where it came from.

use super::PlanError;
use crate::vapor::Curve;

/// One component of the mixture: its name, its vapor-pressure curve and a
/// plain description of the curve's source (constants typed in, a reference
/// table, a structure estimate, a fit result file). The uncertainty the source
/// carries travels with the curve through [`Curve::t_uncertainty_k`].
pub struct Component {
    /// Name shown in the output.
    pub name: String,
    /// The vapor-pressure curve.
    pub curve: Box<dyn Curve>,
    /// Where the curve came from, in words (e.g. "Antoine constants given on the command line").
    pub source: String,
    /// The structure as SMILES, when known (for the liquid model).
    pub smiles: Option<String>,
}

impl std::fmt::Debug for Component {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("Component")
            .field("name", &self.name)
            .field("source", &self.source)
            .finish_non_exhaustive()
    }
}

impl Component {
    /// A component from its parts.
    pub fn new(name: impl Into<String>, curve: Box<dyn Curve>, source: impl Into<String>) -> Self {
        Self {
            name: name.into(),
            curve,
            source: source.into(),
            smiles: None,
        }
    }

    /// The same component with its structure (SMILES) known.
    pub fn with_smiles(mut self, smiles: impl Into<String>) -> Self {
        self.smiles = Some(smiles.into());
        self
    }

    /// Boiling temperature (K) at `p_pa`.
    pub fn tb_k(&self, p_pa: f64) -> Result<f64, PlanError> {
        self.curve
            .t_at(p_pa)
            .filter(|t| t.is_finite())
            .ok_or_else(|| PlanError::NoBoilingPoint {
                name: self.name.clone(),
                p_pa,
            })
    }

    /// ln(p/Pa) at `t_k`, or an error when the curve is undefined there.
    pub fn ln_p(&self, t_k: f64) -> Result<f64, PlanError> {
        let v = self.curve.ln_p(t_k);
        if v.is_finite() {
            Ok(v)
        } else {
            Err(PlanError::NoVaporPressure {
                name: self.name.clone(),
                t_k,
            })
        }
    }

    /// Whether `t_k` lies outside the range the source claims validity for
    /// (false when the source states no range).
    pub fn extrapolated(&self, t_k: f64) -> bool {
        self.curve
            .valid_range_k()
            .is_some_and(|(lo, hi)| t_k < lo || t_k > hi)
    }
}
