//! Free placement: the fewest wells on candidate positions (`placement = "fewest"`, the
//! default for rings), not only on evenly spaced rings.
//!
//! **Candidates.** Positions every `candidate_step` m (default: the minimum spacing; larger
//! when a ring would hold more than [`MAX_CANDIDATES`]) along the ring at the layout's offset and at each `candidate_offsets`, plus the user's `candidates`,
//! less those in a keep-out zone.
//!
//! **The problem** is a mixed-integer programme: a binary yⱼ "well here" per candidate,
//! minimise Σ yⱼ subject to qⱼ ≤ Cⱼ·yⱼ (Cⱼ the capacity at the initial level times the capacity
//! fraction), every target with the operating margin, every target with any one well out, the
//! lowest level in each well, and yᵢ + yⱼ ≤ 1 for candidates closer than the minimum spacing.
//!
//! **The choice: a heuristic with a proven lower bound**, not a branch and bound. The
//! programme's rows are dense (every well draws at every target) and the one-well-out rows
//! come by row generation; microlp's branch and bound on a few hundred binaries with those
//! rows is far slower than the rest of `drydig design`. Instead:
//! 1. *LP relaxation.* With yⱼ relaxed to [0, 1] the best yⱼ is qⱼ / Cⱼ, so the relaxation is
//!    the rate programme with cost 1/Cⱼ per unit rate (every target, one well out, the level
//!    and capacity rows of every candidate; spacing rows relaxed). Its value V bounds the
//!    answer below: no placement on these candidates needs fewer than ⌈V⌉ wells. (The level
//!    rows of candidates left idle are kept in the relaxation; a level row binds only where a
//!    pumping well's level falls to its lowest, which an idle position never reaches before
//!    its pumping neighbours do.)
//! 2. *Rounding.* A few reweighted relaxations (cost 1/(Cⱼ·(yⱼ + ε)), which concentrates the
//!    rates on fewer positions), then candidates in order of yⱼ, each kept when it stands at
//!    least the minimum spacing from every one kept: the support of the relaxation, respecting
//!    spacing.
//! 3. *Greedy removal* from each of those starts and from the best evenly spaced ring: the
//!    programme with cost 1/Cⱼ on the kept wells; wells it leaves idle are dropped; then each
//!    working well, least used first, is dropped when the others still meet every rule (the
//!    full programme with one well out, evaluated), until none can go. The fewest is kept.
//! 4. *Two for one:* two neighbouring wells replaced by one on the ring between them while
//!    every rule is still met, each time followed by the greedy removal again.
//!
//! The layout found is then judged by the same path as every other layout tried
//! ([`crate::optimise::trial`]: rates, one well out, plain superposition); the gap to ⌈V⌉ says
//! how far from the fewest it can be.

use crate::field::checkpoints::CheckPoint;
use crate::field::layout::{self, Placement};
use crate::field::wells::Well;
use crate::input::model::{FreePlacementSpec, LayoutKind, LayoutSpec, Model, RingCount};
use crate::optimise::limits::CAPACITY_SAFETY;
use crate::optimise::lp_problem::LpStatus;
use crate::optimise::rates::{LayoutRates, UnitRows};
use crate::optimise::trial::{solve_individual, try_placement, TrialRun};
use std::collections::HashMap;

/// Rates at or below this are idle, m³/s.
const IDLE: f64 = 1e-9;
/// Most candidate positions per ring (the step grows on a long ring), to bound the work.
pub const MAX_CANDIDATES: usize = 80;
/// Most removal passes over the working wells.
const MAX_PASSES: usize = 3;
/// Reweighted relaxations after the first (the ℓ1 reweighting of Candès, Wakin and Boyd,
/// "Enhancing sparsity by reweighted ℓ1 minimization", J. Fourier Anal. Appl. 14, 2008).
const REWEIGHTS: usize = 3;
/// ε of the reweighting: a candidate used at y gets cost 1 / (y + ε) per unit of y.
const REWEIGHT_EPS: f64 = 0.1;

/// What the free placement found.
#[derive(Debug, Clone)]
pub struct Free {
    /// The layout found, judged like every other layout tried.
    pub run: TrialRun,
    /// ⌈V⌉, V the LP relaxation's value: no placement on these candidates has fewer wells.
    pub lower_bound: usize,
    /// V, the relaxation's Σ qⱼ / Cⱼ.
    pub relaxation: f64,
    /// Candidate positions.
    pub candidates: usize,
    /// Layouts judged by the programme during the search.
    pub layouts_judged: usize,
}

/// Why the free placement found nothing.
#[derive(Debug, Clone)]
pub enum NoFree {
    /// No candidate position (keep-out zones cover the rings).
    NoCandidates,
    /// Even every candidate together cannot meet every rule (the relaxation is infeasible).
    Infeasible(usize),
    /// The dense start layout or the final check did not meet every rule.
    NotMet(String),
}

