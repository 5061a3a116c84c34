//! Read outlines, lines and wells from a DXF drawing, by layer.
//!
//! - Outlines: closed LWPOLYLINE and 2D POLYLINE entities (a polyline whose last vertex repeats
//!   its first counts as closed). Bulges (arc segments) are flattened into straight segments no
//!   farther than the chord tolerance from the true arc; a note says so.
//! - Open polylines are refused, naming layer and handle, unless asked for as lines.
//! - Lines: LINE and ARC entities (and open polylines when asked for).
//! - Wells: POINT and CIRCLE entities (centre and radius) and block references (INSERT): a
//!   block holding points or circles gives those (one symbol inserted eight times is eight
//!   wells); a block holding neither (a cross, a hatch) gives its insertion point. Wells are
//!   named by an attribute of the reference, else by a TEXT/MTEXT label next to them, else by
//!   layer and number ([`super::dxf_wells`]); two wells of one name are refused.
//! - Mirrored entities (extrusion (0, 0, −1)) and block references (scale, rotation, mirror,
//!   nesting) are converted to world coordinates ([`super::dxf_world`]); entities drawn in a
//!   tilted plane, SPLINE and ELLIPSE are refused, never read wrong.
//! - The file is read through [`crate::input::read`]: a regular file of at most 64 MiB.
//!
//! Units come from the drawing's `$INSUNITS` header and are converted to metres; a unitless
//! drawing is refused unless the caller states the unit. Model-space entities only.

use std::path::Path;

use dxf::entities::Entity;
use dxf::enums::Units;
use geo::{Coord, LineString, Point, Polygon};

use super::dxf_wells::{self as wells, Found};
use super::dxf_world::{self, PlacedKind};
use super::notes::ReadNote;
use super::{ring_problem, Drawing, Marker, Shape};
use crate::input::error::InputError;
use crate::input::read::{read_capped, MAX_DXF_BYTES};
use crate::plural::count;

pub use super::dxf_arcs::flatten;

/// A length unit a drawing may be in.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum DrawingUnit {
    /// Millimetres (0.001 m).
    Millimetre,
    /// Centimetres (0.01 m).
    Centimetre,
    /// Metres.
    Metre,
    /// International feet (0.3048 m exactly).
    Foot,
    /// Inches (0.0254 m exactly).
    Inch,
}

impl DrawingUnit {
    /// Metres per drawing unit. Source: the international yard and pound agreement (1959):
    /// 1 ft = 0.3048 m, 1 in = 0.0254 m exactly.
    pub fn metres(self) -> f64 {
        match self {
            DrawingUnit::Millimetre => 1e-3,
            DrawingUnit::Centimetre => 1e-2,
            DrawingUnit::Metre => 1.0,
            DrawingUnit::Foot => 0.3048,
            DrawingUnit::Inch => 0.0254,
        }
    }

    /// Parse `mm`, `cm`, `m`, `ft`, `in` (and their long names).
    pub fn parse(s: &str) -> Option<DrawingUnit> {
        Some(match s.trim().to_ascii_lowercase().as_str() {
            "mm" | "millimetre" | "millimetres" | "millimeter" | "millimeters" => {
                DrawingUnit::Millimetre
            }
            "cm" | "centimetre" | "centimetres" | "centimeter" | "centimeters" => {
                DrawingUnit::Centimetre
            }
            "m" | "metre" | "metres" | "meter" | "meters" => DrawingUnit::Metre,
            "ft" | "foot" | "feet" => DrawingUnit::Foot,
            "in" | "inch" | "inches" => DrawingUnit::Inch,
            _ => return None,
        })
    }

