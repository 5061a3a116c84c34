//! The superposition kernel: the change in discharge potential at a point from every well.
//!
//! For one well of rate Q (m³/s, positive = abstraction) at distance r (Strack 1989, §8; Thiem):
//! ΔΦ = −Q/(2π)·ln(R/r) for r < R, 0 beyond; leaky (Hantush–Jacob steady): ΔΦ = −Q/(2π)·K₀(r/B).
//! r is clamped at the well radius. Straight boundaries add image wells (Ferris et al. 1962, USGS
//! WSP 1536-E): constant head → image of opposite sign, barrier → same sign, mirrored across the
//! line. The total ΔΦ is added to Φ₀ and turned back into a level by [`Aquifer::level`].
//!
//! Wells in range of a point are found with an R-tree (`rstar`); the plain all-pairs sum gives the
//! same result (tested on seeded random layouts).
//!
//! Wells whose screen does not span the saturated thickness add a near-field term, linear in the
//! rate ([`crate::field::near_field`], partial penetration): set with
//! [`Field::with_partial_penetration`].

use crate::field::fast_log::ln_fast;
use crate::field::layered::LayeredKernel;
use crate::field::near_field::{NearField, PointTables, WellScreen};
use crate::field::walls::{WallInput, WallModes, WallSolution};
use crate::field::wells::Well;
use crate::geometry::mirror_point;
use crate::input::model::Boundary;
use crate::physics::images::{image_set, image_sign};
use crate::physics::potential::{Aquifer, Level};
use crate::physics::special::bessel_k0;
use rayon::prelude::*;
use rstar::primitives::GeomWithData;
use rstar::RTree;
use std::f64::consts::PI;
use std::sync::Arc;

/// Beyond this many leakage factors a leaky well's K₀ term is below 1e-11 and is cut off.
const LEAKY_CUTOFF_B: f64 = 25.0;

/// Images are kept out to this many cut-off radii from their well (farther ones add nothing
/// to any point within the map).
const IMAGE_REACH_FACTOR: f64 = 3.0;

type Indexed = GeomWithData<[f64; 2], usize>;

/// One point source: a real well or an image of one.
#[derive(Debug, Clone, Copy)]
pub struct Source {
    /// Position, m (relative to the field's origin).
    pub position: [f64; 2],
    /// Radius the distance is clamped at, m.
    pub radius: f64,
    /// Index of the real well this source belongs to.
    pub well: usize,
    /// +1 for the real well and barrier images, −1 for constant-head images.
    pub sign: f64,
}

/// A well field ready to evaluate: aquifer, cut-off radius, wells and their images, indexed.
pub struct Field {
    aquifer: Aquifer,
    radius_of_influence: f64,
    cutoff: f64,
    origin: [f64; 2],
    sources: Vec<Source>,
    tree: RTree<Indexed>,
    well_count: usize,
    /// Whether each source is a real well (not an image).
    real: Vec<bool>,
    /// Partial penetration near the wells, when some screen does not span the layer.
    near: Option<NearField>,
    /// Layered ground: the multi-aquifer kernel, when the ground has `[[layer]]` entries.
    layered: Option<Arc<LayeredKernel>>,
    /// The aquifer points read by default (layered ground), and whose level `aquifer` is.
    default_aquifer: usize,
    /// Cut-off walls solved for each well of unit rate, when the model has `[[wall]]` entries.
    walls: Option<Arc<WallSolution>>,
}

