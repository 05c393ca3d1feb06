//! Original UNIFAC for a binary: combinatorial (Staverman–Guggenheim, z = 10) plus residual part.
//!
//! ln γi = ln γiC + ln γiR with
//! ln γiC = 1 − Vi + ln Vi − 5 qi (1 − Vi/Fi + ln(Vi/Fi)), Vi = ri/Σ rj xj, Fi = qi/Σ qj xj
//! (the Staverman–Guggenheim term rearranged so that xi = 0 is finite), and
//! ln γiR = Σk νki (ln Γk − ln Γk(i)),
//! ln Γk = Qk [1 − ln(Σm Θm Ψmk) − Σm Θm Ψkm / Σn Θn Ψnm], Ψmn = exp(−amn/T).
//! Derivatives with respect to x1 are analytic.
//!
//! Reference: A. Fredenslund, R. L. Jones, J. M. Prausnitz, AIChE J. 21 (1975)
//! 1086–1099; parameters of Hansen et al., Ind. Eng. Chem. Res. 30 (1991) 2352.

use super::unifac_groups::{assign_subgroups, SubgroupCounts};
use super::unifac_table::unifac_table;
use super::{ActivityModel, MixtureError};
use crate::molecule::parse_smiles;

/// Most distinct subgroups a binary may hold (fixed-size arrays keep one
/// evaluation free of allocation).
pub const MAX_SUBGROUPS: usize = 16;

/// Original UNIFAC for one binary, with its groups and parameters gathered.
///
/// ```
/// use ebullio::mixture::{ActivityModel, Unifac};
/// let m = Unifac::from_smiles(["CC(C)=O", "CCCCC"]).unwrap();
/// let [g1, _] = m.ln_gamma(0.047, 307.0);
/// assert!((g1.exp() - 4.99).abs() < 0.02);
/// ```
#[derive(Debug, Clone)]
pub struct Unifac {
    n: usize,
    q_k: [f64; MAX_SUBGROUPS],
    nu: [[f64; MAX_SUBGROUPS]; 2],
    a: [[f64; MAX_SUBGROUPS]; MAX_SUBGROUPS],
    r: [f64; 2],
    q: [f64; 2],
    groups: [SubgroupCounts; 2],
}

impl Unifac {
    /// From the subgroup counts of the two components (subgroup number → count).
    pub fn new(groups: [SubgroupCounts; 2]) -> Result<Self, MixtureError> {
        let t = unifac_table();
        let mut ids: Vec<u16> = groups.iter().flat_map(|g| g.keys().copied()).collect();
        ids.sort_unstable();
        ids.dedup();
        if ids.len() > MAX_SUBGROUPS {
            return Err(MixtureError::TooManyGroups {
                count: ids.len(),
                max: MAX_SUBGROUPS,
            });
        }
        let subs = ids
            .iter()
            .map(|&id| {
                t.subgroup(id)
                    .ok_or_else(|| MixtureError::UnknownSubgroup(id.to_string()))
            })
            .collect::<Result<Vec<_>, _>>()?;
        let mut m = Unifac {
            n: ids.len(),
            q_k: [0.0; MAX_SUBGROUPS],
            nu: [[0.0; MAX_SUBGROUPS]; 2],
            a: [[0.0; MAX_SUBGROUPS]; MAX_SUBGROUPS],
            r: [0.0; 2],
            q: [0.0; 2],
            groups: groups.clone(),
        };
        for (k, s) in subs.iter().enumerate() {
            m.q_k[k] = s.q;
            for (l, u) in subs.iter().enumerate() {
                m.a[k][l] = t.a(s.main_id, u.main_id).ok_or_else(|| {
                    let (lo, hi) = if s.main_id < u.main_id {
                        (s, u)
                    } else {
                        (u, s)
                    };
                    MixtureError::MissingPair {
                        m: lo.main_id,
                        m_name: lo.main_name.to_string(),
                        n: hi.main_id,
                        n_name: hi.main_name.to_string(),
                    }
                })?;
            }
            for (i, g) in groups.iter().enumerate() {
                let c = f64::from(g.get(&s.id).copied().unwrap_or(0));
                m.nu[i][k] = c;
                m.r[i] += c * s.r;
                m.q[i] += c * s.q;
            }
        }
        if m.r.iter().any(|&r| r <= 0.0) {
            return Err(MixtureError::UnknownSubgroup(
                "a component with no subgroups".into(),
            ));
        }
        Ok(m)
    }

    /// From two SMILES, with the subgroups assigned automatically.
    pub fn from_smiles(smiles: [&str; 2]) -> Result<Self, MixtureError> {
        let mut g = [SubgroupCounts::new(), SubgroupCounts::new()];
        for (i, s) in smiles.iter().enumerate() {
            let m = parse_smiles(s).map_err(|e| MixtureError::Smiles {
                smiles: s.to_string(),
                message: e.to_string(),
            })?;
            g[i] = assign_subgroups(&m)?;
        }
        Self::new(g)
    }

