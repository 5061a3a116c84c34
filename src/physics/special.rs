//! Special functions of well hydraulics: the exponential integral E₁ (the Theis well function),
//! the modified Bessel functions K₀ and K₁, and the Hantush–Jacob leaky well function W(u, r/B).
//!
//! E₁, K₀ and K₁ come from the `spec_math` crate (a port of the Cephes library, relative error
//! about 1e-15). The Hantush function is integrated numerically here.
//!
//! # Edge cases
//! - `exp1(0)`, `bessel_k0(0)`, `bessel_k1(0)` and `hantush_w(0, 0)` are `+inf` (the well itself).
//! - For large arguments the functions underflow to exactly `0.0` (E₁(x) for x > ~709,
//!   K₀ and K₁ for x > ~705, W(u, β) once u + β²/(4u) > ~745): no NaN, no panic.
//! - Negative or NaN arguments return NaN: they have no physical meaning here.

use spec_math::cephes64;

/// The edge cases shared by E₁, K₀ and K₁ (all decay to 0 and are singular at 0): NaN for
/// x < 0 or NaN, +inf at 0, 0 at +inf; `f` for the rest.
fn guarded(x: f64, f: impl Fn(f64) -> f64) -> f64 {
    if x.is_nan() || x < 0.0 {
        return f64::NAN;
    }
    if x == 0.0 {
        return f64::INFINITY;
    }
    if x.is_infinite() {
        return 0.0;
    }
    f(x)
}

/// Exponential integral E₁(x) = ∫ₓ^∞ e^(−y)/y dy, the Theis well function W(u) = E₁(u).
///
/// Dimensionless. Source: Abramowitz & Stegun (1964), *Handbook of Mathematical Functions*,
/// eq. 5.1.1; Theis (1935). Evaluated with `spec_math` (Cephes `expn(1, x)`).
///
/// Returns `+inf` at x = 0, `0.0` for x beyond ~709 (underflow), NaN for x < 0 or NaN.
pub fn exp1(x: f64) -> f64 {
    guarded(x, |x| cephes64::expn(1, x))
}

/// Modified Bessel function of the second kind, order zero, K₀(x).
///
/// Dimensionless. Source: Abramowitz & Stegun (1964), §9.6. Evaluated with `spec_math`
/// (Cephes `k0`). Returns `+inf` at x = 0, `0.0` for very large x, NaN for x < 0 or NaN.
pub fn bessel_k0(x: f64) -> f64 {
    guarded(x, cephes64::k0)
}

/// Modified Bessel function of the second kind, order one, K₁(x).
///
/// Dimensionless. Source: Abramowitz & Stegun (1964), §9.6. Evaluated with `spec_math`
/// (Cephes `k1`). Returns `+inf` at x = 0, `0.0` for very large x, NaN for x < 0 or NaN.
pub fn bessel_k1(x: f64) -> f64 {
    guarded(x, cephes64::k1)
}

/// Hantush–Jacob leaky well function W(u, β) = ∫ᵤ^∞ (1/y)·exp(−y − β²/(4y)) dy, β = r/B.
///
/// Dimensionless. Source: Hantush & Jacob (1955), *Trans. AGU* 36(1); Hantush (1956), tabulated
/// in Kruseman & de Ridder, *Analysis and Evaluation of Pumping Test Data*, 2nd ed. (1994).
///
/// Limits: β = 0 gives E₁(u) (Theis); u = 0 gives the steady value 2·K₀(β); W(β/2, β) = K₀(β).
/// `hantush_w(0, 0)` is `+inf`; the result underflows to `0.0` when u + β²/(4u) exceeds ~745.
/// Negative or NaN arguments return NaN.
///
/// Method: substitution y = eᵗ, which turns the integrand into the smooth, bounded
/// exp(−eᵗ − β²e^(−t)/4); the range is cut where the integrand has fallen below e^(−46) of its
/// peak, and integrated by adaptive 15-point Gauss–Kronrod quadrature to a relative error
/// estimate of 1e-11 (the Kronrod–Gauss difference is itself a large over-estimate, so the
/// achieved error is smaller still). Checked against `mpmath.quad` in
/// `tests/reference/special_functions.csv`.
pub fn hantush_w(u: f64, r_over_b: f64) -> f64 {
    let beta = r_over_b;
    if u.is_nan() || beta.is_nan() || u < 0.0 || beta < 0.0 {
        return f64::NAN;
    }
    if beta == 0.0 {
        return exp1(u);
    }
    if u.is_infinite() || beta.is_infinite() {
        return 0.0;
    }
    let b2 = 0.25 * beta * beta;
    // Exponent g(y) = y + b2/y has its minimum over y ≥ u at y* = max(u, β/2).
    let y_star = u.max(0.5 * beta);
    let g_min = y_star + b2 / y_star;
    if g_min > 800.0 {
        // exp(−g) underflows for every y ≥ u; the integral is below the smallest double.
        return 0.0;
    }
    // Cut-offs where g(y) − g_min ≥ 46 (integrand below 1e-20 of its peak).
    // Upper: g(y) ≥ y, and g_min ≤ y* + β/2.
    let y_hi = y_star + 0.5 * beta + 46.0;
    // Lower (only matters below β/2): b2/y ≥ g_min + 46 implies g(y) − g_min ≥ 46.
    let y_lo = u.max(b2 / (g_min + 46.0));
    if y_lo <= 0.0 {
        // β so small that β²/4 underflows (u = 0 too): the leakage term vanishes to double
        // precision, W(u, β) = E₁(u). Without this the lower limit would be ln 0.
        return exp1(u);
    }
    let t_lo = y_lo.ln();
    let t_hi = y_hi.ln();
    let integrand = |t: f64| {
        let y = t.exp();
        (g_min - y - b2 / y).exp()
    };
    let scaled = adaptive_gauss_kronrod(&integrand, t_lo, t_hi, 1e-11);
    scaled * (-g_min).exp()
}

