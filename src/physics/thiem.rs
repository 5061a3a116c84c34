//! Steady radial flow to a well: Thiem (confined), Dupuit–Thiem (unconfined) and Jacob's
//! correction that links the two.
//!
//! Units: Q in m³/s (positive = abstraction), T in m²/s, K in m/s, distances and heads in m.
//! Heads `h` and thicknesses `H` are measured from the aquifer base.

use std::f64::consts::PI;

/// Thiem steady drawdown in a confined aquifer: s = Q/(2πT)·ln(R/r) for r < R, 0 for r ≥ R.
///
/// Units: Q m³/s, T m²/s, r and R m → s in m. Source: Thiem (1906), *Hydrologische Methoden*;
/// Kruseman & de Ridder (1994), *Analysis and Evaluation of Pumping Test Data*, 2nd ed., ch. 3.
///
/// Edge cases: r = 0 gives `+inf` (use the well radius r_w at the well); r ≥ R gives 0.
pub fn thiem_drawdown(q: f64, transmissivity: f64, r: f64, radius_of_influence: f64) -> f64 {
    if r >= radius_of_influence {
        return 0.0;
    }
    q / (2.0 * PI * transmissivity) * (radius_of_influence / r).ln()
}

/// Thiem steady flow that gives drawdown `s` at distance r: Q = 2πT·s / ln(R/r).
///
/// Units: T m²/s, s m, r and R m → Q in m³/s. Source: Thiem (1906); Kruseman & de Ridder (1994),
/// 2nd ed., ch. 3. Edge case: r ≥ R has no solution and returns NaN; r = 0 returns 0.
pub fn thiem_flow(transmissivity: f64, drawdown: f64, r: f64, radius_of_influence: f64) -> f64 {
    if r >= radius_of_influence {
        return f64::NAN;
    }
    2.0 * PI * transmissivity * drawdown / (radius_of_influence / r).ln()
}

/// Transmissivity from two steady observation wells (Thiem's method):
/// T = Q·ln(r₂/r₁) / (2π·(s₁ − s₂)).
///
/// Units: Q m³/s, r m, s m → T in m²/s. Source: Thiem (1906); Kruseman & de Ridder (1994),
/// 2nd ed., ch. 3. Edge case: s₁ = s₂ returns ±inf or NaN (no gradient measured).
pub fn thiem_transmissivity_from_pair(q: f64, r1: f64, s1: f64, r2: f64, s2: f64) -> f64 {
    q * (r2 / r1).ln() / (2.0 * PI * (s1 - s2))
}

/// Dupuit–Thiem steady head in an unconfined aquifer: h = √(H² − Q/(πK)·ln(R/r)).
///
/// Units: Q m³/s, K m/s, H (initial saturated thickness) m, r and R m → h in m above the base.
/// Source: Dupuit (1863); Thiem (1906); Kruseman & de Ridder (1994), 2nd ed., ch. 5.
///
/// Returns H for r ≥ R, and `None` when H² − Q/(πK)·ln(R/r) < 0, i.e. the aquifer would run
/// dry at r (the rate is too high for this well); r = 0 with Q > 0 is therefore `None`.
pub fn dupuit_thiem_head(
    q: f64,
    k: f64,
    saturated_thickness: f64,
    r: f64,
    radius_of_influence: f64,
) -> Option<f64> {
    let h0 = saturated_thickness;
    if r >= radius_of_influence {
        return Some(h0);
    }
    let h2 = h0 * h0 - q / (PI * k) * (radius_of_influence / r).ln();
    if h2.is_nan() || h2 < 0.0 {
        None
    } else {
        Some(h2.sqrt())
    }
}

/// Dupuit–Thiem steady flow from the head at distance r: Q = πK·(H² − h²) / ln(R/r).
///
/// Units: K m/s, H and h m above the aquifer base, r and R m → Q in m³/s. Source: Dupuit (1863);
/// Kruseman & de Ridder (1994), 2nd ed., ch. 5. Edge case: r ≥ R returns NaN.
pub fn dupuit_thiem_flow(
    k: f64,
    saturated_thickness: f64,
    head_at_well: f64,
    r: f64,
    radius_of_influence: f64,
) -> f64 {
    if r >= radius_of_influence {
        return f64::NAN;
    }
    let h0 = saturated_thickness;
    let h = head_at_well;
    PI * k * (h0 * h0 - h * h) / (radius_of_influence / r).ln()
}

