//! SMILES reading errors that point at the offending character.

/// What went wrong while reading a SMILES string.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum SmilesErrorKind {
    /// The input is empty or only whitespace.
    #[error("empty SMILES")]
    Empty,
    /// A character that SMILES does not use here.
    #[error("unexpected character '{0}'")]
    UnexpectedChar(char),
    /// An element symbol that does not exist (or is not allowed outside brackets).
    #[error("unknown element '{0}'")]
    UnknownElement(String),
    /// A `[` without its `]`.
    #[error("unclosed bracket atom")]
    UnclosedBracket,
    /// A malformed bracket atom (bad charge, H count, chirality, class).
    #[error("malformed bracket atom: {0}")]
    BadBracket(&'static str),
    /// A ring-closure digit that was opened and never closed.
    #[error("unclosed ring {0}")]
    UnclosedRing(u32),
    /// A ring closure joining an atom to itself or to a neighbour it is already bonded to.
    #[error("ring {0} closes onto an atom already bonded there")]
    BadRingClosure(u32),
    /// The two ends of a ring closure specify different bond orders.
    #[error("ring {0} has conflicting bond symbols at its two ends")]
    RingBondConflict(u32),
    /// `(` without `)` or `)` without `(`.
    #[error("unbalanced parenthesis")]
    UnbalancedParen,
    /// A bond symbol, branch or ring number with no atom before or after it.
    #[error("{0} without an atom")]
    Dangling(&'static str),
    /// A lower-case (aromatic) atom that is in no ring.
    #[error("aromatic atom '{0}' is not in a ring")]
    AromaticOutsideRing(String),
    /// Aromatic atoms that cannot be given alternating single and double bonds.
    #[error(
        "aromatic ring cannot be given alternating double bonds (a pyrrole-type N needs [nH])"
    )]
    Kekulize,
    /// An organic-subset atom with more bonds than any of its normal valences.
    #[error("{element} has {bonds} bonds, more than its allowed valence")]
    Valence {
        /// Element name.
        element: &'static str,
        /// Sum of bond orders.
        bonds: u32,
    },
    /// The molecule is too large to read safely.
    #[error("SMILES too long (more than {0} atoms)")]
    TooLarge(usize),
}

/// A SMILES reading error at a 1-based character `position` of `input`.
///
/// `Display` gives one line (`unclosed ring 1 at position 2`); [`SmilesError::caret`]
/// adds the input and a caret under the offending character.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
#[error("{kind} at position {position}")]
pub struct SmilesError {
    /// What went wrong.
    pub kind: SmilesErrorKind,
    /// 1-based character position in `input`.
    pub position: usize,
    /// The SMILES as given.
    pub input: String,
}

impl SmilesError {
    /// Build from a byte offset into `input` (converted to a 1-based character position).
    pub(crate) fn at(kind: SmilesErrorKind, input: &str, byte: usize) -> Self {
        let byte = byte.min(input.len());
        let mut b = byte;
        while b > 0 && !input.is_char_boundary(b) {
            b -= 1;
        }
        SmilesError {
            kind,
            position: input[..b].chars().count() + 1,
            input: input.to_string(),
        }
    }

    /// Two lines: the input, and a caret under the offending character.
    ///
    /// ```
    /// let e = ebullio::molecule::parse_smiles("CC[Xx]C").unwrap_err();
    /// assert_eq!(e.to_string(), "unknown element 'Xx' at position 4");
    /// assert_eq!(e.caret(), "CC[Xx]C\n   ^");
    /// ```
    pub fn caret(&self) -> String {
        let pad: String = " ".repeat(self.position.saturating_sub(1));
        format!("{}\n{pad}^", self.input)
    }
}
