//! Read outlines, lines and wells from a GeoJSON FeatureCollection (RFC 7946 structure) drawn
//! in a projected or local grid, metres.
//!
//! Features are picked by a property filter (`layer` = `excavation`, or any property name and
//! value the caller gives): Polygon and MultiPolygon features become outlines, LineString and
//! MultiLineString lines, Point and MultiPoint wells. Each keeps its `name` property.
//!
//! RFC 7946 GeoJSON is WGS84 longitude/latitude by definition; drydig works in metres on a
//! grid, so a file whose coordinates all fit in |x| ≤ 180, |y| ≤ 90 and that names no CRS (or
//! names WGS84) is refused as geographic. A file in a grid says so with a top-level `crs`
//! member (the 2008 GeoJSON form, `{"type": "name", "properties": {"name": "EPSG:27700"}}`) or
//! a `coordinate_system` member (as drydig's own GeoJSON output writes).

use std::path::Path;

use geo::{Coord, LineString, Point, Polygon};
use geojson::{FeatureCollection, GeoJson, GeometryValue, Position};
use serde_json::Value;

use super::{ring_problem, Drawing, Marker, Shape};
use crate::input::error::InputError;

/// Pick features whose property `key` equals `value` (strings compared without regard to case;
/// numbers and booleans by their JSON text).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct PropertyFilter {
    /// Property name (`layer`).
    pub key: String,
    /// Wanted value (`excavation`).
    pub value: String,
}

impl PropertyFilter {
    /// `key` == `value`.
    pub fn new(key: impl Into<String>, value: impl Into<String>) -> Self {
        PropertyFilter {
            key: key.into(),
            value: value.into(),
        }
    }

    fn matches(&self, v: Option<&Value>) -> bool {
        match v {
            Some(Value::String(s)) => s.eq_ignore_ascii_case(&self.value),
            Some(Value::Null) | None => false,
            Some(other) => *other.to_string() == *self.value,
        }
    }
}

fn err(file: &Path, field: impl Into<String>, message: impl Into<String>) -> InputError {
    InputError::at(file, field, message)
}

/// Read `path` and return every feature matching `filter`, in metres.
///
/// Errors (each naming the file, the feature and what would be valid): unreadable file, not a
/// FeatureCollection, no feature matching (the values present for that property are listed),
/// a bad outline (fewer than 3 distinct vertices, no area, non-finite numbers), or coordinates
/// that look geographic (see the module notes).
pub fn read(path: &Path, filter: &PropertyFilter) -> Result<Drawing, InputError> {
    let text = crate::input::read::read_text_capped(
        path,
        crate::input::read::MAX_GEOJSON_BYTES,
        "GeoJSON file",
    )?;
    parse(path, &text, filter)
}

/// As [`read`], from text already in memory (`path` names it in messages).
pub fn parse(path: &Path, text: &str, filter: &PropertyFilter) -> Result<Drawing, InputError> {
    let gj: GeoJson = text.parse().map_err(|e| {
        err(
            path,
            "",
            format!("not GeoJSON ({e}); give a FeatureCollection of Polygon, LineString and Point features"),
        )
    })?;
    let fc: FeatureCollection = match gj {
        GeoJson::FeatureCollection(fc) => fc,
        _ => {
            return Err(err(
                path,
                "type",
                "the file is a single geometry or feature; give a FeatureCollection",
            ))
        }
    };
    let crs_named = declared_crs(&fc);
    let mut drawing = Drawing::default();
    let mut seen_values: Vec<String> = Vec::new();
    for (i, f) in fc.features.iter().enumerate() {
        let v = f.property(&filter.key);
        if !filter.matches(v) {
            if let Some(v) = v {
                let s = match v {
                    Value::String(s) => s.clone(),
                    other => other.to_string(),
                };
                if !seen_values.contains(&s) {
                    seen_values.push(s);
                }
            }
            continue;
        }
        let name = match f.property("name") {
            Some(Value::String(s)) => s.clone(),
            Some(Value::Null) | None => format!("feature {}", i + 1),
            Some(other) => other.to_string(),
        };
        if let Some(m) = crate::input::validate::ranges::name_problem(&name) {
            return Err(err(path, format!("features[{i}].properties.name"), m));
        }
        let field = format!("features[{i}] (\"{name}\")");
        let Some(geometry) = &f.geometry else {
            return Err(err(path, field, "the feature has no geometry"));
        };
        add_feature(path, &mut drawing, i, &name, geometry)?;
    }
    if drawing.is_empty() {
        let present = if seen_values.is_empty() {
            format!("no feature has a \"{}\" property", filter.key)
        } else {
            format!("values present: {}", seen_values.join(", "))
        };
        return Err(err(
            path,
            format!("{} = \"{}\"", filter.key, filter.value),
            format!("no feature matches ({present})"),
        ));
    }
    onto_site_grid(path, &mut drawing, crs_named.as_deref())?;
    refuse_bad_rings(path, &drawing)?;
    Ok(drawing)
}

