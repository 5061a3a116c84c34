//! Designing for a date: the fewest wells and least total flow that meet every target by day N of
//! pumping, instead of at steady state.
//!
//! With every well pumping a constant rate q_j from day 0, the drawdown at check point i at time
//! t is Σⱼ uᵢⱼ(t)·qⱼ with uᵢⱼ the Theis (or Hantush) response per unit rate including the images
//! ([`crate::transient::TransientAquifer::unit_response`]): linear in the rates, so the linear
//! programme of the steady design applies with this matrix — minimise Σqⱼ subject to
//! Σⱼ uᵢⱼqⱼ ≥ s′ᵢ at every target point. The steady design's allowances apply: the targets carry
//! the operating margin; with `one_well_out` every target (without the margin) holds with any
//! one well at rate 0; each rate is at most the capacity fraction of the lower of the pump's and
//! Sichardt's capacity; every well's level, after its loss, stays above its lowest allowed level
//! (pump intake + submergence, or suction) for the whole programme, not only at day N. Partial
//! penetration enters as in the programme. Unconfined, the drawdowns are the linear
//! s′ = s − s²/(2H) of Jacob's correction (exact inverse of the model's conversion).
//! A ring's count is searched (doubling, then halving the bracket); any other layout keeps its
//! wells and gets rates only. The answer is re-evaluated with the full transient model.

use crate::field::checkpoints::check_points;
use crate::field::layout;
use crate::field::wells::Well;
use crate::input::error::InputError;
use crate::input::model::{LayoutKind, Model, RingCount, WellLossSpec};
use crate::optimise::lp;
use crate::optimise::lp_problem::{Constraint, LpStatus, RateProblem, Sense};
use crate::physics::capacity::sichardt_well_capacity;
use crate::physics::thiem::jacob_correction;
use crate::physics::well_loss::jacob_loss;
use crate::transient::programme::{setup_with, DAY};
use crate::transient::well_levels::{level_in_well, lowest_allowed};
use crate::transient::{RateSchedule, TransientAquifer};

/// Largest ring count tried.
pub const MAX_COUNT: usize = 256;
/// Tolerance on a target in the re-evaluation, m.
const TOLERANCE: f64 = 1e-3;

/// One layout tried.
#[derive(Debug, Clone)]
pub struct DatedTrial {
    /// Wells in the layout.
    pub count: usize,
    /// The programme found rates meeting every row.
    pub feasible: bool,
    /// Least total flow, m³/s (when feasible).
    pub total: f64,
}

/// The design for a date.
#[derive(Debug, Clone)]
pub struct DatedDesign {
    /// Day the targets must be met by.
    pub day: f64,
    /// Wells with their rates (empty when nothing was found).
    pub wells: Vec<Well>,
    /// Total flow, m³/s.
    pub total: f64,
    /// The full transient model confirms every target by that day.
    pub met: bool,
    /// Lowest margin below target by that day over the target points, m.
    pub worst_margin: f64,
    /// Lowest margin of a well's level (after its loss) above its lowest allowed level up to
    /// [`DatedDesign::hold_until`], m.
    pub well_margin: f64,
    /// Time up to which the wells are held above their floors, s.
    pub hold_until: f64,
    /// Layouts tried.
    pub trials: Vec<DatedTrial>,
    /// Remarks.
    pub notes: Vec<String>,
}

fn linear(aq: &TransientAquifer, s: f64) -> f64 {
    match *aq {
        TransientAquifer::Unconfined {
            saturated_thickness,
            ..
        } => jacob_correction(s.min(saturated_thickness), saturated_thickness),
        _ => s,
    }
}

/// Largest rate allowed in a well whose screen-face level is `face` (m), m³/s: the capacity
/// fraction of the lower of the pump's capacity and Sichardt's α·h_w (Sichardt 1928;
/// α = 2π·r_w·√K/15) with the wetted screen h_w at that level, as the steady check takes it.
fn rate_cap(model: &Model, w: &Well, face: f64) -> f64 {
    let aq = &model.aquifer;
    let wetted = (w.screen_top.min(face.max(aq.base_level)) - w.screen_base).max(0.0);
    let sichardt = sichardt_well_capacity(w.radius, wetted, aq.conductivity);
    let cap = model
        .wells
        .pump_capacity
        .map_or(sichardt, |p| p.min(sichardt));
    model.design.capacity_fraction * cap
}

