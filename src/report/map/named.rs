//! Named check points (a diamond and the name) and, when every target is met, the point with
//! the least margin (a ring and "least margin: … below target"), in the chosen units.

use crate::check::run::CheckRun;
use crate::field::checkpoints::PointKind;
use crate::report::map::labels::{place, Occupied};
use crate::report::map::layers::{group, Layers};
use crate::report::map::text::{halo, r1, text, text_width};
use crate::report::map::view::View;
use svg::node::element::{Circle, Path};

const NAMED: &str = "#5b2a86";

fn label_near(
    occ: &mut Occupied,
    area: [f64; 4],
    q: [f64; 2],
    label: &str,
    size: f64,
) -> Option<[f64; 2]> {
    let bw = text_width(label, size) + 6.0;
    let bh = size + 4.0;
    let cands: Vec<[f64; 2]> = [[1.0, 0.0], [-1.0, 0.0], [0.0, -1.0], [0.0, 1.0]]
        .iter()
        .flat_map(|u: &[f64; 2]| {
            [10.0, 24.0, 40.0].map(|k| [q[0] + u[0] * (k + bw / 2.0), q[1] + u[1] * (k + bh / 2.0)])
        })
        .collect();
    place(occ, area, bw, bh, &cands)
}

/// Draw the named check points and the least-margin point into the `failed-points` layer.
pub(super) fn draw_named(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    only: Option<[f64; 4]>,
) {
    let inside = |q: [f64; 2]| {
        only.is_none_or(|w| q[0] >= w[0] && q[0] <= w[2] && q[1] >= w[1] && q[1] <= w[3])
    };
    let mut g = std::mem::replace(&mut lay.failed, group("failed-points"));
    let size = 10.5;
    for p in &run.evaluation.points {
        if p.point.kind != PointKind::Named || !inside(p.point.position) {
            continue;
        }
        let q = view.px(p.point.position);
        let a = 5.0;
        g = g.add(
            Path::new()
                .set("class", "named-point")
                .set(
                    "d",
                    format!("M{} {}l{a} {a}l-{a} {a}l-{a} -{a}z", r1(q[0]), r1(q[1] - a)),
                )
                .set("fill", NAMED)
                .set("stroke", "#ffffff")
                .set("stroke-width", 0.8),
        );
        if let Some(c) = label_near(occ, area, q, &p.point.name, size) {
            g = g.add(halo(
                text(c[0], c[1] + size * 0.35, size, p.point.name.clone())
                    .set("text-anchor", "middle")
                    .set("fill", NAMED),
            ));
        }
    }
    let e = &run.evaluation;
    if let Some(w) = e.worst_point.and_then(|i| e.points.get(i)) {
        if let Some(m) = w.margin_m.filter(|m| *m >= 0.0) {
            if inside(w.point.position) {
                let q = view.px(w.point.position);
                let u = run.model.units;
                g = g.add(
                    Circle::new()
                        .set("class", "least-margin-point")
                        .set("cx", r1(q[0]))
                        .set("cy", r1(q[1]))
                        .set("r", 6)
                        .set("fill", "none")
                        .set("stroke", "#1b6e20")
                        .set("stroke-width", 1.8),
                );
                let label = format!(
                    "least margin: {:.*} {} below target",
                    if u == crate::input::units::UnitSystem::Us {
                        1
                    } else {
                        2
                    },
                    u.length(m),
                    u.length_unit()
                );
                if let Some(c) = label_near(occ, area, q, &label, size) {
                    g = g.add(halo(
                        text(c[0], c[1] + size * 0.35, size, label)
                            .set("text-anchor", "middle")
                            .set("fill", "#1b6e20")
                            .set("font-weight", "bold"),
                    ));
                }
            }
        }
    }
    lay.failed = g;
}