impl Field {
    /// Build the field for `wells` in `aquifer` with radius of influence `radius_of_influence` (m)
    /// and image wells for each straight boundary. Coordinates are shifted to `origin` inside,
    /// so projected coordinates (x ≈ 500 000 m) lose no precision.
    pub fn new(
        aquifer: &Aquifer,
        radius_of_influence: f64,
        wells: &[Well],
        boundaries: &[Boundary],
        origin: [f64; 2],
    ) -> Field {
        let local = |p: [f64; 2]| [p[0] - origin[0], p[1] - origin[1]];
        let cutoff = match aquifer.leakage_factor() {
            Some(b) => LEAKY_CUTOFF_B * b,
            None => radius_of_influence,
        };
        let lines: Vec<_> = boundaries
            .iter()
            .map(|b| (local(b.line[0]), local(b.line[1]), b.kind))
            .collect();
        let mut sources = Vec::with_capacity(wells.len() * (1 + boundaries.len()));
        let mut real = Vec::with_capacity(sources.capacity());
        for (i, w) in wells.iter().enumerate() {
            let p = local(w.position);
            real.push(true);
            sources.push(Source {
                position: p,
                radius: w.radius,
                well: i,
                sign: 1.0,
            });
            // Geometry is checked when the design file is validated; an unsolvable set keeps
            // first-order images only.
            let images = image_set(p, &lines, IMAGE_REACH_FACTOR * cutoff).unwrap_or_else(|_| {
                lines
                    .iter()
                    .map(|(a, c, k)| (mirror_point(p, *a, *c), image_sign(*k)))
                    .collect()
            });
            for (position, sign) in images {
                real.push(false);
                sources.push(Source {
                    position,
                    radius: w.radius,
                    well: i,
                    sign,
                });
            }
        }
        let tree = RTree::bulk_load(
            sources
                .iter()
                .enumerate()
                .map(|(i, s)| GeomWithData::new(s.position, i))
                .collect(),
        );
        Field {
            aquifer: aquifer.clone(),
            radius_of_influence,
            cutoff,
            origin,
            sources,
            tree,
            well_count: wells.len(),
            real,
            near: None,
            layered: None,
            default_aquifer: 0,
            walls: None,
        }
    }

    /// The same field in layered ground: the kernel of every well from `kernel` (built for the
    /// field's wells), points read by default the aquifer holding level `z_eval` (m). No
    /// partial-penetration term is added (split an aquifer into sublayers instead).
    pub fn with_layers(mut self, kernel: LayeredKernel, z_eval: f64) -> Field {
        self.near = None;
        self.default_aquifer = kernel.aquifer_at(z_eval);
        self.aquifer = kernel.aquifer(self.default_aquifer).clone();
        self.cutoff = kernel.reach();
        self.layered = Some(Arc::new(kernel));
        self
    }

    /// The same field with cut-off walls: their line-doublet jumps solved once for each well of
    /// unit rate ([`WallSolution`]), with images in `boundaries` (the field's boundaries).
    /// Apply after [`Field::with_layers`] / [`Field::with_partial_penetration`].
    pub fn with_walls(
        mut self,
        walls: &[crate::input::model_walls::Wall],
        boundaries: &[Boundary],
    ) -> Field {
        if walls.is_empty() {
            return self;
        }
        let (cut, conductivities, modes) = match &self.layered {
            Some(k) => (
                walls
                    .iter()
                    .map(|w| k.ground().cut_by_wall(w.toe_level))
                    .collect(),
                k.ground()
                    .aquifers
                    .iter()
                    .map(|a| a.aquifer.conductivity)
                    .collect(),
                k.wall_modes(),
            ),
            None => (
                vec![vec![0]; walls.len()],
                vec![self.aquifer.conductivity],
                WallModes::single(self.aquifer.leakage_factor()),
            ),
        };
        let o = self.origin;
        let lines = boundaries
            .iter()
            .map(|b| (self.local(b.line[0]), self.local(b.line[1]), b.kind))
            .collect();
        let input = WallInput {
            walls,
            cut,
            conductivities,
            modes,
            lines,
            origin: o,
        };
        let n = self.well_count;
        let solution = WallSolution::new(input, n, |x, at| {
            let mut row = vec![0.0; n];
            self.for_each_well([x[0] + o[0], x[1] + o[1]], at, |w, v| row[w] += v);
            row
        });
        self.walls = Some(Arc::new(solution));
        self
    }

