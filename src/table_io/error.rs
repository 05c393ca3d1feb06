//! The input error every table reader returns: file, line, column, value, what was expected.

use serde::Serialize;
use std::fmt;
use std::path::PathBuf;

/// What kind of input problem a [`ReadError`] reports. Each has a stable kebab-case
/// [`code`](ReadErrorKind::code) so scripts and tests can match on it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ReadErrorKind {
    /// The path does not exist.
    NotFound,
    /// The path is a directory.
    IsDirectory,
    /// Any other failure to open or read the file.
    Io,
    /// The file has no content at all.
    EmptyFile,
    /// The file has a header line and no data rows.
    HeaderOnly,
    /// The bytes are not UTF-8 text.
    NotUtf8,
    /// Semicolon-separated columns (decimal commas) without `--decimal-comma`, or the reverse.
    Delimiter,
    /// A row with a different number of fields than the header.
    RaggedRow,
    /// The CSV syntax itself is broken (e.g. an unclosed quote).
    CsvSyntax,
    /// No temperature column.
    NoTemperatureColumn,
    /// No pressure column.
    NoPressureColumn,
    /// Two columns claim the same role (two temperature columns, ...).
    AmbiguousColumn,
    /// A heading's unit is not one ebullio knows, or it is missing.
    HeadingUnit,
    /// A cell that should hold a number holds something else.
    NotANumber,
    /// A required cell is empty.
    EmptyCell,
    /// NaN or infinity.
    NotFinite,
    /// Zero or negative absolute pressure.
    NonPositivePressure,
    /// Temperature at or below absolute zero.
    BelowAbsoluteZero,
    /// A negative standard uncertainty.
    NegativeUncertainty,
    /// A Parquet column with the wrong data type.
    ColumnType,
    /// A Parquet file that cannot be decoded, or Parquet support not built in.
    Parquet,
    /// A file that should hold `ebullio fit` JSON does not.
    FitFile,
    /// A column the table needs is missing (or incomplete, as A and B without C).
    MissingColumn,
    /// A mole fraction outside 0–1.
    CompositionRange,
    /// Binary VLE data that cannot be fitted as given (missing x1, one composition, ...).
    BinaryData,
    /// A column that disagrees with the fixed condition given on the command line.
    ConditionMismatch,
}

impl ReadErrorKind {
    /// The stable kebab-case code (e.g. `ragged-row`).
    pub fn code(self) -> &'static str {
        match self {
            Self::NotFound => "not-found",
            Self::IsDirectory => "is-directory",
            Self::Io => "io",
            Self::EmptyFile => "empty-file",
            Self::HeaderOnly => "header-only",
            Self::NotUtf8 => "not-utf8",
            Self::Delimiter => "delimiter",
            Self::RaggedRow => "ragged-row",
            Self::CsvSyntax => "csv-syntax",
            Self::NoTemperatureColumn => "no-temperature-column",
            Self::NoPressureColumn => "no-pressure-column",
            Self::AmbiguousColumn => "ambiguous-column",
            Self::HeadingUnit => "heading-unit",
            Self::NotANumber => "not-a-number",
            Self::EmptyCell => "empty-cell",
            Self::NotFinite => "not-finite",
            Self::NonPositivePressure => "non-positive-pressure",
            Self::BelowAbsoluteZero => "below-absolute-zero",
            Self::NegativeUncertainty => "negative-uncertainty",
            Self::ColumnType => "column-type",
            Self::Parquet => "parquet",
            Self::FitFile => "fit-file",
            Self::MissingColumn => "missing-column",
            Self::CompositionRange => "composition-range",
            Self::BinaryData => "binary-data",
            Self::ConditionMismatch => "condition-mismatch",
        }
    }
}

/// How a position in the source is counted: text lines (CSV) or data rows (Parquet).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Locus {
    /// 1-based line of a text file (the header is line 1).
    #[default]
    Line,
    /// 1-based data row of a Parquet file (the header is not counted).
    Row,
}

