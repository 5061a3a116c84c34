//! Whether a closed ring of many vertices is simple (no two edges meet except neighbours at
//! their shared corner), in near-linear time: the edges go into an R-tree ([`rstar`]) and each
//! edge is tested only against the edges whose bounding boxes overlap its own — O(n log n) for
//! an outline whose edges are short compared with its size, instead of the O(n²) of testing
//! every pair.
//!
//! The segment test is the orientation test of Cormen, Leiserson, Rivest & Stein, *Introduction
//! to Algorithms*, 3rd ed., §33.1 (SEGMENTS-INTERSECT), with collinear overlap counted as a
//! meeting.

use rstar::{RTree, RTreeObject, AABB};

struct Edge {
    index: usize,
    a: [f64; 2],
    b: [f64; 2],
}

impl RTreeObject for Edge {
    type Envelope = AABB<[f64; 2]>;
    fn envelope(&self) -> Self::Envelope {
        AABB::from_corners(self.a, self.b)
    }
}

fn orient(p: [f64; 2], q: [f64; 2], r: [f64; 2]) -> f64 {
    (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0])
}

fn on_segment(p: [f64; 2], q: [f64; 2], r: [f64; 2]) -> bool {
    r[0] >= p[0].min(q[0])
        && r[0] <= p[0].max(q[0])
        && r[1] >= p[1].min(q[1])
        && r[1] <= p[1].max(q[1])
}

/// Whether segments p1p2 and p3p4 meet (CLRS §33.1 SEGMENTS-INTERSECT).
pub fn segments_meet(p1: [f64; 2], p2: [f64; 2], p3: [f64; 2], p4: [f64; 2]) -> bool {
    let d1 = orient(p3, p4, p1);
    let d2 = orient(p3, p4, p2);
    let d3 = orient(p1, p2, p3);
    let d4 = orient(p1, p2, p4);
    if ((d1 > 0.0 && d2 < 0.0) || (d1 < 0.0 && d2 > 0.0))
        && ((d3 > 0.0 && d4 < 0.0) || (d3 < 0.0 && d4 > 0.0))
    {
        return true;
    }
    (d1 == 0.0 && on_segment(p3, p4, p1))
        || (d2 == 0.0 && on_segment(p3, p4, p2))
        || (d3 == 0.0 && on_segment(p1, p2, p3))
        || (d4 == 0.0 && on_segment(p1, p2, p4))
}

/// Whether every point lies on one straight line (to 1e-12 of the square of the points'
/// extent): the cross product of each point with the two points farthest apart is zero.
pub fn all_on_one_line(pts: &[[f64; 2]]) -> bool {
    let Some(&a) = pts.first() else {
        return true;
    };
    let far = pts
        .iter()
        .copied()
        .max_by(|p, q| {
            let dp = (p[0] - a[0]).hypot(p[1] - a[1]);
            let dq = (q[0] - a[0]).hypot(q[1] - a[1]);
            dp.total_cmp(&dq)
        })
        .unwrap_or(a);
    let extent = (far[0] - a[0]).hypot(far[1] - a[1]);
    if extent == 0.0 {
        return true;
    }
    pts.iter()
        .all(|p| orient(a, far, *p).abs() <= 1e-12 * extent * extent)
}

/// The first pair of edges (1-based, edge k runs from point k to point k + 1) of the closed
/// ring `pts` (not repeating its first point) that meet other than at a shared corner, or
/// `None` when the ring is simple.
pub fn first_crossing(pts: &[[f64; 2]]) -> Option<(usize, usize)> {
    let n = pts.len();
    if n < 3 {
        return None;
    }
    let edges: Vec<Edge> = (0..n)
        .map(|i| Edge {
            index: i,
            a: pts[i],
            b: pts[(i + 1) % n],
        })
        .collect();
    let tree = RTree::bulk_load(
        edges
            .iter()
            .map(|e| Edge {
                index: e.index,
                a: e.a,
                b: e.b,
            })
            .collect(),
    );
    for e in &edges {
        for o in tree.locate_in_envelope_intersecting(&e.envelope()) {
            let (i, j) = (e.index, o.index);
            if j <= i {
                continue;
            }
            let adjacent = j == i + 1 || (i == 0 && j == n - 1);
            if adjacent {
                // Neighbours share one corner; they must not fold back over each other.
                let (shared, p, q) = if j == i + 1 {
                    (e.b, e.a, o.b)
                } else {
                    (e.a, e.b, o.a)
                };
                let folded = orient(p, shared, q) == 0.0
                    && (p[0] - shared[0]) * (q[0] - shared[0])
                        + (p[1] - shared[1]) * (q[1] - shared[1])
                        > 0.0;
                if folded {
                    return Some((i + 1, j + 1));
                }
                continue;
            }
            if segments_meet(e.a, e.b, o.a, o.b) {
                return Some((i + 1, j + 1));
            }
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    // A square is simple and a bow tie is not: common practice (no source).
    #[test]
    fn square_is_simple_and_bow_tie_is_not() {
        let square = [[0.0, 0.0], [1.0, 0.0], [1.0, 1.0], [0.0, 1.0]];
        assert_eq!(first_crossing(&square), None);
        let bow = [[0.0, 0.0], [1.0, 1.0], [1.0, 0.0], [0.0, 1.0]];
        assert!(first_crossing(&bow).is_some());
        let spike = [[0.0, 0.0], [2.0, 0.0], [1.0, 0.0], [1.0, 1.0]];
        assert!(first_crossing(&spike).is_some());
    }

    /// The shortcut against the plain test: `geo`'s validation of every pair of edges, on rings
    /// of random points (most of which cross themselves) and on star shapes (simple).
    #[test]
    fn agrees_with_geo_validation_on_random_rings() {
        use geo::{Coord, LineString, Polygon, Validation};
        let mut seed: u64 = 12345;
        let mut next = || {
            seed = seed
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (seed >> 11) as f64 / (1u64 << 53) as f64
        };
        for case in 0..300 {
            let n = 3 + case % 9;
            let pts: Vec<[f64; 2]> = if case % 3 == 0 {
                (0..n)
                    .map(|i| {
                        let a = std::f64::consts::TAU * i as f64 / n as f64;
                        let r = 5.0 + 5.0 * next();
                        [r * a.cos(), r * a.sin()]
                    })
                    .collect()
            } else {
                (0..n).map(|_| [10.0 * next(), 10.0 * next()]).collect()
            };
            let ring: LineString<f64> = pts.iter().map(|p| Coord { x: p[0], y: p[1] }).collect();
            let geo_ok = Polygon::new(ring, vec![]).is_valid();
            assert_eq!(first_crossing(&pts).is_none(), geo_ok, "{pts:?}");
        }
    }
}
