//! One plan, the main one or a detail: every layer drawn in a view of a level grid, labels
//! placed in order of importance (each keeps clear of those before it), with the counts of
//! well labels left off and of failed check points marked.

use crate::check::run::CheckRun;
use crate::field::grid::{ContourSet, LevelGrid};
use crate::report::map::contours::{draw_bands, draw_contour_labels, draw_contours};
use crate::report::map::features::{
    draw_boundaries, draw_dry, draw_excavations, draw_far_side, draw_keep_outs, draw_neighbours,
    draw_paths,
};
use crate::report::map::frame::draw_frame;
use crate::report::map::labels::{reserve, Occupied};
use crate::report::map::layers::Layers;
use crate::report::map::options::MapOptions;
use crate::report::map::points::draw_failed;
use crate::report::map::view::View;
use crate::report::map::wells::draw_wells;

/// Draw one plan (the main one, or a detail) of `grid` in `view`; returns the layers, the
/// number of well labels left off and the number of failed check points marked.
pub(super) fn draw_plan(
    run: &CheckRun,
    grid: &LevelGrid,
    set: &ContourSet,
    view: &View,
    opts: &MapOptions,
    prefix: &str,
    only: Option<[f64; 4]>,
) -> (Layers, usize, usize) {
    let gb = grid.bounds();
    let plan_px = {
        let a = view.px([gb[0], gb[3]]);
        let b = view.px([gb[2], gb[1]]);
        [a[0], a[1], b[0], b[1]]
    };
    let mut occ = Occupied::default();
    let mut lay = Layers::new(prefix, view, plan_px, grid);
    draw_bands(&mut lay, grid, set, view);
    draw_far_side(&mut lay, run, grid, view);
    draw_contours(&mut lay, set, view);
    draw_paths(&mut lay, run, view);
    // Labels are placed in order of importance (each keeps clear of those before it); the
    // layers are stacked in their fixed order, whatever the order here.
    reserve(run, view, &mut occ);
    crate::report::map::walls::reserve_walls(run, view, &mut occ);
    let omitted = draw_wells(&mut lay, run, view, &mut occ, plan_px, only);
    draw_excavations(&mut lay, run, view, &mut occ, plan_px);
    draw_neighbours(&mut lay, run, view, &mut occ, plan_px, opts);
    draw_keep_outs(&mut lay, run, view, &mut occ, plan_px);
    draw_boundaries(&mut lay, run, grid, view, &mut occ, plan_px);
    crate::report::map::walls::draw_walls(&mut lay, run, view, &mut occ, plan_px);
    draw_dry(&mut lay, grid, view);
    let failed = draw_failed(&mut lay, run, view, &mut occ, plan_px, only);
    crate::report::map::named::draw_named(&mut lay, run, view, &mut occ, plan_px, only);
    draw_contour_labels(&mut lay, set, grid, view, &mut occ, plan_px);
    draw_frame(&mut lay, view, plan_px);
    (lay, omitted, failed)
}
