//! The command line's words for library errors: the library says what is wrong
//! in its own terms; the command adds which option fixes it.

use ebullio::fit::FitError;
use ebullio::plan::PlanError;
use ebullio::refit::RefitError;
use ebullio::units::UnitError;

/// A unit error as the command line reports it.
#[derive(Debug)]
pub struct UnitHint(pub UnitError);

impl std::fmt::Display for UnitHint {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.0.hint("--barometric"))
    }
}

impl std::error::Error for UnitHint {}

/// A fit error with the options of `fit` that fix it.
pub fn fit_error(e: &FitError) -> String {
    match e {
        FitError::Exclude { .. } => format!("--exclude: {e}"),
        FitError::Critical(_) => format!("{e} (give --tc and --pc)"),
        _ => e.to_string(),
    }
}

/// A refit error with the options of `convert` that fix it.
pub fn refit_error(e: &RefitError) -> String {
    match e {
        RefitError::NoRange => format!("{e}; give one with --range \"20 degC..110 degC\""),
        RefitError::Fit(m) if m.contains("critical") => format!("{e} (give --critical)"),
        _ => e.to_string(),
    }
}

/// A property-table error with the option of `check` that fixes it.
pub fn table_error(e: &ebullio::table_io::ReadError) -> String {
    if e.kind == ebullio::table_io::ReadErrorKind::MissingColumn && e.message.contains("convention")
    {
        format!("{e} (--constants)")
    } else {
        e.to_string()
    }
}

/// A plan error with the options of `plan` that fix it.
pub fn plan_error(e: &PlanError) -> String {
    match e {
        PlanError::NoStructure { .. } => {
            format!("{e} (--smiles for the component, or --model ideal)")
        }
        _ => e.to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_command_line_names_the_option_the_library_does_not() {
        let e = ebullio::units::parse_pressure("300 mbarg").unwrap_err();
        assert!(!e.to_string().contains("--"), "{e}");
        assert!(UnitHint(e).to_string().contains("--barometric"));
        let e = PlanError::NoStructure { name: "x".into() };
        assert!(!e.to_string().contains("--"));
        assert!(plan_error(&e).contains("--smiles"));
        assert!(refit_error(&RefitError::NoRange).contains("--range"));
    }
}
