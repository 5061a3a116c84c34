//! `sweep.svg`: total flow and lowest margin against well count (ring) or spacing (line).
//!
//! Left axis: total flow in m³/day with one rate in every well and with individual rates
//! (filled markers where the layout meets every target within its limits, hollow where the
//! uniform rate it would need is beyond a well limit). Right axis: the lowest margin below target
//! with every well at the largest uniform rate its limits allow, with the zero line: above it
//! the layout has reserve, below it no uniform rate within the limits is enough.

use crate::input::units::{m3s_to_gpm, UnitSystem};
use crate::optimise::sweep::{Axis, Sweep};
use crate::optimise::trial::Trial;
use crate::report::plot_kit::{
    caution_block, legend, line, r1, text, ticks, white_page, Frame, LegendRow,
};
use svg::node::element::{Circle, Group, Path, Rectangle};

const WIDTH: f64 = 920.0;
const HEIGHT: f64 = 600.0;
const LEFT: f64 = 90.0;
const RIGHT: f64 = 90.0;
const TOP: f64 = 64.0;
const PLOT_HEIGHT: f64 = 330.0;
const UNIFORM: &str = "#1f4e79";
const INDIVIDUAL: &str = "#2a9d8f";
const MARGIN: &str = "#d1495b";

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

/// Where everything goes: the frame (x and flow) and the margin's range on the right axis.
struct Scales {
    /// The plot: x across (count or spacing in the output unit), flow up.
    frame: Frame,
    /// The right axis's range, margin in the output length unit.
    margin: (f64, f64),
    /// m³/s → the flow unit drawn (m³/day or US gpm).
    flow_factor: f64,
    /// Each trial's x value.
    xs: Vec<f64>,
}

impl Scales {
    fn py_margin(&self, m: f64) -> f64 {
        let (lo, hi) = self.margin;
        TOP + PLOT_HEIGHT - (m - lo) / (hi - lo) * PLOT_HEIGHT
    }
    fn py_flow(&self, q_m3s: f64) -> f64 {
        self.frame.py(q_m3s * self.flow_factor)
    }
}

fn scales(sweep: &Sweep, units: UnitSystem) -> Scales {
    let xs: Vec<f64> = sweep
        .trials
        .iter()
        .map(|t| match sweep.axis {
            Axis::Count => t.count as f64,
            Axis::Spacing => units.length(t.spacing_m),
        })
        .collect();
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
    let flow_factor = match units {
        UnitSystem::Us => m3s_to_gpm(1.0),
        UnitSystem::Si => 86_400.0,
    };
    let f_hi = sweep
        .trials
        .iter()
        .flat_map(|t| [t.uniform_total_m3_per_s, t.individual_total_m3_per_s])
        .flatten()
        .fold(0.0f64, |a, q| a.max(q * flow_factor))
        .max(1.0)
        * 1.08;
    let margins = sweep.trials.iter().map(|t| units.length(t.lowest_margin_m));
    let (m_lo, m_hi) = margins.fold((0.0f64, 0.0f64), |(a, b), m| (a.min(m), b.max(m)));
    let pad = ((m_hi - m_lo) * 0.08).max(0.05);
    Scales {
        frame: Frame {
            left: LEFT,
            top: TOP,
            width: WIDTH - LEFT - RIGHT,
            height: PLOT_HEIGHT,
            x: (x_lo, x_hi),
            y: (0.0, f_hi),
        },
        margin: (m_lo - pad, m_hi + pad),
        flow_factor,
        xs,
    }
}

/// Grid, ticks on round values, the frame and the three axis titles.
fn axes(sc: &Scales, sweep: &Sweep, units: UnitSystem) -> Group {
    let fr = &sc.frame;
    let mut xt = ticks(fr.x.0, fr.x.1, 10);
    if sweep.axis == Axis::Count {
        // Well counts are whole.
        xt.values.retain(|v| v.fract() == 0.0);
    }
    let flow_t = ticks(fr.y.0, fr.y.1, 6);
    let margin_t = ticks(sc.margin.0, sc.margin.1, 6);
    let x_name = match sweep.axis {
        Axis::Count => "wells in the ring".to_string(),
        Axis::Spacing => format!("spacing along the line, {}", units.length_unit()),
    };
    let (flow_name, margin_name) = match units {
        UnitSystem::Us => ("total flow, US gpm", "lowest margin below target, ft"),
        UnitSystem::Si => ("total flow, m³/day", "lowest margin below target, m"),
    };
    Group::new()
        .set("id", "axes")
        .add(fr.grid(&xt, &flow_t))
        .add(fr.right_labels(&margin_t, |m| sc.py_margin(m)))
        .add(
            Rectangle::new()
                .set("x", r1(fr.left))
                .set("y", r1(fr.top))
                .set("width", r1(fr.width))
                .set("height", r1(fr.height))
                .set("fill", "none")
                .set("stroke", "#444"),
        )
        .add(fr.x_title(&x_name))
        .add(fr.y_title(flow_name, 26.0))
        .add(text(0.0, 0.0, 12.0, "middle", margin_name).set(
            "transform",
            format!(
                "translate({},{}) rotate(90)",
                r1(WIDTH - 24.0),
                r1(TOP + PLOT_HEIGHT / 2.0)
            ),
        ))
}