    /// The solved walls, when there are any.
    pub fn walls(&self) -> Option<&WallSolution> {
        self.walls.as_deref()
    }

    /// The multi-aquifer kernel, in layered ground.
    pub fn layered(&self) -> Option<&LayeredKernel> {
        self.layered.as_deref()
    }

    /// The aquifer points read by default (0 without layers).
    pub fn default_aquifer(&self) -> usize {
        self.default_aquifer
    }

    /// The level in each aquifer at `point` for `rates` (m³/s), top down: one value without
    /// layers. For settlement of a compressible layer from the heads above and below it.
    pub fn levels_in_each_aquifer(&self, point: [f64; 2], rates: &[f64]) -> Vec<Level> {
        let Some(k) = &self.layered else {
            return vec![self.level(point, rates)];
        };
        (0..k.aquifer_count())
            .map(|at| {
                let mut d = 0.0;
                self.for_each_well(point, at, |w, v| d += rates[w] * v);
                d += self.walls_delta(point, at, rates);
                let a = k.aquifer(at);
                a.level(a.initial_potential() + d)
            })
            .collect()
    }

    /// The same field with partial penetration of every well whose screen does not span the
    /// saturated thickness D (the aquifer's thickness before pumping; see
    /// [`crate::field::near_field`] for the approximations), vertical anisotropy
    /// `anisotropy` = K_v/K_h, check points and the map evaluated at level `z_eval` (m, clamped to
    /// the layer). `wells` must be the wells the field was built with.
    pub fn with_partial_penetration(
        mut self,
        wells: &[Well],
        anisotropy: f64,
        z_eval: f64,
    ) -> Field {
        let screens: Vec<WellScreen> = wells
            .iter()
            // water enters over the filter column round the screen (the screen when none given)
            .map(|w| WellScreen {
                screen_base: w.filter_base,
                screen_top: w.filter_top,
                radius: w.radius,
            })
            .collect();
        let sources: Vec<([f64; 2], usize, f64, bool)> = self
            .sources
            .iter()
            .zip(&self.real)
            .map(|(s, r)| (s.position, s.well, s.sign, *r))
            .collect();
        let aq = &self.aquifer;
        self.near = NearField::new(
            &screens,
            &sources,
            aq.base_level,
            aq.initial_saturated_thickness(),
            anisotropy,
            z_eval,
        );
        self
    }

    /// The same field without the partial-penetration term (every well taken as fully
    /// penetrating), e.g. to compare with a plain Thiem sum.
    pub fn fully_penetrating(mut self) -> Field {
        self.near = None;
        self
    }

    /// Whether some well is partially penetrating (a near-field term is added).
    pub fn has_partial_penetration(&self) -> bool {
        self.near.is_some()
    }

    /// The aquifer.
    pub fn aquifer(&self) -> &Aquifer {
        &self.aquifer
    }

    /// Radius of influence R used for every well, m.
    pub fn radius_of_influence(&self) -> f64 {
        self.radius_of_influence
    }

    /// Number of real wells.
    pub fn well_count(&self) -> usize {
        self.well_count
    }

    /// ΔΦ per unit rate (1 m³/s) at distance r from a source, m³/s per m ÷ (m³/s) = 1/m·m.
    /// Thiem: −ln(R/r)/(2π); leaky: −K₀(r/B)/(2π). Zero beyond the cut-off.
    pub fn unit_potential(&self, r: f64, well_radius: f64) -> f64 {
        let r = r.max(well_radius);
        if r >= self.cutoff {
            return 0.0;
        }
        match self.aquifer.leakage_factor() {
            Some(b) => -bessel_k0(r / b) / (2.0 * PI),
            None => -(self.radius_of_influence / r).ln() / (2.0 * PI),
        }
    }

    fn local(&self, p: [f64; 2]) -> [f64; 2] {
        [p[0] - self.origin[0], p[1] - self.origin[1]]
    }

