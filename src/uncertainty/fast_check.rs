//! The given layout on many sampled grounds without a new kernel sum per sample.
//!
//! In discharge potential the superposition is free of K (Strack 1989, ch. 8): the change at a
//! point is ΔΦ_p = Σ_w Q_w·u_pw, with the Thiem part of u_pw = −Σ_s σ_s·ln(R/r_s)/(2π) over the
//! well and its images (σ = +1 for the well and a barrier image, −1 for a constant-head image)
//! and the partial-penetration term free of R (it depends on the geometry, K_v/K_h and the
//! saturated thickness before pumping). Where every source is within R of every point,
//!
//! ```text
//! ΔΦ_p(R) = A_p − ln(R)/(2π)·B,   B = Σ_w Q_w·Σ_s σ_s   (one number for the layout)
//! ```
//!
//! so one table A_p per point (built once, at a reference R that reaches every source) gives
//! every sample's levels: K enters only through h = level(Φ₀ + ΔΦ) and R through a shift. Next
//! to a constant-head boundary B = 0: R drops out (the river fixes the head, not R). A sampled
//! groundwater level or K_v/K_h changes the partial-penetration term: A_p is built at nodes
//! spread over that input's range and interpolated linearly (tested against the plain
//! evaluation in `tests/uncertainty.rs`). The radius at the drawdown produced is found as
//! `check` finds it (the least fixed point above the design drawdown, to 1e-7 m). A sample whose
//! R falls short of the farthest source, a leaky aquifer and two or more boundaries (images of
//! images) are left to the plain evaluation ([`FastCheck::new`] gives `None`,
//! [`FastCheck::evaluate`] gives `None`).
//!
//! The wells' limits are those `check` applies ([`crate::check::evaluate`]): the level in each
//! well (the aquifer's at the well face, from the same tables, less Jacob's loss C·Q²) not below
//! its lowest allowed level (pump intake + submergence, or the wellpoints' suction floor), not
//! pumped dry, and the rate within the capacity (Sichardt's, on the wetted screen and the
//! sample's K, and the pump's). A file with well losses given as an efficiency (the loss then
//! depends on the sample's own-well drawdown) is left to the plain evaluation.

use crate::check::evaluate::TARGET_TOLERANCE;
use crate::check::field_build::{field_with_radius, point_elevation};
use crate::field::radius::{depends_on_drawdown, design_drawdown, radius_at, serves_trench};
use crate::field::wells::Well;
use crate::input::model::Model;
use crate::input::model::WellLossSpec;
use crate::input::model_uncertainty::{InputKind, Uncertainty};
use crate::physics::capacity::sichardt_well_capacity;
use crate::physics::images::BoundaryKind;
use crate::physics::potential::Level;
use crate::physics::well_loss::jacob_loss;
use crate::safety::neighbours::{column_at, sample_points, works_duration};
use crate::uncertainty::check_samples::{CheckSample, Layout};
use rayon::prelude::*;
use std::f64::consts::PI;

/// Nodes over a sampled groundwater level's range.
const LEVEL_NODES: usize = 9;
/// Nodes over a sampled anisotropy's range.
const ANISOTROPY_NODES: usize = 5;

/// Tables of one layout for fast evaluation on sampled grounds.
pub struct FastCheck {
    /// Check points with a target (index into the layout's points, target, served excavation).
    targets: Vec<(usize, f64, bool)>,
    /// Number of check points (probes after them are the neighbours').
    point_count: usize,
    /// Each neighbour's probes: start and end in the probe list.
    neighbours: Vec<(usize, usize)>,
    /// Groundwater level nodes (one: not sampled) and K_v/K_h nodes.
    level_nodes: Vec<f64>,
    anisotropy_nodes: Vec<f64>,
    /// A_p at each node, `[level node * anisotropy nodes + anisotropy node][probe]`.
    a: Vec<Vec<f64>>,
    /// B = Σ_w Q_w·Σ_s σ_s.
    b: f64,
    /// The farthest source from any probe, m: a sample's R must reach it.
    coverage: f64,
    /// Σ Q_w, m³/s.
    total_rate: f64,
    /// The wells (their probes, at the well positions, follow the neighbours').
    wells: Vec<Well>,
    /// Index of the first well probe.
    well_probes: usize,
}

/// `n` nodes spread over the support of `kind` in `spec` (one node at `base` when not sampled).
fn nodes(spec: &Uncertainty, kind: InputKind, n: usize, base: f64) -> Vec<f64> {
    let Some(i) = spec.inputs.iter().find(|i| i.kind == kind) else {
        return vec![base];
    };
    let (lo, hi) = (i.distribution.quantile(0.0), i.distribution.quantile(1.0));
    (0..n)
        .map(|k| lo + (hi - lo) * k as f64 / (n - 1) as f64)
        .collect()
}

