//! IAPWS-IF97 region 4: the saturation line of water, ps(T) (Eq. 30) and Ts(p) (Eq. 31).
//!
//! Reference: IAPWS R7-97(2012), *Revised Release on the IAPWS Industrial
//! Formulation 1997 for the Thermodynamic Properties of Water and Steam*,
//! section 8, Eqs. 28–31 and Table 34 (coefficients as bundled in
//! `reference-data/IAPWS-IF97-saturation.md`).

use crate::vapor::Curve;

/// IF97 Table 34, n1..n10.
const N: [f64; 10] = [
    1167.0521452767,
    -724213.16703206,
    -17.073846940092,
    12020.824702470,
    -3232555.0322333,
    14.915108613530,
    -4823.2657361591,
    405113.40542057,
    -0.23855557567849,
    650.17534844798,
];

/// Lower end of validity, K (IF97 section 8.1).
pub const T_MIN_K: f64 = crate::units::CELSIUS_OFFSET;
/// Critical temperature, upper end of validity, K.
pub const T_MAX_K: f64 = 647.096;
/// Critical pressure, Pa.
pub const P_MAX_PA: f64 = 22.064e6;

/// The IF97 saturation line of water as a [`Curve`], valid 273.15–647.096 K.
///
/// ```
/// use ebullio::reference::water::If97Saturation;
/// use ebullio::vapor::Curve;
/// // IF97 Table 35: ps(300 K) = 0.353 658 941e-2 MPa.
/// let p = If97Saturation.p_pa(300.0);
/// assert!((p / 3536.58941 - 1.0).abs() < 1e-9);
/// ```
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct If97Saturation;

/// Saturation pressure (Pa) at `t_k` by IF97 Eq. 30; NaN outside 273.15–647.096 K.
pub fn ps_pa(t_k: f64) -> f64 {
    if !(T_MIN_K..=T_MAX_K).contains(&t_k) {
        return f64::NAN;
    }
    let th = t_k + N[8] / (t_k - N[9]);
    let a = th * th + N[0] * th + N[1];
    let b = N[2] * th * th + N[3] * th + N[4];
    let c = N[5] * th * th + N[6] * th + N[7];
    let r = 2.0 * c / (-b + (b * b - 4.0 * a * c).sqrt());
    r.powi(4) * 1e6
}

/// Saturation temperature (K) at `p_pa` by IF97 Eq. 31; None outside
/// 611.213 Pa – 22.064 MPa.
pub fn ts_k(p_pa: f64) -> Option<f64> {
    if !(611.212..=P_MAX_PA).contains(&p_pa) {
        return None;
    }
    let beta = (p_pa / 1e6).powf(0.25);
    let e = beta * beta + N[2] * beta + N[5];
    let f = N[0] * beta * beta + N[3] * beta + N[6];
    let g = N[1] * beta * beta + N[4] * beta + N[7];
    let d = 2.0 * g / (-f - (f * f - 4.0 * e * g).sqrt());
    let t = 0.5 * (N[9] + d - ((N[9] + d).powi(2) - 4.0 * (N[8] + N[9] * d)).sqrt());
    t.is_finite().then_some(t)
}

impl Curve for If97Saturation {
    fn ln_p(&self, t_k: f64) -> f64 {
        ps_pa(t_k).ln()
    }
    fn valid_range_k(&self) -> Option<(f64, f64)> {
        Some((T_MIN_K, T_MAX_K))
    }
    fn t_at(&self, p_pa: f64) -> Option<f64> {
        ts_k(p_pa)
    }
    /// 273.16 K (exact by definition of the kelvin before 2019) and 611.657 Pa,
    /// IAPWS R7-97(2012) Sect. 8.1 (triple-point pressure from the IF97 line).
    fn triple_point(&self) -> Option<(f64, f64)> {
        Some((273.16, 611.657))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // IAPWS R7-97(2012) Table 35 (verification values for Eq. 30), all 9 published digits.
    #[test]
    fn iapws_if97_table35_saturation_pressure() {
        for (t, p_mpa) in [
            (300.0, 0.353_658_941e-2),
            (500.0, 0.263_889_776e1),
            (600.0, 0.123_443_146e2),
        ] {
            let got = ps_pa(t) / 1e6;
            // 9 significant digits: rounded to them, the strings are equal.
            assert_eq!(format!("{got:.8e}"), format!("{p_mpa:.8e}"), "T={t}");
        }
    }

    // IAPWS R7-97(2012) Table 36 (verification values for Eq. 31), all 9 published digits.
    #[test]
    fn iapws_if97_table36_saturation_temperature() {
        for (p_mpa, t) in [
            (0.1, 0.372_755_919e3),
            (1.0, 0.453_035_632e3),
            (10.0, 0.584_149_488e3),
        ] {
            let got = ts_k(p_mpa * 1e6).unwrap();
            assert_eq!(format!("{got:.8e}"), format!("{t:.8e}"), "p={p_mpa}");
        }
    }

    #[test]
    fn eq30_and_eq31_are_inverses_and_range_is_enforced() {
        for i in 0..=100 {
            let t = T_MIN_K + (T_MAX_K - 1.0 - T_MIN_K) * i as f64 / 100.0;
            let back = ts_k(ps_pa(t)).unwrap();
            assert!((back - t).abs() < 1e-8, "{t} -> {back}");
        }
        assert!(ps_pa(250.0).is_nan());
        assert!(ts_k(30e6).is_none());
        assert_eq!(
            If97Saturation.valid_range_k(),
            Some((crate::units::CELSIUS_OFFSET, 647.096))
        );
    }
}
