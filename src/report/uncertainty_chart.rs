//! The charts of `drydig uncertainty`: for each output a histogram with its empirical CDF and
//! the P10 / P50 / P90 lines, and the tornado of one-at-a-time swings (each input at its P10 and
//! P90, the others at P50), in the user's units, drawn with the shared plot kit.

use super::plot_kit::{caution_block, line, text, ticks, white_page, Frame};
use super::uncertainty_text::output_number;
use crate::input::units::UnitSystem;
use crate::uncertainty::run::{Measure, Series, Swing};
use svg::node::element::{Group, Polyline, Rectangle};
use svg::Document;

const WIDTH: f64 = 760.0;
const HEIGHT: f64 = 470.0;
const LEFT: f64 = 80.0;
const BINS: usize = 24;

fn page(title: &str, subtitle: &str, height: f64) -> Document {
    white_page(WIDTH, height)
        .add(text(LEFT, 26.0, 16.0, "start", title.to_string()))
        .add(text(LEFT, 44.0, 11.0, "start", subtitle.to_string()))
}

fn caution(height: f64) -> Group {
    caution_block(LEFT, height - 40.0, 9.5, 12.0, 125)
}

fn unit_words(u: &str) -> String {
    u.replace("m3_per_day", "m³/day")
}

/// Histogram, CDF and percentile lines of `s` in `units`; `None` without values.
pub fn cdf_svg(site: &str, s: &Series, units: UnitSystem) -> Option<String> {
    let p = s.percentiles?;
    let conv = |v: f64| output_number(s.measure, v, units).0;
    let unit = unit_words(output_number(s.measure, 0.0, units).1);
    let mut v: Vec<f64> = s.values.iter().flatten().map(|x| conv(*x)).collect();
    v.sort_by(f64::total_cmp);
    // a long tail would squash the body: the axis stops at the 99th percentile, and says so
    let p99 = crate::uncertainty::stats::quantile_sorted(&v, 0.99);
    let clipped = conv(p.max) > p99 + 0.25 * (p99 - conv(p.min));
    let (lo, hi) = (conv(p.min), if clipped { p99 } else { conv(p.max) });
    let pad = ((hi - lo) * 0.05).max(hi.abs() * 1e-3).max(1e-9);
    let xt = ticks(lo - pad, hi + pad, 8);
    let (x0, x1) = (
        xt.values.first().copied().unwrap_or(lo - pad).min(lo),
        xt.values.last().copied().unwrap_or(hi + pad).max(hi),
    );
    let yt = ticks(0.0, 100.0, 5);
    let fr = Frame {
        left: LEFT,
        top: 64.0,
        width: WIDTH - LEFT - 40.0,
        height: HEIGHT - 64.0 - 110.0,
        x: (x0, x1),
        y: (0.0, 100.0),
    };
    // histogram: bars scaled so the fullest bin reaches the top
    let width = (x1 - x0) / BINS as f64;
    let mut counts = [0usize; BINS];
    for x in v.iter().filter(|x| **x <= x1) {
        let b = (((x - x0) / width).floor() as usize).min(BINS - 1);
        counts[b] += 1;
    }
    let most = counts.iter().copied().max().unwrap_or(1).max(1) as f64;
    let mut bars = Group::new().set("fill", "#c9d6e3").set("stroke", "white");
    for (b, c) in counts.iter().enumerate().filter(|(_, c)| **c > 0) {
        let h = *c as f64 / most * 100.0;
        bars = bars.add(
            Rectangle::new()
                .set("x", fr.px(x0 + b as f64 * width))
                .set("y", fr.py(h))
                .set("width", fr.px(x0 + width) - fr.px(x0))
                .set("height", fr.py(0.0) - fr.py(h)),
        );
    }
    let n = v.len() as f64;
    let pts: String = v
        .iter()
        .enumerate()
        .filter(|(_, x)| **x <= x1)
        .map(|(i, x)| format!("{:.1},{:.1} ", fr.px(*x), fr.py((i + 1) as f64 / n * 100.0)))
        .collect();
    let cdf = Polyline::new()
        .set("points", pts)
        .set("fill", "none")
        .set("stroke", "#1f4e79")
        .set("stroke-width", 2);
    let mut marks = Group::new();
    for (name, q, pct) in [
        ("P10", p.p10, 10.0),
        ("P50", p.p50, 50.0),
        ("P90", p.p90, 90.0),
    ] {
        let x = fr.px(conv(q));
        marks = marks
            .add(
                line(x, fr.top, x, fr.bottom())
                    .set("stroke", "#b00020")
                    .set("stroke-dasharray", "5 4"),
            )
            .add(text(x + 3.0, fr.py(pct) - 4.0, 10.5, "start", name).set("fill", "#b00020"));
    }
    let cut = if clipped {
        format!(
            "; axis cut at P99 (largest {} {unit})",
            super::plot_kit::tick_label(conv(p.max), xt.step)
        )
    } else {
        String::new()
    };
    let doc = page(
        &format!("{} — {} samples — {site}", s.label, v.len()),
        &format!("bars: samples per bin (the fullest, {most:.0}, reaches the top); line: share at or below{cut}"),
        HEIGHT,
    )
    .add(fr.grid(&xt, &yt))
    .add(bars)
    .add(cdf)
    .add(marks)
    .add(fr.x_title(&format!("{} ({unit})", s.label)))
    .add(fr.y_title("samples at or below (%)", 24.0))
    .add(caution(HEIGHT));
    Some(doc.to_string())
}

