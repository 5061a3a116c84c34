//! The near-field term of the superposition kernel: partial penetration of wells whose screen
//! does not span the saturated thickness.
//!
//! For a well of rate Q screened over part of a layer of thickness D, the steady drawdown is the
//! fully penetrating one plus Q/(2πT)·Δ(r, z) (Muskat 1937; Hantush 1957; Kruseman & de Ridder,
//! *Analysis and Evaluation of Pumping Test Data*, 2nd ed. 1994, ch. 10; checks.md §12; the series
//! in [`crate::physics::partial_penetration`]). In discharge potential (confined Φ = T·h + const)
//! this is ΔΦ_extra = −Q/(2π)·Δ(r, z): linear in the rate, so it is one more per-source term of
//! the kernel and the linear programme stays linear.
//!
//! Approximations, stated once here and in the reports:
//! - unconfined and converting aquifers: Δ is applied on the saturated thickness before pumping,
//!   D = initial level − base (confined: the layer thickness), with the screen clipped to it —
//!   the linearisation ΔΦ ≈ K·D·Δh of Φ = ½K·h² about the initial level;
//! - leaky aquifers: the confined correction is used unchanged (the leaky one differs only where
//!   r is comparable with B, far beyond the near field when B ≫ D);
//! - a check point is evaluated at its own elevation ([`NearField::tables_at`]; the caller
//!   chooses it), the map at one elevation, both clamped to the saturated layer; a point within a
//!   well's radius is in that well and gets the screen-averaged Δ_w of its own well and the other
//!   wells' Δ averaged over its screen ([`crate::physics::screen_average`], Gauss–Legendre);
//! - beyond [`cutoff_radius`] (|Δ| < [`NEAR_FIELD_TOLERANCE`] = 1e-3) the term is dropped.
//!
//! Δ(r) at a fixed elevation is tabulated once per screen on a uniform grid in ln r and read by
//! cubic (Catmull–Rom) interpolation, within 1e-6 of the series (tested below). The tables
//! averaged over a well's screen (dear: a quadrature of the series per node, most of it near
//! the well, where no other well stands) compute each node on first read, to the same values.

use crate::physics::partial_penetration::{
    cutoff_radius, is_partial, point_correction, well_correction, Screen,
};
use crate::physics::screen_average::screen_averaged_correction;
use std::collections::HashMap;
use std::f64::consts::PI;
use std::sync::{Arc, Mutex, OnceLock};

/// The near-field term is dropped where |Δ| < this, i.e. an error below 1e-3·Q/(2πT) metres
/// (under a millimetre for any well of the demos; the physics module's default of 1e-4 costs
/// twice the pairs on a map for a tenth of a millimetre).
pub const NEAR_FIELD_TOLERANCE: f64 = 1e-3;

/// Nodes of each Δ(ln r) table.
const TABLE_NODES: usize = 320;

/// Δ(r) at one elevation (or averaged over a screen) for one screen, tabulated in u = ln r.
#[derive(Debug)]
struct Table {
    u0: f64,
    du: f64,
    nodes: Nodes,
    cutoff: f64,
}

/// The node values of a [`Table`]: all computed when it is built, or each on first read.
enum Nodes {
    /// Every node computed.
    Ready(Vec<f64>),
    /// Each node computed on first read (the same value as `Ready` would hold): for the
    /// screen-averaged tables, read only at the distances between wells but dear near the well
    /// (a quadrature of the series per node).
    Lazy {
        cells: Vec<OnceLock<f64>>,
        value: LazyValue,
    },
}

/// Δ(r) of a lazily built table.
type LazyValue = Box<dyn Fn(f64) -> f64 + Send + Sync>;

impl std::fmt::Debug for Nodes {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Nodes::Ready(v) => f.debug_tuple("Ready").field(&v.len()).finish(),
            Nodes::Lazy { cells, .. } => f.debug_tuple("Lazy").field(&cells.len()).finish(),
        }
    }
}

impl Table {
    /// The ln r grid from `r_lo` to `cutoff`: (u0, du).
    fn grid(r_lo: f64, cutoff: f64) -> (f64, f64) {
        let u0 = r_lo.ln();
        let u1 = cutoff.max(r_lo * 1.001).ln();
        (u0, (u1 - u0) / (TABLE_NODES - 1) as f64)
    }

