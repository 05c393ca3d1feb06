//! Fuzz the quantity and unit parsers: any text gives a value or a typed error, never a panic.
#![no_main]

use ebullio::units::{parse_pressure, parse_quantity, parse_temperature, Quantity};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(s) = std::str::from_utf8(data) else {
        return;
    };
    if let Ok(p) = parse_pressure(s) {
        assert!(p.pa().is_finite() && p.pa() > 0.0, "{s:?} gave {} Pa", p.pa());
    }
    if let Ok(t) = parse_temperature(s) {
        assert!(t.kelvin().is_finite() && t.kelvin() >= 0.0, "{s:?} gave {} K", t.kelvin());
    }
    match parse_quantity(s) {
        Ok(Quantity::Pressure(p)) => assert!(p.pa().is_finite()),
        Ok(Quantity::Temperature(t)) => assert!(t.kelvin().is_finite()),
        Err(e) => {
            let _ = e.to_string();
        }
    }
    let _ = s.parse::<ebullio::vapor::AntoineConvention>();
});
