//! `estimate`: structures in as an Arrow string array, estimate columns out; the rows the CLI builds.

use crate::arrow::{self, ArrowStream};
use crate::errors::plain;
use ebullio::estimate::anchor::MeasuredPoint;
use ebullio::estimate::batch::EstimateRow;
use ebullio::estimate::estimate_smiles;
use ebullio::units::{parse_pressure, parse_temperature};
use polars::prelude::{Column, DataFrame, NamedFrom, Series};
use pyo3::prelude::*;
use rayon::prelude::*;

/// Rows per block: the rows of one block are turned into columns and dropped, bounding memory.
const BLOCK: usize = 1 << 16;

/// The estimate rows, kept for `to_dict()` (the CLI's JSON) and the HTML report.
#[pyclass(module = "ebullio._ebullio", frozen)]
pub struct EstimateRun {
    rows: Vec<EstimateRow>,
}

#[pymethods]
impl EstimateRun {
    /// The rows as the CLI's `--format json` writes them (always a list).
    fn json(&self) -> PyResult<String> {
        ebullio::table_io::json_text(&self.rows)
            .map_err(|e| pyo3::exceptions::PyValueError::new_err(e.to_string()))
    }

    /// The `--report` HTML document of these rows.
    fn html(&self, command_line: &str) -> String {
        ebullio::report::estimate_section::estimate_report(&self.rows, command_line).render()
    }
}

/// "95 degC at 0.5 mmHg" as the CLI's `--measured` reads it.
fn parse_measured(py: Python<'_>, s: &str) -> PyResult<MeasuredPoint> {
    let (t, p) = s.split_once(" at ").ok_or_else(|| {
        plain(
            py,
            format!("measured '{s}': expected \"TEMPERATURE at PRESSURE\", e.g. \"95 degC at 0.5 mmHg\""),
        )
    })?;
    let t = parse_temperature(t).map_err(|e| plain(py, format!("measured '{s}': {e}")))?;
    let p = parse_pressure(p).map_err(|e| plain(py, format!("measured '{s}': {e}")))?;
    Ok(MeasuredPoint {
        t_k: t.kelvin(),
        p_pa: p.pa(),
    })
}

/// Pressures as the CLI's `--at` reads them, in Pa.
pub fn parse_pressures(py: Python<'_>, at: &[String], what: &str) -> PyResult<Vec<f64>> {
    at.iter()
        .map(|s| {
            parse_pressure(s)
                .map(|p| p.pa())
                .map_err(|e| plain(py, format!("{what} '{s}': {e}")))
        })
        .collect()
}

/// A finite value to 12 significant digits, as the CLI's JSON writes it (no noise, no NaN).
fn finite(v: Option<f64>) -> Option<f64> {
    v.filter(|x| x.is_finite()).map(ebullio::units::tidy)
}

/// Column builders: the CLI's estimate CSV columns at the JSON's precision, nulls where it writes "".
struct Columns {
    text: Vec<(&'static str, Vec<Option<String>>)>,
    num: Vec<(String, Vec<Option<f64>>)>,
}

const TEXT: [&str; 6] = [
    "compound",
    "smiles",
    "formula",
    "tb_variant",
    "groups",
    "error",
];
const NUM: [&str; 16] = [
    "tb_k",
    "tb_pi90_low_k",
    "tb_pi90_high_k",
    "tb_typical_error_k",
    "tb_joback_k",
    "tb_stein_brown_k",
    "tm_k",
    "tc_k",
    "pc_bar",
    "vc_cm3_mol",
    "hf_kj_mol",
    "gf_kj_mol",
    "hvap_tb_kj_mol",
    "hfus_kj_mol",
    "omega",
    "anchored_tb_k",
];

impl Columns {
    fn new(ps: &[f64]) -> Self {
        let mut num: Vec<(String, Vec<Option<f64>>)> =
            NUM.iter().map(|n| (n.to_string(), Vec::new())).collect();
        for p in ps {
            num.push((format!("t_k_at_{p}_pa"), Vec::new()));
        }
        Columns {
            text: TEXT.iter().map(|n| (*n, Vec::new())).collect(),
            num,
        }
    }

    fn push(&mut self, r: &EstimateRow) {
        let e = r.estimate.as_ref();
        let groups = e.map(|e| {
            e.groups
                .iter()
                .map(|(k, v)| format!("{k}={v}"))
                .collect::<Vec<_>>()
                .join(";")
        });
        let smiles = match e {
            Some(e) => e.smiles.clone(),
            None => r.smiles_given.clone(),
        };
        let texts = [
            r.compound.clone(),
            smiles,
            e.and_then(|e| e.formula.clone()),
            e.map(|e| e.tb_variant.name().to_string()),
            groups,
            Some(r.error.clone()),
        ];
        for ((_, col), v) in self.text.iter_mut().zip(texts) {
            col.push(v);
        }
        let nums = [
            e.map(|e| e.tb_k),
            e.map(|e| e.tb_pi90_low_k),
            e.map(|e| e.tb_pi90_high_k),
            e.map(|e| e.tb_typical_error_k),
            e.and_then(|e| e.tb_joback_k),
            e.and_then(|e| e.tb_stein_brown_k),
            e.and_then(|e| e.tm_k),
            e.and_then(|e| e.tc_k),
            e.and_then(|e| e.pc_bar),
            e.and_then(|e| e.vc_cm3_mol),
            e.and_then(|e| e.hf_kj_mol),
            e.and_then(|e| e.gf_kj_mol),
            e.and_then(|e| e.hvap_tb_kj_mol),
            e.and_then(|e| e.hfus_kj_mol),
            e.and_then(|e| e.omega),
            r.anchored.as_ref().map(|a| a.tb_k),
        ];
        for (i, v) in nums.into_iter().enumerate() {
            self.num[i].1.push(finite(v));
        }
        for (k, col) in self.num[NUM.len()..].iter_mut().enumerate() {
            col.1.push(finite(r.at.get(k).and_then(|a| a.t_k)));
        }
    }