    /// Add `f(well, ΔΦ per unit rate)` for every source in range of `point` (site coordinates).
    fn for_each_in_range(&self, point: [f64; 2], mut f: impl FnMut(usize, f64)) {
        crate::work_counts::add(&crate::work_counts::KERNEL_SUMS, 1);
        self.for_each_thiem(point, &mut f);
        if let Some(n) = &self.near {
            n.for_each(self.local(point), f);
        }
    }

    /// As [`Field::for_each_in_range`], the Thiem / Hantush part only (no near-field term).
    fn for_each_thiem(&self, point: [f64; 2], f: impl FnMut(usize, f64)) {
        self.for_each_source(point, self.default_aquifer, f);
    }

    /// Add `f(well, ΔΦ per unit rate)` in aquifer `at` (layered ground; ignored otherwise)
    /// for every source in range of `point`.
    fn for_each_source(&self, point: [f64; 2], at: usize, mut f: impl FnMut(usize, f64)) {
        self.for_each_well(point, at, &mut f);
        if let Some(w) = &self.walls {
            w.for_each(self.local(point), at, f);
        }
    }

    /// As [`Field::for_each_source`], the wells and their images only (no walls).
    fn for_each_well(&self, point: [f64; 2], at: usize, mut f: impl FnMut(usize, f64)) {
        let p = self.local(point);
        for item in self
            .tree
            .locate_within_distance(p, self.cutoff * self.cutoff)
        {
            let s = &self.sources[item.data];
            let r = (s.position[0] - p[0]).hypot(s.position[1] - p[1]);
            let v = match &self.layered {
                Some(k) => k.unit_potential(s.well, at, r, s.radius),
                None => self.unit_potential(r, s.radius),
            };
            f(s.well, s.sign * v);
        }
    }

    /// Row of ΔΦ per unit rate of each real well at `point` (images folded into their well).
    pub fn unit_row(&self, point: [f64; 2]) -> Vec<f64> {
        let mut row = vec![0.0; self.well_count];
        self.for_each_in_range(point, |w, v| row[w] += v);
        row
    }

    /// The partial-penetration tables at elevation `z` (m), for [`Field::unit_row_at`] and
    /// [`Field::levels_at`] (`None` without partial penetration).
    pub fn elevation(&self, z: f64) -> Option<PointTables> {
        if let Some(k) = &self.layered {
            return Some(PointTables::in_aquifer(k.aquifer_at(z)));
        }
        self.near.as_ref().map(|n| n.tables_at(z))
    }

    /// The aquifer points with `tables` read, and its aquifer (for potential ↔ level).
    fn reading(&self, tables: Option<&PointTables>) -> (usize, &Aquifer) {
        match (&self.layered, tables.and_then(PointTables::aquifer)) {
            (Some(k), Some(i)) => (i, k.aquifer(i)),
            _ => (self.default_aquifer, &self.aquifer),
        }
    }

    /// As [`Field::unit_row`], with partial penetration at the elevation of `tables`
    /// ([`Field::elevation`]; `None`: the field's default elevation).
    pub fn unit_row_at(&self, point: [f64; 2], tables: Option<&PointTables>) -> Vec<f64> {
        let mut row = vec![0.0; self.well_count];
        self.for_each_source(point, self.reading(tables).0, |w, v| row[w] += v);
        if let Some(n) = &self.near {
            n.for_each_at(self.local(point), tables, |w, v| row[w] += v);
        }
        row
    }

    /// Same as [`Field::unit_row`] by the plain sum over every source, without the index.
    pub fn unit_row_all_pairs(&self, point: [f64; 2]) -> Vec<f64> {
        let p = self.local(point);
        let mut row = vec![0.0; self.well_count];
        for s in &self.sources {
            let r = (s.position[0] - p[0]).hypot(s.position[1] - p[1]);
            row[s.well] += s.sign
                * match &self.layered {
                    Some(k) => k.unit_potential(s.well, self.default_aquifer, r, s.radius),
                    None => self.unit_potential(r, s.radius),
                };
        }
        if let Some(n) = &self.near {
            n.for_each(p, |w, v| row[w] += v);
        }
        if let Some(walls) = &self.walls {
            walls.for_each(p, self.default_aquifer, |w, v| row[w] += v);
        }
        row
    }

