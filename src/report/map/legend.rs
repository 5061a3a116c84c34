//! The legend at the top of the right-hand column: one row for every kind of thing drawn on
//! this map (band ramp with its end values, contours, excavations, wells, neighbours by
//! status, boundaries, keep-outs, dry area, failed check points), and a note of well labels
//! left off for space.

use crate::check::run::CheckRun;
use crate::field::grid::{ContourSet, LevelGrid};
use crate::input::model::MapQuantity;
use crate::input::units::UnitSystem;
use crate::physics::images::BoundaryKind;
use crate::report::map::contours::band_colour;
use crate::report::map::layers::group;
use crate::report::map::options::{MapOptions, NeighbourStatus};
use crate::report::map::page::{
    BARRIER, CONSTANT_HEAD, CONTOUR, EXCAVATION, FAIL, INK, KEEP_OUT, PANEL, PLAN,
};
use crate::report::map::symbols::well_symbol;
use crate::report::map::text::{decimals, r1, signed, text};
use svg::node::element::{Group, Line, Path, Rectangle};

/// One legend row: a symbol drawn in a 34 × 16 box at (x, y) and words beside it.
fn legend_row(x: f64, y: f64, symbol: Group, words: &str) -> Group {
    Group::new()
        .add(symbol.set("transform", format!("translate({} {})", r1(x), r1(y))))
        .add(text(x + 44.0, y + 12.0, 12.0, words).set("fill", INK))
}

/// A line symbol: a horizontal stroke across the symbol box.
fn line(stroke: &str, width: f64, dash: Option<&str>) -> Group {
    let mut l = Line::new()
        .set("x1", 2)
        .set("y1", 8)
        .set("x2", 32)
        .set("y2", 8)
        .set("stroke", stroke)
        .set("stroke-width", width);
    if let Some(d) = dash {
        l = l.set("stroke-dasharray", d);
    }
    Group::new().add(l)
}

/// An area symbol: a filled box, with a fill pattern over it when given.
fn swatch(fill: &str, stroke: &str, pattern: Option<&str>) -> Group {
    let mut g = Group::new().add(
        Rectangle::new()
            .set("x", 4)
            .set("y", 1)
            .set("width", 26)
            .set("height", 14)
            .set("fill", fill)
            .set("stroke", stroke),
    );
    if let Some(p) = pattern {
        g = g.add(
            Rectangle::new()
                .set("x", 4)
                .set("y", 1)
                .set("width", 26)
                .set("height", 14)
                .set("fill", p),
        );
    }
    g
}

/// Six band colours side by side, `sign` +1 for drawdown, −1 for water raised.
fn ramp(sign: f64) -> Group {
    let mut ramp = Group::new();
    for k in 0..6 {
        let t = sign * k as f64 / 5.0;
        ramp = ramp.add(
            Rectangle::new()
                .set("x", r1(2.0 + 5.0 * k as f64))
                .set("y", 1)
                .set("width", 5)
                .set("height", 14)
                .set("fill", band_colour(t)),
        );
    }
    ramp
}

/// One legend entry: its symbol and its words.
type Entry = (Group, String);

/// The band ramp with its end values, water raised by recharge, and the contour lines.
fn band_entries(set: &ContourSet, u: UnitSystem) -> Vec<Entry> {
    let mut out = Vec::new();
    if set.lines.is_empty() {
        return out;
    }
    let lu = u.length_unit();
    let dec = decimals(u.length(set.interval)).min(3);
    let ul = |v: f64| u.length(v);
    // End values of the drawn-down part, light to dark.
    let down: Vec<f64> = set
        .lines
        .iter()
        .map(|l| l.value)
        .filter(|v| set.drawdown_of(*v) > 0.0)
        .collect();
    let (light, dark) = match set.quantity {
        MapQuantity::Drawdown => (down.first(), down.last()),
        MapQuantity::WaterLevel => (down.last(), down.first()),
    };
    if let (Some(light), Some(dark)) = (light, dark) {
        let words = match set.quantity {
            MapQuantity::Drawdown => "drawdown",
            MapQuantity::WaterLevel => "level",
        };
        out.push((
            ramp(1.0),
            format!(
                "{words} {} … {} {lu}",
                signed(ul(*light), dec),
                signed(ul(*dark), dec)
            ),
        ));
    }
    if set.extremes().1 > 0.0 {
        out.push((ramp(-1.0), "water raised by recharge".into()));
    }
    out.push((
        line(CONTOUR, 0.8, None),
        format!("contour every {} {lu}", signed(ul(set.interval), dec)),
    ));
    out.push((
        line(CONTOUR, 1.6, None),
        format!("bold every {} {lu}", signed(ul(5.0 * set.interval), dec)),
    ));
    out
}

