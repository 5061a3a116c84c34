//! Quantities with units, as written in design files ("2e-4 m/s", "50 gpm", "14 days").
//!
//! Every dimensional value in a design file is a string: a number, then its unit. The parser turns
//! it into SI (metres, seconds, m³/s, kPa…) once, at the edge; the engine never sees a unit again.
//! A bare number where a unit is needed, a unit of the wrong kind, or an unknown unit is an error
//! that names the kind of quantity and the units accepted.

use serde::{Deserialize, Deserializer};
use std::fmt;
use std::marker::PhantomData;
use std::ops::Range;

/// One physical kind of quantity: its name in messages, an example, and the accepted units with
/// their factor to SI.
pub trait Kind {
    /// Name used in messages ("hydraulic conductivity").
    const NAME: &'static str;
    /// A well-formed example ("2e-4 m/s").
    const EXAMPLE: &'static str;
    /// Accepted unit spellings (compared case-insensitively after normalising ³, ², spaces)
    /// and the factor that turns one of them into the SI unit.
    const UNITS: &'static [(&'static str, f64)];
    /// Largest magnitude in SI a real site can have; past it the value is refused after units.
    const MAX_SI: f64;
    /// Smallest non-zero magnitude in SI that is not a unit slip (zero passes here and is judged
    /// by the field's own check).
    const MIN_SI: f64;
}

const DAY: f64 = 86_400.0;
const FOOT: f64 = 0.3048;
/// A year of 365.25 days, s (c_v is usually quoted per year).
const YEAR: f64 = 365.25 * DAY;
const US_GALLON: f64 = 3.785_411_784e-3;

macro_rules! kind {
    ($(#[$doc:meta])* $ty:ident, $name:expr, $example:expr, $min:expr, $max:expr, [$(($u:expr, $f:expr)),* $(,)?]) => {
        $(#[$doc])*
        #[derive(Debug, Clone, Copy, PartialEq)]
        pub struct $ty;
        impl Kind for $ty {
            const NAME: &'static str = $name;
            const EXAMPLE: &'static str = $example;
            const UNITS: &'static [(&'static str, f64)] = &[$(($u, $f)),*];
            const MAX_SI: f64 = $max;
            const MIN_SI: f64 = $min;
        }
    };
}

kind!(
    /// Lengths and levels (SI: m).
    LengthKind, "length or level", "0.3 m", 1e-6, 1e5,
    [("m", 1.0), ("mm", 1e-3), ("cm", 1e-2), ("km", 1e3), ("ft", FOOT), ("in", 0.0254)]
);
kind!(
    /// Hydraulic conductivity, a velocity (SI: m/s).
    ConductivityKind, "hydraulic conductivity", "2e-4 m/s", 1e-15, 10.0,
    [("m/s", 1.0), ("cm/s", 1e-2), ("mm/s", 1e-3), ("m/d", 1.0 / DAY), ("m/day", 1.0 / DAY),
     ("m/h", 1.0 / 3600.0), ("ft/d", FOOT / DAY), ("ft/day", FOOT / DAY), ("ft/s", FOOT)]
);
kind!(
    /// Pumping rate (SI: m³/s).
    FlowKind, "flow rate", "3 L/s", 1e-12, 100.0,
    [("m3/s", 1.0), ("m3/h", 1.0 / 3600.0), ("m3/d", 1.0 / DAY), ("m3/day", 1.0 / DAY),
     ("l/s", 1e-3), ("l/min", 1e-3 / 60.0), ("gpm", US_GALLON / 60.0),
     ("gal/min", US_GALLON / 60.0), ("ft3/s", FOOT * FOOT * FOOT), ("cfs", FOOT * FOOT * FOOT)]
);
kind!(
    /// Duration (SI: s).
    TimeKind, "duration", "14 days", 1e-3, 1e10,
    [("s", 1.0), ("min", 60.0), ("h", 3600.0), ("hours", 3600.0), ("d", DAY), ("day", DAY),
     ("days", DAY), ("week", 7.0 * DAY), ("weeks", 7.0 * DAY)]
);
kind!(
    /// Transmissivity (SI: m²/s).
    TransmissivityKind, "transmissivity", "5e-3 m2/s", 1e-15, 1e3,
    [("m2/s", 1.0), ("m2/d", 1.0 / DAY), ("m2/day", 1.0 / DAY), ("ft2/d", FOOT * FOOT / DAY)]
);
kind!(
    /// Coefficient of volume compressibility m_v (SI: 1/kPa, i.e. m²/kN).
    CompressibilityKind, "coefficient of volume compressibility", "2e-4 1/kPa", 1e-9, 0.1,
    [("1/kpa", 1.0), ("m2/kn", 1.0), ("1/mpa", 1e-3), ("m2/mn", 1e-3)]
);
kind!(
    /// Coefficient of consolidation c_v (SI: m²/s); clays are usually quoted per year.
    ConsolidationKind, "coefficient of consolidation", "2 m2/year", 1e-14, 1e-2,
    [("m2/s", 1.0), ("m2/d", 1.0 / DAY), ("m2/day", 1.0 / DAY), ("m2/year", 1.0 / YEAR),
     ("m2/yr", 1.0 / YEAR), ("cm2/s", 1e-4), ("ft2/d", FOOT * FOOT / DAY),
     ("ft2/day", FOOT * FOOT / DAY), ("ft2/year", FOOT * FOOT / YEAR), ("ft2/yr", FOOT * FOOT / YEAR)]
);
kind!(
    /// Stress or pressure (SI here: kPa, the unit geotechnical engineers work in).
    StressKind, "stress", "60 kPa", 1e-6, 1e5,
    [("kpa", 1.0), ("kn/m2", 1.0), ("mpa", 1e3), ("pa", 1e-3), ("psf", 0.047_880_26)]
);
kind!(
    /// Unit weight of soil or water (SI here: kN/m³).
    UnitWeightKind, "unit weight", "19 kN/m3", 1e-3, 100.0,
    [("kn/m3", 1.0), ("pcf", 0.157_087_5)]
);
kind!(
    /// Angular distortion or other ratios written as a fraction ("1/500") or per cent.
    RatioKind, "ratio", "1/500", 1e-12, 1e6,
    [("%", 0.01)]
);

