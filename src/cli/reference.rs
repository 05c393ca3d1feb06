//! `ebullio reference`: list the bundled reference compounds, or show one with every source.

use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::reference::{Compound, Library};
use ebullio::vapor::Curve;
use std::path::PathBuf;

/// List the reference compounds, or show one (by name, synonym or CAS number,
/// or --smiles) with every value and its source.
///
/// Example: ebullio reference "ethyl alcohol"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// Compound name, synonym or CAS number; omit to list.
    pub query: Option<String>,
    /// Find by structure (any valid SMILES spelling).
    #[arg(long)]
    pub smiles: Option<String>,
    /// List only compounds whose name or synonym contains TEXT.
    #[arg(long, value_name = "TEXT")]
    pub filter: Option<String>,
    /// Show every compound in full (every value and its source), not the one-line list.
    #[arg(long, conflicts_with_all = ["query", "smiles"])]
    pub all: bool,
    /// Your own reference table (CSV, same columns as the bundled ones); takes precedence.
    #[arg(long, value_name = "FILE")]
    pub reference_table: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

#[derive(serde::Serialize)]
struct AntoineOut {
    #[serde(rename = "A")]
    a: f64,
    #[serde(rename = "B")]
    b: f64,
    #[serde(rename = "C")]
    c: f64,
    convention: String,
    t_range_k: Option<(f64, f64)>,
    tb_implied_k: Option<f64>,
    u_p_pct: f64,
    source: String,
    note: String,
    file: String,
    line: usize,
}

#[derive(serde::Serialize)]
struct EquationOut {
    form: &'static str,
    tc_k: f64,
    pc_pa: f64,
    omega: f64,
    t_triple_k: f64,
    t_range_k: (f64, f64),
    max_dev_pct: f64,
    stated_u_p_pct: Option<f64>,
    stated_u_note: String,
    u_p_pct: f64,
    citation: String,
    file: String,
    line: usize,
}

#[derive(serde::Serialize)]
struct CompoundOut {
    name: String,
    synonyms: Vec<String>,
    smiles: Option<String>,
    cas: Option<String>,
    cas_source: Option<String>,
    tb_k: Option<f64>,
    tb_source: Option<String>,
    reference_curve: Option<String>,
    reference_curve_u_p_pct: Option<f64>,
    reference_curve_note: Option<String>,
    equation: Option<EquationOut>,
    antoine: Vec<AntoineOut>,
}

fn describe(c: &Compound) -> CompoundOut {
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
                tb_implied_k: r.constants.t_at(ebullio::units::ATM_PA),
                u_p_pct: 100.0 * r.u_p_rel,
                source: r.source.clone(),
                note: r.note.clone(),
                file: r.origin.file.clone(),
                line: r.origin.line,
            })
            .collect(),
    }
}

fn csv_field(s: &str) -> String {
    format!("\"{}\"", s.replace('"', "\"\""))
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let owned;
    let lib = match &args.reference_table {
        Some(p) => {
            let text =
                std::fs::read_to_string(p).with_context(|| format!("reading {}", p.display()))?;
            owned = Library::with_user_table(&p.display().to_string(), &text)?;
            &owned
        }
        None => Library::bundled(),
    };
    let one = match (&args.query, &args.smiles) {
        (Some(_), Some(_)) => {
            return Err(InputError("give a name/CAS or --smiles, not both".into()).into())
        }
        (Some(q), None) => Some(lib.find(q)?),
        (None, Some(s)) => Some(lib.find_smiles(s)?),
        (None, None) => None,
    };
    let text = match one {
        Some(c) => show(&describe(c), args.out.format())?,
        None if args.all => {
            let all: Vec<CompoundOut> = lib.compounds().iter().map(describe).collect();
            match args.out.format() {
                Format::Json => serde_json::to_string_pretty(&all)? + "\n",
                f => {
                    let mut s = String::new();
                    for (i, c) in all.iter().enumerate() {
                        let one = show(c, f)?;
                        // CSV: one header for all compounds.
                        let body = if f == Format::Csv && i > 0 {
                            one.split_once('\n').map_or("", |(_, b)| b).to_string()
                        } else {
                            one
                        };
                        s.push_str(&body);
                        if f == Format::Table {
                            s.push('\n');
                        }
                    }
                    s
                }
            }
        }
        None => {
            let f = args.filter.as_deref().map(str::to_lowercase);
            let list: Vec<CompoundOut> = lib
                .compounds()
                .iter()
                .filter(|c| {
                    f.as_deref().is_none_or(|f| {
                        c.name.to_lowercase().contains(f)
                            || c.synonyms.iter().any(|s| s.to_lowercase().contains(f))
                    })
                })
                .map(describe)
                .collect();
            list_text(&list, args.out.format(), lib.user_table.as_deref())?
        }
    };
    args.out.emit(&text, &[])?;
    Ok(Outcome::Success)
}

fn list_text(list: &[CompoundOut], f: Format, user: Option<&str>) -> anyhow::Result<String> {
    Ok(match f {
        Format::Json => super::common::json_text(list)? + "\n",
        Format::Csv => {
            let mut s = String::from(
                "name,smiles,cas,cas_source,tb_k,reference_curve_u_p_pct,antoine_rows,synonyms\n",
            );
            for c in list {
                s.push_str(&format!(
                    "{},{},{},{},{},{},{},{}\n",
                    csv_field(&c.name),
                    csv_field(c.smiles.as_deref().unwrap_or("")),
                    c.cas.as_deref().unwrap_or(""),
                    csv_field(c.cas_source.as_deref().unwrap_or("")),
                    c.tb_k.map_or(String::new(), |t| t.to_string()),
                    c.reference_curve_u_p_pct
                        .map_or(String::new(), |u| format!("{u:.4}")),
                    c.antoine.len(),
                    csv_field(&c.synonyms.join("; "))
                ));
            }
            s
        }
        Format::Table => {
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
    })
}

fn show(c: &CompoundOut, f: Format) -> anyhow::Result<String> {
    Ok(match f {
        Format::Json => super::common::json_text(c)? + "\n",
        Format::Csv => {
            let mut s = String::from(
                "name,A,B,C,convention,t_min_k,t_max_k,tb_implied_k,u_p_pct,source,note,file,line\n",
            );
            for r in &c.antoine {
                let (lo, hi) = r
                    .t_range_k
                    .map_or((String::new(), String::new()), |(a, b)| {
                        (a.to_string(), b.to_string())
                    });
                s.push_str(&format!(
                    "{},{},{},{},{},{},{},{},{},{},{},{},{}\n",
                    csv_field(&c.name),
                    r.a,
                    r.b,
                    r.c,
                    r.convention,
                    lo,
                    hi,
                    r.tb_implied_k.map_or(String::new(), |t| t.to_string()),
                    r.u_p_pct,
                    csv_field(&r.source),
                    csv_field(&r.note),
                    csv_field(&r.file),
                    r.line
                ));
            }
            s
        }
        Format::Table => {
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
    })
}
