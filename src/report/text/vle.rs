//! The `vle` command's terminal report and diagram CSV.

use super::{cell, Csv};
use crate::mixture::*;
use crate::units::CELSIUS_OFFSET;
use serde::Serialize;
use std::fmt::Write as _;

fn c(t_k: f64) -> f64 {
    t_k - CELSIUS_OFFSET
}

/// Bubble and dew points at one composition.
#[derive(Debug, Serialize)]
pub struct AtX1 {
    /// Liquid mole fraction of component 1.
    pub x1: f64,
    /// Bubble temperature, K (isobaric).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub bubble_t_k: Option<f64>,
    /// Bubble pressure, Pa (isothermal).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub bubble_p_pa: Option<f64>,
    /// First vapor at the bubble point.
    pub bubble_y1: f64,
    /// Liquid phases at the bubble point (2 inside the predicted split).
    pub liquids: u8,
    /// Dew temperature of a vapor with y1 = x1, K (isobaric).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub dew_t_k: Option<f64>,
    /// Dew pressure of a vapor with y1 = x1, Pa (isothermal).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub dew_p_pa: Option<f64>,
    /// First liquid at the dew point.
    pub dew_x1: Option<f64>,
}

/// The `vle` result: the study and, when asked, the points at one composition.
#[derive(Debug, Serialize)]
pub struct VleOutput {
    /// The diagram, azeotropes, liquid split and findings.
    #[serde(flatten)]
    pub study: VleStudy,
    /// Bubble and dew points at the asked composition.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub at_x1: Option<AtX1>,
}

/// The diagram as CSV, one row per liquid composition.
pub fn csv(s: &VleStudy) -> Result<String, csv::Error> {
    let iso = s.pressure_pa.is_some();
    let mut w = Csv::new([
        "x1",
        "y1",
        if iso { "t_k" } else { "p_pa" },
        "gamma1",
        "gamma2",
        "alpha12",
        "liquids",
    ]);
    for r in &s.diagram {
        let v = if iso { r.t_k } else { r.p_pa };
        w.row([
            cell(Some(r.x1)),
            cell(Some(r.y1)),
            cell(v),
            cell(Some(r.gamma1)),
            cell(Some(r.gamma2)),
            cell(Some(r.alpha12)),
            r.liquids.to_string(),
        ]);
    }
    w.finish()
}

