//! Estimate rows as CSV: the columns `ebullio estimate --format csv` writes (and the demo's estimates.csv).

use crate::estimate::batch::EstimateRow;
use crate::estimate::Estimate;

use std::fmt::Write as _;

/// Writes fields through one reused text buffer (no String per cell).
struct Fields<'a> {
    w: &'a mut csv::Writer<Vec<u8>>,
    buf: String,
}

impl Fields<'_> {
    fn text(&mut self, s: &str) -> Result<(), csv::Error> {
        self.w.write_field(s)
    }

    fn num(&mut self, v: Option<f64>, digits: usize) -> Result<(), csv::Error> {
        self.buf.clear();
        if let Some(x) = v {
            let _ = write!(self.buf, "{x:.digits$}");
        }
        self.w.write_field(&self.buf)
    }

    fn groups(&mut self, e: &Estimate) -> Result<(), csv::Error> {
        self.buf.clear();
        for (i, (k, v)) in e.groups.iter().enumerate() {
            let sep = if i == 0 { "" } else { ";" };
            let _ = write!(self.buf, "{sep}{k}={v}");
        }
        self.w.write_field(&self.buf)
    }

    fn end(&mut self) -> Result<(), csv::Error> {
        self.w.write_record(None::<&[u8]>)
    }
}

/// The rows as CSV text, one column `t_k_at_<p>_pa` per pressure in `ps` (Pa).
pub fn estimates_csv(rows: &[EstimateRow], ps: &[f64]) -> Result<String, csv::Error> {
    // About 200 bytes a row: sized once so the buffer is not regrown and copied.
    let mut w = csv::Writer::from_writer(Vec::with_capacity(1024 + 200 * rows.len()));
    let mut head: Vec<String> = [
        "compound",
        "smiles",
        "formula",
        "tb_k",
        "tb_pi90_low_k",
        "tb_pi90_high_k",
        "tb_typical_error_k",
        "tb_joback_k",
        "tb_stein_brown_k",
        "tb_variant",
        "tm_k",
        "tc_k",
        "pc_bar",
        "vc_cm3_mol",
        "hf_kj_mol",
        "gf_kj_mol",
        "hvap_tb_kj_mol",
        "hfus_kj_mol",
        "omega",
        "groups",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect();
    for p in ps {
        head.push(format!("t_k_at_{}_pa", p));
    }
    head.push("anchored_tb_k".into());
    head.push("error".into());
    w.write_record(&head)?;
    let mut f = Fields {
        w: &mut w,
        buf: String::with_capacity(64),
    };
    for r in rows {
        f.text(r.compound.as_deref().unwrap_or_default())?;
        match &r.estimate {
            Some(e) => {
                f.text(e.smiles.as_deref().unwrap_or_default())?;
                f.text(e.formula.as_deref().unwrap_or_default())?;
                for v in [
                    Some(e.tb_k),
                    Some(e.tb_pi90_low_k),
                    Some(e.tb_pi90_high_k),
                    Some(e.tb_typical_error_k),
                    e.tb_joback_k,
                    e.tb_stein_brown_k,
                ] {
                    f.num(v, 2)?;
                }
                f.text(e.tb_variant.name())?;
                f.num(e.tm_k, 2)?;
                f.num(e.tc_k, 2)?;
                f.num(e.pc_bar, 3)?;
                f.num(e.vc_cm3_mol, 1)?;
                f.num(e.hf_kj_mol, 2)?;
                f.num(e.gf_kj_mol, 2)?;
                f.num(e.hvap_tb_kj_mol, 3)?;
                f.num(e.hfus_kj_mol, 3)?;
                f.num(e.omega, 4)?;
                f.groups(e)?;
            }
            None => {
                f.text(r.smiles_given.as_deref().unwrap_or_default())?;
                for _ in 0..18 {
                    f.text("")?;
                }
            }
        }
        for k in 0..ps.len() {
            f.num(r.at.get(k).and_then(|a| a.t_k), 2)?;
        }
        f.num(r.anchored.as_ref().map(|a| a.tb_k), 2)?;
        f.text(&r.error)?;
        f.end()?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    // Every field written was a &str, so the bytes are UTF-8; no lossy copy is needed.
    Ok(String::from_utf8(bytes)
        .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned()))
}
