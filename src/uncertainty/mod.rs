//! Uncertainty: the spread of the answers from the spread of the ground (`drydig uncertainty`).
//!
//! `sampling` draws the inputs (Latin hypercube, Iman–Conover rank correlation); `apply` puts
//! one sample into a copy of the model; `check_samples` evaluates a given layout on one sample
//! (levels, margins, the flow it needs, neighbours); `days_to_dig` the earliest day each
//! stage of a `[programme]` can be dug on one sample (the programme's rule, Theis in time);
//! `fast_check` the same from tables built
//! once per layout (K a scale, R a shift); `design_samples` runs the fewest-wells
//! search on one sample and finds the robust design; `stats` the percentiles; `run` the whole
//! command: samples, outputs, tornado swings, the implied contingency.

pub mod apply;
pub mod check_samples;
pub mod days_to_dig;
pub mod design_samples;
pub mod fast_check;
pub mod run;
pub mod sampling;
pub mod stats;
