//! `map.svg`: a plan of the evaluated layout for a design report.
//!
//! Landscape page, 1400 × 1000 px. The plan fills the left part at one scale in x and y (north
//! up); a column on the right holds the legend, the north arrow and scale bar, and the title
//! block; the caution runs along the foot of the page.
//!
//! Layers, bottom to top, each an SVG group with a fixed id (tests rely on the order):
//! `bands` (light fills between contours), `far-side` (ground past a boundary line),
//! `contours`, `paths` (the ring or lines the wells were set out on), `keep-outs`,
//! `neighbours`, `excavations`, `boundaries`, `dry-area`, `wells`, `failed-points`,
//! `excavation-labels`, `contour-labels`, `frame`, `legend`, `scale-bar`, `north-arrow`, `title-block`, `caution`.
//!
//! Site coordinates are turned into page pixels here, in f64, and written rounded to 0.1 px,
//! so projected coordinates (x ≈ 500 000 m) lose nothing in the `svg` crate's f32 storage.

use crate::check::run::CheckRun;
use crate::field::grid::{ContourSet, LevelGrid};
use crate::input::model::MapQuantity;
use crate::physics::images::BoundaryKind;
use crate::report::{thousands, CAUTION};
use geo::{Centroid, InteriorPoint, MultiPolygon, Polygon};
use svg::node::element::{
    ClipPath, Definitions, Group, Line, Path, Pattern, Rectangle, Text, Title,
};
use svg::Document;

/// Page width, px.
pub const PAGE_W: f64 = 1400.0;
/// Page height, px.
pub const PAGE_H: f64 = 1000.0;
/// The area the plan may use: [left, top, right, bottom], px.
const PLAN: [f64; 4] = [64.0, 20.0, 1040.0, 900.0];
/// The right-hand column: [left, right], px.
const PANEL: [f64; 2] = [1064.0, 1380.0];
/// Top of the caution footer, px.
const FOOTER_TOP: f64 = 934.0;

const FONT: &str = "DejaVu Sans, Verdana, Arial, Helvetica, sans-serif";
const INK: &str = "#1e2a33";
const CONTOUR: &str = "#2b5d7d";
const EXCAVATION: &str = "#111111";
const WELL: &str = "#14365a";
const RECHARGE: &str = "#1b8a6b";
const CONSTANT_HEAD: &str = "#2c7fb8";
const BARRIER: &str = "#5b5b5b";
const KEEP_OUT: &str = "#b0452e";
const FAIL: &str = "#d7191c";
const BAND_LOW: [f64; 3] = [250.0, 247.0, 236.0];
const BAND_HIGH: [f64; 3] = [160.0, 192.0, 220.0];
const MOUND: [f64; 3] = [236.0, 200.0, 150.0];

/// How a neighbour stands against its limits, for colouring its footprint.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum NeighbourStatus {
    /// Drawdown and settlement within the allowable values.
    WithinLimits,
    /// Within the limits, but close (the caller decides how close).
    NearLimit,
    /// Over an allowable value.
    OverLimit,
    /// Not assessed (no limits or no soil profile given).
    NotAssessed,
}

impl NeighbourStatus {
    fn fill(self) -> &'static str {
        match self {
            NeighbourStatus::WithinLimits => "#cfe3c4",
            NeighbourStatus::NearLimit => "#f6d58e",
            NeighbourStatus::OverLimit => "#f1a08f",
            NeighbourStatus::NotAssessed => "#e2ddd5",
        }
    }

    fn words(self) -> &'static str {
        match self {
            NeighbourStatus::WithinLimits => "neighbour within its limits",
            NeighbourStatus::NearLimit => "neighbour near a limit",
            NeighbourStatus::OverLimit => "neighbour over a limit",
            NeighbourStatus::NotAssessed => "neighbour not assessed",
        }
    }
}

/// Choices for the map beyond the run itself.
#[derive(Debug, Clone, Default)]
pub struct MapOptions {
    /// One status per neighbour, in the design file's order, to colour their footprints.
    /// `None` (or a list of the wrong length): one neutral colour for all.
    pub neighbour_status: Option<Vec<NeighbourStatus>>,
}

/// The map of a run, contouring the quantity the design file asks for.
pub fn map_svg(run: &CheckRun, grid: &LevelGrid, date: &str) -> String {
    map_svg_with(run, grid, date, &MapOptions::default())
}

/// A number rounded to 0.1, without "-0".
fn r1(v: f64) -> String {
    let r = (v * 10.0).round() / 10.0;
    let r = if r == 0.0 { 0.0 } else { r };
    if r.fract() == 0.0 {
        format!("{r:.0}")
    } else {
        format!("{r:.1}")
    }
}

/// Decimals needed to write multiples of `interval` exactly (at most 4).
pub fn decimals(interval: f64) -> usize {
    (0..=4)
        .find(|d| {
            let m = interval * 10f64.powi(*d as i32);
            (m - m.round()).abs() < 1e-6
        })
        .unwrap_or(4)
}

/// A value with `d` decimals and a typographic minus.
fn signed(v: f64, d: usize) -> String {
    let s = format!("{v:.d$}");
    let zero = s
        .trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.');
    if zero {
        s.trim_start_matches('-').to_string()
    } else {
        s.replace('-', "\u{2212}")
    }
}

/// A rate in L/s with sensible decimals.
fn rate_text(q_m3s: f64) -> String {
    let l = q_m3s * 1e3;
    let d = if l.abs() < 0.1 {
        3
    } else if l.abs() < 1.0 {
        2
    } else {
        1
    };
    format!("{} L/s", signed(l, d))
}

/// Rough width of `text` at `size` px in the sans font, px.
fn text_width(text: &str, size: f64) -> f64 {
    text.chars()
        .map(|c| match c {
            'i' | 'l' | 'j' | '.' | ',' | ':' | ';' | '\'' | '|' | '!' | ' ' | 'I' | 'f' | 't'
            | 'r' => 0.36,
            'm' | 'w' | 'M' | 'W' | '—' => 0.92,
            c if c.is_uppercase() => 0.70,
            c if c.is_ascii_digit() => 0.64,
            _ => 0.60,
        })
        .sum::<f64>()
        * size
}

/// From site metres to page pixels: equal scale in x and y, y up the page = north.
#[derive(Debug, Clone, Copy)]
struct View {
    /// Site x at page x = `left`.
    x0: f64,
    /// Site y at page y = `top`.
    y1: f64,
    /// Pixels per metre.
    scale: f64,
    left: f64,
    top: f64,
}

