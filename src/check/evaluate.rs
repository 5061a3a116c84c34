//! Evaluate a placed well field: levels at every check point and in every well, against targets
//! and well limits.
//!
//! The level in a well is the aquifer level at its screen face (with partial penetration, from
//! the kernel) less its well loss (Jacob's C·Q², or the efficiency E: (1/E − 1) × the well's
//! own drawdown at its face, its neighbours' share left out; Jacob 1947, Kruseman & de Ridder
//! 1994 ch. 14). A recharge well's level is raised by its loss. A wellpoint's lowest level is its header level less
//! the suction limit (the same rule in `estimate` and `design`). A recharge well (negative
//! rate) is held below its highest allowed level (ground − margin, or given) and within its
//! injection capacity (a fraction of its abstraction capacity; common practice (no source)).

use crate::field::checkpoints::CheckPoint;
use crate::field::influence::Field;
use crate::field::wells::Well;
use crate::input::model::{Model, WellKind, WellLossSpec};
use crate::physics::capacity::sichardt_well_capacity;
use crate::physics::potential::Level;
use crate::physics::well_loss::{efficiency_loss_of_rate, jacob_loss};
use serde::Serialize;

/// Tolerance on targets, m: a point within a millimetre of its target counts as meeting it.
pub const TARGET_TOLERANCE: f64 = 1e-3;

/// What is wrong at a well, with its numbers in SI (m, m³/s); worded in the user's units by
/// `report::problems`.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "problem", rename_all = "kebab-case")]
pub enum WellProblem {
    /// The rate is more than the aquifer can give at the well.
    PumpedDry,
    /// A deep well's level is below its pump intake + submergence.
    BelowPumpIntake {
        /// Level in the well, m.
        level: f64,
        /// Well loss included in the level, m (0: none).
        well_loss: f64,
        /// Lowest level allowed, m.
        lowest: f64,
    },
    /// A wellpoint's level is below what suction can lift from its header.
    BelowSuctionLimit {
        /// Level in the well, m.
        level: f64,
        /// Well loss included in the level, m (0: none).
        well_loss: f64,
        /// Lowest level allowed (header − suction limit, or the pump intake), m.
        limit: f64,
        /// Header level, m.
        header: f64,
        /// Suction limit, m.
        suction_limit: f64,
    },
    /// A recharge well's level is above the highest allowed.
    AboveHighestRechargeLevel {
        /// Level in the well, m.
        level: f64,
        /// Highest level allowed, m.
        highest: f64,
        /// Where that level comes from (JSON: the SI words).
        basis: crate::input::model::InjectionBasis,
    },
    /// A recharge well injects more than its injection capacity.
    OverInjectionCapacity {
        /// Injection rate (positive), m³/s.
        rate: f64,
        /// Injection capacity, m³/s.
        capacity: f64,
        /// Fraction of the abstraction capacity.
        fraction: f64,
        /// Abstraction capacity, m³/s.
        abstraction_capacity: f64,
        /// The fraction is the default one (common practice, no source).
        default_fraction: bool,
    },
    /// The rate exceeds the well's capacity.
    OverCapacity {
        /// Rate, m³/s.
        rate: f64,
        /// Capacity, m³/s.
        capacity: f64,
        /// The pump limits it (else Sichardt's entrance gradient on the wetted screen).
        by_pump: bool,
    },
}

/// Result at one well.
#[derive(Debug, Clone, Serialize)]
pub struct WellResult {
    /// Well name.
    pub name: String,
    /// Position, m.
    pub position: [f64; 2],
    /// Rate, m³/s.
    pub rate_m3_per_s: f64,
    /// Water level in the well, m, after the well loss (`None`: pumped dry).
    pub level_m: Option<f64>,
    /// Aquifer level at the screen face (with partial penetration, before the well loss), m.
    pub aquifer_level_m: Option<f64>,
    /// Well loss, m (positive: the level in the well is this much below the face when
    /// pumping, above it when recharging).
    pub well_loss_m: f64,
    /// Drawdown in the well, m.
    pub drawdown_m: f64,
    /// Lowest level allowed in the well, m (pump intake + submergence, or suction limit).
    pub lowest_allowed_level_m: f64,
    /// Capacity by Sichardt's entrance gradient on the wetted screen, m³/s.
    pub sichardt_capacity_m3_per_s: f64,
    /// The well's own limit on rate (lower of Sichardt and pump), m³/s.
    pub capacity_m3_per_s: f64,
    /// Recharge wells: the highest level allowed in the well, m.
    pub highest_allowed_level_m: Option<f64>,
    /// Recharge wells: the injection capacity, m³/s (a fraction of the abstraction capacity).
    pub injection_capacity_m3_per_s: Option<f64>,
    /// What is wrong, if anything.
    pub problems: Vec<WellProblem>,
}

