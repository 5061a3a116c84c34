//! The contoured quantity: the light-to-dark band fills between contour levels (a second ramp
//! for a recharge mound), the contour lines with a bold index line every fifth interval, and
//! their values written along straight stretches of each line.

use crate::field::grid::{ContourSet, LevelGrid};
use crate::report::map::labels::{inside, rotated_half_extent, Occupied};
use crate::report::map::layers::{group, Layers};
use crate::report::map::text::{decimals, halo, r1, signed, text, text_width};
use crate::report::map::view::{multipolygon_data, page_line, path_data, View};
use svg::node::element::{Group, Path};

const BAND_LOW: [f64; 3] = [250.0, 247.0, 236.0];
const BAND_HIGH: [f64; 3] = [160.0, 192.0, 220.0];
const MOUND: [f64; 3] = [236.0, 200.0, 150.0];

/// Fill for a band at ramp position `t`: 0 undisturbed, 1 the most drawn down, −1 the highest
/// rise (recharge mound).
pub(super) fn band_colour(t: f64) -> String {
    let (to, t) = if t < 0.0 {
        (MOUND, (-t).min(1.0))
    } else {
        (BAND_HIGH, t.min(1.0))
    };
    let c: Vec<u8> = (0..3)
        .map(|k| (BAND_LOW[k] + (to[k] - BAND_LOW[k]) * t).round() as u8)
        .collect();
    format!("#{:02x}{:02x}{:02x}", c[0], c[1], c[2])
}

/// Where along the band ramp a value sits: 0 undisturbed, 1 the most drawn down.
fn ramp_position(set: &ContourSet, v: f64) -> f64 {
    let dd = set.drawdown_of(v);
    let (down, up) = set.extremes();
    // The light end is the least drawdown on the map (0 where the map reaches undisturbed
    // ground), so a deep, wide cone still shows its shape.
    let least = set
        .drawdown_of(set.range[0])
        .min(set.drawdown_of(set.range[1]))
        .max(0.0);
    if dd >= 0.0 {
        if down > least {
            ((dd - least) / (down - least)).max(0.0)
        } else {
            0.0
        }
    } else if up > 0.0 {
        dd / up
    } else {
        0.0
    }
}

pub(super) fn draw_bands(lay: &mut Layers, grid: &LevelGrid, set: &ContourSet, view: &View) {
    let levels: Vec<f64> = set.lines.iter().map(|l| l.value).collect();
    if levels.is_empty() {
        return;
    }
    let values = grid.values(set.quantity);
    let mut g = Group::new().set("clip-path", lay.aquifer_clip.clone());
    for (lo, hi, mp) in grid.bands(&values, &levels) {
        // Colour each band by its middle (the outer bands by their inner edge).
        let mid = if lo < set.range[0] {
            hi
        } else if hi > set.range[1] {
            lo
        } else {
            (lo + hi) / 2.0
        };
        let t = ramp_position(set, mid);
        g = g.add(
            Path::new()
                .set("d", multipolygon_data(view, &mp))
                .set("fill", band_colour(t))
                .set("fill-rule", "evenodd")
                .set("stroke", "none"),
        );
    }
    lay.bands = std::mem::replace(&mut lay.bands, group("bands"))
        .set("clip-path", lay.plan_clip.clone())
        .add(g);
}

pub(super) fn draw_contours(lay: &mut Layers, set: &ContourSet, view: &View) {
    for line in &set.lines {
        let k = (line.value / set.interval).round() as i64;
        let index = k % 5 == 0;
        let mut d = String::new();
        for part in &line.parts {
            let pts = page_line(view, part);
            if pts.len() >= 2 {
                d.push_str(&path_data(&pts, false));
            }
        }
        if d.is_empty() {
            continue;
        }
        lay.contours = std::mem::replace(&mut lay.contours, group("contours")).add(
            Path::new()
                .set("d", d)
                .set("class", if index { "contour index" } else { "contour" })
                .set("stroke-width", if index { 1.6 } else { 0.8 }),
        );
    }
}

/// The point at arc length `s` along a page polyline with cumulative lengths `cum`.
fn at_length(pts: &[[f64; 2]], cum: &[f64], s: f64) -> [f64; 2] {
    let i = cum.partition_point(|c| *c < s).clamp(1, pts.len() - 1);
    let seg = cum[i] - cum[i - 1];
    let t = if seg > 0.0 {
        (s - cum[i - 1]) / seg
    } else {
        0.0
    };
    let (a, b) = (pts[i - 1], pts[i]);
    [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]
}

pub(super) fn draw_contour_labels(
    lay: &mut Layers,
    set: &ContourSet,
    grid: &LevelGrid,
    view: &View,
    occ: &mut Occupied,
    area: [f64; 4],
) {
    let d = decimals(set.interval / grid.unit).min(3);
    let size = 11.0;
    let inset = [area[0] + 4.0, area[1] + 4.0, area[2] - 4.0, area[3] - 4.0];
    let spacing = 300.0;
    let mut g = std::mem::replace(&mut lay.contour_labels, group("contour-labels"));
    for line in &set.lines {
        let label = signed(line.value / grid.unit, d);
        let w = text_width(&label, size) + 6.0;
        let h = size + 2.0;
        for part in &line.parts {
            let pts = page_line(view, part);
            if pts.len() < 2 {
                continue;
            }
            let mut cum = vec![0.0];
            for s in pts.windows(2) {
                let l = (s[1][0] - s[0][0]).hypot(s[1][1] - s[0][1]);
                cum.push(cum.last().copied().unwrap_or(0.0) + l);
            }
            let total = cum.last().copied().unwrap_or(0.0);
            if total < w * 2.2 {
                continue;
            }
            let n = ((total / spacing).round() as usize).max(1);
            for k in 0..n {
                let target = total * (k as f64 + 0.5) / n as f64;
                for shift in [0.0, 25.0, -25.0, 50.0, -50.0, 80.0, -80.0] {
                    let s = target + shift;
                    if s - w * 0.6 < 0.0 || s + w * 0.6 > total {
                        continue;
                    }
                    let a = at_length(&pts, &cum, s - w / 2.0);
                    let m = at_length(&pts, &cum, s);
                    let b = at_length(&pts, &cum, s + w / 2.0);
                    // Only where the line runs nearly straight under the label.
                    let (u, v) = ([m[0] - a[0], m[1] - a[1]], [b[0] - m[0], b[1] - m[1]]);
                    let turn = (u[0] * v[1] - u[1] * v[0]).atan2(u[0] * v[0] + u[1] * v[1]);
                    if turn.abs() > 0.35 {
                        continue;
                    }
                    let mut angle = (b[1] - a[1]).atan2(b[0] - a[0]).to_degrees();
                    if angle > 90.0 {
                        angle -= 180.0;
                    } else if angle <= -90.0 {
                        angle += 180.0;
                    }
                    let (hw, hh) = rotated_half_extent(w, h, angle);
                    let bx = [m[0] - hw, m[1] - hh, m[0] + hw, m[1] + hh];
                    if !inside(bx, inset) || !occ.free(bx) || !grid.on_aquifer_side(view.site(m)) {
                        continue;
                    }
                    occ.take(bx);
                    g = g.add(
                        halo(text(0.0, size * 0.36, size, label.clone()))
                            .set("class", "contour-label")
                            .set(
                                "transform",
                                format!(
                                    "translate({} {}) rotate({})",
                                    r1(m[0]),
                                    r1(m[1]),
                                    r1(angle)
                                ),
                            ),
                    );
                    break;
                }
            }
        }
    }
    lay.contour_labels = g;
}
