//! Shared command-line pieces: output format and file, exit codes, errors.

use anyhow::Context;
use std::io::{IsTerminal, Write};
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use std::sync::atomic::{AtomicU64, Ordering};

/// The site's barometric pressure from `--barometric`, set once at start.
static BAROMETRIC: std::sync::OnceLock<Option<ebullio::units::Pressure>> =
    std::sync::OnceLock::new();

/// Read `--barometric` once (it must itself be absolute).
pub fn set_barometric(text: Option<&str>) -> Result<(), InputError> {
    let p = text
        .map(|t| {
            ebullio::units::parse_pressure(t).map_err(|e| InputError(format!("--barometric: {e}")))
        })
        .transpose()?;
    let _ = BAROMETRIC.set(p);
    Ok(())
}

/// The site's barometric pressure, if `--barometric` was given.
pub fn barometric() -> Option<ebullio::units::Pressure> {
    BAROMETRIC.get().copied().flatten()
}

/// Parse a pressure given on the command line: absolute, or gauge with `--barometric`.
pub fn parse_pressure(s: &str) -> Result<ebullio::units::Pressure, super::hints::UnitHint> {
    ebullio::units::parse_pressure_at(s, barometric()).map_err(super::hints::UnitHint)
}

pub use ebullio::table_io::json_text;

/// What a command achieved, mapped to an exit code by [`exit_code`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[allow(dead_code)] // Findings is used by `check`
pub enum Outcome {
    /// Exit 0.
    Success,
    /// Exit 1: findings at or above `--fail-on`.
    Findings,
}

/// A bad-input or usage error (exit code 2). Other errors also exit 2; this
/// type exists so a command can say plainly that the user's input was wrong.
#[derive(Debug, thiserror::Error)]
#[error("{0}")]
pub struct InputError(pub String);

/// Output format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum Format {
    /// Readable table (default on a terminal).
    Table,
    /// JSON (default when piped).
    Json,
    /// CSV.
    Csv,
}

/// `--format` and `--output`, shared by every subcommand.
#[derive(Debug, Clone, clap::Args)]
pub struct OutputArgs {
    /// Output format: table, json or csv [default: table on a terminal, json otherwise].
    #[arg(long, value_enum)]
    pub format: Option<Format>,
    /// Write the result to FILE (atomically; never over an input) instead of stdout.
    #[arg(long, short = 'o', value_name = "FILE")]
    pub output: Option<PathBuf>,
}

impl OutputArgs {
    /// The format to use, defaulting by whether stdout (or the file) is a terminal.
    pub fn format(&self) -> Format {
        if let Some(f) = self.format {
            return f;
        }
        if let Some(p) = &self.output {
            return match p.extension().and_then(|e| e.to_str()) {
                Some("csv") => Format::Csv,
                Some("json") => Format::Json,
                _ => Format::Table,
            };
        }
        if std::io::stdout().is_terminal() {
            Format::Table
        } else {
            Format::Json
        }
    }

    /// Emit `text` to the output file (atomically) or stdout.
    ///
    /// An interrupt that arrives while the file is written waits until the
    /// rename is done (see [`install_interrupt_handler`]), so no temporary or
    /// partial file is ever left behind.
    pub fn emit(&self, text: &str, inputs: &[&Path]) -> anyhow::Result<()> {
        let cleaned;
        let text = match self.format() {
            Format::Json => text,
            f => {
                cleaned = without_non_finite(text, if f == Format::Csv { "" } else { "-" });
                cleaned.as_str()
            }
        };
        match &self.output {
            Some(p) => {
                let mut written = OUTPUT_WRITTEN.lock().unwrap_or_else(|e| e.into_inner());
                let r = ebullio::table_io::write_atomic(p, text.as_bytes(), inputs)
                    .with_context(|| format!("writing {}", p.display()));
                *written = r.is_ok();
                r
            }
            None => print_stdout(text),
        }
    }
}

/// `text` with every whole word `NaN`, `inf` or `infinity` replaced by `blank`
/// ([`ebullio::table_io::without_non_finite`], the one rule).
pub fn without_non_finite(text: &str, blank: &str) -> String {
    ebullio::table_io::without_non_finite(text, blank).into_owned()
}

