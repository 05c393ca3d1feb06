//! A table cell's number read at once when it is a plain decimal, exactly as the standard
//! parse reads it (W. D. Clinger, "How to read floating point numbers accurately",
//! *Proc. ACM SIGPLAN '90 PLDI*, 92–101 (1990): the fast path for short decimals).

/// Powers of ten a double holds exactly.
const EXACT_POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// `v.parse::<f64>().ok()`, with the usual cell (`-12.345`: a sign, digits,
/// a point between digits) read at once: up to 2^53 in its digits and 22
/// decimals it is one correctly rounded division of two exact doubles, the
/// value the parse gives (Clinger's fast path). Anything else is parsed.
pub(crate) fn parse_number(v: &str) -> Option<f64> {
    let b = v.as_bytes();
    let (neg, digits) = match b.first() {
        Some(b'-') => (true, &b[1..]),
        Some(b'+') => (false, &b[1..]),
        _ => (false, b),
    };
    let mut m: u64 = 0;
    let mut n = 0;
    let mut point = None;
    for (i, &c) in digits.iter().enumerate() {
        match c {
            b'0'..=b'9' if n < 19 => {
                m = m * 10 + u64::from(c - b'0');
                n += 1;
            }
            b'.' if point.is_none() && i > 0 && i + 1 < digits.len() => point = Some(i),
            _ => return v.parse().ok(),
        }
    }
    let places = point.map_or(0, |p| digits.len() - p - 1);
    if n == 0 || m > 1 << 53 || places >= EXACT_POW10.len() {
        return v.parse().ok();
    }
    let x = m as f64 / EXACT_POW10[places];
    Some(if neg { -x } else { x })
}

#[cfg(test)]
mod tests {
    use super::*;

    // The fast path reads every number as the standard parse does.
    #[test]
    fn parse_number_is_the_standard_parse() {
        for v in [
            "504.08",
            "-0.0",
            "+3",
            "0",
            "1e5",
            "inf",
            "NaN",
            ".5",
            "5.",
            "1.2.3",
            "--1",
            "",
            "-",
            "12345678901234567890",
            "9007199254740993",
            "0.1234567890123456789012",
            "1_0",
            "٣",
            "4655.9782",
            "-237.2737",
        ] {
            let want = v.parse::<f64>().ok();
            let got = parse_number(v);
            assert_eq!(
                got.map(f64::to_bits),
                want.map(f64::to_bits),
                "{v}: {got:?} vs {want:?}"
            );
        }
        let mut s: u64 = 0x0123_4567_89AB_CDEF;
        for _ in 0..100_000 {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            let digits = 1 + (s % 17) as u32;
            let m = (s >> 8) % 10u64.pow(digits);
            let places = ((s >> 4) % 12) as usize;
            let text = if places == 0 {
                format!("{m}")
            } else {
                let t = format!("{m:0w$}", w = places + 1);
                format!("{}.{}", &t[..t.len() - places], &t[t.len() - places..])
            };
            let text = if s & 1 == 1 { format!("-{text}") } else { text };
            assert_eq!(
                parse_number(&text).map(f64::to_bits),
                text.parse::<f64>().ok().map(f64::to_bits),
                "{text}"
            );
        }
    }
}
