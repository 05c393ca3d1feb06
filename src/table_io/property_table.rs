//! Property tables (CSV or Parquet) in and out, with their recognised columns.
//!
//! Every row and column of the input is kept, in order; `check` only adds
//! columns. CSV is read with every column as text, so unknown columns and
//! number formatting come back exactly as written. Recognised columns
//! (`compound`, `smiles`, `cas`, a boiling-point column with its unit such as
//! `Tb/K`, `tb/°C` or `Tb [K]`, Antoine `A`, `B`, `C` with a `convention`
//! column, the three columns `log_base`, `p_unit`, `t_unit`, or `--constants`,
//! `Tmin`/`Tmax` (unit in the heading, else the row's convention), `Tc/K`,
//! `pc/bar`) are read into SI. A recognised column that cannot be understood
//! is an error naming it; one unreadable cell is reported on its row.

use super::error::{Locus, ReadError, ReadErrorKind};
use super::headings::split_heading;
use super::plain_number::parse_number;
use crate::screen::{trimmed, AntoineCell, RowInput, Rows};
use crate::units::{PressureUnit, TemperatureUnit};
use crate::vapor::{AntoineConstants, AntoineConvention, LogBase};
use polars::prelude::*;
use polars_io::prelude::*;
use rayon::prelude::*;
use std::collections::HashMap;
use std::path::{Path, PathBuf};

/// The error of reading a property table is the one [`ReadError`] of every
/// table reader (file, line, column, value, what was expected).
pub type TableError = ReadError;

/// How to read a property table.
#[derive(Debug, Clone, Copy, Default)]
pub struct PropertyReadOptions {
    /// Convention of A, B, C when the table has no convention column (`--constants`).
    pub constants: Option<AntoineConvention>,
}

/// Column roles `check` recognises.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
enum Role {
    Compound,
    Smiles,
    Cas,
    Tb,
    A,
    B,
    C,
    Convention,
    LogBase,
    PUnit,
    TUnit,
    Tmin,
    Tmax,
    Tc,
    Pc,
}

fn role_of(name: &str) -> Option<Role> {
    let n: String = name
        .chars()
        .filter(|c| !matches!(c, ' ' | '_' | '-' | '.'))
        .collect::<String>()
        .to_lowercase();
    Some(match n.as_str() {
        "compound" | "name" | "compoundname" | "substance" => Role::Compound,
        "smiles" => Role::Smiles,
        "cas" | "casno" | "casrn" | "casnumber" => Role::Cas,
        "tb" | "tnb" | "tn" | "nbp" | "normalboilingpoint" | "boilingpoint" => Role::Tb,
        "a" => Role::A,
        "b" => Role::B,
        "c" => Role::C,
        "convention" | "antoineconvention" => Role::Convention,
        "logbase" => Role::LogBase,
        "punit" => Role::PUnit,
        "tunit" => Role::TUnit,
        "tmin" | "tlow" => Role::Tmin,
        "tmax" | "thigh" => Role::Tmax,
        "tc" | "tcrit" => Role::Tc,
        "pc" | "pcrit" => Role::Pc,
        _ => return None,
    })
}

fn is_temperature(r: Role) -> bool {
    matches!(r, Role::Tb | Role::Tmin | Role::Tmax | Role::Tc)
}

/// Split a heading into (role, unit text): `Tb/K`, `Tb [K]`, `Tb (K)`, `tb_k`.
fn parse_heading(h: &str) -> Option<(Role, Option<String>)> {
    let t = h.trim();
    // The one heading form of every table: `Tb/K`, `Tb [K]`, `Tb (K)`.
    if let (q, Some(u)) = split_heading(t) {
        return role_of(&q).map(|r| (r, Some(u)));
    }
    if let Some((n, u)) = t.rsplit_once('_') {
        if let Some(r) = role_of(n) {
            let unit_ok = if is_temperature(r) {
                TemperatureUnit::parse(u).is_ok()
            } else if r == Role::Pc {
                PressureUnit::parse(u).is_ok()
            } else {
                false
            };
            if unit_ok {
                return Some((r, Some(u.to_string())));
            }
        }
    }
    role_of(t).map(|r| (r, None))
}

/// A numeric column read into one unit.
struct NumColumn {
    values: Vec<f64>,
    /// (row, message) for unreadable cells.
    bad: Vec<(usize, String)>,
}

/// A numeric column read, with the unit it was in.
type NumRead = Result<(NumColumn, Option<String>), TableError>;

#[derive(Debug, Clone, Copy)]
enum Kind {
    Temperature,
    Pressure,
    Plain,
}

fn text_of(col: &Column) -> Option<StringChunked> {
    match col.dtype() {
        DataType::String => col.str().ok().cloned(),
        _ => None,
    }
}

/// What one read of a text number column found besides its values.
#[derive(Debug, Clone, Default)]
struct CellStats {
    /// Cells read as numbers.
    good: usize,
    /// The first unreadable cell: (line, text).
    first_bad: Option<(usize, String)>,
    /// Units written in cells, each with the first line it is on.
    cell_units: Vec<(String, usize)>,
}

/// A text column's raw numbers, its unreadable cells (row, message) and what was found.
type RawRead = Result<(Vec<f64>, Vec<(usize, String)>, CellStats), TableError>;

/// Whether a numeric column's unit is settled by its heading or its cells.
fn resolve_unit(
    path: &Path,
    heading: &str,
    unit: Option<&str>,
    cell_units: &[(String, usize)],
) -> Result<Option<String>, TableError> {
    match (unit, cell_units.len()) {
        (_, 0) => Ok(unit.map(str::to_string)),
        (None, 1) => Ok(Some(cell_units[0].0.clone())),
        (h, _) => {
            let mut all: Vec<String> = h.map(|u| format!("{u} (heading)")).into_iter().collect();
            all.extend(cell_units.iter().map(|(u, l)| format!("{u} (line {l})")));
            Err(ReadError::file(
                path,
                ReadErrorKind::HeadingUnit,
                format!(
                    "mixes units ({}); give one unit per column, e.g. in the heading 'Tb/K'",
                    all.join(", ")
                ),
            )
            .at_heading(heading))
        }
    }
}

