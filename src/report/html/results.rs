//! The result parts of `report.html`: estimate against design, the map, the section, the wells
//! table and the worst check points.

use super::context::Context;
use super::page::{facts, inline_svg, table, Part};
use crate::field::checkpoints::PointKind;
use crate::report::format::esc;

/// Wells listed in full up to this many; beyond it, half as many with the least headroom.
const MAX_WELL_ROWS: usize = 60;

/// The quick estimate beside the superposition result.
pub fn estimate(cx: &Context) -> Part {
    let f = &cx.f;
    let est = &cx.found.estimate;
    let e = &cx.run.evaluation;
    let quick = est.total_flow_m3_per_day / 86_400.0;
    let mut body = crate::report::estimate_table::estimate_table(est).to_html(f);
    let ratio = if quick > 0.0 {
        format!("{:.2}", e.total_abstraction_m3_per_s / quick)
    } else {
        "—".into()
    };
    body.push_str(&facts(&[
        ("quick estimate, total", f.flow(quick)),
        (
            "this layout by superposition",
            f.flow(e.total_abstraction_m3_per_s),
        ),
        ("layout ÷ estimate", ratio),
        (
            "wells: estimate / layout",
            format!(
                "{} / {}",
                est.excavations
                    .iter()
                    .map(|x| x.rough_well_count)
                    .sum::<u32>(),
                cx.run.placement.wells.len()
            ),
        ),
    ]));
    body.push_str("<p class=\"note\">The quick estimate treats the excavation as one equivalent well (or a line slot); the layout sums every well and image. A ratio far from 1 asks for a second look at the layout or the inputs.</p>");
    Part::new("estimate", "Estimate against design", body)
}

/// The plan map (the same drawing as `map.svg`).
pub fn map(cx: &Context) -> Part {
    let body = format!(
        "<figure>{}<figcaption>Plan: {} with the wells, check points and neighbours. The same drawing is written as map.svg.</figcaption></figure>",
        inline_svg(&cx.map_svg, "map"),
        esc(match cx.run.model.map_quantity {
            crate::input::model::MapQuantity::Drawdown => "drawdown contours",
            crate::input::model::MapQuantity::WaterLevel => "water-level contours",
        })
    );
    Part::new("map", "Map", body).on_new_page()
}

/// The cross-section (the same drawing as `section.svg`).
pub fn section(cx: &Context) -> Part {
    let body = format!(
        "<figure>{}<figcaption>Section along the line given in the design file ([output] section) or chosen by default; levels on the left, depths below ground on the right. Written as section.svg.</figcaption></figure>",
        inline_svg(&cx.section_svg, "section")
    );
    Part::new("section", "Section", body)
}

/// Every well: position, rate, level in the well with its depth, limits.
pub fn wells(cx: &Context) -> Part {
    let f = &cx.f;
    let all = &cx.run.evaluation.wells;
    // A long line of wellpoints: the wells with the least headroom (water level above the
    // lowest level allowed), problems first; every well stays in wells.csv.
    let cut = all.len() > MAX_WELL_ROWS;
    let shown = cut.then(|| crate::report::tables::tightest_wells(cx.run, MAX_WELL_ROWS / 2));
    let table = crate::report::tables::wells_table(cx.run, shown.as_deref());
    let mut body = String::new();
    if cut {
        body.push_str(&format!(
            "<p>{} wells; the {} with the least headroom above their lowest allowed level are listed.</p>",
            all.len(),
            table.rows.len()
        ));
    }
    body.push_str(&table.to_html(f));
    for n in &cx.run.placement.notes {
        body.push_str(&format!(
            "<p class=\"note\">{}</p>",
            esc(&n.words(cx.run.model.units))
        ));
    }
    body.push_str(
        "<p class=\"note\">Every well is also in <a href=\"wells.csv\">wells.csv</a>.</p>",
    );
    Part::new("wells", "Wells", body).on_new_page()
}

/// The ten check points with the lowest margin, and every named point.
pub fn checkpoints(cx: &Context) -> Part {
    let f = &cx.f;
    let pts = &cx.run.evaluation.points;
    let mut order: Vec<usize> = (0..pts.len())
        .filter(|&i| pts[i].margin_m.is_some())
        .collect();
    order.sort_by(|&a, &b| {
        pts[a]
            .margin_m
            .unwrap_or(f64::INFINITY)
            .total_cmp(&pts[b].margin_m.unwrap_or(f64::INFINITY))
    });
    order.truncate(10);
    for (i, p) in pts.iter().enumerate() {
        if p.point.kind == PointKind::Named && !order.contains(&i) {
            order.push(i);
        }
    }
    let rows: Vec<Vec<String>> = order
        .iter()
        .map(|&i| {
            let p = &pts[i];
            vec![
                esc(&p.point.name),
                esc(&f.length_value(p.point.position[0])),
                esc(&f.length_value(p.point.position[1])),
                esc(&p
                    .point
                    .target_level
                    .map_or("report only".into(), |z| f.length_value(z))),
                esc(&p
                    .point
                    .target_level
                    .map_or("—".into(), |z| f.depth_value(z))),
                esc(&p.level_m.map_or("dry".into(), |z| f.length_value(z))),
                esc(&p.level_m.map_or("—".into(), |z| f.depth_value(z))),
                esc(&p.margin_m.map_or("—".into(), |m| f.length_value(m))),
                match p.met {
                    Some(true) => "met".into(),
                    Some(false) => "<span class=\"bad\">not met</span>".into(),
                    None => "—".into(),
                },
            ]
        })
        .collect();
    let lu = f.lu();
    let head = [
        "check point".to_string(),
        format!("#x ({lu})"),
        format!("#y ({lu})"),
        format!("#target ({lu})"),
        format!("#target depth bgl ({lu})"),
        format!("#water level ({lu})"),
        format!("#water depth bgl ({lu})"),
        format!("#margin ({lu})"),
        "result".to_string(),
    ];
    let head: Vec<&str> = head.iter().map(String::as_str).collect();
    let mut body = format!(
        "<p>The ten of {} check points with the least margin below target{}. Every point is in <a href=\"checkpoints.csv\">checkpoints.csv</a>.</p>",
        pts.len(),
        if pts.iter().any(|p| p.point.kind == PointKind::Named) {
            ", then every named point"
        } else {
            ""
        }
    );
    body.push_str(&table(&head, &rows));
    Part::new("checkpoints", "Check points", body)
}
