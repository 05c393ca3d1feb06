//! The `reference` command's terminal tables and CSV.

use super::{cell, Csv};
use crate::reference::Compound;
use crate::vapor::Curve;

/// One Antoine row of a reference compound, as shown.
#[derive(serde::Serialize)]
pub struct AntoineOut {
    /// Antoine A.
    #[serde(rename = "A")]
    pub a: f64,
    /// Antoine B.
    #[serde(rename = "B")]
    pub b: f64,
    /// Antoine C.
    #[serde(rename = "C")]
    pub c: f64,
    /// The constants' convention (log base, pressure unit, temperature unit).
    pub convention: String,
    /// Validity range, K.
    pub t_range_k: Option<(f64, f64)>,
    /// The normal boiling point the curve gives, K.
    pub tb_implied_k: Option<f64>,
    /// Standard uncertainty in p assumed for the curve, %.
    pub u_p_pct: f64,
    /// The published source.
    pub source: String,
    /// Notes on the row.
    pub note: String,
    /// The bundled file the row is in.
    pub file: String,
    /// Its line.
    pub line: usize,
}

/// The stored reference equation of a compound, as shown.
#[derive(serde::Serialize)]
pub struct EquationOut {
    /// Stored form (Wagner or Chebyshev).
    pub form: &'static str,
    /// Critical temperature, K.
    pub tc_k: f64,
    /// Critical pressure, Pa.
    pub pc_pa: f64,
    /// Acentric factor.
    pub omega: f64,
    /// Triple-point temperature, K.
    pub t_triple_k: f64,
    /// Validity range, K.
    pub t_range_k: (f64, f64),
    /// Largest deviation of the stored form from the equation, % in p.
    pub max_dev_pct: f64,
    /// The equation's stated uncertainty in p, %, where its authors state one.
    pub stated_u_p_pct: Option<f64>,
    /// What the stated uncertainty covers.
    pub stated_u_note: String,
    /// Standard uncertainty in p assumed for the curve, %.
    pub u_p_pct: f64,
    /// The published equation of state.
    pub citation: String,
    /// The bundled file the row is in.
    pub file: String,
    /// Its line.
    pub line: usize,
}

/// A reference compound with every value and its source, as shown.
#[derive(serde::Serialize)]
pub struct CompoundOut {
    /// Preferred name.
    pub name: String,
    /// Other names.
    pub synonyms: Vec<String>,
    /// Structure (SMILES).
    pub smiles: Option<String>,
    /// CAS registry number.
    pub cas: Option<String>,
    /// Where the CAS number comes from.
    pub cas_source: Option<String>,
    /// Normal boiling point, K.
    pub tb_k: Option<f64>,
    /// Its source, file and line.
    pub tb_source: Option<String>,
    /// Source of the best vapor-pressure curve.
    pub reference_curve: Option<String>,
    /// Its standard uncertainty in p, %.
    pub reference_curve_u_p_pct: Option<f64>,
    /// Notes on it.
    pub reference_curve_note: Option<String>,
    /// The stored reference equation, when there is one.
    pub equation: Option<EquationOut>,
    /// Every Antoine row.
    pub antoine: Vec<AntoineOut>,
}

/// Everything the reference holds on `c`, with sources.
pub fn describe(c: &Compound) -> CompoundOut {
    let best = c.best_curve();
    CompoundOut {
        name: c.name.clone(),
        synonyms: c.synonyms.clone(),
        smiles: c.smiles.clone(),
        cas: c.cas.clone(),
        cas_source: c.cas_source().map(str::to_string),
        tb_k: c.tb_row().map(|r| r.tb_k),
        tb_source: c
            .tb_row()
            .map(|r| format!("{} ({}, line {})", r.source, r.origin.file, r.origin.line)),
        reference_curve: best.as_ref().map(|r| r.source.clone()),
        reference_curve_u_p_pct: best.as_ref().map(|r| 100.0 * r.u_p_rel),
        reference_curve_note: best
            .as_ref()
            .map(|r| r.note.clone())
            .filter(|n| !n.is_empty()),
        equation: c.equation.as_ref().map(|e| EquationOut {
            form: e.form.name(),
            tc_k: e.tc_k,
            pc_pa: e.pc_pa,
            omega: e.omega,
            t_triple_k: e.t_triple_k,
            t_range_k: e.range_k,
            max_dev_pct: 100.0 * e.max_dev_rel,
            stated_u_p_pct: e.stated_u_p_rel.map(|u| 100.0 * u),
            stated_u_note: e.stated_u_note.clone(),
            u_p_pct: 100.0 * e.u_p_rel(),
            citation: e.citation.clone(),
            file: e.origin.file.clone(),
            line: e.origin.line,
        }),
        antoine: c
            .antoine
            .iter()
            .map(|r| AntoineOut {
                a: r.constants.a,
                b: r.constants.b,
                c: r.constants.c,
                convention: r.constants.convention.to_string(),
                t_range_k: r.constants.range_k,
                tb_implied_k: r.constants.t_at(crate::units::ATM_PA),
                u_p_pct: 100.0 * r.u_p_rel,
                source: r.source.clone(),
                note: r.note.clone(),
                file: r.origin.file.clone(),
                line: r.origin.line,
            })
            .collect(),
    }
}