impl View {
    /// Fit the site box `b` into the page box `area`, centred.
    fn fit(b: [f64; 4], area: [f64; 4]) -> View {
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

    fn px(&self, p: [f64; 2]) -> [f64; 2] {
        [
            self.left + (p[0] - self.x0) * self.scale,
            self.top + (self.y1 - p[1]) * self.scale,
        ]
    }

    fn site(&self, q: [f64; 2]) -> [f64; 2] {
        [
            self.x0 + (q[0] - self.left) / self.scale,
            self.y1 - (q[1] - self.top) / self.scale,
        ]
    }
}

/// SVG path data for a polyline in page pixels.
fn path_data(points: &[[f64; 2]], close: bool) -> String {
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
fn page_line(view: &View, pts: &[[f64; 2]]) -> Vec<[f64; 2]> {
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

fn polygon_data(view: &View, poly: &Polygon<f64>) -> String {
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

fn multipolygon_data(view: &View, mp: &MultiPolygon<f64>) -> String {
    mp.0.iter().map(|p| polygon_data(view, p)).collect()
}

/// Axis-aligned boxes already taken by labels and symbols: [x0, y0, x1, y1], px. `soft` boxes
/// (failed check points) keep every label off except an excavation's own name, which may sit
/// over them on its white ground.
#[derive(Default)]
struct Occupied {
    hard: Vec<[f64; 4]>,
    soft: Vec<[f64; 4]>,
}

fn overlaps(b: [f64; 4], o: &[f64; 4]) -> bool {
    !(b[2] <= o[0] || b[0] >= o[2] || b[3] <= o[1] || b[1] >= o[3])
}

impl Occupied {
    fn free(&self, b: [f64; 4]) -> bool {
        !self.hard.iter().chain(&self.soft).any(|o| overlaps(b, o))
    }
    fn free_of_hard(&self, b: [f64; 4]) -> bool {
        !self.hard.iter().any(|o| overlaps(b, o))
    }
    fn take(&mut self, b: [f64; 4]) {
        self.hard.push(b);
    }
    fn take_soft(&mut self, b: [f64; 4]) {
        self.soft.push(b);
    }
}

fn inside(b: [f64; 4], area: [f64; 4]) -> bool {
    b[0] >= area[0] && b[1] >= area[1] && b[2] <= area[2] && b[3] <= area[3]
}

/// A text element.
fn text(x: f64, y: f64, size: f64, content: impl Into<String>) -> Text {
    Text::new(content.into())
        .set("x", r1(x))
        .set("y", r1(y))
        .set("font-size", r1(size))
}

/// A text with a white halo, readable over lines.
fn halo(t: Text) -> Text {
    t.set("stroke", "#ffffff")
        .set("stroke-width", 3)
        .set("stroke-linejoin", "round")
        .set("paint-order", "stroke")
}

/// Fill for a band at ramp position `t`: 0 undisturbed, 1 the most drawn down, −1 the highest
/// rise (recharge mound).
fn band_colour(t: f64) -> String {
    let (to, t) = if t < 0.0 {
        (MOUND, (-t).min(1.0))
    } else {
        (BAND_HIGH, t.min(1.0))
    };
    let c: Vec<u8> = (0..3)
        .map(|k| (BAND_LOW[k] + (to[k] - BAND_LOW[k]) * t).round() as u8)
        .collect();
    format!("#{:02x}{:02x}{:02x}", c[0], c[1], c[2])
}

/// Clip the infinite line through `a`, `b` to the box (Liang–Barsky); `None` if it misses.
fn clip_line(a: [f64; 2], b: [f64; 2], bx: [f64; 4]) -> Option<([f64; 2], [f64; 2])> {
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

/// A "nice" length (1, 2 or 5 × 10ᵏ) at most `max`.
fn nice_below(max: f64) -> f64 {
    if max.is_nan() || max <= 0.0 || !max.is_finite() {
        return 1.0;
    }
    let e = max.log10().floor();
    let base = 10f64.powf(e);
    [5.0, 2.0, 1.0]
        .into_iter()
        .map(|m| m * base)
        .find(|v| *v <= max)
        .unwrap_or(base)
}

/// The quantity's words and unit for titles.
fn quantity_words(q: MapQuantity) -> (&'static str, &'static str) {
    match q {
        MapQuantity::Drawdown => ("Drawdown", "m"),
        MapQuantity::WaterLevel => ("Water level", "m above datum"),
    }
}

/// Everything drawn, layer by layer.
struct Layers {
    defs: Definitions,
    /// `url(#…)` of the clip to the plan's rectangle.
    plan_clip: String,
    /// `url(#…)` of the clip to the aquifer side of every boundary.
    aquifer_clip: String,
    bands: Group,
    far_side: Group,
    contours: Group,
    paths: Group,
    keep_outs: Group,
    neighbours: Group,
    excavations: Group,
    boundaries: Group,
    dry: Group,
    wells: Group,
    failed: Group,
    excavation_labels: Group,
    contour_labels: Group,
    frame: Group,
}

fn group(id: &str) -> Group {
    Group::new().set("id", id)
}

impl Layers {
    /// Empty layers whose ids start with `prefix` ("" for the main plan).
    fn new(prefix: &str, view: &View, plan_px: [f64; 4], grid: &LevelGrid) -> Layers {
        let id = |name: &str| format!("{prefix}{name}");
        let plan_clip = id("plan-clip");
        let aquifer_clip = id("aquifer-clip");
        let defs = Definitions::new()
            .add(
                ClipPath::new().set("id", plan_clip.clone()).add(
                    Rectangle::new()
                        .set("x", r1(plan_px[0]))
                        .set("y", r1(plan_px[1]))
                        .set("width", r1(plan_px[2] - plan_px[0]))
                        .set("height", r1(plan_px[3] - plan_px[1])),
                ),
            )
            .add(
                ClipPath::new()
                    .set("id", aquifer_clip.clone())
                    .add(Path::new().set("d", polygon_data(view, &grid.aquifer_area()))),
            );
        let plan_clip = format!("url(#{plan_clip})");
        Layers {
            defs,
            aquifer_clip: format!("url(#{aquifer_clip})"),
            bands: group(&id("bands")),
            far_side: group(&id("far-side")),
            contours: group(&id("contours"))
                .set("fill", "none")
                .set("stroke", CONTOUR)
                .set("stroke-linejoin", "round")
                .set("clip-path", plan_clip.clone()),
            paths: group(&id("paths"))
                .set("fill", "none")
                .set("stroke", "#8a8f96")
                .set("stroke-width", 1)
                .set("stroke-dasharray", "2 4"),
            keep_outs: group(&id("keep-outs")),
            neighbours: group(&id("neighbours")),
            excavations: group(&id("excavations")),
            boundaries: group(&id("boundaries")),
            dry: group(&id("dry-area")),
            wells: group(&id("wells")),
            failed: group(&id("failed-points")),
            excavation_labels: group(&id("excavation-labels")),
            contour_labels: group(&id("contour-labels"))
                .set("font-family", FONT)
                .set("fill", CONTOUR)
                .set("text-anchor", "middle"),
            frame: group(&id("frame")),
            plan_clip,
        }
    }

    /// The layers in stacking order.
    fn stacked(self) -> Vec<Group> {
        vec![
            self.bands,
            self.far_side,
            self.contours,
            self.paths,
            self.keep_outs,
            self.neighbours,
            self.excavations,
            self.boundaries,
            self.dry,
            self.wells,
            self.failed,
            self.excavation_labels,
            self.contour_labels,
            self.frame,
        ]
    }
}

/// Draw one plan (the main one, or a detail) of `grid` in `view`; returns the layers, the
/// number of well labels left off and the number of failed check points marked.
fn draw_plan(
    run: &CheckRun,
    grid: &LevelGrid,
    set: &ContourSet,
    view: &View,
    opts: &MapOptions,
    prefix: &str,
    only: Option<[f64; 4]>,
) -> (Layers, usize, usize) {
    let gb = grid.bounds();
    let plan_px = {
        let a = view.px([gb[0], gb[3]]);
        let b = view.px([gb[2], gb[1]]);
        [a[0], a[1], b[0], b[1]]
    };
    let mut occ = Occupied::default();
    let mut lay = Layers::new(prefix, view, plan_px, grid);
    draw_bands(&mut lay, grid, set, view);
    draw_far_side(&mut lay, run, grid, view);
    draw_contours(&mut lay, set, view);
    draw_paths(&mut lay, run, view);
    // Labels are placed in order of importance (each keeps clear of those before it); the
    // layers are stacked in their fixed order, whatever the order here.
    reserve(run, view, &mut occ);
    let omitted = draw_wells(&mut lay, run, view, &mut occ, plan_px, only);
    draw_excavations(&mut lay, run, view, &mut occ, plan_px);
    draw_neighbours(&mut lay, run, view, &mut occ, plan_px, opts);
    draw_keep_outs(&mut lay, run, view, &mut occ, plan_px);
    draw_boundaries(&mut lay, run, grid, view, &mut occ, plan_px);
    draw_dry(&mut lay, grid, view);
    let failed = draw_failed(&mut lay, run, view, &mut occ, plan_px, only);
    draw_contour_labels(&mut lay, set, grid, view, &mut occ, plan_px);
    draw_frame(&mut lay, view, plan_px);
    (lay, omitted, failed)
}

/// Nearest distance between any two wells, m (infinite with fewer than two). Past 4000 wells
/// only neighbours in the list are compared (layouts list wells in order along their line).
fn nearest_well_spacing(run: &CheckRun) -> f64 {
    let pts: Vec<[f64; 2]> = run.placement.wells.iter().map(|w| w.position).collect();
    let d = |a: &[f64; 2], b: &[f64; 2]| (a[0] - b[0]).hypot(a[1] - b[1]);
    if pts.len() > 4000 {
        return pts
            .windows(2)
            .map(|w| d(&w[0], &w[1]))
            .fold(f64::INFINITY, f64::min);
    }
    let mut nearest = f64::INFINITY;
    for (i, a) in pts.iter().enumerate() {
        for b in &pts[i + 1..] {
            nearest = nearest.min(d(a, b));
        }
    }
    nearest
}

/// Where the detail plan goes, and the site window it shows.
struct Detail {
    /// Page area for the detail, px.
    area: [f64; 4],
    /// Site window, [xmin, ymin, xmax, ymax], m.
    window: [f64; 4],
    /// What it is centred on.
    about: String,
}

/// A detail plan for long, crowded layouts (a line of wellpoints along a trench): when the
/// whole plan is a thin strip and wells stand less than 8 px apart on it, the strip moves to
/// the top and a larger-scale detail around the worst check point fills the space below.
fn plan_detail(run: &CheckRun, gb: [f64; 4]) -> Option<(View, Detail)> {
    let full = View::fit(gb, PLAN);
    let strip_h = (gb[3] - gb[1]) * full.scale;
    let spacing = nearest_well_spacing(run);
    let gap_px = spacing * full.scale;
    if strip_h > 0.5 * (PLAN[3] - PLAN[1]) || gap_px.is_nan() || gap_px >= 8.0 {
        return None;
    }
    let top_area = [PLAN[0], PLAN[1], PLAN[2], PLAN[1] + strip_h];
    let area = [PLAN[0], top_area[3] + 64.0, PLAN[2], PLAN[3]];
    if area[3] - area[1] < 200.0 {
        return None;
    }
    let (aw, ah) = (area[2] - area[0], area[3] - area[1]);
    let scale = (3.0 * full.scale).max(14.0 / spacing).min(aw / 15.0);
    let (hw, hh) = (aw / scale / 2.0, ah / scale / 2.0);
    let e = &run.evaluation;
    let (centre, about) = match e.worst_point.and_then(|i| e.points.get(i)) {
        Some(p) => (
            p.point.position,
            format!(
                "Detail A — round the check point with the least margin ({:.1}, {:.1})",
                p.point.position[0], p.point.position[1]
            ),
        ),
        None => (
            run.placement
                .wells
                .first()
                .map_or([0.0, 0.0], |w| w.position),
            "Detail A — round the first well".to_string(),
        ),
    };
    // Keep the window on the grid where it fits.
    let fit = |c: f64, h: f64, lo: f64, hi: f64| {
        if hi - lo <= 2.0 * h {
            (lo + hi) / 2.0
        } else {
            c.clamp(lo + h, hi - h)
        }
    };
    let cx = fit(centre[0], hw, gb[0], gb[2]);
    let cy = fit(centre[1], hh, gb[1], gb[3]);
    Some((
        View::fit(gb, top_area),
        Detail {
            area,
            window: [cx - hw, cy - hh, cx + hw, cy + hh],
            about,
        },
    ))
}

/// The map of a run, with options.
pub fn map_svg_with(run: &CheckRun, grid: &LevelGrid, date: &str, opts: &MapOptions) -> String {
    let model = run.model;
    let quantity = model.map_quantity;
    let gb = grid.bounds();
    let set = grid.contours(quantity);
    let detail = plan_detail(run, gb);
    let view = detail
        .as_ref()
        .map_or_else(|| View::fit(gb, PLAN), |(v, _)| *v);
    let (mut lay, omitted, failed) = draw_plan(run, grid, &set, &view, opts, "", None);
    let defs = std::mem::replace(&mut lay.defs, Definitions::new())
        .add(hatch("hatch-keep-out", KEEP_OUT, 45.0, 7.0))
        .add(hatch("hatch-barrier", BARRIER, -45.0, 9.0))
        .add(hatch("hatch-dry", "#6b4e2e", 45.0, 4.0));
    let detail_parts = detail.map(|(_, d)| detail_plan(run, &set, &view, &d, opts));

    let legend_bottom;
    let legend = {
        let (g, bottom) = legend(run, grid, &set, opts, omitted, failed);
        legend_bottom = bottom;
        g
    };
    let (scale_bar, north) = scale_and_north(&view, legend_bottom + 14.0);
    let title = title_block(run, &set, date, opts);
    let caution = caution_footer();

    let (what, unit) = quantity_words(quantity);
    let mut doc = Document::new()
        .set("xmlns", "http://www.w3.org/2000/svg")
        .set("width", PAGE_W)
        .set("height", PAGE_H)
        .set("viewBox", (0, 0, PAGE_W, PAGE_H))
        .set("font-family", FONT)
        .add(Title::new(format!(
            "{} — {} ({}) — drydig check",
            model.name,
            what.to_lowercase(),
            unit
        )))
        .add(defs);
    if let Some((_, d)) = &detail_parts {
        doc = doc.add(d.clone());
    }
    doc = doc.add(
        Rectangle::new()
            .set("id", "page")
            .set("x", 0)
            .set("y", 0)
            .set("width", PAGE_W)
            .set("height", PAGE_H)
            .set("fill", "#ffffff"),
    );
    for g in lay.stacked() {
        doc = doc.add(g);
    }
    if let Some((g, _)) = detail_parts {
        doc = doc.add(g);
    }
    doc.add(legend)
        .add(scale_bar)
        .add(north)
        .add(title)
        .add(caution)
        .to_string()
}

/// The detail plan: its own finer grid over the window, the main plan's contour values, its
/// own frame and scale bar, and the window outlined on the main plan.
fn detail_plan(
    run: &CheckRun,
    set: &ContourSet,
    main: &View,
    d: &Detail,
    opts: &MapOptions,
) -> (Group, Definitions) {
    let w = d.window;
    let step = ((w[2] - w[0]) * (w[3] - w[1]) / crate::field::grid::DEFAULT_NODES as f64).sqrt();
    let nx = ((w[2] - w[0]) / step).ceil() as usize + 1;
    let ny = ((w[3] - w[1]) / step).ceil() as usize + 1;
    let fine = LevelGrid::compute(&run.grid_source(), [w[0], w[1]], step, nx.max(4), ny.max(4));
    let levels: Vec<f64> = set.lines.iter().map(|l| l.value).collect();
    let local = ContourSet {
        quantity: set.quantity,
        interval: set.interval,
        range: set.range,
        undisturbed: set.undisturbed,
        lines: fine.lines_at(&fine.values(set.quantity), &levels),
    };
    let view = View::fit(fine.bounds(), d.area);
    let (mut lay, _, _) = draw_plan(run, &fine, &local, &view, opts, "detail-", Some(w));
    let defs = std::mem::replace(&mut lay.defs, Definitions::new());
    let fb = fine.bounds();
    let top_left = view.px([fb[0], fb[3]]);
    let clip = lay.plan_clip.clone();
    let mut g = group("detail");
    // The window on the main plan.
    let a = main.px([w[0], w[3]]);
    let b = main.px([w[2], w[1]]);
    g = g
        .add(
            Rectangle::new()
                .set("x", r1(a[0]))
                .set("y", r1(a[1]))
                .set("width", r1(b[0] - a[0]))
                .set("height", r1(b[1] - a[1]))
                .set("fill", "none")
                .set("stroke", INK)
                .set("stroke-width", 1.4)
                .set("stroke-dasharray", "6 3"),
        )
        .add(halo(
            text(a[0] + 4.0, a[1] + 14.0, 12.0, "A")
                .set("font-weight", "bold")
                .set("fill", INK),
        ))
        .add(
            text(top_left[0], top_left[1] - 30.0, 13.0, d.about.clone())
                .set("font-weight", "bold")
                .set("fill", INK),
        );
    // Its own scale bar, above its top right corner.
    let len_m = nice_below(150.0 / view.scale);
    let len_px = len_m * view.scale;
    let right = view.px([fb[2], fb[3]]);
    let x0 = right[0] - len_px - 30.0;
    let y0 = right[1] - 30.0;
    for k in 0..4 {
        let bw = len_px / 4.0;
        g = g.add(
            Rectangle::new()
                .set("x", r1(x0 + bw * k as f64))
                .set("y", r1(y0 - 6.0))
                .set("width", r1(bw))
                .set("height", 6)
                .set("fill", if k % 2 == 0 { INK } else { "#ffffff" })
                .set("stroke", INK)
                .set("stroke-width", 0.8),
        );
    }
    g = g.add(
        text(
            x0 + len_px + 6.0,
            y0,
            11.0,
            format!("{} m", signed(len_m, decimals(len_m).min(2))),
        )
        .set("fill", INK),
    );
    // The frame and its coordinates stand outside the clip.
    let frame = std::mem::replace(&mut lay.frame, Group::new());
    let mut inner = Group::new().set("clip-path", clip);
    for l in lay
        .stacked()
        .into_iter()
        .filter(|l| !l.get_attributes().is_empty())
    {
        inner = inner.add(l);
    }
    (g.add(inner).add(frame), defs)
}

fn hatch(id: &str, colour: &str, angle: f64, gap: f64) -> Pattern {
    Pattern::new()
        .set("id", id)
        .set("patternUnits", "userSpaceOnUse")
        .set("width", r1(gap))
        .set("height", r1(gap))
        .set("patternTransform", format!("rotate({})", r1(angle)))
        .add(
            Line::new()
                .set("x1", 0)
                .set("y1", 0)
                .set("x2", 0)
                .set("y2", r1(gap))
                .set("stroke", colour)
                .set("stroke-width", 1.2),
        )
}

/// Where along the band ramp a value sits: 0 undisturbed, 1 the most drawn down.
fn ramp_position(set: &ContourSet, v: f64) -> f64 {
    let dd = set.drawdown_of(v);
    let (down, up) = set.extremes();
    // The light end is the least drawdown on the map (0 where the map reaches undisturbed
    // ground), so a deep, wide cone still shows its shape.
    let least = set
        .drawdown_of(set.range[0])
        .min(set.drawdown_of(set.range[1]))
        .max(0.0);
    if dd >= 0.0 {
        if down > least {
            ((dd - least) / (down - least)).max(0.0)
        } else {
            0.0
        }
    } else if up > 0.0 {
        dd / up
    } else {
        0.0
    }
}

fn draw_bands(lay: &mut Layers, grid: &LevelGrid, set: &ContourSet, view: &View) {
    let levels: Vec<f64> = set.lines.iter().map(|l| l.value).collect();
    if levels.is_empty() {
        return;
    }
    let values = grid.values(set.quantity);
    let mut g = Group::new().set("clip-path", lay.aquifer_clip.clone());
    for (lo, hi, mp) in grid.bands(&values, &levels) {
        // Colour each band by its middle (the outer bands by their inner edge).
        let mid = if lo < set.range[0] {
            hi
        } else if hi > set.range[1] {
            lo
        } else {
            (lo + hi) / 2.0
        };
        let t = ramp_position(set, mid);
        g = g.add(
            Path::new()
                .set("d", multipolygon_data(view, &mp))
                .set("fill", band_colour(t))
                .set("fill-rule", "evenodd")
                .set("stroke", "none"),
        );
    }
    lay.bands = std::mem::replace(&mut lay.bands, group("bands"))
        .set("clip-path", lay.plan_clip.clone())
        .add(g);
}

fn draw_far_side(lay: &mut Layers, run: &CheckRun, grid: &LevelGrid, view: &View) {
    for (b, poly) in run.model.boundaries.iter().zip(grid.far_sides()) {
        if poly.exterior().0.len() < 4 {
            continue;
        }
        let d = polygon_data(view, &poly);
        let (fill, extra) = match b.kind {
            BoundaryKind::ConstantHead => ("#dcebf7", None),
            BoundaryKind::Barrier => ("#ececec", Some("url(#hatch-barrier)")),
        };
        let mut g = lay.far_side.clone();
        g = g.add(Path::new().set("d", d.clone()).set("fill", fill));
        if let Some(p) = extra {
            g = g.add(Path::new().set("d", d).set("fill", p).set("opacity", 0.35));
        }
        lay.far_side = g;
    }
}

fn draw_contours(lay: &mut Layers, set: &ContourSet, view: &View) {
    for line in &set.lines {
        let k = (line.value / set.interval).round() as i64;
        let index = k % 5 == 0;
        let mut d = String::new();
        for part in &line.parts {
            let pts = page_line(view, part);
            if pts.len() >= 2 {
                d.push_str(&path_data(&pts, false));
            }
        }
        if d.is_empty() {
            continue;
        }
        lay.contours = std::mem::replace(&mut lay.contours, group("contours")).add(
            Path::new()
                .set("d", d)
                .set("class", if index { "contour index" } else { "contour" })
                .set("stroke-width", if index { 1.6 } else { 0.8 }),
        );
    }
}

fn draw_paths(lay: &mut Layers, run: &CheckRun, view: &View) {
    for p in &run.placement.paths {
        let pts = page_line(view, p);
        if pts.len() >= 2 {
            lay.paths = std::mem::replace(&mut lay.paths, group("paths"))
                .add(Path::new().set("d", path_data(&pts, false)));
        }
    }
}

/// Mark what labels must keep clear of, before any label is placed: well symbols, failed
/// check points, and the outlines of excavations, neighbours and keep-out zones.
fn reserve(run: &CheckRun, view: &View, occ: &mut Occupied) {
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
            let a = view.px([seg[0].x, seg[0].y]);
            let b = view.px([seg[1].x, seg[1].y]);
            let len = (b[0] - a[0]).hypot(b[1] - a[1]);
            let n = (len / 5.0).ceil().max(1.0) as usize;
            for k in 0..=n {
                let t = k as f64 / n as f64;
                let p = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
                occ.take([p[0] - 1.5, p[1] - 1.5, p[0] + 1.5, p[1] + 1.5]);
            }
        }
    }
}

/// Half-size of the cross marking a failed check point, px: smaller where points crowd.
fn cross_size(run: &CheckRun, view: &View) -> f64 {
    let spacing = run
        .model
        .checks
        .grid_spacing
        .min(run.model.checks.edge_spacing);
    (0.3 * spacing * view.scale).clamp(1.5, 3.5)
}

/// Place a label box of size (w, h) at the first free candidate centre; returns the centre.
fn place(
    occ: &mut Occupied,
    area: [f64; 4],
    w: f64,
    h: f64,
    candidates: &[[f64; 2]],
) -> Option<[f64; 2]> {
    place_with(occ, area, w, h, candidates, false)
}

/// As [`place`]; with `over_soft`, the label may cover soft boxes (failed check points).
fn place_with(
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

fn poly_label_candidates(view: &View, poly: &Polygon<f64>, h: f64) -> Vec<[f64; 2]> {
    use geo::{BoundingRect, Contains};
    let mut c = Vec::new();
    let home = poly.interior_point().map(|p| [p.x(), p.y()]);
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
    }
    c
}

fn draw_keep_outs(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for k in &run.model.keep_outs {
        let d = polygon_data(view, &k.polygon);
        let mut g = Group::new().set("class", "keep-out");
        g = g
            .add(
                Path::new()
                    .set("d", d.clone())
                    .set("fill", "#fbe9e4")
                    .set("fill-opacity", 0.7),
            )
            .add(
                Path::new()
                    .set("d", d)
                    .set("fill", "url(#hatch-keep-out)")
                    .set("stroke", KEEP_OUT)
                    .set("stroke-width", 1.2)
                    .set("stroke-dasharray", "5 3"),
            );
        let (size, label) = (11.0, k.name.clone());
        let w = text_width(&label, size) + 6.0;
        if let Some(c) = place(
            occ,
            area,
            w,
            size + 4.0,
            &poly_label_candidates(view, &k.polygon, size),
        ) {
            g = g.add(halo(
                text(c[0], c[1] + size * 0.35, size, label)
                    .set("text-anchor", "middle")
                    .set("fill", KEEP_OUT)
                    .set("font-style", "italic"),
            ));
        }
        lay.keep_outs = std::mem::replace(&mut lay.keep_outs, group("keep-outs")).add(g);
    }
}

fn draw_excavations(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for e in &run.model.excavations {
        let mut g = Group::new().set("class", "excavation");
        g = g.add(
            Path::new()
                .set("d", polygon_data(view, &e.outline))
                .set("fill", "#ffffff")
                .set("fill-opacity", 0.35)
                .set("stroke", EXCAVATION)
                .set("stroke-width", 2.6)
                .set("stroke-linejoin", "miter"),
        );
        let name = e.name.clone();
        let target = format!("target ≤ {} m", signed(e.target_level(), 2));
        let formation = format!("formation {} m", signed(e.formation_level, 2));
        let (s1, s2) = (13.0, 11.0);
        let w = text_width(&name, s1).max(text_width(&formation, s2)) + 8.0;
        let h = s1 + 2.0 * s2 + 10.0;
        let cands = poly_label_candidates(view, &e.outline, h);
        // Clear of failed check points if there is room; over them (on white) if not.
        let spot = place_with(occ, area, w, h, &cands, false)
            .or_else(|| place_with(occ, area, w, h, &cands, true));
        if let Some(c) = spot {
            let top = c[1] - h / 2.0;
            let label = Group::new().set("class", "excavation-label");
            let label = label
                .add(
                    Rectangle::new()
                        .set("x", r1(c[0] - w / 2.0))
                        .set("y", r1(top - 1.0))
                        .set("width", r1(w))
                        .set("height", r1(h + 2.0))
                        .set("rx", 3)
                        .set("fill", "#ffffff")
                        .set("fill-opacity", 0.85),
                )
                .add(halo(
                    text(c[0], top + s1, s1, name)
                        .set("text-anchor", "middle")
                        .set("font-weight", "bold")
                        .set("fill", EXCAVATION),
                ))
                .add(halo(
                    text(c[0], top + s1 + s2 + 3.0, s2, target)
                        .set("text-anchor", "middle")
                        .set("fill", EXCAVATION),
                ))
                .add(halo(
                    text(c[0], top + s1 + 2.0 * s2 + 6.0, s2, formation)
                        .set("text-anchor", "middle")
                        .set("fill", "#4a4a4a"),
                ));
            lay.excavation_labels =
                std::mem::replace(&mut lay.excavation_labels, group("excavation-labels"))
                    .add(label);
        }
        lay.excavations = std::mem::replace(&mut lay.excavations, group("excavations")).add(g);
    }
}

fn draw_neighbours(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    opts: &MapOptions,
) {
    let statuses = opts
        .neighbour_status
        .as_ref()
        .filter(|s| s.len() == run.model.neighbours.len());
    for (i, n) in run.model.neighbours.iter().enumerate() {
        let fill = statuses.map_or("#e2ddd5", |s| s[i].fill());
        let mut g = Group::new().set("class", "neighbour");
        g = g.add(
            Path::new()
                .set("d", polygon_data(view, &n.footprint))
                .set("fill", fill)
                .set("fill-opacity", 0.75)
                .set("stroke", "#5e564b")
                .set("stroke-width", 1.4),
        );
        let size = 12.0;
        let w = text_width(&n.name, size) + 8.0;
        if let Some(c) = place(
            occ,
            area,
            w,
            size + 4.0,
            &poly_label_candidates(view, &n.footprint, size),
        ) {
            g = g.add(halo(
                text(c[0], c[1] + size * 0.35, size, n.name.clone())
                    .set("text-anchor", "middle")
                    .set("fill", "#3b342b"),
            ));
        }
        lay.neighbours = std::mem::replace(&mut lay.neighbours, group("neighbours")).add(g);
    }
}

fn draw_boundaries(
    lay: &mut Layers,
    run: &CheckRun,
    grid: &LevelGrid,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for b in &run.model.boundaries {
        let Some((a, c)) = clip_line(b.line[0], b.line[1], grid.bounds()) else {
            continue;
        };
        let (pa, pc) = (view.px(a), view.px(c));
        let mut g = Group::new().set("class", "boundary");
        let (colour, words) = match b.kind {
            BoundaryKind::ConstantHead => (CONSTANT_HEAD, "constant head"),
            BoundaryKind::Barrier => (BARRIER, "barrier"),
        };
        let line = Line::new()
            .set("x1", r1(pa[0]))
            .set("y1", r1(pa[1]))
            .set("x2", r1(pc[0]))
            .set("y2", r1(pc[1]))
            .set("stroke", colour);
        g = match b.kind {
            BoundaryKind::ConstantHead => g.add(line.set("stroke-width", 3)),
            BoundaryKind::Barrier => g.add(
                line.set("stroke-width", 3.5)
                    .set("stroke-dasharray", "14 4 3 4"),
            ),
        };
        // Label along the line on the far side, where no contour runs.
        let d = [pc[0] - pa[0], pc[1] - pa[1]];
        let len = d[0].hypot(d[1]);
        if len > 40.0 {
            let u = [d[0] / len, d[1] / len];
            let mut n = [-u[1], u[0]];
            let mid = [(pa[0] + pc[0]) / 2.0, (pa[1] + pc[1]) / 2.0];
            let probe = view.site([mid[0] + n[0] * 10.0, mid[1] + n[1] * 10.0]);
            if grid.on_aquifer_side(probe) {
                n = [-n[0], -n[1]];
            }
            let label = format!("{} ({words})", b.name);
            let size = 12.0;
            let w = text_width(&label, size) + 8.0;
            let mut angle = u[1].atan2(u[0]).to_degrees();
            if angle > 90.0 {
                angle -= 180.0;
            } else if angle <= -90.0 {
                angle += 180.0;
            }
            let off = size * 0.5 + 5.0;
            for t in [0.5, 0.3, 0.7, 0.15, 0.85] {
                let p = [pa[0] + d[0] * t + n[0] * off, pa[1] + d[1] * t + n[1] * off];
                let (hw, hh) = rotated_half_extent(w, size + 4.0, angle);
                let bx = [p[0] - hw, p[1] - hh, p[0] + hw, p[1] + hh];
                if inside(bx, area) && occ.free(bx) {
                    occ.take(bx);
                    g = g.add(halo(
                        text(0.0, size * 0.35, size, label)
                            .set("text-anchor", "middle")
                            .set("fill", colour)
                            .set("font-weight", "bold")
                            .set(
                                "transform",
                                format!(
                                    "translate({} {}) rotate({})",
                                    r1(p[0]),
                                    r1(p[1]),
                                    r1(angle)
                                ),
                            ),
                    ));
                    break;
                }
            }
        }
        lay.boundaries = std::mem::replace(&mut lay.boundaries, group("boundaries")).add(g);
    }
}

fn rotated_half_extent(w: f64, h: f64, angle_deg: f64) -> (f64, f64) {
    let (s, c) = angle_deg.to_radians().sin_cos();
    (
        (c.abs() * w + s.abs() * h) / 2.0,
        (s.abs() * w + c.abs() * h) / 2.0,
    )
}

fn draw_dry(lay: &mut Layers, grid: &LevelGrid, view: &View) {
    let mp = grid.dry_area();
    if mp.0.is_empty() {
        return;
    }
    let d = multipolygon_data(view, &mp);
    lay.dry = std::mem::replace(&mut lay.dry, group("dry-area"))
        .set("clip-path", lay.plan_clip.clone())
        .add(Path::new().set("d", d.clone()).set("fill", "#efe3d0"))
        .add(
            Path::new()
                .set("d", d)
                .set("fill", "url(#hatch-dry)")
                .set("stroke", "#6b4e2e")
                .set("stroke-width", 1),
        );
}

/// Well symbol radius, px: smaller where wells stand close together on the page.
fn well_radius(run: &CheckRun, view: &View) -> f64 {
    (0.42 * nearest_well_spacing(run) * view.scale).clamp(2.0, 5.5)
}

fn well_symbol(p: [f64; 2], r: f64, recharge: bool) -> Group {
    if recharge {
        let pts = format!(
            "M{} {}L{} {}L{} {}Z",
            r1(p[0] - r * 1.1),
            r1(p[1] - r * 0.8),
            r1(p[0] + r * 1.1),
            r1(p[1] - r * 0.8),
            r1(p[0]),
            r1(p[1] + r * 1.1)
        );
        Group::new().add(
            Path::new()
                .set("d", pts)
                .set("fill", RECHARGE)
                .set("stroke", "#0c4a39")
                .set("stroke-width", 1.2),
        )
    } else {
        Group::new()
            .add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1(r))
                    .set("fill", "#ffffff")
                    .set("stroke", WELL)
                    .set("stroke-width", if r > 3.0 { 2 } else { 1 }),
            )
            .add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1((r * 0.4).max(1.0)))
                    .set("fill", WELL),
            )
    }
}

