//! A table read as text cells, CSV or Parquet, for batch commands that take one row per job
//! (e.g. `estimate --input`). Rows that cannot be read are kept as per-row errors so a batch
//! never stops on one bad row; only a file that cannot be read at all is an error.

use super::error::{Locus, ReadError, ReadErrorKind};
use super::source::{detect_format, read_bytes, TableFormat};
use std::path::{Path, PathBuf};

/// One data row: its 1-based number (text line for CSV, data row for Parquet) and its cells,
/// or why it could not be read.
#[derive(Debug, Clone, PartialEq)]
pub struct TextRow {
    /// 1-based line (CSV, header is line 1) or data row (Parquet).
    pub number: u64,
    /// The cells in column order, or the reason the row could not be read.
    pub cells: Result<Vec<String>, ReadError>,
}

/// A whole table as text: headings and rows.
#[derive(Debug, Clone, PartialEq)]
pub struct TextTable {
    /// The file read (`-` for standard input).
    pub path: PathBuf,
    /// Column headings, as written.
    pub headers: Vec<String>,
    /// Data rows in file order (blank lines skipped).
    pub rows: Vec<TextRow>,
    /// Whether row numbers count text lines or Parquet rows.
    pub locus: Locus,
}

impl TextTable {
    /// The 0-based index of the column whose heading equals `name`, ignoring case and
    /// surrounding spaces.
    pub fn column(&self, name: &str) -> Option<usize> {
        self.headers
            .iter()
            .position(|h| h.trim().eq_ignore_ascii_case(name.trim()))
    }

    /// Like [`column`](Self::column), but a missing column is an error that lists the
    /// columns there are and says how to choose another (`hint`).
    pub fn require_column(&self, name: &str, hint: &str) -> Result<usize, ReadError> {
        self.column(name).ok_or_else(|| {
            ReadError::file(
                &self.path,
                ReadErrorKind::AmbiguousColumn,
                format!(
                    "no column '{name}' (columns: {}); {hint}",
                    self.headers.join(", ")
                ),
            )
            .at_line(1, Locus::Line)
        })
    }
}

/// Read a CSV or Parquet table (format from the extension or the Parquet magic bytes) as
/// text cells. `-` reads standard input. In CSV, blank lines and lines starting with `#`
/// are skipped (row numbers still count them).
///
/// ```
/// use ebullio::table_io::text_table::read_text_table;
/// let dir = tempfile::tempdir().unwrap();
/// let f = dir.path().join("s.csv");
/// std::fs::write(&f, "compound,smiles\nethanol,CCO\n\nbroken\n").unwrap();
/// let t = read_text_table(&f).unwrap();
/// let col = t.column("SMILES").unwrap();
/// assert_eq!(t.rows[0].cells.as_ref().unwrap()[col], "CCO");
/// let bad = t.rows[1].cells.as_ref().unwrap_err();
/// assert_eq!(bad.line, Some(4));
/// ```
pub fn read_text_table(path: &Path) -> Result<TextTable, ReadError> {
    read_text_table_with(path, false)
}

/// [`read_text_table`] for a CSV that may be semicolon-separated with decimal commas
/// (`decimal_comma`, the `--decimal-comma` of every command): cells that are numbers
/// written with a decimal comma come back with a point. Without it, a header separated
/// by semicolons only is refused with that hint, as `fit` does.
pub fn read_text_table_with(path: &Path, decimal_comma: bool) -> Result<TextTable, ReadError> {
    let bytes = read_bytes(path)?;
    match detect_format(path, &bytes) {
        TableFormat::Csv => read_csv(path, &bytes, decimal_comma),
        TableFormat::Parquet => read_parquet(path, &bytes),
    }
}

