//! Stage 6, safety: what the drawdown does around the excavation.
//!
//! `neighbours` (drawdown at buildings, distortion, pass/fail), `settlement` (one-dimensional
//! consolidation of their soil layers), `uplift` (base-uplift factor of safety and relief head).

pub mod neighbours;
pub mod settlement;
pub mod uplift;