/// Draw wells and their labels; returns how many labels did not fit.
fn draw_wells(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    only: Option<[f64; 4]>,
) -> usize {
    let r = well_radius(run, view);
    let shown = |p: [f64; 2]| {
        only.is_none_or(|w| p[0] >= w[0] && p[0] <= w[2] && p[1] >= w[1] && p[1] <= w[3])
    };
    let centres: Vec<[f64; 2]> = run
        .model
        .excavations
        .iter()
        .filter_map(|e| e.outline.centroid().map(|c| [c.x(), c.y()]))
        .collect();
    // Symbols first, so labels keep clear of every symbol.
    let mut symbols = Group::new().set("id", "well-symbols");
    let mut over = Group::new().set("id", "wells-over-limit");
    for (i, w) in run.placement.wells.iter().enumerate() {
        if !shown(w.position) {
            continue;
        }
        let p = view.px(w.position);
        let trouble = run
            .evaluation
            .wells
            .get(i)
            .is_some_and(|res| !res.problems.is_empty());
        if trouble {
            over = over.add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1(r + 3.0))
                    .set("fill", "none")
                    .set("stroke", FAIL)
                    .set("stroke-width", 2),
            );
        }
        occ.take([
            p[0] - r - 1.0,
            p[1] - r - 1.0,
            p[0] + r + 1.0,
            p[1] + r + 1.0,
        ]);
        let recharge = w.rate < 0.0;
        symbols = symbols.add(well_symbol(p, r, recharge).set(
            "class",
            if recharge {
                "well recharge"
            } else {
                "well pumping"
            },
        ));
    }
    let mut labels = Group::new()
        .set("id", "well-labels")
        .set("font-family", FONT)
        .set("text-anchor", "middle");
    let mut omitted = 0;
    let (s1, s2) = (11.0, 10.0);
    // Where symbols crowd (a line of wellpoints), label only wells at least this far apart.
    let dense = r < 3.0;
    let mut labelled: Vec<[f64; 2]> = Vec::new();
    for w in run.placement.wells.iter().filter(|w| shown(w.position)) {
        let p = view.px(w.position);
        if dense
            && labelled
                .iter()
                .any(|q| (q[0] - p[0]).hypot(q[1] - p[1]) < 140.0)
        {
            omitted += 1;
            continue;
        }
        let name = w.name.clone();
        let rate = rate_text(w.rate);
        let bw = text_width(&name, s1).max(text_width(&rate, s2)) + 4.0;
        let bh = s1 + s2 + 4.0;
        // Outward from the nearest excavation centre, then round the compass.
        let c = centres
            .iter()
            .min_by(|a, b| {
                let da = (a[0] - w.position[0]).hypot(a[1] - w.position[1]);
                let db = (b[0] - w.position[0]).hypot(b[1] - w.position[1]);
                da.total_cmp(&db)
            })
            .copied()
            .unwrap_or(w.position);
        let mut dir = [w.position[0] - c[0], -(w.position[1] - c[1])];
        let l = dir[0].hypot(dir[1]);
        dir = if l > 1e-9 {
            [dir[0] / l, dir[1] / l]
        } else {
            [0.0, -1.0]
        };
        let base = dir[1].atan2(dir[0]);
        let mut cands = Vec::new();
        for k in [0.0, 1.0, -1.0, 2.0, -2.0, 3.0, -3.0, 4.0] {
            let a = base + k * std::f64::consts::FRAC_PI_4;
            let (sa, ca) = a.sin_cos();
            // Box centre so that the box's near edge sits just off the symbol.
            let gap = r + 3.0;
            let ex = ca * (gap + bw / 2.0);
            let ey = sa * (gap + bh / 2.0);
            cands.push([p[0] + ex, p[1] + ey]);
        }
        match place(occ, area, bw, bh, &cands) {
            Some(c) => {
                labelled.push(p);
                let top = c[1] - bh / 2.0;
                let fill = if w.rate < 0.0 { RECHARGE } else { WELL };
                labels = labels.add(
                    Group::new()
                        .set("class", "well-label")
                        .add(halo(
                            text(c[0], top + s1, s1, name)
                                .set("font-weight", "bold")
                                .set("fill", fill),
                        ))
                        .add(halo(
                            text(c[0], top + s1 + s2 + 2.0, s2, rate).set("fill", INK),
                        )),
                );
            }
            None => omitted += 1,
        }
    }
    lay.wells = std::mem::replace(&mut lay.wells, group("wells"))
        .add(over)
        .add(symbols)
        .add(labels);
    omitted
}

