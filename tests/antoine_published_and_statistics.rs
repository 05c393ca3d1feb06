//! Published Antoine rows (reference-data/antoine-published.csv, Smith, Van Ness &
//! Abbott App. B Table B.2) refitted, and seeded statistical checks of the fit's
//! intervals and outlier rule.

use ebullio::fit::{fit_points, FitOptions, Point};
use ebullio::vapor::{AntoineConstants, AntoineConvention, Curve};

/// Rows with a stated range (nothing to generate points over otherwise), by name,
/// with their source.
fn published() -> Vec<(String, AntoineConstants, String)> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/reference-data/antoine-published.csv"
    );
    let mut rd = csv::Reader::from_path(path).unwrap();
    let source_col = rd
        .headers()
        .unwrap()
        .iter()
        .position(|h| h == "source")
        .unwrap();
    let mut out = vec![];
    for rec in rd.records() {
        let r = rec.unwrap();
        let f = |i: usize| r[i].parse::<f64>().unwrap();
        let conv: AntoineConvention = format!("{},{},{}", &r[6], &r[7], &r[8]).parse().unwrap();
        let k = AntoineConstants::new(f(3), f(4), f(5), conv);
        let (Ok(lo), Ok(hi)) = (r[9].parse::<f64>(), r[10].parse::<f64>()) else {
            continue;
        };
        let k = k.with_range_k(conv.t_unit.to_kelvin(lo), conv.t_unit.to_kelvin(hi));
        out.push((r[0].to_string(), k, r[source_col].to_string()));
    }
    out
}

/// The normal boiling points printed beside the constants in Smith, Van Ness &
/// Abbott App. B Table B.2 (column tn), as carried in
/// reference-data/normal-boiling-points-dev.csv with that source named: name → K.
fn table_b2_tn() -> Vec<(String, f64)> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/reference-data/normal-boiling-points-dev.csv"
    );
    let mut rd = csv::Reader::from_path(path).unwrap();
    let head = rd.headers().unwrap().clone();
    let col = |n: &str| head.iter().position(|h| h == n).unwrap();
    let (name, tb, src) = (col("compound"), col("tb_k"), col("source"));
    rd.records()
        .map(|r| r.unwrap())
        .filter(|r| r[src].contains("Table B.2") && r[src].contains("column tn"))
        .map(|r| (r[name].to_string(), r[tb].parse().unwrap()))
        .collect()
}

fn refit(k: &AntoineConstants) -> ebullio::fit::FitReport {
    let (lo, hi) = k.range_k.unwrap();
    let pts: Vec<Point> = (0..10)
        .map(|i| {
            let t = lo + (hi - lo) * i as f64 / 9.0;
            Point {
                t_k: t,
                p_pa: k.p_pa(t),
                u_t_k: None,
                u_p_pa: None,
            }
        })
        .collect();
    let r = fit_points(None, &pts, &FitOptions::default()).unwrap();
    assert!(r.termination.is_success());
    r
}

