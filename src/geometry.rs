//! Plane geometry on site coordinates (x east, y north, m) that every stage shares and `geo`
//! does not offer as such: the side of a line, the foot of a perpendicular, the reflection across
//! a line (image wells) and the cut of a convex polygon by a half-plane (the aquifer side of a
//! boundary; `geo`'s boolean operations need a bounded polygon, and a stand-in "very large"
//! polygon loses the precision of projected coordinates). Distances, areas, containment, offsets
//! and clipping of bounded shapes are `geo`'s own algorithms, used where they are needed.

use geo::{Coord, LineString, Polygon};

/// Twice the signed area of the triangle a, b, p: > 0 when `p` is left of the line a→b, < 0
/// right, 0 on it (the 2-D cross product (b − a) × (p − a)).
pub fn cross(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0])
}

/// The side of the line a→b that `p` is on: +1 left, −1 right, 0 on it.
pub fn side(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    let c = (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]);
    if c > 0.0 {
        1.0
    } else if c < 0.0 {
        -1.0
    } else {
        0.0
    }
}

/// Foot of the perpendicular from `p` to the infinite line through `a` and `b`.
pub fn foot(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> [f64; 2] {
    let d = [b[0] - a[0], b[1] - a[1]];
    let len2 = d[0] * d[0] + d[1] * d[1];
    if len2 <= 0.0 || !len2.is_finite() {
        return a;
    }
    let t = ((p[0] - a[0]) * d[0] + (p[1] - a[1]) * d[1]) / len2;
    [a[0] + t * d[0], a[1] + t * d[1]]
}

/// Reflect point `p` across the infinite line through `a` and `b` (x, y in m).
///
/// Source: plane geometry, as used for image wells by Ferris et al. (1962), USGS WSP 1536-E.
/// If `a` and `b` coincide the line is undefined and `p` is reflected through the point `a`
/// (a documented fallback, never a panic). Coordinates are taken relative to `a`, so large
/// projected coordinates (x ≈ 5e5, y ≈ 6e6) keep their precision.
pub fn mirror_point(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> [f64; 2] {
    let dx = b[0] - a[0];
    let dy = b[1] - a[1];
    let len2 = dx * dx + dy * dy;
    let px = p[0] - a[0];
    let py = p[1] - a[1];
    if len2 == 0.0 || !len2.is_finite() {
        return [a[0] - px, a[1] - py];
    }
    // foot of the perpendicular, relative to a
    let t = (px * dx + py * dy) / len2;
    let fx = t * dx;
    let fy = t * dy;
    [a[0] + 2.0 * fx - px, a[1] + 2.0 * fy - py]
}

/// Cut a convex polygon (closed ring not repeated) to the half-plane on `keep` side of a→b
/// (Sutherland–Hodgman, one edge).
pub fn cut_half_plane(poly: &[[f64; 2]], a: [f64; 2], b: [f64; 2], keep: f64) -> Vec<[f64; 2]> {
    let signed =
        |p: [f64; 2]| keep * ((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]));
    let mut out = Vec::new();
    let n = poly.len();
    for i in 0..n {
        let p = poly[i];
        let q = poly[(i + 1) % n];
        let (sp, sq) = (signed(p), signed(q));
        if sp >= 0.0 {
            out.push(p);
        }
        if (sp >= 0.0) != (sq >= 0.0) {
            let t = sp / (sp - sq);
            out.push([p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]);
        }
    }
    out
}

/// A polygon from a ring of points given without the closing repeat.
pub fn to_polygon(ring: &[[f64; 2]]) -> Polygon<f64> {
    let mut coords: Vec<Coord<f64>> = ring.iter().map(|p| Coord { x: p[0], y: p[1] }).collect();
    if let Some(first) = coords.first().copied() {
        coords.push(first);
    }
    Polygon::new(LineString::new(coords), vec![])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn side_and_foot_of_a_line() {
        // Plane geometry (no source needed beyond the definition): the line y = x.
        assert_eq!(side([0.0, 1.0], [0.0, 0.0], [1.0, 1.0]), 1.0);
        assert_eq!(side([1.0, 0.0], [0.0, 0.0], [1.0, 1.0]), -1.0);
        assert_eq!(side([2.0, 2.0], [0.0, 0.0], [1.0, 1.0]), 0.0);
        assert_eq!(foot([0.0, 2.0], [0.0, 0.0], [1.0, 1.0]), [1.0, 1.0]);
    }
}
