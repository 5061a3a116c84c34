//! Stage 6, safety: what the drawdown does around the excavation.
//!
//! `neighbours` (drawdown at buildings, pass/fail), `limit_check` (one quantity against its
//! limit: what is checked, the basis of the limit), `distortion` (differential settlement,
//! angular distortion, deflection ratio and category of damage along each side), `pore_pressure` (the change of
//! pore pressure through each layer from the heads at its top and base), `settlement`
//! (one-dimensional consolidation of their soil layers, final and in time), `settlement_map`
//! (the settlement and drawdown grids behind settlement.svg), `uplift` (base-uplift factor of safety and relief head).

pub mod distortion;
pub mod limit_check;
pub mod neighbours;
pub mod pore_pressure;
pub mod settlement;
pub mod settlement_map;
pub mod uplift;
