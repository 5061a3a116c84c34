//! `layout.geojson` and `contours.geojson`: the layout and the contour lines for GIS and CAD.
//!
//! Coordinates are the site's own (x east, y north, metres, in the grid the design file names),
//! not shifted and not reprojected; computed positions (wells, set-out lines, contours) are
//! rounded to 0.1 mm, the user's outlines are written as given. RFC 7946 asks for longitude/latitude; a local or projected
//! grid is written as is, and the collection carries `coordinate_system` and `units` members
//! saying so, for the reader to set the layer's CRS. With `[site] crs` every position is
//! reprojected to WGS84 longitude/latitude ([`super::geojson_wgs84`]).

use crate::check::run::CheckRun;
use crate::field::grid::LevelGrid;
use crate::input::model::MapQuantity;
use crate::physics::images::BoundaryKind;
use geo::Polygon;
use geojson::{Feature, FeatureCollection, Geometry, JsonObject};
use serde_json::{json, Value};

fn polygon(poly: &Polygon<f64>) -> Geometry {
    let ring = |ls: &geo::LineString<f64>| -> Vec<[f64; 2]> {
        let mut v: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
        if v.len() > 1 && v.first() != v.last() {
            v.push(v[0]);
        }
        v
    };
    let mut rings = vec![ring(poly.exterior())];
    rings.extend(poly.interiors().iter().map(ring));
    Geometry::new_polygon(rings)
}

fn feature(geometry: Geometry, properties: Value) -> Feature {
    let mut f = Feature::from(geometry);
    if let Value::Object(map) = properties {
        for (k, v) in map {
            f.set_property(k, v);
        }
    }
    f
}

fn collection(features: Vec<Feature>, members: Value) -> String {
    let mut fc = FeatureCollection::new(features);
    if let Value::Object(map) = members {
        fc.foreign_members = Some(map.into_iter().collect::<JsonObject>());
    }
    // Serialising plain numbers and strings cannot fail; fall back to the geojson crate's own
    // Display if it ever did. One line, as GIS tools write it.
    let mut out = serde_json::to_string(&fc).unwrap_or_else(|_| fc.to_string());
    out.push('\n');
    out
}

fn members(run: &CheckRun) -> Value {
    json!({
        "name": run.model.name,
        "coordinate_system": run.model.grid,
        "units": "m",
        "datum": run.model.datum,
    })
}

fn level(v: Option<f64>) -> Value {
    v.map_or(Value::Null, |z| json!(round(z, 4)))
}

fn round(v: f64, d: i32) -> f64 {
    let k = 10f64.powi(d);
    (v * k).round() / k
}

/// The layout: excavations, wells, the lines wells were set out on, boundaries, neighbours and
/// keep-out zones, each feature with a `kind` property.
pub fn layout_geojson(run: &CheckRun) -> String {
    let model = run.model;
    let mut features = Vec::new();
    for e in &model.excavations {
        features.push(feature(
            polygon(&e.outline),
            json!({
                "kind": "excavation",
                "name": e.name,
                "formation_level_m": e.formation_level,
                "target_level_m": round(e.target_level(), 4),
            }),
        ));
    }
    for (w, r) in run.placement.wells.iter().zip(&run.evaluation.wells) {
        features.push(feature(
            Geometry::new_point([round(w.position[0], 4), round(w.position[1], 4)]),
            json!({
                "kind": "well",
                "name": w.name,
                "role": if w.rate < 0.0 { "recharge" } else { "pumping" },
                "rate_l_per_s": round(w.rate * 1e3, 5),
                "level_m": level(r.level_m),
                "drawdown_m": round(r.drawdown_m, 4),
                "radius_m": w.radius,
                "status": if r.problems.is_empty() { "ok".to_string() } else { r.problems.join("; ") },
            }),
        ));
    }
    for (i, p) in run.placement.paths.iter().enumerate() {
        if p.len() >= 2 {
            features.push(feature(
                Geometry::new_line_string(p.iter().map(|q| [round(q[0], 4), round(q[1], 4)])),
                json!({ "kind": "well-line", "name": format!("set-out line {}", i + 1) }),
            ));
        }
    }
    for b in &model.boundaries {
        features.push(feature(
            Geometry::new_line_string(b.line),
            json!({
                "kind": "boundary",
                "name": b.name,
                "boundary": match b.kind {
                    BoundaryKind::ConstantHead => "constant-head",
                    BoundaryKind::Barrier => "barrier",
                },
                "note": "the model treats the line as straight and endless",
            }),
        ));
    }
    for n in &model.neighbours {
        features.push(feature(
            polygon(&n.footprint),
            json!({
                "kind": "neighbour",
                "name": n.name,
                "foundation_level_m": n.foundation_level,
                "allowable_drawdown_m": n.allowable_drawdown,
                "allowable_settlement_m": n.allowable_settlement,
                "allowable_distortion": n.allowable_distortion,
            }),
        ));
    }
    for k in &model.keep_outs {
        features.push(feature(
            polygon(&k.polygon),
            json!({ "kind": "keep-out", "name": k.name }),
        ));
    }
    let (features, members) = super::geojson_wgs84::reproject(run, features, members(run));
    collection(features, members)
}

/// Contour lines of the design file's map quantity over `grid`: one feature per value, a
/// LineString when it is one piece, a MultiLineString otherwise, with `value_m` and `quantity`.
pub fn contours_geojson(run: &CheckRun, grid: &LevelGrid) -> String {
    let quantity = run.model.map_quantity;
    let set = grid.contours(quantity);
    let name = match quantity {
        MapQuantity::Drawdown => "drawdown",
        MapQuantity::WaterLevel => "water-level",
    };
    let features: Vec<Feature> = set
        .lines
        .iter()
        .map(|line| {
            let geometry = if line.parts.len() == 1 {
                Geometry::new_line_string(
                    line.parts[0]
                        .iter()
                        .map(|p| [round(p[0], 4), round(p[1], 4)]),
                )
            } else {
                Geometry::new_multi_line_string(line.parts.iter().map(|part| {
                    part.iter()
                        .map(|p| [round(p[0], 4), round(p[1], 4)])
                        .collect::<Vec<_>>()
                }))
            };
            feature(
                geometry,
                json!({ "value_m": line.value, "quantity": name, "unit": "m" }),
            )
        })
        .collect();
    let mut m = members(run);
    if let Value::Object(map) = &mut m {
        map.insert("quantity".into(), json!(name));
        map.insert("interval_m".into(), json!(set.interval));
        map.insert("grid_step_m".into(), json!(round(grid.step, 4)));
    }
    let (features, m) = super::geojson_wgs84::reproject(run, features, m);
    collection(features, m)
}
