//! The liquid model of a plan's key pair (Raoult's law or UNIFAC from structure) and its equilibrium curve at the plan's pressure.

use super::rayleigh::Equilibrium;
use super::{Component, PlanError};
use crate::mixture::fit::Fitted;
use crate::mixture::{
    self, ActivityModel, Binary, Condition, Ideal, StudyComponent, StudyOptions, Unifac, VleStudy,
};

/// Which liquid model a plan uses for its key pair.
#[derive(Debug, Clone, PartialEq, Default)]
pub enum ActivityChoice {
    /// UNIFAC when both key components have a known structure, otherwise the
    /// ideal solution (with a finding saying why).
    #[default]
    Auto,
    /// UNIFAC; an error when a structure is missing or cannot be assigned.
    Unifac,
    /// The ideal solution (Raoult's law, γ = 1).
    Ideal,
    /// A model fitted to measured binary data (`ebullio fit` on x1, y1 data) for the
    /// two components named, component 1 first; used when they are the key pair.
    Fitted {
        /// The fitted model, numbered as `names`.
        model: Fitted,
        /// The fit's component 1 and 2.
        names: [String; 2],
    },
}

/// The model chosen for a key pair, and why `Auto` fell back to the ideal solution when it did.
pub struct KeyPairModel {
    /// The liquid model.
    pub model: Box<dyn ActivityModel>,
    /// The reason for falling back to the ideal solution.
    pub fallback: Option<String>,
}

/// Choose the key pair's liquid model.
pub fn choose_model(
    choice: ActivityChoice,
    light: &Component,
    heavy: &Component,
) -> Result<KeyPairModel, PlanError> {
    let ideal = |why: Option<String>| KeyPairModel {
        model: Box::new(Ideal),
        fallback: why,
    };
    if choice == ActivityChoice::Ideal {
        return Ok(ideal(None));
    }
    if let ActivityChoice::Fitted { model, names } = &choice {
        let same = |a: &str, b: &str| a.eq_ignore_ascii_case(b);
        let m = if same(&names[0], &light.name) && same(&names[1], &heavy.name) {
            *model
        } else if same(&names[1], &light.name) && same(&names[0], &heavy.name) {
            model
                .swapped()
                .map_err(|e| PlanError::Mixture(e.to_string()))?
        } else {
            return Err(PlanError::Mixture(format!(
                "the fitted activity model is for {} / {}, but the key pair is {} / {}",
                names[0], names[1], light.name, heavy.name
            )));
        };
        return Ok(KeyPairModel {
            model: Box::new(m),
            fallback: None,
        });
    }
    let missing: Vec<&str> = [light, heavy]
        .iter()
        .filter(|c| c.smiles.is_none())
        .map(|c| c.name.as_str())
        .collect();
    if !missing.is_empty() {
        let names = missing.join(" and ");
        return match choice {
            ActivityChoice::Unifac => Err(PlanError::NoStructure { name: names }),
            _ => Ok(ideal(Some(format!(
                "no structure (SMILES) is known for {names}, so the ideal solution (Raoult's law) is assumed"
            )))),
        };
    }
    let smiles = [
        light.smiles.as_deref().unwrap_or_default(),
        heavy.smiles.as_deref().unwrap_or_default(),
    ];
    match Unifac::from_smiles(smiles) {
        Ok(m) => Ok(KeyPairModel {
            model: Box::new(m),
            fallback: None,
        }),
        Err(e) if choice == ActivityChoice::Auto => Ok(ideal(Some(format!(
            "UNIFAC cannot describe this pair ({e}), so the ideal solution (Raoult's law) is assumed"
        )))),
        Err(e) => Err(PlanError::Mixture(e.to_string())),
    }
}

/// The vapor–liquid picture of the key pair at `p_pa` (light component first):
/// azeotropes, liquid split, pressure shift, flags.
pub fn key_pair_study(
    light: &Component,
    heavy: &Component,
    model: &dyn ActivityModel,
    p_pa: f64,
) -> Result<VleStudy, PlanError> {
    fn comp(c: &Component) -> StudyComponent<'_> {
        StudyComponent {
            name: c.name.as_str(),
            smiles: c.smiles.as_deref(),
            source: c.source.as_str(),
            curve: &*c.curve,
        }
    }
    mixture::vle_study(
        [comp(light), comp(heavy)],
        model,
        &StudyOptions {
            condition: Condition::Pressure(p_pa),
            points: 101,
        },
    )
    .map_err(|e| PlanError::Mixture(e.to_string()))
}

/// The key pair's equilibrium curve at fixed pressure under an activity model
/// (modified Raoult's law). Inside a predicted two-liquid region the vapor and
/// temperature are those of the three-phase point (flat in x).
pub struct ModelCurve<'a> {
    binary: Binary<'a>,
    p_pa: f64,
    /// `(x_low, x_high, y, t_k)` of the predicted split.
    split: Option<(f64, f64, f64, f64)>,
}

impl<'a> ModelCurve<'a> {
    /// The curve of `light`/`heavy` under `model` at `p_pa`, with the split of `study`.
    pub fn new(
        light: &'a Component,
        heavy: &'a Component,
        model: &'a dyn ActivityModel,
        p_pa: f64,
        study: &VleStudy,
    ) -> Self {
        let s = &study.liquid_split;
        let split = match (s.predicted, s.x1_low, s.x1_high, s.y1, s.t_k) {
            (true, Some(lo), Some(hi), Some(y), Some(t)) => Some((lo, hi, y, t)),
            _ => None,
        };
        Self {
            binary: Binary {
                names: [light.name.as_str(), heavy.name.as_str()],
                curves: [&*light.curve, &*heavy.curve],
                model,
            },
            p_pa,
            split,
        }
    }

    fn state(&self, x: f64) -> Result<(f64, f64), PlanError> {
        if let Some((lo, hi, y, t)) = self.split {
            if x > lo && x < hi {
                return Ok((y, t));
            }
        }
        self.binary
            .bubble_t(x, self.p_pa)
            .map(|p| (p.y1, p.t_k))
            .map_err(|e| PlanError::Mixture(e.to_string()))
    }
}

impl Equilibrium for ModelCurve<'_> {
    fn y(&self, x: f64) -> Result<f64, PlanError> {
        self.state(x).map(|s| s.0)
    }
    fn t_k(&self, x: f64) -> Result<Option<f64>, PlanError> {
        self.state(x).map(|s| Some(s.1))
    }
    fn model(&self) -> &'static str {
        self.binary.model.name()
    }
}
