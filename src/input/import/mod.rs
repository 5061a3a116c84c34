//! Reading site drawings and site coordinates: GeoJSON ([`geojson_in`]) and DXF ([`dxf_in`])
//! outlines, lines and points in a projected or local grid (x east, y north, metres), and
//! reprojection of site coordinates to WGS84 ([`crs`]), and the design file's references to
//! drawings replaced by the geometry they name ([`resolve`]).
//!
//! Both readers return a [`Drawing`]: what was picked, in metres, each item named and traced to
//! where it came from, plus notes on anything done to the geometry (arcs flattened, units
//! converted). Bad input is a [`crate::input::error::InputError`] naming the file, the layer or feature
//! and what would be valid.

pub mod crs;
pub mod dxf_arcs;
pub mod dxf_in;
pub mod dxf_wells;
pub mod dxf_world;
pub mod geojson_in;
pub mod notes;
pub mod resolve;

use geo::{LineString, Point, Polygon};

/// One picked item: its name, where it came from in the file, and its geometry (metres).
#[derive(Debug, Clone, PartialEq)]
pub struct Shape<G> {
    /// The feature's `name` property (GeoJSON), or layer and number (DXF, `EXCAVATION 1`).
    pub name: String,
    /// Where in the file: `features[2]`, `layer EXCAVATION, handle 2F`.
    pub source: String,
    /// The geometry, metres.
    pub geometry: G,
}

/// A point item (well, wellpoint): position and, for a DXF CIRCLE, its radius.
#[derive(Debug, Clone, PartialEq)]
pub struct Marker {
    /// Name, as for [`Shape::name`] (an INSERT's block name is used when it has one).
    pub name: String,
    /// Where in the file.
    pub source: String,
    /// Position, metres.
    pub at: Point<f64>,
    /// Radius of a CIRCLE entity, metres (`None` for points and inserts).
    pub radius: Option<f64>,
}

/// What a reader picked from a drawing, in metres.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Drawing {
    /// Closed outlines: excavations, building footprints.
    pub polygons: Vec<Shape<Polygon<f64>>>,
    /// Lines: river banks, boundaries (open polylines only when asked for).
    pub lines: Vec<Shape<LineString<f64>>>,
    /// Points: wells.
    pub points: Vec<Marker>,
    /// What the reader did to the geometry, in words (arcs flattened, units converted).
    pub notes: Vec<notes::ReadNote>,
    /// The unit of a DXF drawing (`None` for GeoJSON, which is in metres).
    pub unit: Option<dxf_in::DrawingUnit>,
}

impl Drawing {
    /// True when nothing was picked.
    pub fn is_empty(&self) -> bool {
        self.polygons.is_empty() && self.lines.is_empty() && self.points.is_empty()
    }
}

/// The shoelace area of a closed ring of (x, y) vertices, m² (absolute value; the ring may or
/// may not repeat its first vertex): A = ½·|Σ (x_i·y_{i+1} − x_{i+1}·y_i)|. Source: the
/// surveyor's (shoelace) formula, e.g. Braden (1986), "The Surveyor's Area Formula", *The
/// College Mathematics Journal* 17(4).
pub fn ring_area(ring: &[(f64, f64)]) -> f64 {
    if ring.len() < 3 {
        return 0.0;
    }
    // Shift to the first vertex: site coordinates are large (10⁵–10⁶ m) and the products would
    // otherwise lose digits.
    let (x0, y0) = ring[0];
    let mut s = 0.0;
    for i in 0..ring.len() {
        let (xa, ya) = ring[i];
        let (xb, yb) = ring[(i + 1) % ring.len()];
        s += (xa - x0) * (yb - y0) - (xb - x0) * (ya - y0);
    }
    0.5 * s.abs()
}

/// Checks a ring of vertices (metres) for use as an outline: finite numbers, at least three
/// distinct vertices, area above 1e-6 m². Returns the message for an error, or `None`.
pub(crate) fn ring_problem(ring: &[(f64, f64)]) -> Option<String> {
    if ring.iter().any(|(x, y)| !x.is_finite() || !y.is_finite()) {
        return Some("a vertex is not a finite number".into());
    }
    let mut distinct: Vec<(f64, f64)> = ring.to_vec();
    distinct.dedup();
    if distinct.len() > 1 && distinct.first() == distinct.last() {
        distinct.pop();
    }
    if distinct.len() < 3 {
        return Some(format!(
            "an outline needs at least 3 distinct vertices, this one has {}",
            distinct.len()
        ));
    }
    let pts: Vec<[f64; 2]> = distinct.iter().map(|&(x, y)| [x, y]).collect();
    if crate::input::validate::simple::all_on_one_line(&pts) {
        return Some("the outline encloses no area (all vertices on one line)".into());
    }
    if let Some((a, b)) = crate::input::validate::simple::first_crossing(&pts) {
        return Some(format!("the outline crosses itself (edges {a} and {b} cross, a bow-tie or figure of eight); draw it with its corners in order around the edge"));
    }
    if ring_area(&distinct) <= 1e-6 {
        return Some("the outline encloses no area".into());
    }
    None
}
