//! G^E as a Legendre series, the flexible model of the point-to-point consistency test.
//!
//! g = G^E/RT = x1 x2 Σ_k a_k P_k(2 x1 − 1) with up to five terms; then
//! ln γ1 = g + x2 g′, ln γ2 = g − x1 g′ (′ = d/dx1), and d ln γ1/dx1 = x2 g″,
//! d ln γ2/dx1 = −x1 g″. The coefficients are temperature-independent.
//!
//! Reference: H. C. Van Ness, S. M. Byer, R. E. Gibbs, AIChE J. 19 (1973)
//! 238–244 (data reduction with an orthogonal-polynomial G^E); A. Fredenslund,
//! J. Gmehling, P. Rasmussen, *Vapor–Liquid Equilibria Using UNIFAC*, Elsevier
//! 1977, Sec. 3.3 (Legendre polynomials in the consistency test).

use super::{ActivityModel, MixtureError};

/// Most terms the series takes.
pub const MAX_LEGENDRE_TERMS: usize = 5;

/// A Legendre-series G^E model.
///
/// ```
/// use ebullio::mixture::{ActivityModel, Legendre, Margules};
/// // One term is the symmetric (one-parameter Margules) model.
/// let l = Legendre::new(&[0.9]).unwrap();
/// let m = Margules::new(0.9, 0.9).unwrap();
/// let (a, b) = (l.ln_gamma(0.3, 350.0), m.ln_gamma(0.3, 350.0));
/// assert!((a[0] - b[0]).abs() < 1e-12 && (a[1] - b[1]).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Legendre {
    a: [f64; MAX_LEGENDRE_TERMS],
    n: usize,
}

/// [P_k(z), P_k′(z), P_k″(z)] for k = 0..5.
fn legendre(k: usize, z: f64) -> [f64; 3] {
    let z2 = z * z;
    match k {
        0 => [1.0, 0.0, 0.0],
        1 => [z, 1.0, 0.0],
        2 => [(3.0 * z2 - 1.0) / 2.0, 3.0 * z, 3.0],
        3 => [
            (5.0 * z2 * z - 3.0 * z) / 2.0,
            (15.0 * z2 - 3.0) / 2.0,
            15.0 * z,
        ],
        _ => [
            (35.0 * z2 * z2 - 30.0 * z2 + 3.0) / 8.0,
            (140.0 * z2 * z - 60.0 * z) / 8.0,
            (420.0 * z2 - 60.0) / 8.0,
        ],
    }
}

impl Legendre {
    /// From 1 to 5 coefficients a_0, a_1, ….
    pub fn new(coefficients: &[f64]) -> Result<Self, MixtureError> {
        if coefficients.is_empty() || coefficients.len() > MAX_LEGENDRE_TERMS {
            return Err(MixtureError::BadParameter {
                model: "Legendre",
                name: "terms",
                value: coefficients.len() as f64,
                expected: "1 to 5 coefficients",
            });
        }
        let mut a = [0.0; MAX_LEGENDRE_TERMS];
        for (k, &v) in coefficients.iter().enumerate() {
            if !v.is_finite() {
                return Err(MixtureError::BadParameter {
                    model: "Legendre",
                    name: "a_k",
                    value: v,
                    expected: "a finite number",
                });
            }
            a[k] = v;
        }
        Ok(Self {
            a,
            n: coefficients.len(),
        })
    }

    /// The same mixture with the components numbered the other way round
    /// (z = 2x1 − 1 changes sign, so the odd coefficients do).
    pub fn swapped(&self) -> Self {
        let mut a = self.a;
        for (k, v) in a.iter_mut().enumerate() {
            if k % 2 == 1 {
                *v = -*v;
            }
        }
        Self { a, n: self.n }
    }

    /// g = G^E/RT and its first two derivatives in x1.
    fn g(&self, x1: f64) -> [f64; 3] {
        let z = 2.0 * x1 - 1.0;
        let (mut q, mut q1, mut q2) = (0.0, 0.0, 0.0);
        for k in 0..self.n {
            let [p, dp, ddp] = legendre(k, z);
            q += self.a[k] * p;
            q1 += self.a[k] * 2.0 * dp;
            q2 += self.a[k] * 4.0 * ddp;
        }
        let h = x1 * (1.0 - x1);
        let h1 = 1.0 - 2.0 * x1;
        [h * q, h1 * q + h * q1, -2.0 * q + 2.0 * h1 * q1 + h * q2]
    }
}

impl ActivityModel for Legendre {
    fn name(&self) -> &'static str {
        "legendre"
    }

    fn ln_gamma_dx(&self, x1: f64, _t_k: f64) -> ([f64; 2], [f64; 2]) {
        let [g, g1, g2] = self.g(x1);
        let x2 = 1.0 - x1;
        ([g + x2 * g1, g - x1 * g1], [x2 * g2, -x1 * g2])
    }
}