    /// The radius of node `i` (one node either side of the range for the cubic at the ends).
    #[inline]
    fn node_radius(u0: f64, du: f64, i: usize) -> f64 {
        (u0 + (i as f64 - 1.0) * du).exp()
    }

    /// Δ(r) = `value(r)` tabulated from `r_lo` to `cutoff`.
    fn build(value: impl Fn(f64) -> f64, r_lo: f64, cutoff: f64) -> Table {
        let (u0, du) = Table::grid(r_lo, cutoff);
        let values = (0..TABLE_NODES + 2)
            .map(|i| value(Table::node_radius(u0, du, i)))
            .collect();
        Table {
            u0,
            du,
            nodes: Nodes::Ready(values),
            cutoff,
        }
    }

    /// As [`Table::build`], each node computed when first read (same values).
    fn build_lazy(value: LazyValue, r_lo: f64, cutoff: f64) -> Table {
        let (u0, du) = Table::grid(r_lo, cutoff);
        Table {
            u0,
            du,
            nodes: Nodes::Lazy {
                cells: (0..TABLE_NODES + 2).map(|_| OnceLock::new()).collect(),
                value,
            },
            cutoff,
        }
    }

    /// Δ at radius r (r below the table's start is read at the start).
    fn at(&self, r: f64) -> f64 {
        if r >= self.cutoff {
            return 0.0;
        }
        self.at_log(r.ln())
    }

    /// Δ at u = ln r (below the table's start read at the start; the caller applies the cut-off).
    #[inline]
    fn at_log(&self, u: f64) -> f64 {
        let t = ((u - self.u0) / self.du).max(0.0);
        let i = (t as usize).min(TABLE_NODES - 2);
        let f = t - i as f64;
        let lazy;
        let p: &[f64] = match &self.nodes {
            Nodes::Ready(values) => &values[i..i + 4],
            Nodes::Lazy { cells, value } => {
                lazy = [0, 1, 2, 3].map(|k| {
                    *cells[i + k].get_or_init(|| value(Table::node_radius(self.u0, self.du, i + k)))
                });
                &lazy
            }
        };
        // Catmull–Rom between p[1] and p[2]
        let a = -0.5 * p[0] + 1.5 * p[1] - 1.5 * p[2] + 0.5 * p[3];
        let b = p[0] - 2.5 * p[1] + 2.0 * p[2] - 0.5 * p[3];
        let c = -0.5 * p[0] + 0.5 * p[2];
        ((a * f + b) * f + c) * f + p[1]
    }
}

type Key = [u64; 7];

/// Per block of points: (point, ΔΦ) summed, and the points that stand inside a well.
type BlockSums = (Vec<(usize, f64)>, Vec<usize>);

fn cache() -> &'static Mutex<HashMap<Key, Arc<Table>>> {
    static CACHE: OnceLock<Mutex<HashMap<Key, Arc<Table>>>> = OnceLock::new();
    CACHE.get_or_init(|| Mutex::new(HashMap::new()))
}

/// The table for `screen` at elevation `z`, from the cache when it was built before (the count
/// search builds many fields with the same wells).
fn table(screen: &Screen, z: f64, r_lo: f64) -> Arc<Table> {
    cached_table(screen, [z, f64::NAN], r_lo)
}

/// The table for `screen` averaged over the elevations `over` = [bottom, top] (m above the base):
/// its share in the level of a well screened there.
fn averaged_table(screen: &Screen, over: [f64; 2], r_lo: f64) -> Arc<Table> {
    cached_table(screen, over, r_lo)
}

