//! Sizing recharge (injection) wells so a neighbour keeps within its limit while the excavation
//! still meets its target.
//!
//! Superposition is linear in the discharge potential, so with the abstraction wells held at their
//! rates the change ΔΦ at any point is linear in the recharge rates q_j (negative numbers):
//! ΔΦ(p) = ΔΦ_abstraction(p) + Σ_j a_pj·q_j with a_pj from [`Field::unit_row`]. A linear
//! programme ([`crate::optimise::lp`]) then minimises the total recharge Σ(−q_j) subject to
//! - at every sample point of every protected neighbour: level ≥ h₀ − s_allow, i.e.
//!   ΔΦ ≥ Φ(h₀ − s_allow) − Φ₀, with s_allow the smaller of its allowable drawdown and the uniform
//!   drawdown that settles it by its settlement limit ([`crate::safety::neighbours`]);
//! - at every excavation check point with a target: level ≤ target, ΔΦ ≤ Φ(target) − Φ₀;
//! - at the same sample points: level ≤ h₀ + the allowable rise (the neighbour's, or the rule of
//!   thumb of [`crate::safety::neighbours::RULE_OF_THUMB_RISE`]);
//! - in every recharge well: level ≤ its highest allowed level (`wells.max_injection_level`, or
//!   ground − `wells.injection_margin`; with Jacob's well loss, less C·q² at the largest rate);
//! - −capacity_j ≤ q_j ≤ 0, the capacity being the smaller of the listed (negative) rate and the
//!   injection capacity (`wells.injection_fraction` of the well's abstraction capacity; default
//!   a half, common practice (no source)).
//!
//! The abstraction is first held at its listed rates. When no recharge rates work that way, the
//! abstraction rates join the programme too (0 … capacity, each well's level kept above its pump
//! intake + submergence and high enough that Sichardt's entrance gradient still passes its
//! capacity) and the gross flow, abstraction + recharge, is minimised; the record says which was
//! done. Which neighbours are held: those marked `protect_with_recharge = true`, or all of them
//! when none is marked. The net flow (abstraction − recharge) is what the discharge must take;
//! recharge water must come from somewhere (often the abstraction itself).

use crate::check::run::{evaluate_placement, field_for, CheckRun};
use crate::field::checkpoints::check_points;
use crate::field::influence::Field;
use crate::field::layout::{self, Placement};
use crate::field::layout_notes::LayoutNote;
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::optimise::binding::Binding;
use crate::optimise::lp;
use crate::optimise::lp_problem::{Constraint, LpStatus, RateProblem, Sense};
use crate::optimise::recharge_notes::RechargeNote;
use crate::safety::neighbours::{drawdown_limit_for_recharge, sample_points};
use serde::Serialize;
use std::path::Path;

/// Water level kept below ground in a recharge well, m, before the limit became a design-file
/// setting (`wells.injection_margin`, default [`crate::input::model::DEFAULT_INJECTION_MARGIN`]).
pub const FREEBOARD: f64 = 0.5;
/// Margin the programme keeps inside every level limit, m, so the solver's round-off never puts
/// a binding point on the wrong side.
pub const LP_MARGIN: f64 = 1e-4;

/// A sized recharge well.
#[derive(Debug, Clone, Serialize)]
pub struct RechargeWell {
    /// Name.
    pub name: String,
    /// Position, m.
    pub position: [f64; 2],
    /// Largest injection rate (the listed rate, as a positive number), m³/s.
    pub capacity_m3_per_s: f64,
    /// Sized injection rate (positive number), m³/s.
    pub rate_m3_per_s: f64,
}

/// A neighbour the sizing protects.
#[derive(Debug, Clone, Serialize)]
pub struct Protected {
    /// Name.
    pub name: String,
    /// Drawdown allowed everywhere under it, m.
    pub drawdown_limit_m: f64,
    /// Where that limit comes from.
    pub basis: crate::safety::limit_check::RechargeLimitBasis,
    /// Largest drawdown under it with no recharge, m.
    pub drawdown_without_recharge_m: f64,
}

