//! Designing for a date: the fewest wells and least total flow that meet every target by day N of
//! pumping, instead of at steady state.
//!
//! With every well pumping a constant rate q_j from day 0, the drawdown at check point i at time
//! t is Σⱼ uᵢⱼ(t)·qⱼ with uᵢⱼ the Theis (or Hantush) response per unit rate including the images
//! ([`crate::transient::TransientAquifer::unit_response`]): linear in the rates, so the linear
//! programme of the steady design applies with this matrix — minimise Σqⱼ subject to
//! Σⱼ uᵢⱼqⱼ ≥ s′ᵢ at every target point, Σⱼ u_wj·qⱼ ≤ s′_w,max in every well (its level above
//! pump intake + submergence) and 0 ≤ qⱼ ≤ the pump capacity. Unconfined, the drawdowns are the
//! linear s′ = s − s²/(2H) of Jacob's correction (exact inverse of the model's conversion).
//! A ring's count is searched (doubling, then halving the bracket); any other layout keeps its
//! wells and gets rates only. The answer is re-evaluated with the full transient model.
//! Wells are taken as fully penetrating (see [`crate::transient::programme`]).

use crate::field::checkpoints::check_points;
use crate::field::layout;
use crate::field::wells::Well;
use crate::input::error::InputError;
use crate::input::model::{LayoutKind, Model, RingCount};
use crate::optimise::lp;
use crate::optimise::lp_problem::{Constraint, LpStatus, RateProblem, Sense};
use crate::physics::thiem::jacob_correction;
use crate::transient::programme::{setup_with, DAY};
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

/// Least-flow rates for `wells` to meet every target at time t (s); `None` when infeasible.
fn rates_at(model: &Model, aq: &TransientAquifer, wells: &[Well], t: f64) -> Option<Vec<f64>> {
    let setup = setup_with(
        model,
        aq,
        wells.to_vec(),
        wells
            .iter()
            .map(|_| RateSchedule::constant(0.0, 1.0).expect("a constant schedule is valid"))
            .collect(),
        t,
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
    let h0 = model.aquifer.initial_level;
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
    let a = aq.unit_response(setup.well_radius, &positions, &groups, t);
    let wpos: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
    let aw = aq.unit_response(setup.well_radius, &wpos, &groups, t);
    let mut constraints: Vec<Constraint> = targets
        .iter()
        .zip(a)
        .map(|((name, _, need), row)| Constraint {
            coefficients: row,
            sense: Sense::AtLeast,
            rhs: linear(aq, *need),
            label: format!("target at {name}"),
        })
        .collect();
    let spec = &model.wells;
    for (w, row) in wells.iter().zip(aw) {
        let smax = h0 - (w.pump_intake + spec.submergence);
        if smax > 0.0 {
            constraints.push(Constraint {
                coefficients: row,
                sense: Sense::AtMost,
                rhs: linear(aq, smax),
                label: format!("level in {}", w.name),
            });
        }
    }
    let cap = spec.pump_capacity.unwrap_or(f64::INFINITY);
    let problem = RateProblem {
        costs: vec![1.0; wells.len()],
        bounds: vec![(0.0, cap); wells.len()],
        constraints,
    };
    let sol = lp::solve(&problem);
    (sol.status == LpStatus::Optimal).then(|| sol.values.iter().map(|q| q.max(0.0)).collect())
}

/// Lowest margin (target − level, m) over the target points at time t with these wells, by the
/// full transient model (rates from day 0).
fn worst_margin(model: &Model, aq: &TransientAquifer, wells: &[Well], t: f64) -> f64 {
    let sch = wells
        .iter()
        .map(|w| RateSchedule::constant(0.0, w.rate).expect("finite rate"))
        .collect();
    let Ok(setup) = setup_with(model, aq, wells.to_vec(), sch, t) else {
        return f64::NEG_INFINITY;
    };
    let h0 = model.aquifer.initial_level;
    check_points(model)
        .iter()
        .filter_map(|p| {
            p.target_level
                .map(|z| z - (h0 - setup.model.drawdown_at(p.position, t)))
        })
        .fold(f64::INFINITY, f64::min)
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
    let aq = crate::transient::programme::transient_aquifer(model)?;
    let Some(spec) = model.layout.clone() else {
        return Err(err(
            "layout",
            "design needs a [layout] (ring: the count is searched; others: rates only)".into(),
        ));
    };
    let t = day * DAY;
    let mut trials = Vec::new();
    let mut notes = Vec::new();
    let try_wells = |wells: Vec<Well>, trials: &mut Vec<DatedTrial>| {
        let r = rates_at(model, &aq, &wells, t);
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
            notes.push("the layout's wells are kept; only their rates are found".into());
            let r = try_wells(wells, &mut trials);
            if r.is_none() {
                notes.push(format!(
                    "these wells cannot meet every target by day {day} within the pump capacity and well levels"
                ));
            }
            r
        }
    };
    let wells = found.unwrap_or_default();
    let total = wells.iter().map(|w| w.rate).sum();
    let margin = if wells.is_empty() {
        f64::NEG_INFINITY
    } else {
        worst_margin(model, &aq, &wells, t)
    };
    Ok(DatedDesign {
        day,
        met: !wells.is_empty() && margin >= -TOLERANCE,
        worst_margin: if margin.is_finite() { margin } else { 0.0 },
        wells,
        total,
        trials,
        notes,
    })
}
