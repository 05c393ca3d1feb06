//! Checks that the palette survives colour-vision deficiency and stands out from the paper.
//!
//! Simulation: Machado, G. M., Oliveira, M. M. & Fernandes, L. A. F. (2009), "A
//! physiologically-based model for simulation of color vision deficiency", IEEE
//! Transactions on Visualization and Computer Graphics 15(6), 1291–1298; the
//! authors' precomputed matrices for protanopia, deuteranopia and tritanopia at
//! severity 1.0, applied to linear sRGB. Colour difference: CIEDE2000 as written
//! out by Sharma, Wu & Dalal (2005), "The CIEDE2000 color-difference formula:
//! implementation notes, supplementary test data, and mathematical observations",
//! Color Research & Application 30(1), 21–30. sRGB decoding and the sRGB→XYZ
//! matrix: IEC 61966-2-1; CIELAB and the D65 white: CIE 15:2004.

use super::{Colour, INK, PAPER, SERIES};

type M3 = [[f64; 3]; 3];

/// Machado et al. (2009), severity 1.0.
const PROTANOPIA: M3 = [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
];
const DEUTERANOPIA: M3 = [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.011820, 0.042940, 0.968881],
];
const TRITANOPIA: M3 = [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.303900],
];
const IDENTITY: M3 = [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]];

const VISIONS: [(&str, M3); 4] = [
    ("normal", IDENTITY),
    ("protanopia", PROTANOPIA),
    ("deuteranopia", DEUTERANOPIA),
    ("tritanopia", TRITANOPIA),
];

/// Least CIEDE2000 the palette promises between any two series colours, or a
/// series colour and the ink, under each vision. About 10 is commonly taken as
/// "clearly different at a glance" for thin lines (common practice); 15 leaves room.
const MIN_DE00: f64 = 15.0;

fn linear(c: u8) -> f64 {
    let c = c as f64 / 255.0;
    if c <= 0.04045 {
        c / 12.92
    } else {
        ((c + 0.055) / 1.055).powf(2.4)
    }
}

/// CIELAB (D65) of `c` as seen through `m` (linear sRGB, clipped to the gamut).
fn lab(c: Colour, m: &M3) -> [f64; 3] {
    let rgb = [linear(c.0), linear(c.1), linear(c.2)];
    let s: Vec<f64> = m
        .iter()
        .map(|row| (row[0] * rgb[0] + row[1] * rgb[1] + row[2] * rgb[2]).clamp(0.0, 1.0))
        .collect();
    let x = 0.4124564 * s[0] + 0.3575761 * s[1] + 0.1804375 * s[2];
    let y = 0.2126729 * s[0] + 0.7151522 * s[1] + 0.0721750 * s[2];
    let z = 0.0193339 * s[0] + 0.1191920 * s[1] + 0.9503041 * s[2];
    let f = |t: f64| {
        if t > 216.0 / 24389.0 {
            t.cbrt()
        } else {
            (24389.0 / 27.0 * t + 16.0) / 116.0
        }
    };
    let (fx, fy, fz) = (f(x / 0.95047), f(y), f(z / 1.08883));
    [116.0 * fy - 16.0, 500.0 * (fx - fy), 200.0 * (fy - fz)]
}

/// CIEDE2000 colour difference (kL = kC = kH = 1).
fn de2000(p: [f64; 3], q: [f64; 3]) -> f64 {
    let ([l1, a1, b1], [l2, a2, b2]) = (p, q);
    let c7 = |c: f64| c.powi(7) / (c.powi(7) + 25f64.powi(7));
    let cbar = (a1.hypot(b1) + a2.hypot(b2)) / 2.0;
    let g = 0.5 * (1.0 - c7(cbar).sqrt());
    let (a1p, a2p) = ((1.0 + g) * a1, (1.0 + g) * a2);
    let (c1p, c2p) = (a1p.hypot(b1), a2p.hypot(b2));
    let hue = |b: f64, a: f64| {
        if a == 0.0 && b == 0.0 {
            0.0
        } else {
            b.atan2(a).to_degrees().rem_euclid(360.0)
        }
    };
    let (h1p, h2p) = (hue(b1, a1p), hue(b2, a2p));
    let dl = l2 - l1;
    let dc = c2p - c1p;
    let dh = if c1p * c2p == 0.0 {
        0.0
    } else if (h2p - h1p).abs() <= 180.0 {
        h2p - h1p
    } else if h2p - h1p > 180.0 {
        h2p - h1p - 360.0
    } else {
        h2p - h1p + 360.0
    };
    let d_big_h = 2.0 * (c1p * c2p).sqrt() * (dh / 2.0).to_radians().sin();
    let lbar = (l1 + l2) / 2.0;
    let cbarp = (c1p + c2p) / 2.0;
    let hbar = if c1p * c2p == 0.0 {
        h1p + h2p
    } else if (h1p - h2p).abs() <= 180.0 {
        (h1p + h2p) / 2.0
    } else if h1p + h2p < 360.0 {
        (h1p + h2p + 360.0) / 2.0
    } else {
        (h1p + h2p - 360.0) / 2.0
    };
    let cos = |deg: f64| deg.to_radians().cos();
    let t = 1.0 - 0.17 * cos(hbar - 30.0) + 0.24 * cos(2.0 * hbar) + 0.32 * cos(3.0 * hbar + 6.0)
        - 0.20 * cos(4.0 * hbar - 63.0);
    let dtheta = 30.0 * (-((hbar - 275.0) / 25.0).powi(2)).exp();
    let rc = 2.0 * c7(cbarp).sqrt();
    let sl = 1.0 + 0.015 * (lbar - 50.0).powi(2) / (20.0 + (lbar - 50.0).powi(2)).sqrt();
    let sc = 1.0 + 0.045 * cbarp;
    let sh = 1.0 + 0.015 * cbarp * t;
    let rt = -(2.0 * dtheta).to_radians().sin() * rc;
    ((dl / sl).powi(2)
        + (dc / sc).powi(2)
        + (d_big_h / sh).powi(2)
        + rt * (dc / sc) * (d_big_h / sh))
        .sqrt()
}

