//! The invented demo drawings layouts/drawings/riverside_site.{dxf,geojson} (written by
//! `cargo run --example riverside_drawing`) read back through drydig::import, against areas
//! worked by hand with the shoelace formula and circle geometry.

use std::f64::consts::PI;
use std::path::PathBuf;

use drydig::input::import::dxf_in::{self, DxfOptions};
use drydig::input::import::geojson_in::{self, PropertyFilter};
use drydig::input::import::ring_area;

fn drawing(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("layouts/drawings")
        .join(name)
}

fn area(p: &geo::Polygon<f64>) -> f64 {
    let ring: Vec<(f64, f64)> = p.exterior().0.iter().map(|c| (c.x, c.y)).collect();
    ring_area(&ring)
}

// Hand computation (shoelace / splitting into rectangles): the L-shaped basement
// (1000, 2000) (1040, 2000) (1040, 2015) (1020, 2015) (1020, 2030) (1000, 2030) is a
// 40 × 15 rectangle plus a 20 × 15 one: 600 + 300 = 900 m². The drawing is in millimetres.
#[test]
fn import_demo_dxf_excavation_area_by_hand() {
    let d = dxf_in::read(
        &drawing("riverside_site.dxf"),
        &DxfOptions::layer("EXCAVATION"),
    )
    .unwrap();
    assert_eq!(d.polygons.len(), 1);
    let a = area(&d.polygons[0].geometry);
    assert!((a - 900.0).abs() < 1e-6, "{a}");
    assert!(
        d.notes
            .iter()
            .any(|n| n.to_string().contains("mm converted to metres")),
        "{:?}",
        d.notes
    );
    assert!(d.polygons[0]
        .source
        .starts_with("layer EXCAVATION, handle "));
}

// East building 20 × 15 = 300 m² (a POLYLINE). North building with a quarter-circle corner of
// radius 5 m: 30 × 15 − 5² + π·5²/4 = 444.634 95 m² (circle geometry). Flattening cuts the
// arc's circular segments off: a segment of chord c and sagitta s ≤ tol has area
// ≈ (2/3)·c·s + s³/(2c) (circular-segment approximation), so in all about
// (2/3)·(arc length)·tol = (2/3)·(π·5/2)·0.01 = 0.052 m²; 10 % allowed for the s³ term.
#[test]
fn import_demo_dxf_neighbours_with_arc_corner() {
    let d = dxf_in::read(
        &drawing("riverside_site.dxf"),
        &DxfOptions::layer("neighbours"),
    )
    .unwrap();
    assert_eq!(d.polygons.len(), 2);
    let east = area(&d.polygons[0].geometry);
    assert!((east - 300.0).abs() < 1e-6, "{east}");
    let north = area(&d.polygons[1].geometry);
    let exact = 30.0 * 15.0 - 25.0 + PI * 25.0 / 4.0;
    let bound = 1.1 * 2.0 / 3.0 * (PI * 5.0 / 2.0) * 0.01;
    assert!(north < exact && exact - north < bound, "{north} vs {exact}");
    assert!(
        d.notes.iter().any(|n| n.to_string().contains("flattened")),
        "{:?}",
        d.notes
    );
}

#[test]
fn import_demo_dxf_river_and_wells() {
    let path = drawing("riverside_site.dxf");
    let d = dxf_in::read(&path, &DxfOptions::layer("RIVER")).unwrap();
    assert_eq!(d.lines.len(), 2);
    assert_eq!(
        d.lines[1].geometry.0[1],
        geo::Coord {
            x: 985.0,
            y: 2080.0
        }
    );
    let d = dxf_in::read(&path, &DxfOptions::layer("WELLS")).unwrap();
    assert_eq!(d.points.len(), 2);
    assert_eq!(d.points[0].at, geo::Point::new(1010.0, 2008.0));
    // 150 mm = 0.15 m.
    assert!((d.points[0].radius.unwrap() - 0.15).abs() < 1e-12);
}

// The GeoJSON twin holds the same site in metres: same hand areas.
#[test]
fn import_demo_geojson_matches_hand_areas() {
    let path = drawing("riverside_site.geojson");
    let d = geojson_in::read(&path, &PropertyFilter::new("layer", "excavation")).unwrap();
    assert_eq!(d.polygons[0].name, "Basement");
    assert!((area(&d.polygons[0].geometry) - 900.0).abs() < 1e-6);
    let d = geojson_in::read(&path, &PropertyFilter::new("layer", "neighbours")).unwrap();
    assert!((area(&d.polygons[0].geometry) - 300.0).abs() < 1e-6);
    let exact = 30.0 * 15.0 - 25.0 + PI * 25.0 / 4.0;
    let north = area(&d.polygons[1].geometry);
    assert!((north - exact).abs() < 0.06, "{north}");
    let d = geojson_in::read(&path, &PropertyFilter::new("layer", "wells")).unwrap();
    assert_eq!(d.points.len(), 2);
}
