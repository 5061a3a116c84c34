//! The partial-penetration correction of one well averaged over the screen of another: what a
//! neighbour's partial penetration does to the level inside a well.
//!
//! The water in a well stands at the mean head along its open screen (the screen short-circuits
//! the layer over its length; uniform flux along the screen, as for the well's own Δ_w). So the
//! share of a neighbouring well j in the level of well i is the point correction Δⱼ(r, z) of
//! [`crate::physics::partial_penetration::point_correction`] averaged over the screen of i,
//! z from b to t (m above the aquifer base):
//!
//! ```text
//! Δ̄ᵢⱼ(r) = 1/(t − b) ∫_b^t Δⱼ(r, z) dz
//!        = (2D²/(π² lⱼ (t − b))) Σₙ (1/n²)[sin(nπz₂/D) − sin(nπz₁/D)][sin(nπt/D) − sin(nπb/D)] K₀(nπr√a/D)
//! ```
//!
//! (the second line term by term from the cosine series; Muskat 1937; Hantush 1957; Kruseman &
//! de Ridder 1994, 2nd ed., ch. 10). It is computed here by composite Gauss–Legendre quadrature of
//! the point correction over the screen, in panels no longer than ρ = r·√a (the vertical length
//! over which Δ changes near the ends of j's screen), [`NODES`] nodes a panel, at most
//! [`MAX_PANELS`] panels. Tested against the series above summed by scipy and against
//! `scipy.integrate.quad` of the point correction (tests/reference/screen_average.csv).

use crate::physics::partial_penetration::{point_correction, Screen};

/// Gauss–Legendre nodes per panel.
pub const NODES: usize = 6;
/// Most panels over one screen.
pub const MAX_PANELS: usize = 32;

/// Gauss–Legendre nodes and weights on [−1, 1] for `n` points, by Newton's method on the
/// Legendre polynomial Pₙ (three-term recurrence); Abramowitz & Stegun (1964), 25.4.29.
fn gauss_legendre(n: usize) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        // Tricomi's first guess for the i-th root
        let mut x = (std::f64::consts::PI * (i as f64 + 0.75) / (n as f64 + 0.5)).cos();
        let mut dp = 1.0;
        for _ in 0..100 {
            let (mut p0, mut p1) = (1.0, x);
            for k in 2..=n {
                let kf = k as f64;
                let p2 = ((2.0 * kf - 1.0) * x * p1 - (kf - 1.0) * p0) / kf;
                p0 = p1;
                p1 = p2;
            }
            dp = n as f64 * (x * p1 - p0) / (x * x - 1.0);
            let step = p1 / dp;
            x -= step;
            if step.abs() < 1e-16 {
                break;
            }
        }
        out.push((x, 2.0 / ((1.0 - x * x) * dp * dp)));
    }
    out
}

/// Δ of the partially penetrating `source` screen at horizontal distance `r` (m), averaged over
/// the elevations `bottom` to `top` (m above the aquifer base; clamped to the layer): the share
/// of the source in the level of a well screened there (dimensionless; × Q/(2πT) for metres).
///
/// A screen of no length (after clamping) gives the point value at its level. Never NaN for a
/// valid source screen (an invalid one gives 0, as [`point_correction`] does).
pub fn screen_averaged_correction(source: &Screen, r: f64, bottom: f64, top: f64) -> f64 {
    let d = source.thickness;
    let (b, t) = (bottom.clamp(0.0, d), top.clamp(0.0, d));
    if t.is_nan() || b.is_nan() || t <= b {
        return point_correction(source, r, 0.5 * (b + t));
    }
    let rho = (r * source.anisotropy.max(0.0).sqrt()).max(1e-9);
    let panels = ((t - b) / rho).ceil().clamp(1.0, MAX_PANELS as f64) as usize;
    let nodes = gauss_legendre(NODES);
    let h = (t - b) / panels as f64;
    let mut sum = 0.0;
    for p in 0..panels {
        let mid = b + (p as f64 + 0.5) * h;
        for &(x, w) in &nodes {
            sum += w * point_correction(source, r, mid + 0.5 * h * x);
        }
    }
    // Σ w = 2 on each panel
    sum / (2.0 * panels as f64)
}

#[cfg(test)]
mod tests {
    use super::*;

    // Abramowitz & Stegun (1964), Table 25.4: the 6-point rule integrates x^10 on [−1, 1]
    // exactly (2/11) and its weights sum to 2; the largest node is 0.932469514203152.
    #[test]
    fn gauss_legendre_rule() {
        let g = gauss_legendre(6);
        let sw: f64 = g.iter().map(|(_, w)| w).sum();
        assert!((sw - 2.0).abs() < 1e-14);
        let i10: f64 = g.iter().map(|(x, w)| w * x.powi(10)).sum();
        assert!((i10 - 2.0 / 11.0).abs() < 1e-14);
        let top = g.iter().map(|(x, _)| *x).fold(f64::MIN, f64::max);
        assert!((top - 0.932_469_514_203_152).abs() < 1e-14);
    }

    /// One row of tests/reference/screen_average.csv.
    fn reference_rows() -> Vec<[f64; 8]> {
        let path = concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/tests/reference/screen_average.csv"
        );
        let mut reader = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .has_headers(true)
            .from_path(path)
            .expect("tests/reference/screen_average.csv is readable");
        reader
            .records()
            .map(|rec| {
                let rec = rec.expect("well-formed CSV record");
                let mut row = [0.0; 8];
                for (i, v) in row.iter_mut().enumerate() {
                    *v = rec[i].trim().parse().expect("a number");
                }
                row
            })
            .collect()
    }

    // library: the screen-averaged series summed with scipy.special.k0 and checked against
    // scipy.integrate.quad of the point series (scripts/reference_screen_average.py): within
    // 2e-6 absolute (a micrometre per mm of Q/(2πT)).
    #[test]
    fn matches_the_scipy_table() {
        let rows = reference_rows();
        assert!(rows.len() >= 10);
        for [z1, z2, d, a, r, b, t, want] in rows {
            let s = Screen::new(z1, z2, d).with_anisotropy(a);
            let got = screen_averaged_correction(&s, r, b, t);
            assert!(
                (got - want).abs() < 2e-6,
                "{z1}-{z2}/{d} a={a} r={r} over {b}-{t}: {got} vs {want}"
            );
        }
    }
}
