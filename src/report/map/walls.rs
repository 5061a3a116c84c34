//! Cut-off walls on the plan: each wall a thick dark line along its vertices (closed walls back
//! to the first), its own style in the legend, with its name beside its longest piece.

use crate::check::run::CheckRun;
use crate::report::map::layers::{group, Layers};
use crate::report::map::text::{halo, r1, text};
use crate::report::map::view::View;
use svg::node::element::{Group, Path};

/// Colour of a wall (dark sheet-pile grey-brown).
pub const WALL: &str = "#3d3128";
/// Stroke width of a wall, px.
pub const WALL_WIDTH: f64 = 5.0;

/// Draw every `[[wall]]` of the model into the boundaries layer.
pub(super) fn draw_walls(lay: &mut Layers, run: &CheckRun, view: &View) {
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
        let longest = w.pieces().into_iter().max_by(|a, b| {
            let la = (a.1[0] - a.0[0]).hypot(a.1[1] - a.0[1]);
            let lb = (b.1[0] - b.0[0]).hypot(b.1[1] - b.0[1]);
            la.total_cmp(&lb)
        });
        if let Some((a, b)) = longest {
            let (pa, pb) = (view.px(a), view.px(b));
            let mid = [(pa[0] + pb[0]) / 2.0, (pa[1] + pb[1]) / 2.0 - 9.0];
            g = g.add(halo(
                text(mid[0], mid[1], 11.0, format!("{} (wall)", w.name))
                    .set("text-anchor", "middle")
                    .set("fill", WALL)
                    .set("font-weight", "bold"),
            ));
        }
        lay.boundaries = std::mem::replace(&mut lay.boundaries, group("boundaries")).add(g);
    }
}
