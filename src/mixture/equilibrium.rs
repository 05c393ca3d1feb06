//! Modified Raoult's law for a binary: bubble and dew points at a pressure or a temperature.
//!
//! yi·p = xi·γi(x, T)·pi°(T): ideal vapor, activity coefficients in the
//! liquid, pure-component vapor pressures from each component's curve.
//!
//! Reference: J. M. Smith, H. C. Van Ness, M. M. Abbott, *Introduction to
//! Chemical Engineering Thermodynamics*, 7th ed., Sec. 10.5 (modified Raoult's
//! law, BUBL/DEW P and T).

use super::{ActivityModel, MixtureError};
use crate::vapor::Curve;

/// Two components, their vapor-pressure curves and the liquid model.
#[derive(Clone, Copy)]
pub struct Binary<'a> {
    /// Component names (for messages).
    pub names: [&'a str; 2],
    /// Pure-component vapor-pressure curves.
    pub curves: [&'a dyn Curve; 2],
    /// The activity-coefficient model.
    pub model: &'a dyn ActivityModel,
}

/// One vapor–liquid equilibrium state.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct VlePoint {
    /// Liquid mole fraction of component 1.
    pub x1: f64,
    /// Vapor mole fraction of component 1.
    pub y1: f64,
    /// Temperature, K.
    pub t_k: f64,
    /// Pressure, Pa.
    pub p_pa: f64,
    /// Activity coefficients [γ1, γ2] in the liquid.
    pub gamma: [f64; 2],
    /// Pure vapor pressures [p1°, p2°] at `t_k`, Pa.
    pub p_sat: [f64; 2],
    /// ln α12 = ln γ1 + ln p1° − ln γ2 − ln p2° (finite at both ends).
    pub ln_alpha: f64,
}

impl VlePoint {
    /// Relative volatility α12 = (y1/x1)/(y2/x2) = γ1 p1°/(γ2 p2°) (defined at the ends too).
    pub fn alpha(&self) -> f64 {
        self.ln_alpha.exp()
    }
}

const MAX_ITER: usize = 100;

fn check_x(x: f64) -> Result<f64, MixtureError> {
    if (0.0..=1.0).contains(&x) {
        Ok(x)
    } else {
        Err(MixtureError::Composition { value: x })
    }
}

fn check_positive(what: &'static str, v: f64) -> Result<f64, MixtureError> {
    if v.is_finite() && v > 0.0 {
        Ok(v)
    } else {
        Err(MixtureError::BadCondition { what, value: v })
    }
}

