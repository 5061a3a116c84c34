//! `design.dxf`: what a site engineer sets out from, as a CAD drawing.
//!
//! In the drawing's own units and grid: when the design file read a DXF drawing, coordinates are
//! divided by that drawing's unit (a millimetre drawing gets millimetres back, `$INSUNITS` set
//! to match) with no shift, so the file overlays the drawing it came from; otherwise metres in
//! the design file's grid. One layer per kind of thing:
//!
//! | layer | what |
//! |---|---|
//! | `DRYDIG-WELLS` | working wells: a POINT at the centre and a CIRCLE of the well radius |
//! | `DRYDIG-WELLS-STANDBY` | standby wells (rate 0), the same |
//! | `DRYDIG-WELLS-RECHARGE` | recharge wells, the same |
//! | `DRYDIG-WELL-NAMES` | each well's name, a TEXT beside it |
//! | `DRYDIG-SETOUT` | the lines the wells were set out along |
//! | `DRYDIG-EXCAVATION` | excavation outlines (closed LWPOLYLINE) |
//! | `DRYDIG-BOUNDARY`, `DRYDIG-WALL` | constant-head boundaries, barriers (cut-off walls) |
//! | `DRYDIG-NEIGHBOURS`, `DRYDIG-KEEP-OUT` | neighbour footprints, keep-out zones |
//! | `DRYDIG-CONTOURS` | contour lines of the map quantity, each LWPOLYLINE at its value as elevation, a TEXT with the value |
//! | `DRYDIG-SECTION` | the section line of `section.svg`, with its end letters A and A′ |
//! | `DRYDIG-NOTES` | the caution and the units |
//!
//! Written as DXF R2000 (LWPOLYLINE) by the `dxf` crate, with fixed header dates and GUIDs so the bytes
//! depend on the design only; the drawing is checked by reading it back with ezdxf in the tests.

use crate::check::run::CheckRun;
use crate::check::section::Section;
use crate::field::grid::LevelGrid;
use crate::input::import::dxf_in::DrawingUnit;
use crate::input::model::MapQuantity;
use crate::physics::images::BoundaryKind;
use dxf::entities::{Circle, Entity, EntityType, Line, LwPolyline, ModelPoint, Text};
use dxf::tables::Layer;
use dxf::{Color, LwPolylineVertex, Point};
use geo::Polygon;

/// Layers, with their ACI colour number (1 red, 2 yellow, 3 green, 4 cyan, 5 blue, 6 magenta,
/// 7 white/black, 8 grey).
const LAYERS: [(&str, u8); 14] = [
    (WELLS, 1),
    (STANDBY, 6),
    (RECHARGE, 5),
    (NAMES, 7),
    (SETOUT, 2),
    (EXCAVATION, 7),
    (BOUNDARY, 4),
    (WALL, 8),
    (NEIGHBOURS, 8),
    (KEEP_OUT, 6),
    (CONTOURS, 3),
    (SECTION, 2),
    (NOTES, 7),
    ("0", 7),
];
/// Working wells.
pub const WELLS: &str = "DRYDIG-WELLS";
/// Standby wells.
pub const STANDBY: &str = "DRYDIG-WELLS-STANDBY";
/// Recharge wells.
pub const RECHARGE: &str = "DRYDIG-WELLS-RECHARGE";
/// Well names.
pub const NAMES: &str = "DRYDIG-WELL-NAMES";
/// Set-out lines.
pub const SETOUT: &str = "DRYDIG-SETOUT";
/// Excavation outlines.
pub const EXCAVATION: &str = "DRYDIG-EXCAVATION";
/// Constant-head boundaries.
pub const BOUNDARY: &str = "DRYDIG-BOUNDARY";
/// Barrier boundaries (walls).
pub const WALL: &str = "DRYDIG-WALL";
/// Neighbour footprints.
pub const NEIGHBOURS: &str = "DRYDIG-NEIGHBOURS";
/// Keep-out zones.
pub const KEEP_OUT: &str = "DRYDIG-KEEP-OUT";
/// Contour lines and their values.
pub const CONTOURS: &str = "DRYDIG-CONTOURS";
/// The section line.
pub const SECTION: &str = "DRYDIG-SECTION";
/// Caution and units.
pub const NOTES: &str = "DRYDIG-NOTES";

