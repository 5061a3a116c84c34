//! The programme's answers: when each check point meets its target, the earliest day each stage
//! can be dug, hydrographs, flow and volume against time, drawdown maps at chosen times, recovery
//! after switch-off, and the time to flood when the pumps fail.
//!
//! Method. Drawdowns s(x, t) come from [`crate::transient::TransientModel`] (Theis/Hantush
//! superposition in space and time with images). Output times are the programme's step, every
//! stage start and the end of pumping. A crossing (target first met, water back above formation)
//! is bracketed between two output times and found by bisection to 1 s. A stage can be dug once
//! every check point of its excavation (grid, corners, edges) stands at or below the stage's
//! target, its formation level less the excavation's target margin (the design file has no
//! separate operating margin; the target margin is the one used). Volumes are ∫ Q dt of the step
//! schedules, exact.
//!
//! Time to flood: at each moment a stage is being dug (its earliest moment or its start, and
//! every output time after, while its points are dry), the excavation point with the least margin
//! below formation is taken; every pump is switched off there and then, and the time until the
//! water stands above formation at that point is found. The moment with the shortest time is
//! then refined between its neighbouring moments by golden-section search on the time to flood
//! (to 60 s), so the worst moment itself is found, not the nearest output time. The same is done
//! there with only the most important well off (the one giving the most drawdown at that point at
//! that moment). Searched up to [`FLOOD_SEARCH`] after the failure.
//!
//! Relief excavations (`control = "relieve"`): a stage is ready when its points stand at the
//! relief head, and "flood" is the base lifting: the time until the head rises to the level at
//! which the factor of safety against uplift falls to 1.0 (formation level replaced by that head).

use crate::field::checkpoints::{check_points, CheckPoint, PointKind};
use crate::input::model::{Control, Model, Programme};
use crate::physics::uplift::{overburden, required_head};
use crate::transient::programme::{diffusion_parameters, switched_off, ProgrammeSetup};
use crate::transient::steady_link::{steady_link, SteadyLink};
use crate::transient::well_levels::{
    breaches, first_true, level_in_well, lowest_allowed, WellBreach,
};
use crate::transient::TransientModel;
use rayon::prelude::*;

pub use crate::transient::programme::FLOOD_SEARCH;
/// Nodes along each side of a drawdown map.
pub const MAP_NODES: usize = 101;

/// What a hydrograph is of.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SeriesKind {
    /// A named check point or programme point.
    Point,
    /// A corner of a neighbour's footprint.
    Neighbour,
    /// Inside a well: the level after the well loss (see [`crate::transient::well_levels`]).
    Well,
}

/// Water level against time at one place.
#[derive(Debug, Clone)]
pub struct Hydrograph {
    /// Name.
    pub name: String,
    /// Kind.
    pub kind: SeriesKind,
    /// Position, m.
    pub position: [f64; 2],
    /// Water level at each output time, m above datum.
    pub levels: Vec<f64>,
}

/// When a check point first meets its target.
#[derive(Debug, Clone)]
pub struct PointTime {
    /// Check point name.
    pub name: String,
    /// Target level, m.
    pub target_level: f64,
    /// First time at or below the target, s; `None` if not within the programme.
    pub time: Option<f64>,
}

/// One stage's answer.
#[derive(Debug, Clone)]
pub struct StageAnswer {
    /// Name.
    pub name: String,
    /// Planned start, s.
    pub planned_start: f64,
    /// End of the stage (next stage's start or the end of pumping), s.
    pub end: f64,
    /// Formation level reached, m.
    pub formation_level: f64,
    /// Target level of its check points, m.
    pub target_level: f64,
    /// Earliest time every point meets the target, s; `None`: not within the programme.
    pub earliest: Option<f64>,
    /// The last point to meet it (or the one furthest from it).
    pub critical_point: String,
    /// Scheduled flow at the stage start, m³/s.
    pub flow: f64,
    /// Volume pumped during the stage, m³.
    pub volume: f64,
}

impl StageAnswer {
    /// Ready by its planned start.
    pub fn ready(&self) -> bool {
        self.earliest.is_some_and(|t| t <= self.planned_start + 1.0)
    }
}