    /// ΔΦ at `point` for the given rates (m³/s), summed over wells in range.
    pub fn delta_potential(&self, point: [f64; 2], rates: &[f64]) -> f64 {
        let mut sum = 0.0;
        if self.walls.is_some() {
            crate::work_counts::add(&crate::work_counts::KERNEL_SUMS, 1);
            self.for_each_well(point, self.default_aquifer, |w, v| sum += rates[w] * v);
            if let Some(n) = &self.near {
                n.for_each(self.local(point), |w, v| sum += rates[w] * v);
            }
            return sum + self.walls_delta(point, self.default_aquifer, rates);
        }
        self.for_each_in_range(point, |w, v| sum += rates[w] * v);
        sum
    }

    /// The walls' ΔΦ in aquifer `at` at `point` for `rates` (0 without walls).
    fn walls_delta(&self, point: [f64; 2], at: usize, rates: &[f64]) -> f64 {
        match &self.walls {
            Some(w) => w.delta(self.local(point), at, &w.jumps_cached(rates)),
            None => 0.0,
        }
    }

    /// Water level at `point` for the given rates.
    pub fn level(&self, point: [f64; 2], rates: &[f64]) -> Level {
        self.aquifer
            .level(self.aquifer.initial_potential() + self.delta_potential(point, rates))
    }

    /// Levels at many points, in parallel.
    ///
    /// Where every source is within the cut-off of a point (the usual case on a site map), the
    /// sum runs over flat arrays with an arithmetic logarithm; on many points, sources far from a
    /// block of points enter through a local (Taylor) expansion of Σ w·ln|z − z_j|² about the
    /// block's centre, exact to ~1e-14 of the sum (`Flat::far_expansion`). Elsewhere the
    /// R-tree sum of [`Field::level`] is used.
    pub fn levels(&self, points: &[[f64; 2]], rates: &[f64]) -> Vec<Level> {
        self.levels_at(points, rates, None)
    }

    /// As [`Field::levels`], with partial penetration at the elevation of `tables`
    /// ([`Field::elevation`]; `None`: the field's default elevation).
    pub fn levels_at(
        &self,
        points: &[[f64; 2]],
        rates: &[f64],
        tables: Option<&PointTables>,
    ) -> Vec<Level> {
        if self.aquifer.leakage_factor().is_some() || self.layered.is_some() || self.walls.is_some()
        {
            let (at, aquifer) = self.reading(tables);
            let jumps = self.walls.as_ref().map(|w| w.jumps_cached(rates));
            return points
                .par_iter()
                .map(|p| {
                    let mut d = 0.0;
                    self.for_each_well(*p, at, |w, v| d += rates[w] * v);
                    if let (Some(w), Some(j)) = (&self.walls, &jumps) {
                        d += w.delta(self.local(*p), at, j);
                    }
                    if let Some(n) = &self.near {
                        n.for_each_at(self.local(*p), tables, |w, v| d += rates[w] * v);
                    }
                    aquifer.level(aquifer.initial_potential() + d)
                })
                .collect();
        }
        crate::work_counts::add(&crate::work_counts::KERNEL_SUMS, points.len());
        let flat = Flat::new(&self.sources, rates);
        let [bx0, by0, bx1, by1] = bbox(self.sources.iter().map(|s| s.position));
        let c2 = self.cutoff * self.cutoff;
        let local: Vec<[f64; 2]> = points.iter().map(|p| self.local(*p)).collect();
        let all_in_range = |p: [f64; 2]| {
            let fx = (p[0] - bx0).abs().max((p[0] - bx1).abs());
            let fy = (p[1] - by0).abs().max((p[1] - by1).abs());
            fx * fx + fy * fy < c2
        };
        let fast: Vec<usize> = (0..points.len())
            .filter(|&i| all_in_range(local[i]))
            .collect();
        let mut delta = vec![f64::NAN; points.len()];
        let ln_r2 = (self.radius_of_influence * self.radius_of_influence).ln();
        let offset = flat.wsum * ln_r2;
        if fast.len() >= CELL_MIN_POINTS && flat.ws.len() >= CELL_MIN_SOURCES {
            for (i, v) in flat.sum_by_cells(&local, &fast) {
                delta[i] = v - offset;
            }
        } else {
            let vals: Vec<f64> = fast.par_iter().map(|&i| flat.direct(local[i])).collect();
            for (&i, v) in fast.iter().zip(vals) {
                delta[i] = v - offset;
            }
        }
        // the near-field term at every point, block by block; a point inside a well is summed
        // again in full by the R-tree path
        let mut near = vec![0.0; points.len()];
        let mut inside = vec![false; points.len()];
        if let Some(n) = &self.near {
            for j in n.add_levels(&local, rates, &mut near, tables) {
                inside[j] = true;
            }
        }
        let phi0 = self.aquifer.initial_potential();
        (0..points.len())
            .into_par_iter()
            .map(|i| {
                let pt = points[i];
                let d = if inside[i] {
                    self.delta_potential(pt, rates)
                } else if delta[i].is_nan() {
                    let mut sum = 0.0;
                    self.for_each_thiem(pt, |w, v| sum += rates[w] * v);
                    sum + near[i]
                } else {
                    delta[i] + near[i]
                };
                self.aquifer.level(phi0 + d)
            })
            .collect()
    }