fn no_number_error(path: &Path, heading: &str, kind: Kind, line: usize, value: &str) -> TableError {
    let expected = match kind {
        Kind::Temperature => "temperatures (numbers)",
        Kind::Pressure => "pressures (numbers)",
        Kind::Plain => "numbers",
    };
    ReadError::file(
        path,
        ReadErrorKind::NotANumber,
        format!("should hold {expected}, but holds '{value}' and no cell in it is {expected}"),
    )
    .at_line(line as u64, Locus::Line)
    .at_heading(heading)
}

/// Unreadable cells reported per column; later ones are read as missing
/// without a message of their own (keeps a hostile table's report bounded).
const BAD_CELLS_REPORTED: usize = 1000;

/// The raw numbers of a column (NaN where empty or unreadable), the
/// unreadable cells (row, message) after `reported` earlier ones, and what
/// was found. `Err` for a column that is neither numbers nor text.
fn read_raw(
    path: &Path,
    heading: &str,
    col: &Column,
    kind: Kind,
    line0: usize,
    reported: usize,
) -> RawRead {
    let n = col.len();
    let mut stats = CellStats::default();
    if col.dtype().is_primitive_numeric() {
        let s = col
            .cast(&DataType::Float64)
            .map_err(|e| read_err(path, e))?;
        let ca = s.f64().map_err(|e| read_err(path, e))?;
        let raw: Vec<f64> = ca.iter().map(|v| v.unwrap_or(f64::NAN)).collect();
        stats.good = raw.iter().filter(|v| v.is_finite()).count().max(1);
        return Ok((raw, vec![], stats));
    }
    let Some(ca) = text_of(col) else {
        return Err(ReadError::file(
            path,
            ReadErrorKind::ColumnType,
            format!(
                "should hold numbers, but holds a column of type {}",
                col.dtype()
            ),
        )
        .at_heading(heading));
    };
    let mut raw = Vec::with_capacity(n);
    let mut bad = Vec::new();
    for (i, v) in ca.iter().enumerate() {
        let Some(v) = v.map(trimmed).filter(|v| !v.is_empty()) else {
            raw.push(f64::NAN);
            continue;
        };
        if let Some(x) = parse_number(v) {
            if x.is_finite() {
                raw.push(x);
                stats.good += 1;
                continue;
            }
        }
        // a number followed by a unit?
        let split = v
            .find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E')))
            .map(|k| (v[..k].trim(), v[k..].trim()));
        let unit_ok = |u: &str| match kind {
            Kind::Temperature => TemperatureUnit::parse(u).is_ok(),
            Kind::Pressure => PressureUnit::parse(u).is_ok(),
            Kind::Plain => false,
        };
        match split {
            Some((num, u)) if !u.is_empty() && unit_ok(u) && num.parse::<f64>().is_ok() => {
                let x: f64 = num.parse().unwrap_or(f64::NAN);
                if !stats.cell_units.iter().any(|(x, _)| x == u) {
                    stats.cell_units.push((u.to_string(), i + line0));
                }
                raw.push(x);
                stats.good += 1;
            }
            _ => {
                if stats.first_bad.is_none() {
                    stats.first_bad = Some((i + line0, v.to_string()));
                }
                if reported + bad.len() < BAD_CELLS_REPORTED {
                    bad.push((i, format!("'{v}' is not a number")));
                }
                raw.push(f64::NAN);
            }
        }
    }
    Ok((raw, bad, stats))
}

/// Read a numeric column whole. Returns values in the column's unit converted by
/// `to_si` (temperatures to K, pressures to Pa); `unit` is the heading unit.
fn read_numeric(
    path: &Path,
    heading: &str,
    col: &Column,
    kind: Kind,
    unit: Option<&str>,
    line0: usize,
) -> Result<(NumColumn, Option<String>), TableError> {
    let (raw, bad, stats) = read_raw(path, heading, col, kind, line0, 0)?;
    if stats.good == 0 {
        if let Some((line, value)) = &stats.first_bad {
            return Err(no_number_error(path, heading, kind, *line, value));
        }
    }
    let unit = resolve_unit(path, heading, unit, &stats.cell_units)?;
    let (values, unit) = convert(path, heading, raw, kind, unit.as_deref())?;
    Ok((NumColumn { values, bad }, unit))
}

fn convert(
    path: &Path,
    heading: &str,
    mut raw: Vec<f64>,
    kind: Kind,
    unit: Option<&str>,
) -> Result<(Vec<f64>, Option<String>), TableError> {
    match (kind, unit) {
        (Kind::Plain, _) | (Kind::Temperature, None) => Ok((raw, unit.map(str::to_string))),
        (Kind::Pressure, None) => Err(missing_unit(path, heading, "pc/bar")),
        (Kind::Temperature, Some(u)) => {
            let tu = TemperatureUnit::parse(u).map_err(|e| {
                ReadError::file(path, ReadErrorKind::HeadingUnit, e.to_string()).at_heading(heading)
            })?;
            raw.iter_mut().for_each(|v| *v = tu.to_kelvin(*v));
            Ok((raw, Some(u.to_string())))
        }
        (Kind::Pressure, Some(u)) => {
            let pu = PressureUnit::parse(u).map_err(|e| {
                ReadError::file(path, ReadErrorKind::HeadingUnit, e.to_string()).at_heading(heading)
            })?;
            raw.iter_mut().for_each(|v| *v = pu.to_pa(*v));
            Ok((raw, Some(u.to_string())))
        }
    }
}

fn read_err(path: &Path, e: impl std::fmt::Display) -> TableError {
    ReadError::file(
        path,
        ReadErrorKind::Io,
        format!("cannot read the table: {e}"),
    )
}

