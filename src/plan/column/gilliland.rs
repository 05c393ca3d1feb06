//! The Gilliland correlation between reflux and stages, in the closed form of Molokanov et al.
//!
//! With `X = (R − R_min)/(R + 1)` and `Y = (N − N_min)/(N + 1)`,
//!
//! `Y = 1 − exp[ (1 + 54.4 X)/(11 + 117.2 X) · (X − 1)/√X ]`,
//!
//! which runs from Y = 1 at X = 0 (minimum reflux, infinite stages) to Y = 0
//! at X = 1 (total reflux). N and N_min count theoretical stages including
//! the reboiler. The correlation summarises stage-by-stage calculations of
//! many columns; its data scatter about the curve (Gilliland's plot shows
//! spreads of roughly ±0.05 in Y in mid-range; from memory), so a stage count
//! from it is an estimate.
//!
//! Reference: E. R. Gilliland, "Multicomponent rectification: estimation of
//! the number of theoretical plates as a function of the reflux ratio",
//! *Ind. Eng. Chem.* 32 (1940) 1220–1223; closed form: Yu. K. Molokanov,
//! T. P. Korablina, N. I. Mazurina and G. A. Nikiforov, "An approximation
//! method for calculating the basic parameters of multicomponent
//! fractionation", *Int. Chem. Eng.* 12 (1972) 209–212.

/// Gilliland's Y for X in (0, 1], by Molokanov's equation.
///
/// ```
/// use ebullio::plan::column::gilliland::y_of_x;
/// assert!((y_of_x(1.0)).abs() < 1e-12);
/// assert!(y_of_x(0.1) > 0.5 && y_of_x(0.1) < 0.6);
/// ```
pub fn y_of_x(x: f64) -> f64 {
    if x <= 0.0 {
        return 1.0;
    }
    let x = x.min(1.0);
    1.0 - ((1.0 + 54.4 * x) / (11.0 + 117.2 * x) * (x - 1.0) / x.sqrt()).exp()
}

/// Stages N at reflux `r` from `n_min` and `r_min` (`r > r_min`), with X and Y.
pub fn stages(n_min: f64, r_min: f64, r: f64) -> Option<GillilandPoint> {
    if !(r.is_finite() && r > r_min && n_min.is_finite() && n_min >= 0.0) {
        return None;
    }
    let x = (r - r_min) / (r + 1.0);
    let y = y_of_x(x);
    if y >= 1.0 {
        return None;
    }
    Some(GillilandPoint {
        x,
        y,
        n: (n_min + y) / (1.0 - y),
    })
}

/// A point on the correlation.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct GillilandPoint {
    /// `X = (R − R_min)/(R + 1)`.
    pub x: f64,
    /// `Y = (N − N_min)/(N + 1)`.
    pub y: f64,
    /// Theoretical stages N, including the reboiler.
    pub n: f64,
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand evaluation of Molokanov's equation (Int. Chem. Eng. 12 (1972) 209)
    /// at X = 0.1: (1 + 5.44)/(11 + 11.72) = 0.283451; (0.1 − 1)/√0.1 = −2.846050;
    /// product −0.806715; Y = 1 − e^−0.806715 = 0.553678.
    #[test]
    fn molokanov_matches_hand_evaluation() {
        assert!((y_of_x(0.1) - 0.553_678).abs() < 1e-6, "{}", y_of_x(0.1));
    }

    #[test]
    fn ends_and_monotone() {
        assert_eq!(y_of_x(0.0), 1.0);
        assert!(y_of_x(1.0).abs() < 1e-15);
        let mut prev = 1.0;
        for i in 1..=100 {
            let y = y_of_x(i as f64 / 100.0);
            assert!(y < prev);
            prev = y;
        }
    }

    #[test]
    fn stages_invert_y() {
        let p = stages(10.0, 1.0, 1.3).unwrap();
        assert!(((p.n - 10.0) / (p.n + 1.0) - p.y).abs() < 1e-12);
        assert!(stages(10.0, 1.0, 1.0).is_none());
    }
}
