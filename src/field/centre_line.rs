//! The centre line of a trench: a polyline along the middle of a long thin outline, given by the
//! user or derived from the outline, and the exact offset of a polyline to either side (the line a
//! row of wellpoints stands on).
//!
//! **Derived centre line.** For a long thin outline (a pipeline trench with bends) the line is
//! built from points of its medial axis (Blum 1967, "A transformation for extracting new
//! descriptors of shape": the centres of the largest circles inside the outline). At every
//! outline vertex a ray is cast along the inward bisector of its two edges, and at sample points
//! along long edges along the inward normal (kept only where the ray meets an edge parallel to
//! its own, i.e. straight across the trench); the midpoint of the ray inside the outline is a
//! point midway between the two sides. The points are chained from one end by nearest neighbour,
//! thinned by Ramer–Douglas–Peucker (Douglas & Peucker 1973) to a twentieth of the width, and both
//! ends are run out along their last segment to the outline. For a trench outlined as a strip of
//! constant width with mitred bends and square ends (as drawn from a centre line), every such
//! point lies on the strip's own centre line, so its length and bend points are found exactly.
//!
//! **Offset.** A polyline is offset by `d` (positive to the left of the direction of travel) to
//! the line of points at distance d from it: each segment moves d along its normal; on the
//! inside of a bend the two moved segments meet at their intersection (d·tan(θ/2) short of the
//! bend along each leg, for a turn θ), on the outside they are joined by a circular arc of
//! radius d about the bend point (chords of at most [`ARC_STEP_DEG`]), so the line outside a
//! bend has no gap and the line inside no loop, and every point of it is d from the centre line.

use crate::input::model::Excavation;
use geo::{Area, Euclidean, Length, MinimumRotatedRect, Polygon, Simplify};

/// Outlines with more vertices than this are read by their enclosing rectangle only (the ray
/// casting below tests every edge for every ray).
const MAX_DERIVE_VERTICES: usize = 4_000;
/// Most sample points added along long edges.
const MAX_EDGE_SAMPLES: usize = 2_000;
/// Largest angle (degrees) one chord of an offset's arc turns through.
pub const ARC_STEP_DEG: f64 = 2.0;
/// A sample's ray counts as "straight across" when the edge it meets is parallel to its own
/// edge within this angle (degrees).
const ACROSS_TOLERANCE_DEG: f64 = 5.0;

/// Length of an open polyline, m.
pub fn length(pts: &[[f64; 2]]) -> f64 {
    pts.windows(2)
        .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
        .sum()
}

/// The long axis of the outline's smallest enclosing rotated rectangle, end to end (the centre
/// line of a straight trench).
pub fn rectangle_axis(outline: &Polygon<f64>) -> Vec<[f64; 2]> {
    let Some(rect) = outline.minimum_rotated_rect() else {
        return Vec::new();
    };
    let c = &rect.exterior().0;
    let mid = |a: geo::Coord<f64>, b: geo::Coord<f64>| [(a.x + b.x) / 2.0, (a.y + b.y) / 2.0];
    let d01 = (c[1].x - c[0].x).hypot(c[1].y - c[0].y);
    let d12 = (c[2].x - c[1].x).hypot(c[2].y - c[1].y);
    if d01 >= d12 {
        vec![mid(c[0], c[3]), mid(c[1], c[2])]
    } else {
        vec![mid(c[0], c[1]), mid(c[3], c[2])]
    }
}

/// Length and width of the rectangle with the outline's area A and perimeter P (L + W = P/2,
/// L·W = A), m: the same as the outline's own for a rectangle and for a strip of constant width
/// with mitred bends and square ends. `None` when no real rectangle has them.
pub fn equivalent_rectangle(outline: &Polygon<f64>) -> Option<(f64, f64)> {
    let a = outline.unsigned_area();
    let half_p = Euclidean.length(outline.exterior()) / 2.0;
    let disc = half_p * half_p - 4.0 * a;
    (disc >= 0.0 && a > 0.0).then(|| {
        let l = (half_p + disc.sqrt()) / 2.0;
        (l, a / l)
    })
}