impl Binary<'_> {
    /// ln p°i at `t_k`, or an error naming the component.
    fn ln_psat(&self, i: usize, t_k: f64) -> Result<f64, MixtureError> {
        let v = self.curves[i].ln_p(t_k);
        if v.is_finite() {
            Ok(v)
        } else {
            Err(MixtureError::NoVaporPressure {
                name: self.names[i].to_string(),
                t_k,
            })
        }
    }

    /// Pure-component boiling temperature of component `i` at `p_pa`.
    pub fn pure_t(&self, i: usize, p_pa: f64) -> Result<f64, MixtureError> {
        self.curves[i]
            .t_at(p_pa)
            .filter(|t| t.is_finite())
            .ok_or_else(|| MixtureError::NoVaporPressure {
                name: self.names[i].to_string(),
                t_k: f64::NAN,
            })
    }

    /// Bubble pressure and vapor composition of liquid `x1` at `t_k`.
    ///
    /// ```
    /// use ebullio::mixture::{Binary, Ideal};
    /// use ebullio::vapor::{AntoineConstants, AntoineConvention};
    /// let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
    /// let benzene = AntoineConstants::new(13.7819, 2726.81, 217.572, conv);
    /// let toluene = AntoineConstants::new(13.9320, 3056.96, 217.625, conv);
    /// let b = Binary { names: ["benzene", "toluene"], curves: [&benzene, &toluene], model: &Ideal };
    /// let pt = b.bubble_p(0.5, 363.15).unwrap();
    /// assert!(pt.y1 > 0.5 && pt.p_pa > 0.0);
    /// ```
    pub fn bubble_p(&self, x1: f64, t_k: f64) -> Result<VlePoint, MixtureError> {
        let x1 = check_x(x1)?;
        let t_k = check_positive("temperature", t_k)?;
        let lp = [self.ln_psat(0, t_k)?, self.ln_psat(1, t_k)?];
        let p_sat = [lp[0].exp(), lp[1].exp()];
        let lg = self.model.ln_gamma(x1, t_k);
        let gamma = [lg[0].exp(), lg[1].exp()];
        let p1 = x1 * gamma[0] * p_sat[0];
        let p2 = (1.0 - x1) * gamma[1] * p_sat[1];
        let p = p1 + p2;
        Ok(VlePoint {
            x1,
            y1: p1 / p,
            t_k,
            p_pa: p,
            gamma,
            p_sat,
            ln_alpha: (lg[0] + lp[0]) - (lg[1] + lp[1]),
        })
    }

    /// Bubble temperature and vapor composition of liquid `x1` at `p_pa`.
    pub fn bubble_t(&self, x1: f64, p_pa: f64) -> Result<VlePoint, MixtureError> {
        let x1 = check_x(x1)?;
        let p_pa = check_positive("pressure", p_pa)?;
        let t0 = self.start_t(x1, p_pa)?;
        self.bubble_t_near(x1, p_pa, t0)
    }

    /// A starting temperature: the mole-fraction average of the pure boiling points.
    fn start_t(&self, x1: f64, p_pa: f64) -> Result<f64, MixtureError> {
        let t1 = self.pure_t(0, p_pa);
        let t2 = self.pure_t(1, p_pa);
        match (t1, t2) {
            (Ok(a), Ok(b)) => Ok(x1 * a + (1.0 - x1) * b),
            (Ok(a), Err(_)) => Ok(a),
            (Err(_), Ok(b)) => Ok(b),
            (Err(e), Err(_)) => Err(e),
        }
    }

    /// [`Binary::bubble_t`] starting the search at `t_start` (a neighbour's answer).
    pub fn bubble_t_near(
        &self,
        x1: f64,
        p_pa: f64,
        t_start: f64,
    ) -> Result<VlePoint, MixtureError> {
        let x1 = check_x(x1)?;
        let ln_p = check_positive("pressure", p_pa)?.ln();
        let mut t = t_start;
        for _ in 0..MAX_ITER {
            let pt = self.bubble_p(x1, t)?;
            let g = pt.p_pa.ln() - ln_p;
            if g.abs() < 1e-12 {
                return Ok(pt);
            }
            // Slope with γ held constant (γ varies slowly with T): Σ yi d ln pi°/dT.
            let s =
                pt.y1 * self.curves[0].d_ln_p_dt(t) + (1.0 - pt.y1) * self.curves[1].d_ln_p_dt(t);
            if !(s.is_finite() && s > 0.0) {
                break;
            }
            let step = (g / s).clamp(-50.0, 50.0);
            t -= step;
            if step.abs() < 1e-10 * t {
                return self.bubble_p(x1, t);
            }
        }
        Err(MixtureError::NoConvergence {
            what: "bubble temperature",
            x: x1,
        })
    }

    /// Dew pressure and liquid composition of vapor `y1` at `t_k`.
    pub fn dew_p(&self, y1: f64, t_k: f64) -> Result<VlePoint, MixtureError> {
        let y1 = check_x(y1)?;
        let t_k = check_positive("temperature", t_k)?;
        let p_sat = [self.ln_psat(0, t_k)?.exp(), self.ln_psat(1, t_k)?.exp()];
        let mut x1 = y1;
        for _ in 0..MAX_ITER * 5 {
            let lg = self.model.ln_gamma(x1, t_k);
            let k = [lg[0].exp() * p_sat[0], lg[1].exp() * p_sat[1]];
            let inv_p = y1 / k[0] + (1.0 - y1) / k[1];
            let p = 1.0 / inv_p;
            let new_x1 = y1 * p / k[0];
            if (new_x1 - x1).abs() < 1e-13 {
                return self.bubble_p(new_x1, t_k).map(|pt| VlePoint { y1, ..pt });
            }
            x1 = 0.5 * (x1 + new_x1);
        }
        Err(MixtureError::NoConvergence {
            what: "dew pressure",
            x: y1,
        })
    }

    /// Dew temperature and liquid composition of vapor `y1` at `p_pa`.
    pub fn dew_t(&self, y1: f64, p_pa: f64) -> Result<VlePoint, MixtureError> {
        let y1 = check_x(y1)?;
        let p_pa = check_positive("pressure", p_pa)?;
        let mut t = self.start_t(y1, p_pa)?;
        let mut x1 = y1;
        for _ in 0..MAX_ITER * 5 {
            let lp = [self.ln_psat(0, t)?, self.ln_psat(1, t)?];
            let lg = self.model.ln_gamma(x1, t);
            // xi = yi p / (γi pi°); S = Σ xi should be 1.
            let a1 = y1 * p_pa / (lg[0] + lp[0]).exp();
            let a2 = (1.0 - y1) * p_pa / (lg[1] + lp[1]).exp();
            let s = a1 + a2;
            let new_x1 = a1 / s;
            let g = s.ln();
            let slope =
                new_x1 * self.curves[0].d_ln_p_dt(t) + (1.0 - new_x1) * self.curves[1].d_ln_p_dt(t);
            if !(slope.is_finite() && slope > 0.0) {
                break;
            }
            let step = (g / slope).clamp(-50.0, 50.0);
            t += step;
            let dx = new_x1 - x1;
            x1 = new_x1;
            if g.abs() < 1e-12 && dx.abs() < 1e-12 {
                return self.bubble_p(x1, t).map(|pt| VlePoint { y1, ..pt });
            }
        }
        Err(MixtureError::NoConvergence {
            what: "dew temperature",
            x: y1,
        })
    }
}
