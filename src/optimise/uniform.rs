//! The uniform rate option: one rate in every pumping well (one pump size on site).
//!
//! The smallest q with Φ₀ + q·Σⱼuᵢⱼ ≤ Φ(zₜ) at every target point (a ratio per point), and the
//! largest q within every well's limits: the level floor (linear in q) and Sichardt's capacity on
//! the wetted screen (a monotone equation in q, solved by bisection).

use crate::optimise::binding::{Binding, LevelLoss};
use crate::optimise::rates::LayoutRates;
use serde::Serialize;

/// The uniform-rate answer for one layout.
#[derive(Debug, Clone, Serialize)]
pub struct Uniform {
    /// Smallest rate per well that meets every target, m³/s (`None`: some target is out of
    /// reach of every well).
    pub needed_m3_per_s: Option<f64>,
    /// Check point that sets the needed rate (index into the check points).
    pub needed_at: Option<usize>,
    /// Largest rate per well within every well limit, m³/s.
    pub limit_m3_per_s: f64,
    /// What sets that limit.
    pub limit_reason: Binding,
    /// Lowest margin below target with every well at the limit rate, m (negative: short).
    pub margin_at_limit_m: f64,
    /// Where that margin is (index into the check points).
    pub worst_at_limit: Option<usize>,
    /// The needed rate is within the limits and the evaluation confirms every target and limit.
    pub met: bool,
}

impl LayoutRates<'_> {
    /// The largest uniform rate within every well's limits, and what sets it.
    fn uniform_limit(&self) -> (f64, Binding) {
        let mut best = (f64::INFINITY, Binding::NoLimit);
        for (k, lim) in self.limits.iter().enumerate() {
            if self.group_of[k].is_none() {
                continue;
            }
            let name = &self.wells[k].name;
            let phi_k = self.base_w[k];
            if let Some(p) = lim.pump {
                if p < best.0 {
                    best = (p, Binding::PumpRate { rate_m3_per_s: p });
                }
            }
            let s = self.at_wells_sum()[k];
            if s >= 0.0 {
                continue;
            }
            let mut q_level = ((phi_k - lim.floor_potential) / -s).max(0.0);
            if lim.has_rate_loss() {
                // the face level must stay above floor + loss(q) (monotone in q: bisection)
                let aq = &self.model.aquifer;
                let ok = |q: f64| phi_k + q * s >= aq.potential(lim.face_floor(q));
                let (mut lo, mut hi) = (0.0, q_level);
                for _ in 0..80 {
                    let mid = 0.5 * (lo + hi);
                    if ok(mid) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                q_level = lo;
            }
            let cap =
                |q: f64| lim.capacity_per_metre * lim.wetted(self.level_of(phi_k + q * s)) - q;
            let (q_k, why) = if cap(q_level) >= 0.0 {
                (
                    q_level,
                    Binding::WellLevel {
                        well: name.clone(),
                        level_m: lim.floor_level,
                        floor: lim.floor_kind,
                        loss: LevelLoss::None,
                    },
                )
            } else {
                let (mut lo, mut hi) = (0.0, q_level);
                for _ in 0..80 {
                    let mid = 0.5 * (lo + hi);
                    if cap(mid) >= 0.0 {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                (lo, Binding::SichardtCapacity { well: name.clone() })
            };
            if q_k < best.0 {
                best = (q_k, why);
            }
        }
        if best.0.is_finite() {
            best
        } else {
            (0.0, Binding::NoWells)
        }
    }

    /// Lowest margin below target with rate `q` in every well, and where (index into points).
    fn uniform_margin(&self, q: f64) -> (f64, Option<usize>) {
        let mut worst = (f64::INFINITY, None);
        for (t, s) in self.a_sum.iter().enumerate() {
            let i = self.targets[t];
            let z = self.level_of(self.base_t[t] + q * s);
            let m = self.points[i].target_level.unwrap_or(z) - z;
            if m < worst.0 {
                worst = (m, Some(i));
            }
        }
        worst
    }

    /// Option (a): one rate in every well.
    pub fn uniform(&self) -> Uniform {
        let mut needed = Some(0.0f64);
        let mut needed_at = None;
        for (t, &s) in self.a_sum.iter().enumerate() {
            let deficit = self.base_t[t] - self.target_phi[t];
            if deficit <= 0.0 {
                continue;
            }
            if s >= 0.0 {
                needed = None;
                needed_at = Some(self.targets[t]);
                break;
            }
            let q = deficit / -s;
            if needed.is_some_and(|n| q > n) {
                needed = Some(q);
                needed_at = Some(self.targets[t]);
            }
        }
        let (limit, limit_reason) = self.uniform_limit();
        let (margin, worst) = self.uniform_margin(limit);
        let met = match needed {
            Some(q) if q <= limit && !self.groups.is_empty() => {
                let e = self.evaluate(&self.uniform_rates(q));
                e.targets_met && e.wells_ok
            }
            _ => false,
        };
        Uniform {
            needed_m3_per_s: needed,
            needed_at,
            limit_m3_per_s: limit,
            limit_reason,
            margin_at_limit_m: if margin.is_finite() { margin } else { 0.0 },
            worst_at_limit: worst,
            met,
        }
    }
}
