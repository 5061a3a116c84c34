//! Settlement of a soil column when the water level under it is lowered: one-dimensional
//! consolidation (Terzaghi) on the layers that lose head.
//!
//! **Effective-stress change.** Lowering the head takes pore pressure away while the total
//! stress stays (nearly) the same, so the effective stress rises by the pore pressure lost,
//! Δσ′ = Δu. Δu comes layer by layer from the head drop at the layer's top and base
//! ([`crate::safety::pore_pressure`]): γ_w·Δh in a layer that stays saturated, and at most the
//! pore pressure it had, γ_w·(h₀ − z), in a layer that drains once the water table is below it.
//!
//! *Above the lowered water table* a compressible (fine-grained) layer is taken as staying
//! saturated, held by suction in hydraulic continuity with the water table below (a clay's
//! air-entry suction is tens to hundreds of kPa — common practice (no source)): it takes the
//! whole γ_w·Δh, so its settlement keeps growing as the water falls further below it. A layer
//! marked `above_water_table = "drains"` (and every incompressible one) loses only the pore
//! pressure it had, γ_w·(h₀ − z) — the lower bound, which stops growing once the water is below
//! the layer (the reason the same settlement came out at every corner of a building whose clay
//! was wholly above the lowered water table).
//!
//! This "simple" form is the default. The **buoyancy-loss** form also takes away the weight the
//! dewatered soil loses when it drains from saturated (γ_sat) to moist (γ_moist):
//! Δσ′ = Δu − Σ (γ_sat − γ_moist)·(dewatered thickness of draining layers above z), which for a
//! point below the whole dewatered zone is Δσ′ = Δh·(γ_w − (γ_sat − γ_moist)) (Das, *Principles
//! of Foundation Engineering*; `checks.md` §10). Only the dewatered soil inside the listed profile
//! counts; soil above the foundation level is not in the profile.
//!
//! **Compression.** ρ = Σ m_v·Δσ′·Δz, or for a normally consolidated clay
//! ρ = C_c·H/(1 + e₀)·log₁₀((σ′₀ + Δσ′)/σ′₀), or for an over-consolidated one C_r up to σ′_p and
//! C_c beyond ([`settlement_oc`]). **In time**, each layer with c_v reaches U(T_v) of its final
//! settlement ([`at_time`], [`crate::physics::consolidation`]). Each layer is cut into slices of at most
//! [`SLICE`] so a layer cut by a water level is integrated slice by slice; the C_c form takes the
//! layer's σ′₀ (given at mid-layer) for every slice — split a thick clay into several layers for a
//! closer answer. Incompressible layers (sand, gravel, rock) do not settle.

use crate::input::model::{Compressibility, SoilLayer};
use crate::physics::consolidation;
use crate::safety::pore_pressure::{self, ColumnWater, HeadDrop};
use serde::Serialize;

pub use crate::physics::water::GAMMA_W;
/// Largest slice a layer is cut into, m.
pub const SLICE: f64 = 0.1;
/// Most slices one layer is cut into: a layer thicker than `SLICE × MAX_SLICES` (200 m) is cut
/// into this many equal slices instead, so the work per column stays bounded.
pub const MAX_SLICES: usize = 2_000;

/// Which form of the effective-stress change to use.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StressForm {
    /// Δσ′ = γ_w·Δh below the lowered water level (default).
    Simple,
    /// Also subtract the weight lost by the dewatered soil (γ_sat − γ_moist).
    BuoyancyLoss,
}

/// Δσ′ = γ_w·Δh, kPa, for a drawdown `dh` (m) (Terzaghi's effective-stress principle).
pub fn stress_increase_simple(dh: f64) -> f64 {
    GAMMA_W * dh
}

/// Δσ′ = Δh·(γ_w − (γ_sat − γ_moist)), kPa: below a dewatered zone of thickness `dh` (m) whose
/// soil goes from saturated `gamma_sat` to moist `gamma_moist` (kN/m³) (Das, *Principles of
/// Foundation Engineering*).
pub fn stress_increase_buoyancy_loss(dh: f64, gamma_sat: f64, gamma_moist: f64) -> f64 {
    dh * (GAMMA_W - (gamma_sat - gamma_moist))
}

/// ρ = m_v·Δσ′·H, m, with `mv` in 1/kPa, `dsigma` in kPa, `thickness` in m.
pub fn settlement_mv(mv: f64, dsigma: f64, thickness: f64) -> f64 {
    mv * dsigma * thickness
}

/// ρ = C_c·H/(1 + e₀)·log₁₀((σ′₀ + Δσ′)/σ′₀), m (normally consolidated clay).
pub fn settlement_cc(cc: f64, e0: f64, sigma0: f64, dsigma: f64, thickness: f64) -> f64 {
    if dsigma <= 0.0 || sigma0 <= 0.0 {
        return 0.0;
    }
    cc * thickness / (1.0 + e0) * ((sigma0 + dsigma) / sigma0).log10()
}

