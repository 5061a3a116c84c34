//! The whole page of `map.svg`: the main plan (or a strip and a detail), the fill patterns, the
//! legend, scale bar, north arrow, title block and caution, written in their fixed order; and
//! the map and GeoJSON files of `check` from one level grid.

use crate::check::run::CheckRun;
use crate::field::grid::LevelGrid;
use crate::findings::check::CheckFindings;
use crate::report::map::date::today;
use crate::report::map::frame::scale_and_north;
use crate::report::map::inset::{detail_plan, plan_detail};
use crate::report::map::legend::legend;
use crate::report::map::options::{map_options, MapOptions};
use crate::report::map::page::{BARRIER, FONT, KEEP_OUT, PAGE_H, PAGE_W, PLAN};
use crate::report::map::plan::draw_plan;
use crate::report::map::text::r1;
use crate::report::map::title::{caution_footer, title_block};
use crate::report::map::view::View;
use svg::node::element::{Definitions, Line, Pattern, Rectangle, Title};
use svg::Document;

/// The map of a run, contouring the quantity the design file asks for.
pub fn map_svg(run: &CheckRun, grid: &LevelGrid, date: &str) -> String {
    map_svg_with(run, grid, date, &MapOptions::default())
}

/// The map of a run, with options.
pub fn map_svg_with(run: &CheckRun, grid: &LevelGrid, date: &str, opts: &MapOptions) -> String {
    let model = run.model;
    let quantity = model.map_quantity;
    let gb = grid.bounds();
    let set = grid.contours(quantity);
    let detail = plan_detail(run, gb);
    let view = detail
        .as_ref()
        .map_or_else(|| View::fit(gb, PLAN), |(v, _)| *v);
    let (mut lay, omitted, failed) = draw_plan(run, grid, &set, &view, opts, "", None);
    let defs = std::mem::replace(&mut lay.defs, Definitions::new())
        .add(hatch("hatch-keep-out", KEEP_OUT, 45.0, 7.0))
        .add(hatch("hatch-barrier", BARRIER, -45.0, 9.0))
        .add(hatch("hatch-dry", "#6b4e2e", 45.0, 4.0));
    let detail_parts = detail.map(|(_, d)| detail_plan(run, &set, &view, &d, opts));

    let legend_bottom;
    let legend = {
        let (g, bottom) = legend(run, grid, &set, opts, omitted, failed);
        legend_bottom = bottom;
        g
    };
    let (scale_bar, north) = scale_and_north(&view, legend_bottom + 14.0, model.units);
    let title = title_block(run, &set, date, opts);
    let caution = caution_footer();

    let (what, unit) = crate::report::map::text::quantity_words_in(quantity, model.units);
    let mut doc = Document::new()
        .set("xmlns", "http://www.w3.org/2000/svg")
        .set("width", PAGE_W)
        .set("height", PAGE_H)
        .set("viewBox", (0, 0, PAGE_W, PAGE_H))
        .set("font-family", FONT)
        .add(Title::new(format!(
            "{} — {} ({}) — drydig {}",
            model.name,
            what.to_lowercase(),
            unit,
            opts.command.unwrap_or("check")
        )))
        .add(defs);
    if let Some((_, d)) = &detail_parts {
        doc = doc.add(d.clone());
    }
    doc = doc.add(
        Rectangle::new()
            .set("id", "page")
            .set("x", 0)
            .set("y", 0)
            .set("width", PAGE_W)
            .set("height", PAGE_H)
            .set("fill", "#ffffff"),
    );
    for g in lay.stacked() {
        doc = doc.add(g);
    }
    if let Some((g, _)) = detail_parts {
        doc = doc.add(g);
    }
    doc.add(legend)
        .add(scale_bar)
        .add(north)
        .add(title)
        .add(caution)
        .to_string()
}

fn hatch(id: &str, colour: &str, angle: f64, gap: f64) -> Pattern {
    Pattern::new()
        .set("id", id)
        .set("patternUnits", "userSpaceOnUse")
        .set("width", r1(gap))
        .set("height", r1(gap))
        .set("patternTransform", format!("rotate({})", r1(angle)))
        .add(
            Line::new()
                .set("x1", 0)
                .set("y1", 0)
                .set("x2", 0)
                .set("y2", r1(gap))
                .set("stroke", colour)
                .set("stroke-width", 1.2),
        )
}

/// The map and GeoJSON files of an evaluated layout, the map titled for `command` ("check",
/// "design"): `map.svg`, `layout.geojson`, `contours.geojson` (one level grid for all three).
pub fn files(found: &CheckFindings, command: &'static str) -> Vec<(String, Vec<u8>)> {
    let run = &found.run;
    let grid = &found.grid;
    let mut opts = map_options(&found.neighbours, &found.verdict);
    opts.command = Some(command);
    vec![
        (
            "map.svg".into(),
            map_svg_with(run, grid, &today(), &opts).into_bytes(),
        ),
        (
            "layout.geojson".into(),
            crate::report::geojson_out::layout_geojson(run, &found.neighbours).into_bytes(),
        ),
        (
            "contours.geojson".into(),
            crate::report::geojson_out::contours_geojson(run, grid).into_bytes(),
        ),
    ]
}
