//! Partial penetration: the extra steady drawdown of a well screened over only part of a confined
//! layer (uniform flux along the screen, closed top and base).
//!
//! The screen runs from z₁ to z₂ above the aquifer base (length l = z₂ − z₁) in a layer of
//! thickness D with anisotropy a = K_v/K_h. Expanding the line sink in cosine modes (Muskat 1937;
//! Hantush 1957; the correction tabulated as Huisman's method in Kruseman & de Ridder, *Analysis
//! and Evaluation of Pumping Test Data*, 2nd ed. 1994, ch. 10) gives a correction Δ that is added
//! to the fully penetrating (Thiem, Theis, Hantush) drawdown:
//!
//! ```text
//! s_pp(r, z) = s_full(r) + Q/(2πT) · Δ(r, z)
//! Δ(r, z) = (2D/(πl)) Σₙ (1/n)[sin(nπz₂/D) − sin(nπz₁/D)] cos(nπz/D) K₀(nπr√a/D)
//! Δ_w     = (2D²/(π²l²)) Σₙ (1/n²)[sin(nπz₂/D) − sin(nπz₁/D)]² K₀(nπr_w√a/D)
//! ```
//!
//! Δ_w is Δ averaged over the well's own screen at r = r_w. Both are dimensionless.
//!
//! # How the series are summed
//! With x = πr√a/D the terms decay like K₀(nx), so a direct sum needs about 30/x terms. For
//! x ≥ [`X_SWITCH`] it is summed directly (no extrapolation: accelerating this oscillating series
//! gives wrong answers, see checks.md §12), stopping when a rigorous bound on the rest is below
//! 1e-10 of the sum (+1e-13): since K₁ > K₀, K₀(t) ≤ K₀(y)·e^(−(t−y)) for t ≥ y, so
//! Σ_{n≥N} K₀(nx) ≤ K₀(Nx)/(1 − e^(−x)). The count can never exceed 745/x + 1 (K₀ underflows to 0
//! beyond 745), i.e. 14 901 terms at the switch.
//!
//! For x < [`X_SWITCH`] (a thin well or a point near the screen) the same quantity is computed from
//! the equivalent sum over vertical images (Poisson summation of the cosine series; the standard
//! identity Σₙ K₀(nπρ/D)·cos(nπζ/D) = (D/2)·Σₘ′ 1/√(ρ² + (ζ − 2mD)²) + ½[ln(ρ/(4D)) + γ], where
//! Σ′ subtracts 1/(2D|m|) from each m ≠ 0 term). Integrated over the screen each image is closed
//! form (asinh for a point, u·asinh(u/ρ) − √(u² + ρ²) for the screen average); images
//! |m| ≤ [`IMAGE_PAIRS`] are summed exactly and the rest by their expansion in 1/m to order m⁻⁵
//! (error about 1e-11 absolute). Both routes agree with the scipy direct sums of the reference
//! table (tests/reference/partial_penetration.csv) to 1e-8 relative or better; they meet at
//! x = [`X_SWITCH`] to about 1e-10 relative.

use super::special::bessel_k0;
use std::f64::consts::PI;

/// Euler–Mascheroni constant γ.
const EULER_GAMMA: f64 = 0.577_215_664_901_532_9;

/// Below this x = πr√a/D the vertical-image form is used instead of the cosine series.
pub const X_SWITCH: f64 = 0.05;

/// Image pairs summed exactly in the image form (the rest by an asymptotic tail).
pub const IMAGE_PAIRS: usize = 64;

/// Radii below `R_MIN_FRACTION · D` are treated as that radius: the line sink is singular on its
/// own axis (Δ → ∞ logarithmically inside the screen); in practice r ≥ r_w.
pub const R_MIN_FRACTION: f64 = 1e-6;

/// Default tolerance for [`cutoff_radius`]: |Δ| below 1e-4 (1e-4 · Q/(2πT) metres).
pub const DEFAULT_CUTOFF_TOLERANCE: f64 = 1e-4;

