//! Binary vapor–liquid equilibrium data: `x1`, optional `y1`, and `T/K` (or `t/°C`) and/or
//! `p/kPa`, with the fixed pressure or temperature from the command line when a column is absent.
//!
//! The same heading rules, units and errors as measured vapor-pressure data
//! (file, line, column and the value in every message). Composition columns
//! are dimensionless: `x1`, `y1` (or with the unit `1` or `mol/mol`). An
//! optional comment line `# components: NAME, NAME` names the two components.

use super::error::{display_name, Locus, ReadError, ReadErrorKind};
use super::headings::{classify, split_heading, Role};
use super::measured::{number, raw_headers, raw_table, ReadOptions};
use super::source::read_bytes;
use crate::mixture::fit::{BinaryData, BinaryPoint, DataKind};
use crate::units::{Pressure, PressureUnit, Temperature, TemperatureUnit};
use std::path::Path;

/// How to read binary data.
#[derive(Debug, Clone, Default)]
pub struct BinaryReadOptions {
    /// Units and separators, as for measured data.
    pub read: ReadOptions,
    /// `--pressure`, Pa: the still's pressure when there is no pressure column
    /// (checked against the column when there is one).
    pub pressure_pa: Option<f64>,
    /// `--temperature`, K: the cell's temperature when there is no temperature column.
    pub temperature_k: Option<f64>,
}

/// Binary data as read.
#[derive(Debug, Clone, PartialEq)]
pub struct BinaryTable {
    /// Display name of the source.
    pub source: String,
    /// The points in SI.
    pub data: BinaryData,
    /// Component names from a `# components:` line, with its line number.
    pub components: Option<([String; 2], u64)>,
    /// Units of the temperature and pressure columns, where present.
    pub units: (Option<TemperatureUnit>, Option<PressureUnit>),
}

#[derive(Debug, Clone, Copy, PartialEq)]
enum Comp {
    X,
    Y,
    W,
}

fn composition_role(h: &str) -> Option<(Comp, bool)> {
    let (q, u) = split_heading(h);
    let c = match q.to_ascii_lowercase().replace(['_', ' '], "").as_str() {
        "x1" => Comp::X,
        "y1" => Comp::Y,
        "w1" => Comp::W,
        _ => return None,
    };
    let unit_ok = u
        .as_deref()
        .is_none_or(|u| matches!(u, "1" | "-" | "mol/mol"));
    Some((c, unit_ok))
}

/// Whether a table's header names a liquid or vapor composition column (`x1`, `y1`, `w1`):
/// then `ebullio fit` reads it as binary VLE data.
pub fn looks_binary(path: &Path, bytes: &[u8], opts: &ReadOptions) -> bool {
    raw_headers(path, bytes, opts).is_ok_and(|h| h.iter().any(|h| composition_role(h).is_some()))
}

/// Read binary VLE data from a file.
pub fn read_binary(path: &Path, opts: &BinaryReadOptions) -> Result<BinaryTable, ReadError> {
    let bytes = read_bytes(path)?;
    read_binary_bytes(path, &bytes, opts)
}

fn components_line(bytes: &[u8]) -> Option<([String; 2], u64)> {
    let text = std::str::from_utf8(bytes).ok()?;
    for (i, l) in text.lines().enumerate() {
        let t = l.trim_start_matches('\u{feff}').trim();
        if let Some(rest) = t.strip_prefix('#') {
            let rest = rest.trim();
            let lower = rest.to_ascii_lowercase();
            if let Some(names) = lower
                .strip_prefix("components:")
                .map(|_| &rest["components:".len()..])
            {
                let v: Vec<String> = names
                    .split(',')
                    .map(|s| s.trim().to_string())
                    .filter(|s| !s.is_empty())
                    .collect();
                if v.len() == 2 {
                    return Some(([v[0].clone(), v[1].clone()], i as u64 + 1));
                }
            }
        } else if !t.is_empty() {
            return None;
        }
    }
    None
}