/// Least-flow rates with the capacity taken at each well's own level: start from the capacity
/// at the initial level, solve, take each well's face level at `t_hold` (its lowest, the
/// drawdown growing with time), lower any capacity the rate now exceeds, and solve again (at
/// most 8 times; capacities only fall, so the rates found never exceed the capacity at the level
/// they produce, or the layout is refused).
fn rates_within_capacity(
    model: &Model,
    aq: &TransientAquifer,
    wells: &[Well],
    t: f64,
    t_hold: f64,
) -> Option<Vec<f64>> {
    let h0 = model.aquifer.initial_level;
    let mut caps: Vec<f64> = wells.iter().map(|w| rate_cap(model, w, h0)).collect();
    for _ in 0..8 {
        let q = rates_at(model, aq, wells, t, t_hold, &caps)?;
        let placed: Vec<Well> = wells
            .iter()
            .zip(&q)
            .map(|(w, q)| Well {
                rate: *q,
                ..w.clone()
            })
            .collect();
        let sch = placed
            .iter()
            .map(|w| RateSchedule::constant(0.0, w.rate).expect("finite rate"))
            .collect();
        let setup = setup_with(model, aq, placed.clone(), sch, t.max(t_hold)).ok()?;
        let mut changed = false;
        for (j, w) in placed.iter().enumerate() {
            let face = h0 - setup.model.drawdown_at(w.position, t_hold);
            let cap = rate_cap(model, w, face);
            if w.rate > cap * (1.0 + 1e-6) {
                caps[j] = caps[j].min(cap);
                changed = true;
            }
        }
        if !changed {
            return Some(q);
        }
    }
    None
}

/// The most drawdown allowed at a well's screen face, m: initial level − lowest allowed level −
/// the largest loss at its largest rate (Jacob's C·q_max²), or with an efficiency E the face
/// floor z₀ − E·(z₀ − lowest) of the steady design (Kruseman & de Ridder 1994, ch. 14).
fn face_limit(model: &Model, w: &Well, q_max: f64) -> f64 {
    let z0 = model.aquifer.initial_level;
    let (lowest, _) = lowest_allowed(model, w);
    let floor = match model.as_built.loss {
        WellLossSpec::Jacob(c) => lowest + jacob_loss(c, q_max),
        WellLossSpec::Efficiency(e) if lowest < z0 => z0 - e * (z0 - lowest),
        _ => lowest,
    };
    z0 - floor.max(model.aquifer.base_level + 0.01)
}

