//! `report.html`: the design report as one self-contained file (inline CSS and SVG, no script,
//! no external assets), print-ready on A4 and US Letter.
//!
//! `page` holds the document shell (CSS, page header, one `<section>` per part); `inputs` the
//! summary, inputs and methods; `results` the estimate comparison, map, section, wells and check
//! points; `safety` neighbours, uplift and cautions; `bid` the bid sheet (priced, with category subtotals,
//! when the run has prices); `context` is what every part
//! reads; `build` assembles the parts for `check` and `design`. Each part is one function returning a [`page::Part`], so later
//! features add a part by adding a function and one line in `build`.

pub mod bid;
pub mod build;
pub mod context;
pub mod inputs;
pub mod page;
pub mod results;
pub mod safety;
pub mod uncertainty;
