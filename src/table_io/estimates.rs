//! Estimate rows as CSV: the columns `ebullio estimate --format csv` writes (and the demo's estimates.csv).

use crate::estimate::batch::EstimateRow;
use crate::estimate::Estimate;

fn opt(v: Option<f64>, digits: usize) -> String {
    v.map_or(String::new(), |x| format!("{x:.digits$}"))
}

fn groups_text(e: &Estimate) -> String {
    e.groups
        .iter()
        .map(|(k, v)| format!("{k}={v}"))
        .collect::<Vec<_>>()
        .join(";")
}

/// The rows as CSV text, one column `t_k_at_<p>_pa` per pressure in `ps` (Pa).
pub fn estimates_csv(rows: &[EstimateRow], ps: &[f64]) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
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
    for r in rows {
        let mut rec: Vec<String> = vec![r.compound.clone().unwrap_or_default()];
        match &r.estimate {
            Some(e) => {
                rec.push(e.smiles.clone().unwrap_or_default());
                rec.push(e.formula.clone().unwrap_or_default());
                for v in [
                    Some(e.tb_k),
                    Some(e.tb_pi90_low_k),
                    Some(e.tb_pi90_high_k),
                    Some(e.tb_typical_error_k),
                    Some(e.tb_joback_k),
                    Some(e.tb_stein_brown_k),
                ] {
                    rec.push(opt(v, 2));
                }
                rec.push(e.tb_variant.name().into());
                rec.push(opt(e.tm_k, 2));
                rec.push(opt(e.tc_k, 2));
                rec.push(opt(e.pc_bar, 3));
                rec.push(opt(e.vc_cm3_mol, 1));
                rec.push(opt(e.hf_kj_mol, 2));
                rec.push(opt(e.gf_kj_mol, 2));
                rec.push(opt(e.hvap_tb_kj_mol, 3));
                rec.push(opt(e.hfus_kj_mol, 3));
                rec.push(opt(e.omega, 4));
                rec.push(groups_text(e));
            }
            None => {
                rec.push(r.smiles_given.clone().unwrap_or_default());
                rec.extend(std::iter::repeat_n(String::new(), 18));
            }
        }
        for k in 0..ps.len() {
            rec.push(opt(r.at.get(k).and_then(|a| a.t_k), 2));
        }
        rec.push(opt(r.anchored.as_ref().map(|a| a.tb_k), 2));
        rec.push(r.error.clone());
        w.write_record(&rec)?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
