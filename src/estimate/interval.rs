//! The committed calibration of the boiling-point estimate: which variant
//! ships, its cross-validated figures, and the 90 % interval per class (the
//! structural family, halides split by fluorine).
//!
//! The figures are read from `reference-data/tb-model-cv.csv` and
//! `reference-data/tb-intervals.csv`, written by `cargo run --example fit_tb_model`
//! (see [`super::tb_fit`] for the procedure; `tests/estimate_tb_model.rs`
//! recomputes them). The half-width of the interval is `q · f`, where `q`
//! is the class's conformal 90 % quantile of out-of-fold and held-out absolute errors (K) and
//! `f` is 1, or [`OUTSIDE_FACTOR`] for a molecule outside the calibration (a
//! term with fewer than three calibration compounds, or more than two strongly
//! polar groups).
//!
//! Reference: the rule is this program's own (split conformal prediction,
//! V. Vovk, A. Gammerman, G. Shafer, Algorithmic Learning in a Random World, 2005).

use super::tb_features::IntervalClass;
pub use super::tb_fit::OUTSIDE_FACTOR;
pub use super::tb_model::TbVariant;
use std::collections::BTreeMap;
use std::sync::OnceLock;

const CV_CSV: &str = include_str!("../../reference-data/tb-model-cv.csv");
const INTERVALS_CSV: &str = include_str!("../../reference-data/tb-intervals.csv");

/// Comfort factor of a structure and the reasons for widening.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Comfort {
    /// Multiplier of the interval half-width (1 = inside the calibration).
    pub factor: f64,
    /// Why the interval was widened (stable kebab-case codes).
    pub reasons: Vec<&'static str>,
    /// One sentence per reason.
    pub details: Vec<String>,
}

/// The comfort rule: terms without a fitted value, or more than two strongly polar groups,
/// put a molecule outside the calibration.
pub fn comfort(outside_terms: &[String], strongly_polar: u32) -> Comfort {
    let mut c = Comfort {
        factor: 1.0,
        reasons: Vec::new(),
        details: Vec::new(),
    };
    if !outside_terms.is_empty() {
        c.reasons.push("outside-calibration");
        c.details.push(format!(
            "outside-calibration: {} had fewer than three calibration compounds, so its value is a prior, not a fit",
            outside_terms.join(", ")
        ));
    }
    if strongly_polar > 2 {
        if c.reasons.is_empty() {
            c.reasons.push("outside-calibration");
        }
        c.details.push(format!(
            "outside-calibration: {strongly_polar} strongly polar groups (more than two are not covered by the calibration)"
        ));
    }
    c.factor = comfort_factor(!outside_terms.is_empty(), strongly_polar);
    c
}

/// The factor of [`comfort`] alone (`outside`: some term has no fitted value).
pub fn comfort_factor(outside: bool, strongly_polar: u32) -> f64 {
    if outside || strongly_polar > 2 {
        OUTSIDE_FACTOR
    } else {
        1.0
    }
}

/// One committed figure.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Figure {
    /// Variant.
    pub variant: TbVariant,
    /// `cv-common`, `cv-all`, `heldout-common` or `heldout-all`.
    pub subset: String,
    /// Compounds.
    pub n: usize,
    /// Mean absolute error, K.
    pub mae_k: f64,
    /// RMS error, K.
    pub rms_k: f64,
}

/// One class's committed interval.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct ClassQ {
    /// Out-of-fold residuals it rests on.
    pub n_cv: usize,
    /// Held-out compounds (their residuals also calibrate it).
    pub n_heldout: usize,
    /// Half-width, K.
    pub q90_k: f64,
    /// Held-out compounds inside the interval calibrated without their own residual.
    pub inside_heldout: usize,
    /// Every residual of the class (out-of-fold and held-out) inside the interval
    /// calibrated without it.
    pub inside_all: usize,
}