/// A value parsed from a design file: the number in SI, and where it stood in the file.
#[derive(Clone)]
pub struct Quantity<K: Kind> {
    /// Value in SI units of kind `K`.
    pub si: f64,
    /// Byte range of the value in the source file, when it came from one.
    pub span: Option<Range<usize>>,
    _kind: PhantomData<K>,
}

impl<K: Kind> Quantity<K> {
    /// A quantity that did not come from a file (defaults, tests).
    pub fn from_si(si: f64) -> Self {
        Quantity {
            si,
            span: None,
            _kind: PhantomData,
        }
    }
}

impl<K: Kind> fmt::Debug for Quantity<K> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} (SI)", self.si)
    }
}

/// Lengths and levels, m.
pub type Length = Quantity<LengthKind>;
/// Hydraulic conductivity, m/s.
pub type Conductivity = Quantity<ConductivityKind>;
/// Pumping rate, m³/s.
pub type Flow = Quantity<FlowKind>;
/// Duration, s.
pub type Duration = Quantity<TimeKind>;
/// Coefficient of volume compressibility, 1/kPa.
pub type Compressibility = Quantity<CompressibilityKind>;
/// Coefficient of consolidation c_v, m²/s.
pub type Consolidation = Quantity<ConsolidationKind>;
/// Stress, kPa.
pub type Stress = Quantity<StressKind>;
/// Unit weight, kN/m³.
pub type UnitWeight = Quantity<UnitWeightKind>;

fn normalise(unit: &str) -> String {
    unit.trim()
        .replace('³', "3")
        .replace('²', "2")
        .replace(['·', ' '], "")
        .replace("^3", "3")
        .replace("^2", "2")
        .replace("^-1", "")
        .to_lowercase()
}

/// Every kind's units, to say "that is a flow rate" when a unit of the wrong kind is given.
fn kind_of_unit(unit: &str) -> Option<&'static str> {
    fn find<K: Kind>(u: &str) -> Option<&'static str> {
        K::UNITS.iter().any(|(s, _)| *s == u).then_some(K::NAME)
    }
    find::<LengthKind>(unit)
        .or_else(|| find::<ConductivityKind>(unit))
        .or_else(|| find::<FlowKind>(unit))
        .or_else(|| find::<TimeKind>(unit))
        .or_else(|| find::<TransmissivityKind>(unit))
        .or_else(|| find::<CompressibilityKind>(unit))
        .or_else(|| find::<ConsolidationKind>(unit))
        .or_else(|| find::<StressKind>(unit))
        .or_else(|| find::<UnitWeightKind>(unit))
}