// Smith, Van Ness & Abbott App. B Table B.2, acetone: ln(P/kPa) = 14.3145 −
// 2756.22/(t/°C + 228.060). Pressures worked by hand here (plain arithmetic, no
// library code), so a wrong log base, pressure unit or °C offset in `p_pa`, or in
// the fit that refits it, cannot pass.
#[test]
fn svna_acetone_pressures_match_a_hand_calculation_and_its_refit() {
    let k = AntoineConstants::new(14.3145, 2756.22, 228.060, "ln,kPa,degC".parse().unwrap())
        .with_range_k(247.15, 350.15);
    let r = refit(&k);
    let fitted = ebullio::fit::FittedCurve::from_report(&r);
    for t_c in [-20.0f64, 0.0, 25.0, 56.0, 75.0] {
        let by_hand_pa = 1000.0 * (14.3145 - 2756.22 / (t_c + 228.060)).exp();
        let t_k = t_c + 273.15;
        let rel = |p: f64| (p - by_hand_pa).abs() / by_hand_pa;
        assert!(
            rel(k.p_pa(t_k)) < 1e-12,
            "{t_c} °C: {} vs {by_hand_pa}",
            k.p_pa(t_k)
        );
        assert!(rel(fitted.p_pa(t_k)) < 1e-6, "refit at {t_c} °C");
    }
    // One value written out: at 56.0 °C, 2756.22/284.06 = 9.702950, so
    // ln(P/kPa) = 4.611550 and P = 100.64 kPa, just under 1 atm as Tn = 56.2 °C says.
    assert!(
        (k.p_pa(329.15) - 100_640.0).abs() < 10.0,
        "{}",
        k.p_pa(329.15)
    );
    // The same row rewritten by hand as log10/mmHg/°C: divide A and B by ln 10 and
    // add log10(7.500617) to A (1 kPa = 1000/133.322387 mmHg, NIST SP 811 App. B).
    let a10 = 14.3145 / std::f64::consts::LN_10 + (1000.0f64 / 133.322_387_415).log10();
    let b10 = 2756.22 / std::f64::consts::LN_10;
    let mm = AntoineConstants::new(a10, b10, 228.060, "log10,mmHg,degC".parse().unwrap());
    for t_k in [250.0, 300.0, 345.0] {
        let rel = (mm.p_pa(t_k) - k.p_pa(t_k)).abs() / k.p_pa(t_k);
        assert!(rel < 1e-9, "{t_k} K: {rel}");
    }
}

// Smith, Van Ness & Abbott App. B Table B.2 prints each compound's normal boiling
// point (column tn, 0.1 °C) beside its constants: the refit of points generated
// from every row with a stated range must boil at 1 atm within 0.5 K of it.
#[test]
fn svna_published_antoine_rows_refit_boils_at_the_tables_printed_tn() {
    let tn = table_b2_tn();
    assert!(tn.len() >= 3, "Table B.2 tn values found: {}", tn.len());
    let mut checked = 0;
    let mut worst: f64 = 0.0;
    for (name, k, source) in published() {
        let svna = source.contains("Smith, Van Ness & Abbott") && source.contains("Table B.2");
        let Some(&(_, tn_k)) = tn.iter().find(|(n, _)| *n == name).filter(|_| svna) else {
            continue;
        };
        let r = refit(&k);
        let tb = r.normal_boiling_point_k.unwrap().value;
        eprintln!("{name}: refit Tb {tb:.2} K, Table B.2 tn {tn_k:.2} K");
        // tn is printed to 0.1 °C: half a unit of rounding plus 0.05 K.
        assert!(
            (tb - tn_k).abs() < 0.1,
            "{name}: refit Tb {tb} K vs printed {tn_k} K"
        );
        worst = worst.max((tb - tn_k).abs());
        checked += 1;
    }
    eprintln!("{checked} Table B.2 rows: refit Tb within {worst:.3} K of the printed tn");
    assert!(checked >= 10, "only {checked} rows had a printed tn");
}

/// SplitMix64 (seeded, deterministic) with Box–Muller normals.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> f64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64
    }
    fn normal(&mut self) -> f64 {
        let u = self.next().max(1e-300);
        (-2.0 * u.ln()).sqrt() * (2.0 * std::f64::consts::PI * self.next()).cos()
    }
}

// Invented Harrow Vale intermediate: ln(p/Pa) = 22.0 − 3500/(T − 45).
fn truth(t: f64) -> f64 {
    22.0 - 3500.0 / (t - 45.0)
}

fn noisy(rng: &mut Rng, n: usize, sd: f64) -> Vec<Point> {
    (0..n)
        .map(|i| {
            let t = 330.0 + 50.0 * i as f64 / (n - 1) as f64;
            Point {
                t_k: t,
                p_pa: (truth(t) + sd * rng.normal()).exp(),
                u_t_k: None,
                u_p_pa: None,
            }
        })
        .collect()
}

