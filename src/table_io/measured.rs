//! Measured temperature–pressure data: the in-memory form every reader produces.

use serde::Serialize;

/// One measured point, in SI.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MeasuredPoint {
    /// Temperature, K.
    pub t_k: f64,
    /// Absolute pressure, Pa.
    pub p_pa: f64,
    /// Standard uncertainty of T, K.
    pub u_t_k: Option<f64>,
    /// Standard uncertainty of p, Pa.
    pub u_p_pa: Option<f64>,
    /// 1-based line in the source file (for messages).
    pub line: u64,
}

/// The points of one compound, with the carried-through text columns.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct MeasuredSet {
    /// The `compound` column value, if any.
    pub compound: Option<String>,
    /// The `smiles` column value, if any.
    pub smiles: Option<String>,
    /// The points, in file order.
    pub points: Vec<MeasuredPoint>,
}

use crate::units::{PressureUnit, TemperatureUnit};
use std::path::Path;

/// How to read a measured-data file.
#[derive(Debug, Clone, Default)]
pub struct ReadOptions {
    /// Override the temperature unit of the temperature column (`--t-unit`).
    pub t_unit: Option<TemperatureUnit>,
    /// Override the pressure unit of the pressure column (`--p-unit`).
    pub p_unit: Option<PressureUnit>,
    /// Semicolon-separated with decimal commas (`--decimal-comma`).
    pub decimal_comma: bool,
    /// The site's barometric pressure in pascal (`--barometric`): gauge
    /// pressure columns (`p/barg`) are made absolute with it, refused without.
    pub barometric_pa: Option<f64>,
}

/// A non-fatal remark about the input (e.g. exact duplicate rows).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ReadWarning {
    /// File the remark is about.
    pub file: String,
    /// 1-based line.
    pub line: u64,
    /// Stable kebab-case code.
    pub code: String,
    /// One sentence.
    pub message: String,
}

/// Everything read from one measured-data source, grouped by compound.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct MeasuredData {
    /// Display name of the source (path, or `<stdin>`).
    pub source: String,
    /// One set per compound, in order of first appearance (one set if no `compound` column).
    pub sets: Vec<MeasuredSet>,
    /// Non-fatal remarks.
    pub warnings: Vec<ReadWarning>,
    /// The units the temperature and pressure columns were read in (for
    /// output in the user's units and for re-reading the numbers as written).
    pub units: Option<(TemperatureUnit, PressureUnit)>,
}

use super::error::{display_name, Locus, ReadError, ReadErrorKind};
use super::headings::{classify, Role};
use super::source::{decode_text, detect_format, read_bytes, TableFormat};
use crate::units::{Pressure, Temperature};
use std::collections::HashMap;

/// A table as text cells, whatever the file format: what the validator reads.
pub(crate) struct RawTable {
    pub(crate) headers: Vec<String>,
    pub(crate) rows: RawRows,
    pub(crate) locus: Locus,
}

/// The data rows as read, their trimmed cells end to end in one text: a table of any
/// length costs a few growing buffers, not an allocation per row or cell.
#[derive(Default)]
pub(crate) struct RawRows {
    text: String,
    /// End of each cell in `text`.
    ends: Vec<usize>,
    /// Per row: its line (CSV) or row number (Parquet), its first cell and cell count.
    spans: Vec<(u64, usize, usize)>,
}

impl RawRows {
    fn push<'c>(&mut self, line: u64, cells: impl Iterator<Item = &'c str>) {
        let first = self.ends.len();
        for c in cells {
            self.text.push_str(trim(c));
            self.ends.push(self.text.len());
        }
        self.spans.push((line, first, self.ends.len() - first));
    }
    pub(crate) fn len(&self) -> usize {
        self.spans.len()
    }
    pub(crate) fn is_empty(&self) -> bool {
        self.spans.is_empty()
    }
    pub(crate) fn first(&self) -> Option<RawRow<'_>> {
        self.get(0)
    }
    fn get(&self, i: usize) -> Option<RawRow<'_>> {
        let &(line, first, n) = self.spans.get(i)?;
        Some(RawRow {
            line,
            rows: self,
            first,
            n,
        })
    }
}

impl<'a> IntoIterator for &'a RawRows {
    type Item = RawRow<'a>;
    type IntoIter = RawRowIter<'a>;
    fn into_iter(self) -> RawRowIter<'a> {
        RawRowIter { rows: self, i: 0 }
    }
}

/// The rows of a [`RawRows`], in order.
pub(crate) struct RawRowIter<'a> {
    rows: &'a RawRows,
    i: usize,
}

