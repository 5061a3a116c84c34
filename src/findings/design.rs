//! The findings of `design`: the search, and the chosen (or best) layout evaluated as `check`
//! evaluates it, with the one verdict of the run.

use crate::findings::check::CheckFindings;
use crate::findings::verdict::{of_design, Verdict};
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::input::prices::Price;
use crate::optimise::outcome::{final_run, Design};

/// Everything the outputs of `design` show.
pub struct DesignFindings<'a> {
    /// How the search ended, the layouts tried, notes.
    pub design: Design,
    /// The chosen (or best) layout, when there is one.
    pub chosen: Option<CheckFindings<'a>>,
    /// Met, or what is short.
    pub verdict: Verdict,
}

impl<'a> DesignFindings<'a> {
    /// The findings of `design` on `model`, the chosen layout's bid priced with `prices` when
    /// given (`Err`: a price that does not fit its line, naming the price file's line).
    pub fn build(
        model: &'a Model,
        design: Design,
        prices: Option<&[Price]>,
    ) -> Result<Self, InputError> {
        let mut chosen = final_run(model, &design).map(|run| CheckFindings::build(run, None));
        let verdict = of_design(
            &design,
            chosen
                .as_ref()
                .map(|c| (&c.run.evaluation, c.neighbours.as_slice())),
        );
        if let Some(c) = chosen.as_mut() {
            // The report of the chosen layout carries the design's verdict, and its bid sheet
            // the quick estimate of the excavation the design was searched for.
            c.verdict = verdict.clone();
            c.sheet = crate::bid::sheet::lines(
                &c.bid,
                design.estimate.total_flow_l_per_s / 1e3,
                model.units,
            );
            c.costs = prices
                .map(|p| crate::bid::pricing::costs(&c.sheet, p))
                .transpose()?;
        }
        Ok(DesignFindings {
            design,
            chosen,
            verdict,
        })
    }
}
