//! Where the plan sits on the ground: its frame with site coordinates (E and N) at round steps,
//! the scale bar of a round length in four blocks, and the north arrow (page up = grid north).

use crate::report::map::layers::{group, Layers};
use crate::report::map::page::{INK, PANEL};
use crate::report::map::text::{decimals, r1, signed, text};
use crate::report::map::view::View;
use svg::node::element::{Group, Path, Rectangle};

/// A "nice" length (1, 2 or 5 × 10ᵏ) at most `max`.
pub(super) fn nice_below(max: f64) -> f64 {
    if max.is_nan() || max <= 0.0 || !max.is_finite() {
        return 1.0;
    }
    let e = max.log10().floor();
    let base = 10f64.powf(e);
    [5.0, 2.0, 1.0]
        .into_iter()
        .map(|m| m * base)
        .find(|v| *v <= max)
        .unwrap_or(base)
}

/// Tick step for site coordinates so labels stand about `px` apart.
fn tick_step(view: &View, px: f64) -> f64 {
    let raw = px / view.scale;
    let e = raw.log10().floor();
    let base = 10f64.powf(e);
    [1.0, 2.0, 5.0, 10.0]
        .into_iter()
        .map(|m| m * base)
        .find(|v| *v >= raw)
        .unwrap_or(10.0 * base)
}

fn coord_text(v: f64, step: f64) -> String {
    let d = decimals(step).min(2);
    signed(v, d)
}

pub(super) fn draw_frame(lay: &mut Layers, view: &View, plan: [f64; 4]) {
    let mut g = std::mem::replace(&mut lay.frame, group("frame")).add(
        Rectangle::new()
            .set("x", r1(plan[0]))
            .set("y", r1(plan[1]))
            .set("width", r1(plan[2] - plan[0]))
            .set("height", r1(plan[3] - plan[1]))
            .set("fill", "none")
            .set("stroke", INK)
            .set("stroke-width", 1.2),
    );
    let step = tick_step(view, 110.0);
    let lo = view.site([plan[0], plan[3]]);
    let hi = view.site([plan[2], plan[1]]);
    let mut ticks = String::new();
    let size = 10.0;
    let mut x = (lo[0] / step).ceil() * step;
    while x <= hi[0] + 1e-9 {
        let p = view.px([x, lo[1]]);
        ticks.push_str(&format!("M{} {}v5", r1(p[0]), r1(plan[3])));
        g = g.add(
            text(
                p[0],
                plan[3] + 16.0,
                size,
                format!("E {}", coord_text(x, step)),
            )
            .set("text-anchor", "middle")
            .set("fill", "#555555"),
        );
        x += step;
    }
    let mut y = (lo[1] / step).ceil() * step;
    while y <= hi[1] + 1e-9 {
        let p = view.px([lo[0], y]);
        ticks.push_str(&format!("M{} {}h-5", r1(plan[0]), r1(p[1])));
        let (tx, ty) = (plan[0] - 8.0, p[1]);
        g = g.add(
            text(0.0, 0.0, size, format!("N {}", coord_text(y, step)))
                .set("text-anchor", "middle")
                .set("fill", "#555555")
                .set(
                    "transform",
                    format!("translate({} {}) rotate(-90)", r1(tx), r1(ty)),
                ),
        );
        y += step;
    }
    lay.frame = g.add(
        Path::new()
            .set("d", ticks)
            .set("stroke", INK)
            .set("stroke-width", 1),
    );
}

pub(super) fn scale_and_north(
    view: &View,
    top: f64,
    u: crate::input::units::UnitSystem,
) -> (Group, Group) {
    let height = 96.0;
    let frame = Rectangle::new()
        .set("x", r1(PANEL[0]))
        .set("y", r1(top))
        .set("width", r1(PANEL[1] - PANEL[0]))
        .set("height", r1(height))
        .set("fill", "#ffffff")
        .set("stroke", INK)
        .set("stroke-width", 1);
    // Scale bar: a round length no longer than 200 px, in four blocks.
    let per_unit = 1.0 / u.length(1.0);
    let len_m = nice_below(200.0 / view.scale / per_unit) * per_unit;
    let len_px = len_m * view.scale;
    let x0 = PANEL[0] + 18.0;
    let y0 = top + 52.0;
    let mut bar = group("scale-bar").add(frame);
    for k in 0..4 {
        let w = len_px / 4.0;
        bar = bar.add(
            Rectangle::new()
                .set("x", r1(x0 + w * k as f64))
                .set("y", r1(y0))
                .set("width", r1(w))
                .set("height", 7)
                .set("fill", if k % 2 == 0 { INK } else { "#ffffff" })
                .set("stroke", INK)
                .set("stroke-width", 0.8),
        );
    }
    let d = decimals(u.length(len_m) / 2.0).min(2);
    for (t, v) in [(0.0, 0.0), (0.5, len_m / 2.0), (1.0, len_m)] {
        let label = if t == 1.0 {
            format!("{} {}", signed(u.length(v), d), u.length_unit())
        } else {
            signed(u.length(v), d)
        };
        bar = bar.add(
            text(x0 + len_px * t, y0 + 22.0, 11.0, label)
                .set("text-anchor", "middle")
                .set("fill", INK),
        );
    }
    bar = bar.add(
        text(x0, top + 26.0, 12.0, "Scale")
            .set("font-weight", "bold")
            .set("fill", INK),
    );
    // North arrow: a split needle in a ring, page up = grid north.
    let cx = PANEL[1] - 50.0;
    let cy = top + 54.0;
    let rr = 26.0;
    let north = group("north-arrow")
        .add(
            svg::node::element::Circle::new()
                .set("cx", r1(cx))
                .set("cy", r1(cy))
                .set("r", r1(rr))
                .set("fill", "none")
                .set("stroke", "#9aa3ab")
                .set("stroke-width", 1),
        )
        .add(
            Path::new()
                .set(
                    "d",
                    format!(
                        "M{} {}L{} {}L{} {}Z",
                        r1(cx),
                        r1(cy - rr + 2.0),
                        r1(cx - 8.0),
                        r1(cy + 12.0),
                        r1(cx),
                        r1(cy + 6.0)
                    ),
                )
                .set("fill", INK),
        )
        .add(
            Path::new()
                .set(
                    "d",
                    format!(
                        "M{} {}L{} {}L{} {}Z",
                        r1(cx),
                        r1(cy - rr + 2.0),
                        r1(cx + 8.0),
                        r1(cy + 12.0),
                        r1(cx),
                        r1(cy + 6.0)
                    ),
                )
                .set("fill", "#ffffff")
                .set("stroke", INK)
                .set("stroke-width", 1),
        )
        .add(
            text(cx, cy - rr - 4.0, 14.0, "N")
                .set("text-anchor", "middle")
                .set("font-weight", "bold")
                .set("fill", INK),
        );
    (bar, north)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn nice_scale_lengths() {
        assert_eq!(nice_below(73.0), 50.0);
        assert_eq!(nice_below(19.9), 10.0);
        assert_eq!(nice_below(250.0), 200.0);
        assert_eq!(nice_below(1.0), 1.0);
    }
}
