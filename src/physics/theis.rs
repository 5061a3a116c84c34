//! Transient radial flow to a well in a confined aquifer: Theis and its Cooper–Jacob
//! straight-line form.
//!
//! Units: Q in m³/s (positive = abstraction), T in m²/s, S dimensionless, r in m, t in s since
//! pumping started. For an unconfined aquifer use the specific yield S_y for S, then undo Jacob's
//! correction ([`crate::physics::thiem::jacob_uncorrect`]) on the result.

use super::special::exp1;
use std::f64::consts::PI;

/// Euler–Mascheroni constant γ, as used in the Cooper–Jacob approximation.
const EULER_GAMMA: f64 = 0.577_215_664_901_532_9;

/// Theis argument u = r²·S / (4·T·t).
///
/// Units: r m, S –, T m²/s, t s → u dimensionless. Source: Theis (1935), *Trans. AGU* 16;
/// Kruseman & de Ridder (1994), *Analysis and Evaluation of Pumping Test Data*, 2nd ed., ch. 3.
/// Edge cases: t = 0 gives `+inf` (no drawdown yet), r = 0 gives 0 (at the well line).
pub fn theis_u(r: f64, storativity: f64, transmissivity: f64, t: f64) -> f64 {
    r * r * storativity / (4.0 * transmissivity * t)
}

/// Theis transient drawdown: s = Q/(4πT)·W(u), W(u) = E₁(u), u = r²S/(4Tt).
///
/// Units: Q m³/s, T m²/s, S –, r m, t s → s in m. Source: Theis (1935); Kruseman & de Ridder
/// (1994), 2nd ed., ch. 3. Edge cases: t ≤ 0 (pumping not started) gives 0; r = 0 with t > 0
/// gives `+inf` (use the well radius at the well); very large u underflows to 0.
pub fn theis_drawdown(q: f64, transmissivity: f64, storativity: f64, r: f64, t: f64) -> f64 {
    if t <= 0.0 {
        return 0.0;
    }
    let u = theis_u(r, storativity, transmissivity, t);
    q / (4.0 * PI * transmissivity) * exp1(u)
}

/// Cooper–Jacob straight-line drawdown: s = Q/(4πT)·(−γ − ln u), γ = 0.5772156649.
///
/// Units as [`theis_drawdown`]. Source: Cooper & Jacob (1946), *Trans. AGU* 27(4). Accurate for
/// small u (commonly u < 0.01; 0.25 % error there). Where the line would give a negative value
/// (u > e^(−γ) ≈ 0.5615, i.e. beyond the Cooper–Jacob radius of influence) it returns 0, and
/// t ≤ 0 returns 0.
pub fn cooper_jacob_drawdown(q: f64, transmissivity: f64, storativity: f64, r: f64, t: f64) -> f64 {
    if t <= 0.0 {
        return 0.0;
    }
    let u = theis_u(r, storativity, transmissivity, t);
    let w = -EULER_GAMMA - u.ln();
    if w <= 0.0 {
        return 0.0;
    }
    q / (4.0 * PI * transmissivity) * w
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn theis_one_point() {
        // Inputs from Fetter, Applied Hydrogeology (worked-example inputs); values library
        // (anaflow `theis` 5.71867 m), checks.md §5, tolerance 1e-3
        let day = 86_400.0;
        let t_m2s = 14.9 * 20.1 / day;
        let q = 2725.0 / day;
        let u = theis_u(7.0, 0.0051, t_m2s, day);
        assert_relative_eq!(u, 2.086e-4, max_relative = 1e-3);
        assert_relative_eq!(exp1(u), 7.898, max_relative = 1e-3);
        let s = theis_drawdown(q, t_m2s, 0.0051, 7.0, day);
        assert_relative_eq!(s, 5.71867, max_relative = 1e-3);
    }

    #[test]
    fn cooper_jacob_error_against_theis() {
        // library (checks.md §1): relative error of the Cooper–Jacob line against W(u):
        // u = 0.001 → 0.016 %, 0.01 → 0.247 %, 0.05 → 2.00 %, 0.1 → 5.35 %
        let (q, t_m2s, s_coef, t) = (0.01, 1e-3, 1e-4, 86_400.0_f64);
        for (u, err_pct, tol_pct) in [
            (0.001_f64, 0.016, 0.0005),
            (0.01, 0.247, 0.0005),
            (0.05, 2.00, 0.005),
            (0.1, 5.35, 0.005),
        ] {
            let r = (u * 4.0 * t_m2s * t / s_coef).sqrt();
            let exact = theis_drawdown(q, t_m2s, s_coef, r, t);
            let line = cooper_jacob_drawdown(q, t_m2s, s_coef, r, t);
            let pct = 100.0 * (exact - line) / exact;
            assert!(
                (pct - err_pct).abs() <= tol_pct,
                "u = {u}: {pct} % vs {err_pct} %"
            );
        }
    }

    #[test]
    fn theis_edges() {
        // before pumping starts there is no drawdown; far away it underflows to 0
        // (common practice (no source))
        assert_eq!(theis_drawdown(0.01, 1e-3, 1e-4, 10.0, 0.0), 0.0);
        assert_eq!(theis_drawdown(0.01, 1e-3, 1e-4, 10.0, -5.0), 0.0);
        assert_eq!(theis_drawdown(0.01, 1e-3, 0.2, 1.0e5, 1.0), 0.0);
        assert_eq!(theis_drawdown(0.01, 1e-3, 1e-4, 0.0, 10.0), f64::INFINITY);
        assert_eq!(cooper_jacob_drawdown(0.01, 1e-3, 1e-4, 10.0, 0.0), 0.0);
        // Cooper & Jacob (1946): the line reaches zero at u = e^-γ (r = √(2.25 T t / S));
        // beyond it the returned drawdown is 0, not negative (from memory)
        assert_eq!(
            cooper_jacob_drawdown(0.01, 1e-3, 1e-4, 2000.0, 86_400.0),
            0.0
        );
        assert!(cooper_jacob_drawdown(0.01, 1e-3, 1e-4, 1300.0, 86_400.0) > 0.0);
    }
}
