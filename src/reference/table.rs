//! Reading reference tables (bundled or the user's): one CSV reader for all.
//!
//! A table is CSV with a header. Recognised columns (any order, any subset):
//! `compound` (required), `formula`, `cas`, `cas_source`, `smiles`, `tb_k`, `tc_k`,
//! `pc_pa`, `A`, `B`, `C`, `log_base`, `p_unit`, `t_unit`, `t_min`, `t_max` (in `t_unit`),
//! `u_p_pct`, `source_class`, `source`, `note`. A row with `A`, `B`, `C` is an Antoine row;
//! a row with `tb_k` is a boiling-point row; a row may be both. `tc_k` with `pc_pa` on a
//! boiling-point row give a Lee–Kesler curve through Tb where no Antoine row exists.

use super::cas;
use crate::vapor::{AntoineConstants, AntoineConvention};

/// Where a row came from: a bundled file or the user's table, with its line.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Origin {
    /// File name (bundled: `reference-data/NAME`; user: the path given).
    pub file: String,
    /// 1-based line in that file.
    pub line: usize,
    /// True for a user's `--reference-table`.
    pub user: bool,
}

/// An error reading a reference table, naming file, line and column.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum TableError {
    /// A cell that could not be read.
    #[error("{file}, line {line}, column '{column}': '{value}' is not {expected}")]
    Cell {
        /// File.
        file: String,
        /// 1-based line.
        line: usize,
        /// Column heading.
        column: String,
        /// The cell text.
        value: String,
        /// What was expected.
        expected: String,
    },
    /// A required column is missing.
    #[error("{file}: no '{column}' column (a reference table needs 'compound' and either 'tb_k' or 'A','B','C' with 'log_base','p_unit','t_unit')")]
    MissingColumn {
        /// File.
        file: String,
        /// Column heading.
        column: String,
    },
    /// The CSV itself is broken.
    #[error("{file}: {message}")]
    Csv {
        /// File.
        file: String,
        /// The reader's message.
        message: String,
    },
}

/// One Antoine row as published.
#[derive(Debug, Clone, PartialEq)]
pub struct AntoineRow {
    /// Compound name as written in the table.
    pub compound: String,
    /// Constants with convention and validity range (K), when stated.
    pub constants: AntoineConstants,
    /// Relative standard uncertainty in p assumed or stated for the row.
    pub u_p_rel: f64,
    /// Source class (`handbook`, `from-memory`), empty if not said.
    pub source_class: String,
    /// Source as written.
    pub source: String,
    /// Caveat (e.g. "C from memory"), empty if none.
    pub note: String,
    /// File and line.
    pub origin: Origin,
}

/// One normal-boiling-point row.
#[derive(Debug, Clone, PartialEq)]
pub struct TbRow {
    /// Compound name as written.
    pub compound: String,
    /// SMILES, if given.
    pub smiles: Option<String>,
    /// CAS number (check digit validated), if given.
    pub cas: Option<String>,
    /// Where the CAS number comes from (e.g. "from memory"), empty if not said.
    pub cas_source: String,
    /// Normal boiling point, K.
    pub tb_k: f64,
    /// Critical temperature (K) and pressure (Pa), when the row gives both.
    pub critical: Option<(f64, f64)>,
    /// Source class (`reference-equation`, `handbook`, `from-memory`), empty if not said.
    pub source_class: String,
    /// Source as written.
    pub source: String,
    /// File and line.
    pub origin: Origin,
}

/// Rows read from one table.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Rows {
    /// Antoine rows.
    pub antoine: Vec<AntoineRow>,
    /// Boiling-point rows.
    pub tb: Vec<TbRow>,
}

/// Default relative standard uncertainty in p of a reference Antoine row
/// without a stated one: 2 %. Common practice (no single source): published
/// three-constant Antoine sets typically reproduce their data to 1–2 % in p
/// inside their range.
pub const DEFAULT_U_P_REL: f64 = 0.02;

