//! `section.svg`: the vertical section along a line — ground, the water level before and during
//! pumping, aquifer top and base, excavation formation and target, wells with screens and pump
//! intakes, neighbours' foundations. Levels on the left axis, depths below ground on the right,
//! both in the chosen units. The values come from [`crate::check::section`]; this file only
//! draws. No `id` attributes, so several drawings can share one HTML page.

use crate::check::section::Section;
use crate::input::model::Model;
use crate::report::format::{esc, Fmt};
use crate::report::plot_kit::ticks;
use std::fmt::Write;

const W: f64 = 1000.0;
const H: f64 = 520.0;
const LEFT: f64 = 80.0;
const RIGHT: f64 = 80.0;
const TOP: f64 = 56.0;
const BOTTOM: f64 = 96.0;
/// Most wells drawn on one section.
const MAX_WELLS: usize = 40;

/// The section drawing as SVG text, titled `title`.
pub fn render(model: &Model, s: &Section, f: &Fmt, title: &str) -> String {
    let aq = &model.aquifer;
    let ground = model.ground_level;
    let length = s.samples.last().map_or(1.0, |x| x.chainage).max(1.0);
    let mut zmin = aq.base_level;
    let mut zmax = ground;
    for w in &s.wells {
        zmin = zmin.min(w.screen_base).min(w.pump_intake);
    }
    zmax = zmax.max(aq.initial_level);
    let pad = 0.06 * (zmax - zmin).max(1.0);
    let (zlo, zhi) = (zmin - pad, zmax + pad);
    let px = |ch: f64| LEFT + (W - LEFT - RIGHT) * ch / length;
    let py = |z: f64| TOP + (H - TOP - BOTTOM) * (zhi - z) / (zhi - zlo);
    let mut o = String::new();
    let _ = write!(
        o,
        r##"<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {W} {H}" width="100%" font-family="Helvetica, Arial, sans-serif" font-size="12" role="img" aria-label="cross-section">"##
    );
    let _ = write!(
        o,
        r##"<rect x="0" y="0" width="{W}" height="{H}" fill="#fff"/>"##
    );
    let _ = write!(
        o,
        r##"<text x="{LEFT}" y="22" font-size="16" font-weight="bold">{}</text><text x="{LEFT}" y="40" fill="#444">{}</text>"##,
        esc(title),
        esc(&format!(
            "from ({}, {}) to ({}, {}) — {}",
            f.coordinate(s.line[0][0]),
            f.coordinate(s.line[0][1]),
            f.coordinate(s.line[1][0]),
            f.coordinate(s.line[1][1]),
            s.basis
        ))
    );
    // Aquifer: below base in grey, saturated zone tinted.
    let (x0, x1) = (px(0.0), px(length));
    let top = aq.top_level.unwrap_or(ground).min(ground);
    let _ = write!(
        o,
        r##"<rect x="{x0:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#f3ead8"/>"##,
        py(top),
        x1 - x0,
        py(aq.base_level) - py(top)
    );
    let _ = write!(
        o,
        r##"<rect x="{x0:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#cfc6b8"/>"##,
        py(aq.base_level),
        x1 - x0,
        py(zlo) - py(aq.base_level)
    );
    // Horizontal level grid and axes: round levels on the left, round depths on the right.
    let k = f.units.length(1.0);
    let levels = ticks(zlo * k, zhi * k, 8);
    for (v, label) in levels.labelled() {
        let y = py(v / k);
        let _ = write!(
            o,
            r##"<line x1="{x0:.1}" x2="{x1:.1}" y1="{y:.1}" y2="{y:.1}" stroke="#ddd" stroke-width="0.6"/><text x="{:.1}" y="{:.1}" text-anchor="end">{label}</text>"##,
            x0 - 6.0,
            y + 4.0,
        );
    }
    let depths = ticks((ground - zhi) * k, (ground - zlo) * k, 8);
    for (d, label) in depths.labelled() {
        let y = py(ground - d / k);
        let _ = write!(
            o,
            r##"<line x1="{x1:.1}" x2="{:.1}" y1="{y:.1}" y2="{y:.1}" stroke="#333"/><text x="{:.1}" y="{:.1}">{label}</text>"##,
            x1 + 4.0,
            x1 + 6.0,
            y + 4.0,
        );
    }
    let _ = write!(
        o,
        r##"<text x="18" y="{:.1}" transform="rotate(-90 18 {:.1})" text-anchor="middle">level ({})</text><text x="{:.1}" y="{:.1}" transform="rotate(90 {:.1} {:.1})" text-anchor="middle">depth below ground ({})</text>"##,
        (TOP + H - BOTTOM) / 2.0,
        (TOP + H - BOTTOM) / 2.0,
        f.lu(),
        W - 18.0,
        (TOP + H - BOTTOM) / 2.0,
        W - 18.0,
        (TOP + H - BOTTOM) / 2.0,
        f.lu()
    );
    for (v, label) in ticks(0.0, length * k, 10).labelled() {
        let x = px(v / k);
        let _ = write!(
            o,
            r##"<line x1="{x:.1}" x2="{x:.1}" y1="{:.1}" y2="{:.1}" stroke="#333"/><text x="{x:.1}" y="{:.1}" text-anchor="middle">{label}</text>"##,
            H - BOTTOM,
            H - BOTTOM + 5.0,
            H - BOTTOM + 18.0,
        );
    }
    let _ = write!(
        o,
        r##"<text x="{:.1}" y="{:.1}" text-anchor="middle">distance along the section ({})</text>"##,
        (x0 + x1) / 2.0,
        H - BOTTOM + 34.0,
        f.lu()
    );
    // Neighbours' foundations: a block from ground to the foundation level.
    for n in &s.neighbours {
        let zf = n.level.unwrap_or(ground - 1.0);
        // The label runs away from the nearer end of the drawing so it stays on the page.
        let (lx, anchor) = if (px(n.from) + px(n.to)) / 2.0 > W / 2.0 {
            (px(n.to).min(W - RIGHT), "end")
        } else {
            (px(n.from).max(LEFT), "start")
        };
        let _ = write!(
            o,
            r##"<rect x="{:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#b9c2cc" stroke="#556" stroke-width="0.8"/><text x="{lx:.1}" y="{:.1}" text-anchor="{anchor}" font-size="11">{}</text>"##,
            px(n.from),
            py(ground) - 24.0,
            (px(n.to) - px(n.from)).max(1.0),
            py(zf) - py(ground) + 24.0,
            py(zf) + 13.0,
            esc(&format!(
                "{} — foundation {}",
                n.name,
                n.level.map_or("not given".into(), |z| f.level(z))
            ))
        );
    }
    // Excavations: cut from ground to formation, target dashed.
    for e in &s.excavations {
        let (a, b) = (px(e.from), px(e.to));
        let zf = e.level.unwrap_or(ground);
        let _ = write!(
            o,
            r##"<rect x="{a:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#fff" stroke="#000" stroke-width="1.2"/>"##,
            py(ground),
            (b - a).max(1.0),
            py(zf) - py(ground)
        );
        if let Some(t) = e.target {
            let _ = write!(
                o,
                r##"<line x1="{a:.1}" x2="{b:.1}" y1="{y:.1}" y2="{y:.1}" stroke="#c00" stroke-width="1.2" stroke-dasharray="6 3"/><text x="{:.1}" y="{:.1}" fill="#c00" font-size="11">{}</text>"##,
                a + 4.0,
                py(t) + 13.0,
                esc(&format!(
                    "{} {}",
                    if e.relief { "relief head" } else { "target" },
                    f.level(t)
                )),
                y = py(t)
            );
        }
        let _ = write!(
            o,
            r##"<text x="{:.1}" y="{:.1}" font-size="11">{}</text>"##,
            a + 4.0,
            py(zf) - 5.0,
            esc(&format!("{}: formation {}", e.name, f.level(zf)))
        );
    }
    // Ground, aquifer top and base, original water level.
    let hline = |o: &mut String, z: f64, colour: &str, dash: &str, width: f64| {
        let _ = write!(
            o,
            r##"<line x1="{x0:.1}" x2="{x1:.1}" y1="{y:.1}" y2="{y:.1}" stroke="{colour}" stroke-width="{width}" stroke-dasharray="{dash}"/>"##,
            y = py(z)
        );
    };
    hline(&mut o, ground, "#5a3d1e", "none", 2.0);
    hline(&mut o, aq.base_level, "#5a3d1e", "none", 1.2);
    if let Some(t) = aq.top_level {
        hline(&mut o, t, "#5a3d1e", "4 2", 1.2);
    }
    hline(&mut o, aq.initial_level, "#1f5fbf", "8 4", 1.4);
    // Lowered water level.
    let mut path = String::new();
    for (i, smp) in s.samples.iter().enumerate() {
        let z = smp.level.unwrap_or(aq.base_level);
        let _ = write!(
            path,
            "{}{:.1},{:.1}",
            if i == 0 { "M" } else { " L" },
            px(smp.chainage),
            py(z)
        );
    }
    let _ = write!(
        o,
        r##"<path d="{path}" fill="none" stroke="#1f5fbf" stroke-width="2.2"/>"##
    );
    // Wells: casing from ground, screen thick, intake triangle; at most MAX_WELLS drawn (every
    // k-th along the line), names only when few.
    let k = s.wells.len().div_ceil(MAX_WELLS).max(1);
    let named = s.wells.len() <= 24;
    for w in s.wells.iter().step_by(k) {
        let x = px(w.chainage);
        let _ = write!(
            o,
            r##"<line x1="{x:.1}" x2="{x:.1}" y1="{:.1}" y2="{:.1}" stroke="#222" stroke-width="1.2"/><line x1="{x:.1}" x2="{x:.1}" y1="{:.1}" y2="{:.1}" stroke="#222" stroke-width="4" stroke-dasharray="2 1.5"/><path d="M{:.1},{:.1} l5,8 l-10,0 z" fill="#e07b00"/><text x="{x:.1}" y="{:.1}" text-anchor="middle" font-size="10">{}</text>"##,
            py(ground),
            py(w.screen_base),
            py(w.screen_top),
            py(w.screen_base),
            x,
            py(w.pump_intake) - 4.0,
            py(ground) - 4.0,
            if named { esc(&w.name) } else { String::new() }
        );
    }
    // Legend.
    let ly = H - 30.0;
    let target_label = if s.excavations.iter().any(|e| e.relief) {
        "target level / relief head"
    } else {
        "target level"
    };
    let items: [(&str, &str, &str); 6] = [
        ("#5a3d1e", "none", "ground, aquifer top and base"),
        ("#1f5fbf", "8 4", "water level before pumping"),
        ("#1f5fbf", "none", "water level while pumping"),
        ("#c00", "6 3", target_label),
        ("#222", "2 1.5", "well screen"),
        ("#e07b00", "none", "pump intake"),
    ];
    let mut lx = LEFT;
    for (colour, dash, label) in items {
        let _ = write!(
            o,
            r##"<line x1="{lx:.1}" x2="{:.1}" y1="{ly:.1}" y2="{ly:.1}" stroke="{colour}" stroke-width="3" stroke-dasharray="{dash}"/><text x="{:.1}" y="{:.1}" font-size="11">{}</text>"##,
            lx + 22.0,
            lx + 26.0,
            ly + 4.0,
            esc(label)
        );
        lx += 30.0 + 6.2 * label.len() as f64;
    }
    let _ = write!(
        o,
        r##"<text x="{LEFT}" y="{:.1}" font-size="10" fill="#555">{}</text></svg>"##,
        H - 8.0,
        esc(&format!(
            "levels above {}; {} within {} of the line shown at their foot on it; vertical scale exaggerated",
            model.datum,
            if k > 1 {
                format!("every {k}th of {} wells", s.wells.len())
            } else {
                "wells".to_string()
            },
            f.length(crate::check::section::well_band(length))
        ))
    );
    o.push('\n');
    o
}
