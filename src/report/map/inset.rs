//! The detail plan for long, crowded layouts (a line of wellpoints along a trench): when to
//! draw one and where, the window round the check point with the least margin, and the detail
//! itself on its own finer grid with the main plan's contour values, its own frame and scale
//! bar, and the window outlined on the main plan.

use crate::check::run::CheckRun;
use crate::field::grid::{ContourSet, LevelGrid};
use crate::report::map::frame::nice_below;
use crate::report::map::layers::group;
use crate::report::map::options::MapOptions;
use crate::report::map::page::{INK, PLAN};
use crate::report::map::plan::draw_plan;
use crate::report::map::symbols::nearest_well_spacing;
use crate::report::map::text::{decimals, halo, r1, signed, text};
use crate::report::map::view::View;
use svg::node::element::{Definitions, Group, Rectangle};

/// Where the detail plan goes, and the site window it shows.
pub(super) struct Detail {
    /// Page area for the detail, px.
    area: [f64; 4],
    /// Site window, [xmin, ymin, xmax, ymax], m.
    window: [f64; 4],
    /// What it is centred on.
    about: String,
}

/// A detail plan for long, crowded layouts (a line of wellpoints along a trench): when the
/// whole plan is a strip and wells stand less than 8 px apart on it, or the strip is under a
/// third of the plan's height, the strip moves to the top as a key plan and a larger-scale
/// detail around the worst check point fills the space below.
pub(super) fn plan_detail(run: &CheckRun, gb: [f64; 4]) -> Option<(View, Detail)> {
    let full = View::fit(gb, PLAN);
    let strip_h = (gb[3] - gb[1]) * full.scale;
    let spacing = nearest_well_spacing(run);
    let gap_px = spacing * full.scale;
    // A strip under a third of the page leaves most of it blank even when the wells stand
    // apart: it becomes a key plan above an enlarged panel too.
    let thin = strip_h < 0.33 * (PLAN[3] - PLAN[1]);
    if strip_h > 0.5 * (PLAN[3] - PLAN[1]) || gap_px.is_nan() || (gap_px >= 8.0 && !thin) {
        return None;
    }
    let top_area = [PLAN[0], PLAN[1], PLAN[2], PLAN[1] + strip_h];
    let area = [PLAN[0], top_area[3] + 64.0, PLAN[2], PLAN[3]];
    if area[3] - area[1] < 200.0 {
        return None;
    }
    let (aw, ah) = (area[2] - area[0], area[3] - area[1]);
    let scale = (3.0 * full.scale).max(14.0 / spacing).min(aw / 15.0);
    let (hw, hh) = (aw / scale / 2.0, ah / scale / 2.0);
    let e = &run.evaluation;
    let (centre, about) = match e.worst_point.and_then(|i| e.points.get(i)) {
        Some(p) => (
            p.point.position,
            format!(
                "Detail A — round the check point with the least margin ({:.1}, {:.1})",
                p.point.position[0], p.point.position[1]
            ),
        ),
        None => (
            run.placement
                .wells
                .first()
                .map_or([0.0, 0.0], |w| w.position),
            "Detail A — round the first well".to_string(),
        ),
    };
    // Keep the window on the grid where it fits.
    let fit = |c: f64, h: f64, lo: f64, hi: f64| {
        if hi - lo <= 2.0 * h {
            (lo + hi) / 2.0
        } else {
            c.clamp(lo + h, hi - h)
        }
    };
    let cx = fit(centre[0], hw, gb[0], gb[2]);
    let cy = fit(centre[1], hh, gb[1], gb[3]);
    Some((
        View::fit(gb, top_area),
        Detail {
            area,
            window: [cx - hw, cy - hh, cx + hw, cy + hh],
            about,
        },
    ))
}

/// The detail plan: its own finer grid over the window, the main plan's contour values, its
/// own frame and scale bar, and the window outlined on the main plan.
pub(super) fn detail_plan(
    run: &CheckRun,
    set: &ContourSet,
    main: &View,
    d: &Detail,
    opts: &MapOptions,
) -> (Group, Definitions) {
    let w = d.window;
    let step = ((w[2] - w[0]) * (w[3] - w[1]) / crate::field::grid::DEFAULT_NODES as f64).sqrt();
    let nx = ((w[2] - w[0]) / step).ceil() as usize + 1;
    let ny = ((w[3] - w[1]) / step).ceil() as usize + 1;
    let fine = LevelGrid::compute(&run.grid_source(), [w[0], w[1]], step, nx.max(4), ny.max(4));
    let levels: Vec<f64> = set.lines.iter().map(|l| l.value).collect();
    let local = ContourSet {
        quantity: set.quantity,
        interval: set.interval,
        range: set.range,
        undisturbed: set.undisturbed,
        lines: fine.lines_at(&fine.values(set.quantity), &levels),
    };
    let view = View::fit(fine.bounds(), d.area);
    let (mut lay, _, _) = draw_plan(run, &fine, &local, &view, opts, "detail-", Some(w));
    let defs = std::mem::replace(&mut lay.defs, Definitions::new());
    let fb = fine.bounds();
    let top_left = view.px([fb[0], fb[3]]);
    let clip = lay.plan_clip.clone();
    let mut g = group("detail");
    // The window on the main plan.
    let a = main.px([w[0], w[3]]);
    let b = main.px([w[2], w[1]]);
    g = g
        .add(
            Rectangle::new()
                .set("x", r1(a[0]))
                .set("y", r1(a[1]))
                .set("width", r1(b[0] - a[0]))
                .set("height", r1(b[1] - a[1]))
                .set("fill", "none")
                .set("stroke", INK)
                .set("stroke-width", 1.4)
                .set("stroke-dasharray", "6 3"),
        )
        .add(halo(
            text(a[0] + 4.0, a[1] + 14.0, 12.0, "A")
                .set("font-weight", "bold")
                .set("fill", INK),
        ))
        .add(
            text(top_left[0], top_left[1] - 30.0, 13.0, d.about.clone())
                .set("font-weight", "bold")
                .set("fill", INK),
        );
    // Its own scale bar, above its top right corner.
    let u = run.model.units;
    let per_unit = 1.0 / u.length(1.0);
    let len_m = nice_below(150.0 / view.scale / per_unit) * per_unit;
    let len_px = len_m * view.scale;
    let right = view.px([fb[2], fb[3]]);
    let x0 = right[0] - len_px - 30.0;
    let y0 = right[1] - 30.0;
    for k in 0..4 {
        let bw = len_px / 4.0;
        g = g.add(
            Rectangle::new()
                .set("x", r1(x0 + bw * k as f64))
                .set("y", r1(y0 - 6.0))
                .set("width", r1(bw))
                .set("height", 6)
                .set("fill", if k % 2 == 0 { INK } else { "#ffffff" })
                .set("stroke", INK)
                .set("stroke-width", 0.8),
        );
    }
    g = g.add(
        text(
            x0 + len_px + 6.0,
            y0,
            11.0,
            format!(
                "{} {}",
                signed(u.length(len_m), decimals(u.length(len_m)).min(2)),
                u.length_unit()
            ),
        )
        .set("fill", INK),
    );
    // The frame and its coordinates stand outside the clip.
    let frame = std::mem::replace(&mut lay.frame, Group::new());
    let mut inner = Group::new().set("clip-path", clip);
    for l in lay
        .stacked()
        .into_iter()
        .filter(|l| !l.get_attributes().is_empty())
    {
        inner = inner.add(l);
    }
    (g.add(inner).add(frame), defs)
}