/// A point table (`at[1]` NaN: at elevation `at[0]`) or a screen-averaged one, cached.
fn cached_table(screen: &Screen, at: [f64; 2], r_lo: f64) -> Arc<Table> {
    let key = [
        screen.bottom.to_bits(),
        screen.top.to_bits(),
        screen.thickness.to_bits(),
        screen.anisotropy.to_bits(),
        at[0].to_bits(),
        at[1].to_bits(),
        r_lo.to_bits(),
    ];
    if let Ok(c) = cache().lock() {
        if let Some(t) = c.get(&key) {
            return t.clone();
        }
    }
    let cutoff = cutoff_radius(screen, NEAR_FIELD_TOLERANCE);
    let t = Arc::new(if at[1].is_nan() {
        Table::build(|r| point_correction(screen, r, at[0]), r_lo, cutoff)
    } else {
        let (s, [b, t]) = (*screen, at);
        Table::build_lazy(
            Box::new(move |r| screen_averaged_correction(&s, r, b, t)),
            r_lo,
            cutoff,
        )
    });
    if let Ok(mut c) = cache().lock() {
        if c.len() > 256 {
            c.clear();
        }
        c.insert(key, t.clone());
    }
    t
}

/// One partially penetrating source (a real well or an image of one).
#[derive(Debug, Clone, Copy)]
struct PartialSource {
    position: [f64; 2],
    radius: f64,
    well: usize,
    sign: f64,
    class: usize,
    real: bool,
}

/// Δ tables for check points at one elevation, one per screen class
/// ([`NearField::tables_at`]); in layered ground, the aquifer the elevation reads instead
/// ([`PointTables::in_aquifer`]).
#[derive(Debug, Clone)]
pub struct PointTables(Vec<Arc<Table>>, Option<usize>);

impl PointTables {
    /// No partial-penetration tables: points read the head of aquifer `i` of layered ground.
    pub fn in_aquifer(i: usize) -> PointTables {
        PointTables(Vec::new(), Some(i))
    }

    /// The aquifer of layered ground these points read, if any.
    pub fn aquifer(&self) -> Option<usize> {
        self.1
    }
}

/// A screen class: the wells built alike, with their tables.
#[derive(Debug)]
struct Class {
    /// The class's screen (relative to the base, with the anisotropy).
    screen: Screen,
    /// Smallest radius tabulated, m.
    r_lo: f64,
    /// Δ at the default evaluation elevation.
    at_points: Arc<Table>,
    /// Δ averaged over each class's screen (indexed by the other class).
    at_screen_of: Vec<Arc<Table>>,
    /// Screen-averaged Δ_w in the well itself.
    own: f64,
    cutoff: f64,
}

/// The partial-penetration term of a field.
#[derive(Debug)]
pub struct NearField {
    sources: Vec<PartialSource>,
    classes: Vec<Class>,
    cell: f64,
    grid: HashMap<(i64, i64), Vec<usize>>,
    /// Largest cut-off over the classes, m.
    pub cutoff: f64,
    base: f64,
    thickness: f64,
}

/// What the near-field needs to know of one well: screen (levels, m above datum), radius.
#[derive(Debug, Clone, Copy)]
pub struct WellScreen {
    /// Screen base level, m.
    pub screen_base: f64,
    /// Screen top level, m.
    pub screen_top: f64,
    /// Well radius, m.
    pub radius: f64,
}