/// The excavation's centre line: the one given in the design file, else for a bent strip the
/// derived one ([`derived`]), else the long axis of the enclosing rectangle.
pub fn of_excavation(e: &Excavation) -> Vec<[f64; 2]> {
    if let Some(c) = &e.centre_line {
        return c.clone();
    }
    if is_bent_strip(&e.outline) {
        if let Some(line) = derived(&e.outline) {
            return line;
        }
    }
    rectangle_axis(&e.outline)
}

/// Whether an outline reads better as a bent strip than by its enclosing rectangle: its
/// equivalent rectangle (same area and perimeter) is long and thin (length ≥ 4 × width) and
/// clearly longer (by 1 %) than the enclosing rectangle, which is what a bend does.
fn is_bent_strip(outline: &Polygon<f64>) -> bool {
    let Some((l, w)) = equivalent_rectangle(outline) else {
        return false;
    };
    let Some(rect) = outline.minimum_rotated_rect() else {
        return false;
    };
    let c = &rect.exterior().0;
    let a = (c[1].x - c[0].x).hypot(c[1].y - c[0].y);
    let b = (c[2].x - c[1].x).hypot(c[2].y - c[1].y);
    w > 0.0 && l / w >= 4.0 && a.max(b) < 0.99 * l
}

/// First crossing of the ray `p + t·d` (t > `min_t`) with the ring's edges other than `skip`,
/// as (t, index of the edge).
fn ray_hit(
    ring: &[[f64; 2]],
    p: [f64; 2],
    d: [f64; 2],
    skip: &[usize],
    min_t: f64,
) -> Option<(f64, usize)> {
    let n = ring.len();
    let mut best: Option<(f64, usize)> = None;
    for i in (0..n).filter(|i| !skip.contains(i)) {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        let e = [b[0] - a[0], b[1] - a[1]];
        let denom = d[0] * e[1] - d[1] * e[0];
        if denom.abs() < 1e-15 {
            continue;
        }
        let w = [a[0] - p[0], a[1] - p[1]];
        let t = (w[0] * e[1] - w[1] * e[0]) / denom;
        let u = (w[0] * d[1] - w[1] * d[0]) / denom;
        if t > min_t && (-1e-12..=1.0 + 1e-12).contains(&u) && best.is_none_or(|(bt, _)| t < bt) {
            best = Some((t, i));
        }
    }
    best
}

fn unit(v: [f64; 2]) -> Option<[f64; 2]> {
    let l = v[0].hypot(v[1]);
    (l > 1e-15).then(|| [v[0] / l, v[1] / l])
}

/// Points midway between the sides of the outline (ring counter-clockwise, not closed).
fn medial_points(ring: &[[f64; 2]], width: f64) -> Vec<[f64; 2]> {
    let n = ring.len();
    let left = |a: [f64; 2], b: [f64; 2]| unit([-(b[1] - a[1]), b[0] - a[0]]);
    let mut out = Vec::new();
    let min_t = 1e-9 * width.max(1.0);
    for i in 0..n {
        let (a, b, c) = (ring[(i + n - 1) % n], ring[i], ring[(i + 1) % n]);
        let (Some(n1), Some(n2)) = (left(a, b), left(b, c)) else {
            continue;
        };
        let Some(d) = unit([n1[0] + n2[0], n1[1] + n2[1]]).or(Some(n1)) else {
            continue;
        };
        if let Some((t, _)) = ray_hit(ring, b, d, &[(i + n - 1) % n, i], min_t) {
            out.push([b[0] + d[0] * t / 2.0, b[1] + d[1] * t / 2.0]);
        }
    }
    let perimeter: f64 = (0..n)
        .map(|i| (ring[(i + 1) % n][0] - ring[i][0]).hypot(ring[(i + 1) % n][1] - ring[i][1]))
        .sum();
    let step = (2.0 * width).max(perimeter / MAX_EDGE_SAMPLES as f64);
    let across = ACROSS_TOLERANCE_DEG.to_radians().sin();
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        let len = (b[0] - a[0]).hypot(b[1] - a[1]);
        let Some(nrm) = left(a, b) else { continue };
        let k = (len / step).floor() as usize;
        for j in 1..k {
            let s = j as f64 / k as f64;
            let p = [a[0] + s * (b[0] - a[0]), a[1] + s * (b[1] - a[1])];
            if let Some((t, hit)) = ray_hit(ring, p, nrm, &[i], min_t) {
                let (h0, h1) = (ring[hit], ring[(hit + 1) % n]);
                let parallel = unit([h1[0] - h0[0], h1[1] - h0[1]])
                    .is_some_and(|e| (e[0] * nrm[0] + e[1] * nrm[1]).abs() < across);
                if parallel {
                    out.push([p[0] + nrm[0] * t / 2.0, p[1] + nrm[1] * t / 2.0]);
                }
            }
        }
    }
    out
}