/// Index and weight of `x` between `nodes` (linear interpolation, clamped).
fn bracket(nodes: &[f64], x: f64) -> (usize, f64) {
    if nodes.len() < 2 {
        return (0, 0.0);
    }
    let k = nodes
        .windows(2)
        .position(|w| x <= w[1])
        .unwrap_or(nodes.len() - 2);
    let t = ((x - nodes[k]) / (nodes[k + 1] - nodes[k])).clamp(0.0, 1.0);
    (k, t)
}

impl FastCheck {
    /// The tables of `layout` on the ground of `model`, for the inputs `spec` samples (`None`
    /// where the shortcut does not hold: leaky aquifer, layered ground, two or more boundaries).
    pub fn new(model: &Model, spec: &Uncertainty, layout: &Layout) -> Option<FastCheck> {
        if model.aquifer.leakage_factor().is_some()
            || model.layers.is_some()
            || model.boundaries.len() > 1
            || layout.wells.iter().any(|w| w.rate < 0.0)
            || matches!(model.as_built.loss, WellLossSpec::Efficiency(_))
        {
            return None;
        }
        let wells = &layout.wells;
        let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
        let targets = layout
            .points
            .iter()
            .enumerate()
            .filter_map(|(i, p)| Some((i, p.target_level?, p.excavation == Some(idx))))
            .collect();
        let mut probes: Vec<([f64; 2], Option<f64>)> = layout
            .points
            .iter()
            .map(|p| (p.position, Some(point_elevation(model, p))))
            .collect();
        let mut neighbours = Vec::new();
        for n in &model.neighbours {
            let start = probes.len();
            probes.extend(sample_points(&n.footprint).into_iter().map(|s| (s.2, None)));
            neighbours.push((start, probes.len()));
        }
        let well_probes = probes.len();
        probes.extend(wells.iter().map(|w| (w.position, None)));
        let sign_sum = 1.0
            + model
                .boundaries
                .iter()
                .map(|b| match b.kind {
                    BoundaryKind::ConstantHead => -1.0,
                    _ => 1.0,
                })
                .sum::<f64>();
        let total_rate: f64 = wells.iter().map(|w| w.rate).sum();
        let mut coverage = 0.0f64;
        for (p, _) in &probes {
            for w in wells {
                let mut far = (p[0] - w.position[0]).hypot(p[1] - w.position[1]);
                for b in &model.boundaries {
                    let m = crate::geometry::mirror_point(w.position, b.line[0], b.line[1]);
                    far = far.max((p[0] - m[0]).hypot(p[1] - m[1]));
                }
                coverage = coverage.max(far);
            }
        }
        let r_ref = (4.0 * coverage).max(1000.0);
        let level_nodes = nodes(
            spec,
            InputKind::GroundwaterLevel,
            LEVEL_NODES,
            model.aquifer.initial_level,
        );
        let anisotropy_nodes = nodes(
            spec,
            InputKind::Anisotropy,
            ANISOTROPY_NODES,
            model.as_built.anisotropy,
        );
        let b = total_rate * sign_sum;
        let grid: Vec<(f64, f64)> = level_nodes
            .iter()
            .flat_map(|&l| anisotropy_nodes.iter().map(move |&a| (l, a)))
            .collect();
        let a = grid
            .par_iter()
            .map(|&(level, anisotropy)| {
                let mut m = model.clone();
                m.aquifer.initial_level = level;
                m.as_built.anisotropy = anisotropy;
                let field = field_with_radius(&m, wells, r_ref);
                let mut tables = std::collections::HashMap::new();
                probes
                    .iter()
                    .map(|(p, z)| {
                        let t = z.map(|z| {
                            tables
                                .entry(z.to_bits())
                                .or_insert_with(|| field.elevation(z))
                                .clone()
                        });
                        let row = field.unit_row_at(*p, t.flatten().as_ref());
                        let dphi: f64 = row.iter().zip(wells).map(|(u, w)| u * w.rate).sum();
                        dphi + r_ref.ln() / (2.0 * PI) * b
                    })
                    .collect()
            })
            .collect();
        Some(FastCheck {
            targets,
            point_count: layout.points.len(),
            neighbours,
            level_nodes,
            anisotropy_nodes,
            a,
            b,
            coverage,
            total_rate,
            wells: wells.clone(),
            well_probes,
        })
    }

    /// A_p for the sample's groundwater level and anisotropy.
    fn a_at(&self, level: f64, anisotropy: f64) -> Vec<f64> {
        let (li, lt) = bracket(&self.level_nodes, level);
        let (ai, at) = bracket(&self.anisotropy_nodes, anisotropy);
        let na = self.anisotropy_nodes.len();
        let node = |l: usize, a: usize| &self.a[l * na + a];
        let l1 = (li + 1).min(self.level_nodes.len() - 1);
        let a1 = (ai + 1).min(na - 1);
        (0..self.a[0].len())
            .map(|p| {
                let lo = node(li, ai)[p] * (1.0 - at) + node(li, a1)[p] * at;
                let hi = node(l1, ai)[p] * (1.0 - at) + node(l1, a1)[p] * at;
                lo * (1.0 - lt) + hi * lt
            })
            .collect()
    }

