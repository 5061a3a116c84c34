//! The small number formats of the neighbour outputs: angular distortion as "1/n", settlements
//! in mm or inches, names cut to a width.

use crate::input::units::UnitSystem;

/// An angular distortion or deflection ratio as "1/n" ("0" when none).
pub fn ratio_text(beta: f64) -> String {
    if beta <= 0.0 {
        "0".into()
    } else if beta >= 1.0 {
        format!("{beta:.2}")
    } else {
        format!("1/{:.0}", 1.0 / beta)
    }
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
