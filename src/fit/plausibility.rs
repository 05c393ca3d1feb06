//! Plausibility of the data as labelled: swapped columns, pressure falling
//! with temperature, a pressure column in another unit than its heading says.
//!
//! Every check works on the Clausius–Clapeyron line ln p = a − b/T through
//! the points (ΔHvap = R·b, the line's boiling point Tb = b/(a − ln p°) and the
//! Trouton entropy ΔHvap/Tb), which needs no equation fit and is robust to a
//! few bad points. The data are re-read the other way round (T and p
//! exchanged) or in another pressure unit only to produce evidence for the
//! message; the fit itself always uses the data as labelled.
//!
//! Reference: Clausius–Clapeyron with an ideal vapor and negligible liquid
//! volume; Trouton's rule (ΔSvap at Tb about 85–88 J/(mol·K) for normal
//! liquids, higher for hydrogen-bonded ones) with the band
//! [`TROUTON_BAND_J_MOL_K`] (common practice).

use super::equation_fit::Point;
use super::findings::{Finding, FitCode};
use crate::units::{PressureUnit, TemperatureUnit, ATM_PA};
use crate::vapor::slope::{trouton_plausible, R_J_MOL_K, TROUTON_BAND_J_MOL_K};

/// ΔHvap range of the liquids met in distillation, kJ/mol (common practice:
/// light gases such as nitrogen sit near 6, heavy esters and glycols near 100).
pub const HVAP_BAND_KJ_MOL: (f64, f64) = (15.0, 120.0);

/// Pressure units tried when the data are compared with a known boiling point.
const OTHER_UNITS: [PressureUnit; 8] = [
    PressureUnit::Pa,
    PressureUnit::KPa,
    PressureUnit::MBar,
    PressureUnit::Bar,
    PressureUnit::Atm,
    PressureUnit::MmHg,
    PressureUnit::Psi,
    PressureUnit::MPa,
];

/// The Clausius–Clapeyron line through some points.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ClapeyronLine {
    /// ΔHvap from the slope, kJ/mol (negative when p falls with T).
    pub hvap_kj_mol: f64,
    /// Where the line reaches 101.325 kPa, K (None when it never does).
    pub tb_k: Option<f64>,
    /// Entropy of vaporization at that Tb, J/(mol·K).
    pub svap_j_mol_k: Option<f64>,
}

impl ClapeyronLine {
    /// Least-squares line of ln p on 1/T; None for fewer than two distinct T.
    pub fn through(points: &[(f64, f64)]) -> Option<Self> {
        let pts: Vec<(f64, f64)> = points
            .iter()
            .filter(|(t, p)| *t > 0.0 && *p > 0.0 && t.is_finite() && p.is_finite())
            .map(|&(t, p)| (1.0 / t, p.ln()))
            .collect();
        let n = pts.len() as f64;
        if pts.len() < 2 {
            return None;
        }
        let mx = pts.iter().map(|p| p.0).sum::<f64>() / n;
        let my = pts.iter().map(|p| p.1).sum::<f64>() / n;
        let sxx: f64 = pts.iter().map(|p| (p.0 - mx).powi(2)).sum();
        if sxx <= 0.0 {
            return None;
        }
        let sxy: f64 = pts.iter().map(|p| (p.0 - mx) * (p.1 - my)).sum();
        let slope = sxy / sxx; // = −b
        let a = my - slope * mx;
        let b = -slope;
        let tb = (b > 0.0 && a > ATM_PA.ln()).then(|| b / (a - ATM_PA.ln()));
        let hvap = R_J_MOL_K * b / 1000.0;
        Some(ClapeyronLine {
            hvap_kj_mol: hvap,
            tb_k: tb,
            svap_j_mol_k: tb.map(|t| hvap * 1000.0 / t),
        })
    }

    /// Rises with T, ΔHvap inside [`HVAP_BAND_KJ_MOL`], Trouton entropy inside its band.
    pub fn plausible(&self) -> bool {
        let (lo, hi) = HVAP_BAND_KJ_MOL;
        self.hvap_kj_mol >= lo
            && self.hvap_kj_mol <= hi
            && self.svap_j_mol_k.is_none_or(trouton_plausible)
    }

    fn evidence(&self) -> String {
        match self.svap_j_mol_k {
            Some(s) => format!(
                "ΔHvap {:.1} kJ/mol and a Trouton entropy of {s:.0} J/(mol·K) at Tb {:.1} K",
                self.hvap_kj_mol,
                self.tb_k.unwrap_or(f64::NAN)
            ),
            None => format!("ΔHvap {:.1} kJ/mol", self.hvap_kj_mol),
        }
    }
}