/// The points chained from one end (one of the two farthest apart) by nearest neighbour.
fn chain(mut pts: Vec<[f64; 2]>, tolerance: f64) -> Vec<[f64; 2]> {
    let dist = |a: [f64; 2], b: [f64; 2]| (a[0] - b[0]).hypot(a[1] - b[1]);
    let mut start = 0;
    let mut far = -1.0;
    for (i, a) in pts.iter().enumerate() {
        for b in &pts {
            if dist(*a, *b) > far {
                far = dist(*a, *b);
                start = i;
            }
        }
    }
    let mut out = vec![pts.swap_remove(start)];
    while !pts.is_empty() {
        let last = out[out.len() - 1];
        let (k, _) = pts
            .iter()
            .enumerate()
            .map(|(k, p)| (k, dist(*p, last)))
            .fold((0, f64::INFINITY), |m, x| if x.1 < m.1 { x } else { m });
        let p = pts.swap_remove(k);
        if dist(p, last) > tolerance {
            out.push(p);
        }
    }
    out
}

/// The centre line of a long thin outline by its medial points (see the module docs), or `None`
/// when none can be found (too many vertices, fewer than two points, a straight result).
pub fn derived(outline: &Polygon<f64>) -> Option<Vec<[f64; 2]>> {
    let mut ring: Vec<[f64; 2]> = outline.exterior().0.iter().map(|c| [c.x, c.y]).collect();
    if ring.len() > 1 && ring.first() == ring.last() {
        ring.pop();
    }
    if ring.len() < 3 || ring.len() > MAX_DERIVE_VERTICES {
        return None;
    }
    let signed: f64 = (0..ring.len())
        .map(|i| {
            let (a, b) = (ring[i], ring[(i + 1) % ring.len()]);
            a[0] * b[1] - b[0] * a[1]
        })
        .sum();
    if signed < 0.0 {
        ring.reverse();
    }
    let (_, width) = equivalent_rectangle(outline)?;
    let pts = medial_points(&ring, width);
    let chained = chain(pts, 1e-6 * width);
    if chained.len() < 2 {
        return None;
    }
    let line: geo::LineString<f64> = chained.iter().map(|p| (p[0], p[1])).collect();
    let mut line: Vec<[f64; 2]> = line
        .simplify(width / 20.0)
        .0
        .iter()
        .map(|c| [c.x, c.y])
        .collect();
    let n = line.len();
    if n < 3 {
        return None;
    }
    // Run both ends out along their last segment to the outline.
    for (end, prev) in [(0, 1), (n - 1, n - 2)] {
        let (p, q) = (line[end], line[prev]);
        if let Some(d) = unit([p[0] - q[0], p[1] - q[1]]) {
            if let Some((t, _)) = ray_hit(&ring, p, d, &[], 0.0) {
                line[end] = [p[0] + d[0] * t, p[1] + d[1] * t];
            }
        }
    }
    Some(line)
}

/// Intersection of the lines p + t·u and q + s·v, or `None` when parallel.
fn meet(p: [f64; 2], u: [f64; 2], q: [f64; 2], v: [f64; 2]) -> Option<[f64; 2]> {
    let denom = u[0] * v[1] - u[1] * v[0];
    if denom.abs() < 1e-12 {
        return None;
    }
    let w = [q[0] - p[0], q[1] - p[1]];
    let t = (w[0] * v[1] - w[1] * v[0]) / denom;
    Some([p[0] + t * u[0], p[1] + t * u[1]])
}

