//! The one formatting layer for numbers people read: lengths, levels with their depth below
//! ground, flows and rates per well, each in the chosen unit system (SI inside, converted only
//! here). Conversion factors: NIST SP 811 (2008), Appendix B (1 ft = 0.3048 m, 1 US gallon =
//! 3.785 411 784 L, 1 day = 86 400 s).

use crate::input::units::{m3s_to_gpm, m3s_to_ls, m3s_to_m3d, UnitSystem};

/// Formats quantities in one unit system, with levels measured against one ground level.
#[derive(Debug, Clone, Copy)]
pub struct Fmt {
    /// Unit system of the output.
    pub units: UnitSystem,
    /// Ground level, m above datum, for depths below ground.
    pub ground: f64,
}

fn num(v: f64, decimals: usize) -> String {
    if !v.is_finite() {
        return "—".into();
    }
    let s = format!("{v:.decimals$}");
    // "-0.00" reads as a sign error.
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        s.trim_start_matches('-').to_string()
    } else {
        s
    }
}

impl Fmt {
    /// A formatter for `units` against ground level `ground` (m).
    pub fn new(units: UnitSystem, ground: f64) -> Fmt {
        Fmt { units, ground }
    }
    /// The length unit's symbol ("m", "ft").
    pub fn lu(&self) -> &'static str {
        self.units.length_unit()
    }
    /// A length value without unit (2 decimals in m, 1 in ft).
    pub fn length_value(&self, m: f64) -> String {
        match self.units {
            UnitSystem::Si => num(m, 2),
            UnitSystem::Us => num(self.units.length(m), 1),
        }
    }
    /// A length with its unit: "3.50 m", "11.5 ft".
    pub fn length(&self, m: f64) -> String {
        format!("{} {}", self.length_value(m), self.lu())
    }
    /// A level above datum with its depth below ground: "3.80 m (2.40 m bgl)". Depth d =
    /// ground − level; a level above ground shows "agl" (above ground level).
    pub fn level(&self, z: f64) -> String {
        format!("{} ({})", self.length(z), self.depth(z))
    }
    /// The depth of level `z` below ground: "2.40 m bgl" (bgl: below ground level, the trade's
    /// term; common practice (no source)).
    pub fn depth(&self, z: f64) -> String {
        let d = self.ground - z;
        if d < -0.005 {
            format!("{} agl", self.length(-d))
        } else {
            format!("{} bgl", self.length(d.max(0.0)))
        }
    }
    /// The depth below ground of level `z` as a bare number in the length unit (negative above
    /// ground), for table columns headed "depth bgl".
    pub fn depth_value(&self, z: f64) -> String {
        self.length_value(self.ground - z)
    }
    /// A flow total: "1 234 m³/day" (SI) or "226 gpm" (US).
    pub fn flow(&self, q: f64) -> String {
        match self.units {
            UnitSystem::Si => format!("{} m³/day", super::words::thousands(m3s_to_m3d(q), 0)),
            UnitSystem::Us => format!("{} gpm", super::words::thousands(m3s_to_gpm(q), 0)),
        }
    }
    /// A rate per well: "5.20 L/s" (SI) or "82.4 gpm" (US).
    pub fn rate(&self, q: f64) -> String {
        format!("{} {}", self.rate_value(q), self.rate_unit())
    }
    /// The rate per well without its unit.
    pub fn rate_value(&self, q: f64) -> String {
        match self.units {
            UnitSystem::Si => num(m3s_to_ls(q), 2),
            UnitSystem::Us => num(m3s_to_gpm(q), 1),
        }
    }
    /// Unit of a rate per well ("L/s", "gpm").
    pub fn rate_unit(&self) -> &'static str {
        match self.units {
            UnitSystem::Si => "L/s",
            UnitSystem::Us => "gpm",
        }
    }
    /// An area: "1 812 m²", "19 504 ft²".
    pub fn area(&self, m2: f64) -> String {
        format!(
            "{} {}",
            super::words::thousands(self.units.area(m2), 0),
            self.units.area_unit()
        )
    }
    /// Hydraulic conductivity: "3.0e-4 m/s" or "85.0 ft/day".
    pub fn conductivity(&self, k: f64) -> String {
        match self.units {
            UnitSystem::Si => format!("{k:.1e} m/s"),
            UnitSystem::Us => format!("{} ft/day", num(self.units.length(k) * 86_400.0, 1)),
        }
    }
    /// A small length (settlement): "12.3 mm" or "0.48 in".
    pub fn small_length(&self, m: f64) -> String {
        format!("{} {}", self.small_length_value(m), self.small_unit())
    }
    /// A small length without its unit: mm to one decimal, or inches (1 in = 0.0254 m) to two.
    pub fn small_length_value(&self, m: f64) -> String {
        match self.units {
            UnitSystem::Si => num(m * 1e3, 1),
            UnitSystem::Us => num(m / 0.0254, 2),
        }
    }
    /// Unit of a small length ("mm", "in").
    pub fn small_unit(&self) -> &'static str {
        match self.units {
            UnitSystem::Si => "mm",
            UnitSystem::Us => "in",
        }
    }
    /// A map coordinate (easting or northing) with its unit: "1 040.0 m".
    pub fn coordinate(&self, m: f64) -> String {
        format!(
            "{} {}",
            super::words::thousands(self.units.length(m), 1),
            self.lu()
        )
    }
}