    /// Matrix of ΔΦ per unit rate, one row per point, one column per well (row-major), in
    /// parallel. The linear programme for the rates is built on it.
    pub fn unit_matrix(&self, points: &[[f64; 2]]) -> Vec<Vec<f64>> {
        points.par_iter().map(|p| self.unit_row(*p)).collect()
    }
}

/// Bounding box [x_min, y_min, x_max, y_max] of points.
fn bbox(points: impl Iterator<Item = [f64; 2]>) -> [f64; 4] {
    points.fold([f64::MAX, f64::MAX, f64::MIN, f64::MIN], |b, p| {
        [
            b[0].min(p[0]),
            b[1].min(p[1]),
            b[2].max(p[0]),
            b[3].max(p[1]),
        ]
    })
}

/// Below this many points, or this many sources, [`Field::levels`] sums directly.
const CELL_MIN_POINTS: usize = 2048;
const CELL_MIN_SOURCES: usize = 16;
/// Points per block for the local expansion (a 16 × 16 patch of a map grid).
const POINTS_PER_CELL: f64 = 256.0;
/// A source counts as far from a block when it is at least this many block radii from its
/// centre; the expansion then converges at least as fast as 4⁻ᵏ.
const FAR_RATIO: f64 = 4.0;
/// Terms of the local expansion: (1/4)²¹/21 ≈ 2e-14 of Σ|w| left out.
const EXPANSION_TERMS: usize = 20;

/// Sources as flat arrays with weights w = sign·Q/(4π), so that ΔΦ = Σ w·ln(r²) − Σw·ln R²
/// (Thiem: −Q/(2π)·ln(R/r) = Q/(4π)·(ln r² − ln R²)).
struct Flat {
    xs: Vec<f64>,
    ys: Vec<f64>,
    r2min: Vec<f64>,
    ws: Vec<f64>,
    wsum: f64,
}

impl Flat {
    fn new(sources: &[Source], rates: &[f64]) -> Flat {
        let n = sources.len();
        let mut f = Flat {
            xs: Vec::with_capacity(n),
            ys: Vec::with_capacity(n),
            r2min: Vec::with_capacity(n),
            ws: Vec::with_capacity(n),
            wsum: 0.0,
        };
        for s in sources {
            f.xs.push(s.position[0]);
            f.ys.push(s.position[1]);
            // (at least 1e-12 m², so the arithmetic logarithm only ever sees normal numbers)
            f.r2min.push((s.radius * s.radius).max(1e-12));
            f.ws.push(s.sign * rates[s.well] / (4.0 * PI));
        }
        f.wsum = f.ws.iter().sum();
        f
    }