/// The readable report.
pub fn table(o: &VleOutput) -> String {
    let s = &o.study;
    let mut t = String::new();
    let iso = s.pressure_pa.is_some();
    let names: Vec<&str> = s.components.iter().map(|c| c.name.as_str()).collect();
    let _ = match (s.pressure_pa, s.temperature_k) {
        (Some(p), _) => writeln!(
            t,
            "{} (1) / {} (2) at {:.3} kPa, activity model {}",
            names[0],
            names[1],
            p / 1000.0,
            s.activity_model
        ),
        (_, Some(tk)) => writeln!(
            t,
            "{} (1) / {} (2) at {:.2} °C, activity model {}",
            names[0],
            names[1],
            c(tk),
            s.activity_model
        ),
        _ => Ok(()),
    };
    for (i, comp) in s.components.iter().enumerate() {
        let _ = writeln!(
            t,
            "  {} {}{}: vapor pressure from {}",
            i + 1,
            comp.name,
            comp.smiles
                .as_deref()
                .map(|s| format!(" ({s})"))
                .unwrap_or_default(),
            comp.vapor_pressure_source
        );
    }
    let _ = writeln!(t);
    let _ = writeln!(
        t,
        "{:>7} {:>8} {:>9} {:>9} {:>9} {:>8}",
        "x1",
        "y1",
        if iso { "t/°C" } else { "p/kPa" },
        "γ1",
        "γ2",
        "α12"
    );
    let n = s.diagram.len();
    let step = ((n - 1) / 20).max(1);
    for (j, r) in s.diagram.iter().enumerate() {
        if j % step != 0 && j != n - 1 {
            continue;
        }
        let v = if iso {
            c(r.t_k.unwrap_or(f64::NAN))
        } else {
            r.p_pa.unwrap_or(f64::NAN) / 1000.0
        };
        let _ = writeln!(
            t,
            "{:>7.3} {:>8.4} {:>9.2} {:>9.4} {:>9.4} {:>8.3}{}",
            r.x1,
            r.y1,
            v,
            r.gamma1,
            r.gamma2,
            r.alpha12,
            if r.liquids == 2 { "  two liquids" } else { "" }
        );
    }
    if step > 1 {
        let _ = writeln!(
            t,
            "(every {step}th of {n} points; all of them with --format csv or json)"
        );
    }
    let _ = writeln!(t);
    if s.azeotropes.is_empty() {
        let _ = writeln!(t, "Azeotropes: none predicted.");
    } else {
        let _ = writeln!(t, "Azeotropes (predicted; confirm with mixture data):");
        for a in &s.azeotropes {
            let where_ = match (a.t_k, a.p_pa) {
                (Some(tk), _) => format!("{:.2} °C", c(tk)),
                (_, Some(p)) => format!("{:.3} kPa", p / 1000.0),
                _ => String::new(),
            };
            let _ = writeln!(t, "  {:<16} x1 = {:.3} at {where_}", a.kind_str(), a.x1);
        }
    }
    if !s.azeotrope_pressure_shift.is_empty() {
        let _ = writeln!(t, "  with pressure:");
        for r in &s.azeotrope_pressure_shift {
            let _ = writeln!(
                t,
                "    {:>10.2} kPa  {}{}",
                r.p_pa / 1000.0,
                match (r.x1, r.t_k) {
                    (Some(x), Some(tk)) => format!("x1 = {x:.3} at {:.2} °C", c(tk)),
                    _ => "no azeotrope".into(),
                },
                if r.extrapolated {
                    "  (curve extrapolated)"
                } else {
                    ""
                }
            );
        }
    }
    let ls = &s.liquid_split;
    if ls.predicted {
        let _ = writeln!(
            t,
            "Liquid split: two liquids between x1 = {:.4} and {:.4}{}",
            ls.x1_low.unwrap_or(f64::NAN),
            ls.x1_high.unwrap_or(f64::NAN),
            match (ls.t_k, ls.p_pa) {
                (Some(tk), _) => format!(" at the three-phase point {:.2} °C", c(tk)),
                (_, Some(p)) => format!(" at the three-phase point {:.3} kPa", p / 1000.0),
                _ => String::new(),
            }
        );
    } else {
        let _ = writeln!(t, "Liquid split: none predicted at the boiling point.");
    }
    if let Some(a) = &o.at_x1 {
        let _ = writeln!(t);
        match (a.bubble_t_k, a.bubble_p_pa) {
            (Some(tk), _) => {
                let _ = writeln!(
                    t,
                    "At x1 = {}: bubble point {:.2} °C, first vapor y1 = {:.4}{}",
                    a.x1,
                    c(tk),
                    a.bubble_y1,
                    if a.liquids == 2 { " (two liquids)" } else { "" }
                );
            }
            (_, Some(p)) => {
                let _ = writeln!(
                    t,
                    "At x1 = {}: bubble pressure {:.3} kPa, first vapor y1 = {:.4}{}",
                    a.x1,
                    p / 1000.0,
                    a.bubble_y1,
                    if a.liquids == 2 { " (two liquids)" } else { "" }
                );
            }
            _ => {}
        }
        match (a.dew_t_k, a.dew_p_pa, a.dew_x1) {
            (Some(tk), _, Some(x)) => {
                let _ = writeln!(
                    t,
                    "  a vapor of y1 = {}: dew point {:.2} °C, first liquid x1 = {:.4}",
                    a.x1,
                    c(tk),
                    x
                );
            }
            (_, Some(p), Some(x)) => {
                let _ = writeln!(
                    t,
                    "  a vapor of y1 = {}: dew pressure {:.3} kPa, first liquid x1 = {:.4}",
                    a.x1,
                    p / 1000.0,
                    x
                );
            }
            _ => {}
        }
    }
    let _ = writeln!(t);
    for f in &s.flags {
        let _ = writeln!(t, "{}: {} [{}]", f.severity.as_str(), f.message, f.code);
    }
    let _ = writeln!(t);
    for caution in s.cautions {
        let _ = writeln!(t, "Caution: {caution}");
    }
    t
}