/// Read a reference table from CSV text; `file` names it in errors.
pub fn parse(text: &str, file: &str, user: bool) -> Result<Rows, TableError> {
    let mut rdr = csv::ReaderBuilder::new()
        .flexible(false)
        .trim(csv::Trim::All)
        .from_reader(text.as_bytes());
    let headers = rdr
        .headers()
        .map_err(|e| TableError::Csv {
            file: file.to_string(),
            message: e.to_string(),
        })?
        .clone();
    let col = |name: &str| headers.iter().position(|h| h.eq_ignore_ascii_case(name));
    let Some(i_compound) = col("compound") else {
        return Err(TableError::MissingColumn {
            file: file.into(),
            column: "compound".into(),
        });
    };
    let (ia, ib, ic) = (col("A"), col("B"), col("C"));
    let (i_lb, i_pu, i_tu) = (col("log_base"), col("p_unit"), col("t_unit"));
    let i_tb = col("tb_k");
    if i_tb.is_none() && (ia.is_none() || ib.is_none() || ic.is_none()) {
        return Err(TableError::MissingColumn {
            file: file.into(),
            column: "tb_k".into(),
        });
    }
    let mut rows = Rows::default();
    for (k, rec) in rdr.records().enumerate() {
        let line = k + 2;
        let rec = rec.map_err(|e| TableError::Csv {
            file: file.to_string(),
            message: e.to_string(),
        })?;
        let cell = |i: Option<usize>| i.and_then(|i| rec.get(i)).unwrap_or("").trim();
        let heading = |i: Option<usize>| i.and_then(|i| headers.get(i)).unwrap_or("").to_string();
        let bad = |i: Option<usize>, expected: &str| TableError::Cell {
            file: file.to_string(),
            line,
            column: heading(i),
            value: cell(i).to_string(),
            expected: expected.to_string(),
        };
        let num = |i: Option<usize>| -> Result<Option<f64>, TableError> {
            let s = cell(i);
            if s.is_empty() {
                return Ok(None);
            }
            s.parse::<f64>()
                .ok()
                .filter(|x| x.is_finite())
                .map(Some)
                .ok_or_else(|| bad(i, "a number"))
        };
        let compound = cell(Some(i_compound)).to_string();
        if compound.is_empty() {
            return Err(bad(Some(i_compound), "a compound name"));
        }
        let origin = Origin {
            file: file.to_string(),
            line,
            user,
        };
        let source = cell(col("source")).to_string();
        let cas = match cell(col("cas")) {
            "" => None,
            s => Some(cas::validate(s).map_err(|e| bad(col("cas"), &e.to_string()))?),
        };
        if let (Some(a), Some(b), Some(c)) = (num(ia)?, num(ib)?, num(ic)?) {
            let conv_text = format!("{},{},{}", cell(i_lb), cell(i_pu), cell(i_tu));
            let conv: AntoineConvention = conv_text
                .parse()
                .map_err(|e: crate::vapor::ConventionError| bad(i_lb, &e.reason))?;
            let mut k = AntoineConstants::new(a, b, c, conv);
            let (lo, hi) = (num(col("t_min"))?, num(col("t_max"))?);
            if let (Some(lo), Some(hi)) = (lo, hi) {
                let (lo, hi) = (conv.t_unit.to_kelvin(lo), conv.t_unit.to_kelvin(hi));
                if !(hi > lo && lo > 0.0) {
                    return Err(bad(col("t_max"), "a temperature above t_min"));
                }
                k = k.with_range_k(lo, hi);
            }
            let u_p_rel = match num(col("u_p_pct"))? {
                Some(u) if u > 0.0 => u / 100.0,
                Some(_) => return Err(bad(col("u_p_pct"), "a positive percentage")),
                None => DEFAULT_U_P_REL,
            };
            rows.antoine.push(AntoineRow {
                compound: compound.clone(),
                constants: k,
                u_p_rel,
                source_class: cell(col("source_class")).to_string(),
                source: source.clone(),
                note: cell(col("note")).to_string(),
                origin: origin.clone(),
            });
        }
        if let Some(tb) = num(i_tb)? {
            if tb <= 0.0 {
                return Err(bad(i_tb, "a positive temperature in kelvin"));
            }
            let smiles = Some(cell(col("smiles")).to_string()).filter(|s| !s.is_empty());
            let critical = match (num(col("tc_k"))?, num(col("pc_pa"))?) {
                (Some(tc), Some(pc)) if tc > tb && pc > 0.0 => Some((tc, pc)),
                (None, None) => None,
                _ => {
                    return Err(bad(
                        col("tc_k"),
                        "tc_k above tb_k together with a positive pc_pa (or neither)",
                    ))
                }
            };
            rows.tb.push(TbRow {
                compound,
                smiles,
                cas,
                cas_source: cell(col("cas_source")).to_string(),
                tb_k: tb,
                critical,
                source_class: cell(col("source_class")).to_string(),
                source,
                origin,
            });
        }
    }
    Ok(rows)
}

/// Read a synonyms table (`compound,synonym[,note]`) into (compound, synonym) pairs.
pub fn parse_synonyms(text: &str, file: &str) -> Result<Vec<(String, String)>, TableError> {
    let mut rdr = csv::ReaderBuilder::new()
        .trim(csv::Trim::All)
        .from_reader(text.as_bytes());
    let mut out = Vec::new();
    for rec in rdr.records() {
        let rec = rec.map_err(|e| TableError::Csv {
            file: file.to_string(),
            message: e.to_string(),
        })?;
        if let (Some(c), Some(s)) = (rec.get(0), rec.get(1)) {
            out.push((c.to_string(), s.to_string()));
        }
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_a_mixed_user_table_and_names_bad_cells() {
        let t = "compound,smiles,tb_k,A,B,C,log_base,p_unit,t_unit,t_min,t_max,source\n\
                 HV-12,CCOC(=O)C,350.1,7.1,1300,220,log10,mmHg,degC,20,90,lab book 7\n";
        let r = parse(t, "mine.csv", true).unwrap();
        assert_eq!(r.antoine.len(), 1);
        assert_eq!(r.tb.len(), 1);
        let (lo, hi) = r.antoine[0].constants.range_k.unwrap();
        assert!((lo - 293.15).abs() < 1e-9 && (hi - 363.15).abs() < 1e-9);
        let bad = "compound,tb_k\nx,hot\n";
        let e = parse(bad, "mine.csv", true).unwrap_err().to_string();
        assert!(e.contains("mine.csv, line 2, column 'tb_k'"), "{e}");
        let bad_cas = "compound,cas,tb_k\nx,64-17-4,300\n";
        let e = parse(bad_cas, "m.csv", true).unwrap_err().to_string();
        assert!(e.contains("check digit"), "{e}");
        assert!(parse("name,tb_k\nx,1\n", "m.csv", true).is_err());
    }
}