/// Time to flood after a failure at the worst moment.
#[derive(Debug, Clone)]
pub struct Flood {
    /// Moment of the failure, s.
    pub moment: f64,
    /// Stage active then.
    pub stage: String,
    /// Point that floods.
    pub point: String,
    /// Level the water must stay below, m: formation, or for a relief excavation the head at
    /// which the factor of safety against uplift falls to 1.0 (as a field level).
    pub formation_level: f64,
    /// The excavation is relief only (`control = "relieve"`): "flood" means uplift FoS 1.0.
    pub relief: bool,
    /// Margin below that level at the failure, m.
    pub margin: f64,
    /// Time from failure until water stands above that level with every pump off, s (`None`:
    /// not within [`FLOOD_SEARCH`]).
    pub all_off: Option<f64>,
    /// The most important well.
    pub well: String,
    /// Time to flood with only that well off, s (`None`: the others hold the water down).
    pub well_off: Option<f64>,
}

/// Recovery after the pumps stop at the end of the programme.
#[derive(Debug, Clone)]
pub struct Recovery {
    /// Point followed (the excavation point with the least drawdown at switch-off).
    pub point: String,
    /// Drawdown at switch-off, m.
    pub drawdown_at_stop: f64,
    /// Residual drawdown at the end of the recovery followed, m.
    pub residual_at_end: f64,
    /// Time after switch-off until 90 % of the drawdown has recovered, s.
    pub to_90_percent: Option<f64>,
    /// Time after switch-off until the water stands above the last formation level, s.
    pub above_formation: Option<f64>,
}

/// Drawdown on a regular grid at one time. Node (i, j) at origin + (i, j)·step; row-major j·nx+i.
#[derive(Debug, Clone)]
pub struct DrawdownMap {
    /// Time, s.
    pub time: f64,
    /// Node (0, 0), m.
    pub origin: [f64; 2],
    /// Spacing, m.
    pub step: f64,
    /// Nodes along x.
    pub nx: usize,
    /// Nodes along y.
    pub ny: usize,
    /// Drawdown at each node, m.
    pub drawdown: Vec<f64>,
}

/// Everything the programme answers.
#[derive(Debug, Clone)]
pub struct ProgrammeAnswers {
    /// Output times, s.
    pub times: Vec<f64>,
    /// Total scheduled flow at each output time, m³/s.
    pub flows: Vec<f64>,
    /// Volume pumped from day 0 to each output time, m³.
    pub volumes: Vec<f64>,
    /// Stage active at each output time (`None` after pumping).
    pub stage_at: Vec<Option<usize>>,
    /// Hydrographs.
    pub hydrographs: Vec<Hydrograph>,
    /// Every check point with a target.
    pub point_times: Vec<PointTime>,
    /// Every stage.
    pub stages: Vec<StageAnswer>,
    /// Total volume pumped, m³.
    pub total_volume: f64,
    /// Time to flood at the worst moment.
    pub flood: Option<Flood>,
    /// Recovery after the pumps stop.
    pub recovery: Option<Recovery>,
    /// Drawdown maps at the chosen times.
    pub maps: Vec<DrawdownMap>,
    /// End of pumping, s.
    pub duration: f64,
    /// Wells that fall below their lowest allowed level while scheduled to pump.
    pub well_breaches: Vec<WellBreach>,
    /// t* and the programme against the steady check there (`None`: leaky, or no rates).
    pub steady: Option<SteadyLink>,
    /// Wells whose image series was cut before its tolerance (see the programme notes).
    pub images_capped: usize,
    /// How far images are kept from each well, m ([`crate::transient::programme::image_reach`]).
    pub image_reach: f64,
    /// Lowest allowed level of each well (in the order of the well hydrographs), m.
    pub well_floors: Vec<f64>,
    /// R(t) = √(2.25·T·t/S) at each output time, m (Cooper & Jacob 1946).
    pub cooper_jacob_radius: Vec<f64>,
}

