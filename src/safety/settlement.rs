//! Settlement of a soil column when the water level under it is lowered: one-dimensional
//! consolidation (Terzaghi) on the layers that lose head.
//!
//! **Effective-stress change.** Lowering the water level from h₀ to h₁ (drawdown s = h₀ − h₁)
//! takes pore pressure away while the total stress stays (nearly) the same, so the effective
//! stress rises:
//! - below the lowered water level (z ≤ h₁): Δσ′ = γ_w·s (the whole drawdown);
//! - in the dewatered zone (h₁ < z < h₀): Δσ′ = γ_w·(h₀ − z), the pore pressure that stood there
//!   before. The full γ_w·s applies only to the part of a layer that stays below the new water
//!   level; a soil that stays saturated above it by capillary suction can take more (up to γ_w·s),
//!   one that drains takes less (see the buoyancy-loss form). The tool says so in its notes when
//!   a compressible layer reaches into this zone;
//! - above the old water level: no change.
//!
//! This "simple" form is the default. The **buoyancy-loss** form also takes away the weight the
//! dewatered soil loses when it drains from saturated (γ_sat) to moist (γ_moist):
//! Δσ′ = γ_w·(h₀ − max(z, h₁)) − Σ (γ_sat − γ_moist)·(dewatered thickness above z), which for a
//! point below the whole dewatered zone is Δσ′ = Δh·(γ_w − (γ_sat − γ_moist)) (Das, *Principles
//! of Foundation Engineering*; `checks.md` §10). Only the dewatered soil inside the listed profile
//! counts; soil above the foundation level is not in the profile.
//!
//! **Compression.** ρ = Σ m_v·Δσ′·Δz, or for a normally consolidated clay
//! ρ = C_c·H/(1 + e₀)·log₁₀((σ′₀ + Δσ′)/σ′₀). Each layer is cut into slices of at most
//! [`SLICE`] so a layer cut by a water level is integrated slice by slice; the C_c form takes the
//! layer's σ′₀ (given at mid-layer) for every slice — split a thick clay into several layers for a
//! closer answer. Incompressible layers (sand, gravel, rock) do not settle.

use crate::input::model::{Compressibility, SoilLayer};

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

/// Settlement of one layer slice of thickness `dz` under Δσ′.
fn slice_settlement(c: Compressibility, dsigma: f64, dz: f64) -> f64 {
    if dsigma <= 0.0 {
        return 0.0;
    }
    match c {
        Compressibility::Mv(mv) => settlement_mv(mv, dsigma, dz),
        Compressibility::Cc { cc, e0, sigma0 } => settlement_cc(cc, e0, sigma0, dsigma, dz),
        Compressibility::Incompressible => 0.0,
    }
}

/// The settlement of one soil column.
#[derive(Debug, Clone, PartialEq)]
pub struct ColumnSettlement {
    /// Total, m.
    pub total: f64,
    /// Per layer, m, in the order given.
    pub per_layer: Vec<f64>,
    /// Some compressible layer reaches into the dewatered zone (between old and new level).
    pub compressible_in_dewatered_zone: bool,
}

/// Settlement of the column of `layers` (listed top down from `top_level`, m) when the water
/// level falls from `h0` to `h1` (m).
pub fn column(
    layers: &[SoilLayer],
    top_level: f64,
    h0: f64,
    h1: f64,
    form: StressForm,
) -> ColumnSettlement {
    let h1 = h1.min(h0);
    let mut per_layer = Vec::with_capacity(layers.len());
    let mut in_zone = false;
    // Weight lost so far by the dewatered soil above the current depth, kPa.
    let mut weight_lost = 0.0;
    let mut top = top_level;
    for layer in layers {
        let bottom = top - layer.thickness;
        let n = ((layer.thickness / SLICE).ceil().max(1.0) as usize).min(MAX_SLICES);
        let dz = layer.thickness / n as f64;
        let loss_rate = match (form, layer.unit_weight, layer.moist_unit_weight) {
            (StressForm::BuoyancyLoss, Some(sat), Some(moist)) => (sat - moist).max(0.0),
            _ => 0.0,
        };
        let compressible = !matches!(layer.compressibility, Compressibility::Incompressible);
        if compressible && top > h1 && bottom < h0 && h0 > h1 {
            in_zone = true;
        }
        let mut rho = 0.0;
        for k in 0..n {
            let z_top = top - k as f64 * dz;
            let z = z_top - 0.5 * dz;
            // Dewatered thickness within this slice above its middle.
            let dewatered_above = (z_top.min(h0) - z.max(h1)).max(0.0);
            let lost_here = weight_lost + loss_rate * dewatered_above;
            let dsigma = GAMMA_W * (h0 - z.max(h1)).max(0.0) - lost_here;
            rho += slice_settlement(layer.compressibility, dsigma, dz);
            // Whole slice's dewatered thickness, for the slices below.
            weight_lost += loss_rate * (z_top.min(h0) - (z_top - dz).max(h1)).max(0.0);
        }
        per_layer.push(rho);
        top = bottom;
    }
    ColumnSettlement {
        total: per_layer.iter().sum(),
        per_layer,
        compressible_in_dewatered_zone: in_zone,
    }
}

/// The uniform drawdown (m) at which the column settles by `allowable` (m), by bisection between
/// 0 and `max_drawdown`; `None` when even `max_drawdown` settles less.
pub fn drawdown_for_settlement(
    layers: &[SoilLayer],
    top_level: f64,
    h0: f64,
    allowable: f64,
    max_drawdown: f64,
    form: StressForm,
) -> Option<f64> {
    let rho = |s: f64| column(layers, top_level, h0, h0 - s, form).total;
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

    // Hand integral: a 2 m layer from 0 to −2 m, water from 0 to −2 m: Δσ′ = γ_w·(0 − z) grows
    // linearly, mean γ_w·1 m; ρ = m_v·γ_w·1·2 (Terzaghi; from memory).
    #[test]
    fn dewatered_zone_takes_the_lost_pore_pressure() {
        let c = column(
            &[clay(2.0, Compressibility::Mv(1e-4))],
            0.0,
            0.0,
            -2.0,
            StressForm::Simple,
        );
        assert!((c.total - 1e-4 * 9.81 * 1.0 * 2.0).abs() < 1e-9);
        assert!(c.compressible_in_dewatered_zone);
    }
}
