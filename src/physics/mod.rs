//! Analytical groundwater formulas, one physical idea per module. SI units throughout.

pub mod building_damage;
pub mod capacity;
pub mod consolidation;
pub mod equivalent;
pub mod hantush;
pub mod image_flow;
pub mod images;
pub mod line_doublet;
pub mod multi_aquifer;
pub mod partial_penetration;
pub mod pipes;
pub mod potential;
pub mod pumping_test;
pub mod radius;
pub mod screen_average;
pub mod slot;
pub mod special;
pub mod theis;
pub mod thiem;
pub mod uplift;
pub mod water;
pub mod well_loss;
