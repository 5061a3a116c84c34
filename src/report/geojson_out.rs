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
use crate::input::units::UnitSystem;
use crate::physics::images::BoundaryKind;
use crate::report::problems::well_problems;
use crate::safety::neighbours::NeighbourResult;
use geo::orient::{Direction, Orient};
use geo::Polygon;
use geojson::{Feature, FeatureCollection, Geometry, JsonObject};
use serde_json::{json, Value};

/// A polygon with its rings as RFC 7946 §3.1.6 asks: the exterior counter-clockwise, holes
/// clockwise (`geo::Orient`), each ring closed.
fn polygon(poly: &Polygon<f64>) -> Geometry {
    let poly = poly.orient(Direction::Default);
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
    // The geojson crate starts the collection's bbox as an empty list and keeps it when no
    // feature has one (`"bbox": []`, invalid by RFC 7946 §5); the member is optional, so none.
    fc.bbox = None;
    if let Value::Object(map) = members {
        fc.foreign_members = Some(map.into_iter().collect::<JsonObject>());
    }
    // Serialising plain numbers and strings cannot fail; fall back to the geojson crate's own
    // Display if it ever did. One line, as GIS tools write it.
    let mut out = serde_json::to_string(&fc).unwrap_or_else(|_| fc.to_string());
    out.push('\n');
    out
}

/// The members every collection carries. Without `[site] crs` the coordinates are the site's
/// own grid, which a GIS would read as longitude/latitude (RFC 7946); the 2008 GeoJSON `crs`
/// member then names a local engineering CRS in metres (OGC WKT `LOCAL_CS`, read by GDAL as
/// such), so the layer opens in metres rather than at longitude 300.
fn members(run: &CheckRun) -> Value {
    let mut m = json!({
        "name": run.model.name,
        "coordinate_system": run.model.grid,
        "units": "m",
        "datum": run.model.datum,
    });
    if !run.model.crs_warnings.is_empty() {
        if let Value::Object(map) = &mut m {
            map.insert("crs_warnings".into(), json!(run.model.crs_warnings));
        }
    }
    if run.model.crs.is_none() {
        if let Value::Object(map) = &mut m {
            map.insert("crs".into(), local_crs_member(&run.model.grid));
        }
    }
    m
}

/// The legacy `crs` member naming a local grid in metres, x east and y north.
pub fn local_crs_member(grid: &str) -> Value {
    let name: String = grid
        .chars()
        .filter(|c| !c.is_control() && *c != '"' && *c != '\\')
        .collect();
    json!({
        "type": "name",
        "properties": {
            "name": format!(
                "LOCAL_CS[\"{name} (site grid, metres)\",LOCAL_DATUM[\"site grid\",0],UNIT[\"metre\",1],AXIS[\"x\",EAST],AXIS[\"y\",NORTH]]"
            )
        }
    })
}

fn level(v: Option<f64>) -> Value {
    v.map_or(Value::Null, |z| json!(round(z, 4)))
}

fn round(v: f64, d: i32) -> f64 {
    let k = 10f64.powi(d);
    (v * k).round() / k
}

/// The layout: excavations, wells, the lines wells were set out on, boundaries, neighbours
/// (with their status, worst drawdown and settlement), keep-out zones and check points (with
/// level, target and margin), each feature with a `kind` property.
pub fn layout_geojson(run: &CheckRun, assessed: &[NeighbourResult]) -> String {
    let model = run.model;
    // Status words in SI, as every number of the file.
    let si = crate::report::format::Fmt::new(UnitSystem::Si, model.ground_level);
    let mut features = Vec::new();
    for e in &model.excavations {
        // The level the excavation is held to, as its check points carry it: the relief head
        // for a relief excavation (null when none is needed), else formation − margin.
        let design = crate::field::checkpoints::design_target(model, e);
        features.push(feature(
            polygon(&e.outline),
            json!({
                "kind": "excavation",
                "name": e.name,
                "formation_level_m": e.formation_level,
                "target_level_m": design.level.map(|t| round(t, 4)),
                "target_is_relief_head": design.relief,
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
                "status": if r.problems.is_empty() { "ok".to_string() } else { well_problems(&r.problems, &si) },
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
    for (n, a) in model.neighbours.iter().zip(assessed) {
        features.push(feature(
            polygon(&n.footprint),
            json!({
                "kind": "neighbour",
                "name": n.name,
                "foundation_level_m": n.foundation_level,
                "allowable_drawdown_m": n.allowable_drawdown,
                "allowable_settlement_m": n.allowable_settlement,
                "allowable_distortion": n.allowable_distortion,
                "status": a.status,
                "utilisation": a.utilisation.map(|u| round(u, 4)),
                "drawdown_m": round(a.worst_drawdown.drawdown_m, 4),
                "settlement_m": a.worst_settlement.as_ref().and_then(|s| s.settlement_m).map(|v| round(v, 5)),
                "distortion": a.max_distortion.map(|v| round(v, 7)),
            }),
        ));
    }
    for p in &run.evaluation.points {
        features.push(feature(
            Geometry::new_point([round(p.point.position[0], 4), round(p.point.position[1], 4)]),
            json!({
                "kind": "check-point",
                "name": p.point.name,
                "point_kind": p.point.kind,
                "level_m": level(p.level_m),
                "target_level_m": p.point.target_level.map(|t| round(t, 4)),
                "margin_m": p.margin_m.map(|m| round(m, 4)),
                "drawdown_m": round(p.drawdown_m, 4),
                "met": p.met,
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

#[cfg(test)]
mod tests {
    use super::*;

    // RFC 7946 §5: a bbox has 2·n numbers; an empty collection (no contour in range) has none.
    #[test]
    fn geojson_empty_collection_has_no_empty_bbox() {
        let text = collection(Vec::new(), json!({"name": "x"}));
        let v: Value = serde_json::from_str(&text).unwrap();
        assert!(v.get("bbox").is_none(), "{text}");
        assert_eq!(v["features"], json!([]));
    }

    #[test]
    fn geojson_rings_counter_clockwise_holes_clockwise() {
        use geo::{polygon, Winding};
        // Exterior given clockwise, hole given counter-clockwise.
        let p = polygon!(
            exterior: [(x: 0.0, y: 0.0), (x: 0.0, y: 10.0), (x: 10.0, y: 10.0), (x: 10.0, y: 0.0)],
            interiors: [[(x: 2.0, y: 2.0), (x: 4.0, y: 2.0), (x: 4.0, y: 4.0)]],
        );
        let geojson::GeometryValue::Polygon { coordinates } = polygon(&p).value else {
            panic!("polygon")
        };
        let ring = |r: &Vec<geojson::Position>| {
            geo::LineString::from(r.iter().map(|c| (c[0], c[1])).collect::<Vec<_>>())
        };
        assert!(ring(&coordinates[0]).is_ccw());
        assert!(ring(&coordinates[1]).is_cw());
    }
}
