//! Consolidation in time: Terzaghi's one-dimensional theory (Terzaghi 1943, *Theoretical Soil
//! Mechanics*; as tabulated in Craig's *Soil Mechanics* and Das, *Principles of Geotechnical
//! Engineering*).
//!
//! The time factor is T_v = c_v·t/H_dr², with H_dr the longest drainage path: half the layer when
//! it drains at both faces, the whole layer when at one. The average degree of consolidation of
//! a layer whose excess pore pressure starts uniform (or, with drainage at both faces, varies
//! linearly with depth) is the series
//!
//! U(T_v) = 1 − Σ_{m≥0} (2/M²)·exp(−M²·T_v),  M = π(2m + 1)/2.
//!
//! For T_v below [`SMALL_TV`] the series needs millions of terms; there U = √(4·T_v/π), which
//! differs from the series by less than 1e-12 at that T_v (the error is of order exp(−1/T_v)).

use crate::input::model::DrainageFaces;
use std::f64::consts::PI;

/// Below this T_v, U = √(4·T_v/π).
pub const SMALL_TV: f64 = 1e-4;

/// T_v = c_v·t/H_dr², with `cv` in m²/s, `t` in s, `h_dr` in m.
pub fn time_factor(cv: f64, t: f64, h_dr: f64) -> f64 {
    if h_dr <= 0.0 {
        return f64::INFINITY;
    }
    cv * t.max(0.0) / (h_dr * h_dr)
}

/// Longest drainage path H_dr, m, of a layer of `thickness` m draining through `faces`.
pub fn drainage_path(thickness: f64, faces: DrainageFaces) -> f64 {
    match faces {
        DrainageFaces::Both => 0.5 * thickness,
        DrainageFaces::Top | DrainageFaces::Bottom => thickness,
    }
}

/// Terzaghi's average degree of consolidation U(T_v), 0 … 1 (series solution).
pub fn average_degree(tv: f64) -> f64 {
    if tv.is_nan() || tv <= 0.0 {
        return 0.0;
    }
    if tv == f64::INFINITY {
        return 1.0;
    }
    if tv < SMALL_TV {
        return (4.0 * tv / PI).sqrt();
    }
    let mut sum = 0.0;
    let mut m = 0u32;
    loop {
        let big_m = PI * (2.0 * f64::from(m) + 1.0) / 2.0;
        let exponent = big_m * big_m * tv;
        sum += 2.0 / (big_m * big_m) * (-exponent).exp();
        // The terms fall faster than exp(−M²·T_v); past 60 they are below 1e-26.
        if exponent > 60.0 {
            break;
        }
        m += 1;
    }
    (1.0 - sum).clamp(0.0, 1.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    // Published U–T_v table (Terzaghi 1943; reproduced in Craig's Soil Mechanics and Das,
    // Principles of Geotechnical Engineering — from memory, edition and table number not
    // confirmed; also /work/shared/checks.md §16): T_v → U to the table's three decimals.
    #[test]
    fn matches_the_published_table() {
        for (tv, u) in [
            (0.008, 0.10),
            (0.031, 0.20),
            (0.071, 0.30),
            (0.126, 0.40),
            (0.197, 0.50),
            (0.287, 0.60),
            (0.403, 0.70),
            (0.567, 0.80),
            (0.848, 0.90),
        ] {
            let got = average_degree(tv);
            assert!((got - u).abs() < 5e-3, "T_v {tv}: U {got}, table {u}");
        }
    }

    // The small-T_v form √(4T_v/π) (Terzaghi; from memory) joins the series at SMALL_TV.
    #[test]
    fn small_time_factor_form_joins_the_series() {
        let series = {
            let mut s = 0.0;
            for m in 0..2_000_000u32 {
                let big_m = PI * (2.0 * f64::from(m) + 1.0) / 2.0;
                s += 2.0 / (big_m * big_m) * (-big_m * big_m * SMALL_TV).exp();
            }
            1.0 - s
        };
        assert!((average_degree(SMALL_TV * 0.999_999) - series).abs() < 1e-6);
    }
}