    /// Σ w·ln(max(r², r_w²)) over the sources `idx` at local point p.
    fn sum_over(&self, idx: impl Iterator<Item = usize>, p: [f64; 2]) -> f64 {
        let mut acc = 0.0;
        for i in idx {
            let dx = self.xs[i] - p[0];
            let dy = self.ys[i] - p[1];
            acc += self.ws[i] * ln_fast((dx * dx + dy * dy).max(self.r2min[i]));
        }
        acc
    }

    /// Σ w·ln(max(r², r_w²)) over every source at local point p.
    fn direct(&self, p: [f64; 2]) -> f64 {
        self.sum_over(0..self.ws.len(), p)
    }

    /// Local expansion about `c` of the far sources `idx`:
    /// Σ w·ln|z − z_j|² = Σ w·ln|a_j|² + 2·Re Σ_k c_k·uᵏ, with a_j = c − z_j, u = z − c and
    /// c_k = (−1)^(k+1)/k · Σ w·a_j⁻ᵏ (the Taylor series of ln(1 + u/a); it converges for
    /// |u| < |a|, here |u|/|a| ≤ 1/4). Returns the constant and the coefficients (re, im).
    fn far_expansion(&self, idx: &[usize], c: [f64; 2]) -> (f64, [[f64; 2]; EXPANSION_TERMS]) {
        let mut constant = 0.0;
        let mut coef = [[0.0; 2]; EXPANSION_TERMS];
        for &j in idx {
            let (ar, ai) = (c[0] - self.xs[j], c[1] - self.ys[j]);
            let m2 = ar * ar + ai * ai;
            constant += self.ws[j] * m2.ln();
            let (ir, ii) = (ar / m2, -ai / m2);
            let (mut pr, mut pi) = (ir, ii);
            for ck in coef.iter_mut() {
                ck[0] += self.ws[j] * pr;
                ck[1] += self.ws[j] * pi;
                let t = pr * ir - pi * ii;
                pi = pr * ii + pi * ir;
                pr = t;
            }
        }
        for (k, ck) in coef.iter_mut().enumerate() {
            let f = if k % 2 == 0 { 1.0 } else { -1.0 } / (k + 1) as f64;
            ck[0] *= f;
            ck[1] *= f;
        }
        (constant, coef)
    }