    fn into_frame(self, with_compound: bool) -> PyResult<DataFrame> {
        let mut cols: Vec<Column> = Vec::new();
        let mut text = self.text.into_iter();
        let mut take = |cols: &mut Vec<Column>, keep: bool| {
            if let Some((n, v)) = text.next() {
                if keep {
                    cols.push(Series::new(n.into(), v).into());
                }
            }
        };
        take(&mut cols, with_compound); // compound
        take(&mut cols, true); // smiles
        take(&mut cols, true); // formula
        let mut num = self.num.into_iter();
        for _ in 0..6 {
            if let Some((n, v)) = num.next() {
                cols.push(Series::new(n.as_str().into(), v).into());
            }
        }
        take(&mut cols, true); // tb_variant
        let rest: Vec<(String, Vec<Option<f64>>)> = num.collect();
        let (props, tail) = rest.split_at(9); // tm_k .. omega
        for (n, v) in props {
            cols.push(Series::new(n.as_str().into(), v.clone()).into());
        }
        take(&mut cols, true); // groups
        let (anchored, at) = tail.split_at(1);
        for (n, v) in at.iter().chain(anchored) {
            cols.push(Series::new(n.as_str().into(), v.clone()).into());
        }
        take(&mut cols, true); // error
        DataFrame::new_infer_height(cols)
            .map_err(|e| pyo3::exceptions::PyValueError::new_err(e.to_string()))
    }
}

/// Estimate every structure of `smiles` (an Arrow string stream); the GIL is released and the
/// rows are computed on the Rust thread pool, in blocks. Returns the columns and, when
/// `keep_rows`, the rows themselves (for the JSON and the report).
#[pyfunction]
#[pyo3(signature = (smiles, compound=None, at=Vec::new(), measured=Vec::new(), keep_rows=false))]
pub fn estimate(
    py: Python<'_>,
    smiles: Bound<'_, PyAny>,
    compound: Option<Bound<'_, PyAny>>,
    at: Vec<String>,
    measured: Vec<String>,
    keep_rows: bool,
) -> PyResult<(ArrowStream, Option<EstimateRun>)> {
    let ps = parse_pressures(py, &at, "at")?;
    let measured = measured
        .iter()
        .map(|s| parse_measured(py, s))
        .collect::<PyResult<Vec<_>>>()?;
    if measured.len() > 2 {
        return Err(plain(py, "measured takes one or two points"));
    }
    let (_, chunks) = arrow::import(&smiles)?;
    let smiles = arrow::strings("smiles", &chunks)?;
    let names = match &compound {
        Some(c) => {
            let (_, ch) = arrow::import(c)?;
            Some(arrow::strings("compound", &ch)?)
        }
        None => None,
    };
    let n: usize = smiles.iter().map(|a| a.len()).sum();
    if let Some(nm) = &names {
        let m: usize = nm.iter().map(|a| a.len()).sum();
        if m != n {
            return Err(plain(
                py,
                format!("compound has {m} rows but smiles has {n}"),
            ));
        }
    }
    let with_compound = names.is_some();
    py.detach(|| {
        let cells: Vec<Option<&str>> = smiles.iter().flat_map(|a| a.iter()).collect();
        let name_cells: Option<Vec<Option<&str>>> = names
            .as_ref()
            .map(|v| v.iter().flat_map(|a| a.iter()).collect());
        let mut cols = Columns::new(&ps);
        let mut kept = Vec::new();
        for (b, block) in cells.chunks(BLOCK).enumerate() {
            let rows: Vec<EstimateRow> = block
                .par_iter()
                .enumerate()
                .map(|(i, s)| {
                    // A missing cell is read as the CLI reads an empty one.
                    let s = s.unwrap_or_default();
                    let name = name_cells
                        .as_ref()
                        .and_then(|v| v[b * BLOCK + i])
                        .map(str::to_string);
                    EstimateRow::new(
                        estimate_smiles(s),
                        name,
                        Some(s.to_string()),
                        &ps,
                        &measured,
                    )
                })
                .collect();
            for r in &rows {
                cols.push(r);
            }
            if keep_rows {
                kept.extend(rows);
            }
        }
        let frame = cols.into_frame(with_compound)?;
        Ok((
            ArrowStream::from_frame(frame),
            keep_rows.then_some(EstimateRun { rows: kept }),
        ))
    })
}