impl NearField {
    /// The near-field term for `wells` (local positions, with their images as (position,
    /// well index, sign, is-real)) in a layer from `base` (m) of thickness `d` (m) with anisotropy
    /// K_v/K_h = `anisotropy`, check points evaluated at level `z_eval` (m). `None` when every
    /// well fully penetrates.
    pub fn new(
        wells: &[WellScreen],
        sources: &[([f64; 2], usize, f64, bool)],
        base: f64,
        d: f64,
        anisotropy: f64,
        z_eval: f64,
    ) -> Option<NearField> {
        if !(d.is_finite() && d > 0.0) {
            return None;
        }
        let screen_of = |w: &WellScreen| {
            Screen::new(w.screen_base - base, w.screen_top - base, d).with_anisotropy(anisotropy)
        };
        // classes of wells built alike
        let mut keys: Vec<(u64, u64, u64)> = Vec::new();
        let mut class_of = vec![usize::MAX; wells.len()];
        for (i, w) in wells.iter().enumerate() {
            if !is_partial(&screen_of(w)) {
                continue;
            }
            let k = (
                w.screen_base.to_bits(),
                w.screen_top.to_bits(),
                w.radius.to_bits(),
            );
            class_of[i] = match keys.iter().position(|x| *x == k) {
                Some(c) => c,
                None => {
                    keys.push(k);
                    keys.len() - 1
                }
            };
        }
        if keys.is_empty() {
            return None;
        }
        let rep: Vec<WellScreen> = keys
            .iter()
            .map(|k| WellScreen {
                screen_base: f64::from_bits(k.0),
                screen_top: f64::from_bits(k.1),
                radius: f64::from_bits(k.2),
            })
            .collect();
        let z_rel = (z_eval - base).clamp(0.0, d);
        // each class's screen, clamped to the layer: the others' share is averaged over it
        let rep_spans: Vec<[f64; 2]> = rep
            .iter()
            .map(|w| {
                let s = screen_of(w);
                [s.bottom.clamp(0.0, d), s.top.clamp(0.0, d)]
            })
            .collect();
        let classes: Vec<Class> = rep
            .iter()
            .map(|w| {
                let s = screen_of(w);
                let r_lo = w.radius.max(1e-6 * d);
                Class {
                    screen: s,
                    r_lo,
                    at_points: table(&s, z_rel, r_lo),
                    at_screen_of: rep_spans
                        .iter()
                        .map(|&span| averaged_table(&s, span, r_lo))
                        .collect(),
                    own: well_correction(&s, w.radius),
                    cutoff: 0.0,
                }
            })
            .collect();
        let mut classes = classes;
        for c in &mut classes {
            // the cut-off was found once with the table (cached with it)
            c.cutoff = c.at_points.cutoff;
        }
        let cutoff = classes.iter().map(|c| c.cutoff).fold(0.0, f64::max);
        let list: Vec<PartialSource> = sources
            .iter()
            .filter(|(_, w, _, _)| class_of[*w] != usize::MAX)
            .map(|&(position, well, sign, real)| PartialSource {
                position,
                radius: wells[well].radius,
                well,
                sign,
                class: class_of[well],
                real,
            })
            .collect();
        let cell = cutoff.max(1e-3);
        let mut grid: HashMap<(i64, i64), Vec<usize>> = HashMap::new();
        for (i, s) in list.iter().enumerate() {
            grid.entry(cell_index(s.position, cell))
                .or_default()
                .push(i);
        }
        Some(NearField {
            sources: list,
            classes,
            cell,
            grid,
            cutoff,
            base,
            thickness: d,
        })
    }

    /// The Δ tables for check points at level `z` (m, clamped to the layer), one per class
    /// (cached: a few elevations cost a few tables).
    pub fn tables_at(&self, z: f64) -> PointTables {
        let z_rel = (z - self.base).clamp(0.0, self.thickness);
        PointTables(
            self.classes
                .iter()
                .map(|c| table(&c.screen, z_rel, c.r_lo))
                .collect(),
            None,
        )
    }

    /// Call `f(well, ΔΦ per unit rate)` for every partially penetrating source near local point
    /// `p`: −Δ/(2π), with Δ_w for the well the point stands in (at the default elevation).
    pub fn for_each(&self, p: [f64; 2], f: impl FnMut(usize, f64)) {
        self.for_each_at(p, None, f)
    }

    /// As [`NearField::for_each`], with the point's own elevation's `tables` (`None`: the
    /// default elevation).
    pub fn for_each_at(
        &self,
        p: [f64; 2],
        tables: Option<&PointTables>,
        mut f: impl FnMut(usize, f64),
    ) {
        let (ci, cj) = cell_index(p, self.cell);
        // first: is the point inside one of the wells?
        let mut inside: Option<usize> = None;
        for di in -1..=1 {
            for dj in -1..=1 {
                if let Some(v) = self.grid.get(&(ci + di, cj + dj)) {
                    for &i in v {
                        let s = &self.sources[i];
                        let r = (s.position[0] - p[0]).hypot(s.position[1] - p[1]);
                        if s.real && r <= s.radius * (1.0 + 1e-9) {
                            inside = Some(i);
                        }
                    }
                }
            }
        }
        for di in -1..=1 {
            for dj in -1..=1 {
                let Some(v) = self.grid.get(&(ci + di, cj + dj)) else {
                    continue;
                };
                for &i in v {
                    let s = &self.sources[i];
                    let c = &self.classes[s.class];
                    let r = (s.position[0] - p[0]).hypot(s.position[1] - p[1]);
                    if r >= c.cutoff {
                        continue;
                    }
                    let delta = match inside {
                        Some(k) if k == i => c.own,
                        Some(k) => c.at_screen_of[self.sources[k].class].at(r.max(s.radius)),
                        None => match tables {
                            Some(t) => t.0[s.class].at(r.max(s.radius)),
                            None => c.at_points.at(r.max(s.radius)),
                        },
                    };
                    f(s.well, -s.sign * delta / (2.0 * PI));
                }
            }
        }
    }

