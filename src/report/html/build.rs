//! Assembling `report.html` for `check` and `design`: the context every part reads, and the list
//! of parts in order. A new feature adds a part by writing one `fn(&Context) -> Part` and one
//! line here.

use super::page::{document, Part};
use crate::check::run::CheckRun;
use crate::optimise::outcome::Design;
use crate::report::format::Fmt;

/// What every part reads.
pub struct Context<'a> {
    /// The evaluated layout.
    pub run: &'a CheckRun<'a>,
    /// The design, for `design` reports.
    pub design: Option<&'a Design>,
    /// "check" or "design".
    pub command: &'static str,
    /// The number formatter.
    pub f: Fmt,
    /// The plan map, as written to `map.svg`.
    pub map_svg: String,
    /// The section, as written to `section.svg`.
    pub section_svg: String,
    /// Date of the run.
    pub date: String,
}

/// The parts of a report, in order.
pub fn parts(cx: &Context) -> Vec<Part> {
    use super::{inputs, results, safety};
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
        safety::bid,
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
