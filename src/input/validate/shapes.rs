//! Geometry in the design file: point lists, outlines (closed, simple, not geographic), the
//! excavations, boundary lines (each wholly to one side of the site) and keep-out zones.

use crate::geometry::cross;
use crate::input::error::{InputError, Reporter};
use crate::input::model::*;
use crate::input::schema::DesignFile;
use geo::{Area, Coord, LineString, Polygon, Validation};
use std::collections::HashSet;

pub fn check_positive(
    rep: &Reporter,
    field: &str,
    q: &crate::input::units::Quantity<impl crate::input::units::Kind>,
    what: &str,
) -> Result<f64, InputError> {
    if q.si > 0.0 {
        Ok(q.si)
    } else {
        Err(rep.error(
            field,
            q.span.clone(),
            format!("must be greater than zero ({what})"),
        ))
    }
}

/// Turn `[[x, y], …]` into points, refusing anything but finite pairs.
pub fn points(
    rep: &Reporter,
    field: &str,
    raw: &toml::Spanned<Vec<Vec<f64>>>,
) -> Result<Vec<[f64; 2]>, InputError> {
    use crate::input::validate::ranges::{MAX_COORD, MAX_VERTICES};
    let n = raw.get_ref().len();
    if n > MAX_VERTICES {
        return Err(rep.error(
            field,
            Some(raw.span()),
            format!("{n} points is more than the {MAX_VERTICES} drydig takes in one outline or line; simplify it (e.g. to 0.1 m) first"),
        ));
    }
    raw.get_ref()
        .iter()
        .enumerate()
        .map(|(i, p)| match p.as_slice() {
            [x, y] if x.abs() <= MAX_COORD && y.abs() <= MAX_COORD => Ok([*x, *y]),
            [x, y] if x.is_finite() && y.is_finite() => Err(rep.error(
                field,
                Some(raw.span()),
                format!(
                    "point {} ({x:e}, {y:e}) lies beyond ±{MAX_COORD:e} m of the grid origin; give projected coordinates in metres",
                    i + 1
                ),
            )),
            _ => Err(rep.error(
                field,
                Some(raw.span()),
                format!(
                    "point {} must be [x, y], two finite numbers in metres",
                    i + 1
                ),
            )),
        })
        .collect()
}

/// Outlines up to this many vertices are validated by `geo` itself.
const SMALL_OUTLINE: usize = 2_000;

/// A valid simple polygon from at least three points in projected metres.
pub fn polygon(
    rep: &Reporter,
    field: &str,
    raw: &toml::Spanned<Vec<Vec<f64>>>,
) -> Result<Polygon<f64>, InputError> {
    let mut pts = points(rep, field, raw)?;
    if pts.len() > 1 && pts.first() == pts.last() {
        pts.pop();
    }
    let span = Some(raw.span());
    if pts.len() < 3 {
        return Err(rep.error(
            field,
            span,
            format!(
                "an outline needs at least 3 distinct points [x, y] in metres; found {}",
                pts.len()
            ),
        ));
    }
    looks_geographic(&pts).map_or(Ok(()), |m| Err(rep.error(field, span.clone(), m)))?;
    if crate::input::validate::simple::all_on_one_line(&pts) {
        return Err(rep.error(
            field,
            span,
            format!("all {} points lie on one straight line, so the outline encloses no area; list the corners around the excavation's edge", pts.len()),
        ));
    }
    let ring: LineString<f64> = pts.iter().map(|p| Coord { x: p[0], y: p[1] }).collect();
    let poly = Polygon::new(ring, vec![]);
    // Past a few thousand vertices `geo`'s check (which tests every pair of edges) is replaced
    // by the R-tree test of `simple`, near-linear in the vertices.
    if pts.len() > SMALL_OUTLINE {
        if let Some((a, b)) = crate::input::validate::simple::first_crossing(&pts) {
            return Err(rep.error(
                field,
                span,
                format!("the outline is not a simple polygon (edges {a} and {b} meet); list the corners in order around the outline without crossing edges"),
            ));
        }
    } else if let Err(problem) = poly.check_validation() {
        let what = match crate::input::validate::simple::first_crossing(&pts) {
            Some((a, b)) => format!("the outline crosses itself (edges {a} and {b} cross)"),
            None => format!("the outline is not a simple polygon ({problem})"),
        };
        return Err(rep.error(
            field,
            span,
            format!("{what}; list the corners in order around the outline without crossing edges"),
        ));
    }
    if poly.unsigned_area() <= 0.0 {
        return Err(rep.error(field, span, "the outline encloses no area"));
    }
    Ok(simplified(poly))
}

