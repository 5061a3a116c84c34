//! What every part of `report.html` reads: the findings of the evaluated layout, the design
//! (for `design`), the formatter and the drawings already rendered.

use crate::check::run::CheckRun;
use crate::findings::check::CheckFindings;
use crate::optimise::outcome::Design;
use crate::report::format::Fmt;

/// What every part reads.
pub struct Context<'a> {
    /// The evaluated layout.
    pub run: &'a CheckRun<'a>,
    /// Everything found for it (neighbours, uplift, estimate, bid, verdict).
    pub found: &'a CheckFindings<'a>,
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