/// Mark check points whose target is not met; returns how many.
fn draw_failed(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    only: Option<[f64; 4]>,
) -> usize {
    let failed: Vec<&crate::check::evaluate::PointResult> = run
        .evaluation
        .points
        .iter()
        .filter(|p| p.met == Some(false))
        .filter(|p| {
            let q = p.point.position;
            only.is_none_or(|w| q[0] >= w[0] && q[0] <= w[2] && q[1] >= w[1] && q[1] <= w[3])
        })
        .collect();
    if failed.is_empty() {
        return 0;
    }
    let a = cross_size(run, view);
    let mut d = String::new();
    for p in &failed {
        let q = view.px(p.point.position);
        d.push_str(&format!(
            "M{} {}L{} {}M{} {}L{} {}",
            r1(q[0] - a),
            r1(q[1] - a),
            r1(q[0] + a),
            r1(q[1] + a),
            r1(q[0] - a),
            r1(q[1] + a),
            r1(q[0] + a),
            r1(q[1] - a)
        ));
    }
    let mut g = std::mem::replace(&mut lay.failed, group("failed-points")).add(
        Path::new()
            .set("d", d)
            .set("class", "failed-point")
            .set("stroke", FAIL)
            .set("stroke-width", if a < 3.0 { 1.1 } else { 1.6 })
            .set("stroke-linecap", "round"),
    );
    // Label the worst point with how far the water stands above its target.
    if let Some(w) = run
        .evaluation
        .worst_point
        .and_then(|i| run.evaluation.points.get(i))
    {
        if let Some(m) = w.margin_m.filter(|m| *m < 0.0) {
            let q = view.px(w.point.position);
            let label = format!("worst: {} m above target", signed(-m, 2));
            let size = 11.0;
            let bw = text_width(&label, size) + 6.0;
            let bh = size + 4.0;
            let dirs: [[f64; 2]; 8] = [
                [0.0, -1.0],
                [0.0, 1.0],
                [1.0, 0.0],
                [-1.0, 0.0],
                [0.7, -0.7],
                [-0.7, -0.7],
                [0.7, 0.7],
                [-0.7, 0.7],
            ];
            let cands: Vec<[f64; 2]> = dirs
                .iter()
                .flat_map(|u| {
                    [14.0, 30.0, 50.0, 75.0, 100.0].map(|k| {
                        [
                            q[0] + u[0] * (k + bw / 2.0 * u[0].abs()),
                            q[1] + u[1] * (k + bh / 2.0),
                        ]
                    })
                })
                .collect();
            if let Some(c) = place(occ, area, bw, bh, &cands) {
                g = g.add(
                    Line::new()
                        .set("x1", r1(q[0]))
                        .set("y1", r1(q[1]))
                        .set("x2", r1(c[0]))
                        .set("y2", r1(c[1]))
                        .set("stroke", FAIL)
                        .set("stroke-width", 0.8),
                );
                g = g.add(halo(
                    text(c[0], c[1] + size * 0.35, size, label)
                        .set("text-anchor", "middle")
                        .set("fill", FAIL)
                        .set("font-weight", "bold"),
                ));
            }
        }
    }
    lay.failed = g;
    failed.len()
}

