//! Check points: where the water level is proven against its target.
//!
//! For each excavation: a grid inside the outline, every corner, and points along every edge,
//! each with the excavation's target level (formation − margin); plus the points the user names.

use crate::input::model::{Control, Excavation, Model, Uplift};
use crate::physics::uplift::{overburden, required_head};
use geo::{BoundingRect, Contains, Point};
use serde::Serialize;

/// Where a check point comes from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum PointKind {
    /// Grid node inside an outline.
    Grid,
    /// Outline vertex.
    Corner,
    /// Along an outline edge.
    Edge,
    /// Named by the user.
    Named,
    /// Holds the head that keeps the base from lifting ([`add_uplift_points`]).
    Uplift,
}

/// One check point.
#[derive(Debug, Clone, Serialize)]
pub struct CheckPoint {
    /// Name ("Basement g0012", "Basement corner 3", or the user's).
    pub name: String,
    /// Kind.
    pub kind: PointKind,
    /// Excavation it belongs to, if any.
    pub excavation: Option<usize>,
    /// Position [x, y], m.
    pub position: [f64; 2],
    /// Level the water must be at or below, m; `None`: report only.
    pub target_level: Option<f64>,
}

/// All check points of the model.
pub fn check_points(model: &Model) -> Vec<CheckPoint> {
    let mut out = Vec::new();
    let h = model.checks.grid_spacing;
    for (ei, e) in model.excavations.iter().enumerate() {
        // Relief only: the water table is left where it is; the uplift points carry the target.
        let target = (e.control != Control::Relieve).then(|| e.target_level());
        let ring = &e.outline.exterior().0;
        let n = ring.len().saturating_sub(1);
        for (i, c) in ring.iter().take(n).enumerate() {
            out.push(CheckPoint {
                name: format!("{} corner {}", e.name, i + 1),
                kind: PointKind::Corner,
                excavation: Some(ei),
                position: [c.x, c.y],
                target_level: target,
            });
        }
        for (i, w) in ring.windows(2).enumerate() {
            let len = (w[1].x - w[0].x).hypot(w[1].y - w[0].y);
            let m = (len / model.checks.edge_spacing).ceil().max(1.0) as usize;
            for j in 1..m {
                let t = j as f64 / m as f64;
                out.push(CheckPoint {
                    name: format!("{} edge {}.{}", e.name, i + 1, j),
                    kind: PointKind::Edge,
                    excavation: Some(ei),
                    position: [
                        w[0].x + t * (w[1].x - w[0].x),
                        w[0].y + t * (w[1].y - w[0].y),
                    ],
                    target_level: target,
                });
            }
        }
        if let Some(bb) = e.outline.bounding_rect() {
            let nx = ((bb.width() / h).floor() as usize).max(1);
            let ny = ((bb.height() / h).floor() as usize).max(1);
            // Centre the grid in the bounding box.
            let x0 = bb.min().x + (bb.width() - (nx - 1) as f64 * h) / 2.0;
            let y0 = bb.min().y + (bb.height() - (ny - 1) as f64 * h) / 2.0;
            let mut g = 0;
            for j in 0..ny {
                let y = y0 + j as f64 * h;
                let crossings = row_crossings(ring, y);
                // A row through a vertex or along an edge is decided point by point exactly.
                let on_vertex = ring.iter().any(|c| (c.y - y).abs() < 1e-6);
                for i in 0..nx {
                    let p = [x0 + i as f64 * h, y];
                    let inside = if on_vertex {
                        e.outline.contains(&Point::new(p[0], p[1]))
                    } else {
                        inside_by_crossings(&crossings, p, &e.outline)
                    };
                    if inside {
                        g += 1;
                        out.push(CheckPoint {
                            name: format!("{} g{g:05}", e.name),
                            kind: PointKind::Grid,
                            excavation: Some(ei),
                            position: p,
                            target_level: target,
                        });
                    }
                }
            }
        }
    }
    for (name, p, target) in &model.checks.points {
        out.push(CheckPoint {
            name: name.clone(),
            kind: PointKind::Named,
            excavation: None,
            position: *p,
            target_level: *target,
        });
    }
    add_uplift_points(model, &mut out);
    out
}

