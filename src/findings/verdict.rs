//! The one verdict of a run: met, or what is short, with its exit code. Every output (terminal,
//! report.html, map.svg) words it from this value through `report::verdict`; none decides it
//! again from the numbers or from text.

use crate::check::evaluate::Evaluation;
use crate::optimise::outcome::{Design, Outcome};
use crate::safety::neighbours::{NeighbourResult, Status};
use serde::Serialize;

/// Exit code of a run whose targets and limits are all met.
pub const EXIT_MET: u8 = 0;
/// Exit code of a run that computed, but where a target or limit is not met (outputs written).
pub const EXIT_NOT_MET: u8 = 3;

/// What is short in an evaluated layout.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Default)]
pub struct Shortfalls {
    /// Check points whose water stays above their target.
    pub points_above_target: usize,
    /// Wells over one of their limits (level, capacity, header).
    pub wells_over_limits: usize,
    /// Neighbours over a settlement, distortion or drawdown limit.
    pub neighbours_over_limits: usize,
}

impl Shortfalls {
    /// Nothing short.
    pub fn none(&self) -> bool {
        *self == Shortfalls::default()
    }
}

/// The verdict of a run.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "verdict", rename_all = "kebab-case")]
pub enum Verdict {
    /// Every target met; every well and every neighbour within its limits.
    Met,
    /// The layout was evaluated and something is short.
    NotMet(Shortfalls),
    /// `design`: no layout tried meets every target within the well limits; the best one.
    NoLayoutMeets {
        /// Wells in the best layout.
        count: usize,
        /// Its worst check point.
        worst_point: String,
        /// How far the water stays above the target there, m.
        shortfall_m: f64,
        /// Neighbours over a limit with the best layout.
        neighbours_over_limits: usize,
    },
    /// `design`: no layout of this kind can work.
    Impossible {
        /// Why, in words.
        reason: String,
    },
    /// `sweep`: no value of the range meets every target.
    NoValueMeets,
    /// `programme`: a stage never reached, or a well scheduled below its lowest level.
    ProgrammeShort {
        /// Stages whose level is never reached.
        stages_unreached: usize,
        /// Wells that would pump below their lowest allowed level.
        well_breaches: usize,
    },
    /// `design --by-day`: the targets of the day are not met.
    DayNotMet,
    /// `pumping-test`: no method fitted the data.
    NoFit,
    /// `uncertainty`: every target met in `fraction_met` of the samples (the given layout at its
    /// rates, or the robust design), against the `reliability` asked (both 0 … 1).
    Sampled {
        /// Fraction of samples with every target met.
        fraction_met: f64,
        /// Fraction asked.
        reliability: f64,
    },
}

impl Verdict {
    /// Every target and limit met.
    pub fn is_met(&self) -> bool {
        match self {
            Verdict::Sampled {
                fraction_met,
                reliability,
            } => *fraction_met + 1e-12 >= *reliability,
            v => *v == Verdict::Met,
        }
    }

    /// The exit code: 0 met, 3 computed but not met.
    pub fn exit_code(&self) -> u8 {
        if self.is_met() {
            EXIT_MET
        } else {
            EXIT_NOT_MET
        }
    }
}

/// Neighbours over a limit.
pub fn neighbours_over(neighbours: &[NeighbourResult]) -> usize {
    neighbours
        .iter()
        .filter(|n| n.status == Status::Fail)
        .count()
}

/// The verdict of one evaluated layout and its neighbours.
pub fn of_evaluation(e: &Evaluation, neighbours: &[NeighbourResult]) -> Verdict {
    let short = Shortfalls {
        points_above_target: if e.targets_met {
            0
        } else {
            e.unmet_count.max(1)
        },
        wells_over_limits: e.wells.iter().filter(|w| !w.problems.is_empty()).count(),
        neighbours_over_limits: neighbours_over(neighbours),
    };
    if short.none() && e.targets_met && e.wells_ok {
        Verdict::Met
    } else {
        Verdict::NotMet(short)
    }
}

/// The verdict of `design`: how the search ended, then the chosen layout as `check` sees it.
pub fn of_design(design: &Design, checked: Option<(&Evaluation, &[NeighbourResult])>) -> Verdict {
    match &design.outcome {
        Outcome::Met { .. } => match checked {
            Some((e, n)) => of_evaluation(e, n),
            None => Verdict::NotMet(Shortfalls::default()),
        },
        Outcome::NotMet {
            count,
            worst_point,
            shortfall_m,
            ..
        } => Verdict::NoLayoutMeets {
            count: *count,
            worst_point: worst_point.clone(),
            shortfall_m: *shortfall_m,
            neighbours_over_limits: checked.map_or(0, |(_, n)| neighbours_over(n)),
        },
        Outcome::Impossible { reason } => Verdict::Impossible {
            reason: reason.clone(),
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn only_met_exits_zero() {
        // The exit codes of the command line: 0 met, 3 computed but not met (common practice
        // (no source): a script tells success from a failed check without reading text).
        assert_eq!(Verdict::Met.exit_code(), 0);
        for v in [
            Verdict::NotMet(Shortfalls {
                points_above_target: 1,
                ..Default::default()
            }),
            Verdict::NoValueMeets,
            Verdict::NoFit,
            Verdict::DayNotMet,
            Verdict::Impossible { reason: "x".into() },
        ] {
            assert_eq!(v.exit_code(), 3, "{v:?}");
        }
    }
}
