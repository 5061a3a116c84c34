//! One well out of service: the least-flow rates that still meet every target with any single
//! pumping well stopped (the others keep their rates), and, for a finished design, which
//! well's loss hurts most and the margin left without it.
//!
//! Superposition is linear in Strack's discharge potential, so with well k stopped the
//! potential at target point i is Φᵢ − uᵢₖ·qₖ (uᵢₖ < 0 for pumping). The target with k out
//! holds when Φ₀ + Σⱼ≠ₖ uᵢⱼ·qⱼ ≤ Φ(zₜ): one more linear row per (point, well). There are
//! points × wells such rows, but only a few bind (the points nearest each well). The rows are
//! generated lazily: solve, find for every well the point its loss leaves furthest above the
//! target, add those rows, solve again, until none is violated — the answer is then the
//! optimum of the full programme (every row holds, and the rows left out could only raise the
//! optimum). Stopping a pumping well raises every level, so the level and capacity limits of
//! the wells that keep running are looser than with every well on; they are held with every
//! well on.
//!
//! With one well out the targets are held at the target itself; with every well on at the
//! target less the operating margin.

use crate::optimise::binding::Binding;
use crate::optimise::individual::{CarriedRows, Individual, WellRow};
use crate::optimise::lp_problem::LpStatus;
use crate::optimise::rates::LayoutRates;

/// Most rounds of adding one-well-out rows.
const MAX_ROUNDS: usize = 30;
/// Relative tolerance on the potential scale for a violated one-well-out row.
const ROW_TOLERANCE: f64 = 1e-9;

/// What one well out does to a design.
#[derive(Debug, Clone, serde::Serialize)]
pub struct OneOut {
    /// The well whose loss leaves the lowest margin.
    pub worst_well: String,
    /// The lowest margin below target with that well out, m (negative: a target is missed).
    pub margin_without_m: f64,
    /// Where that margin is.
    pub worst_point: String,
    /// The lowest margin with each pumping well out in turn, by well name.
    pub by_well: Vec<(String, f64)>,
}

impl LayoutRates<'_> {
    /// Least total flow such that every target holds with every well on (at the targets of
    /// this layout's check points) and, with any one pumping well out, at those targets raised
    /// by `relax` m (the operating margin given back).
    pub fn individual_one_out(&self, relax: f64) -> Individual {
        let aq = &self.model.aquifer;
        let u = &self.unit().at_targets;
        let phi_out: Vec<f64> = self
            .targets
            .iter()
            .map(|&i| aq.potential(self.points[i].target_level.unwrap_or(f64::NAN) + relax))
            .collect();
        let n = self.wells.len();
        let tol = ROW_TOLERANCE * self.phi0.abs().max(1e-30);
        let mut extra: Vec<WellRow> = Vec::new();
        let mut have = std::collections::HashSet::new();
        let mut carried = CarriedRows::default();
        // Each round is judged (binding rows, evaluation) only when it is the last.
        let mut round = self.solve_carried(&extra, &mut carried);
        let mut rounds = 0;
        while round.status() == LpStatus::Optimal && rounds < MAX_ROUNDS {
            rounds += 1;
            let x = round.rates();
            let free: Vec<f64> = (0..n)
                .map(|k| {
                    if self.group_of[k].is_some() {
                        x[k]
                    } else {
                        0.0
                    }
                })
                .collect();
            // Φ at each target with every well on, and the worst point per well out.
            let phi: Vec<f64> = u
                .iter()
                .enumerate()
                .map(|(t, row)| {
                    self.base_t[t] + row.iter().zip(&free).map(|(a, q)| a * q).sum::<f64>()
                })
                .collect();
            let mut added = 0;
            for k in (0..n).filter(|&k| free[k] > 0.0) {
                let worst = (0..u.len())
                    .map(|t| (phi[t] - u[t][k] * free[k] - phi_out[t], t))
                    .max_by(|a, b| a.0.total_cmp(&b.0));
                if let Some((v, t)) = worst {
                    if v > tol && have.insert((t, k)) {
                        let per_well: Vec<f64> = u[t]
                            .iter()
                            .enumerate()
                            .map(|(j, a)| {
                                if j != k && self.group_of[j].is_some() {
                                    -a
                                } else {
                                    0.0
                                }
                            })
                            .collect();
                        extra.push(WellRow {
                            per_well,
                            rhs: self.base_t[t] - phi_out[t],
                            label: Binding::TargetWithWellOut {
                                point: self.points[self.targets[t]].name.clone(),
                                well: self.wells[k].name.clone(),
                            },
                        });
                        added += 1;
                    }
                }
            }
            if added == 0 {
                break;
            }
            round = self.solve_carried(&extra, &mut carried);
        }
        let mut ind = round.judge(self);
        if ind.status == LpStatus::Optimal {
            // The one-well-out rows that bind, in words.
            let x = &ind.rates;
            for e in &extra {
                let lhs: f64 = e.per_well.iter().zip(x).map(|(c, q)| c * q).sum();
                let size: f64 = e.rhs.abs()
                    + e.per_well
                        .iter()
                        .zip(x)
                        .map(|(c, q)| (c * q).abs())
                        .sum::<f64>();
                if (lhs - e.rhs).abs() <= 1e-6 * size {
                    ind.binding.push(e.label.clone());
                }
            }
            ind.rounds += rounds;
        }
        ind
    }
}

