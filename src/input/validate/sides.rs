//! Boundaries that hold: every well, named check point and neighbour must lie on the aquifer
//! side of every straight boundary line (the side of the excavations), or its image would land
//! inside the aquifer next to the pit. A well closer to a constant-head line than its own radius
//! is refused too (its image would overlap it: the method of images, Ferris et al. 1962, USGS
//! WSP 1536-E, needs the well wholly on one side).

use crate::geometry::{cross, foot};
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::physics::images::BoundaryKind;
use geo::Centroid;

/// Signed distance of `p` from the boundary line a→b, m, positive on the side of `reference`.
fn signed_distance(p: [f64; 2], a: [f64; 2], b: [f64; 2], reference: f64) -> f64 {
    let f = foot(p, a, b);
    let d = (p[0] - f[0]).hypot(p[1] - f[1]);
    if cross(p, a, b) * reference >= 0.0 {
        d
    } else {
        -d
    }
}

fn refuse(model: &Model, field: &str, message: String) -> InputError {
    InputError {
        file: model.file.clone(),
        field: field.into(),
        line: None,
        message,
    }
}

/// The aquifer side of each boundary: the sign of the cross product at the first excavation's
/// centroid (validation has checked that no boundary crosses an excavation).
fn references(model: &Model) -> Vec<f64> {
    let c = model.excavations[0]
        .outline
        .centroid()
        .map_or([0.0, 0.0], |c| [c.x(), c.y()]);
    model
        .boundaries
        .iter()
        .map(|b| cross(c, b.line[0], b.line[1]).signum())
        .collect()
}

/// Refuse a point (named check point or neighbour vertex) across a boundary. `what` names it.
fn check_point(
    model: &Model,
    refs: &[f64],
    p: [f64; 2],
    field: &str,
    what: &str,
) -> Result<(), InputError> {
    for (b, r) in model.boundaries.iter().zip(refs) {
        let d = signed_distance(p, b.line[0], b.line[1], *r);
        if d < 0.0 {
            return Err(refuse(model, field, format!(
                "{what} at [{:.2}, {:.2}] lies {:.2} m beyond boundary \"{}\", on the far side from the excavations; move it to the aquifer side or remove it (its image would land inside the aquifer)",
                p[0], p[1], -d, b.name
            )));
        }
    }
    Ok(())
}

/// Every named check point and every neighbour's footprint on the aquifer side of every
/// boundary; the error names the thing, the boundary and the distance.
pub fn check_points_and_neighbours(model: &Model) -> Result<(), InputError> {
    if model.boundaries.is_empty() {
        return Ok(());
    }
    let refs = references(model);
    for (i, (name, p, _)) in model.checks.points.iter().enumerate() {
        check_point(
            model,
            &refs,
            *p,
            &format!("checks.point[{}]", i + 1),
            &format!("check point \"{name}\""),
        )?;
    }
    for (i, n) in model.neighbours.iter().enumerate() {
        for c in n.footprint.exterior().coords() {
            check_point(
                model,
                &refs,
                [c.x, c.y],
                &format!("neighbour[{}].footprint", i + 1),
                &format!("neighbour \"{}\" (a footprint corner)", n.name),
            )?;
        }
    }
    Ok(())
}

/// Every well on the aquifer side of every boundary, and more than its own radius from a
/// constant-head line; the error names the well, the boundary and the distance.
/// `wells` as (name, position m, radius m); `field` names where they come from ("well" for the
/// listed wells, "layout" for generated ones, the CSV file for `--wells`).
pub fn check_wells(
    model: &Model,
    wells: &[(&str, [f64; 2], f64)],
    field: &str,
) -> Result<(), InputError> {
    if model.boundaries.is_empty() {
        return Ok(());
    }
    let refs = references(model);
    for &(name, position, radius) in wells {
        for (b, r) in model.boundaries.iter().zip(&refs) {
            let d = signed_distance(position, b.line[0], b.line[1], *r);
            if d < 0.0 {
                return Err(refuse(model, field, format!(
                    "well \"{}\" at [{:.2}, {:.2}] lies {:.2} m beyond boundary \"{}\", on the far side from the excavations; move it to the aquifer side",
                    name, position[0], position[1], -d, b.name
                )));
            }
            if b.kind == BoundaryKind::ConstantHead && d <= radius {
                return Err(refuse(model, field, format!(
                    "well \"{}\" is {:.3} m from constant-head boundary \"{}\", within its own radius ({:.3} m): it would stand in the river; move it at least a well radius inland",
                    name, d, b.name, radius
                )));
            }
        }
    }
    Ok(())
}