/// Read binary VLE data from bytes already in memory.
///
/// ```
/// use ebullio::table_io::binary::{read_binary_bytes, BinaryReadOptions};
/// use std::path::Path;
/// let csv = b"# components: ethanol, water\nx1,y1,t/degC\n0.1,0.44,86.4\n0.3,0.58,81.5\n0.6,0.70,79.1\n";
/// let opts = BinaryReadOptions { pressure_pa: Some(101_325.0), ..Default::default() };
/// let t = read_binary_bytes(Path::new("still.csv"), csv, &opts).unwrap();
/// assert_eq!(t.data.points.len(), 3);
/// assert_eq!(t.components.unwrap().0[1], "water");
/// let bad = b"x1,t/degC\n0.1,86.4\n1.3,81.5\n";
/// let e = read_binary_bytes(Path::new("still.csv"), bad, &opts).unwrap_err().to_string();
/// assert!(e.starts_with("still.csv, line 3, column 1 (x1)"), "{e}");
/// ```
pub fn read_binary_bytes(
    path: &Path,
    bytes: &[u8],
    opts: &BinaryReadOptions,
) -> Result<BinaryTable, ReadError> {
    let raw = raw_table(path, bytes, &opts.read)?;
    let locus = raw.locus;
    let h = |i: usize| raw.headers[i].as_str();
    let at_head = |e: ReadError, i: usize| match locus {
        Locus::Line => e.at_line(1, Locus::Line).at_column(i, h(i)),
        Locus::Row => e.at_column(i, h(i)),
    };
    let (mut xi, mut yi, mut ti, mut pi) = (None, None, None, None);
    let (mut t_head, mut p_head) = (None, None);
    for (i, head) in raw.headers.iter().enumerate() {
        if let Some((c, unit_ok)) = composition_role(head) {
            if !unit_ok {
                return Err(at_head(
                    ReadError::file(
                        path,
                        ReadErrorKind::HeadingUnit,
                        format!("heading '{head}': a mole fraction has no unit; write x1 or y1"),
                    ),
                    i,
                ));
            }
            let slot = match c {
                Comp::X => &mut xi,
                Comp::Y => &mut yi,
                Comp::W => {
                    return Err(at_head(
                        ReadError::file(path, ReadErrorKind::BinaryData, format!("heading '{head}': mass fractions are not read; convert them to mole fractions x1, y1")),
                        i,
                    ))
                }
            };
            if slot.replace(i).is_some() {
                return Err(at_head(
                    ReadError::file(
                        path,
                        ReadErrorKind::AmbiguousColumn,
                        format!("a second '{head}' column; keep one"),
                    ),
                    i,
                ));
            }
            continue;
        }
        let role = classify(head).map_err(|e| {
            at_head(
                ReadError::file(
                    path,
                    ReadErrorKind::HeadingUnit,
                    format!("heading '{head}': {}", e.message),
                ),
                i,
            )
        })?;
        match role {
            Role::Temperature(u) => {
                if ti.replace(i).is_some() {
                    return Err(at_head(ReadError::file(path, ReadErrorKind::AmbiguousColumn, "a second temperature column; keep one"), i));
                }
                t_head = u;
            }
            Role::Pressure(u) => {
                if pi.replace(i).is_some() {
                    return Err(at_head(ReadError::file(path, ReadErrorKind::AmbiguousColumn, "a second pressure column; keep one"), i));
                }
                p_head = u;
            }
            Role::GaugePressure(_) => {
                return Err(at_head(
                    ReadError::file(path, ReadErrorKind::HeadingUnit, format!("heading '{head}': a gauge pressure; binary data need the absolute pressure (p/kPa)")),
                    i,
                ))
            }
            _ => {}
        }
    }
    let Some(xi) = xi else {
        let i = yi.expect("looks_binary found a composition column");
        return Err(at_head(
            ReadError::file(path, ReadErrorKind::BinaryData, "a y1 column without an x1 column: binary data need the liquid mole fraction x1 of every point"),
            i,
        ));
    };
    let t_unit = match ti {
        Some(i) => Some(opts.read.t_unit.or(t_head).ok_or_else(|| {
            at_head(
                ReadError::file(
                    path,
                    ReadErrorKind::HeadingUnit,
                    format!("heading '{}' has no unit; write it as T/K or t/degC", h(i)),
                ),
                i,
            )
        })?),
        None => None,
    };
    let p_unit = match pi {
        Some(i) => Some(opts.read.p_unit.or(p_head).ok_or_else(|| {
            at_head(
                ReadError::file(
                    path,
                    ReadErrorKind::HeadingUnit,
                    format!("heading '{}' has no unit; write it as p/kPa", h(i)),
                ),
                i,
            )
        })?),
        None => None,
    };
    match (ti, pi, opts.pressure_pa, opts.temperature_k) {
        (None, None, _, _) => {
            return Err(ReadError::file(path, ReadErrorKind::NoTemperatureColumn, "binary data need a temperature column (T/K or t/degC, T-x-y at --pressure) or a pressure column (p/kPa, p-x-y at --temperature)"))
        }
        (Some(_), None, None, _) => {
            return Err(ReadError::file(path, ReadErrorKind::NoPressureColumn, "T-x-y data without a pressure column: give the still's pressure with --pressure, e.g. --pressure \"1 atm\""))
        }
        (None, Some(_), _, None) => {
            return Err(ReadError::file(path, ReadErrorKind::NoTemperatureColumn, "p-x-y data without a temperature column: give the cell's temperature with --temperature, e.g. --temperature \"60 degC\""))
        }
        _ => {}
    }
    if raw.rows.is_empty() {
        return Err(ReadError::file(
            path,
            ReadErrorKind::HeaderOnly,
            "the file has a header but no data rows",
        ));
    }
    let mut points = Vec::with_capacity(raw.rows.len());
    for row in &raw.rows {
        let line = row.line;
        let cell = |i: usize| row.cell(i);
        let err = |kind, i: usize, msg: String| {
            ReadError::file(path, kind, msg)
                .at_line(line, locus)
                .at_column(i, h(i))
        };
        let fraction = |i: usize| -> Result<f64, ReadError> {
            let v = number(path, line, locus, i, h(i), cell(i))?;
            if (0.0..=1.0).contains(&v) {
                Ok(v)
            } else {
                Err(err(
                    ReadErrorKind::CompositionRange,
                    i,
                    format!(
                        "'{}' is not a mole fraction; expected a number from 0 to 1",
                        cell(i)
                    ),
                ))
            }
        };
        if cell(xi).is_empty() && yi.is_some_and(|j| !cell(j).is_empty()) {
            return Err(err(
                ReadErrorKind::EmptyCell,
                xi,
                "empty x1 cell beside a y1 value: every point needs its liquid composition x1"
                    .into(),
            ));
        }
        let x1 = fraction(xi)?;
        let y1 = match yi {
            Some(j) if !cell(j).is_empty() => Some(fraction(j)?),
            _ => None,
        };
        let t_k = match (ti, t_unit) {
            (Some(i), Some(u)) => {
                let v = number(path, line, locus, i, h(i), cell(i))?;
                let t = Temperature::new(v, u)
                    .map_err(|e| err(ReadErrorKind::BelowAbsoluteZero, i, e.to_string()))?
                    .kelvin();
                if let Some(tf) = opts.temperature_k {
                    if (t - tf).abs() > 0.5 {
                        return Err(err(ReadErrorKind::ConditionMismatch, i, format!("'{}' differs from --temperature ({:.2} K) by {:.2} K; drop --temperature or correct the column", cell(i), tf, t - tf)));
                    }
                }
                t
            }
            _ => opts.temperature_k.unwrap_or(f64::NAN),
        };
        let p_pa = match (pi, p_unit) {
            (Some(i), Some(u)) => {
                let v = number(path, line, locus, i, h(i), cell(i))?;
                let p = Pressure::new(v, u)
                    .map_err(|e| err(ReadErrorKind::NonPositivePressure, i, e.to_string()))?
                    .pa();
                if let Some(pf) = opts.pressure_pa {
                    let rel = (p - pf) / pf;
                    if rel.abs() > 0.01 {
                        return Err(err(ReadErrorKind::ConditionMismatch, i, format!("'{}' differs from --pressure ({:.3} kPa) by {:+.1} %; drop --pressure or correct the column", cell(i), pf / 1000.0, 100.0 * rel)));
                    }
                }
                p
            }
            _ => opts.pressure_pa.unwrap_or(f64::NAN),
        };
        points.push(BinaryPoint {
            x1,
            y1,
            t_k,
            p_pa,
            line: Some(line),
        });
    }
    // Which variable was held: a temperature column that varies means T-x-y.
    let (tlo, thi) = points
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| {
            (a.min(p.t_k), b.max(p.t_k))
        });
    let kind = if ti.is_some() && thi - tlo > 0.2 {
        DataKind::Isobaric
    } else if pi.is_some() || opts.temperature_k.is_some() {
        DataKind::Isothermal
    } else {
        DataKind::Isobaric
    };
    let data = BinaryData { kind, points };
    let distinct = data.distinct_inner_compositions();
    if distinct < 3 {
        let first = raw.rows.first().map_or(1, |r| r.line);
        return Err(ReadError::file(
            path,
            ReadErrorKind::BinaryData,
            format!("only {distinct} distinct liquid composition(s) strictly between 0 and 1; a binary fit needs at least 3 (two parameters and one degree of freedom)"),
        )
        .at_line(first, locus)
        .at_column(xi, h(xi)));
    }
    Ok(BinaryTable {
        source: display_name(path),
        data,
        components: components_line(bytes),
        units: (t_unit, p_unit),
    })
}
