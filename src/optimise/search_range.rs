//! Where the count search starts and how far it goes: the quick estimate's count as the first
//! index tried, and the cap on wells (when it keeps the search from the spacing limits, the
//! design says so).

use crate::field::layout;
use crate::input::model::{LayoutKind, LayoutSpec, Model};
use crate::input::units::UnitSystem;
use crate::optimise::trial::{closed_length, line_length};

/// The search index the quick estimate points to: its rough count of wells (per side for a
/// trench line), `None` for a given layout.
pub fn seed_index(spec: &LayoutSpec, rough_count: u32) -> Option<usize> {
    let n = rough_count as usize;
    match &spec.kind {
        LayoutKind::Ring { .. } => Some(n),
        LayoutKind::Line { both_sides, .. } => Some(n.div_ceil(if *both_sides { 2 } else { 1 })),
        _ => None,
    }
}

/// The count search's cap on wells, when it keeps the search from the spacing limits. Lengths
/// in m, worded in the run's units by [`CapNote::words`].
#[derive(Debug, Clone, PartialEq)]
pub struct CapNote {
    /// Most wells the search places.
    pub max_wells: usize,
    /// "ring" or "line".
    pub what: &'static str,
    /// Length of the ring or line, m.
    pub length_m: f64,
    /// Wells on one side (1) or both sides (2) of a line.
    pub sides: usize,
    /// Spacing of the layouts tried at the cap, m.
    pub spacing_tried_m: f64,
    /// What the cap keeps the search from.
    pub kind: CapKind,
}

/// What the cap on wells keeps the count search from.
#[derive(Debug, Clone, PartialEq)]
pub enum CapKind {
    /// Even at the cap the layouts tried stand wider than the maximum spacing.
    WiderThanMaximum {
        /// Wells needed at the maximum spacing (all sides).
        needed: usize,
        /// The maximum spacing, m.
        max_spacing_m: f64,
        /// Longest stretch the cap covers at the maximum spacing, m.
        stretch_m: f64,
    },
    /// The closest spacing tried is wider than the minimum spacing.
    MinimumOutOfReach {
        /// The minimum spacing, m.
        min_spacing_m: f64,
    },
}

impl CapNote {
    /// The note in words, lengths in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        let len = |m: f64, d: usize| units.length_words(m, d);
        let (max_wells, what) = (self.max_wells, self.what);
        match &self.kind {
            CapKind::WiderThanMaximum {
                needed,
                max_spacing_m,
                stretch_m,
            } => format!(
                "the search places at most {max_wells} wells (the cap on its work): the {what} of {} needs at least {needed} wells{} at the maximum spacing of {}, so the layouts tried stand {} apart, wider than the maximum; design it in stretches of at most {}",
                len(self.length_m, 0),
                if self.sides == 2 { " (both sides)" } else { "" },
                len(*max_spacing_m, 2),
                len(self.spacing_tried_m, 2),
                len(*stretch_m, 0)
            ),
            CapKind::MinimumOutOfReach { min_spacing_m } => format!(
                "the search places at most {max_wells} wells (the cap on its work): on the {what} of {} the closest spacing tried is {}, not the minimum spacing of {}",
                len(self.length_m, 0),
                len(self.spacing_tried_m, 2),
                len(*min_spacing_m, 2)
            ),
        }
    }
}

/// The search's cap on the number of wells, when it keeps the count search from the spacing
/// limits: the count needed at the widest spacing is over the cap (the layouts tried then
/// stand wider than the maximum spacing), or the closest spacing is out of reach.
pub fn cap_note(model: &Model, spec: &LayoutSpec, max_wells: usize) -> Option<CapNote> {
    let (min_s, max_s) = (model.as_built.min_spacing, model.as_built.max_spacing);
    let (what, length, sides, closed) = match &spec.kind {
        LayoutKind::Ring { .. } => {
            let ring =
                layout::offset_ring(&model.excavations[spec.excavation].outline, spec.offset);
            ("ring", closed_length(&ring), 1, true)
        }
        LayoutKind::Line { both_sides, .. } => (
            "line",
            line_length(model, spec),
            if *both_sides { 2 } else { 1 },
            false,
        ),
        _ => return None,
    };
    let extra = usize::from(!closed);
    let per_side_cap = max_wells / sides;
    let need_widest = (length / max_s).ceil() as usize + extra;
    let need_closest = (length / min_s).floor() as usize + extra;
    let kind = if need_widest > per_side_cap {
        CapKind::WiderThanMaximum {
            needed: need_widest * sides,
            max_spacing_m: max_s,
            stretch_m: (per_side_cap - extra) as f64 * max_s,
        }
    } else if need_closest > per_side_cap {
        CapKind::MinimumOutOfReach {
            min_spacing_m: min_s,
        }
    } else {
        return None;
    };
    Some(CapNote {
        max_wells,
        what,
        length_m: length,
        sides,
        spacing_tried_m: length / (per_side_cap.saturating_sub(extra)).max(1) as f64,
        kind,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cap_note_in_feet() {
        // 4000 m ÷ 0.3048 = 13 123 ft; 3.00 m = 9.84 ft; 4.00 m = 13.12 ft; 2997 m = 9833 ft
        // (NIST SP 811 (2008) App. B: 1 ft = 0.3048 m exactly)
        let n = CapNote {
            max_wells: 2000,
            what: "line",
            length_m: 4000.0,
            sides: 2,
            spacing_tried_m: 4.0,
            kind: CapKind::WiderThanMaximum {
                needed: 2668,
                max_spacing_m: 3.0,
                stretch_m: 2997.0,
            },
        };
        assert_eq!(
            n.words(UnitSystem::Us),
            "the search places at most 2000 wells (the cap on its work): the line of 13123 ft needs at least 2668 wells (both sides) at the maximum spacing of 9.84 ft, so the layouts tried stand 13.12 ft apart, wider than the maximum; design it in stretches of at most 9833 ft"
        );
        assert!(n
            .words(UnitSystem::Si)
            .contains("the line of 4000 m needs at least 2668 wells (both sides) at the maximum spacing of 3.00 m"));
    }
}
