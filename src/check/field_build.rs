//! The field a layout makes, as built: the superposition kernel with partial penetration of
//! every well whose screen does not span the layer, at a given radius of influence.

use crate::field::influence::Field;
use crate::field::wells::Well;
use crate::input::model::Model;
use geo::Centroid;

/// A working origin near the site, so that projected coordinates keep their precision.
pub fn site_origin(model: &Model) -> [f64; 2] {
    model.excavations[0]
        .outline
        .centroid()
        .map_or([0.0, 0.0], |c| [c.x(), c.y()])
}

/// Build the field for `wells` in `model` with radius of influence `r` (m).
pub fn field_with_radius(model: &Model, wells: &[Well], r: f64) -> Field {
    Field::new(
        &model.aquifer,
        r,
        wells,
        &model.boundaries,
        site_origin(model),
    )
    .with_partial_penetration(wells, model.as_built.anisotropy, evaluation_level(model))
}

/// The level check points and the map are evaluated at for partial penetration, m: the served
/// excavation's target level (where the water must be drawn to; clamped to the layer inside).
pub fn evaluation_level(model: &Model) -> f64 {
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    model.excavations[idx].target_level()
}
