//! `ebullio vle`: vapor–liquid equilibrium of a binary (diagram, azeotropes, liquid split).

use super::common::{Format, OutputArgs};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::mixture::{self, Condition, VleRequest, VleSetup};
use ebullio::report::text::vle::{self as vle_text, AtX1, VleOutput};
use std::path::PathBuf;

/// Vapor–liquid equilibrium of two components: the T–x–y diagram at a pressure
/// (or p–x–y at a temperature), the equilibrium curve y(x), every azeotrope
/// with how it moves with pressure, and whether the liquid splits in two.
/// Activity coefficients by original UNIFAC from structure (default when both
/// structures are known), Wilson or NRTL with your parameters, or ideal.
///
/// Component 1 is the first --compound (then the --smiles values in order).
/// Predicted azeotropes must be confirmed with measured mixture data.
///
/// Example: ebullio vle --compound ethanol --compound water --pressure "1 atm"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// A bundled reference compound by name, synonym or CAS number (repeatable).
    #[arg(long, value_name = "NAME")]
    pub compound: Vec<String>,
    /// A component from structure, a name may follow after a space:
    /// "CC(=O)C acetone" (repeatable). Its vapor pressure is the bundled
    /// reference curve when the structure is in the reference, else the
    /// structure estimate (Joback boiling point, Lee–Kesler curve).
    #[arg(long, value_name = "SMILES")]
    pub smiles: Vec<String>,
    /// Fixed pressure with its unit, e.g. "1 atm", "200 mbar" [default: 1 atm].
    #[arg(long, conflicts_with = "temperature", allow_hyphen_values = true)]
    pub pressure: Option<String>,
    /// Fixed temperature with its unit, e.g. "60 degC" (gives the p–x–y diagram).
    #[arg(long, allow_hyphen_values = true)]
    pub temperature: Option<String>,
    /// Liquid activity model [default: unifac when both structures are known, else ideal].
    #[arg(long, value_enum)]
    pub model: Option<ModelArg>,
    /// Wilson parameters "a12,a21" in kelvin, Λ12 = (v2/v1)·exp(−a12/T),
    /// optionally with molar volumes "a12,a21,v1,v2" (implies --model wilson).
    #[arg(long, value_name = "a12,a21[,v1,v2]", allow_hyphen_values = true)]
    pub wilson: Option<String>,
    /// NRTL parameters "b12,b21,alpha", τ12 = b12/T with b in kelvin (implies --model nrtl).
    #[arg(long, value_name = "b12,b21,alpha", allow_hyphen_values = true)]
    pub nrtl: Option<String>,
    /// A binary VLE fit (`ebullio fit still.csv --format json -o fit.json`): its fitted
    /// model and parameters, its components (unless given) and its pressure or temperature
    /// (unless given).
    #[arg(long, value_name = "FIT.json", conflicts_with_all = ["model", "wilson", "nrtl"])]
    pub from: Option<PathBuf>,
    /// Also give the bubble and dew points at this mole fraction of component 1.
    #[arg(long, value_name = "X1", allow_hyphen_values = true)]
    pub x1: Option<String>,
    /// Points in the diagram, 11 to 1001.
    #[arg(long, default_value_t = 101)]
    pub points: usize,
    /// Also draw the T–x–y (or p–x–y) and y–x diagrams to this SVG file.
    #[arg(long, value_name = "FILE.svg")]
    pub plot: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

/// `--model` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum ModelArg {
    /// Original UNIFAC from the structures.
    Unifac,
    /// Wilson with --wilson parameters.
    Wilson,
    /// NRTL with --nrtl parameters.
    Nrtl,
    /// Ideal liquid (Raoult's law).
    Ideal,
}

/// A component with its vapor-pressure curve and where it came from (shared with `fit`).
pub(super) use ebullio::mixture::Component as Comp;

/// One `--compound` value: the library's reference component, the error naming the option.
pub(super) fn reference_comp(name: &str) -> Result<Comp, InputError> {
    Comp::reference(name).map_err(|e| InputError(format!("--compound '{name}': {e}")))
}

/// One `--smiles` value ("SMILES name"): reference first, else the structure estimate.
pub(super) fn smiles_comp(text: &str) -> Result<Comp, InputError> {
    Comp::structure(text).map_err(|e| {
        let sep = if text.trim().is_empty() { ":" } else { "" };
        InputError(format!("--smiles{sep} {e}"))
    })
}

/// "a,b,c" as numbers; the library checks how many and that they are finite.
fn numbers(text: &str, opt: &str, form: &str) -> Result<Vec<f64>, InputError> {
    text.split(',')
        .map(|s| s.trim().parse::<f64>())
        .collect::<Result<_, _>>()
        .map_err(|_| InputError(format!("{opt} '{text}': expected numbers \"{form}\"")))
}