/// Adds one feature's geometry (the `i`-th feature, named `name`) to the drawing: polygons with
/// their holes, lines, points; multi-parts are numbered; a GeometryCollection is refused.
fn add_feature(
    path: &Path,
    drawing: &mut Drawing,
    i: usize,
    name: &str,
    geometry: &geojson::Geometry,
) -> Result<(), InputError> {
    let field = format!("features[{i}] (\"{name}\")");
    let polygon = |rings: &Vec<Vec<Position>>,
                   part: Option<usize>|
     -> Result<Shape<Polygon<f64>>, InputError> {
        let field = match part {
            Some(k) => format!("{field} part {}", k + 1),
            None => field.clone(),
        };
        let mut ls = Vec::new();
        // Finite numbers here; vertices and area once the coordinates are metres on the
        // grid (after any projection from longitude/latitude), in `refuse_bad_rings`.
        for ring in rings {
            ls.push(line_string(&positions(path, &field, ring)?));
        }
        if ls.is_empty() {
            return Err(err(path, field, "the polygon has no rings"));
        }
        let exterior = ls.remove(0);
        Ok(Shape {
            name: match part {
                Some(k) => format!("{name} (part {})", k + 1),
                None => name.to_string(),
            },
            source: format!("features[{i}]"),
            geometry: Polygon::new(exterior, ls),
        })
    };
    match &geometry.value {
        GeometryValue::Polygon { coordinates } => {
            drawing.polygons.push(polygon(coordinates, None)?)
        }
        GeometryValue::MultiPolygon { coordinates } => {
            let single = coordinates.len() == 1;
            for (k, rings) in coordinates.iter().enumerate() {
                drawing
                    .polygons
                    .push(polygon(rings, if single { None } else { Some(k) })?);
            }
        }
        GeometryValue::LineString { coordinates } => {
            let pts = positions(path, &field, coordinates)?;
            if pts.len() < 2 {
                return Err(err(path, field, "a line needs at least 2 vertices"));
            }
            drawing.lines.push(Shape {
                name: name.to_string(),
                source: format!("features[{i}]"),
                geometry: line_string(&pts),
            });
        }
        GeometryValue::MultiLineString { coordinates } => {
            for (k, line) in coordinates.iter().enumerate() {
                let pts = positions(path, &field, line)?;
                if pts.len() < 2 {
                    return Err(err(path, field, "a line needs at least 2 vertices"));
                }
                drawing.lines.push(Shape {
                    name: format!("{name} (part {})", k + 1),
                    source: format!("features[{i}]"),
                    geometry: line_string(&pts),
                });
            }
        }
        GeometryValue::Point { coordinates } => {
            let p = positions(path, &field, std::slice::from_ref(coordinates))?[0];
            drawing.points.push(Marker {
                name: name.to_string(),
                source: format!("features[{i}]"),
                at: Point::new(p.0, p.1),
                radius: None,
            });
        }
        GeometryValue::MultiPoint { coordinates } => {
            for (k, p) in positions(path, &field, coordinates)?.iter().enumerate() {
                drawing.points.push(Marker {
                    name: format!("{name} {}", k + 1),
                    source: format!("features[{i}]"),
                    at: Point::new(p.0, p.1),
                    radius: None,
                });
            }
        }
        GeometryValue::GeometryCollection { .. } => return Err(err(
            path,
            field,
            "a GeometryCollection is not read; give one Polygon, LineString or Point per feature",
        )),
    }
    Ok(())
}

