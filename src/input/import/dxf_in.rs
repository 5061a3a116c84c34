//! Read outlines, lines and wells from a DXF drawing, by layer.
//!
//! - Outlines: closed LWPOLYLINE and 2D POLYLINE entities (a polyline whose last vertex repeats
//!   its first counts as closed). Bulges (arc segments) are flattened into straight segments no
//!   farther than the chord tolerance from the true arc; a note says so.
//! - Open polylines are refused, naming layer and handle, unless asked for as lines.
//! - Lines: LINE entities (and open polylines when asked for).
//! - Wells: POINT, INSERT (block references) and CIRCLE entities (centre and radius).
//!
//! Units come from the drawing's `$INSUNITS` header and are converted to metres; a unitless
//! drawing is refused unless the caller states the unit. Model-space entities only.

use std::f64::consts::PI;
use std::path::Path;

use dxf::entities::{Entity, EntityType};
use dxf::enums::Units;
use geo::{Coord, LineString, Point, Polygon};

use super::{ring_problem, Drawing, Marker, Shape};
use crate::input::error::InputError;

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

    fn name(self) -> &'static str {
        match self {
            DrawingUnit::Millimetre => "mm",
            DrawingUnit::Centimetre => "cm",
            DrawingUnit::Metre => "m",
            DrawingUnit::Foot => "ft",
            DrawingUnit::Inch => "in",
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

/// A polyline vertex: x, y (drawing units) and the bulge of the segment that starts there.
type BulgeVertex = (f64, f64, f64);

fn err(file: &Path, field: impl Into<String>, message: impl Into<String>) -> InputError {
    InputError::at(file, field, message)
}

/// Read `options.layer` of the DXF drawing at `path`, in metres.
///
/// Errors name the file, the layer and the entity handle: unreadable file, unitless drawing
/// without a stated unit (or a stated unit that contradicts `$INSUNITS`), an open polyline
/// not asked for as a line, a degenerate outline, nothing on the layer (the layers present are
/// listed), or a chord tolerance that is not a positive number.
pub fn read(path: &Path, options: &DxfOptions) -> Result<Drawing, InputError> {
    let drawing = dxf::Drawing::load_file(path)
        .map_err(|e| err(path, "", format!("cannot read the DXF drawing: {e}")))?;
    from_drawing(path, &drawing, options)
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
    let in_file = DrawingUnit::from_insunits(drawing.header.default_drawing_units)
        .map_err(|m| err(path, "$INSUNITS", m))?;
    let unit = match (in_file, options.unit) {
        (Some(f), Some(c)) if f != c => {
            return Err(err(
                path,
                "$INSUNITS",
                format!(
                    "the drawing says {} but {} was stated; state the drawing's own unit or none",
                    f.name(),
                    c.name()
                ),
            ))
        }
        (Some(f), _) => f,
        (None, Some(c)) => c,
        (None, None) => {
            return Err(err(
                path,
                "$INSUNITS",
                "the drawing is unitless; state its unit (mm, cm, m, ft or in)",
            ))
        }
    };
    let scale = unit.metres();
    let tol = options.chord_tolerance / scale;
    let layer = options.layer.as_str();
    let mut out = Drawing::default();
    let mut arcs = 0usize;
    let mut arc_segments = 0usize;
    let mut count = 0usize;
    let mut layers: Vec<String> = Vec::new();
    for e in drawing.entities() {
        if !layers.contains(&e.common.layer) {
            layers.push(e.common.layer.clone());
        }
        if e.common.is_in_paper_space || !e.common.layer.eq_ignore_ascii_case(layer) {
            continue;
        }
        let field = format!(
            "layer {}, handle {}",
            e.common.layer,
            e.common.handle.as_string()
        );
        let source = field.clone();
        let mut next_name = || {
            count += 1;
            format!("{} {count}", e.common.layer)
        };
        let vertices: Option<(Vec<BulgeVertex>, bool)> = match &e.specific {
            EntityType::LwPolyline(p) => Some((
                p.vertices.iter().map(|v| (v.x, v.y, v.bulge)).collect(),
                p.is_closed(),
            )),
            EntityType::Polyline(p) => {
                if p.is_3d_polyline() || p.is_3d_polygon_mesh() || p.is_polyface_mesh() {
                    return Err(err(
                        path,
                        field,
                        "a 3D polyline or mesh is not an outline; draw it as a 2D polyline",
                    ));
                }
                Some((
                    p.vertices()
                        .map(|v| (v.location.x, v.location.y, v.bulge))
                        .collect(),
                    p.is_closed(),
                ))
            }
            _ => None,
        };
        if let Some((mut v, mut closed)) = vertices {
            if v.len() >= 3 && !closed {
                let (a, b) = (v[0], v[v.len() - 1]);
                if (a.0 - b.0).hypot(a.1 - b.1) <= 1e-9 * (1.0 + a.0.abs().max(a.1.abs())) {
                    v.pop();
                    closed = true;
                }
            }
            if !closed && !options.open_as_lines {
                return Err(err(
                    path,
                    field,
                    "the polyline is open; close it in the drawing for an outline, or ask for \
                     open polylines as lines",
                ));
            }
            let (pts, n_arcs, n_segs) = flatten(&v, closed, tol);
            arcs += n_arcs;
            arc_segments += n_segs;
            let pts: Vec<(f64, f64)> = pts.iter().map(|(x, y)| (x * scale, y * scale)).collect();
            if closed {
                if let Some(msg) = ring_problem(&pts) {
                    return Err(err(path, field, msg));
                }
                out.polygons.push(Shape {
                    name: next_name(),
                    source,
                    geometry: Polygon::new(line_string(&pts), vec![]),
                });
            } else {
                if pts.len() < 2 || pts.iter().any(|(x, y)| !x.is_finite() || !y.is_finite()) {
                    return Err(err(path, field, "a line needs at least 2 finite vertices"));
                }
                out.lines.push(Shape {
                    name: next_name(),
                    source,
                    geometry: line_string(&pts),
                });
            }
            continue;
        }
        match &e.specific {
            EntityType::Line(l) => {
                let pts = [
                    (l.p1.x * scale, l.p1.y * scale),
                    (l.p2.x * scale, l.p2.y * scale),
                ];
                if pts.iter().any(|(x, y)| !x.is_finite() || !y.is_finite()) || pts[0] == pts[1] {
                    return Err(err(
                        path,
                        field,
                        "the line has no length or a bad coordinate",
                    ));
                }
                out.lines.push(Shape {
                    name: next_name(),
                    source,
                    geometry: line_string(&pts),
                });
            }
            EntityType::ModelPoint(p) => {
                out.points.push(marker(
                    path,
                    &field,
                    next_name(),
                    source.clone(),
                    p.location.x,
                    p.location.y,
                    None,
                    scale,
                )?);
            }
            EntityType::Insert(i) => {
                let name = if i.name.is_empty() {
                    next_name()
                } else {
                    i.name.clone()
                };
                out.points.push(marker(
                    path,
                    &field,
                    name,
                    source.clone(),
                    i.location.x,
                    i.location.y,
                    None,
                    scale,
                )?);
            }
            EntityType::Circle(c) => {
                if !(c.radius.is_finite() && c.radius > 0.0) {
                    return Err(err(
                        path,
                        field,
                        "the circle's radius is not a positive number",
                    ));
                }
                out.points.push(marker(
                    path,
                    &field,
                    next_name(),
                    source.clone(),
                    c.center.x,
                    c.center.y,
                    Some(c.radius * scale),
                    scale,
                )?);
            }
            _ => {}
        }
    }
    if out.is_empty() {
        let mut listed = layers.clone();
        listed.sort();
        return Err(err(
            path,
            format!("layer {layer}"),
            if listed.is_empty() {
                "the drawing has no entities".to_string()
            } else {
                format!(
                    "nothing to read on this layer (polylines, lines, points, inserts, circles); \
                     layers in the drawing: {}",
                    listed.join(", ")
                )
            },
        ));
    }
    if unit != DrawingUnit::Metre {
        out.notes.push(format!(
            "drawing units {} converted to metres (× {})",
            unit.name(),
            unit.metres()
        ));
    }
    if arcs > 0 {
        out.notes.push(format!(
            "{arcs} arc segment(s) on layer {layer} flattened into {arc_segments} straight \
             segments, each within {} m of the true arc",
            options.chord_tolerance
        ));
    }
    Ok(out)
}

#[allow(clippy::too_many_arguments)]
fn marker(
    path: &Path,
    field: &str,
    name: String,
    source: String,
    x: f64,
    y: f64,
    radius: Option<f64>,
    scale: f64,
) -> Result<Marker, InputError> {
    let (x, y) = (x * scale, y * scale);
    if !x.is_finite() || !y.is_finite() {
        return Err(err(
            path,
            field,
            "the point's position is not a pair of finite numbers",
        ));
    }
    Ok(Marker {
        name,
        source,
        at: Point::new(x, y),
        radius,
    })
}

fn line_string(pts: &[(f64, f64)]) -> LineString<f64> {
    LineString::new(pts.iter().map(|&(x, y)| Coord { x, y }).collect())
}

/// Replace every bulged segment of a polyline (vertices (x, y, bulge), the bulge of a vertex
/// belonging to the segment that starts there) by straight segments within `tol` of the arc.
/// Returns the vertices (without repeating the first for a closed one), the number of arcs and
/// the number of segments they became.
///
/// Geometry: bulge b = tan(θ/4) with θ the arc's included angle (positive counter-clockwise);
/// for a chord of length c the radius is r = c/(2·|sin(θ/2)|) and the centre lies
/// (c/2)/tan(θ/2) to the left of the chord's midpoint. A segment of angle φ strays
/// s = r·(1 − cos(φ/2)) from the arc (its sagitta), so φ ≤ 2·acos(1 − tol/r). Source: the DXF
/// reference's definition of the bulge (Autodesk, *DXF Reference*, LWPOLYLINE group 42) and
/// plane geometry of the circular segment.
pub fn flatten(v: &[(f64, f64, f64)], closed: bool, tol: f64) -> (Vec<(f64, f64)>, usize, usize) {
    let mut out = Vec::with_capacity(v.len());
    let (mut arcs, mut segs) = (0, 0);
    let n = v.len();
    let last = if closed { n } else { n.saturating_sub(1) };
    if n > 0 {
        out.push((v[0].0, v[0].1));
    }
    for i in 0..last {
        let (x1, y1, b) = v[i];
        let (x2, y2, _) = v[(i + 1) % n];
        let end_is_start = closed && i + 1 == n;
        let c = (x2 - x1).hypot(y2 - y1);
        if b != 0.0 && b.is_finite() && c > 0.0 {
            let theta = 4.0 * b.atan();
            let r = c / (2.0 * (theta / 2.0).sin().abs());
            let h = (c / 2.0) / (theta / 2.0).tan();
            let (mx, my) = ((x1 + x2) / 2.0, (y1 + y2) / 2.0);
            let (lx, ly) = (-(y2 - y1) / c, (x2 - x1) / c);
            let (cx, cy) = (mx + lx * h, my + ly * h);
            let phi_max = if tol < r {
                2.0 * (1.0 - tol / r).acos()
            } else {
                PI
            };
            let k = ((theta.abs() / phi_max).ceil() as usize).clamp(1, 4096);
            let a1 = (y1 - cy).atan2(x1 - cx);
            for j in 1..k {
                let a = a1 + theta * j as f64 / k as f64;
                out.push((cx + r * a.cos(), cy + r * a.sin()));
            }
            arcs += 1;
            segs += k;
        }
        if !end_is_start {
            out.push((x2, y2));
        }
    }
    (out, arcs, segs)
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
    use dxf::entities::{Line, LwPolyline};
    use dxf::LwPolylineVertex;
    use dxf::Point as DxfPoint;

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
        assert!(d.notes.iter().any(|n| n.contains("mm converted to metres")));
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
}
