//! Checks before a fit: the equation asked for, usable points, the exclusion request,
//! and data at or above the critical point.

use super::build::SAME_T_REL;
use super::equation_fit::Point;
use super::error::*;
use super::options::{Exclude, FitOptions, ModelSelection};
use crate::units::tidy;
use crate::vapor::{Antoine, Equation};
use crate::vapor::{Clapeyron, Riedel, Wagner};

/// Temperatures closer than this are "the same" for an exclusion by temperature, K.
const EXCLUDE_T_TOL_K: f64 = 0.005;

pub(super) fn equation_for(sel: ModelSelection, opts: &FitOptions) -> Result<Equation, FitError> {
    Ok(match sel {
        ModelSelection::Antoine | ModelSelection::Auto => Equation::Antoine(Antoine),
        ModelSelection::Clapeyron => Equation::Clapeyron(Clapeyron),
        ModelSelection::Riedel => Equation::Riedel(Riedel),
        ModelSelection::Wagner => {
            let (tc_k, pc_pa) = opts.critical.ok_or_else(|| {
                FitError::Critical(
                    "the Wagner equation needs the critical temperature and pressure".into(),
                )
            })?;
            if !(tc_k > 0.0 && pc_pa > 0.0 && tc_k.is_finite() && pc_pa.is_finite()) {
                return Err(FitError::Critical(format!(
                    "Tc = {tc_k} K and pc = {pc_pa} Pa must be positive"
                )));
            }
            Equation::Wagner(Wagner { tc_k, pc_pa })
        }
    })
}

pub(super) fn validate(
    points: &[Point],
    lines: &[u64],
    k: usize,
    model: &str,
) -> Result<(), FitError> {
    for (i, p) in points.iter().enumerate() {
        let line = lines.get(i).copied().unwrap_or(0);
        if !(p.t_k.is_finite() && p.t_k > 0.0 && p.p_pa.is_finite() && p.p_pa > 0.0) {
            return Err(FitError::InvalidPoint {
                index: i,
                line,
                t_k: p.t_k,
                p_pa: p.p_pa,
            });
        }
        let bad = |u: Option<f64>| u.is_some_and(|u| !(u.is_finite() && u >= 0.0));
        let both_zero = p.u_t_k.unwrap_or(0.0) == 0.0 && p.u_p_pa.unwrap_or(0.0) == 0.0;
        if bad(p.u_t_k) || bad(p.u_p_pa) || ((p.u_t_k.is_some() || p.u_p_pa.is_some()) && both_zero)
        {
            return Err(FitError::InvalidUncertainty { index: i, line });
        }
    }
    let n = points.len();
    if n < k + 2 {
        return Err(FitError::TooFewPoints {
            n,
            k,
            need: k + 2,
            model: model.to_string(),
        });
    }
    let mut ts: Vec<f64> = points.iter().map(|p| p.t_k).collect();
    ts.sort_by(f64::total_cmp);
    ts.dedup_by(|a, b| (*a - *b).abs() <= SAME_T_REL * b.abs());
    if ts.len() < k {
        return Err(FitError::TooFewTemperatures {
            distinct: ts.len(),
            n,
            need: k,
        });
    }
    Ok(())
}

/// The 0-based indices `exclude` names, each with the rule that named it;
/// a rule that names no point is an error (a typo must not pass silently).
pub(super) fn excluded_indices(
    points: &[Point],
    lines: &[u64],
    exclude: &[Exclude],
) -> Result<Vec<(usize, Exclude)>, FitError> {
    let mut out: Vec<(usize, Exclude)> = Vec::new();
    for &e in exclude {
        let hits: Vec<usize> = match e {
            Exclude::Point(n) => (n >= 1 && n <= points.len())
                .then_some(n - 1)
                .into_iter()
                .collect(),
            Exclude::Line(l) => (0..points.len())
                .filter(|&i| lines.get(i) == Some(&l))
                .collect(),
            Exclude::TemperatureK(t) => (0..points.len())
                .filter(|&i| (points[i].t_k - t).abs() <= EXCLUDE_T_TOL_K)
                .collect(),
        };
        if hits.is_empty() {
            let why = match e {
                Exclude::Point(_) => format!("the data have points 1 to {}", points.len()),
                Exclude::Line(_) if lines.is_empty() => "the points carry no line numbers".into(),
                Exclude::Line(_) => format!(
                    "no point is on that line (the points are on lines {} to {})",
                    lines.iter().min().unwrap_or(&0),
                    lines.iter().max().unwrap_or(&0)
                ),
                Exclude::TemperatureK(t) => {
                    let near = (0..points.len())
                        .min_by(|&a, &b| {
                            (points[a].t_k - t)
                                .abs()
                                .total_cmp(&(points[b].t_k - t).abs())
                        })
                        .map(|i| {
                            format!(
                                "; the nearest is point {} at {} K",
                                i + 1,
                                tidy(points[i].t_k)
                            )
                        })
                        .unwrap_or_default();
                    format!("no point within {EXCLUDE_T_TOL_K} K of it{near}")
                }
            };
            return Err(FitError::Exclude {
                what: e.to_string(),
                why,
            });
        }
        for i in hits {
            if !out.iter().any(|(j, _)| *j == i) {
                out.push((i, e));
            }
        }
    }
    out.sort_by_key(|(i, _)| *i);
    Ok(out)
}

pub(super) fn check_critical(eq: &Equation, points: &[Point]) -> Result<(), FitError> {
    if let Equation::Wagner(w) = eq {
        if let Some(p) = points.iter().find(|p| p.t_k >= w.tc_k) {
            return Err(FitError::Critical(format!(
                "a point at {} K is at or above Tc = {} K",
                p.t_k, w.tc_k
            )));
        }
    }
    Ok(())
}