/// WCAG 2.1 relative luminance and contrast ratio.
fn contrast(a: Colour, b: Colour) -> f64 {
    let y = |c: Colour| 0.2126 * linear(c.0) + 0.7152 * linear(c.1) + 0.0722 * linear(c.2);
    let (hi, lo) = (y(a).max(y(b)), y(a).min(y(b)));
    (hi + 0.05) / (lo + 0.05)
}

/// The smallest pairwise CIEDE2000 in `set` under `m`, with the pair.
fn min_pair(set: &[Colour], m: &M3) -> (f64, Colour, Colour) {
    let mut best = (f64::INFINITY, set[0], set[0]);
    for (i, &a) in set.iter().enumerate() {
        for &b in &set[i + 1..] {
            let d = de2000(lab(a, m), lab(b, m));
            if d < best.0 {
                best = (d, a, b);
            }
        }
    }
    best
}

#[test]
fn ciede2000_reproduces_sharma_wu_dalal_2005_table_1() {
    // Pairs and published ΔE00 from Sharma, Wu & Dalal (2005), Table 1,
    // including the hue-wrap and blue-rotation cases.
    let pairs = [
        ([50.0, 2.6772, -79.7751], [50.0, 0.0, -82.7485], 2.0425),
        ([50.0, 3.1571, -77.2803], [50.0, 0.0, -82.7485], 2.8615),
        ([50.0, 2.8361, -74.0200], [50.0, 0.0, -82.7485], 3.4412),
        ([50.0, 0.0, 0.0], [50.0, -1.0, 2.0], 2.3669),
        ([50.0, 2.49, -0.001], [50.0, -2.49, 0.0009], 7.1792),
        ([50.0, 2.5, 0.0], [73.0, 25.0, -18.0], 27.1492),
        (
            [60.2574, -34.0099, 36.2677],
            [60.4626, -34.1751, 39.4387],
            1.2644,
        ),
    ];
    for (p, q, want) in pairs {
        let got = de2000(p, q);
        assert!((got - want).abs() < 5e-5, "{p:?} {q:?}: {got} vs {want}");
        assert!((de2000(q, p) - want).abs() < 5e-5, "not symmetric");
    }
}

#[test]
fn lab_of_white_and_black_are_the_ends_of_the_lightness_scale() {
    // CIE 15:2004: the reference white is L* = 100, a* = b* = 0; black is 0.
    let w = lab(PAPER, &IDENTITY);
    assert!(
        (w[0] - 100.0).abs() < 0.01 && w[1].abs() < 0.01 && w[2].abs() < 0.01,
        "{w:?}"
    );
    assert!(lab(Colour(0, 0, 0), &IDENTITY)[0].abs() < 1e-9);
    // The Machado matrices keep greys grey (each row sums to 1).
    for (name, m) in VISIONS {
        let g = lab(Colour(128, 128, 128), &m);
        assert!(g[1].abs() < 0.05 && g[2].abs() < 0.05, "{name}: {g:?}");
    }
}

#[test]
fn series_colours_and_ink_stay_apart_under_each_colour_vision_deficiency() {
    let mut set = SERIES.to_vec();
    set.push(INK);
    for (name, m) in VISIONS {
        let (d, a, b) = min_pair(&set, &m);
        println!(
            "{name}: least CIEDE2000 {d:.1} ({} vs {})",
            a.hex(),
            b.hex()
        );
        assert!(
            d >= MIN_DE00,
            "{name}: {} and {} differ by only ΔE00 {d:.1} (< {MIN_DE00})",
            a.hex(),
            b.hex()
        );
    }
}

#[test]
fn the_check_catches_a_red_green_pair() {
    // A brick red and a leaf green, far apart for normal vision, nearly one
    // colour for deuteranopes: the check above must reject such a pair.
    let pair = [Colour(0xc8, 0x3c, 0x28), Colour(0x50, 0x8c, 0x28)];
    assert!(min_pair(&pair, &IDENTITY).0 > 50.0);
    assert!(min_pair(&pair, &DEUTERANOPIA).0 < MIN_DE00);
}

#[test]
fn series_lines_stand_out_from_the_paper() {
    // WCAG 2.1 success criterion 1.4.11 (non-text contrast): at least 3:1
    // against adjacent colours. Text ink is held to 4.5:1 (criterion 1.4.3).
    for c in SERIES {
        let k = contrast(c, PAPER);
        assert!(k >= 3.0, "{}: contrast {k:.2}", c.hex());
    }
    assert!(contrast(INK, PAPER) >= 4.5);
    assert!(contrast(super::INK_SOFT, PAPER) >= 4.5);
}
