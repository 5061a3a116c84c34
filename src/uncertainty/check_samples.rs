//! A given layout evaluated on one sampled ground: the levels at every check point (with the
//! radius of influence at the drawdown produced, as `check` takes it), the wells' limits, the
//! neighbours' drawdown and settlement, and the flow the layout needs on that ground.
//!
//! The flow needed: the given rates scaled together by the least factor α that meets every
//! target. The discharge potential is linear in the rates (superposition: ΔΦ = Σ Q_j·u_j), so
//! at the sample's radius of influence α = max over target points of
//! (Φ₀ − Φ(target)) / (Φ₀ − Φ(level)), Φ the potential of Strack (1989) eqs. 8.7 and 8.13, and
//! the flow needed is α·ΣQ. R is held at the value the given rates produce (a larger α would draw
//! further and, with Sichardt, spread R a little further: second order, stated in the report).

use crate::check::consistent_radius::evaluate_consistent;
use crate::field::checkpoints::{check_points, CheckPoint};
use crate::field::wells::Well;
use crate::input::model::Model;
use serde::Serialize;

/// What one sample of a given layout gives.
#[derive(Debug, Clone, Serialize)]
pub struct CheckSample {
    /// Sum of the given abstraction rates, m³/s.
    pub total_flow_m3_per_s: f64,
    /// The rates scaled together to just meet every target, m³/s (`None`: some target point
    /// sees no drawdown at all).
    pub needed_flow_m3_per_s: Option<f64>,
    /// The lowest margin below a target, m (negative: short).
    pub lowest_margin_m: Option<f64>,
    /// Every target met with the given rates.
    pub targets_met: bool,
    /// Every well within its limits (`None`: not evaluated, the fast path).
    pub wells_ok: Option<bool>,
    /// Radius of influence used, m.
    pub radius_m: f64,
    /// Each neighbour's largest drawdown, m, and largest settlement checked, m.
    pub neighbours: Vec<(f64, Option<f64>)>,
}

/// The layout and its check points, built once for every sample.
pub struct Layout {
    /// The wells with their rates.
    pub wells: Vec<Well>,
    /// The check points (targets do not depend on the sampled inputs).
    pub points: Vec<CheckPoint>,
}

impl Layout {
    /// The layout `wells` with the check points of `model`.
    pub fn new(model: &Model, wells: Vec<Well>) -> Layout {
        Layout {
            points: check_points(model),
            wells,
        }
    }
}

/// Evaluate `layout` on the ground of `model` (one sample).
pub fn evaluate_sample(model: &Model, layout: &Layout) -> CheckSample {
    let (field, e) = evaluate_consistent(model, &layout.wells, &layout.points);
    let aq = field.aquifer();
    let phi0 = aq.initial_potential();
    let mut alpha: Option<f64> = Some(0.0);
    for p in &e.points {
        let Some(target) = p.point.target_level else {
            continue;
        };
        let needed = phi0 - aq.potential(target);
        if needed <= 0.0 {
            continue;
        }
        let produced = phi0 - p.level_m.map_or(0.0, |z| aq.potential(z));
        alpha = match alpha {
            Some(a) if produced > 0.0 => Some(a.max(needed / produced)),
            _ => None,
        };
    }
    let rates: Vec<f64> = layout.wells.iter().map(|w| w.rate).collect();
    let neighbours = crate::safety::neighbours::assess(model, &field, &rates)
        .iter()
        .map(|n| {
            (
                n.worst_drawdown.drawdown_m,
                n.worst_settlement.as_ref().and_then(|s| s.settlement_m),
            )
        })
        .collect();
    CheckSample {
        total_flow_m3_per_s: e.total_abstraction_m3_per_s,
        needed_flow_m3_per_s: alpha.map(|a| a * e.total_abstraction_m3_per_s),
        lowest_margin_m: e
            .worst_point
            .and_then(|i| e.points.get(i))
            .and_then(|p| p.margin_m),
        targets_met: e.targets_met,
        wells_ok: Some(e.wells_ok),
        radius_m: e.radius_of_influence_m,
        neighbours,
    }
}