    /// The short name (`mm`, `m`, `ft`).
    pub fn name(self) -> &'static str {
        match self {
            DrawingUnit::Millimetre => "mm",
            DrawingUnit::Centimetre => "cm",
            DrawingUnit::Metre => "m",
            DrawingUnit::Foot => "ft",
            DrawingUnit::Inch => "in",
        }
    }

    /// The unit's name in words (`millimetres`, `feet`).
    pub fn words(self) -> &'static str {
        match self {
            DrawingUnit::Millimetre => "millimetres",
            DrawingUnit::Centimetre => "centimetres",
            DrawingUnit::Metre => "metres",
            DrawingUnit::Foot => "feet",
            DrawingUnit::Inch => "inches",
        }
    }

    /// The `$INSUNITS` value of this unit.
    pub fn insunits(self) -> Units {
        match self {
            DrawingUnit::Millimetre => Units::Millimeters,
            DrawingUnit::Centimetre => Units::Centimeters,
            DrawingUnit::Metre => Units::Meters,
            DrawingUnit::Foot => Units::Feet,
            DrawingUnit::Inch => Units::Inches,
        }
    }

    /// The unit of a `$INSUNITS` value; `Ok(None)` for unitless, `Err` for units drydig does not
    /// take (miles, microns, …).
    fn from_insunits(u: Units) -> Result<Option<DrawingUnit>, String> {
        Ok(Some(match u {
            Units::Unitless => return Ok(None),
            Units::Millimeters => DrawingUnit::Millimetre,
            Units::Centimeters => DrawingUnit::Centimetre,
            Units::Meters => DrawingUnit::Metre,
            Units::Feet => DrawingUnit::Foot,
            Units::Inches => DrawingUnit::Inch,
            other => {
                return Err(format!(
                    "$INSUNITS is {other:?}; drydig reads drawings in mm, cm, m, ft or in"
                ))
            }
        }))
    }
}

/// What to read from a DXF drawing.
#[derive(Debug, Clone, PartialEq)]
pub struct DxfOptions {
    /// Layer to read (compared without regard to case, as CAD programs do).
    pub layer: String,
    /// Take open polylines as lines instead of refusing them.
    pub open_as_lines: bool,
    /// Largest distance between a flattened arc and the true arc, m (> 0).
    pub chord_tolerance: f64,
    /// The drawing's unit, when `$INSUNITS` is unitless (or to confirm it).
    pub unit: Option<DrawingUnit>,
}

impl DxfOptions {
    /// Read `layer` with a 10 mm chord tolerance, open polylines refused, units from the file.
    pub fn layer(layer: impl Into<String>) -> Self {
        DxfOptions {
            layer: layer.into(),
            open_as_lines: false,
            chord_tolerance: 0.01,
            unit: None,
        }
    }
}

fn err(file: &Path, field: impl Into<String>, message: impl Into<String>) -> InputError {
    InputError::at(file, field, message)
}

/// Read `options.layer` of the DXF drawing at `path`, in metres.
///
/// Errors name the file, the layer and the entity handle: unreadable file (or not a regular
/// file, or larger than [`MAX_DXF_BYTES`]), unitless drawing without a stated unit (or a stated
/// unit that contradicts `$INSUNITS`), an open polyline not asked for as a line, a degenerate
/// outline, a tilted entity, a non-finite bulge, two wells of one name, nothing on the layer
/// (the layers present are listed), or a chord tolerance that is not a positive number.
pub fn read(path: &Path, options: &DxfOptions) -> Result<Drawing, InputError> {
    let bytes = read_capped(path, MAX_DXF_BYTES, "DXF drawing")?;
    let drawing = dxf::Drawing::load(&mut std::io::Cursor::new(bytes))
        .map_err(|e| err(path, "", format!("cannot read the DXF drawing: {e}")))?;
    from_drawing(path, &drawing, options)
}

/// The unit the drawing is read in: `$INSUNITS`, or the stated unit for a unitless drawing.
fn drawing_unit(
    path: &Path,
    drawing: &dxf::Drawing,
    stated: Option<DrawingUnit>,
) -> Result<DrawingUnit, InputError> {
    let in_file = DrawingUnit::from_insunits(drawing.header.default_drawing_units)
        .map_err(|m| err(path, "$INSUNITS", m))?;
    match (in_file, stated) {
        (Some(f), Some(c)) if f != c => Err(err(
            path,
            "$INSUNITS",
            format!(
                "the drawing says {} but {} was stated; state the drawing's own unit or none",
                f.name(),
                c.name()
            ),
        )),
        (Some(f), _) => Ok(f),
        (None, Some(c)) => Ok(c),
        (None, None) => Err(err(
            path,
            "$INSUNITS",
            "the drawing is unitless; state its unit (mm, cm, m, ft or in)",
        )),
    }
}

