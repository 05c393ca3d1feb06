//! Boiling temperature at given pressures, vapor pressure at given temperatures, with intervals.
//!
//! For any [`Curve`]: T(p) by the curve's inverse, and a 95 % interval
//! T ± k·u(T) from the curve's own standard uncertainty (`t_uncertainty_k`),
//! k = 1.96 unless the source gives its own factor (a fit's Student t).
//! In the other direction u(ln p) = u(T)·d ln p/dT. A result outside the
//! source's validity range is marked `extrapolated`.

use crate::vapor::Curve;

mod request;
pub use request::{excluded_note, BoilReport, BoilRequest};

/// One result row (SI).
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct BoilResult {
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Temperature, K.
    pub t_k: f64,
    /// Lower end of the 95 % interval of T, K (None when the source carries no uncertainty).
    pub ci95_low_k: Option<f64>,
    /// Upper end of the 95 % interval of T, K.
    pub ci95_high_k: Option<f64>,
    /// Lower end of the 95 % interval of p, Pa (vapor-pressure mode).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ci95_low_pa: Option<f64>,
    /// Upper end of the 95 % interval of p, Pa (vapor-pressure mode).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ci95_high_pa: Option<f64>,
    /// True outside the source's validity range.
    pub extrapolated: bool,
    /// Why no value could be given, empty otherwise.
    #[serde(skip_serializing_if = "String::is_empty")]
    pub error: String,
}

fn outside(curve: &dyn Curve, t: f64) -> bool {
    curve
        .valid_range_k()
        .is_some_and(|(lo, hi)| t < lo - 1e-9 || t > hi + 1e-9)
}

/// Boiling temperature at each pressure (Pa); `k95` the coverage factor.
///
/// ```
/// use ebullio::boiling::boiling_points;
/// use ebullio::vapor::AntoineConstants;
/// // Benzene, Smith, Van Ness & Abbott App. B Table B.2.
/// let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap())
///     .with_range_k(279.15, 377.15);
/// let r = boiling_points(&bz, &[101_325.0, 1_000.0], 1.96);
/// assert!((r[0].t_k - 353.2).abs() < 0.2 && !r[0].extrapolated);
/// assert!(r[1].extrapolated); // 10 mbar lies below 6 degC
/// ```
pub fn boiling_points(curve: &dyn Curve, pressures_pa: &[f64], k95: f64) -> Vec<BoilResult> {
    pressures_pa
        .iter()
        .map(|&p| match curve.t_at(p) {
            Some(t) => {
                let u = curve.t_uncertainty_k(p).filter(|u| u.is_finite());
                BoilResult {
                    p_pa: p,
                    t_k: t,
                    ci95_low_k: u.map(|u| t - k95 * u),
                    ci95_high_k: u.map(|u| t + k95 * u),
                    ci95_low_pa: None,
                    ci95_high_pa: None,
                    extrapolated: outside(curve, t),
                    error: String::new(),
                }
            }
            None => BoilResult {
                p_pa: p,
                t_k: f64::NAN,
                ci95_low_k: None,
                ci95_high_k: None,
                ci95_low_pa: None,
                ci95_high_pa: None,
                extrapolated: true,
                error: match curve.triple_point() {
                    Some((tt, pt)) if p < pt => format!(
                        "below the triple point ({pt} Pa at {tt} K): the substance sublimes there and has no boiling point"
                    ),
                    _ => format!("the curve does not reach {} Pa", crate::units::tidy(p)),
                },
            },
        })
        .collect()
}

