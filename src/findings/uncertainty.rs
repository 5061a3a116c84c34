//! The findings of `uncertainty`: the sampled run and its one verdict — every target met in at
//! least the fraction of samples asked (the given layout at its rates, or the robust design).

use crate::findings::verdict::Verdict;
use crate::uncertainty::run::{Mode, UncertaintyRun};

/// What `drydig uncertainty` found.
pub struct UncertaintyFindings {
    /// The samples, outputs, swings and robust design.
    pub run: UncertaintyRun,
    /// Met at the reliability asked, or not.
    pub verdict: Verdict,
}

impl UncertaintyFindings {
    /// The findings of `run`.
    pub fn build(run: UncertaintyRun) -> UncertaintyFindings {
        let fraction_met = match run.mode {
            Mode::Check => run.fraction_met,
            Mode::Design => run.robust.as_ref().map_or(0.0, |r| r.fraction_met),
        };
        let verdict = Verdict::Sampled {
            fraction_met,
            reliability: run.reliability,
        };
        UncertaintyFindings { run, verdict }
    }
}
