//! Fixed-decimal number text without the general formatter: the same characters as
//! `format!("{x:.digits$}")`, about ten times cheaper for the values output files hold.
//!
//! `{:.2}` rounds the exact binary value to two decimals. Here the value is scaled by
//! 10^digits in floating point and rounded to an integer; the scaling is off by at most
//! half a unit in the last place (under 2^-10 for the values taken here), so the integer
//! is the exact value's rounding unless the scaled value lies that close to a half. Those
//! rare near-ties, large values, many digits and non-finite values go to the formatter.

use std::io::Write as _;

const POW10: [f64; 10] = [1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];
/// Scaled values below this are exact to under 2^-10 (ulp ≤ 2^-9).
const FAST_LIMIT: f64 = (1u64 << 43) as f64;
/// How far from a half the scaled value must be for its rounding to be certain.
const TIE_MARGIN: f64 = 1.0 / 256.0;

/// Appends `x` written with `digits` decimals, exactly as `write!(out, "{x:.digits$}")`.
///
/// ```
/// let mut s = Vec::new();
/// ebullio::table_io::decimal::push_fixed(&mut s, 583.955, 2);
/// assert_eq!(s, format!("{:.2}", 583.955).as_bytes());
/// ```
pub fn push_fixed(out: &mut Vec<u8>, x: f64, digits: usize) {
    if let Some(scaled) = POW10.get(digits).map(|p| x.abs() * p) {
        if scaled < FAST_LIMIT {
            // scaled is not negative: truncation is the floor
            let whole = scaled as u64;
            let frac = scaled - whole as f64;
            if (frac - 0.5).abs() > TIE_MARGIN {
                let n = whole + u64::from(frac > 0.5);
                push_scaled(out, x.is_sign_negative(), n, digits);
                return;
            }
        }
    }
    let _ = write!(out, "{x:.digits$}");
}

/// `n / 10^digits` as text with `digits` decimals, a leading `-` when `negative`.
fn push_scaled(out: &mut Vec<u8>, negative: bool, n: u64, digits: usize) {
    // at most 20 digits of n, a point and leading zeros up to digits + 1 figures
    let mut buf = [b'0'; 32];
    let mut i = buf.len();
    // the decimals (zeros where n has fewer figures), then the whole part (one figure at
    // least); in 32-bit steps where n fits, two figures at a time
    let mut whole = n;
    if digits > 0 {
        // constant divisors for the usual decimals (a multiplication, not a division)
        let frac;
        (whole, frac) = match digits {
            1 => (n / 10, n % 10),
            2 => (n / 100, n % 100),
            3 => (n / 1_000, n % 1_000),
            4 => (n / 10_000, n % 10_000),
            _ => {
                let p = POW10_INT[digits.min(9)];
                (n / p, n % p)
            }
        };
        let mut left = digits;
        let mut f = frac as u32; // below 10^9
        while left >= 2 {
            i -= 2;
            let d = (f % 100) as usize * 2;
            buf[i..i + 2].copy_from_slice(&PAIRS[d..d + 2]);
            f /= 100;
            left -= 2;
        }
        if left == 1 {
            i -= 1;
            buf[i] = b'0' + (f % 10) as u8;
        }
        i -= 1;
        buf[i] = b'.';
    }
    while whole >= 100 {
        i -= 2;
        let d = (whole % 100) as usize * 2;
        buf[i..i + 2].copy_from_slice(&PAIRS[d..d + 2]);
        whole /= 100;
    }
    if whole >= 10 {
        i -= 2;
        let d = whole as usize * 2;
        buf[i..i + 2].copy_from_slice(&PAIRS[d..d + 2]);
    } else {
        i -= 1;
        buf[i] = b'0' + whole as u8;
    }
    if negative {
        i -= 1;
        buf[i] = b'-';
    }
    out.extend_from_slice(&buf[i..]);
}

const POW10_INT: [u64; 10] = [
    1,
    10,
    100,
    1_000,
    10_000,
    100_000,
    1_000_000,
    10_000_000,
    100_000_000,
    1_000_000_000,
];

/// "00" to "99" end to end.
const PAIRS: [u8; 200] = {
    let mut p = [0u8; 200];
    let mut k = 0;
    while k < 100 {
        p[2 * k] = b'0' + (k / 10) as u8;
        p[2 * k + 1] = b'0' + (k % 10) as u8;
        k += 1;
    }
    p
};

#[cfg(test)]
mod tests {
    use super::push_fixed;

    fn same(x: f64, d: usize) {
        let mut s = Vec::new();
        push_fixed(&mut s, x, d);
        assert_eq!(
            String::from_utf8(s).unwrap(),
            format!("{x:.d$}"),
            "{x:e} with {d} decimals"
        );
    }

    #[test]
    fn same_text_as_the_formatter_on_edges() {
        for d in 0..12 {
            for x in [
                0.0,
                -0.0,
                0.004,
                -0.004,
                0.005,
                0.015,
                0.125,
                0.375,
                2.5,
                -2.5,
                1.005,
                583.955,
                -231.365,
                9.995,
                99.995,
                0.045,
                1e-9,
                -1e-9,
                123456.78901,
                1e12,
                1e15,
                1e300,
                -1e300,
                5e-324,
                f64::MAX,
                f64::MIN_POSITIVE,
                4503599627370495.5,
            ] {
                same(x, d);
            }
        }
    }

    #[test]
    fn same_text_as_the_formatter_on_seeded_values() {
        // a seeded xorshift: values on every scale the output holds, and exact ties
        let mut state = 0x9E37_79B9_7F4A_7C15u64;
        let mut next = || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            state
        };
        for _ in 0..200_000 {
            let r = next();
            let mantissa = (r >> 11) as f64 / (1u64 << 53) as f64;
            let exp = (next() % 16) as i32 - 6;
            let sign = if r & 1 == 0 { 1.0 } else { -1.0 };
            let d = (next() % 6) as usize;
            same(sign * mantissa * 10f64.powi(exp), d);
            // decimal-looking values (as computed sums give) and their halves
            let k = (next() % 2_000_000) as f64;
            same(sign * k / 1000.0, d);
            same(sign * (k + 0.5) / 10f64.powi(d as i32), d);
        }
    }
}
