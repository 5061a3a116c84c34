//! `settlement.svg`: settlement bands under each neighbour (from its own soil profile and the
//! drawdown there), drawdown isolines for context, the excavations and the wells, each
//! building outlined in its status colour, with scale bar, north arrow, legend, method and
//! caution.

use crate::caution::CAUTION;
use crate::check::run::CheckRun;
use crate::input::model::Model;
use crate::input::units::UnitSystem;
use crate::report::neighbours::numbers::{ratio_text, truncate};
use crate::report::neighbours::settlement_plot::{
    fmt_step, fmt_value, label, nice_step, path_data, polyline_data, ramp, Grid, View, FOOT_GAP,
    FOOT_LINE, FOOT_PAD, MARGIN, PANEL_W, PLOT_W, TITLE_H,
};
use crate::report::neighbours::status::status_colour;
use crate::report::plot_kit::{caution_block, white_page};
use crate::report::words::wrap;
use crate::safety::neighbours::{NeighbourResult, Status};
use crate::safety::settlement_map::SettlementMap;
use svg::node::element::{Circle, ClipPath, Definitions, Group, Line, Path as SvgPath, Rectangle};
use svg::Document;

/// The page: units, picture transform and size, shared by every part of the drawing.
struct Page<'a> {
    model: &'a Model,
    units: UnitSystem,
    us: bool,
    lu: &'static str,
    /// Settlement: display units per metre and their name.
    sc: f64,
    su: &'static str,
    view: View,
    plot_h: f64,
    width: f64,
    height: f64,
    extent: [f64; 4],
    /// The method note under the plot, wrapped.
    method: Vec<String>,
}

/// Characters a footer line holds (10 px text across the page).
const FOOT_WRAP: usize = 150;

impl<'a> Page<'a> {
    fn new(run: &'a CheckRun, map: &SettlementMap) -> Page<'a> {
        let model = run.model;
        let u = model.units;
        let us = u == UnitSystem::Us;
        // Settlement in mm (SI) or inches (US): 1 in = 0.0254 m (NIST SP 811, App. B).
        let (sc, su) = if us {
            (1.0 / 0.0254, "in")
        } else {
            (1e3, "mm")
        };
        let [xmin, xmax, ymin, ymax] = map.extent;
        let scale = PLOT_W / (xmax - xmin);
        let plot_h = ((ymax - ymin) * scale).clamp(300.0, 900.0);
        let scale = scale.min(plot_h / (ymax - ymin));
        let method: Vec<String> = wrap(&method_note(model), FOOT_WRAP, "")
            .lines()
            .map(str::to_string)
            .collect();
        let caution_lines = wrap(&format!("CAUTION: {CAUTION}"), FOOT_WRAP, "")
            .lines()
            .count();
        let foot_h = FOOT_GAP + FOOT_LINE * (method.len() + caution_lines - 1) as f64 + FOOT_PAD;
        Page {
            model,
            units: u,
            us,
            lu: u.length_unit(),
            sc,
            su,
            view: View {
                x0: xmin,
                y1: ymax,
                scale,
            },
            plot_h,
            width: MARGIN * 2.0 + PLOT_W + PANEL_W,
            height: TITLE_H + plot_h + foot_h,
            extent: map.extent,
            method,
        }
    }
}

/// `settlement.svg`: settlement bands under each neighbour (from its own soil profile and the
/// drawdown there; at the end of the works when a duration is known), drawdown isolines for
/// context, the excavation and the wells, each building outlined in its status colour.
pub fn settlement_svg(run: &CheckRun, results: &[NeighbourResult], map: &SettlementMap) -> String {
    let pg = Page::new(run, map);
    let grids: Vec<(usize, Grid)> = map
        .under
        .iter()
        .map(|(i, g)| (*i, Grid::from_values(g, pg.sc)))
        .collect();
    let max_rho = grids
        .iter()
        .flat_map(|(_, g)| g.values.iter().copied())
        .fold(0.0_f64, f64::max);
    let step = nice_step(max_rho, 8);
    let n_bands = ((max_rho / step).ceil() as usize).max(1);
    let thresholds: Vec<f64> = (0..=n_bands).map(|k| k as f64 * step).collect();
    let mut doc = frame(&pg);
    doc = drawdown_context(doc, &pg, &Grid::from_values(&map.drawdown, 1.0));
    doc = excavations(doc, &pg);
    doc = settlement_bands(doc, &pg, &grids, &thresholds, n_bands, step);
    doc = footprints(doc, &pg, results);
    doc = wells_scale_north(doc, &pg, run);
    doc = legend(doc, &pg, results, n_bands, step);
    doc = method_and_caution(doc, &pg);
    doc.to_string()
}

/// Title, background, plot frame and the clip paths of the footprints and the plot.
fn frame(pg: &Page) -> Document {
    let (model, su, lu, plot_h, view) = (pg.model, pg.su, pg.lu, pg.plot_h, &pg.view);
    let (width, height) = (pg.width, pg.height);
    let mut doc = white_page(width.round(), height.round());
    doc = doc.add(
        label(
            MARGIN,
            26.0,
            17.0,
            &format!("Settlement of neighbours from dewatering — {}", model.name),
        )
        .set("font-weight", "bold"),
    );
    doc = doc.add(label(MARGIN, 45.0, 11.5, &format!("Bands: settlement ({su}) under each building from its own soil profile (1D consolidation; at the end of the works where a duration is known). Grey dashed lines: drawdown ({lu}).")));
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
                .set("id", format!("settle-fp{i}"))
                .add(SvgPath::new().set("d", polyline_data(&pts, view, true))),
        );
    }
    defs = defs.add(
        ClipPath::new().set("id", "settle-plot").add(
            Rectangle::new()
                .set("x", MARGIN)
                .set("y", TITLE_H)
                .set("width", PLOT_W)
                .set("height", format!("{plot_h:.1}")),
        ),
    );
    doc = doc.add(defs);

    doc
}

