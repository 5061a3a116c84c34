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
/// `source_crs` names the site's CRS. A feature whose position would not convert is left out
/// and counted in `features_not_converted`.
pub fn reproject(
    run: &CheckRun,
    features: Vec<Feature>,
    mut members: Value,
) -> (Vec<Feature>, Value) {
    let Some(crs) = run.model.crs.as_deref() else {
        return (features, members);
    };
    let Ok(r) = Reprojector::new(crs) else {
        return (features, members);
    };
    let before = features.len();
    let out: Vec<Feature> = features
        .into_iter()
        .filter_map(|mut f| {
            let ok = f
                .geometry
                .as_mut()
                .is_none_or(|g| geometry(&r, &mut g.value));
            ok.then_some(f)
        })
        .collect();
    if let Value::Object(map) = &mut members {
        map.insert(
            "coordinate_system".into(),
            json!("WGS84 longitude/latitude (RFC 7946)"),
        );
        map.insert("units".into(), json!("degrees"));
        map.insert("source_crs".into(), json!(crs));
        if out.len() < before {
            map.insert("features_not_converted".into(), json!(before - out.len()));
        }
    }
    (out, members)
}
