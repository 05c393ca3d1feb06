//! Unit-slip diagnosis: which usual slip makes the constants and the listed Tb agree.
//!
//! When the Antoine-implied normal boiling point disagrees with the listed
//! one, the usual causes are few: constants in kPa labelled mmHg (or any other
//! pressure unit), constants for t in K labelled °C (C off by 273.15), natural
//! logarithm constants labelled log10, A and B swapped, a boiling point in
//! °C written into a kelvin column, or one digit mistyped. Each alternative is
//! tried; a cause is named only when the evidence singles it out:
//!
//! 1. the mismatch is far beyond noise: at least [`SLIP_CLAIM_MULTIPLE`] times
//!    the tolerance (a row 1.5 K off is noise or a poor source, not a slip);
//! 2. the slip explains it far better than no slip: once undone, the rows agree
//!    within the tolerance, so the mismatch shrinks at least that many times;
//! 3. it is the only candidate that does: with hundreds of digit edits one
//!    nearly always lands near a small mismatch, so when two different slips
//!    both fit, neither is named. Two pressure units that both fit (bar and
//!    atm are 1.3 % apart) are named together.
//!
//! Otherwise the row only says how far apart the two boiling points are.

use super::finding::CheckCode;
use super::number_text::OneDecimal as D1;
use crate::units::{PressureUnit, TemperatureUnit, ATM_PA, CELSIUS_OFFSET};
use crate::vapor::slope::{svap_j_mol_k, trouton_plausible};
use crate::vapor::{AntoineConstants, AntoineConvention, Curve, LogBase};

/// Pressure units tried as slips (the ones tables actually mix up).
pub const SLIP_PRESSURE_UNITS: [PressureUnit; 6] = [
    PressureUnit::KPa,
    PressureUnit::MmHg,
    PressureUnit::Bar,
    PressureUnit::Pa,
    PressureUnit::Atm,
    PressureUnit::Psi,
];

/// A slip is named only when the implied and listed boiling points differ by
/// at least this many tolerances (5 × 1 K by default). Clean rows with 1 K of
/// noise in Tb then get a false cause in well under 1 % of rows (measured by
/// the seeded generator test in `screen::false_cause`; 27.8 % before the rule).
pub const SLIP_CLAIM_MULTIPLE: f64 = 5.0;

/// A slip that explains the disagreement.
#[derive(Debug, Clone, PartialEq)]
pub struct Slip {
    /// Which slip (one of the `slip-*` codes).
    pub code: CheckCode,
    /// The boiling point the row gives once the slip is undone, K.
    pub corrected_tb_k: f64,
    /// The value it is compared with, K (listed Tb, or implied Tb for a Tb slip).
    pub matches_k: f64,
    /// One sentence naming the slip.
    pub message: String,
}

fn implied(k: &AntoineConstants) -> Option<f64> {
    k.t_at(ATM_PA)
}

/// One atmosphere as the log-pressure of each convention tried (log base ×
/// [`SLIP_PRESSURE_UNITS`]; the temperature unit does not enter), computed
/// once: what [`implied`] computes for constants in that convention.
fn slip_log_p() -> &'static [[f64; 6]; 2] {
    static LOG_P: std::sync::OnceLock<[[f64; 6]; 2]> = std::sync::OnceLock::new();
    LOG_P.get_or_init(|| {
        [LogBase::Ten, LogBase::E].map(|log_base| {
            SLIP_PRESSURE_UNITS.map(|p_unit| {
                let conv = AntoineConvention {
                    log_base,
                    p_unit,
                    t_unit: TemperatureUnit::Kelvin,
                };
                AntoineConstants::new(1.0, 1.0, 0.0, conv).log_p_in_convention(ATM_PA)
            })
        })
    })
}

fn t_unit_word(u: TemperatureUnit) -> &'static str {
    match u {
        TemperatureUnit::Kelvin => "K",
        TemperatureUnit::Celsius => "°C",
        TemperatureUnit::Fahrenheit => "°F",
        TemperatureUnit::Rankine => "°R",
    }
}