fn missing_unit(path: &Path, heading: &str, example: &str) -> ReadError {
    ReadError::file(
        path,
        ReadErrorKind::HeadingUnit,
        format!("has no unit; write it in the heading, e.g. '{example}'"),
    )
    .at_heading(heading)
}

fn columns_err(path: &Path, kind: ReadErrorKind, message: impl Into<String>) -> ReadError {
    ReadError::file(path, kind, message)
}

/// One numeric column of a table read in batches.
#[derive(Debug, Clone)]
struct ColScan {
    heading: String,
    kind: Kind,
    heading_unit: Option<String>,
    stats: CellStats,
    /// Unreadable cells reported so far.
    reported: usize,
    /// The unit each batch so far was converted with (`None`: no batch yet).
    used: Option<Option<String>>,
    /// Whether batches were converted with different units.
    changed: bool,
    /// The unit settled by [`ColumnScan::finish`], used from then on.
    fixed: Option<Option<String>>,
}

/// What reading a table batch by batch carries from one batch to the next:
/// per numeric column the readable cells, the units written in cells, and
/// how many unreadable cells were reported. A first pass over all batches
/// then [`ColumnScan::finish`] gives the errors a whole-table read gives
/// (no readable cell, mixed units, no unit) and settles each column's
/// unit; a second pass reads with those units.
#[derive(Debug, Clone, Default)]
pub struct ColumnScan {
    cols: HashMap<Role, ColScan>,
}

impl ColumnScan {
    /// A scan before the first batch.
    pub fn new() -> Self {
        Self::default()
    }

    fn batch_column(
        &mut self,
        path: &Path,
        role: Role,
        kind: Kind,
        heading: &str,
        heading_unit: Option<&str>,
        res: RawRead,
    ) -> NumRead {
        let (raw, bad, st) = res?;
        let c = self.cols.entry(role).or_insert_with(|| ColScan {
            heading: heading.to_string(),
            kind,
            heading_unit: heading_unit.map(str::to_string),
            stats: CellStats::default(),
            reported: 0,
            used: None,
            changed: false,
            fixed: None,
        });
        c.reported += bad.len();
        let unit = match &c.fixed {
            Some(u) => u.clone(),
            None => {
                c.stats.good += st.good;
                if c.stats.first_bad.is_none() {
                    c.stats.first_bad = st.first_bad;
                }
                for (u, l) in st.cell_units {
                    if !c.stats.cell_units.iter().any(|(x, _)| *x == u) {
                        c.stats.cell_units.push((u, l));
                    }
                }
                // mixed units are reported by `finish`; until then the heading's
                let u = resolve_unit(path, heading, heading_unit, &c.stats.cell_units)
                    .unwrap_or_else(|_| heading_unit.map(str::to_string));
                match &c.used {
                    None => c.used = Some(u.clone()),
                    Some(prev) if *prev != u => c.changed = true,
                    Some(_) => {}
                }
                u
            }
        };
        let values = match (kind, unit.as_deref()) {
            // no unit yet: `finish` reports it, or a later batch's cells give it
            (Kind::Pressure, None) => raw,
            (_, u) => convert(path, heading, raw, kind, u)?.0,
        };
        Ok((NumColumn { values, bad }, unit))
    }

    /// After the first pass over every batch: the errors of the whole table
    /// (in the order a whole-table read finds them), else settle each
    /// column's unit for the second pass. Returns whether some batch of the
    /// first pass was read with a unit other than the settled one (a unit
    /// that only appears in a later batch's cells): the first pass must then
    /// be run again.
    pub fn finish(&mut self, path: &Path) -> Result<bool, TableError> {
        let order = [
            Role::Tb,
            Role::A,
            Role::B,
            Role::C,
            Role::Tmin,
            Role::Tmax,
            Role::Tc,
            Role::Pc,
        ];
        let mut redo = false;
        for r in order {
            let Some(c) = self.cols.get_mut(&r) else {
                continue;
            };
            if c.fixed.is_some() {
                continue;
            }
            if c.stats.good == 0 {
                if let Some((line, value)) = &c.stats.first_bad {
                    return Err(no_number_error(path, &c.heading, c.kind, *line, value));
                }
            }
            let u = resolve_unit(
                path,
                &c.heading,
                c.heading_unit.as_deref(),
                &c.stats.cell_units,
            )?;
            match (r, c.kind, &u) {
                (Role::Tb, _, None) => return Err(missing_unit(path, &c.heading, "Tb/K")),
                (Role::Tc, _, None) => return Err(missing_unit(path, &c.heading, "Tc/K")),
                (_, Kind::Pressure, None) => return Err(missing_unit(path, &c.heading, "pc/bar")),
                _ => {}
            }
            redo |= c.changed || c.used.as_ref().is_some_and(|x| *x != u);
            c.fixed = Some(u);
        }
        for c in self.cols.values_mut() {
            c.reported = 0;
        }
        Ok(redo)
    }
}

/// A property table: the original frame plus its recognised columns in SI.
pub struct PropertyTable {
    /// The table as read (every column, in order).
    pub frame: DataFrame,
    path: PathBuf,
    line0: usize,
    compound: Option<StringChunked>,
    smiles: Option<StringChunked>,
    cas: Option<StringChunked>,
    tb_k: Option<Vec<f64>>,
    tb_unit: TemperatureUnit,
    abc: Option<[Vec<f64>; 3]>,
    conventions: Vec<Option<AntoineConvention>>,
    tmin: Option<(Vec<f64>, bool)>,
    tmax: Option<(Vec<f64>, bool)>,
    tc_k: Option<Vec<f64>>,
    pc_pa: Option<Vec<f64>>,
    /// Unreadable cells per row: (column heading, message).
    bad: HashMap<usize, Vec<(String, String)>>,
}

/// Whether the file's first byte is `#` (a provenance comment line).
fn starts_with_comment(path: &Path) -> bool {
    use std::io::Read;
    let mut b = [0u8; 1];
    std::fs::File::open(path)
        .and_then(|mut f| f.read_exact(&mut b))
        .is_ok_and(|_| b[0] == b'#')
}

