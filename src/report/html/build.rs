//! Assembling `report.html` for `check` and `design`: the list of parts in order (the context
//! every part reads is in `context`). A new feature adds a part by writing one `fn(&Context) -> Part` and one
//! line here.

use super::context::Context;
use super::page::{document, Part};

/// The parts of a report, in order.
pub fn parts(cx: &Context) -> Vec<Part> {
    use super::{bid, inputs, results, safety};
    let makers: [fn(&Context) -> Part; 12] = [
        inputs::summary,
        inputs::inputs,
        inputs::methods,
        results::estimate,
        results::map,
        results::section,
        results::wells,
        results::checkpoints,
        safety::neighbours,
        safety::uplift,
        bid::bid,
        safety::cautions,
    ];
    makers.iter().map(|m| m(cx)).collect()
}

/// The report document.
pub fn report(cx: &Context) -> String {
    let title = match cx.command {
        "design" => "Dewatering design report",
        _ => "Dewatering check report",
    };
    document(&cx.run.model.name, &cx.date, title, &parts(cx))
}
