//! The radius of influence at the drawdown the wells actually produce.
//!
//! Sichardt's R = C·s·√K and Kusakin's R = 575·s·√(H·K) grow with the drawdown s. The design
//! takes s at the design drawdown s_d = target + operating margin (what the excavation needs,
//! with the margin the design keeps); a layout that draws the water further down spreads
//! further, and its neighbours see more. `check` therefore uses
//!
//! ```text
//! R = R(s*),   s* = the least s ≥ s_d with s = s_p(R(s))
//! ```
//!
//! s_p(R) the least drawdown the wells produce at the served excavation's target points with
//! radius R. R never falls below R(s_d) (a smaller R would shrink the layout's own drawdown
//! further, towards the trivial fixed point of no drawdown), so a layout that falls short is
//! evaluated, and stated, at R(s_d); a layout that overdraws is evaluated at its own larger
//! drawdown. s ↦ s_p(R(max(s, s_d))) is continuous and increasing in s and in every abstraction
//! rate, so its least fixed point above s_d — and R with it — is continuous and never falls as a
//! rate rises, and with pumping wells only no level rises as a rate rises (tested by a property
//! test). The fixed point is found by the secant method on s − s_p(R(s)) (the drawdown grows
//! only with ln R, so the map contracts), to [`DRAWDOWN_TOLERANCE`]. Where R does not depend on
//! drawdown (Cooper–Jacob, fixed, pumping test, leaky B) or the excavation is a trench (see
//! below) one evaluation is made at R(s_d). The basis text states the R used, the drawdown it was
//! taken at and how the iteration ended.

use crate::check::evaluate::{evaluate, Evaluation};
use crate::check::field_build::field_with_radius;
use crate::field::checkpoints::CheckPoint;
use crate::field::influence::Field;
use crate::field::radius::{depends_on_drawdown, design_drawdown, radius_at, serves_trench};
use crate::field::wells::Well;
use crate::input::model::Model;

/// Stop when the drawdown R is taken at changes by less than this, m.
pub const DRAWDOWN_TOLERANCE: f64 = 1e-7;
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
    let s_d = design_drawdown(model);
    let (r0, basis0) = radius_at(model, s_d);
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
            "{basis0}; taken at the design drawdown (target + operating margin = {}) and not iterated: for flow to a line the drawdown grows in proportion to R, so a radius taken from the drawdown produced has no stable value",
            model.units.length_words(s_d, 2)
        );
        return (field, e);
    }
    let Some(p0) = produced_drawdown(model, &e) else {
        e.radius_of_influence_basis = basis0;
        return (field, e);
    };
    if p0 <= s_d {
        e.radius_of_influence_basis = format!(
            "{basis0}; taken at the design drawdown (target + operating margin = {}): the wells produce {} at the excavation, no more than that, and R is never taken below it",
            model.units.length_words(s_d, 2),
            model.units.length_words(p0, 2)
        );
        return (field, e);
    }
    // secant on g(s) = s_p(R(s)) − s from s_d (g > 0) towards the least root above s_d
    let evaluate_at = |s: f64| {
        let (r, _) = radius_at(model, s);
        let f = field_with_radius(model, wells, r);
        let ev = evaluate(model, &f, wells, points);
        let p = produced_drawdown(model, &ev).unwrap_or(s);
        (f, ev, p)
    };
    let (mut s_a, mut g_a) = (s_d, p0 - s_d);
    let mut s_b = p0;
    let (mut field, mut e, mut p_b) = evaluate_at(s_b);
    let mut steps = 2;
    let mut converged = false;
    while steps < MAX_ITERATIONS {
        let g_b = p_b - s_b;
        if g_b.abs() <= DRAWDOWN_TOLERANCE {
            converged = true;
            break;
        }
        // the map contracts: a secant step, or a plain step where the secant is not usable
        let next = if (g_b - g_a).abs() > 0.0 && g_b < g_a {
            s_b - g_b * (s_b - s_a) / (g_b - g_a)
        } else {
            p_b
        };
        let next = if next.is_finite() {
            next.max(s_d)
        } else {
            p_b.max(s_d)
        };
        (s_a, g_a) = (s_b, g_b);
        s_b = next;
        (field, e, p_b) = evaluate_at(s_b);
        steps += 1;
    }
    let (r, basis) = radius_at(model, s_b);
    let u = model.units;
    e.radius_of_influence_basis = format!(
        "{basis}; taken at the drawdown the wells produce at the excavation ({}, more than the design drawdown {} = target + operating margin): {}",
        u.length_words(s_b, 2),
        u.length_words(s_d, 2),
        if converged {
            format!("converged in {steps} evaluations (drawdown within {:.0e} {})", u.length(DRAWDOWN_TOLERANCE), u.length_unit())
        } else {
            format!("NOT converged after {steps} evaluations; R = {} used", u.length_words(r, 1))
        }
    );
    (field, e)
}
