//! Validation: the design file as written ([`crate::input::schema`]) checked value by value and
//! turned into the [`crate::input::model::Model`] the engine computes on. Every refusal names
//! the file, the field (and line where known) and what would be valid.
//!
//! `file` reads and parses and assembles the model from the parts: `shapes` (outlines, lines,
//! boundaries, keep-out zones), `aquifer` (aquifer and radius-of-influence method), `wells`
//! (well specification and layout), `neighbours` (buildings and the base-uplift check),
//! `ranges` (levels, coordinates, counts and names a real site can have), `derived` (what the
//! formulas compute from them: distance of influence, leakage factor, equivalent radius, the
//! number of check points), `as_built` (screens, well losses, header level, spacing limits,
//! recharge limits), `sides` (everything on the aquifer side of every boundary),
//! `design_settings` (operating margin, capacity fraction, one well out, pumps), `bid` (the bid's
//! durations and rules of thumb),
//! `simple` (outlines of many vertices: simplicity by R-tree, simplification), `output` (map
//! extent, contour interval, section line), `site_grid` (the site coordinate system checked at
//! the site: unit, parameters, round trip, scale factor).

pub mod aquifer;
pub mod as_built;
pub mod bid;
pub mod derived;
pub mod design_settings;
pub mod file;
pub mod layers;
pub mod neighbours;
pub mod output;
pub mod programme;
pub mod ranges;
pub mod rolling;
pub mod shapes;
pub mod sides;
pub mod simple;
pub mod site_grid;
pub mod uncertainty;
pub mod walls;
pub mod wells;
