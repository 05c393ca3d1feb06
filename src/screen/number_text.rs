//! Numbers in finding messages, written as `format!` writes them, faster.
//!
//! Nearly every flagged row's message holds a few numbers with one decimal
//! (`{:.1}`); the standard library's exact formatting of those was about a
//! tenth of `check`'s time on a large table. [`OneDecimal`] and [`Shortest`]
//! give the same text byte for byte: the common case by integer arithmetic,
//! any case that arithmetic cannot settle (a value near a rounding tie, a
//! very large or non-finite value) by the standard formatter itself.

use std::fmt;

/// `x` as `format!("{x:.1}")` writes it (and as `{x:+.1}` under the `+` flag).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OneDecimal(pub f64);

/// `x` as `format!("{x}")` writes it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Shortest(pub f64);

/// Largest magnitude taken by the integer path (ten times it is far below 2^53).
const FAST_LIMIT: f64 = 1e9;

/// |x| rounded to tenths (the exact binary value, as the standard formatter
/// rounds it), as an integer count of tenths; `None` for an exact tie (left
/// to the standard formatter's rule) and outside the integer path.
fn tenths(x: f64) -> Option<u64> {
    let a = x.abs();
    if a.is_nan() || a >= FAST_LIMIT {
        return None;
    }
    // y is 10·a rounded; the exact 10·a is within half an ulp of y, so only
    // a y exactly halfway between tenths leaves the side in doubt, and the
    // product's exact error (one fused multiply-add) settles it.
    let y = a * 10.0;
    // truncation is the floor here (y ≥ 0), and y − floor is exact
    let whole = y as u64;
    let frac = y - whole as f64;
    if frac == 0.5 {
        let err = a.mul_add(10.0, -y);
        if err == 0.0 {
            return None;
        }
        return Some(whole + u64::from(err > 0.0));
    }
    Some(whole + u64::from(frac > 0.5))
}

/// Decimal digits of `n` at the end of `buf`; returns where they start.
fn digits(mut n: u64, buf: &mut [u8; 24]) -> usize {
    let mut i = buf.len();
    loop {
        i -= 1;
        buf[i] = b'0' + (n % 10) as u8;
        n /= 10;
        if n == 0 {
            return i;
        }
    }
}

/// Appends the decimal digits of `n`.
pub fn push_uint(out: &mut String, n: u64) {
    let mut buf = [0u8; 24];
    let s = digits(n, &mut buf);
    for &c in &buf[s..] {
        out.push(char::from(c));
    }
}

/// "00" to "99", two bytes each.
const PAIRS: &[u8; 200] = b"\
0001020304050607080910111213141516171819\
2021222324252627282930313233343536373839\
4041424344454647484950515253545556575859\
6061626364656667686970717273747576777879\
8081828384858687888990919293949596979899";

/// Appends `x` as `{x:.1}` writes it (`{x:+.1}` when `plus`).
pub fn push_one_decimal(out: &mut String, x: f64, plus: bool) {
    let Some(t) = tenths(x) else {
        use fmt::Write as _;
        let _ = if plus {
            write!(out, "{x:+.1}")
        } else {
            write!(out, "{x:.1}")
        };
        return;
    };
    // written from the end: tenths, point, whole part, sign; then added at once
    let mut buf = [0u8; 24];
    let last = buf.len() - 1;
    buf[last] = b'0' + (t % 10) as u8;
    buf[last - 1] = b'.';
    let mut i = last - 1;
    // the whole part two digits at a time (most values have three or four)
    let mut n = t / 10;
    while n >= 100 {
        let r = 2 * (n % 100) as usize;
        n /= 100;
        i -= 2;
        buf[i..i + 2].copy_from_slice(&PAIRS[r..r + 2]);
    }
    if n >= 10 {
        let r = 2 * n as usize;
        i -= 2;
        buf[i..i + 2].copy_from_slice(&PAIRS[r..r + 2]);
    } else {
        i -= 1;
        buf[i] = b'0' + n as u8;
    }
    if x.is_sign_negative() {
        i -= 1;
        buf[i] = b'-';
    } else if plus {
        i -= 1;
        buf[i] = b'+';
    }
    // only ASCII digits, '.', '-' and '+' were written: each byte is its char
    out.extend(buf[i..].iter().map(|&c| char::from(c)));
}

/// A message built piece by piece into one string of the right size, without
/// the general formatter: text, numbers with one decimal, whole numbers.
#[derive(Debug, Default)]
pub struct Message(String);

thread_local! {
    /// Emptied message strings handed back by [`recycle`], for the next messages.
    static SPARE: std::cell::RefCell<Vec<String>> = const { std::cell::RefCell::new(Vec::new()) };
}

/// Hand back a message's string once its text has been copied elsewhere:
/// the next [`Message`] on this thread reuses it instead of allocating
/// (a large table's findings are copied into one text as they are made).
pub fn recycle(mut s: String) {
    if s.capacity() == 0 || s.capacity() > 4096 {
        return;
    }
    s.clear();
    SPARE.with(|p| {
        if let Ok(mut p) = p.try_borrow_mut() {
            if p.len() < 8 {
                p.push(s);
            }
        }
    });
}

