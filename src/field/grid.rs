//! A regular grid of water levels over the part of the site that matters, for maps and contours.
//!
//! # Which area the grid covers
//!
//! 1. The *feature box*: the bounding box of every excavation outline, well, placement path,
//!    neighbour footprint, keep-out zone and named check point.
//! 2. With `L` the longer side of that box (at least 10 m), the box grows on every side by the
//!    margin `m = max(30 m, 0.4·L)`, capped at `max(30 m, R)` where `R` is the radius of
//!    influence (or the leakage factor of a leaky aquifer) used for superposition. The cap keeps
//!    the map on the ground the wells change; the full radius of influence of a deep shaft can
//!    be several hundred metres and would shrink the excavation to a dot.
//! 3. A straight boundary (river edge, cut-off wall) closer to the feature box than `2·m` is
//!    brought into view: the grid grows to hold the foot of the perpendicular from the feature
//!    box's centre to the boundary line, plus `0.15·m` beyond it, so the map shows the line and
//!    a strip of the far side.
//!
//! # Nodes
//!
//! By default the grid has about 40 000 nodes (200 × 200 on a square area), spaced equally in x
//! and y; a long thin area (a trench) gets more nodes along its length, up to
//! [`MAX_NODES_PER_SIDE`]. Levels come from [`crate::field::influence::Field::levels`] (parallel). A node pumped dry
//! ([`Level::Dry`]) takes the aquifer base level and is flagged in [`LevelGrid::dry`].
//!
//! # The aquifer side of boundaries
//!
//! Image wells make the field symmetric (barrier) or antisymmetric (constant head) about a
//! boundary; past the line the numbers describe no real ground. [`LevelGrid::aquifer_area`] is
//! the grid rectangle cut by every boundary to the side the excavations are on, for clipping
//! contours and shading the far side.

use crate::field::influence::Field;
use crate::field::layout::Placement;
use crate::geometry::{cut_half_plane, foot, side, to_polygon};
use crate::input::model::{MapQuantity, Model};
use crate::physics::potential::Level;
use contour::ContourBuilder;
use geo::{BooleanOps, BoundingRect, LineString, MultiLineString, MultiPolygon, Polygon};

/// Default number of nodes on the grid (about 200 × 200).
pub const DEFAULT_NODES: usize = 40_000;
/// Upper limit on nodes along one side.
pub const MAX_NODES_PER_SIDE: usize = 1_000;
/// Smallest margin around the features, m.
pub const MIN_MARGIN: f64 = 30.0;
/// Margin as a fraction of the longer side of the feature box.
pub const MARGIN_FRACTION: f64 = 0.4;

/// Water levels on a regular grid. Node (i, j) sits at `origin + (i·step, j·step)`, site
/// coordinates (x east, y north, m); arrays are row-major, index `j * nx + i`.
#[derive(Debug, Clone)]
pub struct LevelGrid {
    /// Site coordinates of node (0, 0), m.
    pub origin: [f64; 2],
    /// Node spacing in x and y, m.
    pub step: f64,
    /// Nodes along x.
    pub nx: usize,
    /// Nodes along y.
    pub ny: usize,
    /// Water level at each node, m above datum (aquifer base where dry).
    pub levels: Vec<f64>,
    /// Node pumped dry (no saturated thickness left).
    pub dry: Vec<bool>,
    /// Groundwater level before pumping, m.
    pub initial_level: f64,
    /// Aquifer base level, m.
    pub base_level: f64,
    /// Boundary lines, kept to tell the aquifer side from the far side.
    boundaries: Vec<[[f64; 2]; 2]>,
    /// A point on the aquifer side (centre of the excavations).
    inside: [f64; 2],
    /// Contour interval from `[output] contour_interval`, m.
    pub interval: Option<f64>,
    /// Metres per display length unit (1, or 0.3048 for US output), for round contour steps.
    pub unit: f64,
}

/// Axis-aligned box [xmin, ymin, xmax, ymax].
pub type Bounds = [f64; 4];

fn grow(b: &mut Bounds, p: [f64; 2]) {
    if p[0].is_finite() && p[1].is_finite() {
        b[0] = b[0].min(p[0]);
        b[1] = b[1].min(p[1]);
        b[2] = b[2].max(p[0]);
        b[3] = b[3].max(p[1]);
    }
}

