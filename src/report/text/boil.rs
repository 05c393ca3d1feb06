//! The `boil` command's terminal table and CSV.

use super::{cell, Csv};

pub use crate::boiling::BoilReport;

/// The results as CSV. A value that could not be computed is an empty cell (the
/// error column says why), never NaN text.
pub fn csv(rep: &BoilReport) -> Result<String, csv::Error> {
    let mut w = Csv::new([
        "p_pa",
        "t_k",
        "ci95_low_k",
        "ci95_high_k",
        "ci95_low_pa",
        "ci95_high_pa",
        "extrapolated",
        "error",
    ]);
    for r in &rep.results {
        w.row([
            cell(Some(r.p_pa)),
            cell(Some(r.t_k)),
            cell(r.ci95_low_k),
            cell(r.ci95_high_k),
            cell(r.ci95_low_pa),
            cell(r.ci95_high_pa),
            r.extrapolated.to_string(),
            r.error.clone(),
        ]);
    }
    w.finish()
}

pub use crate::boiling::excluded_note;

/// The readable report.
pub fn table(rep: &BoilReport) -> String {
    use crate::units::{pa_to_mbar, CELSIUS_OFFSET};
    let mut s = format!("Source: {}\n\n", rep.source);
    let vapor = rep.mode == "vapor-pressure";
    // The interval is in the unit of the computed quantity: °C for a boiling
    // temperature, mbar for a vapor pressure.
    if vapor {
        s.push_str("   t / degC     p / mbar    95 % interval / mbar   note\n");
    } else {
        s.push_str("   p / mbar     t / degC    95 % interval / degC   note\n");
    }
    let num = |x: f64, w: usize, d: usize| {
        if x.is_finite() {
            format!("{x:w$.d$}")
        } else {
            format!("{:>w$}", "-")
        }
    };
    for r in &rep.results {
        let ci = match (r.ci95_low_k, r.ci95_high_k, r.ci95_low_pa, r.ci95_high_pa) {
            (Some(a), Some(b), _, _) => {
                format!("{:8.2} .. {:8.2}", a - CELSIUS_OFFSET, b - CELSIUS_OFFSET)
            }
            (_, _, Some(a), Some(b)) => {
                format!("{:8.3} .. {:8.3}", pa_to_mbar(a), pa_to_mbar(b))
            }
            _ => "-".into(),
        };
        let note = if !r.error.is_empty() {
            r.error.clone()
        } else if r.extrapolated {
            "extrapolated".into()
        } else {
            String::new()
        };
        let (first, second) = if vapor {
            (
                num(r.t_k - CELSIUS_OFFSET, 11, 2),
                num(pa_to_mbar(r.p_pa), 12, 3),
            )
        } else {
            (
                num(pa_to_mbar(r.p_pa), 11, 3),
                num(r.t_k - CELSIUS_OFFSET, 12, 2),
            )
        };
        s.push_str(&format!("{first} {second}    {ci:22} {note}\n"));
    }
    for n in &rep.notes {
        s.push_str(&format!("\nNote: {n}"));
    }
    if !rep.cautions.is_empty() {
        s.push_str("\n\nVacuum-distillation cautions:\n");
        for c in &rep.cautions {
            s.push_str(&format!("  - {c}\n"));
        }
    } else {
        s.push('\n');
    }
    s
}