impl<'a> Iterator for RawRowIter<'a> {
    type Item = RawRow<'a>;
    fn next(&mut self) -> Option<RawRow<'a>> {
        let r = self.rows.get(self.i)?;
        self.i += 1;
        Some(r)
    }
}

/// One data row: its line (CSV) or row number (Parquet) and its trimmed cells.
#[derive(Clone, Copy)]
pub(crate) struct RawRow<'a> {
    pub(crate) line: u64,
    rows: &'a RawRows,
    first: usize,
    n: usize,
}

impl<'a> RawRow<'a> {
    /// Cell `i`, trimmed; "" past the row's end.
    pub(crate) fn cell(&self, i: usize) -> &'a str {
        if i >= self.n {
            return "";
        }
        let k = self.first + i;
        let start = if k == 0 { 0 } else { self.rows.ends[k - 1] };
        &self.rows.text[start..self.rows.ends[k]]
    }
    /// The row's trimmed cells run together.
    fn joined(&self) -> &'a str {
        if self.n == 0 {
            return "";
        }
        let start = if self.first == 0 {
            0
        } else {
            self.rows.ends[self.first - 1]
        };
        &self.rows.text[start..self.rows.ends[self.first + self.n - 1]]
    }
    fn cells(&self) -> impl Iterator<Item = &'a str> + '_ {
        (0..self.n).map(|i| self.cell(i))
    }
}

/// A row compared and hashed by its trimmed cells: the repeated-row warning.
struct SameCells<'a>(RawRow<'a>);

impl PartialEq for SameCells<'_> {
    fn eq(&self, other: &Self) -> bool {
        self.0.n == other.0.n && self.0.cells().eq(other.0.cells())
    }
}

impl Eq for SameCells<'_> {}

impl std::hash::Hash for SameCells<'_> {
    // The cells lie end to end in one text: rows with the same cells have the same
    // count and the same run of text (the converse is for `eq` to settle).
    fn hash<H: std::hash::Hasher>(&self, h: &mut H) {
        let r = &self.0;
        h.write_usize(r.n);
        h.write(r.joined().as_bytes());
    }
}

/// Any measured table as text cells (CSV or Parquet): shared with the binary reader.
pub(crate) fn raw_table(
    path: &Path,
    bytes: &[u8],
    opts: &ReadOptions,
) -> Result<RawTable, ReadError> {
    match detect_format(path, bytes) {
        TableFormat::Parquet => parquet_raw(path, bytes),
        TableFormat::Csv => csv_raw(path, bytes, opts),
    }
}

/// Read measured (T, p) data from CSV, Parquet (by extension or magic bytes) or stdin (`-`).
///
/// ```
/// use ebullio::table_io::{read_measured, ReadOptions};
/// let dir = std::env::temp_dir().join(format!("ebullio-rm-{}", std::process::id()));
/// std::fs::create_dir_all(&dir).unwrap();
/// let f = dir.join("d.csv");
/// std::fs::write(&f, "t/degC,p/kPa\n50,12.3\n60,18.9\n").unwrap();
/// let d = read_measured(&f, &ReadOptions::default()).unwrap();
/// assert_eq!(d.sets[0].points.len(), 2);
/// assert!((d.sets[0].points[0].t_k - 323.15).abs() < 1e-12);
/// assert!((d.sets[0].points[0].p_pa - 12_300.0).abs() < 1e-9);
/// std::fs::remove_dir_all(&dir).unwrap();
/// ```
pub fn read_measured(path: &Path, opts: &ReadOptions) -> Result<MeasuredData, ReadError> {
    let bytes = read_bytes(path)?;
    read_measured_bytes(path, &bytes, opts)
}

/// Read measured data from bytes already in memory (`path` is used for messages and
/// format detection only).
pub fn read_measured_bytes(
    path: &Path,
    bytes: &[u8],
    opts: &ReadOptions,
) -> Result<MeasuredData, ReadError> {
    let raw = raw_table(path, bytes, opts)?;
    validate(path, raw, opts)
}

fn csv_raw(path: &Path, bytes: &[u8], opts: &ReadOptions) -> Result<RawTable, ReadError> {
    csv_rows(path, bytes, opts, false)
}

/// The headings of a table alone (CSV: the first line that is not blank or a comment,
/// without reading further; Parquet: read whole).
pub(crate) fn raw_headers(
    path: &Path,
    bytes: &[u8],
    opts: &ReadOptions,
) -> Result<Vec<String>, ReadError> {
    match detect_format(path, bytes) {
        TableFormat::Parquet => parquet_raw(path, bytes).map(|r| r.headers),
        TableFormat::Csv => csv_rows(path, bytes, opts, true).map(|r| r.headers),
    }
}