/// The candidate positions and the rings they stand on.
pub fn candidates(
    model: &Model,
    spec: &LayoutSpec,
    free: &FreePlacementSpec,
) -> (Vec<[f64; 2]>, Vec<Vec<[f64; 2]>>) {
    let exc = &model.excavations[spec.excavation];
    // At most MAX_CANDIDATES per ring: the step grows on a long ring.
    let exc_ring = layout::offset_ring(&exc.outline, spec.offset);
    let perimeter: f64 = (0..exc_ring.len())
        .map(|i| dist(exc_ring[i], exc_ring[(i + 1) % exc_ring.len()]))
        .sum();
    let step = free
        .step
        .unwrap_or(model.as_built.min_spacing)
        .max(perimeter / MAX_CANDIDATES as f64);
    let mut points = Vec::new();
    let mut rings = Vec::new();
    let mut offsets = vec![spec.offset];
    offsets.extend(free.offsets.iter().copied());
    for off in offsets {
        let (c, ring) = layout::ring_candidates(model, exc, off, step);
        points.extend(c);
        rings.push(ring);
    }
    points.extend(
        free.points
            .iter()
            .copied()
            .filter(|p| !layout::in_keep_out(model, *p)),
    );
    (points, rings)
}

fn dist(a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - b[0]).hypot(b[1] - a[1])
}

/// The unit rows of every candidate position (and of the wells of a second start) at the
/// design's targets and at those positions,
/// summed once: a layout on candidates takes its columns
/// ([`LayoutRates::with_unit_rows`]) instead of summing its own.
struct CandidateRows {
    /// Column of each candidate position (by the bits of its coordinates).
    column: HashMap<[u64; 2], usize>,
    rows: UnitRows,
}

impl CandidateRows {
    fn new(model: &Model, points: &[CheckPoint], cands: &[[f64; 2]]) -> CandidateRows {
        let rows = LayoutRates::with_groups(model, points, wells_at(model, cands), usize::MAX)
            .into_unit_rows();
        let column = cands
            .iter()
            .enumerate()
            .map(|(i, p)| ([p[0].to_bits(), p[1].to_bits()], i))
            .collect();
        CandidateRows { column, rows }
    }

    /// The columns of `positions`, when every one is a candidate.
    fn columns(&self, positions: &[[f64; 2]]) -> Option<Vec<usize>> {
        positions
            .iter()
            .map(|p| self.column.get(&[p[0].to_bits(), p[1].to_bits()]).copied())
            .collect()
    }
}

/// Wells built to the design file at `positions` (rates 0), named C001 ….
fn wells_at(model: &Model, positions: &[[f64; 2]]) -> Vec<Well> {
    positions
        .iter()
        .enumerate()
        .map(|(i, p)| Well::from_spec(format!("C{:03}", i + 1), *p, 0.0, &model.wells))
        .collect()
}

/// The rate programme on `positions` with cost mⱼ / Cⱼ per unit rate (mⱼ = `multiplier`, 1
/// when not given), every rule of the design: the rates (None when infeasible), whether the
/// evaluation confirms every rule, and the Cⱼ. The unit rows come from `cache` when every
/// position is a candidate (a merged well between two candidates is summed afresh).
fn weighted(
    model: &Model,
    points: &[CheckPoint],
    positions: &[[f64; 2]],
    multiplier: Option<&[f64]>,
    cache: &CandidateRows,
) -> (Option<Vec<f64>>, bool, Vec<f64>) {
    let wells = wells_at(model, positions);
    let mut rates = match cache.columns(positions) {
        Some(cols) => {
            LayoutRates::with_unit_rows(model, points, wells, usize::MAX, &cache.rows, &cols)
        }
        None => LayoutRates::with_groups(model, points, wells, usize::MAX),
    };
    let z0 = model.aquifer.initial_level;
    let caps: Vec<f64> = rates
        .limits
        .iter()
        .map(|l| (l.capacity_at(z0) * CAPACITY_SAFETY).max(1e-9))
        .collect();
    rates.well_cost = Some(
        caps.iter()
            .enumerate()
            .map(|(j, c)| multiplier.map_or(1.0, |m| m[j]) / c)
            .collect(),
    );
    let ind = solve_individual(model, &rates);
    if ind.status != LpStatus::Optimal {
        return (None, false, caps);
    }
    (Some(ind.rates), ind.met, caps)
}