/// The point at arc length `s` along a page polyline with cumulative lengths `cum`.
fn at_length(pts: &[[f64; 2]], cum: &[f64], s: f64) -> [f64; 2] {
    let i = cum.partition_point(|c| *c < s).clamp(1, pts.len() - 1);
    let seg = cum[i] - cum[i - 1];
    let t = if seg > 0.0 {
        (s - cum[i - 1]) / seg
    } else {
        0.0
    };
    let (a, b) = (pts[i - 1], pts[i]);
    [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]
}

fn draw_contour_labels(
    lay: &mut Layers,
    set: &ContourSet,
    grid: &LevelGrid,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    let d = decimals(set.interval);
    let size = 11.0;
    let inset = [area[0] + 4.0, area[1] + 4.0, area[2] - 4.0, area[3] - 4.0];
    let spacing = 300.0;
    let mut g = std::mem::replace(&mut lay.contour_labels, group("contour-labels"));
    for line in &set.lines {
        let label = signed(line.value, d);
        let w = text_width(&label, size) + 6.0;
        let h = size + 2.0;
        for part in &line.parts {
            let pts = page_line(view, part);
            if pts.len() < 2 {
                continue;
            }
            let mut cum = vec![0.0];
            for s in pts.windows(2) {
                let l = (s[1][0] - s[0][0]).hypot(s[1][1] - s[0][1]);
                cum.push(cum.last().copied().unwrap_or(0.0) + l);
            }
            let total = cum.last().copied().unwrap_or(0.0);
            if total < w * 2.2 {
                continue;
            }
            let n = ((total / spacing).round() as usize).max(1);
            for k in 0..n {
                let target = total * (k as f64 + 0.5) / n as f64;
                for shift in [0.0, 25.0, -25.0, 50.0, -50.0, 80.0, -80.0] {
                    let s = target + shift;
                    if s - w * 0.6 < 0.0 || s + w * 0.6 > total {
                        continue;
                    }
                    let a = at_length(&pts, &cum, s - w / 2.0);
                    let m = at_length(&pts, &cum, s);
                    let b = at_length(&pts, &cum, s + w / 2.0);
                    // Only where the line runs nearly straight under the label.
                    let (u, v) = ([m[0] - a[0], m[1] - a[1]], [b[0] - m[0], b[1] - m[1]]);
                    let turn = (u[0] * v[1] - u[1] * v[0]).atan2(u[0] * v[0] + u[1] * v[1]);
                    if turn.abs() > 0.35 {
                        continue;
                    }
                    let mut angle = (b[1] - a[1]).atan2(b[0] - a[0]).to_degrees();
                    if angle > 90.0 {
                        angle -= 180.0;
                    } else if angle <= -90.0 {
                        angle += 180.0;
                    }
                    let (hw, hh) = rotated_half_extent(w, h, angle);
                    let bx = [m[0] - hw, m[1] - hh, m[0] + hw, m[1] + hh];
                    if !inside(bx, inset) || !occ.free(bx) || !grid.on_aquifer_side(view.site(m)) {
                        continue;
                    }
                    occ.take(bx);
                    g = g.add(
                        halo(text(0.0, size * 0.36, size, label.clone()))
                            .set("class", "contour-label")
                            .set(
                                "transform",
                                format!(
                                    "translate({} {}) rotate({})",
                                    r1(m[0]),
                                    r1(m[1]),
                                    r1(angle)
                                ),
                            ),
                    );
                    break;
                }
            }
        }
    }
    lay.contour_labels = g;
}

