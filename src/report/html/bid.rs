//! The bid part of `report.html`: the bid sheet (quantity, unit, category, hire weeks), and
//! with the user's unit prices (`design --prices`) each line's cost, the subtotal of each
//! category and the total; then how each line was found.

use super::context::Context;
use super::page::{table, Part};
use crate::report::bid_out::quantity_text;
use crate::report::format::esc;

/// The bid sheet, priced when the run has prices.
pub fn bid(cx: &Context) -> Part {
    let sheet = &cx.found.sheet;
    let priced = cx.found.costs.as_ref();
    let mut body = String::new();
    let mut head = vec!["item", "category", "#quantity", "unit", "#weeks"];
    if priced.is_some() {
        head.extend(["#unit price", "per", "#cost"]);
    }
    let rows: Vec<Vec<String>> = sheet
        .iter()
        .map(|l| {
            let mut r = vec![
                esc(&l.item),
                esc(l.category.name()),
                quantity_text(&l.unit, l.quantity, 1),
                esc(&l.unit),
                l.weeks.map_or(String::new(), |w| format!("{w:.0}")),
            ];
            if let Some(c) = priced {
                let hit = c.lines.iter().find(|c| c.item == l.item);
                r.push(hit.map_or(String::new(), |c| format!("{:.2}", c.unit_price)));
                r.push(hit.map_or(String::new(), |c| esc(&c.price_per)));
                r.push(hit.map_or(String::new(), |c| format!("{:.2}", c.cost)));
            }
            r
        })
        .collect();
    body.push_str(&table(&head, &rows));
    match priced {
        Some(c) => {
            let mut rows: Vec<Vec<String>> = c
                .subtotals
                .iter()
                .map(|(cat, sum)| vec![esc(cat.name()), format!("{sum:.2}")])
                .collect();
            rows.push(vec![
                "<b>total of the priced lines</b>".into(),
                format!("<b>{:.2}</b>", c.total),
            ]);
            body.push_str("<h3>Cost by category (your unit prices)</h3>\n");
            body.push_str(&table(&["category", "#cost"], &rows));
            if !c.unused.is_empty() {
                body.push_str(&format!(
                    "<p class=\"note\">Prices with no bid line of that name: {}.</p>",
                    esc(&c.unused.join(", "))
                ));
            }
        }
        None => body.push_str(
            "<p class=\"note\">Give your unit prices with <code>drydig design --prices</code> to price the sheet: a hired line per week, days of work per day, energy per kWh.</p>",
        ),
    }
    body.push_str("<h3>How each line was found</h3>\n");
    let basis: Vec<Vec<String>> = sheet
        .iter()
        .map(|l| vec![esc(&l.item), esc(&l.basis)])
        .collect();
    body.push_str(&table(&["item", "basis"], &basis));
    // The engine's own notes are worded in SI; the sheet's basis above is in the user's units.
    if cx.f.units == crate::input::units::UnitSystem::Si {
        for s in &cx.found.bid.basis {
            body.push_str(&format!("<p class=\"note\">{}</p>", esc(s)));
        }
    }
    Part::new("bid", "Bid", body)
}
