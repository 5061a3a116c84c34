//! Method of images for a straight boundary: a river or lake edge held at constant head, or an
//! impermeable barrier (cut-off wall, rock outcrop). Each real well gets an image well mirrored
//! across the boundary line, of opposite sign for a constant head and the same sign for a
//! barrier. Source: Ferris, Knowles, Brown & Stallman (1962), *Theory of Aquifer Tests*, USGS
//! Water-Supply Paper 1536-E.

use crate::geometry::{cross, mirror_point};

/// The kind of a straight boundary.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum BoundaryKind {
    /// A line held at constant head (river, lake, sea): image well of opposite sign (recharge).
    ConstantHead,
    /// An impermeable line (cut-off wall, rock): image well of the same sign.
    Barrier,
}

/// Sign of the image well's rate relative to the real well: −1 for a constant-head boundary,
/// +1 for a barrier. Source: Ferris et al. (1962), USGS WSP 1536-E.
pub fn image_sign(kind: BoundaryKind) -> f64 {
    match kind {
        BoundaryKind::ConstantHead => -1.0,
        BoundaryKind::Barrier => 1.0,
    }
}

/// Most images kept per well (parallel boundaries give an endless series, cut at `reach`).
pub const MAX_IMAGES_PER_WELL: usize = 400;

/// Every image of a well at `p` in a set of straight boundaries, with its sign, by repeated
/// reflection: every first-order image, and images of images out to `reach` metres from the well.
///
/// One boundary gives one image. Two parallel boundaries give the endless alternating series,
/// cut where it no longer matters; two boundaries meeting at 180°/n give a closed group of images
/// (Ferris et al. 1962, USGS WSP 1536-E, "multiple boundary systems"). Any other geometry has no
/// exact image solution; it is refused with a message, detected where an image would land inside
/// the aquifer or two reflection paths reach one point with opposite signs.
pub fn image_set(
    p: [f64; 2],
    boundaries: &[([f64; 2], [f64; 2], BoundaryKind)],
    reach: f64,
) -> Result<Vec<([f64; 2], f64)>, String> {
    image_set_up_to(p, boundaries, reach, MAX_IMAGES_PER_WELL).map(|(v, _)| v)
}

/// Images with their signs: (position m, sign).
pub type Images = Vec<([f64; 2], f64)>;