/// Least-flow rates for `wells` to meet every target at time `t` (s) with the steady design's
/// allowances, and to keep every well above its lowest allowed level up to `t_hold` (s);
/// `None` when infeasible.
///
/// Rows: every target drawdown plus the operating margin at t; with one well out, every target
/// itself at t with each well in turn at rate 0 (rows added for the points that fail, until none
/// fails); every well's face drawdown at `t_hold` at most its [`face_limit`]; 0 ≤ q ≤ `caps`.
/// With constant rates from day 0 the drawdown never falls with time (each W(u) grows with t, and
/// the image of a constant-head line is farther than the well), so a well above its floor at
/// `t_hold` is above it before. Partial penetration enters as in the programme.
fn rates_at(
    model: &Model,
    aq: &TransientAquifer,
    wells: &[Well],
    t: f64,
    t_hold: f64,
    caps: &[f64],
) -> Option<Vec<f64>> {
    let setup = setup_with(
        model,
        aq,
        wells.to_vec(),
        wells
            .iter()
            .map(|_| RateSchedule::constant(0.0, 1.0).expect("a constant schedule is valid"))
            .collect(),
        t.max(t_hold),
    )
    .ok()?;
    let groups: Vec<(f64, Vec<[f64; 3]>)> = wells
        .iter()
        .zip(&setup.images)
        .map(|(w, imgs)| {
            let mut m = vec![[w.position[0], w.position[1], 1.0]];
            m.extend(imgs.iter().map(|(p, s)| [p[0], p[1], *s]));
            (0.0, m)
        })
        .collect();
    // unit responses in the linear drawdown s′, with the partial-penetration term
    let response = |positions: &[[f64; 2]], time: f64| -> Vec<Vec<f64>> {
        let mut m = aq.unit_response(setup.well_radius, positions, &groups, time);
        if let Some(n) = &setup.near {
            for (row, p) in m.iter_mut().zip(positions) {
                for (v, pp) in row.iter_mut().zip((n.rows)(*p)) {
                    *v -= pp / n.transmissivity;
                }
            }
        }
        m
    };
    let h0 = model.aquifer.initial_level;
    let margin = model.design.operating_margin;
    let pts = check_points(model);
    let targets: Vec<(&str, [f64; 2], f64)> = pts
        .iter()
        .filter_map(|p| {
            p.target_level
                .map(|z| (p.name.as_str(), p.position, h0 - z))
        })
        .filter(|p| p.2 > 0.0)
        .collect();
    let positions: Vec<[f64; 2]> = targets.iter().map(|p| p.1).collect();
    let a = response(&positions, t);
    let wpos: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
    let aw = response(&wpos, t_hold);
    let mut constraints: Vec<Constraint> = targets
        .iter()
        .zip(&a)
        .map(|((name, _, need), row)| Constraint {
            coefficients: row.clone(),
            sense: Sense::AtLeast,
            rhs: linear(aq, need + margin),
            label: format!("target at {name}"),
        })
        .collect();
    for ((w, row), cap) in wells.iter().zip(aw).zip(caps) {
        let smax = face_limit(model, w, *cap);
        if smax <= 0.0 {
            return None;
        }
        constraints.push(Constraint {
            coefficients: row,
            sense: Sense::AtMost,
            rhs: linear(aq, smax),
            label: format!("level in {}", w.name),
        });
    }
    let bounds: Vec<(f64, f64)> = caps.iter().map(|c| (0.0, *c)).collect();
    for _round in 0..12 {
        let problem = RateProblem {
            costs: vec![1.0; wells.len()],
            bounds: bounds.clone(),
            constraints: constraints.clone(),
        };
        let sol = lp::solve(&problem);
        if sol.status != LpStatus::Optimal {
            return None;
        }
        let q: Vec<f64> = sol.values.iter().map(|q| q.max(0.0)).collect();
        if !model.design.one_well_out || wells.is_empty() {
            return Some(q);
        }
        if wells.len() == 1 {
            // With its only well out nothing pumps: as the steady design judges it.
            return None;
        }
        // one well out: for each well, the point that fails worst without it gets a row
        let mut added = false;
        for k in 0..wells.len() {
            let worst = targets
                .iter()
                .zip(&a)
                .map(|((name, _, need), row)| {
                    let s: f64 = row
                        .iter()
                        .zip(&q)
                        .enumerate()
                        .filter(|(j, _)| *j != k)
                        .map(|(_, (u, q))| u * q)
                        .sum();
                    (s - linear(aq, *need), name, row)
                })
                .min_by(|x, y| x.0.total_cmp(&y.0));
            if let Some((short, name, row)) = worst {
                if short < -1e-6 {
                    let mut c = row.clone();
                    c[k] = 0.0;
                    constraints.push(Constraint {
                        coefficients: c,
                        sense: Sense::AtLeast,
                        rhs: linear(
                            aq,
                            targets.iter().find(|p| p.0 == *name).map_or(0.0, |p| p.2),
                        ),
                        label: format!("target at {name} with {} out", wells[k].name),
                    });
                    added = true;
                }
            }
        }
        if !added {
            return Some(q);
        }
    }
    None
}

/// Lowest margin (target − level, m) over the target points at time t with these wells, by the
/// full transient model (rates from day 0), and the lowest margin of a well above its lowest
/// allowed level (level inside, after its loss) at every output-like time up to `t_hold`.
fn worst_margins(
    model: &Model,
    aq: &TransientAquifer,
    wells: &[Well],
    t: f64,
    t_hold: f64,
) -> (f64, f64) {
    let sch = wells
        .iter()
        .map(|w| RateSchedule::constant(0.0, w.rate).expect("finite rate"))
        .collect();
    let Ok(setup) = setup_with(model, aq, wells.to_vec(), sch, t.max(t_hold)) else {
        return (f64::NEG_INFINITY, f64::NEG_INFINITY);
    };
    let h0 = model.aquifer.initial_level;
    let targets = check_points(model)
        .iter()
        .filter_map(|p| {
            p.target_level
                .map(|z| z - (h0 - setup.model.drawdown_at(p.position, t)))
        })
        .fold(f64::INFINITY, f64::min);
    let checks: Vec<f64> = (1..=20).map(|i| t_hold * i as f64 / 20.0).collect();
    let in_wells = wells
        .iter()
        .enumerate()
        .flat_map(|(j, w)| {
            let lowest = lowest_allowed(model, w).0;
            let setup = &setup;
            checks
                .iter()
                .map(move |&tc| level_in_well(model, &setup.model, j, w.position, tc) - lowest)
        })
        .fold(f64::INFINITY, f64::min);
    (targets, in_wells)
}

