//! Atomic output: temporary file beside the target, then rename.

use std::io::Write;
use std::path::{Path, PathBuf};

/// Error writing an output file.
#[derive(Debug, thiserror::Error)]
pub enum OutputError {
    /// The output path is one of the inputs.
    #[error("refusing to write {path}: it is an input of this run (choose another --output)")]
    WouldOverwriteInput {
        /// The path.
        path: PathBuf,
    },
    /// The output path is a directory.
    #[error("cannot write {path}: it is a directory")]
    IsDirectory {
        /// The path.
        path: PathBuf,
    },
    /// An I/O failure.
    #[error("cannot write {path}: {source}")]
    Io {
        /// The path.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
}

fn same_file(a: &Path, b: &Path) -> bool {
    match (a.canonicalize(), b.canonicalize()) {
        (Ok(x), Ok(y)) => x == y,
        _ => false,
    }
}

/// Write `bytes` to `path` atomically: a temporary file in the same folder,
/// flushed and synced, then renamed over the target. Refuses when `path` is
/// one of `inputs`. On failure no partial file is left behind.
///
/// ```
/// let dir = std::env::temp_dir().join(format!("ebullio-doc-{}", std::process::id()));
/// std::fs::create_dir_all(&dir).unwrap();
/// let out = dir.join("out.txt");
/// ebullio::table_io::write_atomic(&out, b"hello", &[]).unwrap();
/// assert_eq!(std::fs::read(&out).unwrap(), b"hello");
/// std::fs::remove_dir_all(&dir).unwrap();
/// ```
pub fn write_atomic(path: &Path, bytes: &[u8], inputs: &[&Path]) -> Result<(), OutputError> {
    write_atomic_with(path, inputs, |w| w.write_all(bytes))
}

/// Like [`write_atomic`], but the content is streamed by `write` into a
/// buffered temporary file (large tables need not sit in memory twice). One
/// flush and one sync at the end, then the rename.
pub fn write_atomic_with(
    path: &Path,
    inputs: &[&Path],
    write: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> Result<(), OutputError> {
    write_atomic_with_hook(path, inputs, write, || ())
}

/// The temporary file [`write_atomic_with`] writes before renaming it to `path`.
pub fn temp_path_for(path: &Path) -> PathBuf {
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "output".into());
    dir.join(format!(".{name}.{}.tmp", std::process::id()))
}

/// Like [`write_atomic_with`]; `before_rename` runs once the content is
/// written and synced, just before the rename, and what it returns (say a
/// lock that keeps an interrupt from stopping the rename half-way) is
/// handed back after the rename.
pub fn write_atomic_with_hook<G>(
    path: &Path,
    inputs: &[&Path],
    write: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
    before_rename: impl FnOnce() -> G,
) -> Result<G, OutputError> {
    if inputs.iter().any(|i| same_file(i, path)) {
        return Err(OutputError::WouldOverwriteInput {
            path: path.to_path_buf(),
        });
    }
    if path.is_dir() {
        return Err(OutputError::IsDirectory {
            path: path.to_path_buf(),
        });
    }
    let io = |source| OutputError::Io {
        path: path.to_path_buf(),
        source,
    };
    let tmp = temp_path_for(path);
    let result = (|| {
        let mut f = std::io::BufWriter::with_capacity(1 << 20, std::fs::File::create(&tmp)?);
        write(&mut f)?;
        let f = f.into_inner().map_err(|e| e.into_error())?;
        f.sync_data()?;
        let guard = before_rename();
        std::fs::rename(&tmp, path).map(|_| guard)
    })();
    match result {
        Ok(g) => Ok(g),
        Err(e) => {
            let _ = std::fs::remove_file(&tmp);
            Err(io(e))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn refuses_to_overwrite_an_input() {
        let dir = tempfile::tempdir().unwrap();
        let input = dir.path().join("in.csv");
        std::fs::write(&input, "T/K,p/kPa\n").unwrap();
        let err = write_atomic(&input, b"x", &[&input]).unwrap_err();
        assert!(matches!(err, OutputError::WouldOverwriteInput { .. }));
        assert_eq!(std::fs::read_to_string(&input).unwrap(), "T/K,p/kPa\n");
    }

    #[test]
    fn failed_write_leaves_nothing() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("missing-folder").join("out.json");
        assert!(write_atomic(&target, b"x", &[]).is_err());
        assert!(!target.exists());
    }
}
