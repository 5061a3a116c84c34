//! Charts of the programme: `hydrographs.svg` (water level against day at the named points and
//! neighbour corners, with the formation level of each stage as a step line), `wells.svg` (levels
//! in the wells) and `flow.svg` (total flow and cumulative volume against day). Stage starts and
//! the switch-off are marked by vertical lines.

use super::{wrap, CAUTION};
use crate::input::model::Model;
use crate::report::chart_axes::{label, ticks};
use crate::transient::answers::{ProgrammeAnswers, SeriesKind};
use crate::transient::programme::DAY;
use svg::node::element::{Group, Line, Path, Rectangle, Text};
use svg::Document;

const WIDTH: f64 = 960.0;
const HEIGHT: f64 = 620.0;
const LEFT: f64 = 80.0;
const RIGHT: f64 = 250.0;
const TOP: f64 = 60.0;
const PLOT_H: f64 = 420.0;
const COLOURS: [&str; 10] = [
    "#1f4e79", "#d1495b", "#2a9d8f", "#e9c46a", "#6a4c93", "#f4a261", "#264653", "#8ab17d",
    "#b5838d", "#577590",
];

fn r1(v: f64) -> String {
    format!("{v:.1}")
}

fn text(x: f64, y: f64, size: f64, anchor: &str, content: impl Into<String>) -> Text {
    Text::new(content.into())
        .set("x", r1(x))
        .set("y", r1(y))
        .set("font-size", size)
        .set("text-anchor", anchor)
        .set("font-family", "sans-serif")
}

struct Series<'a> {
    name: String,
    values: &'a [f64],
    dashed: bool,
}

