//! The binary VLE fit as text: the table `ebullio fit` prints and the per-point CSV.

use crate::mixture::fit::{BinaryFitReport, DataKind};
use crate::units::{PressureUnit, TemperatureUnit};
use std::fmt::Write as _;

/// `x` to `d` significant digits as plain decimal text (`-` when missing).
fn sig(x: f64, d: i32) -> String {
    if !x.is_finite() {
        return "-".into();
    }
    if x == 0.0 {
        return "0".into();
    }
    let n = (d - 1 - x.abs().log10().floor() as i32).clamp(0, 12) as usize;
    format!("{x:.n$}")
}

fn osig(x: Option<f64>, d: i32) -> String {
    x.map_or("-".into(), |v| sig(v, d))
}

fn t_sym(u: TemperatureUnit) -> &'static str {
    match u {
        TemperatureUnit::Kelvin => "K",
        TemperatureUnit::Celsius => "°C",
        TemperatureUnit::Fahrenheit => "°F",
        TemperatureUnit::Rankine => "°R",
    }
}

/// The readable table, temperatures and pressures in the given units.
pub fn table(r: &BinaryFitReport, tu: TemperatureUnit, pu: PressureUnit) -> String {
    let ts = t_sym(tu);
    let ps = pu.symbol();
    let t = |k: f64| format!("{} {ts}", sig(tu.from_kelvin(k), 5));
    let p = |pa: f64| format!("{} {ps}", sig(pu.from_pa(pa), 5));
    let mut s = String::new();
    let names: Vec<&str> = r.components.iter().map(|c| c.name.as_str()).collect();
    let pair = if names.len() == 2 {
        format!("{} (1) / {} (2)", names[0], names[1])
    } else {
        "binary".into()
    };
    let cond = match (r.pressure_pa, r.temperature_k) {
        (Some(pa), _) => format!("T-x-y at {}", p(pa)),
        (_, Some(k)) => format!("p-x-y at {}", t(k)),
        _ => String::new(),
    };
    let st = &r.statistics;
    let _ = writeln!(
        s,
        "{pair}: {} fit to {} points ({} observations), {cond} ({})",
        r.model,
        st.n_points,
        st.n_observations,
        if st.termination.is_success() {
            "converged"
        } else {
            "NOT CONVERGED"
        }
    );
    for c in &r.components {
        let _ = writeln!(
            s,
            "  vapor pressure of {}: {}",
            c.name, c.vapor_pressure_source
        );
    }
    if let Some(mc) = &r.model_choice {
        let _ = writeln!(s, "  model choice: {}", mc.reason);
    }
    s += "  parameters (temperature-independent):\n";
    for q in &r.parameters {
        let _ = writeln!(
            s,
            "    {:<6} = {:>10}  ± {:<8}  95 % CI [{}, {}]",
            q.name,
            sig(q.value, 5),
            sig(q.std_error, 2),
            sig(q.ci95_low, 4),
            sig(q.ci95_high, 4)
        );
    }
    for f in &r.fixed_parameters {
        let _ = writeln!(s, "    {:<6} = {:>10}  (fixed)", f.name, f.value);
    }
    let _ = writeln!(
        s,
        "  fit: reduced chi-square {} with u(T) = {} K, u(y1) = {}, u(p) = {} %; RMS {}{}",
        osig(st.reduced_chi_square, 3),
        r.uncertainties.t_k,
        r.uncertainties.y1,
        100.0 * r.uncertainties.p_rel,
        match r.kind {
            DataKind::Isobaric => format!("{} K in T", osig(st.rms_t_k, 2)),
            DataKind::Isothermal => format!("{} % in p", osig(st.rms_p_pct, 2)),
        },
        st.rms_y1
            .map_or(String::new(), |v| format!(", {} in y1", sig(v, 2)))
    );
    for j in 0..2 {
        let ci = r.gamma_infinity_ci95[j].map_or(String::new(), |[a, b]| {
            format!(", 95 % CI [{}, {}]", sig(a, 3), sig(b, 3))
        });
        let _ = writeln!(
            s,
            "  gamma{}∞ = {} at {}{ci}",
            j + 1,
            sig(r.gamma_infinity[j], 4),
            t(r.gamma_infinity_t_k[j])
        );
    }
    if r.azeotropes.is_empty() {
        s += "  azeotrope: none predicted at the data's condition\n";
    }
    for a in &r.azeotropes {
        let at = match (a.t_k, a.p_pa) {
            (Some(k), _) => t(k),
            (_, Some(pa)) => p(pa),
            _ => String::new(),
        };
        let ci = a.x1_ci95.map_or(String::new(), |[l, h]| {
            format!(" (95 % CI {} to {})", sig(l, 3), sig(h, 3))
        });
        let _ = writeln!(
            s,
            "  azeotrope: {} at x1 = {}{ci}, {at}{}",
            a.kind.as_str(),
            sig(a.x1, 3),
            if a.inside_data {
                ""
            } else {
                ", outside the measured compositions"
            }
        );
    }
    if r.liquid_split.inside_data {
        s += "  liquid split: the fitted model predicts two liquids inside the data range (see flags)\n";
    }
    s += "  consistency:\n";
    for c in &r.consistency {
        let _ = writeln!(
            s,
            "    {:<20} {:<4}  statistic {:>8}  criterion {}",
            c.test,
            if c.passed { "pass" } else { "FAIL" },
            sig(c.statistic, 3),
            c.criterion
        );
        let _ = writeln!(s, "      {}", c.meaning);
    }
    for c in &r.consistency_not_run {
        let _ = writeln!(s, "    {:<20} not run: {}", c.test, c.reason);
    }
    let (calc_head, dev_head) = match r.kind {
        DataKind::Isobaric => (format!("t calc/{ts}"), format!("dT/{ts}")),
        DataKind::Isothermal => (format!("p calc/{ps}"), "dp/%".to_string()),
    };
    let _ = writeln!(
        s,
        "  points:  #      x1      y1  {:>10} {:>12} {:>8}  y1 calc      dy1  stud.T/p  stud.y1",
        match r.kind {
            DataKind::Isobaric => format!("t/{ts}"),
            DataKind::Isothermal => format!("p/{ps}"),
        },
        calc_head,
        dev_head
    );
    for q in &r.points {
        let (meas, calc, dev) = match r.kind {
            DataKind::Isobaric => (
                format!("{:.2}", tu.from_kelvin(q.t_k)),
                q.calc
                    .map_or("-".into(), |v| format!("{:.2}", tu.from_kelvin(v))),
                q.deviation
                    .map_or("-".into(), |v| format!("{:.2}", v / tu.kelvin_per_degree())),
            ),
            DataKind::Isothermal => (
                sig(pu.from_pa(q.p_pa), 5),
                q.calc.map_or("-".into(), |v| sig(pu.from_pa(v), 5)),
                q.deviation.map_or("-".into(), |v| format!("{v:.2}")),
            ),
        };
        let _ = writeln!(
            s,
            "    {:>5}  {:>6.4}  {:>6}  {:>10} {:>12} {:>8}  {:>7}  {:>7}  {:>8}  {:>7}{}",
            q.number,
            q.x1,
            q.y1.map_or("-".into(), |v| format!("{v:.4}")),
            meas,
            calc,
            dev,
            q.y1_calc.map_or("-".into(), |v| format!("{v:.4}")),
            q.y1_deviation.map_or("-".into(), |v| format!("{v:+.4}")),
            q.studentized.map_or("-".into(), |v| format!("{v:.2}")),
            q.y1_studentized.map_or("-".into(), |v| format!("{v:.2}")),
            if q.outlier { "  OUTLIER (kept)" } else { "" }
        );
    }
    for f in &r.flags {
        let _ = writeln!(s, "  [{}] {}: {}", f.severity, f.code, f.message);
    }
    for c in &r.cautions {
        let _ = writeln!(s, "  Caution: {c}");
    }
    s
}