/// Tick step for site coordinates so labels stand about `px` apart.
fn tick_step(view: &View, px: f64) -> f64 {
    let raw = px / view.scale;
    let e = raw.log10().floor();
    let base = 10f64.powf(e);
    [1.0, 2.0, 5.0, 10.0]
        .into_iter()
        .map(|m| m * base)
        .find(|v| *v >= raw)
        .unwrap_or(10.0 * base)
}

fn coord_text(v: f64, step: f64) -> String {
    let d = decimals(step).min(2);
    signed(v, d)
}

fn draw_frame(lay: &mut Layers, view: &View, plan: [f64; 4]) {
    let mut g = std::mem::replace(&mut lay.frame, group("frame")).add(
        Rectangle::new()
            .set("x", r1(plan[0]))
            .set("y", r1(plan[1]))
            .set("width", r1(plan[2] - plan[0]))
            .set("height", r1(plan[3] - plan[1]))
            .set("fill", "none")
            .set("stroke", INK)
            .set("stroke-width", 1.2),
    );
    let step = tick_step(view, 110.0);
    let lo = view.site([plan[0], plan[3]]);
    let hi = view.site([plan[2], plan[1]]);
    let mut ticks = String::new();
    let size = 10.0;
    let mut x = (lo[0] / step).ceil() * step;
    while x <= hi[0] + 1e-9 {
        let p = view.px([x, lo[1]]);
        ticks.push_str(&format!("M{} {}v5", r1(p[0]), r1(plan[3])));
        g = g.add(
            text(
                p[0],
                plan[3] + 16.0,
                size,
                format!("E {}", coord_text(x, step)),
            )
            .set("text-anchor", "middle")
            .set("fill", "#555555"),
        );
        x += step;
    }
    let mut y = (lo[1] / step).ceil() * step;
    while y <= hi[1] + 1e-9 {
        let p = view.px([lo[0], y]);
        ticks.push_str(&format!("M{} {}h-5", r1(plan[0]), r1(p[1])));
        let (tx, ty) = (plan[0] - 8.0, p[1]);
        g = g.add(
            text(0.0, 0.0, size, format!("N {}", coord_text(y, step)))
                .set("text-anchor", "middle")
                .set("fill", "#555555")
                .set(
                    "transform",
                    format!("translate({} {}) rotate(-90)", r1(tx), r1(ty)),
                ),
        );
        y += step;
    }
    lay.frame = g.add(
        Path::new()
            .set("d", ticks)
            .set("stroke", INK)
            .set("stroke-width", 1),
    );
}

/// One legend row: a symbol drawn in a 34 × 16 box at (x, y) and words beside it.
fn legend_row(x: f64, y: f64, symbol: Group, words: &str) -> Group {
    Group::new()
        .add(symbol.set("transform", format!("translate({} {})", r1(x), r1(y))))
        .add(text(x + 44.0, y + 12.0, 12.0, words).set("fill", INK))
}

