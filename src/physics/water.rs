//! Properties of water used by the formulas: unit weight, density and gravity (SI).

/// Unit weight of water γ_w, kN/m³ (fresh water, common practice (no source)).
pub const GAMMA_W: f64 = 9.81;
