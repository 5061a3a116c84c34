//! The radius of influence at the drawdown the wells actually produce.
//!
//! Sichardt's R = C·s·√K and Kusakin's R = 575·s·√(H·K) grow with the drawdown s. The design
//! takes s at the target (what the excavation needs); a layout that draws the water further
//! down spreads further, and its neighbours see more. `check` therefore iterates: evaluate with
//! R(s_k), take s_{k+1} = the least drawdown the wells produce at the served excavation's target
//! points (the one that decides whether the targets are met; equal to the target drawdown for a
//! layout that just meets it, so `design` is consistent by construction), until R changes by
//! less than [`RELATIVE_TOLERANCE`]. A layout that draws less than the target keeps R at the
//! target drawdown (a smaller R would shrink its own drawdown further, towards the trivial fixed
//! point of no drawdown); the basis text says so and by how much it falls short. The iteration is a fixed point of s ↦ drawdown(R(s)); the
//! drawdown grows only with ln R, so the map contracts and it converges in a few steps. Where R
//! does not depend on drawdown (Cooper–Jacob, fixed, pumping test, leaky B) one evaluation is
//! made. The basis text says which drawdown R was taken at and how the iteration ended.

use crate::check::evaluate::{evaluate, Evaluation};
use crate::check::field_build::field_with_radius;
use crate::field::checkpoints::CheckPoint;
use crate::field::influence::Field;
use crate::field::radius::{
    depends_on_drawdown, design_drawdown, design_radius, radius_at, serves_trench,
};
use crate::field::wells::Well;
use crate::input::model::Model;

/// Stop when R changes by less than this fraction.
pub const RELATIVE_TOLERANCE: f64 = 1e-3;
/// Most evaluations.
pub const MAX_ITERATIONS: usize = 30;

/// The least drawdown at the served excavation's target points, m (`None`: no such point).
fn produced_drawdown(model: &Model, e: &Evaluation) -> Option<f64> {
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    e.points
        .iter()
        .filter(|p| p.point.target_level.is_some())
        .filter(|p| p.point.excavation == Some(idx))
        .map(|p| p.drawdown_m)
        .min_by(f64::total_cmp)
}

/// Evaluate `wells` at `points` with the radius of influence at the drawdown they produce.
pub fn evaluate_consistent(
    model: &Model,
    wells: &[Well],
    points: &[CheckPoint],
) -> (Field, Evaluation) {
    let (r0, basis0) = design_radius(model);
    let field = field_with_radius(model, wells, r0);
    let mut e = evaluate(model, &field, wells, points);
    if !depends_on_drawdown(model) || wells.iter().all(|w| w.rate <= 0.0) {
        e.radius_of_influence_basis = basis0;
        return (field, e);
    }
    if serves_trench(model) {
        // Flow to a line: ΔΦ at the line is q′·R/π, in proportion to R, and Sichardt's L₀ is in
        // proportion to s, so s ↦ drawdown(R(s)) has slope (produced / asked) and no stable
        // fixed point once a layout overdraws. R stays at the design drawdown, and says so.
        e.radius_of_influence_basis = format!(
            "{basis0}; taken at the design drawdown (target + operating margin = {:.2} m) and not iterated: for flow to a line the drawdown grows in proportion to R, so a radius taken from the drawdown produced has no stable value",
            design_drawdown(model)
        );
        return (field, e);
    }
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    let s_target = model.aquifer.initial_level - model.excavations[idx].target_level();
    let (mut field, mut r) = (field, r0);
    let mut s = s_target;
    let mut steps = 1;
    let mut converged = false;
    while steps < MAX_ITERATIONS {
        let Some(s_new) = produced_drawdown(model, &e) else {
            break;
        };
        if s_new < s_target && steps == 1 {
            e.radius_of_influence_basis = format!(
                "{}; the wells produce only {s_new:.2} m at the excavation, less than the {s_target:.2} m the target needs, so R is kept at the target drawdown",
                radius_at(model, s_target).1
            );
            return (field, e);
        }
        let (r_new, _) = radius_at(model, s_new);
        s = s_new;
        if !(r_new.is_finite() && r_new > 0.0) {
            break;
        }
        if (r_new - r).abs() <= RELATIVE_TOLERANCE * r {
            converged = true;
            break;
        }
        r = r_new;
        field = field_with_radius(model, wells, r);
        e = evaluate(model, &field, wells, points);
        steps += 1;
    }
    let (_, basis) = radius_at(model, s);
    e.radius_of_influence_basis = format!(
        "{basis}; taken at the drawdown the wells produce at the excavation ({s:.2} m, the target needs {s_target:.2} m): {}",
        if converged {
            format!("converged in {steps} evaluation{} (R within {:.1} %)", if steps == 1 { "" } else { "s" }, RELATIVE_TOLERANCE * 100.0)
        } else {
            format!("NOT converged after {steps} evaluations; R = {r:.1} m used")
        }
    );
    (field, e)
}
