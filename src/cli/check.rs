//! `ebullio check`: placeholder until its issue lands (returns a usage error).

use super::Outcome;

/// (not built yet)
#[derive(Debug, clap::Args)]
pub struct Args {}

pub fn run(_args: Args) -> anyhow::Result<Outcome> {
    anyhow::bail!("'check' is not built yet")
}
