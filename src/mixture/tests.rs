//! Unit tests of the mixture module (sources named beside each check).

use super::*;
use crate::molecule::parse_smiles;
use crate::vapor::{AntoineConstants, AntoineConvention};

fn groups(smiles: &str) -> String {
    subgroup_names(&assign_subgroups(&parse_smiles(smiles).unwrap()).unwrap())
}

/// Poling, Prausnitz & O'Connell, *The Properties of Gases and Liquids*, 5th ed.,
/// UNIFAC worked example: acetone (1) / n-pentane (2) at x1 = 0.047, 307 K,
/// γ1 ≈ 4.99, γ2 ≈ 1.00 (values from memory).
#[test]
fn unifac_acetone_pentane_poling_worked_example() {
    let m = Unifac::from_smiles(["CC(C)=O", "CCCCC"]).unwrap();
    let [g1, g2] = m.ln_gamma(0.047, 307.0).map(f64::exp);
    assert!((g1 - 4.99).abs() < 0.02, "γ acetone {g1}");
    assert!((g2 - 1.00).abs() < 0.01, "γ pentane {g2}");
    // The same example's group assignment: acetone = 1 CH3 + 1 CH3CO, n-pentane = 2 CH3 + 3 CH2.
    assert_eq!(groups("CC(C)=O"), "CH3CO 1, CH3 1");
    assert_eq!(groups("CCCCC"), "CH3 2, CH2 3");
}

/// Group assignments as tabulated for the original UNIFAC subgroups
/// (Fredenslund, Jones & Prausnitz 1975, Table of group assignments with
/// example molecules; Hansen et al. 1991; examples from memory).
#[test]
fn unifac_textbook_group_assignments() {
    let cases = [
        ("CCO", "OH 1, CH3 1, CH2 1"),
        ("O", "H2O 1"),
        ("CO", "CH3OH 1"),
        ("Cc1ccccc1", "ACH 5, ACCH3 1"),
        ("CCc1ccccc1", "ACH 5, ACCH2 1, CH3 1"),
        ("CC(C)c1ccccc1", "ACH 5, ACCH 1, CH3 2"),
        ("c1ccccc1", "ACH 6"),
        ("C1CCCCC1", "CH2 6"),
        ("CCOC(C)=O", "CH3COO 1, CH3 1, CH2 1"),
        ("COC=O", "HCOO 1, CH3 1"),
        ("CCOCC", "CH2O 1, CH3 2, CH2 1"),
        ("CC=O", "HCO 1, CH3 1"),
        ("CCC(C)=O", "CH3CO 1, CH3 1, CH2 1"),
        ("CC#N", "CH3CN 1"),
        ("CC(O)=O", "COOH 1, CH3 1"),
        ("ClC(Cl)Cl", "CHCL3 1"),
        ("ClC(Cl)(Cl)Cl", "CCL4 1"),
        ("ClCCl", "CH2CL2 1"),
        ("Clc1ccccc1", "ACH 5, ACCL 1"),
        ("CCN", "CH2NH2 1, CH3 1"),
        ("CCNCC", "CH2NH 1, CH3 2, CH2 1"),
        ("CN(C)C", "CH3N 1, CH3 2"),
        ("Nc1ccccc1", "ACH 5, ACNH2 1"),
        ("Oc1ccccc1", "ACH 5, ACOH 1"),
        ("C[N+](=O)[O-]", "CH3NO2 1"),
        ("C1CCOC1", "THF 1, CH2 3"),
        ("CC=C", "CH2=CH 1, CH3 1"),
        ("CCCCBr", "BR 1, CH3 1, CH2 3"),
        ("CS(C)=O", "DMSO 1"),
        ("OCCO", "DOH 1"),
        ("CCCS", "CH2SH 1, CH3 1, CH2 1"),
        ("CC(C)=O", "CH3CO 1, CH3 1"),
        ("CC(=O)c1ccccc1", "ACH 5, AC 1, CH3CO 1"),
        ("c1ccncc1", "C5H5N 1"),
        ("Cc1ccccn1", "C5H4N 1, CH3 1"),
        ("c1ccsc1", "C4H4S 1"),
        ("Cc1cccs1", "C4H3S 1, CH3 1"),
    ];
    for (smiles, want) in cases {
        assert_eq!(groups(smiles), want, "{smiles}");
    }
}

