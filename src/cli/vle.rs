//! `ebullio vle`: vapor–liquid equilibrium of a binary (diagram, azeotropes, liquid split).

use super::common::parse_pressure;
use super::common::{Format, OutputArgs};
use super::curve_source::{self, ByStructure};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::mixture::{
    self, ActivityModel, Condition, Ideal, Nrtl, StudyComponent, StudyOptions, Unifac, Wilson,
};
use ebullio::report::text::vle::{self as vle_text, AtX1, VleOutput};
use ebullio::units::{parse_temperature, ATM_PA};
use ebullio::vapor::Curve;
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
pub(super) struct Comp {
    pub(super) name: String,
    pub(super) smiles: Option<String>,
    pub(super) source: String,
    pub(super) curve: Box<dyn Curve>,
}

pub(super) fn reference_comp(name: &str) -> Result<Comp, InputError> {
    let (c, curve) = curve_source::by_name(ebullio::reference::Library::bundled(), name)?;
    let source = format!(
        "reference: {} (u(p)/p = {:.1} %)",
        citation(&curve.source),
        100.0 * curve.u_p_rel
    );
    Ok(Comp {
        name: c.name.clone(),
        smiles: c.smiles.clone(),
        source,
        curve: Box::new(curve),
    })
}

/// The printed citation of a reference row without any web address the row's
/// notes carry (output names published works only), keeping file and line.
fn citation(source: &str) -> String {
    match source.find("; http") {
        Some(i) => {
            let tail = source
                .rfind(" (reference-data/")
                .or_else(|| source.rfind(" ("))
                .filter(|&j| j > i && !source[j..].contains("http"))
                .map_or("", |j| &source[j..]);
            format!("{}{tail}", &source[..i])
        }
        None => source.to_string(),
    }
}

pub(super) fn smiles_comp(text: &str) -> Result<Comp, InputError> {
    let (smiles, given) = curve_source::smiles_and_name(text)?;
    let name = given.unwrap_or_else(|| smiles.to_string());
    Ok(match curve_source::by_structure(smiles)? {
        ByStructure::Reference(c, curve) => Comp {
            name,
            smiles: Some(smiles.to_string()),
            source: format!(
                "reference, matched by structure to {}: {} (u(p)/p = {:.1} %)",
                c.name,
                citation(&curve.source),
                100.0 * curve.u_p_rel
            ),
            curve: Box::new(curve),
        },
        ByStructure::Estimate(e) => Comp {
            name,
            smiles: Some(smiles.to_string()),
            source: format!(
                "structure estimate ({} normal boiling point {:.1} K, typical error {:.1} K; Lee–Kesler curve)",
                curve_source::variant_words(e.variant),
                e.tb_k,
                e.typical_error_k
            ),
            curve: Box::new(e.curve),
        },
    })
}

fn numbers(text: &str, opt: &str, counts: &[usize], form: &str) -> Result<Vec<f64>, InputError> {
    let v: Vec<f64> = text
        .split(',')
        .map(|s| s.trim().parse::<f64>())
        .collect::<Result<_, _>>()
        .map_err(|_| InputError(format!("{opt} '{text}': expected numbers \"{form}\"")))?;
    if !counts.contains(&v.len()) || v.iter().any(|x| !x.is_finite()) {
        return Err(InputError(format!(
            "{opt} '{text}': expected {} finite numbers \"{form}\"",
            counts
                .iter()
                .map(|c| c.to_string())
                .collect::<Vec<_>>()
                .join(" or ")
        )));
    }
    Ok(v)
}

fn model(
    args: &Args,
    comps: &[Comp],
) -> Result<(Box<dyn ActivityModel>, Option<String>), InputError> {
    let chosen = args.model.unwrap_or(if args.wilson.is_some() {
        ModelArg::Wilson
    } else if args.nrtl.is_some() {
        ModelArg::Nrtl
    } else if comps.iter().all(|c| c.smiles.is_some()) {
        ModelArg::Unifac
    } else {
        ModelArg::Ideal
    });
    let note = (args.model.is_none() && chosen == ModelArg::Ideal).then(|| {
        let missing: Vec<&str> = comps
            .iter()
            .filter(|c| c.smiles.is_none())
            .map(|c| c.name.as_str())
            .collect();
        format!(
            "No structure is known for {}, so UNIFAC cannot be used: ideal liquid assumed.",
            missing.join(", ")
        )
    });
    let m: Box<dyn ActivityModel> = match chosen {
        ModelArg::Ideal => Box::new(Ideal),
        ModelArg::Unifac => {
            let s: Vec<&str> = comps
                .iter()
                .map(|c| {
                    c.smiles.as_deref().ok_or_else(|| {
                        InputError(format!(
                            "--model unifac: no structure (SMILES) is known for {}; give it with --smiles",
                            c.name
                        ))
                    })
                })
                .collect::<Result<_, _>>()?;
            Box::new(
                Unifac::from_smiles([s[0], s[1]])
                    .map_err(|e| InputError(format!("UNIFAC: {e}")))?,
            )
        }
        ModelArg::Wilson => {
            let text = args.wilson.as_deref().ok_or_else(|| {
                InputError("--model wilson needs --wilson \"a12,a21\" (kelvin)".into())
            })?;
            let v = numbers(text, "--wilson", &[2, 4], "a12,a21[,v1,v2]")?;
            let vol = if v.len() == 4 {
                [v[2], v[3]]
            } else {
                [1.0, 1.0]
            };
            Box::new(
                Wilson::new(v[0], v[1], vol).map_err(|e| InputError(format!("--wilson: {e}")))?,
            )
        }
        ModelArg::Nrtl => {
            let text = args.nrtl.as_deref().ok_or_else(|| {
                InputError("--model nrtl needs --nrtl \"b12,b21,alpha\" (b in kelvin)".into())
            })?;
            let v = numbers(text, "--nrtl", &[3], "b12,b21,alpha")?;
            Box::new(Nrtl::new(v[0], v[1], v[2]).map_err(|e| InputError(format!("--nrtl: {e}")))?)
        }
    };
    Ok((m, note))
}

