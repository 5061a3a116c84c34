//! Base uplift: a confined aquifer below the formation pushes up on the soil left above it.
//!
//! Total-stress check (the usual hand formula; e.g. CIRIA C750 *Groundwater control* and the UPL
//! limit state of EN 1997-1 — from memory):
//! - weight of the soil between formation and the top of the confined layer:
//!   σ_v = γ·(z_formation − z_top), kPa;
//! - water pressure at the layer top: u = γ_w·(h_p − z_top), kPa, with h_p its piezometric level;
//! - factor of safety FoS = σ_v/u (no uplift pressure when h_p ≤ z_top);
//! - the head the relief wells must bring the layer down to for the required factor:
//!   h_req = z_top + σ_v/(γ_w·FoS_req).
//!
//! h_req becomes a target for the check points and the rate optimiser: the uplift points of each
//! excavation carry target = min(excavation target, h_req) (see [`crate::field::checkpoints::add_uplift_points`]). The pumped
//! aquifer is taken to be the confined layer: the drawdown the wells make is subtracted from h_p.
//! A factor of 1.1 … 1.5 is usual (common practice (no source)); the design file gives its own.

use crate::check::run::CheckRun;
use crate::field::checkpoints::field_target;
use crate::input::model::Model;
use crate::physics::uplift::{factor_of_safety, overburden, required_head};
use crate::physics::water::GAMMA_W;
use serde::Serialize;

/// The uplift check of one excavation.
#[derive(Debug, Clone, Serialize)]
pub struct UpliftResult {
    /// Excavation name.
    pub excavation: String,
    /// Formation level, m.
    pub formation_level_m: f64,
    /// Top of the confined layer, m.
    pub layer_top_m: f64,
    /// Soil left between them, m.
    pub cover_thickness_m: f64,
    /// Its unit weight, kN/m³.
    pub soil_unit_weight_kn_per_m3: f64,
    /// σ_v, kPa.
    pub overburden_kpa: f64,
    /// Piezometric level before pumping, m.
    pub piezometric_level_m: f64,
    /// Water pressure at the layer top before pumping, kPa.
    pub water_pressure_kpa: f64,
    /// FoS before pumping (`None`: no uplift pressure).
    pub factor_of_safety_before: Option<f64>,
    /// Required FoS.
    pub factor_of_safety_required: f64,
    /// Head the relief wells must reach, m.
    pub required_head_m: f64,
    /// Drawdown of the layer that needs, m (0 when none).
    pub required_drawdown_m: f64,
    /// The excavation's own target level, m.
    pub excavation_target_m: f64,
    /// h_req as a level of the pumped aquifer (the check-point target), m; `None`: no relief.
    pub uplift_target_m: Option<f64>,
    /// The uplift target is stricter than the excavation's own.
    pub uplift_governs: bool,
    /// Highest head in the layer under the excavation after pumping, m.
    pub head_after_m: Option<f64>,
    /// FoS after pumping (`None`: no uplift pressure left).
    pub factor_of_safety_after: Option<f64>,
    /// Required factor reached after pumping.
    pub pass_after: Option<bool>,
    /// The formula and its source.
    pub method: String,
}

/// Method text for reports.
pub const METHOD: &str = "FoS = γ·(z_formation − z_top)/(γ_w·(h − z_top)); h_req = z_top + σ_v/(γ_w·FoS_req) (total-stress uplift check, e.g. CIRIA C750 / EN 1997-1 UPL — from memory)";

/// The uplift check of every excavation, before pumping and, given the least drawdown under each
/// excavation after pumping (`least_drawdown[ei]`, m), after.
pub fn assess(model: &Model, least_drawdown: &[Option<f64>]) -> Vec<UpliftResult> {
    let Some(u) = &model.uplift else {
        return Vec::new();
    };
    model
        .excavations
        .iter()
        .enumerate()
        .map(|(ei, e)| {
            let sigma = overburden(u.soil_unit_weight, e.formation_level, u.layer_top);
            let h_req = required_head(sigma, u.layer_top, u.factor_of_safety);
            let after = least_drawdown
                .get(ei)
                .copied()
                .flatten()
                .map(|s| u.piezometric_level - s);
            let fos_after = after.and_then(|h| factor_of_safety(sigma, h, u.layer_top));
            UpliftResult {
                excavation: e.name.clone(),
                formation_level_m: e.formation_level,
                layer_top_m: u.layer_top,
                cover_thickness_m: e.formation_level - u.layer_top,
                soil_unit_weight_kn_per_m3: u.soil_unit_weight,
                overburden_kpa: sigma,
                piezometric_level_m: u.piezometric_level,
                water_pressure_kpa: (GAMMA_W * (u.piezometric_level - u.layer_top)).max(0.0),
                factor_of_safety_before: factor_of_safety(sigma, u.piezometric_level, u.layer_top),
                factor_of_safety_required: u.factor_of_safety,
                required_head_m: h_req,
                required_drawdown_m: (u.piezometric_level - h_req).max(0.0),
                excavation_target_m: e.target_level(),
                uplift_target_m: field_target(model, u, e.formation_level),
                uplift_governs: field_target(model, u, e.formation_level).is_some_and(|t| {
                    t < e.target_level() || e.control == crate::input::model::Control::Relieve
                }),
                head_after_m: after,
                factor_of_safety_after: fos_after,
                pass_after: after.map(|h| h <= h_req + crate::check::evaluate::TARGET_TOLERANCE),
                method: METHOD.into(),
            }
        })
        .collect()
}

/// The uplift check of an evaluated layout: the least drawdown over each excavation's check
/// points gives the highest head left under it.
pub fn assess_run(run: &CheckRun) -> Vec<UpliftResult> {
    let least: Vec<Option<f64>> = (0..run.model.excavations.len())
        .map(|ei| {
            run.evaluation
                .points
                .iter()
                .filter(|p| p.point.excavation == Some(ei))
                .map(|p| p.drawdown_m)
                .fold(None, |acc: Option<f64>, s| {
                    Some(acc.map_or(s, |a| a.min(s)))
                })
        })
        .collect();
    assess(run.model, &least)
}