/// The accepted units of a kind, for messages ("m/s, cm/s, m/d…").
pub fn accepted_units<K: Kind>() -> String {
    K::UNITS
        .iter()
        .map(|(u, _)| *u)
        .collect::<Vec<_>>()
        .join(", ")
}

/// Split "2e-4 m/s" (or "2e-4m/s") into the number and the unit text.
fn split_number(text: &str) -> Option<(f64, &str)> {
    let t = text.trim();
    // Longest prefix that parses as a number.
    let mut best = None;
    for (i, _) in t.char_indices().chain(std::iter::once((t.len(), ' '))) {
        if i == 0 {
            continue;
        }
        if let Ok(v) = t[..i].trim().parse::<f64>() {
            best = Some((v, i));
        }
    }
    best.map(|(v, i)| (v, t[i..].trim()))
}

/// Refuse an SI value that overflowed when its unit was applied, or lies outside what a real
/// site can have for kind `K` (`K::MIN_SI` ≤ |v| ≤ `K::MAX_SI`, or exactly zero, which the
/// field's own check judges). Bounds are common practice (no source): they are generous limits
/// of the trade (no soil conducts 10 m/s, no well pumps 100 m³/s), set to keep every formula
/// finite, not to judge a design.
fn in_bounds<K: Kind>(text: &str, si: f64) -> Result<f64, String> {
    let a = si.abs();
    if !si.is_finite() || a > K::MAX_SI {
        return Err(format!(
            "\"{text}\" is {si:e} in SI, beyond the largest {} a site can have ({:e} in SI); check the number and its unit",
            K::NAME,
            K::MAX_SI
        ));
    }
    if a != 0.0 && a < K::MIN_SI {
        return Err(format!(
            "\"{text}\" is {si:e} in SI, below the smallest non-zero {} drydig accepts ({:e} in SI); check the number and its unit",
            K::NAME,
            K::MIN_SI
        ));
    }
    Ok(si)
}

/// Parse "value unit" into SI for kind `K`.
///
/// # Examples
/// ```
/// use drydig::input::units::{parse, ConductivityKind};
/// assert!((parse::<ConductivityKind>("17 m/d").unwrap() - 17.0 / 86400.0).abs() < 1e-15);
/// ```
pub fn parse<K: Kind>(text: &str) -> Result<f64, String> {
    let accepted = accepted_units::<K>();
    let Some((number, unit)) = split_number(text) else {
        return Err(format!(
            "\"{text}\" is not a number with a unit; a {} is written like \"{}\" (units: {accepted})",
            K::NAME,
            K::EXAMPLE
        ));
    };
    if !number.is_finite() {
        return Err(format!("\"{text}\" is not a finite number"));
    }
    if unit.is_empty() {
        return Err(format!(
            "\"{text}\" has no unit; a {} needs one, e.g. \"{}\" (units: {accepted})",
            K::NAME,
            K::EXAMPLE
        ));
    }
    if unit.starts_with(',') && unit[1..].starts_with(|c: char| c.is_ascii_digit()) {
        return Err(format!(
            "\"{text}\" has a comma in the number; write it with a decimal point and no thousands separator, e.g. \"{}\"",
            text.trim().replacen(',', ".", 1)
        ));
    }
    let norm = normalise(unit);
    if let Some((_, factor)) = K::UNITS.iter().find(|(u, _)| *u == norm) {
        return in_bounds::<K>(text, number * factor);
    }
    if let Some(other) = kind_of_unit(&norm) {
        return Err(format!(
            "\"{unit}\" is a unit of {other}, but this field is a {} (units: {accepted})",
            K::NAME
        ));
    }
    // On a tie the unit listed first (the usual one) is suggested.
    let hint = K::UNITS
        .iter()
        .map(|(u, _)| (strsim::levenshtein(u, &norm), *u))
        .min_by_key(|(d, _)| *d)
        .filter(|(d, _)| *d <= 2)
        .map(|(_, u)| format!("; did you mean \"{u}\"?"))
        .unwrap_or_default();
    Err(format!(
        "unknown unit \"{unit}\" for a {}{hint} (units: {accepted})",
        K::NAME
    ))
}