/// Read CSV cells, trimmed, skipping blank and comment lines; with `headers_only`, stop after
/// the header. A cell is copied once (trimmed) into its row ([`records`]).
fn csv_rows(
    path: &Path,
    bytes: &[u8],
    opts: &ReadOptions,
    headers_only: bool,
) -> Result<RawTable, ReadError> {
    let text = decode_text(path, bytes)?;
    if text.trim().is_empty() {
        return Err(ReadError::file(
            path,
            ReadErrorKind::EmptyFile,
            "the file is empty; expected a header line such as \"t/degC,p/kPa\" and data rows",
        ));
    }
    let first = text.lines().next().unwrap_or_default();
    let delim = if opts.decimal_comma { b';' } else { b',' };
    if !opts.decimal_comma && first.contains(';') && !first.contains(',') {
        return Err(ReadError::file(
            path,
            ReadErrorKind::Delimiter,
            "the columns are separated by semicolons (a decimal-comma file?); use --decimal-comma",
        )
        .at_line(1, Locus::Line));
    }
    records(path, text, opts, headers_only, is_plain(text, delim))
}

/// The records of a CSV text as [`csv_rows`] reads them: line by line when `plain` (see
/// [`is_plain`]), else through the csv crate.
fn records(
    path: &Path,
    text: &str,
    opts: &ReadOptions,
    headers_only: bool,
    plain: bool,
) -> Result<RawTable, ReadError> {
    let delim = if opts.decimal_comma { b';' } else { b',' };
    let mut headers: Option<Vec<String>> = None;
    let mut rows = RawRows::default();
    let mut table = (&mut headers, &mut rows);
    if plain {
        // No quotes, and carriage returns only in line ends: a record is a line split at the
        // delimiter (what the csv crate reads from such a text, blank lines skipped), without
        // the per-record UTF-8 check of a text that is already a str.
        let mut start = 0;
        let ends = memchr::memchr_iter(b'\n', text.as_bytes()).chain([text.len()]);
        for (i, end) in ends.enumerate() {
            let l = &text[start..end];
            let l = l.strip_suffix('\r').unwrap_or(l);
            start = end + 1;
            if l.is_empty() {
                continue;
            }
            let n = l.bytes().filter(|&b| b == delim).count() + 1;
            let cells = Cells {
                rest: Some(l),
                delim,
            };
            if take_record(path, opts, headers_only, &mut table, i as u64 + 1, cells, n)? {
                break;
            }
        }
    } else {
        let mut rdr = csv::ReaderBuilder::new()
            .has_headers(false)
            .flexible(true)
            .delimiter(delim)
            .from_reader(text.as_bytes());
        let mut rec = csv::StringRecord::new();
        loop {
            match rdr.read_record(&mut rec) {
                Ok(true) => {}
                Ok(false) => break,
                Err(e) => {
                    let line = e.position().map(|p| p.line()).unwrap_or(0);
                    return Err(ReadError::file(
                        path,
                        ReadErrorKind::CsvSyntax,
                        format!("broken CSV: {e}"),
                    )
                    .at_line(line.max(1), Locus::Line));
                }
            }
            let line = rec.position().map_or(0, |p| record_line(text, p));
            if take_record(
                path,
                opts,
                headers_only,
                &mut table,
                line,
                rec.iter(),
                rec.len(),
            )? {
                break;
            }
        }
    }
    let headers = headers.ok_or_else(|| ReadError::no_header(path))?;
    Ok(RawTable {
        headers,
        rows,
        locus: Locus::Line,
    })
}

/// A CSV text whose records are its lines split at the delimiter: no quote character (so no
/// quoted field) and carriage returns only just before a '\n' (so every record ends at a
/// '\n', the byte the csv crate counts lines by, as Windows files do). Decimal-comma files
/// take the general reader.
fn is_plain(text: &str, delim: u8) -> bool {
    let b = text.as_bytes();
    delim == b','
        && memchr::memchr(b'"', b).is_none()
        && memchr::memchr_iter(b'\r', b).all(|i| b.get(i + 1) == Some(&b'\n'))
}

/// The line a record of the csv crate starts on: the crate gives the position where it began
/// looking for it, before any blank lines it skipped, so those are counted here.
fn record_line(text: &str, p: &csv::Position) -> u64 {
    let at = usize::try_from(p.byte())
        .unwrap_or(usize::MAX)
        .min(text.len());
    let blank = text.as_bytes()[at..]
        .iter()
        .take_while(|&&b| b == b'\n' || b == b'\r')
        .filter(|&&b| b == b'\n')
        .count();
    p.line() + blank as u64
}