fn read_csv(path: &Path, bytes: &[u8], decimal_comma: bool) -> Result<TextTable, ReadError> {
    let body = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let first = body
        .split(|&b| b == b'\n')
        .find(|l| !l.iter().all(u8::is_ascii_whitespace) && !l.starts_with(b"#"))
        .unwrap_or_default();
    if !decimal_comma && first.contains(&b';') && !first.contains(&b',') {
        return Err(ReadError::file(
            path,
            ReadErrorKind::CsvSyntax,
            "the columns are separated by semicolons (a decimal-comma file?); use --decimal-comma",
        )
        .at_line(1, Locus::Line));
    }
    if body.iter().all(u8::is_ascii_whitespace) {
        return Err(ReadError::file(
            path,
            ReadErrorKind::EmptyFile,
            "the file is empty; expected a header line and one row per structure",
        ));
    }
    let mut rdr = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .comment(Some(b'#'))
        .delimiter(if decimal_comma { b';' } else { b',' })
        .from_reader(body);
    let mut headers: Option<Vec<String>> = None;
    let mut rows = Vec::new();
    let mut rec = csv::ByteRecord::new();
    // The csv crate does not count skipped blank lines, so lines are counted here from byte
    // offsets: `line` is the 1-based line at byte `counted`.
    let (mut counted, mut line) = (0usize, 1u64);
    let mut line_at = |byte: usize| {
        // A record's recorded start can sit before the blank and comment lines skipped
        // ahead of it.
        let mut byte = byte.min(body.len());
        while let Some(&b) = body.get(byte) {
            match b {
                b'\n' | b'\r' => byte += 1,
                b'#' => {
                    byte = body[byte..]
                        .iter()
                        .position(|&c| c == b'\n')
                        .map_or(body.len(), |k| byte + k + 1)
                }
                _ => break,
            }
        }
        if byte > counted {
            line += body[counted..byte].iter().filter(|&&b| b == b'\n').count() as u64;
            counted = byte;
        }
        line
    };
    loop {
        let number = line_at(rdr.position().byte() as usize);
        match rdr.read_byte_record(&mut rec) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => {
                let line = e.position().map_or(number, |p| line_at(p.byte() as usize));
                let err =
                    ReadError::file(path, ReadErrorKind::CsvSyntax, format!("broken CSV: {e}"))
                        .at_line(line, Locus::Line);
                if headers.is_none() {
                    return Err(err);
                }
                // With flexible records only I/O fails here; nothing more can be read.
                rows.push(TextRow {
                    number: line,
                    cells: Err(err),
                });
                break;
            }
        }
        let line = rec
            .position()
            .map_or(number, |p| line_at(p.byte() as usize));
        if rec.iter().all(|c| c.iter().all(u8::is_ascii_whitespace)) {
            continue;
        }
        let mut cells = decode_record(path, line, &rec, headers.as_deref());
        if decimal_comma && headers.is_some() {
            if let Ok(c) = cells.as_mut() {
                for cell in c.iter_mut() {
                    let dotted = cell.replace(',', ".");
                    if cell.contains(',') && dotted.parse::<f64>().is_ok() {
                        *cell = dotted;
                    }
                }
            }
        }
        match &headers {
            None => headers = Some(cells?),
            Some(_) => rows.push(TextRow {
                number: line,
                cells,
            }),
        }
    }
    let headers = headers.ok_or_else(|| ReadError::no_header(path))?;
    Ok(TextTable {
        path: path.to_path_buf(),
        headers,
        rows,
        locus: Locus::Line,
    })
}

fn decode_record(
    path: &Path,
    line: u64,
    rec: &csv::ByteRecord,
    headers: Option<&[String]>,
) -> Result<Vec<String>, ReadError> {
    let mut cells = Vec::with_capacity(rec.len());
    for (i, raw) in rec.iter().enumerate() {
        match std::str::from_utf8(raw) {
            Ok(s) => cells.push(s.trim().to_string()),
            Err(e) => {
                let bad = raw.get(e.valid_up_to()).copied().unwrap_or_default();
                let mut err = ReadError::file(
                    path,
                    ReadErrorKind::NotUtf8,
                    format!("not UTF-8 text: byte 0x{bad:02X}; save the file as UTF-8"),
                )
                .at_line(line, Locus::Line);
                if let Some(h) = headers.and_then(|h| h.get(i)) {
                    err = err.at_column(i, h);
                }
                return Err(err);
            }
        }
    }
    if let Some(h) = headers {
        if cells.len() != h.len() {
            return Err(ReadError::ragged(path, line, cells.len(), h.len()));
        }
    }
    Ok(cells)
}