/// The outcome of sizing.
#[derive(Debug, Clone, Serialize)]
pub struct RechargeSizing {
    /// "optimal", "infeasible", "unbounded" or the solver's message.
    pub status: String,
    /// A set of rates was found.
    pub feasible: bool,
    /// The recharge wells and their rates (the listed capacities when not feasible).
    pub wells: Vec<RechargeWell>,
    /// Neighbours held to a drawdown limit.
    pub protected: Vec<Protected>,
    /// Total abstraction, m³/s.
    pub abstraction_m3_per_s: f64,
    /// Total recharge, m³/s.
    pub recharge_m3_per_s: f64,
    /// Net flow, abstraction − recharge, m³/s.
    pub net_flow_m3_per_s: f64,
    /// Constraints active at the optimum (SI numbers), worded where shown with
    /// [`Binding::words`] in the run's units.
    pub binding: Vec<Binding>,
    /// What an engineer should know (SI numbers), worded where shown with
    /// [`RechargeNote::words`] in the run's units.
    pub notes: Vec<RechargeNote>,
}

/// How the abstraction wells enter the programme.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Mode {
    /// Abstraction held at its rates; recharge only.
    FixedAbstraction,
    /// Abstraction also free between 0 and its capacity; minimise abstraction + recharge.
    Joint,
}

/// The programme over every well's rate, with the sample data behind it.
struct Problem {
    rate_problem: RateProblem,
    /// What each row of the programme stands for.
    rows: Vec<Binding>,
    protected: Vec<Protected>,
    unmet_without_recharge: usize,
}

/// Largest rate an abstraction well may take in the joint programme, m³/s, and the lowest level
/// the well may be drawn to, m. The rate is the pump capacity when given, capped by Sichardt's
/// capacity on the screen wetted up to the initial level; the level is the pump intake +
/// submergence, raised where needed so the screen left wet still passes that rate by Sichardt's
/// entrance gradient (a linear stand-in for the capacity that falls as the well is drawn down).
fn abstraction_limits(model: &Model, w: &crate::field::wells::Well) -> (f64, f64) {
    let k = model.aquifer.conductivity;
    let full = (w.screen_top.min(model.aquifer.initial_level) - w.screen_base).max(0.0);
    let sichardt = crate::physics::capacity::sichardt_well_capacity(w.radius, full, k);
    let cap = model
        .wells
        .pump_capacity
        .map_or(sichardt, |p| p.min(sichardt))
        .max(w.rate);
    let per_metre = crate::physics::capacity::sichardt_well_capacity(w.radius, 1.0, k);
    let wetted_needed = if per_metre > 0.0 {
        cap / per_metre
    } else {
        0.0
    };
    let lowest = (w.pump_intake + model.wells.submergence).max(w.screen_base + wetted_needed);
    (cap, lowest)
}

/// Injection capacity of a recharge well, m³/s: `wells.injection_fraction` of its abstraction
/// capacity (Sichardt on the screen wetted to the initial level, or the pump), the same rule as
/// [`crate::check::evaluate::evaluate`].
fn injection_capacity(model: &Model, w: &crate::field::wells::Well) -> f64 {
    let aq = &model.aquifer;
    let wetted = (w.screen_top.min(aq.initial_level) - w.screen_base).max(0.0);
    let full = crate::physics::capacity::sichardt_well_capacity(w.radius, wetted, aq.conductivity);
    let full = model.wells.pump_capacity.map_or(full, |p| p.min(full));
    model.as_built.injection_fraction * full
}