fn si_pairs(points: &[Point]) -> Vec<(f64, f64)> {
    points.iter().map(|p| (p.t_k, p.p_pa)).collect()
}

/// Findings about the data as labelled: `pressure-falls-with-temperature`,
/// `columns-swapped`, `hvap-implausible`. `t_unit` and `p_unit` are the units
/// the file's columns were read in (to re-read the numbers as written).
///
/// ```
/// use ebullio::fit::plausibility::check_columns;
/// use ebullio::fit::Point;
/// use ebullio::units::{PressureUnit, TemperatureUnit};
/// // Water near 100 °C (IAPWS-IF97 saturation pressures, rounded) with the
/// // columns exchanged: t/°C holds kPa values and p/kPa holds °C values.
/// let rows = [(47.4, 80.0), (70.2, 90.0), (101.4, 100.0), (143.4, 110.0), (198.7, 120.0)];
/// let pts: Vec<Point> = rows.iter().map(|&(t, p)| Point {
///     t_k: t + 273.15, p_pa: p * 1000.0, u_t_k: None, u_p_pa: None }).collect();
/// let f = check_columns(&pts, TemperatureUnit::Celsius, PressureUnit::KPa);
/// assert!(f.iter().any(|f| f.code == "columns-swapped"));
/// ```
pub fn check_columns(
    points: &[Point],
    t_unit: TemperatureUnit,
    p_unit: PressureUnit,
) -> Vec<Finding> {
    let mut out = Vec::new();
    let Some(given) = ClapeyronLine::through(&si_pairs(points)) else {
        return out;
    };
    if given.plausible() {
        return out;
    }
    // The numbers as written, read the other way round.
    let swapped: Vec<(f64, f64)> = points
        .iter()
        .map(|p| {
            let t_num = t_unit.from_kelvin(p.t_k);
            let p_num = p_unit.from_pa(p.p_pa);
            (t_unit.to_kelvin(p_num), p_unit.to_pa(t_num))
        })
        .collect();
    let other = ClapeyronLine::through(&swapped).filter(ClapeyronLine::plausible);
    let falls = given.hvap_kj_mol <= 0.0;
    if falls {
        out.push(Finding::new(
            FitCode::PressureFallsWithTemperature,
            "Pressure falls as temperature rises across the data; a vapor pressure always rises with temperature, so the columns are swapped or mislabelled.",
        ));
    }
    if let Some(o) = other {
        out.push(Finding::new(
            FitCode::ColumnsSwapped,
            format!(
                "Columns swapped? As labelled the data give {}; read with temperature and pressure exchanged they give {}, as liquids do.",
                given.evidence(),
                o.evidence()
            ),
        ));
    } else if !falls {
        let (lo, hi) = HVAP_BAND_KJ_MOL;
        let (slo, shi) = TROUTON_BAND_J_MOL_K;
        out.push(Finding::new(
            FitCode::HvapImplausible,
            format!(
                "The data give {}, outside what liquids show ({lo:.0}–{hi:.0} kJ/mol, Trouton {slo:.0}–{shi:.0} J/(mol·K), common practice); check the units of both columns.",
                given.evidence()
            ),
        ));
    }
    out
}

