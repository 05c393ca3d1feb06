//! Published Antoine rows (reference-data/antoine-published.csv, Smith, Van Ness &
//! Abbott App. B Table B.2) refitted, and seeded statistical checks of the fit's
//! intervals and outlier rule.

use ebullio::fit::{fit_points, FitOptions, Point};
use ebullio::vapor::{AntoineConstants, AntoineConvention, Curve};

fn published() -> Vec<AntoineConstants> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/reference-data/antoine-published.csv"
    );
    let mut rd = csv::Reader::from_path(path).unwrap();
    let mut out = vec![];
    for rec in rd.records() {
        let r = rec.unwrap();
        let f = |i: usize| r[i].parse::<f64>().unwrap();
        let conv: AntoineConvention = format!("{},{},{}", &r[6], &r[7], &r[8]).parse().unwrap();
        let k = AntoineConstants::new(f(3), f(4), f(5), conv);
        // rows without a stated range are skipped (nothing to generate points over)
        let (Ok(lo), Ok(hi)) = (r[9].parse::<f64>(), r[10].parse::<f64>()) else {
            continue;
        };
        out.push(k.with_range_k(conv.t_unit.to_kelvin(lo), conv.t_unit.to_kelvin(hi)));
    }
    out
}

// Smith, Van Ness & Abbott App. B Table B.2 rows: points generated from each row and
// refitted recover the row's predictions to 1e-6 relative.
#[test]
fn svna_published_antoine_rows_refit_recovers_predictions() {
    let rows = published();
    assert!(rows.len() >= 5);
    for k in rows {
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
        assert!(r.termination.converged);
        let c = ebullio::fit::FittedCurve::from_report(&r);
        for i in 0..20 {
            let t = lo + (hi - lo) * i as f64 / 19.0;
            let rel = (c.p_pa(t) - k.p_pa(t)).abs() / k.p_pa(t);
            assert!(rel < 1e-6, "{t} K: {rel}");
        }
        // the same data written in mmHg/degC and in kPa/K give the same Tb
        let mm = AntoineConvention {
            ..AntoineConvention::DISPLAY
        };
        let as_mmhg: Vec<Point> = pts
            .iter()
            .map(|p| {
                let t_c = mm.t_unit.from_kelvin(p.t_k);
                let p_mm = mm.p_unit.from_pa(p.p_pa);
                Point {
                    t_k: mm.t_unit.to_kelvin(t_c),
                    p_pa: mm.p_unit.to_pa(p_mm),
                    ..*p
                }
            })
            .collect();
        let r2 = fit_points(None, &as_mmhg, &FitOptions::default()).unwrap();
        let (a, b) = (
            r.normal_boiling_point_k.unwrap(),
            r2.normal_boiling_point_k.unwrap(),
        );
        assert!(
            (a.value - b.value).abs() < 1e-6,
            "{} vs {}",
            a.value,
            b.value
        );
    }
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