/// Where the outline `ring` crosses the horizontal line at `y`, sorted: the even–odd rule of a
/// scanline fill (Foley, van Dam, Feiner & Hughes, *Computer Graphics*, 2nd ed., §3.6), so a grid
/// row costs one pass over the edges instead of one per point — near-linear in the vertices.
fn row_crossings(ring: &[geo::Coord<f64>], y: f64) -> Vec<f64> {
    let mut xs: Vec<f64> = ring
        .windows(2)
        .filter(|w| (w[0].y <= y) != (w[1].y <= y))
        .map(|w| w[0].x + (y - w[0].y) * (w[1].x - w[0].x) / (w[1].y - w[0].y))
        .collect();
    xs.sort_by(f64::total_cmp);
    xs
}

/// Inside by the count of crossings left of `p`; a point within a micrometre of an edge
/// crossing is decided by `geo`'s exact test (boundary points are outside, as in `Contains`).
fn inside_by_crossings(crossings: &[f64], p: [f64; 2], outline: &geo::Polygon<f64>) -> bool {
    let k = crossings.partition_point(|&x| x < p[0]);
    let near = |i: usize| crossings.get(i).is_some_and(|&x| (x - p[0]).abs() < 1e-6);
    if near(k) || (k > 0 && near(k - 1)) {
        return outline.contains(&Point::new(p[0], p[1]));
    }
    k % 2 == 1
}

/// A point inside `poly`: its centroid when that lies inside, else the middle of the widest
/// inside stretch of the horizontal line through the middle of its bounding box (the scanline
/// crossings of `row_crossings`). Linear in the vertices and free of the degenerate cases of a
/// sweep-line search.
pub fn inside_point(poly: &geo::Polygon<f64>) -> Option<[f64; 2]> {
    use geo::Centroid;
    if let Some(c) = poly.centroid() {
        if poly.contains(&c) {
            return Some([c.x(), c.y()]);
        }
    }
    let bb = poly.bounding_rect()?;
    let ring = &poly.exterior().0;
    // A row exactly through a vertex is nudged off it.
    let mut y = 0.5 * (bb.min().y + bb.max().y);
    if ring.iter().any(|c| c.y == y) {
        y += 1e-6 * bb.height().max(1e-9);
    }
    let xs = row_crossings(ring, y);
    xs.chunks_exact(2)
        .max_by(|a, b| (a[1] - a[0]).total_cmp(&(b[1] - b[0])))
        .map(|w| [0.5 * (w[0] + w[1]), y])
}

/// The level the superposition field must reach for h_req: the drawdown the layer needs
/// (h_p − h_req) taken off the aquifer's initial level. `None` when no relief is needed.
pub fn field_target(model: &Model, u: &Uplift, formation_level: f64) -> Option<f64> {
    let sigma = overburden(u.soil_unit_weight, formation_level, u.layer_top);
    let h_req = required_head(sigma, u.layer_top, u.factor_of_safety);
    (h_req < u.piezometric_level)
        .then_some(model.aquifer.initial_level - (u.piezometric_level - h_req))
}

/// The level an excavation is designed to, and whether it is the relief head.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DesignTarget {
    /// Level the water (field) must be at or below, m; `None`: relief only and none needed.
    pub level: Option<f64>,
    /// The level is the relief head h_req (as a field level), not formation − margin.
    pub relief: bool,
}

