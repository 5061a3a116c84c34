//! What the caller may choose for the map beyond the run itself: the status of each neighbour
//! (to colour its footprint), with its fill and legend words, and the mapping from the
//! neighbour assessment of a run ([`crate::safety::neighbours`]) to those statuses. The map owns
//! this mapping so that no report module has to import the map and be imported by it.

use crate::findings::verdict::Verdict;
use crate::safety::neighbours::{NeighbourResult, Status};

/// How a neighbour stands against its limits, for colouring its footprint.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum NeighbourStatus {
    /// Drawdown and settlement within the allowable values.
    WithinLimits,
    /// Within the limits, but close (the caller decides how close).
    NearLimit,
    /// Over an allowable value.
    OverLimit,
    /// Not assessed (no limits or no soil profile given).
    NotAssessed,
}

impl NeighbourStatus {
    pub(super) fn fill(self) -> &'static str {
        match self {
            NeighbourStatus::WithinLimits => "#cfe3c4",
            NeighbourStatus::NearLimit => "#f6d58e",
            NeighbourStatus::OverLimit => "#f1a08f",
            NeighbourStatus::NotAssessed => "#e2ddd5",
        }
    }

    pub(super) fn words(self) -> &'static str {
        match self {
            NeighbourStatus::WithinLimits => "neighbour within its limits",
            NeighbourStatus::NearLimit => "neighbour near a limit",
            NeighbourStatus::OverLimit => "neighbour over a limit",
            NeighbourStatus::NotAssessed => "neighbour not assessed",
        }
    }
}

/// Choices for the map beyond the run itself.
#[derive(Debug, Clone, Default)]
pub struct MapOptions {
    /// One status per neighbour, in the design file's order, to colour their footprints.
    /// `None` (or a list of the wrong length): one neutral colour for all.
    pub neighbour_status: Option<Vec<NeighbourStatus>>,
    /// The command that drew the map ("check", "design"); `None`: "check".
    pub command: Option<&'static str>,
    /// The verdict of the run, worded in the title block (in the failure colour when not met);
    /// `None`: no result line.
    pub verdict: Option<Verdict>,
}

/// The map's colouring of the neighbours by their assessed status, and the run's verdict.
pub fn map_options(neighbours: &[NeighbourResult], verdict: &Verdict) -> MapOptions {
    use NeighbourStatus as M;
    MapOptions {
        neighbour_status: Some(
            neighbours
                .iter()
                .map(|n| match n.status {
                    Status::Pass => M::WithinLimits,
                    Status::Close => M::NearLimit,
                    Status::Fail => M::OverLimit,
                    Status::NotChecked => M::NotAssessed,
                })
                .collect(),
        ),
        command: None,
        verdict: Some(verdict.clone()),
    }
}