fn legend(
    run: &CheckRun,
    grid: &LevelGrid,
    set: &ContourSet,
    opts: &MapOptions,
    omitted: usize,
    failed: usize,
) -> (Group, f64) {
    let model = run.model;
    let x = PANEL[0] + 12.0;
    let top = PLAN[1];
    let mut y = top + 30.0;
    let row = 22.0;
    let mut g = group("legend");
    let mut rows = Group::new();
    let line = |stroke: &str, width: f64, dash: Option<&str>| {
        let mut l = Line::new()
            .set("x1", 2)
            .set("y1", 8)
            .set("x2", 32)
            .set("y2", 8)
            .set("stroke", stroke)
            .set("stroke-width", width);
        if let Some(d) = dash {
            l = l.set("stroke-dasharray", d);
        }
        Group::new().add(l)
    };
    let swatch = |fill: &str, stroke: &str, pattern: Option<&str>| {
        let mut g = Group::new().add(
            Rectangle::new()
                .set("x", 4)
                .set("y", 1)
                .set("width", 26)
                .set("height", 14)
                .set("fill", fill)
                .set("stroke", stroke),
        );
        if let Some(p) = pattern {
            g = g.add(
                Rectangle::new()
                    .set("x", 4)
                    .set("y", 1)
                    .set("width", 26)
                    .set("height", 14)
                    .set("fill", p),
            );
        }
        g
    };
    let (what, unit) = quantity_words(set.quantity);
    let dec = decimals(set.interval);
    // Band ramp with its end values.
    if !set.lines.is_empty() {
        let mut ramp = Group::new();
        for k in 0..6 {
            let t = k as f64 / 5.0;
            ramp = ramp.add(
                Rectangle::new()
                    .set("x", r1(2.0 + 5.0 * k as f64))
                    .set("y", 1)
                    .set("width", 5)
                    .set("height", 14)
                    .set("fill", band_colour(t)),
            );
        }
        // End values of the drawn-down part, light to dark.
        let down: Vec<f64> = set
            .lines
            .iter()
            .map(|l| l.value)
            .filter(|v| set.drawdown_of(*v) > 0.0)
            .collect();
        let (light, dark) = match set.quantity {
            MapQuantity::Drawdown => (down.first(), down.last()),
            MapQuantity::WaterLevel => (down.last(), down.first()),
        };
        if let (Some(light), Some(dark)) = (light, dark) {
            let words = match set.quantity {
                MapQuantity::Drawdown => "drawdown",
                MapQuantity::WaterLevel => "level",
            };
            rows = rows.add(legend_row(
                x,
                y,
                ramp,
                &format!("{words} {} … {} m", signed(*light, dec), signed(*dark, dec)),
            ));
            y += row;
        }
        if set.extremes().1 > 0.0 {
            let mut mound = Group::new();
            for k in 0..6 {
                let t = -(k as f64) / 5.0;
                mound = mound.add(
                    Rectangle::new()
                        .set("x", r1(2.0 + 5.0 * k as f64))
                        .set("y", 1)
                        .set("width", 5)
                        .set("height", 14)
                        .set("fill", band_colour(t)),
                );
            }
            rows = rows.add(legend_row(x, y, mound, "water raised by recharge"));
            y += row;
        }
        rows = rows.add(legend_row(
            x,
            y,
            line(CONTOUR, 0.8, None),
            &format!("contour every {} m", signed(set.interval, dec)),
        ));
        y += row;
        rows = rows.add(legend_row(
            x,
            y,
            line(CONTOUR, 1.6, None),
            &format!("bold every {} m", signed(5.0 * set.interval, dec)),
        ));
        y += row;
    }
    rows = rows.add(legend_row(
        x,
        y,
        swatch("#ffffff", EXCAVATION, None).set("stroke-width", 2.2),
        "excavation, target level",
    ));
    y += row;
    let pumping = run.placement.wells.iter().any(|w| w.rate >= 0.0);
    let recharge = run.placement.wells.iter().any(|w| w.rate < 0.0);
    if pumping {
        rows = rows.add(legend_row(
            x,
            y,
            well_symbol([17.0, 8.0], 5.0, false),
            "pumping well, name, rate",
        ));
        y += row;
    }
    if recharge {
        rows = rows.add(legend_row(
            x,
            y,
            well_symbol([17.0, 8.0], 5.0, true),
            "recharge well, name, rate",
        ));
        y += row;
    }
    let over = run
        .evaluation
        .wells
        .iter()
        .filter(|w| !w.problems.is_empty())
        .count();
    if over > 0 {
        let ring = Group::new()
            .add(
                svg::node::element::Circle::new()
                    .set("cx", 17)
                    .set("cy", 8)
                    .set("r", 8)
                    .set("fill", "none")
                    .set("stroke", FAIL)
                    .set("stroke-width", 2),
            )
            .add(well_symbol([17.0, 8.0], 5.0, false));
        rows = rows.add(legend_row(
            x,
            y,
            ring,
            &format!("well over a limit ({over}): see wells.csv"),
        ));
        y += row;
    }
    if !run.placement.paths.is_empty() {
        rows = rows.add(legend_row(
            x,
            y,
            line("#8a8f96", 1.0, Some("2 4")),
            "line the wells are set out on",
        ));
        y += row;
    }
    if !model.neighbours.is_empty() {
        match opts
            .neighbour_status
            .as_ref()
            .filter(|s| s.len() == model.neighbours.len())
        {
            Some(statuses) => {
                for s in [
                    NeighbourStatus::WithinLimits,
                    NeighbourStatus::NearLimit,
                    NeighbourStatus::OverLimit,
                    NeighbourStatus::NotAssessed,
                ] {
                    if statuses.contains(&s) {
                        rows = rows.add(legend_row(
                            x,
                            y,
                            swatch(s.fill(), "#5e564b", None),
                            s.words(),
                        ));
                        y += row;
                    }
                }
            }
            None => {
                rows = rows.add(legend_row(
                    x,
                    y,
                    swatch("#e2ddd5", "#5e564b", None),
                    "neighbouring building",
                ));
                y += row;
            }
        }
    }
    if model
        .boundaries
        .iter()
        .any(|b| b.kind == BoundaryKind::ConstantHead)
    {
        rows = rows.add(legend_row(
            x,
            y,
            line(CONSTANT_HEAD, 3.0, None),
            "constant-head boundary",
        ));
        y += row;
    }
    if model
        .boundaries
        .iter()
        .any(|b| b.kind == BoundaryKind::Barrier)
    {
        rows = rows.add(legend_row(
            x,
            y,
            line(BARRIER, 3.5, Some("14 4 3 4")),
            "barrier (no flow)",
        ));
        y += row;
    }
    if !model.keep_outs.is_empty() {
        rows = rows.add(legend_row(
            x,
            y,
            swatch("#fbe9e4", KEEP_OUT, Some("url(#hatch-keep-out)")),
            "keep-out zone",
        ));
        y += row;
    }
    if grid.dry_count() > 0 {
        rows = rows.add(legend_row(
            x,
            y,
            swatch("#efe3d0", "#6b4e2e", Some("url(#hatch-dry)")),
            "pumped dry (at aquifer base)",
        ));
        y += row;
    }
    if failed > 0 {
        let cross = Group::new().add(
            Path::new()
                .set("d", "M13.5 4.5L20.5 11.5M13.5 11.5L20.5 4.5")
                .set("stroke", FAIL)
                .set("stroke-width", 1.6)
                .set("stroke-linecap", "round"),
        );
        rows = rows.add(legend_row(
            x,
            y,
            cross,
            &format!("check point above target ({failed})"),
        ));
        y += row;
    }
    if omitted > 0 {
        rows = rows.add(
            text(
                x,
                y + 12.0,
                11.0,
                format!(
                    "{omitted} well label{} left off for space: see wells.csv",
                    if omitted == 1 { "" } else { "s" }
                ),
            )
            .set("fill", "#555555")
            .set("font-style", "italic"),
        );
        y += row;
    }
    let bottom = y + 4.0;
    g = g
        .add(
            Rectangle::new()
                .set("x", r1(PANEL[0]))
                .set("y", r1(top))
                .set("width", r1(PANEL[1] - PANEL[0]))
                .set("height", r1(bottom - top))
                .set("fill", "#ffffff")
                .set("stroke", INK)
                .set("stroke-width", 1),
        )
        .add(
            text(
                x,
                top + 19.0,
                13.0,
                format!("Legend — {} ({unit})", what.to_lowercase()),
            )
            .set("font-weight", "bold")
            .set("fill", INK),
        )
        .add(rows);
    (g, bottom)
}

fn scale_and_north(view: &View, top: f64) -> (Group, Group) {
    let height = 96.0;
    let frame = Rectangle::new()
        .set("x", r1(PANEL[0]))
        .set("y", r1(top))
        .set("width", r1(PANEL[1] - PANEL[0]))
        .set("height", r1(height))
        .set("fill", "#ffffff")
        .set("stroke", INK)
        .set("stroke-width", 1);
    // Scale bar: a round length no longer than 200 px, in four blocks.
    let len_m = nice_below(200.0 / view.scale);
    let len_px = len_m * view.scale;
    let x0 = PANEL[0] + 18.0;
    let y0 = top + 52.0;
    let mut bar = group("scale-bar").add(frame);
    for k in 0..4 {
        let w = len_px / 4.0;
        bar = bar.add(
            Rectangle::new()
                .set("x", r1(x0 + w * k as f64))
                .set("y", r1(y0))
                .set("width", r1(w))
                .set("height", 7)
                .set("fill", if k % 2 == 0 { INK } else { "#ffffff" })
                .set("stroke", INK)
                .set("stroke-width", 0.8),
        );
    }
    let d = decimals(len_m / 2.0).min(2);
    for (t, v) in [(0.0, 0.0), (0.5, len_m / 2.0), (1.0, len_m)] {
        let label = if t == 1.0 {
            format!("{} m", signed(v, d))
        } else {
            signed(v, d)
        };
        bar = bar.add(
            text(x0 + len_px * t, y0 + 22.0, 11.0, label)
                .set("text-anchor", "middle")
                .set("fill", INK),
        );
    }
    bar = bar.add(
        text(x0, top + 26.0, 12.0, "Scale")
            .set("font-weight", "bold")
            .set("fill", INK),
    );
    // North arrow: a split needle in a ring, page up = grid north.
    let cx = PANEL[1] - 50.0;
    let cy = top + 54.0;
    let rr = 26.0;
    let north = group("north-arrow")
        .add(
            svg::node::element::Circle::new()
                .set("cx", r1(cx))
                .set("cy", r1(cy))
                .set("r", r1(rr))
                .set("fill", "none")
                .set("stroke", "#9aa3ab")
                .set("stroke-width", 1),
        )
        .add(
            Path::new()
                .set(
                    "d",
                    format!(
                        "M{} {}L{} {}L{} {}Z",
                        r1(cx),
                        r1(cy - rr + 2.0),
                        r1(cx - 8.0),
                        r1(cy + 12.0),
                        r1(cx),
                        r1(cy + 6.0)
                    ),
                )
                .set("fill", INK),
        )
        .add(
            Path::new()
                .set(
                    "d",
                    format!(
                        "M{} {}L{} {}L{} {}Z",
                        r1(cx),
                        r1(cy - rr + 2.0),
                        r1(cx + 8.0),
                        r1(cy + 12.0),
                        r1(cx),
                        r1(cy + 6.0)
                    ),
                )
                .set("fill", "#ffffff")
                .set("stroke", INK)
                .set("stroke-width", 1),
        )
        .add(
            text(cx, cy - rr - 4.0, 14.0, "N")
                .set("text-anchor", "middle")
                .set("font-weight", "bold")
                .set("fill", INK),
        );
    (bar, north)
}

