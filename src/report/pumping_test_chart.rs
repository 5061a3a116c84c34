//! `pumping_test.svg`: observed drawdowns and the fitted curves, on log–log axes (left, the
//! type-curve view) and semi-log axes (right, the Cooper–Jacob view); decades on the log axes,
//! round 1-2-5 ticks on the drawdown axis of the semi-log view (the plot kit).

use crate::input::units::UnitSystem;
use crate::report::plot_kit::{line, r1, text, ticks};
use crate::test_analysis::{Fit, ObservationWell};
use svg::node::element::{Circle, Group, Path, Rectangle};
use svg::Document;

const W: f64 = 980.0;
const H: f64 = 460.0;
const PW: f64 = 390.0;
const PH: f64 = 320.0;
const TOP: f64 = 60.0;
const COLOURS: [&str; 6] = [
    "#1f4e79", "#d1495b", "#2a9d8f", "#e9a03b", "#6a4c93", "#555555",
];

struct Axes {
    x0: f64,
    lx: (f64, f64),
    ly: (f64, f64),
    log_y: bool,
}

impl Axes {
    fn px(&self, t: f64) -> f64 {
        self.x0 + (t.log10() - self.lx.0) / (self.lx.1 - self.lx.0) * PW
    }
    fn py(&self, s: f64) -> f64 {
        let v = if self.log_y { s.log10() } else { s };
        TOP + PH - (v - self.ly.0) / (self.ly.1 - self.ly.0) * PH
    }
    fn inside(&self, t: f64, s: f64) -> bool {
        let v = if self.log_y { s.log10() } else { s };
        t > 0.0 && v.is_finite() && v >= self.ly.0 && v <= self.ly.1 && (!self.log_y || s > 0.0)
    }
}

fn frame(ax: &Axes, title: &str, lu: &str) -> Group {
    let mut g = Group::new().add(
        Rectangle::new()
            .set("x", r1(ax.x0))
            .set("y", r1(TOP))
            .set("width", PW)
            .set("height", PH)
            .set("fill", "none")
            .set("stroke", "#333"),
    );
    g = g.add(text(ax.x0 + PW / 2.0, TOP - 10.0, 13.0, "middle", title));
    for d in (ax.lx.0.ceil() as i32)..=(ax.lx.1.floor() as i32) {
        let x = ax.px(10f64.powi(d));
        g = g
            .add(line(x, TOP, x, TOP + PH).set("stroke", "#ddd"))
            .add(text(x, TOP + PH + 16.0, 11.0, "middle", format!("1e{d}")));
    }
    // Drawdown ticks: decades on a log axis, round 1-2-5 values on a linear one.
    let y_ticks: Vec<(f64, String)> = if ax.log_y {
        ((ax.ly.0.ceil() as i32)..=(ax.ly.1.floor() as i32))
            .map(|d| (10f64.powi(d), format!("1e{d}")))
            .collect()
    } else {
        ticks(ax.ly.0, ax.ly.1, 5).labelled().collect()
    };
    for (v, label) in y_ticks {
        let y = ax.py(v);
        g = g
            .add(line(ax.x0, y, ax.x0 + PW, y).set("stroke", "#ddd"))
            .add(text(ax.x0 - 6.0, y + 4.0, 11.0, "end", label));
    }
    g.add(text(
        ax.x0 + PW / 2.0,
        TOP + PH + 34.0,
        12.0,
        "middle",
        "time since pumping started (s)",
    ))
    .add(
        text(
            ax.x0 - 48.0,
            TOP + PH / 2.0,
            12.0,
            "middle",
            format!("drawdown ({lu})"),
        )
        .set(
            "transform",
            format!("rotate(-90 {} {})", r1(ax.x0 - 48.0), r1(TOP + PH / 2.0)),
        ),
    )
}

