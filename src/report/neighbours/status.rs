//! The colour of a neighbour's status (within limits, close, over, not checked), used for the
//! building outlines and legend of `settlement.svg`; one place so every picture of the
//! neighbours shows a status the same way.

use crate::safety::neighbours::Status;

/// Colour of a status on maps (also for the map owner to reuse).
pub fn status_colour(status: Status) -> &'static str {
    match status {
        Status::Pass => "#2e8b57",
        Status::Close => "#d99a00",
        Status::Fail => "#c0282d",
        Status::NotChecked => "#7a7a7a",
    }
}