/// Split `text` into lines of at most `width` characters.
fn lines_of(text: &str, width: usize) -> Vec<String> {
    crate::report::wrap(text, width, "")
        .lines()
        .map(str::to_string)
        .collect()
}

fn title_block(run: &CheckRun, set: &ContourSet, date: &str, opts: &MapOptions) -> Group {
    let model = run.model;
    let e = &run.evaluation;
    let (what, unit) = quantity_words(set.quantity);
    let dec = decimals(set.interval);
    let x = PANEL[0] + 12.0;
    let bottom = PLAN[3];
    let mut raw: Vec<(f64, String, bool)> = Vec::new();
    raw.insert(0, (16.0, model.name.clone(), true));
    raw.push((
        12.0,
        format!(
            "{what}, {unit}: contours every {} m",
            signed(set.interval, dec)
        ),
        false,
    ));
    if !model.datum.is_empty() {
        raw.push((11.0, format!("Levels: {}", model.datum), false));
    }
    let pumping = run.placement.wells.iter().filter(|w| w.rate >= 0.0).count();
    let recharging = run.placement.wells.len() - pumping;
    let first_rate = run.placement.wells.first().map_or(0.0, |w| w.rate);
    let same = run
        .placement
        .wells
        .iter()
        .all(|w| (w.rate - first_rate).abs() <= 1e-12);
    let wells = if recharging > 0 {
        format!("Wells: {pumping} pumping, {recharging} recharge")
    } else if same && pumping > 1 {
        format!("Wells: {pumping}, {} each", rate_text(first_rate))
    } else {
        format!("Wells: {pumping}")
    };
    raw.push((12.0, wells, false));
    raw.push((
        12.0,
        format!(
            "Total flow: {} L/s ({} m³/day)",
            thousands(e.total_abstraction_m3_per_s * 1e3, 1),
            thousands(e.total_abstraction_m3_per_s * 86_400.0, 0)
        ),
        true,
    ));
    if e.total_recharge_m3_per_s > 0.0 {
        raw.push((
            12.0,
            format!(
                "Recharge: {} L/s; net {} L/s",
                thousands(e.total_recharge_m3_per_s * 1e3, 1),
                thousands(e.net_flow_m3_per_s * 1e3, 1)
            ),
            false,
        ));
    }
    raw.push((
        12.0,
        format!(
            "Design flow (+{:.0} %): {} L/s",
            model.contingency * 100.0,
            thousands(e.design_flow_m3_per_s * 1e3, 1)
        ),
        false,
    ));
    let result = if e.targets_met && e.wells_ok {
        "Result: every target met".to_string()
    } else if !e.targets_met {
        format!("Result: target NOT met at {} check points", e.unmet_count)
    } else {
        "Result: targets met; some wells over limits".to_string()
    };
    raw.push((12.0, result, true));
    let over = opts.neighbour_status.as_ref().map_or(0, |v| {
        v.iter()
            .filter(|s| **s == NeighbourStatus::OverLimit)
            .count()
    });
    if over > 0 {
        raw.push((
            12.0,
            format!("Result: {over} neighbour(s) over a limit"),
            true,
        ));
    }
    if let Some(w) = e.worst_point.and_then(|i| e.points.get(i)) {
        if let Some(m) = w.margin_m.filter(|m| *m < 0.0) {
            raw.push((
                11.0,
                format!(
                    "Worst: {} m above target at ({:.1}, {:.1})",
                    signed(-m, 2),
                    w.point.position[0],
                    w.point.position[1]
                ),
                false,
            ));
        }
    }
    raw.push((11.0, format!("Grid: {}, metres", model.grid), false));
    let file = model
        .file
        .file_name()
        .map_or_else(String::new, |f| f.to_string_lossy().into_owned());
    raw.push((11.0, format!("Date: {date}"), false));
    raw.push((11.0, format!("Design file: {file}"), false));
    raw.push((11.0, "Drawn by drydig check".to_string(), false));
    // Wrap each row to the column's width.
    let avail = PANEL[1] - PANEL[0] - 24.0;
    let mut rows: Vec<(f64, String, bool, &str)> = Vec::new();
    for (size, words, bold) in raw {
        let chars = (avail / (0.62 * size)).floor().max(10.0) as usize;
        let fill = if words.starts_with("Result: target NOT") || words.contains("over a limit") {
            FAIL
        } else {
            INK
        };
        for l in lines_of(&words, chars) {
            rows.push((size, l, bold, fill));
        }
    }
    let height: f64 = rows.iter().map(|r| r.0 + 6.0).sum::<f64>() + 18.0;
    let top = bottom - height;
    let mut g = group("title-block").add(
        Rectangle::new()
            .set("x", r1(PANEL[0]))
            .set("y", r1(top))
            .set("width", r1(PANEL[1] - PANEL[0]))
            .set("height", r1(height))
            .set("fill", "#f6f7f8")
            .set("stroke", INK)
            .set("stroke-width", 1.4),
    );
    let mut y = top + 8.0;
    for (size, words, bold, fill) in rows {
        y += size + 6.0;
        let mut t = text(x, y, size, words).set("fill", fill);
        if bold {
            t = t.set("font-weight", "bold");
        }
        g = g.add(t);
    }
    g
}

fn caution_footer() -> Group {
    let size = 11.0;
    let mut g = group("caution").add(
        Line::new()
            .set("x1", r1(PLAN[0]))
            .set("y1", r1(FOOTER_TOP))
            .set("x2", r1(PANEL[1]))
            .set("y2", r1(FOOTER_TOP))
            .set("stroke", INK)
            .set("stroke-width", 0.8),
    );
    let full = format!("CAUTION — {CAUTION}");
    let mut y = FOOTER_TOP + 17.0;
    for l in lines_of(&full, 190) {
        g = g.add(text(PLAN[0], y, size, l).set("fill", "#6b1f1f"));
        y += size + 5.0;
    }
    g
}

/// The map and GeoJSON files of `check`: `map.svg`, `layout.geojson`, `contours.geojson`
/// (one level grid for all three).
pub fn files(run: &CheckRun) -> Vec<(String, Vec<u8>)> {
    let grid = LevelGrid::for_run(&run.grid_source());
    vec![
        (
            "map.svg".into(),
            map_svg_with(
                run,
                &grid,
                &today(),
                &super::neighbours_out::map_options(run),
            )
            .into_bytes(),
        ),
        (
            "layout.geojson".into(),
            crate::report::geojson_out::layout_geojson(run).into_bytes(),
        ),
        (
            "contours.geojson".into(),
            crate::report::geojson_out::contours_geojson(run, &grid).into_bytes(),
        ),
    ]
}

/// Today's date (UTC) as YYYY-MM-DD; `SOURCE_DATE_EPOCH` (seconds) overrides the clock, for
/// reproducible outputs.
pub fn today() -> String {
    let secs = std::env::var("SOURCE_DATE_EPOCH")
        .ok()
        .and_then(|s| s.trim().parse::<i64>().ok())
        .unwrap_or_else(|| {
            std::time::SystemTime::now()
                .duration_since(std::time::UNIX_EPOCH)
                .map_or(0, |d| d.as_secs() as i64)
        });
    let (y, m, d) = civil_from_days(secs.div_euclid(86_400));
    format!("{y:04}-{m:02}-{d:02}")
}

/// Proleptic Gregorian date from days since 1970-01-01 (H. Hinnant, "chrono-compatible
/// low-level date algorithms").
fn civil_from_days(z: i64) -> (i64, u32, u32) {
    let z = z + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097);
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = (doy - (153 * mp + 2) / 5 + 1) as u32;
    let m = if mp < 10 { mp + 3 } else { mp - 9 } as u32;
    let y = yoe + era * 400 + i64::from(m <= 2);
    (y, m, d)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn civil_dates() {
        // 1970-01-01 is day 0; 2000-03-01 is day 11 017; 2024-02-29 is day 19 782.
        assert_eq!(civil_from_days(0), (1970, 1, 1));
        assert_eq!(civil_from_days(11_017), (2000, 3, 1));
        assert_eq!(civil_from_days(19_782), (2024, 2, 29));
        assert_eq!(civil_from_days(-1), (1969, 12, 31));
    }

    #[test]
    fn decimals_of_intervals() {
        assert_eq!(decimals(0.25), 2);
        assert_eq!(decimals(0.5), 1);
        assert_eq!(decimals(2.0), 0);
        assert_eq!(decimals(2.5), 1);
        assert_eq!(decimals(0.05), 2);
    }

    #[test]
    fn signed_uses_a_real_minus_and_no_negative_zero() {
        assert_eq!(signed(-0.3, 2), "\u{2212}0.30");
        assert_eq!(signed(-0.001, 2), "0.00");
        assert_eq!(signed(2.5, 1), "2.5");
    }

    #[test]
    fn nice_scale_lengths() {
        assert_eq!(nice_below(73.0), 50.0);
        assert_eq!(nice_below(19.9), 10.0);
        assert_eq!(nice_below(250.0), 200.0);
        assert_eq!(nice_below(1.0), 1.0);
    }

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
