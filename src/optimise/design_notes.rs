//! Notes of the design choice that carry numbers, as data with SI values, worded in the run's
//! units ([`DesignNote::words`]); the pattern of [`crate::input::import::notes`].
//!
//! The design's note list carries these notes (the count search's cap as [`DesignNote::Cap`],
//! notes without numbers as [`DesignNote::Said`]); the outputs word them in the run's units
//! where they show them.

use crate::input::units::UnitSystem;
use crate::optimise::binding::Binding;
use crate::optimise::search_range::CapNote;

/// A note of the design choice.
#[derive(Debug, Clone, PartialEq)]
pub enum DesignNote {
    /// The count search's cap on wells keeps it from the spacing limits.
    Cap(CapNote),
    /// A note without quantities, in words.
    Said(String),
    /// Every well runs at its pump class's largest rate (`pumps.one_rate_per_class`).
    OneRatePerClass {
        /// Flow added over the individual rates, m³/s.
        added_m3_per_s: f64,
    },
    /// With one rate in every well no count meets every target: the closest one.
    UniformShort {
        /// Wells of the closest layout.
        count: usize,
        /// What caps the uniform rate there.
        limit: Binding,
        /// The worst check point.
        point: String,
        /// How far above its target that point stays, m.
        shortfall_m: f64,
    },
    /// The design's allowances, and whether the same wells meet every target without them.
    Allowances {
        /// Operating margin below every target, m.
        margin_m: f64,
        /// Largest share of each well's capacity used.
        capacity_fraction: f64,
        /// Any one well out is planned for.
        one_well_out: bool,
        /// The same wells meet every target without the allowances.
        met_without: bool,
    },
}

impl DesignNote {
    /// The note in words, quantities in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        match self {
            DesignNote::Cap(c) => c.words(units),
            DesignNote::Said(s) => s.clone(),
            DesignNote::OneRatePerClass { added_m3_per_s } => format!(
                "one rate per pump class (pumps.one_rate_per_class): every well runs at its class's largest rate, {} more in all",
                units.rate_words(*added_m3_per_s)
            ),
            DesignNote::UniformShort {
                count,
                limit,
                point,
                shortfall_m,
            } => format!(
                "with one rate in every well no count tried meets every target: at best ({count} wells, every well at the most its limits allow, {}) \"{point}\" stays {} above its target; individual rates give more to the wells that serve it",
                limit.words(units),
                units.length_words(*shortfall_m, 2)
            ),
            DesignNote::Allowances {
                margin_m,
                capacity_fraction,
                one_well_out,
                met_without,
            } => format!(
                "the design keeps {} below every target with every well running, uses at most {:.0} % of each well's capacity{} (allowances.operating_margin, capacity_fraction, one_well_out); {}",
                units.length_words(*margin_m, 2),
                capacity_fraction * 100.0,
                if *one_well_out { " and plans for any one well out" } else { "" },
                if *met_without {
                    "without these allowances the same wells meet every target, with no reserve: add wells, or relax an allowance if the engineer accepts less reserve"
                } else {
                    "the same wells do not meet every target even without them"
                }
            ),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn notes_in_feet_and_gpm() {
        // 0.30 m ÷ 0.3048 = 0.98 ft; 0.12 m = 0.39 ft; 5 L/s × 60 ÷ 3.785411784 = 79.25 gpm
        // (NIST SP 811 (2008) App. B: 1 ft = 0.3048 m, 1 US gal = 3.785411784 L exactly)
        let a = DesignNote::Allowances {
            margin_m: 0.3,
            capacity_fraction: 0.8,
            one_well_out: true,
            met_without: false,
        };
        assert!(a
            .words(UnitSystem::Us)
            .starts_with("the design keeps 0.98 ft below every target with every well running, uses at most 80 % of each well's capacity and plans for any one well out"));
        let u = DesignNote::UniformShort {
            count: 12,
            limit: Binding::PumpRate {
                rate_m3_per_s: 0.005,
            },
            point: "P4".into(),
            shortfall_m: 0.12,
        };
        assert_eq!(
            u.words(UnitSystem::Us),
            "with one rate in every well no count tried meets every target: at best (12 wells, every well at the most its limits allow, pump capacity 79.3 gpm) \"P4\" stays 0.39 ft above its target; individual rates give more to the wells that serve it"
        );
        // 2.5 L/s × 60 ÷ 3.785411784 = 39.63 gpm (NIST SP 811 (2008) App. B)
        let c = DesignNote::OneRatePerClass {
            added_m3_per_s: 0.0025,
        };
        assert!(c.words(UnitSystem::Us).ends_with(", 39.6 gpm more in all"));
        assert!(c.words(UnitSystem::Si).ends_with(", 2.50 L/s more in all"));
    }
}
