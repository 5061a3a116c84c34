//! Base uplift by the total-stress check (the usual hand formula; e.g. CIRIA C750 *Groundwater
//! control* and the UPL limit state of EN 1997-1 — from memory): the weight of the soil left
//! above a confined layer against the water pressure at its top.
//!
//! σ_v = γ·(z_formation − z_top) kPa; u = γ_w·(h − z_top) kPa; FoS = σ_v/u; the head for a
//! required factor h_req = z_top + σ_v/(γ_w·FoS_req).

use crate::physics::water::GAMMA_W;

/// Weight of the soil between formation and layer top, kPa.
pub fn overburden(soil_unit_weight: f64, formation_level: f64, layer_top: f64) -> f64 {
    soil_unit_weight * (formation_level - layer_top).max(0.0)
}

/// FoS = σ_v/(γ_w·(h − z_top)); `None` when the head is at or below the layer top (no pressure).
pub fn factor_of_safety(overburden_kpa: f64, head: f64, layer_top: f64) -> Option<f64> {
    let u = GAMMA_W * (head - layer_top);
    (u > 0.0).then(|| overburden_kpa / u)
}

/// h_req = z_top + σ_v/(γ_w·FoS_req), m.
pub fn required_head(overburden_kpa: f64, layer_top: f64, fos_required: f64) -> f64 {
    layer_top + overburden_kpa / (GAMMA_W * fos_required)
}
