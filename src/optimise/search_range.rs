//! Where the count search starts and how far it goes: the quick estimate's count as the first
//! index tried, and the cap on wells (when it keeps the search from the spacing limits, the
//! design says so).

use crate::field::layout;
use crate::input::model::{LayoutKind, LayoutSpec, Model};
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

/// The search's cap on the number of wells, in words, when it keeps the count search from the
/// spacing limits: the count needed at the widest spacing is over the cap (the layouts tried
/// then stand wider than the maximum spacing), or the closest spacing is out of reach.
pub fn cap_note(model: &Model, spec: &LayoutSpec, max_wells: usize) -> Option<String> {
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
    let spacing_at = |n: usize| length / (n.saturating_sub(extra)).max(1) as f64;
    if need_widest > per_side_cap {
        Some(format!(
            "the search places at most {max_wells} wells (the cap on its work): the {what} of {length:.0} m needs at least {} wells{} at the maximum spacing of {max_s:.2} m, so the layouts tried stand {:.2} m apart, wider than the maximum; design it in stretches of at most {:.0} m",
            need_widest * sides,
            if sides == 2 { " (both sides)" } else { "" },
            spacing_at(per_side_cap),
            (per_side_cap - extra) as f64 * max_s
        ))
    } else if need_closest > per_side_cap {
        Some(format!(
            "the search places at most {max_wells} wells (the cap on its work): on the {what} of {length:.0} m the closest spacing tried is {:.2} m, not the minimum spacing of {min_s:.2} m",
            spacing_at(per_side_cap)
        ))
    } else {
        None
    }
}
