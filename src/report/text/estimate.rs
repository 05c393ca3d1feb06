//! The `estimate` command's terminal report.

use crate::estimate::batch::EstimateRow as Row;
use crate::estimate::{calibration, group, Estimate};
use crate::units::PressureUnit;

fn mbar(p_pa: f64) -> String {
    let v = PressureUnit::MBar.from_pa(p_pa);
    let t = format!("{v:.4}");
    let t = t.trim_end_matches('0').trim_end_matches('.');
    format!("{t} mbar")
}

fn opt(v: Option<f64>, digits: usize) -> String {
    v.map_or(String::new(), |x| format!("{x:.digits$}"))
}

/// The readable report of a batch of estimates, with the calibration summary and the cautions.
pub fn table(rows: &[Row]) -> String {
    let cal = calibration();
    let mut s = String::new();
    for r in rows {
        let label = r.compound.clone().unwrap_or_default();
        let Some(e) = &r.estimate else {
            s.push_str(&format!(
                "{label} {}\n  error: {}\n\n",
                r.smiles_given.clone().unwrap_or_default(),
                r.error
            ));
            continue;
        };
        s.push_str(&format!(
            "{label}{}{}  {}\n",
            if label.is_empty() { "" } else { "  " },
            e.smiles
                .clone()
                .unwrap_or_else(|| "(groups given by hand)".into()),
            e.formula.clone().unwrap_or_default()
        ));
        s.push_str(&format!(
            "  Tb     {:.1} K ({:.1} °C), 90 % interval {:.1}–{:.1} K  [{}, {} family{}; published Joback {}]\n",
            e.tb_k,
            e.tb_k - crate::units::CELSIUS_OFFSET,
            e.tb_pi90_low_k,
            e.tb_pi90_high_k,
            e.tb_variant.name(),
            e.family.name(),
            if e.interval_class == crate::estimate::IntervalClass::FluorinatedHalide {
                " (fluorinated)"
            } else {
                ""
            },
            e.tb_joback_k
                .map_or("has no group for this structure".to_string(), |t| format!("{t:.1} K"))
        ));
        if let Some(rf) = &r.reference {
            s.push_str(&format!(
                "  reference Tb {:.2} K ({}): the estimate is {:+.1} K off  [{}]\n",
                rf.tb_k, rf.compound, rf.estimate_error_k, rf.source
            ));
        }
        for d in &e.comfort.details {
            s.push_str(&format!(
                "         interval widened ×{:.1}: {d}\n",
                e.comfort.factor
            ));
        }
        for n in &e.notes {
            s.push_str(&format!("  note: {n}\n"));
        }
        s.push_str(&format!(
            "  Tc {} K   pc {} bar   Vc {} cm³/mol   ω {}   Tm {} K\n",
            opt(e.tc_k, 1),
            opt(e.pc_bar, 2),
            opt(e.vc_cm3_mol, 1),
            opt(e.omega, 3),
            opt(e.tm_k, 1)
        ));
        s.push_str(&format!(
            "  ΔHvap(Tb) {} kJ/mol   ΔHfus {} kJ/mol   ΔHf° {} kJ/mol   ΔGf° {} kJ/mol   Cp(298 K) {} J/(mol·K)\n",
            opt(e.hvap_tb_kj_mol, 2),
            opt(e.hfus_kj_mol, 2),
            opt(e.hf_kj_mol, 2),
            opt(e.gf_kj_mol, 2),
            opt(e.cp.map(|c| c.at(298.15)), 1)
        ));
        if let Some(a) = &r.anchored {
            for d in &a.deviations {
                s.push_str(&format!(
                    "  measured {:.2} K at {}: pure estimate gives {} K ({} K off)\n",
                    d.measured.t_k,
                    mbar(d.measured.p_pa),
                    opt(d.estimate_t_k, 2),
                    opt(d.deviation_k, 2)
                ));
            }
            s.push_str(&format!(
                "  anchored curve: Tb {:.1} K ({:+.1} K), Tc {:.1} K, ω {:.3}\n",
                a.tb_k, a.tb_shift_k, a.curve.tc_k, a.curve.omega
            ));
        }
        for a in &r.at {
            s.push_str(&format!(
                "  at {}: {} K{}{}\n",
                mbar(a.p_pa),
                opt(a.t_k, 1),
                match (a.pi90_low_k, a.pi90_high_k) {
                    (Some(l), Some(h)) if r.anchored.is_none() =>
                        format!(", 90 % interval {l:.1}–{h:.1} K"),
                    _ => String::new(),
                },
                if a.extrapolated {
                    " (outside the curve's range)"
                } else {
                    ""
                }
            ));
        }
        s.push_str("  groups:");
        for (id, n) in &e.groups {
            let name = group(id).map_or("", |g| g.name.as_str());
            s.push_str(&format!("  {id} ×{n} ({name})"));
        }
        s.push('\n');
        if !e.tb_terms.is_empty() {
            s.push_str(&format!(
                "  Tb terms ({}; fitted values are this project's regression):\n",
                e.tb_variant.name()
            ));
            for t in &e.tb_terms {
                s.push_str(&format!(
                    "    {:<16} ×{}  {:>9.4}{}  {}\n",
                    t.id,
                    t.count,
                    t.value,
                    t.se.map_or(" ".repeat(10), |se| format!(" ±{se:<8.4}")),
                    match (t.origin, t.published_joback_dtb_k) {
                        ("prior-not-fitted", _) => format!(
                            "not fitted ({} calibration compounds): prior",
                            t.n_compounds
                        ),
                        (_, Some(p)) => format!("published Joback ΔTb {p:.2} K"),
                        (_, None) =>
                            format!("project's own {} ({} compounds)", t.kind, t.n_compounds),
                    }
                ));
            }
        }
        if !r.error.is_empty() {
            s.push_str(&format!("  error: {}\n", r.error));
        }
        s.push('\n');
    }
    s.push_str(&cal.summary());
    s.push('\n');
    for c in Estimate::cautions() {
        s.push_str(c);
        s.push('\n');
    }
    s
}