/// Candidates in order of `y` (largest first), each kept when at least the minimum spacing
/// from every one kept; with `support_only`, only those with y above zero.
fn round(model: &Model, cands: &[[f64; 2]], y: &[f64], support_only: bool) -> Vec<[f64; 2]> {
    let mut order: Vec<usize> = (0..cands.len()).collect();
    order.sort_by(|a, b| y[*b].total_cmp(&y[*a]).then(a.cmp(b)));
    let min_spacing = model.as_built.min_spacing;
    let mut kept: Vec<[f64; 2]> = Vec::new();
    for i in order {
        if support_only && y[i] <= 1e-6 {
            break;
        }
        if kept
            .iter()
            .all(|k| dist(*k, cands[i]) >= min_spacing - 1e-9)
        {
            kept.push(cands[i]);
        }
    }
    kept
}

/// The fewest wells on the candidate positions of `spec` (a ring), judged like every layout;
/// `also_from`: the working wells of a layout already met (the best evenly spaced ring), a
/// second start for the greedy removal.
pub fn fewest(
    model: &Model,
    points: &[CheckPoint],
    spec: &LayoutSpec,
    free: &FreePlacementSpec,
    also_from: Option<Vec<[f64; 2]>>,
) -> Result<Free, NoFree> {
    let (cands, rings) = candidates(model, spec, free);
    if cands.is_empty() {
        return Err(NoFree::NoCandidates);
    }
    let mut judged = 1;
    // Unit rows of every candidate and of the second start's wells, summed once.
    let mut rows_at = cands.clone();
    rows_at.extend(also_from.iter().flatten().copied());
    let cache = CandidateRows::new(model, points, &rows_at);
    // 1. The LP relaxation over every candidate.
    let (Some(q), _, caps) = weighted(model, points, &cands, None, &cache) else {
        return Err(NoFree::Infeasible(cands.len()));
    };
    let mut y: Vec<f64> = q.iter().zip(&caps).map(|(q, c)| q / c).collect();
    let relaxation: f64 = y.iter().sum();
    let lower_bound = ((relaxation - 1e-6).ceil().max(1.0)) as usize;
    // 2. Reweighted relaxations (cost 1 / (Cⱼ·(yⱼ + ε))) concentrate the rates on fewer
    //    positions; then rounding by y with the minimum spacing.
    for _ in 0..REWEIGHTS {
        let m: Vec<f64> = y.iter().map(|y| 1.0 / (y + REWEIGHT_EPS)).collect();
        judged += 1;
        match weighted(model, points, &cands, Some(&m), &cache) {
            (Some(q), _, _) => y = q.iter().zip(&caps).map(|(q, c)| q / c).collect(),
            _ => break,
        }
    }
    let mut starts = vec![round(model, &cands, &y, true)];
    starts.extend(also_from);
    // 3. Greedy removal from each start; the fewest kept.
    let mut best: Option<Vec<[f64; 2]>> = None;
    for start in starts {
        if let Some(k) = greedy(model, points, start, lower_bound, &mut judged, &cache) {
            if best.as_ref().is_none_or(|b| k.len() < b.len()) {
                best = Some(k);
            }
        }
    }
    let Some(mut kept) = best else {
        return Err(NoFree::NotMet(
            "the candidate positions at the minimum spacing do not meet every rule".into(),
        ));
    };
    // 4. Two for one: neighbours merged into one well on the ring between them.
    if let Some(ring) = rings.first() {
        while kept.len() > lower_bound {
            match merge_pair(model, points, ring, &kept, &mut judged, &cache) {
                Some(k) => {
                    kept = greedy(model, points, k, lower_bound, &mut judged, &cache)
                        .unwrap_or_default()
                }
                None => break,
            }
        }
    }
    let best = Some(kept);
    let Some(kept) = best else {
        return Err(NoFree::NotMet(
            "the candidate positions at the minimum spacing do not meet every rule".into(),
        ));
    };
    let run = judge_found(model, points, spec, kept, rings);
    if !run.trial.individual_met {
        return Err(NoFree::NotMet(format!(
            "the {} wells found do not pass the final check",
            run.trial.count
        )));
    }
    Ok(Free {
        run,
        lower_bound,
        relaxation,
        candidates: cands.len(),
        layouts_judged: judged,
    })
}