/// The polyline `pts` offset by `d` m to the left of its direction of travel (negative: to the
/// right): intersections inside bends, arcs about the bend point outside (see the module docs).
/// Repeated points are dropped first.
pub fn offset(pts: &[[f64; 2]], d: f64) -> Vec<[f64; 2]> {
    let mut p: Vec<[f64; 2]> = Vec::with_capacity(pts.len());
    for q in pts {
        if p.last()
            .is_none_or(|l: &[f64; 2]| (l[0] - q[0]).hypot(l[1] - q[1]) > 1e-9)
        {
            p.push(*q);
        }
    }
    if p.len() < 2 {
        return p;
    }
    let dirs: Vec<[f64; 2]> = p
        .windows(2)
        .map(|w| unit([w[1][0] - w[0][0], w[1][1] - w[0][1]]).unwrap_or([1.0, 0.0]))
        .collect();
    let shift = |a: [f64; 2], u: [f64; 2]| [a[0] - d * u[1], a[1] + d * u[0]];
    let mut out = vec![shift(p[0], dirs[0])];
    for i in 1..p.len() - 1 {
        let (u, v) = (dirs[i - 1], dirs[i]);
        // Turn θ, positive to the left; the bend's inside is the side it turns to.
        let turn = (u[0] * v[1] - u[1] * v[0]).atan2(u[0] * v[0] + u[1] * v[1]);
        let (a, b) = (shift(p[i], u), shift(p[i], v));
        if turn.abs() < 1e-9 {
            out.push(a);
        } else if turn * d > 0.0 {
            out.push(meet(a, u, b, v).unwrap_or(a));
        } else {
            let steps = (turn.abs() / ARC_STEP_DEG.to_radians()).ceil().max(1.0) as usize;
            let start = (a[1] - p[i][1]).atan2(a[0] - p[i][0]);
            let r = d.abs();
            for k in 0..=steps {
                let phi = start + turn * k as f64 / steps as f64;
                out.push([p[i][0] + r * phi.cos(), p[i][1] + r * phi.sin()]);
            }
        }
    }
    let n = p.len();
    out.push(shift(p[n - 1], dirs[n - 2]));
    out
}

