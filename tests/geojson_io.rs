//! GeoJSON out and the messages of foreign inputs (issues 18.4, 19.9).
//!
//! Ring orientation is checked with the shoelace formula (Braden (1986), "The Surveyor's Area
//! Formula", The College Mathematics Journal 17(4)): RFC 7946 §3.1.6 asks exterior rings
//! counter-clockwise (positive signed area) and holes clockwise. `scripts/check_geojson.py`
//! (run in CI) reads the same files with GDAL's ogrinfo and shapely.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn drydig(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs")
}

fn layout(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn signed_area(ring: &[serde_json::Value]) -> f64 {
    let p: Vec<(f64, f64)> = ring
        .iter()
        .map(|c| (c[0].as_f64().unwrap(), c[1].as_f64().unwrap()))
        .collect();
    let (x0, y0) = p[0];
    (0..p.len())
        .map(|i| {
            let (xa, ya) = p[i];
            let (xb, yb) = p[(i + 1) % p.len()];
            (xa - x0) * (yb - y0) - (xb - x0) * (ya - y0)
        })
        .sum::<f64>()
        / 2.0
}

fn check(design: &str, dir: &Path) -> serde_json::Value {
    let out = drydig(&[
        "check",
        layout(design).to_str().unwrap(),
        "-o",
        dir.to_str().unwrap(),
    ]);
    // 0: targets met, 3: not met (the outputs are written either way).
    assert!(
        matches!(out.status.code(), Some(0 | 3)),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&std::fs::read(dir.join("layout.geojson")).unwrap()).unwrap()
}

#[test]
fn local_grid_geojson_names_its_grid_rings_ccw_and_carries_results() {
    let d = tempfile::tempdir().unwrap();
    let g = check("riverside_basement.toml", &d.path().join("out"));
    let crs = g["crs"]["properties"]["name"].as_str().unwrap();
    assert!(
        crs.starts_with("LOCAL_CS[") && crs.contains("UNIT[\"metre\",1]"),
        "{crs}"
    );
    let features = g["features"].as_array().unwrap();
    let mut polygons = 0;
    for f in features {
        if f["geometry"]["type"] == "Polygon" {
            let rings = f["geometry"]["coordinates"].as_array().unwrap();
            assert!(
                signed_area(rings[0].as_array().unwrap()) > 0.0,
                "{}",
                f["properties"]
            );
            for h in &rings[1..] {
                assert!(signed_area(h.as_array().unwrap()) < 0.0);
            }
            polygons += 1;
        }
    }
    assert!(polygons >= 2);
    let points: Vec<_> = features
        .iter()
        .filter(|f| f["properties"]["kind"] == "check-point")
        .collect();
    assert!(!points.is_empty());
    assert!(points
        .iter()
        .any(|p| p["properties"]["margin_m"].is_number()));
    assert!(points
        .iter()
        .all(|p| p["properties"]["level_m"].is_number() || p["properties"]["level_m"].is_null()));
    let neighbours: Vec<_> = features
        .iter()
        .filter(|f| f["properties"]["kind"] == "neighbour")
        .collect();
    assert!(!neighbours.is_empty());
    for n in neighbours {
        let p = &n["properties"];
        assert!(
            p["status"].is_string() && p["drawdown_m"].is_number(),
            "{p}"
        );
    }
}

#[test]
fn site_crs_geojson_is_wgs84_lon_lat() {
    let d = tempfile::tempdir().unwrap();
    let g = check("riverside_basement_drawing.toml", &d.path().join("out"));
    assert!(g.get("crs").is_none());
    assert_eq!(g["units"], "degrees");
    // The demo's grid has its false origin (1000, 2000) at 1.6° W, 52.2° N (its proj string);
    // the site lies within a kilometre of it.
    for f in g["features"].as_array().unwrap() {
        if f["geometry"]["type"] == "Point" {
            let c = &f["geometry"]["coordinates"];
            let (lon, lat) = (c[0].as_f64().unwrap(), c[1].as_f64().unwrap());
            assert!(
                (lon + 1.6).abs() < 0.02 && (lat - 52.2).abs() < 0.02,
                "{lon} {lat}"
            );
        }
    }
}

// A file given to --wells by mistake (here shaped like /etc/passwd) is refused without echoing
// its content.
#[test]
fn wells_csv_of_a_foreign_file_is_not_echoed() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("passwd");
    std::fs::write(
        &f,
        "root:x:0:0:root:/root:/bin/bash\ndaemon:x:1:1:daemon:/usr/sbin:/usr/sbin/nologin\n",
    )
    .unwrap();
    let out = drydig(&[
        "check",
        layout("riverside_basement.toml").to_str().unwrap(),
        "--wells",
        f.to_str().unwrap(),
        "-o",
        d.path().join("out").to_str().unwrap(),
    ]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(
        !err.contains("root:x") && !err.contains("/bin/bash"),
        "{err}"
    );
    assert!(
        err.contains("name, x_m (or x), y_m (or y), rate_l_per_s"),
        "{err}"
    );
}

// The wiring from [site] crs to the GeoJSON reader: a standard lon/lat outline (RFC 7946, no crs
// member) named by outline_from is projected onto the site grid (before: "encloses no area").
// The corners are the grid rectangle (1000, 2000)–(1030, 2020) taken to lon/lat; the pyproj
// comparison of the conversion itself is in input::import::crs's tests.
#[test]
fn lon_lat_geojson_outline_is_projected_with_the_site_crs() {
    use drydig::input::import::crs::Reprojector;
    let crs = "+proj=tmerc +lat_0=52.2 +lon_0=-1.6 +k=1 +x_0=1000 +y_0=2000 +ellps=WGS84 +units=m +no_defs";
    let r = Reprojector::new(crs).unwrap();
    let ring: Vec<[f64; 2]> = [
        (1000.0, 2000.0),
        (1030.0, 2000.0),
        (1030.0, 2020.0),
        (1000.0, 2020.0),
        (1000.0, 2000.0),
    ]
    .iter()
    .map(|&(x, y)| {
        let (lon, lat) = r.to_wgs84(x, y).unwrap();
        [lon, lat]
    })
    .collect();
    let d = tempfile::tempdir().unwrap();
    let gj = serde_json::json!({"type": "FeatureCollection", "features": [{"type": "Feature",
        "properties": {"layer": "excavation", "name": "Pit"},
        "geometry": {"type": "Polygon", "coordinates": [ring]}}]});
    std::fs::write(d.path().join("site.geojson"), gj.to_string()).unwrap();
    let design = format!(
        r#"[site]
name = "lon/lat outline"
ground_level = "10 m"
crs = "{crs}"
[aquifer]
kind = "unconfined"
conductivity = "1e-4 m/s"
base_level = "-20 m"
groundwater_level = "8 m"
[[excavation]]
name = "Pit"
outline_from = {{ file = "site.geojson", layer = "excavation" }}
formation_level = "6 m"
target_margin = "0.5 m"
[influence]
method = "fixed"
distance = "200 m"
"#
    );
    let path = d.path().join("design.toml");
    std::fs::write(&path, design).unwrap();
    let m = drydig::input::validate::file::load(&path).unwrap();
    use geo::Area;
    let area = m.excavations[0].outline.unsigned_area();
    assert!((area - 600.0).abs() < 0.01, "{area}");
    let c = m.excavations[0].outline.exterior().0[0];
    assert!(
        (c.x - 1000.0).abs() < 1e-4 && (c.y - 2000.0).abs() < 1e-4,
        "{c:?}"
    );
    assert!(m.import_notes.iter().any(|n| n
        .words(drydig::input::units::UnitSystem::Si)
        .contains("projected onto the site grid")));
}
