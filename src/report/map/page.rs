//! The page of `map.svg`: its size, the areas for the plan, the right-hand column and the
//! caution footer, the font stack and the palette every layer draws with. Constants only, so
//! every other file of the map takes its measures and colours from one place.

/// Page width, px.
pub const PAGE_W: f64 = 1400.0;

/// Page height, px.
pub const PAGE_H: f64 = 1000.0;

/// The area the plan may use: [left, top, right, bottom], px.
pub(super) const PLAN: [f64; 4] = [64.0, 20.0, 1040.0, 900.0];

/// The right-hand column: [left, right], px.
pub(super) const PANEL: [f64; 2] = [1064.0, 1380.0];

/// Top of the caution footer, px.
pub(super) const FOOTER_TOP: f64 = 934.0;

pub(super) const FONT: &str = "DejaVu Sans, Verdana, Arial, Helvetica, sans-serif";
pub(super) const INK: &str = "#1e2a33";
pub(super) const CONTOUR: &str = "#2b5d7d";
pub(super) const EXCAVATION: &str = "#111111";
pub(super) const WELL: &str = "#14365a";
pub(super) const RECHARGE: &str = "#1b8a6b";
pub(super) const CONSTANT_HEAD: &str = "#2c7fb8";
pub(super) const BARRIER: &str = "#5b5b5b";
pub(super) const KEEP_OUT: &str = "#b0452e";
pub(super) const FAIL: &str = "#d7191c";
