//! The output rule for values that could not be computed: no `NaN` or `inf` text, ever.

use std::borrow::Cow;

/// `text` with every whole word `NaN`, `inf` or `infinity` (any case, with a sign) replaced
/// by `blank`: a value that could not be computed is shown as missing (`-` in a table, an
/// empty CSV cell), never as floating-point text. Words that merely contain the letters
/// (`info`) are kept. Borrows `text` when there is nothing to replace (the usual case).
///
/// ```
/// use ebullio::table_io::without_non_finite;
/// assert_eq!(without_non_finite("RMS NaN % [info] -inf,inf\n", "-"), "RMS - % [info] -,-\n");
/// assert!(matches!(without_non_finite("1.5,info", ""), std::borrow::Cow::Borrowed(_)));
/// ```
pub fn without_non_finite<'a>(text: &'a str, blank: &str) -> Cow<'a, str> {
    // every such word holds an `n` followed by `a` or `f` (any case): most text has none
    if !may_hold_one(text.as_bytes()) || !words(text).any(|(_, w)| is_non_finite(w)) {
        return Cow::Borrowed(text);
    }
    let bytes = text.as_bytes();
    let mut out = String::with_capacity(text.len());
    let mut copied = 0;
    for (start, w) in words(text).filter(|(_, w)| is_non_finite(w)) {
        out.push_str(&text[copied..start]);
        // a sign that belongs to the word goes with it (not the hyphen of `x-inf`)
        if out.ends_with(['-', '+']) && (start < 2 || !bytes[start - 2].is_ascii_alphanumeric()) {
            out.pop();
        }
        out.push_str(blank);
        copied = start + w.len();
    }
    out.push_str(&text[copied..]);
    Cow::Owned(out)
}

/// Whether `b` holds an `n` followed by `a` or `f` (any case), as every such word does;
/// found by memchr, since most text has none.
fn may_hold_one(b: &[u8]) -> bool {
    memchr::memchr2_iter(b'n', b'N', b).any(|i| {
        b.get(i + 1)
            .is_some_and(|c| matches!(c | 0x20, b'a' | b'f'))
    })
}

fn is_non_finite(w: &str) -> bool {
    ["nan", "inf", "infinity"]
        .iter()
        .any(|n| w.eq_ignore_ascii_case(n))
}

/// The runs of ASCII letters and digits in `text`, with their byte offsets.
fn words(text: &str) -> impl Iterator<Item = (usize, &str)> {
    let bytes = text.as_bytes();
    let mut i = 0;
    std::iter::from_fn(move || {
        while i < bytes.len() && !bytes[i].is_ascii_alphanumeric() {
            i += 1;
        }
        if i >= bytes.len() {
            return None;
        }
        let start = i;
        while i < bytes.len() && bytes[i].is_ascii_alphanumeric() {
            i += 1;
        }
        Some((start, &text[start..i]))
    })
}

#[cfg(test)]
mod tests {
    use super::{may_hold_one, without_non_finite};
    use proptest::prelude::*;

    proptest! {
        // The memchr search finds what a scan of every pair of bytes finds.
        #[test]
        fn the_quick_search_is_the_pair_scan(s in "[nNaAfFiItyY ,x0é-]{0,40}") {
            let pairs = s
                .as_bytes()
                .windows(2)
                .any(|w| w[0] | 0x20 == b'n' && matches!(w[1] | 0x20, b'a' | b'f'));
            prop_assert_eq!(may_hold_one(s.as_bytes()), pairs);
        }
    }

    #[test]
    fn non_finite_words_are_blanked_and_info_is_kept() {
        assert_eq!(
            without_non_finite("RMS NaN % [info] -inf,inf,NaN\n", "-"),
            "RMS - % [info] -,-,-\n"
        );
        assert_eq!(without_non_finite("1,NaN,,x-inf\n", ""), "1,,,x-\n");
        assert_eq!(without_non_finite("+Infinity é NAN", "?"), "? é ?");
        assert_eq!(without_non_finite("-nan", ""), "");
        assert_eq!(without_non_finite("InF,C6H6", ""), ",C6H6");
    }
}