fn grow_polygon(b: &mut Bounds, poly: &Polygon<f64>) {
    if let Some(r) = poly.bounding_rect() {
        grow(b, [r.min().x, r.min().y]);
        grow(b, [r.max().x, r.max().y]);
    }
}

/// What a grid of levels is computed from: the model, the field of the wells and their placement
/// (the check stage hands these over from its evaluated run).
#[derive(Clone, Copy)]
pub struct GridSource<'a> {
    /// The validated model.
    pub model: &'a Model,
    /// The superposition field of the wells.
    pub field: &'a Field,
    /// The wells (and the paths they were placed on).
    pub placement: &'a Placement,
}

/// The feature box (step 1 of the module rule).
pub fn feature_bounds(run: &GridSource) -> Bounds {
    let model = run.model;
    let mut b = [
        f64::INFINITY,
        f64::INFINITY,
        f64::NEG_INFINITY,
        f64::NEG_INFINITY,
    ];
    for e in &model.excavations {
        grow_polygon(&mut b, &e.outline);
    }
    for n in &model.neighbours {
        grow_polygon(&mut b, &n.footprint);
    }
    for k in &model.keep_outs {
        grow_polygon(&mut b, &k.polygon);
    }
    for w in &run.placement.wells {
        grow(&mut b, w.position);
    }
    for p in run.placement.paths.iter().flatten() {
        grow(&mut b, *p);
    }
    for (_, p, _) in &model.checks.points {
        grow(&mut b, *p);
    }
    if !b[0].is_finite() {
        b = [-10.0, -10.0, 10.0, 10.0];
    }
    b
}

/// Distance from `p` to the box `b` (0 inside).
fn distance_to_box(p: [f64; 2], b: &Bounds) -> f64 {
    let dx = (b[0] - p[0]).max(p[0] - b[2]).max(0.0);
    let dy = (b[1] - p[1]).max(p[1] - b[3]).max(0.0);
    dx.hypot(dy)
}

/// The margin for a feature box with longer side `extent` and radius of influence `radius`.
pub fn margin(extent: f64, radius: f64) -> f64 {
    let m = MIN_MARGIN.max(MARGIN_FRACTION * extent.max(10.0));
    let cap = if radius.is_finite() {
        MIN_MARGIN.max(radius)
    } else {
        m
    };
    m.min(cap)
}

/// Drawdown the default map reaches out to, m (the 0.5 m contour; common practice (no source):
/// the edge of the cone people ask about for neighbours and services).
pub const REACH_DRAWDOWN: f64 = 0.5;

/// How far beyond the feature box `f` the drawdown stays above [`REACH_DRAWDOWN`], m: the
/// largest such distance over 16 directions from the box centre, sampled in 1/60 of the radius
/// of influence, and never beyond that radius.
pub fn reach_margin(run: &GridSource, f: &Bounds) -> f64 {
    let r = run.field.radius_of_influence();
    if !r.is_finite() || r <= 0.0 || run.placement.wells.is_empty() {
        return 0.0;
    }
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    let aq = run.field.aquifer();
    let c = [(f[0] + f[2]) / 2.0, (f[1] + f[3]) / 2.0];
    let (hw, hh) = ((f[2] - f[0]) / 2.0, (f[3] - f[1]) / 2.0);
    let step = r / 60.0;
    let mut best: f64 = 0.0;
    for k in 0..16 {
        let a = k as f64 * std::f64::consts::PI / 8.0;
        let (dx, dy) = (a.cos(), a.sin());
        // Distance from the centre to the box edge in this direction.
        let to_edge = (if dx.abs() > 1e-12 {
            hw / dx.abs()
        } else {
            f64::INFINITY
        })
        .min(if dy.abs() > 1e-12 {
            hh / dy.abs()
        } else {
            f64::INFINITY
        });
        let mut d = step;
        while d <= r {
            let p = [c[0] + (to_edge + d) * dx, c[1] + (to_edge + d) * dy];
            let z = run.field.level(p, &rates).or_base(aq.base_level);
            if aq.initial_level - z < REACH_DRAWDOWN {
                break;
            }
            d += step;
        }
        best = best.max(d.min(r));
    }
    best
}