    /// Σ w·ln(max(r², r_w²)) at the points `which` of `pts`, block by block: near sources
    /// directly, far ones by [`Flat::far_expansion`].
    fn sum_by_cells(&self, pts: &[[f64; 2]], which: &[usize]) -> Vec<(usize, f64)> {
        let [x0, y0, x1, y1] = bbox(which.iter().map(|&i| pts[i]));
        let area = ((x1 - x0) * (y1 - y0)).max(1e-12);
        let side = (area * POINTS_PER_CELL / which.len() as f64)
            .sqrt()
            .max(1e-6);
        let nx = ((x1 - x0) / side) as usize + 1;
        let ny = ((y1 - y0) / side) as usize + 1;
        let cell_of = |p: [f64; 2]| {
            let ix = (((p[0] - x0) / side) as usize).min(nx - 1);
            let iy = (((p[1] - y0) / side) as usize).min(ny - 1);
            iy * nx + ix
        };
        let mut cells: Vec<Vec<usize>> = vec![Vec::new(); nx * ny];
        for &i in which {
            cells[cell_of(pts[i])].push(i);
        }
        cells
            .par_iter()
            .filter(|c| !c.is_empty())
            .flat_map_iter(|cell| {
                let [cx0, cy0, cx1, cy1] = bbox(cell.iter().map(|&i| pts[i]));
                let c = [(cx0 + cx1) / 2.0, (cy0 + cy1) / 2.0];
                let rho = cell
                    .iter()
                    .map(|&i| (pts[i][0] - c[0]).hypot(pts[i][1] - c[1]))
                    .fold(0.0, f64::max);
                let (mut near, mut far) = (Vec::new(), Vec::new());
                for j in 0..self.ws.len() {
                    let a = (self.xs[j] - c[0]).hypot(self.ys[j] - c[1]);
                    let clear = (FAR_RATIO * rho).max(rho + 2.0 * self.r2min[j].sqrt());
                    if a >= clear && rho > 0.0 {
                        far.push(j);
                    } else {
                        near.push(j);
                    }
                }
                let (constant, coef) = self.far_expansion(&far, c);
                cell.iter()
                    .map(|&i| {
                        let p = pts[i];
                        let (ur, ui) = (p[0] - c[0], p[1] - c[1]);
                        let (mut sr, mut si) = (0.0, 0.0);
                        for ck in coef.iter().rev() {
                            let t = sr + ck[0];
                            let v = si + ck[1];
                            sr = t * ur - v * ui;
                            si = t * ui + v * ur;
                        }
                        (
                            i,
                            constant + 2.0 * sr + self.sum_over(near.iter().copied(), p),
                        )
                    })
                    .collect::<Vec<_>>()
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use crate::field::fast_log::ln_fast;

    // Against the platform's libm logarithm (f64::ln), over the range of r² the kernel meets
    // (1e-12 m² … 1e14 m²) and beyond: within 4 ulp-scale relative error (absolute near x = 1).
    #[test]
    fn arithmetic_logarithm_matches_libm() {
        let mut x = 1e-12_f64;
        while x < 1e20 {
            for f in [1.0, 1.0000001, 1.3, 1.414, 1.5, 1.99999] {
                let v = x * f;
                let (a, b) = (ln_fast(v), v.ln());
                assert!(
                    (a - b).abs() <= 4.0 * f64::EPSILON * b.abs().max(1.0),
                    "{v}: {a} vs {b}"
                );
            }
            x *= 3.7;
        }
    }

    // The block expansion is a shortcut: it must equal the plain sum over every source (to
    // 1e-12 of Σ|w·ln r²|) on a seeded random field of wells and points, wells among the points.
    #[test]
    fn block_expansion_equals_the_plain_sum() {
        use super::{Flat, Source};
        let mut seed = 0x2545_f491_4f6c_dd1d_u64;
        let mut rnd = || {
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed >> 11) as f64 / (1u64 << 53) as f64
        };
        let sources: Vec<Source> = (0..70)
            .map(|i| Source {
                position: [rnd() * 300.0 - 150.0, rnd() * 200.0 - 100.0],
                radius: 0.1 + 0.2 * rnd(),
                well: i,
                sign: if i % 9 == 0 { -1.0 } else { 1.0 },
            })
            .collect();
        let rates: Vec<f64> = (0..70).map(|_| 1e-3 + 5e-3 * rnd()).collect();
        let flat = Flat::new(&sources, &rates);
        let mut pts: Vec<[f64; 2]> = (0..6000)
            .map(|_| [rnd() * 400.0 - 200.0, rnd() * 300.0 - 150.0])
            .collect();
        pts.extend(sources.iter().map(|s| s.position));
        let which: Vec<usize> = (0..pts.len()).collect();
        for (i, v) in flat.sum_by_cells(&pts, &which) {
            let plain = flat.direct(pts[i]);
            let scale: f64 = (0..70)
                .map(|j| {
                    let r2 = (pts[i][0] - flat.xs[j]).powi(2) + (pts[i][1] - flat.ys[j]).powi(2);
                    (flat.ws[j] * r2.max(flat.r2min[j]).ln()).abs()
                })
                .sum();
            assert!(
                (v - plain).abs() <= 1e-12 * scale,
                "point {i}: {v} vs {plain}"
            );
        }
    }
}
