//! drydig: construction dewatering well-field design by superposition.
//!
//! Pipeline: design file ([`design`]) → validated [`model`] → quick [`estimate`] … → [`report`].
#![forbid(unsafe_code)]

pub mod aquifer;
pub mod check;
pub mod checkpoints;
pub mod cli;
pub mod design;
pub mod error;
pub mod estimate;
pub mod evaluate;
pub mod grid;
pub mod import;
pub mod influence;
pub mod layout;
pub mod lp;
pub mod model;
pub mod neighbours;
pub mod optimise;
pub mod optimise_clarabel;
pub mod physics;
pub mod pumping_test;
pub mod recharge;
pub mod report;
pub mod settlement;
pub mod starter;
pub mod sweep;
pub mod units;
pub mod uplift;
pub mod wells;