fn read_frame(path: &Path) -> Result<(DataFrame, usize), TableError> {
    let ext = path
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase);
    match ext.as_deref() {
        Some("parquet") | Some("pq") => {
            let f = std::fs::File::open(path).map_err(|e| read_err(path, e))?;
            let df = ParquetReader::new(f)
                .finish()
                .map_err(|e| read_err(path, e))?;
            Ok((df, 1))
        }
        _ => {
            let df = CsvReadOptions::default()
                .with_has_header(true)
                .with_infer_schema_length(Some(0))
                .try_into_reader_with_file_path(Some(path.to_path_buf()))
                .and_then(|r| r.finish())
                .map_err(|e| read_err(path, e))?;
            Ok((df, 2))
        }
    }
}

impl PropertyTable {
    /// Read a CSV or Parquet property table (by extension; anything not
    /// `.parquet` is read as CSV) and recognise its columns. Leading `#`
    /// lines of a CSV are comments (see [`PropertyTable::from_csv_bytes`]).
    pub fn read(path: &Path, opts: &PropertyReadOptions) -> Result<Self, TableError> {
        if !is_parquet(path) && starts_with_comment(path) {
            let bytes = std::fs::read(path).map_err(|e| read_err(path, e))?;
            return Self::from_csv_bytes(&bytes, path, opts);
        }
        let (frame, line0) = read_frame(path)?;
        Self::from_frame(frame, path, line0, opts)
    }

    /// Read a CSV property table held in memory (an embedded file), with
    /// `path` naming it in messages. Leading lines starting with `#` are
    /// comments (the demo files' provenance note) and are skipped; line
    /// numbers in findings still count them.
    pub fn from_csv_bytes(
        bytes: &[u8],
        path: &Path,
        opts: &PropertyReadOptions,
    ) -> Result<Self, TableError> {
        let mut start = 0;
        let mut comments = 0;
        while bytes[start..].starts_with(b"#") {
            match bytes[start..].iter().position(|&b| b == b'\n') {
                Some(i) => start += i + 1,
                None => start = bytes.len(),
            }
            comments += 1;
        }
        let df = CsvReadOptions::default()
            .with_has_header(true)
            .with_infer_schema_length(Some(0))
            .into_reader_with_file_handle(std::io::Cursor::new(bytes[start..].to_vec()))
            .finish()
            .map_err(|e| read_err(path, e))?;
        Self::from_frame(df, path, 2 + comments, opts)
    }

    /// Recognise the columns of an already-read frame. `line0` is the line of
    /// the first data row (2 for CSV with a header, 1 for Parquet).
    pub fn from_frame(
        frame: DataFrame,
        path: &Path,
        line0: usize,
        opts: &PropertyReadOptions,
    ) -> Result<Self, TableError> {
        Self::from_frame_in(frame, path, line0, opts, None)
    }

    /// Recognise the columns of one batch of a table read in batches:
    /// `scan` carries the column-wide rules (one unit per column, some
    /// readable cell, a bounded number of unreadable-cell messages) from
    /// batch to batch; their errors come from [`ColumnScan::finish`].
    pub fn from_batch(
        frame: DataFrame,
        path: &Path,
        line0: usize,
        opts: &PropertyReadOptions,
        scan: &mut ColumnScan,
    ) -> Result<Self, TableError> {
        Self::from_frame_in(frame, path, line0, opts, Some(scan))
    }