/// A line chart of `series` against day with a legend on the right.
fn chart(
    title: &str,
    y_label: &str,
    days: &[f64],
    series: &[Series],
    steps: &[(f64, f64, String)],
    marks: &[(f64, String)],
) -> String {
    let plot_w = WIDTH - LEFT - RIGHT;
    let finite = |v: &&f64| v.is_finite();
    let mut lo = series
        .iter()
        .flat_map(|s| s.values.iter().filter(finite))
        .fold(f64::INFINITY, |a, b| a.min(*b));
    let mut hi = series
        .iter()
        .flat_map(|s| s.values.iter().filter(finite))
        .fold(f64::NEG_INFINITY, |a, b| a.max(*b));
    for (_, v, _) in steps {
        lo = lo.min(*v);
        hi = hi.max(*v);
    }
    if !(lo.is_finite() && hi.is_finite()) {
        lo = 0.0;
        hi = 1.0;
    }
    if hi - lo < 1e-6 {
        hi = lo + 1.0;
    }
    let pad = 0.05 * (hi - lo);
    let (lo, hi) = (lo - pad, hi + pad);
    let x_max = days.last().copied().unwrap_or(1.0).max(1e-6);
    let xs = |d: f64| LEFT + d / x_max * plot_w;
    let ys = |v: f64| TOP + PLOT_H - (v - lo) / (hi - lo) * PLOT_H;
    let mut doc = Document::new()
        .set("viewBox", (0, 0, WIDTH, HEIGHT))
        .set("width", WIDTH)
        .set("height", HEIGHT)
        .add(
            Rectangle::new()
                .set("width", WIDTH)
                .set("height", HEIGHT)
                .set("fill", "white"),
        )
        .add(text(WIDTH / 2.0 - RIGHT / 2.0, 30.0, 16.0, "middle", title));
    let mut grid = Group::new()
        .set("stroke", "#dddddd")
        .set("stroke-width", 0.6);
    let mut labels = Group::new();
    for v in ticks(lo, hi, 8) {
        grid = grid.add(
            Line::new()
                .set("x1", r1(LEFT))
                .set("x2", r1(LEFT + plot_w))
                .set("y1", r1(ys(v)))
                .set("y2", r1(ys(v))),
        );
        labels = labels.add(text(LEFT - 6.0, ys(v) + 4.0, 11.0, "end", label(v)));
    }
    for d in ticks(0.0, x_max, 10) {
        grid = grid.add(
            Line::new()
                .set("x1", r1(xs(d)))
                .set("x2", r1(xs(d)))
                .set("y1", r1(TOP))
                .set("y2", r1(TOP + PLOT_H)),
        );
        labels = labels.add(text(xs(d), TOP + PLOT_H + 16.0, 11.0, "middle", label(d)));
    }
    doc = doc.add(grid).add(labels);
    doc = doc.add(text(
        LEFT + plot_w / 2.0,
        TOP + PLOT_H + 36.0,
        12.0,
        "middle",
        "days from the start of pumping",
    ));
    doc = doc.add(text(18.0, TOP + PLOT_H / 2.0, 12.0, "middle", y_label).set(
        "transform",
        format!("rotate(-90 18 {})", r1(TOP + PLOT_H / 2.0)),
    ));
    for (d, name) in marks {
        doc = doc
            .add(
                Line::new()
                    .set("x1", r1(xs(*d)))
                    .set("x2", r1(xs(*d)))
                    .set("y1", r1(TOP))
                    .set("y2", r1(TOP + PLOT_H))
                    .set("stroke", "#888888")
                    .set("stroke-dasharray", "4 3"),
            )
            .add(text(xs(*d) + 3.0, TOP + 12.0, 10.0, "start", name.clone()));
    }
    // Step line of the formation levels.
    if !steps.is_empty() {
        let mut dpath = String::new();
        for (k, (d0, v, _)) in steps.iter().enumerate() {
            let d1 = steps.get(k + 1).map_or(x_max, |s| s.0);
            dpath.push_str(&format!(
                "{}{} {} L{} {} ",
                if k == 0 { "M" } else { "L" },
                r1(xs(*d0)),
                r1(ys(*v)),
                r1(xs(d1)),
                r1(ys(*v))
            ));
        }
        doc = doc.add(
            Path::new()
                .set("d", dpath)
                .set("fill", "none")
                .set("stroke", "#000000")
                .set("stroke-width", 1.4)
                .set("stroke-dasharray", "7 4"),
        );
    }
    for (i, s) in series.iter().enumerate() {
        let colour = COLOURS[i % COLOURS.len()];
        let mut dpath = String::new();
        let mut pen = false;
        for (d, v) in days.iter().zip(s.values) {
            if v.is_finite() {
                dpath.push_str(&format!(
                    "{}{} {} ",
                    if pen { "L" } else { "M" },
                    r1(xs(*d)),
                    r1(ys(*v))
                ));
                pen = true;
            } else {
                pen = false;
            }
        }
        let mut p = Path::new()
            .set("d", dpath)
            .set("fill", "none")
            .set("stroke", colour)
            .set("stroke-width", 1.6);
        if s.dashed {
            p = p.set("stroke-dasharray", "3 2");
        }
        doc = doc.add(p);
    }
    // Legend.
    let lx = LEFT + plot_w + 16.0;
    let mut ly = TOP + 6.0;
    let shown = series.len().min(24);
    for (i, s) in series.iter().take(shown).enumerate() {
        doc = doc
            .add(
                Line::new()
                    .set("x1", r1(lx))
                    .set("x2", r1(lx + 22.0))
                    .set("y1", r1(ly))
                    .set("y2", r1(ly))
                    .set("stroke", COLOURS[i % COLOURS.len()])
                    .set("stroke-width", 2),
            )
            .add(text(lx + 28.0, ly + 4.0, 10.5, "start", s.name.clone()));
        ly += 16.0;
    }
    if series.len() > shown {
        doc = doc.add(text(
            lx,
            ly + 4.0,
            10.5,
            "start",
            format!("… and {} more (see programme.csv)", series.len() - shown),
        ));
        ly += 16.0;
    }
    if !steps.is_empty() {
        doc = doc
            .add(
                Line::new()
                    .set("x1", r1(lx))
                    .set("x2", r1(lx + 22.0))
                    .set("y1", r1(ly))
                    .set("y2", r1(ly))
                    .set("stroke", "#000000")
                    .set("stroke-dasharray", "7 4"),
            )
            .add(text(lx + 28.0, ly + 4.0, 10.5, "start", "formation level"));
    }
    let mut y = TOP + PLOT_H + 60.0;
    for line in wrap(&format!("CAUTION: {CAUTION}"), 150, "").lines() {
        doc = doc.add(text(LEFT, y, 10.0, "start", line.to_string()));
        y += 13.0;
    }
    doc.to_string()
}