/// Try the usual slips on constants `k` and the listed boiling point
/// `listed_tb_k` (written in `tb_unit`). Returns the simplest slip whose
/// correction brings the two within `tol_k`, or `None`.
///
/// Some slips are arithmetically the same: 110.6 written in a kelvin column
/// matches °C constants read as if for kelvin. Such ties are broken by
/// physics: a candidate whose corrected curve gives an entropy of
/// vaporization outside the Trouton band at its boiling point counts as one
/// more change (Trouton's rule; the band is common practice).
///
/// ```
/// use ebullio::screen::slip::diagnose;
/// use ebullio::screen::CheckCode;
/// use ebullio::units::TemperatureUnit;
/// use ebullio::vapor::AntoineConstants;
/// // Toluene ln(p/kPa) constants (Smith, Van Ness & Abbott, App. B Table B.2)
/// // labelled as ln(p/mmHg): the listed 383.8 K only fits with kPa.
/// let k = AntoineConstants::new(13.9320, 3056.96, 217.625, "ln,mmHg,degC".parse().unwrap());
/// let slip = diagnose(&k, 383.8, TemperatureUnit::Kelvin, 1.0).unwrap();
/// assert_eq!(slip.code, CheckCode::SlipPressureUnit);
/// assert!(slip.message.contains("kPa, not mmHg"));
/// ```
pub fn diagnose(
    k: &AntoineConstants,
    listed_tb_k: f64,
    tb_unit: TemperatureUnit,
    tol_k: f64,
) -> Option<Slip> {
    let declared = k.convention;
    if let Some(t) = implied(k) {
        let d = (t - listed_tb_k).abs();
        if d.is_nan() || d < SLIP_CLAIM_MULTIPLE * tol_k {
            return None;
        }
    }
    let mut best: Vec<Cand> = Vec::new();

    // 1. Another convention (pressure unit, log base, K vs °C), alone or combined.
    let t_units: &[TemperatureUnit] = match declared.t_unit {
        TemperatureUnit::Kelvin | TemperatureUnit::Celsius => {
            &[TemperatureUnit::Kelvin, TemperatureUnit::Celsius]
        }
        TemperatureUnit::Fahrenheit => &[TemperatureUnit::Fahrenheit],
        TemperatureUnit::Rankine => &[TemperatureUnit::Rankine],
    };
    let log_p = slip_log_p();
    for (b, log_base) in [LogBase::Ten, LogBase::E].into_iter().enumerate() {
        for (u, &p_unit) in SLIP_PRESSURE_UNITS.iter().enumerate() {
            for &t_unit in t_units {
                let conv = AntoineConvention {
                    log_base,
                    p_unit,
                    t_unit,
                };
                if conv == declared {
                    continue;
                }
                let alt = AntoineConstants {
                    convention: conv,
                    ..*k
                };
                let Some(t) = alt.t_at_log_p(log_p[b][u]) else {
                    continue;
                };
                let r = (t - listed_tb_k).abs();
                if r.is_nan() || r > tol_k {
                    continue;
                }
                let dp = u8::from(p_unit != declared.p_unit);
                let db = u8::from(log_base != declared.log_base);
                let dt = u8::from(t_unit != declared.t_unit);
                let changes = dp + db + dt;
                let code = match (dp, db, dt) {
                    (1, 0, 0) => CheckCode::SlipPressureUnit,
                    (0, 1, 0) => CheckCode::SlipLogBase,
                    (0, 0, 1) => CheckCode::SlipConstantsTemperatureUnit,
                    _ => CheckCode::SlipConvention,
                };
                offer(
                    &mut best,
                    (changes, 0),
                    (t - listed_tb_k).abs(),
                    &alt,
                    Cand::new(code, t, listed_tb_k, Msg::Label { conv, c: k.c }),
                    tol_k,
                );
                if let Some(c) = best.last_mut() {
                    if c.code == CheckCode::SlipPressureUnit && c.unit.is_none() {
                        c.unit = Some(p_unit);
                    }
                }
            }
        }
    }

    // 2. A and B swapped.
    let swapped = AntoineConstants {
        a: k.b,
        b: k.a,
        ..*k
    };
    if let Some(t) = implied(&swapped) {
        offer(
            &mut best,
            (1, 0),
            (t - listed_tb_k).abs(),
            &swapped,
            Cand::new(CheckCode::SlipSwappedAB, t, listed_tb_k, Msg::Swapped),
            tol_k,
        );
    }

    // 3. The listed Tb written in the wrong temperature unit.
    if let Some(t_impl) = implied(k) {
        let number = tb_unit.from_kelvin(listed_tb_k);
        let alternatives: &[(TemperatureUnit, f64)] = match tb_unit {
            TemperatureUnit::Kelvin => &[(TemperatureUnit::Celsius, number + CELSIUS_OFFSET)],
            TemperatureUnit::Celsius => &[(TemperatureUnit::Kelvin, number)],
            _ => &[],
        };
        for &(was, as_k) in alternatives {
            offer(
                &mut best,
                (1, 0),
                (as_k - t_impl).abs(),
                k,
                Cand::new(
                    CheckCode::SlipTbTemperatureUnit,
                    as_k,
                    t_impl,
                    Msg::TbUnit { was, number },
                ),
                tol_k,
            );
        }
    }
    // 4. One digit dropped, doubled or the decimal point misplaced, in A, B,
    // C or the listed Tb. Many variants exist, so these rank after any
    // plausible one-change label slip, and are only tried when none exists.
    if best.iter().map(|c| c.rank.0).min().is_none_or(|m| m > 1) {
        digit_slips(k, listed_tb_k, tb_unit, tol_k, &mut best, true);
    }
    choose(best, k, tb_unit)
}

