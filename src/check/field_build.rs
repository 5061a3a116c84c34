//! The field a layout makes, as built: the superposition kernel with partial penetration of
//! every well whose screen does not span the layer, at a given radius of influence.

use crate::field::checkpoints::{CheckPoint, PointKind};
use crate::field::influence::Field;
use crate::field::layered::LayeredKernel;
use crate::field::near_field::PointTables;
use crate::field::wells::Well;
use crate::input::model::Model;
use crate::physics::potential::Level;
use geo::Centroid;
use std::collections::HashMap;

/// A working origin near the site, so that projected coordinates keep their precision.
pub fn site_origin(model: &Model) -> [f64; 2] {
    model.excavations[0]
        .outline
        .centroid()
        .map_or([0.0, 0.0], |c| [c.x(), c.y()])
}

/// Build the field for `wells` in `model` with radius of influence `r` (m).
/// In layered ground the multi-aquifer kernel ([`LayeredKernel`]) replaces the single-aquifer
/// one and its partial-penetration term; without `[[layer]]` the field is exactly as before.
/// Cut-off walls (`[[wall]]`) are solved last, for each well of unit rate.
pub fn field_with_radius(model: &Model, wells: &[Well], r: f64) -> Field {
    let field = Field::new(
        &model.aquifer,
        r,
        wells,
        &model.boundaries,
        site_origin(model),
    );
    if let Some(ground) = &model.layers {
        let screens: Vec<(f64, f64, f64)> = wells
            .iter()
            .map(|w| (w.filter_top, w.filter_base, w.radius))
            .collect();
        if let Some(kernel) = LayeredKernel::new(ground, &screens, r) {
            return field
                .with_layers(kernel, evaluation_level(model))
                .with_walls(&model.walls, &model.boundaries);
        }
    }
    field
        .with_partial_penetration(wells, model.as_built.anisotropy, evaluation_level(model))
        .with_walls(&model.walls, &model.boundaries)
}

/// The level the map, sections and points without a target are evaluated at for partial
/// penetration, m: the served excavation's target level (clamped to the layer inside).
pub fn evaluation_level(model: &Model) -> f64 {
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    model.excavations[idx].target_level()
}

/// The level check point `p` is evaluated at for partial penetration, m (clamped to the
/// saturated layer inside): the target level of its own excavation (grid, corners and edges of
/// each excavation at that excavation's target), a named point at the target given for it, an
/// uplift point at the top of the pressurised layer (where the uplift acts), anything else at
/// [`evaluation_level`]. Taken from the model, not from `p.target_level`, so that the design's
/// targets lowered by the operating margin are evaluated at the same elevations as `check`.
pub fn point_elevation(model: &Model, p: &CheckPoint) -> f64 {
    match (p.kind, &model.uplift, p.excavation) {
        (PointKind::Uplift, Some(u), _) => u.layer_top,
        (PointKind::Uplift, None, _) => evaluation_level(model),
        (_, _, Some(ei)) => model
            .excavations
            .get(ei)
            .map_or_else(|| evaluation_level(model), |e| e.target_level()),
        _ => model
            .checks
            .points
            .iter()
            .find(|(name, _, _)| *name == p.name)
            .and_then(|(_, _, t)| *t)
            .unwrap_or_else(|| evaluation_level(model)),
    }
}

/// The aquifer whose head check point `p` reads: the model's aquifer, or in layered ground the
/// aquifer holding the point's elevation ([`point_elevation`]).
pub fn aquifer_of_point<'m>(
    model: &'m Model,
    p: &CheckPoint,
) -> &'m crate::physics::potential::Aquifer {
    match &model.layers {
        Some(g) => &g.aquifers[g.aquifer_at(point_elevation(model, p))].aquifer,
        None => &model.aquifer,
    }
}

/// The partial-penetration tables of each point in `points` at its own elevation
/// ([`point_elevation`]); all `None` without partial penetration.
pub fn point_tables(
    model: &Model,
    field: &Field,
    points: &[CheckPoint],
) -> Vec<Option<PointTables>> {
    let mut by_level: HashMap<u64, Option<PointTables>> = HashMap::new();
    points
        .iter()
        .map(|p| {
            let z = point_elevation(model, p);
            by_level
                .entry(z.to_bits())
                .or_insert_with(|| field.elevation(z))
                .clone()
        })
        .collect()
}

/// Levels at `points`, each at its own elevation, for `rates` (m³/s).
pub fn point_levels(
    model: &Model,
    field: &Field,
    points: &[CheckPoint],
    rates: &[f64],
) -> Vec<Level> {
    let mut groups: HashMap<u64, Vec<usize>> = HashMap::new();
    for (i, p) in points.iter().enumerate() {
        groups
            .entry(point_elevation(model, p).to_bits())
            .or_default()
            .push(i);
    }
    let mut out = vec![Level::Dry; points.len()];
    for (z, idx) in groups {
        let tables = field.elevation(f64::from_bits(z));
        let pos: Vec<[f64; 2]> = idx.iter().map(|&i| points[i].position).collect();
        for (i, lv) in idx
            .iter()
            .zip(field.levels_at(&pos, rates, tables.as_ref()))
        {
            out[*i] = lv;
        }
    }
    out
}
