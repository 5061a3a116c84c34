//! What stands on the site, drawn on the plan: the ground past a boundary line, the lines the
//! wells were set out on, keep-out zones, excavations with their target and formation levels,
//! neighbouring buildings (coloured by status when given), boundary lines with their names, and
//! the area pumped dry.

use crate::check::run::CheckRun;
use crate::field::grid::LevelGrid;
use crate::physics::images::BoundaryKind;
use crate::report::map::labels::{
    inside, place, place_with, poly_label_candidates, rotated_half_extent, Occupied,
};
use crate::report::map::layers::{group, Layers};
use crate::report::map::options::MapOptions;
use crate::report::map::page::{BARRIER, CONSTANT_HEAD, EXCAVATION, KEEP_OUT};
use crate::report::map::text::{halo, r1, signed, text, text_width};
use crate::report::map::view::{
    clip_line, multipolygon_data, page_line, path_data, polygon_data, View,
};
use svg::node::element::{Group, Line, Path, Rectangle};

pub(super) fn draw_far_side(lay: &mut Layers, run: &CheckRun, grid: &LevelGrid, view: &View) {
    for (b, poly) in run.model.boundaries.iter().zip(grid.far_sides()) {
        if poly.exterior().0.len() < 4 {
            continue;
        }
        let d = polygon_data(view, &poly);
        let (fill, extra) = match b.kind {
            BoundaryKind::ConstantHead => ("#dcebf7", None),
            BoundaryKind::Barrier => ("#ececec", Some("url(#hatch-barrier)")),
        };
        let mut g = lay.far_side.clone();
        g = g.add(Path::new().set("d", d.clone()).set("fill", fill));
        if let Some(p) = extra {
            g = g.add(Path::new().set("d", d).set("fill", p).set("opacity", 0.35));
        }
        lay.far_side = g;
    }
}

pub(super) fn draw_paths(lay: &mut Layers, run: &CheckRun, view: &View) {
    for p in &run.placement.paths {
        let pts = page_line(view, p);
        if pts.len() >= 2 {
            lay.paths = std::mem::replace(&mut lay.paths, group("paths"))
                .add(Path::new().set("d", path_data(&pts, false)));
        }
    }
}

pub(super) fn draw_keep_outs(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for k in &run.model.keep_outs {
        let d = polygon_data(view, &k.polygon);
        let mut g = Group::new().set("class", "keep-out");
        g = g
            .add(
                Path::new()
                    .set("d", d.clone())
                    .set("fill", "#fbe9e4")
                    .set("fill-opacity", 0.7),
            )
            .add(
                Path::new()
                    .set("d", d)
                    .set("fill", "url(#hatch-keep-out)")
                    .set("stroke", KEEP_OUT)
                    .set("stroke-width", 1.2)
                    .set("stroke-dasharray", "5 3"),
            );
        let (size, label) = (11.0, k.name.clone());
        let w = text_width(&label, size) + 6.0;
        if let Some(c) = place(
            occ,
            area,
            w,
            size + 4.0,
            &poly_label_candidates(view, &k.polygon, size),
        ) {
            g = g.add(halo(
                text(c[0], c[1] + size * 0.35, size, label)
                    .set("text-anchor", "middle")
                    .set("fill", KEEP_OUT)
                    .set("font-style", "italic"),
            ));
        }
        lay.keep_outs = std::mem::replace(&mut lay.keep_outs, group("keep-outs")).add(g);
    }
}

pub(super) fn draw_excavations(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for e in &run.model.excavations {
        let mut g = Group::new().set("class", "excavation");
        g = g.add(
            Path::new()
                .set("d", polygon_data(view, &e.outline))
                .set("fill", "#ffffff")
                .set("fill-opacity", 0.35)
                .set("stroke", EXCAVATION)
                .set("stroke-width", 2.6)
                .set("stroke-linejoin", "miter"),
        );
        let name = e.name.clone();
        let u = run.model.units;
        let (lu, dl) = (
            u.length_unit(),
            if u == crate::input::units::UnitSystem::Us {
                1
            } else {
                2
            },
        );
        // Relief (`control = "relieve"`, or `"both"` where it is lower): the relief head.
        let design = crate::field::checkpoints::design_target(run.model, e);
        let target = match (design.level, design.relief) {
            (Some(t), true) => format!("relief head ≤ {} {lu}", signed(u.length(t), dl)),
            (Some(t), false) => format!("target ≤ {} {lu}", signed(u.length(t), dl)),
            (None, _) => "relief head: none needed".to_string(),
        };
        let formation = format!("formation {} {lu}", signed(u.length(e.formation_level), dl));
        let (s1, s2) = (13.0, 11.0);
        let w = text_width(&name, s1).max(text_width(&formation, s2)) + 8.0;
        let h = s1 + 2.0 * s2 + 10.0;
        let cands = poly_label_candidates(view, &e.outline, h);
        // Clear of failed check points if there is room; over them (on white) if not.
        let spot = place_with(occ, area, w, h, &cands, false)
            .or_else(|| place_with(occ, area, w, h, &cands, true));
        if let Some(c) = spot {
            let top = c[1] - h / 2.0;
            let label = Group::new().set("class", "excavation-label");
            let label = label
                .add(
                    Rectangle::new()
                        .set("x", r1(c[0] - w / 2.0))
                        .set("y", r1(top - 1.0))
                        .set("width", r1(w))
                        .set("height", r1(h + 2.0))
                        .set("rx", 3)
                        .set("fill", "#ffffff")
                        .set("fill-opacity", 0.85),
                )
                .add(halo(
                    text(c[0], top + s1, s1, name)
                        .set("text-anchor", "middle")
                        .set("font-weight", "bold")
                        .set("fill", EXCAVATION),
                ))
                .add(halo(
                    text(c[0], top + s1 + s2 + 3.0, s2, target)
                        .set("text-anchor", "middle")
                        .set("fill", EXCAVATION),
                ))
                .add(halo(
                    text(c[0], top + s1 + 2.0 * s2 + 6.0, s2, formation)
                        .set("text-anchor", "middle")
                        .set("fill", "#4a4a4a"),
                ));
            lay.excavation_labels =
                std::mem::replace(&mut lay.excavation_labels, group("excavation-labels"))
                    .add(label);
        }
        lay.excavations = std::mem::replace(&mut lay.excavations, group("excavations")).add(g);
    }
}

