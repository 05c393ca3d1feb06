//! The `ebullio` command: argument parsing and glue only.

mod cli;
mod demo;

use std::process::ExitCode;

fn main() -> ExitCode {
    cli::main()
}
