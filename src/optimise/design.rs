//! The optimiser: how many wells, pumping how much, so that every check point is at or below its
//! target without asking any well for more than it can give.
//!
//! # Rates for a given layout
//! Superposition is linear in Strack's discharge potential Φ (see [`crate::field::influence`]): the
//! potential at check point i is Φᵢ = Φ₀ + Σⱼ uᵢⱼ·qⱼ, with uᵢⱼ the change per unit rate of well j
//! (negative for pumping). A target level zₜ holds when Φᵢ ≤ Φ(zₜ) — exact, because Φ rises with
//! the level. Two rate options:
//! - **uniform** (one pump size on site): the smallest q with Φ₀ + q·Σⱼuᵢⱼ ≤ Φ(zₜ) at every point,
//!   which is a ratio per point; then the limits are checked at that rate;
//! - **individual**: a linear programme ([`crate::optimise::lp`]) minimising Σqⱼ subject to the targets
//!   at every check point and the limits at every well.
//!
//! # Well limits
//! - Level in the well (pump intake + submergence; for wellpoints also ground − suction limit):
//!   Φₖ ≥ Φ(lowest level), linear in the rates and exact.
//! - Capacity: the rate is at most the pump's capacity and Sichardt's capacity
//!   α·h_w (α = 2π·r_w·√K/15, h_w the wetted screen, which depends on the well's own level).
//!   h_w = min(screen top, z) − screen base is a concave function of the level, and the level is
//!   a concave function of Φ, so h_w(Φ) is concave in Φ. Its piecewise-linear interpolation
//!   through a few levels between the lowest allowed level and the initial level lies below it,
//!   and equals it at the breakpoints. The linear programme uses those chords
//!   (qₖ ≤ α·chord(Φₖ), one constraint per piece): a safe bound, never allowing more than the
//!   true capacity, and much less pessimistic than the capacity at the lowest allowed level.
//!   The uniform option uses the exact capacity (a monotone equation in q, solved by bisection).
//!
//! Every answer is re-evaluated by [`crate::check::evaluate::evaluate`] with the final rates and heads;
//! only a layout that passes there counts as meeting its targets.
//!
//! # Size of the linear programme
//! A layout has hundreds of check points but only a few bind. The programme starts with the
//! points that need the most from a uniform rate (and, for each well, the neediest point it
//! serves most), solves, checks every point and well against the full unit matrix, adds the most
//! violated rows (a bounded number per round) and solves again, until nothing is violated. The
//! answer is the optimum of the full programme (a relaxation whose optimum is feasible for the
//! whole). Above [`MAX_LP_VARIABLES`] wells, neighbouring wells share a rate (see
//! [`LayoutRates`]).
//!
//! # Count search
//! For a ring (by count) or a trench line (by wells per side, i.e. spacing), the smallest count
//! that meets every target within the limits: counts are tried at the smallest, then 1, 3, 7,
//! 15 … above it, then bisected between the last failure and the first success, so the count
//! found has been tried and the one below it has been tried and failed. The search for
//! individual rates solves a programme per count; the search for one rate needs none. Outcomes
//! are data: met, not met (best layout, worst point, shortfall) or impossible (and why).

use crate::check::evaluate::{evaluate, Evaluation};
use crate::estimate::{self, ExcavationEstimate};
use crate::field::checkpoints::{check_points, CheckPoint};
use crate::field::influence::Field;
use crate::field::layout::{self, Placement};
use crate::field::radius::design_radius;
use crate::field::wells::Well;
use crate::input::error::InputError;
use crate::input::model::{LayoutKind, LayoutSpec, Model, RingCount, WellKind};
use crate::optimise::lp::{self, Constraint, LpStatus, RateProblem, Sense};
use crate::physics::capacity::sichardt_well_capacity;
use rayon::prelude::*;
use serde::Serialize;
use std::collections::BTreeMap;
use std::sync::OnceLock;

/// Allowance below the screen base for the sump and the drill bit, m, added to every well's
/// drilled depth in the bid quantities (common practice (no source)).
pub const SUMP_ALLOWANCE: f64 = 1.0;
/// Closest spacing the count search goes to for deep wells, m (common practice (no source):
/// rigs and pipework need a few metres).
pub const MIN_SPACING_DEEP_WELL: f64 = 3.0;
/// Closest spacing the count search goes to for wellpoints, m (common practice (no source):
/// wellpoints are jetted at 0.5–3 m).
pub const MIN_SPACING_WELLPOINT: f64 = 0.5;
/// Most wells the count search places, to bound the work.
pub const MAX_WELLS: usize = 2000;
/// Capacities used in the programme are this fraction of the true value, so that solver
/// round-off never lets a rate exceed the capacity the evaluation checks.
const CAPACITY_SAFETY: f64 = 1.0 - 1e-6;
/// Pieces of the chord approximation of Sichardt's capacity between the lowest allowed level
/// and the initial level (plus a breakpoint at the screen top).
const CAPACITY_PIECES: usize = 8;
/// A pumping well's level is kept at least this far above the aquifer base, m, so that it never
/// reads as pumped dry.
const DRY_GUARD: f64 = 0.01;
/// Most rate variables in one linear programme; above it neighbouring wells share a rate.
pub const MAX_LP_VARIABLES: usize = 120;
/// Most rounds of adding violated constraints before the full programme is used.
const MAX_ROUNDS: usize = 40;
/// Relative tolerance on a violated constraint when adding rows, on the potential scale.
const ROW_TOLERANCE: f64 = 1e-9;

/// How the rates are chosen.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RateOption {
    /// The same rate in every well (one pump size on site).
    Uniform,
    /// A rate per well, minimising the total flow (linear programme).
    Individual,
}

impl RateOption {
    /// Name for reports.
    pub fn describe(self) -> &'static str {
        match self {
            RateOption::Uniform => "same rate in every well",
            RateOption::Individual => "individual rates (least total flow)",
        }
    }
}

/// What sets the lowest level allowed in a well.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum FloorKind {
    /// Pump intake plus submergence.
    PumpIntake,
    /// Wellpoint suction limit below ground.
    Suction,
    /// The screen base: below it the screen is dry and gives nothing.
    ScreenBase,
    /// Just above the aquifer base.
    AquiferBase,
}

impl FloorKind {
    fn describe(self) -> &'static str {
        match self {
            FloorKind::PumpIntake => "pump intake + submergence",
            FloorKind::Suction => "suction limit below ground",
            FloorKind::ScreenBase => "screen base",
            FloorKind::AquiferBase => "aquifer base",
        }
    }
}

/// The limits of one well, ready for the programme.
#[derive(Debug, Clone)]
pub struct WellLimit {
    /// Lowest level allowed, m, as [`crate::check::evaluate::evaluate`] checks it.
    pub lowest_level: f64,
    /// Level the programme holds the well at or above, m: the lowest allowed, the screen base
    /// or just above the aquifer base, whichever is highest.
    pub floor_level: f64,
    /// What sets the floor.
    pub floor_kind: FloorKind,
    /// Φ at the floor.
    pub floor_potential: f64,
    /// Sichardt capacity per metre of wetted screen, α = 2π·r_w·√K/15, m³/s per m.
    pub capacity_per_metre: f64,
    /// Pump capacity, m³/s.
    pub pump: Option<f64>,
    screen_top: f64,
    screen_base: f64,
    /// Chord pieces of h_w(Φ): (Φ_a, h_w at Φ_a, slope dh_w/dΦ).
    pieces: Vec<(f64, f64, f64)>,
}

impl WellLimit {
    fn new(model: &Model, well: &Well) -> WellLimit {
        let aq = &model.aquifer;
        let spec = &model.wells;
        // The same rule as evaluate().
        let intake = well.pump_intake + spec.submergence;
        let (lowest, mut kind) = match well.kind {
            WellKind::DeepWell => (intake, FloorKind::PumpIntake),
            WellKind::Wellpoint => {
                let suction = model.ground_level - spec.suction_limit;
                if suction >= intake {
                    (suction, FloorKind::Suction)
                } else {
                    (intake, FloorKind::PumpIntake)
                }
            }
        };
        let mut floor = lowest;
        if well.screen_base > floor {
            floor = well.screen_base;
            kind = FloorKind::ScreenBase;
        }
        if aq.base_level + DRY_GUARD > floor {
            floor = aq.base_level + DRY_GUARD;
            kind = FloorKind::AquiferBase;
        }
        let mut limit = WellLimit {
            lowest_level: lowest,
            floor_level: floor,
            floor_kind: kind,
            floor_potential: aq.potential(floor),
            capacity_per_metre: sichardt_well_capacity(well.radius, 1.0, aq.conductivity),
            pump: spec.pump_capacity,
            screen_top: well.screen_top,
            screen_base: well.screen_base,
            pieces: Vec::new(),
        };
        let top = aq.initial_level;
        if top > floor {
            let mut levels: Vec<f64> = (0..=CAPACITY_PIECES)
                .map(|i| floor + (top - floor) * i as f64 / CAPACITY_PIECES as f64)
                .collect();
            if well.screen_top > floor && well.screen_top < top {
                levels.push(well.screen_top);
            }
            levels.sort_by(f64::total_cmp);
            levels.dedup_by(|a, b| (*a - *b).abs() < 1e-9);
            for w in levels.windows(2) {
                let (pa, pb) = (aq.potential(w[0]), aq.potential(w[1]));
                if pb > pa {
                    let (ha, hb) = (limit.wetted(w[0]), limit.wetted(w[1]));
                    limit.pieces.push((pa, ha, (hb - ha) / (pb - pa)));
                }
            }
        }
        limit
    }

