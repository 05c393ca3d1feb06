//! Identity checks: CAS check digit and form, and cells that could not be read.

use super::finding::{CheckCode, Finding};
use crate::reference::cas::{validate, CasError};

/// Check a CAS number; returns the normalised number when it is valid.
pub fn check_cas<'a>(cas: &'a str, out: &mut Vec<Finding>) -> Option<&'a str> {
    let t = super::trimmed(cas);
    if t.is_empty() {
        return None;
    }
    match validate(t) {
        Ok(_) => Some(t),
        Err(CasError::CheckDigit {
            given, expected, ..
        }) => {
            out.push(Finding::new(
                CheckCode::CasCheckDigit,
                format!(
                    "CAS number {t} ends in check digit {given}, but its digits give {expected}, so it is mistyped."
                ),
            ));
            None
        }
        Err(CasError::Format(_)) => {
            out.push(Finding::new(
                CheckCode::CasMalformed,
                format!("'{t}' is not a CAS number (expected digits-digits-digit, e.g. 67-64-1)."),
            ));
            None
        }
    }
}

/// One finding per unreadable recognised cell.
pub fn check_unreadable(cells: &[(&str, String)], line: usize, out: &mut Vec<Finding>) {
    for (column, why) in cells {
        out.push(Finding::new(
            CheckCode::UnreadableCell,
            format!("Column '{column}' on line {line}: {why}."),
        ));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Acetone's CAS number 67-64-1 (from memory; its check digit verifies).
    #[test]
    fn cas_check_digit_from_memory() {
        let mut out = vec![];
        assert_eq!(check_cas("67-64-1", &mut out), Some("67-64-1"));
        assert!(out.is_empty());
        assert_eq!(check_cas("67-64-2", &mut out), None);
        assert_eq!(out[0].code, CheckCode::CasCheckDigit);
        check_cas("67641", &mut out);
        assert_eq!(out[1].code, CheckCode::CasMalformed);
    }
}