#[test]
fn unassigned_atoms_and_missing_pairs_are_named_errors() {
    let e = assign_subgroups(&parse_smiles("CC(N)=O").unwrap()).unwrap_err();
    let msg = e.to_string();
    assert!(msg.contains("position 2") && msg.contains("amide"), "{msg}");
    let e = assign_subgroups(&parse_smiles("C").unwrap()).unwrap_err();
    assert!(e.to_string().contains("atom C at position 1"), "{e}");
    let e = assign_subgroups(&parse_smiles("[Na+].[Cl-]").unwrap()).unwrap_err();
    assert!(matches!(e, MixtureError::UnassignedAtom { .. }), "{e}");
    // Ester (CCOO, main group 11) with a primary amine (CNH2, 14): no published pair.
    let e = Unifac::from_smiles(["CCOC(C)=O", "CCCCCCN"]).unwrap_err();
    assert_eq!(
        e,
        MixtureError::MissingPair {
            m: 11,
            m_name: "CCOO".into(),
            n: 14,
            n_name: "CNH2".into()
        }
    );
    assert!(e.to_string().contains("CCOO (11) and CNH2 (14)"), "{e}");
    // Fused heteroaromatics (quinoline) have no original-UNIFAC subgroup here.
    let e = assign_subgroups(&parse_smiles("c1ccc2ncccc2c1").unwrap()).unwrap_err();
    assert!(e.to_string().contains("atom N at position 7"), "{e}");
    let e = assign_subgroups(&parse_smiles("CP(C)C").unwrap()).unwrap_err();
    assert!(e.to_string().contains("atom P at position 2"), "{e}");
}

/// γ → 1 for a mixture of a molecule with itself; with identical groups the
/// residual part vanishes and only the (small) size term is left.
#[test]
fn identical_groups_give_unit_activity() {
    let m = Unifac::from_smiles(["CCCCCC", "CCCCCC"]).unwrap();
    for x in [0.0, 0.2, 0.5, 0.9, 1.0] {
        let [a, b] = m.ln_gamma(x, 330.0);
        assert!(a.abs() < 1e-14 && b.abs() < 1e-14, "{a} {b}");
    }
    let m = Unifac::from_smiles(["CCCCCC", "CCCCCCC"]).unwrap();
    let [a, b] = m.ln_gamma(0.5, 330.0);
    assert!(a.abs() < 0.01 && b.abs() < 0.01, "{a} {b}");
    // Same residual at two temperatures (no interaction between identical main groups).
    let [c, d] = m.ln_gamma(0.5, 400.0);
    assert!((a - c).abs() < 1e-14 && (b - d).abs() < 1e-14);
}

fn models() -> Vec<Box<dyn ActivityModel>> {
    vec![
        Box::new(Ideal),
        Box::new(Wilson::new(250.0, 600.0, [58.0, 18.0]).unwrap()),
        Box::new(Nrtl::new(-100.0, 900.0, 0.3).unwrap()),
        Box::new(Unifac::from_smiles(["CCO", "O"]).unwrap()),
        Box::new(Unifac::from_smiles(["CC(C)=O", "ClC(Cl)Cl"]).unwrap()),
        Box::new(Unifac::from_smiles(["Cc1ccccc1", "O"]).unwrap()),
        Box::new(Unifac::from_smiles(["CCOC(C)=O", "CCCCCC"]).unwrap()),
        Box::new(Unifac::from_smiles(["CCCCO", "O"]).unwrap()),
        Box::new(Margules::new(0.7, 1.4).unwrap()),
        Box::new(Margules::new(-0.6, -0.2).unwrap()),
        Box::new(VanLaar::new(0.9, 1.6).unwrap()),
        Box::new(VanLaar::new(-0.5, -0.8).unwrap()),
        Box::new(Legendre::new(&[0.8, -0.3, 0.2, 0.1, -0.05]).unwrap()),
    ]
}

/// Gibbs–Duhem at constant T and p: x1 d ln γ1/dx1 + x2 d ln γ2/dx1 = 0, with the
/// derivatives by central differences (any model); and the analytic derivatives
/// agree with those differences.
#[test]
fn gibbs_duhem_and_analytic_derivatives_for_every_model() {
    let h = 1e-6;
    for m in models() {
        for t in [300.0, 360.0] {
            for x in [0.01, 0.1, 0.3, 0.5, 0.7, 0.95] {
                let up = m.ln_gamma(x + h, t);
                let dn = m.ln_gamma(x - h, t);
                let d1 = (up[0] - dn[0]) / (2.0 * h);
                let d2 = (up[1] - dn[1]) / (2.0 * h);
                let gd = x * d1 + (1.0 - x) * d2;
                let scale = 1.0 + d1.abs() + d2.abs();
                assert!(gd.abs() < 1e-6 * scale, "{} x={x} T={t}: {gd}", m.name());
                let (_, an) = m.ln_gamma_dx(x, t);
                assert!(
                    (an[0] - d1).abs() < 1e-5 * scale,
                    "{} dlnγ1 {} vs {d1}",
                    m.name(),
                    an[0]
                );
                assert!(
                    (an[1] - d2).abs() < 1e-5 * scale,
                    "{} dlnγ2 {} vs {d2}",
                    m.name(),
                    an[1]
                );
            }
        }
    }
}

