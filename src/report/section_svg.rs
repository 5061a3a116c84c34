//! `section.svg`: the vertical section along a line — ground, the water level before and during
//! pumping, aquifer top and base, excavation formation and target, wells with screens and pump
//! intakes, neighbours' foundations; in layered ground the aquifers and aquitards as named
//! bands and the level in each aquifer where they differ; cut-off walls where the line crosses
//! them, from ground to the toe. Levels on the left axis, depths below ground on the right,
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

/// The drawing's scales: chainage along the line to x, level to y (both m to SVG units).
struct Frame {
    /// Length of the line, m (at least 1).
    length: f64,
    /// Lowest level drawn, m.
    zlo: f64,
    /// Highest level drawn, m.
    zhi: f64,
    /// Ground level, m.
    ground: f64,
}

impl Frame {
    /// Levels from the lowest of aquifer base, screens and intakes to the highest of ground and
    /// original water level, padded 6 % each way.
    fn new(model: &Model, s: &Section) -> Frame {
        let aq = &model.aquifer;
        let ground = model.ground_level;
        let length = s.samples.last().map_or(1.0, |x| x.chainage).max(1.0);
        let mut zmin = aq.base_level;
        let mut zmax = ground;
        for w in &s.wells {
            zmin = zmin.min(w.screen_base).min(w.pump_intake);
        }
        if let Some(l) = &model.layers {
            zmin = zmin.min(l.lowest_base());
        }
        for w in &s.walls {
            zmin = zmin.min(w.toe);
        }
        zmax = zmax.max(aq.initial_level);
        let pad = 0.06 * (zmax - zmin).max(1.0);
        Frame {
            length,
            zlo: zmin - pad,
            zhi: zmax + pad,
            ground,
        }
    }
    /// x of chainage `ch` (m).
    fn px(&self, ch: f64) -> f64 {
        LEFT + (W - LEFT - RIGHT) * ch / self.length
    }
    /// y of level `z` (m).
    fn py(&self, z: f64) -> f64 {
        TOP + (H - TOP - BOTTOM) * (self.zhi - z) / (self.zhi - self.zlo)
    }
    /// x of both ends of the line.
    fn ends(&self) -> (f64, f64) {
        (self.px(0.0), self.px(self.length))
    }
}

/// The section drawing as SVG text, titled `title`.
pub fn render(model: &Model, s: &Section, f: &Fmt, title: &str) -> String {
    let fr = Frame::new(model, s);
    let mut o = String::new();
    header(&mut o, s, f, title);
    strata(&mut o, &fr, model);
    axes(&mut o, &fr, f);
    excavations(&mut o, &fr, s, f);
    walls(&mut o, &fr, s, f);
    neighbours(&mut o, &fr, s, f);
    level_lines(&mut o, &fr, model);
    layer_names(&mut o, &fr, model);
    lowered_level(&mut o, &fr, s, model.aquifer.base_level);
    aquifer_lines(&mut o, &fr, s, model);
    let step = wells(&mut o, &fr, s);
    legend(&mut o, s);
    footnote(&mut o, model, s, f, fr.length, step);
    o.push('\n');
    o
}

/// SVG opening, white page, title and the line's ends with how it was chosen.
fn header(o: &mut String, s: &Section, f: &Fmt, title: &str) {
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
            &s.basis
        ))
    );
}

/// The bands of the ground from the top down: (name, top, base, aquitard); one unnamed
/// aquifer band without `[[layer]]` entries.
fn bands(model: &Model, ground: f64) -> Vec<(String, f64, f64, bool)> {
    let Some(l) = &model.layers else {
        let aq = &model.aquifer;
        let top = aq.top_level.unwrap_or(ground).min(ground);
        return vec![(String::new(), top, aq.base_level, false)];
    };
    let mut out: Vec<(String, f64, f64, bool)> = l
        .aquifers
        .iter()
        .map(|a| {
            (
                a.name.clone(),
                a.top.min(ground),
                a.aquifer.base_level,
                false,
            )
        })
        .chain(
            l.aquitards
                .iter()
                .map(|t| (t.name.clone(), t.top.min(ground), t.base, true)),
        )
        .collect();
    out.sort_by(|a, b| b.1.total_cmp(&a.1));
    out
}

