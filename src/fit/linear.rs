//! Weighted linear least squares for equations linear in their parameters.
//!
//! Solves min Σ ((y_i − o_i − Σ_k θ_k φ_ik)/σ_i)² exactly by singular value
//! decomposition of the column-scaled design matrix (Clausius–Clapeyron,
//! Riedel, Wagner with known Tc and pc; also the linearized Antoine start).
//!
//! Reference: G. H. Golub & C. F. Van Loan, *Matrix Computations*, 4th ed.,
//! section 5.5 (least squares by SVD).

use super::svd::thin_svd;
use nalgebra::DMatrix;

/// Solve the weighted linear problem; `design` is m×n (rows φ_i), `rhs` the
/// targets y_i − o_i. Returns `None` when the design is rank deficient.
pub fn solve_weighted(design: &DMatrix<f64>, rhs: &[f64], sigma: &[f64]) -> Option<Vec<f64>> {
    let (m, n) = design.shape();
    solve_weighted_columns(design.as_slice().to_vec(), m, n, rhs, sigma)
}

/// As [`solve_weighted`], with the design given column-major in `a` (m×n),
/// which is used as the work buffer.
pub fn solve_weighted_columns(
    mut a: Vec<f64>,
    m: usize,
    n: usize,
    rhs: &[f64],
    sigma: &[f64],
) -> Option<Vec<f64>> {
    if m < n || a.len() != m * n || rhs.len() != m || sigma.len() != m {
        return None;
    }
    for k in 0..n {
        for i in 0..m {
            a[k * m + i] /= sigma[i];
        }
    }
    let mut scale = vec![1.0; n];
    for k in 0..n {
        let col = &mut a[k * m..(k + 1) * m];
        let norm = col.iter().map(|x| x * x).sum::<f64>().sqrt();
        if !(norm > 0.0 && norm.is_finite()) {
            return None;
        }
        scale[k] = norm;
        col.iter_mut().for_each(|x| *x /= norm);
    }
    let svd = thin_svd(a, m, n)?;
    let smax = svd.s_max();
    if svd.s.iter().any(|&s| s.is_nan() || s <= smax * 1e-13) {
        return None;
    }
    // x = V Σ⁻¹ Uᵀ b, then undo the column scaling.
    let mut c = vec![0.0; n];
    for k in 0..n {
        let utb: f64 = (0..m).map(|i| svd.u(i, k) * rhs[i] / sigma[i]).sum();
        c[k] = utb / svd.s[k];
    }
    let theta: Vec<f64> = (0..n)
        .map(|j| (0..n).map(|k| svd.v(j, k) * c[k]).sum::<f64>() / scale[j])
        .collect();
    theta.iter().all(|v| v.is_finite()).then_some(theta)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fits_a_line_exactly() {
        let d = DMatrix::from_fn(5, 2, |i, k| if k == 0 { 1.0 } else { i as f64 });
        let y: Vec<f64> = (0..5).map(|i| 3.0 - 2.0 * i as f64).collect();
        let th = solve_weighted(&d, &y, &[1.0; 5]).unwrap();
        assert!((th[0] - 3.0).abs() < 1e-12 && (th[1] + 2.0).abs() < 1e-12);
        let rank1 = DMatrix::from_element(5, 2, 1.0);
        assert!(solve_weighted(&rank1, &y, &[1.0; 5]).is_none());
    }
}
