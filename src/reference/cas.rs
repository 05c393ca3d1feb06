//! CAS registry numbers: format and check digit.
//!
//! A CAS number is 2–7 digits, a hyphen, 2 digits, a hyphen and one check
//! digit. The check digit is the sum of each digit times its position counted
//! from the right (excluding the check digit), modulo 10.
//!
//! Reference: CAS Registry Number format and check-digit rule, as published by
//! the Chemical Abstracts Service (from memory).

/// Why a CAS number was refused.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum CasError {
    /// Not of the form NNNNNNN-NN-N.
    #[error("'{0}' is not a CAS number (expected digits-digits-digit, e.g. 67-64-1)")]
    Format(String),
    /// The check digit does not match.
    #[error("CAS number '{text}' has check digit {given}, but its digits give {expected}")]
    CheckDigit {
        /// The text given.
        text: String,
        /// The check digit given.
        given: u32,
        /// The check digit computed.
        expected: u32,
    },
}

/// Validate a CAS number, returning it normalised (trimmed).
///
/// ```
/// use ebullio::reference::cas::validate;
/// assert_eq!(validate("67-64-1").unwrap(), "67-64-1"); // acetone
/// assert!(validate("67-64-2").is_err());
/// ```
pub fn validate(text: &str) -> Result<String, CasError> {
    let t = text.trim();
    let parts: Vec<&str> = t.split('-').collect();
    let fmt = || CasError::Format(t.to_string());
    if parts.len() != 3 {
        return Err(fmt());
    }
    let (a, b, c) = (parts[0], parts[1], parts[2]);
    let digits_only = |s: &str| !s.is_empty() && s.bytes().all(|x| x.is_ascii_digit());
    let well_formed = digits_only(a)
        && digits_only(b)
        && digits_only(c)
        && (2..=7).contains(&a.len())
        && b.len() == 2
        && c.len() == 1;
    if !well_formed {
        return Err(fmt());
    }
    let body: Vec<u32> = a
        .bytes()
        .chain(b.bytes())
        .map(|x| u32::from(x - b'0'))
        .collect();
    let sum: u32 = body
        .iter()
        .rev()
        .enumerate()
        .map(|(i, d)| (i as u32 + 1) * d)
        .sum();
    let expected = sum % 10;
    let given = u32::from(c.as_bytes()[0] - b'0');
    if given != expected {
        return Err(CasError::CheckDigit {
            text: t.to_string(),
            given,
            expected,
        });
    }
    Ok(t.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    // CAS numbers of common solvents (from memory) and the check-digit rule.
    #[test]
    fn known_cas_numbers_from_memory_validate() {
        for cas in [
            "7732-18-5",
            "67-64-1",
            "71-43-2",
            "108-88-3",
            "64-17-5",
            "75-09-2",
        ] {
            assert!(validate(cas).is_ok(), "{cas}");
        }
    }

    #[test]
    fn wrong_check_digit_and_bad_format() {
        assert!(matches!(
            validate("7732-18-4"),
            Err(CasError::CheckDigit { expected: 5, .. })
        ));
        for bad in [
            "",
            "7732-18",
            "7732-1-5",
            "1-18-5",
            "77a2-18-5",
            "12345678-18-5",
            "7732-18-55",
        ] {
            assert!(matches!(validate(bad), Err(CasError::Format(_))), "{bad}");
        }
    }
}