/// The area the map covers, by the rule in the module notes.
pub fn map_bounds(run: &GridSource) -> Bounds {
    let f = feature_bounds(run);
    let extent = (f[2] - f[0]).max(f[3] - f[1]);
    let m = match run.model.output.map_extent {
        Some(e) => e,
        None => margin(extent, run.field.radius_of_influence()).max(reach_margin(run, &f)),
    };
    let mut b = [f[0] - m, f[1] - m, f[2] + m, f[3] + m];
    let centre = [(f[0] + f[2]) / 2.0, (f[1] + f[3]) / 2.0];
    for bd in &run.model.boundaries {
        let ft = foot(centre, bd.line[0], bd.line[1]);
        if distance_to_box(ft, &f) < 2.0 * m {
            let (dx, dy) = (ft[0] - centre[0], ft[1] - centre[1]);
            let d = dx.hypot(dy);
            let beyond = if d > 0.0 {
                let k = (d + 0.15 * m) / d;
                [centre[0] + dx * k, centre[1] + dy * k]
            } else {
                ft
            };
            grow(&mut b, beyond);
        }
    }
    b
}

/// A point on the aquifer side: the mean of the excavation centroids.
fn inside_point(model: &Model) -> [f64; 2] {
    use geo::Centroid;
    let cs: Vec<[f64; 2]> = model
        .excavations
        .iter()
        .filter_map(|e| e.outline.centroid().map(|c| [c.x(), c.y()]))
        .collect();
    if cs.is_empty() {
        return [0.0, 0.0];
    }
    let n = cs.len() as f64;
    [
        cs.iter().map(|c| c[0]).sum::<f64>() / n,
        cs.iter().map(|c| c[1]).sum::<f64>() / n,
    ]
}

impl LevelGrid {
    /// The grid for a run: about [`DEFAULT_NODES`] nodes over [`map_bounds`].
    pub fn for_run(run: &GridSource) -> LevelGrid {
        LevelGrid::with_nodes(run, DEFAULT_NODES)
    }

    /// The grid for a run with about `nodes` nodes over [`map_bounds`].
    pub fn with_nodes(run: &GridSource, nodes: usize) -> LevelGrid {
        let b = map_bounds(run);
        let (w, h) = ((b[2] - b[0]).max(1e-3), (b[3] - b[1]).max(1e-3));
        let nodes = nodes.max(16) as f64;
        let mut step = (w * h / nodes).sqrt();
        let longest = w.max(h);
        if longest / step > (MAX_NODES_PER_SIDE - 1) as f64 {
            step = longest / (MAX_NODES_PER_SIDE - 1) as f64;
        }
        let nx = ((w / step).ceil() as usize + 1).clamp(4, MAX_NODES_PER_SIDE);
        let ny = ((h / step).ceil() as usize + 1).clamp(4, MAX_NODES_PER_SIDE);
        // Centre the nodes on the box.
        let origin = [
            (b[0] + b[2]) / 2.0 - step * (nx - 1) as f64 / 2.0,
            (b[1] + b[3]) / 2.0 - step * (ny - 1) as f64 / 2.0,
        ];
        LevelGrid::compute(run, origin, step, nx, ny)
    }

    /// Levels at the nodes of the given grid for a run.
    pub fn compute(
        run: &GridSource,
        origin: [f64; 2],
        step: f64,
        nx: usize,
        ny: usize,
    ) -> LevelGrid {
        let aq = run.field.aquifer();
        let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
        let points: Vec<[f64; 2]> = (0..ny)
            .flat_map(|j| {
                (0..nx).map(move |i| [origin[0] + i as f64 * step, origin[1] + j as f64 * step])
            })
            .collect();
        let raw = run.field.levels(&points, &rates);
        let dry: Vec<bool> = raw.iter().map(|l| *l == Level::Dry).collect();
        let levels: Vec<f64> = raw.iter().map(|l| l.or_base(aq.base_level)).collect();
        LevelGrid {
            origin,
            step,
            nx,
            ny,
            levels,
            dry,
            initial_level: aq.initial_level,
            base_level: aq.base_level,
            boundaries: run.model.boundaries.iter().map(|b| b.line).collect(),
            inside: inside_point(run.model),
            interval: run.model.output.contour_interval,
            unit: run.model.units.length(1.0).recip(),
        }
    }

    /// Site coordinates of node (i, j).
    pub fn node(&self, i: usize, j: usize) -> [f64; 2] {
        [
            self.origin[0] + i as f64 * self.step,
            self.origin[1] + j as f64 * self.step,
        ]
    }

