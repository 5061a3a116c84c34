//! Cut-off walls on the plan: each wall a thick dark line along its vertices (closed walls back
//! to the first), its own style in the legend, with its name beside it, along a piece of the
//! wall (the longest first), on whichever side is free of other labels, symbols and outlines
//! (a label over a neighbour's outline shows the outline through the gaps between its words).

use crate::check::run::CheckRun;
use crate::input::model_walls::Wall;
use crate::report::map::labels::{inside, reserve_segment, rotated_half_extent, Occupied};
use crate::report::map::layers::{group, Layers};
use crate::report::map::text::{halo, r1, text, text_width};
use crate::report::map::view::View;
use svg::node::element::{Group, Path, Rectangle};

/// Colour of a wall (dark sheet-pile grey-brown).
pub const WALL: &str = "#3d3128";
/// Stroke width of a wall, px.
pub const WALL_WIDTH: f64 = 5.0;

/// Keep every label off the walls (drawn `WALL_WIDTH` px wide), before any label is placed.
pub(super) fn reserve_walls(run: &CheckRun, view: &View, occ: &mut Occupied) {
    for w in &run.model.walls {
        for (a, b) in w.pieces() {
            reserve_segment(view, occ, a, b, 1.0 + WALL_WIDTH / 2.0);
        }
    }
}

/// Draw every `[[wall]]` of the model into the boundaries layer.
pub(super) fn draw_walls(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for w in &run.model.walls {
        let pts: Vec<[f64; 2]> = w.vertices.iter().map(|p| view.px(*p)).collect();
        let mut d = String::new();
        for (i, p) in pts.iter().enumerate() {
            d.push_str(&format!(
                "{}{} {}",
                if i == 0 { "M" } else { "L" },
                r1(p[0]),
                r1(p[1])
            ));
        }
        if w.closed {
            d.push('Z');
        }
        let mut g = Group::new().set("class", "wall").add(
            Path::new()
                .set("d", d)
                .set("fill", "none")
                .set("stroke", WALL)
                .set("stroke-width", WALL_WIDTH)
                .set("stroke-linejoin", "round")
                .set(
                    "stroke-dasharray",
                    if w.resistance.is_some() {
                        "10 3"
                    } else {
                        "none"
                    },
                ),
        );
        g = g.add(wall_label(w, view, occ, area));
        lay.boundaries = std::mem::replace(&mut lay.boundaries, group("boundaries")).add(g);
    }
}

/// The wall's name, written along a piece of it (text upright) at the first free spot: pieces
/// longest first, at 0.5, 0.3, 0.7, 0.15 and 0.85 of the piece, on one side then the other; when
/// none is free, above the middle of the longest piece all the same (a wall is always named), on
/// a white plate.
fn wall_label(w: &Wall, view: &View, occ: &mut Occupied, area: [f64; 4]) -> Group {
    let label = format!("{} (wall)", w.name);
    let size = 11.0;
    // bold: about a tenth wider than the regular widths text_width counts
    let width = 1.1 * text_width(&label, size) + 8.0;
    let mut pieces: Vec<([f64; 2], [f64; 2])> = w
        .pieces()
        .into_iter()
        .map(|(a, b)| (view.px(a), view.px(b)))
        .collect();
    pieces.sort_by(|a, b| {
        let la = (a.1[0] - a.0[0]).hypot(a.1[1] - a.0[1]);
        let lb = (b.1[0] - b.0[0]).hypot(b.1[1] - b.0[1]);
        lb.total_cmp(&la)
    });
    let upright = |d: [f64; 2]| {
        let mut angle = d[1].atan2(d[0]).to_degrees();
        if angle > 90.0 {
            angle -= 180.0;
        } else if angle <= -90.0 {
            angle += 180.0;
        }
        angle
    };
    let off = size * 0.5 + 2.0 + WALL_WIDTH / 2.0 + 2.0;
    let mut chosen = None;
    'pieces: for (pa, pb) in &pieces {
        let d = [pb[0] - pa[0], pb[1] - pa[1]];
        let len = d[0].hypot(d[1]);
        if len < 1e-9 {
            continue;
        }
        let n = [-d[1] / len, d[0] / len];
        let angle = upright(d);
        let (hw, hh) = rotated_half_extent(width, size + 4.0, angle);
        for t in [0.5, 0.3, 0.7, 0.15, 0.85] {
            // the side above the line on the page first (n points up or left when -n_y > 0)
            let sides = if n[1] <= 0.0 {
                [1.0, -1.0]
            } else {
                [-1.0, 1.0]
            };
            for side in sides {
                let p = [
                    pa[0] + d[0] * t + side * n[0] * off,
                    pa[1] + d[1] * t + side * n[1] * off,
                ];
                let bx = [p[0] - hw, p[1] - hh, p[0] + hw, p[1] + hh];
                if inside(bx, area) && occ.free(bx) {
                    occ.take(bx);
                    chosen = Some((p, angle));
                    break 'pieces;
                }
            }
        }
    }
    let (p, angle, over) = match (chosen, pieces.first()) {
        (Some((p, angle)), _) => (p, angle, false),
        (None, Some((pa, pb))) => (
            [(pa[0] + pb[0]) / 2.0, (pa[1] + pb[1]) / 2.0 - off],
            upright([pb[0] - pa[0], pb[1] - pa[1]]),
            true,
        ),
        (None, None) => ([0.0, 0.0], 0.0, true),
    };
    if over {
        let (hw, hh) = rotated_half_extent(width, size + 4.0, angle);
        occ.take([p[0] - hw, p[1] - hh, p[0] + hw, p[1] + hh]);
    }
    let at = format!("translate({} {}) rotate({})", r1(p[0]), r1(p[1]), r1(angle));
    let mut g = Group::new().set("class", "wall-label");
    if over {
        // Over other lines: a white plate behind the words, or the lines show through the
        // gaps between words (the halo follows the letters only).
        g = g.add(
            Rectangle::new()
                .set("x", r1(-width / 2.0))
                .set("y", r1(-size * 0.5 - 2.0))
                .set("width", r1(width))
                .set("height", r1(size + 4.0))
                .set("rx", 2)
                .set("fill", "#ffffff")
                .set("fill-opacity", 0.85)
                .set("transform", at.clone()),
        );
    }
    g.add(halo(
        text(0.0, size * 0.35, size, label)
            .set("text-anchor", "middle")
            .set("fill", WALL)
            .set("font-weight", "bold")
            .set("transform", at),
    ))
}