/// As [`read`], from a drawing already loaded (`path` names it in messages).
pub fn from_drawing(
    path: &Path,
    drawing: &dxf::Drawing,
    options: &DxfOptions,
) -> Result<Drawing, InputError> {
    if !(options.chord_tolerance.is_finite() && options.chord_tolerance > 0.0) {
        return Err(err(
            path,
            "chord_tolerance",
            format!(
                "{} is not usable; give a distance greater than 0 m (e.g. 0.01 m)",
                options.chord_tolerance
            ),
        ));
    }
    let unit = drawing_unit(path, drawing, options.unit)?;
    let scale = unit.metres();
    let layer = options.layer.as_str();
    let field = |source: &str| format!("layer {layer}, {source}");
    let world = dxf_world::place(drawing, layer, options.chord_tolerance / scale)
        .map_err(|(source, m)| err(path, field(&source), m))?;
    let mut out = Drawing {
        unit: Some(unit),
        ..Drawing::default()
    };
    let mut count = 0usize;
    let mut found: Vec<Found> = Vec::new();
    let mut texts: Vec<((f64, f64), f64, String)> = Vec::new();
    for item in &world.items {
        let source = field(&item.source);
        match &item.kind {
            PlacedKind::Text { at, height, text } => {
                // Text inside a block is part of its symbol, not a label of one well.
                if item.instance.is_none() {
                    texts.push((*at, *height, text.clone()));
                }
            }
            PlacedKind::Point { at, radius } => {
                count += 1;
                let (x, y) = (at.0 * scale, at.1 * scale);
                if !x.is_finite() || !y.is_finite() {
                    return Err(err(
                        path,
                        source,
                        "the point's position is not a pair of finite numbers",
                    ));
                }
                found.push(Found {
                    marker: Marker {
                        name: format!("{} {count}", options.layer),
                        source,
                        at: Point::new(x, y),
                        radius: radius.map(|r| r * scale),
                    },
                    drawn_at: *at,
                    instance: item.instance,
                });
            }
            PlacedKind::Path {
                points,
                closed,
                line_entity,
            } => {
                if !closed && !line_entity && !options.open_as_lines {
                    return Err(err(
                        path,
                        source,
                        "the polyline is open; close it in the drawing for an outline, or ask \
                         for open polylines as lines",
                    ));
                }
                count += 1;
                let name = format!("{} {count}", options.layer);
                let pts: Vec<(f64, f64)> =
                    points.iter().map(|(x, y)| (x * scale, y * scale)).collect();
                if *closed {
                    if let Some(msg) = ring_problem(&pts) {
                        return Err(err(path, source, msg));
                    }
                    out.polygons.push(Shape {
                        name,
                        source,
                        geometry: Polygon::new(line_string(&pts), vec![]),
                    });
                } else {
                    if pts.len() < 2
                        || pts.iter().any(|(x, y)| !x.is_finite() || !y.is_finite())
                        || pts.windows(2).all(|w| w[0] == w[1])
                    {
                        return Err(err(
                            path,
                            source,
                            "a line needs at least 2 distinct, finite vertices",
                        ));
                    }
                    out.lines.push(Shape {
                        name,
                        source,
                        geometry: line_string(&pts),
                    });
                }
            }
        }
    }
    let merge = 0.001 / scale;
    let found = merge_concentric(found, merge);
    let named = wells::name_wells(&world, found, &texts, 2.0 / scale);
    wells::refuse_duplicates(path, &named)?;
    let naming = wells::how_named(&named);
    out.points = named.into_iter().map(|(m, _)| m).collect();
    if out.is_empty() {
        let mut listed = world.layers.clone();
        listed.sort();
        return Err(err(
            path,
            format!("layer {layer}"),
            if listed.is_empty() {
                "the drawing has no entities".to_string()
            } else {
                format!(
                    "nothing to read on this layer (polylines, lines, arcs, points, circles, \
                     block references); layers in the drawing: {}",
                    listed.join(", ")
                )
            },
        ));
    }
    notes(&mut out, &world, unit, options, &naming);
    Ok(out)
}