    /// Wetted screen length at level `z`, m.
    pub fn wetted(&self, z: f64) -> f64 {
        (self.screen_top.min(z) - self.screen_base).max(0.0)
    }

    /// True capacity at level `z`: the lower of Sichardt's and the pump's, m³/s.
    pub fn capacity_at(&self, z: f64) -> f64 {
        let s = self.capacity_per_metre * self.wetted(z);
        self.pump.map_or(s, |p| p.min(s))
    }

    /// The safe (chord) Sichardt capacity at potential `phi`, m³/s.
    fn chord_capacity(&self, phi: f64) -> (f64, usize) {
        self.pieces
            .iter()
            .enumerate()
            .map(|(s, (pa, ha, slope))| (self.capacity_per_metre * (ha + slope * (phi - pa)), s))
            .min_by(|a, b| a.0.total_cmp(&b.0))
            .unwrap_or((0.0, 0))
    }
}

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
    pub limit_reason: String,
    /// Lowest margin below target with every well at the limit rate, m (negative: short).
    pub margin_at_limit_m: f64,
    /// Where that margin is (index into the check points).
    pub worst_at_limit: Option<usize>,
    /// The needed rate is within the limits and the evaluation confirms every target and limit.
    pub met: bool,
}

/// The individual-rate answer for one layout.
#[derive(Debug, Clone)]
pub struct Individual {
    /// How the programme ended.
    pub status: LpStatus,
    /// Rates, m³/s (empty unless solved).
    pub rates: Vec<f64>,
    /// Σ rates, m³/s.
    pub total: f64,
    /// Constraints that bind at the optimum, in words.
    pub binding: Vec<String>,
    /// Solved, and the evaluation confirms every target and limit.
    pub met: bool,
    /// Rounds of adding violated constraints.
    pub rounds: usize,
    /// Rate variables in the programme (the number of pumping wells unless neighbouring wells
    /// share a rate).
    pub groups: usize,
}

/// Which constraint a programme row stands for.
#[derive(Debug, Clone, Copy)]
enum RowRef {
    Target(usize),
    Level(usize),
    Capacity(usize, usize),
}

/// What the programme minimises.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Goal {
    /// Total flow, within every limit.
    MinFlow,
    /// The largest shortfall (in Φ) over the targets, within every limit.
    MinShortfall,
    /// Total flow with no well limits at all (a lower bound on the flow a layout needs).
    TargetsOnly,
}

/// One layout with its unit matrix, ready for both rate options.
///
/// Above [`MAX_LP_VARIABLES`] wells, neighbouring wells along the ring or line share one rate
/// in the linear programme (groups of consecutive wells, never across a gap): closely spaced
/// wellpoints have nearly equal columns, which both slows the simplex and makes it singular.
/// The grouped answer is feasible for every well (every well's own limits are constraints) and
/// is evaluated in full; its total can only be at or a little above the ungrouped optimum.
pub struct LayoutRates<'a> {
    model: &'a Model,
    points: &'a [CheckPoint],
    /// The wells (rates ignored).
    pub wells: Vec<Well>,
    /// The field they make.
    pub field: Field,
    /// Indices of the check points that carry a target.
    targets: Vec<usize>,
    /// Φ at each target level (parallel to `targets`).
    target_phi: Vec<f64>,
    /// Unit rows per rate group at the target points and at the wells, built when the linear
    /// programme first needs them.
    matrices: OnceLock<Matrices>,
    /// Positions of the target points.
    positions: Vec<[f64; 2]>,
    /// Positions of the wells.
    well_positions: Vec<[f64; 2]>,
    /// Row sums of the unit rows at the target points (ΔΦ per unit uniform rate).
    a_sum: Vec<f64>,
    /// Row sums of the unit rows at the wells.
    at_wells_sum: Vec<f64>,
    /// Wells of each rate group (indices into `wells`).
    groups: Vec<Vec<usize>>,
    /// Group of each well; `None` for a recharge well kept at its given (negative) rate.
    group_of: Vec<Option<usize>>,
    /// Limits per well.
    pub limits: Vec<WellLimit>,
    phi0: f64,
    /// Φ₀ plus the effect of the recharge wells at each target point.
    base_t: Vec<f64>,
    /// Φ₀ plus the effect of the recharge wells at each well.
    base_w: Vec<f64>,
}

fn dot(row: &[f64], x: &[f64]) -> f64 {
    row.iter().zip(x).map(|(a, b)| a * b).sum()
}

/// Unit rows folded by rate group.
struct Matrices {
    /// At the target points.
    a: Vec<Vec<f64>>,
    /// At the wells.
    at_wells: Vec<Vec<f64>>,
}

/// Groups of consecutive wells (indices `free` into `wells`) sharing one rate, at most `max`
/// groups, never across a gap (a step more than three times the median step between
/// consecutive wells).
fn rate_groups(wells: &[Well], free: &[usize], max: usize) -> Vec<Vec<usize>> {
    let n = free.len();
    if n <= max {
        return free.iter().map(|&k| vec![k]).collect();
    }
    let step = |i: usize| {
        let (a, b) = (wells[free[i]].position, wells[free[i + 1]].position);
        (b[0] - a[0]).hypot(b[1] - a[1])
    };
    let mut steps: Vec<f64> = (0..n - 1).map(step).collect();
    steps.sort_by(f64::total_cmp);
    let median = steps.get(steps.len() / 2).copied().unwrap_or(0.0);
    let mut runs: Vec<Vec<usize>> = vec![vec![free[0]]];
    for (i, &k) in free.iter().enumerate().skip(1) {
        if step(i - 1) > 3.0 * median {
            runs.push(Vec::new());
        }
        if let Some(r) = runs.last_mut() {
            r.push(k);
        }
    }
    let size = n.div_ceil(max.max(1)).max(1);
    runs.into_iter()
        .flat_map(|run| {
            let g = run.len().div_ceil(size).max(1);
            let per = run.len().div_ceil(g);
            run.chunks(per).map(<[usize]>::to_vec).collect::<Vec<_>>()
        })
        .collect()
}