/// The excavation, pumping and recharge wells, wells over a limit, set-out lines.
fn well_entries(run: &CheckRun) -> Vec<Entry> {
    let mut out = vec![(
        swatch("#ffffff", EXCAVATION, None).set("stroke-width", 2.2),
        "excavation, target level".to_string(),
    )];
    if run.placement.wells.iter().any(|w| w.rate >= 0.0) {
        out.push((
            well_symbol([17.0, 8.0], 5.0, false),
            "pumping well, name, rate".into(),
        ));
    }
    if run.placement.wells.iter().any(|w| w.rate < 0.0) {
        out.push((
            well_symbol([17.0, 8.0], 5.0, true),
            "recharge well, name, rate".into(),
        ));
    }
    let over = run
        .evaluation
        .wells
        .iter()
        .filter(|w| !w.problems.is_empty())
        .count();
    if over > 0 {
        let ring = Group::new()
            .add(
                svg::node::element::Circle::new()
                    .set("cx", 17)
                    .set("cy", 8)
                    .set("r", 8)
                    .set("fill", "none")
                    .set("stroke", FAIL)
                    .set("stroke-width", 2),
            )
            .add(well_symbol([17.0, 8.0], 5.0, false));
        out.push((ring, format!("well over a limit ({over}): see wells.csv")));
    }
    if !run.placement.paths.is_empty() {
        out.push((
            line("#8a8f96", 1.0, Some("2 4")),
            "line the wells are set out on".into(),
        ));
    }
    out
}

/// Neighbours (by status when given), boundaries, keep-outs, the dry area and failed points.
fn site_entries(run: &CheckRun, grid: &LevelGrid, opts: &MapOptions, failed: usize) -> Vec<Entry> {
    let model = run.model;
    let mut out = Vec::new();
    if !model.neighbours.is_empty() {
        match opts
            .neighbour_status
            .as_ref()
            .filter(|s| s.len() == model.neighbours.len())
        {
            Some(statuses) => {
                for s in [
                    NeighbourStatus::WithinLimits,
                    NeighbourStatus::NearLimit,
                    NeighbourStatus::OverLimit,
                    NeighbourStatus::NotAssessed,
                ] {
                    if statuses.contains(&s) {
                        out.push((swatch(s.fill(), "#5e564b", None), s.words().to_string()));
                    }
                }
            }
            None => out.push((
                swatch("#e2ddd5", "#5e564b", None),
                "neighbouring building".into(),
            )),
        }
    }
    let has = |kind: BoundaryKind| model.boundaries.iter().any(|b| b.kind == kind);
    if has(BoundaryKind::ConstantHead) {
        out.push((
            line(CONSTANT_HEAD, 3.0, None),
            "constant-head boundary".into(),
        ));
    }
    if has(BoundaryKind::Barrier) {
        out.push((
            line(BARRIER, 3.5, Some("14 4 3 4")),
            "barrier (no flow)".into(),
        ));
    }
    if model.walls.iter().any(|w| w.resistance.is_none()) {
        out.push((
            line(
                crate::report::map::walls::WALL,
                crate::report::map::walls::WALL_WIDTH,
                None,
            ),
            "cut-off wall".into(),
        ));
    }
    if model.walls.iter().any(|w| w.resistance.is_some()) {
        out.push((
            line(
                crate::report::map::walls::WALL,
                crate::report::map::walls::WALL_WIDTH,
                Some("10 3"),
            ),
            "leaky cut-off wall".into(),
        ));
    }
    if !model.keep_outs.is_empty() {
        out.push((
            swatch("#fbe9e4", KEEP_OUT, Some("url(#hatch-keep-out)")),
            "keep-out zone".into(),
        ));
    }
    if grid.dry_count() > 0 {
        out.push((
            swatch("#efe3d0", "#6b4e2e", Some("url(#hatch-dry)")),
            "pumped dry (at aquifer base)".into(),
        ));
    }
    if failed > 0 {
        let cross = Group::new().add(
            Path::new()
                .set("d", "M13.5 4.5L20.5 11.5M13.5 11.5L20.5 4.5")
                .set("stroke", FAIL)
                .set("stroke-width", 1.6)
                .set("stroke-linecap", "round"),
        );
        out.push((cross, format!("check point above target ({failed})")));
    }
    out
}

/// The legend group and the y of its bottom edge.
pub(super) fn legend(
    run: &CheckRun,
    grid: &LevelGrid,
    set: &ContourSet,
    opts: &MapOptions,
    omitted: usize,
    failed: usize,
) -> (Group, f64) {
    let u = run.model.units;
    let x = PANEL[0] + 12.0;
    let top = PLAN[1];
    let mut y = top + 30.0;
    let row = 22.0;
    let mut rows = Group::new();
    let entries = band_entries(set, u)
        .into_iter()
        .chain(well_entries(run))
        .chain(site_entries(run, grid, opts, failed));
    for (symbol, words) in entries {
        rows = rows.add(legend_row(x, y, symbol, &words));
        y += row;
    }
    if omitted > 0 {
        rows = rows.add(
            text(
                x,
                y + 12.0,
                11.0,
                format!(
                    "{omitted} well label{} left off for space: see wells.csv",
                    if omitted == 1 { "" } else { "s" }
                ),
            )
            .set("fill", "#555555")
            .set("font-style", "italic"),
        );
        y += row;
    }
    let bottom = y + 4.0;
    let (what, unit) = crate::report::map::text::quantity_words_in(set.quantity, u);
    let g = group("legend")
        .add(
            Rectangle::new()
                .set("x", r1(PANEL[0]))
                .set("y", r1(top))
                .set("width", r1(PANEL[1] - PANEL[0]))
                .set("height", r1(bottom - top))
                .set("fill", "#ffffff")
                .set("stroke", INK)
                .set("stroke-width", 1),
        )
        .add(
            text(
                x,
                top + 19.0,
                13.0,
                format!("Legend — {} ({unit})", what.to_lowercase()),
            )
            .set("font-weight", "bold")
            .set("fill", INK),
        )
        .add(rows);
    (g, bottom)
}
