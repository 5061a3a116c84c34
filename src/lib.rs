//! drydig: construction dewatering well-field design by superposition.
#![forbid(unsafe_code)]

pub mod physics;
