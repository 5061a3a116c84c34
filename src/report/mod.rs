//! Formatting results for people and programs: one file per output format.

pub mod as_built_text;
pub mod bid_out;
pub mod by_day_text;
pub mod check_outputs;
pub mod check_text;
pub mod design_text;
pub mod dxf_out;
pub mod estimate_table;
pub mod estimate_text;
pub mod files;
pub mod format;
pub mod geojson_out;
pub mod geojson_wgs84;
pub mod html;
pub mod map;
pub mod neighbours;
pub mod plot_kit;
pub mod problems;
pub mod programme_charts;
pub mod programme_map;
pub mod programme_text;
pub mod pumping_test_chart;
pub mod pumping_test_text;
pub mod section_svg;
pub mod sweep_chart;
pub mod table;
pub mod tables;
pub mod uncertainty_chart;
pub mod uncertainty_files;
pub mod uncertainty_text;
pub mod verdict;
pub mod words;

/// The caution carried by every output (defined once in [`crate::caution`]).
pub use crate::caution::CAUTION;

// Re-exports keep the older paths (`report::wrap`, `report::check_files`, …) that callers
// across report/ and the tests use.
pub use check_outputs::{check_files, check_files_for};
pub use words::{thousands, wrap};
