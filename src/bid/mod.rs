//! The bid: what an estimator prices for a designed layout, with time.
//!
//! `quantities` (wells, drilling or jetting, screen, pumps by class and head, power, header or
//! collecting main) → `vacuum_sets` (wellpoint pump sets sized for air and water from a table of
//! common-practice sizes) → `durations` (mobilise, install, pumping, removal, hire weeks, energy
//! over the pumping, monitoring piezometers, settlement tank and discharged volume) → `line` (one
//! line of the sheet, its category: capital, hire per week, running, one-off, information; the
//! display units) → `sheet` and `time_lines` (the lines in the user's units) → `pricing` (the user's unit prices times quantity and duration, the total split by
//! category).

pub mod durations;
pub mod line;
pub mod pricing;
pub mod quantities;
pub mod sheet;
pub mod time_lines;
pub mod vacuum_sets;