pub(super) fn draw_neighbours(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    opts: &MapOptions,
) {
    let statuses = opts
        .neighbour_status
        .as_ref()
        .filter(|s| s.len() == run.model.neighbours.len());
    for (i, n) in run.model.neighbours.iter().enumerate() {
        let fill = statuses.map_or("#e2ddd5", |s| s[i].fill());
        let mut g = Group::new().set("class", "neighbour");
        g = g.add(
            Path::new()
                .set("d", polygon_data(view, &n.footprint))
                .set("fill", fill)
                .set("fill-opacity", 0.75)
                .set("stroke", "#5e564b")
                .set("stroke-width", 1.4),
        );
        let size = 12.0;
        let w = text_width(&n.name, size) + 8.0;
        if let Some(c) = place(
            occ,
            area,
            w,
            size + 4.0,
            &poly_label_candidates(view, &n.footprint, size),
        ) {
            g = g.add(halo(
                text(c[0], c[1] + size * 0.35, size, n.name.clone())
                    .set("text-anchor", "middle")
                    .set("fill", "#3b342b"),
            ));
        }
        lay.neighbours = std::mem::replace(&mut lay.neighbours, group("neighbours")).add(g);
    }
}

pub(super) fn draw_boundaries(
    lay: &mut Layers,
    run: &CheckRun,
    grid: &LevelGrid,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    for b in &run.model.boundaries {
        let Some((a, c)) = clip_line(b.line[0], b.line[1], grid.bounds()) else {
            continue;
        };
        let (pa, pc) = (view.px(a), view.px(c));
        let mut g = Group::new().set("class", "boundary");
        let (colour, words) = match b.kind {
            BoundaryKind::ConstantHead => (CONSTANT_HEAD, "constant head"),
            BoundaryKind::Barrier => (BARRIER, "barrier"),
        };
        let line = Line::new()
            .set("x1", r1(pa[0]))
            .set("y1", r1(pa[1]))
            .set("x2", r1(pc[0]))
            .set("y2", r1(pc[1]))
            .set("stroke", colour);
        g = match b.kind {
            BoundaryKind::ConstantHead => g.add(line.set("stroke-width", 3)),
            BoundaryKind::Barrier => g.add(
                line.set("stroke-width", 3.5)
                    .set("stroke-dasharray", "14 4 3 4"),
            ),
        };
        // Label along the line on the far side, where no contour runs.
        let d = [pc[0] - pa[0], pc[1] - pa[1]];
        let len = d[0].hypot(d[1]);
        if len > 40.0 {
            let u = [d[0] / len, d[1] / len];
            let mut n = [-u[1], u[0]];
            let mid = [(pa[0] + pc[0]) / 2.0, (pa[1] + pc[1]) / 2.0];
            let probe = view.site([mid[0] + n[0] * 10.0, mid[1] + n[1] * 10.0]);
            if grid.on_aquifer_side(probe) {
                n = [-n[0], -n[1]];
            }
            let label = format!("{} ({words})", b.name);
            let size = 12.0;
            let w = text_width(&label, size) + 8.0;
            let mut angle = u[1].atan2(u[0]).to_degrees();
            if angle > 90.0 {
                angle -= 180.0;
            } else if angle <= -90.0 {
                angle += 180.0;
            }
            let off = size * 0.5 + 5.0;
            for t in [0.5, 0.3, 0.7, 0.15, 0.85] {
                let p = [pa[0] + d[0] * t + n[0] * off, pa[1] + d[1] * t + n[1] * off];
                let (hw, hh) = rotated_half_extent(w, size + 4.0, angle);
                let bx = [p[0] - hw, p[1] - hh, p[0] + hw, p[1] + hh];
                if inside(bx, area) && occ.free(bx) {
                    occ.take(bx);
                    g = g.add(halo(
                        text(0.0, size * 0.35, size, label)
                            .set("text-anchor", "middle")
                            .set("fill", colour)
                            .set("font-weight", "bold")
                            .set(
                                "transform",
                                format!(
                                    "translate({} {}) rotate({})",
                                    r1(p[0]),
                                    r1(p[1]),
                                    r1(angle)
                                ),
                            ),
                    ));
                    break;
                }
            }
        }
        lay.boundaries = std::mem::replace(&mut lay.boundaries, group("boundaries")).add(g);
    }
}

pub(super) fn draw_dry(lay: &mut Layers, grid: &LevelGrid, view: &View) {
    let mp = grid.dry_area();
    if mp.0.is_empty() {
        return;
    }
    let d = multipolygon_data(view, &mp);
    lay.dry = std::mem::replace(&mut lay.dry, group("dry-area"))
        .set("clip-path", lay.plan_clip.clone())
        .add(Path::new().set("d", d.clone()).set("fill", "#efe3d0"))
        .add(
            Path::new()
                .set("d", d)
                .set("fill", "url(#hatch-dry)")
                .set("stroke", "#6b4e2e")
                .set("stroke-width", 1),
        );
}
