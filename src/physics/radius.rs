//! Radius of influence R: the distance beyond which a steady formula takes the drawdown as zero.
//!
//! R enters the steady formulas only through ln(R/r), so a rough value serves. For a group of
//! wells around an excavation the caller counts the radius from the centre of the group,
//! R₀ = r_e + L₀, with L₀ from one of the formulas here (common practice, no source).

/// Sichardt's empirical radius of influence: R = C·s·√K.
///
/// Units: **s in m and K in m/s only** (the formula is empirical and not dimensionally
/// consistent) → R in m. Use [`SICHARDT_C_RADIAL`] for flow to a well and [`SICHARDT_C_LINE`]
/// (1500–2000) for flow to a line of wells or a trench. Source: Sichardt (1928), as reviewed by
/// Houben (2021), *Grundwasser*, doi 10.1007/s00767-021-00500-3.
pub fn sichardt(drawdown: f64, k: f64, c: f64) -> f64 {
    c * drawdown * k.sqrt()
}

/// Sichardt's coefficient C for radial flow to a well (s in m, K in m/s). Sichardt (1928).
pub const SICHARDT_C_RADIAL: f64 = 3000.0;

/// Sichardt's coefficient C for flow to a line (trench, wellpoint line); published range
/// 1500–2000, lower end used here (from memory; TM 5-818-5 gives the rule in feet).
pub const SICHARDT_C_LINE: f64 = 1500.0;

/// Kusakin's empirical radius of influence for an unconfined aquifer: R = 575·s·√(H·K).
///
/// Units: **s and H in m, K in m/s only** (empirical) → R in m. Source: Kusakin (1935); the
/// formula as commonly quoted (from memory).
pub fn kusakin(drawdown: f64, saturated_thickness: f64, k: f64) -> f64 {
    575.0 * drawdown * (saturated_thickness * k).sqrt()
}

/// Cooper–Jacob radius of influence after pumping time t: R = √(2.25·T·t / S).
///
/// The distance where the Cooper–Jacob straight line reaches zero drawdown. Units: T m²/s, t s,
/// S – → R in m. Source: Cooper & Jacob (1946), *Trans. AGU* 27(4). t ≤ 0 gives 0 (or NaN for
/// t < 0, which has no meaning).
pub fn cooper_jacob_radius(transmissivity: f64, t: f64, storativity: f64) -> f64 {
    (2.25 * transmissivity * t / storativity).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn sichardt_values() {
        // Sichardt (1928), published in the review by Houben (2021), Grundwasser,
        // doi 10.1007/s00767-021-00500-3: s = 5 m, K = 1e-5 → 47.43 m; K = 1e-4 → 150.00 m
        assert_relative_eq!(
            sichardt(5.0, 1e-5, SICHARDT_C_RADIAL),
            47.43,
            max_relative = 1e-4
        );
        assert_relative_eq!(
            sichardt(5.0, 1e-4, SICHARDT_C_RADIAL),
            150.00,
            max_relative = 1e-4
        );
        // flow to a line: C = 1500–2000 (from memory), i.e. half the radial value at C = 1500
        assert_relative_eq!(
            sichardt(5.0, 1e-4, SICHARDT_C_LINE),
            75.0,
            max_relative = 1e-12
        );
    }

    #[test]
    fn kusakin_values() {
        // Kusakin (1935), formula from memory (checks.md §6): s = 5 m, H = 15 m →
        // K = 1e-5: 35.21 m; K = 1e-4: 111.35 m
        assert_relative_eq!(kusakin(5.0, 15.0, 1e-5), 35.21, max_relative = 2e-4);
        assert_relative_eq!(kusakin(5.0, 15.0, 1e-4), 111.35, max_relative = 2e-4);
    }

    #[test]
    fn cooper_jacob_radius_value() {
        // Cooper & Jacob (1946), library-computed (checks.md §6): T = 1e-3, S = 1e-4,
        // t = 1 day → 1394.27 m
        assert_relative_eq!(
            cooper_jacob_radius(1e-3, 86_400.0, 1e-4),
            1394.27,
            max_relative = 1e-5
        );
        assert_eq!(cooper_jacob_radius(1e-3, 0.0, 1e-4), 0.0);
    }
}