/// What a candidate's message says: the message is written only for the
/// slip chosen, not for every candidate tried.
#[derive(Debug, Clone, Copy)]
enum Msg {
    /// Another convention `conv` (C as given).
    Label { conv: AntoineConvention, c: f64 },
    /// A and B swapped.
    Swapped,
    /// The listed Tb (`number` in its column's unit) written in unit `was`.
    TbUnit { was: TemperatureUnit, number: f64 },
    /// A, B or C typed `typed`, meant `v`.
    Digit {
        which: &'static str,
        kind: DigitSlip,
        v: f64,
        typed: f64,
    },
    /// The listed Tb typed `number`, meant `v` (in its column's unit).
    TbDigit {
        kind: DigitSlip,
        v: f64,
        number: f64,
    },
}

/// A candidate that explains the row within the tolerance: (changes, family),
/// residual, the slip's code and values, the pressure unit for a
/// pressure-unit slip, what was changed (the code for a label slip, A, B, C
/// or Tb for a typing slip) and its message. Family 0 is a label slip (unit,
/// base, swap), 1–4 a typing slip ([`DigitSlip`]).
#[derive(Debug, Clone, Copy)]
struct Cand {
    rank: (u8, u8),
    residual: f64,
    code: CheckCode,
    corrected_tb_k: f64,
    matches_k: f64,
    unit: Option<PressureUnit>,
    what: &'static str,
    msg: Msg,
}

impl Cand {
    fn new(code: CheckCode, corrected_tb_k: f64, matches_k: f64, msg: Msg) -> Self {
        Cand {
            rank: (0, 0),
            residual: 0.0,
            code,
            corrected_tb_k,
            matches_k,
            unit: None,
            what: code.as_str(),
            msg,
        }
    }

    /// The slip with its sentence (`k` and `tb_unit` as given to [`diagnose`]).
    fn into_slip(self, k: &AntoineConstants, tb_unit: TemperatureUnit) -> Slip {
        let declared = k.convention;
        let (t, listed_tb_k) = (D1(self.corrected_tb_k), D1(self.matches_k));
        let message = match self.msg {
            Msg::Label { conv, c } => {
                let tail =
                    format!("the implied Tb is {t} K, matching the listed {listed_tb_k} K");
                match self.code {
                    CheckCode::SlipPressureUnit => format!(
                        "The constants look like {}, not {}: with {} {tail}.",
                        conv.p_unit.symbol(),
                        declared.p_unit.symbol(),
                        conv.p_unit.symbol()
                    ),
                    CheckCode::SlipLogBase => format!(
                        "The constants look like {}, not {}: with {} {tail}.",
                        conv.log_base.symbol(),
                        declared.log_base.symbol(),
                        conv.log_base.symbol()
                    ),
                    CheckCode::SlipConstantsTemperatureUnit => format!(
                        "The constants look like they are for t in {}, not {} (C = {}): read that way {tail}.",
                        t_unit_word(conv.t_unit),
                        t_unit_word(declared.t_unit),
                        c
                    ),
                    _ => format!(
                        "The constants look like {conv}, not {declared}: with {conv} {tail}."
                    ),
                }
            }
            Msg::Swapped => format!(
                "A and B look swapped: with A = {} and B = {} the implied Tb is {t} K, matching the listed {listed_tb_k} K.",
                k.b, k.a
            ),
            Msg::TbUnit { was, number } => {
                let (as_k, t_impl) = (t, listed_tb_k);
                format!(
                    "The listed boiling point looks like {} written as {}: {number} {} is {as_k} K, matching the implied {t_impl} K.",
                    t_unit_word(was),
                    t_unit_word(tb_unit),
                    t_unit_word(was)
                )
            }
            Msg::Digit {
                which,
                kind,
                v,
                typed,
            } => format!(
                "{which} looks mistyped ({}): with {which} = {} instead of {} the implied Tb is {t} K, matching the listed {listed_tb_k} K.",
                kind.words(),
                written_signed(v),
                written_signed(typed)
            ),
            Msg::TbDigit { kind, v, number } => {
                let u = t_unit_word(tb_unit);
                let t_impl = listed_tb_k;
                format!(
                    "The listed boiling point looks mistyped ({}): {} {u} instead of {} {u} matches the implied {t_impl} K.",
                    kind.words(),
                    written_signed(v),
                    written_signed(number)
                )
            }
        };
        Slip {
            code: self.code,
            corrected_tb_k: self.corrected_tb_k,
            matches_k: self.matches_k,
            message,
        }
    }
}