/// Text height of names and labels, m (legible at 1:200, where 0.5 m is 2.5 mm on paper).
const TEXT_HEIGHT_M: f64 = 0.5;

/// Positions are written to 0.1 mm (as in `layout.geojson`), in drawing units.
fn round_to(v: f64, step: f64) -> f64 {
    (v / step).round() * step
}

struct Out {
    drawing: dxf::Drawing,
    /// Metres per drawing unit.
    unit: f64,
}

impl Out {
    fn p(&self, xy: [f64; 2]) -> Point {
        let step = 1e-4 / self.unit;
        Point::new(
            round_to(xy[0] / self.unit, step),
            round_to(xy[1] / self.unit, step),
            0.0,
        )
    }

    fn add(&mut self, layer: &str, specific: EntityType) {
        let mut e = Entity::new(specific);
        e.common.layer = layer.to_string();
        self.drawing.add_entity(e);
    }

    fn text(&mut self, layer: &str, at: [f64; 2], words: &str) {
        let t = Text {
            location: self.p(at),
            text_height: TEXT_HEIGHT_M / self.unit,
            value: words.to_string(),
            ..Default::default()
        };
        self.add(layer, EntityType::Text(t));
    }

    fn polyline(&mut self, layer: &str, pts: &[[f64; 2]], closed: bool, elevation: f64) {
        let mut v: Vec<[f64; 2]> = pts.to_vec();
        if closed && v.len() > 1 && v.first() == v.last() {
            v.pop();
        }
        if v.len() < 2 {
            return;
        }
        let mut p = LwPolyline {
            vertices: v
                .iter()
                .map(|&q| {
                    let pt = self.p(q);
                    LwPolylineVertex {
                        x: pt.x,
                        y: pt.y,
                        ..Default::default()
                    }
                })
                .collect(),
            ..Default::default()
        };
        p.set_is_closed(closed);
        let mut e = Entity::new(EntityType::LwPolyline(p));
        e.common.layer = layer.to_string();
        e.common.elevation = elevation;
        self.drawing.add_entity(e);
    }

    fn polygon(&mut self, layer: &str, poly: &Polygon<f64>) {
        for ring in std::iter::once(poly.exterior()).chain(poly.interiors()) {
            let pts: Vec<[f64; 2]> = ring.0.iter().map(|c| [c.x, c.y]).collect();
            self.polyline(layer, &pts, true, 0.0);
        }
    }
}

/// The unit `design.dxf` is written in: the drawing the design file read, else metres.
pub fn unit_of(run: &CheckRun) -> DrawingUnit {
    run.model.drawing_unit.unwrap_or(DrawingUnit::Metre)
}