/// Gauss–Kronrod 15-point nodes (non-negative half, descending), Kronrod weights, and the
/// weights of the embedded 7-point Gauss rule (nodes `XGK[1]`, `XGK[3]`, `XGK[5]`, `XGK[7]`).
/// Values as in QUADPACK `qk15` (Piessens et al. 1983).
const XGK: [f64; 8] = [
    0.991_455_371_120_812_6,
    0.949_107_912_342_758_5,
    0.864_864_423_359_769_1,
    0.741_531_185_599_394_4,
    0.586_087_235_467_691_1,
    0.405_845_151_377_397_2,
    0.207_784_955_007_898_5,
    0.0,
];
const WGK: [f64; 8] = [
    0.022_935_322_010_529_225,
    0.063_092_092_629_978_55,
    0.104_790_010_322_250_18,
    0.140_653_259_715_525_92,
    0.169_004_726_639_267_9,
    0.190_350_578_064_785_4,
    0.204_432_940_075_298_9,
    0.209_482_141_084_727_83,
];
const WG: [f64; 4] = [
    0.129_484_966_168_869_7,
    0.279_705_391_489_276_7,
    0.381_830_050_505_118_9,
    0.417_959_183_673_469_4,
];

/// One Gauss–Kronrod 15-point panel on [a, b]: (Kronrod estimate, |Kronrod − Gauss|).
fn gk15<F: Fn(f64) -> f64>(f: &F, a: f64, b: f64) -> (f64, f64) {
    let c = 0.5 * (a + b);
    let h = 0.5 * (b - a);
    let fc = f(c);
    let mut kronrod = WGK[7] * fc;
    let mut gauss = WG[3] * fc;
    for (j, (&x, &w)) in XGK.iter().zip(WGK.iter()).take(7).enumerate() {
        let dx = h * x;
        let pair = f(c - dx) + f(c + dx);
        kronrod += w * pair;
        if j % 2 == 1 {
            gauss += WG[j / 2] * pair;
        }
    }
    (kronrod * h, ((kronrod - gauss) * h).abs())
}

