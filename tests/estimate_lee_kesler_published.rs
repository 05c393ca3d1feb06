//! The Lee–Kesler curve at reduced temperature 0.6, far from its normal-boiling-point
//! anchor, against vapor pressures computed from published Antoine constants.
//!
//! Each compound's curve is built the way `estimate` builds it (through Tb at 1 atm,
//! with Tc and pc), but from measured Tb, Tc and pc, so the error seen here is the
//! Lee–Kesler correlation's own, not the group method's. Bounds are the errors measured
//! when this test was written plus a margin; they were not tuned by changing the method.
//!
//! Sources: Antoine constants (ln p/kPa = A − B/(t/°C + C)) and their ranges from
//! J. M. Smith, H. C. Van Ness, M. M. Abbott, Introduction to Chemical Engineering
//! Thermodynamics, App. B, Table B.2; critical constants from B. E. Poling,
//! J. M. Prausnitz, J. P. O'Connell, The Properties of Gases and Liquids, 5th ed.
//! (2001), App. A (from memory); water: IAPWS-IF97 (Tc 647.096 K, pc 22.064 MPa),
//! its saturation line as implemented and checked in `tests/iapws_if97.rs`.

use ebullio::estimate::lee_kesler::LeeKeslerCurve;
use ebullio::reference::water;
use ebullio::units::ATM_PA;
use ebullio::vapor::Curve;

struct Case {
    name: &'static str,
    abc: (f64, f64, f64),
    range_c: (f64, f64),
    tc_k: f64,
    pc_bar: f64,
}

fn antoine_pa(abc: (f64, f64, f64), t_k: f64) -> f64 {
    1000.0 * (abc.0 - abc.1 / (t_k - 273.15 + abc.2)).exp()
}

fn antoine_tb_k(abc: (f64, f64, f64)) -> f64 {
    abc.1 / (abc.0 - (ATM_PA / 1000.0).ln()) - abc.2 + 273.15
}

const CASES: &[Case] = &[
    Case {
        name: "benzene",
        abc: (13.7819, 2726.81, 217.572),
        range_c: (6.0, 104.0),
        tc_k: 562.05,
        pc_bar: 48.95,
    },
    Case {
        name: "cyclohexane",
        abc: (13.6568, 2723.44, 220.618),
        range_c: (9.0, 105.0),
        tc_k: 553.6,
        pc_bar: 40.73,
    },
    Case {
        name: "n-decane",
        abc: (13.9748, 3442.76, 193.858),
        range_c: (65.0, 203.0),
        tc_k: 617.7,
        pc_bar: 21.1,
    },
    Case {
        name: "carbon tetrachloride",
        abc: (14.0572, 2914.23, 232.148),
        range_c: (-14.0, 101.0),
        tc_k: 556.35,
        pc_bar: 45.6,
    },
    Case {
        name: "chloroform",
        abc: (13.7324, 2548.74, 218.552),
        range_c: (-23.0, 84.0),
        tc_k: 536.4,
        pc_bar: 54.72,
    },
    Case {
        name: "diethyl ether",
        abc: (14.0735, 2511.29, 231.2),
        range_c: (-43.0, 55.0),
        tc_k: 466.7,
        pc_bar: 36.4,
    },
    Case {
        name: "acetone",
        abc: (14.3145, 2756.22, 228.060),
        range_c: (-26.0, 77.0),
        tc_k: 508.1,
        pc_bar: 47.0,
    },
    Case {
        name: "ethanol",
        abc: (16.8958, 3795.17, 230.918),
        range_c: (3.0, 96.0),
        tc_k: 513.92,
        pc_bar: 61.48,
    },
];

/// Relative error in p at Tr = 0.6 and error of the boiling temperature at that
/// pressure, for one curve against one reference p(T).
fn errors(curve: &LeeKeslerCurve, t_k: f64, p_ref: f64) -> (f64, f64) {
    let p_lk = curve.p_pa(t_k);
    let t_lk = curve.t_at(p_ref).expect("Lee–Kesler reaches the pressure");
    (p_lk / p_ref - 1.0, t_lk - t_k)
}

#[test]
fn lee_kesler_at_reduced_temperature_0_6_against_smith_van_ness_abbott_antoine() {
    let mut worst_nonpolar: f64 = 0.0;
    for c in CASES {
        let t = 0.6 * c.tc_k;
        let t_c = t - 273.15;
        assert!(
            c.range_c.0 <= t_c && t_c <= c.range_c.1,
            "{}: Tr 0.6 inside the Antoine range",
            c.name
        );
        let tb = antoine_tb_k(c.abc);
        let curve = LeeKeslerCurve::from_tb(tb, c.tc_k, c.pc_bar * 1e5, None);
        let p_ref = antoine_pa(c.abc, t);
        let (ep, et) = errors(&curve, t, p_ref);
        println!(
            "{:<22} Tb {tb:.2} K  T {t:.1} K  p_ref {:.3} kPa  Lee–Kesler {:+.2} % in p, {:+.2} K in T",
            c.name,
            p_ref / 1000.0,
            100.0 * ep,
            et
        );
        // Measured when written (error in p / in T): benzene −0.01 % / +0.00 K,
        // cyclohexane −0.17 / +0.05, n-decane −3.18 / +0.79, CCl4 +0.10 / −0.03,
        // chloroform −0.67 / +0.19, diethyl ether −0.59 / +0.13, acetone −2.29 / +0.55,
        // ethanol −4.11 / +0.76. Bounds: 4 % and 1 K (6 % and 1.2 K for ethanol),
        // the measured worst plus a margin.
        let (bp, bt) = if c.name == "ethanol" {
            (0.06, 1.2)
        } else {
            (0.04, 1.0)
        };
        assert!(ep.abs() < bp, "{}: {:.2} % in p", c.name, 100.0 * ep);
        assert!(et.abs() < bt, "{}: {et:.2} K", c.name);
        if c.name != "ethanol" && c.name != "acetone" {
            worst_nonpolar = worst_nonpolar.max(ep.abs());
        }
    }
    println!(
        "worst nonpolar error in p at Tr 0.6: {:.2} %",
        100.0 * worst_nonpolar
    );
}

/// Water at Tr = 0.6 against IAPWS-IF97 (the published saturation equation):
/// the correlation's worst case among common liquids (strongly hydrogen-bonded).
#[test]
fn lee_kesler_water_at_reduced_temperature_0_6_against_iapws_if97() {
    let (tc, pc) = (647.096, 22.064e6);
    let tb = water::ts_k(ATM_PA).unwrap();
    let curve = LeeKeslerCurve::from_tb(tb, tc, pc, None);
    let t = 0.6 * tc;
    let (ep, et) = errors(&curve, t, water::ps_pa(t));
    println!(
        "water: Lee–Kesler {:+.2} % in p, {:+.2} K in T at {t:.1} K",
        100.0 * ep,
        et
    );
    // Measured when written: +1.67 % in p, −0.49 K in T; bound measured + margin.
    assert!(ep.abs() < 0.025 && et.abs() < 0.7, "{ep} {et}");
}