/// Result at one check point.
#[derive(Debug, Clone, Serialize)]
pub struct PointResult {
    /// The check point.
    #[serde(flatten)]
    pub point: CheckPoint,
    /// Water level, m (`None`: pumped dry here).
    pub level_m: Option<f64>,
    /// Drawdown, m.
    pub drawdown_m: f64,
    /// Target level − water level, m: positive is below target (met), negative short.
    pub margin_m: Option<f64>,
    /// Met, not met, or no target.
    pub met: Option<bool>,
}

/// The whole evaluation.
#[derive(Debug, Clone, Serialize)]
pub struct Evaluation {
    /// Radius of influence used, m.
    pub radius_of_influence_m: f64,
    /// How it was found.
    pub radius_of_influence_basis: String,
    /// Per well.
    pub wells: Vec<WellResult>,
    /// Per check point.
    pub points: Vec<PointResult>,
    /// Sum of abstraction rates, m³/s.
    pub total_abstraction_m3_per_s: f64,
    /// Sum of recharge rates (positive number), m³/s.
    pub total_recharge_m3_per_s: f64,
    /// Net flow (abstraction − recharge), m³/s.
    pub net_flow_m3_per_s: f64,
    /// Design flow: abstraction × (1 + contingency), m³/s.
    pub design_flow_m3_per_s: f64,
    /// Index into `points` of the lowest margin.
    pub worst_point: Option<usize>,
    /// Number of points with a target that is not met.
    pub unmet_count: usize,
    /// Every target met.
    pub targets_met: bool,
    /// Every well within its limits.
    pub wells_ok: bool,
}

/// Evaluate `wells` at `points`.
pub fn evaluate(model: &Model, field: &Field, wells: &[Well], points: &[CheckPoint]) -> Evaluation {
    let aq = field.aquifer();
    let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();
    // each point at its own elevation (partial penetration depends on it)
    let levels = crate::check::field_build::point_levels(model, field, points, &rates);
    let point_results: Vec<PointResult> = points
        .iter()
        .zip(levels)
        .map(|(p, lv)| {
            let level = match lv {
                Level::Wet(z) => Some(z),
                Level::Dry => None,
            };
            let z = lv.or_base(aq.base_level);
            let margin = p.target_level.map(|t| t - z);
            PointResult {
                point: p.clone(),
                level_m: level,
                drawdown_m: aq.initial_level - z,
                margin_m: margin,
                met: margin.map(|m| m >= -TARGET_TOLERANCE),
            }
        })
        .collect();
    let well_positions: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
    let well_levels = field.levels(&well_positions, &rates);
    let spec = &model.wells;
    let well_results: Vec<WellResult> = wells
        .iter()
        .zip(well_levels)
        .enumerate()
        .map(|(k, (w, lv))| {
            let face = lv.or_base(aq.base_level);
            let loss = match model.as_built.loss {
                WellLossSpec::Jacob(c) => jacob_loss(c, w.rate),
                // the well's own drawdown (or rise) only, not its neighbours' share
                WellLossSpec::Efficiency(e) if w.rate != 0.0 => {
                    efficiency_loss_of_rate(aq, e, field.unit_row(w.position)[k], w.rate)
                }
                _ => 0.0,
            };
            // the loss lowers the level in a pumped well and raises it in a recharge well
            let z = if w.rate < 0.0 {
                face + loss
            } else {
                face - loss
            };
            let lowest = lowest_pumping_level(model, w);
            // Sichardt's entrance gradient over the wetted filter column (the screen when no
            // filter column is given)
            let wetted = (w.filter_top.min(face) - w.filter_base).max(0.0);
            let sichardt = sichardt_well_capacity(w.radius, wetted, aq.conductivity);
            let cap = spec.pump_capacity.map_or(sichardt, |p| p.min(sichardt));
            let mut problems = Vec::new();
            if lv == Level::Dry {
                problems.push(WellProblem::PumpedDry);
            } else if w.rate > 0.0 && z < lowest - TARGET_TOLERANCE {
                let well_loss = loss.max(0.0);
                problems.push(match w.kind {
                    WellKind::DeepWell => WellProblem::BelowPumpIntake {
                        level: z,
                        well_loss,
                        lowest,
                    },
                    WellKind::Wellpoint => WellProblem::BelowSuctionLimit {
                        level: z,
                        well_loss,
                        limit: lowest,
                        header: model.as_built.header_level,
                        suction_limit: spec.suction_limit,
                    },
                });
            }
            let (highest, injection_cap) = if w.rate < 0.0 {
                let wet = lv != Level::Dry;
                let (top, inj) = recharge_limits(model, aq, w, wet, z, &mut problems);
                (Some(top), Some(inj))
            } else {
                (None, None)
            };
            if w.rate > cap * (1.0 + 1e-9) {
                problems.push(WellProblem::OverCapacity {
                    rate: w.rate,
                    capacity: cap,
                    by_pump: cap < sichardt,
                });
            }
            let wet = |v: f64| match lv {
                Level::Wet(_) => Some(v),
                Level::Dry => None,
            };
            WellResult {
                name: w.name.clone(),
                position: w.position,
                rate_m3_per_s: w.rate,
                level_m: wet(z),
                aquifer_level_m: wet(face),
                well_loss_m: loss,
                drawdown_m: aq.initial_level - z,
                lowest_allowed_level_m: lowest,
                sichardt_capacity_m3_per_s: sichardt,
                capacity_m3_per_s: cap,
                highest_allowed_level_m: highest,
                injection_capacity_m3_per_s: injection_cap,
                problems,
            }
        })
        .collect();
    let abstraction: f64 = rates.iter().filter(|q| **q > 0.0).sum();
    let recharge: f64 = -rates.iter().filter(|q| **q < 0.0).sum::<f64>();
    let worst_point = point_results
        .iter()
        .enumerate()
        .filter_map(|(i, p)| p.margin_m.map(|m| (i, m)))
        .min_by(|a, b| a.1.total_cmp(&b.1))
        .map(|(i, _)| i);
    let unmet_count = point_results
        .iter()
        .filter(|p| p.met == Some(false))
        .count();
    let wells_ok = well_results.iter().all(|w| w.problems.is_empty());
    Evaluation {
        radius_of_influence_m: field.radius_of_influence(),
        radius_of_influence_basis: String::new(),
        wells: well_results,
        points: point_results,
        total_abstraction_m3_per_s: abstraction,
        total_recharge_m3_per_s: recharge,
        net_flow_m3_per_s: abstraction - recharge,
        design_flow_m3_per_s: abstraction * (1.0 + model.contingency),
        worst_point,
        unmet_count,
        targets_met: unmet_count == 0,
        wells_ok,
    }
}