    fn from_frame_in(
        frame: DataFrame,
        path: &Path,
        line0: usize,
        opts: &PropertyReadOptions,
        mut scan: Option<&mut ColumnScan>,
    ) -> Result<Self, TableError> {
        let n = frame.height();
        let mut roles: HashMap<Role, (String, Option<String>)> = HashMap::new();
        for c in frame.columns() {
            let h = c.name().to_string();
            if let Some((r, u)) = parse_heading(&h) {
                if let Some((other, _)) = roles.get(&r) {
                    return Err(columns_err(
                        path,
                        ReadErrorKind::AmbiguousColumn,
                        format!(
                            "columns '{other}' and '{h}' both look like the same quantity; keep one"
                        ),
                    ));
                }
                roles.insert(r, (h, u));
            }
        }
        let col = |r: Role| roles.get(&r).and_then(|(h, _)| frame.column(h).ok());
        let text = |r: Role| -> Result<Option<StringChunked>, TableError> {
            match col(r) {
                None => Ok(None),
                Some(c) => match text_of(c) {
                    Some(ca) => Ok(Some(ca.rechunk().into_owned())),
                    None => Err(ReadError::file(
                        path,
                        ReadErrorKind::ColumnType,
                        format!("should hold text, but holds a column of type {}", c.dtype()),
                    )
                    .at_heading(c.name())),
                },
            }
        };
        let compound = text(Role::Compound)?;
        let smiles = text(Role::Smiles)?;
        let cas = text(Role::Cas)?;

        let have = |r: Role| roles.contains_key(&r);
        let n_abc = [Role::A, Role::B, Role::C]
            .iter()
            .filter(|r| have(**r))
            .count();
        if n_abc > 0 && n_abc < 3 {
            return Err(columns_err(
                path,
                ReadErrorKind::MissingColumn,
                "Antoine constants need all three columns A, B and C",
            ));
        }
        if !have(Role::Tb) && n_abc == 0 && !have(Role::Smiles) {
            return Err(columns_err(
                path,
                ReadErrorKind::MissingColumn,
                "no column to check: expected a boiling point (e.g. 'Tb/K'), Antoine 'A', 'B', 'C', or 'smiles'",
            ));
        }

        let numeric: Vec<(Role, Kind)> = vec![
            (Role::Tb, Kind::Temperature),
            (Role::A, Kind::Plain),
            (Role::B, Kind::Plain),
            (Role::C, Kind::Plain),
            (Role::Tmin, Kind::Temperature),
            (Role::Tmax, Kind::Temperature),
            (Role::Tc, Kind::Temperature),
            (Role::Pc, Kind::Pressure),
        ];
        let read: Vec<(Role, NumRead)> = match scan.as_deref_mut() {
            None => numeric
                .par_iter()
                .filter_map(|&(r, k)| {
                    let (h, u) = roles.get(&r)?;
                    let c = frame.column(h).ok()?;
                    Some((r, read_numeric(path, h, c, k, u.as_deref(), line0)))
                })
                .collect(),
            Some(scan) => {
                let raws: Vec<_> = numeric
                    .par_iter()
                    .filter_map(|&(r, k)| {
                        let (h, _) = roles.get(&r)?;
                        let c = frame.column(h).ok()?;
                        let reported = scan.cols.get(&r).map_or(0, |s| s.reported);
                        Some((r, k, read_raw(path, h, c, k, line0, reported)))
                    })
                    .collect();
                let mut read = Vec::with_capacity(raws.len());
                for (r, k, res) in raws {
                    let (h, u) = &roles[&r];
                    read.push((r, scan.batch_column(path, r, k, h, u.as_deref(), res)));
                }
                read
            }
        };
        let mut nums: HashMap<Role, (NumColumn, Option<String>)> = HashMap::new();
        for (r, res) in read {
            nums.insert(r, res?);
        }
        let mut bad: HashMap<usize, Vec<(String, String)>> = HashMap::new();
        for (r, (c, _)) in &nums {
            let h = roles.get(r).map(|x| x.0.clone()).unwrap_or_default();
            for (i, m) in &c.bad {
                bad.entry(*i).or_default().push((h.clone(), m.clone()));
            }
        }
        let mut take = |r: Role| nums.remove(&r);
        let mut tb_unit = TemperatureUnit::Kelvin;
        let tb_k = match take(Role::Tb) {
            Some((c, Some(u))) => {
                tb_unit = TemperatureUnit::parse(&u).unwrap_or(TemperatureUnit::Kelvin);
                Some(c.values)
            }
            Some((c, None)) if scan.is_some() => Some(c.values),
            Some((_, None)) => return Err(missing_unit(path, &roles[&Role::Tb].0, "Tb/K")),
            None => None,
        };
        let tc_k = match take(Role::Tc) {
            Some((c, Some(_))) => Some(c.values),
            Some((c, None)) if scan.is_some() => Some(c.values),
            Some((_, None)) => return Err(missing_unit(path, &roles[&Role::Tc].0, "Tc/K")),
            None => None,
        };
        let pc_pa = take(Role::Pc).map(|(c, _)| c.values);
        let tmin = take(Role::Tmin).map(|(c, u)| (c.values, u.is_some()));
        let tmax = take(Role::Tmax).map(|(c, u)| (c.values, u.is_some()));
        let abc = match (take(Role::A), take(Role::B), take(Role::C)) {
            (Some(a), Some(b), Some(c)) => Some([a.0.values, b.0.values, c.0.values]),
            _ => None,
        };

        // Conventions per row.
        let mut conventions = vec![opts.constants; n];
        if abc.is_some() {
            let conv_col = text(Role::Convention)?;
            let parts = [text(Role::LogBase)?, text(Role::PUnit)?, text(Role::TUnit)?];
            let three = parts.iter().all(Option::is_some);
            if conv_col.is_none() && !three && opts.constants.is_none() {
                return Err(columns_err(
                    path,
                    ReadErrorKind::MissingColumn,
                    "Antoine constants A, B, C need their convention: give it for the whole table (for example \"log10,mmHg,degC\") or add a 'convention' column",
                ));
            }
            // Tables repeat a handful of conventions: parse each distinct
            // text once, and compare with the previous row's before hashing.
            let parse = |t: &str| {
                let mut p = t.split(',').map(str::trim);
                let base = p.next().and_then(LogBase::parse);
                t.parse::<AntoineConvention>()
                    .ok()
                    .or_else(|| base.and(t.parse().ok()))
            };
            let mut cache: HashMap<String, Option<AntoineConvention>> = HashMap::new();
            let mut last: Option<(String, Option<AntoineConvention>)> = None;
            let mut joined = String::new();
            for (i, slot) in conventions.iter_mut().enumerate() {
                let text: Option<&str> = if let Some(cc) = &conv_col {
                    cc.get(i).map(trimmed).filter(|s| !s.is_empty())
                } else if three {
                    let g = |k: usize| {
                        parts[k]
                            .as_ref()
                            .and_then(|p| p.get(i))
                            .map(str::trim)
                            .filter(|s| !s.is_empty())
                    };
                    match (g(0), g(1), g(2)) {
                        (Some(b), Some(p), Some(t)) => {
                            joined.clear();
                            joined.push_str(b);
                            joined.push(',');
                            joined.push_str(p);
                            joined.push(',');
                            joined.push_str(t);
                            Some(joined.as_str())
                        }
                        _ => None,
                    }
                } else {
                    None
                };
                let Some(t) = text else { continue };
                let parsed = match &last {
                    Some((lt, lp)) if lt == t => *lp,
                    _ => {
                        let p = match cache.get(t) {
                            Some(p) => *p,
                            None => {
                                let p = parse(t);
                                cache.insert(t.to_string(), p);
                                p
                            }
                        };
                        last = Some((t.to_string(), p));
                        p
                    }
                };
                *slot = parsed;
                if parsed.is_none() {
                    bad.entry(i).or_default().push((
                        "convention".into(),
                        format!("'{t}' is not an Antoine convention (write e.g. log10,mmHg,degC)"),
                    ));
                }
            }
        }
        Ok(PropertyTable {
            frame,
            path: path.into(),
            line0,
            compound,
            smiles,
            cas,
            tb_k,
            tb_unit,
            abc,
            conventions,
            tmin,
            tmax,
            tc_k,
            pc_pa,
            bad,
        })
    }

    /// Number of rows.
    pub fn height(&self) -> usize {
        self.frame.height()
    }

