//! Findings: every result a command's outputs show, computed once, between the engine stages
//! (check, safety, optimise, transient, test_analysis) and `report/`.
//!
//! A findings value is built once per run from the engine's results: the evaluation, the
//! neighbour assessment, uplift, the section, the level grid, the quick estimate, the bid and the
//! one typed [`verdict::Verdict`] that decides the headline of every output and the exit code.
//! `report/` reads findings and formats them; it makes no engine call (checked by
//! `scripts/module_graph.py`).
//!
//! `verdict` holds the verdict and its exit code; `section` the choice of the section line;
//! `check` the findings of one evaluated layout (`check`, and the layout `design` chose);
//! `design` the findings of `design`; `commands` the findings of the other commands; `walls` the cut-off walls' quantities and
//! the size of their solve.

pub mod check;
pub mod commands;
pub mod design;
pub mod section;
pub mod uncertainty;
pub mod verdict;
pub mod walls;
