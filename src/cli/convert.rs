//! `ebullio convert`: Antoine constants from one convention to another.

use super::common::parse_pressure;
use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use ebullio::fit::options::ModelSelection;
use ebullio::refit::refit;
use ebullio::units::parse_temperature;
use ebullio::vapor::{convert, AntoineConstants, AntoineConvention};

/// Convert Antoine constants between conventions (log base, pressure unit,
/// temperature unit), exactly; or into another equation form (--model
/// clapeyron|riedel|wagner) by refitting over the validity range (--range),
/// reporting the largest deviation the refit introduced.
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
    /// Target convention, e.g. "ln,kPa,K" (for an Antoine target).
    #[arg(long)]
    pub to: Option<String>,
    /// Target equation: antoine (exact, default), clapeyron, riedel or wagner (refit).
    #[arg(long, default_value = "antoine")]
    pub model: String,
    /// Validity range to refit over, e.g. "-26 degC..77 degC".
    #[arg(long, allow_hyphen_values = true)]
    pub range: Option<String>,
    /// Critical point "Tc,pc" with units for Wagner, e.g. "508.1 K,47.0 bar".
    #[arg(long)]
    pub critical: Option<String>,
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

#[derive(serde::Serialize)]
struct Refitted {
    model: String,
    /// The equation the parameters belong to, written out.
    equation: &'static str,
    /// Critical temperature used (Wagner), K.
    #[serde(skip_serializing_if = "Option::is_none")]
    tc_k: Option<f64>,
    /// Critical pressure used (Wagner), Pa.
    #[serde(skip_serializing_if = "Option::is_none")]
    pc_pa: Option<f64>,
    parameters: Vec<Param>,
    convention: String,
    exact: bool,
    range_k: (f64, f64),
    max_rel_dev_pct: f64,
}

#[derive(serde::Serialize)]
struct Param {
    name: String,
    value: f64,
}

/// The equation form a refit reports its parameters in (SI: T in K, p in Pa).
fn equation_form(model: ModelSelection) -> &'static str {
    match model {
        ModelSelection::Clapeyron => "ln(p/Pa) = A - B/(T/K)",
        ModelSelection::Riedel => "ln(p/Pa) = A + B/(T/K) + C ln(T/K) + D (T/K)^6",
        ModelSelection::Wagner => {
            "ln(p/pc) = (Tc/T) (A tau + B tau^1.5 + C tau^2.5 + D tau^5), tau = 1 - T/Tc"
        }
        ModelSelection::Antoine | ModelSelection::Auto => "Antoine, in the stated convention",
    }
}

fn run_refit(args: &Args, k: AntoineConstants, model: ModelSelection) -> anyhow::Result<Outcome> {
    let mut k = k;
    if let Some(r) = &args.range {
        let (lo, hi) = r.split_once("..").ok_or_else(|| {
            InputError(format!(
                "--range '{r}': write it as \"LOW..HIGH\", e.g. \"20 degC..110 degC\""
            ))
        })?;
        let lo = parse_temperature(lo).map_err(|e| InputError(format!("--range: {e}")))?;
        let hi = parse_temperature(hi).map_err(|e| InputError(format!("--range: {e}")))?;
        k = k.with_range_k(lo.kelvin(), hi.kelvin());
    }
    let critical = match &args.critical {
        Some(s) => {
            let (t, p) = s.split_once(',').ok_or_else(|| {
                InputError(format!(
                    "--critical '{s}': write it as \"Tc,pc\" with units"
                ))
            })?;
            let t = parse_temperature(t).map_err(|e| InputError(format!("--critical: {e}")))?;
            let p = parse_pressure(p).map_err(|e| InputError(format!("--critical: {e}")))?;
            Some((t.kelvin(), p.pa()))
        }
        None if model == ModelSelection::Wagner => {
            return Err(InputError(
                "--model wagner needs the critical point: --critical \"Tc,pc\" with units, e.g. --critical \"591.8 K,41.1 bar\"".into(),
            )
            .into())
        }
        None => None,
    };
    let r = refit(&k, model, critical).map_err(|e| InputError(super::hints::refit_error(&e)))?;
    let out = Refitted {
        model: r.model.clone(),
        equation: equation_form(model),
        tc_k: critical.map(|c| c.0),
        pc_pa: critical.map(|c| c.1),
        parameters: r
            .parameters
            .iter()
            .map(|(n, v)| Param {
                name: n.clone(),
                value: *v,
            })
            .collect(),
        convention: r.convention.clone(),
        exact: false,
        range_k: r.range_k,
        max_rel_dev_pct: r.max_rel_dev_pct,
    };
    let text = match args.out.format() {
        Format::Json => super::common::json_text(&out)? + "\n",
        Format::Csv => {
            let mut s = String::from("model,name,value,convention,exact,max_rel_dev_pct\n");
            for p in &out.parameters {
                s.push_str(&format!(
                    "{},{},{},\"{}\",false,{}\n",
                    out.model, p.name, p.value, out.convention, out.max_rel_dev_pct
                ));
            }
            s
        }
        Format::Table => {
            let mut s = format!(
                "{} constants ({}), refitted over {:.2}-{:.2} K (not exact)\n  {}\n",
                out.model, out.convention, out.range_k.0, out.range_k.1, out.equation
            );
            if let (Some(tc), Some(pc)) = (out.tc_k, out.pc_pa) {
                s.push_str(&format!(
                    "  with Tc = {} K, pc = {} bar (as given)\n",
                    ebullio::units::tidy(tc),
                    ebullio::units::tidy(pc / 1e5)
                ));
            }
            for p in &out.parameters {
                s.push_str(&format!("  {} = {}\n", p.name, p.value));
            }
            s.push_str(&format!(
                "Largest deviation from the Antoine curve over the range: {:.3} % in p\n",
                out.max_rel_dev_pct
            ));
            s
        }
    };
    args.out.emit(&text, &[])?;
    Ok(Outcome::Success)
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let [a, b, c] = parse_abc(&args.antoine)?;
    let from: AntoineConvention = args
        .constants
        .parse()
        .map_err(|e| InputError(format!("--constants: {e}")))?;
    let model: ModelSelection = args
        .model
        .parse()
        .map_err(|e: String| InputError(format!("--model: {e}")))?;
    if !matches!(model, ModelSelection::Antoine) {
        return run_refit(&args, AntoineConstants::new(a, b, c, from), model);
    }
    let to: AntoineConvention = args
        .to
        .as_deref()
        .ok_or_else(|| {
            InputError("--to is needed for an Antoine target, e.g. --to \"log10,mmHg,degC\"".into())
        })?
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
        Format::Json => super::common::json_text(&r)? + "\n",
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