/// Output times: 0, step, 2·step … to duration + recovery, with every stage start and the end of
/// pumping added, sorted, without repeats.
pub fn output_times(starts: &[f64], duration: f64, recovery: f64, step: f64) -> Vec<f64> {
    let end = duration + recovery;
    let n = (end / step).ceil() as usize;
    let mut t: Vec<f64> = (0..=n).map(|k| (k as f64 * step).min(end)).collect();
    t.extend_from_slice(starts);
    t.push(duration);
    t.sort_by(f64::total_cmp);
    t.dedup_by(|a, b| (*a - *b).abs() < 1e-6);
    t
}

/// First time after `from` (s) that the drawdown at `point` falls below `limit` (m), searched
/// to `from + cap`: 300 times spaced geometrically from 1 s, then bisection. `None` if it
/// stays at or above the limit.
pub fn time_until_below(
    model: &TransientModel,
    point: [f64; 2],
    limit: f64,
    from: f64,
    cap: f64,
) -> Option<f64> {
    let below = |t: f64| model.drawdown_at(point, t) < limit;
    if below(from) {
        return Some(0.0);
    }
    let n = 300;
    let ratio = cap.max(2.0).powf(1.0 / n as f64);
    let mut lo = from;
    for i in 1..=n {
        let t = from + ratio.powi(i);
        if below(t) {
            return Some(first_true(lo, t, below) - from);
        }
        lo = t;
    }
    None
}

fn first_crossing(times: &[f64], values: &[bool], ok: impl Fn(f64) -> bool) -> Option<f64> {
    let k = values.iter().position(|v| *v)?;
    if k == 0 {
        return Some(times[0]);
    }
    Some(first_true(times[k - 1], times[k], ok))
}

/// The check points of excavation `e` that decide when it can be dug: grid, corners, edges.
pub fn points_in_excavation(points: &[CheckPoint], e: usize) -> Vec<usize> {
    (0..points.len())
        .filter(|&i| {
            points[i].excavation == Some(e)
                && matches!(
                    points[i].kind,
                    PointKind::Grid | PointKind::Corner | PointKind::Edge
                )
        })
        .collect()
}

/// When each check point with a target first meets it; `d` are the drawdowns at `times`.
fn point_times(
    model: &Model,
    tm: &TransientModel,
    points: &[CheckPoint],
    times: &[f64],
    d: &[Vec<f64>],
) -> Vec<PointTime> {
    let h0 = model.aquifer.initial_level;
    let with_target: Vec<usize> = (0..points.len())
        .filter(|&i| points[i].target_level.is_some())
        .collect();
    with_target
        .par_iter()
        .map(|&i| {
            let p = &points[i];
            let target = p.target_level.unwrap_or(h0);
            let need = h0 - target;
            let met: Vec<bool> = d[i].iter().map(|s| *s >= need).collect();
            PointTime {
                name: p.name.clone(),
                target_level: target,
                time: first_crossing(times, &met, |t| tm.drawdown_at(p.position, t) >= need),
            }
        })
        .collect()
}

/// Each stage: the earliest moment all its excavation's points meet its target, the critical
/// point (the last to meet it, or the furthest from it), its flow and volume.
fn stage_answers(
    model: &Model,
    prog: &Programme,
    setup: &ProgrammeSetup,
    points: &[CheckPoint],
    times: &[f64],
    d: &[Vec<f64>],
    in_exc: &dyn Fn(usize) -> Vec<usize>,
) -> Vec<StageAnswer> {
    let tm = &setup.model;
    let h0 = model.aquifer.initial_level;
    let starts: Vec<f64> = prog.stages.iter().map(|s| s.start).collect();
    prog.stages
        .iter()
        .enumerate()
        .map(|(k, st)| {
            let target = stage_levels(model, st.excavation, st.formation_level).target;
            let need = h0 - target;
            let idx = in_exc(st.excavation);
            let all_met = |t: f64| {
                idx.iter()
                    .all(|&i| tm.drawdown_at(points[i].position, t) >= need)
            };
            let met: Vec<bool> = (0..times.len())
                .map(|j| times[j] < prog.duration && idx.iter().all(|&i| d[i][j] >= need))
                .collect();
            let earliest = if need <= 0.0 {
                Some(0.0)
            } else {
                first_crossing(times, &met, all_met)
            };
            // The critical point: the last to meet the target, or the furthest from it.
            let at = earliest.unwrap_or(prog.duration * (1.0 - 1e-9));
            let critical = idx
                .iter()
                .min_by(|&&a, &&b| {
                    tm.drawdown_at(points[a].position, at)
                        .total_cmp(&tm.drawdown_at(points[b].position, at))
                })
                .map_or(String::new(), |&i| points[i].name.clone());
            let end = starts.get(k + 1).copied().unwrap_or(prog.duration);
            StageAnswer {
                name: st.name.clone(),
                planned_start: st.start,
                end,
                formation_level: st.formation_level,
                target_level: target,
                earliest,
                critical_point: critical,
                flow: setup.flow_at(st.start),
                volume: setup.volume_between(st.start, end),
            }
        })
        .collect()
}

