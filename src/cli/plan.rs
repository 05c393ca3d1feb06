//! `ebullio plan`: separation plan for two or more components (pressure, α, Fenske stages, Rayleigh curve, verdict).

use super::common::parse_pressure;
use super::common::{Format, OutputArgs};
use super::curve_source::{self, ByStructure};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::plan::{self, ActivityChoice, Component, PlanOptions, PressureRequest, RayleighModel};
use ebullio::report::text::plan as plan_text;
use ebullio::units::parse_temperature;
use ebullio::vapor::{AntoineConstants, AntoineConvention};
use std::path::PathBuf;

/// Plan the separation of two or more components by batch distillation: the
/// operating pressure, boiling points, ideal relative volatility (Raoult's
/// law), Fenske minimum theoretical stages, the simple-distillation (Rayleigh)
/// curve and a plain verdict. Ideal solution assumed: azeotropes and
/// non-ideal mixtures are not modelled.
///
/// Example: ebullio plan --antoine "benzene:13.7819,2726.81,217.572" --antoine "toluene:13.9320,3056.96,217.625" --constants "ln,kPa,degC" --pressure "200 mbar"
#[derive(Debug, clap::Args)]
pub struct Args {
    /// A component by Antoine constants, "NAME:A,B,C" (repeatable), in the
    /// convention of --constants, or with its own: "NAME:A,B,C@log10,mmHg,degC".
    #[arg(long, value_name = "NAME:A,B,C", allow_hyphen_values = true)]
    pub antoine: Vec<String>,
    /// A component estimated from structure (Joback boiling point, Lee–Kesler
    /// curve), repeatable; a name may follow after a space: "CC(=O)C acetone".
    #[arg(long, value_name = "SMILES")]
    pub smiles: Vec<String>,
    /// A bundled reference compound by name, synonym or CAS number (repeatable).
    #[arg(long, value_name = "NAME")]
    pub compound: Vec<String>,
    /// A component from a fit result file written by `ebullio fit --format json`
    /// (repeatable; every compound in a batch file becomes a component). A binary
    /// VLE fit (`ebullio fit` on x1, y1 data) gives the key pair's liquid model
    /// instead, with its two components unless they are already given.
    #[arg(long, value_name = "FIT.json")]
    pub from: Vec<PathBuf>,
    /// Convention of the --antoine constants, e.g. "log10,mmHg,degC".
    #[arg(long)]
    pub constants: Option<String>,
    /// Operating pressure with its unit, e.g. "50 mbar" [default: 1 atm].
    #[arg(long, conflicts_with = "max_pot", allow_hyphen_values = true)]
    pub pressure: Option<String>,
    /// Maximum pot temperature, e.g. "120 degC": the plan uses the highest
    /// pressure at which the heaviest component boils at or below it, rounded
    /// down to 2 significant figures in mbar.
    #[arg(long, allow_hyphen_values = true)]
    pub max_pot: Option<String>,
    /// Target purity (mole fraction) of both distillate and bottoms.
    #[arg(long, default_value_t = 0.99)]
    pub purity: f64,
    /// Light-component purity of the distillate (overrides --purity).
    #[arg(long)]
    pub distillate_purity: Option<f64>,
    /// Heavy-component purity of the bottoms (overrides --purity).
    #[arg(long)]
    pub bottoms_purity: Option<f64>,
    /// Mole fraction of the lighter key component in the charge.
    #[arg(long, default_value_t = 0.5)]
    pub feed: f64,
    /// Equilibrium for the Rayleigh curve: `varying` (Raoult, α follows the
    /// pot temperature) or `constant` (the geometric-mean α).
    #[arg(long, value_enum, default_value_t = RayleighArg::Varying)]
    pub rayleigh: RayleighArg,
    /// Liquid model of the key pair: `unifac` (from structure) or `ideal`
    /// (Raoult's law) [default: unifac when both structures are known, else ideal].
    #[arg(long, value_enum)]
    pub model: Option<ModelArg>,
    /// Reflux ratio of the column's stage count as a multiple of the minimum.
    #[arg(long, default_value_t = 1.3)]
    pub reflux_factor: f64,
    /// Feed condition q of the continuous column: 1 saturated liquid, 0 saturated vapor.
    #[arg(long, default_value_t = 1.0, allow_hyphen_values = true)]
    pub feed_q: f64,
    /// Also draw boiling points against pressure and the Rayleigh curve to this SVG file.
    #[arg(long, value_name = "FILE.svg")]
    pub plot: Option<PathBuf>,
    /// Also write one self-contained HTML report (the plan, its drawings: the
    /// column on the equilibrium curve and the key pair's T–x–y diagram) to this file.
    #[arg(long, value_name = "FILE.html")]
    pub report: Option<PathBuf>,
    #[command(flatten)]
    pub out: OutputArgs,
}

