//! `map_day_N.svg`: the drawdown at one time of the programme as shaded cells, with the
//! excavations, neighbours and wells drawn over it and a colour scale.

use super::format::Fmt;
use crate::caution::CAUTION;
use crate::input::model::Model;
use crate::report::words::wrap;
use crate::transient::answers::DrawdownMap;
use crate::transient::programme::DAY;
use svg::node::element::{Circle, Polygon, Rectangle, Text};
use svg::Document;

const SIZE: f64 = 640.0;
const PAD: f64 = 50.0;
const LEGEND: f64 = 150.0;

/// Colour for a fraction 0 … 1 (pale to deep blue).
fn colour(f: f64) -> String {
    let f = f.clamp(0.0, 1.0);
    let (r0, g0, b0) = (247.0, 251.0, 255.0);
    let (r1, g1, b1) = (8.0, 48.0, 107.0);
    format!(
        "rgb({:.0},{:.0},{:.0})",
        r0 + (r1 - r0) * f,
        g0 + (g1 - g0) * f,
        b0 + (b1 - b0) * f
    )
}

fn text(x: f64, y: f64, size: f64, content: impl Into<String>) -> Text {
    Text::new(content.into())
        .set("x", format!("{x:.1}"))
        .set("y", format!("{y:.1}"))
        .set("font-size", size)
        .set("font-family", "sans-serif")
}

/// The SVG of one map. `wells` are the well positions (m).
pub fn map_svg(model: &Model, map: &DrawdownMap, wells: &[[f64; 2]]) -> String {
    let units = Fmt::new(model.units, model.ground_level);
    let w = (map.nx - 1) as f64 * map.step;
    let h = (map.ny - 1) as f64 * map.step;
    let scale = SIZE / w.max(h).max(1e-9);
    let px = |x: f64| PAD + (x - map.origin[0]) * scale;
    let py = |y: f64| PAD + SIZE - (y - map.origin[1]) * scale;
    let max = map
        .drawdown
        .iter()
        .copied()
        .filter(|v| v.is_finite())
        .fold(0.0_f64, f64::max)
        .max(1e-6);
    let mut doc = Document::new()
        .set(
            "viewBox",
            (0, 0, SIZE + 2.0 * PAD + LEGEND, SIZE + 2.0 * PAD + 60.0),
        )
        .add(
            Rectangle::new()
                .set("width", SIZE + 2.0 * PAD + LEGEND)
                .set("height", SIZE + 2.0 * PAD + 60.0)
                .set("fill", "white"),
        )
        .add(text(
            PAD,
            30.0,
            15.0,
            format!(
                "{} — drawdown on day {:.1} ({})",
                model.name,
                map.time / DAY,
                units.lu()
            ),
        ));
    let cell = map.step * scale;
    for j in 0..map.ny {
        for i in 0..map.nx {
            let v = map.drawdown[j * map.nx + i];
            let x = map.origin[0] + i as f64 * map.step;
            let y = map.origin[1] + j as f64 * map.step;
            doc = doc.add(
                Rectangle::new()
                    .set("x", format!("{:.2}", px(x) - cell / 2.0))
                    .set("y", format!("{:.2}", py(y) - cell / 2.0))
                    .set("width", format!("{:.2}", cell + 0.3))
                    .set("height", format!("{:.2}", cell + 0.3))
                    .set("fill", colour(if v.is_finite() { v / max } else { 0.0 })),
            );
        }
    }
    let poly = |ring: &[geo::Coord<f64>], stroke: &str, fill: &str| {
        Polygon::new()
            .set(
                "points",
                ring.iter()
                    .map(|c| format!("{:.1},{:.1}", px(c.x), py(c.y)))
                    .collect::<Vec<_>>()
                    .join(" "),
            )
            .set("fill", fill.to_string())
            .set("stroke", stroke.to_string())
            .set("stroke-width", 1.5)
    };
    for e in &model.excavations {
        doc = doc.add(poly(&e.outline.exterior().0, "#d1495b", "none"));
    }
    for n in &model.neighbours {
        doc = doc.add(poly(&n.footprint.exterior().0, "#444444", "none"));
    }
    for p in wells {
        doc = doc.add(
            Circle::new()
                .set("cx", format!("{:.1}", px(p[0])))
                .set("cy", format!("{:.1}", py(p[1])))
                .set("r", 3)
                .set("fill", "#e9c46a")
                .set("stroke", "black")
                .set("stroke-width", 0.6),
        );
    }
    // Colour scale.
    let lx = PAD + SIZE + 24.0;
    for k in 0..=10 {
        let f = 1.0 - k as f64 / 10.0;
        doc = doc
            .add(
                Rectangle::new()
                    .set("x", lx)
                    .set("y", PAD + k as f64 * 30.0)
                    .set("width", 22)
                    .set("height", 30)
                    .set("fill", colour(f)),
            )
            .add(text(
                lx + 28.0,
                PAD + k as f64 * 30.0 + 19.0,
                11.0,
                units.length(f * max),
            ));
    }
    doc = doc.add(text(
        lx,
        PAD + 350.0,
        10.5,
        format!("grid {}", units.length(map.step)),
    ));
    let mut y = PAD + SIZE + 24.0;
    for line in wrap(&format!("CAUTION: {CAUTION}"), 130, "").lines() {
        doc = doc.add(text(PAD, y, 9.5, line.to_string()));
        y += 12.0;
    }
    doc.to_string()
}
