//! `check`: evaluate one layout — place the wells, build the field, evaluate every check point
//! and well.

use crate::check::evaluate::Evaluation;
pub use crate::check::field_build::{evaluation_level, field_with_radius, site_origin};
use crate::field::checkpoints::{check_points, CheckPoint};
use crate::field::influence::Field;
use crate::field::layout::{self, Placement};
use crate::field::radius::design_radius;
use crate::field::wells::Well;
use crate::input::error::InputError;
use crate::input::model::Model;
use std::path::Path;

/// Everything one evaluated layout needs for its outputs.
pub struct CheckRun<'a> {
    /// The validated model.
    pub model: &'a Model,
    /// Wells and placement notes.
    pub placement: Placement,
    /// The field the wells make.
    pub field: Field,
    /// Check points.
    pub points: Vec<CheckPoint>,
    /// Results.
    pub evaluation: Evaluation,
}

impl CheckRun<'_> {
    /// What the map grid is computed from.
    pub fn grid_source(&self) -> crate::field::grid::GridSource<'_> {
        crate::field::grid::GridSource {
            model: self.model,
            field: &self.field,
            placement: &self.placement,
        }
    }
}

/// Build the field for `wells` in `model`.
pub fn field_for(model: &Model, wells: &[Well]) -> Field {
    field_with_radius(model, wells, design_radius(model).0)
}

/// Evaluate a placement (with the radius of influence taken at the drawdown the wells produce,
/// where it depends on drawdown: [`crate::check::consistent_radius`]).
pub fn evaluate_placement(model: &Model, placement: Placement) -> CheckRun<'_> {
    let points = check_points(model);
    let (field, evaluation) =
        crate::check::consistent_radius::evaluate_consistent(model, &placement.wells, &points);
    CheckRun {
        model,
        placement,
        field,
        points,
        evaluation,
    }
}

/// Evaluate the design file's layout (or the wells of a CSV file).
pub fn run<'a>(model: &'a Model, wells_csv: Option<&Path>) -> Result<CheckRun<'a>, InputError> {
    let placement = layout::from_model(model, wells_csv)?;
    let named: Vec<(&str, [f64; 2], f64)> = placement
        .wells
        .iter()
        .map(|w| (w.name.as_str(), w.position, w.radius))
        .collect();
    crate::input::validate::sides::check_wells(
        model,
        &named,
        if wells_csv.is_some() {
            "--wells"
        } else {
            "layout"
        },
    )?;
    if placement.wells.is_empty() {
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "the layout places no wells".into(),
        });
    }
    if placement.wells.iter().all(|w| w.rate == 0.0) {
        return Err(InputError { file: model.file.clone(), field: "layout.rate".into(), line: None, message: "every well has a zero rate: give layout.rate (e.g. \"4 L/s\") or rates per well; `drydig design` finds rates for you".into() });
    }
    Ok(evaluate_placement(model, placement))
}
