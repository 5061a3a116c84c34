//! `sweep.svg`: total flow and lowest margin against well count (ring) or spacing (line).
//!
//! Left axis: total flow in m³/day with one rate in every well and with individual rates
//! (filled markers where the layout meets every target within its limits, hollow where the
//! uniform rate it would need is beyond a well limit). Right axis: the lowest margin below target
//! with every well at the largest uniform rate its limits allow, with the zero line: above it
//! the layout has reserve, below it no uniform rate within the limits is enough.

use super::{wrap, CAUTION};
use crate::optimise::sweep::{Axis, Sweep};
use crate::report::chart_axes::{label, ticks};
use svg::node::element::{Circle, Group, Line, Path, Rectangle, Text};
use svg::Document;

const WIDTH: f64 = 920.0;
const HEIGHT: f64 = 600.0;
const LEFT: f64 = 90.0;
const RIGHT: f64 = 90.0;
const TOP: f64 = 64.0;
const PLOT_HEIGHT: f64 = 330.0;
const UNIFORM: &str = "#1f4e79";
const INDIVIDUAL: &str = "#2a9d8f";
const MARGIN: &str = "#d1495b";

fn r1(v: f64) -> String {
    format!("{:.1}", v)
}

fn text(x: f64, y: f64, size: f64, anchor: &str, content: impl Into<String>) -> Text {
    Text::new(content.into())
        .set("x", r1(x))
        .set("y", r1(y))
        .set("font-size", r1(size))
        .set("font-family", "Helvetica, Arial, sans-serif")
        .set("text-anchor", anchor)
        .set("fill", "#222")
}

fn polyline(points: &[(f64, f64)], colour: &str, dash: Option<&str>) -> Option<Path> {
    if points.len() < 2 {
        return None;
    }
    let d: String = points
        .iter()
        .enumerate()
        .map(|(i, (x, y))| format!("{}{},{}", if i == 0 { "M" } else { " L" }, r1(*x), r1(*y)))
        .collect();
    let mut p = Path::new()
        .set("d", d)
        .set("fill", "none")
        .set("stroke", colour)
        .set("stroke-width", 2);
    if let Some(dash) = dash {
        p = p.set("stroke-dasharray", dash);
    }
    Some(p)
}

/// The chart as SVG text.
pub fn render(title: &str, sweep: &Sweep) -> String {
    render_in(title, sweep, crate::input::units::UnitSystem::Si)
}