/// ρ (m) of an over-consolidated clay: recompression with C_r up to σ′_p, virgin compression
/// with C_c beyond (checks.md §16; Craig's *Soil Mechanics*, from memory):
/// ρ = H/(1 + e₀)·C_r·log₁₀(σ′_f/σ′₀) when σ′_f = σ′₀ + Δσ′ ≤ σ′_p, else
/// ρ = H/(1 + e₀)·[C_r·log₁₀(σ′_p/σ′₀) + C_c·log₁₀(σ′_f/σ′_p)].
pub fn settlement_oc(
    cc: f64,
    cr: f64,
    e0: f64,
    sigma0: f64,
    sigma_p: f64,
    dsigma: f64,
    thickness: f64,
) -> f64 {
    if dsigma <= 0.0 || sigma0 <= 0.0 {
        return 0.0;
    }
    let sigma_p = sigma_p.max(sigma0);
    let sigma_f = sigma0 + dsigma;
    let h = thickness / (1.0 + e0);
    if sigma_f <= sigma_p {
        h * cr * (sigma_f / sigma0).log10()
    } else {
        h * (cr * (sigma_p / sigma0).log10() + cc * (sigma_f / sigma_p).log10())
    }
}

/// Settlement of one layer slice of thickness `dz` under Δσ′.
fn slice_settlement(c: Compressibility, dsigma: f64, dz: f64) -> f64 {
    if dsigma <= 0.0 {
        return 0.0;
    }
    match c {
        Compressibility::Mv(mv) => settlement_mv(mv, dsigma, dz),
        Compressibility::Cc {
            cc,
            e0,
            sigma0,
            sigma_p,
            cr,
        } => settlement_oc(cc, cr, e0, sigma0, sigma_p, dsigma, dz),
        Compressibility::Incompressible => 0.0,
    }
}

/// One layer's part of a column's settlement.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LayerSettlement {
    /// Final (fully consolidated) settlement, m.
    pub final_m: f64,
    /// Pore-pressure change at the layer's top, middle and base, kPa.
    pub du_kpa: [f64; 3],
    /// Effective-stress change at mid-layer, kPa.
    pub dsigma_mid_kpa: f64,
}

/// The settlement of one soil column.
#[derive(Debug, Clone, PartialEq)]
pub struct ColumnSettlement {
    /// Total, m.
    pub total: f64,
    /// Per layer, m, in the order given.
    pub per_layer: Vec<f64>,
    /// Per layer: pore-pressure and stress change.
    pub layers: Vec<LayerSettlement>,
    /// Some compressible layer reaches into the dewatered zone (between old and new level).
    pub compressible_in_dewatered_zone: bool,
}

/// Settlement of the column of `layers` (listed top down from `top_level`, m) when the water
/// level falls from `h0` to `h1` (m) in one unconfined aquifer (the water table's drawdown in
/// every layer).
pub fn column(
    layers: &[SoilLayer],
    top_level: f64,
    h0: f64,
    h1: f64,
    form: StressForm,
) -> ColumnSettlement {
    let h1 = h1.min(h0);
    let water = ColumnWater {
        h0,
        drops: vec![
            HeadDrop {
                top: h0 - h1,
                base: h0 - h1
            };
            layers.len()
        ],
        dewatered: (h1, h0),
    };
    column_with_water(layers, top_level, &water, form)
}

/// Settlement of the column of `layers` (listed top down from `top_level`, m) for the head drops
/// of `water` (per layer, top and base; [`crate::safety::pore_pressure`]).
pub fn column_with_water(
    layers: &[SoilLayer],
    top_level: f64,
    water: &ColumnWater,
    form: StressForm,
) -> ColumnSettlement {
    let (dry_lo, dry_hi) = water.dewatered;
    let mut out = Vec::with_capacity(layers.len());
    let mut in_zone = false;
    // Weight lost so far by the dewatered soil above the current depth, kPa.
    let mut weight_lost = 0.0;
    let mut top = top_level;
    for (layer, &drop) in layers.iter().zip(&water.drops) {
        let bottom = top - layer.thickness;
        let n = ((layer.thickness / SLICE).ceil().max(1.0) as usize).min(MAX_SLICES);
        let dz = layer.thickness / n as f64;
        let drains = layer.drains_above_water_table;
        let loss_rate = match (form, drains, layer.unit_weight, layer.moist_unit_weight) {
            (StressForm::BuoyancyLoss, true, Some(sat), Some(moist)) => (sat - moist).max(0.0),
            _ => 0.0,
        };
        let compressible = !matches!(layer.compressibility, Compressibility::Incompressible);
        if compressible && top > dry_lo && bottom < dry_hi && dry_hi > dry_lo {
            in_zone = true;
        }
        let du = |z: f64| pore_pressure::change_at(water, drop, drains, z, top, bottom);
        let mut rho = 0.0;
        let mut dsigma_mid = 0.0;
        for k in 0..n {
            let z_top = top - k as f64 * dz;
            let z = z_top - 0.5 * dz;
            // Dewatered thickness within this slice above its middle.
            let dewatered_above = (z_top.min(dry_hi) - z.max(dry_lo)).max(0.0);
            let dsigma = du(z) - weight_lost - loss_rate * dewatered_above;
            if k == n / 2 {
                dsigma_mid = dsigma;
            }
            rho += slice_settlement(layer.compressibility, dsigma, dz);
            // Whole slice's dewatered thickness, for the slices below.
            weight_lost += loss_rate * (z_top.min(dry_hi) - (z_top - dz).max(dry_lo)).max(0.0);
        }
        out.push(LayerSettlement {
            final_m: rho,
            du_kpa: [du(top), du(0.5 * (top + bottom)), du(bottom)],
            dsigma_mid_kpa: dsigma_mid,
        });
        top = bottom;
    }
    ColumnSettlement {
        total: out.iter().map(|l| l.final_m).sum(),
        per_layer: out.iter().map(|l| l.final_m).collect(),
        layers: out,
        compressible_in_dewatered_zone: in_zone,
    }
}