/// `design.dxf` for a checked layout, its contour lines over `grid` and its `section`.
pub fn design_dxf(run: &CheckRun, grid: &LevelGrid, section: &Section) -> anyhow::Result<Vec<u8>> {
    let model = run.model;
    let unit = unit_of(run);
    let mut d = dxf::Drawing::new();
    d.header.version = dxf::enums::AcadVersion::R2000;
    d.header.default_drawing_units = unit.insunits();
    // Fixed dates (the epoch, 1970-01-01) and nil GUIDs: the same design gives the same bytes,
    // run after run.
    d.header.creation_date = Default::default();
    d.header.creation_date_universal = Default::default();
    d.header.update_date = Default::default();
    d.header.update_date_universal = Default::default();
    d.header.fingerprint_guid = Default::default();
    d.header.version_guid = Default::default();
    for (name, colour) in LAYERS {
        if name != "0" {
            d.add_layer(Layer {
                name: name.to_string(),
                color: Color::from_index(colour),
                ..Default::default()
            });
        }
    }
    let mut out = Out {
        drawing: d,
        unit: unit.metres(),
    };
    for e in &model.excavations {
        out.polygon(EXCAVATION, &e.outline);
    }
    for (w, _) in run.placement.wells.iter().zip(&run.evaluation.wells) {
        let layer = if crate::optimise::standby::is_standby(w) {
            STANDBY
        } else if w.rate < 0.0 {
            RECHARGE
        } else {
            WELLS
        };
        let centre = out.p(w.position);
        out.add(
            layer,
            EntityType::ModelPoint(ModelPoint::new(centre.clone())),
        );
        let r = w.radius / out.unit;
        out.add(layer, EntityType::Circle(Circle::new(centre, r)));
        let offset = w.radius.max(0.25);
        out.text(
            NAMES,
            [w.position[0] + offset, w.position[1] + offset],
            &w.name,
        );
    }
    for path in &run.placement.paths {
        out.polyline(SETOUT, path, false, 0.0);
    }
    for b in &model.boundaries {
        let layer = match b.kind {
            BoundaryKind::ConstantHead => BOUNDARY,
            BoundaryKind::Barrier => WALL,
        };
        let (a, z) = (out.p(b.line[0]), out.p(b.line[1]));
        out.add(layer, EntityType::Line(Line::new(a, z)));
        out.text(layer, b.line[0], &b.name);
    }
    for n in &model.neighbours {
        out.polygon(NEIGHBOURS, &n.footprint);
        if let Some(first) = n.footprint.exterior().0.first() {
            out.text(NEIGHBOURS, [first.x, first.y], &n.name);
        }
    }
    for k in &model.keep_outs {
        out.polygon(KEEP_OUT, &k.polygon);
    }
    contours(&mut out, run, grid);
    let [a, z] = section.line;
    let (pa, pz) = (out.p(a), out.p(z));
    out.add(SECTION, EntityType::Line(Line::new(pa, pz)));
    out.text(SECTION, a, "A");
    out.text(SECTION, z, "A'");
    notes(&mut out, run, unit, section);
    let mut bytes = Vec::new();
    out.drawing
        .save(&mut bytes)
        .map_err(|e| anyhow::anyhow!("internal error: cannot write design.dxf: {e}"))?;
    Ok(bytes)
}

fn contours(out: &mut Out, run: &CheckRun, grid: &LevelGrid) {
    let set = grid.contours(run.model.map_quantity);
    let what = match set.quantity {
        MapQuantity::Drawdown => "drawdown",
        MapQuantity::WaterLevel => "water level",
    };
    for line in &set.lines {
        // The elevation is the contoured value, in drawing units like every coordinate.
        let z = line.value / out.unit;
        for part in &line.parts {
            let closed = part.len() > 2 && part.first() == part.last();
            out.polyline(CONTOURS, part, closed, z);
        }
        if let Some(at) = line.parts.first().and_then(|p| p.first()) {
            out.text(CONTOURS, *at, &format!("{what} {:.2} m", line.value));
        }
    }
}

fn notes(out: &mut Out, run: &CheckRun, unit: DrawingUnit, section: &Section) {
    let model = run.model;
    let mut lines = vec![
        format!("{} - drydig design drawing", model.name),
        format!(
            "coordinates in {} on the grid of the design file ({}); levels in m {}",
            unit.name(),
            if model.grid.is_empty() {
                "local"
            } else {
                &model.grid
            },
            model.datum
        ),
        format!("section A-A': {}", section.basis),
    ];
    lines.extend(
        crate::report::words::wrap(crate::caution::CAUTION, 100, "")
            .lines()
            .map(String::from),
    );
    // Below the lowest thing drawn, left-aligned with it.
    let (mut x0, mut y0) = (f64::INFINITY, f64::INFINITY);
    for e in &model.excavations {
        for c in &e.outline.exterior().0 {
            x0 = x0.min(c.x);
            y0 = y0.min(c.y);
        }
    }
    for w in &run.placement.wells {
        x0 = x0.min(w.position[0]);
        y0 = y0.min(w.position[1]);
    }
    if !(x0.is_finite() && y0.is_finite()) {
        return;
    }
    for (i, l) in lines.iter().enumerate() {
        let y = y0 - 3.0 - 1.5 * TEXT_HEIGHT_M * (i as f64 + 1.0);
        out.text(NOTES, [x0, y], l);
    }
}
