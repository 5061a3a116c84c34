//! Neighbours, base uplift and recharge in the outputs: the neighbours table built once for the
//! terminal, report.html and `neighbours.csv` ([`table`]), the terminal section ([`text`], with
//! the settlement in time, damage category and soil column of [`column_text`]),
//! `neighbours.csv` and `neighbour_points.csv` ([`csv_tables`]), the rule-of-thumb limits in
//! `summary.json` ([`summary`]), `settlement.svg` ([`settlement_svg`], drawn with the
//! transform, grids, colour ramp and labels of [`settlement_plot`]), the status colours
//! ([`status`]), the list of files written ([`files`]), and the settlement part of report.html
//! ([`html_section`], with the soil-column drawing of [`soil_column_svg`]); number formats in
//! [`numbers`].

pub mod column_text;
pub mod csv_tables;
pub mod files;
pub mod html_section;
pub mod numbers;
pub mod settlement_plot;
pub mod settlement_svg;
pub mod soil_column_svg;
pub mod status;
pub mod summary;
pub mod table;
pub mod text;
