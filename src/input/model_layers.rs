//! Layered ground in the validated model: the aquifers from the top down (the first is the
//! model's `[aquifer]`), the resistance between each pair, and the aquitards for drawings.

use crate::physics::potential::Aquifer;

/// One aquifer of layered ground.
#[derive(Debug, Clone)]
pub struct GroundAquifer {
    /// Name (`"aquifer"` for the top one, else the `[[layer]]` name).
    pub name: String,
    /// The aquifer (the top one as `[aquifer]` says; the ones below confined by the layer
    /// above, with the same groundwater level at rest).
    pub aquifer: Aquifer,
    /// Level of its top, m (for the top one: its confining top, or the water table).
    pub top: f64,
    /// Vertical hydraulic conductivity K_v, m/s (to split the aquifer at a wall's toe).
    pub vertical_conductivity: f64,
}

/// An aquitard between two aquifers.
#[derive(Debug, Clone)]
pub struct GroundAquitard {
    /// Name from `[[layer]]`.
    pub name: String,
    /// Level of its top, m.
    pub top: f64,
    /// Level of its base, m.
    pub base: f64,
    /// Hydraulic resistance c = thickness/K_v, s.
    pub resistance: f64,
}

/// The layered ground: at least two aquifers.
#[derive(Debug, Clone)]
pub struct LayeredGround {
    /// The aquifers from the top down.
    pub aquifers: Vec<GroundAquifer>,
    /// Resistance between aquifer i and i+1, s (`aquifers.len() − 1` values).
    pub resistances: Vec<f64>,
    /// The aquitards, from the top down.
    pub aquitards: Vec<GroundAquitard>,
}

impl LayeredGround {
    /// Base of the lowest aquifer, m.
    pub fn lowest_base(&self) -> f64 {
        self.aquifers
            .last()
            .map_or(f64::NEG_INFINITY, |a| a.aquifer.base_level)
    }

    /// Transmissivity of each aquifer before pumping, m²/s.
    pub fn transmissivities(&self) -> Vec<f64> {
        self.aquifers
            .iter()
            .map(|a| a.aquifer.transmissivity())
            .collect()
    }

    /// The aquifer whose head a point at level `z` (m) reads: the aquifer holding z; in an
    /// aquitard the aquifer below it (the one that pushes on the aquitard's base, as for
    /// uplift); above the top aquifer the top one, below the lowest the lowest.
    pub fn aquifer_at(&self, z: f64) -> usize {
        self.aquifers
            .iter()
            .position(|a| z > a.aquifer.base_level)
            .unwrap_or(self.aquifers.len() - 1)
    }

    /// The aquifers a wall with its toe at `toe` (m; `None`: to the base) cuts: those whose
    /// base is at or above the toe (the ground is split at every toe inside an aquifer, so a
    /// toe never falls inside one).
    pub fn cut_by_wall(&self, toe: Option<f64>) -> Vec<usize> {
        (0..self.aquifers.len())
            .filter(|&i| toe.is_none_or(|z| self.aquifers[i].aquifer.base_level >= z - 1e-3))
            .collect()
    }

    /// The aquifers a screen from `base` to `top` (m) crosses (more than 1 mm inside); the
    /// nearest aquifer below when it crosses none (a screen in an aquitard).
    pub fn screened(&self, top: f64, base: f64) -> Vec<usize> {
        let crossed: Vec<usize> = self
            .aquifers
            .iter()
            .enumerate()
            .filter(|(_, a)| top.min(a.top) - base.max(a.aquifer.base_level) > 1e-3)
            .map(|(i, _)| i)
            .collect();
        if crossed.is_empty() {
            vec![self.aquifer_at(base)]
        } else {
            crossed
        }
    }
}