    /// The implied normal boiling points of every row in one vectorised pass.
    pub fn implied_tb_k(&self) -> Option<Vec<f64>> {
        let [a, b, c] = self.abc.as_ref()?;
        super::frame::implied_tb_k(a, b, c, &self.conventions).ok()
    }

    /// The path the table was read from.
    pub fn path(&self) -> &Path {
        &self.path
    }
}

fn get(v: &Option<Vec<f64>>, i: usize) -> Option<f64> {
    v.as_ref()
        .and_then(|v| v.get(i).copied())
        .filter(|x| x.is_finite())
}

fn text_at(c: &Option<StringChunked>, i: usize) -> Option<&str> {
    c.as_ref()
        .and_then(|c| c.get(i))
        .map(trimmed)
        .filter(|s| !s.is_empty())
}

impl Rows for PropertyTable {
    fn n_rows(&self) -> usize {
        self.height()
    }

    fn row(&self, i: usize) -> RowInput<'_> {
        let conv = self.conventions.get(i).copied().flatten();
        let antoine = match &self.abc {
            None => AntoineCell::Absent,
            Some([a, b, c]) => {
                let (a, b, c) = (a[i], b[i], c[i]);
                let given = [a, b, c].iter().filter(|x| x.is_finite()).count();
                match (given, conv) {
                    (0, _) => AntoineCell::Absent,
                    (3, Some(cv)) => {
                        let to_k = |v: &Option<(Vec<f64>, bool)>| {
                            let (vals, in_k) = v.as_ref()?;
                            let x = *vals.get(i)?;
                            if !x.is_finite() {
                                return None;
                            }
                            Some(if *in_k { x } else { cv.t_unit.to_kelvin(x) })
                        };
                        let mut k = AntoineConstants::new(a, b, c, cv);
                        match (to_k(&self.tmin), to_k(&self.tmax)) {
                            (None, None) => {}
                            (lo, hi) => {
                                k.range_k = Some((
                                    lo.unwrap_or(f64::NEG_INFINITY),
                                    hi.unwrap_or(f64::INFINITY),
                                ))
                            }
                        }
                        AntoineCell::Given(k)
                    }
                    (3, None) => AntoineCell::NoConvention,
                    _ => AntoineCell::Incomplete,
                }
            }
        };
        RowInput {
            line: i + self.line0,
            compound: text_at(&self.compound, i),
            smiles: text_at(&self.smiles, i),
            cas: text_at(&self.cas, i),
            tb_k: get(&self.tb_k, i),
            tb_unit: self.tb_unit,
            antoine,
            tc_k: get(&self.tc_k, i),
            pc_pa: get(&self.pc_pa, i),
            unreadable: if self.bad.is_empty() {
                Vec::new()
            } else {
                self.bad
                    .get(&i)
                    .map(|v| v.iter().map(|(h, m)| (h.as_str(), m.clone())).collect())
                    .unwrap_or_default()
            },
        }
    }

    fn smiles(&self, i: usize) -> Option<&str> {
        text_at(&self.smiles, i)
    }
}

/// Output file kind, by extension: `.parquet` is Parquet, anything else CSV.
pub fn is_parquet(path: &Path) -> bool {
    matches!(
        path.extension()
            .and_then(|e| e.to_str())
            .map(str::to_ascii_lowercase)
            .as_deref(),
        Some("parquet") | Some("pq")
    )
}

/// The table with added text columns, as CSV or Parquet bytes.
pub fn table_bytes(
    frame: &DataFrame,
    added: Vec<(&str, Vec<String>)>,
    parquet: bool,
    path_for_errors: &Path,
) -> Result<Vec<u8>, TableError> {
    let mut buf = Vec::new();
    write_table(frame, added, parquet, &mut buf, path_for_errors)?;
    Ok(buf)
}

/// Write the table with added text columns to `w`, as CSV or Parquet.
/// Refuses (before writing anything) when an added column's name is taken.
pub fn write_table(
    frame: &DataFrame,
    added: Vec<(&str, Vec<String>)>,
    parquet: bool,
    w: &mut dyn std::io::Write,
    path_for_errors: &Path,
) -> Result<(), TableError> {
    let df = with_added(frame, added, path_for_errors)?;
    write_frame(df, parquet, w, path_for_errors)
}

/// The frame with the added columns; an error when a name is taken.
pub fn with_added(
    frame: &DataFrame,
    added: Vec<(&str, Vec<String>)>,
    path_for_errors: &Path,
) -> Result<DataFrame, TableError> {
    let added = added
        .into_iter()
        .map(|(name, values)| Column::new(name.into(), values))
        .collect();
    with_added_columns(frame, added, path_for_errors)
}

/// The frame with the added columns (named); an error when a name is taken.
pub fn with_added_columns(
    frame: &DataFrame,
    added: Vec<Column>,
    path_for_errors: &Path,
) -> Result<DataFrame, TableError> {
    let mut df = frame.clone();
    for col in added {
        let name = col.name().to_string();
        let name = name.as_str();
        if df.column(name).is_ok() {
            return Err(columns_err(
                path_for_errors,
                ReadErrorKind::AmbiguousColumn,
                format!("the input already has a column named '{name}'; rename it so the check columns can be added"),
            ));
        }
        df.with_column(col).map_err(|e| {
            ReadError::file(
                path_for_errors,
                ReadErrorKind::Io,
                format!("cannot add the check columns: {e}"),
            )
        })?;
    }
    Ok(df)
}

/// Write a frame to `w` as CSV (with header) or Parquet.
pub fn write_frame(
    mut df: DataFrame,
    parquet: bool,
    w: &mut dyn std::io::Write,
    path_for_errors: &Path,
) -> Result<(), TableError> {
    let werr = |e: PolarsError| {
        ReadError::file(
            path_for_errors,
            ReadErrorKind::Io,
            format!("cannot write the table: {e}"),
        )
    };
    if parquet {
        ParquetWriter::new(w).finish(&mut df).map_err(werr)?;
    } else {
        CsvWriter::new(w)
            .include_header(true)
            .finish(&mut df)
            .map_err(werr)?;
    }
    Ok(())
}