/// Largest distance, m, by which an outline of more than `SMALL_OUTLINE` vertices may move
/// when it is simplified.
pub const SIMPLIFY_TOLERANCE: f64 = 1e-3;

/// An outline of more than `SMALL_OUTLINE` vertices (a surveyed curve, a traced drawing) is
/// simplified by Ramer–Douglas–Peucker (Douglas & Peucker 1973, *The Canadian Cartographer*
/// 10(2)) to within [`SIMPLIFY_TOLERANCE`] = 1 mm of the given line, so that the layout and
/// shape steps (convex hull, minimum rotated rectangle) stay fast; a result that is no longer
/// simple keeps the outline as given.
pub fn simplified(poly: Polygon<f64>) -> Polygon<f64> {
    use geo::Simplify;
    if poly.exterior().0.len() <= SMALL_OUTLINE + 1 {
        return poly;
    }
    let s = poly.simplify(SIMPLIFY_TOLERANCE);
    let pts: Vec<[f64; 2]> = s.exterior().0.iter().skip(1).map(|c| [c.x, c.y]).collect();
    if pts.len() >= 3
        && s.unsigned_area() > 0.0
        && crate::input::validate::simple::first_crossing(&pts).is_none()
    {
        s
    } else {
        poly
    }
}

/// Coordinates that look like longitude/latitude degrees rather than metres.
pub fn looks_geographic(pts: &[[f64; 2]]) -> Option<String> {
    let (mut xmin, mut xmax, mut ymin, mut ymax) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for p in pts {
        xmin = xmin.min(p[0]);
        xmax = xmax.max(p[0]);
        ymin = ymin.min(p[1]);
        ymax = ymax.max(p[1]);
    }
    let in_range = xmin >= -180.0 && xmax <= 180.0 && ymin >= -90.0 && ymax <= 90.0;
    let tiny = (xmax - xmin) < 0.05 && (ymax - ymin) < 0.05;
    (in_range && tiny).then(|| {
        format!(
            "the coordinates look like longitude/latitude degrees (x {xmin}…{xmax}, y {ymin}…{ymax}); drydig works in metres on a flat grid: project them first to a local grid or a projected system such as UTM"
        )
    })
}