/// As [`image_set`], keeping at most `max_images` images; the flag is true when the series was
/// cut at that number before reaching `reach`.
pub fn image_set_up_to(
    p: [f64; 2],
    boundaries: &[([f64; 2], [f64; 2], BoundaryKind)],
    reach: f64,
    max_images: usize,
) -> Result<(Images, bool), String> {
    let own: Vec<f64> = boundaries
        .iter()
        .map(|(a, b, _)| cross(p, *a, *b).signum())
        .collect();
    let mut out: Vec<([f64; 2], f64)> = Vec::new();
    let mut queue = std::collections::VecDeque::from([(p, 1.0, usize::MAX)]);
    let close = |u: [f64; 2], v: [f64; 2]| (u[0] - v[0]).hypot(u[1] - v[1]) < 1e-6 * (1.0 + reach);
    while let Some((q, sign, last)) = queue.pop_front() {
        for (bi, (a, b, kind)) in boundaries.iter().enumerate() {
            if bi == last {
                continue;
            }
            let img = mirror_point(q, *a, *b);
            let img_sign = sign * image_sign(*kind);
            // First-order images are always kept; images of images only out to `reach`.
            let far = last != usize::MAX && (img[0] - p[0]).hypot(img[1] - p[1]) > reach;
            if far || close(img, p) {
                continue;
            }
            if let Some((_, s)) = out.iter().find(|(x, _)| close(*x, img)) {
                if *s != img_sign {
                    return Err("these boundaries meet at an angle where a constant-head line and a barrier have no exact image solution (mixed boundaries need parallel lines or a right angle)".into());
                }
                continue;
            }
            let inside = boundaries
                .iter()
                .zip(&own)
                .all(|((a, b, _), s0)| cross(img, *a, *b).signum() == *s0);
            if inside {
                return Err("these boundaries meet at an angle that is not 180°/n (90°, 60°, 45°…) and are not parallel, so the method of images has no exact solution; simplify them to one line, two parallel lines or a right-angled corner".into());
            }
            if out.len() >= max_images {
                return Ok((out, true));
            }
            out.push((img, img_sign));
            queue.push_back((img, img_sign, bi));
        }
    }
    Ok((out, false))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::theis::theis_drawdown;
    use crate::physics::thiem::thiem_drawdown;
    use approx::assert_relative_eq;

    const Q: f64 = 0.01;
    const T: f64 = 1e-3;
    const WELL: [f64; 2] = [50.0, 0.0];
    /// Boundary on the line x = 0.
    const A: [f64; 2] = [0.0, -100.0];
    const B: [f64; 2] = [0.0, 100.0];

    fn dist(p: [f64; 2], q: [f64; 2]) -> f64 {
        (p[0] - q[0]).hypot(p[1] - q[1])
    }

    fn steady(kind: BoundaryKind, p: [f64; 2]) -> f64 {
        // R large enough to hold both wells: the ln R terms cancel for a constant head
        let r_big = 1.0e5;
        let image = mirror_point(WELL, A, B);
        thiem_drawdown(Q, T, dist(p, WELL), r_big)
            + image_sign(kind) * thiem_drawdown(Q, T, dist(p, image), r_big)
    }

    fn transient(kind: BoundaryKind, p: [f64; 2]) -> f64 {
        let (s, t) = (1e-4, 86_400.0);
        let image = mirror_point(WELL, A, B);
        theis_drawdown(Q, T, s, dist(p, WELL), t)
            + image_sign(kind) * theis_drawdown(Q, T, s, dist(p, image), t)
    }

    #[test]
    fn mirror_simple_lines() {
        // plane geometry (common practice (no source))
        assert_eq!(mirror_point(WELL, A, B), [-50.0, 0.0]);
        let m = mirror_point([3.0, 1.0], [0.0, 0.0], [1.0, 1.0]);
        assert_relative_eq!(m[0], 1.0, epsilon = 1e-12);
        assert_relative_eq!(m[1], 3.0, epsilon = 1e-12);
        // a point on the line is its own image
        let m = mirror_point([2.0, 2.0], [0.0, 0.0], [1.0, 1.0]);
        assert_relative_eq!(m[0], 2.0, epsilon = 1e-12);
        assert_relative_eq!(m[1], 2.0, epsilon = 1e-12);
        // degenerate line: reflection through the point
        assert_eq!(
            mirror_point([1.0, 2.0], [0.0, 0.0], [0.0, 0.0]),
            [-1.0, -2.0]
        );
    }

    #[test]
    fn mirror_in_projected_coordinates() {
        // stability with real projected coordinates (x ≈ 5e5, y ≈ 6e6): the same geometry as
        // mirror_simple_lines, shifted (common practice (no source))
        let (x0, y0) = (512_345.678, 6_123_456.789);
        let m = mirror_point([x0 + 50.0, y0], [x0, y0 - 100.0], [x0, y0 + 100.0]);
        assert_relative_eq!(m[0] - x0, -50.0, epsilon = 1e-8);
        assert_relative_eq!(m[1] - y0, 0.0, epsilon = 1e-8);
    }

    #[test]
    fn steady_constant_head() {
        // Ferris et al. (1962) USGS WSP 1536-E, method; values library-computed (checks.md §8):
        // (25, 0) → 1.74850 m; (50, 20) → 2.59271 m; on the boundary → 0
        let kind = BoundaryKind::ConstantHead;
        assert_relative_eq!(steady(kind, [25.0, 0.0]), 1.74850, max_relative = 1e-5);
        assert_relative_eq!(steady(kind, [50.0, 20.0]), 2.59271, max_relative = 1e-5);
        assert_relative_eq!(steady(kind, [0.0, 37.0]), 0.0, epsilon = 1e-12);
    }

    #[test]
    fn transient_images() {
        // Ferris et al. (1962) USGS WSP 1536-E, method; values library-computed (checks.md §8):
        // S = 1e-4, t = 1 day; constant head 1.74734 / 2.59041 m, barrier 11.05004 / 10.91716 m
        let ch = BoundaryKind::ConstantHead;
        let bar = BoundaryKind::Barrier;
        assert_relative_eq!(transient(ch, [25.0, 0.0]), 1.74734, max_relative = 1e-5);
        assert_relative_eq!(transient(ch, [50.0, 20.0]), 2.59041, max_relative = 1e-5);
        assert_relative_eq!(transient(bar, [25.0, 0.0]), 11.05004, max_relative = 1e-5);
        assert_relative_eq!(transient(bar, [50.0, 20.0]), 10.91716, max_relative = 1e-5);
    }

    #[test]
    fn well_beside_river() {
        // Ferris et al. (1962) USGS WSP 1536-E: drawdown at the well face with its image,
        // s_w = Q/(2πT)·ln(2a/r_w); Q = 1.8192e-3 gives s_w = 2 for a = 50, r_w = 0.1, T = 1e-3
        // (library-computed, checks.md §8)
        let q = 1.8192e-3;
        let face = [WELL[0] - 0.1, 0.0];
        let image = mirror_point(WELL, A, B);
        let r_big = 1.0e5;
        let s = thiem_drawdown(q, T, 0.1, r_big) - thiem_drawdown(q, T, dist(face, image), r_big);
        // the face nearest the river is 99.9 m from the image, not 100 m: 1e-3 relative
        assert_relative_eq!(s, 2.0, max_relative = 1e-3);
    }

    #[test]
    fn signs() {
        // Ferris et al. (1962) USGS WSP 1536-E
        assert_eq!(image_sign(BoundaryKind::ConstantHead), -1.0);
        assert_eq!(image_sign(BoundaryKind::Barrier), 1.0);
    }

    // Ferris et al. (1962) WSP 1536-E: two parallel constant-head lines (a strip aquifer) give
    // an endless alternating series; with a barrier and a river at a right angle the group is
    // three images with signs (−, +, −). Checked against the boundary conditions themselves:
    // zero drawdown on each river line, zero normal gradient at the barrier (plane geometry).
    #[test]
    fn images_of_images_meet_both_boundary_conditions() {
        let thiem_sum_r = |p: [f64; 2], imgs: &[([f64; 2], f64)], r_big: f64| {
            thiem_drawdown(Q, T, dist(p, WELL), r_big)
                + imgs
                    .iter()
                    .map(|(q, s)| s * thiem_drawdown(Q, T, dist(p, *q), r_big))
                    .sum::<f64>()
        };
        let thiem_sum = |p: [f64; 2], imgs: &[([f64; 2], f64)]| thiem_sum_r(p, imgs, 1.0e7);
        // Right-angled corner: river on x = 0, barrier on y = -30.
        let corner = [
            ([0.0, -100.0], [0.0, 100.0], BoundaryKind::ConstantHead),
            ([-100.0, -30.0], [100.0, -30.0], BoundaryKind::Barrier),
        ];
        let imgs = image_set(WELL, &corner, 1.0e6).unwrap();
        assert_eq!(imgs.len(), 3);
        for y in [-30.0, -10.0, 0.0, 40.0, 200.0] {
            assert!(thiem_sum([0.0, y], &imgs).abs() < 1e-9);
        }
        for x in [5.0, 30.0, 80.0] {
            let h = 1e-4;
            let g =
                (thiem_sum([x, -30.0 + h], &imgs) - thiem_sum([x, -30.0 - h], &imgs)) / (2.0 * h);
            assert!(g.abs() < 1e-6, "gradient {g}");
        }
        // Strip between two rivers, x = 0 and x = 120: images are kept out to 3 R, as the
        // superposition kernel does, and each well and image adds nothing beyond R.
        let strip = [
            ([0.0, -100.0], [0.0, 100.0], BoundaryKind::ConstantHead),
            ([120.0, -100.0], [120.0, 100.0], BoundaryKind::ConstantHead),
        ];
        let r_big = 5.0e3;
        let imgs = image_set(WELL, &strip, 3.0 * r_big).unwrap();
        assert!(imgs.len() > 100);
        assert!(thiem_sum_r([0.0, 10.0], &imgs, r_big).abs() < 2e-3);
        assert!(thiem_sum_r([120.0, -20.0], &imgs, r_big).abs() < 2e-3);
        assert!(thiem_sum_r([60.0, 0.0], &imgs, r_big) > 0.1);
        // A 70° wedge has no exact image solution: refused.
        let t = 70f64.to_radians();
        let wedge = [
            ([0.0, 0.0], [1.0, 0.0], BoundaryKind::Barrier),
            ([0.0, 0.0], [t.cos(), t.sin()], BoundaryKind::Barrier),
        ];
        assert!(image_set([10.0, 3.0], &wedge, 1.0e4).is_err());
    }
}
