//! `ebullio demo`: run the embedded (invented) demo scenario and write a report folder.

use super::Outcome;
use anyhow::Context;
use std::path::PathBuf;

/// Run the whole job on the embedded demo scenario (INVENTED in-house data of a
/// fictional site) and write a report folder. Needs no input and no network.
///
/// Example: ebullio demo --output ebullio-demo
#[derive(Debug, clap::Args)]
pub struct Args {
    /// Folder to write (report.html, fits.json, estimates.csv, the checked supplier table, the plan, the demo data).
    #[arg(long, short = 'o', default_value = "ebullio-demo")]
    pub output: PathBuf,
    /// Write into the folder even if it is not empty.
    #[arg(long)]
    pub force: bool,
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let dir = &args.output;
    if dir.exists() {
        let non_empty = std::fs::read_dir(dir)
            .with_context(|| format!("reading {}", dir.display()))?
            .next()
            .is_some();
        if non_empty && !args.force {
            return Err(super::InputError(format!(
                "{} is not empty; choose another --output or pass --force",
                dir.display()
            ))
            .into());
        }
    }
    std::fs::create_dir_all(dir).with_context(|| format!("creating {}", dir.display()))?;
    let run = crate::demo::run().map_err(anyhow::Error::msg)?;
    let cmd = super::common::command_line();
    let w = |name: &str, text: &str| -> anyhow::Result<()> {
        let p = dir.join(name);
        ebullio::table_io::write_atomic(&p, text.as_bytes(), &[])
            .with_context(|| format!("writing {}", p.display()))
    };
    w("report.html", &crate::demo::html(&run, &cmd))?;
    w("fits.json", &(super::common::json_text(&run.fits)? + "\n"))?;
    w(
        "estimates.json",
        &(super::common::json_text(&run.estimates)? + "\n"),
    )?;
    w(
        "estimates.csv",
        &ebullio::table_io::estimates_csv(&run.estimates, &[crate::demo::VACUUM_PA])?,
    )?;
    if let Some(p) = &run.plan {
        w(
            "plan-result.json",
            &(super::common::json_text(&p.plan)? + "\n"),
        )?;
    }
    #[cfg(feature = "tables")]
    if let Some(c) = &run.check {
        w(
            crate::demo::CHECKED_TABLE,
            &String::from_utf8_lossy(&c.checked_csv),
        )?;
    }
    std::fs::create_dir_all(dir.join("data"))?;
    for (name, text) in crate::demo::FILES {
        w(&format!("data/{name}"), text)?;
    }
    super::common::print_stdout(&crate::demo::summary(&run))?;
    super::common::print_stdout(&format!("\nWrote {}/report.html\n", dir.display()))?;
    Ok(Outcome::Success)
}