impl Message {
    /// An empty message with room for `capacity` bytes.
    pub fn with_capacity(capacity: usize) -> Self {
        let spare = SPARE.with(|p| p.try_borrow_mut().ok().and_then(|mut p| p.pop()));
        let mut s = spare.unwrap_or_default();
        s.reserve(capacity);
        Message(s)
    }
    /// Text as it is.
    pub fn text(mut self, s: &str) -> Self {
        self.0.push_str(s);
        self
    }
    /// `x` as `{x:.1}`.
    pub fn d1(mut self, x: f64) -> Self {
        push_one_decimal(&mut self.0, x, false);
        self
    }
    /// `x` as `{x:+.1}`.
    pub fn d1_signed(mut self, x: f64) -> Self {
        push_one_decimal(&mut self.0, x, true);
        self
    }
    /// A whole number.
    pub fn int(mut self, n: usize) -> Self {
        push_uint(&mut self.0, n as u64);
        self
    }
    /// `x` as `{x}`.
    pub fn shortest(mut self, x: f64) -> Self {
        use fmt::Write as _;
        let _ = write!(self.0, "{}", Shortest(x));
        self
    }
    /// The message.
    pub fn done(self) -> String {
        self.0
    }
}

impl fmt::Display for OneDecimal {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let x = self.0;
        let Some(t) = tenths(x) else {
            return if f.sign_plus() {
                write!(f, "{x:+.1}")
            } else {
                write!(f, "{x:.1}")
            };
        };
        let mut buf = [0u8; 24];
        let last = buf.len() - 1;
        buf[last] = b'0' + (t % 10) as u8;
        buf[last - 1] = b'.';
        let mut tail = [0u8; 24];
        let s = digits(t / 10, &mut tail);
        let n_int = tail.len() - s;
        let start = last - 1 - n_int;
        buf[start..last - 1].copy_from_slice(&tail[s..]);
        let start = if x.is_sign_negative() {
            buf[start - 1] = b'-';
            start - 1
        } else if f.sign_plus() {
            buf[start - 1] = b'+';
            start - 1
        } else {
            start
        };
        // only ASCII digits, '.', '-' and '+' were written
        f.write_str(std::str::from_utf8(&buf[start..]).map_err(|_| fmt::Error)?)
    }
}

impl fmt::Display for Shortest {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let x = self.0;
        // a whole number (a tolerance of 1 K, three sigmas) is written as one
        if x.fract() == 0.0 && x.abs() < FAST_LIMIT && x != 0.0 && !f.sign_plus() {
            let mut buf = [0u8; 24];
            let mut s = digits(x.abs() as u64, &mut buf);
            if x < 0.0 {
                s -= 1;
                buf[s] = b'-';
            }
            return f.write_str(std::str::from_utf8(&buf[s..]).map_err(|_| fmt::Error)?);
        }
        fmt::Display::fmt(&x, f)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn same(x: f64) {
        assert_eq!(format!("{}", OneDecimal(x)), format!("{x:.1}"), "{x:e}");
        let m = Message::default().d1(x).text(" ").d1_signed(x).done();
        assert_eq!(m, format!("{x:.1} {x:+.1}"), "{x:e}");
        assert_eq!(format!("{:+}", OneDecimal(x)), format!("{x:+.1}"), "{x:e}");
        assert_eq!(format!("{}", Shortest(x)), format!("{x}"), "{x:e}");
    }

    // The standard formatter is the reference: every value, ties and edges
    // included, gives its text exactly.
    #[test]
    fn the_same_text_as_the_standard_formatter() {
        for x in [
            0.0,
            -0.0,
            0.04,
            -0.04,
            0.05,
            -0.05,
            0.25,
            0.35,
            0.45,
            9.95,
            99.95,
            1.0,
            3.0,
            -1.0,
            crate::units::CELSIUS_OFFSET,
            353.15,
            1e8,
            999_999_999.95,
            1e9,
            1e15,
            1e300,
            -1e300,
            5e-324,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
            0.1 + 0.2,
            2.5,
            -2.5,
        ] {
            same(x);
        }
        for n in [0, 7, 10, 12_345, u32::MAX as usize, usize::MAX] {
            assert_eq!(Message::default().int(n).done(), n.to_string());
        }
        // a seeded walk over magnitudes and digits (xorshift, no crate)
        let mut s: u64 = 0x9E37_79B9_7F4A_7C15;
        for _ in 0..200_000 {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            let mant = (s >> 11) as f64 / (1u64 << 53) as f64;
            let exp = ((s & 0xff) as i32 % 24) - 6;
            let sign = if s & 0x100 == 0 { 1.0 } else { -1.0 };
            same(sign * mant * 10f64.powi(exp));
            // values on the hundredths grid land near ties
            same(sign * ((s >> 20) % 100_000) as f64 / 100.0);
            same(sign * ((s >> 24) % 1000) as f64);
        }
    }
}