/// The neighbours the sizing holds: those marked `protect_with_recharge`, or every one when
/// none is marked.
fn protected_neighbours(model: &Model) -> Vec<&crate::input::model::Neighbour> {
    let marked: Vec<_> = model
        .neighbours
        .iter()
        .filter(|n| n.protect_with_recharge)
        .collect();
    if marked.is_empty() {
        model.neighbours.iter().collect()
    } else {
        marked
    }
}

fn build(model: &Model, field: &Field, placement: &Placement, mode: Mode) -> Problem {
    let aq = field.aquifer();
    let phi0 = aq.initial_potential();
    let wells = &placement.wells;
    let abstraction_now: Vec<f64> = wells.iter().map(|w| w.rate.max(0.0)).collect();
    let mut constraints = Vec::new();
    let mut rows = Vec::new();
    let mut unmet = 0;
    for p in check_points(model) {
        let Some(t) = p.target_level else { continue };
        if p.excavation.is_none() {
            continue;
        }
        // at the point's own elevation (partial penetration depends on it)
        let tables = field.elevation(crate::check::field_build::point_elevation(model, &p));
        let row = field.unit_row_at(p.position, tables.as_ref());
        let without: f64 = row.iter().zip(&abstraction_now).map(|(a, q)| a * q).sum();
        let rhs = aq.potential(t - LP_MARGIN) - phi0;
        if without > rhs + 1e-12 {
            unmet += 1;
        }
        let b = Binding::RechargeTarget {
            point: p.name.clone(),
        };
        constraints.push(Constraint {
            coefficients: row,
            sense: Sense::AtMost,
            rhs,
            label: b.to_string(),
        });
        rows.push(b);
    }
    let mut protected = Vec::new();
    for n in protected_neighbours(model) {
        let Some((limit, basis)) = drawdown_limit_for_recharge(model, n) else {
            continue;
        };
        let level = aq.initial_level - limit + LP_MARGIN;
        let mut worst: f64 = 0.0;
        for (name, _, pos) in sample_points(&n.footprint) {
            let row = field.unit_row(pos);
            let without: f64 = row.iter().zip(&abstraction_now).map(|(a, q)| a * q).sum();
            let z = aq.level(phi0 + without).or_base(aq.base_level);
            worst = worst.max(aq.initial_level - z);
            let b = Binding::NeighbourDrawdown {
                neighbour: n.name.clone(),
                sample: name.to_string(),
                limit_m: limit,
            };
            constraints.push(Constraint {
                coefficients: row.clone(),
                sense: Sense::AtLeast,
                rhs: aq.potential(level) - phi0,
                label: b.to_string(),
            });
            rows.push(b);
            let rise = n
                .allowable_rise
                .unwrap_or(crate::safety::neighbours::RULE_OF_THUMB_RISE);
            let b = Binding::NeighbourRise {
                neighbour: n.name.clone(),
                sample: name.to_string(),
                rise_m: rise,
            };
            constraints.push(Constraint {
                coefficients: row,
                sense: Sense::AtMost,
                rhs: aq.potential(aq.initial_level + rise - LP_MARGIN) - phi0,
                label: b.to_string(),
            });
            rows.push(b);
        }
        protected.push(Protected {
            name: n.name.clone(),
            drawdown_limit_m: limit,
            basis,
            drawdown_without_recharge_m: worst,
        });
    }
    for (k, w) in wells.iter().enumerate() {
        let row = field.unit_row(w.position);
        if w.rate < 0.0 {
            let q_max = injection_capacity(model, w);
            let loss = match model.as_built.loss {
                crate::input::model::WellLossSpec::Jacob(c) => {
                    crate::physics::well_loss::jacob_loss(c, q_max)
                }
                // (1/E − 1) × the well's own rise at its largest injection
                crate::input::model::WellLossSpec::Efficiency(e) => {
                    crate::physics::well_loss::efficiency_loss_of_rate(aq, e, row[k], -q_max)
                }
                _ => 0.0,
            };
            let cap_level = model.as_built.max_injection_level - loss - LP_MARGIN;
            let b = Binding::RechargeWellLevel {
                well: w.name.clone(),
                level_m: model.as_built.max_injection_level,
                basis: model.as_built.injection_basis.clone(),
            };
            constraints.push(Constraint {
                coefficients: row,
                sense: Sense::AtMost,
                rhs: aq.potential(cap_level) - phi0,
                label: b.to_string(),
            });
            rows.push(b);
        } else if mode == Mode::Joint {
            let (_, lowest) = abstraction_limits(model, w);
            let b = Binding::WellLowestLevel {
                well: w.name.clone(),
                level_m: lowest,
            };
            constraints.push(Constraint {
                coefficients: row,
                sense: Sense::AtLeast,
                rhs: aq.potential(lowest) - phi0,
                label: b.to_string(),
            });
            rows.push(b);
        }
    }
    let bounds = wells
        .iter()
        .map(|w| match (w.rate < 0.0, mode) {
            (true, _) => (w.rate.max(-injection_capacity(model, w)), 0.0),
            (false, Mode::FixedAbstraction) => (w.rate, w.rate),
            (false, Mode::Joint) => (0.0, abstraction_limits(model, w).0),
        })
        .collect();
    let costs = wells
        .iter()
        .map(|w| match (w.rate < 0.0, mode) {
            (true, _) => -1.0,
            (false, Mode::FixedAbstraction) => 0.0,
            (false, Mode::Joint) => 1.0,
        })
        .collect();
    Problem {
        rate_problem: RateProblem {
            costs,
            bounds,
            constraints,
        },
        rows,
        protected,
        unmet_without_recharge: unmet,
    }
}

