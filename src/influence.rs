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

use crate::aquifer::{Aquifer, Level};
use crate::model::Boundary;
use crate::physics::images::{image_set, image_sign, mirror_point};
use crate::physics::special::bessel_k0;
use crate::wells::Well;
use rayon::prelude::*;
use rstar::primitives::GeomWithData;
use rstar::RTree;
use std::f64::consts::PI;

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
        for (i, w) in wells.iter().enumerate() {
            let p = local(w.position);
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
        }
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
        let p = self.local(point);
        for item in self
            .tree
            .locate_within_distance(p, self.cutoff * self.cutoff)
        {
            let s = &self.sources[item.data];
            let r = (s.position[0] - p[0]).hypot(s.position[1] - p[1]);
            f(s.well, s.sign * self.unit_potential(r, s.radius));
        }
    }

    /// Row of ΔΦ per unit rate of each real well at `point` (images folded into their well).
    pub fn unit_row(&self, point: [f64; 2]) -> Vec<f64> {
        let mut row = vec![0.0; self.well_count];
        self.for_each_in_range(point, |w, v| row[w] += v);
        row
    }

    /// Same as [`Field::unit_row`] by the plain sum over every source, without the index.
    pub fn unit_row_all_pairs(&self, point: [f64; 2]) -> Vec<f64> {
        let p = self.local(point);
        let mut row = vec![0.0; self.well_count];
        for s in &self.sources {
            let r = (s.position[0] - p[0]).hypot(s.position[1] - p[1]);
            row[s.well] += s.sign * self.unit_potential(r, s.radius);
        }
        row
    }

    /// ΔΦ at `point` for the given rates (m³/s), summed over wells in range.
    pub fn delta_potential(&self, point: [f64; 2], rates: &[f64]) -> f64 {
        let mut sum = 0.0;
        self.for_each_in_range(point, |w, v| sum += rates[w] * v);
        sum
    }

    /// Water level at `point` for the given rates.
    pub fn level(&self, point: [f64; 2], rates: &[f64]) -> Level {
        self.aquifer
            .level(self.aquifer.initial_potential() + self.delta_potential(point, rates))
    }

    /// Levels at many points, in parallel.
    pub fn levels(&self, points: &[[f64; 2]], rates: &[f64]) -> Vec<Level> {
        if self.aquifer.leakage_factor().is_some() {
            return points.par_iter().map(|p| self.level(*p, rates)).collect();
        }
        // Weight of each source: sign·Q/(4π), so ΔΦ = Σ w·ln(r²/R²) over sources in range.
        let n = self.sources.len();
        let mut xs = Vec::with_capacity(n);
        let mut ys = Vec::with_capacity(n);
        let mut r2min = Vec::with_capacity(n);
        let mut ws = Vec::with_capacity(n);
        for s in &self.sources {
            xs.push(s.position[0]);
            ys.push(s.position[1]);
            // (at least 1e-12 m², so the arithmetic logarithm only ever sees normal numbers)
            r2min.push((s.radius * s.radius).max(1e-12));
            ws.push(s.sign * rates[s.well] / (4.0 * PI));
        }
        let ln_r2 = (self.radius_of_influence * self.radius_of_influence).ln();
        let wsum: f64 = ws.iter().sum();
        let (mut bx0, mut by0, mut bx1, mut by1) = (f64::MAX, f64::MAX, f64::MIN, f64::MIN);
        for s in &self.sources {
            bx0 = bx0.min(s.position[0]);
            by0 = by0.min(s.position[1]);
            bx1 = bx1.max(s.position[0]);
            by1 = by1.max(s.position[1]);
        }
        let c2 = self.cutoff * self.cutoff;
        let phi0 = self.aquifer.initial_potential();
        points
            .par_iter()
            .map(|pt| {
                let p = self.local(*pt);
                let fx = (p[0] - bx0).abs().max((p[0] - bx1).abs());
                let fy = (p[1] - by0).abs().max((p[1] - by1).abs());
                let d = if fx * fx + fy * fy < c2 {
                    let mut acc = 0.0;
                    for i in 0..n {
                        let dx = xs[i] - p[0];
                        let dy = ys[i] - p[1];
                        let r2 = (dx * dx + dy * dy).max(r2min[i]);
                        acc += ws[i] * ln_fast(r2);
                    }
                    acc - wsum * ln_r2
                } else {
                    self.delta_potential(*pt, rates)
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

/// Natural logarithm of a positive, finite, normal `x` by arithmetic only (so loops over it
/// vectorise): x = m·2^e with m in [√½, √2), ln m = 2·atanh(t), t = (m − 1)/(m + 1), |t| < 0.172,
/// by its series to t²¹ (truncation below 1e-17 relative).
#[inline]
fn ln_fast(x: f64) -> f64 {
    let bits = x.to_bits();
    let mut e = ((bits >> 52) & 0x7ff) as i64 - 1023;
    let mut m = f64::from_bits((bits & 0x000f_ffff_ffff_ffff) | 0x3ff0_0000_0000_0000);
    if m > std::f64::consts::SQRT_2 {
        m *= 0.5;
        e += 1;
    }
    let t = (m - 1.0) / (m + 1.0);
    let t2 = t * t;
    let p = 1.0 / 21.0;
    let p = p * t2 + 1.0 / 19.0;
    let p = p * t2 + 1.0 / 17.0;
    let p = p * t2 + 1.0 / 15.0;
    let p = p * t2 + 1.0 / 13.0;
    let p = p * t2 + 1.0 / 11.0;
    let p = p * t2 + 1.0 / 9.0;
    let p = p * t2 + 1.0 / 7.0;
    let p = p * t2 + 1.0 / 5.0;
    let p = p * t2 + 1.0 / 3.0;
    let p = p * t2 + 1.0;
    e as f64 * std::f64::consts::LN_2 + 2.0 * t * p
}

#[cfg(test)]
mod tests {
    use super::ln_fast;

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
}
