//! `ebullio convert`: Antoine constants from one convention to another.

use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use ebullio::vapor::{convert, AntoineConstants, AntoineConvention};

/// Convert Antoine constants between conventions (log base, pressure unit,
/// temperature unit). Unit and base changes are exact.
///
/// Example: ebullio convert --antoine "14.3145,2756.22,228.060" --constants "ln,kPa,degC" --to "log10,mmHg,degC"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// Antoine constants "A,B,C" in the convention given by --constants.
    #[arg(long, allow_hyphen_values = true)]
    pub antoine: String,
    /// Convention of the given constants, e.g. "log10,mmHg,degC".
    #[arg(long)]
    pub constants: String,
    /// Target convention, e.g. "ln,kPa,K".
    #[arg(long)]
    pub to: String,
    #[command(flatten)]
    pub out: OutputArgs,
}

#[derive(serde::Serialize)]
struct Converted {
    #[serde(rename = "A")]
    a: f64,
    #[serde(rename = "B")]
    b: f64,
    #[serde(rename = "C")]
    c: f64,
    convention: String,
    exact: bool,
}

/// Parse "A,B,C" into three finite numbers.
pub fn parse_abc(s: &str) -> Result<[f64; 3], InputError> {
    let parts: Vec<&str> = s.split(',').map(str::trim).collect();
    if parts.len() != 3 {
        return Err(InputError(format!(
            "--antoine '{s}': expected three numbers \"A,B,C\", found {}",
            parts.len()
        )));
    }
    let mut v = [0.0; 3];
    for (i, p) in parts.iter().enumerate() {
        v[i] = p
            .parse::<f64>()
            .ok()
            .filter(|x| x.is_finite())
            .ok_or_else(|| {
                InputError(format!(
                    "--antoine '{s}': {} = '{p}' is not a finite number",
                    ["A", "B", "C"][i]
                ))
            })?;
    }
    Ok(v)
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let [a, b, c] = parse_abc(&args.antoine)?;
    let from: AntoineConvention = args
        .constants
        .parse()
        .map_err(|e| InputError(format!("--constants: {e}")))?;
    let to: AntoineConvention = args
        .to
        .parse()
        .map_err(|e| InputError(format!("--to: {e}")))?;
    let k = convert::exact(&AntoineConstants::new(a, b, c, from), to);
    let r = Converted {
        a: k.a,
        b: k.b,
        c: k.c,
        convention: to.to_string(),
        exact: true,
    };
    let text = match args.out.format() {
        Format::Json => serde_json::to_string_pretty(&r)? + "\n",
        Format::Csv => format!(
            "A,B,C,convention,exact\n{},{},{},\"{}\",true\n",
            r.a, r.b, r.c, r.convention
        ),
        Format::Table => format!(
            "Antoine constants in {} (exact conversion)\n  A = {:.6}\n  B = {:.4}\n  C = {:.4}\n",
            r.convention, r.a, r.b, r.c
        ),
    };
    args.out.emit(&text, &[])?;
    Ok(Outcome::Success)
}
