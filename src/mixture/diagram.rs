//! Phase diagrams of a binary: T–x–y at a pressure or p–x–y at a temperature, y(x) and α(x).

use super::{Binary, MixtureError, VlePoint};

/// What is held fixed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Condition {
    /// Isobaric, Pa: the T–x–y diagram.
    Pressure(f64),
    /// Isothermal, K: the p–x–y diagram.
    Temperature(f64),
}

impl Binary<'_> {
    /// The bubble point of liquid `x1` under `cond` (`t_near` seeds the isobaric search).
    pub fn point(
        &self,
        x1: f64,
        cond: Condition,
        t_near: Option<f64>,
    ) -> Result<VlePoint, MixtureError> {
        match (cond, t_near) {
            (Condition::Temperature(t), _) => self.bubble_p(x1, t),
            (Condition::Pressure(p), Some(t0)) => self
                .bubble_t_near(x1, p, t0)
                .or_else(|_| self.bubble_t(x1, p)),
            (Condition::Pressure(p), None) => self.bubble_t(x1, p),
        }
    }

    /// Bubble points at `n` evenly spaced liquid compositions from x1 = 0 to 1
    /// (the one-liquid model everywhere; see the stability test for splits).
    ///
    /// ```
    /// use ebullio::mixture::{Binary, Condition, Ideal};
    /// use ebullio::vapor::{AntoineConstants, AntoineConvention};
    /// let conv: AntoineConvention = "ln,kPa,degC".parse().unwrap();
    /// let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, conv);
    /// let tol = AntoineConstants::new(13.9320, 3056.96, 217.625, conv);
    /// let b = Binary { names: ["benzene", "toluene"], curves: [&bz, &tol], model: &Ideal };
    /// let d = b.diagram(Condition::Pressure(101_325.0), 11).unwrap();
    /// assert_eq!(d.len(), 11);
    /// assert!(d.windows(2).all(|w| w[1].t_k < w[0].t_k)); // benzene is the lighter
    /// ```
    pub fn diagram(&self, cond: Condition, n: usize) -> Result<Vec<VlePoint>, MixtureError> {
        let n = n.max(2);
        let mut out = Vec::with_capacity(n);
        let mut t_near = None;
        for j in 0..n {
            let x1 = j as f64 / (n - 1) as f64;
            let pt = self.point(x1, cond, t_near)?;
            t_near = Some(pt.t_k);
            out.push(pt);
        }
        Ok(out)
    }
}
