//! Distortion of a neighbour from its settlement profile: along each side of the footprint, the
//! differential settlement and angular distortion between its corners, β = |ρ_a − ρ_b|/L, and
//! the deflection ratio Δ/L of the profile sampled along the side (Δ the largest departure of
//! the settlement from the straight line joining the corners; Burland & Wroth 1974), with the
//! tensile strain of a deep beam of the building's height and its category of damage
//! ([`crate::physics::building_damage`]; an information line, not a check).

use crate::physics::building_damage::{self, Category, Mode};
use serde::Serialize;

/// Settlement along one side, between its corners.
#[derive(Debug, Clone, Serialize)]
pub struct Side {
    /// "corner 1–2".
    pub name: String,
    /// Length, m.
    pub length_m: f64,
    /// Settlement at its first corner, m.
    pub settlement_from_m: f64,
    /// Settlement at its second corner, m.
    pub settlement_to_m: f64,
    /// |Δρ|, m.
    pub differential_m: f64,
    /// β = |Δρ|/L.
    pub distortion: f64,
    /// Largest departure from the chord, m (positive: sagging).
    pub deflection_m: f64,
    /// Δ/L (absolute).
    pub deflection_ratio: f64,
    /// Sagging or hogging.
    pub mode: Mode,
    /// Tensile strain of the deep beam, when the building's height is known.
    pub tensile_strain: Option<f64>,
    /// Category of damage for that strain.
    pub damage: Option<Category>,
}

/// One side from its profile: `profile` is (distance along the side m, settlement m) from the
/// first corner to the second, both included; `height` the building's height, m.
pub fn side(name: String, profile: &[(f64, f64)], height: Option<f64>) -> Side {
    let (first, last) = match (profile.first(), profile.last()) {
        (Some(a), Some(b)) => (*a, *b),
        _ => ((0.0, 0.0), (0.0, 0.0)),
    };
    let length = last.0 - first.0;
    let differential = (last.1 - first.1).abs();
    let deflection = profile
        .iter()
        .map(|&(d, rho)| {
            let t = if length > 0.0 {
                (d - first.0) / length
            } else {
                0.0
            };
            rho - (first.1 + t * (last.1 - first.1))
        })
        .fold(0.0_f64, |a, b| if b.abs() > a.abs() { b } else { a });
    let mode = if deflection >= 0.0 {
        Mode::Sagging
    } else {
        Mode::Hogging
    };
    let ratio = if length > 0.0 {
        deflection.abs() / length
    } else {
        0.0
    };
    let tensile_strain = height.map(|h| building_damage::tensile_strain(ratio, length, h, mode));
    Side {
        name,
        length_m: length,
        settlement_from_m: first.1,
        settlement_to_m: last.1,
        differential_m: differential,
        distortion: if length > 0.0 {
            differential / length
        } else {
            0.0
        },
        deflection_m: deflection,
        deflection_ratio: ratio,
        mode,
        tensile_strain,
        damage: tensile_strain.map(building_damage::category),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // A hand profile (common practice (no source) for the definitions): corners 10 and 20 mm
    // over 20 m, 18 mm at mid-side; the chord there is 15 mm so Δ = +3 mm (sagging), Δ/L =
    // 1.5e-4, β = 10 mm / 20 m = 5e-4.
    #[test]
    fn sagging_side_by_hand() {
        let s = side(
            "corner 1–2".into(),
            &[(0.0, 0.010), (10.0, 0.018), (20.0, 0.020)],
            None,
        );
        assert!((s.distortion - 5e-4).abs() < 1e-12);
        assert!((s.deflection_m - 0.003).abs() < 1e-12);
        assert!((s.deflection_ratio - 1.5e-4).abs() < 1e-12);
        assert_eq!(s.mode, Mode::Sagging);
        assert!(s.damage.is_none());
    }
}
