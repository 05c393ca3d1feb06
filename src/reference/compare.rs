//! Fitted curve against reference: differences over the common range, and findings.
//!
//! Over the overlap of the two validity ranges, the relative difference in p,
//! δ(T) = p_fit/p_ref − 1, is sampled at 41 temperatures; its maximum and RMS
//! are reported, with the difference in normal boiling point. A finding is
//! raised where |δ| exceeds the allowance
//! √((1.96·u_fit(T))² + tol_p²), with u_fit the fit's own standard
//! uncertainty in ln p (from `Curve::t_uncertainty_k` times the slope), and
//! likewise for Tb with `tol_tb_k`. The tolerances stand for the reference's
//! uncertainty: defaults 2 % in p and 0.5 K in Tb (common practice).

use super::{Compound, ReferenceCurve};
use crate::units::ATM_PA;
use crate::vapor::Curve;

pub use crate::finding::{Finding, ReferenceCode, Severity, Subject};

pub use crate::fit::comparison::{Comparison, Tolerances};

/// Compare `fitted` (with its fitted range `fit_range_k`) with the compound's best reference curve.
pub fn compare(
    fitted: &dyn Curve,
    fit_range_k: (f64, f64),
    compound: &Compound,
    tol: Tolerances,
) -> Option<Comparison> {
    let reference = compound.best_curve()?;
    Some(compare_with(fitted, fit_range_k, compound, &reference, tol))
}

/// Compare with a given reference curve of `compound`.
pub fn compare_with(
    fitted: &dyn Curve,
    fit_range_k: (f64, f64),
    compound: &Compound,
    reference: &ReferenceCurve,
    tol: Tolerances,
) -> Comparison {
    let mut out = Comparison {
        compound: compound.name.clone(),
        reference_source: reference.source.clone(),
        overlap_k: None,
        gap_k: None,
        max_rel_diff_pct: None,
        rms_rel_diff_pct: None,
        tb_diff_k: None,
        tb_reference_k: None,
        findings: Vec::new(),
    };
    // Reference range: stated, else ±30 K about its Tb (common practice, flagged).
    let ref_range = reference.valid_range_k().or_else(|| {
        let tb = reference.t_at(ATM_PA)?;
        out.findings.push(Finding::new(
            ReferenceCode::ReferenceRangeUnstated,
            format!("The reference row for {} states no temperature range; it was compared within 30 K of its boiling point.", compound.name),
        ));
        Some((tb - 30.0, tb + 30.0))
    });
    if let Some((rlo, rhi)) = ref_range {
        let (lo, hi) = (fit_range_k.0.max(rlo), fit_range_k.1.min(rhi));
        if hi > lo {
            out.overlap_k = Some((lo, hi));
            let (mut max, mut ss, mut n, mut worst) = (0.0f64, 0.0, 0usize, None);
            for i in 0..=40 {
                let t = lo + (hi - lo) * i as f64 / 40.0;
                let d = (fitted.ln_p(t) - reference.ln_p(t)).exp() - 1.0;
                if !d.is_finite() {
                    continue;
                }
                let slope = fitted.d_ln_p_dt(t);
                let u_fit = fitted
                    .t_uncertainty_k(fitted.p_pa(t))
                    .map_or(0.0, |u| u * slope.abs());
                let allow = ((1.96 * u_fit).powi(2) + tol.p_rel.powi(2)).sqrt();
                if d.abs() > allow
                    && worst.is_none_or(|(wd, _, _): (f64, f64, f64)| d.abs() > wd.abs())
                {
                    worst = Some((d, t, allow));
                }
                max = max.max(d.abs());
                ss += d * d;
                n += 1;
            }
            if n > 0 {
                out.max_rel_diff_pct = Some(100.0 * max);
                out.rms_rel_diff_pct = Some(100.0 * (ss / n as f64).sqrt());
            }
            if let Some((d, t, allow)) = worst {
                out.findings.push(Finding::new(
            ReferenceCode::ReferencePressureDisagrees,
                    format!(
                        "The fitted vapor pressure differs from the reference for {} by {:+.1} % at {:.1} K, more than the {:.1} % the fit's 95 % interval and the reference's uncertainty allow.",
                        compound.name, 100.0 * d, t, 100.0 * allow
                    ),
                ));
            }
        } else {
            let gap = if fit_range_k.1 < rlo {
                rlo - fit_range_k.1
            } else {
                fit_range_k.0 - rhi
            };
            out.gap_k = Some(gap);
            out.findings.push(Finding::new(
            ReferenceCode::ReferenceNoOverlap,
                format!(
                    "The fitted range {:.1}-{:.1} K and the reference range {:.1}-{:.1} K for {} do not overlap (gap {:.1} K), so the curves were not compared point by point.",
                    fit_range_k.0, fit_range_k.1, rlo, rhi, compound.name, gap
                ),
            ));
        }
    }
    let tb_ref = compound
        .tb_row()
        .map(|r| r.tb_k)
        .or_else(|| reference.t_at(ATM_PA));
    out.tb_reference_k = tb_ref;
    if let (Some(tr), Some(tf)) = (tb_ref, fitted.t_at(ATM_PA)) {
        let d = tf - tr;
        out.tb_diff_k = Some(d);
        let u = fitted.t_uncertainty_k(ATM_PA).unwrap_or(0.0);
        let allow = ((1.96 * u).powi(2) + tol.tb_k.powi(2)).sqrt();
        if d.abs() > allow {
            out.findings.push(Finding::new(
            ReferenceCode::ReferenceTbDisagrees,
                format!(
                    "The fitted normal boiling point {:.2} K differs from the reference {:.2} K for {} by {:+.2} K, more than the {:.2} K allowed.",
                    tf, tr, compound.name, d, allow
                ),
            ));
        }
    }
    out
}

/// Fitted Tb against a structure estimate: a finding when the fitted value
/// lies outside the estimate's own calibrated 90 % prediction interval
/// `pi90_k` (and the message says when it is also beyond three times the
/// method's typical error for the structure).
pub fn compare_structure(
    fitted_tb_k: f64,
    estimate_tb_k: f64,
    pi90_k: (f64, f64),
    typical_error_k: f64,
    smiles: &str,
) -> Option<Finding> {
    let d = fitted_tb_k - estimate_tb_k;
    let (lo, hi) = pi90_k;
    let outside = fitted_tb_k < lo || fitted_tb_k > hi;
    outside.then(|| {
        let far = if d.abs() > 3.0 * typical_error_k {
            format!(", and more than three times the method's typical error ({typical_error_k:.1} K)")
        } else {
            String::new()
        };
        Finding::new(
            ReferenceCode::StructureTbDisagrees,
            format!(
                "The fitted normal boiling point {fitted_tb_k:.1} K lies outside the structure estimate's 90 % interval {lo:.1}–{hi:.1} K for {smiles} (estimate {estimate_tb_k:.1} K, difference {d:+.1} K{far}); check the data's units and the structure."
            ),
        )
    })
}
