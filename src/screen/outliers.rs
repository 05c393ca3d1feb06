//! Robust outlier scores of residuals across the table (median and MAD).
//!
//! The modified z-score z = 0.6745·(r − median)/MAD uses the median absolute
//! deviation instead of the standard deviation, so a handful of bad rows
//! cannot inflate the scale and hide each other; |z| > 3.5 is flagged.
//!
//! Reference: B. Iglewicz and D. C. Hoaglin, *How to Detect and Handle
//! Outliers*, ASQC Quality Press (1993) (from memory).

use super::finding::{CheckCode, Finding};
use super::number_text::Message;

/// |z| above which a residual is an outlier.
pub const Z_LIMIT: f64 = 3.5;

/// Fewest residuals for which robust scores are computed.
pub const MIN_ROWS: usize = 8;

/// The median of `v` (at least one value; reordered here): the middle of the
/// order statistics, selected rather than sorted (the same values).
fn median(v: &mut [f64]) -> f64 {
    let n = v.len();
    let (below, mid, _) = v.select_nth_unstable_by(n / 2, f64::total_cmp);
    let mid = *mid;
    if n % 2 == 1 {
        mid
    } else {
        let lower = below.iter().copied().max_by(f64::total_cmp).unwrap_or(mid);
        0.5 * (lower + mid)
    }
}

/// The median and MAD of `finite` (finite residuals, reordered here);
/// `None` when there are fewer than [`MIN_ROWS`] or their MAD is zero.
pub fn robust_scale(finite: &mut [f64]) -> Option<(f64, f64)> {
    if finite.len() < MIN_ROWS {
        return None;
    }
    let med = median(finite);
    finite.iter_mut().for_each(|r| *r = (*r - med).abs());
    let mad = median(finite);
    if mad <= 0.0 || mad.is_nan() {
        return None;
    }
    Some((med, mad))
}

/// Modified z-scores for `residuals` (NaN for missing); `None` when fewer
/// than [`MIN_ROWS`] residuals exist or their MAD is zero.
pub fn robust_z(residuals: &[f64]) -> Option<(Vec<f64>, f64, f64)> {
    let mut finite: Vec<f64> = residuals
        .iter()
        .copied()
        .filter(|r| r.is_finite())
        .collect();
    let (med, mad) = robust_scale(&mut finite)?;
    Some((
        residuals.iter().map(|r| 0.6745 * (r - med) / mad).collect(),
        med,
        mad,
    ))
}

/// The `structure-outlier` finding of one residual against the table's
/// median and MAD, if its |z| exceeds [`Z_LIMIT`].
pub fn outlier(residual: f64, med: f64, mad: f64) -> Option<Finding> {
    let z = 0.6745 * (residual - med) / mad;
    (z.abs() > Z_LIMIT).then(|| {
        Finding::new(
            CheckCode::StructureOutlier,
            Message::with_capacity(140)
                .text("Against the structure estimate this row's residual of ")
                .d1_signed(residual)
                .text(" K is an outlier in the table (robust z = ")
                .d1(z)
                .text("; median ")
                .d1_signed(med)
                .text(" K, MAD ")
                .d1(mad)
                .text(" K).")
                .done(),
        )
    })
}

/// `structure-outlier` findings per row index for residuals (Tb − estimate).
pub fn check_outliers(residuals: &[f64]) -> Vec<(usize, Finding)> {
    let mut finite: Vec<f64> = residuals
        .iter()
        .copied()
        .filter(|r| r.is_finite())
        .collect();
    let Some((med, mad)) = robust_scale(&mut finite) else {
        return Vec::new();
    };
    residuals
        .iter()
        .enumerate()
        .filter_map(|(i, &r)| outlier(r, med, mad).map(|f| (i, f)))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    // Selecting gives the sorted middle, odd and even counts, ties included.
    #[test]
    fn median_is_the_sorted_middle() {
        let mut s: u64 = 0xDEAD_BEEF_CAFE_F00D;
        for n in 1..200 {
            let mut v: Vec<f64> = (0..n)
                .map(|_| {
                    s ^= s << 13;
                    s ^= s >> 7;
                    s ^= s << 17;
                    ((s >> 40) % 50) as f64 - 20.0
                })
                .collect();
            let mut sorted = v.clone();
            sorted.sort_by(f64::total_cmp);
            let want = if n % 2 == 1 {
                sorted[n / 2]
            } else {
                0.5 * (sorted[n / 2 - 1] + sorted[n / 2])
            };
            assert_eq!(median(&mut v), want, "{n}");
        }
    }

    #[test]
    fn two_outliers_do_not_hide_each_other() {
        let mut r = vec![1.0, -2.0, 0.5, 3.0, -1.5, 2.0, -0.5, 1.5, -3.0, 0.0];
        r.push(60.0);
        r.push(-55.0);
        r.push(f64::NAN);
        let f = check_outliers(&r);
        let rows: Vec<usize> = f.iter().map(|(i, _)| *i).collect();
        assert_eq!(rows, [10, 11]);
    }

    #[test]
    fn too_few_rows_gives_nothing() {
        assert!(check_outliers(&[1.0, 100.0, 2.0]).is_empty());
    }
}
