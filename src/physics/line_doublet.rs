//! The line doublet: a straight element across which the potential jumps by a constant
//! strength σ, with no jump in the normal flux (Strack, O.D.L. 1989, *Groundwater Mechanics*,
//! Prentice Hall, ch. 6 "line doublets"; for several aquifers, one such element per mode:
//! Bakker, M. & Strack, O.D.L. 2003, *Analytic elements for multiaquifer flow*,
//! J. Hydrology 271, §4).
//!
//! For an element from a to b with unit normal n (the left of a → b), the potential per unit
//! jump at x is the double-layer integral
//!
//!   D(x) = ∫ₐᵇ n·(x − y) · g(|x − y|) ds_y / (2π),
//!
//! with g(r) = 1/r² for the Laplace (zero) mode, whose integral is the angle the element
//! subtends: D₀(x) = arg((b − x)/(a − x))/(2π) (Strack 1989, §6), and g(r) = K₁(r/λ)/(λ·r)
//! for a mode of leakage factor λ (the normal derivative of K₀(r/λ)/(2π), the point sink of
//! ∇²ψ = ψ/λ²). D jumps by 1 across the element (+½ on the side n points to, −½ on the other).
//! The leaky mode is written as the Laplace one plus the difference, whose kernel is at most
//! logarithmic on the element; the difference is integrated by Gauss–Legendre on pieces graded
//! towards the foot of the perpendicular from x.

use crate::physics::special::{bessel_k0, bessel_k1};
use std::f64::consts::PI;

/// Beyond this many leakage factors from the element a leaky mode's doublet is below 1e-10.
const MODE_REACH: f64 = 25.0;
/// Euler–Mascheroni constant γ.
const EULER_GAMMA: f64 = 0.577_215_664_901_532_9;

/// 8-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun 1964, table 25.4).
const GL_X: [f64; 8] = [
    -0.960_289_856_497_536_3,
    -0.796_666_477_413_626_7,
    -0.525_532_409_916_329,
    -0.183_434_642_495_649_8,
    0.183_434_642_495_649_8,
    0.525_532_409_916_329,
    0.796_666_477_413_626_7,
    0.960_289_856_497_536_3,
];
const GL_W: [f64; 8] = [
    0.101_228_536_290_376_3,
    0.222_381_034_453_374_5,
    0.313_706_645_877_887_3,
    0.362_683_783_378_362,
    0.362_683_783_378_362,
    0.313_706_645_877_887_3,
    0.222_381_034_453_374_5,
    0.101_228_536_290_376_3,
];

/// A straight element from `a` to `b` (m), normal to the left of a → b.
#[derive(Debug, Clone, Copy)]
pub struct Segment {
    /// Start, m.
    pub a: [f64; 2],
    /// End, m.
    pub b: [f64; 2],
}

impl Segment {
    /// Length, m.
    pub fn length(&self) -> f64 {
        (self.b[0] - self.a[0]).hypot(self.b[1] - self.a[1])
    }

    /// Unit normal, to the left of a → b.
    pub fn normal(&self) -> [f64; 2] {
        let l = self.length();
        [-(self.b[1] - self.a[1]) / l, (self.b[0] - self.a[0]) / l]
    }

    /// Midpoint, m.
    pub fn midpoint(&self) -> [f64; 2] {
        [0.5 * (self.a[0] + self.b[0]), 0.5 * (self.a[1] + self.b[1])]
    }

    /// Distance from x to the element, m.
    fn distance(&self, x: [f64; 2]) -> f64 {
        let (t, _) = self.foot(x);
        let l = self.length();
        let tc = t.clamp(0.0, l);
        let d = [self.b[0] - self.a[0], self.b[1] - self.a[1]];
        let p = [self.a[0] + d[0] * tc / l, self.a[1] + d[1] * tc / l];
        (x[0] - p[0]).hypot(x[1] - p[1])
    }

    /// Position of the foot of the perpendicular from x along the element (m from a) and the
    /// signed distance from the line (m, positive on the normal's side).
    fn foot(&self, x: [f64; 2]) -> (f64, f64) {
        let l = self.length();
        let t = [(self.b[0] - self.a[0]) / l, (self.b[1] - self.a[1]) / l];
        let v = [x[0] - self.a[0], x[1] - self.a[1]];
        (v[0] * t[0] + v[1] * t[1], -v[0] * t[1] + v[1] * t[0])
    }
}