/// Write `path` atomically by streaming into `write`, holding off an
/// interrupt until the rename is done (as [`OutputArgs::emit`] does).
pub fn write_file_atomic(
    path: &Path,
    inputs: &[&Path],
    write: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> anyhow::Result<()> {
    let mut written = OUTPUT_WRITTEN.lock().unwrap_or_else(|e| e.into_inner());
    let r = ebullio::table_io::write_atomic_with(path, inputs, write)
        .with_context(|| format!("writing {}", path.display()));
    *written = r.is_ok();
    r
}

/// Whether colour may be used (never when NO_COLOR is set or not a terminal).
#[allow(dead_code)]
pub fn colour_allowed() -> bool {
    std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty()) && std::io::stdout().is_terminal()
}

/// Print to stdout; a broken pipe is reported as [`BrokenPipe`] so `main` ends quietly.
pub fn print_stdout(text: &str) -> anyhow::Result<()> {
    print_stdout_with(|out| out.write_all(text.as_bytes()))
}

/// Stream output to stdout through `write`, as [`print_stdout`] does with text.
pub fn print_stdout_with(
    write: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> anyhow::Result<()> {
    let mut out = std::io::stdout().lock();
    let r = write(&mut out).and_then(|_| out.flush());
    match r {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Err(BrokenPipe.into()),
        Err(e) => Err(e.into()),
        Ok(()) => Ok(()),
    }
}

/// Marker: stdout was closed by the reader.
#[derive(Debug, thiserror::Error)]
#[error("broken pipe")]
pub struct BrokenPipe;

/// Map a command's result to the process exit code, printing the error chain.
pub fn exit_code(r: anyhow::Result<Outcome>) -> ExitCode {
    match r {
        Ok(Outcome::Success) => ExitCode::SUCCESS,
        Ok(Outcome::Findings) => ExitCode::from(1),
        Err(e) => {
            if e.downcast_ref::<BrokenPipe>().is_some()
                || e.downcast_ref::<std::io::Error>()
                    .is_some_and(|io| io.kind() == std::io::ErrorKind::BrokenPipe)
            {
                return ExitCode::SUCCESS;
            }
            let mut msg = format!("error: {e}");
            for cause in e.chain().skip(1) {
                msg.push_str(&format!("\n  caused by: {cause}"));
            }
            let _ = writeln!(std::io::stderr(), "{msg}");
            ExitCode::from(2)
        }
    }
}

/// Set once the output file has been written; held while it is being written.
static OUTPUT_WRITTEN: std::sync::Mutex<bool> = std::sync::Mutex::new(false);
/// Files and folders an interrupt removes (scratch files, an output being written).
static CLEANUP: std::sync::Mutex<Vec<PathBuf>> = std::sync::Mutex::new(Vec::new());

/// Have an interrupt remove `path` (a file or a folder) before it ends the run.
fn remove_on_interrupt(path: PathBuf) {
    CLEANUP.lock().unwrap_or_else(|e| e.into_inner()).push(path);
}

/// A scratch folder in the system's temporary folder, removed when dropped
/// and by an interrupt.
pub struct ScratchDir(PathBuf);

impl ScratchDir {
    /// A new empty folder named after `what` and this process.
    #[allow(dead_code)] // used by check
    pub fn new(what: &str) -> anyhow::Result<Self> {
        let p = std::env::temp_dir().join(format!("ebullio-{what}-{}", std::process::id()));
        std::fs::create_dir_all(&p)
            .with_context(|| format!("creating the scratch folder {}", p.display()))?;
        remove_on_interrupt(p.clone());
        Ok(ScratchDir(p))
    }

    /// The folder.
    pub fn path(&self) -> &Path {
        &self.0
    }
}

impl Drop for ScratchDir {
    fn drop(&mut self) {
        let _ = std::fs::remove_dir_all(&self.0);
    }
}

/// Like [`write_file_atomic`], for output written while the batch runs: an
/// interrupt during the writing removes the temporary file and ends the run
/// (exit 130, no output); only the rename is waited for.
#[allow(dead_code)] // used by check
pub fn write_file_atomic_streamed(
    path: &Path,
    inputs: &[&Path],
    write: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> anyhow::Result<()> {
    remove_on_interrupt(ebullio::table_io::atomic::temp_path_for(path));
    let mut written =
        ebullio::table_io::atomic::write_atomic_with_hook(path, inputs, write, || {
            OUTPUT_WRITTEN.lock().unwrap_or_else(|e| e.into_inner())
        })
        .with_context(|| format!("writing {}", path.display()))?;
    *written = true;
    Ok(())
}

/// Run `f` on a buffered stdout; a reader that closed it gives [`BrokenPipe`].
#[allow(dead_code)] // used by check
pub fn to_stdout<T>(f: impl FnOnce(&mut dyn Write) -> T) -> anyhow::Result<T> {
    struct Watch<W> {
        inner: W,
        broken: bool,
    }
    impl<W: Write> Write for Watch<W> {
        fn write(&mut self, b: &[u8]) -> std::io::Result<usize> {
            let r = self.inner.write(b);
            self.broken |= matches!(&r, Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe);
            r
        }
        fn flush(&mut self) -> std::io::Result<()> {
            let r = self.inner.flush();
            self.broken |= matches!(&r, Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe);
            r
        }
    }
    let mut w = Watch {
        inner: std::io::BufWriter::with_capacity(1 << 20, std::io::stdout().lock()),
        broken: false,
    };
    let t = f(&mut w);
    let r = w.flush();
    if w.broken {
        return Err(BrokenPipe.into());
    }
    r?;
    Ok(t)
}
/// Items finished in the running batch, for the interrupt message.
static BATCH_DONE: AtomicU64 = AtomicU64::new(0);
/// Items in the running batch (0 when no batch has started).
static BATCH_TOTAL: AtomicU64 = AtomicU64::new(0);

/// Install the SIGINT/SIGTERM handler: an interrupted run prints how far its
/// batch got and exits with code 130 without writing any output, so a file
/// named by `--output` is either complete or absent. An interrupt during the
/// final atomic write waits for the rename and lets the run finish.
pub fn install_interrupt_handler() {
    // Failing to install (a handler already set) only loses the message.
    let _ = ctrlc::set_handler(|| {
        let written = OUTPUT_WRITTEN.lock().unwrap_or_else(|e| e.into_inner());
        if *written {
            return;
        }
        for p in CLEANUP.lock().unwrap_or_else(|e| e.into_inner()).iter() {
            let _ = std::fs::remove_dir_all(p).or_else(|_| std::fs::remove_file(p));
        }
        let done = BATCH_DONE.load(Ordering::Relaxed);
        let total = BATCH_TOTAL.load(Ordering::Relaxed);
        let msg = if total > 0 {
            format!("interrupted after {done} of {total} items; no output was written")
        } else {
            "interrupted before the batch started; no output was written".to_string()
        };
        let _ = writeln!(std::io::stderr(), "{msg}");
        std::process::exit(130);
    });
}

/// Tell the interrupt handler that a batch of `total` items has started.
#[allow(dead_code)] // used by the batch commands
pub fn batch_started(total: usize) {
    BATCH_DONE.store(0, Ordering::Relaxed);
    BATCH_TOTAL.store(total as u64, Ordering::Relaxed);
}

/// Tell the interrupt handler that `n` more batch items are finished.
#[allow(dead_code)] // used by the batch commands
pub fn batch_steps(n: usize) {
    BATCH_DONE.fetch_add(n as u64, Ordering::Relaxed);
}

/// Tell the interrupt handler that one more batch item is finished.
#[allow(dead_code)] // used by the batch commands
pub fn batch_step() {
    BATCH_DONE.fetch_add(1, Ordering::Relaxed);
}

/// The exact command line of this run, shell-quoted, for a report's footer.
pub fn command_line() -> String {
    let args: Vec<String> = std::env::args_os()
        .map(|a| a.to_string_lossy().into_owned())
        .collect();
    ebullio::report::html::shell_line(&args)
}

/// Write an HTML report atomically, refusing any of `inputs` and the
/// command's own output file. Written after the main output.
pub fn write_report(
    path: &Path,
    html: &str,
    inputs: &[&Path],
    output: Option<&Path>,
) -> anyhow::Result<()> {
    let mut refuse: Vec<&Path> = inputs.to_vec();
    refuse.extend(output);
    write_file_atomic(path, &refuse, |w| w.write_all(html.as_bytes()))
}