/// A pressure column whose values match a known boiling point much better in
/// another unit: `pressure-unit-mislabelled`, naming the unit(s) and the
/// evidence. `known_tb_k` is a boiling point from elsewhere (reference data
/// or a structure estimate), `tol_k` how closely the Clausius–Clapeyron
/// extrapolation must meet it, `what` names its source.
///
/// A unit is named only when, read in it, the data meet the known Tb within
/// `tol_k`, as labelled they miss it by more than five times as much, and no
/// unit more than 2 % apart also fits (bar and atm are named together).
pub fn check_pressure_unit(
    points: &[Point],
    p_unit: PressureUnit,
    known_tb_k: f64,
    tol_k: f64,
    what: &str,
) -> Option<Finding> {
    let given = ClapeyronLine::through(&si_pairs(points))?;
    let d_given = given.tb_k.map_or(f64::INFINITY, |t| (t - known_tb_k).abs());
    if d_given <= 5.0 * tol_k {
        return None;
    }
    let mut fits: Vec<(PressureUnit, f64)> = Vec::new();
    for u in OTHER_UNITS {
        if u == p_unit {
            continue;
        }
        let pts: Vec<(f64, f64)> = points
            .iter()
            .map(|p| (p.t_k, u.to_pa(p_unit.from_pa(p.p_pa))))
            .collect();
        let Some(tb) = ClapeyronLine::through(&pts).and_then(|l| l.tb_k) else {
            continue;
        };
        if (tb - known_tb_k).abs() <= tol_k {
            fits.push((u, tb));
        }
    }
    if fits.is_empty() {
        return None;
    }
    let f0 = fits[0].0.pa_per_unit();
    if fits
        .iter()
        .any(|(u, _)| (u.pa_per_unit() / f0).ln().abs() > 0.02)
    {
        return None; // units far apart both fit: the evidence does not single one out
    }
    let names: Vec<&str> = fits.iter().map(|(u, _)| u.symbol()).collect();
    let given_tb = given.tb_k.map_or("never reach 1 atm".to_string(), |t| {
        format!("give {t:.1} K")
    });
    Some(Finding::new(
            FitCode::PressureUnitMislabelled,
        format!(
            "The values look like {} under a {} heading: read as {} the data give a boiling point of {:.1} K, matching {what} {known_tb_k:.1} K; as {} they {given_tb}.",
            names.join(" or "),
            p_unit.symbol(),
            names[0],
            fits[0].1,
            p_unit.symbol()
        ),
    ))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::vapor::{AntoineConstants, Curve};

    // Toluene, Smith, Van Ness & Abbott App. B Table B.2, ln(p/kPa), t in °C,
    // 35–111 °C; tn 110.6 °C.
    fn toluene_points(scale: f64) -> Vec<Point> {
        let k = AntoineConstants::new(13.9320, 3056.96, 217.625, "ln,kPa,degC".parse().unwrap());
        (0..8)
            .map(|i| {
                let t = 310.0 + 10.0 * i as f64;
                Point {
                    t_k: t,
                    p_pa: k.p_pa(t) * scale,
                    u_t_k: None,
                    u_p_pa: None,
                }
            })
            .collect()
    }

    #[test]
    fn svna_toluene_as_labelled_is_plausible() {
        let pts = toluene_points(1.0);
        let l = ClapeyronLine::through(&si_pairs(&pts)).unwrap();
        assert!(l.plausible(), "{l:?}");
        assert!((l.tb_k.unwrap() - 383.75).abs() < 3.0, "{l:?}");
        assert!(check_columns(&pts, TemperatureUnit::Kelvin, PressureUnit::KPa).is_empty());
    }

    #[test]
    fn svna_toluene_swapped_columns_are_named() {
        // The kPa numbers in the K column and the K numbers in the kPa column.
        let pts: Vec<Point> = toluene_points(1.0)
            .iter()
            .map(|p| Point {
                t_k: p.p_pa / 1000.0 + crate::units::CELSIUS_OFFSET,
                p_pa: (p.t_k - crate::units::CELSIUS_OFFSET) * 1000.0,
                u_t_k: None,
                u_p_pa: None,
            })
            .collect();
        let f = check_columns(&pts, TemperatureUnit::Celsius, PressureUnit::KPa);
        let codes: Vec<&str> = f.iter().map(|f| f.code.as_str()).collect();
        assert!(codes.contains(&"columns-swapped"), "{f:?}");
        let msg = &f
            .iter()
            .find(|f| f.code == "columns-swapped")
            .unwrap()
            .message;
        assert!(
            msg.contains("Columns swapped?") && msg.contains("ΔHvap"),
            "{msg}"
        );
    }

    #[test]
    fn pressure_falling_with_temperature_is_named() {
        let mut pts = toluene_points(1.0);
        let ps: Vec<f64> = pts.iter().rev().map(|p| p.p_pa).collect();
        for (p, v) in pts.iter_mut().zip(ps) {
            p.p_pa = v;
        }
        let f = check_columns(&pts, TemperatureUnit::Kelvin, PressureUnit::KPa);
        assert!(
            f.iter()
                .any(|f| f.code == "pressure-falls-with-temperature"),
            "{f:?}"
        );
    }

    #[test]
    fn svna_toluene_mmhg_values_under_a_kpa_heading() {
        // mmHg numbers read as kPa: every pressure 7.5 times too high.
        let mmhg_numbers: Vec<Point> = toluene_points(1.0)
            .iter()
            .map(|p| Point {
                p_pa: p.p_pa / 133.322_387_415 * 1000.0,
                ..*p
            })
            .collect();
        let f = check_pressure_unit(
            &mmhg_numbers,
            PressureUnit::KPa,
            383.75,
            3.0,
            "the reference",
        )
        .expect("named");
        assert!(
            f.message.contains("look like mmHg under a kPa heading"),
            "{}",
            f.message
        );
        // As labelled there is nothing to say.
        assert!(check_pressure_unit(
            &toluene_points(1.0),
            PressureUnit::KPa,
            383.75,
            3.0,
            "the reference"
        )
        .is_none());
    }
}