/// A well screen in a confined layer.
///
/// All lengths in m, measured above the aquifer base. Out-of-range screens are clamped to
/// [0, D] by every function of this module.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Screen {
    /// Screen bottom z₁ above the aquifer base, m.
    pub bottom: f64,
    /// Screen top z₂ above the aquifer base, m.
    pub top: f64,
    /// Saturated (layer) thickness D, m.
    pub thickness: f64,
    /// Anisotropy a = K_v/K_h, dimensionless (1 = isotropic).
    pub anisotropy: f64,
}

/// A screen clamped to the layer, with derived numbers.
#[derive(Debug, Clone, Copy)]
struct Geometry {
    z1: f64,
    z2: f64,
    d: f64,
    sqrt_a: f64,
}

impl Geometry {
    fn len(&self) -> f64 {
        self.z2 - self.z1
    }
}

impl Screen {
    /// An isotropic screen from `bottom` (z₁) to `top` (z₂) in a layer of thickness D, all m above
    /// the aquifer base.
    pub fn new(bottom: f64, top: f64, thickness: f64) -> Self {
        Screen {
            bottom,
            top,
            thickness,
            anisotropy: 1.0,
        }
    }

    /// The same screen with anisotropy a = K_v/K_h.
    pub fn with_anisotropy(self, anisotropy: f64) -> Self {
        Screen { anisotropy, ..self }
    }

    /// Checks the inputs: D > 0, a > 0, all finite, and a screen of positive length inside the
    /// layer once clamped to [0, D]. The error names the field and what would be valid.
    pub fn validate(&self) -> Result<(), String> {
        let Screen {
            bottom,
            top,
            thickness,
            anisotropy,
        } = *self;
        if !(thickness.is_finite() && thickness > 0.0) {
            return Err(format!(
                "thickness: saturated thickness D = {thickness} m must be a finite number > 0"
            ));
        }
        if !(anisotropy.is_finite() && anisotropy > 0.0) {
            return Err(format!(
                "anisotropy: K_v/K_h = {anisotropy} must be a finite number > 0"
            ));
        }
        if !bottom.is_finite() || !top.is_finite() {
            return Err(format!(
                "screen: bottom {bottom} m and top {top} m must be finite elevations above the base"
            ));
        }
        if top.min(thickness) <= bottom.max(0.0) {
            return Err(format!(
                "screen: top ({top} m) must be above bottom ({bottom} m), with some of the screen \
                 inside the layer 0..{thickness} m above the base"
            ));
        }
        Ok(())
    }

    /// Clamped geometry, or `None` for an invalid screen.
    fn geometry(&self) -> Option<Geometry> {
        self.validate().ok()?;
        let d = self.thickness;
        Some(Geometry {
            z1: self.bottom.clamp(0.0, d),
            z2: self.top.clamp(0.0, d),
            d,
            sqrt_a: self.anisotropy.sqrt(),
        })
    }
}

/// True when the screen (clamped to [0, D]) does not cover the whole layer, i.e. the correction
/// is not zero. An invalid screen (see [`Screen::validate`]) returns `false`.
pub fn is_partial(screen: &Screen) -> bool {
    match screen.geometry() {
        Some(g) => g.z1 > 0.0 || g.z2 < g.d,
        None => false,
    }
}