fn status_word(status: &LpStatus) -> String {
    match status {
        LpStatus::Optimal => "optimal".to_string(),
        LpStatus::Infeasible => "infeasible".to_string(),
        LpStatus::Unbounded => "unbounded".to_string(),
        LpStatus::Failed(m) => format!("failed: {m}"),
    }
}

/// Size the recharge wells of `placement` (those with a negative rate; the listed rate is each
/// one's capacity) with the abstraction held at its rates. When no recharge rates work that way,
/// the abstraction rates are freed too (0 … capacity, level in each well above its pump intake)
/// and abstraction + recharge is minimised; the record says which was done. Returns the placement
/// with the sized rates (unchanged when nothing works) and the sizing record. Bad input (no
/// recharge wells) is an error naming the field.
pub fn size(
    model: &Model,
    placement: Placement,
) -> Result<(Placement, RechargeSizing), InputError> {
    let recharge: Vec<usize> = placement
        .wells
        .iter()
        .enumerate()
        .filter(|(_, w)| w.rate < 0.0)
        .map(|(i, _)| i)
        .collect();
    if recharge.is_empty() {
        return Err(InputError {
            file: model.file.clone(),
            field: "well".into(),
            line: None,
            message: "sizing recharge needs recharge wells: list [[well]] entries with a negative rate (its largest injection rate, e.g. rate = \"-4 L/s\") in a layout of kind \"listed\" or a wells CSV".into(),
        });
    }
    let field = field_for(model, &placement.wells);
    let mut notes: Vec<RechargeNote> = Vec::new();
    let fixed = build(model, &field, &placement, Mode::FixedAbstraction);
    if fixed.protected.is_empty() {
        notes.push(RechargeNote::Said("no neighbour has a drawdown or settlement limit to protect (give allowable_drawdown or a soil profile): recharge sized to zero".into()));
    }
    let mut sol = lp::solve(&fixed.rate_problem);
    let mut problem = fixed;
    let mut status = status_word(&sol.status);
    if sol.status != LpStatus::Optimal {
        if problem.unmet_without_recharge > 0 {
            notes.push(RechargeNote::Said(format!(
                "with the listed abstraction, {} excavation check points are above their target even before recharge; recharge only raises levels",
                problem.unmet_without_recharge
            )));
        }
        let joint = build(model, &field, &placement, Mode::Joint);
        let joint_sol = lp::solve(&joint.rate_problem);
        if joint_sol.status == LpStatus::Optimal {
            notes.push(RechargeNote::Said(format!("with the abstraction held at its listed rates the sizing is {status}; the abstraction rates were sized too (0 … capacity, minimising abstraction + recharge), see wells.csv")));
            status = "optimal (abstraction re-sized)".into();
            sol = joint_sol;
            problem = joint;
        } else {
            notes.push(RechargeNote::Said(format!(
                "held abstraction: {status}; abstraction sized too: {}",
                status_word(&joint_sol.status)
            )));
            notes.push(RechargeNote::Said("no rates keep every protected neighbour within its limit while the excavation meets its target, the recharge wells stay below ground and the pumped wells above their intakes; the recharge wells are evaluated at their listed (largest) rates — add recharge wells, move them, protect fewer buildings (protect_with_recharge), or cut the excavation off".into()));
        }
    }
    let feasible = sol.status == LpStatus::Optimal;
    let mut placement = placement;
    if feasible {
        for (w, q) in placement.wells.iter_mut().zip(&sol.values) {
            w.rate = if w.rate < 0.0 { q.min(0.0) } else { q.max(0.0) };
        }
    }
    notes.push(RechargeNote::Bounds {
        injection_fraction: model.as_built.injection_fraction,
        default_fraction: (model.as_built.injection_fraction
            - crate::input::model::DEFAULT_INJECTION_FRACTION)
            .abs()
            < 1e-12,
        max_level_m: model.as_built.max_injection_level,
        basis: model.as_built.injection_basis.clone(),
        default_rise_m: crate::safety::neighbours::RULE_OF_THUMB_RISE,
    });
    for j in &recharge {
        let w = &placement.wells[*j];
        let inj = injection_capacity(model, w);
        if -w.rate > inj * (1.0 + 1e-9) && !feasible {
            notes.push(RechargeNote::OverCapacity {
                well: w.name.clone(),
                rate_m3_per_s: -w.rate,
                capacity_m3_per_s: inj,
            });
        }
    }
    placement.notes.push(LayoutNote::Said(if feasible {
        "rates sized by the recharge linear programme (drydig check --size-recharge)".into()
    } else {
        format!("recharge sizing {status}: recharge wells at their listed rates")
    }));
    let wells: Vec<RechargeWell> = recharge
        .iter()
        .map(|j| {
            let w = &placement.wells[*j];
            RechargeWell {
                name: w.name.clone(),
                position: w.position,
                capacity_m3_per_s: -problem.rate_problem.bounds[*j].0,
                rate_m3_per_s: -w.rate,
            }
        })
        .collect();
    let abstraction: f64 = placement
        .wells
        .iter()
        .filter(|w| w.rate > 0.0)
        .map(|w| w.rate)
        .sum();
    let recharge_total: f64 = wells.iter().map(|w| w.rate_m3_per_s).sum();
    let binding = sol
        .binding
        .iter()
        .filter_map(|i| problem.rows.get(*i))
        .cloned()
        .collect();
    Ok((
        placement,
        RechargeSizing {
            status,
            feasible,
            wells,
            protected: problem.protected,
            abstraction_m3_per_s: abstraction,
            recharge_m3_per_s: recharge_total,
            net_flow_m3_per_s: abstraction - recharge_total,
            binding,
            notes,
        },
    ))
}

/// `check --size-recharge`: place the wells, size the recharge, evaluate.
pub fn run_sized<'a>(
    model: &'a Model,
    wells_csv: Option<&Path>,
) -> Result<(CheckRun<'a>, RechargeSizing), InputError> {
    let placement = layout::from_model(model, wells_csv)?;
    let (placement, sizing) = size(model, placement)?;
    let run = evaluate_placement(model, placement);
    Ok((run, sizing))
}
