//! `map.svg`: a plan of the evaluated layout for a design report.
//!
//! Landscape page, 1400 × 1000 px. The plan fills the left part at one scale in x and y (north
//! up); a column on the right holds the legend, the north arrow and scale bar, and the title
//! block; the caution runs along the foot of the page.
//!
//! Layers, bottom to top, each an SVG group with a fixed id (tests rely on the order):
//! `bands` (light fills between contours), `far-side` (ground past a boundary line),
//! `contours`, `paths` (the ring or lines the wells were set out on), `keep-outs`,
//! `neighbours`, `excavations`, `boundaries`, `dry-area`, `wells`, `failed-points`,
//! `excavation-labels`, `contour-labels`, `frame`, `legend`, `scale-bar`, `north-arrow`, `title-block`, `caution`.
//!
//! Site coordinates are turned into page pixels here, in f64, and written rounded to 0.1 px,
//! so projected coordinates (x ≈ 500 000 m) lose nothing in the `svg` crate's f32 storage.
//!
//! One idea per file: [`render`] assembles the page from [`plan`] (one plan's layers, drawn by
//! [`contours`], [`features`], [`wells`], [`points`], [`named`] and [`frame`]), [`inset`] (the detail plan),
//! [`legend`] and [`title`]; [`view`] turns site metres into pixels, [`labels`] keeps labels
//! apart, [`symbols`] sizes the well and point marks, [`text`] writes numbers and text,
//! [`page`] holds the page geometry and palette, [`options`] the caller's choices, and [`date`]
//! the date stamp.

pub mod contours;
pub mod date;
pub mod features;
pub mod frame;
pub mod inset;
pub mod labels;
pub mod layers;
pub mod legend;
pub mod named;
pub mod options;
pub mod page;
pub mod plan;
pub mod points;
pub mod render;
pub mod symbols;
pub mod text;
pub mod title;
pub mod view;
pub mod walls;
pub mod wells;
