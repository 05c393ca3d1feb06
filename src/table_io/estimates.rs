//! Estimate rows as CSV: the columns `ebullio estimate --format csv` writes (and the demo's estimates.csv).

use super::non_finite::without_non_finite;
use crate::estimate::batch::EstimateRow;
use crate::estimate::Estimate;

use std::fmt::Write as _;
use std::io::Write;

/// Writes fields through one reused text buffer (no String per cell). Numbers that could not
/// be computed are written empty, and text cells go through [`without_non_finite`], so the
/// output never holds `NaN` or `inf` text and needs no cleaning pass afterwards.
struct Fields<'a, W: Write> {
    w: &'a mut csv::Writer<W>,
    buf: String,
}

impl<W: Write> Fields<'_, W> {
    fn text(&mut self, s: &str) -> Result<(), csv::Error> {
        self.w.write_field(without_non_finite(s, "").as_ref())
    }

    fn num(&mut self, v: Option<f64>, digits: usize) -> Result<(), csv::Error> {
        self.buf.clear();
        if let Some(x) = v.filter(|x| x.is_finite()) {
            super::decimal::push_fixed(&mut self.buf, x, digits);
        }
        self.w.write_field(&self.buf)
    }

    fn groups(&mut self, e: &Estimate) -> Result<(), csv::Error> {
        self.buf.clear();
        for (i, (k, v)) in e.groups.iter().enumerate() {
            let sep = if i == 0 { "" } else { ";" };
            let _ = write!(self.buf, "{sep}{k}={v}");
        }
        self.w
            .write_field(without_non_finite(&self.buf, "").as_ref())
    }

    fn end(&mut self) -> Result<(), csv::Error> {
        self.w.write_record(None::<&[u8]>)
    }
}

/// The rows as CSV text, one column `t_k_at_<p>_pa` per pressure in `ps` (Pa).
pub fn estimates_csv(rows: &[EstimateRow], ps: &[f64]) -> Result<String, csv::Error> {
    // About 200 bytes a row: sized once so the buffer is not regrown and copied.
    let mut bytes = Vec::with_capacity(1024 + 200 * rows.len());
    write_estimates_csv(&mut bytes, rows, ps)?;
    // Every field written was a &str, so the bytes are UTF-8; no lossy copy is needed.
    Ok(String::from_utf8(bytes)
        .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned()))
}

/// The rows as CSV streamed into `out` (what [`estimates_csv`] returns as text), through the
/// csv crate's buffer: no text of the whole table is built.
pub fn write_estimates_csv(
    out: impl Write,
    rows: &[EstimateRow],
    ps: &[f64],
) -> Result<(), csv::Error> {
    let mut w = csv::WriterBuilder::new()
        .buffer_capacity(64 * 1024)
        .from_writer(out);
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
    w.flush()?;
    Ok(())
}