/// Coordinates that look like longitude/latitude are projected with the site CRS when the design
/// file gives one, else refused with what to do; anything else is taken as the site grid.
fn onto_site_grid(
    path: &Path,
    drawing: &mut Drawing,
    crs_named: Option<&str>,
) -> Result<(), InputError> {
    let geographic = looks_geographic(drawing) && crs_named.is_none_or(is_wgs84);
    if geographic {
        if let Some(site) = site_crs() {
            project_lon_lat(path, drawing, &site)?;
        }
    }
    if geographic && site_crs().is_none() {
        return Err(err(
            path,
            "coordinates",
            format!(
                "the file looks geographic (all coordinates within ±180, ±90{}); drydig needs \
                 x east, y north in metres on a projected or local grid — export the drawing in \
                 its grid (e.g. a national grid or UTM zone) and name it in a top-level \"crs\" \
                 member, or give the site's grid as [site] crs and the longitudes/latitudes are \
                 projected onto it",
                match crs_named {
                    Some(c) => format!(", CRS \"{c}\""),
                    None => ", no CRS named".into(),
                }
            ),
        ));
    }
    Ok(())
}

thread_local! {
    /// The site CRS of the design file being read, for GeoJSON in longitude/latitude.
    static SITE_CRS: std::cell::RefCell<Option<String>> = const { std::cell::RefCell::new(None) };
}

/// Run `f` (reading the drawings a design file names) with `crs` as the site CRS: a GeoJSON file
/// in WGS84 longitude/latitude (RFC 7946) read meanwhile is projected onto that grid instead of
/// being refused as geographic.
pub fn with_site_crs<T>(crs: Option<&str>, f: impl FnOnce() -> T) -> T {
    let before = SITE_CRS.with(|c| c.replace(crs.map(str::to_string)));
    let out = f();
    SITE_CRS.with(|c| *c.borrow_mut() = before);
    out
}

fn site_crs() -> Option<String> {
    SITE_CRS.with(|c| c.borrow().clone())
}

/// Every position of `drawing`, WGS84 longitude/latitude, projected onto the site grid `crs`.
fn project_lon_lat(path: &Path, drawing: &mut Drawing, crs: &str) -> Result<(), InputError> {
    let r = super::crs::Reprojector::new(crs).map_err(|e| {
        err(
            path,
            "coordinates",
            format!("longitude/latitude cannot be projected: {e}"),
        )
    })?;
    let mut failed = None;
    let mut go = |c: &mut Coord<f64>| match r.from_wgs84(c.x, c.y) {
        Ok((x, y)) => *c = Coord { x, y },
        Err(_) => failed = Some(*c),
    };
    for p in &mut drawing.polygons {
        p.geometry
            .exterior_mut(|ls| ls.0.iter_mut().for_each(&mut go));
        p.geometry.interiors_mut(|rs| {
            rs.iter_mut()
                .for_each(|ls| ls.0.iter_mut().for_each(&mut go))
        });
    }
    for l in &mut drawing.lines {
        l.geometry.0.iter_mut().for_each(&mut go);
    }
    for m in &mut drawing.points {
        go(&mut m.at.0);
    }
    if let Some(c) = failed {
        return Err(err(
            path,
            "coordinates",
            format!(
                "the longitude/latitude ({}, {}) does not project onto the site grid {crs}",
                c.x, c.y
            ),
        ));
    }
    drawing
        .notes
        .push(crate::input::import::notes::ReadNote::Said(format!(
            "WGS84 longitude/latitude projected onto the site grid {crs}"
        )));
    Ok(())
}

