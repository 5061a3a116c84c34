//! Flow to a well in a leaky (semi-confined) aquifer: Hantush–Jacob, steady and transient.
//!
//! Units: Q in m³/s (positive = abstraction), T in m²/s, c (hydraulic resistance of the
//! aquitard, thickness / vertical conductivity) in s, B in m, S dimensionless, r in m, t in s.

use super::special::{bessel_k0, hantush_w};
use super::theis::theis_u;
use std::f64::consts::PI;

/// Leakage factor B = √(T·c).
///
/// Units: T m²/s, c s → B in m. Source: Hantush & Jacob (1955); Kruseman & de Ridder (1994),
/// *Analysis and Evaluation of Pumping Test Data*, 2nd ed., ch. 4. An infinite resistance (no
/// leakage) gives B = `+inf`, for which the formulas below reduce to Thiem-like and Theis forms.
pub fn leakage_factor(transmissivity: f64, resistance_s: f64) -> f64 {
    (transmissivity * resistance_s).sqrt()
}

/// Steady drawdown in a leaky aquifer (de Glee / Hantush–Jacob): s = Q/(2πT)·K₀(r/B).
///
/// Units: Q m³/s, T m²/s, r m, B m → s in m. Source: de Glee (1930); Hantush & Jacob (1955);
/// Kruseman & de Ridder (1994), 2nd ed., ch. 4. Edge cases: r = 0 gives `+inf`; B = `+inf`
/// (no leakage) has no steady state and gives `+inf`; very large r/B underflows to 0.
pub fn hantush_steady_drawdown(q: f64, transmissivity: f64, r: f64, leakage_factor: f64) -> f64 {
    q / (2.0 * PI * transmissivity) * bessel_k0(r / leakage_factor)
}

/// Transient drawdown in a leaky aquifer: s = Q/(4πT)·W(u, r/B), u = r²S/(4Tt).
///
/// Units: Q m³/s, T m²/s, S –, r m, t s, B m → s in m. Source: Hantush & Jacob (1955),
/// *Trans. AGU* 36(1); Kruseman & de Ridder (1994), 2nd ed., ch. 4. Edge cases: t ≤ 0 gives 0;
/// B = `+inf` gives the Theis drawdown; as t → ∞ it tends to [`hantush_steady_drawdown`].
pub fn hantush_transient_drawdown(
    q: f64,
    transmissivity: f64,
    storativity: f64,
    r: f64,
    t: f64,
    leakage_factor: f64,
) -> f64 {
    if t <= 0.0 {
        return 0.0;
    }
    let u = theis_u(r, storativity, transmissivity, t);
    q / (4.0 * PI * transmissivity) * hantush_w(u, r / leakage_factor)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn leakage_factor_value() {
        // B = √(T c): T = 1e-3 m²/s, c = 1e6 s → B = √1000 = 31.6228 m (Hantush & Jacob 1955,
        // arithmetic; from memory)
        assert_relative_eq!(
            leakage_factor(1e-3, 1e6),
            31.622_776_601_683_793,
            max_relative = 1e-12
        );
    }

    #[test]
    fn steady_matches_two_k0_table() {
        // library: scipy.special.k0, steady limit 2·K0(r/B) (checks.md §2):
        // s·4πT/Q = 2 K0(r/B)
        let (q, t_m2s, b) = (0.01, 1e-3, 100.0);
        let scale = q / (4.0 * PI * t_m2s);
        for (rb, two_k0) in [
            (0.001, 14.047378),
            (0.01, 9.4424895),
            (0.1, 4.854138),
            (0.5, 1.8488381),
            (1.0, 0.84204888),
            (2.0, 0.22778775),
        ] {
            let s = hantush_steady_drawdown(q, t_m2s, rb * b, b);
            assert_relative_eq!(s / scale, two_k0, max_relative = 1e-6);
        }
    }

    #[test]
    fn transient_matches_hantush_table() {
        // library: scipy quad / mpmath.quad W(u, r/B) (checks.md §2), tol 1e-6
        let (q, t_m2s, s_coef, b) = (0.01, 1e-3, 1e-4, 200.0);
        let scale = q / (4.0 * PI * t_m2s);
        for (u, rb, w) in [
            (1e-4, 0.1, 4.854138),
            (1e-2, 0.1, 3.8150165),
            (0.1, 0.5, 1.4421957),
            (1.0, 1.0, 0.18547481),
        ] {
            let r = rb * b;
            let t = r * r * s_coef / (4.0 * t_m2s * u);
            let s = hantush_transient_drawdown(q, t_m2s, s_coef, r, t, b);
            assert_relative_eq!(s / scale, w, max_relative = 1e-6);
        }
    }

    #[test]
    fn limits() {
        // No leakage (B = ∞) is the Theis case: W(0.1) = 1.8229240 (library: scipy.special.exp1)
        let (q, t_m2s, s_coef) = (0.01, 1e-3, 1e-4);
        let scale = q / (4.0 * PI * t_m2s);
        let r = 50.0;
        let t = r * r * s_coef / (4.0 * t_m2s * 0.1);
        let s = hantush_transient_drawdown(q, t_m2s, s_coef, r, t, f64::INFINITY);
        assert_relative_eq!(s / scale, 1.8229240, max_relative = 1e-6);
        // Long times reach the steady 2·K0(1) = 0.84204888 (library: scipy.special.k0)
        let s = hantush_transient_drawdown(q, t_m2s, s_coef, 100.0, 1e12, 100.0);
        assert_relative_eq!(s / scale, 0.84204888, max_relative = 1e-6);
        // before pumping: nothing (common practice (no source))
        assert_eq!(
            hantush_transient_drawdown(q, t_m2s, s_coef, r, 0.0, 100.0),
            0.0
        );
    }
}
