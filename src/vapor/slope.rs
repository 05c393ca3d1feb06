//! Enthalpy and entropy of vaporization from a curve's slope (Clausius–Clapeyron).
//!
//! ΔHvap = R·T²·d ln p/dT assumes an ideal vapor and a negligible liquid
//! volume; both fail towards the critical point, so results above a reduced
//! temperature of about 0.75 are flagged by callers.
//!
//! Reference: the Clausius–Clapeyron relation, d ln p/d(1/T) = −ΔHvap/R.

use super::Curve;

/// Molar gas constant, J/(mol·K) (CODATA 2018, exact).
pub const R_J_MOL_K: f64 = 8.314_462_618;

/// Trouton band for the entropy of vaporization at the normal boiling point,
/// J/(mol·K). Common practice (no single source): most non-associating liquids
/// give about 85–88 J/(mol·K); hydrogen-bonded liquids reach about 110; a value
/// outside 60–130 points at wrong constants rather than unusual chemistry.
pub const TROUTON_BAND_J_MOL_K: (f64, f64) = (60.0, 130.0);

/// Reduced temperature above which the Clausius–Clapeyron estimate of ΔHvap
/// is flagged (ideal-gas and liquid-volume assumptions degrade).
pub const TR_CLAPEYRON_LIMIT: f64 = 0.75;

/// ΔHvap in J/mol at `t_k` from the slope of `curve`.
///
/// ```
/// use ebullio::vapor::{slope, AntoineConstants, Curve};
/// let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, "ln,kPa,degC".parse().unwrap());
/// let h = slope::hvap_j_mol(&bz, 353.2);
/// assert!(h > 28_000.0 && h < 34_000.0); // benzene is about 30.7 kJ/mol at Tb (from memory)
/// ```
pub fn hvap_j_mol(curve: &dyn Curve, t_k: f64) -> f64 {
    R_J_MOL_K * t_k * t_k * curve.d_ln_p_dt(t_k)
}

/// Entropy of vaporization ΔHvap/T in J/(mol·K) at `t_k`.
pub fn svap_j_mol_k(curve: &dyn Curve, t_k: f64) -> f64 {
    hvap_j_mol(curve, t_k) / t_k
}

/// Whether an entropy of vaporization lies inside [`TROUTON_BAND_J_MOL_K`].
pub fn trouton_plausible(svap_j_mol_k: f64) -> bool {
    let (lo, hi) = TROUTON_BAND_J_MOL_K;
    svap_j_mol_k.is_finite() && svap_j_mol_k >= lo && svap_j_mol_k <= hi
}