/// The `flags`, `severity` and `diagnosis` columns of a screened batch, each
/// row's text written once, straight into polars' text arrays (in parallel
/// pieces; no string per cell).
pub fn check_columns(report: &crate::screen::ScreenReport) -> PolarsResult<Vec<Column>> {
    const PIECE: usize = 8192;
    let n = report.len();
    let pieces: Vec<[StringChunked; 3]> = (0..n.div_ceil(PIECE).max(1))
        .into_par_iter()
        .map(|p| {
            let rows = p * PIECE..((p + 1) * PIECE).min(n);
            let mut b = ["flags", "severity", "diagnosis"]
                .map(|name| StringChunkedBuilder::new(name.into(), rows.len()));
            let mut buf = String::new();
            for i in rows {
                buf.clear();
                report.write_flags(i, &mut buf);
                b[0].append_value(&buf);
                b[1].append_value(report.severity(i).map_or("", |s| s.as_str()));
                buf.clear();
                report.write_diagnosis(i, &mut buf);
                b[2].append_value(&buf);
            }
            b.map(|b| b.finish())
        })
        .collect();
    let mut cols: Option<[StringChunked; 3]> = None;
    for piece in pieces {
        match &mut cols {
            None => cols = Some(piece),
            Some(c) => {
                for (c, p) in c.iter_mut().zip(piece) {
                    c.append_owned(p)?;
                }
            }
        }
    }
    Ok(cols
        .map(|c| c.into_iter().map(|c| c.into_column()).collect())
        .unwrap_or_default())
}

/// One text field of a CSV row as polars' writer (quote style "necessary")
/// writes a present text: `""` when empty, quoted when it holds a comma, a
/// quote or a line break, quotes doubled.
fn csv_field(buf: &mut Vec<u8>, s: &[u8]) {
    if s.is_empty() {
        buf.extend_from_slice(b"\"\"");
        return;
    }
    // short fields (most cells) are scanned byte by byte, long ones (messages) by memchr
    let plain = if s.len() < 48 {
        !s.iter().any(|&b| matches!(b, b',' | b'\n' | b'\r' | b'"'))
    } else {
        memchr::memchr3(b',', b'\n', b'\r', s).is_none() && memchr::memchr(b'"', s).is_none()
    };
    if plain {
        buf.extend_from_slice(s);
        return;
    }
    buf.push(b'"');
    let mut start = 0;
    for q in memchr::memchr_iter(b'"', s) {
        buf.extend_from_slice(&s[start..=q]);
        buf.push(b'"');
        start = q + 1;
    }
    buf.extend_from_slice(&s[start..]);
    buf.push(b'"');
}