/// Hydrographs at the named points, the neighbours' corners and the wells (in the wells the
/// level inside, after the well loss at the rate of that time), with the wells' breaches.
fn hydrographs(
    model: &Model,
    prog: &Programme,
    setup: &ProgrammeSetup,
    times: &[f64],
) -> (Vec<Hydrograph>, Vec<WellBreach>) {
    let tm = &setup.model;
    let h0 = model.aquifer.initial_level;
    let mut places: Vec<(String, SeriesKind, [f64; 2])> = Vec::new();
    for (name, p, _) in &model.checks.points {
        places.push((name.clone(), SeriesKind::Point, *p));
    }
    for (name, p) in &prog.points {
        places.push((name.clone(), SeriesKind::Point, *p));
    }
    for n in &model.neighbours {
        let ring = &n.footprint.exterior().0;
        for (i, c) in ring.iter().take(ring.len().saturating_sub(1)).enumerate() {
            places.push((
                format!("{} corner {}", n.name, i + 1),
                SeriesKind::Neighbour,
                [c.x, c.y],
            ));
        }
    }
    for w in &setup.wells {
        places.push((w.name.clone(), SeriesKind::Well, w.position));
    }
    let n_wells = setup.wells.len();
    let n_other = places.len() - n_wells;
    let place_pos: Vec<[f64; 2]> = places[..n_other].iter().map(|p| p.2).collect();
    let mut levels: Vec<Vec<f64>> = tm
        .drawdowns(&place_pos, times)
        .into_iter()
        .map(|s| s.iter().map(|s| h0 - s).collect())
        .collect();
    // in the wells: the level inside, after the well loss at the rate of that time
    let well_levels: Vec<Vec<f64>> = (0..n_wells)
        .into_par_iter()
        .map(|j| {
            times
                .iter()
                .map(|t| level_in_well(model, tm, j, setup.wells[j].position, *t))
                .collect()
        })
        .collect();
    let well_breaches = breaches(model, tm, &setup.wells, times, &well_levels, prog.duration);
    levels.extend(well_levels);
    let hydrographs = places
        .into_iter()
        .zip(levels)
        .map(|((name, kind, position), levels)| Hydrograph {
            name,
            kind,
            position,
            levels,
        })
        .collect();
    (hydrographs, well_breaches)
}

