//! The Theis well function W(u) = E₁(u) for the inner loop of the superposition in time.
//!
//! For u ≤ 1 the convergent series E₁(u) = −γ − ln u + Σₖ (−1)^(k+1)·uᵏ/(k·k!) (Abramowitz &
//! Stegun 1964, eq. 5.1.11) is summed to k = 20 by Horner's rule (plain multiply-add: `mul_add` is a library call without FMA hardware flags) with fixed coefficients (the
//! first term left out is below 2e-20, far under the double-precision step of E₁ ≥ 0.219
//! there); above 1 the Cephes `expn(1, u)` of [`crate::physics::special::exp1`] is used. The same
//! function, about five times cheaper where most pairs of a map lie (u small), which is where
//! the transient map spends its time. Dimensionless.

use crate::physics::special::exp1;

/// Euler–Mascheroni constant γ (Abramowitz & Stegun 1964, 6.1.3).
const EULER_GAMMA: f64 = 0.577_215_664_901_532_9;
/// Terms of the series.
const TERMS: usize = 20;

/// c_k = (−1)^(k+1)/(k·k!), k = 1 … 20.
const fn coefficients() -> [f64; TERMS] {
    let mut c = [0.0; TERMS];
    let mut fact = 1.0;
    let mut k = 1;
    while k <= TERMS {
        fact *= k as f64;
        let sign = if k % 2 == 1 { 1.0 } else { -1.0 };
        c[k - 1] = sign / (k as f64 * fact);
        k += 1;
    }
    c
}

const C: [f64; TERMS] = coefficients();

/// W(u) = E₁(u), u > 0: the series of A&S 5.1.11 for u ≤ 1, Cephes above; +inf at 0, 0 at
/// +inf, NaN for u < 0 or NaN (as [`exp1`]).
#[inline]
pub fn theis_w(u: f64) -> f64 {
    if u > 0.0 && u <= 1.0 {
        let mut s = C[TERMS - 1];
        for k in (0..TERMS - 1).rev() {
            s = s * u + C[k];
        }
        -EULER_GAMMA - u.ln() + u * s
    } else {
        exp1(u)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn matches_the_scipy_table_and_cephes() {
        // tests/reference/special_functions.csv: scipy.special.exp1 (13 significant figures)
        let table = include_str!("../../tests/reference/special_functions.csv");
        let mut n = 0;
        for line in table.lines().filter(|l| l.starts_with("exp1,")) {
            let f: Vec<f64> = line
                .split(',')
                .skip(1)
                .map(|v| v.parse().unwrap())
                .collect();
            let got = theis_w(f[0]);
            assert!(
                (got - f[2]).abs() <= 1e-12 * f[2].abs() + 1e-300,
                "E1({}) = {got}, scipy {}",
                f[0],
                f[2]
            );
            n += 1;
        }
        assert!(n >= 10);
        // and the Cephes port (relative 1e-15) over the series range, to 2e-15
        for i in 0..=2000 {
            let u = 10f64.powf(-12.0 + 12.0 * i as f64 / 2000.0);
            let (a, b) = (theis_w(u), exp1(u));
            assert!((a - b).abs() <= 2e-15 * b, "u = {u}: {a} vs {b}");
        }
        assert_eq!(theis_w(0.0), f64::INFINITY);
        assert!(theis_w(-1.0).is_nan());
    }
}
