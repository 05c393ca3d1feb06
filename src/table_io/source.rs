//! Getting the bytes of an input: path or stdin, existence, directories, BOM, UTF-8, format.

use super::error::{ReadError, ReadErrorKind};
use std::io::Read;
use std::path::Path;

/// The on-disk format of a table.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TableFormat {
    /// Delimited text (comma, or semicolon with decimal commas).
    Csv,
    /// Apache Parquet (recognised by the `.parquet` extension or the `PAR1` magic bytes).
    Parquet,
}

/// The UTF-8 byte-order mark some spreadsheet programs write.
const BOM: &[u8] = b"\xEF\xBB\xBF";
/// Parquet files start (and end) with these four bytes.
const PARQUET_MAGIC: &[u8] = b"PAR1";

/// Read all bytes of `path`, or of standard input when `path` is `-`.
pub fn read_bytes(path: &Path) -> Result<Vec<u8>, ReadError> {
    if path.as_os_str() == "-" {
        let mut buf = Vec::new();
        std::io::stdin().lock().read_to_end(&mut buf).map_err(|e| {
            ReadError::file(
                path,
                ReadErrorKind::Io,
                format!("cannot read standard input: {e}"),
            )
        })?;
        return Ok(buf);
    }
    match std::fs::metadata(path) {
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => {
            return Err(ReadError::file(
                path,
                ReadErrorKind::NotFound,
                "no such file (check the path; use - to read standard input)",
            ))
        }
        Err(e) => {
            return Err(ReadError::file(
                path,
                ReadErrorKind::Io,
                format!("cannot open: {e}"),
            ))
        }
        Ok(m) if m.is_dir() => {
            return Err(ReadError::file(
                path,
                ReadErrorKind::IsDirectory,
                "is a directory; expected a CSV or Parquet file",
            ))
        }
        Ok(_) => {}
    }
    std::fs::read(path)
        .map_err(|e| ReadError::file(path, ReadErrorKind::Io, format!("cannot read: {e}")))
}

/// Decide the format: the `.parquet` extension or the `PAR1` magic bytes mean Parquet.
pub fn detect_format(path: &Path, bytes: &[u8]) -> TableFormat {
    let by_ext = path
        .extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("parquet") || e.eq_ignore_ascii_case("pq"));
    if by_ext || bytes.starts_with(PARQUET_MAGIC) {
        TableFormat::Parquet
    } else {
        TableFormat::Csv
    }
}

/// Turn bytes into text: drop a UTF-8 byte-order mark silently; refuse anything that is not
/// UTF-8, naming the byte offset, line and the byte found.
///
/// ```
/// use ebullio::table_io::source::decode_text;
/// use std::path::Path;
/// assert_eq!(decode_text(Path::new("a.csv"), b"\xEF\xBB\xBFT/K").unwrap(), "T/K");
/// let e = decode_text(Path::new("a.csv"), b"T/K\nt/\xB0C").unwrap_err();
/// assert_eq!(e.line, Some(2));
/// ```
pub fn decode_text<'a>(path: &Path, bytes: &'a [u8]) -> Result<&'a str, ReadError> {
    let body = bytes.strip_prefix(BOM).unwrap_or(bytes);
    if body.starts_with(b"\xFF\xFE") || body.starts_with(b"\xFE\xFF") {
        return Err(ReadError::file(
            path,
            ReadErrorKind::NotUtf8,
            "the file is UTF-16 text (it starts with a UTF-16 byte-order mark); save it as UTF-8",
        )
        .at_line(1, super::error::Locus::Line));
    }
    match std::str::from_utf8(body) {
        Ok(s) => Ok(s),
        Err(e) => {
            let offset = e.valid_up_to();
            let before = body.get(..offset).unwrap_or_default();
            let line = 1 + before.iter().filter(|&&b| b == b'\n').count() as u64;
            let bad = body.get(offset).copied().unwrap_or_default();
            let shown_offset = offset + (bytes.len() - body.len());
            let hint = if bad == 0xB0 {
                " (0xB0 is the degree sign in Latin-1/Windows-1252)"
            } else {
                ""
            };
            Err(ReadError::file(
                path,
                ReadErrorKind::NotUtf8,
                format!(
                    "not UTF-8 text: byte 0x{bad:02X} at byte offset {shown_offset}{hint}; \
                     save the file as UTF-8"
                ),
            )
            .at_line(line, super::error::Locus::Line))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn missing_path_and_directory_are_named() {
        let dir = tempfile::tempdir().unwrap();
        let e = read_bytes(&dir.path().join("nope.csv")).unwrap_err();
        assert_eq!(e.kind, ReadErrorKind::NotFound);
        let e = read_bytes(dir.path()).unwrap_err();
        assert_eq!(e.kind, ReadErrorKind::IsDirectory);
    }

    #[test]
    fn parquet_by_extension_or_magic() {
        assert_eq!(
            detect_format(Path::new("x.parquet"), b""),
            TableFormat::Parquet
        );
        assert_eq!(
            detect_format(Path::new("x.dat"), b"PAR1...."),
            TableFormat::Parquet
        );
        assert_eq!(detect_format(Path::new("x.csv"), b"T/K"), TableFormat::Csv);
    }

    #[test]
    fn utf16_is_refused() {
        let e = decode_text(Path::new("a.csv"), b"\xFF\xFET\x00").unwrap_err();
        assert!(e.message.contains("UTF-16"));
    }
}
