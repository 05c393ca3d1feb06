//! Fuzz the fitter on arbitrary point sets: an error, or a report with a termination reason
//! whose numbers are finite when it says it converged.
#![no_main]

use arbitrary::Arbitrary;
use ebullio::fit::{fit_points, FitOptions, ModelSelection, Point, RobustLoss};
use libfuzzer_sys::fuzz_target;

#[derive(Debug, Arbitrary)]
struct Input {
    model: u8,
    robust: u8,
    critical: Option<(f64, f64)>,
    points: Vec<(f64, f64, Option<f64>, Option<f64>)>,
}

fuzz_target!(|input: Input| {
    if input.points.len() > 64 {
        return;
    }
    let points: Vec<Point> = input
        .points
        .iter()
        .map(|&(t_k, p_pa, u_t_k, u_p_pa)| Point { t_k, p_pa, u_t_k, u_p_pa })
        .collect();
    let opts = FitOptions {
        model: match input.model % 5 {
            0 => ModelSelection::Antoine,
            1 => ModelSelection::Clapeyron,
            2 => ModelSelection::Riedel,
            3 => ModelSelection::Wagner,
            _ => ModelSelection::Auto,
        },
        robust: match input.robust % 3 {
            0 => None,
            1 => Some(RobustLoss::Huber),
            _ => Some(RobustLoss::Tukey),
        },
        critical: input.critical,
        ..FitOptions::default()
    };
    if let Ok(r) = fit_points(None, &points, &opts) {
        assert!(!r.termination.reason.to_string().is_empty(), "no termination reason");
        if r.termination.is_success() {
            assert!(
                r.si_parameters.iter().all(|v| v.is_finite()),
                "converged with non-finite parameters {:?}",
                r.si_parameters
            );
        }
    }
});