/// Answer the programme on its setup. See the module notes for the method.
pub fn answer(model: &Model, setup: &ProgrammeSetup) -> ProgrammeAnswers {
    let prog = model
        .programme
        .as_ref()
        .expect("answer is called on a model with a programme");
    let tm = &setup.model;
    let starts: Vec<f64> = prog.stages.iter().map(|s| s.start).collect();
    let times = output_times(&starts, prog.duration, prog.recovery, prog.output_step);
    let stage_of = |t: f64| -> Option<usize> {
        (t < prog.duration)
            .then(|| starts.iter().rposition(|s| *s <= t))
            .flatten()
    };
    let stage_at: Vec<Option<usize>> = times.iter().map(|t| stage_of(*t)).collect();
    let flows: Vec<f64> = times.iter().map(|t| setup.flow_at(*t)).collect();
    let volumes: Vec<f64> = times
        .iter()
        .map(|t| setup.volume_between(0.0, *t))
        .collect();

    // Check points and their drawdowns at every output time.
    let points = check_points(model);
    let positions: Vec<[f64; 2]> = points.iter().map(|p| p.position).collect();
    let d = tm.drawdowns(&positions, &times);
    let point_times = point_times(model, tm, &points, &times, &d);

    let in_exc = |e: usize| points_in_excavation(&points, e);
    let stages = stage_answers(model, prog, setup, &points, &times, &d, &in_exc);
    let total_volume = setup.volume_between(0.0, prog.duration);
    let (hydrographs, well_breaches) = hydrographs(model, prog, setup, &times);

    let flood = flood(model, setup, &times, &stages, &in_exc);
    let recovery = recovery(model, setup, &times, &d, &in_exc);
    let maps = prog
        .map_times
        .iter()
        .map(|t| drawdown_map(model, setup, *t))
        .collect();
    let steady = steady_link(model, setup);
    let well_floors = setup
        .wells
        .iter()
        .map(|w| lowest_allowed(model, w).0)
        .collect();
    let (tr, st) = diffusion_parameters(&setup.aquifer);
    let cooper_jacob_radius = times.iter().map(|t| (2.25 * tr * t / st).sqrt()).collect();
    ProgrammeAnswers {
        well_floors,
        cooper_jacob_radius,
        image_reach: setup.image_reach,
        well_breaches,
        steady,
        images_capped: setup.images_capped,
        times,
        flows,
        volumes,
        stage_at,
        hydrographs,
        point_times,
        stages,
        total_volume,
        flood,
        recovery,
        maps,
        duration: prog.duration,
    }
}

/// The levels a stage is judged by, as field levels (m).
pub struct StageLevels {
    /// The level the water must be below before digging: formation − margin, or for relief the
    /// head at the required factor of safety against uplift (the lower of the two for
    /// `control = "both"`).
    pub target: f64,
    /// The level above which the stage floods: water above formation, or for relief the head at
    /// which the uplift factor of safety falls to 1.0 (the lower of the two for `"both"`).
    pub flood: f64,
    /// The flood level is the uplift one.
    pub relief: bool,
}

/// The levels of a stage at `formation` in `excavation` by its `control`: `"dewater"` formation
/// (− margin), `"relieve"` the relief heads (h_req = z_top + σ_v/(γ_w·FoS),
/// [`crate::physics::uplift`], taken off the initial level as
/// [`crate::field::checkpoints::field_target`] does) at the required factor of safety and at
/// 1.0, `"both"` the lower of each pair — the same rule as the steady design's
/// [`crate::field::checkpoints::design_target`].
pub fn stage_levels(model: &Model, excavation: usize, formation: f64) -> StageLevels {
    let e = &model.excavations[excavation];
    let dewater = StageLevels {
        target: formation - e.target_margin,
        flood: formation,
        relief: false,
    };
    let Some(u) = model.uplift.as_ref() else {
        return dewater;
    };
    let sigma = overburden(u.soil_unit_weight, formation, u.layer_top);
    let field = |fos: f64| {
        model.aquifer.initial_level - (u.piezometric_level - required_head(sigma, u.layer_top, fos))
    };
    let (required, at_one) = (field(u.factor_of_safety), field(1.0));
    match e.control {
        Control::Dewater => dewater,
        Control::Relieve => StageLevels {
            target: required,
            flood: at_one,
            relief: true,
        },
        Control::Both => StageLevels {
            target: required.min(dewater.target),
            flood: at_one.min(formation),
            relief: at_one < formation,
        },
    }
}

/// The failure at one moment `t` in stage `k`: the excavation point with the least margin below
/// formation (none when the stage is not dry there), that margin, and the time until water stands
/// above formation there with every pump off.
type FloodMoment = (usize, f64, Option<f64>);

fn flood_at(
    model: &Model,
    setup: &ProgrammeSetup,
    idx: &[usize],
    points: &[crate::field::checkpoints::CheckPoint],
    k: usize,
    t: f64,
) -> Option<FloodMoment> {
    let prog = model.programme.as_ref()?;
    let h0 = model.aquifer.initial_level;
    let st = &prog.stages[k];
    let f = stage_levels(model, st.excavation, st.formation_level).flood;
    let (i, margin) = idx
        .iter()
        .map(|&i| (i, f - (h0 - setup.model.drawdown_at(points[i].position, t))))
        .min_by(|a, b| a.1.total_cmp(&b.1))?;
    if margin <= 0.0 {
        return None;
    }
    let sch: Vec<_> = setup.schedules.iter().map(|s| switched_off(s, t)).collect();
    let ttf = setup
        .with_schedules(sch)
        .ok()
        .and_then(|m| time_until_below(&m, points[i].position, h0 - f, t, FLOOD_SEARCH));
    Some((i, margin, ttf))
}