/// The one slip the evidence singles out, if any. The fewest changes win;
/// when candidates with as few changes touch different things (B in one, the
/// listed Tb in another, or two kinds of label slip), the row is ambiguous
/// and none is named. Within one thing, the likeliest typing wins (a moved
/// decimal point before a dropped digit: [`DigitSlip`]); several pressure
/// units that all fit are named together.
fn choose(cands: Vec<Cand>, k: &AntoineConstants, tb_unit: TemperatureUnit) -> Option<Slip> {
    let declared = &k.convention;
    let fewest = cands.iter().map(|c| c.rank.0).min()?;
    let mut tied: Vec<Cand> = cands.into_iter().filter(|c| c.rank.0 == fewest).collect();
    if tied.iter().any(|c| c.what != tied[0].what) {
        return None;
    }
    tied.sort_by(|a, b| {
        a.rank
            .1
            .cmp(&b.rank.1)
            .then(a.residual.total_cmp(&b.residual))
    });
    if tied.len() > 1 && tied.iter().all(|c| c.unit.is_some()) {
        let units: Vec<&str> = tied
            .iter()
            .filter_map(|c| c.unit)
            .map(|u| u.symbol())
            .collect();
        let first = &tied[0];
        let listed = first.matches_k;
        let tbs: Vec<String> = tied
            .iter()
            .filter_map(|c| {
                c.unit
                    .map(|u| format!("{:.1} K with {}", c.corrected_tb_k, u.symbol()))
            })
            .collect();
        return Some(Slip {
            code: CheckCode::SlipPressureUnit,
            corrected_tb_k: first.corrected_tb_k,
            matches_k: listed,
            message: format!(
                "The constants look like {}, not {}: the implied Tb is {}, each within tolerance of the listed {listed:.1} K, so the data cannot tell these units apart.",
                join_or(&units),
                declared.p_unit.symbol(),
                tbs.join(", ")
            ),
        });
    }
    tied.into_iter().next().map(|c| c.into_slip(k, tb_unit))
}

fn join_or(words: &[&str]) -> String {
    match words {
        [] => String::new(),
        [a] => (*a).to_string(),
        [rest @ .., last] => format!("{} or {last}", rest.join(", ")),
    }
}

/// Keep `cand` if it explains the row (residual within `tol_k`), ranked by
/// `(changes, family)`. A corrected curve outside the Trouton band counts as
/// one more change.
fn offer(
    best: &mut Vec<Cand>,
    (changes, family): (u8, u8),
    residual: f64,
    curve: &AntoineConstants,
    mut cand: Cand,
    tol_k: f64,
) {
    if !(residual.is_finite() && residual <= tol_k) {
        return;
    }
    let plausible = trouton_plausible(svap_j_mol_k(curve, cand.corrected_tb_k));
    cand.rank = (changes + u8::from(!plausible), family);
    cand.residual = residual;
    best.push(cand);
}

/// How a number was mistyped, read from the typed value to the intended one.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DigitSlip {
    /// The decimal point is in the wrong place, or missing.
    DecimalPoint,
    /// A digit was left out (the intended value has one more).
    Dropped,
    /// A digit too many was typed (the intended value has one fewer).
    Extra,
    /// Two adjacent digits typed in the wrong order (1642.89 typed 1462.89).
    Transposed,
}

impl DigitSlip {
    /// Rank among typing slips: a moved decimal point has few variants, so it
    /// is the least likely to fit by chance and is preferred.
    fn family(self) -> u8 {
        match self {
            DigitSlip::DecimalPoint => 1,
            DigitSlip::Transposed => 2,
            DigitSlip::Extra => 3,
            DigitSlip::Dropped => 4,
        }
    }

    fn words(self) -> &'static str {
        match self {
            DigitSlip::DecimalPoint => "a misplaced decimal point",
            DigitSlip::Dropped => "a dropped digit",
            DigitSlip::Extra => "a digit too many",
            DigitSlip::Transposed => "two adjacent digits swapped",
        }
    }
}

/// The number as it was most likely written: the shortest round-trip form,
/// rounded to 9 significant figures when arithmetic (a unit conversion) has
/// left noise in the last places.
fn written(x: f64) -> String {
    let s = format!("{}", x.abs());
    if s.len() <= 10 || s.contains('e') {
        return s;
    }
    let digits = 9i32 - (x.abs().log10().floor() as i32 + 1);
    let r = format!("{:.*}", digits.clamp(0, 15) as usize, x.abs());
    if r.contains('.') {
        r.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        r
    }
}

/// Longest number, in digits, taken as typed by hand: more than a double holds (17) is a
/// computed value, not a table entry, so it has no typing slips. Without this bound a value
/// like 1e300, written out in 301 digits, costs thousands of long parses (found by the
/// `screen_rows` fuzz target).
const MAX_TYPED_DIGITS: usize = 17;