/// The cells of one plain line (split at an ASCII delimiter), scanned byte by byte: cells are
/// short, where a searcher's setup costs more than the scan.
#[derive(Clone)]
struct Cells<'a> {
    rest: Option<&'a str>,
    delim: u8,
}

impl<'a> Iterator for Cells<'a> {
    type Item = &'a str;
    fn next(&mut self) -> Option<&'a str> {
        let rest = self.rest?;
        match rest.bytes().position(|b| b == self.delim) {
            Some(k) => {
                // the delimiter is ASCII, so both sides are on character boundaries
                self.rest = Some(&rest[k + 1..]);
                Some(&rest[..k])
            }
            None => {
                self.rest = None;
                Some(rest)
            }
        }
    }
}

/// `c.trim()`, without the character-by-character search when both ends are visible ASCII
/// (most cells), where it changes nothing.
fn trim(c: &str) -> &str {
    let b = c.as_bytes();
    if b.first().is_some_and(u8::is_ascii_graphic) && b.last().is_some_and(u8::is_ascii_graphic) {
        c
    } else {
        c.trim()
    }
}

/// One record of [`csv_rows`] (its `n` cells, untrimmed): skipped when blank or a comment,
/// else the header or a data row. `Ok(true)` when reading should stop (only the header
/// was wanted).
fn take_record<'c>(
    path: &Path,
    opts: &ReadOptions,
    headers_only: bool,
    (headers, rows): &mut (&mut Option<Vec<String>>, &mut RawRows),
    line: u64,
    cells: impl Iterator<Item = &'c str> + Clone,
    n: usize,
) -> Result<bool, ReadError> {
    // Skip blank lines and comment lines starting with '#'.
    let mut first = cells.clone();
    if first.next().is_some_and(|c| trim(c).starts_with('#'))
        || cells.clone().all(|c| trim(c).is_empty())
    {
        return Ok(false);
    }
    match headers {
        None => {
            **headers = Some(cells.map(|c| c.trim().to_string()).collect());
            Ok(headers_only)
        }
        Some(h) => {
            if n != h.len() {
                return Err(ReadError::ragged(path, line, n, h.len()));
            }
            if opts.decimal_comma {
                let cells: Vec<String> = cells.map(|c| c.trim().replace(',', ".")).collect();
                rows.push(line, cells.iter().map(String::as_str));
            } else {
                rows.push(line, cells);
            }
            Ok(false)
        }
    }
}

#[cfg(feature = "tables")]
fn parquet_raw(path: &Path, bytes: &[u8]) -> Result<RawTable, ReadError> {
    super::parquet::read_as_text(path, bytes).map(|(headers, rows)| RawTable {
        headers,
        rows: {
            let mut raw = RawRows::default();
            for (n, cells) in &rows {
                raw.push(*n, cells.iter().map(String::as_str));
            }
            raw
        },
        locus: Locus::Row,
    })
}

#[cfg(not(feature = "tables"))]
fn parquet_raw(path: &Path, _bytes: &[u8]) -> Result<RawTable, ReadError> {
    Err(ReadError::file(
        path,
        ReadErrorKind::Parquet,
        "this build of ebullio has no Parquet support (built without the `tables` feature); convert the file to CSV",
    ))
}

struct Columns {
    t: (usize, Role),
    p: (usize, Role),
    ut: Option<(usize, Role)>,
    up: Option<(usize, Role)>,
    compound: Option<usize>,
    smiles: Option<usize>,
}

fn find_columns(path: &Path, headers: &[String], locus: Locus) -> Result<Columns, ReadError> {
    let mut t = None;
    let mut p = None;
    let mut ut = None;
    let mut up = None;
    let mut compound = None;
    let mut smiles = None;
    let at_header = |e: ReadError, i: usize, h: &str| match locus {
        Locus::Line => e.at_line(1, Locus::Line).at_column(i, h),
        Locus::Row => e.at_column(i, h),
    };
    for (i, h) in headers.iter().enumerate() {
        let role = classify(h).map_err(|e| {
            at_header(
                ReadError::file(
                    path,
                    ReadErrorKind::HeadingUnit,
                    format!("heading '{h}': {}", e.message),
                ),
                i,
                h,
            )
        })?;
        let slot = match role {
            Role::Temperature(_) => &mut t,
            Role::Pressure(_) | Role::GaugePressure(_) => &mut p,
            Role::UTemperature(_) => &mut ut,
            Role::UPressure(_) => &mut up,
            Role::Compound => {
                compound.get_or_insert(i);
                continue;
            }
            Role::Smiles => {
                smiles.get_or_insert(i);
                continue;
            }
            Role::Other => continue,
        };
        if let Some((j, _)) = *slot {
            let other: &String = &headers[j];
            return Err(at_header(
                ReadError::file(
                    path,
                    ReadErrorKind::AmbiguousColumn,
                    format!("both '{other}' and '{h}' look like the same quantity; keep one (or rename the other, e.g. to 'note')"),
                ),
                i,
                h,
            ));
        }
        *slot = Some((i, role));
    }
    let t = t.ok_or_else(|| {
        ReadError::file(
            path,
            ReadErrorKind::NoTemperatureColumn,
            format!(
                "no temperature column among [{}]; expected a heading such as T/K, t/degC or T [K]",
                headers.join(", ")
            ),
        )
    })?;
    let p = p.ok_or_else(|| {
        ReadError::file(
            path,
            ReadErrorKind::NoPressureColumn,
            format!(
                "no pressure column among [{}]; expected a heading such as p/kPa, p/mmHg or p (bar)",
                headers.join(", ")
            ),
        )
    })?;
    Ok(Columns {
        t,
        p,
        ut,
        up,
        compound,
        smiles,
    })
}