    /// The rectangle the nodes span, [xmin, ymin, xmax, ymax].
    pub fn bounds(&self) -> Bounds {
        [
            self.origin[0],
            self.origin[1],
            self.origin[0] + (self.nx - 1) as f64 * self.step,
            self.origin[1] + (self.ny - 1) as f64 * self.step,
        ]
    }

    /// Drawdown at each node, m (initial level − level).
    pub fn drawdowns(&self) -> Vec<f64> {
        self.levels.iter().map(|z| self.initial_level - z).collect()
    }

    /// The mapped quantity at each node: drawdown (m) or water level (m above datum).
    pub fn values(&self, quantity: MapQuantity) -> Vec<f64> {
        match quantity {
            MapQuantity::Drawdown => self.drawdowns(),
            MapQuantity::WaterLevel => self.levels.clone(),
        }
    }

    /// Number of nodes pumped dry.
    pub fn dry_count(&self) -> usize {
        self.dry.iter().filter(|d| **d).count()
    }

    /// Whether a site point is on the aquifer side of every boundary.
    pub fn on_aquifer_side(&self, p: [f64; 2]) -> bool {
        self.boundaries.iter().all(|l| {
            let want = side(self.inside, l[0], l[1]);
            want == 0.0 || side(p, l[0], l[1]) != -want
        })
    }

    /// Aquifer side of each node (false past a boundary line).
    pub fn inside_mask(&self) -> Vec<bool> {
        (0..self.ny)
            .flat_map(|j| (0..self.nx).map(move |i| (i, j)))
            .map(|(i, j)| self.on_aquifer_side(self.node(i, j)))
            .collect()
    }

    /// The grid rectangle cut by every boundary to the aquifer side: where the map's numbers
    /// describe real ground.
    pub fn aquifer_area(&self) -> Polygon<f64> {
        let b = self.bounds();
        let mut ring = vec![[b[0], b[1]], [b[2], b[1]], [b[2], b[3]], [b[0], b[3]]];
        for l in &self.boundaries {
            let keep = side(self.inside, l[0], l[1]);
            if keep != 0.0 {
                ring = cut_half_plane(&ring, l[0], l[1], keep);
            }
        }
        to_polygon(&ring)
    }

    /// For each boundary, the part of the grid rectangle past it (may be empty).
    pub fn far_sides(&self) -> Vec<Polygon<f64>> {
        let b = self.bounds();
        let rect = vec![[b[0], b[1]], [b[2], b[1]], [b[2], b[3]], [b[0], b[3]]];
        self.boundaries
            .iter()
            .map(|l| {
                let keep = side(self.inside, l[0], l[1]);
                if keep == 0.0 {
                    return to_polygon(&[]);
                }
                let ring = cut_half_plane(&rect, l[0], l[1], -keep);
                if ring.len() < 3 {
                    to_polygon(&[])
                } else {
                    to_polygon(&ring)
                }
            })
            .collect()
    }
}

/// Candidate contour intervals within one decade.
const NICE_STEPS: [f64; 4] = [1.0, 2.0, 2.5, 5.0];
/// The number of contour lines the interval aims at.
const TARGET_LINES: usize = 11;

/// The multiples of `interval` strictly between `lo` and `hi`, leaving out `skip` (the
/// undisturbed value: drawdown 0 or the initial level, which only traces the edge of
/// influence).
pub fn thresholds(lo: f64, hi: f64, interval: f64, skip: f64) -> Vec<f64> {
    if interval.is_nan() || interval <= 0.0 || !lo.is_finite() || !hi.is_finite() || hi <= lo {
        return Vec::new();
    }
    let first = (lo / interval).floor() as i64;
    let last = (hi / interval).ceil() as i64;
    if last - first > 10_000 {
        return Vec::new();
    }
    (first..=last)
        .map(|k| k as f64 * interval)
        .map(|v| (v * 1e9).round() / 1e9)
        .filter(|v| *v > lo && *v < hi && (v - skip).abs() > 1e-9 * interval.max(1.0))
        .collect()
}

