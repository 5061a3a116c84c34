//! Stage 7, optimise: the fewest wells and their rates.
//!
//! `lp` (a small linear-programme layer) → `design` (limits, rates, count search, outcomes) →
//! `sweep` (a range of counts or spacings) and `recharge` (sizing recharge wells for neighbours).

pub mod clarabel;
pub mod design;
pub mod lp;
pub mod recharge;
pub mod sweep;