/// The excavations: names unique, outline valid, formation below ground, target above the base.
pub fn excavations(
    rep: &Reporter,
    raw: &DesignFile,
    ground: f64,
    base: f64,
) -> Result<Vec<Excavation>, InputError> {
    // Excavations.
    if raw.excavation.is_empty() {
        return Err(rep.error("excavation", None, "at least one [[excavation]] with name, outline, formation_level and target_margin is needed"));
    }
    let mut names = HashSet::new();
    let mut excavations = Vec::new();
    for (i, e) in raw.excavation.iter().enumerate() {
        let f = |name: &str| format!("excavation[{}].{name}", i + 1);
        if e.name.trim().is_empty() {
            return Err(rep.error(f("name"), None, "must not be empty"));
        }
        if !names.insert(e.name.trim().to_string()) {
            return Err(rep.error(
                f("name"),
                Some(e.outline.span()),
                format!(
                    "duplicate excavation name \"{}\"; each excavation needs its own name",
                    e.name
                ),
            ));
        }
        let outline = polygon(rep, &f("outline"), &e.outline)?;
        let formation = e.formation_level.si;
        if formation >= ground {
            return Err(rep.error(
                f("formation_level"),
                e.formation_level.span.clone(),
                format!("the formation ({formation} m) must be below ground level ({ground} m)"),
            ));
        }
        let margin = e.target_margin.si;
        if !(0.0..=5.0).contains(&margin) {
            return Err(rep.error(
                f("target_margin"),
                e.target_margin.span.clone(),
                format!("{margin} m is outside 0 … 5 m (usually 0.5 … 1 m below formation)"),
            ));
        }
        let target = formation - margin;
        if target <= base + 0.1 {
            return Err(rep.error(f("target_margin"), e.target_margin.span.clone(), format!("the target level ({target:.2} m = formation − margin) is at or below the aquifer base ({base} m): the aquifer would have to be pumped dry; wells cannot do that — consider a cut-off into the layer below or relief of a deeper aquifer")));
        }
        let shape = match e.shape.as_deref().map(str::trim) {
            None | Some("auto") => ShapeChoice::Auto,
            Some("pit") => ShapeChoice::Pit,
            Some("trench") => ShapeChoice::Trench,
            Some(other) => {
                return Err(rep.error(
                    f("shape"),
                    None,
                    format!("unknown shape \"{other}\"; valid: \"auto\", \"pit\", \"trench\""),
                ))
            }
        };
        let centre_line = match &e.centre_line {
            Some(c) => Some(centre_line(rep, &f("centre_line"), c, &outline)?),
            None => None,
        };
        excavations.push(Excavation {
            name: e.name.trim().to_string(),
            outline,
            formation_level: formation,
            target_margin: margin,
            shape,
            control: crate::input::validate::design_settings::control(
                rep,
                &f("control"),
                e.control.as_deref(),
                raw.uplift.is_some(),
            )?,
            centre_line,
        });
    }

    Ok(excavations)
}

/// A trench centre line: at least two points, no two in a row the same, every point within the
/// outline or at most its width (area / centre-line length, at least 5 m) outside it.
pub fn centre_line(
    rep: &Reporter,
    field: &str,
    raw: &toml::Spanned<Vec<Vec<f64>>>,
    outline: &Polygon<f64>,
) -> Result<Vec<[f64; 2]>, InputError> {
    use geo::{Distance, Euclidean, Point};
    let pts = points(rep, field, raw)?;
    let span = Some(raw.span());
    if pts.len() < 2 {
        return Err(rep.error(
            field,
            span,
            "a centre line needs at least 2 points [x, y] in metres, from one end of the trench to the other",
        ));
    }
    if let Some(i) = pts.windows(2).position(|w| w[0] == w[1]) {
        return Err(rep.error(
            field,
            span,
            format!(
                "points {} and {} are the same; list each bend of the centre line once",
                i + 1,
                i + 2
            ),
        ));
    }
    let length: f64 = pts
        .windows(2)
        .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
        .sum();
    let allowed = (outline.unsigned_area() / length).max(5.0);
    for (i, p) in pts.iter().enumerate() {
        let off = Euclidean.distance(&Point::new(p[0], p[1]), outline);
        if off > allowed {
            return Err(rep.error(
                field,
                span,
                format!(
                    "point {} ({}, {}) is {off:.1} m outside the excavation outline; the centre line runs along the middle of the trench (within {allowed:.1} m of it)",
                    i + 1,
                    p[0],
                    p[1]
                ),
            ));
        }
    }
    Ok(pts)
}

/// Half-length, m, of a boundary line as stored: the line is infinite, its two points only fix it.
pub const BOUNDARY_HALF_LENGTH: f64 = 1_000.0;

/// A boundary given by points farther apart (or farther from the site) than this, m, is stored
/// normalised.
pub const NORMALISE_BEYOND: f64 = 10_000.0;

/// The centre of the first excavation's bounding box: the point boundary lines are fixed near.
fn site_centre(excavations: &[Excavation]) -> [f64; 2] {
    use geo::BoundingRect;
    excavations
        .first()
        .and_then(|e| e.outline.bounding_rect())
        .map_or([0.0, 0.0], |b| {
            [0.5 * (b.min().x + b.max().x), 0.5 * (b.min().y + b.max().y)]
        })
}

