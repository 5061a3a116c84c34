//! Capacity of a single well limited by the entrance velocity at the screen (Sichardt).

use std::f64::consts::PI;

/// Sichardt's maximum hydraulic gradient at the well face: i_max = 1/(15·√K).
///
/// Units: **K in m/s only** (empirical) → dimensionless gradient. Source: Sichardt (1928); the
/// form 1/(15√K) from memory.
pub fn sichardt_entrance_gradient(k: f64) -> f64 {
    1.0 / (15.0 * k.sqrt())
}

/// Sichardt's well capacity: q_max = 2π·r_w·h_w·K·i_max = 2π·r_w·h_w·√K / 15.
///
/// Units: r_w (well radius) m, h_w (wetted screen length) m, **K in m/s** → q_max in m³/s.
/// Source: Sichardt (1928); the form from memory. The caller must also keep the pumping level
/// above the pump intake plus its submergence; this formula does not check that.
pub fn sichardt_well_capacity(well_radius: f64, wetted_screen_length: f64, k: f64) -> f64 {
    2.0 * PI * well_radius * wetted_screen_length * k.sqrt() / 15.0
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn sichardt_capacity_values() {
        // Sichardt (1928), form from memory (checks.md §9): r_w = 0.15, h_w = 5, K = 1e-4 →
        // q_max = 3.1416e-3 m³/s, i_max = 6.667
        assert_relative_eq!(
            sichardt_well_capacity(0.15, 5.0, 1e-4),
            3.1416e-3,
            max_relative = 1e-4
        );
        assert_relative_eq!(sichardt_entrance_gradient(1e-4), 6.667, max_relative = 1e-4);
    }
}