/// Greedy removal from `kept` (which must meet every rule, else `None`): the programme with
/// cost 1/Cⱼ; wells it leaves idle are dropped; then each working well, least used first, is
/// dropped when the others still meet every rule, until none can go (or the lower bound is
/// reached).
fn greedy(
    model: &Model,
    points: &[CheckPoint],
    mut kept: Vec<[f64; 2]>,
    lower_bound: usize,
    judged: &mut usize,
    cache: &CandidateRows,
) -> Option<Vec<[f64; 2]>> {
    *judged += 1;
    let (Some(mut rates), true, mut caps) = weighted(model, points, &kept, None, cache) else {
        return None;
    };
    drop_idle(&mut kept, &mut rates, &mut caps);
    for _ in 0..MAX_PASSES {
        let mut removed = false;
        let mut by_use: Vec<([f64; 2], f64)> = kept
            .iter()
            .zip(rates.iter().zip(&caps))
            .map(|(p, (q, c))| (*p, q / c))
            .collect();
        by_use.sort_by(|a, b| a.1.total_cmp(&b.1));
        for (p, _) in by_use {
            if kept.len() <= lower_bound {
                break;
            }
            let Some(i) = kept.iter().position(|x| *x == p) else {
                continue;
            };
            let mut fewer = kept.clone();
            fewer.remove(i);
            *judged += 1;
            if let (Some(r), true, c) = weighted(model, points, &fewer, None, cache) {
                (kept, rates, caps) = (fewer, r, c);
                drop_idle(&mut kept, &mut rates, &mut caps);
                removed = true;
            }
        }
        if !removed || kept.len() <= lower_bound {
            break;
        }
    }
    Some(kept)
}

/// The first pair of neighbours (round the centroid of `kept`) that one well on the ring
/// between them can replace, every rule still met: the layout with one well fewer.
fn merge_pair(
    model: &Model,
    points: &[CheckPoint],
    ring: &[[f64; 2]],
    kept: &[[f64; 2]],
    judged: &mut usize,
    cache: &CandidateRows,
) -> Option<Vec<[f64; 2]>> {
    let sorted = by_angle(kept.to_vec());
    let n = sorted.len();
    if n < 4 {
        return None;
    }
    for i in 0..n {
        let (a, b) = (sorted[i], sorted[(i + 1) % n]);
        let others: Vec<[f64; 2]> = sorted
            .iter()
            .enumerate()
            .filter(|(j, _)| *j != i && *j != (i + 1) % n)
            .map(|(_, p)| *p)
            .collect();
        let mid = [0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1])];
        let Some(p) = layout::free_on_ring(model, ring, mid, &others, model.as_built.min_spacing)
        else {
            continue;
        };
        let mut fewer = others;
        fewer.push(p);
        *judged += 1;
        if let (Some(_), true, _) = weighted(model, points, &fewer, None, cache) {
            return Some(fewer);
        }
    }
    None
}

/// Positions in order round their centroid (clockwise from west).
fn by_angle(mut kept: Vec<[f64; 2]>) -> Vec<[f64; 2]> {
    let n = kept.len().max(1) as f64;
    let c = [
        kept.iter().map(|p| p[0]).sum::<f64>() / n,
        kept.iter().map(|p| p[1]).sum::<f64>() / n,
    ];
    kept.sort_by(|a, b| {
        let ang = |p: &[f64; 2]| (p[1] - c[1]).atan2(p[0] - c[0]);
        ang(b).total_cmp(&ang(a))
    });
    kept
}

/// Drop the wells the programme leaves idle.
fn drop_idle(kept: &mut Vec<[f64; 2]>, rates: &mut Vec<f64>, caps: &mut Vec<f64>) {
    let keep: Vec<bool> = rates.iter().map(|q| *q > IDLE).collect();
    let mut i = 0;
    kept.retain(|_| {
        i += 1;
        keep[i - 1]
    });
    let mut i = 0;
    caps.retain(|_| {
        i += 1;
        keep[i - 1]
    });
    rates.retain(|q| *q > IDLE);
}

/// The wells found, named W01 … round the excavation (by angle about the centroid of the
/// positions), judged by the same path as every layout tried.
fn judge_found(
    model: &Model,
    points: &[CheckPoint],
    spec: &LayoutSpec,
    kept: Vec<[f64; 2]>,
    rings: Vec<Vec<[f64; 2]>>,
) -> TrialRun {
    let kept = by_angle(kept);
    let wells: Vec<Well> = kept
        .iter()
        .enumerate()
        .map(|(i, p)| Well::from_spec(format!("W{:02}", i + 1), *p, 0.0, &model.wells))
        .collect();
    let count = wells.len();
    let ring_length: f64 = rings
        .first()
        .map_or(0.0, |r| r.windows(2).map(|w| dist(w[0], w[1])).sum::<f64>());
    let placement = Placement {
        wells,
        notes: Vec::new(),
        paths: rings,
    };
    let spec = LayoutSpec {
        kind: LayoutKind::Ring {
            count: RingCount::Count(count as u32),
            corner_wells: false,
        },
        ..spec.clone()
    };
    let mut run = try_placement(
        model,
        points,
        spec,
        placement,
        None,
        ring_length / count.max(1) as f64,
        true,
    );
    run.trial.variant = "fewest on candidates".into();
    run
}