impl<'de, K: Kind> Deserialize<'de> for Quantity<K> {
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        let spanned = toml::Spanned::<toml::Value>::deserialize(deserializer)?;
        let span = Some(spanned.span());
        let si = match spanned.get_ref() {
            toml::Value::String(s) => parse::<K>(s).map_err(serde::de::Error::custom)?,
            toml::Value::Integer(_) | toml::Value::Float(_) => {
                return Err(serde::de::Error::custom(format!(
                    "a bare number has no unit; write the {} as a string with its unit, e.g. \"{}\" (units: {})",
                    K::NAME,
                    K::EXAMPLE,
                    accepted_units::<K>()
                )))
            }
            other => {
                return Err(serde::de::Error::custom(format!(
                    "expected a {} as a string with its unit, e.g. \"{}\", found a {}",
                    K::NAME,
                    K::EXAMPLE,
                    other.type_str()
                )))
            }
        };
        Ok(Quantity {
            si,
            span,
            _kind: PhantomData,
        })
    }
}

/// A dimensionless number that may also be written as a fraction ("1/500") or per cent ("50 %").
#[derive(Debug, Clone)]
pub struct Ratio {
    /// The value as a plain fraction.
    pub value: f64,
    /// Where it stood in the file.
    pub span: Option<Range<usize>>,
}

impl Ratio {
    /// A ratio that did not come from a file.
    pub fn new(value: f64) -> Self {
        Ratio { value, span: None }
    }
}

/// Parse a ratio: "0.5", "50 %", "1/500".
pub fn parse_ratio(text: &str) -> Result<f64, String> {
    let t = text.trim();
    if let Some(p) = t.strip_suffix('%') {
        return p
            .trim()
            .parse::<f64>()
            .map(|v| v / 100.0)
            .map_err(|_| format!("\"{text}\" is not a percentage like \"50 %\""));
    }
    if let Some((a, b)) = t.split_once('/') {
        let (a, b) = (a.trim().parse::<f64>(), b.trim().parse::<f64>());
        if let (Ok(a), Ok(b)) = (a, b) {
            if b != 0.0 {
                return Ok(a / b);
            }
        }
        return Err(format!("\"{text}\" is not a fraction like \"1/500\""));
    }
    t.parse::<f64>().map_err(|_| {
        format!("\"{text}\" is not a number, a fraction (\"1/500\") or a percentage (\"50 %\")")
    })
}

impl<'de> Deserialize<'de> for Ratio {
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        let spanned = toml::Spanned::<toml::Value>::deserialize(deserializer)?;
        let span = Some(spanned.span());
        let value = match spanned.get_ref() {
            toml::Value::String(s) => parse_ratio(s).map_err(serde::de::Error::custom)?,
            toml::Value::Integer(i) => *i as f64,
            toml::Value::Float(f) => *f,
            other => {
                return Err(serde::de::Error::custom(format!(
                "expected a number, a fraction (\"1/500\") or a percentage (\"50 %\"), found a {}",
                other.type_str()
            )))
            }
        };
        if !value.is_finite() || value.abs() > RatioKind::MAX_SI {
            return Err(serde::de::Error::custom(format!(
                "expected a finite ratio of magnitude at most {:e}",
                RatioKind::MAX_SI
            )));
        }
        Ok(Ratio { value, span })
    }
}

/// Output unit system chosen by the user.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum UnitSystem {
    /// Metres, m³/day and L/s.
    #[default]
    Si,
    /// Feet and US gallons per minute.
    Us,
}

impl UnitSystem {
    /// Length in the display unit.
    pub fn length(self, metres: f64) -> f64 {
        match self {
            UnitSystem::Si => metres,
            UnitSystem::Us => metres / FOOT,
        }
    }
    /// Name of the display length unit.
    pub fn length_unit(self) -> &'static str {
        match self {
            UnitSystem::Si => "m",
            UnitSystem::Us => "ft",
        }
    }
    /// Area in the display unit.
    pub fn area(self, m2: f64) -> f64 {
        match self {
            UnitSystem::Si => m2,
            UnitSystem::Us => m2 / (FOOT * FOOT),
        }
    }
    /// Name of the display area unit.
    pub fn area_unit(self) -> &'static str {
        match self {
            UnitSystem::Si => "m²",
            UnitSystem::Us => "ft²",
        }
    }
    /// A length (given in m) in words with `decimals` decimals and its unit: "3.50 m", "11.48 ft".
    /// For the few engine notes worded where the model is at hand; `report::format::Fmt` words
    /// everything else.
    pub fn length_words(self, metres: f64, decimals: usize) -> String {
        format!("{:.decimals$} {}", self.length(metres), self.length_unit())
    }
    /// A small length (given in m) in words: mm to one decimal, or inches (1 in = 0.0254 m
    /// exactly, NIST SP 811 (2008) App. B) to two: "10.0 mm", "0.39 in". As
    /// `report::format::Fmt::small_length`, for engine notes.
    pub fn small_length_words(self, metres: f64) -> String {
        match self {
            UnitSystem::Si => format!("{:.1} mm", metres * 1e3),
            UnitSystem::Us => format!("{:.2} in", metres / 0.0254),
        }
    }
    /// A transmissivity (given in m²/s) in words: "3.341e-3 m²/s", "3 107 ft²/day" (1 ft =
    /// 0.3048 m, 1 day = 86 400 s; NIST SP 811 (2008) App. B).
    pub fn transmissivity_words(self, t: f64) -> String {
        match self {
            UnitSystem::Si => format!("{t:.3e} m²/s"),
            UnitSystem::Us => format!("{:.0} ft²/day", t * DAY / (FOOT * FOOT)),
        }
    }
    /// A rate per well (given in m³/s) in words: "6.40 L/s", "101.4 gpm".
    pub fn rate_words(self, q: f64) -> String {
        match self {
            UnitSystem::Si => format!("{:.2} L/s", m3s_to_ls(q)),
            UnitSystem::Us => format!("{:.1} gpm", m3s_to_gpm(q)),
        }
    }
}

