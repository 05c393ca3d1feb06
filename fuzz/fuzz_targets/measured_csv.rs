//! Fuzz the measured-data reader on arbitrary CSV bytes: data or an error naming the file,
//! never a panic. The bytes go straight to `read_measured_bytes` (what `read_measured` calls
//! after reading the file), so no temporary file is created per input.
#![no_main]

use ebullio::table_io::{read_measured_bytes, ReadOptions};
use libfuzzer_sys::fuzz_target;
use std::path::Path;

fuzz_target!(|data: &[u8]| {
    let path = Path::new("points.csv");
    for decimal_comma in [false, true] {
        let opts = ReadOptions {
            decimal_comma,
            ..ReadOptions::default()
        };
        match read_measured_bytes(path, data, &opts) {
            Ok(d) => {
                for set in &d.sets {
                    for p in &set.points {
                        assert!(p.t_k.is_finite() && p.p_pa.is_finite(), "{p:?}");
                    }
                }
            }
            Err(e) => {
                let msg = e.to_string();
                assert!(msg.contains("points.csv"), "error does not name the file: {msg}");
            }
        }
    }
});