/// Each outline has 3 distinct vertices and an area ([`ring_problem`]); holes (interior rings)
/// are refused with their area: the model has outlines without holes, and dropping one silently
/// would change the excavation's area.
fn refuse_bad_rings(path: &Path, drawing: &Drawing) -> Result<(), InputError> {
    for p in &drawing.polygons {
        let rings = std::iter::once(p.geometry.exterior()).chain(p.geometry.interiors());
        for (r, ring) in rings.enumerate() {
            let pts: Vec<(f64, f64)> = ring.0.iter().map(|c| (c.x, c.y)).collect();
            if let Some(msg) = ring_problem(&pts) {
                return Err(err(
                    path,
                    format!("{} (\"{}\") ring {}", p.source, p.name, r + 1),
                    msg,
                ));
            }
        }
        let holes = p.geometry.interiors();
        if holes.is_empty() {
            continue;
        }
        let area: f64 = holes
            .iter()
            .map(|r| super::ring_area(&r.0.iter().map(|c| (c.x, c.y)).collect::<Vec<_>>()))
            .sum();
        return Err(err(
            path,
            format!("{} (\"{}\")", p.source, p.name),
            format!(
                "the polygon has {} ({area:.1} m² in all); drydig does not read holes: give the outer outline alone (the whole area inside it is then dewatered, on the safe side for an excavation) or draw separate outlines",
                crate::plural::count(holes.len(), "hole", "holes")
            ),
        ));
    }
    Ok(())
}

fn positions(path: &Path, field: &str, ps: &[Position]) -> Result<Vec<(f64, f64)>, InputError> {
    ps.iter()
        .map(|p| {
            let s = p.as_slice();
            if s.len() < 2 || !s[0].is_finite() || !s[1].is_finite() {
                Err(err(
                    path,
                    field,
                    "a position is not a pair of finite numbers [x, y]",
                ))
            } else {
                Ok((s[0], s[1]))
            }
        })
        .collect()
}

fn line_string(pts: &[(f64, f64)]) -> LineString<f64> {
    LineString::new(pts.iter().map(|&(x, y)| Coord { x, y }).collect())
}

/// The CRS the file names, if any: `crs.properties.name` or `coordinate_system`.
fn declared_crs(fc: &FeatureCollection) -> Option<String> {
    let m = fc.foreign_members.as_ref()?;
    if let Some(Value::Object(crs)) = m.get("crs") {
        if let Some(Value::Object(p)) = crs.get("properties") {
            if let Some(Value::String(n)) = p.get("name") {
                return Some(n.clone());
            }
        }
    }
    match m.get("coordinate_system") {
        Some(Value::String(s)) => Some(s.clone()),
        _ => None,
    }
}

fn is_wgs84(name: &str) -> bool {
    let n = name.to_ascii_uppercase();
    n.contains("4326") || n.contains("CRS84") || n.contains("WGS84") || n.contains("WGS 84")
}

fn looks_geographic(d: &Drawing) -> bool {
    let fits = |c: &Coord<f64>| c.x.abs() <= 180.0 && c.y.abs() <= 90.0;
    d.polygons.iter().all(|p| {
        p.geometry.exterior().0.iter().all(fits)
            && p.geometry.interiors().iter().all(|r| r.0.iter().all(fits))
    }) && d.lines.iter().all(|l| l.geometry.0.iter().all(fits))
        && d.points.iter().all(|m| fits(&m.at.0))
}

#[cfg(test)]
mod tests {
    use super::*;
    use geojson::{Feature, Geometry, JsonObject};

