//! The wells on the plan: a red ring round any well over a limit, the symbols, and a label
//! with name and rate set outward from the nearest excavation, thinned where wellpoints crowd;
//! the count of labels left off goes to the legend.

use crate::check::run::CheckRun;
use crate::report::map::labels::{place, Occupied};
use crate::report::map::layers::{group, Layers};
use crate::report::map::page::{FAIL, FONT, INK, RECHARGE, WELL};
use crate::report::map::symbols::{well_radius, well_symbol};
use crate::report::map::text::{halo, r1, text, text_width};
use crate::report::map::view::View;
use geo::Centroid;
use svg::node::element::Group;

/// Draw wells and their labels; returns how many labels did not fit.
pub(super) fn draw_wells(
    lay: &mut Layers,
    run: &CheckRun,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
    only: Option<[f64; 4]>,
) -> usize {
    let r = well_radius(run, view);
    let shown = |p: [f64; 2]| {
        only.is_none_or(|w| p[0] >= w[0] && p[0] <= w[2] && p[1] >= w[1] && p[1] <= w[3])
    };
    let centres: Vec<[f64; 2]> = run
        .model
        .excavations
        .iter()
        .filter_map(|e| e.outline.centroid().map(|c| [c.x(), c.y()]))
        .collect();
    // Symbols first, so labels keep clear of every symbol.
    let mut symbols = Group::new().set("id", format!("{}well-symbols", lay.prefix));
    let mut over = Group::new().set("id", format!("{}wells-over-limit", lay.prefix));
    for (i, w) in run.placement.wells.iter().enumerate() {
        if !shown(w.position) {
            continue;
        }
        let p = view.px(w.position);
        let trouble = run
            .evaluation
            .wells
            .get(i)
            .is_some_and(|res| !res.problems.is_empty());
        if trouble {
            over = over.add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1(r + 3.0))
                    .set("fill", "none")
                    .set("stroke", FAIL)
                    .set("stroke-width", 2),
            );
        }
        occ.take([
            p[0] - r - 1.0,
            p[1] - r - 1.0,
            p[0] + r + 1.0,
            p[1] + r + 1.0,
        ]);
        let recharge = w.rate < 0.0;
        if crate::optimise::standby::is_standby(w) {
            // A standby well: a hollow symbol, not drawn as pumping.
            symbols = symbols.add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1(r))
                    .set("fill", "white")
                    .set("stroke", WELL)
                    .set("stroke-width", 1.5)
                    .set("stroke-dasharray", "3 2")
                    .set("class", "well standby"),
            );
            continue;
        }
        symbols = symbols.add(well_symbol(p, r, recharge).set(
            "class",
            if recharge {
                "well recharge"
            } else {
                "well pumping"
            },
        ));
    }
    let mut labels = Group::new()
        .set("id", format!("{}well-labels", lay.prefix))
        .set("font-family", FONT)
        .set("text-anchor", "middle");
    let mut omitted = 0;
    let (s1, s2) = (11.0, 10.0);
    // Where symbols crowd (a line of wellpoints), label only wells at least this far apart.
    let dense = r < 3.0;
    let mut labelled: Vec<[f64; 2]> = Vec::new();
    for w in run.placement.wells.iter().filter(|w| shown(w.position)) {
        let p = view.px(w.position);
        if dense
            && labelled
                .iter()
                .any(|q| (q[0] - p[0]).hypot(q[1] - p[1]) < 140.0)
        {
            omitted += 1;
            continue;
        }
        let name = w.name.clone();
        let rate = if crate::optimise::standby::is_standby(w) {
            "standby".to_string()
        } else {
            crate::report::map::text::rate_text_in(w.rate, run.model.units)
        };
        let bw = text_width(&name, s1).max(text_width(&rate, s2)) + 4.0;
        let bh = s1 + s2 + 4.0;
        let cands = label_candidates(w.position, p, &centres, r, [bw, bh]);
        match place(occ, area, bw, bh, &cands) {
            Some(c) => {
                labelled.push(p);
                let top = c[1] - bh / 2.0;
                let fill = if w.rate < 0.0 { RECHARGE } else { WELL };
                labels = labels.add(
                    Group::new()
                        .set("class", "well-label")
                        .add(halo(
                            text(c[0], top + s1, s1, name)
                                .set("font-weight", "bold")
                                .set("fill", fill),
                        ))
                        .add(halo(
                            text(c[0], top + s1 + s2 + 2.0, s2, rate).set("fill", INK),
                        )),
                );
            }
            None => omitted += 1,
        }
    }
    lay.wells = std::mem::replace(&mut lay.wells, group("wells"))
        .add(over)
        .add(symbols)
        .add(labels);
    omitted
}

/// Where a well's label box (`size` w × h, px) may go, best first: outward from the nearest
/// excavation centre, then round the compass in eighths, the box's near edge just off the
/// symbol of radius `r` at page point `p`.
fn label_candidates(
    position: [f64; 2],
    p: [f64; 2],
    centres: &[[f64; 2]],
    r: f64,
    [bw, bh]: [f64; 2],
) -> Vec<[f64; 2]> {
    let c = centres
        .iter()
        .min_by(|a, b| {
            let da = (a[0] - position[0]).hypot(a[1] - position[1]);
            let db = (b[0] - position[0]).hypot(b[1] - position[1]);
            da.total_cmp(&db)
        })
        .copied()
        .unwrap_or(position);
    let mut dir = [position[0] - c[0], -(position[1] - c[1])];
    let l = dir[0].hypot(dir[1]);
    dir = if l > 1e-9 {
        [dir[0] / l, dir[1] / l]
    } else {
        [0.0, -1.0]
    };
    let base = dir[1].atan2(dir[0]);
    let mut cands = Vec::new();
    for k in [0.0, 1.0, -1.0, 2.0, -2.0, 3.0, -3.0, 4.0] {
        let a = base + k * std::f64::consts::FRAC_PI_4;
        let (sa, ca) = a.sin_cos();
        // Box centre so that the box's near edge sits just off the symbol.
        let gap = r + 3.0;
        let ex = ca * (gap + bw / 2.0);
        let ey = sa * (gap + bh / 2.0);
        cands.push([p[0] + ex, p[1] + ey]);
    }
    cands
}