/// Vapor pressure at each temperature (K); `k95` the coverage factor.
pub fn vapor_pressures(curve: &dyn Curve, temps_k: &[f64], k95: f64) -> Vec<BoilResult> {
    temps_k
        .iter()
        .map(|&t| {
            let p = curve.p_pa(t);
            let ok = p.is_finite() && p > 0.0;
            let u_t = if ok {
                curve.t_uncertainty_k(p).filter(|u| u.is_finite())
            } else {
                None
            };
            let u_ln = u_t.map(|u| u * curve.d_ln_p_dt(t).abs());
            BoilResult {
                p_pa: if ok { p } else { f64::NAN },
                t_k: t,
                ci95_low_k: None,
                ci95_high_k: None,
                ci95_low_pa: u_ln.map(|u| p * (-k95 * u).exp()),
                ci95_high_pa: u_ln.map(|u| p * (k95 * u).exp()),
                extrapolated: outside(curve, t),
                error: match curve.triple_point() {
                    _ if ok => String::new(),
                    Some((tt, pt)) if t < tt => format!(
                        "below the triple point ({pt} Pa at {tt} K): the substance is solid there and its vapor pressure is a sublimation pressure"
                    ),
                    _ => format!("the curve is undefined at {} K", crate::units::tidy(t)),
                },
            }
        })
        .collect()
}

#[cfg(test)]
mod triple_point_tests {
    use super::*;
    use crate::reference::water::If97Saturation;

    // IAPWS R7-97(2012): the IF97 saturation line starts at 273.15 K; the
    // triple point is 273.16 K, 611.657 Pa.
    #[test]
    fn iapws_below_the_triple_point_is_said_in_words() {
        let r = boiling_points(&If97Saturation, &[100.0], 1.96);
        assert!(
            r[0].error
                .contains("below the triple point (611.657 Pa at 273.16 K)"),
            "{}",
            r[0].error
        );
        let r = vapor_pressures(&If97Saturation, &[260.0], 1.96);
        assert!(
            r[0].error.contains("below the triple point"),
            "{}",
            r[0].error
        );
    }
}

/// `steps` values from `lo` to `hi` spaced evenly in log (pressures).
pub fn log_spaced(lo: f64, hi: f64, steps: usize) -> Vec<f64> {
    if steps < 2 {
        return vec![lo];
    }
    let (a, b) = (lo.ln(), hi.ln());
    (0..steps)
        .map(|i| (a + (b - a) * i as f64 / (steps - 1) as f64).exp())
        .collect()
}

/// `steps` values from `lo` to `hi` spaced evenly (temperatures).
pub fn lin_spaced(lo: f64, hi: f64, steps: usize) -> Vec<f64> {
    if steps < 2 {
        return vec![lo];
    }
    (0..steps)
        .map(|i| lo + (hi - lo) * i as f64 / (steps - 1) as f64)
        .collect()
}

/// The cautions printed with any pressure below atmospheric.
pub const VACUUM_CAUTIONS: &[&str] = &[
    "Estimates and published constants are not measurements: confirm the boiling point on a small scale first.",
    "Glassware under vacuum can implode: use only sound, star-crack-free vessels rated for vacuum, behind a shield.",
    "Liquids bump under reduced pressure: stir or use a capillary bleed; boiling chips do not work under vacuum.",
    "Protect the pump with a cold trap; vapors may be flammable or toxic.",
    "Test peroxide formers (ethers, some alkenes) before concentrating them, and never distill to dryness.",
    "These figures defer to local rules and a qualified process-safety review.",
];

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::Library;

    // IAPWS-IF97 Table 36: Ts(0.1 MPa) = 372.755919 K, through the reference library.
    #[test]
    fn iapws_if97_table36_through_boiling_points() {
        let w = Library::bundled()
            .find("water")
            .unwrap()
            .best_curve()
            .unwrap();
        let r = boiling_points(&w, &[1e5], 1.96);
        assert!((r[0].t_k - 372.755919).abs() < 1e-6);
        let (lo, hi) = (r[0].ci95_low_k.unwrap(), r[0].ci95_high_k.unwrap());
        assert!(lo < r[0].t_k && hi > r[0].t_k && hi - lo < 0.2);
        let v = vapor_pressures(&w, &[300.0, 700.0], 1.96);
        assert!((v[0].p_pa - 3536.58941).abs() < 1e-4);
        assert!(!v[1].error.is_empty() && v[1].extrapolated);
    }

    #[test]
    fn spacing() {
        let p = log_spaced(100.0, 100_000.0, 4);
        assert!((p[1] - 1000.0).abs() < 1e-9 && (p[3] - 1e5).abs() < 1e-6);
        assert_eq!(lin_spaced(300.0, 310.0, 3), vec![300.0, 305.0, 310.0]);
    }
}
