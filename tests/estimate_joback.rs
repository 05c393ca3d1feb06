//! Joback estimation: the group table pinned cell by cell to the verified
//! transcription, self-consistency vectors computed from that table, hand-counted
//! groups. The measured accuracy (cross-validated and held-out, replacing the
//! earlier in-sample dev-set checks) is in `estimate_tb_model.rs`.

use ebullio::estimate::{
    assign_groups, estimate_groups, estimate_smiles, joback, parse_groups, EstimateError,
};
use ebullio::molecule::parse_smiles;

fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol
}

/// Every Tb, Tc and Pc cell of the embedded group table, pinned to the table of
/// Joback & Reid, Chem. Eng. Commun. 57 (1987) 233–243, as cross-checked cell by
/// cell against independent transcriptions (reference-data/JOBACK.md §1: all 564
/// valued cells agree). The expected values are written here, not read from the
/// CSV, so a changed cell, a shifted column or a parser slip fails this test.
/// It is a table check, not a paper example: the paper's own worked examples were
/// not available.
#[test]
fn joback_table_tb_tc_pc_cells_pinned_to_verified_transcription() {
    type Cell = Option<f64>;
    let want: &[(&str, Cell, Cell, Cell)] = &[
        ("ch3", Some(0.0141), Some(-0.0012), Some(23.58)),
        ("ch2_chain", Some(0.0189), Some(0.0000), Some(22.88)),
        ("ch_chain", Some(0.0164), Some(0.0020), Some(21.74)),
        ("c_chain", Some(0.0067), Some(0.0043), Some(18.25)),
        ("eq_ch2", Some(0.0113), Some(-0.0028), Some(18.18)),
        ("eq_ch_chain", Some(0.0129), Some(-0.0006), Some(24.96)),
        ("eq_c_chain", Some(0.0117), Some(0.0011), Some(24.14)),
        ("eq_c_eq", Some(0.0026), Some(0.0028), Some(26.15)),
        ("tr_ch", Some(0.0027), Some(-0.0008), Some(9.20)),
        ("tr_c", Some(0.0020), Some(0.0016), Some(27.38)),
        ("ch2_ring", Some(0.0100), Some(0.0025), Some(27.15)),
        ("ch_ring", Some(0.0122), Some(0.0004), Some(21.78)),
        ("c_ring", Some(0.0042), Some(0.0061), Some(21.32)),
        ("eq_ch_ring", Some(0.0082), Some(0.0011), Some(26.73)),
        ("eq_c_ring", Some(0.0143), Some(0.0008), Some(31.01)),
        ("f", Some(0.0111), Some(-0.0057), Some(-0.03)),
        ("cl", Some(0.0105), Some(-0.0049), Some(38.13)),
        ("br", Some(0.0133), Some(0.0057), Some(66.86)),
        ("i", Some(0.0068), Some(-0.0034), Some(93.84)),
        ("oh_alcohol", Some(0.0741), Some(0.0112), Some(92.88)),
        ("oh_phenol", Some(0.0240), Some(0.0184), Some(76.34)),
        ("o_chain", Some(0.0168), Some(0.0015), Some(22.42)),
        ("o_ring", Some(0.0098), Some(0.0048), Some(31.22)),
        ("co_chain", Some(0.0380), Some(0.0031), Some(76.75)),
        ("co_ring", Some(0.0284), Some(0.0028), Some(94.97)),
        ("cho", Some(0.0379), Some(0.0030), Some(72.24)),
        ("cooh", Some(0.0791), Some(0.0077), Some(169.09)),
        ("coo", Some(0.0481), Some(0.0005), Some(81.10)),
        ("eq_o", Some(0.0143), Some(0.0101), Some(-10.50)),
        ("nh2", Some(0.0243), Some(0.0109), Some(73.23)),
        ("nh_chain", Some(0.0295), Some(0.0077), Some(50.17)),
        ("nh_ring", Some(0.0130), Some(0.0114), Some(52.82)),
        ("n_chain", Some(0.0169), Some(0.0074), Some(11.74)),
        ("eq_n_chain", Some(0.0255), Some(-0.0099), Some(74.60)),
        ("eq_n_ring", Some(0.0085), Some(0.0076), Some(57.55)),
        ("eq_nh", None, None, Some(83.08)),
        ("cn", Some(0.0496), Some(-0.0101), Some(125.66)),
        ("no2", Some(0.0437), Some(0.0064), Some(152.54)),
        ("sh", Some(0.0031), Some(0.0084), Some(63.56)),
        ("s_chain", Some(0.0119), Some(0.0049), Some(68.78)),
        ("s_ring", Some(0.0019), Some(0.0051), Some(52.10)),
    ];
    let table = ebullio::estimate::table();
    assert_eq!(table.len(), want.len(), "41 published groups");
    for (id, tc, pc, tb) in want {
        let g = ebullio::estimate::group(id).unwrap_or_else(|| panic!("group {id} missing"));
        assert_eq!(g.tc, *tc, "{id} Tc");
        assert_eq!(g.pc, *pc, "{id} Pc");
        assert_eq!(g.tb, *tb, "{id} Tb");
    }
}