/// The ground: aquifers tinted (alternate shades), aquitards darker, below the base in grey.
fn strata(o: &mut String, fr: &Frame, model: &Model) {
    let (x0, x1) = fr.ends();
    let bands = bands(model, fr.ground);
    let mut aquifers = 0;
    for (_, top, base, aquitard) in &bands {
        let fill = if *aquitard {
            "#c8b59a"
        } else {
            aquifers += 1;
            if aquifers % 2 == 1 {
                "#f3ead8"
            } else {
                "#e8dcc2"
            }
        };
        let _ = write!(
            o,
            r##"<rect x="{x0:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="{fill}"/>"##,
            fr.py(*top),
            x1 - x0,
            (fr.py(*base) - fr.py(*top)).max(0.0)
        );
    }
    let lowest = bands.iter().map(|b| b.2).fold(f64::INFINITY, f64::min);
    let _ = write!(
        o,
        r##"<rect x="{x0:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#cfc6b8"/>"##,
        fr.py(lowest),
        x1 - x0,
        (fr.py(fr.zlo) - fr.py(lowest)).max(0.0)
    );
}

/// Layered ground: each band's name at the right end of the band, with aquifer or aquitard.
fn layer_names(o: &mut String, fr: &Frame, model: &Model) {
    if model.layers.is_none() {
        return;
    }
    let (_, x1) = fr.ends();
    for (name, top, base, aquitard) in bands(model, fr.ground) {
        let (yt, yb) = (fr.py(top), fr.py(base));
        // above the band's base when there is room (the level lines are named near the top),
        // else in its middle
        let y = if yb - yt > 30.0 {
            yb - 6.0
        } else {
            (yt + yb) / 2.0 + 4.0
        };
        let _ = write!(
            o,
            r##"<text x="{:.1}" y="{y:.1}" text-anchor="end" font-size="11" font-style="italic" fill="#5a3d1e" paint-order="stroke" stroke="#fff" stroke-width="3">{}</text>"##,
            x1 - 6.0,
            esc(&band_label(&name, aquitard))
        );
    }
}

/// A band's name with what it is, unless the name says so already.
fn band_label(name: &str, aquitard: bool) -> String {
    let kind = if aquitard { "aquitard" } else { "aquifer" };
    if name.to_lowercase().contains(kind) {
        name.to_string()
    } else {
        format!("{name} ({kind})")
    }
}

