//! The superposition kernel in layered ground: ΔΦ per unit rate of each well in each aquifer,
//! from the multi-aquifer solution ([`crate::physics::multi_aquifer`]).
//!
//! A well screened in several aquifers shares its rate among them so that its head is the same
//! in each, as one well alone would ([`LeakageSystem::equal_head_shares`]; the shares do not
//! change with the other wells, an approximation where wells of different screens stand close).
//! In aquifer j the change in discharge potential per unit rate of well w at distance r is
//!
//!   ΔΦ_j = −T_j · Σ_i f_wi · s_ji(r),
//!
//! f_wi the share of aquifer i and s_ji the unit drawdown of the multi-aquifer system; ΔΦ_j is
//! turned into a level with aquifer j's own potential (Strack 1989, §8), so with one aquifer
//! this is the single-aquifer kernel. Partial penetration inside one aquifer is not added: split
//! the aquifer into sublayers instead.

use crate::input::model_layers::LayeredGround;
use crate::physics::multi_aquifer::{LeakageSystem, MODE_CUTOFF};
use crate::physics::potential::Aquifer;
use std::f64::consts::PI;

/// A screen (top, base, radius) by the bits of its numbers, for sharing weights.
type ScreenKey = (u64, u64, u64);

/// The layered-ground kernel of one field: weights of each mode for each well and aquifer.
#[derive(Debug, Clone)]
pub struct LayeredKernel {
    system: LeakageSystem,
    aquifers: Vec<Aquifer>,
    /// weights[well][aquifer][mode] = −T_j · Σ_i f_wi·a_k(i, j) / (2π).
    weights: Vec<Vec<Vec<f64>>>,
    radius_of_influence: f64,
    ground: LayeredGround,
}

impl LayeredKernel {
    /// The kernel for wells with screens `(top, base, radius)` (m) in `ground` with radius of
    /// influence `big_r` (m) for the zero mode. `None` when the ground cannot be decomposed.
    pub fn new(
        ground: &LayeredGround,
        screens: &[(f64, f64, f64)],
        big_r: f64,
    ) -> Option<LayeredKernel> {
        let t = ground.transmissivities();
        let system = LeakageSystem::new(&t, &ground.resistances)?;
        let n = t.len();
        let mut by_screen: Vec<(ScreenKey, Vec<Vec<f64>>)> = Vec::new();
        let weights = screens
            .iter()
            .map(|&(top, base, rw)| {
                let key = (top.to_bits(), base.to_bits(), rw.to_bits());
                if let Some((_, w)) = by_screen.iter().find(|(k, _)| *k == key) {
                    return w.clone();
                }
                let screened = ground.screened(top, base);
                let shares = system.equal_head_shares(&screened, rw, big_r);
                let w: Vec<Vec<f64>> = (0..n)
                    .map(|j| {
                        let mut row = vec![0.0; n];
                        for (&i, f) in screened.iter().zip(&shares) {
                            for (rk, a) in row.iter_mut().zip(system.mode_weights(i, j)) {
                                *rk -= t[j] * f * a / (2.0 * PI);
                            }
                        }
                        row
                    })
                    .collect();
                by_screen.push((key, w.clone()));
                w
            })
            .collect();
        Some(LayeredKernel {
            system,
            aquifers: ground.aquifers.iter().map(|a| a.aquifer.clone()).collect(),
            weights,
            radius_of_influence: big_r,
            ground: ground.clone(),
        })
    }

    /// The farthest distance at which any mode still acts, m.
    pub fn reach(&self) -> f64 {
        let leaky = self
            .system
            .leakage_factors()
            .first()
            .map_or(0.0, |l| MODE_CUTOFF * l);
        if self.system.has_zero_mode() {
            leaky.max(self.radius_of_influence)
        } else {
            leaky
        }
    }

    /// ΔΦ per unit rate in aquifer `at` at distance `r` (m, clamped at `rw`) from well `well`.
    pub fn unit_potential(&self, well: usize, at: usize, r: f64, rw: f64) -> f64 {
        let f = self
            .system
            .mode_functions(r.max(rw), self.radius_of_influence);
        self.weights[well][at]
            .iter()
            .zip(&f)
            .map(|(w, fk)| w * fk)
            .sum()
    }

    /// Aquifer `i` (for its potential ↔ level).
    pub fn aquifer(&self, i: usize) -> &Aquifer {
        &self.aquifers[i]
    }

    /// Number of aquifers.
    pub fn aquifer_count(&self) -> usize {
        self.aquifers.len()
    }

    /// The aquifer a point at level `z` (m) reads ([`LayeredGround::aquifer_at`]).
    pub fn aquifer_at(&self, z: f64) -> usize {
        self.ground.aquifer_at(z)
    }

    /// The ground the kernel was built for.
    pub fn ground(&self) -> &LayeredGround {
        &self.ground
    }

    /// The modes for the walls' line doublets: √T, U and each mode's leakage factor.
    pub fn wall_modes(&self) -> crate::field::walls::WallModes {
        crate::field::walls::WallModes {
            sqrt_t: self
                .ground
                .transmissivities()
                .iter()
                .map(|t| t.sqrt())
                .collect(),
            vectors: self.system.vectors().clone(),
            lambdas: self.system.mode_leakage_factors().to_vec(),
        }
    }

    /// The leakage factors of the modes, m (largest first).
    pub fn leakage_factors(&self) -> Vec<f64> {
        self.system.leakage_factors()
    }
}