/// A symbol drawn as a circle and a centre point (or two concentric circles) is one well: points
/// of one block reference closer than `within` (drawing units) are merged, the first circle's
/// radius kept.
fn merge_concentric(found: Vec<Found>, within: f64) -> Vec<Found> {
    let mut out: Vec<Found> = Vec::with_capacity(found.len());
    for f in found {
        let twin = out.iter_mut().find(|o| {
            f.instance.is_some()
                && o.instance == f.instance
                && (o.drawn_at.0 - f.drawn_at.0).hypot(o.drawn_at.1 - f.drawn_at.1) <= within
        });
        match twin {
            Some(o) => {
                if o.marker.radius.is_none() {
                    o.marker.radius = f.marker.radius;
                }
            }
            None => out.push(f),
        }
    }
    out
}

fn notes(
    out: &mut Drawing,
    world: &dxf_world::World,
    unit: DrawingUnit,
    options: &DxfOptions,
    naming: &str,
) {
    let layer = &options.layer;
    if unit != DrawingUnit::Metre {
        out.notes.push(ReadNote::UnitsConverted {
            symbol: unit.name(),
            words: unit.words(),
            metres: unit.metres(),
        });
    }
    if world.arcs > 0 {
        out.notes.push(ReadNote::ArcsFlattened {
            arcs: world.arcs,
            segments: world.arc_segments,
            layer: layer.clone(),
            tolerance_m: options.chord_tolerance,
        });
    }
    if world.inserts > 0 {
        out.notes.push(ReadNote::Said(format!(
            "{} on layer {layer} expanded with their position, scale and rotation",
            count(world.inserts, "block reference", "block references")
        )));
    }
    if world.mirrored > 0 {
        out.notes.push(ReadNote::Said(format!(
            "{} converted to world coordinates (DXF arbitrary axis algorithm)",
            count(
                world.mirrored,
                "mirrored entity or block reference",
                "mirrored entities or block references"
            )
        )));
    }
    if world.distorted_circles > 0 {
        out.notes.push(ReadNote::Said(format!(
            "{} in blocks scaled unequally in x and y: {} taken, {} not",
            count(world.distorted_circles, "circle", "circles"),
            if world.distorted_circles == 1 {
                "its centre is"
            } else {
                "their centres are"
            },
            if world.distorted_circles == 1 {
                "its radius is"
            } else {
                "their radii are"
            }
        )));
    }
    if !naming.is_empty() {
        out.notes.push(ReadNote::Said(naming.to_string()));
    }
}

fn line_string(pts: &[(f64, f64)]) -> LineString<f64> {
    LineString::new(pts.iter().map(|&(x, y)| Coord { x, y }).collect())
}

/// Write an entity list as a DXF drawing in `unit` (R2000, so LWPOLYLINE is kept). For demo
/// drawings and tests.
pub fn write_drawing(path: &Path, unit: Units, entities: Vec<Entity>) -> Result<(), InputError> {
    let mut d = dxf::Drawing::new();
    d.header.version = dxf::enums::AcadVersion::R2000;
    d.header.default_drawing_units = unit;
    for e in entities {
        d.add_entity(e);
    }
    d.save_file(path)
        .map_err(|e| err(path, "", format!("cannot write the DXF drawing: {e}")))
}

#[cfg(test)]
mod tests {
    use super::*;
    use dxf::entities::EntityType;
    use dxf::entities::{Line, LwPolyline};
    use dxf::LwPolylineVertex;
    use dxf::Point as DxfPoint;
    use std::f64::consts::PI;