// Seeded simulation: the 95 % interval of Tb covers the true value in 93–97 % of sets.
#[test]
fn seeded_coverage_of_tb_interval_is_near_95_percent() {
    let tb_true = 3500.0 / (22.0 - 101_325f64.ln()) + 45.0;
    let mut rng = Rng(20261202);
    let sets = 1000;
    let mut covered = 0;
    for _ in 0..sets {
        let r = fit_points(None, &noisy(&mut rng, 10, 0.005), &FitOptions::default()).unwrap();
        let tb = r.normal_boiling_point_k.unwrap();
        if tb.ci95_low <= tb_true && tb_true <= tb.ci95_high {
            covered += 1;
        }
    }
    let rate = covered as f64 / sets as f64;
    eprintln!("coverage of the 95 % Tb interval: {rate:.3} over {sets} sets");
    assert!((0.93..=0.97).contains(&rate), "{rate}");
}

// Seeded simulation: one gross outlier (+6 % in p) among 12 good points (0.3 % noise).
#[test]
fn seeded_outlier_rule_finds_planted_point_and_spares_good_ones() {
    let mut rng = Rng(7);
    let trials = 300;
    let (mut found, mut false_marks) = (0, 0);
    for _ in 0..trials {
        let mut pts = noisy(&mut rng, 13, 0.003);
        let k = (rng.next() * 13.0) as usize % 13;
        pts[k].p_pa *= 1.06;
        let r = fit_points(None, &pts, &FitOptions::default()).unwrap();
        if r.points[k].outlier {
            found += 1;
        }
        false_marks += (0..13).filter(|&i| i != k && r.points[i].outlier).count();
    }
    eprintln!(
        "planted outlier found in {found}/{trials} trials; good points marked: {false_marks} of {}",
        trials * 12
    );
    assert!(found as f64 >= 0.95 * trials as f64);
    assert!(false_marks as f64 <= 0.01 * (trials * 12) as f64);
}

// Seeded simulation, the hard case: one outlier of 4.5σ (+1.36 % in p against 0.3 %
// noise) among 12 good points. Detection and false-flag rates are measured here and
// printed; the bars are what the rule achieved on this seed less a margin.
#[test]
fn seeded_outlier_rule_at_four_and_a_half_sigma_detection_and_false_flag_rates() {
    let mut rng = Rng(45);
    let (trials, sd) = (400, 0.003f64);
    let (mut found, mut false_marks) = (0, 0);
    for _ in 0..trials {
        let mut pts = noisy(&mut rng, 13, sd);
        let k = (rng.next() * 13.0) as usize % 13;
        pts[k].p_pa *= (4.5 * sd).exp();
        let r = fit_points(None, &pts, &FitOptions::default()).unwrap();
        if r.points[k].outlier {
            found += 1;
        }
        false_marks += (0..13).filter(|&i| i != k && r.points[i].outlier).count();
    }
    let detection = found as f64 / trials as f64;
    let false_rate = false_marks as f64 / (trials * 12) as f64;
    eprintln!(
        "4.5σ outlier: detected in {found}/{trials} ({:.1} %); good points flagged {false_marks}/{} ({:.2} %)",
        100.0 * detection,
        trials * 12,
        100.0 * false_rate
    );
    assert!(detection >= DETECTION_BAR, "{detection}");
    assert!(false_rate <= FALSE_FLAG_BAR, "{false_rate}");
}
/// Measured on seed 45: 239/400 detected (59.8 %), 6/4800 good points flagged
/// (0.12 %). Bars: 4 binomial standard errors (2.4 % each) below the detection rate;
/// the false-flag bar about four times what was measured.
const DETECTION_BAR: f64 = 0.50;
const FALSE_FLAG_BAR: f64 = 0.005;