    fn write_fc(features: Vec<Feature>, crs: Option<&str>) -> String {
        let mut fc = FeatureCollection::new(features);
        if let Some(c) = crs {
            let mut m = JsonObject::new();
            m.insert(
                "crs".into(),
                serde_json::json!({"type": "name", "properties": {"name": c}}),
            );
            fc.foreign_members = Some(m);
        }
        fc.to_string()
    }

    fn feature(g: Geometry, layer: &str, name: &str) -> Feature {
        let mut f = Feature::from(g);
        f.set_property("layer", layer);
        f.set_property("name", name);
        f
    }

    // Round trip through the geojson crate's writer (the geojson crate is the outside
    // reference for the format): the vertices read back are the ones written, exactly.
    #[test]
    fn import_geojson_round_trip_same_vertices() {
        let outline = vec![
            [1000.0, 2000.0],
            [1040.0, 2000.0],
            [1040.0, 2015.0],
            [1020.0, 2015.0],
            [1020.0, 2030.0],
            [1000.0, 2030.0],
            [1000.0, 2000.0],
        ];
        let hole = vec![
            [1005.0, 2005.0],
            [1010.0, 2005.0],
            [1010.0, 2010.0],
            [1005.0, 2005.0],
        ];
        let text = write_fc(
            vec![
                feature(
                    Geometry::new_polygon(vec![outline.clone()]),
                    "excavation",
                    "Basement",
                ),
                feature(
                    Geometry::new_line_string(vec![[970.0, 1960.0], [985.0, 2080.0]]),
                    "river",
                    "Bank",
                ),
                feature(Geometry::new_point([1010.5, 2022.25]), "wells", "W1"),
            ],
            None,
        );
        let p = Path::new("round_trip.geojson");
        let d = parse(p, &text, &PropertyFilter::new("layer", "EXCAVATION")).unwrap();
        assert_eq!(d.polygons.len(), 1);
        assert_eq!(d.polygons[0].name, "Basement");
        let got: Vec<[f64; 2]> = d.polygons[0]
            .geometry
            .exterior()
            .0
            .iter()
            .map(|c| [c.x, c.y])
            .collect();
        assert_eq!(got, outline);
        // A polygon with a hole is refused, naming the feature and the hole's area (5 × 5 m).
        let holed = write_fc(
            vec![feature(
                Geometry::new_polygon(vec![outline.clone(), hole.clone()]),
                "excavation",
                "Basement",
            )],
            None,
        );
        let e = parse(p, &holed, &PropertyFilter::new("layer", "excavation")).unwrap_err();
        assert!(e.field.contains("Basement"), "{e}");
        assert!(e.message.contains("1 hole (12.5 m² in all)"), "{e}");
        let d = parse(p, &text, &PropertyFilter::new("layer", "river")).unwrap();
        assert_eq!(
            d.lines[0].geometry.0[1],
            Coord {
                x: 985.0,
                y: 2080.0
            }
        );
        let d = parse(p, &text, &PropertyFilter::new("name", "W1")).unwrap();
        assert_eq!(d.points[0].at, Point::new(1010.5, 2022.25));
    }

    // design.md §4: geographic lon/lat input is refused with an explanation.
    #[test]
    fn import_geojson_refuses_lon_lat() {
        let ring = vec![
            [-0.13, 51.50],
            [-0.12, 51.50],
            [-0.12, 51.51],
            [-0.13, 51.50],
        ];
        let f = || {
            feature(
                Geometry::new_polygon(vec![ring.clone()]),
                "excavation",
                "Pit",
            )
        };
        let filter = PropertyFilter::new("layer", "excavation");
        let p = Path::new("site.geojson");
        for crs in [
            None,
            Some("urn:ogc:def:crs:OGC:1.3:CRS84"),
            Some("EPSG:4326"),
        ] {
            let e = parse(p, &write_fc(vec![f()], crs), &filter).unwrap_err();
            assert!(e.message.contains("looks geographic"), "{e}");
            assert!(e.message.contains("projected or local grid"), "{e}");
        }
        // Small numbers in a named local grid are accepted.
        assert!(parse(p, &write_fc(vec![f()], Some("local site grid")), &filter).is_ok());
    }