/// The one-line-per-compound list.
pub fn list_table(list: &[CompoundOut], user: Option<&str>) -> String {
    let mut s = format!("{} reference compounds", list.len());
    if let Some(u) = user {
        s.push_str(&format!(
            " (bundled, plus your table {u}, which takes precedence)"
        ));
    }
    s.push_str("\n\n  name                                   CAS          Tb / K   curve (u(p) %)           SMILES\n");
    for c in list {
        let curve = match (&c.equation, c.reference_curve_u_p_pct) {
            (Some(_), Some(u)) if c.name != "water" => format!("ref. equation ({u:.2})"),
            (_, Some(u)) if c.name == "water" => format!("IAPWS-IF97 ({u:.2})"),
            (_, Some(u)) if !c.antoine.is_empty() => format!("Antoine ({u:.1})"),
            (_, Some(u)) => format!("Lee-Kesler ({u:.0})"),
            _ => "-".into(),
        };
        let mem = if c.cas_source.as_deref() == Some("from memory") {
            "*"
        } else {
            " "
        };
        s.push_str(&format!(
            "  {:38} {:>11}{mem} {:>7}   {:24} {}\n",
            c.name,
            c.cas.as_deref().unwrap_or("-"),
            c.tb_k.map_or("-".into(), |t| format!("{t:.2}")),
            curve,
            c.smiles.as_deref().unwrap_or("")
        ));
    }
    s.push_str("\n  * CAS number from memory (check digit validated).\n");
    s
}

/// The list as CSV.
pub fn list_csv(list: &[CompoundOut]) -> Result<String, csv::Error> {
    let mut w = Csv::new([
        "name",
        "smiles",
        "cas",
        "cas_source",
        "tb_k",
        "reference_curve_u_p_pct",
        "antoine_rows",
        "synonyms",
    ]);
    for c in list {
        w.row([
            c.name.clone(),
            c.smiles.clone().unwrap_or_default(),
            c.cas.clone().unwrap_or_default(),
            c.cas_source.clone().unwrap_or_default(),
            cell(c.tb_k),
            c.reference_curve_u_p_pct
                .map_or(String::new(), |u| format!("{u:.4}")),
            c.antoine.len().to_string(),
            c.synonyms.join("; "),
        ]);
    }
    w.finish()
}

/// One compound's Antoine rows as CSV.
pub fn show_csv(c: &CompoundOut) -> Result<String, csv::Error> {
    let mut w = Csv::new([
        "name",
        "A",
        "B",
        "C",
        "convention",
        "t_min_k",
        "t_max_k",
        "tb_implied_k",
        "u_p_pct",
        "source",
        "note",
        "file",
        "line",
    ]);
    for r in &c.antoine {
        w.row([
            c.name.clone(),
            cell(Some(r.a)),
            cell(Some(r.b)),
            cell(Some(r.c)),
            r.convention.clone(),
            cell(r.t_range_k.map(|t| t.0)),
            cell(r.t_range_k.map(|t| t.1)),
            cell(r.tb_implied_k),
            cell(Some(r.u_p_pct)),
            r.source.clone(),
            r.note.clone(),
            r.file.clone(),
            r.line.to_string(),
        ]);
    }
    w.finish()
}

/// One compound in full, every value with its source.
pub fn show_table(c: &CompoundOut) -> String {
    let mut s = format!("{}\n", c.name);
    if !c.synonyms.is_empty() {
        s.push_str(&format!("  also:      {}\n", c.synonyms.join(", ")));
    }
    s.push_str(&format!(
        "  SMILES:    {}\n",
        c.smiles.as_deref().unwrap_or("-")
    ));
    s.push_str(&format!(
        "  CAS:       {}{}\n",
        c.cas.as_deref().unwrap_or("-"),
        c.cas_source
            .as_deref()
            .map_or(String::new(), |x| format!("  [{x}]"))
    ));
    match (c.tb_k, &c.tb_source) {
        (Some(t), Some(src)) => s.push_str(&format!("  Tb:        {t:.2} K  [{src}]\n")),
        _ => s.push_str("  Tb:        -\n"),
    }
    s.push_str(&format!(
        "  reference curve: {}\n",
        c.reference_curve.as_deref().unwrap_or("none")
    ));
    if let Some(u) = c.reference_curve_u_p_pct {
        s.push_str(&format!(
            "    standard uncertainty in p: {u:.2} %{}\n",
            c.reference_curve_note
                .as_deref()
                .map_or(String::new(), |n| format!(" ({n})"))
        ));
    }
    if let Some(e) = &c.equation {
        s.push_str(&format!(
            "\n  Reference equation: Tc {:.3} K, pc {:.4} MPa, omega {:.4}, triple point {:.2} K\n    stored {} form over {:.2}-{:.2} K, largest deviation from the equation {:.4} % in p\n    {} ({}, line {})\n",
            e.tc_k,
            e.pc_pa / 1e6,
            e.omega,
            e.t_triple_k,
            e.form,
            e.t_range_k.0,
            e.t_range_k.1,
            e.max_dev_pct,
            e.citation,
            e.file,
            e.line
        ));
    }
    for (i, r) in c.antoine.iter().enumerate() {
        s.push_str(&format!(
            "\n  Antoine {}: A = {}, B = {}, C = {} ({})\n",
            i + 1,
            r.a,
            r.b,
            r.c,
            r.convention
        ));
        match r.t_range_k {
            Some((lo, hi)) => s.push_str(&format!("    range {lo:.2}-{hi:.2} K")),
            None => s.push_str("    range not stated"),
        }
        if let Some(t) = r.tb_implied_k {
            s.push_str(&format!("; gives Tb {t:.2} K"));
        }
        s.push_str(&format!("; assumed u(p) {:.1} %\n", r.u_p_pct));
        s.push_str(&format!(
            "    source: {} ({}, line {})\n",
            r.source, r.file, r.line
        ));
        if !r.note.is_empty() {
            s.push_str(&format!("    note: {}\n", r.note));
        }
    }
    s
}