impl<'a> LayoutRates<'a> {
    /// Build the field and the unit matrix of `wells` (their rates are ignored) at `points`.
    pub fn new(model: &'a Model, points: &'a [CheckPoint], wells: Vec<Well>) -> LayoutRates<'a> {
        Self::with_groups(model, points, wells, MAX_LP_VARIABLES)
    }

    /// As [`LayoutRates::new`], with at most `max_groups` rate variables in the programme.
    pub fn with_groups(
        model: &'a Model,
        points: &'a [CheckPoint],
        wells: Vec<Well>,
        max_groups: usize,
    ) -> LayoutRates<'a> {
        let field = crate::check::run::field_for(model, &wells);
        let aq = &model.aquifer;
        let targets: Vec<usize> = points
            .iter()
            .enumerate()
            .filter(|(_, p)| p.target_level.is_some())
            .map(|(i, _)| i)
            .collect();
        let target_phi = targets
            .iter()
            .map(|&i| aq.potential(points[i].target_level.unwrap_or(f64::NAN)))
            .collect();
        // A negative rate marks a recharge well: it keeps its rate; every other rate is found.
        let free: Vec<usize> = (0..wells.len()).filter(|&k| wells[k].rate >= 0.0).collect();
        let groups = rate_groups(&wells, &free, max_groups);
        let mut group_of = vec![None; wells.len()];
        for (g, members) in groups.iter().enumerate() {
            for &k in members {
                group_of[k] = Some(g);
            }
        }
        let phi0 = aq.initial_potential();
        // Row sums (ΔΦ per unit uniform rate) and the recharge wells' effect, without the
        // matrix: the uniform option needs nothing more.
        let free_ones: Vec<f64> = wells
            .iter()
            .map(|w| if w.rate >= 0.0 { 1.0 } else { 0.0 })
            .collect();
        let fixed: Vec<f64> = wells.iter().map(|w| w.rate.min(0.0)).collect();
        let any_fixed = fixed.iter().any(|q| *q < 0.0);
        let sums = |pts: &[[f64; 2]]| -> (Vec<f64>, Vec<f64>) {
            pts.par_iter()
                .map(|p| {
                    let base = if any_fixed {
                        field.delta_potential(*p, &fixed)
                    } else {
                        0.0
                    };
                    (field.delta_potential(*p, &free_ones), phi0 + base)
                })
                .unzip()
        };
        let positions: Vec<[f64; 2]> = targets.iter().map(|&i| points[i].position).collect();
        let (a_sum, base_t) = sums(&positions);
        let well_positions: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
        let (at_wells_sum, base_w) = sums(&well_positions);
        let limits = wells.iter().map(|w| WellLimit::new(model, w)).collect();
        LayoutRates {
            model,
            points,
            wells,
            field,
            targets,
            target_phi,
            matrices: OnceLock::new(),
            positions,
            well_positions,
            a_sum,
            at_wells_sum,
            groups,
            group_of,
            limits,
            phi0,
            base_t,
            base_w,
        }
    }

    /// The unit rows per rate group (ΔΦ per unit rate of each group), built once.
    fn matrices(&self) -> &Matrices {
        self.matrices.get_or_init(|| {
            let fold = |pts: &[[f64; 2]]| -> Vec<Vec<f64>> {
                pts.par_iter()
                    .map(|p| {
                        let r = self.field.unit_row(*p);
                        self.groups
                            .iter()
                            .map(|m| m.iter().map(|&k| r[k]).sum())
                            .collect()
                    })
                    .collect()
            };
            Matrices {
                a: fold(&self.positions),
                at_wells: fold(&self.well_positions),
            }
        })
    }

    /// Evaluate the layout at `rates` with the plain solver.
    pub fn evaluate(&self, rates: &[f64]) -> Evaluation {
        let wells = self.with_rates(rates);
        evaluate(self.model, &self.field, &wells, self.points)
    }

    /// The wells with `rates`.
    pub fn with_rates(&self, rates: &[f64]) -> Vec<Well> {
        self.wells
            .iter()
            .zip(rates)
            .map(|(w, q)| Well {
                rate: *q,
                ..w.clone()
            })
            .collect()
    }

    fn level_of(&self, phi: f64) -> f64 {
        let aq = &self.model.aquifer;
        aq.level(phi).or_base(aq.base_level)
    }

    /// The largest uniform rate within every well's limits, and what sets it.
    fn uniform_limit(&self) -> (f64, String) {
        let mut best = (f64::INFINITY, String::from("no limit"));
        for (k, lim) in self.limits.iter().enumerate() {
            if self.group_of[k].is_none() {
                continue;
            }
            let name = &self.wells[k].name;
            let phi_k = self.base_w[k];
            if let Some(p) = lim.pump {
                if p < best.0 {
                    best = (p, format!("pump capacity {:.2} L/s", p * 1e3));
                }
            }
            let s = self.at_wells_sum[k];
            if s >= 0.0 {
                continue;
            }
            let q_level = ((phi_k - lim.floor_potential) / -s).max(0.0);
            let cap =
                |q: f64| lim.capacity_per_metre * lim.wetted(self.level_of(phi_k + q * s)) - q;
            let (q_k, why) = if cap(q_level) >= 0.0 {
                (
                    q_level,
                    format!(
                        "level in {name} at {:.2} m ({})",
                        lim.floor_level,
                        lim.floor_kind.describe()
                    ),
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
                (
                    lo,
                    format!("Sichardt capacity of {name} on its wetted screen"),
                )
            };
            if q_k < best.0 {
                best = (q_k, why);
            }
        }
        if best.0.is_finite() {
            best
        } else {
            (0.0, "no wells".into())
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

    /// Rates per well from the programme's values per group (recharge wells keep theirs).
    fn well_rates(&self, values: &[f64]) -> Vec<f64> {
        self.group_of
            .iter()
            .zip(&self.wells)
            .map(|(g, w)| match g {
                Some(g) => values.get(*g).copied().unwrap_or(0.0).max(0.0),
                None => w.rate,
            })
            .collect()
    }

    /// Rate `q` in every pumping well (recharge wells keep theirs).
    pub fn uniform_rates(&self, q: f64) -> Vec<f64> {
        self.group_of
            .iter()
            .zip(&self.wells)
            .map(|(g, w)| if g.is_some() { q } else { w.rate })
            .collect()
    }

    /// Option (b): a rate per well, least total flow, by linear programme.
    ///
    /// If the solver fails numerically (not an infeasible answer: a fault), the programme is
    /// solved again with half as many rate groups: coarser, but still within every well's own
    /// limits and evaluated in full.
    pub fn individual(&self) -> Individual {
        let (sol, rows, rounds) = self.solve(Goal::MinFlow);
        if matches!(sol.status, LpStatus::Failed(_)) && self.groups.len() >= 16 {
            let coarser = LayoutRates::with_groups(
                self.model,
                self.points,
                self.wells.clone(),
                self.groups.len() / 2,
            );
            return coarser.individual();
        }
        if sol.status != LpStatus::Optimal {
            return Individual {
                status: sol.status,
                rates: Vec::new(),
                total: 0.0,
                binding: Vec::new(),
                met: false,
                rounds,
                groups: self.groups.len(),
            };
        }
        let rates = self.well_rates(&sol.values);
        let binding = self.binding_labels(&sol, &rows, &rates);
        let e = self.evaluate(&rates);
        Individual {
            status: LpStatus::Optimal,
            total: rates.iter().filter(|q| **q > 0.0).sum(),
            rates,
            binding,
            met: e.targets_met && e.wells_ok,
            rounds,
            groups: self.groups.len(),
        }
    }

    /// Rates within every limit that make the largest shortfall (in Φ) over the targets as
    /// small as it can be: the best this layout can do when it cannot meet every target.
    pub fn least_shortfall(&self) -> Option<Vec<f64>> {
        let (sol, _, _) = self.solve(Goal::MinShortfall);
        (sol.status == LpStatus::Optimal).then(|| self.well_rates(&sol.values))
    }

    /// Least total flow to meet the targets with no well limits at all, m³/s (a lower bound on
    /// what the layout needs).
    pub fn flow_without_limits(&self) -> Option<f64> {
        let (sol, _, _) = self.solve(Goal::TargetsOnly);
        (sol.status == LpStatus::Optimal).then(|| {
            self.well_rates(&sol.values)
                .iter()
                .filter(|q| **q > 0.0)
                .sum()
        })
    }

    fn row(&self, r: RowRef, goal: Goal) -> Constraint {
        let g = self.groups.len();
        let width = g + usize::from(goal == Goal::MinShortfall);
        let mut coefficients = vec![0.0; width];
        match r {
            RowRef::Target(t) => {
                for (c, u) in coefficients.iter_mut().zip(&self.matrices().a[t]) {
                    *c = -u;
                }
                if goal == Goal::MinShortfall {
                    coefficients[g] = 1.0;
                }
                Constraint {
                    coefficients,
                    sense: Sense::AtLeast,
                    rhs: self.base_t[t] - self.target_phi[t],
                    label: format!("target at {}", self.points[self.targets[t]].name),
                }
            }
            RowRef::Level(k) => {
                coefficients[..g].copy_from_slice(&self.matrices().at_wells[k]);
                let lim = &self.limits[k];
                Constraint {
                    coefficients,
                    sense: Sense::AtLeast,
                    rhs: lim.floor_potential - self.base_w[k],
                    label: format!(
                        "level in {} at {:.2} m ({})",
                        self.wells[k].name,
                        lim.floor_level,
                        lim.floor_kind.describe()
                    ),
                }
            }
            RowRef::Capacity(k, s) => {
                let lim = &self.limits[k];
                let (pa, ha, slope) = lim.pieces[s];
                let f = CAPACITY_SAFETY * lim.capacity_per_metre;
                for (c, u) in coefficients.iter_mut().zip(&self.matrices().at_wells[k]) {
                    *c = -f * slope * u;
                }
                if let Some(g) = self.group_of[k] {
                    coefficients[g] += 1.0;
                }
                Constraint {
                    coefficients,
                    sense: Sense::AtMost,
                    rhs: f * (ha + slope * (self.base_w[k] - pa)),
                    label: format!(
                        "Sichardt capacity of {} on its wetted screen",
                        self.wells[k].name
                    ),
                }
            }
        }
    }

    /// Solve by adding violated rows until none is left. Returns the solution (values per
    /// group, then the shortfall when asked for), the rows it was solved with and the rounds.
    fn solve(&self, goal: Goal) -> (lp::LpSolution, Vec<RowRef>, usize) {
        let g = self.groups.len();
        let n = self.wells.len();
        let limits_on = goal != Goal::TargetsOnly;
        let aq_initial = self.model.aquifer.initial_level;
        let mut costs: Vec<f64> = self.groups.iter().map(|m| m.len() as f64).collect();
        let mut bounds: Vec<(f64, f64)> = self
            .groups
            .iter()
            .map(|m| {
                let hi = if limits_on {
                    m.iter()
                        .map(|&k| self.limits[k].capacity_at(aq_initial) * CAPACITY_SAFETY)
                        .fold(f64::INFINITY, f64::min)
                } else {
                    f64::INFINITY
                };
                (0.0, hi)
            })
            .collect();
        if goal == Goal::MinShortfall {
            // Shortfall first; a little weight on the flow picks the leanest of equal answers.
            costs.iter_mut().for_each(|c| *c *= 1e-4);
            costs.push(1.0);
            bounds.push((0.0, f64::INFINITY));
        }
        // Start with the points that ask most of a uniform rate.
        let mut order: Vec<(f64, usize)> = self
            .a_sum
            .iter()
            .enumerate()
            .map(|(t, &s)| {
                let deficit = self.base_t[t] - self.target_phi[t];
                let need = if s < 0.0 {
                    deficit / -s
                } else if deficit > 0.0 {
                    f64::INFINITY
                } else {
                    f64::NEG_INFINITY
                };
                (need, t)
            })
            .collect();
        order.sort_by(|a, b| b.0.total_cmp(&a.0));
        let mats = self.matrices();
        // The ten neediest points, and for each rate group the neediest point it serves most
        // (largest |ΔΦ per unit rate|): the first programme then sees the whole layout.
        let mut best_of_group: Vec<Option<usize>> = vec![None; g];
        for (_, t) in &order {
            let row = &mats.a[*t];
            if let Some((h, _)) = row
                .iter()
                .enumerate()
                .min_by(|a, b| a.1.total_cmp(b.1))
                .filter(|(_, u)| **u < 0.0)
            {
                if best_of_group[h].is_none() {
                    best_of_group[h] = Some(*t);
                }
            }
        }
        let mut rows: Vec<RowRef> = order
            .iter()
            .take(10)
            .map(|(_, t)| RowRef::Target(*t))
            .collect();
        for t in best_of_group.into_iter().flatten() {
            if !rows
                .iter()
                .any(|r| matches!(r, RowRef::Target(u) if *u == t))
            {
                rows.push(RowRef::Target(t));
            }
        }
        let mut have_target = vec![false; mats.a.len()];
        for r in &rows {
            if let RowRef::Target(t) = r {
                have_target[*t] = true;
            }
        }
        let mut have_level = vec![false; n];
        let mut have_cap: Vec<Vec<bool>> = self
            .limits
            .iter()
            .map(|l| vec![false; l.pieces.len()])
            .collect();
        let tol = ROW_TOLERANCE * self.phi0.abs().max(1e-30);
        let mut rounds = 0;
        loop {
            rounds += 1;
            let full = rounds > MAX_ROUNDS;
            if full {
                rows = (0..mats.a.len()).map(RowRef::Target).collect();
                if limits_on {
                    for k in (0..n).filter(|&k| self.group_of[k].is_some()) {
                        rows.push(RowRef::Level(k));
                        for s in 0..self.limits[k].pieces.len() {
                            rows.push(RowRef::Capacity(k, s));
                        }
                    }
                }
            }
            let problem = RateProblem {
                costs: costs.clone(),
                bounds: bounds.clone(),
                constraints: rows.iter().map(|r| self.row(*r, goal)).collect(),
            };
            let sol = lp::solve(&problem);
            if sol.status != LpStatus::Optimal || full {
                return (sol, rows, rounds);
            }
            let x = &sol.values[..g];
            let shortfall = if goal == Goal::MinShortfall {
                sol.values.get(g).copied().unwrap_or(0.0)
            } else {
                0.0
            };
            // Violated rows, most violated first (relative to Φ₀ for levels and targets, to
            // the capacity for rates); at most `per_round` of each kind are added per round so
            // that each programme stays small and far from degenerate.
            let per_round = g.max(20);
            let mut target_viol: Vec<(f64, usize)> = mats
                .a
                .iter()
                .enumerate()
                .filter(|(t, _)| !have_target[*t])
                .filter_map(|(t, row)| {
                    let v = self.base_t[t] + dot(row, x) - shortfall - self.target_phi[t];
                    (v > tol).then_some((v / self.phi0.abs().max(1e-30), t))
                })
                .collect();
            let mut well_viol: Vec<(f64, RowRef)> = Vec::new();
            if limits_on {
                for k in 0..n {
                    let Some(gk) = self.group_of[k] else {
                        continue;
                    };
                    let phi = self.base_w[k] + dot(&mats.at_wells[k], x);
                    let lim = &self.limits[k];
                    if !have_level[k] && phi < lim.floor_potential - tol {
                        let v = (lim.floor_potential - phi) / self.phi0.abs().max(1e-30);
                        well_viol.push((v, RowRef::Level(k)));
                    }
                    let (cap, s) = lim.chord_capacity(phi);
                    if !lim.pieces.is_empty()
                        && !have_cap[k][s]
                        && x[gk] > CAPACITY_SAFETY * cap + 1e-12
                    {
                        let v = (x[gk] - cap) / cap.abs().max(1e-12);
                        well_viol.push((v, RowRef::Capacity(k, s)));
                    }
                }
            }
            target_viol.sort_by(|a, b| b.0.total_cmp(&a.0));
            well_viol.sort_by(|a, b| b.0.total_cmp(&a.0));
            let added = !target_viol.is_empty() || !well_viol.is_empty();
            for (_, t) in target_viol.into_iter().take(per_round) {
                have_target[t] = true;
                rows.push(RowRef::Target(t));
            }
            for (_, r) in well_viol.into_iter().take(per_round) {
                match r {
                    RowRef::Level(k) => have_level[k] = true,
                    RowRef::Capacity(k, s) => have_cap[k][s] = true,
                    RowRef::Target(_) => {}
                }
                rows.push(r);
            }
            if !added {
                return (sol, rows, rounds);
            }
        }
    }

    fn binding_labels(&self, sol: &lp::LpSolution, rows: &[RowRef], rates: &[f64]) -> Vec<String> {
        let mut out = Vec::new();
        let mut targets = Vec::new();
        for &i in &sol.binding {
            match rows.get(i) {
                Some(RowRef::Target(t)) => targets.push(self.points[self.targets[*t]].name.clone()),
                Some(r) => out.push(self.row(*r, Goal::MinFlow).label),
                None => {}
            }
        }
        for (k, q) in rates.iter().enumerate() {
            if self.group_of[k].is_none() {
                continue;
            }
            if let Some(p) = self.limits[k].pump {
                if *q >= p * CAPACITY_SAFETY * (1.0 - 1e-7) {
                    out.push(format!("pump capacity of {}", self.wells[k].name));
                }
            }
        }
        out.sort();
        out.dedup();
        let mut all: Vec<String> = targets
            .into_iter()
            .map(|name| format!("target at {name}"))
            .collect();
        all.extend(out);
        all
    }
}

/// Short summary of binding constraints: "targets at 7 points (…); capacity: W01, W04".
pub fn summarise_binding(binding: &[String]) -> String {
    let targets: Vec<&str> = binding
        .iter()
        .filter_map(|b| b.strip_prefix("target at "))
        .collect();
    let mut parts = Vec::new();
    if !targets.is_empty() {
        let shown: Vec<&str> = targets.iter().take(3).copied().collect();
        parts.push(format!(
            "targets at {} point{} ({}{})",
            targets.len(),
            if targets.len() == 1 { "" } else { "s" },
            shown.join(", "),
            if targets.len() > 3 { ", …" } else { "" }
        ));
    }
    let wells: Vec<&String> = binding
        .iter()
        .filter(|b| !b.starts_with("target at "))
        .collect();
    if !wells.is_empty() {
        let shown: Vec<&str> = wells.iter().take(4).map(|s| s.as_str()).collect();
        parts.push(format!(
            "{}{}",
            shown.join("; "),
            if wells.len() > 4 {
                format!("; and {} more well limits", wells.len() - 4)
            } else {
                String::new()
            }
        ));
    }
    if parts.is_empty() {
        "none".into()
    } else {
        parts.join("; ")
    }
}

/// One layout tried: a row of the count table and of the sweep.
#[derive(Debug, Clone, Serialize)]
pub struct Trial {
    /// Number of wells placed.
    pub count: usize,
    /// Wells per side of a trench line (`None` for rings and given layouts).
    pub per_side: Option<usize>,
    /// Spacing along the ring or line, m.
    pub spacing_m: f64,
    /// Smallest uniform rate per well that meets every target, m³/s.
    pub uniform_rate_m3_per_s: Option<f64>,
    /// The check point that sets that rate.
    pub uniform_rate_set_by: String,
    /// Total flow at that rate, m³/s.
    pub uniform_total_m3_per_s: Option<f64>,
    /// Largest uniform rate within the well limits, m³/s.
    pub uniform_limit_m3_per_s: f64,
    /// Least total flow with individual rates, m³/s (when the programme is feasible).
    pub individual_total_m3_per_s: Option<f64>,
    /// How the programme for individual rates ended ("optimal", "infeasible", "not run" …).
    pub individual_status: String,
    /// Lowest margin below target with every well at the largest uniform rate its limits allow,
    /// m: positive is reserve, negative a shortfall no uniform rate within the limits removes.
    pub lowest_margin_m: f64,
    /// Where that margin is.
    pub lowest_margin_at: String,
    /// The limit that caps the uniform rate.
    pub binding_limit: String,
    /// The uniform rate meets every target within the limits (confirmed by evaluation).
    pub uniform_met: bool,
    /// The individual rates meet every target within the limits (confirmed by evaluation).
    pub individual_met: bool,
    /// In words.
    pub outcome: String,
}

/// A trial with what the design needs to write it out.
#[derive(Debug, Clone)]
pub struct TrialRun {
    /// The table row.
    pub trial: Trial,
    /// The layout that was generated.
    pub spec: LayoutSpec,
    /// Its wells (rate 0) and paths.
    pub placement: Placement,
    /// The individual rates when solved.
    pub individual: Option<Individual>,
}

/// Evaluate one layout `spec` with the uniform rate and, when `with_lp`, individual rates.
pub fn try_layout(
    model: &Model,
    points: &[CheckPoint],
    spec: &LayoutSpec,
    per_side: Option<usize>,
    with_lp: bool,
) -> Result<TrialRun, InputError> {
    let placement = layout::generate(model, spec, 0.0)?;
    let spacing = layout_spacing(model, spec, &placement);
    Ok(try_placement(
        model,
        points,
        spec.clone(),
        placement,
        per_side,
        spacing,
        with_lp,
    ))
}

fn status_words(status: &LpStatus) -> String {
    match status {
        LpStatus::Optimal => "optimal".into(),
        LpStatus::Infeasible => "infeasible".into(),
        LpStatus::Unbounded => "unbounded".into(),
        LpStatus::Failed(why) => format!("solver failed: {why}"),
    }
}

fn try_placement(
    model: &Model,
    points: &[CheckPoint],
    spec: LayoutSpec,
    placement: Placement,
    per_side: Option<usize>,
    spacing: f64,
    with_lp: bool,
) -> TrialRun {
    let count = placement.wells.len();
    let rates = LayoutRates::new(model, points, placement.wells.clone());
    let uniform = rates.uniform();
    let individual = (count > 0 && with_lp).then(|| rates.individual());
    let mut run = TrialRun {
        trial: trial_row(
            points,
            count,
            rates.group_of.iter().filter(|g| g.is_some()).count(),
            per_side,
            spacing,
            &uniform,
            None,
        ),
        spec,
        placement,
        individual: None,
    };
    if let Some(ind) = individual {
        run.set_individual(ind);
    }
    run
}

impl TrialRun {
    /// Record the individual-rate answer in the run and its table row.
    fn set_individual(&mut self, ind: Individual) {
        let t = &mut self.trial;
        t.individual_met = ind.met;
        t.individual_status = status_words(&ind.status);
        t.individual_total_m3_per_s = (ind.status == LpStatus::Optimal).then_some(ind.total);
        t.outcome = outcome_words(t);
        self.individual = Some(ind);
    }
}

fn outcome_words(t: &Trial) -> String {
    match (t.uniform_met, t.individual_met) {
        (true, true) => "met (both rate options)".to_string(),
        (false, true) => "met with individual rates only".to_string(),
        (true, false) if t.individual_status == "not run" => {
            "met with the same rate in every well".to_string()
        }
        (true, false) => "met with the same rate in every well only".to_string(),
        (false, false) => {
            if t.count == 0 {
                "no wells placed".to_string()
            } else if t.uniform_rate_m3_per_s.is_none() {
                "not met: a target is out of every well's reach".to_string()
            } else {
                format!("not met: {}", t.binding_limit)
            }
        }
    }
}

fn trial_row(
    points: &[CheckPoint],
    count: usize,
    pumping: usize,
    per_side: Option<usize>,
    spacing: f64,
    uniform: &Uniform,
    individual: Option<&Individual>,
) -> Trial {
    let ind_met = individual.is_some_and(|i| i.met);
    let mut trial = Trial {
        count,
        per_side,
        spacing_m: spacing,
        uniform_rate_m3_per_s: uniform.needed_m3_per_s,
        uniform_rate_set_by: uniform
            .needed_at
            .map(|i| points[i].name.clone())
            .unwrap_or_default(),
        uniform_total_m3_per_s: uniform.needed_m3_per_s.map(|q| q * pumping as f64),
        uniform_limit_m3_per_s: uniform.limit_m3_per_s,
        individual_total_m3_per_s: individual
            .filter(|i| i.status == LpStatus::Optimal)
            .map(|i| i.total),
        individual_status: individual.map_or("not run".into(), |i| status_words(&i.status)),
        lowest_margin_m: uniform.margin_at_limit_m,
        lowest_margin_at: uniform
            .worst_at_limit
            .map(|i| points[i].name.clone())
            .unwrap_or_default(),
        binding_limit: uniform.limit_reason.clone(),
        uniform_met: uniform.met,
        individual_met: ind_met,
        outcome: String::new(),
    };
    trial.outcome = outcome_words(&trial);
    trial
}

/// Mean spacing of a generated layout along its path, m.
fn layout_spacing(model: &Model, spec: &LayoutSpec, placement: &Placement) -> f64 {
    let n = placement.wells.len();
    match &spec.kind {
        LayoutKind::Ring { .. } => {
            let ring =
                layout::offset_ring(&model.excavations[spec.excavation].outline, spec.offset);
            closed_length(&ring) / n.max(1) as f64
        }
        LayoutKind::Line { both_sides, .. } => {
            let per_side = if *both_sides { n / 2 } else { n };
            line_length(model, spec) / (per_side.max(2) - 1) as f64
        }
        _ => 0.0,
    }
}

fn closed_length(ring: &[[f64; 2]]) -> f64 {
    let n = ring.len();
    (0..n)
        .map(|i| {
            let (a, b) = (ring[i], ring[(i + 1) % n]);
            (b[0] - a[0]).hypot(b[1] - a[1])
        })
        .sum()
}

/// Length of the line the wellpoints stand on: the centre line extended past each end by the
/// end extension (half-width plus the offset unless the design file says otherwise), as
/// [`layout::line`] places them, m.
pub fn line_length(model: &Model, spec: &LayoutSpec) -> f64 {
    let exc = &model.excavations[spec.excavation];
    let (given, end_ext) = match &spec.kind {
        LayoutKind::Line {
            centre_line,
            end_extension,
            ..
        } => (centre_line.as_ref(), *end_extension),
        _ => (None, None),
    };
    let centre = layout::centre_line(exc, given);
    let open: f64 = centre
        .windows(2)
        .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
        .sum();
    open + 2.0 * layout::end_extension(exc, spec.offset, end_ext)
}

/// How a design ended.
#[derive(Debug, Clone, Serialize)]
#[serde(tag = "status", rename_all = "kebab-case")]
pub enum Outcome {
    /// Every target met within every limit.
    Met {
        /// Wells in the chosen layout.
        count: usize,
        /// Total flow, m³/s.
        total_flow_m3_per_s: f64,
    },
    /// Computed, but no layout tried meets every target within the limits.
    NotMet {
        /// Wells in the best layout found.
        count: usize,
        /// Its worst check point.
        worst_point: String,
        /// Where.
        position: [f64; 2],
        /// How far the water stays above the target there, m.
        shortfall_m: f64,
    },
    /// No layout of this kind can work, and why.
    Impossible {
        /// In words.
        reason: String,
    },
}

/// The result of `design`.
#[derive(Debug, Clone)]
pub struct Design {
    /// The rate option asked for.
    pub asked: RateOption,
    /// The rate option of the chosen layout.
    pub used: Option<RateOption>,
    /// How it ended.
    pub outcome: Outcome,
    /// Chosen (or best) layout settings.
    pub spec: Option<LayoutSpec>,
    /// Chosen (or best) wells with their rates, and paths.
    pub placement: Option<Placement>,
    /// Every layout tried, by count.
    pub trials: Vec<Trial>,
    /// Smallest count meeting every target with one rate in every well.
    pub smallest_uniform: Option<usize>,
    /// Smallest count meeting every target with individual rates.
    pub smallest_individual: Option<usize>,
    /// Binding constraints of the chosen rates.
    pub binding: Vec<String>,
    /// What was searched, in words.
    pub search: String,
    /// What an engineer should know.
    pub notes: Vec<String>,
    /// The quick estimate of the layout's excavation.
    pub estimate: ExcavationEstimate,
}

/// The layout family the search varies.
enum Family {
    /// Ring by count, from `min` to `max` wells.
    Ring { min: usize, max: usize },
    /// Trench line by wells per side (`min`..`max`), on a line `length` m long.
    Line { min: usize, max: usize, length: f64 },
    /// The layout is given: rates only.
    Fixed,
}

fn family(model: &Model, spec: &LayoutSpec) -> Family {
    let min_spacing = match model.wells.kind {
        WellKind::DeepWell => MIN_SPACING_DEEP_WELL,
        WellKind::Wellpoint => MIN_SPACING_WELLPOINT,
    };
    match &spec.kind {
        LayoutKind::Ring { .. } => {
            let ring =
                layout::offset_ring(&model.excavations[spec.excavation].outline, spec.offset);
            let max = ((closed_length(&ring) / min_spacing).floor() as usize).clamp(3, MAX_WELLS);
            Family::Ring { min: 3, max }
        }
        LayoutKind::Line { both_sides, .. } => {
            let length = line_length(model, spec);
            let sides = if *both_sides { 2 } else { 1 };
            let max = ((length / min_spacing).floor() as usize + 1).clamp(2, MAX_WELLS / sides);
            Family::Line {
                min: 2,
                max,
                length,
            }
        }
        LayoutKind::Listed | LayoutKind::Csv { .. } => Family::Fixed,
    }
}

/// The layout settings for search index `n` of a family.
fn spec_for(spec: &LayoutSpec, fam: &Family, n: usize) -> LayoutSpec {
    let mut s = spec.clone();
    match (&mut s.kind, fam) {
        (LayoutKind::Ring { count, .. }, Family::Ring { .. }) => {
            *count = RingCount::Count(n as u32);
        }
        (LayoutKind::Line { spacing, .. }, Family::Line { length, .. }) => {
            // n wells per side at exactly length/(n − 1); the factor keeps ⌈L/s⌉ = n − 1
            // against round-off.
            *spacing = length / (n.max(2) - 1) as f64 * (1.0 + 1e-9);
        }
        _ => {}
    }
    s
}

/// Distance from `p` to the segment a–b, m.
fn segment_distance(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len2 = dx * dx + dy * dy;
    let t = if len2 > 0.0 {
        (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2).clamp(0.0, 1.0)
    } else {
        0.0
    };
    (p[0] - a[0] - t * dx).hypot(p[1] - a[1] - t * dy)
}

/// Reasons no layout of this kind can work, found before any search.
fn impossible_before_search(
    model: &Model,
    points: &[CheckPoint],
    reach_paths: &[Vec<[f64; 2]>],
    well_points: &[[f64; 2]],
) -> Option<String> {
    let aq = &model.aquifer;
    let spec = &model.wells;
    let targets: Vec<&CheckPoint> = points.iter().filter(|p| p.target_level.is_some()).collect();
    // 1. Target at or below the aquifer base (validation refuses it; kept as a guard).
    if let Some(p) = targets.iter().find(|p| {
        p.target_level
            .is_some_and(|t| t <= aq.base_level + DRY_GUARD)
    }) {
        return Some(format!(
            "the target at \"{}\" ({:.2} m) is at or below the aquifer base ({:.2} m): the aquifer would have to be pumped dry there",
            p.name,
            p.target_level.unwrap_or(f64::NAN),
            aq.base_level
        ));
    }
    // 2. Target below what the wells may be drawn to. Between pumping wells the water stands
    //    higher than in the wells themselves (the drawdown of a sink is largest at the sink),
    //    so no check point can go below the lowest level the wells are allowed.
    let lowest_target = targets
        .iter()
        .filter_map(|p| p.target_level)
        .fold(f64::INFINITY, f64::min);
    let intake = spec.pump_intake + spec.submergence;
    match spec.kind {
        WellKind::Wellpoint => {
            let suction = model.ground_level - spec.suction_limit;
            if lowest_target < suction.max(intake) - 1e-9 {
                return Some(format!(
                    "wellpoints are asked for more drawdown than suction can lift: the target ({lowest_target:.2} m) is below ground − suction limit ({:.2} − {:.2} = {suction:.2} m){}; the water between wellpoints stands higher than in them, so one stage cannot reach it — use a second stage, ejectors or deep wells (common practice (no source))",
                    model.ground_level,
                    spec.suction_limit,
                    if intake > suction { format!(" and the intake + submergence ({intake:.2} m)") } else { String::new() }
                ));
            }
        }
        WellKind::DeepWell => {
            if lowest_target < intake - 1e-9 {
                return Some(format!(
                    "the target ({lowest_target:.2} m) is below the pump intake + submergence ({intake:.2} m): the water between the wells stands higher than in them, so the pumps would have to draw the wells below their intakes — set the pumps deeper (screen and intake)"
                ));
            }
        }
    }
    let wetted = (spec.screen_top.min(aq.initial_level) - spec.screen_base.max(intake)).max(0.0);
    if wetted <= 0.0 {
        return Some(format!(
            "no length of screen lies between the lowest level a well may be drawn to ({:.2} m) and the groundwater level ({:.2} m): the wells could give no water — lower the screen or the pump",
            spec.screen_base.max(intake),
            aq.initial_level
        ));
    }
    // 3. Radius of influence shorter than the distance from the wells to a check point: no
    //    well's drawdown reaches that point whatever the count or rate (Thiem cut-off at R).
    if aq.leakage_factor().is_none() {
        let (r, _) = design_radius(model);
        let mut far: Option<(f64, &CheckPoint)> = None;
        for p in &targets {
            let mut d = f64::INFINITY;
            for path in reach_paths {
                for w in path.windows(2) {
                    d = d.min(segment_distance(p.position, w[0], w[1]));
                }
                if path.len() == 1 {
                    d = d.min(segment_distance(p.position, path[0], path[0]));
                }
            }
            for w in well_points {
                d = d.min(segment_distance(p.position, *w, *w));
            }
            if d.is_finite() && far.is_none_or(|(fd, _)| d > fd) {
                far = Some((d, p));
            }
        }
        if let Some((d, p)) = far {
            if d >= r {
                return Some(format!(
                    "the radius of influence ({r:.1} m) is shorter than the distance from the wells to check point \"{}\" ({d:.1} m): no well's drawdown reaches it, whatever the count or rate. The radius comes from the design file's influence method; a larger one needs evidence from a pumping test, or wells must stand inside the excavation",
                    p.name
                ));
            }
        }
    }
    None
}

/// The count search with its cache of layouts tried, by search index.
struct Search<'m, 'p> {
    model: &'m Model,
    points: &'p [CheckPoint],
    spec: &'p LayoutSpec,
    fam: &'p Family,
    cache: BTreeMap<usize, TrialRun>,
}

impl Search<'_, '_> {
    /// Whether search index `n` meets `ok`, trying the layout once (and solving its linear
    /// programme only when `with_lp`, once).
    fn meets(
        &mut self,
        n: usize,
        ok: fn(&Trial) -> bool,
        with_lp: bool,
    ) -> Result<bool, InputError> {
        if !self.cache.contains_key(&n) {
            let s = spec_for(self.spec, self.fam, n);
            let per_side = matches!(self.fam, Family::Line { .. }).then_some(n);
            let t = try_layout(self.model, self.points, &s, per_side, with_lp)?;
            self.cache.insert(n, t);
        }
        if let Some(t) = self.cache.get_mut(&n) {
            if with_lp && t.individual.is_none() && !t.placement.wells.is_empty() {
                let ind = LayoutRates::new(self.model, self.points, t.placement.wells.clone())
                    .individual();
                t.set_individual(ind);
            }
        }
        Ok(self.cache.get(&n).is_some_and(|t| ok(&t.trial)))
    }

    /// Smallest index meeting `ok`: try min, min + 1, min + 3, min + 7 … up to max, then
    /// bisect between the last failure and the first success. The index returned was tried
    /// and met; the one below it was tried and failed (or is below the range).
    fn smallest(
        &mut self,
        ok: fn(&Trial) -> bool,
        with_lp: bool,
    ) -> Result<Option<usize>, InputError> {
        let (min, max) = match *self.fam {
            Family::Ring { min, max } | Family::Line { min, max, .. } => (min, max),
            Family::Fixed => (0, 0),
        };
        let mut lo: Option<usize> = None;
        let mut n = min;
        let mut step = 1;
        let mut hi = loop {
            if self.meets(n, ok, with_lp)? {
                break n;
            }
            lo = Some(n);
            if n >= max {
                return Ok(None);
            }
            n = (n + step).min(max);
            step *= 2;
        };
        while let Some(l) = lo {
            if hi - l <= 1 {
                break;
            }
            let m = l + (hi - l) / 2;
            if self.meets(m, ok, with_lp)? {
                hi = m;
            } else {
                lo = Some(m);
            }
        }
        Ok(Some(hi))
    }
}

/// Run the design: the smallest layout of the design file's kind that meets every target
/// within every well limit, with rates by `asked`.
pub fn design(model: &Model, asked: RateOption) -> Result<Design, InputError> {
    let Some(spec) = model.layout.clone() else {
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "design needs a [layout]: kind = \"ring\" (the count is searched), \"line\" (the spacing is searched), or \"listed\"/\"csv\" (the rates are found for the given wells)".into(),
        });
    };
    let points = check_points(model);
    let est = estimate::estimate(model)
        .excavations
        .into_iter()
        .nth(spec.excavation)
        .ok_or_else(|| InputError {
            file: model.file.clone(),
            field: "layout.excavation".into(),
            line: None,
            message: "the layout's excavation does not exist".into(),
        })?;
    let fam = family(model, &spec);
    let mut notes = Vec::new();
    let (search, probe) = match &fam {
        Family::Ring { min, max } => (
            format!(
                "ring at {:.1} m outside \"{}\": {min} … {max} wells (closest spacing {:.1} m)",
                spec.offset,
                model.excavations[spec.excavation].name,
                match model.wells.kind {
                    WellKind::DeepWell => MIN_SPACING_DEEP_WELL,
                    WellKind::Wellpoint => MIN_SPACING_WELLPOINT,
                }
            ),
            spec_for(&spec, &fam, *min),
        ),
        Family::Line { min, max, length } => (
            format!(
                "trench line {length:.0} m long, {} side{}: {min} … {max} wellpoints per side (spacing {:.2} … {:.2} m)",
                if matches!(spec.kind, LayoutKind::Line { both_sides: true, .. }) { "both" } else { "one" },
                if matches!(spec.kind, LayoutKind::Line { both_sides: true, .. }) { "s" } else { "" },
                length / (*min - 1) as f64,
                length / (*max - 1).max(1) as f64
            ),
            spec_for(&spec, &fam, *min),
        ),
        Family::Fixed => ("the given wells: rates only".to_string(), spec.clone()),
    };
    let probe_placement = layout::generate(model, &probe, 0.0)?;
    if matches!(fam, Family::Fixed) && probe_placement.wells.is_empty() {
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "the layout places no wells".into(),
        });
    }
    let fixed_points: Vec<[f64; 2]> = if matches!(fam, Family::Fixed) {
        probe_placement.wells.iter().map(|w| w.position).collect()
    } else {
        Vec::new()
    };
    let empty = Design {
        asked,
        used: None,
        outcome: Outcome::Impossible {
            reason: String::new(),
        },
        spec: None,
        placement: None,
        trials: Vec::new(),
        smallest_uniform: None,
        smallest_individual: None,
        binding: Vec::new(),
        search: search.clone(),
        notes: Vec::new(),
        estimate: est.clone(),
    };
    if let Some(reason) =
        impossible_before_search(model, &points, &probe_placement.paths, &fixed_points)
    {
        return Ok(Design {
            outcome: Outcome::Impossible { reason },
            ..empty
        });
    }

    let mut search_state = Search {
        model,
        points: &points,
        spec: &spec,
        fam: &fam,
        cache: BTreeMap::new(),
    };
    let (smallest_individual, smallest_uniform) = if matches!(fam, Family::Fixed) {
        let t = try_placement(
            model,
            &points,
            spec.clone(),
            probe_placement,
            None,
            0.0,
            true,
        );
        let (i, u) = (t.trial.individual_met, t.trial.uniform_met);
        search_state.cache.insert(0, t);
        (i.then_some(0), u.then_some(0))
    } else {
        let i = search_state.smallest(|t| t.individual_met, true)?;
        let u = search_state.smallest(|t| t.uniform_met, false)?;
        (i, u)
    };
    let cache = search_state.cache;
    let trials: Vec<Trial> = cache.values().map(|t| t.trial.clone()).collect();
    let count_of = |n: Option<usize>| n.and_then(|n| cache.get(&n)).map(|t| t.trial.count);

    let pick = match asked {
        RateOption::Individual => smallest_individual
            .map(|n| (n, RateOption::Individual))
            .or(smallest_uniform.map(|n| (n, RateOption::Uniform))),
        RateOption::Uniform => smallest_uniform
            .map(|n| (n, RateOption::Uniform))
            .or(smallest_individual.map(|n| (n, RateOption::Individual))),
    };
    if let Some((_, used)) = pick {
        if used != asked {
            notes.push(format!(
                "no layout tried meets every target with {}; the design uses {} instead",
                asked.describe(),
                used.describe()
            ));
        }
    }
    if !model.boundaries.is_empty() {
        notes.push(format!(
            "the quick estimate leaves out the design file's {} straight boundar{} (a constant-head edge such as a river feeds the wells and raises the flow; a barrier lowers it), so the two flows differ by more than usual",
            model.boundaries.len(),
            if model.boundaries.len() == 1 { "y" } else { "ies" }
        ));
    }
    if smallest_uniform.is_none() && smallest_individual.is_some() {
        if let Some(t) = cache
            .values()
            .filter(|t| t.trial.count > 0)
            .max_by(|a, b| a.trial.lowest_margin_m.total_cmp(&b.trial.lowest_margin_m))
        {
            notes.push(format!(
                "with one rate in every well no count tried meets every target: at best ({} wells, every well at the most its limits allow, {}) \"{}\" stays {:.2} m above its target; individual rates give more to the wells that serve it",
                t.trial.count,
                t.trial.binding_limit,
                t.trial.lowest_margin_at,
                -t.trial.lowest_margin_m
            ));
        }
    }
    if let (Some(i), Some(u)) = (count_of(smallest_individual), count_of(smallest_uniform)) {
        if u > i {
            notes.push(format!(
                "with one rate in every well {u} wells are needed; with individual rates {i}"
            ));
        }
    }
    let design = if let Some((n, used)) = pick {
        let t = &cache[&n];
        let (rates, binding) = match used {
            RateOption::Individual => {
                let pumping = t.placement.wells.iter().filter(|w| w.rate >= 0.0).count();
                if let Some(i) = t.individual.as_ref().filter(|i| i.groups < pumping) {
                    notes.push(format!(
                        "the {pumping} wells share {} rates in the linear programme (neighbouring wells in groups, as above {MAX_LP_VARIABLES} wells): each well is still held to its own limits, and the total may be a little above the ungrouped least flow",
                        i.groups
                    ));
                }
                let ind = t.individual.clone().map(|i| (i.rates, i.binding));
                ind.unwrap_or_default()
            }
            RateOption::Uniform => {
                let q = t.trial.uniform_rate_m3_per_s.unwrap_or(0.0);
                let b = vec![
                    format!("target at {} (sets the rate)", t.trial.uniform_rate_set_by),
                    format!(
                        "largest uniform rate within the limits {:.2} L/s ({})",
                        t.trial.uniform_limit_m3_per_s * 1e3,
                        t.trial.binding_limit
                    ),
                ];
                let rates = t
                    .placement
                    .wells
                    .iter()
                    .map(|w| if w.rate < 0.0 { w.rate } else { q })
                    .collect();
                (rates, b)
            }
        };
        let mut placement = t.placement.clone();
        for (w, q) in placement.wells.iter_mut().zip(&rates) {
            w.rate = *q;
        }
        Design {
            used: Some(used),
            outcome: Outcome::Met {
                count: placement.wells.len(),
                total_flow_m3_per_s: rates.iter().filter(|q| **q > 0.0).sum(),
            },
            spec: Some(t.spec.clone()),
            placement: Some(placement),
            trials,
            smallest_uniform: count_of(smallest_uniform),
            smallest_individual: count_of(smallest_individual),
            binding,
            notes,
            ..empty
        }
    } else {
        not_met(model, &points, &cache, trials, notes, empty)?
    };
    Ok(design)
}

