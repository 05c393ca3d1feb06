//! Finds colours in an SVG or HTML document that are not the palette's.
//!
//! Used by the tests of every plot and of the report: a colour written anywhere
//! (an SVG `fill`/`stroke` attribute, a CSS declaration, an inline style) must
//! be one of [`super::NAMED`].

use super::{contains, Colour};

/// CSS named colours a plotting library or a hand-written style might emit.
const NAMED_CSS: [&str; 24] = [
    "black", "white", "red", "green", "blue", "yellow", "orange", "purple", "gray", "grey",
    "silver", "maroon", "navy", "teal", "olive", "lime", "aqua", "fuchsia", "cyan", "magenta",
    "brown", "pink", "gold", "indigo",
];

/// Properties and attributes whose values are colours.
const COLOUR_KEYS: [&str; 9] = [
    "fill",
    "stroke",
    "color",
    "background",
    "background-color",
    "border",
    "border-color",
    "stop-color",
    "outline",
];

/// Every colour written in `doc` that is not in the palette, as written
/// (e.g. `#1F77B4`, `rgb(1,2,3)`, `stroke="red"`). Empty when the document
/// keeps to the palette.
///
/// ```
/// use ebullio::report::palette::{foreign_colours, INK};
/// let ok = format!("<rect fill=\"{}\"/>", INK.hex());
/// assert!(foreign_colours(&ok).is_empty());
/// assert_eq!(foreign_colours("<rect fill=\"#FF0000\"/>"), ["#FF0000"]);
/// assert_eq!(foreign_colours("p { color: red; }"), ["color: red"]);
/// ```
pub fn foreign_colours(doc: &str) -> Vec<String> {
    let mut out = Vec::new();
    let bytes = doc.as_bytes();
    // 1. Hex literals (#rgb, #rgba, #rrggbb, #rrggbbaa) where a colour can stand:
    //    an attribute value, a CSS value or a function argument (not prose such
    //    as "row #123", not in-page links).
    for (i, _) in doc.match_indices('#') {
        let run = bytes[i + 1..]
            .iter()
            .take_while(|b| b.is_ascii_alphanumeric() || **b == b'-' || **b == b'_')
            .count();
        let word = &doc[i + 1..i + 1 + run];
        let is_hex = word.bytes().all(|b| b.is_ascii_hexdigit());
        let before = doc[..i].trim_end_matches(' ');
        let in_value = before.ends_with(['"', '\'', ':', '(', ',']) && !before.ends_with("href=\"");
        if !is_hex || ![3, 4, 6, 8].contains(&run) || !in_value {
            continue;
        }
        match parse_hex(word) {
            Some(c) if contains(c) => {}
            _ => out.push(doc[i..i + 1 + run].to_string()),
        }
    }
    // 2. Functional notations: the palette is written in hex only.
    let lower = doc.to_ascii_lowercase();
    for f in [
        "rgb(", "rgba(", "hsl(", "hsla(", "hwb(", "lab(", "lch(", "color(",
    ] {
        for (i, _) in lower.match_indices(f) {
            let prev = lower[..i].chars().next_back();
            if prev.is_some_and(|c| c.is_ascii_alphanumeric() || c == '-') {
                continue;
            }
            let end = lower[i..].find(')').map_or(lower.len(), |e| i + e + 1);
            out.push(doc[i..end].to_string());
        }
    }
    // 3. Named colours as the value of a colour attribute or CSS property.
    for key in COLOUR_KEYS {
        for sep in ["=\"", ":"] {
            let pat = format!("{key}{sep}");
            for (i, _) in lower.match_indices(&pat) {
                let prev = lower[..i].chars().next_back();
                if prev.is_some_and(|c| c.is_ascii_alphanumeric() || c == '-') {
                    continue;
                }
                let start = i + pat.len();
                let end = lower[start..]
                    .find(['"', ';', '}', '\n'])
                    .map_or(lower.len(), |e| start + e);
                let value = &lower[start..end];
                for token in value.split(|c: char| !c.is_ascii_alphabetic()) {
                    if NAMED_CSS.contains(&token) {
                        out.push(format!("{key}: {token}"));
                    }
                }
            }
        }
    }
    out
}

/// `rrggbb` as a colour; the palette writes no short or alpha forms, so those are foreign.
fn parse_hex(h: &str) -> Option<Colour> {
    let n = |s: &str| u8::from_str_radix(s, 16).ok();
    if h.len() != 6 {
        return None;
    }
    Some(Colour(n(&h[0..2])?, n(&h[2..4])?, n(&h[4..6])?))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::palette::{SERIES, SHADE};

    #[test]
    fn finds_foreign_colours_in_every_notation() {
        let doc = format!(
            "<svg><rect fill=\"{}\" stroke=\"#1F77B4\"/><path stroke=\"black\"/>\
             <text fill=\"{}\">row #123</text><a href=\"#add\">x</a><rect fill=\"#abc\"/></svg>\
             <style>p {{ color: #333; background: rgb(1, 2, 3); }} h1 {{ border: 1px solid Red; }}</style>",
            SERIES[0].hex().to_uppercase(),
            SHADE.hex()
        );
        let found = foreign_colours(&doc);
        assert_eq!(
            found,
            [
                "#1F77B4",
                "#abc",
                "#333",
                "rgb(1, 2, 3)",
                "stroke: black",
                "border: red"
            ],
            "{found:?}"
        );
    }

    #[test]
    fn palette_colours_and_css_variables_pass() {
        let doc = format!(
            "{}<style>a {{ color: var(--ink); }}</style><rect fill=\"none\"/>",
            crate::report::palette::css_custom_properties()
        );
        assert!(
            foreign_colours(&doc).is_empty(),
            "{:?}",
            foreign_colours(&doc)
        );
    }
}
