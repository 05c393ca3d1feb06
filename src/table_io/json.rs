//! JSON output text: numbers without floating-point noise, never NaN text.

/// JSON text of `v` with every number kept to 12 significant digits
/// ([`crate::units::tidy`]): arithmetic noise in the last places
/// (0.9999999999999998, 353.20000000000005) never reaches the output, and every
/// number printed is the shortest text that reads back to the same double.
/// Non-finite numbers are written as `null` by serde_json, never as text. Every JSON
/// output (the command line's and the Python package's) goes through here.
///
/// ```
/// let t = ebullio::table_io::json_text(&[0.1 + 0.2, f64::NAN]).unwrap();
/// assert_eq!(t.split_whitespace().collect::<String>(), "[0.3,null]");
/// ```
pub fn json_text<T: serde::Serialize + ?Sized>(v: &T) -> serde_json::Result<String> {
    let mut v = serde_json::to_value(v)?;
    tidy_value(&mut v);
    serde_json::to_string_pretty(&v)
}

fn tidy_value(v: &mut serde_json::Value) {
    match v {
        serde_json::Value::Number(n) if n.is_f64() => {
            if let Some(x) = n.as_f64() {
                if let Some(t) = serde_json::Number::from_f64(crate::units::tidy(x)) {
                    *n = t;
                }
            }
        }
        serde_json::Value::Array(a) => a.iter_mut().for_each(tidy_value),
        serde_json::Value::Object(o) => o.values_mut().for_each(tidy_value),
        _ => {}
    }
}