/// Self-consistency vectors of reference-data/JOBACK.md §6 for acetone, computed
/// from the verified table with the published equations (JOBACK.md §3, confirmed
/// by sources S2, S3). They agree with the encyclopedia article's acetone example
/// as recalled (from memory; that text was not retrieved), so this checks the
/// equations and the summing, not the table cells (pinned above).
#[test]
fn acetone_self_consistency_joback_md_section6() {
    let e = estimate_smiles("CC(C)=O").unwrap();
    assert_eq!(e.groups.get("ch3"), Some(&2));
    assert_eq!(e.groups.get("co_chain"), Some(&1));
    assert_eq!(e.n_atoms, 10);
    assert!(
        close(e.tb_joback_k.unwrap(), 321.91, 0.005),
        "{:?}",
        e.tb_joback_k
    );
    assert!(
        close(e.tb_stein_brown_k.unwrap(), 326.76, 0.01),
        "{:?}",
        e.tb_stein_brown_k
    );
    assert!(close(e.tm_k.unwrap(), 173.5, 0.005));
    // Tc from the Joback Tb, as in the worked example.
    assert!(close(
        joback::tc_k(e.tb_joback_k.unwrap(), 0.0662),
        500.248,
        0.01
    ));
    assert!(close(e.pc_bar.unwrap(), 48.025, 0.005), "{:?}", e.pc_bar);
    assert!(close(e.vc_cm3_mol.unwrap(), 209.5, 1e-9));
    assert!(close(e.hf_kj_mol.unwrap(), -217.83, 0.005));
    assert!(close(e.gf_kj_mol.unwrap(), -154.54, 0.005));
    let cp = e.cp.unwrap();
    assert!(close(cp.at(298.15), 74.970, 0.002), "{}", cp.at(298.15));
    assert!(close(cp.at(300.0), 75.326, 0.002));
    assert!(close(cp.at(1000.0), 163.120, 0.005));
    assert!(close(e.hvap_tb_kj_mol.unwrap(), 29.018, 0.0005));
    assert!(close(e.hfus_kj_mol.unwrap(), 5.125, 0.0005));
}

/// Source: reference-data/JOBACK.md §6 self-consistency vectors (ethanol,
/// toluene, thiophene), computed from the table.
#[test]
fn ethanol_toluene_thiophene_joback_md_section6() {
    let e = estimate_smiles("CCO").unwrap();
    assert!(close(e.tb_joback_k.unwrap(), 337.34, 0.005));
    assert!(close(e.pc_bar.unwrap(), 57.566, 0.005));
    assert!(close(e.hvap_tb_kj_mol.unwrap(), 36.725, 0.001));
    let t = estimate_smiles("Cc1ccccc1").unwrap();
    assert!(close(t.tb_joback_k.unwrap(), 386.24, 0.005));
    assert!(close(t.pc_bar.unwrap(), 41.144, 0.005));
    assert!(close(t.cp.unwrap().at(298.15), 106.583, 0.005));
    let s = estimate_smiles("c1ccsc1").unwrap();
    assert!(close(s.tb_joback_k.unwrap(), 357.02, 0.005));
    assert!(close(s.pc_bar.unwrap(), 57.132, 0.005));
}

