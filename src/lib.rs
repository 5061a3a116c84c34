//! drydig: construction dewatering well-field design by superposition.
//!
//! The modules follow the data, one stage each, in the order it flows:
//!
//! 0. [`geometry`] — plane geometry on site coordinates that `geo` does not offer as such.
//! 1. [`input`] — the design file: units into SI, the raw schema, validation into the
//!    [`input::model::Model`] the engine computes on, errors that name the field, the starter file.
//! 2. [`physics`] — the published formulas (Thiem, Dupuit–Thiem, Theis, Hantush, Strack's
//!    discharge potential, radius of influence, images, capacity, uplift), one idea per module.
//! 3. [`field`] — where things are: geometry, the radius used by superposition, well layouts,
//!    check points, and the superposition kernel that sums every well's effect.
//! 4. [`estimate`] — the quick hand method (equivalent well or line slot) for comparison.
//! 5. [`check`] — one layout evaluated: levels at every check point and in every well.
//! 6. [`safety`] — what the drawdown does around the pit: neighbours, settlement, base uplift.
//! 7. [`optimise`] — well limits, rates by linear programme, the count search, sweeps, recharge.
//! 8. [`transient`] — time: Theis / Hantush superposition in space and time with rates that change
//!    in steps, images in time.
//! 9. [`test_analysis`] — a constant-rate pumping test fitted for T, S (and B).
//! 10. [`findings`] — every result the outputs show, built once per run, with the one verdict.
//! 11. [`report`] — output formats only, reading findings: terminal text, tables, GeoJSON, SVG
//!     maps and charts.
//! 12. [`app`] — one command: model → findings → rendered outputs.
//!
//! [`work_counts`] counts the work done (LP solves, kernel sums), for `design -v`.
//!
//! [`cli`] holds the command-line arguments; the binary only parses, calls, prints and exits.
#![forbid(unsafe_code)]

pub mod app;
pub mod bid;
pub mod caution;
pub mod check;
pub mod cli;
pub mod estimate;
pub mod field;
pub mod findings;
pub mod geometry;
pub mod input;
pub mod optimise;
pub mod physics;
pub mod plural;
pub mod report;
pub mod safety;
pub mod test_analysis;
pub mod transient;
pub mod uncertainty;
pub mod work_counts;
