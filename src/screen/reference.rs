//! Boiling point against the reference table (bundled or user-supplied).

use super::finding::{CheckCode, Finding};
use super::number_text::Message;
use super::sources::{Identity, ReferenceLookup};

/// Compare `tb_k` (listed, or implied when `listed` is false) with the
/// reference entry for this identity, if there is one.
pub fn check_reference(
    reference: &dyn ReferenceLookup,
    id: &Identity<'_>,
    tb_k: f64,
    listed: bool,
    tol_k: f64,
    out: &mut Vec<Finding>,
) {
    let Some(entry) = reference.find(id) else {
        return;
    };
    let d = tb_k - entry.tb_k;
    if d.abs() > tol_k {
        let which = if listed { "listed" } else { "implied" };
        out.push(Finding::new(
            CheckCode::ReferenceMismatch,
            Message::with_capacity(96 + entry.name.len() + entry.source.len())
                .text("The ")
                .text(which)
                .text(" boiling point ")
                .d1(tb_k)
                .text(" K differs by ")
                .d1(d.abs())
                .text(" K from the reference value ")
                .d1(entry.tb_k)
                .text(" K for ")
                .text(&entry.name)
                .text(" (")
                .text(&entry.source)
                .text(").")
                .done(),
        ));
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::screen::sources::{ReferenceEntry, TableReference};

    #[test]
    fn disagreement_beyond_tolerance_is_flagged() {
        let mut r = TableReference::new();
        let id = Identity {
            name: Some("benzene"),
            ..Default::default()
        };
        r.add(
            &id,
            ReferenceEntry {
                name: "benzene".into(),
                tb_k: 353.15,
                source: "test table".into(),
            },
        );
        let mut out = vec![];
        check_reference(&r, &id, 353.5, true, 1.0, &mut out);
        assert!(out.is_empty());
        check_reference(&r, &id, 363.15, true, 1.0, &mut out);
        assert_eq!(out[0].code, CheckCode::ReferenceMismatch);
    }
}