/// The sweep chart in `units`: flows in m³/day (SI) or US gpm, margins and spacings in m or ft.
pub fn render_in(title: &str, sweep: &Sweep, units: crate::input::units::UnitSystem) -> String {
    let us = units == crate::input::units::UnitSystem::Us;
    let plot_w = WIDTH - LEFT - RIGHT;
    let (x_of, x_name): (Box<dyn Fn(usize) -> f64>, &str) = match sweep.axis {
        Axis::Count => (
            Box::new(|i| sweep.trials[i].count as f64),
            "wells in the ring",
        ),
        Axis::Spacing => (
            Box::new(move |i| units.length(sweep.trials[i].spacing_m)),
            if us {
                "spacing along the line, ft"
            } else {
                "spacing along the line, m"
            },
        ),
    };
    let n = sweep.trials.len();
    let xs: Vec<f64> = (0..n).map(&x_of).collect();
    let (mut x_lo, mut x_hi) = xs
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), x| {
            (a.min(*x), b.max(*x))
        });
    if !x_lo.is_finite() {
        (x_lo, x_hi) = (0.0, 1.0);
    }
    if x_hi - x_lo < 1e-9 {
        x_lo -= 1.0;
        x_hi += 1.0;
    }
    // Flow scale: m³/s → m³/day, or → US gpm.
    let day = if us {
        crate::input::units::m3s_to_gpm(1.0)
    } else {
        86_400.0
    };
    let flows: Vec<f64> = sweep
        .trials
        .iter()
        .flat_map(|t| [t.uniform_total_m3_per_s, t.individual_total_m3_per_s])
        .flatten()
        .map(|q| q * day)
        .collect();
    let f_hi = flows.iter().fold(0.0f64, |a, b| a.max(*b)).max(1.0) * 1.08;
    let margins: Vec<f64> = sweep
        .trials
        .iter()
        .map(|t| units.length(t.lowest_margin_m))
        .collect();
    let m_lo = margins.iter().fold(0.0f64, |a, b| a.min(*b));
    let m_hi = margins.iter().fold(0.0f64, |a, b| a.max(*b));
    let pad = ((m_hi - m_lo) * 0.08).max(0.05);
    let (m_lo, m_hi) = (m_lo - pad, m_hi + pad);

    let px = |x: f64| LEFT + (x - x_lo) / (x_hi - x_lo) * plot_w;
    let py_flow = |f: f64| TOP + PLOT_HEIGHT - f / f_hi * PLOT_HEIGHT;
    let py_margin = |m: f64| TOP + PLOT_HEIGHT - (m - m_lo) / (m_hi - m_lo) * PLOT_HEIGHT;

    let mut doc = Document::new()
        .set("viewBox", (0, 0, WIDTH as i64, HEIGHT as i64))
        .set("width", WIDTH as i64)
        .set("height", HEIGHT as i64)
        .add(
            Rectangle::new()
                .set("width", "100%")
                .set("height", "100%")
                .set("fill", "white"),
        )
        .add(text(
            LEFT,
            28.0,
            17.0,
            "start",
            format!(
                "Flow and margin by {}",
                match sweep.axis {
                    Axis::Count => "well count",
                    Axis::Spacing => "wellpoint spacing",
                }
            ),
        ))
        .add(text(LEFT, 48.0, 12.0, "start", title.to_string()));

    // Grid, axes and ticks.
    let mut axes = Group::new().set("id", "axes");
    for f in ticks(0.0, f_hi, 6) {
        let y = py_flow(f);
        axes = axes
            .add(
                Line::new()
                    .set("x1", r1(LEFT))
                    .set("x2", r1(LEFT + plot_w))
                    .set("y1", r1(y))
                    .set("y2", r1(y))
                    .set("stroke", "#e4e4e4"),
            )
            .add(text(LEFT - 8.0, y + 4.0, 11.0, "end", label(f)));
    }
    for m in ticks(m_lo, m_hi, 6) {
        axes = axes.add(text(
            LEFT + plot_w + 8.0,
            py_margin(m) + 4.0,
            11.0,
            "start",
            label(m),
        ));
    }
    let x_ticks: Vec<f64> = match sweep.axis {
        Axis::Count => ticks(x_lo, x_hi, 10)
            .into_iter()
            .filter(|v| v.fract() == 0.0)
            .collect(),
        Axis::Spacing => ticks(x_lo, x_hi, 10),
    };
    for x in x_ticks {
        axes = axes
            .add(
                Line::new()
                    .set("x1", r1(px(x)))
                    .set("x2", r1(px(x)))
                    .set("y1", r1(TOP + PLOT_HEIGHT))
                    .set("y2", r1(TOP + PLOT_HEIGHT + 5.0))
                    .set("stroke", "#444"),
            )
            .add(text(
                px(x),
                TOP + PLOT_HEIGHT + 19.0,
                11.0,
                "middle",
                match sweep.axis {
                    Axis::Count => format!("{x:.0}"),
                    Axis::Spacing => label(x),
                },
            ));
    }
    axes = axes
        .add(
            Rectangle::new()
                .set("x", r1(LEFT))
                .set("y", r1(TOP))
                .set("width", r1(plot_w))
                .set("height", r1(PLOT_HEIGHT))
                .set("fill", "none")
                .set("stroke", "#444"),
        )
        .add(text(
            LEFT + plot_w / 2.0,
            TOP + PLOT_HEIGHT + 40.0,
            13.0,
            "middle",
            x_name,
        ))
        .add(
            text(
                0.0,
                0.0,
                13.0,
                "middle",
                if us {
                    "total flow, US gpm"
                } else {
                    "total flow, m³/day"
                },
            )
            .set(
                "transform",
                format!(
                    "translate({},{}) rotate(-90)",
                    r1(26.0),
                    r1(TOP + PLOT_HEIGHT / 2.0)
                ),
            ),
        )
        .add(
            text(
                0.0,
                0.0,
                13.0,
                "middle",
                if us {
                    "lowest margin below target, ft"
                } else {
                    "lowest margin below target, m"
                },
            )
            .set(
                "transform",
                format!(
                    "translate({},{}) rotate(90)",
                    r1(WIDTH - 24.0),
                    r1(TOP + PLOT_HEIGHT / 2.0)
                ),
            ),
        );
    doc = doc.add(axes);

    // Zero-margin line.
    let y0 = py_margin(0.0);
    doc = doc
        .add(
            Line::new()
                .set("x1", r1(LEFT))
                .set("x2", r1(LEFT + plot_w))
                .set("y1", r1(y0))
                .set("y2", r1(y0))
                .set("stroke", MARGIN)
                .set("stroke-width", 1)
                .set("stroke-dasharray", "2 3"),
        )
        .add(
            text(
                LEFT + plot_w - 6.0,
                if y0 - TOP < 16.0 { y0 + 14.0 } else { y0 - 5.0 },
                10.5,
                "end",
                "zero margin: below it no uniform rate within the limits is enough",
            )
            .set("fill", MARGIN),
        );

    // Series.
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|a, b| xs[*a].total_cmp(&xs[*b]));
    let mut series = Group::new().set("id", "series");
    let margin_pts: Vec<(f64, f64)> = order
        .iter()
        .map(|&i| {
            (
                px(xs[i]),
                py_margin(units.length(sweep.trials[i].lowest_margin_m)),
            )
        })
        .collect();
    if let Some(p) = polyline(&margin_pts, MARGIN, Some("6 4")) {
        series = series.add(p);
    }
    let uni: Vec<(f64, f64)> = order
        .iter()
        .filter_map(|&i| {
            let t = &sweep.trials[i];
            t.uniform_total_m3_per_s
                .filter(|_| t.uniform_met)
                .map(|q| (px(xs[i]), py_flow(q * day)))
        })
        .collect();
    let ind: Vec<(f64, f64)> = order
        .iter()
        .filter_map(|&i| {
            let t = &sweep.trials[i];
            t.individual_total_m3_per_s
                .filter(|_| t.individual_met)
                .map(|q| (px(xs[i]), py_flow(q * day)))
        })
        .collect();
    if let Some(p) = polyline(&uni, UNIFORM, None) {
        series = series.add(p);
    }
    if let Some(p) = polyline(&ind, INDIVIDUAL, None) {
        series = series.add(p);
    }
    for &i in &order {
        let t = &sweep.trials[i];
        let x = px(xs[i]);
        if let Some(q) = t.uniform_total_m3_per_s {
            let y = py_flow(q * day);
            series = series.add(
                Circle::new()
                    .set("cx", r1(x))
                    .set("cy", r1(y))
                    .set("r", 3.5)
                    .set("stroke", UNIFORM)
                    .set("stroke-width", 1.5)
                    .set("fill", if t.uniform_met { UNIFORM } else { "white" }),
            );
        }
        if let (Some(q), true) = (t.individual_total_m3_per_s, t.individual_met) {
            let y = py_flow(q * day);
            series = series.add(
                Rectangle::new()
                    .set("x", r1(x - 3.0))
                    .set("y", r1(y - 3.0))
                    .set("width", 6)
                    .set("height", 6)
                    .set("fill", INDIVIDUAL),
            );
        }
        series = series.add(
            Circle::new()
                .set("cx", r1(x))
                .set("cy", r1(py_margin(units.length(t.lowest_margin_m))))
                .set("r", 2.5)
                .set("fill", MARGIN),
        );
    }
    doc = doc.add(series);

    // Legend.
    let ly = TOP + PLOT_HEIGHT + 62.0;
    let mut legend = Group::new().set("id", "legend");
    let entries: [(&str, &str, &str); 4] = [
        (UNIFORM, "", "total flow, one rate in every well (filled: meets every target within the limits; hollow: that rate is beyond a well limit)"),
        (INDIVIDUAL, "", "total flow, individual rates (least total flow, linear programme), where every target is met"),
        (MARGIN, "6 4", "lowest margin below target with every well at the largest uniform rate its limits allow (right axis)"),
        (MARGIN, "2 3", "zero margin"),
    ];
    for (k, (colour, dash, words)) in entries.iter().enumerate() {
        let y = ly + 17.0 * k as f64;
        let mut l = Line::new()
            .set("x1", r1(LEFT))
            .set("x2", r1(LEFT + 28.0))
            .set("y1", r1(y - 4.0))
            .set("y2", r1(y - 4.0))
            .set("stroke", *colour)
            .set("stroke-width", 2);
        if !dash.is_empty() {
            l = l.set("stroke-dasharray", *dash);
        }
        legend = legend
            .add(l)
            .add(text(LEFT + 36.0, y, 11.0, "start", *words));
        let (mx, my) = (LEFT + 14.0, y - 4.0);
        legend = match k {
            0 => legend.add(
                Circle::new()
                    .set("cx", r1(mx))
                    .set("cy", r1(my))
                    .set("r", 3.5)
                    .set("stroke", UNIFORM)
                    .set("fill", UNIFORM),
            ),
            1 => legend.add(
                Rectangle::new()
                    .set("x", r1(mx - 3.0))
                    .set("y", r1(my - 3.0))
                    .set("width", 6)
                    .set("height", 6)
                    .set("fill", INDIVIDUAL),
            ),
            2 => legend.add(
                Circle::new()
                    .set("cx", r1(mx))
                    .set("cy", r1(my))
                    .set("r", 2.5)
                    .set("fill", MARGIN),
            ),
            _ => legend,
        };
    }
    doc = doc.add(legend);

    // Caution.
    let mut caution = Group::new().set("id", "caution");
    let lines = wrap(&format!("CAUTION: {CAUTION}"), 130, "");
    for (k, line) in lines.lines().enumerate() {
        caution = caution.add(
            text(
                LEFT,
                HEIGHT - 50.0 + 13.0 * k as f64,
                10.0,
                "start",
                line.to_string(),
            )
            .set("fill", "#555"),
        );
    }
    doc = doc.add(caution);
    doc.to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    // Tick steps are 1, 2, 2.5 or 5 × 10ᵏ and cover the range (a property that can fail).
    #[test]
    fn ticks_are_round_and_cover() {
        for (lo, hi) in [(0.0, 7300.0), (-0.83, 0.41), (3.0, 25.0), (1.0, 3.0)] {
            let t = ticks(lo, hi, 6);
            assert!(t.len() >= 3, "{lo}..{hi}: {t:?}");
            assert!(t.iter().all(|v| *v >= lo - 1e-9 && *v <= hi + 1e-9));
            let step = t[1] - t[0];
            let mant = step / 10f64.powf(step.log10().floor());
            assert!(
                [1.0, 2.0, 2.5, 5.0].iter().any(|m| (m - mant).abs() < 1e-9),
                "step {step}"
            );
        }
    }
}
