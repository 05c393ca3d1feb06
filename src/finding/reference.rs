//! Finding codes about a fit held against reference data or a structure estimate.

use super::finding_codes;

finding_codes! {
    /// Every finding of a reference comparison (also appended to a fit's `flags`).
    pub enum ReferenceCode {
        /// The reference row states no range; compared within 30 K of its Tb.
        ReferenceRangeUnstated = "reference-range-unstated", Info;
        /// Fitted and reference pressures differ beyond the tolerance.
        ReferencePressureDisagrees = "reference-pressure-disagrees", Warning;
        /// The fitted and reference ranges do not overlap.
        ReferenceNoOverlap = "reference-no-overlap", Info;
        /// Fitted and reference normal boiling points differ beyond the tolerance.
        ReferenceTbDisagrees = "reference-tb-disagrees", Warning;
        /// The fitted Tb is far from the structure estimate.
        StructureTbDisagrees = "structure-tb-disagrees", Warning;
        /// No reference compound matched the name or structure.
        ReferenceNotFound = "reference-not-found", Info;
    }
}