/// The straight line through `a` and `b`, however far apart, as two points
/// [`BOUNDARY_HALF_LENGTH`] either side of the foot of the perpendicular from `centre`: the unit
/// direction d = (b − a)/|b − a| and the foot f = a + ((centre − a)·d)·d (plane geometry, common
/// practice (no source)). Every later use (images, map, outputs) then sees a line of the site's
/// own scale whatever points were given.
/// Points up to [`NORMALISE_BEYOND`] apart are kept as given (they are what the outputs show).
pub fn normalised_line(a: [f64; 2], b: [f64; 2], centre: [f64; 2]) -> [[f64; 2]; 2] {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len = dx.hypot(dy);
    let near = |p: [f64; 2]| (p[0] - centre[0]).hypot(p[1] - centre[1]) <= NORMALISE_BEYOND;
    if len <= NORMALISE_BEYOND && near(a) && near(b) {
        return [a, b];
    }
    let d = [dx / len, dy / len];
    let t = (centre[0] - a[0]) * d[0] + (centre[1] - a[1]) * d[1];
    let f = [a[0] + t * d[0], a[1] + t * d[1]];
    let h = BOUNDARY_HALF_LENGTH;
    [
        [f[0] - h * d[0], f[1] - h * d[1]],
        [f[0] + h * d[0], f[1] + h * d[1]],
    ]
}

/// Boundary lines and keep-out zones.
pub fn boundaries_and_keep_outs(
    rep: &Reporter,
    raw: &DesignFile,
    excavations: &[Excavation],
) -> Result<(Vec<Boundary>, Vec<NamedPolygon>), InputError> {
    // Boundaries.
    let mut boundaries = Vec::new();
    for (i, b) in raw.boundary.iter().enumerate() {
        let f = format!("boundary[{}]", i + 1);
        let kind = match b.kind.trim() {
            "constant-head" => crate::physics::images::BoundaryKind::ConstantHead,
            "barrier" => crate::physics::images::BoundaryKind::Barrier,
            other => return Err(rep.error(format!("{f}.kind"), Some(b.line.span()), format!("unknown boundary kind \"{other}\"; valid: \"constant-head\" (river, lake) or \"barrier\" (cut-off wall, rock)"))),
        };
        let pts = points(rep, &format!("{f}.line"), &b.line)?;
        if pts.len() != 2 || (pts[0][0] - pts[1][0]).hypot(pts[0][1] - pts[1][1]) < 1e-6 {
            return Err(rep.error(
                format!("{f}.line"),
                Some(b.line.span()),
                "a boundary line is two distinct points [[x1, y1], [x2, y2]]",
            ));
        }
        for e in excavations {
            let ring = e.outline.exterior();
            let p0 = ring.0[0];
            let side0 = cross(pts[0], pts[1], [p0.x, p0.y]);
            if ring
                .0
                .iter()
                .any(|c| cross(pts[0], pts[1], [c.x, c.y]) * side0 <= 0.0)
            {
                return Err(rep.error(format!("{f}.line"), Some(b.line.span()), format!("the boundary line crosses excavation \"{}\"; an image boundary must lie wholly to one side of the site", e.name)));
            }
        }
        boundaries.push(Boundary {
            name: b.name.clone(),
            kind,
            line: normalised_line(pts[0], pts[1], site_centre(excavations)),
        });
    }

    if boundaries.len() > 1 {
        let lines: Vec<_> = boundaries
            .iter()
            .map(|b| (b.line[0], b.line[1], b.kind))
            .collect();
        let probe = excavations[0].outline.exterior().0[0];
        if let Err(why) = crate::physics::images::image_set([probe.x, probe.y], &lines, 1.0e5) {
            return Err(rep.error("boundary", None, why));
        }
    }

    let mut keep_outs = Vec::new();
    for (i, k) in raw.keep_out.iter().enumerate() {
        keep_outs.push(NamedPolygon {
            name: k.name.clone(),
            polygon: polygon(rep, &format!("keep_out[{}].outline", i + 1), &k.outline)?,
        });
    }

    Ok((boundaries, keep_outs))
}
