//! Stage 5, check: one layout evaluated.
//!
//! `evaluate` compares levels at check points and in wells with their targets and limits;
//! `run` places the wells, builds the field and evaluates it into a [`run::CheckRun`] that the
//! later stages read;
//! `section` samples the levels along a straight line for the cross-section.

pub mod evaluate;
pub mod run;
pub mod section;
