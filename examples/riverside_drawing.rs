//! Write the invented demo drawing layouts/drawings/riverside_site.dxf (millimetres) and the
//! same site as layouts/drawings/riverside_site.geojson (metres, read back from the DXF through
//! drydig's own reader, so the arc corner is flattened the same way).
//!
//! Run: cargo run --example riverside_drawing
//!
//! Invented site on a local grid (x east, y north, near x ≈ 1000 m, y ≈ 2000 m):
//! - EXCAVATION: an L-shaped basement, (1000, 2000) (1040, 2000) (1040, 2015) (1020, 2015)
//!   (1020, 2030) (1000, 2030): 40 × 15 + 20 × 15 = 900 m².
//! - NEIGHBOURS: an east building (1055, 1995)–(1075, 2010), 20 × 15 = 300 m², as a POLYLINE;
//!   a north building (1000, 2045) (1025, 2045) ⌒ (1030, 2050) (1030, 2060) (1000, 2060) with a
//!   quarter-circle corner of radius 5 m about (1025, 2050), as a LWPOLYLINE with a bulge:
//!   30 × 15 − 5² + π·5²/4 = 444.635 m².
//! - RIVER: the bank as two LINEs, (970, 1960) → (978, 2020) → (985, 2080).
//! - WELLS: two CIRCLEs of radius 150 mm at (1010, 2008) and (1030, 2008).

use std::path::Path;

use drydig::input::import::dxf_in::{self, DxfOptions};
use dxf::entities::{Circle, Entity, EntityType, Line, LwPolyline, Polyline, Vertex};
use dxf::enums::{AcadVersion, Units};
use dxf::{LwPolylineVertex, Point};
use geojson::{Feature, FeatureCollection, Geometry, JsonObject};

const MM: f64 = 1000.0;

fn on_layer(specific: EntityType, layer: &str) -> Entity {
    let mut e = Entity::new(specific);
    e.common.layer = layer.into();
    e
}

fn lwpolyline(pts: &[(f64, f64, f64)]) -> EntityType {
    let mut p = LwPolyline {
        vertices: pts
            .iter()
            .map(|&(x, y, bulge)| LwPolylineVertex {
                x: x * MM,
                y: y * MM,
                bulge,
                ..Default::default()
            })
            .collect(),
        ..Default::default()
    };
    p.set_is_closed(true);
    EntityType::LwPolyline(p)
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/drawings");
    std::fs::create_dir_all(&dir)?;
    let dxf_path = dir.join("riverside_site.dxf");

    let mut d = dxf::Drawing::new();
    d.header.version = AcadVersion::R2000;
    d.header.default_drawing_units = Units::Millimeters;
    d.add_entity(on_layer(
        lwpolyline(&[
            (1000.0, 2000.0, 0.0),
            (1040.0, 2000.0, 0.0),
            (1040.0, 2015.0, 0.0),
            (1020.0, 2015.0, 0.0),
            (1020.0, 2030.0, 0.0),
            (1000.0, 2030.0, 0.0),
        ]),
        "EXCAVATION",
    ));
    // East neighbour as an old-style POLYLINE with VERTEX entities.
    let mut east = Polyline::default();
    east.set_is_closed(true);
    for (x, y) in [
        (1055.0, 1995.0),
        (1075.0, 1995.0),
        (1075.0, 2010.0),
        (1055.0, 2010.0),
    ] {
        east.add_vertex(&mut d, Vertex::new(Point::new(x * MM, y * MM, 0.0)));
    }
    d.add_entity(on_layer(EntityType::Polyline(east), "NEIGHBOURS"));
    // North neighbour: the segment from (1025, 2045) to (1030, 2050) is a counter-clockwise
    // quarter circle, bulge tan(90°/4).
    let quarter = (std::f64::consts::PI / 8.0).tan();
    d.add_entity(on_layer(
        lwpolyline(&[
            (1000.0, 2045.0, 0.0),
            (1025.0, 2045.0, quarter),
            (1030.0, 2050.0, 0.0),
            (1030.0, 2060.0, 0.0),
            (1000.0, 2060.0, 0.0),
        ]),
        "NEIGHBOURS",
    ));
    for (a, b) in [
        ((970.0, 1960.0), (978.0, 2020.0)),
        ((978.0, 2020.0), (985.0, 2080.0)),
    ] {
        d.add_entity(on_layer(
            EntityType::Line(Line::new(
                Point::new(a.0 * MM, a.1 * MM, 0.0),
                Point::new(b.0 * MM, b.1 * MM, 0.0),
            )),
            "RIVER",
        ));
    }
    for (x, y) in [(1010.0, 2008.0), (1030.0, 2008.0)] {
        d.add_entity(on_layer(
            EntityType::Circle(Circle::new(Point::new(x * MM, y * MM, 0.0), 150.0)),
            "WELLS",
        ));
    }
    d.save_file(&dxf_path)?;
    println!("wrote {}", dxf_path.display());

    // The GeoJSON twin, read back through drydig's DXF reader (metres, arcs flattened).
    let names = [
        ("EXCAVATION", "excavation", vec!["Basement"]),
        (
            "NEIGHBOURS",
            "neighbours",
            vec!["East building", "North building"],
        ),
        (
            "RIVER",
            "river",
            vec!["River bank south", "River bank north"],
        ),
        ("WELLS", "wells", vec!["W1", "W2"]),
    ];
    let mut features = Vec::new();
    for (layer, tag, labels) in names {
        let got = dxf_in::read(&dxf_path, &DxfOptions::layer(layer))?;
        let mut labels = labels.into_iter();
        let mut push = |g: Geometry, labels: &mut dyn Iterator<Item = &str>| {
            let mut f = Feature::from(g);
            f.set_property("layer", tag);
            f.set_property("name", labels.next().unwrap_or(layer));
            features.push(f);
        };
        for p in &got.polygons {
            let mut ring: Vec<[f64; 2]> = p
                .geometry
                .exterior()
                .0
                .iter()
                .map(|c| [round(c.x), round(c.y)])
                .collect();
            if ring.first() != ring.last() {
                ring.push(ring[0]);
            }
            push(Geometry::new_polygon(vec![ring]), &mut labels);
        }
        for l in &got.lines {
            let line: Vec<[f64; 2]> = l
                .geometry
                .0
                .iter()
                .map(|c| [round(c.x), round(c.y)])
                .collect();
            push(Geometry::new_line_string(line), &mut labels);
        }
        for m in &got.points {
            push(
                Geometry::new_point([round(m.at.x()), round(m.at.y())]),
                &mut labels,
            );
        }
    }
    let mut fc = FeatureCollection::new(features);
    let mut members = JsonObject::new();
    members.insert(
        "crs".into(),
        serde_json::json!({"type": "name", "properties": {"name": "local site grid (m)"}}),
    );
    fc.foreign_members = Some(members);
    let geojson_path = dir.join("riverside_site.geojson");
    std::fs::write(&geojson_path, serde_json::to_string_pretty(&fc)? + "\n")?;
    println!("wrote {}", geojson_path.display());
    Ok(())
}

/// Millimetre precision for the GeoJSON text.
fn round(v: f64) -> f64 {
    (v * 1000.0).round() / 1000.0
}
