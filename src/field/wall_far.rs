//! The far field of a block of consecutive wall elements in the Laplace mode, by multipole
//! moments: a string of constant-jump line doublets is a set of point vortices at its vertices,
//! Σ_v c_v·log(z_v − x) with c_v the step of the jump at vertex v (Σ c_v = 0 over a block), so
//! beyond three block radii from its centre z_c
//!
//!   2π·D(x) = Im Σ_v c_v·log(z_v − x) = −Im Σ_{k≥1} M_k / (k·(x − z_c)^k),
//!   M_k = Σ_v c_v·(z_v − z_c)^k
//!
//! (the Laurent series of the logarithm; Strack 1989, §6 writes the line doublet in complex
//! form). With 24 terms the series is exact to (1/3)²⁴ ≈ 4e-12 of the block's moments.

use nalgebra::Complex;
use std::f64::consts::PI;

/// Elements in a block.
pub const BLOCK: usize = 48;
/// Terms of the series.
const TERMS: usize = 24;
/// A point is far from a block beyond this many block radii from its centre.
const FAR: f64 = 3.0;

/// The geometry of one block of consecutive elements (one string: the wall, or an image).
#[derive(Debug, Clone)]
pub struct BlockGeometry {
    /// Centre of the vertices, m (local).
    centre: Complex<f64>,
    /// Largest distance of a vertex from the centre, m.
    radius: f64,
    /// Vertices relative to the centre (elements + 1).
    offsets: Vec<Complex<f64>>,
    /// +1 for the wall, −sign for an image.
    factor: f64,
}

/// The moments of one block for one set of jumps.
pub type Moments = [Complex<f64>; TERMS];

impl BlockGeometry {
    /// A block whose element i runs from `vertices[i]` to `vertices[i + 1]`.
    pub fn new(vertices: &[[f64; 2]], factor: f64) -> BlockGeometry {
        let n = vertices.len() as f64;
        let c = vertices
            .iter()
            .fold([0.0, 0.0], |s, v| [s[0] + v[0] / n, s[1] + v[1] / n]);
        let centre = Complex::new(c[0], c[1]);
        let offsets: Vec<Complex<f64>> = vertices
            .iter()
            .map(|v| Complex::new(v[0], v[1]) - centre)
            .collect();
        let radius = offsets.iter().map(|z| z.norm()).fold(0.0, f64::max);
        BlockGeometry {
            centre,
            radius,
            offsets,
            factor,
        }
    }

    /// The moments M_k for the jumps `mu` of the block's elements.
    pub fn moments(&self, mu: &[f64]) -> Moments {
        let mut m = [Complex::new(0.0, 0.0); TERMS];
        let n = mu.len();
        for (v, z) in self.offsets.iter().enumerate() {
            let before = if v > 0 { mu[v - 1] } else { 0.0 };
            let after = if v < n { mu[v] } else { 0.0 };
            let c = self.factor * (before - after);
            if c == 0.0 {
                continue;
            }
            let mut p = *z;
            for mk in m.iter_mut() {
                *mk += p * c;
                p *= z;
            }
        }
        m
    }

    /// The powers 1/(x − z_c)^k, k = 1 … TERMS, when x is far from the block; `None` when near.
    pub fn far_powers(&self, x: [f64; 2]) -> Option<Moments> {
        let d = Complex::new(x[0], x[1]) - self.centre;
        if d.norm() <= FAR * self.radius.max(1e-9) {
            return None;
        }
        let u = d.inv();
        let mut out = [Complex::new(0.0, 0.0); TERMS];
        let mut p = u;
        for o in out.iter_mut() {
            *o = p;
            p *= u;
        }
        Some(out)
    }
}

/// D(x) of a block from its moments and the far powers at x.
pub fn far_value(m: &Moments, powers: &Moments) -> f64 {
    let mut s = 0.0;
    for (k, (mk, pk)) in m.iter().zip(powers).enumerate() {
        // Im(M·P) = M.re·P.im + M.im·P.re
        s += (mk.re * pk.im + mk.im * pk.re) / (k + 1) as f64;
    }
    -s / (2.0 * PI)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::line_doublet::{doublet_value, Segment};

    // The series equals the sum of the elements' doublets (Strack 1989, §6) far from the block.
    #[test]
    fn series_matches_the_sum_of_doublets() {
        let verts: Vec<[f64; 2]> = (0..=10)
            .map(|i| [i as f64 * 0.7, (i as f64 * 0.4).sin() * 2.0])
            .collect();
        let mu: Vec<f64> = (0..10).map(|i| 0.3 + (i as f64 * 0.9).cos()).collect();
        let g = BlockGeometry::new(&verts, -1.0);
        let m = g.moments(&mu);
        for x in [[30.0, 4.0], [-12.0, -9.0], [3.0, 25.0]] {
            let direct: f64 = (0..10)
                .map(|i| {
                    -mu[i]
                        * doublet_value(
                            &Segment {
                                a: verts[i],
                                b: verts[i + 1],
                            },
                            None,
                            x,
                        )
                })
                .sum();
            let far = far_value(&m, &g.far_powers(x).expect("far"));
            assert!((far - direct).abs() < 1e-11, "{x:?}: {far} {direct}");
        }
    }
}