/// Expected groups written by hand (counted from the structures on paper).
#[test]
fn group_sums_of_hand_checked_molecules() {
    let cases: &[(&str, &[(&str, u32)])] = &[
        ("CCOC(C)=O", &[("ch3", 2), ("ch2_chain", 1), ("coo", 1)]),
        (
            "Oc1ccccc1",
            &[("oh_phenol", 1), ("eq_ch_ring", 5), ("eq_c_ring", 1)],
        ),
        ("C1=CC=CC=C1", &[("eq_ch_ring", 6)]),
        ("CCCC(=O)O", &[("ch3", 1), ("ch2_chain", 2), ("cooh", 1)]),
        ("CC#N", &[("ch3", 1), ("cn", 1)]),
        ("C[N+](=O)[O-]", &[("ch3", 1), ("no2", 1)]),
        ("CN(C)C=O", &[("ch3", 2), ("n_chain", 1), ("cho", 1)]),
        ("C1CCC(=O)CC1", &[("ch2_ring", 5), ("co_ring", 1)]),
        ("c1ccncc1", &[("eq_ch_ring", 5), ("eq_n_ring", 1)]),
        ("C1CCNC1", &[("ch2_ring", 4), ("nh_ring", 1)]),
        (
            "CC(C)(C)CC(C)C",
            &[
                ("ch3", 5),
                ("c_chain", 1),
                ("ch2_chain", 1),
                ("ch_chain", 1),
            ],
        ),
        (
            "C=CC#C",
            &[("eq_ch2", 1), ("eq_ch_chain", 1), ("tr_c", 1), ("tr_ch", 1)],
        ),
        ("CCSC", &[("ch3", 2), ("ch2_chain", 1), ("s_chain", 1)]),
        ("C1CCOC1", &[("ch2_ring", 4), ("o_ring", 1)]),
        (
            "FC(F)(Cl)Br",
            &[("c_chain", 1), ("f", 2), ("cl", 1), ("br", 1)],
        ),
        ("NCCS", &[("nh2", 1), ("ch2_chain", 2), ("sh", 1)]),
        ("C=C=C", &[("eq_ch2", 2), ("eq_c_eq", 1)]),
    ];
    for (smi, want) in cases {
        let got = assign_groups(&parse_smiles(smi).unwrap()).unwrap();
        let want: std::collections::BTreeMap<String, u32> =
            want.iter().map(|(k, v)| (k.to_string(), *v)).collect();
        assert_eq!(got, want, "{smi}");
    }
}

#[test]
fn kekule_and_aromatic_benzene_give_the_same_estimate() {
    let a = estimate_smiles("C1=CC=CC=C1C").unwrap();
    let b = estimate_smiles("Cc1ccccc1").unwrap();
    assert_eq!(a.groups, b.groups);
    assert_eq!(a.tb_k, b.tb_k);
}

#[test]
fn atoms_without_a_group_are_named_with_position() {
    let e = estimate_smiles("CCP(C)C").unwrap_err();
    assert!(
        matches!(e, EstimateError::NoGroup { position: 3, .. }),
        "{e}"
    );
    assert!(e.to_string().contains("phosphorus"), "{e}");
    // The published table has no ring >N-: the published assignment says so, while the
    // estimate goes on with this project's n_ring_tert group.
    let e = assign_groups(&parse_smiles("CN1CCCC1").unwrap()).unwrap_err();
    assert!(e.to_string().contains("ring tertiary nitrogen"), "{e}");
    assert!(estimate_smiles("CN1CCCC1").unwrap().tb_joback_k.is_none());
    let e = estimate_smiles("CCO.Cl").unwrap_err();
    assert!(e.to_string().contains("estimate each component"), "{e}");
}

#[test]
fn manual_groups_match_the_smiles_route() {
    let g = parse_groups("ch3=2,ch2_chain=3").unwrap();
    let a = estimate_groups(&g).unwrap();
    let b = estimate_smiles("CCCCC").unwrap();
    assert_eq!(a.tb_k, b.tb_k);
    assert_eq!(a.pc_bar, b.pc_bar);
}
