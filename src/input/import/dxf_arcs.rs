//! Arcs of DXF polylines flattened into straight segments within a chord tolerance, the
//! vertices counted before any arc is expanded (so a drawing of many bulges cannot grow without
//! bound).

use std::f64::consts::PI;

/// Most straight segments one arc becomes.
pub const MAX_ARC_STEPS: usize = 4096;

/// The number of straight segments an arc of angle `theta` (rad) and radius `r` becomes so that
/// none strays more than `tol` from the arc: a segment of angle φ strays r·(1 − cos(φ/2)) (the
/// sagitta), so φ ≤ 2·acos(1 − tol/r); at least 1, at most [`MAX_ARC_STEPS`].
pub fn arc_steps(theta: f64, r: f64, tol: f64) -> usize {
    let phi_max = if tol < r {
        2.0 * (1.0 - tol / r).acos()
    } else {
        PI
    };
    let k = (theta.abs() / phi_max).ceil();
    if k.is_nan() {
        1
    } else {
        (k.min(MAX_ARC_STEPS as f64) as usize).clamp(1, MAX_ARC_STEPS)
    }
}

/// Radius and included angle of the arc of bulge `b` over a chord of length `c`.
fn bulge_arc(b: f64, c: f64) -> (f64, f64) {
    let theta = 4.0 * b.atan();
    (c / (2.0 * (theta / 2.0).sin().abs()), theta)
}

/// The vertices [`flatten`] will return, counted without building them.
pub fn planned_vertices(v: &[(f64, f64, f64)], closed: bool, tol: f64) -> usize {
    let n = v.len();
    let last = if closed { n } else { n.saturating_sub(1) };
    let mut count = n;
    for i in 0..last {
        let (x1, y1, b) = v[i];
        let (x2, y2, _) = v[(i + 1) % n];
        let c = (x2 - x1).hypot(y2 - y1);
        if b != 0.0 && b.is_finite() && c > 0.0 {
            let (r, theta) = bulge_arc(b, c);
            count = count.saturating_add(arc_steps(theta, r, tol) - 1);
        }
    }
    count
}

/// Replace every bulged segment of a polyline (vertices (x, y, bulge), the bulge of a vertex
/// belonging to the segment that starts there) by straight segments within `tol` of the arc.
/// Returns the vertices (without repeating the first for a closed one), the number of arcs and
/// the number of segments they became.
///
/// Geometry: bulge b = tan(θ/4) with θ the arc's included angle (positive counter-clockwise);
/// for a chord of length c the radius is r = c/(2·|sin(θ/2)|) and the centre lies
/// (c/2)/tan(θ/2) to the left of the chord's midpoint. Steps by [`arc_steps`]. Source: the DXF
/// reference's definition of the bulge (Autodesk, *DXF Reference*, LWPOLYLINE group 42) and
/// plane geometry of the circular segment.
pub fn flatten(v: &[(f64, f64, f64)], closed: bool, tol: f64) -> (Vec<(f64, f64)>, usize, usize) {
    let mut out = Vec::with_capacity(planned_vertices(v, closed, tol));
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
            let (r, theta) = bulge_arc(b, c);
            let h = (c / 2.0) / (theta / 2.0).tan();
            let (mx, my) = ((x1 + x2) / 2.0, (y1 + y2) / 2.0);
            let (lx, ly) = (-(y2 - y1) / c, (x2 - x1) / c);
            let (cx, cy) = (mx + lx * h, my + ly * h);
            let k = arc_steps(theta, r, tol);
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

#[cfg(test)]
mod tests {
    use super::*;

    // A bulge of 1e300 is a full circle in the limit; its steps are capped, and counted before.
    #[test]
    fn arc_steps_are_capped_and_counted_first() {
        let v = [(0.0, 0.0, 1e300), (1.0, 0.0, 1e300)];
        let n = planned_vertices(&v, true, 1e-9);
        assert!(n <= 2 + 2 * MAX_ARC_STEPS, "{n}");
        let (pts, _, _) = flatten(&v, true, 1e-9);
        assert_eq!(pts.len(), n);
    }
}
