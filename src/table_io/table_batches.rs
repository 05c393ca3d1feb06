//! A property table read in batches of rows (CSV or Parquet), so a table larger
//! than memory can be screened: each batch is one polars frame with every
//! column as the whole-table read gives it.
//!
//! CSV is cut into batches at record ends found outside quotes (a quoted
//! field may hold a line break), and each piece is parsed by polars with the
//! header's schema; Parquet batches are row slices of the file.

use super::error::{ReadError, ReadErrorKind};
use super::property_table::{is_parquet, TableError};
use polars::prelude::*;
use polars_io::prelude::*;
use std::io::Read;
use std::path::{Path, PathBuf};

/// Bytes read from a CSV file at a time while looking for record ends.
const BLOCK: usize = 1 << 20;

enum Source {
    Csv {
        file: std::fs::File,
        /// Bytes read past the last batch.
        carry: Vec<u8>,
        /// The header's schema (every column text), after the first batch.
        schema: Option<SchemaRef>,
        eof: bool,
    },
    Parquet {
        rows: usize,
    },
}

/// A property table read batch by batch; [`TableBatches::rewind`] starts again
/// (screening reads a table twice).
pub struct TableBatches {
    path: PathBuf,
    batch_rows: usize,
    source: Source,
    /// Rows given out so far.
    next_row: usize,
    /// Line of the first data row (2 for CSV with a header, plus comment lines; 1 for Parquet).
    line0: usize,
    started: bool,
}

fn read_err(path: &Path, e: impl std::fmt::Display) -> TableError {
    ReadError::file(
        path,
        ReadErrorKind::Io,
        format!("cannot read the table: {e}"),
    )
}

impl TableBatches {
    /// Open a CSV or Parquet table (by extension, as [`super::property_table::PropertyTable::read`])
    /// to be read `batch_rows` rows at a time (at least one).
    pub fn open(path: &Path, batch_rows: usize) -> Result<Self, TableError> {
        let mut t = TableBatches {
            path: path.to_path_buf(),
            batch_rows: batch_rows.max(1),
            source: Source::Parquet { rows: 0 },
            next_row: 0,
            line0: 1,
            started: false,
        };
        t.rewind()?;
        Ok(t)
    }

    /// Back to the first row.
    pub fn rewind(&mut self) -> Result<(), TableError> {
        let path = self.path.clone();
        self.next_row = 0;
        self.started = false;
        if is_parquet(&path) {
            let f = std::fs::File::open(&path).map_err(|e| read_err(&path, e))?;
            let rows = ParquetReader::new(f)
                .num_rows()
                .map_err(|e| read_err(&path, e))?;
            self.source = Source::Parquet { rows };
            self.line0 = 1;
            return Ok(());
        }
        let mut file = std::fs::File::open(&path).map_err(|e| read_err(&path, e))?;
        // Leading `#` lines are comments (a provenance note); line numbers count them.
        let mut carry = Vec::new();
        let mut comments = 0;
        let mut eof = false;
        loop {
            if carry.first() == Some(&b'#') {
                match carry.iter().position(|&b| b == b'\n') {
                    Some(i) => {
                        carry.drain(..=i);
                        comments += 1;
                        continue;
                    }
                    None if eof => {
                        carry.clear();
                        comments += 1;
                        break;
                    }
                    None => {}
                }
            } else if !carry.is_empty() || eof {
                break;
            }
            eof = read_block(&mut file, &mut carry).map_err(|e| read_err(&path, e))?;
        }
        self.line0 = 2 + comments;
        self.source = Source::Csv {
            file,
            carry,
            schema: None,
            eof,
        };
        Ok(())
    }

    /// Line in the file of row 0.
    pub fn line0(&self) -> usize {
        self.line0
    }