/// Below this an angular distortion or deflection ratio is negligible for any building and
/// prints as "< 1/100 000": 200 times smaller than the 1/500 usually allowed.
pub const NEGLIGIBLE_RATIO: f64 = 1e-5;

/// An angular distortion or deflection ratio as people read it: "1/n" with n rounded down to
/// three significant figures, thousands grouped ("1/495", "1/4 950", "1/46 900"); "< 1/100 000"
/// when negligible ([`NEGLIGIBLE_RATIO`]); "0" when none; two decimals from 1 up. Machine
/// columns (CSV, JSON) keep the number itself.
pub fn ratio_value(beta: f64) -> String {
    if beta <= 0.0 {
        "0".into()
    } else if beta < NEGLIGIBLE_RATIO {
        format!("< 1/{}", super::words::thousands(1.0 / NEGLIGIBLE_RATIO, 0))
    } else if beta >= 1.0 {
        format!("{beta:.2}")
    } else {
        // n rounded down, so the ratio shown is never smaller than the one computed: 1/499.6
        // reads "1/499" beside a 1/500 limit, not "1/500" (1e-9 keeps an exact 1/500 itself).
        let n = 1.0 / beta;
        let unit = 10f64.powi((n.log10().floor() as i32 - 2).max(0));
        format!(
            "1/{}",
            super::words::thousands((n / unit * (1.0 + 1e-9)).floor() * unit, 0)
        )
    }
}

/// US gallons in one cubic metre (NIST SP 811 (2008) App. B: 1 gal = 3.785 411 784 L).
const GAL_PER_M3: f64 = 1e3 / 3.785_411_784;
/// Pounds-force per square foot in one pascal (NIST SP 811 (2008) App. B: 1 lbf/ft² =
/// 47.880 26 Pa).
const PSF_PER_PA: f64 = 1.0 / 47.880_26;
/// Square feet per day in one m²/s (1 ft = 0.3048 m, 1 day = 86 400 s).
const FT2D_PER_M2S: f64 = 86_400.0 / (0.3048 * 0.3048);

impl Fmt {
    /// A length to the finer precision margins need (3 decimals in m, 2 in ft): "0.012 m",
    /// "0.04 ft"; never "-0.000".
    pub fn length_fine(&self, m: f64) -> String {
        format!("{} {}", self.length_fine_value(m), self.lu())
    }
    /// [`Fmt::length_fine`] without its unit.
    pub fn length_fine_value(&self, m: f64) -> String {
        match self.units {
            UnitSystem::Si => num(m, 3),
            UnitSystem::Us => num(self.units.length(m), 2),
        }
    }
    /// A flow total without its unit (m³/day or gpm), for table columns.
    pub fn flow_value(&self, q: f64) -> String {
        match self.units {
            UnitSystem::Si => super::words::thousands(m3s_to_m3d(q), 0),
            UnitSystem::Us => super::words::thousands(m3s_to_gpm(q), 0),
        }
    }
    /// Unit of a flow total ("m³/day", "gpm").
    pub fn flow_unit(&self) -> &'static str {
        match self.units {
            UnitSystem::Si => "m³/day",
            UnitSystem::Us => "gpm",
        }
    }
    /// A volume pumped: "25 160 m³" or "6 646 000 gal" (US gallons).
    pub fn volume(&self, m3: f64) -> String {
        format!("{} {}", self.volume_value(m3), self.volume_unit())
    }
    /// A volume without its unit.
    pub fn volume_value(&self, m3: f64) -> String {
        match self.units {
            UnitSystem::Si => super::words::thousands(m3, 0),
            UnitSystem::Us => super::words::thousands(m3 * GAL_PER_M3, 0),
        }
    }
    /// Unit of a volume ("m³", "gal").
    pub fn volume_unit(&self) -> &'static str {
        match self.units {
            UnitSystem::Si => "m³",
            UnitSystem::Us => "gal",
        }
    }
    /// A pressure (uplift, water pressure): "12.3 kPa" or "257 psf" (pounds-force per square
    /// foot, the unit of base-slab loads in US practice; common practice (no source)).
    pub fn pressure(&self, pa: f64) -> String {
        match self.units {
            UnitSystem::Si => format!("{} kPa", num(pa / 1e3, 1)),
            UnitSystem::Us => format!("{} psf", super::words::thousands(pa * PSF_PER_PA, 0)),
        }
    }
    /// Transmissivity: "4.44e-3 m²/s" or "4 130 ft²/day".
    pub fn transmissivity(&self, t: f64) -> String {
        match self.units {
            UnitSystem::Si => format!("{t:.2e} m²/s"),
            UnitSystem::Us => format!("{} ft²/day", super::words::thousands(t * FT2D_PER_M2S, 0)),
        }
    }
    /// Unit of transmissivity in tables ("m²/s", "ft²/day").
    pub fn transmissivity_unit(&self) -> &'static str {
        match self.units {
            UnitSystem::Si => "m²/s",
            UnitSystem::Us => "ft²/day",
        }
    }
    /// Transmissivity in [`Fmt::transmissivity_unit`], as a number.
    pub fn transmissivity_number(&self, t: f64) -> f64 {
        match self.units {
            UnitSystem::Si => t,
            UnitSystem::Us => t * FT2D_PER_M2S,
        }
    }
    /// A length in the output unit, as a number (for charts and CSV columns).
    pub fn length_number(&self, m: f64) -> f64 {
        self.units.length(m)
    }
    /// A rate per well in [`Fmt::rate_unit`], as a number.
    pub fn rate_number(&self, q: f64) -> f64 {
        match self.units {
            UnitSystem::Si => m3s_to_ls(q),
            UnitSystem::Us => m3s_to_gpm(q),
        }
    }
    /// The output unit system's word for CSV column suffixes ("m", "ft").
    pub fn length_suffix(&self) -> &'static str {
        match self.units {
            UnitSystem::Si => "m",
            UnitSystem::Us => "ft",
        }
    }
}

