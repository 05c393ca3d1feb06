//! Fuzz the SMILES reader and the Joback estimate on top of it: a molecule or a typed error.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(s) = std::str::from_utf8(data) else {
        return;
    };
    if let Ok(m) = ebullio::molecule::parse_smiles(s) {
        let _ = m.formula();
        let _ = m.molar_mass();
        let _ = m.structure_key();
        let _ = m.write_smiles();
    }
    if let Ok(e) = ebullio::estimate::estimate_smiles(s) {
        let _ = format!("{e:?}");
    }
});
