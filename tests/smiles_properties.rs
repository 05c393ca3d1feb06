//! Property tests of the SMILES reader: no panics on any input; written SMILES
//! read back to the same formula and the same structure key.

use ebullio::molecule::parse_smiles;
use proptest::prelude::*;

const FRAGMENTS: &[&str] = &[
    "C",
    "C",
    "C",
    "CC",
    "N",
    "O",
    "S",
    "F",
    "Cl",
    "Br",
    "I",
    "=C",
    "#N",
    "c1ccccc1",
    "c1ccncc1",
    "c1cc[nH]c1",
    "c1ccoc1",
    "C1CCCCC1",
    "C1=CC=CC=C1",
    "[N+](=O)[O-]",
    "C(=O)O",
    "C(=O)[O-]",
    "[NH3+]",
    "(C)",
    "(O)",
    "(CC)",
    "(=O)",
    "c1ccc2ccccc2c1",
    "C%10CC%10",
    ".",
    "[13CH3]",
    "[H]",
    "/C=C/",
    "[C@@H](N)",
    "P",
    "B",
];

fn smiles_like() -> impl Strategy<Value = String> {
    prop::collection::vec(prop::sample::select(FRAGMENTS), 1..12).prop_map(|v| v.concat())
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 2000, rng_seed: proptest::test_runner::RngSeed::Fixed(20261202), ..ProptestConfig::default() })]

    #[test]
    fn valid_smiles_round_trip_to_the_same_formula_and_key(s in smiles_like()) {
        if let Ok(m) = parse_smiles(&s) {
            let w = m.write_smiles();
            let back = parse_smiles(&w);
            prop_assert!(back.is_ok(), "{s} -> {w}: {:?}", back.err());
            let back = back.unwrap();
            prop_assert_eq!(back.formula(), m.formula(), "{} -> {}", s, w);
            prop_assert_eq!(back.structure_key(), m.structure_key(), "{} -> {}", s, w);
            let _ = ebullio::estimate::estimate_molecule(&m);
        }
    }

    #[test]
    fn random_bytes_never_panic(b in prop::collection::vec(any::<u8>(), 0..64)) {
        let s = String::from_utf8_lossy(&b);
        let _ = parse_smiles(&s).map(|m| (m.write_smiles(), ebullio::estimate::estimate_molecule(&m)));
    }

    #[test]
    fn random_smiles_characters_never_panic(s in "[CNOSPBFIclnosp0-9%()\\[\\]=#$:/\\\\@+\\-.H*]{0,40}") {
        let _ = parse_smiles(&s).map(|m| (m.write_smiles(), ebullio::estimate::estimate_molecule(&m)));
    }
}

#[test]
fn spellings_of_one_structure_share_a_key() {
    let same: &[&[&str]] = &[
        &["CCO", "OCC", "C(O)C"],
        &["c1ccccc1", "C1=CC=CC=C1", "C1C=CC=CC=1"],
        &["Cc1ccccc1O", "Oc1ccccc1C", "CC1=CC=CC=C1O"],
        &["c1ccc2ccccc2c1", "C1=CC=C2C=CC=CC2=C1"],
        &["c1cc[nH]c1", "N1C=CC=C1"],
        &["CC(=O)O", "OC(C)=O"],
    ];
    for group in same {
        let k0 = parse_smiles(group[0]).unwrap().structure_key();
        for s in &group[1..] {
            assert_eq!(
                parse_smiles(s).unwrap().structure_key(),
                k0,
                "{s} vs {}",
                group[0]
            );
        }
    }
    assert_ne!(
        parse_smiles("Cc1ccccc1C").unwrap().structure_key(),
        parse_smiles("Cc1cccc(C)c1").unwrap().structure_key()
    );
}