/// Distance from `q` to the nearest point of the polyline, with that point's chainage along it
/// and the unit direction of the segment it lies on: (distance, chainage, foot, direction).
pub fn nearest(pts: &[[f64; 2]], q: [f64; 2]) -> (f64, f64, [f64; 2], [f64; 2]) {
    let mut best = (
        f64::INFINITY,
        0.0,
        pts.first().copied().unwrap_or(q),
        [1.0, 0.0],
    );
    let mut chainage = 0.0;
    for w in pts.windows(2) {
        let (a, b) = (w[0], w[1]);
        let e = [b[0] - a[0], b[1] - a[1]];
        let len = e[0].hypot(e[1]);
        if len <= 0.0 {
            continue;
        }
        let u = [e[0] / len, e[1] / len];
        let t = ((q[0] - a[0]) * u[0] + (q[1] - a[1]) * u[1]).clamp(0.0, len);
        let f = [a[0] + t * u[0], a[1] + t * u[1]];
        let dist = (q[0] - f[0]).hypot(q[1] - f[1]);
        if dist < best.0 {
            best = (dist, chainage + t, f, u);
        }
        chainage += len;
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;
    use geo::{Coord, LineString};

    /// The bent trench of the demo, by hand: legs of 350 m along x and 250 m turned 30° to the
    /// left, 2.5 m wide, mitred at the bend. Outside and inside corners of the bend lie
    /// h·tan 15° = 0.334936 m past and short of the bend along each leg (h = 1.25 m).
    fn bent_outline() -> Polygon<f64> {
        let (h, t15) = (1.25, 15f64.to_radians().tan());
        let (c30, s30) = (30f64.to_radians().cos(), 30f64.to_radians().sin());
        let end = [350.0 + 250.0 * c30, 250.0 * s30];
        let pts = [
            [0.0, -h],
            [350.0 + h * t15, -h],
            [end[0] + h * s30, end[1] - h * c30],
            [end[0] - h * s30, end[1] + h * c30],
            [350.0 - h * t15, h],
            [0.0, h],
        ];
        Polygon::new(
            LineString(pts.iter().map(|p| Coord { x: p[0], y: p[1] }).collect()),
            vec![],
        )
    }

    #[test]
    fn bent_strip_centre_line_has_the_drawn_legs() {
        // Hand-computed: 350 m + 250 m = 600 m, bend at (350, 0), end at
        // (350 + 250·cos 30°, 250·sin 30°) = (566.506, 125.0).
        let line = derived(&bent_outline()).expect("a bent strip has a centre line");
        assert_eq!(line.len(), 3, "{line:?}");
        let (mut first, last) = (line[0], line[2]);
        if first[0] > last[0] {
            first = last;
        }
        assert!(first[0].abs() < 1e-6 && first[1].abs() < 1e-6, "{line:?}");
        assert!((line[1][0] - 350.0).abs() < 1e-6 && line[1][1].abs() < 1e-6);
        assert!((length(&line) - 600.0).abs() < 1e-6, "{}", length(&line));
        // Area / length is the strip's width.
        let (l, w) = equivalent_rectangle(&bent_outline()).unwrap();
        assert!(
            (l - 600.0).abs() < 1e-6 && (w - 2.5).abs() < 1e-9,
            "{l} {w}"
        );
    }

    #[test]
    fn offset_of_a_bend_by_trigonometry() {
        // Turn θ = 30° left. Inside (left): the moved legs meet d·tan 15° short of the bend
        // along the first leg, so that line is 2·d·tan 15° shorter than the centre line.
        // Outside (right): an arc of radius d through θ from (350, −d) to
        // (350 + d·sin 30°, −d·cos 30°), so that line is d·θ longer (less the chords' shortfall,
        // 2·d·sin(1°)·15 against d·π/6).
        let c = [
            [0.0, 0.0],
            [350.0, 0.0],
            [350.0 + 250.0 * 30f64.to_radians().cos(), 125.0],
        ];
        let d = 3.25;
        let t15 = 15f64.to_radians().tan();
        let right = offset(&c, -d);
        let left = offset(&c, d);
        assert_eq!(left.len(), 3);
        assert!((left[1][0] - (350.0 - d * t15)).abs() < 1e-9 && (left[1][1] - d).abs() < 1e-9);
        assert!((right[1][0] - 350.0).abs() < 1e-9 && (right[1][1] + d).abs() < 1e-9);
        let arc_end = right[right.len() - 2];
        assert!((arc_end[0] - (350.0 + d * 0.5)).abs() < 1e-9);
        assert!((arc_end[1] + d * 30f64.to_radians().cos()).abs() < 1e-9);
        assert!((length(&left) - (600.0 - 2.0 * d * t15)).abs() < 1e-9);
        let chords = 2.0 * d * 1f64.to_radians().sin() * 15.0;
        assert!(
            (length(&right) - (600.0 + chords)).abs() < 1e-9,
            "{}",
            length(&right)
        );
        assert!((chords - d * std::f64::consts::FRAC_PI_6).abs() < 2e-4 * d);
        // Every point of either line is d from the centre line (to the chords' sagitta,
        // d·(1 − cos 1°) = 0.5 mm): no gap, no overlap.
        for line in [&left, &right] {
            for i in 0..=6000 {
                let s = length(line) * i as f64 / 6000.0;
                let p = point_at(line, s);
                let (dist, _, _, _) = nearest(&c, p);
                assert!(
                    (dist - d).abs() < d * (1.0 - 1f64.to_radians().cos()) + 1e-9,
                    "{p:?} at {dist}"
                );
            }
        }
    }

    fn point_at(pts: &[[f64; 2]], s: f64) -> [f64; 2] {
        let mut left = s;
        for w in pts.windows(2) {
            let l = (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]);
            if left <= l {
                let t = left / l;
                return [
                    w[0][0] + t * (w[1][0] - w[0][0]),
                    w[0][1] + t * (w[1][1] - w[0][1]),
                ];
            }
            left -= l;
        }
        pts[pts.len() - 1]
    }

    #[test]
    fn straight_and_compact_outlines_keep_the_rectangle_reading() {
        let rect = |l: f64, w: f64| {
            Polygon::new(
                LineString(vec![
                    Coord { x: 0.0, y: 0.0 },
                    Coord { x: l, y: 0.0 },
                    Coord { x: l, y: w },
                    Coord { x: 0.0, y: w },
                ]),
                vec![],
            )
        };
        assert!(!is_bent_strip(&rect(400.0, 3.0)));
        assert!(!is_bent_strip(&rect(40.0, 30.0)));
        assert!(is_bent_strip(&bent_outline()));
        // Equivalent rectangle of a rectangle is itself.
        let (l, w) = equivalent_rectangle(&rect(400.0, 3.0)).unwrap();
        assert!((l - 400.0).abs() < 1e-9 && (w - 3.0).abs() < 1e-9);
    }
}