pub(crate) fn number(
    path: &Path,
    line: u64,
    locus: Locus,
    col: usize,
    heading: &str,
    cell: &str,
) -> Result<f64, ReadError> {
    let err = |kind, msg: String| {
        ReadError::file(path, kind, msg)
            .at_line(line, locus)
            .at_column(col, heading)
    };
    if cell.is_empty() {
        return Err(err(
            ReadErrorKind::EmptyCell,
            "empty cell; expected a number".to_string(),
        ));
    }
    let v: f64 = super::plain_number::parse_number(cell).ok_or_else(|| {
        let hint = if cell.contains(',') {
            " (a decimal comma? use --decimal-comma with semicolon-separated files)"
        } else {
            ""
        };
        err(
            ReadErrorKind::NotANumber,
            format!("'{cell}' is not a number{hint}"),
        )
    })?;
    if !v.is_finite() {
        return Err(err(
            ReadErrorKind::NotFinite,
            format!("'{cell}' is not a finite number"),
        ));
    }
    Ok(v)
}

fn validate(path: &Path, raw: RawTable, opts: &ReadOptions) -> Result<MeasuredData, ReadError> {
    let locus = raw.locus;
    let cols = find_columns(path, &raw.headers, locus)?;
    if raw.rows.is_empty() {
        return Err(ReadError::file(
            path,
            ReadErrorKind::HeaderOnly,
            "the file has a header but no data rows",
        ));
    }
    let heading = |i: usize| raw.headers[i].as_str();
    let (ti, Role::Temperature(t_head)) = cols.t else {
        unreachable!("find_columns returns a temperature role")
    };
    let (pi, p_head, gauge) = match cols.p {
        (i, Role::Pressure(u)) => (i, u, false),
        (i, Role::GaugePressure(u)) => (i, Some(u), true),
        _ => unreachable!("find_columns returns a pressure role"),
    };
    let barometric = if gauge && opts.p_unit.is_none() {
        let Some(b) = opts.barometric_pa else {
            return Err(ReadError::file(
                path,
                ReadErrorKind::HeadingUnit,
                format!(
                    "heading '{}' is a gauge pressure (relative to the atmosphere); give the site's barometric pressure, e.g. --barometric \"1013 mbar\", to convert it to absolute",
                    heading(pi)
                ),
            )
            .at_column(pi, heading(pi)));
        };
        b
    } else {
        0.0
    };
    let t_unit = opts.t_unit.or(t_head).ok_or_else(|| {
        ReadError::file(
            path,
            ReadErrorKind::HeadingUnit,
            format!(
                "heading '{}' has no unit; write it as T/K or t/degC, or pass --t-unit",
                heading(ti)
            ),
        )
        .at_column(ti, heading(ti))
    })?;
    let p_unit = opts.p_unit.or(p_head).ok_or_else(|| {
        ReadError::file(
            path,
            ReadErrorKind::HeadingUnit,
            format!(
                "heading '{}' has no unit; write it as p/kPa or p/mmHg, or pass --p-unit",
                heading(pi)
            ),
        )
        .at_column(pi, heading(pi))
    })?;
    let ut_unit = cols.ut.map(|(i, r)| match r {
        Role::UTemperature(u) => (i, u.unwrap_or(t_unit)),
        _ => (i, t_unit),
    });
    let up_unit = cols.up.map(|(i, r)| match r {
        Role::UPressure(u) => (i, u.unwrap_or(p_unit)),
        _ => (i, p_unit),
    });

    let mut data = MeasuredData {
        source: display_name(path),
        sets: Vec::new(),
        warnings: Vec::new(),
        units: Some((t_unit, p_unit)),
    };
    // Rows are borrowed as keys (no copy per row) and the maps sized once: on a batch of
    // 10,000 compounds the copies and rehashes cost as much as the fits.
    // foldhash, seeded per process like the standard hasher, at a fraction of SipHash's cost.
    let mut set_index: HashMap<&str, usize, foldhash::quality::RandomState> = HashMap::default();
    let mut seen_rows: HashMap<SameCells, u64, foldhash::quality::RandomState> =
        HashMap::with_capacity_and_hasher(raw.rows.len(), Default::default());
    for row in &raw.rows {
        let line = row.line;
        let cell = |i: usize| row.cell(i);
        let tv = number(path, line, locus, ti, heading(ti), cell(ti))?;
        let t = Temperature::new(tv, t_unit).map_err(|e| {
            ReadError::file(path, ReadErrorKind::BelowAbsoluteZero, e.to_string())
                .at_line(line, locus)
                .at_column(ti, heading(ti))
        })?;
        let pv = number(path, line, locus, pi, heading(pi), cell(pi))?;
        let pv = if barometric > 0.0 {
            p_unit.from_pa(p_unit.to_pa(pv) + barometric)
        } else {
            pv
        };
        let p = Pressure::new(pv, p_unit).map_err(|e| {
            ReadError::file(path, ReadErrorKind::NonPositivePressure, e.to_string())
                .at_line(line, locus)
                .at_column(pi, heading(pi))
        })?;
        let uncertainty = |spec: Option<(usize, f64)>| -> Result<Option<f64>, ReadError> {
            let Some((i, scale)) = spec else {
                return Ok(None);
            };
            if cell(i).is_empty() {
                return Ok(None);
            }
            let v = number(path, line, locus, i, heading(i), cell(i))?;
            if v < 0.0 {
                return Err(ReadError::file(
                    path,
                    ReadErrorKind::NegativeUncertainty,
                    format!(
                        "uncertainty '{}' is negative; expected a standard uncertainty ≥ 0",
                        cell(i)
                    ),
                )
                .at_line(line, locus)
                .at_column(i, heading(i)));
            }
            Ok(Some(v * scale))
        };
        let u_t_k = uncertainty(ut_unit.map(|(i, u)| (i, u.kelvin_per_degree())))?;
        let u_p_pa = uncertainty(up_unit.map(|(i, u)| (i, u.pa_per_unit())))?;

        match seen_rows.entry(SameCells(row)) {
            std::collections::hash_map::Entry::Occupied(first) => {
                let first = *first.get();
                data.warnings.push(ReadWarning {
                    file: display_name(path),
                    line,
                    code: "repeated-row".into(),
                    message: format!(
                        "this row repeats line {first} exactly; both are kept (remove one if it was pasted twice)"
                    ),
                });
            }
            std::collections::hash_map::Entry::Vacant(v) => {
                v.insert(line);
            }
        }

        let key = cols.compound.map(cell).unwrap_or("");
        let idx = *set_index.entry(key).or_insert_with(|| {
            data.sets.push(MeasuredSet {
                compound: Some(key.to_string()).filter(|s| !s.is_empty()),
                smiles: None,
                points: Vec::new(),
            });
            data.sets.len() - 1
        });
        let set = &mut data.sets[idx];
        if set.smiles.is_none() {
            set.smiles = cols
                .smiles
                .map(|i| cell(i).to_string())
                .filter(|s| !s.is_empty());
        }
        set.points.push(MeasuredPoint {
            t_k: t.kelvin(),
            p_pa: p.pa(),
            u_t_k,
            u_p_pa,
            line,
        });
    }
    Ok(data)
}