/// Text made safe for HTML and SVG: `&`, `<`, `>`, `"` and `'` escaped.
pub fn esc(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// An angular distortion of 1/500, the value usually allowed for framed buildings and load
    /// bearing walls (Skempton & MacDonald 1956; Bjerrum 1963; Burland & Wroth 1974 — from
    /// memory), prints as itself so a reader compares it at a glance; one 200 times smaller is
    /// negligible and says so instead of printing seven digits.
    #[test]
    fn ratios_read_against_the_1_in_500_rule() {
        assert_eq!(ratio_value(1.0 / 500.0), "1/500");
        assert_eq!(ratio_value(1.0 / 4951.0), "1/4\u{2009}950");
        assert_eq!(ratio_value(1.0 / 46_965.0), "1/46\u{2009}900");
        assert_eq!(ratio_value(1.0 / 99_999.0), "1/99\u{2009}900");
        // just over the 1/500 rule: shown over it, not rounded onto it
        assert_eq!(ratio_value(1.0 / 499.6), "1/499");
        assert_eq!(ratio_value(1.0 / 4_587_445.0), "< 1/100\u{2009}000");
        assert_eq!(ratio_value(0.0), "0");
        assert_eq!(ratio_value(1.5), "1.50");
    }

    // Snapshots. Conversions: NIST SP 811 (2008) App. B: 1 ft = 0.3048 m; 1 US gal =
    // 3.785411784 L; so 5.2 L/s = 5.2e-3·60/3.785411784e-3 = 82.42 gpm and 3.8 m = 12.47 ft.
    #[test]
    fn snapshots_si_and_us() {
        let si = Fmt::new(UnitSystem::Si, 6.2);
        assert_eq!(si.level(3.8), "3.80 m (2.40 m bgl)");
        assert_eq!(si.rate(5.2e-3), "5.20 L/s");
        assert_eq!(si.flow(0.1), "8\u{2009}640 m³/day");
        assert_eq!(si.small_length(0.0123), "12.3 mm");
        let us = Fmt::new(UnitSystem::Us, 6.2);
        assert_eq!(us.level(3.8), "12.5 ft (7.9 ft bgl)");
        assert_eq!(us.rate(5.2e-3), "82.4 gpm");
        assert_eq!(us.flow(0.1), "1\u{2009}585 gpm");
        assert_eq!(us.length(0.3048), "1.0 ft");
        assert_eq!(us.small_length(0.0254), "1.00 in");
        assert_eq!(us.depth(7.0), "2.6 ft agl");
        // 1e-4 m/s = 8.64 m/day = 28.35 ft/day.
        assert_eq!(us.conductivity(1e-4), "28.3 ft/day");
        assert_eq!(si.length(f64::NAN), "— m");
        // 1 m³ = 264.17 gal; 47.88026 Pa = 1 psf; 1e-3 m²/s = 86.4 m²/day = 930.0 ft²/day.
        assert_eq!(us.volume(100.0), "26\u{2009}417 gal");
        assert_eq!(us.pressure(47_880.26), "1\u{2009}000 psf");
        assert_eq!(si.pressure(12_345.0), "12.3 kPa");
        assert_eq!(us.transmissivity(1e-3), "930 ft²/day");
        assert_eq!(si.length_fine(-0.0001), "0.000 m");
        assert_eq!(us.length_fine(-0.0001), "0.00 ft");
    }
}
