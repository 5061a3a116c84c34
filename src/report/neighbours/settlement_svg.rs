//! `settlement.svg`: settlement bands under each neighbour (from its own soil profile and the
//! drawdown there), drawdown isolines for context, the excavations and the wells, each
//! building outlined in its status colour, with scale bar, north arrow, legend, method and
//! caution.

use crate::check::run::CheckRun;
use crate::findings::settlement_grid::SettlementGrid;
use crate::report::neighbours::settlement_plot::{
    fmt_step, fmt_value, label, nice_step, path_data, polyline_data, ramp, Grid, View, FOOT_H,
    MARGIN, PANEL_W, PLOT_W, TITLE_H,
};
use crate::report::neighbours::status::status_colour;
use crate::report::neighbours::text::{ratio_text, truncate};
use crate::report::{wrap, CAUTION};
use crate::safety::neighbours::{NeighbourResult, Status};
use svg::node::element::{Circle, ClipPath, Definitions, Group, Line, Path as SvgPath, Rectangle};
use svg::Document;

/// `settlement.svg`: settlement bands under each neighbour (from its own soil profile and the
/// drawdown there), drawdown isolines for context, the excavation and the wells, each building
/// outlined in its status colour.
pub fn settlement_svg(
    run: &CheckRun,
    results: &[NeighbourResult],
    settlement: &[SettlementGrid],
) -> String {
    let model = run.model;
    let u = model.units;
    let us = u == crate::input::units::UnitSystem::Us;
    let lu = u.length_unit();
    // Settlement in mm (SI) or inches (US): 1 in = 0.0254 m (NIST SP 811, App. B).
    let (sc, su) = if us {
        (1.0 / 0.0254, "in")
    } else {
        (1e3, "mm")
    };
    let aq = run.field.aquifer();
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    // Extent: neighbours and excavations, and wells.
    let mut xs = Vec::new();
    let mut ys = Vec::new();
    for n in &model.neighbours {
        for c in &n.footprint.exterior().0 {
            xs.push(c.x);
            ys.push(c.y);
        }
    }
    for e in &model.excavations {
        for c in &e.outline.exterior().0 {
            xs.push(c.x);
            ys.push(c.y);
        }
    }
    for w in &run.placement.wells {
        xs.push(w.position[0]);
        ys.push(w.position[1]);
    }
    let fold = |v: &[f64], f: fn(f64, f64) -> f64, init: f64| v.iter().copied().fold(init, f);
    let (mut xmin, mut xmax) = (
        fold(&xs, f64::min, f64::INFINITY),
        fold(&xs, f64::max, f64::NEG_INFINITY),
    );
    let (mut ymin, mut ymax) = (
        fold(&ys, f64::min, f64::INFINITY),
        fold(&ys, f64::max, f64::NEG_INFINITY),
    );
    if !(xmin.is_finite() && ymin.is_finite()) {
        (xmin, xmax, ymin, ymax) = (0.0, 1.0, 0.0, 1.0);
    }
    let pad = 0.08 * (xmax - xmin).max(ymax - ymin).max(1.0);
    xmin -= pad;
    xmax += pad;
    ymin -= pad;
    ymax += pad;
    let scale = PLOT_W / (xmax - xmin);
    let plot_h = ((ymax - ymin) * scale).clamp(300.0, 900.0);
    let scale = scale.min(plot_h / (ymax - ymin));
    let view = View {
        x0: xmin,
        y1: ymax,
        scale,
    };
    let width = MARGIN * 2.0 + PLOT_W + PANEL_W;
    let height = TITLE_H + plot_h + FOOT_H;

    // Settlement grids under each neighbour with a profile (computed in the findings).
    let mut grids: Vec<(usize, Grid)> = Vec::new();
    let mut max_rho: f64 = 0.0;
    for g in settlement {
        let values: Vec<f64> = g.settlement_m.iter().map(|s| s * sc).collect();
        max_rho = values.iter().copied().fold(max_rho, f64::max);
        grids.push((
            g.neighbour,
            Grid {
                x0: g.x0,
                y0: g.y0,
                h: g.h,
                nx: g.nx,
                ny: g.ny,
                values,
            },
        ));
    }
    let step = nice_step(max_rho, 8);
    let n_bands = ((max_rho / step).ceil() as usize).max(1);
    let thresholds: Vec<f64> = (0..=n_bands).map(|k| k as f64 * step).collect();

    let mut doc = Document::new()
        .set("xmlns", "http://www.w3.org/2000/svg")
        .set("width", format!("{width:.0}"))
        .set("height", format!("{height:.0}"))
        .set("viewBox", format!("0 0 {width:.0} {height:.0}"));
    doc = doc.add(
        Rectangle::new()
            .set("width", "100%")
            .set("height", "100%")
            .set("fill", "#ffffff"),
    );
    doc = doc.add(
        label(
            MARGIN,
            26.0,
            17.0,
            &format!("Settlement of neighbours from dewatering — {}", model.name),
        )
        .set("font-weight", "bold"),
    );
    doc = doc.add(label(MARGIN, 45.0, 11.5, &format!("Bands: settlement ({su}) under each building from its own soil profile (1D consolidation). Grey dashed lines: drawdown ({lu}).")));
    doc = doc.add(
        Rectangle::new()
            .set("x", MARGIN)
            .set("y", TITLE_H)
            .set("width", PLOT_W)
            .set("height", format!("{plot_h:.1}"))
            .set("fill", "#f7f7f4")
            .set("stroke", "#999"),
    );

    // Clip paths for the footprints.
    let mut defs = Definitions::new();
    for (i, n) in model.neighbours.iter().enumerate() {
        let pts: Vec<[f64; 2]> = n
            .footprint
            .exterior()
            .0
            .iter()
            .map(|c| [c.x, c.y])
            .collect();
        defs = defs.add(
            ClipPath::new()
                .set("id", format!("fp{i}"))
                .add(SvgPath::new().set("d", polyline_data(&pts, &view, true))),
        );
    }
    defs = defs.add(
        ClipPath::new().set("id", "plot").add(
            Rectangle::new()
                .set("x", MARGIN)
                .set("y", TITLE_H)
                .set("width", PLOT_W)
                .set("height", format!("{plot_h:.1}")),
        ),
    );
    doc = doc.add(defs);

    // Drawdown isolines over the whole plot, for context.
    let nxd = 120usize;
    let hd = (xmax - xmin) / (nxd - 1) as f64;
    let nyd = ((ymax - ymin) / hd).ceil() as usize + 1;
    let dpts = Grid::points(xmin, ymin, hd, nxd, nyd);
    let dvals: Vec<f64> = run
        .field
        .levels(&dpts, &rates)
        .iter()
        .map(|lv| aq.initial_level - lv.or_base(aq.base_level))
        .collect();
    let dmax = dvals.iter().copied().fold(0.0f64, f64::max);
    let dstep = nice_step(dmax, 10);
    let dgrid = Grid {
        x0: xmin,
        y0: ymin,
        h: hd,
        nx: nxd,
        ny: nyd,
        values: dvals,
    };
    let dthr: Vec<f64> = (1..=((dmax / dstep).floor() as usize).min(40))
        .map(|k| k as f64 * dstep)
        .collect();
    let mut context = Group::new().set("clip-path", "url(#plot)");
    if let Ok(lines) = dgrid.builder().lines(&dgrid.values, &dthr) {
        for line in lines {
            let mut d = String::new();
            for ls in &line.geometry().0 {
                let pts: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
                d.push_str(&polyline_data(&pts, &view, false));
            }
            context = context.add(
                SvgPath::new()
                    .set("d", d)
                    .set("fill", "none")
                    .set("stroke", "#8c8c8c")
                    .set("stroke-width", 0.8)
                    .set("stroke-dasharray", "4 3"),
            );
            // Label the longest piece at the vertex nearest its middle that is well inside the
            // plot.
            let inside = |c: &geo::Coord<f64>| {
                let (x, y) = view.p(c.x, c.y);
                x > MARGIN + 30.0
                    && x < MARGIN + PLOT_W - 60.0
                    && y > TITLE_H + 30.0
                    && y < TITLE_H + plot_h - 30.0
            };
            let longest = line.geometry().0.iter().max_by_key(|ls| ls.0.len());
            if let Some(c) = longest.and_then(|ls| {
                let mid = ls.0.len() / 2;
                (0..ls.0.len())
                    .map(|k| (k as isize - mid as isize).unsigned_abs())
                    .zip(ls.0.iter())
                    .filter(|(_, c)| inside(c))
                    .min_by_key(|(d, _)| *d)
                    .map(|(_, c)| *c)
            }) {
                let (x, y) = view.p(c.x, c.y);
                context = context.add(
                    label(
                        x + 2.0,
                        y - 2.0,
                        9.0,
                        &if us {
                            format!("{:.1} {lu}", u.length(line.threshold()))
                        } else {
                            format!("{} m", fmt_value(line.threshold(), dstep))
                        },
                    )
                    .set("fill", "#6f6f6f"),
                );
            }
        }
    }
    doc = doc.add(context);

    // Excavations.
    for e in &model.excavations {
        let pts: Vec<[f64; 2]> = e.outline.exterior().0.iter().map(|c| [c.x, c.y]).collect();
        doc = doc.add(
            SvgPath::new()
                .set("d", polyline_data(&pts, &view, true))
                .set("fill", "#d9d4c7")
                .set("stroke", "#5b5548")
                .set("stroke-width", 1.5),
        );
        if let Some(c) = geo::InteriorPoint::interior_point(&e.outline) {
            let (x, y) = view.p(c.x(), c.y());
            doc = doc.add(
                label(x, y, 12.0, &e.name)
                    .set("text-anchor", "middle")
                    .set("fill", "#3d3a33"),
            );
        }
    }

    // Settlement bands, clipped to each footprint.
    for (i, g) in &grids {
        let mut group = Group::new().set("clip-path", format!("url(#fp{i})"));
        if let Ok(bands) = g.builder().isobands(&g.values, &thresholds) {
            for b in bands {
                let mid = 0.5 * (b.min_v() + b.max_v());
                group = group.add(
                    SvgPath::new()
                        .set("d", path_data(b.geometry(), &view))
                        .set("fill", ramp(mid / (n_bands as f64 * step)))
                        .set("fill-rule", "evenodd")
                        .set("stroke", "none"),
                );
            }
        }
        let inner: Vec<f64> = thresholds[1..].to_vec();
        if let Ok(lines) = g.builder().lines(&g.values, &inner) {
            for line in lines {
                let mut d = String::new();
                for ls in &line.geometry().0 {
                    let pts: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
                    d.push_str(&polyline_data(&pts, &view, false));
                }
                group = group.add(
                    SvgPath::new()
                        .set("d", d)
                        .set("fill", "none")
                        .set("stroke", "#4a2a1a")
                        .set("stroke-width", 0.6),
                );
            }
        }
        doc = doc.add(group);
    }

    // Footprints in status colour, with labels.
    for (i, r) in results.iter().enumerate() {
        let colour = status_colour(r.status);
        doc = doc.add(
            SvgPath::new()
                .set("d", polyline_data(&r.footprint, &view, true))
                .set("fill", "none")
                .set("stroke", colour)
                .set("stroke-width", 2.5),
        );
        let top = r
            .footprint
            .iter()
            .fold(f64::NEG_INFINITY, |m, p| m.max(p[1]));
        let left = r.footprint.iter().fold(f64::INFINITY, |m, p| m.min(p[0]));
        let (x, y) = view.p(left, top);
        let rho = r
            .worst_settlement
            .as_ref()
            .and_then(|s| s.settlement_m)
            .map_or("no profile".into(), |s| format!("max {:.1} {su}", s * sc));
        let words = format!("{} — {} — {}", r.name, rho, r.status.word());
        // Keep the label inside the plot (about 0.6 em a character).
        let width = words.chars().count() as f64 * 11.0 * 0.6;
        let x = x.min(MARGIN + PLOT_W - width - 4.0).max(MARGIN + 4.0);
        let y = if y - 5.0 < TITLE_H + 12.0 {
            y + 16.0
        } else {
            y
        };
        doc = doc.add(
            label(x, y - 5.0, 11.0, &words)
                .set("fill", colour)
                .set("font-weight", "bold"),
        );
        if let Some(s) = &r.worst_settlement {
            let (px, py) = view.p(s.position[0], s.position[1]);
            doc = doc.add(
                Circle::new()
                    .set("cx", format!("{px:.1}"))
                    .set("cy", format!("{py:.1}"))
                    .set("r", 3.0)
                    .set("fill", "none")
                    .set("stroke", "#000")
                    .set("stroke-width", 1.2)
                    .set("data-neighbour", i),
            );
        }
    }

    // Wells: abstraction filled, recharge open with a ring.
    for w in &run.placement.wells {
        let (x, y) = view.p(w.position[0], w.position[1]);
        let c = Circle::new()
            .set("cx", format!("{x:.1}"))
            .set("cy", format!("{y:.1}"))
            .set("r", 3.5);
        doc = doc.add(if w.rate < 0.0 {
            c.set("fill", "#ffffff")
                .set("stroke", "#1f6fb2")
                .set("stroke-width", 2.0)
        } else {
            c.set("fill", "#1f3b57")
        });
    }

    // Scale bar and north arrow.
    let bar = nice_step(u.length(xmax - xmin) / 6.0, 1);
    let (bx, by) = (MARGIN + 12.0, TITLE_H + 22.0);
    doc = doc.add(
        Line::new()
            .set("x1", bx)
            .set("y1", by)
            .set("x2", format!("{:.1}", bx + bar / u.length(1.0) * scale))
            .set("y2", by)
            .set("stroke", "#222")
            .set("stroke-width", 2.0),
    );
    doc = doc.add(label(bx, by - 4.0, 10.0, &format!("{bar:.0} {lu}")));
    let (nx0, ny0) = (MARGIN + PLOT_W - 22.0, TITLE_H + 16.0);
    doc = doc.add(
        SvgPath::new()
            .set("d", format!("M{nx0:.1},{ny0:.1} l-6,16 l6,-5 l6,5 Z",))
            .set("fill", "#222"),
    );
    doc = doc.add(label(nx0 - 4.0, ny0 + 28.0, 10.0, "N"));

    // Legend panel.
    let lx = MARGIN * 1.5 + PLOT_W;
    let mut ly = TITLE_H + 6.0;
    doc =
        doc.add(label(lx, ly + 8.0, 12.0, &format!("settlement, {su}")).set("font-weight", "bold"));
    ly += 18.0;
    for k in (0..n_bands).rev() {
        let mid = (k as f64 + 0.5) * step;
        doc = doc.add(
            Rectangle::new()
                .set("x", lx)
                .set("y", format!("{ly:.1}"))
                .set("width", 22.0)
                .set("height", 14.0)
                .set("fill", ramp(mid / (n_bands as f64 * step)))
                .set("stroke", "#888")
                .set("stroke-width", 0.5),
        );
        doc = doc.add(label(
            lx + 28.0,
            ly + 11.0,
            10.5,
            &format!(
                "{} – {}",
                fmt_step(k as f64 * step),
                fmt_step((k + 1) as f64 * step)
            ),
        ));
        ly += 15.0;
    }
    ly += 12.0;
    doc = doc.add(label(lx, ly, 12.0, "buildings").set("font-weight", "bold"));
    for (what, st) in [
        ("within limits", Status::Pass),
        ("within, ≥ 80 % of a limit", Status::Close),
        ("over a limit", Status::Fail),
        ("nothing to check", Status::NotChecked),
    ] {
        ly += 17.0;
        doc = doc.add(
            Rectangle::new()
                .set("x", lx)
                .set("y", format!("{:.1}", ly - 10.0))
                .set("width", 22.0)
                .set("height", 12.0)
                .set("fill", "none")
                .set("stroke", status_colour(st))
                .set("stroke-width", 2.5),
        );
        doc = doc.add(label(lx + 28.0, ly, 10.5, what));
    }
    ly += 22.0;
    doc = doc.add(label(lx, ly, 12.0, "wells").set("font-weight", "bold"));
    ly += 16.0;
    doc = doc.add(
        Circle::new()
            .set("cx", lx + 8.0)
            .set("cy", format!("{:.1}", ly - 4.0))
            .set("r", 3.5)
            .set("fill", "#1f3b57"),
    );
    doc = doc.add(label(lx + 28.0, ly, 10.5, "abstraction"));
    ly += 16.0;
    doc = doc.add(
        Circle::new()
            .set("cx", lx + 8.0)
            .set("cy", format!("{:.1}", ly - 4.0))
            .set("r", 3.5)
            .set("fill", "#fff")
            .set("stroke", "#1f6fb2")
            .set("stroke-width", 2.0),
    );
    doc = doc.add(label(lx + 28.0, ly, 10.5, "recharge"));
    ly += 16.0;
    doc = doc.add(
        Circle::new()
            .set("cx", lx + 8.0)
            .set("cy", format!("{:.1}", ly - 4.0))
            .set("r", 3.0)
            .set("fill", "none")
            .set("stroke", "#000")
            .set("stroke-width", 1.2),
    );
    doc = doc.add(label(lx + 28.0, ly, 10.5, "largest settlement"));
    ly += 24.0;
    for r in results {
        let line = match (&r.worst_settlement, r.max_distortion) {
            (Some(s), Some(b)) => format!(
                "{}: {:.1} {su}, β {}",
                truncate(&r.name, 18),
                s.settlement_m.unwrap_or(0.0) * sc,
                ratio_text(b)
            ),
            _ => format!(
                "{}: {:.2} {lu} drawdown",
                truncate(&r.name, 18),
                u.length(r.worst_drawdown.drawdown_m)
            ),
        };
        doc = doc.add(label(lx, ly, 10.0, &line).set("fill", status_colour(r.status)));
        ly += 14.0;
    }

    // Method and caution.
    let mut fy = TITLE_H + plot_h + 18.0;
    let method = format!(
        "Method: drawdown by superposition (Strack discharge potential); Δσ′ = γ_w·Δh below the lowered water level ({}); ρ = Σ m_v·Δσ′·Δz or C_c·H/(1+e₀)·log₁₀((σ′₀+Δσ′)/σ′₀). Limits marked * in the tables are rules of thumb (common practice, no source).",
        if model.neighbours.iter().any(|n| n.buoyancy_loss) {
            "buoyancy-loss form where chosen"
        } else {
            "simple form"
        }
    );
    for line in wrap(&method, 150, "").lines() {
        doc = doc.add(label(MARGIN, fy, 10.0, line).set("fill", "#333"));
        fy += 13.0;
    }
    for line in wrap(&format!("CAUTION: {CAUTION}"), 150, "").lines() {
        doc = doc.add(label(MARGIN, fy, 10.0, line).set("fill", "#8a1c1c"));
        fy += 13.0;
    }
    doc.to_string()
}