/// A recharge well's highest allowed level (m) and injection capacity (m³/s, a fraction of its
/// abstraction capacity with the full screen wetted), with the problems of level `z` (when
/// `wet`) and rate against them pushed to `problems`.
fn recharge_limits(
    model: &Model,
    aq: &crate::physics::potential::Aquifer,
    w: &Well,
    wet: bool,
    z: f64,
    problems: &mut Vec<WellProblem>,
) -> (f64, f64) {
    let spec = &model.wells;
    let full_wetted = (w.filter_top.min(aq.initial_level) - w.filter_base).max(0.0);
    let full = sichardt_well_capacity(w.radius, full_wetted, aq.conductivity);
    let full = spec.pump_capacity.map_or(full, |p| p.min(full));
    let inj = model.as_built.injection_fraction * full;
    let top = model.as_built.max_injection_level;
    if wet && z > top + TARGET_TOLERANCE {
        problems.push(WellProblem::AboveHighestRechargeLevel {
            level: z,
            highest: top,
            basis: model.as_built.injection_basis.clone(),
        });
    }
    if -w.rate > inj * (1.0 + 1e-9) {
        problems.push(WellProblem::OverInjectionCapacity {
            rate: -w.rate,
            capacity: inj,
            fraction: model.as_built.injection_fraction,
            abstraction_capacity: full,
            default_fraction: (model.as_built.injection_fraction
                - crate::input::model::DEFAULT_INJECTION_FRACTION)
                .abs()
                < 1e-12,
        });
    }
    (top, inj)
}

/// The lowest level a pumped well may hold, m: its pump intake + submergence; for a wellpoint
/// also no lower than suction can lift from its header ([`AsBuilt::suction_floor`]). One rule
/// for `check` and the uncertainty samples.
///
/// [`AsBuilt::suction_floor`]: crate::input::model::AsBuilt::suction_floor
pub fn lowest_pumping_level(model: &Model, w: &Well) -> f64 {
    let spec = &model.wells;
    match w.kind {
        WellKind::DeepWell => w.pump_intake + spec.submergence,
        WellKind::Wellpoint => model
            .as_built
            .suction_floor(spec.suction_limit)
            .max(w.pump_intake + spec.submergence),
    }
}