/// Jacob's correction of an unconfined drawdown: s′ = s − s²/(2H).
///
/// The corrected s′ is the drawdown of the equivalent confined aquifer with T = K·H, so confined
/// formulas (Thiem, Theis) apply to s′. Units: s and H in m → s′ in m. Source: Jacob (1944);
/// Kruseman & de Ridder (1994), 2nd ed., ch. 5. H must be positive.
pub fn jacob_correction(drawdown: f64, saturated_thickness: f64) -> f64 {
    drawdown - drawdown * drawdown / (2.0 * saturated_thickness)
}

/// Inverse of Jacob's correction: s = H·(1 − √(1 − 2s′/H)), the real unconfined drawdown from
/// a confined-formula (corrected) drawdown s′.
///
/// Units: s′ and H in m → s in m. Source: Jacob (1944); Kruseman & de Ridder (1994), 2nd ed.,
/// ch. 5. Returns `None` when 2s′/H > 1 (the well would run dry). Computed in the equivalent,
/// cancellation-free form s = 2s′/(1 + √(1 − 2s′/H)).
pub fn jacob_uncorrect(corrected: f64, saturated_thickness: f64) -> Option<f64> {
    if corrected == 0.0 {
        return Some(0.0);
    }
    let ratio = 2.0 * corrected / saturated_thickness;
    if ratio.is_nan() || ratio > 1.0 {
        return None;
    }
    Some(2.0 * corrected / (1.0 + (1.0 - ratio).sqrt()))
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Oude Korendijk test, Q = 788 m³/d, in m³/s.
    const Q_OK: f64 = 788.0 / 86_400.0;

    #[test]
    fn oude_korendijk_pairwise_transmissivity() {
        // Kruseman & de Ridder (1994) 2nd ed., Table 3.2, Oude Korendijk: pairwise Thiem T
        // (values in checks.md §3), tolerance 0.5 %
        let t_a = thiem_transmissivity_from_pair(Q_OK, 0.8, 2.236, 30.0, 1.088);
        let t_b = thiem_transmissivity_from_pair(Q_OK, 0.8, 2.236, 90.0, 0.716);
        let t_c = thiem_transmissivity_from_pair(Q_OK, 30.0, 1.088, 90.0, 0.716);
        assert_relative_eq!(t_a, 4.583e-3, max_relative = 5e-3);
        assert_relative_eq!(t_b, 4.510e-3, max_relative = 5e-3);
        assert_relative_eq!(t_c, 4.287e-3, max_relative = 5e-3);
        // Kruseman & de Ridder (1994) 2nd ed., ch. 3, Oude Korendijk: T ≈ 390 m²/d (4.5e-3 m²/s)
        let mean = (t_a + t_b + t_c) / 3.0;
        assert_relative_eq!(mean, 390.0 / 86_400.0, max_relative = 0.03);
    }

    #[test]
    fn oude_korendijk_predicts_other_pairs() {
        // Kruseman & de Ridder (1994) 2nd ed., Table 3.2, Oude Korendijk: T from the 0.8/30 m
        // pair predicts the other observed drawdown differences within the ~7 % spread of the
        // book's pairwise T values (4.29e-3 to 4.58e-3 m²/s).
        let t = thiem_transmissivity_from_pair(Q_OK, 0.8, 2.236, 30.0, 1.088);
        let r_far = 1.0e4;
        let s = |r: f64| thiem_drawdown(Q_OK, t, r, r_far);
        assert_relative_eq!(s(0.8) - s(90.0), 2.236 - 0.716, max_relative = 0.07);
        assert_relative_eq!(s(30.0) - s(90.0), 1.088 - 0.716, max_relative = 0.07);
    }

    #[test]
    fn thiem_edges() {
        // Thiem (1906): zero beyond R, diverges at r = 0 (common practice (no source))
        assert_eq!(thiem_drawdown(0.01, 1e-3, 300.0, 200.0), 0.0);
        assert_eq!(thiem_drawdown(0.01, 1e-3, 200.0, 200.0), 0.0);
        assert_eq!(thiem_drawdown(0.01, 1e-3, 0.0, 200.0), f64::INFINITY);
        assert!(thiem_flow(1e-3, 1.0, 200.0, 200.0).is_nan());
    }

    #[test]
    fn well_beside_river_flow() {
        // Ferris et al. (1962) USGS WSP 1536-E, image well: Q = 2πT·s_w/ln(2a/r_w), i.e. Thiem
        // with R = 2a; s_w = 2, a = 50, r_w = 0.1, T = 1e-3 → 1.8192e-3 m³/s (checks.md §8, library)
        assert_relative_eq!(
            thiem_flow(1e-3, 2.0, 0.1, 100.0),
            1.8192e-3,
            max_relative = 1e-4
        );
    }

    #[test]
    fn dupuit_thiem_and_jacob() {
        // library: anaflow 1.2.0 `thiem` (checks.md §4): H = 20, K = 1e-4, Q = 0.01, R = 200,
        // r = 10 → Dupuit–Thiem s = 2.54598 m; Jacob-corrected 2.383928 m = Thiem with T = K·H
        let h = dupuit_thiem_head(0.01, 1e-4, 20.0, 10.0, 200.0).unwrap();
        let s = 20.0 - h;
        assert_relative_eq!(s, 2.54598, max_relative = 1e-5);
        assert_relative_eq!(jacob_correction(s, 20.0), 2.383928, max_relative = 1e-6);
        assert_relative_eq!(
            thiem_drawdown(0.01, 1e-4 * 20.0, 10.0, 200.0),
            2.383928,
            max_relative = 1e-6
        );
        // inverse: anaflow 1.2.0 values (checks.md §4)
        assert_relative_eq!(
            jacob_uncorrect(2.383928, 20.0).unwrap(),
            2.54598,
            max_relative = 1e-5
        );
    }

    #[test]
    fn jacob_correction_values() {
        // library: welltestpy 1.2.0 `cooper_jacob_correction`; Jacob (1944), from memory
        assert_relative_eq!(jacob_correction(1.0, 10.0), 0.95, max_relative = 1e-12);
        assert_relative_eq!(jacob_correction(2.0, 10.0), 1.80, max_relative = 1e-12);
        assert_relative_eq!(jacob_correction(3.0, 20.0), 2.775, max_relative = 1e-12);
        // inverse of the same published values
        assert_relative_eq!(
            jacob_uncorrect(0.95, 10.0).unwrap(),
            1.0,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            jacob_uncorrect(1.80, 10.0).unwrap(),
            2.0,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            jacob_uncorrect(2.775, 20.0).unwrap(),
            3.0,
            max_relative = 1e-12
        );
    }

    #[test]
    fn jacob_uncorrect_edges() {
        // s' = H/2 is the dry limit s = H; beyond it no solution (Jacob 1944, from memory)
        assert_relative_eq!(
            jacob_uncorrect(5.0, 10.0).unwrap(),
            10.0,
            max_relative = 1e-12
        );
        assert_eq!(jacob_uncorrect(5.0001, 10.0), None);
        assert_eq!(jacob_uncorrect(0.0, 10.0), Some(0.0));
        assert_eq!(jacob_uncorrect(1.0, 0.0), None);
    }

    #[test]
    fn single_unconfined_well_flow() {
        // checks.md §4 hand formula (library-checked): K = 5e-4, H = 10, h_w = 7, r_w = 0.15,
        // R = 201.25 → Q = 0.011124 m³/s
        let q = dupuit_thiem_flow(5e-4, 10.0, 7.0, 0.15, 201.25);
        assert_relative_eq!(q, 0.011124, max_relative = 1e-4);
        // and the head it gives back at the well is 7 m (Dupuit 1863, same formula inverted)
        let h = dupuit_thiem_head(0.011124, 5e-4, 10.0, 0.15, 201.25).unwrap();
        assert_relative_eq!(h, 7.0, max_relative = 1e-4);
    }

    #[test]
    fn dupuit_thiem_runs_dry() {
        // H² < Q/(πK)·ln(R/r): no real head (common practice (no source))
        assert_eq!(dupuit_thiem_head(1.0, 1e-5, 10.0, 0.1, 200.0), None);
        assert_eq!(dupuit_thiem_head(0.01, 1e-4, 10.0, 0.0, 200.0), None);
        assert_eq!(
            dupuit_thiem_head(0.01, 1e-4, 10.0, 250.0, 200.0),
            Some(10.0)
        );
    }
}
