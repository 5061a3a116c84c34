//! Properties of water used by the formulas: unit weight, density and gravity (SI).

/// Unit weight of water γ_w, kN/m³ (fresh water, common practice (no source)).
pub const GAMMA_W: f64 = 9.81;
/// Gravity g, m/s² (the rounded value checks.md §15 uses).
pub const G: f64 = 9.81;
/// Density of water ρ_w, kg/m³ (fresh water).
pub const WATER_DENSITY: f64 = 1000.0;
