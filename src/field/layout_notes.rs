//! What placing a layout noted, as data with SI numbers, worded in the run's units
//! ([`LayoutNote::words`]); the pattern of [`crate::input::import::notes`].
//!
//! The placement's note list carries these notes (notes without numbers as [`LayoutNote::Said`]);
//! the outputs word them in the run's units where they show them.

use crate::input::model::Rolling;
use crate::input::units::UnitSystem;

/// One thing placing a layout did or found.
#[derive(Debug, Clone)]
pub enum LayoutNote {
    /// A well moved along its ring or line out of a keep-out zone.
    Moved {
        /// The well.
        well: String,
        /// How far it moved along its line, m.
        distance_m: f64,
        /// The keep-out zone.
        zone: String,
    },
    /// The wellpoints placed along a trench line.
    Wellpoints {
        /// Wellpoints placed.
        count: usize,
        /// Closest and widest spacing, m.
        spacing_m: (f64, f64),
        /// Length of the line, m.
        length_m: f64,
        /// On both sides of the trench.
        both_sides: bool,
    },
    /// A rolling run's line is one position of the set.
    Rolling(Box<Rolling>),
    /// A note without quantities, in words.
    Said(String),
}

impl LayoutNote {
    /// The note in words, quantities in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        let lu = units.length_unit();
        match self {
            LayoutNote::Moved {
                well,
                distance_m,
                zone,
            } => format!(
                "{well} moved {} along its line out of keep-out zone \"{zone}\"",
                units.length_words(*distance_m, 1)
            ),
            LayoutNote::Wellpoints {
                count,
                spacing_m: (lo, hi),
                length_m,
                both_sides,
            } => format!(
                "{count} wellpoints at {} {lu} spacing along {:.0} {lu}{}",
                if hi - lo < 0.005 {
                    format!("{:.2}", units.length(*lo))
                } else {
                    format!("{:.2}–{:.2}", units.length(*lo), units.length(*hi))
                },
                units.length(*length_m),
                if *both_sides {
                    " on both sides"
                } else {
                    " on one side"
                }
            ),
            LayoutNote::Rolling(r) => rolling_words(r, units),
            LayoutNote::Said(s) => s.clone(),
        }
    }
}

/// What a rolling run's line stands for.
fn rolling_words(r: &Rolling, u: UnitSystem) -> String {
    let lu = u.length_unit();
    let tag = |d: bool| {
        if d {
            " (default, common practice (no source))"
        } else {
            ""
        }
    };
    format!(
        "rolling run: the line is one position of the set, {:.0} {lu} installed = run-out {:.0} {lu}{} + open length {:.0} {lu} + run-in {:.0} {lu}{}, shown at chainage {:.1}–{:.1} {lu} of the {:.0} {lu} trench; the targets are those of the open length; the set is moved along as the face advances {:.1} {lu} a day ({:.0} days of digging); `programme` does not yet move it",
        u.length(r.installed_length()), u.length(r.run_out), tag(r.run_out_default),
        u.length(r.open_length), u.length(r.run_in), tag(r.run_in_default),
        u.length(r.open_from), u.length(r.open_from + r.open_length), u.length(r.trench_length),
        u.length(r.advance_per_day), (r.trench_length / r.advance_per_day - 1e-9).ceil()
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn moved_well_in_feet() {
        // 1.5 m ÷ 0.3048 m/ft = 4.92 ft (NIST SP 811 (2008) App. B: 1 ft = 0.3048 m exactly)
        let n = LayoutNote::Moved {
            well: "W03".into(),
            distance_m: 1.5,
            zone: "culvert".into(),
        };
        assert_eq!(
            n.words(UnitSystem::Us),
            "W03 moved 4.9 ft along its line out of keep-out zone \"culvert\""
        );
        assert_eq!(
            n.words(UnitSystem::Si),
            "W03 moved 1.5 m along its line out of keep-out zone \"culvert\""
        );
    }

    #[test]
    fn wellpoint_line_in_feet() {
        // 1.5 m = 4.92 ft, 2.0 m = 6.56 ft, 120 m = 393.7 ft → 394 (NIST SP 811 (2008) App. B)
        let n = LayoutNote::Wellpoints {
            count: 70,
            spacing_m: (1.5, 2.0),
            length_m: 120.0,
            both_sides: true,
        };
        assert_eq!(
            n.words(UnitSystem::Us),
            "70 wellpoints at 4.92–6.56 ft spacing along 394 ft on both sides"
        );
        let even = LayoutNote::Wellpoints {
            count: 41,
            spacing_m: (3.0, 3.0),
            length_m: 120.0,
            both_sides: false,
        };
        assert_eq!(
            even.words(UnitSystem::Si),
            "41 wellpoints at 3.00 m spacing along 120 m on one side"
        );
    }
}
