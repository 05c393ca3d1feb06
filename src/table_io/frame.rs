//! Vectorised helper for the screen (polars, so it lives in table_io): implied normal boiling points for a whole
//! table in one polars lazy expression.
//!
//! The implied boiling point is closed form, t = B/(A − y₀) − C with
//! y₀ = ln(101 325 Pa / p_unit)/ln(base), then T/K = (t + offset)·scale for
//! the row's temperature unit. Rows without complete constants give NaN.

use crate::units::ATM_PA;
use crate::vapor::AntoineConvention;
use polars::prelude::*;

/// Implied normal boiling points (K, NaN where undefined) for columns of
/// A, B, C and each row's convention (None where unknown).
pub fn implied_tb_k(
    a: &[f64],
    b: &[f64],
    c: &[f64],
    conventions: &[Option<AntoineConvention>],
) -> PolarsResult<Vec<f64>> {
    let n = a.len();
    let mut y0 = Vec::with_capacity(n);
    let mut off = Vec::with_capacity(n);
    let mut scale = Vec::with_capacity(n);
    for conv in conventions {
        match conv {
            Some(cv) => {
                let s = cv.t_unit.kelvin_per_degree();
                y0.push((ATM_PA / cv.p_unit.pa_per_unit()).ln() / cv.log_base.ln_base());
                off.push(cv.t_unit.to_kelvin(0.0) / s);
                scale.push(s);
            }
            None => {
                y0.push(f64::NAN);
                off.push(f64::NAN);
                scale.push(f64::NAN);
            }
        }
    }
    let df = DataFrame::new(
        n,
        vec![
            Column::new("a".into(), a),
            Column::new("b".into(), b),
            Column::new("c".into(), c),
            Column::new("y0".into(), y0),
            Column::new("off".into(), off),
            Column::new("scale".into(), scale),
        ],
    )?;
    let t_own = col("b") / (col("a") - col("y0")) - col("c");
    let tb = (t_own + col("off")) * col("scale");
    let ok = col("b")
        .gt(lit(0.0))
        .and(col("a").gt(col("y0")))
        .and(tb.clone().gt(lit(0.0)));
    let out = df
        .lazy()
        .select([when(ok).then(tb).otherwise(lit(f64::NAN)).alias("tb")])
        .collect()?;
    let ca = out.column("tb")?.f64()?.clone();
    Ok(ca.iter().map(|v| v.unwrap_or(f64::NAN)).collect())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::vapor::{AntoineConstants, Curve};

    // Benzene (Smith, Van Ness & Abbott App. B Table B.2, ln/kPa/°C) and
    // toluene (Himmelblau App. H, ln/mmHg/K): bulk result equals the row-wise one.
    #[test]
    fn bulk_equals_row_by_row_for_published_rows() {
        let rows = [
            (13.7819, 2726.81, 217.572, "ln,kPa,degC"),
            (16.0137, 3096.52, -53.67, "ln,mmHg,K"),
        ];
        let a: Vec<f64> = rows.iter().map(|r| r.0).collect();
        let b: Vec<f64> = rows.iter().map(|r| r.1).collect();
        let c: Vec<f64> = rows.iter().map(|r| r.2).collect();
        let conv: Vec<Option<AntoineConvention>> =
            rows.iter().map(|r| Some(r.3.parse().unwrap())).collect();
        let bulk = implied_tb_k(&a, &b, &c, &conv).unwrap();
        for (i, r) in rows.iter().enumerate() {
            let k = AntoineConstants::new(r.0, r.1, r.2, r.3.parse().unwrap());
            let t = k.t_at(ATM_PA).unwrap();
            assert!((bulk[i] - t).abs() < 1e-9, "{} vs {t}", bulk[i]);
        }
        let none = implied_tb_k(&[1.0], &[2.0], &[3.0], &[None]).unwrap();
        assert!(none[0].is_nan());
    }
}
