//! `ebullio fit` on binary VLE data (an `x1` column): read, resolve the two components'
//! vapor pressures, fit, print. Glue only: reading is `table_io::binary`, numerics
//! `mixture::fit`, text `report::text::binary_fit`.

use super::common::{parse_pressure, Format};
use super::fit::Args;
use super::vle::{reference_comp, smiles_comp, Comp};
use super::{InputError, Outcome};
use anyhow::Context;
use ebullio::mixture::fit::report::ComponentInfo;
use ebullio::mixture::fit::{
    fit_binary, BinaryFitOptions, BinaryModelSelection, FitModel, Uncertainties, NRTL_ALPHA_DEFAULT,
};
use ebullio::table_io::binary::{read_binary_bytes, BinaryReadOptions};
use ebullio::table_io::ReadOptions;
use ebullio::units::{parse_temperature, PressureUnit, TemperatureUnit};

fn model(text: Option<&str>) -> Result<BinaryModelSelection, InputError> {
    Ok(match text.unwrap_or("auto").trim().to_ascii_lowercase().as_str() {
        "auto" => BinaryModelSelection::Auto,
        "margules" => BinaryModelSelection::Fixed(FitModel::Margules),
        "van-laar" | "vanlaar" => BinaryModelSelection::Fixed(FitModel::VanLaar),
        "wilson" => BinaryModelSelection::Fixed(FitModel::Wilson),
        "nrtl" => BinaryModelSelection::Fixed(FitModel::Nrtl {
            alpha: NRTL_ALPHA_DEFAULT,
        }),
        "nrtl-alpha" => BinaryModelSelection::Fixed(FitModel::NrtlAlpha),
        other => {
            return Err(InputError(format!(
                "--model '{other}': for binary VLE data expected margules, van-laar, wilson, nrtl, nrtl-alpha or auto"
            )))
        }
    })
}

/// The two components: --compound/--smiles in order, else the file's `# components:` line.
fn components(
    args: &Args,
    header: Option<&([String; 2], u64)>,
    source: &str,
) -> Result<Vec<Comp>, InputError> {
    let mut comps = Vec::new();
    for c in &args.compound {
        comps.push(reference_comp(c)?);
    }
    for s in &args.smiles {
        comps.push(smiles_comp(s)?);
    }
    if comps.is_empty() {
        if let Some((names, line)) = header {
            for n in names {
                comps.push(reference_comp(n).map_err(|e| {
                    InputError(format!(
                        "{source}, line {line}, column 1 (# components): {}",
                        e.0
                    ))
                })?);
            }
            if comps[0].name == comps[1].name {
                return Err(InputError(format!(
                    "{source}, line {line}, column 1 (# components): both components are {}; a binary needs two different compounds",
                    comps[0].name
                )));
            }
            return Ok(comps);
        }
    }
    if comps.len() != 2 {
        return Err(InputError(format!(
            "{source}: binary VLE data need two components: give --compound (or --smiles) twice, component 1 first, or a line \"# components: A, B\" above the header; {} given",
            comps.len()
        )));
    }
    let same_structure =
        matches!((&comps[0].smiles, &comps[1].smiles), (Some(a), Some(b)) if a == b);
    if comps[0].name.eq_ignore_ascii_case(&comps[1].name) || same_structure {
        return Err(InputError(format!(
            "{source}: both components are {}; a binary needs two different compounds",
            comps[0].name
        )));
    }
    Ok(comps)
}

pub fn run(args: &Args, bytes: &[u8]) -> anyhow::Result<Outcome> {
    let opts = BinaryReadOptions {
        read: ReadOptions {
            decimal_comma: args.decimal_comma,
            ..Default::default()
        },
        pressure_pa: args
            .pressure
            .as_deref()
            .map(|p| {
                parse_pressure(p)
                    .map(|q| q.pa())
                    .map_err(|e| InputError(format!("--pressure '{p}': {e}")))
            })
            .transpose()?,
        temperature_k: args
            .temperature
            .as_deref()
            .map(|t| {
                parse_temperature(t)
                    .map(|q| q.kelvin())
                    .map_err(|e| InputError(format!("--temperature '{t}': {e}")))
            })
            .transpose()?,
    };
    let sel = model(args.model.as_deref())?;
    let d = Uncertainties::default();
    let positive = |v: Option<f64>, default: f64, opt: &str| -> Result<f64, InputError> {
        match v {
            None => Ok(default),
            Some(x) if x.is_finite() && x > 0.0 => Ok(x),
            Some(x) => Err(InputError(format!(
                "{opt} {x}: expected a positive standard uncertainty"
            ))),
        }
    };
    let u = Uncertainties {
        t_k: positive(args.u_t, d.t_k, "--u-t")?,
        y1: positive(args.u_y, d.y1, "--u-y")?,
        p_rel: positive(args.u_p.map(|p| p / 100.0), d.p_rel, "--u-p")?,
    };
    let table =
        read_binary_bytes(&args.data, bytes, &opts).map_err(|e| InputError(e.to_string()))?;
    let comps = components(args, table.components.as_ref(), &table.source)?;
    let info: Vec<ComponentInfo> = comps
        .iter()
        .map(|c| ComponentInfo {
            name: c.name.clone(),
            smiles: c.smiles.clone(),
            vapor_pressure_source: c.source.clone(),
        })
        .collect();
    let curves = [comps[0].curve.as_ref(), comps[1].curve.as_ref()];
    let report = fit_binary(
        &table.data,
        curves,
        info,
        &BinaryFitOptions { model: sel, u },
    )
    .map_err(|e| InputError(format!("{}: {e}", table.source)))?;
    let text = match args.out.format() {
        Format::Json => super::common::json_text(&report)? + "\n",
        Format::Csv => ebullio::report::text::binary_fit::points_csv(&report)?,
        Format::Table => ebullio::report::text::binary_fit::table(
            &report,
            table.units.0.unwrap_or(TemperatureUnit::Kelvin),
            table.units.1.unwrap_or(PressureUnit::KPa),
        ),
    };
    if let Some(path) = &args.plot {
        let svg = ebullio::report::binary_fit_plot::binary_fit_svg(&report)?;
        ebullio::table_io::write_atomic(path, svg.as_bytes(), &[args.data.as_path()])
            .with_context(|| format!("writing {}", path.display()))?;
    }
    args.out.emit(&text, &[args.data.as_path()])?;
    if let Some(path) = &args.report {
        let html = ebullio::report::binary_fit_section::binary_fit_report(
            &table.source,
            &report,
            &super::common::command_line(),
        )
        .render();
        super::common::write_report(
            path,
            &html,
            &[args.data.as_path()],
            args.out.output.as_deref(),
        )?;
    }
    Ok(Outcome::Success)
}