enum Sink<'w> {
    Start(&'w mut dyn std::io::Write),
    /// CSV of text columns, written here row by row (header written).
    Text(&'w mut dyn std::io::Write),
    Csv(polars_io::csv::write::BatchedWriter<&'w mut dyn std::io::Write>),
    Parquet(Box<polars_io::parquet::write::BatchedWriter<&'w mut dyn std::io::Write>>),
    Gone,
}

/// Writes a checked table batch by batch, as CSV (one header) or Parquet:
/// the same file [`write_table`] writes from the whole table.
pub struct BatchWriter<'w> {
    sink: Sink<'w>,
    parquet: bool,
    path: PathBuf,
}

impl<'w> BatchWriter<'w> {
    /// Write to `w`; `path_for_errors` names the output in messages.
    pub fn new(w: &'w mut dyn std::io::Write, parquet: bool, path_for_errors: &Path) -> Self {
        BatchWriter {
            sink: Sink::Start(w),
            parquet,
            path: path_for_errors.to_path_buf(),
        }
    }

    fn werr(&self, e: PolarsError) -> TableError {
        ReadError::file(
            &self.path,
            ReadErrorKind::Io,
            format!("cannot write the table: {e}"),
        )
    }

    /// Write the next batch with the added text columns. Refuses (before
    /// writing anything of it) when an added column's name is taken.
    pub fn write(&mut self, frame: &DataFrame, added: Vec<Column>) -> Result<(), TableError> {
        let mut df = with_added_columns(frame, added, &self.path)?;
        // the batched writers take frames whose columns are chunked alike
        df.align_chunks_par();
        if matches!(self.sink, Sink::Start(_)) {
            if let Sink::Start(w) = std::mem::replace(&mut self.sink, Sink::Gone) {
                self.sink = if self.parquet {
                    Sink::Parquet(Box::new(
                        ParquetWriter::new(w)
                            .batched(df.schema())
                            .map_err(|e| self.werr(e))?,
                    ))
                } else {
                    Sink::Csv(
                        CsvWriter::new(w)
                            .include_header(true)
                            .batched(df.schema())
                            .map_err(|e| self.werr(e))?,
                    )
                };
            }
        }
        let r = match &mut self.sink {
            Sink::Csv(c) => c.write_batch(&df),
            Sink::Parquet(p) => p.write_batch(&df),
            _ => Ok(()),
        };
        r.map_err(|e| self.werr(e))
    }

    /// Write the next screened batch: the table's columns and the `flags`,
    /// `severity` and `diagnosis` of `report` ([`check_columns`]). A CSV
    /// whose columns are all text (every CSV read, since it is read as text)
    /// is written here, each row's texts straight into the output, as
    /// polars' CSV writer writes it: a field is quoted when it holds the
    /// separator, a quote or a line break (quotes doubled), an empty text is
    /// `""`, a missing one empty. Anything else goes through [`BatchWriter::write`].
    pub fn write_checked(
        &mut self,
        frame: &DataFrame,
        report: &crate::screen::ScreenReport,
    ) -> Result<(), TableError> {
        let text = !self.parquet
            && frame
                .columns()
                .iter()
                .all(|c| c.dtype() == &DataType::String);
        let start = matches!(self.sink, Sink::Start(_));
        if !(text && (start || matches!(self.sink, Sink::Text(_)))) {
            let cols = check_columns(report).map_err(|e| self.werr(e))?;
            return self.write(frame, cols);
        }
        const ADDED: [&str; 3] = ["flags", "severity", "diagnosis"];
        let mut buf: Vec<u8> = Vec::with_capacity(1 << 20);
        if start {
            let mut names: Vec<&str> = frame
                .get_column_names()
                .into_iter()
                .map(|x| x.as_str())
                .collect();
            for a in ADDED {
                if names.contains(&a) {
                    return Err(columns_err(
                        &self.path,
                        ReadErrorKind::AmbiguousColumn,
                        format!("the input already has a column named '{a}'; rename it so the check columns can be added"),
                    ));
                }
            }
            names.extend(ADDED);
            let opts = polars_io::csv::write::SerializeOptions::default();
            buf = polars_io::csv::write::csv_header(&names, &opts).map_err(|e| self.werr(e))?;
            if let Sink::Start(w) = std::mem::replace(&mut self.sink, Sink::Gone) {
                self.sink = Sink::Text(w);
            }
        }
        let Sink::Text(w) = &mut self.sink else {
            return Ok(());
        };
        let cols: Vec<&StringChunked> = frame
            .columns()
            .iter()
            .map(|c| c.str())
            .collect::<PolarsResult<_>>()
            .map_err(|e| {
                ReadError::file(
                    &self.path,
                    ReadErrorKind::Io,
                    format!("cannot write the table: {e}"),
                )
            })?;
        let mut cells: Vec<_> = cols.iter().map(|c| c.iter()).collect();
        let mut text = String::new();
        let io = |e: std::io::Error, path: &Path| {
            ReadError::file(
                path,
                ReadErrorKind::Io,
                format!("cannot write the table: {e}"),
            )
        };
        for i in 0..frame.height() {
            for cell in cells.iter_mut() {
                // a missing text is written as nothing
                if let Some(v) = cell.next().flatten() {
                    csv_field(&mut buf, v.as_bytes());
                }
                buf.push(b',');
            }
            text.clear();
            report.write_flags(i, &mut text);
            csv_field(&mut buf, text.as_bytes());
            buf.push(b',');
            csv_field(
                &mut buf,
                report.severity(i).map_or("", |s| s.as_str()).as_bytes(),
            );
            buf.push(b',');
            csv_field(&mut buf, report.diagnosis_str(i).as_bytes());
            buf.push(b'\n');
            if buf.len() >= 1 << 20 {
                w.write_all(&buf).map_err(|e| io(e, &self.path))?;
                buf.clear();
            }
        }
        w.write_all(&buf).map_err(|e| io(e, &self.path))
    }

    /// End the file (Parquet's footer).
    pub fn finish(mut self) -> Result<(), TableError> {
        let r = match &mut self.sink {
            Sink::Csv(c) => c.finish(),
            Sink::Parquet(p) => p.finish().map(|_| ()),
            _ => Ok(()),
        };
        r.map_err(|e| self.werr(e))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // The rows written here are polars' CSV, byte for byte: empty and missing
    // texts, commas, quotes and line breaks in the table and in the messages.
    #[test]
    fn checked_csv_is_the_polars_csv() {
        use crate::screen::{CheckCode, Finding, ScreenReport};
        let frame = df! {
            "compound" => [Some("a,b"), Some(""), None, Some("say \"x\""), Some("two\nlines")],
            "Tb/K" => [Some("1"), None, Some("3\r"), Some(""), Some("5")],
        }
        .unwrap();
        let findings = vec![
            vec![],
            vec![Finding::new(
                CheckCode::SmilesUnreadable,
                "The SMILES 'C\"' cannot, be read.",
            )],
            vec![
                Finding::new(CheckCode::TbAntoineMismatch, "plain"),
                Finding::new(CheckCode::SlipDigit, "also plain"),
            ],
            vec![
                Finding::new(
                    CheckCode::ReferenceMismatch,
                    "A message longer than the short-field scan, with \"quotes\" inside it",
                ),
                Finding::new(
                    CheckCode::TbStructureMismatch,
                    "and a second long message that holds nothing to quote at all",
                ),
            ],
            vec![Finding::new(CheckCode::DuplicateDisagrees, "x\ny")],
        ];
        let report = ScreenReport::new(findings, vec![2, 3, 4, 5, 6]);
        let path = Path::new("t.csv");
        let mut want = Vec::new();
        write_table(
            &frame,
            {
                let [f, s, d] = report.columns();
                vec![("flags", f), ("severity", s), ("diagnosis", d)]
            },
            false,
            &mut want,
            path,
        )
        .unwrap();
        let mut got = Vec::new();
        let mut w = BatchWriter::new(&mut got, false, path);
        w.write_checked(&frame, &report).unwrap();
        w.write_checked(&frame.slice(0, 0), &ScreenReport::new(vec![], vec![]))
            .unwrap();
        w.finish().unwrap();
        assert_eq!(
            String::from_utf8(got).unwrap(),
            String::from_utf8(want).unwrap()
        );
    }

    #[test]
    fn headings_are_recognised_with_units() {
        assert_eq!(parse_heading("Tb/K"), Some((Role::Tb, Some("K".into()))));
        assert_eq!(parse_heading("tb/°C"), Some((Role::Tb, Some("°C".into()))));
        assert_eq!(parse_heading("Tb [K]"), Some((Role::Tb, Some("K".into()))));
        assert_eq!(parse_heading("tb_k"), Some((Role::Tb, Some("k".into()))));
        assert_eq!(
            parse_heading("pc/bar"),
            Some((Role::Pc, Some("bar".into())))
        );
        assert_eq!(parse_heading("t_min"), Some((Role::Tmin, None)));
        assert_eq!(parse_heading("log_base"), Some((Role::LogBase, None)));
        assert_eq!(parse_heading("supplier"), None);
    }
}