/// A "nice" contour interval (1, 2, 2.5 or 5 × 10ᵏ m) giving 8–15 lines between `lo` and
/// `hi`, as near `TARGET_LINES` as the steps allow.
pub fn nice_interval(lo: f64, hi: f64, skip: f64) -> f64 {
    let span = hi - lo;
    if span.is_nan() || span <= 0.0 || !span.is_finite() {
        return 1.0;
    }
    let decade = (span / TARGET_LINES as f64).log10().floor() as i32;
    let mut best: Option<(usize, f64)> = None;
    for e in (decade - 1)..=(decade + 1) {
        for m in NICE_STEPS {
            let interval = m * 10f64.powi(e);
            let n = thresholds(lo, hi, interval, skip).len();
            if n == 0 {
                continue;
            }
            let off = n.abs_diff(TARGET_LINES) + if (8..=15).contains(&n) { 0 } else { 100 };
            // On a tie keep the larger interval (fewer, rounder numbers).
            if best.is_none_or(|(b, bi)| off < b || (off == b && interval > bi)) {
                best = Some((off, interval));
            }
        }
    }
    best.map_or(1.0, |(_, i)| i)
}

/// One contour value and its lines (site coordinates).
#[derive(Debug, Clone)]
pub struct ContourLine {
    /// The contoured value: drawdown (m) or water level (m above datum).
    pub value: f64,
    /// Polylines; a closed ring repeats its first point at the end.
    pub parts: Vec<Vec<[f64; 2]>>,
}

/// Contour lines of one quantity over a grid.
#[derive(Debug, Clone)]
pub struct ContourSet {
    /// What is contoured.
    pub quantity: MapQuantity,
    /// Interval between lines, m.
    pub interval: f64,
    /// Lowest and highest value on the aquifer side of the grid.
    pub range: [f64; 2],
    /// The value before pumping (drawdown 0, or the initial level).
    pub undisturbed: f64,
    /// Lines, one entry per value that has any.
    pub lines: Vec<ContourLine>,
}

impl ContourSet {
    /// Drawdown equivalent of a mapped value: how far the water stands below its level before
    /// pumping (negative where recharge raises it).
    pub fn drawdown_of(&self, v: f64) -> f64 {
        match self.quantity {
            MapQuantity::Drawdown => v - self.undisturbed,
            MapQuantity::WaterLevel => self.undisturbed - v,
        }
    }

    /// Largest drawdown (≥ 0) and largest rise (≥ 0) over the range.
    pub fn extremes(&self) -> (f64, f64) {
        let a = self.drawdown_of(self.range[0]);
        let b = self.drawdown_of(self.range[1]);
        (a.max(b).max(0.0), (-a.min(b)).max(0.0))
    }
}

/// Split a ring from the contour builder at every point on the grid's outer frame, so lines
/// that leave the grid stay open instead of running round its edge.
fn split_at_frame(ring: &[[f64; 2]], frame: &Bounds, tol: f64) -> Vec<Vec<[f64; 2]>> {
    let on_frame = |p: &[f64; 2]| {
        (p[0] - frame[0]).abs() < tol
            || (p[0] - frame[2]).abs() < tol
            || (p[1] - frame[1]).abs() < tol
            || (p[1] - frame[3]).abs() < tol
    };
    let mut pts: Vec<[f64; 2]> = ring.to_vec();
    if pts.len() > 1 && pts.first() == pts.last() {
        pts.pop();
    }
    let n = pts.len();
    if n < 2 {
        return Vec::new();
    }
    let Some(start) = pts.iter().position(on_frame) else {
        let mut closed = pts;
        closed.push(closed[0]);
        return vec![closed];
    };
    let mut out = Vec::new();
    let mut cur: Vec<[f64; 2]> = Vec::new();
    for k in 1..=n {
        let p = pts[(start + k) % n];
        if on_frame(&p) {
            if cur.len() >= 2 {
                out.push(std::mem::take(&mut cur));
            } else {
                cur.clear();
            }
        } else {
            cur.push(p);
        }
    }
    if cur.len() >= 2 {
        out.push(cur);
    }
    out
}

impl LevelGrid {
    /// A contour builder for this grid: node (i, j) at `origin + (i, j)·step`.
    fn builder(&self) -> ContourBuilder {
        ContourBuilder::new(self.nx, self.ny, true)
            .x_origin(self.origin[0] - self.step / 2.0)
            .y_origin(self.origin[1] - self.step / 2.0)
            .x_step(self.step)
            .y_step(self.step)
    }

