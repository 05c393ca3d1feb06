//! Fit result files (`ebullio fit --format json`): one fit or a list of them.

use super::error::{Locus, ReadError, ReadErrorKind};
use super::source::{decode_text, read_bytes};
use crate::fit::FitReport;
use std::path::Path;

/// Read a fit result file: the JSON `ebullio fit --format json` writes, either one fit
/// object or a list of them (one per compound). An error names the file and the line and
/// column where the JSON stopped making sense.
pub fn read_fit_reports(path: &Path) -> Result<Vec<FitReport>, ReadError> {
    let bytes = read_bytes(path)?;
    let text = decode_text(path, &bytes)?;
    let bad = |e: serde_json::Error| {
        // serde_json's message ends with "at line L column C".
        ReadError::file(
            path,
            ReadErrorKind::FitFile,
            format!("not a fit result (expected the JSON of `ebullio fit --format json`): {e}"),
        )
        .at_line(e.line().max(1) as u64, Locus::Line)
    };
    // Parsed straight from the text (not through a Value) so errors keep their position.
    let reports: Vec<FitReport> = if text.trim_start().starts_with('[') {
        serde_json::from_str(text).map_err(bad)?
    } else {
        vec![serde_json::from_str(text).map_err(bad)?]
    };
    if reports.is_empty() {
        return Err(ReadError::file(
            path,
            ReadErrorKind::FitFile,
            "the fit result list is empty",
        ));
    }
    Ok(reports)
}

/// Pick one fit from a file's list: the only one, or the one whose compound is `name`
/// (ignoring case). The error lists the compounds there are.
pub fn pick_fit<'a>(
    path: &Path,
    reports: &'a [FitReport],
    name: Option<&str>,
) -> Result<&'a FitReport, ReadError> {
    let names = || {
        reports
            .iter()
            .map(|r| r.compound.clone().unwrap_or_else(|| "(unnamed)".into()))
            .collect::<Vec<_>>()
            .join(", ")
    };
    match name {
        None if reports.len() == 1 => Ok(&reports[0]),
        None => Err(ReadError::file(
            path,
            ReadErrorKind::FitFile,
            format!(
                "holds {} fits ({}); name one with --compound",
                reports.len(),
                names()
            ),
        )),
        Some(n) => reports
            .iter()
            .find(|r| {
                r.compound
                    .as_deref()
                    .is_some_and(|c| c.trim().eq_ignore_ascii_case(n.trim()))
            })
            .ok_or_else(|| {
                ReadError::file(
                    path,
                    ReadErrorKind::FitFile,
                    format!("no fit for compound '{n}' (compounds: {})", names()),
                )
            }),
    }
}

/// Whether a fit result file holds a binary VLE fit (the JSON of `ebullio fit` on x1, y1 data).
pub fn is_binary_fit(path: &Path) -> bool {
    read_bytes(path)
        .ok()
        .and_then(|b| serde_json::from_slice::<serde_json::Value>(&b).ok())
        .is_some_and(|v| v.get("model_spec").is_some() && v.get("gamma_infinity").is_some())
}

/// Read a binary VLE fit result (`ebullio fit DATA --format json` on x1, y1, T or p data).
pub fn read_binary_fit(path: &Path) -> Result<crate::mixture::fit::BinaryFitReport, ReadError> {
    let bytes = read_bytes(path)?;
    let text = decode_text(path, &bytes)?;
    serde_json::from_str(text).map_err(|e| {
        ReadError::file(
            path,
            ReadErrorKind::FitFile,
            format!(
                "not a binary VLE fit (expected the JSON of `ebullio fit` on x1, y1 data): {e}"
            ),
        )
        .at_line(e.line().max(1) as u64, Locus::Line)
    })
}
