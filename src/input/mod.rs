//! Stage 1, input: the design file as written, turned into the validated model.
//!
//! `units` (quantity strings → SI) → `schema` (the file's serde types) → `model` (validation,
//! the [`model::Model`] the engine computes on) with `error` for messages that name the field;
//! `starter` writes a commented design file; `read` is the one size-capped reader of every input
//! file (regular files only).

pub mod error;
pub mod import;
pub mod model;
pub mod model_bid;
pub mod model_layers;
pub mod model_uncertainty;
pub mod model_walls;
pub mod prices;
pub mod read;
pub mod schema;
pub mod schema_uncertainty;
pub mod starter;
pub mod units;
pub mod validate;
