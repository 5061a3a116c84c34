//! Shape measures of an excavation outline: its length and width, and whether it is treated as
//! a trench.
//!
//! A compact or straight outline is measured by its smallest enclosing rotated rectangle (from
//! `geo`). A trench with bends is measured along its centre line
//! ([`crate::field::centre_line`]): length = centre-line length L, width = area / L (exact for
//! a strip of constant width with mitred bends); its enclosing rectangle would read the bend as
//! width.

use crate::field::centre_line;
use crate::input::model::{Excavation, Model, ShapeChoice};
use geo::{Area, MinimumRotatedRect};

/// Length and width of the smallest rectangle that encloses the outline, m.
pub fn rectangle_length_and_width(e: &Excavation) -> (f64, f64) {
    let Some(rect) = e.outline.minimum_rotated_rect() else {
        return (0.0, 0.0);
    };
    let c = &rect.exterior().0;
    let a = (c[1].x - c[0].x).hypot(c[1].y - c[0].y);
    let b = (c[2].x - c[1].x).hypot(c[2].y - c[1].y);
    (a.max(b), a.min(b))
}

/// Length and width of the excavation, m: along its centre line (length L, width area / L)
/// when it has one with a bend or one given in the design file, else its enclosing rectangle.
pub fn length_and_width(e: &Excavation) -> (f64, f64) {
    let (l, w, _) = measure(e);
    (l, w)
}

/// As [`length_and_width`], with `true` when measured along the centre line.
pub fn measure(e: &Excavation) -> (f64, f64, bool) {
    let line = centre_line::of_excavation(e);
    if e.centre_line.is_some() || line.len() > 2 {
        let l = centre_line::length(&line);
        if l > 0.0 {
            return (l, e.outline.unsigned_area() / l, true);
        }
    }
    let (l, w) = rectangle_length_and_width(e);
    (l, w, false)
}

/// Whether an excavation is treated as a trench (line slot): by the user's choice, or when it is
/// at least the trench aspect ratio long ([`length_and_width`]).
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