    /// The next batch and the index of its first row; `None` after the last.
    /// The first call always gives a batch (with no rows for an empty table),
    /// so the columns are always checked.
    pub fn next_batch(&mut self) -> Option<Result<(DataFrame, usize), TableError>> {
        let first = !self.started;
        self.started = true;
        let start = self.next_row;
        let r = match &mut self.source {
            Source::Parquet { rows } => {
                if !first && start >= *rows {
                    return None;
                }
                let len = self.batch_rows.min(*rows - start.min(*rows));
                std::fs::File::open(&self.path)
                    .map_err(|e| read_err(&self.path, e))
                    .and_then(|f| {
                        ParquetReader::new(f)
                            .with_slice(Some((start, len)))
                            .finish()
                            .map_err(|e| read_err(&self.path, e))
                    })
            }
            Source::Csv {
                file,
                carry,
                schema,
                eof,
            } => {
                // the first piece holds the header line too
                let records = self.batch_rows + usize::from(first);
                let chunk = match next_chunk(file, carry, eof, records) {
                    Ok(c) => c,
                    Err(e) => return Some(Err(read_err(&self.path, e))),
                };
                if !first && chunk.iter().all(|b| b.is_ascii_whitespace()) {
                    return None;
                }
                let opts = match schema {
                    None => CsvReadOptions::default()
                        .with_has_header(true)
                        .with_infer_schema_length(Some(0)),
                    Some(s) => CsvReadOptions::default()
                        .with_has_header(false)
                        .with_schema(Some(s.clone())),
                };
                let df = opts
                    .into_reader_with_file_handle(std::io::Cursor::new(chunk))
                    .finish()
                    .map_err(|e| read_err(&self.path, e));
                if let (Ok(df), None) = (&df, &schema) {
                    *schema = Some(df.schema().clone());
                }
                df
            }
        };
        Some(r.map(|df| {
            self.next_row += df.height();
            (df, start)
        }))
    }
}

/// Append up to [`BLOCK`] bytes of `file` to `buf`; `true` at the end of the file.
fn read_block(file: &mut std::fs::File, buf: &mut Vec<u8>) -> std::io::Result<bool> {
    let old = buf.len();
    buf.resize(old + BLOCK, 0);
    let k = loop {
        match file.read(&mut buf[old..]) {
            Err(e) if e.kind() == std::io::ErrorKind::Interrupted => continue,
            r => break r?,
        }
    };
    buf.truncate(old + k);
    Ok(k == 0)
}

/// The next `records` CSV records (fewer at the end of the file), cut after
/// a line break outside quotes; the bytes after it stay in `carry`.
fn next_chunk(
    file: &mut std::fs::File,
    carry: &mut Vec<u8>,
    eof: &mut bool,
    records: usize,
) -> std::io::Result<Vec<u8>> {
    let mut buf = std::mem::take(carry);
    let mut pos = 0;
    let mut in_quotes = false;
    let mut count = 0;
    loop {
        while pos < buf.len() {
            // jump to the next quote or line break
            let rest = &buf[pos..];
            let Some(k) = memchr::memchr2(b'"', b'\n', rest) else {
                pos = buf.len();
                break;
            };
            pos += k + 1;
            if rest[k] == b'"' {
                in_quotes = !in_quotes;
            } else if !in_quotes {
                count += 1;
                if count == records {
                    *carry = buf.split_off(pos);
                    return Ok(buf);
                }
            }
        }
        if *eof {
            return Ok(buf);
        }
        *eof = read_block(file, &mut buf)?;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn batches(text: &str, rows: usize) -> Vec<(usize, usize)> {
        let dir = std::env::temp_dir().join(format!("ebullio-batches-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let p = dir.join(format!("t{rows}.csv"));
        std::fs::write(&p, text).unwrap();
        let mut t = TableBatches::open(&p, rows).unwrap();
        let mut out = vec![];
        while let Some(b) = t.next_batch() {
            let (df, start) = b.unwrap();
            out.push((start, df.height()));
        }
        std::fs::remove_file(&p).unwrap();
        out
    }

    // A quoted line break stays inside its record; comment lines are skipped.
    #[test]
    fn csv_batches_cut_at_record_ends_outside_quotes() {
        let text = "# note\ncompound,Tb/K\n\"a\nb\",300\nc,310\nd,320\ne,330\n";
        assert_eq!(batches(text, 2), [(0, 2), (2, 2)]);
        assert_eq!(batches(text, 3), [(0, 3), (3, 1)]);
        assert_eq!(batches(text, 10), [(0, 4)]);
        assert_eq!(batches("compound,Tb/K\n", 2), [(0, 0)]);
        assert_eq!(batches("compound,Tb/K\nx,1", 1), [(0, 1)]);
    }
}