/// Settlement (m) of a column whose layers settle by `per_layer` (final, m) after the water has
/// stayed lowered for `t` seconds: each layer with c_v reaches U(T_v) of its final value
/// (Terzaghi), each without c_v its final value (an upper bound). Also says whether any layer
/// had no c_v.
pub fn at_time(layers: &[SoilLayer], per_layer: &[f64], t: f64) -> (f64, bool) {
    let mut total = 0.0;
    let mut without_cv = false;
    for (l, &rho) in layers.iter().zip(per_layer) {
        total += match l.consolidation {
            Some(c) => {
                let h_dr = consolidation::drainage_path(l.thickness, c.drainage);
                rho * consolidation::average_degree(consolidation::time_factor(c.cv, t, h_dr))
            }
            None => {
                if rho > 0.0 {
                    without_cv = true;
                }
                rho
            }
        };
    }
    (total, without_cv)
}

/// The uniform drawdown (m) at which `rho(s)` (settlement, m, never decreasing with s) reaches
/// `allowable` (m), by bisection between 0 and `max_drawdown`; `None` when even `max_drawdown`
/// settles less.
pub fn drawdown_for_settlement(
    rho: impl Fn(f64) -> f64,
    allowable: f64,
    max_drawdown: f64,
) -> Option<f64> {
    if rho(max_drawdown) <= allowable {
        return None;
    }
    let (mut lo, mut hi) = (0.0, max_drawdown);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if rho(mid) > allowable {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    Some(lo)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn clay(thickness: f64, c: Compressibility) -> SoilLayer {
        SoilLayer {
            name: "clay".into(),
            thickness,
            compressibility: c,
            unit_weight: None,
            moist_unit_weight: None,
            drains_above_water_table: false,
            consolidation: None,
        }
    }

    // Hand value: a layer wholly below both levels (−2 m to −5 m, water 0 → −2 m) takes γ_w·Δh uniformly, so the column equals the
    // one-line formula ρ = m_v·γ_w·Δh·H (Terzaghi; from memory): 2e-4 × 9.81 × 2 × 3 = 11.772 mm.
    #[test]
    fn column_below_water_matches_one_line_formula() {
        let c = column(
            &[clay(3.0, Compressibility::Mv(2e-4))],
            -2.0,
            0.0,
            -2.0,
            StressForm::Simple,
        );
        assert!((c.total - 2e-4 * 9.81 * 2.0 * 3.0).abs() < 1e-12);
        assert!(!c.compressible_in_dewatered_zone);
    }

    // Hand integral: a 2 m layer from 0 to −2 m, water from 0 to −2 m, a layer that drains: Δσ′ =
    // γ_w·(0 − z) grows linearly, mean γ_w·1 m; ρ = m_v·γ_w·1·2 (Terzaghi; from memory). Kept
    // saturated by suction it takes γ_w·2 m throughout: twice that.
    #[test]
    fn dewatered_zone_takes_the_lost_pore_pressure() {
        let mut draining = clay(2.0, Compressibility::Mv(1e-4));
        draining.drains_above_water_table = true;
        let saturated = column(
            &[clay(2.0, Compressibility::Mv(1e-4))],
            0.0,
            0.0,
            -2.0,
            StressForm::Simple,
        );
        assert!((saturated.total - 1e-4 * 9.81 * 2.0 * 2.0).abs() < 1e-9);
        let c = column(&[draining], 0.0, 0.0, -2.0, StressForm::Simple);
        assert!((c.total - 1e-4 * 9.81 * 1.0 * 2.0).abs() < 1e-9);
        assert!(c.compressible_in_dewatered_zone);
    }
}