fn round(v: f64, d: i32) -> f64 {
    let f = 10f64.powi(d);
    (v * f).round() / f
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let mut comps = Vec::new();
    let fitted = args
        .from
        .as_deref()
        .map(ebullio::table_io::read_binary_fit)
        .transpose()
        .map_err(|e| InputError(format!("--from {e}")))?;
    if let (Some(f), true) = (&fitted, args.compound.is_empty() && args.smiles.is_empty()) {
        for c in &f.components {
            comps.push(match (reference_comp(&c.name), &c.smiles) {
                (Ok(comp), _) => comp,
                (Err(_), Some(s)) => smiles_comp(&format!("{s} {}", c.name))?,
                (Err(e), None) => return Err(e.into()),
            });
        }
    }
    for c in &args.compound {
        comps.push(reference_comp(c)?);
    }
    for s in &args.smiles {
        comps.push(smiles_comp(s)?);
    }
    if comps.len() != 2 {
        return Err(InputError(format!(
            "vle needs exactly two components (--compound or --smiles); {} given",
            comps.len()
        ))
        .into());
    }
    if !(11..=1001).contains(&args.points) {
        return Err(InputError(format!("--points {}: expected 11 to 1001", args.points)).into());
    }
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
    let condition = match (&args.pressure, &args.temperature) {
        (_, Some(t)) => Condition::Temperature(
            parse_temperature(t)
                .map_err(|e| InputError(format!("--temperature: {e}")))?
                .kelvin(),
        ),
        (Some(p), None) => Condition::Pressure(
            parse_pressure(p)
                .map_err(|e| InputError(format!("--pressure: {e}")))?
                .pa(),
        ),
        (None, None) => match fitted.as_ref().map(|f| (f.pressure_pa, f.temperature_k)) {
            Some((Some(p), _)) => Condition::Pressure(p),
            Some((None, Some(t))) => Condition::Temperature(t),
            _ => Condition::Pressure(ATM_PA),
        },
    };
    let (model, note) = match &fitted {
        Some(f) => (fitted_model(f, &comps, args.from.as_deref())?, None),
        None => model(&args, &comps)?,
    };
    fn sc(c: &Comp) -> StudyComponent<'_> {
        StudyComponent {
            name: &c.name,
            smiles: c.smiles.as_deref(),
            source: &c.source,
            curve: c.curve.as_ref(),
        }
    }
    let opts = StudyOptions {
        condition,
        points: args.points,
    };
    let mut study = mixture::vle_study([sc(&comps[0]), sc(&comps[1])], model.as_ref(), &opts)
        .map_err(|e| InputError(e.to_string()))?;
    if let Some(n) = note {
        study.flags.insert(
            0,
            mixture::Finding::new(mixture::MixtureCode::NoStructure, n),
        );
    }
    let at_x1 = match x1 {
        Some(x) => Some(point_at(
            &comps,
            model.as_ref(),
            condition,
            x,
            &study.liquid_split,
        )?),
        None => None,
    };
    let svg = match &args.plot {
        Some(_) => Some(ebullio::report::vle_plot::vle_svg(&study)?),
        None => None,
    };
    let out = VleOutput { study, at_x1 };
    let text = match args.out.format() {
        Format::Json => serde_json::to_string_pretty(&out)? + "\n",
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

fn point_at(
    comps: &[Comp],
    model: &dyn ActivityModel,
    cond: Condition,
    x: f64,
    split: &mixture::LiquidSplit,
) -> Result<AtX1, InputError> {
    let b = mixture::Binary {
        names: [&comps[0].name, &comps[1].name],
        curves: [comps[0].curve.as_ref(), comps[1].curve.as_ref()],
        model,
    };
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

/// The model of a binary fit file, numbered as the components given (swapped when they
/// come in the other order); refused when the fit is for another pair.
fn fitted_model(
    f: &ebullio::mixture::fit::BinaryFitReport,
    comps: &[Comp],
    path: Option<&std::path::Path>,
) -> Result<Box<dyn ActivityModel>, InputError> {
    let file = path.map(|p| p.display().to_string()).unwrap_or_default();
    let bad = |e: ebullio::mixture::MixtureError| InputError(format!("--from {file}: {e}"));
    let m = f.fitted_model().map_err(bad)?;
    let fit: Vec<String> = f.components.iter().map(|c| c.name.to_lowercase()).collect();
    let given: Vec<String> = comps.iter().map(|c| c.name.to_lowercase()).collect();
    if fit.len() != 2 || fit == given {
        return Ok(Box::new(m));
    }
    if fit[0] == given[1] && fit[1] == given[0] {
        return Ok(Box::new(m.swapped().map_err(bad)?));
    }
    Err(InputError(format!(
        "--from {file}: the fit is for {} / {}, not {} / {}",
        f.components[0].name, f.components[1].name, comps[0].name, comps[1].name
    )))
}