    /// The outer frame of the contour builder's rings (half a step outside the nodes).
    fn frame(&self) -> Bounds {
        let h = self.step;
        [
            self.origin[0] - h / 2.0,
            self.origin[1] - h / 2.0,
            self.origin[0] - h / 2.0 + self.nx as f64 * h,
            self.origin[1] - h / 2.0 + self.ny as f64 * h,
        ]
    }

    /// The undisturbed value of a quantity (drawdown 0, or the initial level).
    pub fn undisturbed(&self, quantity: MapQuantity) -> f64 {
        match quantity {
            MapQuantity::Drawdown => 0.0,
            MapQuantity::WaterLevel => self.initial_level,
        }
    }

    /// Lowest and highest of `values` on the aquifer side of every boundary.
    pub fn value_range(&self, values: &[f64]) -> Option<[f64; 2]> {
        let mask = self.inside_mask();
        let mut lo = f64::INFINITY;
        let mut hi = f64::NEG_INFINITY;
        for (v, inside) in values.iter().zip(mask) {
            if inside && v.is_finite() {
                lo = lo.min(*v);
                hi = hi.max(*v);
            }
        }
        (lo <= hi).then_some([lo, hi])
    }

    /// Contour lines of `quantity` at a nice interval ([`nice_interval`]), open where they leave
    /// the grid and clipped to the aquifer side of every boundary.
    pub fn contours(&self, quantity: MapQuantity) -> ContourSet {
        let values = self.values(quantity);
        let skip = self.undisturbed(quantity);
        let Some(range) = self.value_range(&values) else {
            return ContourSet {
                quantity,
                interval: 1.0,
                range: [skip, skip],
                undisturbed: skip,
                lines: Vec::new(),
            };
        };
        let interval = self.interval.unwrap_or_else(|| {
            // Round steps in the unit people read: feet for US output.
            let u = self.unit;
            u * nice_interval(range[0] / u, range[1] / u, skip / u)
        });
        let levels = thresholds(range[0], range[1], interval, skip);
        let lines = self.lines_at(&values, &levels);
        ContourSet {
            quantity,
            interval,
            range,
            undisturbed: skip,
            lines,
        }
    }

    /// Contour lines of `values` (row-major, one per node) at the given levels.
    pub fn lines_at(&self, values: &[f64], levels: &[f64]) -> Vec<ContourLine> {
        let Ok(raw) = self.builder().lines(values, levels) else {
            return Vec::new();
        };
        let frame = self.frame();
        let tol = self.step * 1e-6;
        let area = (!self.boundaries.is_empty()).then(|| self.aquifer_area());
        raw.into_iter()
            .filter_map(|line| {
                let value = line.threshold();
                let mut parts: Vec<Vec<[f64; 2]>> = line
                    .geometry()
                    .0
                    .iter()
                    .flat_map(|ls| {
                        let ring: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
                        split_at_frame(&ring, &frame, tol)
                    })
                    .collect();
                if let Some(area) = &area {
                    let mls = MultiLineString::new(
                        parts
                            .iter()
                            .map(|p| {
                                LineString::from(p.iter().map(|q| (q[0], q[1])).collect::<Vec<_>>())
                            })
                            .collect(),
                    );
                    parts = area
                        .clip(&mls, false)
                        .0
                        .into_iter()
                        .map(|ls| ls.0.into_iter().map(|c| [c.x, c.y]).collect::<Vec<_>>())
                        .filter(|p: &Vec<[f64; 2]>| p.len() >= 2)
                        .collect();
                }
                (!parts.is_empty()).then_some(ContourLine { value, parts })
            })
            .collect()
    }

    /// Filled bands between consecutive `levels` (plus one below and one above), each with its
    /// lower and upper value. Polygons reach half a step past the nodes: clip them to
    /// [`LevelGrid::bounds`] when drawing.
    pub fn bands(&self, values: &[f64], levels: &[f64]) -> Vec<(f64, f64, MultiPolygon<f64>)> {
        let Some(range) = self.value_range(values) else {
            return Vec::new();
        };
        let mut t = Vec::with_capacity(levels.len() + 2);
        let pad = (range[1] - range[0]).abs().max(1.0);
        t.push(range[0].min(values.iter().copied().fold(f64::INFINITY, f64::min)) - pad);
        t.extend_from_slice(levels);
        t.push(range[1].max(values.iter().copied().fold(f64::NEG_INFINITY, f64::max)) + pad);
        match self.builder().isobands(values, &t) {
            Ok(bands) => bands
                .into_iter()
                .map(|b| {
                    let (lo, hi) = (b.min_v(), b.max_v());
                    (lo, hi, b.into_inner().0)
                })
                .filter(|b| !b.2 .0.is_empty())
                .collect(),
            Err(_) => Vec::new(),
        }
    }

