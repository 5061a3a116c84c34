//! The drawing kit of `settlement.svg`: its page measures, the world-to-picture transform,
//! round band steps, the light-to-dark settlement ramp, SVG path data of polygons and
//! polylines, text labels, the regular grids contoured under each building, and the number
//! formats of contour values and band edges.

use geo::MultiPolygon;
use svg::node::element::Text;

pub(super) const PLOT_W: f64 = 860.0;
pub(super) const PANEL_W: f64 = 250.0;
pub(super) const MARGIN: f64 = 30.0;
pub(super) const TITLE_H: f64 = 56.0;
/// The footer: gap under the plot to the first baseline, line pitch, and the margin under
/// the last line.
pub(super) const FOOT_GAP: f64 = 18.0;
pub(super) const FOOT_LINE: f64 = 13.0;
pub(super) const FOOT_PAD: f64 = 10.0;

/// World → picture transform.
pub(super) struct View {
    pub(super) x0: f64,
    pub(super) y1: f64,
    pub(super) scale: f64,
}

impl View {
    pub(super) fn p(&self, x: f64, y: f64) -> (f64, f64) {
        (
            MARGIN + (x - self.x0) * self.scale,
            TITLE_H + (self.y1 - y) * self.scale,
        )
    }
}

/// A step from 1, 2, 2.5, 5 × 10ⁿ giving at most `bands` bands up to `max`.
pub(super) fn nice_step(max: f64, bands: usize) -> f64 {
    if max <= 0.0 || !max.is_finite() {
        return 1.0;
    }
    let raw = max / bands as f64;
    let p = 10f64.powf(raw.log10().floor());
    for m in [1.0, 2.0, 2.5, 5.0, 10.0] {
        if m * p >= raw {
            return m * p;
        }
    }
    10.0 * p
}

/// Sequential ramp for settlement bands, light to dark (our own colours).
pub(super) fn ramp(t: f64) -> String {
    let stops = [
        (0.0, [255.0, 247.0, 214.0]),
        (0.35, [246.0, 190.0, 110.0]),
        (0.7, [208.0, 92.0, 64.0]),
        (1.0, [110.0, 28.0, 72.0]),
    ];
    let t = t.clamp(0.0, 1.0);
    let mut c = stops[stops.len() - 1].1;
    for w in stops.windows(2) {
        if t <= w[1].0 {
            let f = (t - w[0].0) / (w[1].0 - w[0].0);
            c = [0, 1, 2].map(|k| w[0].1[k] + f * (w[1].1[k] - w[0].1[k]));
            break;
        }
    }
    format!(
        "#{:02x}{:02x}{:02x}",
        c[0].round() as u8,
        c[1].round() as u8,
        c[2].round() as u8
    )
}

pub(super) fn path_data(mp: &MultiPolygon<f64>, view: &View) -> String {
    let mut d = String::new();
    let mut ring = |ls: &geo::LineString<f64>| {
        for (i, c) in ls.0.iter().enumerate() {
            let (x, y) = view.p(c.x, c.y);
            d.push_str(&format!(
                "{}{:.1},{:.1}",
                if i == 0 { "M" } else { "L" },
                x,
                y
            ));
        }
        d.push('Z');
    };
    for poly in &mp.0 {
        ring(poly.exterior());
        for hole in poly.interiors() {
            ring(hole);
        }
    }
    d
}

pub(super) fn polyline_data(pts: &[[f64; 2]], view: &View, close: bool) -> String {
    let mut d = String::new();
    for (i, p) in pts.iter().enumerate() {
        let (x, y) = view.p(p[0], p[1]);
        d.push_str(&format!(
            "{}{:.1},{:.1}",
            if i == 0 { "M" } else { "L" },
            x,
            y
        ));
    }
    if close {
        d.push('Z');
    }
    d
}

pub(super) fn label(x: f64, y: f64, size: f64, s: &str) -> Text {
    Text::new(s)
        .set("x", format!("{x:.1}"))
        .set("y", format!("{y:.1}"))
        .set("font-size", size)
        .set("font-family", "sans-serif")
}

/// A regular grid of values over `[x0, x0 + (nx−1)·h] × [y0, y0 + (ny−1)·h]`, row by row from y0.
pub(super) struct Grid {
    pub(super) x0: f64,
    pub(super) y0: f64,
    pub(super) h: f64,
    pub(super) nx: usize,
    pub(super) ny: usize,
    pub(super) values: Vec<f64>,
}

impl Grid {
    /// The engine's grid with its values multiplied by `scale` (to display units).
    pub(super) fn from_values(g: &crate::safety::settlement_map::GridValues, scale: f64) -> Grid {
        Grid {
            x0: g.x0,
            y0: g.y0,
            h: g.h,
            nx: g.nx,
            ny: g.ny,
            values: g.values.iter().map(|v| v * scale).collect(),
        }
    }

    /// The contour builder for this grid: the crate puts value k at cell centre k + ½, so the
    /// origin is moved back half a step.
    pub(super) fn builder(&self) -> contour::ContourBuilder {
        contour::ContourBuilder::new(self.nx, self.ny, true)
            .x_origin(self.x0 - 0.5 * self.h)
            .y_origin(self.y0 - 0.5 * self.h)
            .x_step(self.h)
            .y_step(self.h)
    }
}

/// A contour value written with as many decimals as its step needs.
pub(super) fn fmt_value(v: f64, step: f64) -> String {
    let decimals = if step >= 1.0 {
        0
    } else {
        (-step.log10()).ceil().clamp(0.0, 3.0) as usize
    };
    let text = format!("{v:.decimals$}");
    if decimals > 0 && format!("{:.*}", decimals + 1, step).ends_with('5') {
        format!("{v:.*}", decimals + 1)
    } else {
        text
    }
}

pub(super) fn fmt_step(v: f64) -> String {
    if (v - v.round()).abs() < 1e-9 {
        format!("{v:.0}")
    } else {
        format!("{v:.1}")
    }
}