#[cfg(feature = "tables")]
fn read_parquet(path: &Path, bytes: &[u8]) -> Result<TextTable, ReadError> {
    let (headers, rows) = super::parquet::read_as_text(path, bytes)?;
    Ok(TextTable {
        path: path.to_path_buf(),
        headers,
        rows: rows
            .into_iter()
            .map(|(number, cells)| TextRow {
                number,
                cells: Ok(cells),
            })
            .collect(),
        locus: Locus::Row,
    })
}

#[cfg(not(feature = "tables"))]
fn read_parquet(path: &Path, _bytes: &[u8]) -> Result<TextTable, ReadError> {
    Err(ReadError::file(
        path,
        ReadErrorKind::Parquet,
        "Parquet support is not built in (build with the `tables` feature)",
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn table(text: &[u8]) -> TextTable {
        let dir = tempfile::tempdir().unwrap();
        let f = dir.path().join("t.csv");
        std::fs::write(&f, text).unwrap();
        read_text_table(&f).unwrap()
    }

    #[test]
    fn bad_rows_are_kept_as_row_errors_and_the_rest_is_read() {
        let t = table(b"name,smiles\na,CCO\nb,C\xB0C\nc\nd,CC\n");
        assert_eq!(t.rows.len(), 4);
        assert_eq!(t.rows[0].cells.as_ref().unwrap(), &vec!["a", "CCO"]);
        let e = t.rows[1].cells.as_ref().unwrap_err();
        assert_eq!(
            (e.kind, e.line, e.column_index),
            (ReadErrorKind::NotUtf8, Some(3), Some(2))
        );
        let e = t.rows[2].cells.as_ref().unwrap_err();
        assert_eq!((e.kind, e.line), (ReadErrorKind::RaggedRow, Some(4)));
        assert_eq!(t.rows[3].number, 5);
    }

    #[test]
    fn bom_blank_lines_and_case_insensitive_headings() {
        let t = table(b"\xEF\xBB\xBF# a note, with \"commas\"\nName , SMILES\n\n# more\nx,C\n");
        assert_eq!(t.column("smiles"), Some(1));
        assert_eq!(t.column("name"), Some(0));
        assert_eq!(t.rows.len(), 1);
        assert_eq!(t.rows[0].number, 5);
        let e = t
            .require_column("structure", "use --smiles-column")
            .unwrap_err();
        assert!(e.to_string().contains("columns: Name, SMILES"), "{e}");
    }

    #[test]
    fn empty_file_is_an_error() {
        let dir = tempfile::tempdir().unwrap();
        let f = dir.path().join("e.csv");
        std::fs::write(&f, "\n \n").unwrap();
        let e = read_text_table(&f).unwrap_err();
        assert_eq!(e.kind, ReadErrorKind::EmptyFile);
    }

    proptest::proptest! {
        /// Any table written by the csv crate (quotes, commas, blank lines between rows) reads
        /// back cell for cell, with each row's number the line it starts on.
        #[test]
        fn csv_round_trip(rows in proptest::collection::vec(
            proptest::collection::vec("[a-z0-9 ,\"]{0,6}", 3), 1..12), blank in 0usize..3) {
            let rows: Vec<Vec<String>> = rows
                .into_iter()
                .map(|r| {
                    let mut r: Vec<String> = r.into_iter().map(|c| c.trim().to_string()).collect();
                    r[0] = format!("x{}", r[0]);
                    r
                })
                .collect();
            let mut text = String::from("a,b,c\n");
            let mut lines = Vec::new();
            for r in &rows {
                text.push_str(&"\n".repeat(blank));
                lines.push(text.lines().count() as u64 + 1);
                let mut w = csv::Writer::from_writer(Vec::new());
                w.write_record(r).unwrap();
                text.push_str(&String::from_utf8(w.into_inner().unwrap()).unwrap());
            }
            let t = table(text.as_bytes());
            proptest::prop_assert_eq!(t.rows.len(), rows.len());
            for ((got, want), line) in t.rows.iter().zip(&rows).zip(lines) {
                proptest::prop_assert_eq!(got.cells.as_ref().unwrap(), want);
                proptest::prop_assert_eq!(got.number, line);
            }
        }
    }
}
