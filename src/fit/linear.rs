//! Weighted linear least squares for equations linear in their parameters.
//!
//! Solves min Σ ((y_i − o_i − Σ_k θ_k φ_ik)/σ_i)² exactly by singular value
//! decomposition of the column-scaled design matrix (Clausius–Clapeyron,
//! Riedel, Wagner with known Tc and pc; also the linearized Antoine start).
//!
//! Reference: G. H. Golub & C. F. Van Loan, *Matrix Computations*, 4th ed.,
//! section 5.5 (least squares by SVD).

use nalgebra::{DMatrix, DVector};

/// Solve the weighted linear problem; `design` is m×n (rows φ_i), `rhs` the
/// targets y_i − o_i. Returns `None` when the design is rank deficient.
pub fn solve_weighted(design: &DMatrix<f64>, rhs: &[f64], sigma: &[f64]) -> Option<Vec<f64>> {
    let (m, n) = design.shape();
    if m < n || rhs.len() != m || sigma.len() != m {
        return None;
    }
    let mut a = design.clone();
    let mut b = DVector::from_column_slice(rhs);
    for i in 0..m {
        a.row_mut(i).unscale_mut(sigma[i]);
        b[i] /= sigma[i];
    }
    let mut scale = vec![1.0; n];
    for k in 0..n {
        let norm = a.column(k).norm();
        if !(norm > 0.0 && norm.is_finite()) {
            return None;
        }
        scale[k] = norm;
        a.column_mut(k).unscale_mut(norm);
    }
    let svd = a.svd(true, true);
    let smax = svd.singular_values.max();
    if svd
        .singular_values
        .iter()
        .any(|&s| s.is_nan() || s <= smax * 1e-13)
    {
        return None;
    }
    let x = svd.solve(&b, 0.0).ok()?;
    let theta: Vec<f64> = (0..n).map(|k| x[k] / scale[k]).collect();
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