/// The target an excavation is designed to, the same as its check points carry
/// ([`add_uplift_points`]): `"dewater"` formation − margin; `"relieve"` the relief head
/// ([`field_target`]; `None` when the layer needs no relief; formation − margin when the file has
/// no `[uplift]`, which validation refuses); `"both"` the lower of the two.
pub fn design_target(model: &Model, e: &Excavation) -> DesignTarget {
    let dewater = e.target_level();
    let relief = model
        .uplift
        .as_ref()
        .map(|u| field_target(model, u, e.formation_level));
    match (e.control, relief) {
        (Control::Relieve, Some(t)) => DesignTarget {
            level: t,
            relief: true,
        },
        (Control::Both, Some(Some(t))) if t < dewater => DesignTarget {
            level: Some(t),
            relief: true,
        },
        _ => DesignTarget {
            level: Some(dewater),
            relief: false,
        },
    }
}

/// Add the uplift check points of every excavation that needs relief: its corners and an
/// interior point, with target = min(excavation target, h_req as a field level) (`control =
/// "both"`), or h_req alone (`"relieve"`; none for `"dewater"`); where h_req is the stricter or
/// the only target, also a copy of every check point of the excavation, so the whole base is
/// held.
pub fn add_uplift_points(model: &Model, points: &mut Vec<CheckPoint>) {
    let Some(u) = &model.uplift else { return };
    let mut extra = Vec::new();
    for (ei, e) in model.excavations.iter().enumerate() {
        let Some(t_uplift) = field_target(model, u, e.formation_level) else {
            continue;
        };
        let target = match e.control {
            Control::Dewater => continue,
            Control::Relieve => t_uplift,
            Control::Both => e.target_level().min(t_uplift),
        };
        let ring = &e.outline.exterior().0;
        let n = ring.len().saturating_sub(1);
        for (i, c) in ring.iter().take(n).enumerate() {
            extra.push(CheckPoint {
                name: format!("{} uplift corner {}", e.name, i + 1),
                kind: PointKind::Uplift,
                excavation: Some(ei),
                position: [c.x, c.y],
                target_level: Some(target),
            });
        }
        if let Some(p) = inside_point(&e.outline) {
            extra.push(CheckPoint {
                name: format!("{} uplift inside", e.name),
                kind: PointKind::Uplift,
                excavation: Some(ei),
                position: p,
                target_level: Some(target),
            });
        }
        if t_uplift < e.target_level() || e.control == Control::Relieve {
            for p in points
                .iter()
                .filter(|p| p.excavation == Some(ei) && p.kind != PointKind::Corner)
            {
                extra.push(CheckPoint {
                    name: format!("{} (uplift)", p.name),
                    kind: PointKind::Uplift,
                    excavation: Some(ei),
                    position: p.position,
                    target_level: Some(target),
                });
            }
        }
    }
    points.extend(extra);
}

#[cfg(test)]
mod scanline_tests {
    use super::*;
    use geo::{Coord, LineString, Polygon};

    /// The scanline shortcut against the plain test (`geo`'s `Contains`) on an L-shaped outline
    /// and a rotated one, at points on and off the grid.
    #[test]
    fn scanline_agrees_with_contains() {
        let shapes = [
            vec![
                [0.0, 0.0],
                [56.0, 0.0],
                [56.0, 22.0],
                [30.0, 22.0],
                [30.0, 44.0],
                [0.0, 44.0],
            ],
            vec![
                [0.3, -7.1],
                [40.2, 3.3],
                [31.7, 29.9],
                [12.1, 15.2],
                [-8.4, 22.8],
            ],
        ];
        for pts in shapes {
            let mut ring: Vec<Coord<f64>> =
                pts.iter().map(|p| Coord { x: p[0], y: p[1] }).collect();
            ring.push(ring[0]);
            let poly = Polygon::new(LineString(ring.clone()), vec![]);
            for j in 0..97 {
                let y = -10.0 + 0.57 * j as f64;
                let xs = row_crossings(&ring, y);
                for i in 0..131 {
                    let p = [-12.0 + 0.53 * i as f64, y];
                    let plain = poly.contains(&Point::new(p[0], p[1]));
                    assert_eq!(inside_by_crossings(&xs, p, &poly), plain, "{p:?}");
                }
            }
            let inside = inside_point(&poly).unwrap();
            assert!(poly.contains(&Point::new(inside[0], inside[1])));
        }
    }
}
