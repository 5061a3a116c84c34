//! Check points whose target is not met: a cross on each (in the window only, for a detail
//! plan), and a leader to a label on the worst one saying how far the water stands above its
//! target.

use crate::check::run::CheckRun;
use crate::report::map::labels::{place, Occupied};
use crate::report::map::layers::{group, Layers};
use crate::report::map::page::FAIL;
use crate::report::map::symbols::cross_size;
use crate::report::map::text::{halo, r1, signed, text, text_width};
use crate::report::map::view::View;
use svg::node::element::{Line, Path};

/// Mark check points whose target is not met; returns how many.
pub(super) fn draw_failed(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    only: Option<[f64; 4]>,
) -> usize {
    let failed: Vec<&crate::check::evaluate::PointResult> = run
        .evaluation
        .points
        .iter()
        .filter(|p| p.met == Some(false))
        .filter(|p| {
            let q = p.point.position;
            only.is_none_or(|w| q[0] >= w[0] && q[0] <= w[2] && q[1] >= w[1] && q[1] <= w[3])
        })
        .collect();
    if failed.is_empty() {
        return 0;
    }
    let a = cross_size(run, view);
    let mut d = String::new();
    for p in &failed {
        let q = view.px(p.point.position);
        d.push_str(&format!(
            "M{} {}L{} {}M{} {}L{} {}",
            r1(q[0] - a),
            r1(q[1] - a),
            r1(q[0] + a),
            r1(q[1] + a),
            r1(q[0] - a),
            r1(q[1] + a),
            r1(q[0] + a),
            r1(q[1] - a)
        ));
    }
    let mut g = std::mem::replace(&mut lay.failed, group("failed-points")).add(
        Path::new()
            .set("d", d)
            .set("class", "failed-point")
            .set("stroke", FAIL)
            .set("stroke-width", if a < 3.0 { 1.1 } else { 1.6 })
            .set("stroke-linecap", "round"),
    );
    // Label the worst point with how far the water stands above its target.
    if let Some(w) = run
        .evaluation
        .worst_point
        .and_then(|i| run.evaluation.points.get(i))
    {
        if let Some(m) = w.margin_m.filter(|m| *m < 0.0) {
            let q = view.px(w.point.position);
            let u = run.model.units;
            let label = format!(
                "worst: {} {} above target",
                signed(u.length(-m), 2),
                u.length_unit()
            );
            let size = 11.0;
            let bw = text_width(&label, size) + 6.0;
            let bh = size + 4.0;
            let dirs: [[f64; 2]; 8] = [
                [0.0, -1.0],
                [0.0, 1.0],
                [1.0, 0.0],
                [-1.0, 0.0],
                [0.7, -0.7],
                [-0.7, -0.7],
                [0.7, 0.7],
                [-0.7, 0.7],
            ];
            let cands: Vec<[f64; 2]> = dirs
                .iter()
                .flat_map(|u| {
                    [14.0, 30.0, 50.0, 75.0, 100.0].map(|k| {
                        [
                            q[0] + u[0] * (k + bw / 2.0 * u[0].abs()),
                            q[1] + u[1] * (k + bh / 2.0),
                        ]
                    })
                })
                .collect();
            if let Some(c) = place(occ, area, bw, bh, &cands) {
                g = g.add(
                    Line::new()
                        .set("x1", r1(q[0]))
                        .set("y1", r1(q[1]))
                        .set("x2", r1(c[0]))
                        .set("y2", r1(c[1]))
                        .set("stroke", FAIL)
                        .set("stroke-width", 0.8),
                );
                g = g.add(halo(
                    text(c[0], c[1] + size * 0.35, size, label)
                        .set("text-anchor", "middle")
                        .set("fill", FAIL)
                        .set("font-weight", "bold"),
                ));
            }
        }
    }
    lay.failed = g;
    failed.len()
}