/// No layout met: the best one tried, its worst point and shortfall — or a capacity reason.
fn not_met(
    model: &Model,
    points: &[CheckPoint],
    cache: &BTreeMap<usize, TrialRun>,
    trials: Vec<Trial>,
    mut notes: Vec<String>,
    empty: Design,
) -> Result<Design, InputError> {
    let Some(best) = cache
        .values()
        .filter(|t| t.trial.count > 0)
        .max_by(|a, b| a.trial.lowest_margin_m.total_cmp(&b.trial.lowest_margin_m))
    else {
        return Ok(Design {
            outcome: Outcome::Impossible {
                reason: "no layout tried placed any wells (keep-out zones cover the well line)"
                    .into(),
            },
            trials,
            ..empty
        });
    };
    let ctx = LayoutRates::new(model, points, best.placement.wells.clone());
    let n = ctx.wells.len();
    // Candidates: every well at the largest uniform rate, and the least-shortfall programme.
    let mut candidates = vec![(
        ctx.uniform_rates(best.trial.uniform_limit_m3_per_s),
        RateOption::Uniform,
    )];
    if let Some(r) = ctx.least_shortfall() {
        candidates.push((r, RateOption::Individual));
    }
    let mut chosen: Option<(Vec<f64>, RateOption, Evaluation)> = None;
    for (rates, option) in candidates {
        let e = ctx.evaluate(&rates);
        let m = e
            .worst_point
            .and_then(|i| e.points[i].margin_m)
            .unwrap_or(f64::NEG_INFINITY);
        let better = chosen.as_ref().is_none_or(|(_, _, c)| {
            m > c
                .worst_point
                .and_then(|i| c.points[i].margin_m)
                .unwrap_or(f64::NEG_INFINITY)
        });
        if better {
            chosen = Some((rates, option, e));
        }
    }
    let Some((rates, option, e)) = chosen else {
        return Ok(Design { trials, ..empty });
    };
    // Capacity: with no limits the targets need F; if all wells together cannot give F even
    // at the closest spacing tried, no count of this kind can work.
    let largest = cache.values().max_by_key(|t| t.trial.count);
    if let Some(l) = largest {
        let lctx = LayoutRates::new(model, points, l.placement.wells.clone());
        let all_cap: f64 = (0..lctx.wells.len())
            .filter(|&k| lctx.wells[k].rate >= 0.0)
            .map(|k| lctx.limits[k].capacity_at(model.aquifer.initial_level))
            .sum();
        if let Some(f) = lctx.flow_without_limits() {
            if all_cap < f {
                return Ok(Design {
                    outcome: Outcome::Impossible {
                        reason: format!(
                            "well capacity: even {} wells (the closest spacing tried, {:.2} m) can give at most {:.2} L/s together (each at its full capacity before any drawdown), less than the {:.2} L/s the targets need with no limits at all",
                            l.trial.count,
                            l.trial.spacing_m,
                            all_cap * 1e3,
                            f * 1e3
                        ),
                    },
                    trials,
                    notes,
                    ..empty
                });
            }
        }
    }
    let worst = e.worst_point.map(|i| &e.points[i]);
    notes.push(format!(
        "the best layout tried has {} wells; shown with {}",
        n,
        match option {
            RateOption::Uniform => "every well at the largest rate its limits allow",
            RateOption::Individual =>
                "rates that make the largest shortfall least within the limits",
        }
    ));
    let mut placement = best.placement.clone();
    for (w, q) in placement.wells.iter_mut().zip(&rates) {
        w.rate = *q;
    }
    Ok(Design {
        used: Some(option),
        outcome: Outcome::NotMet {
            count: n,
            worst_point: worst.map(|p| p.point.name.clone()).unwrap_or_default(),
            position: worst.map_or([0.0, 0.0], |p| p.point.position),
            shortfall_m: worst
                .and_then(|p| p.margin_m)
                .map_or(0.0, |m| (-m).max(0.0)),
        },
        spec: Some(best.spec.clone()),
        placement: Some(placement),
        binding: vec![best.trial.binding_limit.clone()],
        trials,
        notes,
        ..empty
    })
}

