//! One fit per compound of a measured data set, held against the reference library and
//! checked for plausible labels: what `ebullio fit` and the Python package's `fit` both run,
//! so the two give the same rows by construction.

use super::measured::{fit_set, MeasuredData};
use crate::fit::{FitError, FitOptions, FitReport, Point};
use crate::reference::compare::Tolerances;
use crate::reference::fit_check::{check_fit, check_labels};
use crate::reference::Library;
use rayon::prelude::*;

/// How each fit is held against the reference library (`--compound`, `--smiles`,
/// `--ref-p-tolerance-pct`, `--ref-tb-tolerance-k`).
#[derive(Debug, Clone, Default)]
pub struct FitCheckOptions {
    /// Compare with this reference compound (else each set's `compound` is tried).
    pub compound: Option<String>,
    /// Structure for the reference lookup and the structure estimate (else each set's `smiles`).
    pub smiles: Option<String>,
    /// Allowed differences from the reference.
    pub tolerances: Tolerances,
}

/// One compound's result: its report, or why it could not be fitted. Serialised as
/// `ebullio fit --format json` writes it (a report, or `{compound, error}`).
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
#[serde(untagged)]
pub enum FitRow {
    /// The fit, with reference comparison and findings in its flags.
    Ok(Box<FitReport>),
    /// A compound whose points could not be fitted.
    Failed {
        /// The `compound` value of the set, if any.
        compound: Option<String>,
        /// Why.
        error: String,
    },
}

impl FitRow {
    /// The report, when the fit succeeded.
    pub fn report(&self) -> Option<&FitReport> {
        match self {
            FitRow::Ok(r) => Some(r),
            FitRow::Failed { .. } => None,
        }
    }
}

/// Fit every set of `data` on the thread pool, in input order, calling `step` after each
/// (progress); `describe` words a fit error for the caller's users (which option fixes it). Each fit is compared with the reference and, when the data's units are
/// known, checked for swapped or mislabelled columns. A set that cannot be fitted becomes
/// [`FitRow::Failed`]; the batch never stops on one compound.
///
/// ```
/// use ebullio::table_io::{fit_batch, read_measured_bytes, FitCheckOptions, ReadOptions};
/// // Water's saturation pressures, rounded (steam tables, from memory).
/// let text = "t/degC,p/kPa\n40,7.38\n50,12.35\n60,19.95\n80,47.41\n100,101.3\n";
/// let data = read_measured_bytes("w.csv".as_ref(), text.as_bytes(), &ReadOptions::default()).unwrap();
/// let rows = fit_batch(&data, &Default::default(), &FitCheckOptions::default(), &|e| e.to_string(), &|| {});
/// let tb = rows[0].report().unwrap().normal_boiling_point_k.as_ref().unwrap().value;
/// assert!((tb - 373.1).abs() < 0.5, "{rows:?}");
/// ```
pub fn fit_batch(
    data: &MeasuredData,
    opts: &FitOptions,
    check: &FitCheckOptions,
    describe: &(dyn Fn(&FitError) -> String + Sync),
    step: &(dyn Fn() + Sync),
) -> Vec<FitRow> {
    fit_batch_map(data, opts, check, describe, step, &|row| row)
}

/// [`fit_batch`], with each row handed to `keep` on the worker that fitted it, in input
/// order: a batch that only writes rows (CSV) keeps their text and drops each report
/// where it was made, rather than holding every report until the end.
pub fn fit_batch_map<T: Send>(
    data: &MeasuredData,
    opts: &FitOptions,
    check: &FitCheckOptions,
    describe: &(dyn Fn(&FitError) -> String + Sync),
    step: &(dyn Fn() + Sync),
    keep: &(dyn Fn(FitRow) -> T + Sync),
) -> Vec<T> {
    let lib = Library::bundled();
    data.sets
        .par_iter()
        .map(|set| {
            let row = match fit_set(set, opts) {
                Ok(mut rep) => {
                    let smiles = check.smiles.as_deref().or(set.smiles.as_deref());
                    let chk = check_fit(
                        &mut rep,
                        lib,
                        check.compound.as_deref(),
                        smiles,
                        check.tolerances,
                    );
                    if let Some(units) = data.units {
                        let pts: Vec<Point> = set
                            .points
                            .iter()
                            .map(|p| Point {
                                t_k: p.t_k,
                                p_pa: p.p_pa,
                                u_t_k: p.u_t_k,
                                u_p_pa: p.u_p_pa,
                            })
                            .collect();
                        check_labels(&mut rep, &chk, &pts, units);
                    }
                    FitRow::Ok(Box::new(rep))
                }
                Err(e) => FitRow::Failed {
                    compound: set.compound.clone(),
                    error: describe(&e),
                },
            };
            step();
            keep(row)
        })
        .collect()
}

/// When no compound could be fitted, the error to give (no output is written then):
/// the first compound's reason, naming `source`.
pub fn none_fitted(source: &str, rows: &[FitRow]) -> Option<String> {
    none_fitted_by(
        source,
        rows.iter().map(|r| match r {
            FitRow::Failed { error, .. } => Some(error.as_str()),
            FitRow::Ok(_) => None,
        }),
    )
}

/// [`none_fitted`] from each row's error (`None` for a fitted row), for a batch that kept
/// only its rows' text ([`fit_batch_map`]).
pub fn none_fitted_by<'a>(
    source: &str,
    errors: impl ExactSizeIterator<Item = Option<&'a str>>,
) -> Option<String> {
    let n = errors.len();
    let mut first = None;
    for e in errors {
        let why = e?; // a fitted row: something to write
        first.get_or_insert(why);
    }
    let why = first.unwrap_or("no fit");
    Some(if n > 1 {
        format!("{source}: none of the {n} compounds could be fitted; the first: {why}")
    } else {
        format!("{source}: {why}")
    })
}