/// Powers of ten a double holds exactly.
const EXACT_POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// The number written with the ASCII digits `d` and a decimal point before
/// digit `point` (none when `point == d.len()`), as `str::parse` reads it.
/// Up to 2^53 in the digits and 22 decimal places it is one correctly
/// rounded division of two exact doubles, which is what the parse gives
/// (Clinger's fast path); otherwise the text is parsed.
fn digits_value(d: &[u8], point: usize, buf: &mut String) -> Option<f64> {
    let places = d.len() - point;
    if d.len() <= 19 && places < EXACT_POW10.len() {
        let m = d.iter().fold(0u64, |m, &c| m * 10 + u64::from(c - b'0'));
        if m <= 1 << 53 {
            return Some(m as f64 / EXACT_POW10[places]);
        }
    }
    buf.clear();
    for (i, &c) in d.iter().enumerate() {
        if i == point {
            buf.push('.');
        }
        buf.push(c as char);
    }
    buf.parse::<f64>().ok()
}

/// Every value one typing slip away from `x` as written, in the order
/// generated (a value may come more than once), each told to `f`. None for a
/// number longer than [`MAX_TYPED_DIGITS`]. The ten digits that may be
/// inserted at one place give values in order (0 lowest in magnitude, 9
/// highest): when `may_fit(value with 0, value with 9)` says no value between
/// the two can be wanted, those ten are skipped.
fn each_digit_variant(
    x: f64,
    may_fit: impl Fn(f64, f64) -> bool,
    mut f: impl FnMut(f64, DigitSlip),
) {
    let s = written(x);
    if !x.is_finite() || s.contains('e') {
        return;
    }
    let sign = if x < 0.0 { -1.0 } else { 1.0 };
    let digits: Vec<u8> = s.bytes().filter(u8::is_ascii_digit).collect();
    if digits.len() > MAX_TYPED_DIGITS {
        return;
    }
    let point = s.find('.').unwrap_or(s.len());
    let mut buf = String::with_capacity(digits.len() + 2);
    let mut push = |d: &[u8], point: usize, kind: DigitSlip| {
        if let Some(v) = digits_value(d, point, &mut buf) {
            let v = sign * v;
            if v != x {
                f(v, kind);
            }
        }
    };
    for p in 1..=digits.len() {
        if p != point {
            push(&digits, p, DigitSlip::DecimalPoint);
        }
    }
    let mut d = digits.clone();
    for i in 0..digits.len().saturating_sub(1) {
        if d[i] != d[i + 1] && !(i == 0 && d[1] == b'0') {
            d.swap(i, i + 1);
            push(&d, point, DigitSlip::Transposed);
            d.swap(i, i + 1);
        }
    }
    for i in 0..digits.len() {
        let c = d.remove(i);
        let p = if i < point { point - 1 } else { point };
        if !d.is_empty() && p >= 1 {
            push(&d, p, DigitSlip::Extra);
        }
        d.insert(i, c);
    }
    let mut end = String::new();
    for i in 0..=digits.len() {
        let p = if i <= point { point + 1 } else { point };
        let mut at = |c: u8| {
            d.insert(i, c);
            let v = digits_value(&d, p, &mut end);
            d.remove(i);
            v.map(|v| sign * v)
        };
        if let (Some(lo), Some(hi)) = (at(b'0'), at(b'9')) {
            if !may_fit(lo, hi) {
                continue;
            }
        }
        for c in b'0'..=b'9' {
            d.insert(i, c);
            if !(i == 0 && c == b'0') {
                push(&d, p, DigitSlip::Dropped);
            }
            d.remove(i);
        }
    }
}

/// Keep the first of each value (in the order found).
fn first_of_each<T>(v: &mut Vec<T>, value: impl Fn(&T) -> f64) {
    // a sort, not a search per variant: about a hundred variants per number
    let mut order: Vec<usize> = (0..v.len()).collect();
    order.sort_by(|&a, &b| value(&v[a]).total_cmp(&value(&v[b])).then(a.cmp(&b)));
    let mut keep = vec![false; v.len()];
    for (k, &i) in order.iter().enumerate() {
        keep[i] = k == 0 || value(&v[order[k - 1]]) != value(&v[i]);
    }
    let mut k = 0;
    v.retain(|_| {
        k += 1;
        keep[k - 1]
    });
}

/// Every value one typing slip away from `x` as written: the decimal point
/// moved (or dropped), two adjacent digits swapped, one digit removed, one
/// digit inserted. Sign kept;
/// `x` itself excluded. None for a number longer than 17 digits (`MAX_TYPED_DIGITS`).
pub fn digit_variants(x: f64) -> Vec<(f64, DigitSlip)> {
    let mut out: Vec<(f64, DigitSlip)> = Vec::new();
    each_digit_variant(x, |_, _| true, |v, kind| out.push((v, kind)));
    // each value once, with the first slip that gives it, in the order found
    first_of_each(&mut out, |x| x.0);
    out
}