/// The measured calibration of the boiling-point estimate.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Calibration {
    /// The shipped variant.
    pub variant: TbVariant,
    /// Every committed figure.
    pub figures: Vec<Figure>,
    /// Interval per class.
    pub classes: BTreeMap<IntervalClass, ClassQ>,
}

impl Calibration {
    /// A committed figure.
    pub fn figure(&self, v: TbVariant, subset: &str) -> Option<&Figure> {
        self.figures
            .iter()
            .find(|f| f.variant == v && f.subset == subset)
    }

    /// 90 % half-width of a class, K (the largest class's value if none is committed).
    pub fn q90_k(&self, c: IntervalClass) -> f64 {
        self.classes
            .get(&c)
            .map(|q| q.q90_k)
            .unwrap_or_else(|| self.classes.values().map(|q| q.q90_k).fold(40.0, f64::max))
    }

    /// One sentence on the measured calibration, for reports and the terminal.
    pub fn summary(&self) -> String {
        let (Some(s), Some(j), Some(h)) = (
            self.figure(self.variant, "cv-common"),
            self.figure(TbVariant::Joback, "cv-common"),
            self.figure(self.variant, "heldout-all"),
        ) else {
            return "The boiling-point calibration files hold no figures; tb_k is the published Joback value.".into();
        };
        let (n, inside) = self
            .classes
            .values()
            .fold((0, 0), |a, q| (a.0 + q.n_heldout, a.1 + q.inside_heldout));
        format!(
            "Calibration: 10-fold cross-validated mean absolute error {:.1} K ({}) against {:.1} K for published Joback on the same {} compounds; {:.1} K on {} held-out compounds, {:.0} % of which lie inside their 90 % interval.",
            s.mae_k,
            self.variant.name(),
            j.mae_k,
            j.n,
            h.mae_k,
            h.n,
            100.0 * inside as f64 / n.max(1) as f64
        )
    }
}

fn data_lines(text: &str) -> impl Iterator<Item = Vec<&str>> {
    text.lines()
        .filter(|l| !l.starts_with('#') && !l.trim().is_empty())
        .skip(1)
        .map(|l| l.split(',').collect())
}

fn parse() -> Calibration {
    let mut variant = TbVariant::Joback;
    let mut figures = Vec::new();
    for f in data_lines(CV_CSV) {
        let (Some(v), Some(n), Some(mae), Some(rms)) = (
            f.first().and_then(|s| TbVariant::from_name(s)),
            f.get(2).and_then(|s| s.parse().ok()),
            f.get(3).and_then(|s| s.parse().ok()),
            f.get(4).and_then(|s| s.parse().ok()),
        ) else {
            continue;
        };
        if f.get(5) == Some(&"true") {
            variant = v;
        }
        figures.push(Figure {
            variant: v,
            subset: f.get(1).unwrap_or(&"").to_string(),
            n,
            mae_k: mae,
            rms_k: rms,
        });
    }
    let mut classes = BTreeMap::new();
    for f in data_lines(INTERVALS_CSV) {
        let (Some(class), Some(n_cv), Some(nh), Some(q), Some(ins), Some(ia)) = (
            f.first().and_then(|s| IntervalClass::from_name(s)),
            f.get(2).and_then(|s| s.parse().ok()),
            f.get(3).and_then(|s| s.parse().ok()),
            f.get(4).and_then(|s| s.parse().ok()),
            f.get(5).and_then(|s| s.parse().ok()),
            f.get(6).and_then(|s| s.parse().ok()),
        ) else {
            continue;
        };
        classes.insert(
            class,
            ClassQ {
                n_cv,
                n_heldout: nh,
                q90_k: q,
                inside_heldout: ins,
                inside_all: ia,
            },
        );
    }
    Calibration {
        variant,
        figures,
        classes,
    }
}

/// The committed calibration, parsed once.
pub fn calibration() -> &'static Calibration {
    static C: OnceLock<Calibration> = OnceLock::new();
    C.get_or_init(parse)
}
