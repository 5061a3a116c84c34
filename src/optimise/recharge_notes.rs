//! Notes of the recharge sizing that carry quantities, as data with SI values, worded in the
//! run's units ([`RechargeNote::words`]); the pattern of [`crate::optimise::design_notes`].

use crate::input::model::InjectionBasis;
use crate::input::units::UnitSystem;

/// A note of the recharge sizing.
#[derive(Debug, Clone, PartialEq)]
pub enum RechargeNote {
    /// A note without quantities, in words.
    Said(String),
    /// The bounds every recharge well is held to, and the neighbours' rise limit.
    Bounds {
        /// Injection capacity as a share of the abstraction capacity.
        injection_fraction: f64,
        /// That share is the common-practice default (none given).
        default_fraction: bool,
        /// Highest level allowed in a recharge well, m.
        max_level_m: f64,
        /// How that level was set.
        basis: InjectionBasis,
        /// The default allowable rise at a neighbour, m.
        default_rise_m: f64,
    },
    /// A recharge well's listed rate is above its injection capacity.
    OverCapacity {
        /// The well.
        well: String,
        /// Its listed rate, m³/s (positive: injected).
        rate_m3_per_s: f64,
        /// Its injection capacity, m³/s.
        capacity_m3_per_s: f64,
    },
}

impl RechargeNote {
    /// The note in words, quantities in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        match self {
            RechargeNote::Said(s) => s.clone(),
            RechargeNote::Bounds {
                injection_fraction,
                default_fraction,
                max_level_m,
                basis,
                default_rise_m,
            } => format!(
                "recharge wells are bounded by their listed rates and by their injection capacity ({:.0} % of the abstraction capacity{}), and keep their water level at or below {} ({}); neighbours' water may rise at most their allowable_rise (default {}, common practice (no source)); the water injected must be clean and compatible with the aquifer, or the wells clog",
                injection_fraction * 100.0,
                if *default_fraction { ", common practice (no source)" } else { "" },
                units.length_words(*max_level_m, 2),
                basis.words(units),
                units.length_words(*default_rise_m, 2),
            ),
            RechargeNote::OverCapacity {
                well,
                rate_m3_per_s,
                capacity_m3_per_s,
            } => format!(
                "{well}: listed rate {} is above its injection capacity {}",
                units.rate_words(*rate_m3_per_s),
                units.rate_words(*capacity_m3_per_s)
            ),
        }
    }
}

impl serde::Serialize for RechargeNote {
    /// The SI words; `summary.json` replaces them with the run's units.
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(&self.words(UnitSystem::Si))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A 1.00 m margin reads 3.28 ft and 2 L/s reads 31.7 gpm (1 ft = 0.3048 m, 1 US gal =
    /// 3.785411784 L, exact; NIST SP 811 (2008) App. B).
    #[test]
    fn recharge_notes_in_us_units() {
        let bounds = RechargeNote::Bounds {
            injection_fraction: 0.5,
            default_fraction: true,
            max_level_m: 5.2,
            basis: InjectionBasis::BelowGround {
                margin_m: 1.0,
                default: true,
            },
            default_rise_m: 0.3,
        };
        let us = bounds.words(UnitSystem::Us);
        assert!(
            us.contains("at or below 17.06 ft (ground − 3.28 ft"),
            "{us}"
        );
        assert!(us.contains("(default 0.98 ft,"), "{us}");
        assert!(!us.contains(" m ") && !us.contains(" m)"), "{us}");
        let si = bounds.words(UnitSystem::Si);
        assert!(
            si.contains("at or below 5.20 m (ground − 1.00 m (default margin"),
            "{si}"
        );
        let over = RechargeNote::OverCapacity {
            well: "R1".into(),
            rate_m3_per_s: 0.002,
            capacity_m3_per_s: 0.001,
        };
        assert_eq!(
            over.words(UnitSystem::Us),
            "R1: listed rate 31.7 gpm is above its injection capacity 15.9 gpm"
        );
    }
}