/// Golden-section search for the least time to flood on [a, b] (s) in stage k, to 60 s.
fn refine_flood(eval: impl Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
    let g = 0.5 * (5f64.sqrt() - 1.0);
    let mut c = b - g * (b - a);
    let mut d = a + g * (b - a);
    let (mut fc, mut fd) = (eval(c), eval(d));
    for _ in 0..60 {
        if b - a <= 60.0 {
            break;
        }
        if fc <= fd {
            b = d;
            d = c;
            fd = fc;
            c = b - g * (b - a);
            fc = eval(c);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + g * (b - a);
            fd = eval(d);
        }
    }
    if fc <= fd {
        c
    } else {
        d
    }
}

fn flood(
    model: &Model,
    setup: &ProgrammeSetup,
    times: &[f64],
    stages: &[StageAnswer],
    in_exc: &dyn Fn(usize) -> Vec<usize>,
) -> Option<Flood> {
    let prog = model.programme.as_ref()?;
    let h0 = model.aquifer.initial_level;
    let points = check_points(model);
    // Moments digging is under way: every output time, each stage's start and the earliest
    // moment it can be dug, within the stage and not before that earliest moment.
    let mut moments: Vec<(f64, usize)> = Vec::new();
    for (k, st) in stages.iter().enumerate() {
        let Some(e) = st.earliest else { continue };
        let from = e.max(st.planned_start);
        if from >= st.end {
            continue;
        }
        moments.push((from, k));
        moments.extend(
            times
                .iter()
                .filter(|t| **t > from && **t < st.end)
                .map(|t| (*t, k)),
        );
    }
    let idx_of: Vec<Vec<usize>> = prog.stages.iter().map(|s| in_exc(s.excavation)).collect();
    let ttf_key = |r: &Option<FloodMoment>| r.and_then(|m| m.2).unwrap_or(f64::INFINITY);
    let results: Vec<Option<FloodMoment>> = moments
        .par_iter()
        .map(|&(t, k)| flood_at(model, setup, &idx_of[k], &points, k, t))
        .collect();
    let best = (0..moments.len())
        .filter(|&m| results[m].is_some())
        .min_by(|&a, &b| ttf_key(&results[a]).total_cmp(&ttf_key(&results[b])))?;
    // The worst moment itself: between the moments either side of the best, in its stage.
    let (tb, k) = moments[best];
    let lo = moments[..best]
        .iter()
        .rev()
        .find(|m| m.1 == k)
        .map_or(tb, |m| m.0);
    let hi = moments[best + 1..]
        .iter()
        .find(|m| m.1 == k)
        .map_or(tb, |m| m.0);
    let mut t = tb;
    let mut found = results[best];
    if hi > lo && ttf_key(&found).is_finite() {
        let eval = |x: f64| ttf_key(&flood_at(model, setup, &idx_of[k], &points, k, x));
        let tr = refine_flood(eval, lo, hi);
        let r = flood_at(model, setup, &idx_of[k], &points, k, tr);
        if ttf_key(&r) < ttf_key(&found) {
            t = tr;
            found = r;
        }
    }
    let (i, margin, all_off) = found?;
    let p = points[i].position;
    // The most important well: the most drawdown at p at t from its own sources.
    let (w_best, _) = (0..setup.wells.len())
        .map(|w| {
            let sch: Vec<_> = setup
                .schedules
                .iter()
                .enumerate()
                .map(|(m, s)| {
                    if m == w {
                        s.clone()
                    } else {
                        switched_off(s, 0.0)
                    }
                })
                .collect();
            let s = setup
                .with_schedules(sch)
                .map_or(0.0, |m| m.drawdown_at(p, t));
            (w, s)
        })
        .max_by(|a, b| a.1.total_cmp(&b.1))?;
    let sch: Vec<_> = setup
        .schedules
        .iter()
        .enumerate()
        .map(|(m, s)| {
            if m == w_best {
                switched_off(s, t)
            } else {
                s.clone()
            }
        })
        .collect();
    let st = &prog.stages[k];
    let levels = stage_levels(model, st.excavation, st.formation_level);
    let level = levels.flood;
    let limit = h0 - level;
    let well_off = setup.with_schedules(sch).ok().and_then(|m| {
        // Only while the programme still pumps: beyond its end every pump stops anyway.
        let cap = (prog.duration - t).max(1.0);
        time_until_below(&m, p, limit, t, cap)
    });
    Some(Flood {
        moment: t,
        stage: prog.stages[k].name.clone(),
        point: points[i].name.clone(),
        formation_level: level,
        relief: levels.relief,
        margin,
        all_off,
        well: setup.wells[w_best].name.clone(),
        well_off,
    })
}

