//! Exact conversion of Antoine constants between conventions.
//!
//! With y = log_b(p/P) and θ = t in unit U, the Antoine form is
//! y = A − B/(θ + C). Changing convention is exact:
//!
//! - pressure unit P→P': log_b(p/P') = log_b(p/P) + log_b(P/P'), so
//!   A' = A + log_b(P/P'), B and C unchanged;
//! - log base b→b': multiply the whole equation by ln b / ln b', so A and B
//!   scale by that factor, C unchanged;
//! - temperature unit: θ' = s·θ + o (affine), and B/(θ + C) = s·B/(θ' + s·C − o),
//!   so B' = s·B and C' = s·C − o (A unchanged).
//!
//! Reference: follows directly from the definition of the logarithm and the
//! affine relation between temperature scales (NIST SP 811, App. B).

use super::convention::{AntoineConstants, AntoineConvention};

/// Convert Antoine constants exactly into another convention. The validity
/// range (kept in kelvin) is carried over unchanged.
///
/// ```
/// use ebullio::vapor::{convert, AntoineConstants, AntoineConvention, Curve};
/// let from: AntoineConvention = "ln,kPa,degC".parse().unwrap();
/// let to: AntoineConvention = "log10,mmHg,K".parse().unwrap();
/// let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, from);
/// let bz2 = convert::exact(&bz, to);
/// assert!((bz.ln_p(350.0) - bz2.ln_p(350.0)).abs() < 1e-12);
/// ```
pub fn exact(k: &AntoineConstants, to: AntoineConvention) -> AntoineConstants {
    let from = k.convention;
    // 1. to natural log and pascal: ln p_Pa = ln b·A + ln P − ln b·B/(θ + C)
    let lb = from.log_base.ln_base();
    let mut a = k.a * lb + from.p_unit.pa_per_unit().ln();
    let mut b = k.b * lb;
    // 2. temperature unit: θ_from = s·θ_to + o, with s, o from the kelvin maps.
    //    θ_from = f(K), K = g(θ_to): both affine.
    let ft = from.t_unit;
    let tt = to.t_unit;
    // θ_from as a function of θ_to: θ_from = s·θ_to + o
    let o = ft.from_kelvin(tt.to_kelvin(0.0));
    let s = ft.from_kelvin(tt.to_kelvin(1.0)) - o;
    // B/(s θ_to + o + C) = (B/s)/(θ_to + (o + C)/s)
    b /= s;
    let c = (o + k.c) / s;
    // 3. natural log Pa → target base and unit
    a -= to.p_unit.pa_per_unit().ln();
    let lt = to.log_base.ln_base();
    a /= lt;
    b /= lt;
    AntoineConstants {
        a,
        b,
        c,
        convention: to,
        range_k: k.range_k,
    }
}

impl AntoineConstants {
    /// The same curve in SI (ln, Pa, K): exact, since a unit change of p adds
    /// a constant to A, a base change scales A and B, and a Celsius/Kelvin
    /// shift moves C. Fahrenheit/Rankine also stay exact (linear in T).
    pub fn to_si(&self) -> AntoineConstants {
        exact(self, AntoineConvention::SI)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::{PressureUnit, TemperatureUnit};
    use crate::vapor::{Curve, LogBase};

    fn all_conventions() -> Vec<AntoineConvention> {
        let mut v = Vec::new();
        for log_base in [LogBase::Ten, LogBase::E] {
            for p_unit in PressureUnit::ALL {
                for t_unit in TemperatureUnit::ALL {
                    v.push(AntoineConvention {
                        log_base,
                        p_unit,
                        t_unit,
                    });
                }
            }
        }
        v
    }

    // Round trips between every pair of conventions are exact to 1e-12 at 50 temperatures.
    #[test]
    fn round_trips_are_exact_for_every_pair() {
        let base = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap());
        let convs = all_conventions();
        for &from in &convs {
            let k1 = exact(&base, from);
            for &to in &convs {
                let k2 = exact(&k1, to);
                let back = exact(&k2, from);
                for i in 0..50 {
                    let t = 280.0 + i as f64 * 2.0;
                    let p0 = k1.ln_p(t);
                    assert!((k2.ln_p(t) - p0).abs() <= 1e-12 * p0.abs().max(1.0));
                    assert!((back.ln_p(t) - p0).abs() <= 1e-12 * p0.abs().max(1.0));
                }
                assert!(((back.a - k1.a) / k1.a).abs() < 1e-12);
                assert!(((back.b - k1.b) / k1.b).abs() < 1e-12);
            }
        }
    }

    // Himmelblau App. H / Reid, Prausnitz & Sherwood form ln(p/mmHg) = A − B/(T/K + C)
    // against the same curve written as log10 mmHg degC: C shifts by 273.15, A and B scale by 1/ln 10.
    #[test]
    fn kelvin_to_celsius_shift_is_273_15() {
        let k = AntoineConstants::new(18.5242, 3578.91, -50.50, "ln,mmHg,K".parse().unwrap());
        let c = exact(&k, "log10,mmHg,degC".parse().unwrap());
        assert!((c.c - (-50.50 + crate::units::CELSIUS_OFFSET)).abs() < 1e-12);
        assert!((c.a - 18.5242 / std::f64::consts::LN_10).abs() < 1e-12);
    }
}
