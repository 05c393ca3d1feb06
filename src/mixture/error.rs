//! The one error type of the mixture module: every refusal names what was wrong.

use thiserror::Error;

/// Why a mixture calculation was refused.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum MixtureError {
    /// The SMILES could not be read.
    #[error("SMILES '{smiles}': {message}")]
    Smiles {
        /// The SMILES as given.
        smiles: String,
        /// What the reader said.
        message: String,
    },
    /// A heavy atom belongs to no original-UNIFAC subgroup.
    #[error("SMILES '{smiles}': atom {atom} at position {position} fits no original-UNIFAC subgroup ({reason})")]
    UnassignedAtom {
        /// The SMILES as given.
        smiles: String,
        /// Element symbol of the atom.
        atom: String,
        /// 1-based character position in the SMILES.
        position: usize,
        /// Why no subgroup fits.
        reason: String,
    },
    /// Two main groups meet for which no interaction parameter is published.
    #[error("no published original-UNIFAC interaction parameter between main groups {m_name} ({m}) and {n_name} ({n}); the pair cannot be estimated (a missing pair is never taken as zero)")]
    MissingPair {
        /// First main group id.
        m: u16,
        /// Its name.
        m_name: String,
        /// Second main group id.
        n: u16,
        /// Its name.
        n_name: String,
    },
    /// More distinct subgroups than the fixed-size model holds.
    #[error("{count} distinct UNIFAC subgroups in the pair; at most {max} are supported")]
    TooManyGroups {
        /// Distinct subgroups found.
        count: usize,
        /// The limit.
        max: usize,
    },
    /// A subgroup id or name not in the embedded table.
    #[error("unknown UNIFAC subgroup '{0}'")]
    UnknownSubgroup(String),
    /// A model parameter that cannot be used.
    #[error("{model} parameter {name} = {value} is not usable: {expected}")]
    BadParameter {
        /// Model name.
        model: &'static str,
        /// Parameter name.
        name: &'static str,
        /// Value given.
        value: f64,
        /// What was expected.
        expected: &'static str,
    },
    /// A mole fraction outside 0–1.
    #[error("mole fraction {value} is outside 0 to 1")]
    Composition {
        /// The value given.
        value: f64,
    },
    /// A vapor-pressure curve gives no value where one is needed.
    #[error("the vapor-pressure curve of {name} gives no value at {t_k:.2} K")]
    NoVaporPressure {
        /// Component name.
        name: String,
        /// Temperature asked for.
        t_k: f64,
    },
    /// A pressure at which neither component boils on its curve.
    #[error("{} is outside the range of both vapor-pressure curves ({detail}): no boiling liquid can be assumed there", pressure_text(*.p_pa))]
    OutsideBothCurves {
        /// The pressure asked for.
        p_pa: f64,
        /// Per-component detail.
        detail: String,
    },
    /// A temperature or pressure that is not a positive finite number.
    #[error("{what} {value} is not a positive finite number")]
    BadCondition {
        /// "pressure" or "temperature".
        what: &'static str,
        /// The value.
        value: f64,
    },
    /// An equilibrium solver did not converge.
    #[error("{what} did not converge at x = {x}")]
    NoConvergence {
        /// Which calculation.
        what: &'static str,
        /// Composition it was asked at.
        x: f64,
    },
}

/// A pressure for messages: plain pascals in the everyday range, powers of ten outside it.
fn pressure_text(p_pa: f64) -> String {
    if (0.01..1e9).contains(&p_pa) {
        format!("{} Pa", (p_pa * 100.0).round() / 100.0)
    } else {
        format!("{p_pa:.3e} Pa")
    }
}
