//! Stage 5, check: one layout evaluated.
//!
//! `evaluate` compares levels at check points and in wells with their targets and limits;
//! `field_build` builds the kernel for a layout as built; `consistent_radius` takes a
//! drawdown-dependent radius of influence at the drawdown the wells produce; `run` places the
//! wells, builds the field and evaluates it into a [`run::CheckRun`] that the later stages read;
//! `section` samples the levels along a straight line for the cross-section.

pub mod consistent_radius;
pub mod evaluate;
pub mod field_build;
pub mod run;
pub mod section;
pub mod section_ground;
pub mod wall_quantities;
