//! Stage 3, the field: where the wells and check points are and what each well does to the
//! level there.
//!
//! `shape` (length, width and whether an outline is a trench) → `radius` (the radius of
//! influence superposition uses) → `wells` and `layout` (ring, line, listed, CSV) →
//! `checkpoints` (grid, corners, edges, named points) → `influence` (the superposition kernel)
//! (with `near_field`, partial penetration near the wells) → `grid` (the regular grid of levels behind the maps).

pub mod centre_line;
pub mod checkpoints;
pub mod fast_log;
pub mod grid;
pub mod influence;
pub mod layered;
pub mod layout;
pub mod layout_notes;
pub mod near_field;
pub mod radius;
pub mod shape;
pub mod wall_far;
pub mod walls;
pub mod wells;
pub mod wells_csv;