    /// ΔΦ of the near-field term at many local points `pts` for `rates` (m³/s), added to
    /// `delta`. Points are taken in square blocks; each block gathers once the sources within
    /// the cut-off of any of its points, then sums −sign·q·Δ(r)/(2π) over them point by point.
    /// Returns the points that stand inside a well (r ≤ r_w of a real source): those need
    /// [`NearField::for_each`] (the screen-averaged Δ_w) and are left unchanged here.
    /// `tables`: the points' elevation (`None`: the default one).
    pub fn add_levels(
        &self,
        pts: &[[f64; 2]],
        rates: &[f64],
        delta: &mut [f64],
        tables: Option<&PointTables>,
    ) -> Vec<usize> {
        use rayon::prelude::*;
        if pts.is_empty() {
            return Vec::new();
        }
        let at: Vec<&Table> = match tables {
            Some(t) => t.0.iter().map(|x| x.as_ref()).collect(),
            None => self.classes.iter().map(|c| c.at_points.as_ref()).collect(),
        };
        let ws: Vec<f64> = self
            .sources
            .iter()
            .map(|s| -s.sign * rates[s.well] / (2.0 * PI))
            .collect();
        let side = (0.25 * self.cutoff).max(1e-3);
        let blocks = blocks_of(pts, side);
        let reach = self.cutoff + side * std::f64::consts::FRAC_1_SQRT_2;
        let results: Vec<BlockSums> = blocks
            .par_iter()
            .map(|((bi, bj), members)| {
                let c = [(*bi as f64 + 0.5) * side, (*bj as f64 + 0.5) * side];
                // candidate sources for the whole block, flat: x, y, weight, r_w², cut-off²,
                // real well, class
                let (ci, cj) = cell_index(c, self.cell);
                let mut cand: Vec<(f64, f64, f64, f64, f64, bool, usize)> = Vec::new();
                for di in -1..=1 {
                    for dj in -1..=1 {
                        if let Some(v) = self.grid.get(&(ci + di, cj + dj)) {
                            for &k in v {
                                let s = &self.sources[k];
                                let d = (s.position[0] - c[0]).hypot(s.position[1] - c[1]);
                                // a real well is kept at zero rate too: a point in an
                                // idle well reads its screen average
                                if d < reach && (ws[k] != 0.0 || s.real) {
                                    let cut = self.classes[s.class].cutoff;
                                    cand.push((
                                        s.position[0],
                                        s.position[1],
                                        ws[k],
                                        s.radius * s.radius,
                                        cut * cut,
                                        s.real,
                                        s.class,
                                    ));
                                }
                            }
                        }
                    }
                }
                let mut out = Vec::with_capacity(members.len());
                let mut slow = Vec::new();
                for &i in members {
                    let p = pts[i];
                    let mut acc = 0.0;
                    let mut inside = false;
                    for &(x, y, w, rw2, cut2, real, class) in &cand {
                        let dx = x - p[0];
                        let dy = y - p[1];
                        let r2 = dx * dx + dy * dy;
                        if r2 >= cut2 {
                            continue;
                        }
                        if real && r2 <= rw2 * (1.0 + 2e-9) {
                            inside = true;
                            break;
                        }
                        acc += w * at[class]
                            .at_log(0.5 * crate::field::fast_log::ln_fast(r2.max(rw2)));
                    }
                    if inside {
                        slow.push(i);
                    } else {
                        out.push((i, acc));
                    }
                }
                (out, slow)
            })
            .collect();
        let mut slow_all = Vec::new();
        for (out, slow) in results {
            for (i, v) in out {
                delta[i] += v;
            }
            slow_all.extend(slow);
        }
        slow_all
    }
}