/// `--model` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum ModelArg {
    /// Original UNIFAC from the components' structures.
    Unifac,
    /// Ideal solution (Raoult's law).
    Ideal,
}

/// `--rayleigh` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum RayleighArg {
    /// α follows the bubble-point temperature (Raoult's law).
    Varying,
    /// Constant α.
    Constant,
}

/// Parse one `--antoine` value into a component.
fn antoine_component(
    text: &str,
    default: Option<AntoineConvention>,
) -> Result<Component, InputError> {
    let (body, conv) = match text.rsplit_once('@') {
        Some((b, c)) => (
            b,
            Some(
                c.parse::<AntoineConvention>()
                    .map_err(|e| InputError(format!("--antoine '{text}': {e}")))?,
            ),
        ),
        None => (text, None),
    };
    let (name, abc) = body.rsplit_once(':').ok_or_else(|| {
        InputError(format!(
            "--antoine '{text}': expected \"NAME:A,B,C\", e.g. \"toluene:13.9320,3056.96,217.625\""
        ))
    })?;
    let name = name.trim();
    if name.is_empty() {
        return Err(InputError(format!(
            "--antoine '{text}': the component name before ':' is empty"
        )));
    }
    let [a, b, c] = super::convert::parse_abc(abc).map_err(|e| {
        InputError(format!(
            "--antoine '{text}': {}",
            e.0.trim_start_matches("--antoine ")
        ))
    })?;
    let conv = conv.or(default).ok_or_else(|| {
        InputError(format!(
            "--antoine '{text}': no convention; give --constants \"log10,mmHg,degC\" or append \"@log10,mmHg,degC\""
        ))
    })?;
    Ok(Component::new(
        name,
        Box::new(AntoineConstants::new(a, b, c, conv)),
        format!("Antoine constants given on the command line ({conv}); no uncertainty stated"),
    ))
}

/// One `--compound` value into a component from the bundled reference.
fn reference_component(name: &str) -> Result<Component, InputError> {
    let (c, curve) = curve_source::by_name(ebullio::reference::Library::bundled(), name)?;
    let source = format!("reference: {}", curve.source);
    let comp = Component::new(c.name.clone(), Box::new(curve), source);
    Ok(match &c.smiles {
        Some(s) => comp.with_smiles(s.clone()),
        None => comp,
    })
}

/// One `--smiles` value into a component (reference first, else an estimate).
fn smiles_component(text: &str) -> Result<Component, InputError> {
    let (smiles, given) = curve_source::smiles_and_name(text)?;
    Ok(match curve_source::by_structure(smiles)? {
        ByStructure::Reference(c, rc) => {
            let source = format!(
                "reference (structure {smiles} is {}): {}",
                c.name, rc.source
            );
            Component::new(given.unwrap_or_else(|| c.name.clone()), Box::new(rc), source)
        }
        ByStructure::Estimate(e) => Component::new(
            given.unwrap_or_else(|| smiles.to_string()),
            Box::new(e.curve),
            format!(
                "structure estimate from SMILES {smiles} ({} normal boiling point {:.1} K, typical error {:.1} K; Lee–Kesler curve)",
                curve_source::variant_words(e.variant),
                e.tb_k,
                e.typical_error_k
            ),
        )
        .with_smiles(smiles),
    })
}

/// The components in one fit result file.
fn fit_components(path: &std::path::Path) -> Result<Vec<Component>, InputError> {
    use ebullio::fit::FittedCurve;
    let reports =
        ebullio::table_io::read_fit_reports(path).map_err(|e| InputError(format!("--from {e}")))?;
    let stem = path
        .file_stem()
        .and_then(|s| s.to_str())
        .unwrap_or("fit")
        .to_string();
    let many = reports.len() > 1;
    Ok(reports
        .iter()
        .enumerate()
        .map(|(i, r)| {
            let name = r.compound.clone().unwrap_or_else(|| {
                if many {
                    format!("{stem}#{}", i + 1)
                } else {
                    stem.clone()
                }
            });
            let source = format!(
                "{} fit of {} measured points from {} (uncertainty from the fit covariance)",
                r.model,
                r.n_points,
                path.display()
            );
            Component::new(name, Box::new(FittedCurve::from_report(r)), source)
        })
        .collect())
}