    /// The layout on the ground of `model` (one sample), or `None` when its radius of influence
    /// falls short of the farthest source (use the plain evaluation).
    pub fn evaluate(&self, model: &Model) -> Option<CheckSample> {
        let aq = &model.aquifer;
        let a = self.a_at(aq.initial_level, model.as_built.anisotropy);
        let phi0 = aq.initial_potential();
        let wet_level = |p: usize, r: f64| aq.level(phi0 + a[p] - r.ln() / (2.0 * PI) * self.b);
        let level = |p: usize, r: f64| wet_level(p, r).or_base(aq.base_level);
        let produced = |r: f64| {
            self.targets
                .iter()
                .filter(|t| t.2)
                .map(|t| aq.initial_level - level(t.0, r))
                .min_by(f64::total_cmp)
        };
        let s_d = design_drawdown(model);
        let mut r = radius_at(model, s_d).0;
        if depends_on_drawdown(model) && !serves_trench(model) && self.total_rate > 0.0 {
            if let Some(p0) = produced(r).filter(|p| *p > s_d) {
                let mut s = p0;
                for _ in 0..60 {
                    r = radius_at(model, s).0;
                    let p = produced(r).unwrap_or(s).max(s_d);
                    if (p - s).abs() <= 1e-8 {
                        break;
                    }
                    s = p;
                }
                r = radius_at(model, s).0;
            }
        }
        if r < self.coverage {
            return None;
        }
        let mut alpha: Option<f64> = Some(0.0);
        let mut lowest: Option<f64> = None;
        let mut met = true;
        for &(i, target, _) in &self.targets {
            let z = level(i, r);
            let margin = target - z;
            met &= margin >= -TARGET_TOLERANCE;
            lowest = Some(lowest.map_or(margin, |l: f64| l.min(margin)));
            let needed = phi0 - aq.potential(target);
            if needed > 0.0 {
                let done = phi0 - aq.potential(z);
                alpha = match alpha {
                    Some(x) if done > 0.0 => Some(x.max(needed / done)),
                    _ => None,
                };
            }
        }
        let neighbours = model
            .neighbours
            .iter()
            .zip(&self.neighbours)
            .map(|(n, &(s, e))| {
                let duration = works_duration(model, n).map(|w| w.0);
                let mut worst_drawdown = f64::NEG_INFINITY;
                let mut worst_settlement: Option<f64> = None;
                for p in s..e {
                    let h1 = level(p, r);
                    worst_drawdown = worst_drawdown.max(aq.initial_level - h1);
                    if !n.layers.is_empty() {
                        let c = column_at(model, n, h1);
                        let v = duration.map_or(c.total, |t| {
                            crate::safety::settlement::at_time(&n.layers, &c.per_layer, t).0
                        });
                        worst_settlement = Some(worst_settlement.map_or(v, |w| w.max(v)));
                    }
                }
                (worst_drawdown, worst_settlement)
            })
            .collect();
        debug_assert!(self.point_count <= a.len());
        Some(CheckSample {
            total_flow_m3_per_s: self.total_rate,
            needed_flow_m3_per_s: alpha.map(|x| x * self.total_rate),
            lowest_margin_m: lowest,
            targets_met: met,
            wells_ok: Some(
                self.wells
                    .iter()
                    .enumerate()
                    .all(|(k, w)| within_limits(model, w, wet_level(self.well_probes + k, r))),
            ),
            radius_m: r,
            neighbours,
        })
    }
}

/// Whether well `w` keeps within its limits on the ground of `model` with the aquifer level `lv`
/// at its face: the rules of [`crate::check::evaluate`] for an abstraction well with no loss or
/// Jacob's loss (not pumped dry; the level inside, face − C·Q², not below pump intake +
/// submergence or, for a wellpoint, its suction floor; Q within Sichardt's capacity on the
/// wetted screen and the pump's).
fn within_limits(model: &Model, w: &Well, lv: Level) -> bool {
    let Level::Wet(face) = lv else {
        return false;
    };
    let spec = &model.wells;
    let loss = match model.as_built.loss {
        WellLossSpec::Jacob(c) => jacob_loss(c, w.rate),
        _ => 0.0,
    };
    let lowest = crate::check::evaluate::lowest_pumping_level(model, w);
    if w.rate > 0.0 && face - loss < lowest - TARGET_TOLERANCE {
        return false;
    }
    let wetted = (w.filter_top.min(face) - w.filter_base).max(0.0);
    let sichardt = sichardt_well_capacity(w.radius, wetted, model.aquifer.conductivity);
    let cap = spec.pump_capacity.map_or(sichardt, |p| p.min(sichardt));
    w.rate <= cap * (1.0 + 1e-9)
}
