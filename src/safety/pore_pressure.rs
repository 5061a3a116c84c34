//! Pore-pressure change through a neighbour's soil column, layer by layer.
//!
//! Input is the head drop (m, positive where the head falls) at the top and at the base of every
//! layer; through the layer it varies linearly, the steady profile of one-dimensional seepage
//! through a uniform layer (checks.md §16: clay between a water table held at its top and an
//! aquifer whose head falls by Δh at its base loses pore pressure linearly, from 0 at the top to
//! γ_w·Δh at the base). A layered model of the ground gives these heads per aquifer directly;
//! [`single_aquifer`] derives them from today's one aquifer:
//!
//! - **unconfined**: every layer sees the water table's drawdown s at top and base;
//! - **confined or leaky** (top at z_T): the layers below z_T see the aquifer's drawdown s; the
//!   run of compressible layers directly above z_T is the confining clay, whose head drop goes
//!   linearly from 0 at its top (the water table above it is not pumped) to s_T at its base,
//!   where s_T = min(s, h₀ − z_T) (once the head falls below z_T the aquifer's top drains and
//!   the clay's base is at zero pore pressure); layers above the clay see no change.
//!
//! From the head drop Δh(z) the pore-pressure change is
//! - above the water table before pumping (z ≥ h₀): no change (a dry or desiccated crust is not
//!   counted);
//! - in a layer that stays saturated (a clay held by suction above the lowered water table, or
//!   any layer below it): Δu = γ_w·Δh(z);
//! - in a layer that drains once above the water (sand, gravel, fill marked "drains"):
//!   Δu = γ_w·min(h₀ − z, Δh(z)): it cannot lose more than the pore pressure it had.

use crate::input::model::{Compressibility, SoilLayer};
use crate::physics::potential::{Aquifer, AquiferKind};
use crate::physics::water::GAMMA_W;
use serde::Serialize;

/// Head drop at the top and base of one layer, m (positive: the head falls).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct HeadDrop {
    /// At the layer's top.
    pub top: f64,
    /// At the layer's base.
    pub base: f64,
}

impl HeadDrop {
    /// The drop at level `z` of a layer from `z_top` to `z_base`, by the linear steady profile.
    pub fn at(&self, z: f64, z_top: f64, z_base: f64) -> f64 {
        let h = z_top - z_base;
        if h <= 0.0 {
            return self.top;
        }
        let t = ((z_top - z) / h).clamp(0.0, 1.0);
        self.top + t * (self.base - self.top)
    }
}

/// The water under one soil column before and after pumping.
#[derive(Debug, Clone, PartialEq)]
pub struct ColumnWater {
    /// Water table (or piezometric level) before, m: hydrostatic pore pressure below it.
    pub h0: f64,
    /// Head drop at the top and base of every layer, in the order listed.
    pub drops: Vec<HeadDrop>,
    /// The levels drained by the lowering (low, high), m, where drained soil loses its buoyancy
    /// (empty when low ≥ high).
    pub dewatered: (f64, f64),
}

/// Pore-pressure change Δu (kPa) at level `z` inside a layer from `z_top` to `z_base`.
pub fn change_at(
    water: &ColumnWater,
    drop: HeadDrop,
    drains: bool,
    z: f64,
    z_top: f64,
    z_base: f64,
) -> f64 {
    let dh = drop.at(z, z_top, z_base);
    if z >= water.h0 {
        0.0
    } else if drains {
        GAMMA_W * (water.h0 - z).min(dh)
    } else {
        GAMMA_W * dh
    }
}

/// Heads for today's single aquifer at a point where its level falls from `aquifer.initial_level`
/// to `h1` (m), for `layers` listed top down from `top_level` (m).
pub fn single_aquifer(
    layers: &[SoilLayer],
    top_level: f64,
    aquifer: &Aquifer,
    h1: f64,
) -> ColumnWater {
    let h0 = aquifer.initial_level;
    let s = (h0 - h1).max(0.0);
    let confining_top = match aquifer.kind {
        AquiferKind::Unconfined => None,
        AquiferKind::Confined | AquiferKind::Leaky { .. } => aquifer.top_level,
    };
    let Some(z_t) = confining_top else {
        return ColumnWater {
            h0,
            drops: vec![HeadDrop { top: s, base: s }; layers.len()],
            dewatered: (h1.min(h0), h0),
        };
    };
    let s_t = s.min((h0 - z_t).max(0.0));
    // Levels of each layer's top and base.
    let mut bounds = Vec::with_capacity(layers.len());
    let mut top = top_level;
    for l in layers {
        bounds.push((top, top - l.thickness));
        top -= l.thickness;
    }
    // The confining clay: compressible layers directly above z_T, walking up.
    let mut clay_top = z_t;
    for (l, &(zt, zb)) in layers.iter().zip(&bounds).rev() {
        if zb >= z_t - 1e-9 {
            if matches!(l.compressibility, Compressibility::Incompressible) {
                if zt > z_t + 1e-9 {
                    break;
                }
            } else {
                clay_top = clay_top.max(zt);
            }
        } else if zt > z_t + 1e-9 && !matches!(l.compressibility, Compressibility::Incompressible) {
            // A compressible layer across z_T: its upper part is confining clay.
            clay_top = clay_top.max(zt);
        }
    }
    // Above z_T the confining clay's linear profile (s_T at z_T itself); below it the aquifer's.
    let drop_at = |z: f64| {
        if z < z_t - 1e-9 {
            s
        } else if z < clay_top {
            s_t * (clay_top - z) / (clay_top - z_t)
        } else {
            0.0
        }
    };
    let drops = bounds
        .iter()
        .map(|&(zt, zb)| {
            if zt <= z_t + 1e-9 {
                // Wholly in the aquifer.
                HeadDrop { top: s, base: s }
            } else {
                HeadDrop {
                    top: drop_at(zt),
                    base: drop_at(zb),
                }
            }
        })
        .collect();
    ColumnWater {
        h0,
        drops,
        dewatered: (h1.min(z_t), h0.min(z_t)),
    }
}