/// The fewest wells (ring count) and least flow meeting every target by `day` of pumping.
/// Errors: no layout, a day outside 0 … 7300, the aquifer's storage missing.
pub fn design_by_day(model: &Model, day: f64) -> Result<DatedDesign, InputError> {
    let err = |field: &str, m: String| InputError {
        file: model.file.clone(),
        field: field.into(),
        line: None,
        message: m,
    };
    if !(day.is_finite() && day > 0.0 && day <= 7300.0) {
        return Err(err(
            "--by-day",
            format!("{day}: the day must be more than 0 and at most 7300 (20 years)"),
        ));
    }
    if !model.walls.is_empty() {
        return Err(err(
            "wall",
            "a design by day works in time, which does not take cut-off walls yet ([[wall]] entries): `check` and `design` (steady) do; for a design by day, leave the walls out in a copy of the file".into(),
        ));
    }
    if model.layers.is_some() {
        // Theis superposition in one aquifer: layered ground would be answered silently as if
        // it were the design aquifer alone.
        return Err(err(
            "layer",
            "a design by day works in time, which does not take layered ground yet ([[layer]] entries): `check` and `design` (steady) do; for a design by day, describe the aquifer the wells pump as a single [aquifer] in a copy of the file".into(),
        ));
    }
    let aq = crate::transient::programme::transient_aquifer(model)?;
    let Some(spec) = model.layout.clone() else {
        return Err(err(
            "layout",
            "design needs a [layout] (ring: the count is searched; others: rates only)".into(),
        ));
    };
    let t = day * DAY;
    // the wells must stay above their floors for the whole programme (at least to day N)
    let t_hold = model.programme.as_ref().map_or(t, |p| p.duration.max(t));
    let mut trials = Vec::new();
    // The allowances (margin, capacity fraction, one well out) are model data: the report
    // states them in the user's units.
    let mut notes = Vec::new();
    let try_wells = |wells: Vec<Well>, trials: &mut Vec<DatedTrial>| {
        let r = rates_within_capacity(model, &aq, &wells, t, t_hold);
        trials.push(DatedTrial {
            count: wells.len(),
            feasible: r.is_some(),
            total: r.as_ref().map_or(0.0, |q| q.iter().sum()),
        });
        r.map(|q| {
            wells
                .into_iter()
                .zip(q)
                .map(|(mut w, q)| {
                    w.rate = q;
                    w
                })
                .collect::<Vec<Well>>()
        })
    };
    let found: Option<Vec<Well>> = match &spec.kind {
        LayoutKind::Ring { .. } => {
            let ring = |n: usize| -> Option<Vec<Well>> {
                let mut s = spec.clone();
                if let LayoutKind::Ring { count, .. } = &mut s.kind {
                    *count = RingCount::Count(n as u32);
                }
                layout::generate(model, &s, 0.0).ok().map(|p| p.wells)
            };
            let mut lo = 0usize; // largest infeasible count tried
            let mut hi: Option<(usize, Vec<Well>)> = None;
            let mut n = 4usize;
            while n <= MAX_COUNT {
                if let Some(w) = ring(n).and_then(|w| try_wells(w, &mut trials)) {
                    hi = Some((n, w));
                    break;
                }
                lo = n;
                n *= 2;
            }
            if let Some((mut h, mut best)) = hi {
                while h - lo > 1 {
                    let m = lo + (h - lo) / 2;
                    match ring(m).and_then(|w| try_wells(w, &mut trials)) {
                        Some(w) => {
                            h = m;
                            best = w;
                        }
                        None => lo = m,
                    }
                }
                Some(best)
            } else {
                notes.push(format!(
                    "no ring of up to {MAX_COUNT} wells meets every target by day {day} within the pump capacity and well levels"
                ));
                None
            }
        }
        _ => {
            let wells = layout::from_model(model, None)?.wells;
            let single = wells.len() == 1;
            notes.push("the layout's wells are kept; only their rates are found".into());
            let r = try_wells(wells, &mut trials);
            if r.is_none() && single && model.design.one_well_out {
                notes.push("one well cannot meet any target with one well out (nothing pumps while it is out): add a well, or set allowances.one_well_out = false and keep a standby pump".into());
            } else if r.is_none() {
                notes.push(format!(
                    "these wells cannot meet every target by day {day} within the pump capacity and well levels"
                ));
            }
            r
        }
    };
    let wells = found.unwrap_or_default();
    let total = wells.iter().map(|w| w.rate).sum();
    let (margin, well_margin) = if wells.is_empty() {
        (f64::NEG_INFINITY, f64::NEG_INFINITY)
    } else {
        worst_margins(model, &aq, &wells, t, t_hold)
    };
    Ok(DatedDesign {
        day,
        met: !wells.is_empty() && margin >= -TOLERANCE && well_margin >= -TOLERANCE,
        worst_margin: if margin.is_finite() { margin } else { 0.0 },
        well_margin: if well_margin.is_finite() {
            well_margin
        } else {
            0.0
        },
        hold_until: t_hold,
        wells,
        total,
        trials,
        notes,
    })
}
