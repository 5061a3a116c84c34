//! The words of the map: the title block at the foot of the right-hand column (name, quantity
//! and interval, datum, wells, flows, the result, the worst point, grid, date, design file) and
//! the caution along the foot of the page.

use crate::caution::CAUTION;
use crate::check::run::CheckRun;
use crate::field::grid::ContourSet;
use crate::report::map::layers::group;
use crate::report::map::options::MapOptions;
use crate::report::map::page::{FAIL, FOOTER_TOP, INK, PANEL, PLAN};
use crate::report::map::text::{decimals, lines_of, r1, signed, text};
use crate::report::words::thousands;
use svg::node::element::{Group, Line, Rectangle};

/// The title block: its rows wrapped to the column, the verdict's row in the failure colour
/// when not met.
pub(super) fn title_block(
    run: &CheckRun,
    set: &ContourSet,
    date: &str,
    opts: &MapOptions,
) -> Group {
    let (raw, alarm) = title_rows(run, set, date, opts);
    let x = PANEL[0] + 12.0;
    let bottom = PLAN[3];
    // Wrap each row to the column's width.
    let avail = PANEL[1] - PANEL[0] - 24.0;
    let mut rows: Vec<(f64, String, bool, &str)> = Vec::new();
    for (i, (size, words, bold)) in raw.into_iter().enumerate() {
        let chars = (avail / (0.62 * size)).floor().max(10.0) as usize;
        let fill = if alarm == Some(i) { FAIL } else { INK };
        for l in lines_of(&words, chars) {
            rows.push((size, l, bold, fill));
        }
    }
    let height: f64 = rows.iter().map(|r| r.0 + 6.0).sum::<f64>() + 18.0;
    let top = bottom - height;
    let mut g = group("title-block").add(
        Rectangle::new()
            .set("x", r1(PANEL[0]))
            .set("y", r1(top))
            .set("width", r1(PANEL[1] - PANEL[0]))
            .set("height", r1(height))
            .set("fill", "#f6f7f8")
            .set("stroke", INK)
            .set("stroke-width", 1.4),
    );
    let mut y = top + 8.0;
    for (size, words, bold, fill) in rows {
        y += size + 6.0;
        let mut t = text(x, y, size, words).set("fill", fill);
        if bold {
            t = t.set("font-weight", "bold");
        }
        g = g.add(t);
    }
    g
}

/// One row of the title block: font size, words, bold.
type Row = (f64, String, bool);

/// The rows of the title block, and which of them is a verdict that is not met.
fn title_rows(
    run: &CheckRun,
    set: &ContourSet,
    date: &str,
    opts: &MapOptions,
) -> (Vec<Row>, Option<usize>) {
    let model = run.model;
    let e = &run.evaluation;
    let u = model.units;
    let (what, unit) = crate::report::map::text::quantity_words_in(set.quantity, u);
    let lu = u.length_unit();
    let dec = decimals(u.length(set.interval)).min(3);
    let fl = crate::report::format::Fmt::new(u, model.ground_level);
    let mut raw: Vec<Row> = Vec::new();
    raw.insert(0, (16.0, model.name.clone(), true));
    raw.push((
        12.0,
        format!(
            "{what}, {unit}: contours every {} {lu}",
            signed(u.length(set.interval), dec)
        ),
        false,
    ));
    if !model.datum.is_empty() {
        raw.push((11.0, format!("Levels: {}", model.datum), false));
    }
    let placed = &run.placement.wells;
    let duty = || {
        placed
            .iter()
            .filter(|w| !crate::optimise::standby::is_standby(w))
    };
    let standby = placed.len() - duty().count();
    let pumping = duty().filter(|w| w.rate >= 0.0).count();
    let recharging = duty().count() - pumping;
    let first_rate = duty().next().map_or(0.0, |w| w.rate);
    let same = duty().all(|w| (w.rate - first_rate).abs() <= 1e-12);
    let wells = if recharging > 0 {
        format!("Wells: {pumping} pumping, {recharging} recharge")
    } else if same && pumping > 1 {
        format!(
            "Wells: {pumping}, {} each",
            crate::report::map::text::rate_text_in(first_rate, u)
        )
    } else {
        format!("Wells: {pumping}")
    };
    let wells = if standby > 0 {
        format!("{wells} + {standby} standby")
    } else {
        wells
    };
    raw.push((12.0, wells, false));
    raw.push((
        12.0,
        match u {
            crate::input::units::UnitSystem::Si => format!(
                "Total flow: {} L/s ({} m³/day)",
                thousands(e.total_abstraction_m3_per_s * 1e3, 1),
                thousands(e.total_abstraction_m3_per_s * 86_400.0, 0)
            ),
            crate::input::units::UnitSystem::Us => {
                format!("Total flow: {}", fl.flow(e.total_abstraction_m3_per_s))
            }
        },
        true,
    ));
    if e.total_recharge_m3_per_s > 0.0 {
        raw.push((
            12.0,
            format!(
                "Recharge: {}; net {}",
                fl.rate(e.total_recharge_m3_per_s),
                fl.rate(e.net_flow_m3_per_s)
            ),
            false,
        ));
    }
    raw.push((
        12.0,
        format!(
            "Design flow (+{:.0} %): {}",
            model.contingency * 100.0,
            fl.flow(e.design_flow_m3_per_s)
        ),
        false,
    ));
    // The verdict's row is drawn in the failure colour when the verdict is not met.
    let mut alarm = None;
    if let Some(v) = &opts.verdict {
        if !v.is_met() {
            alarm = Some(raw.len());
        }
        raw.push((
            12.0,
            format!("Result: {}", crate::report::verdict::headline(v, &fl)),
            true,
        ));
    }
    if let Some(w) = e.worst_point.and_then(|i| e.points.get(i)) {
        // Short by less than the tolerance counts as met: not reported as "0.00 above".
        if let Some(m) = w
            .margin_m
            .filter(|m| *m < -crate::check::evaluate::TARGET_TOLERANCE)
        {
            raw.push((
                11.0,
                format!(
                    "Worst: {} {lu} above target at ({:.1}, {:.1})",
                    signed(u.length(-m), 2),
                    w.point.position[0],
                    w.point.position[1]
                ),
                false,
            ));
        }
    }
    raw.push((11.0, format!("Grid: {}, metres", model.grid), false));
    let file = model
        .file
        .file_name()
        .map_or_else(String::new, |f| f.to_string_lossy().into_owned());
    raw.push((11.0, format!("Date: {date}"), false));
    raw.push((11.0, format!("Design file: {file}"), false));
    raw.push((
        11.0,
        format!("Drawn by drydig {}", opts.command.unwrap_or("check")),
        false,
    ));
    (raw, alarm)
}

pub(super) fn caution_footer() -> Group {
    let size = 11.0;
    let mut g = group("caution").add(
        Line::new()
            .set("x1", r1(PLAN[0]))
            .set("y1", r1(FOOTER_TOP))
            .set("x2", r1(PANEL[1]))
            .set("y2", r1(FOOTER_TOP))
            .set("stroke", INK)
            .set("stroke-width", 0.8),
    );
    let full = format!("CAUTION — {CAUTION}");
    let mut y = FOOTER_TOP + 17.0;
    for l in lines_of(&full, 190) {
        g = g.add(text(PLAN[0], y, size, l).set("fill", "#6b1f1f"));
        y += size + 5.0;
    }
    g
}