/// The lowest margin at the target points with each pumping well of `rates` out in turn, at
/// the layout's check points (the real targets).
///
/// By superposition in Φ: the full sum once, then with well k out Φᵢ − uᵢₖ·qₖ at every target
/// (uᵢₖ from the layout's unit rows, built once), a product per target and well instead of a
/// full evaluation per well. Margins are taken to the nanometre, so that wells whose loss is
/// the same by symmetry compare equal and the first of them in layout order is named.
pub fn one_out_report(layout: &LayoutRates, rates: &[f64]) -> Option<OneOut> {
    let aq = layout.field.aquifer();
    let u = &layout.unit().at_targets;
    let phi: Vec<f64> = u
        .iter()
        .map(|row| layout.phi0 + row.iter().zip(rates).map(|(a, q)| a * q).sum::<f64>())
        .collect();
    let mut by_well = Vec::new();
    let mut worst: Option<(f64, String, String)> = None;
    for k in (0..rates.len()).filter(|&k| rates[k] > 0.0) {
        let mut low: Option<(f64, usize)> = None;
        for (t, row) in u.iter().enumerate() {
            let i = layout.targets[t];
            let z = aq.level(phi[t] - row[k] * rates[k]).or_base(aq.base_level);
            let m = layout.points[i]
                .target_level
                .map_or(f64::INFINITY, |zt| zt - z);
            if low.is_none_or(|(lm, _)| m < lm) {
                low = Some((m, i));
            }
        }
        let Some((m, i)) = low else { continue };
        let m = (m * 1e9).round() / 1e9 + 0.0; // (+ 0.0: no −0)
        by_well.push((layout.wells[k].name.clone(), m));
        if worst.as_ref().is_none_or(|w| m < w.0) {
            worst = Some((
                m,
                layout.wells[k].name.clone(),
                layout.points[i].name.clone(),
            ));
        }
    }
    worst.map(|(m, w, p)| OneOut {
        worst_well: w,
        margin_without_m: m,
        worst_point: p,
        by_well,
    })
}

impl LayoutRates<'_> {
    /// The smallest rate in every pumping well that meets every target with any one well out
    /// (targets raised by `relax` m): per point and well out, the deficit over the summed unit
    /// rows of the wells still running (a ratio, as for the uniform option). `None` when a
    /// target is out of reach of the wells left running.
    pub fn uniform_one_out_rate(&self, relax: f64) -> Option<f64> {
        let aq = &self.model.aquifer;
        let u = &self.unit().at_targets;
        let mut need = 0.0f64;
        for (t, row) in u.iter().enumerate() {
            let i = self.targets[t];
            let phi_out = aq.potential(self.points[i].target_level.unwrap_or(f64::NAN) + relax);
            let deficit = self.base_t[t] - phi_out;
            if deficit <= 0.0 {
                continue;
            }
            for k in (0..row.len()).filter(|&k| self.group_of[k].is_some()) {
                let s = self.a_sum[t] - row[k];
                if s >= 0.0 {
                    return None;
                }
                need = need.max(deficit / -s);
            }
        }
        Some(need)
    }
}