/// The zero-margin line across the plot, with its meaning.
fn zero_line(sc: &Scales) -> Group {
    let fr = &sc.frame;
    let y0 = sc.py_margin(0.0);
    Group::new()
        .add(
            line(fr.left, y0, fr.right(), y0)
                .set("stroke", MARGIN)
                .set("stroke-width", 1)
                .set("stroke-dasharray", "2 3"),
        )
        .add(
            text(
                fr.right() - 6.0,
                if y0 - TOP < 16.0 { y0 + 14.0 } else { y0 - 5.0 },
                10.5,
                "end",
                "zero margin: below it no uniform rate within the limits is enough",
            )
            .set("fill", MARGIN),
        )
}

fn uniform_marker(x: f64, y: f64, met: bool) -> Circle {
    Circle::new()
        .set("cx", r1(x))
        .set("cy", r1(y))
        .set("r", 3.5)
        .set("stroke", UNIFORM)
        .set("stroke-width", 1.5)
        .set("fill", if met { UNIFORM } else { "white" })
}

fn individual_marker(x: f64, y: f64) -> Rectangle {
    Rectangle::new()
        .set("x", r1(x - 3.0))
        .set("y", r1(y - 3.0))
        .set("width", 6)
        .set("height", 6)
        .set("fill", INDIVIDUAL)
}

fn margin_marker(x: f64, y: f64) -> Circle {
    Circle::new()
        .set("cx", r1(x))
        .set("cy", r1(y))
        .set("r", 2.5)
        .set("fill", MARGIN)
}

/// The three series: margin (dashed, right axis), flow with one rate and with individual
/// rates, each trial marked.
fn series(sc: &Scales, sweep: &Sweep, units: UnitSystem) -> Group {
    let mut order: Vec<usize> = (0..sweep.trials.len()).collect();
    order.sort_by(|a, b| sc.xs[*a].total_cmp(&sc.xs[*b]));
    let px = |i: usize| sc.frame.px(sc.xs[i]);
    let margin_y = |i: usize| sc.py_margin(units.length(sweep.trials[i].lowest_margin_m));
    let margin_pts: Vec<(f64, f64)> = order.iter().map(|&i| (px(i), margin_y(i))).collect();
    let flow_pts = |pick: fn(&Trial) -> Option<f64>| -> Vec<(f64, f64)> {
        order
            .iter()
            .filter_map(|&i| pick(&sweep.trials[i]).map(|q| (px(i), sc.py_flow(q))))
            .collect()
    };
    let uni = flow_pts(|t| t.uniform_total_m3_per_s.filter(|_| t.uniform_met));
    let ind = flow_pts(|t| t.individual_total_m3_per_s.filter(|_| t.individual_met));
    let mut g = Group::new().set("id", "series");
    for p in [
        polyline(&margin_pts, MARGIN, Some("6 4")),
        polyline(&uni, UNIFORM, None),
        polyline(&ind, INDIVIDUAL, None),
    ]
    .into_iter()
    .flatten()
    {
        g = g.add(p);
    }
    for &i in &order {
        let t = &sweep.trials[i];
        if let Some(q) = t.uniform_total_m3_per_s {
            g = g.add(uniform_marker(px(i), sc.py_flow(q), t.uniform_met));
        }
        if let (Some(q), true) = (t.individual_total_m3_per_s, t.individual_met) {
            g = g.add(individual_marker(px(i), sc.py_flow(q)));
        }
        g = g.add(margin_marker(px(i), margin_y(i)));
    }
    g
}

/// The legend under the plot, each row with its line and marker.
fn legend_rows() -> Group {
    let rows = [
        (UNIFORM, None, "total flow, one rate in every well (filled: meets every target within the limits; hollow: that rate is beyond a well limit)"),
        (INDIVIDUAL, None, "total flow, individual rates (least total flow, linear programme), where every target is met"),
        (MARGIN, Some("6 4"), "lowest margin below target with every well at the largest uniform rate its limits allow (right axis)"),
        (MARGIN, Some("2 3"), "zero margin"),
    ]
    .map(|(colour, dash, label)| LegendRow {
        colour: colour.to_string(),
        dash: dash.map(str::to_string),
        label: label.to_string(),
    });
    let ly = TOP + PLOT_HEIGHT + 58.0;
    let (mx, step) = (LEFT + 11.0, 17.0);
    legend(LEFT, ly, step, &rows)
        .set("id", "legend")
        .add(uniform_marker(mx, ly, true))
        .add(individual_marker(mx, ly + step))
        .add(margin_marker(mx, ly + 2.0 * step))
}

fn caution() -> Group {
    caution_block(LEFT, HEIGHT - 50.0, 10.0, 13.0, 130)
}

/// The chart as SVG text, SI.
pub fn render(title: &str, sweep: &Sweep) -> String {
    render_in(title, sweep, UnitSystem::Si)
}

/// The sweep chart in `units`: flows in m³/day (SI) or US gpm, margins and spacings in m or ft.
pub fn render_in(title: &str, sweep: &Sweep, units: UnitSystem) -> String {
    let sc = scales(sweep, units);
    let heading = format!(
        "Flow and margin by {}",
        match sweep.axis {
            Axis::Count => "well count",
            Axis::Spacing => "wellpoint spacing",
        }
    );
    white_page(WIDTH, HEIGHT)
        .add(text(LEFT, 28.0, 17.0, "start", heading))
        .add(text(LEFT, 48.0, 12.0, "start", title.to_string()))
        .add(axes(&sc, sweep, units))
        .add(zero_line(&sc))
        .add(series(&sc, sweep, units))
        .add(legend_rows())
        .add(caution())
        .to_string()
}