/// m³/s → m³/day.
pub fn m3s_to_m3d(q: f64) -> f64 {
    q * DAY
}
/// m³/s → L/s.
pub fn m3s_to_ls(q: f64) -> f64 {
    q * 1e3
}
/// m³/s → US gallons per minute.
pub fn m3s_to_gpm(q: f64) -> f64 {
    q * 60.0 / US_GALLON
}
/// Metres → feet.
pub fn m_to_ft(x: f64) -> f64 {
    x / FOOT
}

#[cfg(test)]
mod tests {
    use super::*;

    // Conversion factors: NIST SP 811 (2008), Appendix B.8/B.9: 1 ft = 0.3048 m exactly,
    // 1 US gallon = 3.785 411 784 L exactly, 1 day = 86 400 s.
    #[test]
    fn conversions_follow_nist_sp811() {
        assert!((parse::<ConductivityKind>("5e-2 cm/s").unwrap() - 5e-4).abs() < 1e-18);
        assert!((parse::<FlowKind>("50 gpm").unwrap() - 3.154_509_82e-3).abs() < 1e-11);
        assert!((parse::<LengthKind>("10 ft").unwrap() - 3.048).abs() < 1e-12);
        assert!((parse::<TimeKind>("14 days").unwrap() - 1_209_600.0).abs() < 1e-9);
        assert!((parse::<FlowKind>("3 L/s").unwrap() - 3e-3).abs() < 1e-15);
        assert!((parse::<FlowKind>("100 m³/h").unwrap() - 100.0 / 3600.0).abs() < 1e-15);
    }

    #[test]
    fn missing_unit_and_wrong_kind_are_explained() {
        let e = parse::<ConductivityKind>("2e-4").unwrap_err();
        assert!(e.contains("no unit") && e.contains("m/s"), "{e}");
        let e = parse::<ConductivityKind>("3 L/s").unwrap_err();
        assert!(e.contains("flow rate"), "{e}");
        let e = parse::<ConductivityKind>("2e-4 m/sec").unwrap_err();
        assert!(e.contains("unknown unit"), "{e}");
        let e = parse::<LengthKind>("2 mn").unwrap_err();
        assert!(e.contains("did you mean"), "{e}");
    }

    // IEEE 754 doubles overflow past about 1.8e308 (so 1e306 km is infinite in metres);
    // common practice (no source) that no soil conducts 1e-20 m/s as a deliberate value.
    #[test]
    fn values_out_of_bounds_after_units_are_refused() {
        let e = parse::<LengthKind>("1e306 km").unwrap_err();
        assert!(e.contains("beyond the largest"), "{e}");
        let e = parse::<ConductivityKind>("1e-20 m/s").unwrap_err();
        assert!(e.contains("below the smallest"), "{e}");
        assert_eq!(parse::<LengthKind>("0 m").unwrap(), 0.0);
        assert!(parse::<FlowKind>("1e300 m3/h").is_err());
        assert!(parse::<TimeKind>("1e306 weeks").is_err());
    }

    #[test]
    fn ratios() {
        assert_eq!(parse_ratio("50 %").unwrap(), 0.5);
        assert_eq!(parse_ratio("1/500").unwrap(), 0.002);
        assert!(parse_ratio("1/0").is_err());
    }
}