/// Pumps of one duty.
#[derive(Debug, Clone, Serialize)]
pub struct PumpGroup {
    /// Duty each pump is bought for, L/s (rate × (1 + contingency), rounded up to the step).
    pub duty_l_per_s: f64,
    /// How many working wells have it.
    pub count: usize,
    /// Range of running rates of those wells, L/s.
    pub running_l_per_s: [f64; 2],
}

/// The quantities a bid needs.
#[derive(Debug, Clone, Serialize)]
pub struct Bid {
    /// Wells in the layout.
    pub wells_in_layout: usize,
    /// Wells with a rate above zero.
    pub working_wells: usize,
    /// Wells the programme left idle.
    pub idle_wells: usize,
    /// Recharge wells kept at their given rates.
    pub recharge_wells: usize,
    /// Their total injection, m³/s (a positive number).
    pub recharge_flow_m3_per_s: f64,
    /// Standby wells from the design file.
    pub standby_wells: u32,
    /// Depth of one well: ground to screen base plus the sump allowance, m.
    pub depth_per_well_m: f64,
    /// Drilling (or jetting) for working + standby wells, m.
    pub drilling_m: f64,
    /// Screen for working + standby wells, m.
    pub screen_m: f64,
    /// Pumps by duty (deep wells); empty for wellpoints.
    pub pumps: Vec<PumpGroup>,
    /// Standby pumps (one per standby well, at the largest duty).
    pub standby_pumps: u32,
    /// Total flow, m³/s.
    pub total_flow_m3_per_s: f64,
    /// Design flow = total × (1 + contingency), m³/s.
    pub design_flow_m3_per_s: f64,
    /// Contingency used.
    pub contingency: f64,
    /// Header length and flow per 100 m (wellpoints).
    pub header_length_m: Option<f64>,
    /// Design flow per 100 m of header, m³/s (wellpoints).
    pub design_flow_per_100m_m3_per_s: Option<f64>,
    /// How each figure was found.
    pub basis: Vec<String>,
}