/// The typing slips of `x` whose value `fits` (giving the corrected
/// boiling point): [`digit_variants`] filtered, without keeping the others
/// (whether a value fits depends on the value alone, so filtering before
/// keeping the first of each value gives the same list).
fn fitting_variants(
    x: f64,
    may_fit: impl Fn(f64, f64) -> bool,
    fits: impl Fn(f64) -> Option<f64>,
) -> Vec<(f64, DigitSlip, f64)> {
    let mut out = Vec::new();
    each_digit_variant(x, may_fit, |v, kind| {
        if let Some(t) = fits(v) {
            out.push((v, kind, t));
        }
    });
    first_of_each(&mut out, |x| x.0);
    out
}

/// The typing-slip candidates of a row; `prune` skips the values that
/// cannot fit (the same candidates, found with less work).
fn digit_slips(
    k: &AntoineConstants,
    listed_tb_k: f64,
    tb_unit: TemperatureUnit,
    tol_k: f64,
    best: &mut Vec<Cand>,
    prune: bool,
) {
    // the convention is kept, so every variant's implied Tb solves for one log-pressure
    let y = k.log_p_in_convention(ATM_PA);
    for which in ["A", "B", "C"] {
        let typed = match which {
            "A" => k.a,
            "B" => k.b,
            _ => k.c,
        };
        let with = |v: f64| {
            let mut alt = *k;
            match which {
                "A" => alt.a = v,
                "B" => alt.b = v,
                _ => alt.c = v,
            }
            alt
        };
        let fits = |v: f64| {
            let t = with(v).t_at_log_p(y)?;
            ((t - listed_tb_k).abs() <= tol_k).then_some(t)
        };
        // The implied Tb is monotone in A (where A exceeds y), B (where
        // positive) and C, in floating point too: when both ends of a range
        // of values give a Tb off by more than the tolerance on the same
        // side, nothing between them fits.
        let may_fit = |lo: f64, hi: f64| match (with(lo).t_at_log_p(y), with(hi).t_at_log_p(y)) {
            (Some(a), Some(b)) if prune => {
                !same_side_beyond(a - listed_tb_k, b - listed_tb_k, tol_k)
            }
            _ => true,
        };
        for (v, kind, t) in fitting_variants(typed, may_fit, fits) {
            let n0 = best.len();
            offer(
                best,
                (1, kind.family()),
                (t - listed_tb_k).abs(),
                &with(v),
                Cand::new(
                    CheckCode::SlipDigit,
                    t,
                    listed_tb_k,
                    Msg::Digit {
                        which,
                        kind,
                        v,
                        typed,
                    },
                ),
                tol_k,
            );
            mark(best, n0, which);
        }
    }
    let Some(t_impl) = implied(k) else { return };
    let number = tb_unit.from_kelvin(listed_tb_k);
    let fits = |v: f64| {
        let as_k = tb_unit.to_kelvin(v);
        if as_k.is_nan() || as_k <= 0.0 {
            return None;
        }
        let r = (as_k - t_impl).abs();
        (r.is_finite() && r <= tol_k).then_some(as_k)
    };
    let may_fit = |lo: f64, hi: f64| {
        let (a, b) = (tb_unit.to_kelvin(lo), tb_unit.to_kelvin(hi));
        !(prune && same_side_beyond(a - t_impl, b - t_impl, tol_k))
    };
    for (v, kind, as_k) in fitting_variants(number, may_fit, fits) {
        let n0 = best.len();
        offer(
            best,
            (1, kind.family()),
            (as_k - t_impl).abs(),
            k,
            Cand::new(
                CheckCode::SlipDigit,
                as_k,
                t_impl,
                Msg::TbDigit { kind, v, number },
            ),
            tol_k,
        );
        mark(best, n0, "Tb");
    }
}

/// Whether two differences both exceed `tol` on the same side (false with a NaN).
fn same_side_beyond(a: f64, b: f64, tol: f64) -> bool {
    (a > tol && b > tol) || (a < -tol && b < -tol)
}

/// Record what a typing-slip candidate changed, if `offer` kept it.
fn mark(best: &mut [Cand], n0: usize, what: &'static str) {
    if best.len() > n0 {
        if let Some(c) = best.last_mut() {
            c.what = what;
        }
    }
}