/// Adaptive Gauss–Kronrod quadrature of a smooth, non-negative integrand on [a, b].
///
/// The interval is first split into panels of width at most 2, then each panel is bisected until
/// its error estimate falls below its share of `rel_tol` × (total estimate). Depth is capped, so
/// the routine always terminates.
fn adaptive_gauss_kronrod<F: Fn(f64) -> f64>(f: &F, a: f64, b: f64, rel_tol: f64) -> f64 {
    if !(a.is_finite() && b.is_finite()) {
        return f64::NAN;
    }
    if b <= a {
        return 0.0;
    }
    let width = b - a;
    let n0 = (width / 2.0).ceil().max(1.0) as usize;
    let step = width / n0 as f64;
    // First pass: coarse estimate of the total to set the absolute tolerance.
    let mut panels: Vec<(f64, f64, f64, f64, u32)> = Vec::with_capacity(n0);
    let mut total = 0.0;
    for i in 0..n0 {
        let lo = a + step * i as f64;
        let hi = if i + 1 == n0 { b } else { lo + step };
        let (v, e) = gk15(f, lo, hi);
        total += v;
        panels.push((lo, hi, v, e, 0));
    }
    let abs_tol = rel_tol * total.abs();
    let mut sum = 0.0;
    while let Some((lo, hi, v, e, depth)) = panels.pop() {
        let share = abs_tol * (hi - lo) / width;
        if e <= share || depth >= 40 || !e.is_finite() {
            sum += v;
            continue;
        }
        let mid = 0.5 * (lo + hi);
        let (v1, e1) = gk15(f, lo, mid);
        let (v2, e2) = gk15(f, mid, hi);
        panels.push((lo, mid, v1, e1, depth + 1));
        panels.push((mid, hi, v2, e2, depth + 1));
    }
    sum
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn exp1_library_values() {
        // library: scipy.special.exp1 / mpmath.e1 (values copied into checks.md §1), tol 1e-6
        let rows = [
            (1e-10, 22.448635),
            (1e-8, 17.843465),
            (1e-6, 13.238296),
            (1e-5, 10.935720),
            (1e-4, 8.6332247),
            (1e-3, 6.3315394),
            (0.01, 4.0379296),
            (0.05, 2.4678985),
            (0.1, 1.8229240),
            (0.5, 0.55977359),
            (1.0, 0.21938393),
            (2.0, 0.048900511),
            (5.0, 0.0011482956),
        ];
        for (u, w) in rows {
            assert_relative_eq!(exp1(u), w, max_relative = 1e-6);
        }
    }

    #[test]
    fn exp1_published_theis_table() {
        // Huisman (1972) Groundwater Recovery, Table 4.1 (Theis well function), 4-5 figures.
        // Tolerance: half a unit in the last published digit (the relative 1e-4 of checks.md
        // is tighter than the rounding of 0.001148 and 1.245e-5 allows).
        let rows = [
            (1e-10, 22.4486, 0.5e-4),
            (1e-5, 10.9357, 0.5e-4),
            (1.0, 0.2194, 0.5e-4),
            (2.0, 0.04890, 0.5e-5),
            (5.0, 0.001148, 0.5e-6),
            (9.0, 1.245e-5, 0.5e-8),
        ];
        for (u, w, half_ulp) in rows {
            assert!(
                (exp1(u) - w).abs() <= half_ulp,
                "E1({u}) = {} vs published {w}",
                exp1(u)
            );
        }
    }

    #[test]
    fn exp1_edges() {
        // Abramowitz & Stegun (1964) 5.1.1: E1(0) diverges; E1(x) ~ e^-x/x for large x (from memory)
        assert_eq!(exp1(0.0), f64::INFINITY);
        assert_eq!(exp1(f64::INFINITY), 0.0);
        assert_eq!(exp1(1000.0), 0.0);
        assert!(exp1(-1.0).is_nan());
        assert!(exp1(f64::NAN).is_nan());
        // asymptotic E1(x) ≈ e^-x/x·(1 − 1/x + 2/x²), relative error < 6/x³ (from memory)
        let x = 600.0_f64;
        let asym = (-x).exp() / x * (1.0 - 1.0 / x + 2.0 / (x * x));
        assert_relative_eq!(exp1(x), asym, max_relative = 1e-7);
    }

    #[test]
    fn bessel_k0_library_values() {
        // library: scipy.special.k0 (values 2·K0 in checks.md §2), tol 1e-6
        let rows = [
            (0.001, 14.047378),
            (0.01, 9.4424895),
            (0.1, 4.854138),
            (0.5, 1.8488381),
            (1.0, 0.84204888),
            (2.0, 0.22778775),
        ];
        for (x, two_k0) in rows {
            assert_relative_eq!(2.0 * bessel_k0(x), two_k0, max_relative = 1e-6);
        }
    }

    #[test]
    fn bessel_k1_values() {
        // library: scipy 1.17.1 special.k1: K1(1) = 0.6019072302, K1(2) = 0.1398658818
        assert_relative_eq!(bessel_k1(1.0), 0.601_907_230_2, max_relative = 1e-9);
        assert_relative_eq!(bessel_k1(2.0), 0.139_865_881_8, max_relative = 1e-9);
        // K1(x) ~ 1/x for small x (A&S 9.6.9, from memory)
        assert_relative_eq!(bessel_k1(1e-8), 1e8, max_relative = 1e-6);
    }

    #[test]
    fn bessel_edges() {
        // K0, K1 diverge at 0 and decay as sqrt(pi/(2x)) e^-x (A&S 9.7.2, from memory)
        assert_eq!(bessel_k0(0.0), f64::INFINITY);
        assert_eq!(bessel_k1(0.0), f64::INFINITY);
        assert_eq!(bessel_k0(1e4), 0.0);
        assert_eq!(bessel_k1(f64::INFINITY), 0.0);
        assert!(bessel_k0(-1.0).is_nan());
        let x = 300.0_f64;
        let asym = (std::f64::consts::PI / (2.0 * x)).sqrt() * (-x).exp() * (1.0 - 1.0 / (8.0 * x));
        assert_relative_eq!(bessel_k0(x), asym, max_relative = 1e-5);
    }

    #[test]
    fn hantush_library_values() {
        // library: scipy quad / mpmath.quad (checks.md §2; several match the Hantush 1956 table
        // reprinted in Kruseman & de Ridder 1994 2nd ed., from memory), tol 1e-6
        let rows = [
            (1e-6, 0.01, 9.4424895),
            (1e-4, 0.01, 8.3982586),
            (1e-2, 0.01, 4.0355569),
            (1e-4, 0.1, 4.854138),
            (1e-2, 0.1, 3.8150165),
            (0.1, 0.1, 1.8049897),
            (1.0, 0.1, 0.21901304),
            (0.1, 0.5, 1.4421957),
            (0.1, 1.0, 0.8190345),
            (1.0, 1.0, 0.18547481),
        ];
        for (u, beta, w) in rows {
            assert_relative_eq!(hantush_w(u, beta), w, max_relative = 1e-6);
        }
    }

    #[test]
    fn hantush_identities() {
        // Hantush (1956) identity W(r/(2B), r/B) = K0(r/B); W(0.5, 1) = 0.42102444
        // (library: scipy.special.k0, checks.md §2)
        assert_relative_eq!(hantush_w(0.5, 1.0), 0.421_024_44, max_relative = 1e-7);
        // steady limit W(0, r/B) = 2 K0(r/B) (library: scipy.special.k0, checks.md §2)
        let steady = [
            (0.001, 14.047378),
            (0.01, 9.4424895),
            (0.1, 4.854138),
            (0.5, 1.8488381),
            (1.0, 0.84204888),
            (2.0, 0.22778775),
        ];
        for (beta, w) in steady {
            assert_relative_eq!(hantush_w(0.0, beta), w, max_relative = 1e-6);
        }
        // r/B = 0 reduces to the Theis function (library: scipy.special.exp1, checks.md §1)
        assert_relative_eq!(hantush_w(0.1, 0.0), 1.8229240, max_relative = 1e-6);
        // a tiny r/B is continuous with the Theis limit (library: scipy.special.exp1)
        assert_relative_eq!(hantush_w(0.1, 1e-9), 1.8229240, max_relative = 1e-6);
    }

    #[test]
    fn hantush_edges() {
        // divergent at the well with no leakage; underflow far away (common practice (no source))
        assert_eq!(hantush_w(0.0, 0.0), f64::INFINITY);
        assert_eq!(hantush_w(1000.0, 1.0), 0.0);
        assert_eq!(hantush_w(0.1, 2000.0), 0.0);
        assert_eq!(hantush_w(f64::INFINITY, 1.0), 0.0);
        assert!(hantush_w(-1.0, 1.0).is_nan());
        assert!(hantush_w(1.0, -1.0).is_nan());
        assert!(hantush_w(f64::NAN, 1.0).is_nan());
        // large u: W(u, β) ≈ exp(−u − β²/(4u))/u·(1 − 1/u + ...) (leading term, from memory)
        let u = 200.0_f64;
        let beta = 1.0_f64;
        let lead = (-u - beta * beta / (4.0 * u)).exp() / u;
        assert_relative_eq!(hantush_w(u, beta), lead, max_relative = 2.0 / u);
        // u = 0 with a β whose square underflows (a fit wandering to B → ∞ and S → 0) once
        // panicked (ln 0 as a quadrature limit): W(0, β) = 2·K₀(β) diverges like −2 ln β,
        // and β²/4 = 0 in double precision leaves E₁(0) = ∞ (A&S 9.6.13, from memory).
        assert_eq!(hantush_w(0.0, 1e-200), f64::INFINITY);
        assert_relative_eq!(hantush_w(1e-3, 1e-200), exp1(1e-3), max_relative = 1e-12);
        assert!(adaptive_gauss_kronrod(&|x: f64| x, f64::NEG_INFINITY, 1.0, 1e-9).is_nan());
    }

    #[test]
    fn gauss_kronrod_polynomial_exactness() {
        // A 15-point Kronrod rule integrates polynomials up to degree 22 exactly
        // (Piessens et al. 1983, QUADPACK, from memory): ∫_0^1 x^22 dx = 1/23
        let (v, _) = gk15(&|x: f64| x.powi(22), 0.0, 1.0);
        assert_relative_eq!(v, 1.0 / 23.0, max_relative = 1e-14);
    }
}