    fn lw(layer: &str, pts: &[(f64, f64, f64)], closed: bool) -> Entity {
        let mut p = LwPolyline {
            vertices: pts
                .iter()
                .map(|&(x, y, bulge)| LwPolylineVertex {
                    x,
                    y,
                    bulge,
                    ..Default::default()
                })
                .collect(),
            ..Default::default()
        };
        p.set_is_closed(closed);
        let mut e = Entity::new(EntityType::LwPolyline(p));
        e.common.layer = layer.into();
        e
    }

    fn temp_dxf(unit: Units, entities: Vec<Entity>) -> (tempfile::TempDir, std::path::PathBuf) {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("t.dxf");
        write_drawing(&path, unit, entities).unwrap();
        (dir, path)
    }

    // Unit conversion: a 40 000 × 15 000 mm rectangle is 40 m × 15 m = 600 m² (1 mm = 0.001 m
    // by definition of the SI prefix).
    #[test]
    fn import_dxf_mm_to_m() {
        let (_d, path) = temp_dxf(
            Units::Millimeters,
            vec![lw(
                "PIT",
                &[
                    (0.0, 0.0, 0.0),
                    (40_000.0, 0.0, 0.0),
                    (40_000.0, 15_000.0, 0.0),
                    (0.0, 15_000.0, 0.0),
                ],
                true,
            )],
        );
        let d = read(&path, &DxfOptions::layer("pit")).unwrap();
        let c = &d.polygons[0].geometry.exterior().0;
        assert_eq!(c[2], Coord { x: 40.0, y: 15.0 });
        assert!(d
            .notes
            .iter()
            .any(|n| n.to_string().contains("mm converted to metres")));
        // Stated unit contradicting $INSUNITS, and a unitless drawing without a stated unit.
        let mut o = DxfOptions::layer("PIT");
        o.unit = Some(DrawingUnit::Metre);
        assert_eq!(read(&path, &o).unwrap_err().field, "$INSUNITS");
        let (_d2, path2) = temp_dxf(
            Units::Unitless,
            vec![lw(
                "PIT",
                &[(0.0, 0.0, 0.0), (4.0, 0.0, 0.0), (4.0, 1.5, 0.0)],
                true,
            )],
        );
        let e = read(&path2, &DxfOptions::layer("PIT")).unwrap_err();
        assert!(e.message.contains("state its unit"), "{e}");
        let mut o = DxfOptions::layer("PIT");
        o.unit = Some(DrawingUnit::parse("ft").unwrap());
        let d = read(&path2, &o).unwrap();
        // 1 ft = 0.3048 m exactly (international foot, 1959).
        assert!((d.polygons[0].geometry.exterior().0[1].x - 4.0 * 0.3048).abs() < 1e-12);
    }

    // Arc flattening: a quarter circle (bulge tan(90°/4)) of radius 5 m. Exact arc length
    // π·r·θ/180 = π·5·90/180 = 7.853 98 m (circle geometry). The flattened length is shorter,
    // by less than the chord tolerance, and every vertex lies on the circle.
    #[test]
    fn import_dxf_arc_flattening_length() {
        let b = (PI / 8.0).tan();
        let tol = 0.01;
        let (pts, arcs, segs) = flatten(&[(5.0, 0.0, b), (0.0, 5.0, 0.0)], false, tol);
        assert_eq!(arcs, 1);
        assert_eq!(pts.len(), segs + 1);
        let exact = PI * 5.0 * 90.0 / 180.0;
        let len: f64 = pts
            .windows(2)
            .map(|w| (w[1].0 - w[0].0).hypot(w[1].1 - w[0].1))
            .sum();
        assert!(len < exact && exact - len < tol, "{len} vs {exact}");
        for w in pts.windows(2) {
            let (mx, my) = ((w[0].0 + w[1].0) / 2.0, (w[0].1 + w[1].1) / 2.0);
            // Sagitta of each segment within the tolerance (centre of this arc is the origin).
            assert!(5.0 - mx.hypot(my) <= tol + 1e-12);
            assert!((w[1].0.hypot(w[1].1) - 5.0).abs() < 1e-9);
        }
        // Clockwise (negative bulge) half circle from (0,0) to (10,0): centre (5,0), through
        // (5,5) — the bulge of a clockwise semicircle is −1 (DXF reference).
        let (pts, _, _) = flatten(&[(0.0, 0.0, -1.0), (10.0, 0.0, 0.0)], false, 0.001);
        let top = pts.iter().fold(f64::MIN, |m, p| m.max(p.1));
        assert!((top - 5.0).abs() < 1e-3, "{top}");
    }