    // A standard RFC 7946 outline (lon/lat, no crs member) is projected onto the site grid when
    // the design file names one; the projected corners are compared with pyproj's forward
    // conversion of the same grid (tests/reference/crs_scale_factors.csv, "local tmerc":
    // lon -1.6, lat 52.2 is the false origin (1000, 2000)), and a 30 m square stays 30 m within
    // the grid's scale (k = 1 at the origin).
    #[test]
    fn import_geojson_lon_lat_projected_with_the_site_crs() {
        let crs = "+proj=tmerc +lat_0=52.2 +lon_0=-1.6 +k=1 +x_0=1000 +y_0=2000 +ellps=WGS84 +units=m +no_defs";
        let dlat = 30.0 / 111_257.0; // about 30 m of latitude at 52.2° N
        let ring = vec![
            [-1.6, 52.2],
            [-1.6, 52.2 + dlat],
            [-1.6005, 52.2 + dlat],
            [-1.6, 52.2],
        ];
        let text = write_fc(
            vec![feature(
                Geometry::new_polygon(vec![ring]),
                "excavation",
                "Pit",
            )],
            None,
        );
        let filter = PropertyFilter::new("layer", "excavation");
        let p = Path::new("site.geojson");
        assert!(parse(p, &text, &filter).is_err());
        let d = with_site_crs(Some(crs), || parse(p, &text, &filter)).unwrap();
        let c = &d.polygons[0].geometry.exterior().0;
        assert!(
            (c[0].x - 1000.0).abs() < 1e-6 && (c[0].y - 2000.0).abs() < 1e-6,
            "{c:?}"
        );
        assert!((c[1].y - c[0].y - 30.0).abs() < 0.05, "{c:?}");
        assert!(d
            .notes
            .iter()
            .any(|n| n.to_string().contains("projected onto the site grid")));
        // The context ends with the closure.
        assert!(parse(p, &text, &filter).is_err());
    }

    // The name rule of the design file applies to feature names (issue 19.2).
    #[test]
    fn import_geojson_names_follow_the_name_rule() {
        let p = Path::new("site.geojson");
        let ring = vec![
            [1000.0, 2000.0],
            [1030.0, 2000.0],
            [1030.0, 2020.0],
            [1000.0, 2000.0],
        ];
        for (name, hint) in [
            ("NaN", "choose another name"),
            ("Pit\u{1b}[2J", "control character"),
        ] {
            let text = write_fc(
                vec![feature(
                    Geometry::new_polygon(vec![ring.clone()]),
                    "excavation",
                    name,
                )],
                None,
            );
            let e = parse(p, &text, &PropertyFilter::new("layer", "excavation")).unwrap_err();
            assert!(e.message.contains(hint), "{e}");
            assert!(!e.to_string().contains('\u{1b}'), "{e}");
        }
    }

    #[test]
    fn import_geojson_errors_name_feature_and_choices() {
        let p = Path::new("site.geojson");
        let text = write_fc(
            vec![feature(
                Geometry::new_polygon(vec![vec![
                    [1000.0, 2000.0],
                    [1010.0, 2000.0],
                    [1000.0, 2000.0],
                ]]),
                "excavation",
                "Thin",
            )],
            None,
        );
        let e = parse(p, &text, &PropertyFilter::new("layer", "excavation")).unwrap_err();
        assert!(
            e.field.contains("features[0]") && e.field.contains("Thin"),
            "{e}"
        );
        let e = parse(p, &text, &PropertyFilter::new("layer", "neighbours")).unwrap_err();
        assert!(e.message.contains("values present: excavation"), "{e}");
        assert!(parse(
            p,
            "{\"type\": \"Point\", \"coordinates\": [1, 2]}",
            &PropertyFilter::new("a", "b")
        )
        .is_err());
        assert!(parse(p, "not json", &PropertyFilter::new("a", "b")).is_err());
    }
}
