//! The one set of helpers the integration tests share: the real binary, scratch folders,
//! JSON output, and paths into the repository.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

/// The `ebullio` binary cargo built for this test run.
pub fn ebullio() -> Command {
    Command::new(env!("CARGO_BIN_EXE_ebullio"))
}

/// Run the binary in `dir` with `args` and collect its output.
pub fn run_in(dir: &Path, args: &[&str]) -> Output {
    ebullio()
        .current_dir(dir)
        .args(args)
        .output()
        .expect("binary runs")
}

/// Run the binary with `args` plus `--format json`; it must succeed; stdout parsed.
pub fn json(args: &[&str]) -> serde_json::Value {
    let out = ebullio()
        .args(args)
        .args(["--format", "json"])
        .output()
        .unwrap();
    ok(&out);
    serde_json::from_slice(&out.stdout).unwrap()
}

/// Assert the run succeeded, showing its exit code and both streams if not.
pub fn ok(o: &Output) {
    assert!(
        o.status.success(),
        "exit {:?}\nstdout: {}\nstderr: {}",
        o.status.code(),
        String::from_utf8_lossy(&o.stdout),
        String::from_utf8_lossy(&o.stderr)
    );
}

/// A fresh scratch folder, removed when dropped.
pub fn scratch() -> tempfile::TempDir {
    tempfile::tempdir().unwrap()
}

/// A path inside the repository (data files, reference tables).
pub fn repo(p: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join(p)
}