/// The observations and fitted curves, drawdowns multiplied by `scale` (1 for m, 1/0.3048 for
/// ft).
fn series(ax: &Axes, wells: &[ObservationWell], fit: Option<&Fit>, scale: f64) -> Group {
    let mut g = Group::new();
    for (k, w) in wells.iter().enumerate() {
        let c = COLOURS[k % COLOURS.len()];
        // One circle per pixel: a logger's 10⁶ readings draw as the curve they make.
        let mut drawn = std::collections::HashSet::new();
        for &(t, s) in &w.points {
            let s = s * scale;
            if ax.inside(t, s) && drawn.insert((ax.px(t) as i32, ax.py(s) as i32)) {
                g = g.add(
                    Circle::new()
                        .set("cx", r1(ax.px(t)))
                        .set("cy", r1(ax.py(s)))
                        .set("r", 3)
                        .set("fill", "none")
                        .set("stroke", c),
                );
            }
        }
        if let Some(f) = fit {
            let mut d = String::new();
            for i in 0..=120 {
                let t = 10f64.powf(ax.lx.0 + (ax.lx.1 - ax.lx.0) * i as f64 / 120.0);
                let s = f.model_drawdown(w.distance, t) * scale;
                if ax.inside(t, s) {
                    let cmd = if d.is_empty() { 'M' } else { 'L' };
                    d.push_str(&format!("{cmd}{} {} ", r1(ax.px(t)), r1(ax.py(s))));
                }
            }
            if !d.is_empty() {
                g = g.add(
                    Path::new()
                        .set("d", d.trim_end())
                        .set("fill", "none")
                        .set("stroke", c)
                        .set("stroke-width", 1.5),
                );
            }
        }
    }
    g
}

/// SVG of the observations of `wells` (open circles) and the fitted model of `fit` (lines), on
/// log–log and semi-log axes, with a legend and the fitted values. Points that cannot be shown
/// (zero drawdown on a log axis) are left out; no non-finite number is written. Lengths are in
/// `units` (the data stay SI; only the drawing converts).
pub fn pumping_test_svg(wells: &[ObservationWell], fit: Option<&Fit>, units: UnitSystem) -> String {
    let f = crate::report::format::Fmt::new(units, 0.0);
    let k = units.length(1.0);
    let pts: Vec<(f64, f64)> = wells
        .iter()
        .flat_map(|w| w.points.iter().map(|&(t, s)| (t, s * k)))
        .collect();
    let tmin = pts
        .iter()
        .map(|p| p.0)
        .filter(|t| *t > 0.0)
        .fold(f64::INFINITY, f64::min);
    let tmax = pts.iter().map(|p| p.0).fold(0.0, f64::max);
    let smin = pts
        .iter()
        .map(|p| p.1)
        .filter(|s| *s > 0.0)
        .fold(f64::INFINITY, f64::min);
    let smax = pts.iter().map(|p| p.1).fold(0.0, f64::max);
    let (tmin, tmax) = if tmin.is_finite() && tmax > tmin {
        (tmin, tmax)
    } else {
        (1.0, 10.0)
    };
    let (smin, smax) = if smin.is_finite() && smax > smin {
        (smin, smax)
    } else {
        (0.01, 1.0)
    };
    let lx = (
        tmin.log10().floor(),
        tmax.log10().ceil().max(tmin.log10().floor() + 1.0),
    );
    let loglog = Axes {
        x0: 80.0,
        lx,
        ly: (
            smin.log10().floor(),
            smax.log10().ceil().max(smin.log10().floor() + 1.0),
        ),
        log_y: true,
    };
    let semilog = Axes {
        x0: 80.0 + PW + 100.0,
        lx,
        ly: (0.0, smax * 1.1),
        log_y: false,
    };
    let mut doc = Document::new()
        .set("viewBox", (0, 0, W, H))
        .set("width", W)
        .set("height", H)
        .add(
            Rectangle::new()
                .set("width", W)
                .set("height", H)
                .set("fill", "white"),
        )
        .add(frame(&loglog, "log–log", f.lu()))
        .add(frame(&semilog, "semi-log", f.lu()))
        .add(series(&loglog, wells, fit, k))
        .add(series(&semilog, wells, fit, k));
    let mut legend = String::new();
    for (k, w) in wells.iter().enumerate() {
        doc = doc.add(
            text(
                80.0 + 150.0 * k as f64,
                H - 14.0,
                12.0,
                "start",
                format!("○ {} (r = {})", w.name, f.length(w.distance)),
            )
            .set("fill", COLOURS[k % COLOURS.len()]),
        );
    }
    if let Some(fit) = fit {
        let t = match units {
            UnitSystem::Si => format!("{:.3e} m²/s", fit.transmissivity.value),
            UnitSystem::Us => f.transmissivity(fit.transmissivity.value),
        };
        legend.push_str(&format!("{}: T = {t}", fit.method.name()));
        if let Some(s) = fit.storativity {
            legend.push_str(&format!(", S = {:.3e}", s.value));
        }
        if let Some(b) = fit.leakage_factor {
            legend.push_str(&format!(", B = {}", f.length(b.value)));
        }
        legend.push_str(&format!(", rms {}", f.length_fine(fit.rms)));
    } else {
        legend.push_str("observations");
    }
    doc = doc.add(text(W / 2.0, 24.0, 14.0, "middle", legend));
    doc.to_string()
}
