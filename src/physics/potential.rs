//! The aquifer and its discharge potential Φ (Strack, *Groundwater Mechanics*, 1989, §8).
//!
//! Superposition is linear in Φ, not in head, so every well's effect is summed as ΔΦ and only the
//! total is turned back into a level. With h the head above the aquifer base and b the confined
//! thickness:
//! - confined (h ≥ b): Φ = K·b·h − ½·K·b²
//! - unconfined (h < b, or no confining top): Φ = ½·K·h²
//!
//! The two join with equal value and slope at h = b, so an aquifer that turns unconfined near the
//! wells is one formula. Units: Φ in m³/s per metre (m³/s·m⁻¹ = m²/s · m).

/// How the aquifer is bounded above.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum AquiferKind {
    /// Free water table.
    Unconfined,
    /// Below an impermeable layer; turns unconfined where the head falls below its top.
    Confined,
    /// Below a leaky aquitard with leakage factor B (m), Hantush–Jacob.
    Leaky {
        /// Leakage factor B = √(T·c), m.
        leakage_factor: f64,
    },
}

/// A homogeneous, isotropic aquifer of constant thickness. Levels are elevations above datum, m.
#[derive(Debug, Clone)]
pub struct Aquifer {
    /// Boundary above.
    pub kind: AquiferKind,
    /// Hydraulic conductivity K, m/s.
    pub conductivity: f64,
    /// Level of the aquifer base, m.
    pub base_level: f64,
    /// Level of the confining top, m (confined and leaky).
    pub top_level: Option<f64>,
    /// Groundwater level before pumping, m.
    pub initial_level: f64,
    /// Storativity S (confined, leaky), dimensionless.
    pub storativity: Option<f64>,
    /// Specific yield S_y (unconfined), dimensionless.
    pub specific_yield: Option<f64>,
}

/// A level computed from a potential: wet, or pumped dry at the aquifer base.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Level {
    /// Water level above datum, m.
    Wet(f64),
    /// The potential is at or below zero: no saturated thickness is left here.
    Dry,
}

impl Level {
    /// The level, or the aquifer base when dry.
    pub fn or_base(self, base: f64) -> f64 {
        match self {
            Level::Wet(z) => z,
            Level::Dry => base,
        }
    }
}

impl Aquifer {
    /// Confined thickness b = top − base, m; `None` for an unconfined aquifer.
    pub fn confined_thickness(&self) -> Option<f64> {
        match self.kind {
            AquiferKind::Unconfined => None,
            _ => self.top_level.map(|t| t - self.base_level),
        }
    }

    /// Saturated thickness before pumping, m: b when confined, H = level − base when unconfined.
    pub fn initial_saturated_thickness(&self) -> f64 {
        let h = self.initial_level - self.base_level;
        self.confined_thickness().map_or(h, |b| b.min(h))
    }

    /// Transmissivity T = K × saturated thickness before pumping, m²/s.
    pub fn transmissivity(&self) -> f64 {
        self.conductivity * self.initial_saturated_thickness()
    }

    /// Discharge potential Φ at a water level (Strack 1989, eqs. 8.7 and 8.13), m³/s per m.
    pub fn potential(&self, level: f64) -> f64 {
        let k = self.conductivity;
        let h = (level - self.base_level).max(0.0);
        match self.confined_thickness() {
            Some(b) if h >= b => k * b * h - 0.5 * k * b * b,
            _ => 0.5 * k * h * h,
        }
    }

    /// Potential before pumping, Φ₀.
    pub fn initial_potential(&self) -> f64 {
        self.potential(self.initial_level)
    }

    /// Inverse of [`Aquifer::potential`]: the water level for a potential, or `Dry` when Φ ≤ 0.
    pub fn level(&self, potential: f64) -> Level {
        if potential.is_nan() || potential <= 0.0 {
            return Level::Dry;
        }
        let k = self.conductivity;
        let h = match self.confined_thickness() {
            Some(b) if potential >= 0.5 * k * b * b => (potential + 0.5 * k * b * b) / (k * b),
            _ => (2.0 * potential / k).sqrt(),
        };
        Level::Wet(self.base_level + h)
    }

    /// Leakage factor B, m, for a leaky aquifer.
    pub fn leakage_factor(&self) -> Option<f64> {
        match self.kind {
            AquiferKind::Leaky { leakage_factor } => Some(leakage_factor),
            _ => None,
        }
    }

    /// Storage coefficient for time-dependent work: S when confined, S_y when unconfined.
    pub fn storage(&self) -> Option<f64> {
        match self.kind {
            AquiferKind::Unconfined => self.specific_yield,
            _ => self.storativity,
        }
    }

    /// Short description for reports.
    pub fn describe(&self) -> &'static str {
        match self.kind {
            AquiferKind::Unconfined => "unconfined",
            AquiferKind::Confined => "confined (unconfined where drawn below its top)",
            AquiferKind::Leaky { .. } => "leaky confined (Hantush–Jacob)",
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    fn confined() -> Aquifer {
        Aquifer {
            kind: AquiferKind::Confined,
            conductivity: 1e-4,
            base_level: -20.0,
            top_level: Some(-10.0),
            initial_level: 0.0,
            storativity: Some(1e-4),
            specific_yield: None,
        }
    }

    // Strack (1989) eq. 8.13: the confined and unconfined forms meet at h = b with equal value
    // ½·K·b² (published identity).
    #[test]
    fn potential_is_continuous_at_the_confining_top() {
        let a = confined();
        let b = 10.0;
        assert_relative_eq!(a.potential(-10.0), 0.5 * 1e-4 * b * b, max_relative = 1e-15);
        assert_relative_eq!(
            a.potential(-10.0 + 1e-9),
            a.potential(-10.0 - 1e-9),
            max_relative = 1e-7
        );
    }

    // Dupuit–Thiem through the potential reproduces the hand formula of checks.md §4 (single
    // unconfined well, library-checked): K = 5e-4, H = 10, h_w = 7, r_w = 0.15, R = 201.25
    // → Q = 0.011124 m³/s, Q = 2π(Φ₀ − Φ_w)/ln(R/r_w).
    #[test]
    fn unconfined_potential_reproduces_dupuit_thiem_flow() {
        let a = Aquifer {
            kind: AquiferKind::Unconfined,
            conductivity: 5e-4,
            base_level: 0.0,
            top_level: None,
            initial_level: 10.0,
            storativity: None,
            specific_yield: Some(0.2),
        };
        let q = 2.0 * std::f64::consts::PI * (a.initial_potential() - a.potential(7.0))
            / (201.25f64 / 0.15).ln();
        assert_relative_eq!(q, 0.011124, max_relative = 1e-4);
    }

    // Confined: ΔΦ = T·s while the head stays above the top (Strack 1989 eq. 8.7); dry at Φ ≤ 0.
    #[test]
    fn level_round_trip_and_dry() {
        let a = confined();
        for z in [-19.0, -12.0, -10.0, -5.0, 0.0] {
            assert_relative_eq!(a.level(a.potential(z)).or_base(-20.0), z, epsilon = 1e-9);
        }
        assert_relative_eq!(
            a.potential(0.0) - a.potential(-4.0),
            a.transmissivity() * 4.0,
            max_relative = 1e-12
        );
        assert_eq!(a.level(0.0), Level::Dry);
        assert_eq!(a.level(-1.0), Level::Dry);
    }
}
