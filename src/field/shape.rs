//! Shape measures of an excavation outline: its length and width (the smallest enclosing
//! rotated rectangle, from `geo`) and whether it is treated as a trench.

use crate::input::model::{Excavation, Model, ShapeChoice};
use geo::MinimumRotatedRect;

/// Length and width of the smallest rectangle that encloses the outline, m.
pub fn length_and_width(e: &Excavation) -> (f64, f64) {
    let Some(rect) = e.outline.minimum_rotated_rect() else {
        return (0.0, 0.0);
    };
    let c = &rect.exterior().0;
    let a = (c[1].x - c[0].x).hypot(c[1].y - c[0].y);
    let b = (c[2].x - c[1].x).hypot(c[2].y - c[1].y);
    (a.max(b), a.min(b))
}

/// Whether an excavation is treated as a trench (line slot): by the user's choice, or when its
/// enclosing rectangle is at least the trench aspect ratio long.
pub fn is_trench(model: &Model, e: &Excavation) -> bool {
    match e.shape {
        ShapeChoice::Pit => false,
        ShapeChoice::Trench => true,
        ShapeChoice::Auto => {
            let (length, width) = length_and_width(e);
            width <= 0.0 || length / width >= model.trench_aspect_ratio
        }
    }
}