/// The tornado of `swings` of output `s` about `base` (every input at P50).
pub fn tornado_svg(
    site: &str,
    s: &Series,
    base: Option<f64>,
    swings: &[Swing],
    units: UnitSystem,
) -> Option<String> {
    let base = base?;
    let conv = |v: f64| output_number(s.measure, v, units).0;
    let unit = unit_words(output_number(s.measure, 0.0, units).1);
    let vals: Vec<f64> = swings
        .iter()
        .flat_map(|w| [w.at_p10, w.at_p90])
        .flatten()
        .map(conv)
        .chain([conv(base)])
        .collect();
    let lo = vals.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = vals.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let pad = ((hi - lo) * 0.12).max(hi.abs() * 0.01).max(1e-9);
    let xt = ticks(lo - pad, hi + pad, 6);
    let left = 190.0;
    let rows = swings.len().max(1) as f64;
    let height = 70.0 + rows * 36.0 + 110.0;
    let fr = Frame {
        left,
        top: 70.0,
        width: WIDTH - left - 50.0,
        height: rows * 36.0,
        x: (lo - pad, hi + pad),
        y: (0.0, rows),
    };
    let mut g = Group::new();
    let bh = fr.height / rows * 0.6;
    for (k, w) in swings.iter().enumerate() {
        let yc = fr.top + (k as f64 + 0.5) * fr.height / rows;
        for (v, colour, tag) in [(w.at_p10, "#7fa7cf", "P10"), (w.at_p90, "#d9825b", "P90")] {
            let Some(v) = v.map(conv) else { continue };
            if (v - conv(base)).abs() <= 1e-9 * conv(base).abs().max(1e-12) {
                continue;
            }
            let (a, b) = (
                fr.px(conv(base)).min(fr.px(v)),
                fr.px(conv(base)).max(fr.px(v)),
            );
            g = g.add(
                Rectangle::new()
                    .set("x", a)
                    .set("y", yc - bh / 2.0)
                    .set("width", (b - a).max(1.0))
                    .set("height", bh)
                    .set("fill", colour),
            );
            let right = v >= conv(base);
            g = g.add(text(
                if right { b + 3.0 } else { a - 3.0 },
                yc + 4.0,
                9.5,
                if right { "start" } else { "end" },
                tag,
            ));
        }
        let none = [w.at_p10, w.at_p90].iter().all(|v| {
            v.is_some_and(|v| (conv(v) - conv(base)).abs() <= 1e-9 * conv(base).abs().max(1e-12))
        });
        if none {
            g = g.add(
                text(fr.px(conv(base)) + 6.0, yc + 4.0, 9.5, "start", "no swing")
                    .set("fill", "#555"),
            );
        }
        g = g.add(text(left - 10.0, yc + 4.0, 11.0, "end", w.input.clone()));
    }
    let bx = fr.px(conv(base));
    let doc = page(
        &format!("Tornado: {}", s.label),
        &format!("{site}: each input at P10 (blue) and P90 (orange), the others at P50"),
        height,
    )
    .add(fr.grid(
        &xt,
        &super::plot_kit::Ticks {
            values: Vec::new(),
            step: 1.0,
        },
    ))
    .add(g)
    .add(
        line(bx, fr.top - 6.0, bx, fr.bottom())
            .set("stroke", "black")
            .set("stroke-width", 1.5),
    )
    .add(text(bx, fr.top - 10.0, 10.0, "middle", "all at P50"))
    .add(fr.x_title(&format!("{} ({unit})", s.label)))
    .add(caution(height));
    Some(doc.to_string())
}

/// Every chart file: `uncertainty_<output>.svg` per output and `uncertainty_tornado.svg`.
pub fn charts(
    site: &str,
    series: &[Series],
    tornado: &(String, Option<f64>, Vec<Swing>),
    units: UnitSystem,
) -> Vec<(String, String)> {
    let mut out: Vec<(String, String)> = series
        .iter()
        .filter(|s| s.measure != Measure::Count || s.percentiles.is_some())
        .filter_map(|s| {
            cdf_svg(site, s, units).map(|svg| (format!("uncertainty_{}.svg", s.key), svg))
        })
        .collect();
    if let Some(s) = series.iter().find(|s| s.key == tornado.0) {
        if let Some(svg) = tornado_svg(site, s, tornado.1, &tornado.2, units) {
            out.push(("uncertainty_tornado.svg".into(), svg));
        }
    }
    out
}