    /// The subgroup counts of each component.
    pub fn groups(&self) -> &[SubgroupCounts; 2] {
        &self.groups
    }

    /// Ψ at `t_k`.
    fn psi(&self, t_k: f64) -> [[f64; MAX_SUBGROUPS]; MAX_SUBGROUPS] {
        let mut p = [[1.0; MAX_SUBGROUPS]; MAX_SUBGROUPS];
        for (pk, ak) in p.iter_mut().zip(&self.a).take(self.n) {
            for (v, &a) in pk.iter_mut().zip(ak).take(self.n) {
                if a != 0.0 {
                    *v = (-a / t_k).exp();
                }
            }
        }
        p
    }

    /// ln Γk for group amounts `c` and their x1-derivative `dc`; returns (ln Γ, d ln Γ/dx1).
    fn residual(
        &self,
        c: &[f64; MAX_SUBGROUPS],
        dc: &[f64; MAX_SUBGROUPS],
        psi: &[[f64; MAX_SUBGROUPS]; MAX_SUBGROUPS],
    ) -> ([f64; MAX_SUBGROUPS], [f64; MAX_SUBGROUPS]) {
        let n = self.n;
        let mut th = [0.0; MAX_SUBGROUPS];
        let mut dth = [0.0; MAX_SUBGROUPS];
        let (mut a, mut da) = (0.0, 0.0);
        for k in 0..n {
            a += self.q_k[k] * c[k];
            da += self.q_k[k] * dc[k];
        }
        for k in 0..n {
            th[k] = self.q_k[k] * c[k] / a;
            dth[k] = (self.q_k[k] * dc[k] - th[k] * da) / a;
        }
        let mut s = [0.0; MAX_SUBGROUPS];
        let mut ds = [0.0; MAX_SUBGROUPS];
        for k in 0..n {
            for m in 0..n {
                s[k] += th[m] * psi[m][k];
                ds[k] += dth[m] * psi[m][k];
            }
        }
        let mut lg = [0.0; MAX_SUBGROUPS];
        let mut dlg = [0.0; MAX_SUBGROUPS];
        for k in 0..n {
            let (mut sum, mut dsum) = (0.0, 0.0);
            for m in 0..n {
                let w = psi[k][m] / s[m];
                sum += th[m] * w;
                dsum += dth[m] * w - th[m] * w * ds[m] / s[m];
            }
            lg[k] = self.q_k[k] * (1.0 - s[k].ln() - sum);
            dlg[k] = self.q_k[k] * (-ds[k] / s[k] - dsum);
        }
        (lg, dlg)
    }
}

impl ActivityModel for Unifac {
    fn name(&self) -> &'static str {
        "unifac"
    }

    fn ln_gamma_dx(&self, x1: f64, t_k: f64) -> ([f64; 2], [f64; 2]) {
        let x2 = 1.0 - x1;
        // Combinatorial part.
        let rbar = self.r[0] * x1 + self.r[1] * x2;
        let qbar = self.q[0] * x1 + self.q[1] * x2;
        let (dr, dq) = (self.r[0] - self.r[1], self.q[0] - self.q[1]);
        let mut lng = [0.0; 2];
        let mut dlng = [0.0; 2];
        for i in 0..2 {
            let v = self.r[i] / rbar;
            let f = self.q[i] / qbar;
            let w = v / f;
            let dv = -v * dr / rbar;
            let dw = w * (-dr / rbar + dq / qbar);
            let q5 = 5.0 * self.q[i];
            lng[i] = 1.0 - v + v.ln() - q5 * (1.0 - w + w.ln());
            dlng[i] = -dv + dv / v - q5 * (-dw + dw / w);
        }
        // Residual part.
        let psi = self.psi(t_k);
        let zero = [0.0; MAX_SUBGROUPS];
        let mut c = [0.0; MAX_SUBGROUPS];
        let mut dc = [0.0; MAX_SUBGROUPS];
        for k in 0..self.n {
            c[k] = self.nu[0][k] * x1 + self.nu[1][k] * x2;
            dc[k] = self.nu[0][k] - self.nu[1][k];
        }
        let (lg, dlg) = self.residual(&c, &dc, &psi);
        for i in 0..2 {
            let (pure, _) = self.residual(&self.nu[i], &zero, &psi);
            for k in 0..self.n {
                let nu = self.nu[i][k];
                if nu != 0.0 {
                    lng[i] += nu * (lg[k] - pure[k]);
                    dlng[i] += nu * dlg[k];
                }
            }
        }
        (lng, dlng)
    }
}