fn conv() -> AntoineConvention {
    "ln,kPa,degC".parse().unwrap()
}

/// With γ = 1 the bubble pressure is Raoult's law exactly, and the bubble and
/// dew solvers invert each other.
#[test]
fn ideal_model_is_raoult_exactly_and_solvers_are_consistent() {
    // Smith, Van Ness & Abbott, Table B.2 (benzene, toluene).
    let bz = AntoineConstants::new(13.7819, 2726.81, 217.572, conv());
    let tol = AntoineConstants::new(13.9320, 3056.96, 217.625, conv());
    let b = Binary {
        names: ["benzene", "toluene"],
        curves: [&bz, &tol],
        model: &Ideal,
    };
    use crate::vapor::Curve;
    let t = 370.0;
    let pt = b.bubble_p(0.4, t).unwrap();
    let raoult = 0.4 * bz.p_pa(t) + 0.6 * tol.p_pa(t);
    assert_eq!(pt.p_pa, raoult);
    assert_eq!(pt.y1, 0.4 * bz.p_pa(t) / raoult);
    let bt = b.bubble_t(0.4, 101_325.0).unwrap();
    assert!((bt.p_pa - 101_325.0).abs() < 1e-6);
    let dt = b.dew_t(bt.y1, 101_325.0).unwrap();
    assert!(
        (dt.t_k - bt.t_k).abs() < 1e-6 && (dt.x1 - 0.4).abs() < 1e-8,
        "{dt:?}"
    );
    let dp = b.dew_p(pt.y1, t).unwrap();
    assert!((dp.p_pa - pt.p_pa).abs() < 1e-4 && (dp.x1 - 0.4).abs() < 1e-8);
    // Non-ideal too: dew of the bubble vapor gives the liquid back.
    let m = Unifac::from_smiles(["CCO", "c1ccccc1"]).unwrap();
    let etoh = AntoineConstants::new(16.8958, 3795.17, 230.918, conv());
    let b = Binary {
        names: ["ethanol", "benzene"],
        curves: [&etoh, &bz],
        model: &m,
    };
    let bt = b.bubble_t(0.2, 101_325.0).unwrap();
    let dt = b.dew_t(bt.y1, 101_325.0).unwrap();
    assert!(
        (dt.t_k - bt.t_k).abs() < 1e-5 && (dt.x1 - 0.2).abs() < 1e-6,
        "{bt:?} {dt:?}"
    );
    assert!(b.bubble_t(1.2, 101_325.0).is_err());
}

/// Wilson at infinite dilution: ln γ1∞ = −ln Λ12 + 1 − Λ21 (Wilson 1964).
#[test]
fn wilson_infinite_dilution_closed_form() {
    let w = Wilson::new(250.0, 600.0, [58.0, 18.0]).unwrap();
    let t = 340.0;
    let [l12, l21] = w.lambdas(t);
    let [g1, _] = w.ln_gamma(0.0, t);
    assert!((g1 - (-l12.ln() + 1.0 - l21)).abs() < 1e-12);
    assert!(Wilson::new(f64::NAN, 1.0, [1.0, 1.0]).is_err());
    assert!(Nrtl::new(1.0, 1.0, 0.0).is_err());
}

/// Toluene / water is nearly immiscible (mutual solubilities of order 1e-4
/// and 1e-3 mole fraction near 25 °C; from memory): UNIFAC must predict a
/// split with both liquids nearly pure.
#[test]
fn toluene_water_splits_into_two_nearly_pure_liquids() {
    let m = Unifac::from_smiles(["Cc1ccccc1", "O"]).unwrap();
    assert!(is_unstable(&m, 0.5, 350.0));
    let [lo, hi] = liquid_split_at(&m, 350.0).unwrap();
    assert!(lo < 1e-2 && hi > 0.95, "{lo} {hi}");
    // Ethanol / water is miscible.
    let m = Unifac::from_smiles(["CCO", "O"]).unwrap();
    assert!(liquid_split_at(&m, 350.0).is_none());
}
