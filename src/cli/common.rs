//! Shared command-line pieces: output format and file, exit codes, errors.

use anyhow::Context;
use std::io::{IsTerminal, Write};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

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
    pub fn emit(&self, text: &str, inputs: &[&Path]) -> anyhow::Result<()> {
        match &self.output {
            Some(p) => ebullio::table_io::write_atomic(p, text.as_bytes(), inputs)
                .with_context(|| format!("writing {}", p.display())),
            None => print_stdout(text),
        }
    }
}

/// Whether colour may be used (never when NO_COLOR is set or not a terminal).
#[allow(dead_code)]
pub fn colour_allowed() -> bool {
    std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty()) && std::io::stdout().is_terminal()
}

/// Print to stdout; a broken pipe is reported as [`BrokenPipe`] so `main` ends quietly.
pub fn print_stdout(text: &str) -> anyhow::Result<()> {
    let mut out = std::io::stdout().lock();
    let r = out.write_all(text.as_bytes()).and_then(|_| out.flush());
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