fn recovery(
    model: &Model,
    setup: &ProgrammeSetup,
    times: &[f64],
    d: &[Vec<f64>],
    in_exc: &dyn Fn(usize) -> Vec<usize>,
) -> Option<Recovery> {
    let prog = model.programme.as_ref()?;
    let points = check_points(model);
    let last = prog.stages.last()?;
    let j = times.iter().position(|t| *t >= prog.duration)?;
    let idx = in_exc(last.excavation);
    let &i = idx.iter().min_by(|&&a, &&b| d[a][j].total_cmp(&d[b][j]))?;
    let p = points[i].position;
    let s0 = setup.model.drawdown_at(p, prog.duration);
    let end = prog.duration + prog.recovery;
    let h0 = model.aquifer.initial_level;
    Some(Recovery {
        point: points[i].name.clone(),
        drawdown_at_stop: s0,
        residual_at_end: setup.model.drawdown_at(p, end),
        to_90_percent: time_until_below(&setup.model, p, 0.1 * s0, prog.duration, prog.recovery),
        above_formation: time_until_below(
            &setup.model,
            p,
            h0 - last.formation_level,
            prog.duration,
            FLOOD_SEARCH,
        ),
    })
}

/// The box a map covers: excavations, wells and neighbours with a margin (40 % of the longer
/// side, at least 30 m), m: [xmin, ymin, xmax, ymax].
pub fn map_box(model: &Model, setup: &ProgrammeSetup) -> [f64; 4] {
    let mut b = [f64::MAX, f64::MAX, f64::MIN, f64::MIN];
    let mut grow = |x: f64, y: f64| {
        b[0] = b[0].min(x);
        b[1] = b[1].min(y);
        b[2] = b[2].max(x);
        b[3] = b[3].max(y);
    };
    for e in &model.excavations {
        for c in &e.outline.exterior().0 {
            grow(c.x, c.y);
        }
    }
    for n in &model.neighbours {
        for c in &n.footprint.exterior().0 {
            grow(c.x, c.y);
        }
    }
    for w in &setup.wells {
        grow(w.position[0], w.position[1]);
    }
    let m = (0.4 * (b[2] - b[0]).max(b[3] - b[1])).max(30.0);
    [b[0] - m, b[1] - m, b[2] + m, b[3] + m]
}

/// The drawdown map at time t (s) on [`MAP_NODES`] nodes along the longer side of [`map_box`].
pub fn drawdown_map(model: &Model, setup: &ProgrammeSetup, t: f64) -> DrawdownMap {
    let b = map_box(model, setup);
    let step = (b[2] - b[0]).max(b[3] - b[1]) / (MAP_NODES - 1) as f64;
    let nx = ((b[2] - b[0]) / step).ceil() as usize + 1;
    let ny = ((b[3] - b[1]) / step).ceil() as usize + 1;
    let pts: Vec<[f64; 2]> = (0..nx * ny)
        .map(|k| [b[0] + (k % nx) as f64 * step, b[1] + (k / nx) as f64 * step])
        .collect();
    let drawdown = setup
        .model
        .drawdowns(&pts, &[t])
        .into_iter()
        .map(|v| v[0])
        .collect();
    DrawdownMap {
        time: t,
        origin: [b[0], b[1]],
        step,
        nx,
        ny,
        drawdown,
    }
}