    #[test]
    fn import_dxf_open_polyline_refused_unless_lines() {
        let (_d, path) = temp_dxf(
            Units::Meters,
            vec![
                lw(
                    "SKETCH",
                    &[(0.0, 0.0, 0.0), (10.0, 0.0, 0.0), (10.0, 5.0, 0.0)],
                    false,
                ),
                {
                    let mut e = Entity::new(EntityType::Line(Line::new(
                        DxfPoint::new(0.0, 10.0, 0.0),
                        DxfPoint::new(10.0, 12.0, 0.0),
                    )));
                    e.common.layer = "SKETCH".into();
                    e
                },
            ],
        );
        let e = read(&path, &DxfOptions::layer("SKETCH")).unwrap_err();
        assert!(e.field.starts_with("layer SKETCH, handle "), "{e}");
        assert!(e.message.contains("open"), "{e}");
        let mut o = DxfOptions::layer("SKETCH");
        o.open_as_lines = true;
        let d = read(&path, &o).unwrap();
        assert_eq!(d.lines.len(), 2);
        assert!(d.polygons.is_empty());
        let e = read(&path, &DxfOptions::layer("NOPE")).unwrap_err();
        assert!(e.message.contains("layers in the drawing: SKETCH"), "{e}");
        let mut o = DxfOptions::layer("SKETCH");
        o.chord_tolerance = 0.0;
        assert_eq!(read(&path, &o).unwrap_err().field, "chord_tolerance");
    }

    fn memory(unit: Units, entities: Vec<Entity>) -> dxf::Drawing {
        let mut d = dxf::Drawing::new();
        d.header.default_drawing_units = unit;
        for e in entities {
            d.add_entity(e);
        }
        d
    }

    // #19.4: a NaN or infinite bulge is refused naming the vertex, never read as straight.
    #[test]
    fn import_dxf_non_finite_bulge_refused() {
        for b in [f64::NAN, f64::INFINITY] {
            let d = memory(
                Units::Meters,
                vec![lw(
                    "PIT",
                    &[(0.0, 0.0, 0.0), (10.0, 0.0, b), (10.0, 5.0, 0.0)],
                    true,
                )],
            );
            let e = from_drawing(Path::new("site.dxf"), &d, &DxfOptions::layer("PIT")).unwrap_err();
            assert!(e.message.contains("bulge of vertex 2"), "{e}");
            assert_eq!(e.file, Path::new("site.dxf"));
        }
    }

    // #19.3: 30 000 semicircle bulges at a 1 nm chord tolerance would become 4096 segments each
    // (1.2·10⁸ vertices, GBs): refused from the count, before any arc is expanded.
    #[test]
    fn import_dxf_bulge_bomb_counted_before_expansion() {
        let pts: Vec<(f64, f64, f64)> = (0..30_000)
            .map(|i| (i as f64, (i % 2) as f64, 1.0))
            .collect();
        let d = memory(Units::Meters, vec![lw("PIT", &pts, true)]);
        let mut o = DxfOptions::layer("PIT");
        o.chord_tolerance = 1e-9;
        let e = from_drawing(Path::new("bomb.dxf"), &d, &o).unwrap_err();
        assert!(e.message.contains("once its arcs are flattened"), "{e}");
    }
}
