//! `ebullio completions` and `ebullio man`: shell completions and manual pages,
//! generated from the same clap definitions the commands parse with, so they
//! never drift from the real options.
//!
//! clap_complete and clap_mangen are clap's own companion crates (same
//! maintainers, released with clap): hand-written completion scripts and roff
//! would have to be kept in step with every option by hand.

use super::Outcome;
use clap::CommandFactory;

/// Print a shell completion script for bash, zsh or fish.
///
/// Example (bash): ebullio completions bash > ~/.local/share/bash-completion/completions/ebullio
#[derive(Debug, clap::Args)]
pub struct CompletionsArgs {
    /// The shell.
    #[arg(value_enum)]
    pub shell: Shell,
}

/// Shells with completions.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum Shell {
    /// GNU bash.
    Bash,
    /// Z shell.
    Zsh,
    /// fish.
    Fish,
}

/// Print the manual page (roff) of ebullio, or of one subcommand.
///
/// Example: ebullio man > ebullio.1 && man ./ebullio.1; ebullio man fit > ebullio-fit.1
#[derive(Debug, clap::Args)]
pub struct ManArgs {
    /// A subcommand (fit, check, boil, ...); the overview page when left out.
    pub command: Option<String>,
}

pub fn completions(a: CompletionsArgs) -> anyhow::Result<Outcome> {
    let mut cmd = super::Cli::command();
    let shell = match a.shell {
        Shell::Bash => clap_complete::Shell::Bash,
        Shell::Zsh => clap_complete::Shell::Zsh,
        Shell::Fish => clap_complete::Shell::Fish,
    };
    let mut buf = Vec::new();
    clap_complete::generate(shell, &mut cmd, "ebullio", &mut buf);
    super::common::print_stdout(&String::from_utf8_lossy(&buf))?;
    Ok(Outcome::Success)
}

pub fn man(a: ManArgs) -> anyhow::Result<Outcome> {
    let top = super::Cli::command();
    let cmd = match &a.command {
        None => top,
        Some(name) => {
            let sub = top
                .get_subcommands()
                .find(|c| c.get_name() == name)
                .cloned()
                .ok_or_else(|| {
                    let names: Vec<&str> = top.get_subcommands().map(|c| c.get_name()).collect();
                    super::InputError(format!(
                        "no subcommand '{name}'; one of: {}",
                        names.join(", ")
                    ))
                })?;
            // clap names are 'static; this runs once per process.
            let full: &'static str = Box::leak(format!("ebullio-{name}").into_boxed_str());
            sub.name(full).version(env!("CARGO_PKG_VERSION"))
        }
    };
    let mut buf = Vec::new();
    clap_mangen::Man::new(cmd).render(&mut buf)?;
    super::common::print_stdout(&String::from_utf8_lossy(&buf))?;
    Ok(Outcome::Success)
}
