//! From site metres to page pixels: the equal-scale, north-up transform of a plan, the SVG path
//! data of polylines, polygons and multipolygons in pixels, and the clipping of an infinite
//! boundary line to a box (Liang–Barsky).

use crate::report::map::text::r1;
use geo::{MultiPolygon, Polygon};

/// From site metres to page pixels: equal scale in x and y, y up the page = north.
#[derive(Debug, Clone, Copy)]
pub(super) struct View {
    /// Site x at page x = `left`.
    pub(super) x0: f64,
    /// Site y at page y = `top`.
    pub(super) y1: f64,
    /// Pixels per metre.
    pub(super) scale: f64,
    pub(super) left: f64,
    pub(super) top: f64,
}

impl View {
    /// Fit the site box `b` into the page box `area`, centred.
    pub(super) fn fit(b: [f64; 4], area: [f64; 4]) -> View {
        let (w, h) = ((b[2] - b[0]).max(1e-6), (b[3] - b[1]).max(1e-6));
        let (pw, ph) = (area[2] - area[0], area[3] - area[1]);
        let scale = (pw / w).min(ph / h);
        let left = area[0] + (pw - w * scale) / 2.0;
        let top = area[1] + (ph - h * scale) / 2.0;
        View {
            x0: b[0],
            y1: b[3],
            scale,
            left,
            top,
        }
    }

    pub(super) fn px(&self, p: [f64; 2]) -> [f64; 2] {
        [
            self.left + (p[0] - self.x0) * self.scale,
            self.top + (self.y1 - p[1]) * self.scale,
        ]
    }

    pub(super) fn site(&self, q: [f64; 2]) -> [f64; 2] {
        [
            self.x0 + (q[0] - self.left) / self.scale,
            self.y1 - (q[1] - self.top) / self.scale,
        ]
    }
}

/// SVG path data for a polyline in page pixels.
pub(super) fn path_data(points: &[[f64; 2]], close: bool) -> String {
    let mut d = String::with_capacity(points.len() * 14);
    for (i, p) in points.iter().enumerate() {
        d.push(if i == 0 { 'M' } else { 'L' });
        d.push_str(&r1(p[0]));
        d.push(' ');
        d.push_str(&r1(p[1]));
    }
    if close {
        d.push('Z');
    }
    d
}

/// Page-pixel polyline, dropping points closer than 0.3 px to the last one kept.
pub(super) fn page_line(view: &View, pts: &[[f64; 2]]) -> Vec<[f64; 2]> {
    let mut out: Vec<[f64; 2]> = Vec::with_capacity(pts.len());
    for p in pts {
        let q = view.px(*p);
        match out.last() {
            Some(l) if (l[0] - q[0]).hypot(l[1] - q[1]) < 0.3 => {}
            _ => out.push(q),
        }
    }
    if let (Some(first), Some(last)) = (pts.first(), pts.last()) {
        // Keep the true end point, so closed rings stay closed.
        let q = view.px(*last);
        if out.len() > 1 && first == last {
            if let Some(l) = out.last_mut() {
                *l = q;
            }
        }
    }
    out
}

pub(super) fn polygon_data(view: &View, poly: &Polygon<f64>) -> String {
    let mut d = String::new();
    let ring = |ls: &geo::LineString<f64>| -> Vec<[f64; 2]> {
        ls.0.iter().map(|c| view.px([c.x, c.y])).collect()
    };
    d.push_str(&path_data(&ring(poly.exterior()), true));
    for i in poly.interiors() {
        d.push_str(&path_data(&ring(i), true));
    }
    d
}

pub(super) fn multipolygon_data(view: &View, mp: &MultiPolygon<f64>) -> String {
    mp.0.iter().map(|p| polygon_data(view, p)).collect()
}

/// Clip the infinite line through `a`, `b` to the box (Liang–Barsky); `None` if it misses.
pub(super) fn clip_line(a: [f64; 2], b: [f64; 2], bx: [f64; 4]) -> Option<([f64; 2], [f64; 2])> {
    let d = [b[0] - a[0], b[1] - a[1]];
    let len = d[0].hypot(d[1]);
    if len <= 0.0 || !len.is_finite() {
        return None;
    }
    let big = 1e3
        * ((bx[2] - bx[0]) + (bx[3] - bx[1]) + (a[0] - bx[0]).abs() + (a[1] - bx[1]).abs())
        / len;
    let (mut t0, mut t1) = (-big, big);
    for (p, q) in [
        (-d[0], a[0] - bx[0]),
        (d[0], bx[2] - a[0]),
        (-d[1], a[1] - bx[1]),
        (d[1], bx[3] - a[1]),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return None;
            }
        } else {
            let r = q / p;
            if p < 0.0 {
                t0 = t0.max(r);
            } else {
                t1 = t1.min(r);
            }
        }
    }
    (t0 < t1).then(|| {
        (
            [a[0] + t0 * d[0], a[1] + t0 * d[1]],
            [a[0] + t1 * d[0], a[1] + t1 * d[1]],
        )
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::map::page::PLAN;

    #[test]
    fn line_clipped_to_a_box() {
        // A horizontal line y = 5 across the box [0, 0, 10, 10].
        let (a, b) =
            clip_line([-100.0, 5.0], [300.0, 5.0], [0.0, 0.0, 10.0, 10.0]).unwrap_or_default();
        let near = |p: [f64; 2], q: [f64; 2]| (p[0] - q[0]).hypot(p[1] - q[1]) < 1e-9;
        assert!(near(a, [0.0, 5.0]) && near(b, [10.0, 5.0]), "{a:?} {b:?}");
        // A diagonal through the corners.
        let (a, b) =
            clip_line([-3.0, -3.0], [1.0, 1.0], [0.0, 0.0, 10.0, 10.0]).unwrap_or_default();
        assert!(near(a, [0.0, 0.0]) && near(b, [10.0, 10.0]), "{a:?} {b:?}");
        // A line that misses.
        assert!(clip_line([0.0, 20.0], [1.0, 20.0], [0.0, 0.0, 10.0, 10.0]).is_none());
    }

    #[test]
    fn view_flips_y_so_north_is_up() {
        let v = View::fit([0.0, 0.0, 100.0, 100.0], PLAN);
        let south = v.px([50.0, 0.0]);
        let north = v.px([50.0, 100.0]);
        assert!(north[1] < south[1], "north must be higher on the page");
        let back = v.site(north);
        assert!((back[0] - 50.0).abs() < 1e-9 && (back[1] - 100.0).abs() < 1e-9);
    }
}
