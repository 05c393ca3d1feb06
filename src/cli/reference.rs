//! `ebullio reference`: list the bundled reference compounds, or show one with every source.

use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::reference::Library;
use ebullio::report::text::reference::{self as ref_text, describe, CompoundOut};
use std::path::PathBuf;

/// List the reference compounds, or show one (by name, synonym or CAS number,
/// or --smiles) with every value and its source.
///
/// Example: ebullio reference "ethyl alcohol"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// Compound name, synonym or CAS number; omit to list.
    pub query: Option<String>,
    /// Find by structure (any valid SMILES spelling).
    #[arg(long)]
    pub smiles: Option<String>,
    /// List only compounds whose name or synonym contains TEXT.
    #[arg(long, value_name = "TEXT")]
    pub filter: Option<String>,
    /// Show every compound in full (every value and its source), not the one-line list.
    #[arg(long, conflicts_with_all = ["query", "smiles"])]
    pub all: bool,
    /// Your own reference table (CSV, same columns as the bundled ones); takes precedence.
    #[arg(long, value_name = "FILE")]
    pub reference_table: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let owned;
    let lib = match &args.reference_table {
        Some(p) => {
            let text =
                std::fs::read_to_string(p).with_context(|| format!("reading {}", p.display()))?;
            owned = Library::with_user_table(&p.display().to_string(), &text)?;
            &owned
        }
        None => Library::bundled(),
    };
    let one = match (&args.query, &args.smiles) {
        (Some(_), Some(_)) => {
            return Err(InputError("give a name/CAS or --smiles, not both".into()).into())
        }
        (Some(q), None) => Some(lib.find(q)?),
        (None, Some(s)) => Some(lib.find_smiles(s)?),
        (None, None) => None,
    };
    let text = match one {
        Some(c) => show(&describe(c), args.out.format())?,
        None if args.all => {
            let all: Vec<CompoundOut> = lib.compounds().iter().map(describe).collect();
            match args.out.format() {
                Format::Json => serde_json::to_string_pretty(&all)? + "\n",
                f => {
                    let mut s = String::new();
                    for (i, c) in all.iter().enumerate() {
                        let one = show(c, f)?;
                        // CSV: one header for all compounds.
                        let body = if f == Format::Csv && i > 0 {
                            one.split_once('\n').map_or("", |(_, b)| b).to_string()
                        } else {
                            one
                        };
                        s.push_str(&body);
                        if f == Format::Table {
                            s.push('\n');
                        }
                    }
                    s
                }
            }
        }
        None => {
            let f = args.filter.as_deref().map(str::to_lowercase);
            let list: Vec<CompoundOut> = lib
                .compounds()
                .iter()
                .filter(|c| {
                    f.as_deref().is_none_or(|f| {
                        c.name.to_lowercase().contains(f)
                            || c.synonyms.iter().any(|s| s.to_lowercase().contains(f))
                    })
                })
                .map(describe)
                .collect();
            list_text(&list, args.out.format(), lib.user_table.as_deref())?
        }
    };
    args.out.emit(&text, &[])?;
    Ok(Outcome::Success)
}

fn list_text(list: &[CompoundOut], f: Format, user: Option<&str>) -> anyhow::Result<String> {
    Ok(match f {
        Format::Json => super::common::json_text(list)? + "\n",
        Format::Csv => ref_text::list_csv(list)?,
        Format::Table => ref_text::list_table(list, user),
    })
}

fn show(c: &CompoundOut, f: Format) -> anyhow::Result<String> {
    Ok(match f {
        Format::Json => super::common::json_text(c)? + "\n",
        Format::Csv => ref_text::show_csv(c)?,
        Format::Table => ref_text::show_table(c),
    })
}