fn written_signed(x: f64) -> String {
    if x < 0.0 {
        format!("-{}", written(x))
    } else {
        written(x)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Toluene, Smith, Van Ness & Abbott App. B Table B.2: ln(p/kPa) = 13.9320 −
    // 3056.96/(t/°C + 217.625); tn = 110.6 °C = 383.75 K (C from memory, see
    // reference-data/SOURCES.md).
    const TOLUENE: (f64, f64, f64) = (13.9320, 3056.96, 217.625);
    const TOLUENE_TB_K: f64 = 383.75;

    fn toluene(conv: &str) -> AntoineConstants {
        AntoineConstants::new(TOLUENE.0, TOLUENE.1, TOLUENE.2, conv.parse().unwrap())
    }

    #[test]
    fn svna_toluene_kpa_labelled_mmhg_is_a_pressure_slip() {
        let s = diagnose(
            &toluene("ln,mmHg,degC"),
            TOLUENE_TB_K,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, CheckCode::SlipPressureUnit);
        assert!(s.message.contains("kPa, not mmHg"), "{}", s.message);
        assert!((s.corrected_tb_k - TOLUENE_TB_K).abs() < 1.0);
    }

    #[test]
    fn svna_toluene_ln_labelled_log10_is_a_log_base_slip() {
        let s = diagnose(
            &toluene("log10,kPa,degC"),
            TOLUENE_TB_K,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, CheckCode::SlipLogBase);
        assert!(s.message.contains("ln, not log10"), "{}", s.message);
    }

    #[test]
    fn svna_toluene_two_changes_is_a_convention_slip() {
        let s = diagnose(
            &toluene("log10,mmHg,degC"),
            TOLUENE_TB_K,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, CheckCode::SlipConvention);
        assert!(s.message.contains("ln,kPa,degC"), "{}", s.message);
    }

    #[test]
    fn svna_toluene_swapped_and_celsius_tb() {
        let k = AntoineConstants::new(
            TOLUENE.1,
            TOLUENE.0,
            TOLUENE.2,
            "ln,kPa,degC".parse().unwrap(),
        );
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, CheckCode::SlipSwappedAB);
        // 110.6 written into a K column
        let s = diagnose(&toluene("ln,kPa,degC"), 110.6, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, CheckCode::SlipTbTemperatureUnit);
        assert!(s.message.contains("°C written as K"), "{}", s.message);
    }

    // Toluene in the ln(mmHg)/K form, Himmelblau App. H (after Reid, Prausnitz
    // & Sherwood): 16.0137, 3096.52, −53.67; labelled °C, C is off by 273.15.
    #[test]
    fn rps_toluene_kelvin_constants_labelled_celsius() {
        let k = AntoineConstants::new(16.0137, 3096.52, -53.67, "ln,mmHg,degC".parse().unwrap());
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(
            s.code,
            CheckCode::SlipConstantsTemperatureUnit,
            "{}",
            s.message
        );
    }

    #[test]
    fn svna_toluene_digit_slips_in_b_and_tb_are_named() {
        // B = 3056.96 typed with its decimal point one place left.
        let k = AntoineConstants::new(
            TOLUENE.0,
            305.696,
            TOLUENE.2,
            "ln,kPa,degC".parse().unwrap(),
        );
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, CheckCode::SlipDigit);
        assert!(
            s.message.contains("B = 3056.96 instead of 305.696"),
            "{}",
            s.message
        );
        // B with its 5 dropped: 306.96.
        let k = AntoineConstants::new(TOLUENE.0, 306.96, TOLUENE.2, "ln,kPa,degC".parse().unwrap());
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, CheckCode::SlipDigit);
        assert!(s.message.contains("dropped digit"), "{}", s.message);
        // Tb 383.75 typed without its decimal point.
        let s = diagnose(
            &toluene("ln,kPa,degC"),
            38375.0,
            TemperatureUnit::Kelvin,
            1.0,
        )
        .unwrap();
        assert_eq!(s.code, CheckCode::SlipDigit);
        assert!(
            s.message.contains("383.75 K instead of 38375 K"),
            "{}",
            s.message
        );
        // A row no single slip explains stays unexplained: B halved.
        let k = AntoineConstants::new(
            TOLUENE.0,
            1528.48,
            TOLUENE.2,
            "ln,kPa,degC".parse().unwrap(),
        );
        assert!(diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).is_none());
    }

    #[test]
    fn svna_transposed_digits_in_b_are_named() {
        // B = 3056.96 typed 3506.96: two adjacent digits in the wrong order.
        let k = AntoineConstants::new(
            TOLUENE.0,
            3506.96,
            TOLUENE.2,
            "ln,kPa,degC".parse().unwrap(),
        );
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, CheckCode::SlipDigit);
        assert!(
            s.message.contains("two adjacent digits swapped")
                && s.message.contains("B = 3056.96 instead of 3506.96"),
            "{}",
            s.message
        );
        let v: Vec<f64> = digit_variants(1462.89).into_iter().map(|x| x.0).collect();
        assert!(v.contains(&1642.89) && v.contains(&4162.89) && v.contains(&1462.98));
    }

    #[test]
    fn a_small_mismatch_is_never_given_a_cause() {
        // 1.5 K and 4.9 K off: within SLIP_CLAIM_MULTIPLE tolerances, so noise
        // or a poor source, even if some digit edit happens to fit.
        let k = toluene("ln,kPa,degC");
        let t = k.t_at(ATM_PA).unwrap();
        for off in [1.5, -1.5, 4.9] {
            assert!(diagnose(&k, t + off, TemperatureUnit::Kelvin, 1.0).is_none());
        }
    }

    #[test]
    fn svna_bar_constants_labelled_mmhg_name_both_bar_and_atm() {
        // Toluene ln(p/kPa) rewritten for p in bar (A − ln 100): 1 atm and
        // 1 bar differ by 1.3 %, 0.5 K in Tb, so both fit the listed 383.75 K.
        let k = AntoineConstants::new(
            TOLUENE.0 - 100f64.ln(),
            TOLUENE.1,
            TOLUENE.2,
            "ln,mmHg,degC".parse().unwrap(),
        );
        let s = diagnose(&k, TOLUENE_TB_K, TemperatureUnit::Kelvin, 1.0).unwrap();
        assert_eq!(s.code, CheckCode::SlipPressureUnit);
        assert!(
            s.message.contains("bar or atm, not mmHg") && s.message.contains("cannot tell"),
            "{}",
            s.message
        );
    }

    // Skipping the values that cannot fit finds the same candidates as
    // trying every one: seeded rows near their typing slips, every unit.
    #[test]
    fn pruned_digit_search_finds_the_same_candidates() {
        let mut s: u64 = 0x1234_5678_9ABC_DEF1;
        let mut next = || {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            (s >> 11) as f64 / (1u64 << 53) as f64
        };
        let convs = [
            "ln,kPa,degC",
            "log10,mmHg,degC",
            "log10,bar,K",
            "ln,Pa,degF",
        ];
        let mut found = 0;
        for i in 0..3000 {
            let conv = convs[i % convs.len()].parse().unwrap();
            let round = |x: f64, d: i32| (x * 10f64.powi(d)).round() / 10f64.powi(d);
            let k = AntoineConstants::new(
                round(5.0 + 12.0 * next(), 4),
                round(800.0 + 4000.0 * next(), 2),
                round(-60.0 + 300.0 * next(), 3),
                conv,
            );
            let Some(t) = implied(&k) else { continue };
            // the listed Tb as typed, sometimes with a digit slip of its own
            let tb_unit = if i % 3 == 0 {
                TemperatureUnit::Celsius
            } else {
                TemperatureUnit::Kelvin
            };
            let mut typed = round(tb_unit.from_kelvin(t), 2);
            if i % 2 == 0 {
                typed = digit_variants(typed)[(next() * 20.0) as usize].0;
            }
            let listed = tb_unit.to_kelvin(typed) + (next() - 0.5) * 3.0;
            for tol in [0.5, 1.0, 3.0] {
                let (mut a, mut b) = (vec![], vec![]);
                digit_slips(&k, listed, tb_unit, tol, &mut a, true);
                digit_slips(&k, listed, tb_unit, tol, &mut b, false);
                assert_eq!(format!("{a:?}"), format!("{b:?}"), "{k:?} {listed} {tol}");
                found += a.len();
            }
        }
        assert!(found > 1000, "{found}");
    }

    // The arithmetic path gives exactly what parsing the written digits gives.
    #[test]
    fn digits_value_is_the_parse_of_the_digits() {
        let mut s: u64 = 0x2545_F491_4F6C_DD1D;
        let mut buf = String::new();
        for _ in 0..100_000 {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            let len = 1 + (s % 19) as usize;
            let d: Vec<u8> = (0..len)
                .map(|i| b'0' + ((s >> (i * 3 % 60)) % 10) as u8)
                .collect();
            let point = 1 + ((s >> 40) as usize % len);
            let mut text = String::new();
            for (i, &c) in d.iter().enumerate() {
                if i == point {
                    text.push('.');
                }
                text.push(c as char);
            }
            let want: f64 = text.parse().unwrap();
            assert_eq!(digits_value(&d, point, &mut buf), Some(want), "{text}");
        }
    }

    #[test]
    fn digit_variants_cover_point_dropped_and_extra_digits() {
        let v: Vec<f64> = digit_variants(134.48).into_iter().map(|x| x.0).collect();
        for want in [1344.8, 13448.0, 13.448, 14.48, 1344.48, 1134.48] {
            assert!(v.contains(&want), "{want} missing");
        }
        assert!(!v.contains(&134.48));
        // 1e300 is written out in 301 digits: not a hand-typed number, so no slips
        // (and no thousands of 300-digit parses).
        assert_eq!(written(1e300).len(), 301);
        assert!(digit_variants(1e300).is_empty());
        assert!(!digit_variants(12345678901234567.0).is_empty());
        let c: Vec<f64> = digit_variants(-53.67).into_iter().map(|x| x.0).collect();
        assert!(c.contains(&-536.7) && c.contains(&-5.67));
        assert_eq!(written(110.60000000000002), "110.6");
    }
}
