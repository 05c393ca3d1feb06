//! Fuzz the measured-data reader on arbitrary CSV bytes (written to a temporary file):
//! data or an error naming the file, never a panic.
#![no_main]

use ebullio::table_io::{read_measured, ReadOptions};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(dir) = tempfile::tempdir() else {
        return;
    };
    let path = dir.path().join("points.csv");
    if std::fs::write(&path, data).is_err() {
        return;
    }
    for decimal_comma in [false, true] {
        let opts = ReadOptions {
            decimal_comma,
            ..ReadOptions::default()
        };
        match read_measured(&path, &opts) {
            Ok(d) => {
                for set in &d.sets {
                    for p in &set.points {
                        assert!(p.t_k.is_finite() && p.p_pa.is_finite(), "{p:?}");
                    }
                }
            }
            Err(e) => {
                let _ = e.to_string();
            }
        }
    }
});
