//! Listed boiling point against the structure-based estimate.
//!
//! A difference beyond three times the method's typical error is unusual
//! for a correct entry (about 0.3 % of rows for normally distributed errors),
//! so it is flagged as a warning, not an error: the method can be wrong too.

use super::finding::{CheckCode, Finding};
use super::number_text::Message;
use super::sources::StructureOutcome;

/// Multiple of the typical error beyond which a row is flagged.
pub const STRUCTURE_SIGMAS: f64 = 3.0;

/// Check a boiling point against the estimate for the row's SMILES.
/// Returns the residual (Tb − estimate) when an estimate exists.
pub fn check_structure(
    smiles: &str,
    outcome: &StructureOutcome,
    tb_k: Option<f64>,
    listed: bool,
    out: &mut Vec<Finding>,
) -> Option<f64> {
    match outcome {
        StructureOutcome::Unreadable { reason } => {
            out.push(Finding::new(
                CheckCode::SmilesUnreadable,
                format!("The SMILES '{smiles}' cannot be read: {reason}."),
            ));
            None
        }
        StructureOutcome::NoEstimate { .. } => None,
        StructureOutcome::Estimate {
            tb_k: est,
            typical_error_k,
            ..
        } => {
            let tb = tb_k?;
            let d = tb - est;
            let limit = STRUCTURE_SIGMAS * typical_error_k;
            if d.abs() > limit {
                let which = if listed { "listed" } else { "implied" };
                out.push(Finding::new(
                    CheckCode::TbStructureMismatch,
                    Message::with_capacity(160)
                        .text("The ")
                        .text(which)
                        .text(" boiling point ")
                        .d1(tb)
                        .text(" K is ")
                        .d1(d.abs())
                        .text(" K from the structure estimate ")
                        .d1(*est)
                        .text(" K, more than ")
                        .shortest(STRUCTURE_SIGMAS)
                        .text(" times the method's typical error of ")
                        .d1(*typical_error_k)
                        .text(" K.")
                        .done(),
                ));
            }
            Some(d)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn beyond_three_sigma_is_flagged() {
        let est = StructureOutcome::Estimate {
            tb_k: 350.0,
            typical_error_k: 10.0,
            structure_key: None,
        };
        let mut out = vec![];
        assert_eq!(
            check_structure("CCO", &est, Some(375.0), true, &mut out),
            Some(25.0)
        );
        assert!(out.is_empty());
        check_structure("CCO", &est, Some(385.0), true, &mut out);
        assert_eq!(out[0].code, CheckCode::TbStructureMismatch);
        let bad = StructureOutcome::Unreadable {
            reason: "ring 1 not closed".into(),
        };
        check_structure("C1CC", &bad, Some(385.0), true, &mut out);
        assert_eq!(out[1].code, CheckCode::SmilesUnreadable);
    }
}
