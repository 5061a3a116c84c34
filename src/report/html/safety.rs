//! The safety parts of `report.html`: neighbours, base uplift, cautions.

use super::context::Context;
use super::page::{table, Part};
use crate::report::format::esc;
use crate::report::neighbours::table::neighbours_table;
use crate::report::neighbours::text::rule_of_thumb_note;

/// Each neighbour: worst drawdown, settlement and distortion against the limits.
pub fn neighbours(cx: &Context) -> Part {
    let f = &cx.f;
    let results = &cx.found.neighbours;
    if results.is_empty() {
        return Part::new(
            "neighbours",
            "Neighbours",
            "<p>No neighbouring buildings are given in the design file.</p>".into(),
        );
    }
    let mut body = neighbours_table(results).to_html(f);
    if let Some(note) = rule_of_thumb_note(results, cx.run.model.units) {
        body.push_str(&format!("<p class=\"note\">{}</p>", esc(&note)));
    }
    let body = body
        + "<p class=\"note\">Every sample under each building is in neighbours.csv; settlement.svg draws them.</p>"
        + &crate::report::neighbours::html_section::settlement_section(
            results,
            &crate::report::neighbours::settlement_svg::settlement_svg(
                cx.run,
                results,
                &cx.found.settlement,
            ),
            f,
            cx.run.model.units,
        );
    Part::new("neighbours", "Neighbours", body)
}

/// The base-uplift check of each excavation.
pub fn uplift(cx: &Context) -> Part {
    let f = &cx.f;
    let results = &cx.found.uplift;
    if results.is_empty() {
        return Part::new(
            "uplift",
            "Base uplift",
            "<p>No confined layer below the formation is given ([uplift]); the base-uplift check was not made.</p>".into(),
        );
    }
    let fos = |x: Option<f64>| x.map_or("no uplift pressure".into(), |v| format!("{v:.2}"));
    let rows: Vec<Vec<String>> = results
        .iter()
        .map(|u| {
            vec![
                esc(&u.excavation),
                esc(&f.level(u.layer_top_m)),
                esc(&fos(u.factor_of_safety_before)),
                format!("{:.2}", u.factor_of_safety_required),
                esc(&f.level(u.required_head_m)),
                esc(&fos(u.factor_of_safety_after)),
                match u.pass_after {
                    Some(true) => "pass".into(),
                    Some(false) => "<span class=\"bad\">FAIL</span>".into(),
                    None => "—".into(),
                },
            ]
        })
        .collect();
    let mut body = table(
        &[
            "excavation",
            "layer top (depth)",
            "#FoS before",
            "#FoS required",
            "head needed (depth)",
            "#FoS after",
            "result",
        ],
        &rows,
    );
    body.push_str(&format!(
        "<p class=\"note\">{}</p>",
        esc(crate::safety::uplift::METHOD)
    ));
    Part::new("uplift", "Base uplift", body)
}

/// The caution every output carries, and what the run noted.
pub fn cautions(cx: &Context) -> Part {
    let mut body = format!(
        "<p class=\"caution\">{}</p>\n",
        esc(crate::caution::CAUTION)
    );
    let units = cx.run.model.units;
    let mut notes: Vec<String> = cx
        .run
        .placement
        .notes
        .iter()
        .map(|n| n.words(units))
        .collect();
    if let Some(d) = cx.design {
        notes.extend(d.notes.iter().map(|n| n.words(units)));
    }
    notes.extend(
        cx.run
            .model
            .import_notes
            .iter()
            .map(|n| n.words(cx.run.model.units)),
    );
    notes.extend(cx.run.model.crs_warnings.iter().cloned());
    if !notes.is_empty() {
        body.push_str("<ul>\n");
        for n in notes {
            body.push_str(&format!("<li>{}</li>\n", esc(&n)));
        }
        body.push_str("</ul>\n");
    }
    Part::new("cautions", "Cautions", body)
}
