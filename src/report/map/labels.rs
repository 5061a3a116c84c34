//! Keeping labels apart: the boxes already taken on the page (hard, or soft for failed check
//! points), reserving the symbols and outlines before any label is placed, placing a label box
//! at the first free candidate, candidate spots inside or beside a polygon, and the extent of a
//! rotated label.

use crate::check::run::CheckRun;
use crate::report::map::symbols::{cross_size, well_radius};
use crate::report::map::view::View;
use geo::{Centroid, Polygon};

/// Axis-aligned boxes already taken by labels and symbols: [x0, y0, x1, y1], px. `soft` boxes
/// (failed check points) keep every label off except an excavation's own name, which may sit
/// over them on its white ground.
#[derive(Default)]
pub(super) struct Occupied {
    hard: Vec<[f64; 4]>,
    soft: Vec<[f64; 4]>,
}

fn overlaps(b: [f64; 4], o: &[f64; 4]) -> bool {
    !(b[2] <= o[0] || b[0] >= o[2] || b[3] <= o[1] || b[1] >= o[3])
}

impl Occupied {
    pub(super) fn free(&self, b: [f64; 4]) -> bool {
        !self.hard.iter().chain(&self.soft).any(|o| overlaps(b, o))
    }
    pub(super) fn free_of_hard(&self, b: [f64; 4]) -> bool {
        !self.hard.iter().any(|o| overlaps(b, o))
    }
    pub(super) fn take(&mut self, b: [f64; 4]) {
        self.hard.push(b);
    }
    pub(super) fn take_soft(&mut self, b: [f64; 4]) {
        self.soft.push(b);
    }
}

pub(super) fn inside(b: [f64; 4], area: [f64; 4]) -> bool {
    b[0] >= area[0] && b[1] >= area[1] && b[2] <= area[2] && b[3] <= area[3]
}

/// Mark what labels must keep clear of, before any label is placed: well symbols, failed
/// check points, and the outlines of excavations, neighbours and keep-out zones (cut-off walls:
/// [`crate::report::map::walls::reserve_walls`]).
pub(super) fn reserve(run: &CheckRun, view: &View, occ: &mut Occupied) {
    let r = well_radius(run, view);
    for w in &run.placement.wells {
        let p = view.px(w.position);
        occ.take([
            p[0] - r - 1.0,
            p[1] - r - 1.0,
            p[0] + r + 1.0,
            p[1] + r + 1.0,
        ]);
    }
    let a = cross_size(run, view);
    for p in run
        .evaluation
        .points
        .iter()
        .filter(|p| p.met == Some(false))
    {
        let q = view.px(p.point.position);
        occ.take_soft([q[0] - a, q[1] - a, q[0] + a, q[1] + a]);
    }
    let model = run.model;
    let outlines = model
        .excavations
        .iter()
        .map(|e| &e.outline)
        .chain(model.neighbours.iter().map(|n| &n.footprint))
        .chain(model.keep_outs.iter().map(|k| &k.polygon));
    for poly in outlines {
        for seg in poly.exterior().0.windows(2) {
            reserve_segment(view, occ, [seg[0].x, seg[0].y], [seg[1].x, seg[1].y], 1.5);
        }
    }
}

/// Keep labels off the line from `a` to `b` (site coordinates): boxes of ± `half` px every 5 px
/// or closer along it.
pub(super) fn reserve_segment(
    view: &View,
    occ: &mut Occupied,
    a: [f64; 2],
    b: [f64; 2],
    half: f64,
) {
    let (a, b) = (view.px(a), view.px(b));
    let len = (b[0] - a[0]).hypot(b[1] - a[1]);
    let n = (len / 5.0).ceil().max(1.0) as usize;
    for k in 0..=n {
        let t = k as f64 / n as f64;
        let p = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
        occ.take([p[0] - half, p[1] - half, p[0] + half, p[1] + half]);
    }
}

/// Place a label box of size (w, h) at the first free candidate centre; returns the centre.
pub(super) fn place(
    occ: &mut Occupied,
    area: [f64; 4],
    w: f64,
    h: f64,
    candidates: &[[f64; 2]],
) -> Option<[f64; 2]> {
    place_with(occ, area, w, h, candidates, false)
}

/// As [`place`]; with `over_soft`, the label may cover soft boxes (failed check points).
pub(super) fn place_with(
    occ: &mut Occupied,
    area: [f64; 4],
    w: f64,
    h: f64,
    candidates: &[[f64; 2]],
    over_soft: bool,
) -> Option<[f64; 2]> {
    for c in candidates {
        let b = [
            c[0] - w / 2.0,
            c[1] - h / 2.0,
            c[0] + w / 2.0,
            c[1] + h / 2.0,
        ];
        let free = if over_soft {
            occ.free_of_hard(b)
        } else {
            occ.free(b)
        };
        if inside(b, area) && free {
            occ.take(b);
            return Some(*c);
        }
    }
    None
}

pub(super) fn poly_label_candidates(view: &View, poly: &Polygon<f64>, h: f64) -> Vec<[f64; 2]> {
    use geo::{BoundingRect, Contains};
    let mut c = Vec::new();
    let home = crate::field::checkpoints::inside_point(poly);
    if let Some(p) = home {
        c.push(view.px(p));
    }
    if let Some(p) = poly.centroid() {
        c.push(view.px([p.x(), p.y()]));
    }
    if let Some(r) = poly.bounding_rect() {
        // Other places inside the outline, nearest the interior point first.
        let mut inner: Vec<[f64; 2]> = Vec::new();
        for i in 1..8 {
            for j in 1..8 {
                let p = [
                    r.min().x + r.width() * i as f64 / 8.0,
                    r.min().y + r.height() * j as f64 / 8.0,
                ];
                if poly.contains(&geo::Point::new(p[0], p[1])) {
                    inner.push(p);
                }
            }
        }
        let h0 = home.unwrap_or([r.center().x, r.center().y]);
        inner.sort_by(|a, b| {
            let da = (a[0] - h0[0]).hypot(a[1] - h0[1]);
            let db = (b[0] - h0[0]).hypot(b[1] - h0[1]);
            da.total_cmp(&db)
        });
        c.extend(inner.into_iter().map(|p| view.px(p)));
        let top = view.px([(r.min().x + r.max().x) / 2.0, r.max().y]);
        let bottom = view.px([(r.min().x + r.max().x) / 2.0, r.min().y]);
        for gap in [4.0, 18.0, 34.0, 52.0] {
            c.push([top[0], top[1] - h / 2.0 - gap]);
            c.push([bottom[0], bottom[1] + h / 2.0 + gap]);
        }
        // Beside the outline, then further out: a neighbour's name is never left off for want
        // of room next to the pit's own labels.
        let left = view.px([r.min().x, (r.min().y + r.max().y) / 2.0]);
        let right = view.px([r.max().x, (r.min().y + r.max().y) / 2.0]);
        for gap in [60.0, 90.0, 130.0] {
            c.push([right[0] + gap, right[1]]);
            c.push([left[0] - gap, left[1]]);
        }
        for gap in [76.0, 104.0] {
            c.push([top[0], top[1] - h / 2.0 - gap]);
            c.push([bottom[0], bottom[1] + h / 2.0 + gap]);
        }
    }
    c
}

pub(super) fn rotated_half_extent(w: f64, h: f64, angle_deg: f64) -> (f64, f64) {
    let (s, c) = angle_deg.to_radians().sin_cos();
    (
        (c.abs() * w + s.abs() * h) / 2.0,
        (s.abs() * w + c.abs() * h) / 2.0,
    )
}