/// Points grouped by square block of side `side`: (block index, members). A counting sort over
/// the points' bounding box (a map grid fills it), or a hash map for scattered points.
fn blocks_of(pts: &[[f64; 2]], side: f64) -> Vec<((i64, i64), Vec<usize>)> {
    let (mut x0, mut y0, mut x1, mut y1) = (f64::MAX, f64::MAX, f64::MIN, f64::MIN);
    for p in pts {
        x0 = x0.min(p[0]);
        y0 = y0.min(p[1]);
        x1 = x1.max(p[0]);
        y1 = y1.max(p[1]);
    }
    let (i0, j0) = cell_index([x0, y0], side);
    let (i1, j1) = cell_index([x1, y1], side);
    let (nx, ny) = ((i1 - i0 + 1) as usize, (j1 - j0 + 1) as usize);
    if nx.saturating_mul(ny) > 4 * pts.len() + 1024 {
        let mut map: HashMap<(i64, i64), Vec<usize>> = HashMap::new();
        for (i, p) in pts.iter().enumerate() {
            map.entry(cell_index(*p, side)).or_default().push(i);
        }
        return map.into_iter().collect();
    }
    let mut cells: Vec<Vec<usize>> = vec![Vec::new(); nx * ny];
    for (i, p) in pts.iter().enumerate() {
        let (ci, cj) = cell_index(*p, side);
        cells[(cj - j0) as usize * nx + (ci - i0) as usize].push(i);
    }
    cells
        .into_iter()
        .enumerate()
        .filter(|(_, v)| !v.is_empty())
        .map(|(k, v)| ((i0 + (k % nx) as i64, j0 + (k / nx) as i64), v))
        .collect()
}

fn cell_index(p: [f64; 2], cell: f64) -> (i64, i64) {
    ((p[0] / cell).floor() as i64, (p[1] / cell).floor() as i64)
}

#[cfg(test)]
mod tests {
    use super::*;

    // The table is a shortcut: it must equal the series of partial_penetration (itself tested
    // against the scipy table of checks.md §12) to 1e-6 over the near field.
    #[test]
    fn table_matches_the_series() {
        for (z1, z2, d, a, z) in [
            (2.5, 3.5, 9.0, 1.0, 3.9),
            (0.0, 1.0, 9.0, 0.1, 5.0),
            (4.0, 9.0, 20.0, 1.0, 2.0),
        ] {
            let s = Screen::new(z1, z2, d).with_anisotropy(a);
            let t = table(&s, z, 0.03);
            let mut r = 0.03;
            while r < t.cutoff {
                let exact = point_correction(&s, r, z);
                assert!(
                    (t.at(r) - exact).abs() < 1e-6 * exact.abs().max(1.0),
                    "r {r}: {} vs {exact}",
                    t.at(r)
                );
                r *= 1.013;
            }
        }
    }

    // Nodes computed on first read are the nodes computed up front: the same numbers, in any
    // order of reading; and the averaged table follows the averaged series of
    // physics::screen_average (tested against scipy there) to 1e-6.
    #[test]
    fn lazy_table_equals_the_built_one() {
        let s = Screen::new(4.0, 12.0, 15.0).with_anisotropy(0.5);
        let (b, t) = (3.0, 11.0);
        let cutoff = cutoff_radius(&s, NEAR_FIELD_TOLERANCE);
        let eager = Table::build(|r| screen_averaged_correction(&s, r, b, t), 0.15, cutoff);
        let lazy = Table::build_lazy(
            Box::new(move |r| screen_averaged_correction(&s, r, b, t)),
            0.15,
            cutoff,
        );
        let mut r = cutoff * 0.99;
        while r > 0.15 {
            assert_eq!(lazy.at(r).to_bits(), eager.at(r).to_bits(), "r {r}");
            let exact = screen_averaged_correction(&s, r, b, t);
            assert!((lazy.at(r) - exact).abs() < 1e-6 * exact.abs().max(1.0));
            r *= 0.93;
        }
    }
}