/// The doublet of unit jump in one mode at x: (D, ∇D).
/// `lambda` is the mode's leakage factor, m (`None`: the Laplace mode).
pub fn doublet(seg: &Segment, lambda: Option<f64>, x: [f64; 2]) -> (f64, [f64; 2]) {
    if let Some(l) = lambda {
        if seg.distance(x) > MODE_REACH * l {
            return (0.0, [0.0, 0.0]);
        }
    }
    let (mut v, mut g) = laplace(seg, x);
    if let Some(l) = lambda {
        let (dv, dg) = leaky_difference(seg, l, x);
        v += dv;
        g[0] += dg[0];
        g[1] += dg[1];
    }
    (v, g)
}

/// The doublet's value only (no gradient): what every level and unit row reads.
pub fn doublet_value(seg: &Segment, lambda: Option<f64>, x: [f64; 2]) -> f64 {
    match lambda {
        None => laplace_value(seg, x),
        Some(_) => doublet(seg, lambda, x).0,
    }
}

/// The Laplace line doublet's value, arg((b − x)/(a − x))/(2π).
fn laplace_value(seg: &Segment, x: [f64; 2]) -> f64 {
    let za = [seg.a[0] - x[0], seg.a[1] - x[1]];
    let zb = [seg.b[0] - x[0], seg.b[1] - x[1]];
    (za[0] * zb[1] - za[1] * zb[0]).atan2(za[0] * zb[0] + za[1] * zb[1]) / (2.0 * PI)
}

/// The Laplace line doublet of unit jump: the angle subtended over 2π, and its gradient
/// ∇D₀ = (⊥(x − b)/|x − b|² − ⊥(x − a)/|x − a|²)/(2π), ⊥(v) = (−v_y, v_x).
fn laplace(seg: &Segment, x: [f64; 2]) -> (f64, [f64; 2]) {
    let za = [seg.a[0] - x[0], seg.a[1] - x[1]];
    let zb = [seg.b[0] - x[0], seg.b[1] - x[1]];
    // arg(zb / za) = atan2(za × zb, za · zb)
    let angle = (za[0] * zb[1] - za[1] * zb[0]).atan2(za[0] * zb[0] + za[1] * zb[1]);
    let grad = |z: [f64; 2]| {
        // x − c = −z; ⊥(x − c)/|x − c|² = (z_y, −z_x)/|z|²
        let r2 = (z[0] * z[0] + z[1] * z[1]).max(1e-300);
        [z[1] / r2, -z[0] / r2]
    };
    let gb = grad(zb);
    let ga = grad(za);
    (
        angle / (2.0 * PI),
        [(gb[0] - ga[0]) / (2.0 * PI), (gb[1] - ga[1]) / (2.0 * PI)],
    )
}

/// Δg(r) = K₁(z)/(λ²z) − 1/r² and its derivative in r, z = r/λ; by the series of K₁ for small z
/// (Abramowitz & Stegun 1964, eq. 9.6.11), where the two terms would cancel.
fn kernel_difference(r: f64, lambda: f64) -> (f64, f64) {
    let z = r / lambda;
    let l2 = lambda * lambda;
    if z < 1e-2 {
        let lz = (0.5 * z).ln() + EULER_GAMMA;
        let f = 0.5 * lz - 0.25 + z * z / 16.0 * lz - 5.0 * z * z / 64.0;
        let df = 0.5 / z + z / 8.0 * lz - 3.0 * z / 32.0;
        (f / l2, df / (l2 * lambda))
    } else {
        let k1 = bessel_k1(z);
        let f = k1 / z - 1.0 / (z * z);
        let df = -bessel_k0(z) / z - 2.0 * k1 / (z * z) + 2.0 / (z * z * z);
        (f / l2, df / (l2 * lambda))
    }
}

