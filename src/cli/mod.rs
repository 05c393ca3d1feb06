//! Command-line front end: argument definitions and glue, no numerics.
//!
//! Each subcommand is one file with the same skeleton: an `Args` struct (its
//! doc comments are the help text) and `run(args) -> anyhow::Result<ExitCode>`.
//! `main` maps that one result to one exit code: 0 success, 1 findings at or
//! above `--fail-on`, 2 bad input or usage. A broken pipe is success.

mod common;
mod curve_source;
mod hints;

mod boil;
mod check;
mod completions;
mod convert;
mod demo;
mod estimate;
mod fit;
mod fit_binary;
mod plan;
mod reference;
mod vle;

use clap::{Parser, Subcommand};
use std::process::ExitCode;

pub use common::{InputError, Outcome};

/// Vapor-pressure curves and boiling points for process chemists: fit measured
/// data, estimate from structure, check property tables.
///
/// Estimates are not measurements. Output that feeds a distillation or any
/// physical operation must be reviewed under local codes and by qualified
/// process-safety staff.
#[derive(Debug, Parser)]
#[command(name = "ebullio", version, about, long_about = None, propagate_version = true)]
pub struct Cli {
    #[command(subcommand)]
    command: Command,
    /// The site's barometric pressure (e.g. "1013 mbar"): gauge pressures
    /// (barg, psig, kPa(g)) on the command line or in a file heading are made
    /// absolute with it, and refused without it.
    #[arg(long, global = true, value_name = "PRESSURE")]
    barometric: Option<String>,
}

#[derive(Debug, Subcommand)]
enum Command {
    Fit(fit::Args),
    Estimate(estimate::Args),
    Check(check::Args),
    Boil(boil::Args),
    Convert(convert::Args),
    Plan(plan::Args),
    Reference(reference::Args),
    Vle(vle::Args),
    Demo(demo::Args),
    Completions(completions::CompletionsArgs),
    Man(completions::ManArgs),
}

/// Parse arguments, run, map the outcome to an exit code.
pub fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(c) => c,
        Err(e) => {
            let code = match e.kind() {
                clap::error::ErrorKind::DisplayHelp | clap::error::ErrorKind::DisplayVersion => 0,
                _ => 2,
            };
            let _ = e.print();
            return ExitCode::from(code);
        }
    };
    if let Err(e) = common::set_barometric(cli.barometric.as_deref()) {
        eprintln!("error: {e}");
        return ExitCode::from(2);
    }
    common::install_interrupt_handler();
    let result = match cli.command {
        Command::Fit(a) => fit::run(a),
        Command::Estimate(a) => estimate::run(a),
        Command::Check(a) => check::run(a),
        Command::Boil(a) => boil::run(a),
        Command::Convert(a) => convert::run(a),
        Command::Plan(a) => plan::run(a),
        Command::Reference(a) => reference::run(a),
        Command::Vle(a) => vle::run(a),
        Command::Demo(a) => demo::run(a),
        Command::Completions(a) => completions::completions(a),
        Command::Man(a) => completions::man(a),
    };
    common::exit_code(result)
}