/// Horizontal level grid and axes: round levels on the left, round depths on the right,
/// round distances along the bottom.
fn axes(o: &mut String, fr: &Frame, f: &Fmt) {
    let (x0, x1) = fr.ends();
    let ground = fr.ground;
    let k = f.units.length(1.0);
    let levels = ticks(fr.zlo * k, fr.zhi * k, 8);
    for (v, label) in levels.labelled() {
        let y = fr.py(v / k);
        let _ = write!(
            o,
            r##"<line x1="{x0:.1}" x2="{x1:.1}" y1="{y:.1}" y2="{y:.1}" stroke="#ddd" stroke-width="0.6"/><text x="{:.1}" y="{:.1}" text-anchor="end">{label}</text>"##,
            x0 - 6.0,
            y + 4.0,
        );
    }
    let depths = ticks((ground - fr.zhi) * k, (ground - fr.zlo) * k, 8);
    for (d, label) in depths.labelled() {
        let y = fr.py(ground - d / k);
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
    for (v, label) in ticks(0.0, fr.length * k, 10).labelled() {
        let x = fr.px(v / k);
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
}

/// Neighbours' foundations: a block from ground to the foundation level.
fn neighbours(o: &mut String, fr: &Frame, s: &Section, f: &Fmt) {
    let ground = fr.ground;
    for n in &s.neighbours {
        let zf = n.level.unwrap_or(ground - 1.0);
        let (from, to) = (fr.px(n.from), fr.px(n.to));
        // The label runs away from the nearer end of the drawing so it stays on the page.
        let (lx, anchor) = if (from + to) / 2.0 > W / 2.0 {
            (to.min(W - RIGHT), "end")
        } else {
            (from.max(LEFT), "start")
        };
        let _ = write!(
            o,
            r##"<rect x="{:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#b9c2cc" stroke="#556" stroke-width="0.8"/><text x="{lx:.1}" y="{:.1}" text-anchor="{anchor}" font-size="11" paint-order="stroke" stroke="#fff" stroke-width="3">{}</text>"##,
            from,
            fr.py(ground) - 24.0,
            (to - from).max(1.0),
            fr.py(zf) - fr.py(ground) + 24.0,
            fr.py(zf) + 13.0,
            esc(&format!(
                "{} — foundation {}",
                n.name,
                n.level.map_or("not given".into(), |z| f.level(z))
            ))
        );
    }
}

/// Excavations: cut from ground to formation, target dashed.
fn excavations(o: &mut String, fr: &Frame, s: &Section, f: &Fmt) {
    let ground = fr.ground;
    for e in &s.excavations {
        let (a, b) = (fr.px(e.from), fr.px(e.to));
        let zf = e.level.unwrap_or(ground);
        let _ = write!(
            o,
            r##"<rect x="{a:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="#fff" stroke="#000" stroke-width="1.2"/>"##,
            fr.py(ground),
            (b - a).max(1.0),
            fr.py(zf) - fr.py(ground)
        );
        // a target within 30 px above the formation: its label above its line, the formation's
        // below the formation, so the two never overlap
        let close = e
            .target
            .is_some_and(|t| t > zf && fr.py(zf) - fr.py(t) < 30.0);
        if let Some(t) = e.target {
            let _ = write!(
                o,
                r##"<line x1="{a:.1}" x2="{b:.1}" y1="{y:.1}" y2="{y:.1}" stroke="#c00" stroke-width="1.2" stroke-dasharray="6 3"/><text x="{:.1}" y="{:.1}" fill="#c00" font-size="11">{}</text>"##,
                a + 4.0,
                if close {
                    fr.py(t) - 4.0
                } else {
                    fr.py(t) + 13.0
                },
                esc(&format!(
                    "{} {}",
                    if e.relief { "relief head" } else { "target" },
                    f.level(t)
                )),
                y = fr.py(t)
            );
        }
        let _ = write!(
            o,
            r##"<text x="{:.1}" y="{:.1}" font-size="11">{}</text>"##,
            a + 4.0,
            if close {
                fr.py(zf) + 13.0
            } else {
                fr.py(zf) - 5.0
            },
            esc(&format!("{}: formation {}", e.name, f.level(zf)))
        );
    }
}

/// Ground, aquifer top and base, original water level.
fn level_lines(o: &mut String, fr: &Frame, model: &Model) {
    let aq = &model.aquifer;
    let (x0, x1) = fr.ends();
    let mut hline = |z: f64, colour: &str, dash: &str, width: f64| {
        let _ = write!(
            o,
            r##"<line x1="{x0:.1}" x2="{x1:.1}" y1="{y:.1}" y2="{y:.1}" stroke="{colour}" stroke-width="{width}" stroke-dasharray="{dash}"/>"##,
            y = fr.py(z)
        );
    };
    hline(fr.ground, "#5a3d1e", "none", 2.0);
    hline(aq.base_level, "#5a3d1e", "none", 1.2);
    if let Some(t) = aq.top_level {
        hline(t, "#5a3d1e", "4 2", 1.2);
    }
    for (_, top, base, _) in bands(model, fr.ground).iter().skip(1) {
        hline(*top, "#5a3d1e", "none", 0.8);
        hline(*base, "#5a3d1e", "none", 0.8);
    }
    hline(aq.initial_level, "#1f5fbf", "8 4", 1.4);
}

/// The lowered water level along the line (a dry sample drawn at the aquifer base `base`).
fn lowered_level(o: &mut String, fr: &Frame, s: &Section, base: f64) {
    let mut path = String::new();
    for (i, smp) in s.samples.iter().enumerate() {
        let z = smp.level.unwrap_or(base);
        let _ = write!(
            path,
            "{}{:.1},{:.1}",
            if i == 0 { "M" } else { " L" },
            fr.px(smp.chainage),
            fr.py(z)
        );
    }
    let _ = write!(
        o,
        r##"<path d="{path}" fill="none" stroke="#1f5fbf" stroke-width="2.2"/>"##
    );
}

/// Layered ground: the level in every other aquifer where it differs from the main line
/// (dash-dotted, darker), each line named at its right end (the main line too).
fn aquifer_lines(o: &mut String, fr: &Frame, s: &Section, model: &Model) {
    let (_, x1) = fr.ends();
    let mut labels: Vec<(f64, String)> = Vec::new();
    for line in &s.aquifer_levels {
        let base = model
            .layers
            .as_ref()
            .and_then(|l| l.aquifers.iter().find(|a| a.name == line.name))
            .map_or(model.aquifer.base_level, |a| a.aquifer.base_level);
        let zs: Vec<f64> = line.levels.iter().map(|z| z.unwrap_or(base)).collect();
        if !line.main {
            let mut path = String::new();
            for (i, (smp, z)) in s.samples.iter().zip(&zs).enumerate() {
                let _ = write!(
                    path,
                    "{}{:.1},{:.1}",
                    if i == 0 { "M" } else { " L" },
                    fr.px(smp.chainage),
                    fr.py(*z)
                );
            }
            let _ = write!(
                o,
                r##"<path d="{path}" fill="none" stroke="#0b3d7a" stroke-width="1.8" stroke-dasharray="9 3 2 3"/>"##
            );
        }
        if let Some(z) = zs.last() {
            labels.push((fr.py(*z) - 5.0, format!("level in {}", line.name)));
        }
    }
    // keep the labels at least 13 px apart
    labels.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut last = f64::NEG_INFINITY;
    for (y, text) in labels {
        let y = y.max(last + 13.0);
        last = y;
        let _ = write!(
            o,
            r##"<text x="{:.1}" y="{y:.1}" text-anchor="end" font-size="11" fill="#0b3d7a" paint-order="stroke" stroke="#fff" stroke-width="3">{}</text>"##,
            x1 - 6.0,
            esc(&text)
        );
    }
}

/// Page x of the baseline of a wall's label written up beside the wall at page x `x`: the first
/// of x − 7, x + 14, x − 11, x + 18, … (4 px further out each time, up to 60 px) whose band
/// (the rotated text of 11 px reaches about 10 px left of its baseline and 3 px right of it)
/// stays clear of every drawn well (screen, casing and intake triangle: ±6 px of `wells`) and
/// inside the plot from `left` to `right`; x − 7 when none is.
fn wall_label_x(x: f64, wells: &[f64], left: f64, right: f64) -> f64 {
    let clear = |bx: f64| {
        let (lo, hi) = (bx - 10.0, bx + 3.0);
        lo >= left && hi <= right && wells.iter().all(|w| hi < w - 6.0 || lo > w + 6.0)
    };
    (0..15)
        .flat_map(|k| {
            let step = 4.0 * k as f64;
            [x - 7.0 - step, x + 14.0 + step]
        })
        .find(|bx| clear(*bx))
        .unwrap_or(x - 7.0)
}

/// Page x of the wells drawn (every k-th along the line, as [`wells`] draws them).
fn drawn_well_xs(fr: &Frame, s: &Section) -> Vec<f64> {
    let k = s.wells.len().div_ceil(MAX_WELLS).max(1);
    s.wells
        .iter()
        .step_by(k)
        .map(|w| fr.px(w.chainage))
        .collect()
}

/// Cut-off walls crossed: a thick bar from ground to the toe, its name and toe level written
/// up beside it, on a side clear of the wells ([`wall_label_x`]).
fn walls(o: &mut String, fr: &Frame, s: &Section, f: &Fmt) {
    let well_xs = drawn_well_xs(fr, s);
    let (left, right) = fr.ends();
    for w in &s.walls {
        let x = fr.px(w.chainage);
        let (yg, yt) = (fr.py(fr.ground), fr.py(w.toe));
        let toe = if w.toe_given {
            format!("toe {}", f.level(w.toe))
        } else {
            format!("to the impermeable base {}", f.level(w.toe))
        };
        let (tx, ty) = (wall_label_x(x, &well_xs, left, right), yt - 4.0);
        let _ = write!(
            o,
            r##"<line class="wall" x1="{x:.1}" x2="{x:.1}" y1="{yg:.1}" y2="{yt:.1}" stroke="#3a3a3a" stroke-width="6"/><text x="{tx:.1}" y="{ty:.1}" transform="rotate(-90 {tx:.1} {ty:.1})" font-size="11" paint-order="stroke" stroke="#fff" stroke-width="3">{}</text>"##,
            esc(&format!("{}: {toe}", w.name))
        );
    }
}

/// Wells: casing from ground, screen thick, intake triangle; at most MAX_WELLS drawn (every
/// k-th along the line), names only when few. Returns k.
fn wells(o: &mut String, fr: &Frame, s: &Section) -> usize {
    let k = s.wells.len().div_ceil(MAX_WELLS).max(1);
    let named = s.wells.len() <= 24;
    for w in s.wells.iter().step_by(k) {
        let x = fr.px(w.chainage);
        let _ = write!(
            o,
            r##"<line x1="{x:.1}" x2="{x:.1}" y1="{:.1}" y2="{:.1}" stroke="#222" stroke-width="1.2"/><line x1="{x:.1}" x2="{x:.1}" y1="{:.1}" y2="{:.1}" stroke="#222" stroke-width="4" stroke-dasharray="2 1.5"/><path d="M{:.1},{:.1} l5,8 l-10,0 z" fill="#e07b00"/><text x="{x:.1}" y="{:.1}" text-anchor="middle" font-size="10">{}</text>"##,
            fr.py(fr.ground),
            fr.py(w.screen_base),
            fr.py(w.screen_top),
            fr.py(w.screen_base),
            x,
            fr.py(w.pump_intake) - 4.0,
            fr.py(fr.ground) - 4.0,
            if named { esc(&w.name) } else { String::new() }
        );
    }
    k
}

/// The legend row under the axis.
fn legend(o: &mut String, s: &Section) {
    let target_label = if s.excavations.iter().any(|e| e.relief) {
        "target level / relief head"
    } else {
        "target level"
    };
    let mut items: Vec<(&str, &str, &str)> = vec![
        ("#5a3d1e", "none", "ground, aquifer top and base"),
        ("#1f5fbf", "8 4", "water level before pumping"),
        ("#1f5fbf", "none", "water level while pumping"),
    ];
    if s.aquifer_levels.len() > 1 {
        items.push(("#0b3d7a", "9 3 2 3", "while pumping, in another aquifer"));
    }
    items.extend([
        ("#c00", "6 3", target_label),
        ("#222", "2 1.5", "well screen"),
        ("#e07b00", "none", "pump intake"),
    ]);
    if !s.walls.is_empty() {
        items.push(("#3a3a3a", "none", "cut-off wall"));
    }
    // rows that fit the page, the last one just above the footnote
    let width = |label: &str| 30.0 + 6.2 * label.chars().count() as f64;
    let mut rows = 1;
    let mut lx = LEFT;
    for (_, _, label) in &items {
        if lx > LEFT && lx + width(label) > W - 20.0 {
            rows += 1;
            lx = LEFT;
        }
        lx += width(label);
    }
    let mut ly = H - 30.0 - 16.0 * (rows - 1) as f64;
    let mut lx = LEFT;
    for (colour, dash, label) in items {
        if lx > LEFT && lx + width(label) > W - 20.0 {
            ly += 16.0;
            lx = LEFT;
        }
        let _ = write!(
            o,
            r##"<line x1="{lx:.1}" x2="{:.1}" y1="{ly:.1}" y2="{ly:.1}" stroke="{colour}" stroke-width="3" stroke-dasharray="{dash}"/><text x="{:.1}" y="{:.1}" font-size="11">{}</text>"##,
            lx + 22.0,
            lx + 26.0,
            ly + 4.0,
            esc(label)
        );
        lx += width(label);
    }
}

/// The note on datum, which wells are shown (every `step`-th) and the scale; closes the SVG.
fn footnote(o: &mut String, model: &Model, s: &Section, f: &Fmt, length: f64, step: usize) {
    let _ = write!(
        o,
        r##"<text x="{LEFT}" y="{:.1}" font-size="10" fill="#555">{}</text></svg>"##,
        H - 8.0,
        esc(&format!(
            "levels above {}; {} within {} of the line shown at their foot on it; vertical scale exaggerated",
            model.datum,
            if step > 1 {
                format!("every {step}th of {} wells", s.wells.len())
            } else {
                "wells".to_string()
            },
            f.length(crate::check::section::well_band(length))
        ))
    );
}

#[cfg(test)]
mod tests {
    use super::wall_label_x;

    /// The band of page x the label covers (10 px left of its baseline, 3 px right).
    fn band(bx: f64) -> (f64, f64) {
        (bx - 10.0, bx + 3.0)
    }

    #[test]
    fn a_wall_label_keeps_clear_of_the_wells_beside_the_wall() {
        // No well near: left of the wall as before.
        assert_eq!(wall_label_x(599.1, &[238.7], 80.0, 920.0), 592.1);
        // The walled demo's design: W14 10.5 px left of the wall; the label goes right.
        let bx = wall_label_x(599.1, &[238.7, 588.6], 80.0, 920.0);
        assert_eq!(bx, 613.1);
        // Wells on both sides close by, and the plot's right end: further out on the left,
        // clear of every well.
        let wells = [590.0, 612.0, 625.0];
        let bx = wall_label_x(600.0, &wells, 80.0, 640.0);
        let (lo, hi) = band(bx);
        assert!(wells.iter().all(|w| hi < w - 6.0 || lo > w + 6.0), "{bx}");
        assert!(lo >= 80.0 && hi <= 640.0);
    }
}