impl ModelArg {
    fn name(self) -> &'static str {
        match self {
            ModelArg::Unifac => "unifac",
            ModelArg::Wilson => "wilson",
            ModelArg::Nrtl => "nrtl",
            ModelArg::Ideal => "ideal",
        }
    }
}

fn round(v: f64, d: i32) -> f64 {
    let f = 10f64.powi(d);
    (v * f).round() / f
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let wilson = args
        .wilson
        .as_deref()
        .map(|t| numbers(t, "--wilson", "a12,a21[,v1,v2]"))
        .transpose()?;
    let nrtl = args
        .nrtl
        .as_deref()
        .map(|t| numbers(t, "--nrtl", "b12,b21,alpha"))
        .transpose()?;
    let fitted = args
        .from
        .as_deref()
        .map(ebullio::table_io::read_binary_fit)
        .transpose()
        .map_err(|e| InputError(format!("--from {e}")))?;
    let file = args
        .from
        .as_deref()
        .map(|p| p.display().to_string())
        .unwrap_or_default();
    let setup = VleRequest {
        compounds: &args.compound,
        smiles: &args.smiles,
        pressure: args.pressure.as_deref(),
        temperature: args.temperature.as_deref(),
        model: args.model.map(ModelArg::name),
        wilson: wilson.as_deref(),
        nrtl: nrtl.as_deref(),
        points: args.points,
        barometric_pa: super::common::barometric().map(|p| p.pa()),
        fitted: fitted.as_ref().map(|f| (f, file.as_str())),
    }
    .resolve(&|n| format!("--{n}"))
    .map_err(InputError)?;
    let x1 = args
        .x1
        .as_deref()
        .map(|t| {
            t.trim()
                .parse::<f64>()
                .ok()
                .filter(|x| (0.0..=1.0).contains(x))
                .ok_or_else(|| {
                    InputError(format!("--x1 '{t}': expected a mole fraction from 0 to 1"))
                })
        })
        .transpose()?;
    let study = setup.study().map_err(|e| InputError(e.to_string()))?;
    let at_x1 = match x1 {
        Some(x) => Some(point_at(&setup, x, &study.liquid_split)?),
        None => None,
    };
    let svg = match &args.plot {
        Some(_) => Some(ebullio::report::vle_plot::vle_svg(&study)?),
        None => None,
    };
    let out = VleOutput { study, at_x1 };
    let text = match args.out.format() {
        Format::Json => super::common::json_text(&out)? + "\n",
        Format::Csv => vle_text::csv(&out.study)?,
        Format::Table => vle_text::table(&out),
    };
    if let (Some(path), Some(svg)) = (&args.plot, svg) {
        ebullio::table_io::write_atomic(path, svg.as_bytes(), &[])
            .with_context(|| format!("writing {}", path.display()))?;
    }
    args.out.emit(&text, &[])?;
    Ok(Outcome::Success)
}

fn point_at(setup: &VleSetup, x: f64, split: &mixture::LiquidSplit) -> Result<AtX1, InputError> {
    let b = setup.binary();
    let cond = setup.condition;
    let e = |e: mixture::MixtureError| InputError(format!("--x1 {x}: {e}"));
    let (bub, dew) = match cond {
        Condition::Pressure(p) => (b.bubble_t(x, p).map_err(e)?, b.dew_t(x, p).ok()),
        Condition::Temperature(t) => (b.bubble_p(x, t).map_err(e)?, b.dew_p(x, t).ok()),
    };
    let iso = matches!(cond, Condition::Pressure(_));
    // Inside the predicted split the liquid boils at the three-phase point.
    let two = split.predicted
        && split.x1_low.is_some_and(|lo| x > lo)
        && split.x1_high.is_some_and(|hi| x < hi);
    let (bt, bp, by) = if two {
        (split.t_k, split.p_pa, split.y1.unwrap_or(f64::NAN))
    } else {
        (
            iso.then(|| round(bub.t_k, 3)),
            (!iso).then(|| round(bub.p_pa, 1)),
            round(bub.y1, 6),
        )
    };
    Ok(AtX1 {
        x1: x,
        bubble_t_k: bt,
        bubble_p_pa: bp,
        bubble_y1: by,
        liquids: if two { 2 } else { 1 },
        dew_t_k: dew.filter(|_| iso).map(|d| round(d.t_k, 3)),
        dew_p_pa: dew.filter(|_| !iso).map(|d| round(d.p_pa, 1)),
        dew_x1: dew.map(|d| round(d.x1, 6)),
    })
}
