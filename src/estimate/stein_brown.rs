//! Stein & Brown (1994) correction of the group-sum boiling point.
//!
//! Tb,corr = Tb − 94.84 + 0.5577·Tb − 0.0007705·Tb² for Tb ≤ 700 K, and
//! Tb + 282.7 − 0.5209·Tb above. Applied here to the original Joback Tb (an
//! approximation: Stein & Brown derived it for their own refitted groups).
//!
//! Reference: S. E. Stein, R. L. Brown, J. Chem. Inf. Comput. Sci. 34 (1994)
//! 581–587. Coefficients as written in `reference-data/JOBACK.md` §4 —
//! **unconfirmed** there (from memory of the compiler).

/// Corrected boiling point (K) from an uncorrected group-sum Tb (K).
///
/// ```
/// // JOBACK.md §6: acetone 321.91 K → 326.76 K.
/// let t = ebullio::estimate::stein_brown::corrected_tb_k(321.91);
/// assert!((t - 326.76).abs() < 0.01);
/// ```
pub fn corrected_tb_k(tb: f64) -> f64 {
    if tb <= 700.0 {
        tb - 94.84 + 0.5577 * tb - 0.0007705 * tb * tb
    } else {
        tb + 282.7 - 0.5209 * tb
    }
}
