//! Area consistency tests on ln(γ1/γ2) from measured x, y, T, p: Herington (isobaric) and
//! Redlich–Kister (isothermal).
//!
//! The Gibbs–Duhem equation at constant T (and p) requires ∫₀¹ ln(γ1/γ2) dx1 = 0:
//! the area above the axis equals the area below. ln(γ1/γ2) of each point is
//! ln(y1 x2 p2°/(y2 x1 p1°)); a polynomial of degree ≤ 3 in x1 (the
//! Redlich–Kister form) carries it to both ends, and D = 100 |A⁺ − A⁻|/(A⁺ + A⁻).
//! Isothermal data pass when D < 10 (common practice). At constant pressure
//! the heat of mixing term is not zero, so Herington allows
//! J = 150 |ΔT_max|/T_min (the boiling range of the system over its lowest
//! boiling temperature, K) and the data pass when D − J < 10.
//!
//! Reference: O. Redlich, A. T. Kister, Ind. Eng. Chem. 40 (1948) 345–348;
//! E. F. G. Herington, J. Inst. Petrol. 37 (1951) 457–470.

use super::data::BinaryData;
use super::report::ConsistencyTest;
use crate::fit::linear::solve_weighted;
use crate::vapor::Curve;
use nalgebra::DMatrix;

/// (x1, ln(γ1/γ2)) of every point with a measured y1 strictly inside 0–1.
pub fn ln_gamma_ratio(data: &BinaryData, curves: [&dyn Curve; 2]) -> Vec<(f64, f64)> {
    data.points
        .iter()
        .filter_map(|p| {
            let y = p.y1?;
            let ok = p.x1 > 0.0 && p.x1 < 1.0 && y > 0.0 && y < 1.0;
            let r = (y * (1.0 - p.x1)).ln() - ((1.0 - y) * p.x1).ln() + curves[1].ln_p(p.t_k)
                - curves[0].ln_p(p.t_k);
            (ok && r.is_finite()).then_some((p.x1, r))
        })
        .collect()
}

/// Coefficients of the least-squares polynomial in x1 (degree ≤ 3, at most m − 2).
pub fn ratio_polynomial(pts: &[(f64, f64)]) -> Option<Vec<f64>> {
    let m = pts.len();
    if m < 3 {
        return None;
    }
    let deg = (m - 2).min(3);
    let design = DMatrix::from_fn(m, deg + 1, |i, k| pts[i].0.powi(k as i32));
    let rhs: Vec<f64> = pts.iter().map(|p| p.1).collect();
    solve_weighted(&design, &rhs, &vec![1.0; m])
}

/// Value of the polynomial at x.
pub fn poly(c: &[f64], x: f64) -> f64 {
    c.iter().rev().fold(0.0, |acc, &a| acc * x + a)
}

/// (A⁺, A⁻) of the polynomial over 0 ≤ x1 ≤ 1 (midpoint rule, 2000 steps).
fn areas(c: &[f64]) -> (f64, f64) {
    const N: usize = 2000;
    let (mut up, mut dn) = (0.0, 0.0);
    for j in 0..N {
        let v = poly(c, (j as f64 + 0.5) / N as f64) / N as f64;
        if v > 0.0 {
            up += v;
        } else {
            dn -= v;
        }
    }
    (up, dn)
}

/// D = 100 |A⁺ − A⁻|/(A⁺ + A⁻), or `None` with fewer than 3 usable points.
pub fn area_deviation(data: &BinaryData, curves: [&dyn Curve; 2]) -> Option<f64> {
    let c = ratio_polynomial(&ln_gamma_ratio(data, curves))?;
    let (up, dn) = areas(&c);
    (up + dn > 0.0).then(|| 100.0 * (up - dn).abs() / (up + dn))
}

/// Herington's test for isobaric data; `t_pure` are the pure boiling points at the pressure.
pub fn herington(
    data: &BinaryData,
    curves: [&dyn Curve; 2],
    t_pure: [Option<f64>; 2],
) -> Option<ConsistencyTest> {
    let d = area_deviation(data, curves)?;
    let (mut lo, mut hi) = data.t_range();
    for t in t_pure.into_iter().flatten() {
        lo = lo.min(t);
        hi = hi.max(t);
    }
    let j = 150.0 * (hi - lo) / lo;
    Some(ConsistencyTest {
        test: "herington-area".into(),
        passed: d - j < 10.0,
        statistic: d - j,
        criterion: "D - J < 10".into(),
        meaning: format!(
            "the areas above and below ln(γ1/γ2) against x1 differ by D = {d:.1} % of their sum, and the boiling range allows J = {j:.1}; a larger D - J means the data break the Gibbs-Duhem equation (typically a bias in y or T)."
        ),
        needs_y: true,
    })
}

/// The Redlich–Kister area test for isothermal data.
pub fn redlich_kister(data: &BinaryData, curves: [&dyn Curve; 2]) -> Option<ConsistencyTest> {
    let d = area_deviation(data, curves)?;
    Some(ConsistencyTest {
        test: "redlich-kister-area".into(),
        passed: d < 10.0,
        statistic: d,
        criterion: "D < 10".into(),
        meaning: format!(
            "the areas above and below ln(γ1/γ2) against x1 differ by D = {d:.1} % of their sum; at constant temperature they must be equal (Gibbs-Duhem), so a large D points to a bias in y or p."
        ),
        needs_y: true,
    })
}