/// Round a pump duty (L/s) up to a selection step: 0.5 L/s below 5, 1 below 20, 2.5 below 50,
/// 5 above (a convenience for grouping, not a pump catalogue).
pub fn pump_step(duty_l_per_s: f64) -> f64 {
    let step = if duty_l_per_s < 5.0 {
        0.5
    } else if duty_l_per_s < 20.0 {
        1.0
    } else if duty_l_per_s < 50.0 {
        2.5
    } else {
        5.0
    };
    ((duty_l_per_s / step) - 1e-9).ceil().max(1.0) * step
}

/// The bid quantities of a designed layout.
pub fn bid(model: &Model, wells: &[Well], paths: &[Vec<[f64; 2]>]) -> Bid {
    let spec = &model.wells;
    let working: Vec<&Well> = wells.iter().filter(|w| w.rate > 1e-9).collect();
    let total: f64 = working.iter().map(|w| w.rate).sum();
    let f = model.contingency;
    let depth = model.ground_level - spec.screen_base + SUMP_ALLOWANCE;
    let screen = spec.screen_top - spec.screen_base;
    let built = working.len() as f64 + spec.standby as f64;
    let mut basis = vec![
        format!(
            "depth per well = ground {:.2} m − screen base {:.2} m + {SUMP_ALLOWANCE:.1} m sump allowance = {depth:.2} m (common practice (no source))",
            model.ground_level, spec.screen_base
        ),
        format!("drilling and screen count working + standby wells ({} + {})", working.len(), spec.standby),
        format!("design flow = total × (1 + {f:.2}) (contingency from the design file)"),
    ];
    let mut pumps = Vec::new();
    let (mut header, mut per100) = (None, None);
    match spec.kind {
        WellKind::DeepWell => {
            let mut groups: BTreeMap<i64, PumpGroup> = BTreeMap::new();
            for w in &working {
                let want = w.rate * 1e3 * (1.0 + f);
                let duty = match spec.pump_capacity {
                    Some(p) if p * 1e3 < want => p * 1e3,
                    _ => pump_step(want),
                };
                let key = (duty * 1000.0).round() as i64;
                let g = groups.entry(key).or_insert(PumpGroup {
                    duty_l_per_s: duty,
                    count: 0,
                    running_l_per_s: [f64::INFINITY, 0.0],
                });
                g.count += 1;
                g.running_l_per_s[0] = g.running_l_per_s[0].min(w.rate * 1e3);
                g.running_l_per_s[1] = g.running_l_per_s[1].max(w.rate * 1e3);
            }
            pumps = groups.into_values().collect();
            basis.push(format!(
                "pump duty = running rate × (1 + {f:.2}), rounded up to 0.5 L/s below 5 L/s, 1 L/s below 20, 2.5 L/s below 50 (a grouping step, not a catalogue){}",
                if spec.pump_capacity.is_some() { "; never above the design file's pump capacity" } else { "" }
            ));
        }
        WellKind::Wellpoint => {
            let length: f64 = paths
                .iter()
                .map(|p| {
                    p.windows(2)
                        .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
                        .sum::<f64>()
                })
                .sum();
            if length > 0.0 {
                header = Some(length);
                per100 = Some(total * (1.0 + f) / length * 100.0);
            }
            basis.push("wellpoints share header pumps: sized on the design flow per length of header, not per wellpoint (not sized here)".into());
        }
    }
    Bid {
        wells_in_layout: wells.len(),
        working_wells: working.len(),
        idle_wells: wells
            .iter()
            .filter(|w| (0.0..=1e-9).contains(&w.rate))
            .count(),
        recharge_wells: wells.iter().filter(|w| w.rate < 0.0).count(),
        recharge_flow_m3_per_s: -wells
            .iter()
            .filter(|w| w.rate < 0.0)
            .map(|w| w.rate)
            .sum::<f64>(),
        standby_wells: spec.standby,
        depth_per_well_m: depth,
        drilling_m: depth * built,
        screen_m: screen * built,
        standby_pumps: if spec.kind == WellKind::DeepWell {
            spec.standby
        } else {
            0
        },
        pumps,
        total_flow_m3_per_s: total,
        design_flow_m3_per_s: total * (1.0 + f),
        contingency: f,
        header_length_m: header,
        design_flow_per_100m_m3_per_s: per100,
        basis,
    }
}