/// Partial-penetration correction Δ at radius r and elevation z above the base (dimensionless;
/// multiply by Q/(2πT) for metres):
/// Δ = (2D/(πl)) Σₙ (1/n)[sin(nπz₂/D) − sin(nπz₁/D)] cos(nπz/D) K₀(nπr√a/D).
///
/// Units: r, z in m. Source: Muskat (1937); Hantush (1957); Kruseman & de Ridder (1994), 2nd ed.,
/// ch. 10 (checks.md §12). Positive near the screen (more drawdown), slightly negative at
/// elevations away from it, → 0 for r ≫ D/√a.
///
/// Edge cases: a fully penetrating screen gives exactly 0; an invalid screen gives 0 (check with
/// [`Screen::validate`]); z is clamped to [0, D]; r below `R_MIN_FRACTION·D` (or NaN) is taken
/// as that radius; r = `+inf` gives 0. Never NaN, never panics.
pub fn point_correction(screen: &Screen, r: f64, z: f64) -> f64 {
    let Some(g) = screen.geometry() else {
        return 0.0;
    };
    if !is_partial(screen) || r == f64::INFINITY {
        return 0.0;
    }
    let z = if z.is_nan() {
        0.5 * g.d
    } else {
        z.clamp(0.0, g.d)
    };
    let rho = guarded_radius(r, &g) * g.sqrt_a;
    let x = PI * rho / g.d;
    if x >= X_SWITCH {
        point_modes(&g, x, z)
    } else {
        point_images(&g, rho, z)
    }
}

/// Screen-averaged partial-penetration correction at the well, Δ_w (dimensionless; multiply by
/// Q/(2πT) for the extra drawdown in the well, m):
/// Δ_w = (2D²/(π²l²)) Σₙ (1/n²)[sin(nπz₂/D) − sin(nπz₁/D)]² K₀(nπr_w√a/D).
///
/// Units: r_w in m. Source: Muskat (1937); Hantush (1957); Kruseman & de Ridder (1994), 2nd ed.,
/// ch. 10 (checks.md §12). Accurate to 1e-9 relative or 1e-11 absolute (see the module notes);
/// 2–30 µs per call in a release build (worst for thin wells, x just under [`X_SWITCH`]).
///
/// Edge cases: a fully penetrating screen gives exactly 0; an invalid screen gives 0 (check with
/// [`Screen::validate`]); r_w below `R_MIN_FRACTION·D` (or NaN) is taken as that radius.
/// Always ≥ 0, never NaN, never panics.
pub fn well_correction(screen: &Screen, r_w: f64) -> f64 {
    let Some(g) = screen.geometry() else {
        return 0.0;
    };
    if !is_partial(screen) || r_w == f64::INFINITY {
        return 0.0;
    }
    let rho = guarded_radius(r_w, &g) * g.sqrt_a;
    let x = PI * rho / g.d;
    let v = if x >= X_SWITCH {
        well_modes(&g, x)
    } else {
        well_images(&g, rho)
    };
    v.max(0.0)
}

/// Rule-of-thumb reach of partial penetration: r = 1.5·D·√(K_h/K_v), m.
///
/// Source: Kruseman & de Ridder (1994), 2nd ed., ch. 10 (from memory, checks.md §12). Beyond it
/// the correction is small against the drawdown (|Δ| ≲ 0.01–0.02, i.e. about 1 % of a typical
/// ln(R/r)) but not below 1e-3; use [`cutoff_radius`] for a kernel cut-off. 0 for a fully
/// penetrating or invalid screen.
pub fn reach(screen: &Screen) -> f64 {
    match screen.geometry() {
        Some(g) if is_partial(screen) => 1.5 * g.d / g.sqrt_a,
        _ => 0.0,
    }
}