/// Drawdown isolines over the whole plot, for context, labelled on their longest piece.
fn drawdown_context(mut doc: Document, pg: &Page, dgrid: &Grid) -> Document {
    let (us, u, lu, plot_h, view) = (pg.us, pg.units, pg.lu, pg.plot_h, &pg.view);
    let dmax = dgrid.values.iter().copied().fold(0.0f64, f64::max);
    let dstep = nice_step(dmax, 10);
    let dthr: Vec<f64> = (1..=((dmax / dstep).floor() as usize).min(40))
        .map(|k| k as f64 * dstep)
        .collect();
    let mut context = Group::new().set("clip-path", "url(#settle-plot)");
    if let Ok(lines) = dgrid.builder().lines(&dgrid.values, &dthr) {
        for line in lines {
            let mut d = String::new();
            for ls in &line.geometry().0 {
                let pts: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
                d.push_str(&polyline_data(&pts, view, false));
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

    doc
}

/// The excavations, filled and named.
fn excavations(mut doc: Document, pg: &Page) -> Document {
    let (model, view) = (pg.model, &pg.view);
    // Excavations.
    for e in &model.excavations {
        let pts: Vec<[f64; 2]> = e.outline.exterior().0.iter().map(|c| [c.x, c.y]).collect();
        doc = doc.add(
            SvgPath::new()
                .set("d", polyline_data(&pts, view, true))
                .set("fill", "#d9d4c7")
                .set("stroke", "#5b5548")
                .set("stroke-width", 1.5),
        );
        // Name at the centroid, or the middle of the bounding box, whichever is inside (geo's
        // interior point sweeps every edge and trips its own assertion on dense outlines).
        let inside = |p: geo::Point<f64>| geo::Contains::contains(&e.outline, &p);
        let at = geo::Centroid::centroid(&e.outline)
            .filter(|p| inside(*p))
            .or_else(|| {
                geo::BoundingRect::bounding_rect(&e.outline)
                    .map(|b| geo::Point::from(b.center()))
                    .filter(|p| inside(*p))
            })
            .or_else(|| geo::Centroid::centroid(&e.outline));
        if let Some(c) = at {
            let (x, y) = view.p(c.x(), c.y());
            doc = doc.add(
                label(x, y, 12.0, &e.name)
                    .set("text-anchor", "middle")
                    .set("fill", "#3d3a33"),
            );
        }
    }

    doc
}

/// Settlement bands and their edges, clipped to each footprint.
fn settlement_bands(
    mut doc: Document,
    pg: &Page,
    grids: &[(usize, Grid)],
    thresholds: &[f64],
    n_bands: usize,
    step: f64,
) -> Document {
    let view = &pg.view;
    // Settlement bands, clipped to each footprint.
    for (i, g) in grids {
        let mut group = Group::new().set("clip-path", format!("url(#settle-fp{i})"));
        if let Ok(bands) = g.builder().isobands(&g.values, thresholds) {
            for b in bands {
                let mid = 0.5 * (b.min_v() + b.max_v());
                group = group.add(
                    SvgPath::new()
                        .set("d", path_data(b.geometry(), view))
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
                    d.push_str(&polyline_data(&pts, view, false));
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

    doc
}

/// Footprints in their status colour, labelled, with the largest settlement marked.
fn footprints(mut doc: Document, pg: &Page, results: &[NeighbourResult]) -> Document {
    let (su, sc, view) = (pg.su, pg.sc, &pg.view);
    // Footprints in status colour, with labels.
    for (i, r) in results.iter().enumerate() {
        let colour = status_colour(r.status);
        doc = doc.add(
            SvgPath::new()
                .set("d", polyline_data(&r.footprint, view, true))
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

    doc
}

/// Wells (abstraction filled, recharge open), the scale bar and the north arrow.
fn wells_scale_north(mut doc: Document, pg: &Page, run: &CheckRun) -> Document {
    let (u, lu, view) = (pg.units, pg.lu, &pg.view);
    let [xmin, xmax, _, _] = pg.extent;
    let scale = view.scale;
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

    doc
}

/// The legend panel: bands, building status, wells, and each building's numbers.
fn legend(
    mut doc: Document,
    pg: &Page,
    results: &[NeighbourResult],
    n_bands: usize,
    step: f64,
) -> Document {
    let (u, su, sc, lu) = (pg.units, pg.su, pg.sc, pg.lu);
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

    doc
}

/// The method note under the plot: how drawdown becomes settlement, and where the limits come
/// from.
fn method_note(model: &Model) -> String {
    format!(
        "Method: drawdown by superposition (Strack discharge potential); Δσ′ = Δu from the head drop at the top and base of each layer ({}); ρ = Σ m_v·Δσ′·Δz, or C_r to σ′_p and C_c beyond; U(T_v) of Terzaghi in time where c_v is given. Limits marked * in the tables are rules of thumb (common practice, no source).",
        if model.neighbours.iter().any(|n| n.buoyancy_loss) {
            "buoyancy-loss form where chosen"
        } else {
            "simple form"
        }
    )
}

/// The method note and the caution under the plot; the page's height leaves room for every
/// line of both.
fn method_and_caution(mut doc: Document, pg: &Page) -> Document {
    let mut fy = TITLE_H + pg.plot_h + FOOT_GAP;
    for line in &pg.method {
        doc = doc.add(label(MARGIN, fy, 10.0, line).set("fill", "#333"));
        fy += FOOT_LINE;
    }
    doc.add(caution_block(MARGIN, fy, 10.0, FOOT_LINE, FOOT_WRAP))
}