/// One CSV row per point: measured, model, deviations, studentized residuals, outlier.
pub fn points_csv(r: &BinaryFitReport) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
    let calc = match r.kind {
        DataKind::Isobaric => ["T_calc/K", "dT/K"],
        DataKind::Isothermal => ["p_calc/kPa", "dp/%"],
    };
    w.write_record([
        "point",
        "line",
        "x1",
        "y1",
        "T/K",
        "p/kPa",
        calc[0],
        calc[1],
        "y1_calc",
        "dy1",
        "stud_T_or_p",
        "stud_y1",
        "outlier",
        "model",
    ])?;
    let f = |v: Option<f64>| {
        v.filter(|v| v.is_finite())
            .map(|v| crate::units::tidy(v).to_string())
            .unwrap_or_default()
    };
    for q in &r.points {
        let c = match r.kind {
            DataKind::Isobaric => q.calc,
            DataKind::Isothermal => q.calc.map(|v| v / 1000.0),
        };
        w.write_record([
            q.number.to_string(),
            q.line.map_or(String::new(), |l| l.to_string()),
            f(Some(q.x1)),
            f(q.y1),
            f(Some(q.t_k)),
            f(Some(q.p_pa / 1000.0)),
            f(c),
            f(q.deviation),
            f(q.y1_calc),
            f(q.y1_deviation),
            f(q.studentized),
            f(q.y1_studentized),
            q.outlier.to_string(),
            r.model.clone(),
        ])?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
