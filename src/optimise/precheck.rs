//! Reasons no layout of the design file's kind can work, found before any count is searched:
//! a target at the aquifer base, a target below what the wells may be drawn to, no wetted
//! screen, or check points beyond the radius of influence of every well.

use crate::field::checkpoints::CheckPoint;
use crate::field::radius::design_radius;
use crate::input::model::{Model, WellKind};
use crate::optimise::limits::DRY_GUARD;
use geo::{Distance, Euclidean, Line, Point};

/// Distance from `p` to the segment a–b, m (geo's Euclidean point-to-line distance).
fn segment_distance(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    Euclidean.distance(&Point::from(p), &Line::new(a, b))
}

/// Reasons no layout of this kind can work, found before any search.
pub(super) fn impossible_before_search(
    model: &Model,
    points: &[CheckPoint],
    reach_paths: &[Vec<[f64; 2]>],
    well_points: &[[f64; 2]],
) -> Option<String> {
    let aq = &model.aquifer;
    let spec = &model.wells;
    let targets: Vec<&CheckPoint> = points.iter().filter(|p| p.target_level.is_some()).collect();
    // 1. Target at or below the aquifer base (validation refuses it; kept as a guard).
    // (in layered ground, the base of the aquifer the point reads)
    let base_of = |p: &CheckPoint| crate::check::field_build::aquifer_of_point(model, p).base_level;
    if let Some(p) = targets
        .iter()
        .find(|p| p.target_level.is_some_and(|t| t <= base_of(p) + DRY_GUARD))
    {
        return Some(format!(
            "the target at \"{}\" ({:.2} m) is at or below the aquifer base ({:.2} m): the aquifer would have to be pumped dry there",
            p.name,
            p.target_level.unwrap_or(f64::NAN),
            base_of(p)
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
            let suction = model.as_built.suction_floor(spec.suction_limit);
            if lowest_target < suction.max(intake) - 1e-9 {
                return Some(format!(
                    "wellpoints are asked for more drawdown than suction can lift: the target ({lowest_target:.2} m) is below header − suction limit ({:.2} − {:.2} = {suction:.2} m), by {:.2} m{}; the water between wellpoints stands higher than in them, so one stage cannot reach it — use a second stage, ejectors or deep wells (common practice (no source))",
                    model.as_built.header_level,
                    spec.suction_limit,
                    suction.max(intake) - lowest_target,
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
    let wetted = (spec.filter_top.min(aq.initial_level) - spec.filter_base.max(intake)).max(0.0);
    if wetted <= 0.0 {
        return Some(format!(
            "no length of screen (or filter column) lies between the lowest level a well may be drawn to ({:.2} m) and the groundwater level ({:.2} m): the wells could give no water — lower the screen or the pump",
            spec.filter_base.max(intake),
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
