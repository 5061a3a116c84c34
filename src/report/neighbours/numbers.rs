//! The small number formats of the neighbour outputs: angular distortion as "1/n", settlements
//! in mm or inches, names cut to a width.

use crate::input::units::UnitSystem;

/// An angular distortion or deflection ratio as "1/n" ("0" when none).
pub fn ratio_text(beta: f64) -> String {
    crate::report::format::ratio_value(beta)
}

/// A settlement in mm (SI) or inches (US; 1 in = 0.0254 m, NIST SP 811 App. B): value, unit.
pub fn small(x: f64, units: UnitSystem) -> (f64, &'static str) {
    match units {
        UnitSystem::Si => (x * 1e3, "mm"),
        UnitSystem::Us => (x / 0.0254, "in"),
    }
}

/// A settlement in mm (SI, one decimal) or inches (US, two decimals).
pub fn mm(x: f64, units: UnitSystem) -> String {
    let (v, u) = small(x, units);
    match units {
        UnitSystem::Si => format!("{v:.1} {u}"),
        UnitSystem::Us => format!("{v:.2} {u}"),
    }
}

/// A pressure given in kPa: "50.0 kPa" (SI) or "1044 psf" (US; 1 lbf/ft² = 47.880 26 Pa, NIST
/// SP 811 (2008) App. B).
pub fn pressure_kpa(kpa: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{kpa:.1} kPa"),
        UnitSystem::Us => format!("{:.0} psf", kpa * 1e3 / 47.880_26),
    }
}

/// A unit weight given in kN/m³: "20.0 kN/m³" (SI) or "127.3 lb/ft³" (US; 1 lbf/ft³ =
/// 157.087 5 N/m³, NIST SP 811 (2008) App. B).
pub fn unit_weight(kn_per_m3: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{kn_per_m3:.1} kN/m³"),
        UnitSystem::Us => format!("{:.1} lb/ft³", kn_per_m3 * 1e3 / 157.087_5),
    }
}

/// The rule-of-thumb settlement limit in words: "25 mm" (SI) or "0.98 in" (US).
pub fn rule_settlement(x: f64, units: UnitSystem) -> String {
    let (v, u) = small(x, units);
    match units {
        UnitSystem::Si => format!("{v:.0} {u}"),
        UnitSystem::Us => format!("{v:.2} {u}"),
    }
}

/// `s` cut to `n` characters, with an ellipsis when cut.
pub fn truncate(s: &str, n: usize) -> String {
    if s.chars().count() <= n {
        s.to_string()
    } else {
        let mut t: String = s.chars().take(n - 1).collect();
        t.push('…');
        t
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn uplift_units_in_us_practice() {
        // NIST SP 811 (2008) App. B: 1 psf = 47.880 26 Pa, 1 lbf/ft³ = 157.087 5 N/m³; water at
        // 9.81 kN/m³ is the familiar 62.4 lb/ft³ (from memory).
        assert_eq!(pressure_kpa(47.880_26, UnitSystem::Us), "1000 psf");
        assert_eq!(pressure_kpa(50.0, UnitSystem::Si), "50.0 kPa");
        assert_eq!(unit_weight(9.81, UnitSystem::Us), "62.4 lb/ft³");
        assert_eq!(unit_weight(20.0, UnitSystem::Si), "20.0 kN/m³");
        assert_eq!(rule_settlement(0.025, UnitSystem::Si), "25 mm");
        assert_eq!(rule_settlement(0.025, UnitSystem::Us), "0.98 in");
    }
}