/// The radius beyond which |Δ(r, z)| < `tolerance` at every elevation z, m (use
/// [`DEFAULT_CUTOFF_TOLERANCE`] = 1e-4 for a kernel cut-off).
///
/// Found by bisection (to 1e-6 relative, rounded up) on the bound
/// max_z |Δ| ≤ (2D/(πl)) Σₙ (1/n)|sin(nπz₂/D) − sin(nπz₁/D)| K₀(nπr√a/D), which decreases with r
/// and is tight once r ≳ D/√a (the first mode, at z = 0 or D, dominates). Source: the series of
/// [`point_correction`]. Never less than 0.016·D/√a (where x = [`X_SWITCH`]); 0 for a fully
/// penetrating or invalid screen, or a tolerance that is not a positive finite number.
pub fn cutoff_radius(screen: &Screen, tolerance: f64) -> f64 {
    let Some(g) = screen.geometry() else {
        return 0.0;
    };
    if !(is_partial(screen) && tolerance.is_finite() && tolerance > 0.0) {
        return 0.0;
    }
    // never below the radius where x = X_SWITCH (0.016·D/√a): keeps the bound's sum short
    let r_min = X_SWITCH * g.d / (PI * g.sqrt_a);
    let bound = |r: f64| abs_bound(&g, PI * r * g.sqrt_a / g.d);
    let mut hi = g.d / g.sqrt_a;
    while bound(hi) >= tolerance {
        hi *= 2.0;
    }
    let mut lo = hi;
    while lo > r_min && bound(lo) < tolerance {
        lo *= 0.5;
    }
    if lo <= r_min {
        return r_min;
    }
    // bound(lo) ≥ tolerance > bound(hi)
    while hi - lo > 1e-6 * hi {
        let mid = 0.5 * (lo + hi);
        if bound(mid) < tolerance {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    hi
}

fn guarded_radius(r: f64, g: &Geometry) -> f64 {
    let r_min = R_MIN_FRACTION * g.d;
    if r.is_nan() || r < r_min {
        r_min
    } else {
        r
    }
}

/// sin(nπz₂/D) − sin(nπz₁/D) for n = 1, 2, … by rotation (two complex multiplications a term),
/// re-seeded exactly every 64 terms so rounding cannot build up.
struct SinDiff {
    n: usize,
    t1: f64,
    t2: f64,
    c1: f64,
    s1: f64,
    c2: f64,
    s2: f64,
    dc1: f64,
    ds1: f64,
    dc2: f64,
    ds2: f64,
}

impl SinDiff {
    fn new(g: &Geometry) -> Self {
        let t1 = PI * g.z1 / g.d;
        let t2 = PI * g.z2 / g.d;
        SinDiff {
            n: 0,
            t1,
            t2,
            c1: 1.0,
            s1: 0.0,
            c2: 1.0,
            s2: 0.0,
            dc1: t1.cos(),
            ds1: t1.sin(),
            dc2: t2.cos(),
            ds2: t2.sin(),
        }
    }

    fn next(&mut self) -> f64 {
        self.n += 1;
        if self.n.is_multiple_of(64) {
            let n = self.n as f64;
            (self.s1, self.c1) = (n * self.t1).sin_cos();
            (self.s2, self.c2) = (n * self.t2).sin_cos();
        } else {
            (self.c1, self.s1) = (
                self.c1 * self.dc1 - self.s1 * self.ds1,
                self.s1 * self.dc1 + self.c1 * self.ds1,
            );
            (self.c2, self.s2) = (
                self.c2 * self.dc2 - self.s2 * self.ds2,
                self.s2 * self.dc2 + self.c2 * self.ds2,
            );
        }
        self.s2 - self.s1
    }
}

/// Largest n ever summed for this x (K₀ underflows beyond 745).
fn term_cap(x: f64) -> usize {
    (745.0 / x).ceil() as usize + 1
}

fn point_modes(g: &Geometry, x: f64, z: f64) -> f64 {
    let pref = 2.0 * g.d / (PI * g.len());
    let rest = 1.0 / (1.0 - (-x).exp());
    let tz = PI * z / g.d;
    let mut sd = SinDiff::new(g);
    let mut sum = 0.0;
    for n in 1..=term_cap(x) {
        let nf = n as f64;
        let k = bessel_k0(nf * x);
        // |Σ_{m≥n} term_m| ≤ pref · (2/n) · K₀(nx)/(1 − e^(−x))
        if pref * 2.0 / nf * k * rest < 1e-10 * (pref * sum).abs() + 1e-13 {
            break;
        }
        sum += sd.next() / nf * (nf * tz).cos() * k;
    }
    pref * sum
}

fn well_modes(g: &Geometry, x: f64) -> f64 {
    let l = g.len();
    let pref = 2.0 * g.d * g.d / (PI * PI * l * l);
    let rest = 1.0 / (1.0 - (-x).exp());
    let mut sd = SinDiff::new(g);
    let mut sum = 0.0;
    for n in 1..=term_cap(x) {
        let nf = n as f64;
        let k = bessel_k0(nf * x);
        // all terms ≥ 0; Σ_{m≥n} term_m ≤ pref · (4/n²) · K₀(nx)/(1 − e^(−x))
        if pref * 4.0 / (nf * nf) * k * rest < 1e-10 * pref * sum + 1e-13 {
            break;
        }
        let s = sd.next();
        sum += s * s / (nf * nf) * k;
    }
    pref * sum
}

/// max_z |Δ| bound used by [`cutoff_radius`].
fn abs_bound(g: &Geometry, x: f64) -> f64 {
    let pref = 2.0 * g.d / (PI * g.len());
    let rest = 1.0 / (1.0 - (-x).exp());
    let mut sd = SinDiff::new(g);
    let mut sum = 0.0;
    for n in 1..=term_cap(x) {
        let nf = n as f64;
        let k = bessel_k0(nf * x);
        if pref * 2.0 / nf * k * rest < 1e-6 * pref * sum + 1e-15 {
            break;
        }
        sum += sd.next().abs() / nf * k;
    }
    pref * sum
}

/// Offsets w of the image sources, described by their mean μ and the 2nd and 4th central
/// moments (the odd ones vanish), for the 1/m tail of the image sum.
struct Offsets {
    mu: f64,
    m2: f64,
    m4: f64,
}

impl Offsets {
    fn w2(&self) -> f64 {
        self.mu * self.mu + self.m2
    }
    fn w4(&self) -> f64 {
        let mu2 = self.mu * self.mu;
        mu2 * mu2 + 6.0 * mu2 * self.m2 + self.m4
    }
}

/// Σ over image pairs m > M of [g(2mD − w) + g(2mD + w)] − 2/(2mD), g(u) = 1/√(ρ² + u²), averaged
/// over the offsets w: the expansion 2⟨w²⟩−ρ² over L³ plus (¾ρ⁴ − 6ρ²⟨w²⟩ + 2⟨w⁴⟩) over L⁵,
/// L = 2mD, with Σ_{m>M} m⁻ᵏ by the midpoint rule and its first correction.
fn image_tail(d: f64, rho: f64, groups: &[Offsets]) -> f64 {
    let h = IMAGE_PAIRS as f64 + 0.5;
    let zeta3 = 1.0 / (2.0 * h * h) - 1.0 / (8.0 * h.powi(4));
    let zeta5 = 1.0 / (4.0 * h.powi(4)) - 5.0 / (24.0 * h.powi(6));
    let two_d = 2.0 * d;
    let rho2 = rho * rho;
    groups
        .iter()
        .map(|o| {
            let c3 = 2.0 * o.w2() - rho2;
            let c5 = 0.75 * rho2 * rho2 - 6.0 * rho2 * o.w2() + 2.0 * o.w4();
            c3 * zeta3 / two_d.powi(3) + c5 * zeta5 / two_d.powi(5)
        })
        .sum()
}

fn point_images(g: &Geometry, rho: f64, z: f64) -> f64 {
    let (z1, z2, d, l) = (g.z1, g.z2, g.d, g.len());
    let f1 = |u: f64| (u / rho).asinh();
    // mean over the screen of 1/√(ρ² + (z ∓ z′ + c)²), both image families
    let pair = |c: f64| {
        let direct = f1(z - z1 + c) - f1(z - z2 + c);
        let mirror = f1(z + z2 + c) - f1(z + z1 + c);
        (direct + mirror) / l
    };
    let mut sum = pair(0.0);
    for m in 1..=IMAGE_PAIRS {
        let c = 2.0 * m as f64 * d;
        sum += pair(-c) + pair(c) - 2.0 / (m as f64 * d);
    }
    let zc = 0.5 * (z1 + z2);
    let groups = [
        Offsets {
            mu: z - zc,
            m2: l * l / 12.0,
            m4: l.powi(4) / 80.0,
        },
        Offsets {
            mu: z + zc,
            m2: l * l / 12.0,
            m4: l.powi(4) / 80.0,
        },
    ];
    sum += image_tail(d, rho, &groups);
    0.5 * d * sum + (rho / (4.0 * d)).ln() + EULER_GAMMA
}

fn well_images(g: &Geometry, rho: f64) -> f64 {
    let (z1, z2, d, l) = (g.z1, g.z2, g.d, g.len());
    let f2 = |u: f64| u * (u / rho).asinh() - u.hypot(rho);
    // mean over the screen × screen of 1/√(ρ² + (z ∓ z′ + c)²), both image families
    let pair = |c: f64| {
        let direct = f2(c + l) - 2.0 * f2(c) + f2(c - l);
        let mirror = f2(2.0 * z2 + c) - 2.0 * f2(z1 + z2 + c) + f2(2.0 * z1 + c);
        (direct + mirror) / (l * l)
    };
    let mut sum = pair(0.0);
    for m in 1..=IMAGE_PAIRS {
        let c = 2.0 * m as f64 * d;
        sum += pair(-c) + pair(c) - 2.0 / (m as f64 * d);
    }
    let groups = [
        Offsets {
            mu: 0.0,
            m2: l * l / 6.0,
            m4: l.powi(4) / 15.0,
        },
        Offsets {
            mu: z1 + z2,
            m2: l * l / 6.0,
            m4: l.powi(4) / 15.0,
        },
    ];
    sum += image_tail(d, rho, &groups);
    0.5 * d * sum + (rho / (4.0 * d)).ln() + EULER_GAMMA
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    fn rel(got: f64, want: f64) -> f64 {
        (got - want).abs() / want.abs()
    }

    #[test]
    fn checks_md_table() {
        // library: scipy.special.k0 summed directly, mpmath agrees to 15 figures —
        // /work/shared/checks.md §12 (tolerance 1e-6 relative)
        let well = [
            (15.0, 20.0, 20.0, 1.0, 0.15, 9.9420448),
            (15.0, 20.0, 20.0, 0.1, 0.15, 13.355107),
            (10.0, 20.0, 20.0, 1.0, 0.15, 3.5401030),
            (6.0, 9.0, 9.0, 1.0, 0.05, 7.4879908),
            (20.0, 30.0, 40.0, 1.0, 0.30, 7.9967801),
        ];
        for (z1, z2, d, a, rw, want) in well {
            let got = well_correction(&Screen::new(z1, z2, d).with_anisotropy(a), rw);
            assert!(
                rel(got, want) < 1e-6,
                "well {z1}-{z2}/{d} a={a}: {got} vs {want}"
            );
        }
        let s = Screen::new(15.0, 20.0, 20.0);
        for (r, z, want) in [
            (1.0, 17.5, 4.9253419),
            (5.0, 17.5, 1.1579813),
            (10.0, 10.0, -0.0375578),
            (30.0, 17.5, 0.0084513),
        ] {
            let got = point_correction(&s, r, z);
            // the last two rows are quoted to 6 and 5 significant figures
            assert!(
                (got - want).abs() < 1e-6 * want.abs().max(0.05),
                "r={r} z={z}: {got}"
            );
        }
    }

    /// One row of tests/reference/partial_penetration.csv.
    struct Row {
        kind: String,
        screen: Screen,
        r: f64,
        z: f64,
        value: f64,
    }

    fn reference_rows() -> Vec<Row> {
        let path = concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/tests/reference/partial_penetration.csv"
        );
        let mut reader = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .has_headers(true)
            .from_path(path)
            .expect("tests/reference/partial_penetration.csv is readable");
        reader
            .records()
            .map(|rec| {
                let rec = rec.expect("well-formed CSV record");
                let num = |i: usize| -> f64 { rec[i].trim().parse().expect("a number") };
                Row {
                    kind: rec[0].trim().to_string(),
                    screen: Screen::new(num(1), num(2), num(3)).with_anisotropy(num(4)),
                    r: num(5),
                    z: num(6),
                    value: num(7),
                }
            })
            .collect()
    }

    #[test]
    fn reference_table() {
        // library: scipy.special.k0 summed directly until K0 underflows, cross-checked with a
        // 20-digit mpmath direct sum (scripts/reference_partial_penetration.py; versions in the
        // CSV header). Tolerance 1e-8 relative, or 1e-12 absolute.
        let rows = reference_rows();
        assert!(rows.len() >= 20, "only {} rows", rows.len());
        for row in &rows {
            let got = match row.kind.as_str() {
                "well" => well_correction(&row.screen, row.r),
                "point" => point_correction(&row.screen, row.r, row.z),
                other => panic!("unknown kind {other}"),
            };
            let err = (got - row.value).abs();
            assert!(
                err <= 1e-8 * row.value.abs() || err <= 1e-12,
                "{} {:?} r={} z={}: {got:.12e} vs {:.12e}",
                row.kind,
                row.screen,
                row.r,
                row.z,
                row.value
            );
        }
    }

    #[test]
    fn kozeny_cross_check() {
        // Kozeny (1933), from memory (checks.md §12): Q_pp/Q_full ≈ (l/D)[1 + 7√(r_w/(2l))
        // cos(πl/(2D))] = 0.448 for r_w = 0.15, screen 15–20 m, D = 20, R = 200 m; the series
        // gives ln(R/r_w)/(ln(R/r_w) + Δ_w) = 0.420. Held within 10 %.
        let (rw, l, d, r_inf) = (0.15_f64, 5.0_f64, 20.0_f64, 200.0_f64);
        let kozeny = l / d * (1.0 + 7.0 * (rw / (2.0 * l)).sqrt() * (PI * l / (2.0 * d)).cos());
        assert!((kozeny - 0.448).abs() < 5e-4, "Kozeny {kozeny}");
        let dw = well_correction(&Screen::new(15.0, 20.0, d), rw);
        let ln = (r_inf / rw).ln();
        let ratio = ln / (ln + dw);
        assert!((ratio - 0.420).abs() < 5e-4, "series {ratio}");
        assert!(rel(ratio, kozeny) < 0.10);
    }

    #[test]
    fn fully_penetrating_is_exactly_zero() {
        // Muskat (1937): a screen over the whole layer has no vertical flow, no correction.
        for s in [
            Screen::new(0.0, 20.0, 20.0),
            Screen::new(-3.0, 25.0, 20.0),
            Screen::new(0.0, 20.0, 20.0).with_anisotropy(0.05),
        ] {
            assert!(!is_partial(&s));
            assert_eq!(well_correction(&s, 0.15), 0.0);
            assert_eq!(point_correction(&s, 3.0, 4.0), 0.0);
            assert_eq!(reach(&s), 0.0);
            assert_eq!(cutoff_radius(&s, 1e-4), 0.0);
        }
        assert!(is_partial(&Screen::new(0.0, 19.0, 20.0)));
        assert!(is_partial(&Screen::new(1.0, 25.0, 20.0)));
    }

    #[test]
    fn depth_average_is_zero() {
        // Hantush (1957), from memory: the depth-averaged drawdown of a partially penetrating
        // well equals that of a fully penetrating one (the correction only moves drawdown
        // vertically). Simpson's rule over z at radii on both sides of X_SWITCH.
        let s = Screen::new(12.0, 18.0, 20.0).with_anisotropy(0.3);
        for r in [0.2, 0.5, 2.0, 8.0] {
            let n = 2000;
            let h = 20.0 / n as f64;
            let mut acc = 0.0;
            for i in 0..=n {
                let w = if i == 0 || i == n {
                    1.0
                } else if i % 2 == 1 {
                    4.0
                } else {
                    2.0
                };
                acc += w * point_correction(&s, r, i as f64 * h);
            }
            let mean = acc * h / 3.0 / 20.0;
            let scale = point_correction(&s, r, 15.0).abs();
            assert!(
                mean.abs() < 1e-4 * scale,
                "r = {r}: mean {mean}, scale {scale}"
            );
        }
    }

    #[test]
    fn decays_beyond_reach_and_cutoff() {
        for s in [
            Screen::new(15.0, 20.0, 20.0),
            Screen::new(15.0, 20.0, 20.0).with_anisotropy(0.1),
            Screen::new(0.0, 3.0, 9.0),
            Screen::new(20.0, 30.0, 40.0),
        ] {
            // rule of thumb, Kruseman & de Ridder (1994), from memory: 1.5·D·√(K_h/K_v)
            assert_relative_eq!(
                reach(&s),
                1.5 * s.thickness / s.anisotropy.sqrt(),
                max_relative = 1e-12
            );
            let cut4 = cutoff_radius(&s, 1e-4);
            let cut3 = cutoff_radius(&s, 1e-3);
            assert!(cut3 < cut4);
            for i in 0..=40 {
                let z = s.thickness * i as f64 / 40.0;
                for f in [1.0, 1.3, 2.0, 5.0] {
                    // beyond the rule-of-thumb reach the correction is a small fraction of a
                    // typical ln(R/r) ≈ 2 (about 1 % or less)
                    assert!(point_correction(&s, f * reach(&s), z).abs() < 0.02);
                    assert!(point_correction(&s, f * cut3, z).abs() < 1e-3);
                    assert!(point_correction(&s, f * cut4, z).abs() < 1e-4);
                }
            }
            // the cut-off is tight: at 0.9 of it some elevation still exceeds the tolerance
            let worst = (0..=40)
                .map(|i| point_correction(&s, 0.9 * cut4, s.thickness * i as f64 / 40.0).abs())
                .fold(0.0, f64::max);
            assert!(worst > 1e-4, "worst {worst}");
        }
    }

    #[test]
    fn no_nan_at_the_edges() {
        // common practice (no source): nothing non-finite reaches an output
        let screens = [
            Screen::new(0.0, 1e-6, 20.0),
            Screen::new(19.999, 20.0, 20.0),
            Screen::new(5.0, 6.0, 20.0).with_anisotropy(1e-8),
            Screen::new(5.0, 6.0, 20.0).with_anisotropy(1e4),
            Screen::new(0.0, 10.0, 1e-3),
            Screen::new(0.0, 10.0, 1e4),
        ];
        for s in screens {
            for r in [
                0.0,
                1e-12,
                1e-3,
                0.15,
                3.0,
                1e3,
                1e9,
                f64::INFINITY,
                f64::NAN,
            ] {
                let w = well_correction(&s, r);
                assert!(w.is_finite() && w >= 0.0, "{s:?} r={r}: {w}");
                for z in [-1.0, 0.0, 0.5 * s.thickness, s.thickness, 1e9, f64::NAN] {
                    let p = point_correction(&s, r, z);
                    assert!(p.is_finite(), "{s:?} r={r} z={z}: {p}");
                }
            }
            assert!(reach(&s).is_finite());
            assert!(cutoff_radius(&s, 1e-4).is_finite());
        }
        for bad in [
            Screen::new(5.0, 5.0, 20.0),
            Screen::new(6.0, 5.0, 20.0),
            Screen::new(21.0, 25.0, 20.0),
            Screen::new(1.0, 5.0, 0.0),
            Screen::new(1.0, 5.0, 20.0).with_anisotropy(0.0),
            Screen::new(f64::NAN, 5.0, 20.0),
        ] {
            assert!(bad.validate().is_err(), "{bad:?}");
            assert_eq!(well_correction(&bad, 0.15), 0.0);
            assert_eq!(point_correction(&bad, 1.0, 1.0), 0.0);
            assert_eq!(cutoff_radius(&bad, 1e-4), 0.0);
            assert!(!is_partial(&bad));
        }
        let msg = Screen::new(1.0, 5.0, 20.0)
            .with_anisotropy(-1.0)
            .validate()
            .unwrap_err();
        assert!(msg.starts_with("anisotropy"), "{msg}");
    }
}