/// Fit one measured set (as read by [`read_measured`]): its points in SI, with their file
/// lines so that errors and findings name them.
pub fn fit_set(
    set: &MeasuredSet,
    opts: &crate::fit::FitOptions,
) -> Result<crate::fit::FitReport, crate::fit::FitError> {
    let points: Vec<crate::fit::Point> = set
        .points
        .iter()
        .map(|p| crate::fit::Point {
            t_k: p.t_k,
            p_pa: p.p_pa,
            u_t_k: p.u_t_k,
            u_p_pa: p.u_p_pa,
        })
        .collect();
    let lines: Vec<u64> = set.points.iter().map(|p| p.line).collect();
    crate::fit::fit_points_with_lines(set.compound.clone(), &points, &lines, opts)
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;
    use std::path::PathBuf;

    fn read(text: &str, opts: &ReadOptions) -> Result<MeasuredData, ReadError> {
        read_measured_bytes(&PathBuf::from("in.csv"), text.as_bytes(), opts)
    }
    fn kind(text: &str) -> ReadErrorKind {
        read(text, &ReadOptions::default()).unwrap_err().kind
    }

    #[test]
    fn reads_units_uncertainties_and_compounds() {
        let d = read(
            "compound,t/°C,p/mmHg,u(T)/K,u(p)/mmHg,note\nA,50,100,0.1,0.5,x\nB,60,200,,,\nA,70,300,0.1,0.5,\n",
            &ReadOptions::default(),
        )
        .unwrap();
        assert_eq!(d.sets.len(), 2);
        assert_eq!(d.sets[0].compound.as_deref(), Some("A"));
        assert_eq!(d.sets[0].points.len(), 2);
        let p = &d.sets[0].points[0];
        assert!((p.t_k - 323.15).abs() < 1e-12);
        assert!((p.p_pa - 100.0 * 133.322_387_415).abs() < 1e-9);
        assert_eq!(p.u_t_k, Some(0.1));
        assert!((p.u_p_pa.unwrap() - 0.5 * 133.322_387_415).abs() < 1e-12);
        assert_eq!(p.line, 2);
        assert_eq!(d.sets[1].points[0].u_t_k, None);
    }

    #[test]
    fn bom_decimal_comma_and_overrides() {
        let d = read("\u{feff}T/K,p/kPa\n300,3.5\n", &ReadOptions::default()).unwrap();
        assert_eq!(d.sets[0].points[0].t_k, 300.0);
        let o = ReadOptions {
            decimal_comma: true,
            ..Default::default()
        };
        let d = read("t/degC;p/kPa\n50,5;12,25\n", &o).unwrap();
        assert!((d.sets[0].points[0].t_k - 323.65).abs() < 1e-12);
        assert_eq!(kind("t/degC;p/kPa\n50,5;12,25\n"), ReadErrorKind::Delimiter);
        let o = ReadOptions {
            t_unit: Some(crate::units::TemperatureUnit::Celsius),
            p_unit: Some(crate::units::PressureUnit::Bar),
            ..Default::default()
        };
        let d = read("T,p\n100,1\n", &o).unwrap();
        assert!((d.sets[0].points[0].p_pa - 1e5).abs() < 1e-9);
    }

    #[test]
    fn every_bad_case_has_its_kind_and_position() {
        use ReadErrorKind as K;
        assert_eq!(kind(""), K::EmptyFile);
        assert_eq!(kind("T/K,p/kPa\n"), K::HeaderOnly);
        assert_eq!(kind("T/K,x\n1,2\n"), K::NoPressureColumn);
        assert_eq!(kind("x,p/kPa\n1,2\n"), K::NoTemperatureColumn);
        assert_eq!(kind("T/K,t/degC,p/kPa\n1,2,3\n"), K::AmbiguousColumn);
        assert_eq!(kind("T/K,p/furlong\n1,2\n"), K::HeadingUnit);
        assert_eq!(kind("T/K,p/kPa\n300,abc\n"), K::NotANumber);
        assert_eq!(kind("T/K,p/kPa\n300,\n"), K::EmptyCell);
        assert_eq!(kind("T/K,p/kPa\n300,NaN\n"), K::NotFinite);
        assert_eq!(kind("T/K,p/kPa\n300,inf\n"), K::NotFinite);
        assert_eq!(kind("T/K,p/kPa\n300,-1\n"), K::NonPositivePressure);
        assert_eq!(kind("T/K,p/kPa\n300,0\n"), K::NonPositivePressure);
        assert_eq!(kind("t/degC,p/kPa\n-300,1\n"), K::BelowAbsoluteZero);
        assert_eq!(
            kind("T/K,p/kPa,u(T)/K\n300,1,-0.1\n"),
            K::NegativeUncertainty
        );
        assert_eq!(kind("T/K,p/kPa\n300,1,5\n"), K::RaggedRow);
        assert_eq!(kind("T,p\n300,1\n"), K::HeadingUnit);
        let e = read("T/K,p/kPa\n300,1\n310,x\n", &ReadOptions::default()).unwrap_err();
        assert_eq!(e.line, Some(3));
        assert_eq!(e.column.as_deref(), Some("p/kPa"));
        assert!(
            e.to_string()
                .starts_with("in.csv, line 3, column 2 (p/kPa)"),
            "{e}"
        );
        let e = read_measured_bytes(
            Path::new("in.csv"),
            b"T/K,p/kPa\n3\xB000,1\n",
            &ReadOptions::default(),
        )
        .unwrap_err();
        assert_eq!(e.kind, K::NotUtf8);
        assert_eq!(e.line, Some(2));
    }

    // After blank lines an error names the row's own line, in plain files and in files the
    // csv crate reads (quotes, CRLF), whose position is where the blank lines began.
    #[test]
    fn plain_means_no_quotes_and_no_lone_carriage_return() {
        assert!(is_plain("T/K,p/kPa\r\n300,1\r\n", b','));
        assert!(!is_plain("T/K,p/kPa\r300,1\r\n", b','));
        assert!(!is_plain("T/K,p/kPa\n300,1\r", b','));
        assert!(!is_plain("\"T/K\",p/kPa\n300,1\n", b','));
        assert!(!is_plain("T/K;p/kPa\n300;1\n", b';'));
    }

    #[test]
    fn errors_after_blank_lines_name_the_row_line() {
        for text in [
            "T/K,p/kPa\n300,1\n\n\n310,x\n",
            "T/K,p/kPa\r\n300,1\r\n\r\n\r\n\"310\",x\r\n",
            "\"T/K\",p/kPa\n300,1\n\n\n310,x\n",
        ] {
            let e = read(text, &ReadOptions::default()).unwrap_err();
            assert_eq!(e.line, Some(5), "{text:?}: {e}");
        }
    }

    #[test]
    fn duplicate_rows_are_kept_and_warned() {
        let d = read("T/K,p/kPa\n300,1\n300,1\n310,2\n", &ReadOptions::default()).unwrap();
        assert_eq!(d.sets[0].points.len(), 3);
        assert_eq!(d.warnings.len(), 1);
        assert_eq!(d.warnings[0].code, "repeated-row");
        assert_eq!(d.warnings[0].line, 3);
        // the same characters split differently are different rows
        let text = "compound,T/K,p/kPa\nx1,300,1\nx,1300,1\nx1,30,01\n";
        assert!(read(text, &ReadOptions::default())
            .unwrap()
            .warnings
            .is_empty());
    }

    proptest! {
        #[test]
        fn arbitrary_bytes_never_panic(bytes in proptest::collection::vec(any::<u8>(), 0..300)) {
            let _ = read_measured_bytes(Path::new("x.csv"), &bytes, &ReadOptions::default());
        }

        #[test]
        fn arbitrary_csv_text_never_panics(s in "[Tp/Kka,;0-9.\\- \n\"e]{0,120}") {
            let _ = read(&s, &ReadOptions::default());
            let _ = read(&s, &ReadOptions { decimal_comma: true, ..Default::default() });
        }

        // The line-by-line reader of plain texts gives what the csv crate gives: the same
        // headings, rows, cells, lines and errors (blank, comment, ragged and spaced lines).
        #[test]
        fn plain_texts_read_as_the_csv_crate_reads_them(
            s in "(\r\n|[Tp/K#,; 0-9.a\n\u{a0}\t]){0,120}",
            headers_only in any::<bool>(),
        ) {
            let path = Path::new("p.csv");
            let opts = ReadOptions::default();
            prop_assume!(is_plain(&s, b','));
            let show = |r: Result<RawTable, ReadError>| match r {
                Ok(t) => {
                    let rows: Vec<(u64, Vec<String>)> = t
                        .rows
                        .into_iter()
                        .map(|r| (r.line, r.cells().map(str::to_string).collect()))
                        .collect();
                    format!("{:?} {rows:?}", t.headers)
                }
                Err(e) => e.to_string(),
            };
            prop_assert_eq!(
                show(records(path, &s, &opts, headers_only, true)),
                show(records(path, &s, &opts, headers_only, false))
            );
        }

        // Round trip: values written in a random unit read back in SI within
        // 1e-11 (conversion results are kept to 12 significant digits, units::tidy).
        #[test]
        fn written_values_read_back(
            pts in proptest::collection::vec((1.0f64..2000.0, 1e-2f64..1e7), 1..20),
            tu in proptest::sample::select(crate::units::TemperatureUnit::ALL.to_vec()),
            pu in proptest::sample::select(crate::units::PressureUnit::ALL.to_vec()),
        ) {
            let mut text = format!("T/{},p/{}\n", tu.symbol(), pu.symbol());
            for (t, p) in &pts {
                text.push_str(&format!("{:e},{:e}\n", tu.from_kelvin(*t), pu.from_pa(*p)));
            }
            let d = read(&text, &ReadOptions::default()).unwrap();
            for ((t, p), got) in pts.iter().zip(&d.sets[0].points) {
                prop_assert!(((got.t_k - t) / t).abs() < 1e-11);
                prop_assert!(((got.p_pa - p) / p).abs() < 1e-11);
            }
        }
    }
}