/// The leaky mode minus the Laplace one: value and gradient, by Gauss–Legendre on pieces
/// graded geometrically towards the foot of the perpendicular from x (the kernel is
/// logarithmic there when x lies on the element).
fn leaky_difference(seg: &Segment, lambda: f64, x: [f64; 2]) -> (f64, [f64; 2]) {
    let len = seg.length();
    let n = seg.normal();
    let (foot, h) = seg.foot(x);
    let dir = [(seg.b[0] - seg.a[0]) / len, (seg.b[1] - seg.a[1]) / len];
    let mut cuts = vec![0.0, len];
    let near = h.abs() < len && foot > -len && foot < 2.0 * len;
    if near {
        let f = foot.clamp(0.0, len);
        let smallest = (1e-3 * h.abs()).max(1e-9 * len);
        for (from, to) in [(f, 0.0), (f, len)] {
            let span: f64 = to - from;
            let mut d = span.abs();
            while d > smallest {
                cuts.push(from + span.signum() * d);
                d *= 0.3;
            }
            cuts.push(from);
        }
    }
    cuts.sort_by(f64::total_cmp);
    cuts.dedup_by(|p, q| (*p - *q).abs() < 1e-14 * len);
    let (mut v, mut g) = (0.0, [0.0, 0.0]);
    for w in cuts.windows(2) {
        let (t0, t1) = (w[0], w[1]);
        let half = 0.5 * (t1 - t0);
        for (xi, wi) in GL_X.iter().zip(GL_W) {
            let t = t0 + half * (1.0 + xi);
            let y = [seg.a[0] + dir[0] * t, seg.a[1] + dir[1] * t];
            let d = [x[0] - y[0], x[1] - y[1]];
            let r = d[0].hypot(d[1]).max(1e-12);
            let (dg, ddg) = kernel_difference(r, lambda);
            let nd = n[0] * d[0] + n[1] * d[1];
            let wt = wi * half / (2.0 * PI);
            v += wt * nd * dg;
            g[0] += wt * (n[0] * dg + nd * ddg * d[0] / r);
            g[1] += wt * (n[1] * dg + nd * ddg * d[1] / r);
        }
    }
    (v, g)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn seg() -> Segment {
        Segment {
            a: [-1.0, 0.0],
            b: [1.0, 0.0],
        }
    }

    // The jump across the element is 1: +½ just on the normal's side, −½ on the other
    // (Strack 1989, §6: the potential of a line doublet jumps by its strength).
    #[test]
    fn jump_is_one_in_every_mode() {
        for lambda in [None, Some(0.3), Some(5.0), Some(200.0)] {
            let (up, _) = doublet(&seg(), lambda, [0.2, 1e-7]);
            let (down, _) = doublet(&seg(), lambda, [0.2, -1e-7]);
            assert!((up - down - 1.0).abs() < 1e-5, "{lambda:?}: {up} {down}");
        }
    }

    // The gradient is the derivative of the value (central differences), off the element and
    // on it (where the normal derivative is continuous across a doublet).
    #[test]
    fn gradient_is_the_derivative() {
        for lambda in [None, Some(0.5), Some(4.0)] {
            for x in [[0.3, 0.7], [2.5, -0.4], [-1.3, 0.05], [0.1, 0.0]] {
                let (_, g) = doublet(&seg(), lambda, x);
                let e = 1e-5;
                let fx = (doublet(&seg(), lambda, [x[0] + e, x[1]]).0
                    - doublet(&seg(), lambda, [x[0] - e, x[1]]).0)
                    / (2.0 * e);
                let fy = (doublet(&seg(), lambda, [x[0], x[1] + e]).0
                    - doublet(&seg(), lambda, [x[0], x[1] - e]).0)
                    / (2.0 * e);
                if x[1] != 0.0 {
                    assert!((g[0] - fx).abs() < 1e-6, "{lambda:?} {x:?}: {g:?} {fx}");
                    assert!((g[1] - fy).abs() < 1e-5, "{lambda:?} {x:?}: {g:?} {fy}");
                } else {
                    // on the element: the limit of the normal derivative from either side
                    let (_, above) = doublet(&seg(), lambda, [x[0], 1e-6]);
                    assert!(
                        (g[1] - above[1]).abs() < 1e-4,
                        "{lambda:?}: {g:?} {above:?}"
                    );
                }
            }
        }
    }

    // A leaky mode's doublet far away (many λ) vanishes; a very large λ tends to Laplace.
    #[test]
    fn leaky_limits() {
        let (v, _) = doublet(&seg(), Some(0.1), [0.0, 5.0]);
        assert!(v.abs() < 1e-12);
        let (v, _) = doublet(&seg(), Some(1e6), [0.3, 0.8]);
        let (l, _) = doublet(&seg(), None, [0.3, 0.8]);
        assert!((v - l).abs() < 1e-6, "{v} {l}");
    }
}
