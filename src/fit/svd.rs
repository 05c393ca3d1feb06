//! Thin singular value decomposition of a tall, narrow matrix by one-sided Jacobi rotations.
//!
//! The fitter's matrices are m×n with n ≤ 9 and columns already scaled to unit
//! norm; for them the one-sided (Hestenes) Jacobi method is both cheaper than
//! bidiagonalisation (no m×m work, one buffer) and accurate to high relative
//! precision in the small singular values, which the rank tests rely on.
//!
//! Reference: M. R. Hestenes, *J. SIAM* 6, 51–90 (1958); J. Demmel &
//! K. Veselić, *SIAM J. Matrix Anal. Appl.* 13, 1204–1245 (1992).

/// A = U·diag(s)·Vᵀ with U m×n (orthonormal columns where s > 0), V n×n.
/// Singular values are not sorted. Matrices are column-major.
#[derive(Debug, Clone)]
pub struct ThinSvd {
    /// Rows m.
    pub m: usize,
    /// Columns n.
    pub n: usize,
    /// Left singular vectors, m×n column-major (column k is zero when s_k = 0).
    pub u: Vec<f64>,
    /// Singular values (unsorted, ≥ 0).
    pub s: Vec<f64>,
    /// Right singular vectors, n×n column-major (column k pairs with s_k).
    pub v: Vec<f64>,
}

impl ThinSvd {
    /// Largest singular value.
    pub fn s_max(&self) -> f64 {
        self.s.iter().copied().fold(0.0, f64::max)
    }
    /// U_ik.
    pub fn u(&self, i: usize, k: usize) -> f64 {
        self.u[k * self.m + i]
    }
    /// V_jk.
    pub fn v(&self, j: usize, k: usize) -> f64 {
        self.v[k * self.n + j]
    }
}

const MAX_SWEEPS: usize = 60;

/// Thin SVD of the m×n column-major matrix `a` (consumed as the work buffer).
/// `None` if m < n, the input is not finite, or the sweeps do not converge.
pub fn thin_svd(mut a: Vec<f64>, m: usize, n: usize) -> Option<ThinSvd> {
    if m < n || a.len() != m * n || !a.iter().all(|x| x.is_finite()) {
        return None;
    }
    let mut v = vec![0.0; n * n];
    for k in 0..n {
        v[k * n + k] = 1.0;
    }
    // Columns p, q are orthogonal enough when |w_p·w_q| ≤ tol·‖w_p‖‖w_q‖.
    let tol = f64::EPSILON * (m as f64).sqrt();
    let mut norm2 = vec![0.0; n];
    let mut converged = n < 2;
    for _ in 0..MAX_SWEEPS {
        if converged {
            break;
        }
        // Squared column norms, refreshed every sweep and updated exactly
        // (in exact arithmetic) after each rotation in between.
        for k in 0..n {
            norm2[k] = a[k * m..(k + 1) * m].iter().map(|x| x * x).sum();
        }
        let mut rotated = false;
        for p in 0..n {
            for q in p + 1..n {
                let (alpha, beta) = (norm2[p], norm2[q]);
                let (cp, cq) = columns(&mut a, m, p, q);
                let gamma: f64 = cp.iter().zip(cq.iter()).map(|(x, y)| x * y).sum();
                if alpha == 0.0 || beta == 0.0 || gamma.abs() <= tol * (alpha * beta).sqrt() {
                    continue;
                }
                rotated = true;
                // Rotation that zeroes the (p, q) entry of AᵀA.
                let zeta = (beta - alpha) / (2.0 * gamma);
                let t = zeta.signum() / (zeta.abs() + (1.0 + zeta * zeta).sqrt());
                let c = 1.0 / (1.0 + t * t).sqrt();
                let s = c * t;
                rotate(cp, cq, c, s);
                let (vp, vq) = columns(&mut v, n, p, q);
                rotate(vp, vq, c, s);
                norm2[p] = (alpha - t * gamma).max(0.0);
                norm2[q] = beta + t * gamma;
            }
        }
        converged = !rotated;
    }
    if !converged {
        return None;
    }
    let mut s = vec![0.0; n];
    for k in 0..n {
        let col = &mut a[k * m..(k + 1) * m];
        let norm = col.iter().map(|x| x * x).sum::<f64>().sqrt();
        s[k] = norm;
        if norm > 0.0 {
            col.iter_mut().for_each(|x| *x /= norm);
        }
    }
    Some(ThinSvd { m, n, u: a, s, v })
}

/// Columns p < q of a column-major matrix with `rows` rows, both mutable.
fn columns(w: &mut [f64], rows: usize, p: usize, q: usize) -> (&mut [f64], &mut [f64]) {
    let (left, right) = w.split_at_mut(q * rows);
    (&mut left[p * rows..(p + 1) * rows], &mut right[..rows])
}

fn rotate(wp: &mut [f64], wq: &mut [f64], c: f64, s: f64) {
    for (x, y) in wp.iter_mut().zip(wq.iter_mut()) {
        let (a, b) = (*x, *y);
        *x = c * a - s * b;
        *y = s * a + c * b;
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use nalgebra::DMatrix;

    #[test]
    fn reconstructs_and_matches_nalgebra_singular_values() {
        // A fixed 7×3 matrix with a wide spread of column scales.
        let a = DMatrix::from_fn(7, 3, |i, k| {
            let x = 1.0 + i as f64;
            [1.0, 1.0 / x, x.ln() * 1e-3][k] + 1e-4 * ((i * 3 + k) as f64).sin()
        });
        let svd = thin_svd(a.as_slice().to_vec(), 7, 3).unwrap();
        for i in 0..7 {
            for j in 0..3 {
                let r: f64 = (0..3).map(|k| svd.u(i, k) * svd.s[k] * svd.v(j, k)).sum();
                assert!((r - a[(i, j)]).abs() < 1e-14, "{i},{j}");
            }
        }
        let mut ours = svd.s.clone();
        ours.sort_by(|x, y| y.total_cmp(x));
        let theirs = a.svd(false, false).singular_values;
        for k in 0..3 {
            assert!(
                ((ours[k] - theirs[k]) / theirs[k]).abs() < 1e-10,
                "{ours:?} {theirs}"
            );
        }
    }

    #[test]
    fn rank_deficient_shows_a_tiny_singular_value() {
        let a = DMatrix::from_fn(5, 2, |i, _| 1.0 + i as f64);
        let svd = thin_svd(a.as_slice().to_vec(), 5, 2).unwrap();
        let smin = svd.s.iter().copied().fold(f64::INFINITY, f64::min);
        assert!(smin <= svd.s_max() * 1e-15, "{:?}", svd.s);
        assert!(thin_svd(vec![f64::NAN; 4], 2, 2).is_none());
    }
}