/// Error reading a table: always names the file and, where it applies, the line
/// and column (number and heading) and the offending value.
///
/// Displayed as `data.csv, line 4, column 2 (p/kPa): '-3' is not a positive ...`.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub struct ReadError {
    /// The file (`-` for standard input).
    pub file: PathBuf,
    /// 1-based line (or data row for Parquet, see [`locus`](Self::locus)), where it applies.
    pub line: Option<u64>,
    /// Column heading, where it applies.
    pub column: Option<String>,
    /// 1-based column number, where it applies.
    pub column_index: Option<usize>,
    /// Whether [`line`](Self::line) counts text lines or Parquet rows.
    pub locus: Locus,
    /// What kind of problem.
    pub kind: ReadErrorKind,
    /// What was wrong and what was expected (names the offending value).
    pub message: String,
}

impl ReadError {
    /// An error about the whole file.
    pub fn file(file: impl Into<PathBuf>, kind: ReadErrorKind, message: impl Into<String>) -> Self {
        Self {
            file: file.into(),
            line: None,
            column: None,
            column_index: None,
            locus: Locus::Line,
            kind,
            message: message.into(),
        }
    }

    /// A text row with a different number of fields than the header, at `line`.
    pub fn ragged(
        file: impl Into<PathBuf>,
        line: u64,
        fields: usize,
        header_fields: usize,
    ) -> Self {
        Self::file(
            file,
            ReadErrorKind::RaggedRow,
            format!("this row has {fields} fields but the header has {header_fields}"),
        )
        .at_line(line, Locus::Line)
    }

    /// A text table with no header line.
    pub fn no_header(file: impl Into<PathBuf>) -> Self {
        Self::file(
            file,
            ReadErrorKind::EmptyFile,
            "the file has no header line",
        )
    }

    /// Attach a line (or row).
    pub fn at_line(mut self, line: u64, locus: Locus) -> Self {
        self.line = Some(line);
        self.locus = locus;
        self
    }

    /// Attach a column: 0-based index (shown 1-based) and its heading.
    pub fn at_column(mut self, index0: usize, heading: &str) -> Self {
        self.column_index = Some(index0 + 1);
        self.column = Some(heading.to_string());
        self
    }

    /// Attach a column by its heading alone (its position unknown).
    pub fn at_heading(mut self, heading: &str) -> Self {
        self.column = Some(heading.to_string());
        self
    }

    /// The name shown for the file (`<stdin>` for `-`).
    pub fn file_display(&self) -> String {
        display_name(&self.file)
    }
}

/// The name shown for a source path (`<stdin>` for `-`).
pub(crate) fn display_name(path: &std::path::Path) -> String {
    if path.as_os_str() == "-" {
        "<stdin>".to_string()
    } else {
        path.display().to_string()
    }
}

impl fmt::Display for ReadError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.file_display())?;
        if let Some(line) = self.line {
            let word = match self.locus {
                Locus::Line => "line",
                Locus::Row => "row",
            };
            write!(f, ", {word} {line}")?;
        }
        match (self.column_index, &self.column) {
            (Some(i), Some(h)) => write!(f, ", column {i} ({h})")?,
            (None, Some(h)) => write!(f, ", column {h}")?,
            (Some(i), None) => write!(f, ", column {i}")?,
            (None, None) => {}
        }
        write!(f, ": {}", self.message)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn display_names_file_line_and_column() {
        let e = ReadError::file("data.csv", ReadErrorKind::EmptyCell, "empty cell")
            .at_line(4, Locus::Line)
            .at_column(1, "p/kPa");
        assert_eq!(
            e.to_string(),
            "data.csv, line 4, column 2 (p/kPa): empty cell"
        );
        let s = ReadError::file("-", ReadErrorKind::EmptyFile, "empty").at_line(2, Locus::Row);
        assert_eq!(s.to_string(), "<stdin>, row 2: empty");
        assert_eq!(s.kind.code(), "empty-file");
    }
}