fn marks(model: &Model, a: &ProgrammeAnswers) -> Vec<(f64, String)> {
    let mut m: Vec<(f64, String)> = model
        .programme
        .iter()
        .flat_map(|p| &p.stages)
        .map(|s| (s.start / DAY, s.name.clone()))
        .collect();
    m.push((a.duration / DAY, "pumps off".into()));
    if let Some(l) = &a.steady {
        let end = a.times.last().copied().unwrap_or(a.duration);
        if l.t_star <= end {
            m.push((l.t_star / DAY, "t*: R(t) = steady R".into()));
        }
    }
    m
}

/// The three charts: (file name, SVG text).
pub fn charts(model: &Model, a: &ProgrammeAnswers) -> Vec<(String, Vec<u8>)> {
    let days: Vec<f64> = a.times.iter().map(|t| t / DAY).collect();
    let steps: Vec<(f64, f64, String)> = model
        .programme
        .iter()
        .flat_map(|p| &p.stages)
        .map(|s| (s.start / DAY, s.formation_level, s.name.clone()))
        .collect();
    let mk = |kinds: &[SeriesKind]| -> Vec<Series> {
        a.hydrographs
            .iter()
            .filter(|h| kinds.contains(&h.kind))
            .map(|h| Series {
                name: h.name.clone(),
                values: &h.levels,
                dashed: h.kind == SeriesKind::Neighbour,
            })
            .collect()
    };
    let marks = marks(model, a);
    let hyd = chart(
        &format!("{} — water level against time", model.name),
        "water level, m above datum",
        &days,
        &mk(&[SeriesKind::Point, SeriesKind::Neighbour]),
        &steps,
        &marks,
    );
    let mut floors: Vec<f64> = a.well_floors.clone();
    floors.sort_by(f64::total_cmp);
    floors.dedup_by(|x, y| (*x - *y).abs() < 1e-6);
    let floor_values: Vec<Vec<f64>> = floors.iter().map(|f| vec![*f; days.len()]).collect();
    let mut well_series = mk(&[SeriesKind::Well]);
    for (f, v) in floors.iter().zip(&floor_values) {
        well_series.push(Series {
            name: format!("lowest allowed {f:.2} m"),
            values: v,
            dashed: true,
        });
    }
    let warning = match a.well_breaches.iter().min_by(|x, y| x.time.total_cmp(&y.time)) {
        Some(b) => format!(
            " — WARNING: {} well(s) below the lowest allowed level while pumping (first {} on day {:.1})",
            a.well_breaches.len(),
            b.well,
            b.time / DAY
        ),
        None => String::new(),
    };
    let wells = chart(
        &format!(
            "{} — water level in the wells (after well loss){warning}",
            model.name
        ),
        "water level in well, m above datum",
        &days,
        &well_series,
        &steps,
        &marks,
    );
    let flow_ls: Vec<f64> = a.flows.iter().map(|q| q * 1e3).collect();
    let vol_k: Vec<f64> = a.volumes.iter().map(|v| v / 1e3).collect();
    let flow = chart(
        &format!(
            "{} — flow (L/s) and volume pumped (thousand m³)",
            model.name
        ),
        "L/s   |   thousand m³",
        &days,
        &[
            Series {
                name: "total flow, L/s".into(),
                values: &flow_ls,
                dashed: false,
            },
            Series {
                name: "volume so far, thousand m³".into(),
                values: &vol_k,
                dashed: true,
            },
        ],
        &[],
        &marks,
    );
    vec![
        ("hydrographs.svg".into(), hyd.into_bytes()),
        ("wells.svg".into(), wells.into_bytes()),
        ("flow.svg".into(), flow.into_bytes()),
    ]
}