/// Stage two of argument handling: build the components and options.
fn resolve(args: &Args) -> Result<(Vec<Component>, PlanOptions), InputError> {
    let default = args
        .constants
        .as_deref()
        .map(|c| {
            c.parse::<AntoineConvention>()
                .map_err(|e| InputError(format!("--constants: {e}")))
        })
        .transpose()?;
    let mut comps = args
        .antoine
        .iter()
        .map(|t| antoine_component(t, default))
        .collect::<Result<Vec<_>, _>>()?;
    for c in &args.compound {
        comps.push(reference_component(c)?);
    }
    for s in &args.smiles {
        comps.push(smiles_component(s)?);
    }
    let mut fitted = None;
    for f in &args.from {
        if ebullio::table_io::is_binary_fit(f) {
            let r = ebullio::table_io::read_binary_fit(f)
                .map_err(|e| InputError(format!("--from {e}")))?;
            let model = r
                .fitted_model()
                .map_err(|e| InputError(format!("--from {}: {e}", f.display())))?;
            let names: Vec<String> = r.components.iter().map(|c| c.name.clone()).collect();
            if names.len() != 2 || fitted.is_some() {
                return Err(InputError(format!(
                    "--from {}: a plan takes one binary VLE fit with its two components named",
                    f.display()
                )));
            }
            for c in &r.components {
                if !comps
                    .iter()
                    .any(|k: &Component| k.name.eq_ignore_ascii_case(&c.name))
                {
                    comps.push(match (reference_component(&c.name), &c.smiles) {
                        (Ok(k), _) => k,
                        (Err(_), Some(sm)) => smiles_component(&format!("{sm} {}", c.name))?,
                        (Err(e), None) => return Err(e),
                    });
                }
            }
            fitted = Some(ActivityChoice::Fitted {
                model,
                names: [names[0].clone(), names[1].clone()],
            });
            continue;
        }
        comps.extend(fit_components(f)?);
    }
    if fitted.is_some() && args.model.is_some() {
        return Err(InputError(
            "--model and a binary VLE fit in --from both choose the liquid model; give one".into(),
        ));
    }
    if comps.len() < 2 {
        return Err(InputError(format!(
            "a plan needs at least two components (any mix of --antoine, --compound, --smiles, --from); {} given",
            comps.len()
        )));
    }
    let pressure = match (&args.pressure, &args.max_pot) {
        (Some(p), _) => PressureRequest::Given(
            parse_pressure(p)
                .map_err(|e| InputError(format!("--pressure: {e}")))?
                .pa(),
        ),
        (None, Some(t)) => PressureRequest::MaxPot(
            parse_temperature(t)
                .map_err(|e| InputError(format!("--max-pot: {e}")))?
                .kelvin(),
        ),
        (None, None) => PressureRequest::Given(ebullio::units::ATM_PA),
    };
    let opts = PlanOptions {
        pressure,
        distillate_purity: args.distillate_purity.unwrap_or(args.purity),
        bottoms_purity: args.bottoms_purity.unwrap_or(args.purity),
        feed_x_light: args.feed,
        rayleigh_model: match args.rayleigh {
            RayleighArg::Varying => RayleighModel::Varying,
            RayleighArg::Constant => RayleighModel::Constant,
        },
        activity: match args.model {
            None if fitted.is_some() => fitted.unwrap_or_default(),
            None => ActivityChoice::Auto,
            Some(ModelArg::Unifac) => ActivityChoice::Unifac,
            Some(ModelArg::Ideal) => ActivityChoice::Ideal,
        },
        feed_q: args.feed_q,
        reflux_factor: args.reflux_factor,
    };
    if !(opts.reflux_factor.is_finite() && opts.reflux_factor > 1.0) {
        return Err(InputError(format!(
            "--reflux-factor {}: expected a multiple of the minimum reflux above 1, e.g. 1.3",
            opts.reflux_factor
        )));
    }
    if !(opts.feed_q.is_finite() && opts.feed_q > -5.0 && opts.feed_q < 5.0) {
        return Err(InputError(format!(
            "--feed-q {}: expected the feed condition q between -5 and 5 (1 saturated liquid, 0 saturated vapor)",
            opts.feed_q
        )));
    }
    Ok((comps, opts))
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let (comps, opts) = resolve(&args)?;
    let p = plan::plan(&comps, &opts).map_err(|e| InputError(super::hints::plan_error(&e)))?;
    if let Some(path) = &args.plot {
        let svg = ebullio::report::plan_plot::plan_svg(&p, &comps)?;
        let inputs: Vec<&std::path::Path> = args.from.iter().map(|p| p.as_path()).collect();
        ebullio::table_io::write_atomic(path, svg.as_bytes(), &inputs)
            .with_context(|| format!("writing {}", path.display()))?;
    }
    let text = match args.out.format() {
        Format::Json => super::common::json_text(&p)? + "\n",
        Format::Csv => plan_text::csv(&p)?,
        Format::Table => plan_text::table(&p),
    };
    let inputs: Vec<&std::path::Path> = args.from.iter().map(|p| p.as_path()).collect();
    args.out.emit(&text, &inputs)?;
    if let Some(path) = &args.report {
        let html =
            ebullio::report::plan_section::plan_report(&p, &comps, &super::common::command_line())
                .render();
        super::common::write_report(path, &html, &inputs, args.out.output.as_deref())?;
    }
    Ok(Outcome::Success)
}
