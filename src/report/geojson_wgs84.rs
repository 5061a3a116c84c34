//! GeoJSON in WGS84 longitude/latitude, as RFC 7946 §4 requires, when the site names its
//! coordinate system (`[site] crs`). Every position of every feature goes through
//! [`crate::input::import::crs::Reprojector::to_wgs84`]; the CSVs keep the site coordinates.

use crate::check::run::CheckRun;
use crate::input::import::crs::Reprojector;
use geojson::{Feature, GeometryValue as G, Position};
use serde_json::{json, Value};

/// Degrees kept: 1e-9° is about 0.1 mm on the ground.
const DEGREE_DECIMALS: i32 = 9;

fn round(v: f64) -> f64 {
    let k = 10f64.powi(DEGREE_DECIMALS);
    (v * k).round() / k
}

fn position(r: &Reprojector, p: &mut Position) -> bool {
    if p.len() < 2 {
        return false;
    }
    match r.to_wgs84(p[0], p[1]) {
        Ok((lon, lat)) if lon.is_finite() && lat.is_finite() => {
            p[0] = round(lon);
            p[1] = round(lat);
            true
        }
        _ => false,
    }
}

fn geometry(r: &Reprojector, g: &mut G) -> bool {
    match g {
        G::Point { coordinates: p } => position(r, p),
        G::MultiPoint { coordinates: ps } | G::LineString { coordinates: ps } => {
            ps.iter_mut().all(|p| position(r, p))
        }
        G::MultiLineString { coordinates: ls } | G::Polygon { coordinates: ls } => {
            ls.iter_mut().all(|l| l.iter_mut().all(|p| position(r, p)))
        }
        G::MultiPolygon { coordinates: pls } => pls
            .iter_mut()
            .all(|pl| pl.iter_mut().all(|l| l.iter_mut().all(|p| position(r, p)))),
        G::GeometryCollection { geometries: gs } => {
            gs.iter_mut().all(|g| geometry(r, &mut g.value))
        }
    }
}

/// The features in WGS84 lon/lat when the model has a CRS (else unchanged), and the members
/// that say so: `coordinate_system` becomes "WGS84 longitude/latitude (RFC 7946)" and
/// `source_crs` names the site's CRS.
///
/// Validation has converted the site there and back, but a far feature (a contour at the map's
/// edge) may still not convert. Then no feature is dropped: the whole collection stays in the
/// site grid, with the 2008 GeoJSON `crs` member naming the site CRS (an EPSG URN, or the proj
/// string, both read by GDAL) and `wgs84_not_written` saying why.
pub fn reproject(
    run: &CheckRun,
    features: Vec<Feature>,
    mut members: Value,
) -> (Vec<Feature>, Value) {
    let Some(crs) = run.model.crs.as_deref() else {
        return (features, members);
    };
    let converted = Reprojector::new(crs).ok().and_then(|r| {
        let mut out = features.clone();
        out.iter_mut()
            .all(|f| {
                f.geometry
                    .as_mut()
                    .is_none_or(|g| geometry(&r, &mut g.value))
            })
            .then_some(out)
    });
    let Value::Object(map) = &mut members else {
        return (converted.unwrap_or(features), members);
    };
    map.insert("source_crs".into(), json!(crs));
    match converted {
        Some(out) => {
            map.insert(
                "coordinate_system".into(),
                json!("WGS84 longitude/latitude (RFC 7946)"),
            );
            map.insert("units".into(), json!("degrees"));
            (out, members)
        }
        None => {
            map.insert("crs".into(), grid_crs_member(crs));
            map.insert(
                "wgs84_not_written".into(),
                json!("a position does not convert to WGS84 with the site CRS; the coordinates are the site grid's, named in `crs`"),
            );
            (features, members)
        }
    }
}

/// The legacy `crs` member naming the site CRS: `urn:ogc:def:crs:EPSG::27700` for an EPSG
/// code, the proj string otherwise.
fn grid_crs_member(crs: &str) -> Value {
    let c = crs.trim();
    let name = match c
        .strip_prefix("EPSG:")
        .or_else(|| c.strip_prefix("epsg:"))
        .map(str::trim)
    {
        Some(code) => format!("urn:ogc:def:crs:EPSG::{code}"),
        None => c.to_string(),
    };
    json!({ "type": "name", "properties": { "name": name } })
}
