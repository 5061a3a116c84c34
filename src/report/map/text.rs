//! Numbers and text on the map: coordinates rounded to 0.1 px, values with a typographic
//! minus and the decimals a contour interval needs, well rates, a rough text width for label
//! boxes, wrapped lines, the quantity's words, and the plain and haloed text elements.

use crate::input::model::MapQuantity;
use crate::input::units::UnitSystem;
use svg::node::element::Text;

/// A number rounded to 0.1, without "-0".
pub(super) fn r1(v: f64) -> String {
    let r = (v * 10.0).round() / 10.0;
    let r = if r == 0.0 { 0.0 } else { r };
    if r.fract() == 0.0 {
        format!("{r:.0}")
    } else {
        format!("{r:.1}")
    }
}

/// Decimals needed to write multiples of `interval` exactly (at most 4).
pub fn decimals(interval: f64) -> usize {
    (0..=4)
        .find(|d| {
            let m = interval * 10f64.powi(*d as i32);
            (m - m.round()).abs() < 1e-6
        })
        .unwrap_or(4)
}

/// A value with `d` decimals and a typographic minus.
pub(super) fn signed(v: f64, d: usize) -> String {
    let s = format!("{v:.d$}");
    let zero = s
        .trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.');
    if zero {
        s.trim_start_matches('-').to_string()
    } else {
        s.replace('-', "\u{2212}")
    }
}

/// A rate in L/s with sensible decimals.
pub(super) fn rate_text(q_m3s: f64) -> String {
    let l = q_m3s * 1e3;
    let d = if l.abs() < 0.1 {
        3
    } else if l.abs() < 1.0 {
        2
    } else {
        1
    };
    format!("{} L/s", signed(l, d))
}

/// Rough width of `text` at `size` px in the sans font, px.
pub(super) fn text_width(text: &str, size: f64) -> f64 {
    text.chars()
        .map(|c| match c {
            'i' | 'l' | 'j' | '.' | ',' | ':' | ';' | '\'' | '|' | '!' | ' ' | 'I' | 'f' | 't'
            | 'r' => 0.36,
            'm' | 'w' | 'M' | 'W' | '—' => 0.92,
            c if c.is_uppercase() => 0.70,
            c if c.is_ascii_digit() => 0.64,
            _ => 0.60,
        })
        .sum::<f64>()
        * size
}

/// A text element.
pub(super) fn text(x: f64, y: f64, size: f64, content: impl Into<String>) -> Text {
    Text::new(content.into())
        .set("x", r1(x))
        .set("y", r1(y))
        .set("font-size", r1(size))
}

/// A text with a white halo, readable over lines.
pub(super) fn halo(t: Text) -> Text {
    t.set("stroke", "#ffffff")
        .set("stroke-width", 3)
        .set("stroke-linejoin", "round")
        .set("paint-order", "stroke")
}

/// Split `text` into lines of at most `width` characters.
pub(super) fn lines_of(text: &str, width: usize) -> Vec<String> {
    crate::report::words::wrap(text, width, "")
        .lines()
        .map(str::to_string)
        .collect()
}

/// A rate per well in the output units: L/s (SI) or US gpm.
pub(super) fn rate_text_in(q_m3s: f64, u: UnitSystem) -> String {
    match u {
        UnitSystem::Si => rate_text(q_m3s),
        UnitSystem::Us => {
            let g = crate::input::units::m3s_to_gpm(q_m3s);
            format!("{} gpm", signed(g, if g.abs() < 10.0 { 2 } else { 1 }))
        }
    }
}

/// The quantity's words and unit for titles, in the output units.
pub(super) fn quantity_words_in(q: MapQuantity, u: UnitSystem) -> (&'static str, &'static str) {
    match (q, u) {
        (_, UnitSystem::Si) => quantity_words(q),
        (MapQuantity::Drawdown, UnitSystem::Us) => ("Drawdown", "ft"),
        (MapQuantity::WaterLevel, UnitSystem::Us) => ("Water level", "ft above datum"),
    }
}

/// The quantity's words and unit for titles.
pub(super) fn quantity_words(q: MapQuantity) -> (&'static str, &'static str) {
    match q {
        MapQuantity::Drawdown => ("Drawdown", "m"),
        MapQuantity::WaterLevel => ("Water level", "m above datum"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn decimals_of_intervals() {
        assert_eq!(decimals(0.25), 2);
        assert_eq!(decimals(0.5), 1);
        assert_eq!(decimals(2.0), 0);
        assert_eq!(decimals(2.5), 1);
        assert_eq!(decimals(0.05), 2);
    }

    #[test]
    fn signed_uses_a_real_minus_and_no_negative_zero() {
        assert_eq!(signed(-0.3, 2), "\u{2212}0.30");
        assert_eq!(signed(-0.001, 2), "0.00");
        assert_eq!(signed(2.5, 1), "2.5");
    }
}