    /// Where the grid is pumped dry, as polygons (empty when nowhere).
    pub fn dry_area(&self) -> MultiPolygon<f64> {
        if self.dry_count() == 0 {
            return MultiPolygon::new(Vec::new());
        }
        let v: Vec<f64> = self
            .dry
            .iter()
            .map(|d| if *d { 1.0 } else { 0.0 })
            .collect();
        match self.builder().contours(&v, &[0.5]) {
            Ok(mut c) if !c.is_empty() => c.swap_remove(0).into_inner().0,
            _ => MultiPolygon::new(Vec::new()),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn nice_interval_gives_eight_to_fifteen_lines() {
        for (lo, hi) in [
            (0.0, 4.1),
            (0.05, 14.3),
            (2.0, 17.5),
            (-0.2, 0.9),
            (0.0, 37.0),
        ] {
            let i = nice_interval(lo, hi, 0.0);
            let n = thresholds(lo, hi, i, 0.0).len();
            assert!(
                (8..=15).contains(&n),
                "{lo}..{hi}: interval {i} gives {n} lines"
            );
            let mant = i / 10f64.powf(i.log10().floor());
            assert!(
                NICE_STEPS.iter().any(|m| (m - mant).abs() < 1e-9),
                "{i} is not 1, 2, 2.5 or 5 × 10^k"
            );
        }
    }

    #[test]
    fn thresholds_skip_the_undisturbed_value() {
        let t = thresholds(-0.3, 1.1, 0.5, 0.0);
        assert_eq!(t, vec![0.5, 1.0]);
        let t = thresholds(14.0, 18.0, 1.0, 17.0);
        assert_eq!(t, vec![15.0, 16.0]);
    }

    #[test]
    fn ring_split_at_frame() {
        let frame = [0.0, 0.0, 10.0, 10.0];
        // A ring that runs along the left edge between (0, 2) and (0, 8).
        let ring = vec![
            [0.0, 2.0],
            [3.0, 2.0],
            [4.0, 5.0],
            [3.0, 8.0],
            [0.0, 8.0],
            [0.0, 5.0],
            [0.0, 2.0],
        ];
        let parts = split_at_frame(&ring, &frame, 1e-9);
        assert_eq!(parts, vec![vec![[3.0, 2.0], [4.0, 5.0], [3.0, 8.0]]]);
        // A ring clear of the frame stays closed.
        let ring = vec![[2.0, 2.0], [4.0, 2.0], [3.0, 4.0], [2.0, 2.0]];
        let parts = split_at_frame(&ring, &frame, 1e-9);
        assert_eq!(parts.len(), 1);
        assert_eq!(parts[0].first(), parts[0].last());
        assert_eq!(parts[0].len(), 4);
    }

    #[test]
    fn margin_rule() {
        // Small site: the 30 m floor.
        assert_eq!(margin(20.0, 400.0), 30.0);
        // Larger site: 40 % of the extent.
        assert!((margin(100.0, 400.0) - 40.0).abs() < 1e-12);
        // Capped by the radius of influence, but never below 30 m.
        assert!((margin(400.0, 33.0) - 33.0).abs() < 1e-12);
        assert_eq!(margin(400.0, 5.0), 30.0);
    }

    #[test]
    fn half_plane_cut_of_a_square() {
        let sq = vec![[0.0, 0.0], [10.0, 0.0], [10.0, 10.0], [0.0, 10.0]];
        // Keep the part above y = 4 (left of a line running east).
        let cut = cut_half_plane(&sq, [-5.0, 4.0], [20.0, 4.0], 1.0);
        let area = geo::Area::unsigned_area(&to_polygon(&cut));
        assert!((area - 60.0).abs() < 1e-9, "{area}");
        let below = cut_half_plane(&sq, [-5.0, 4.0], [20.0, 4.0], -1.0);
        let area = geo::Area::unsigned_area(&to_polygon(&below));
        assert!((area - 40.0).abs() < 1e-9, "{area}");
    }
}
