//! The findings of one evaluated layout: what `check` shows, and what `design` shows of the
//! layout it chose. Built once; every output reads the same values.

use crate::bid::line::BidLine;
use crate::bid::pricing::Costs;
use crate::bid::quantities::{bid_of, Bid};
use crate::bid::sheet::lines;
use crate::check::run::CheckRun;
use crate::check::section::Section;
use crate::estimate::{estimate, Estimate};
use crate::field::grid::LevelGrid;
use crate::findings::section::section_of;
use crate::findings::verdict::{of_evaluation, Verdict};
use crate::findings::walls::{walls_of, WallFindings};
use crate::optimise::recharge::RechargeSizing;
use crate::safety::neighbours::{assess_run, NeighbourResult};
use crate::safety::settlement_map::{settlement_map, SettlementMap};
use crate::safety::uplift::{self, UpliftResult};

/// Everything the outputs of an evaluated layout show.
pub struct CheckFindings<'a> {
    /// The evaluated layout (model, wells, field, check points, evaluation).
    pub run: CheckRun<'a>,
    /// Recharge wells sized to protect the neighbours (`check --size-recharge`).
    pub recharge: Option<RechargeSizing>,
    /// Each neighbour assessed, in the design file's order.
    pub neighbours: Vec<NeighbourResult>,
    /// Base uplift of each excavation with a confined layer below.
    pub uplift: Vec<UpliftResult>,
    /// The section drawn (line and levels along it).
    pub section: Section,
    /// The level grid behind the map, contours and drawing.
    pub grid: LevelGrid,
    /// Settlement on a grid under each neighbour with a soil profile.
    pub settlement: SettlementMap,
    /// The quick hand estimate, for comparison.
    pub estimate: Estimate,
    /// The bid quantities of the layout.
    pub bid: Bid,
    /// The bid sheet: its lines in the user's units, each with its category.
    pub sheet: Vec<BidLine>,
    /// The sheet priced with the user's unit prices (`design --prices`), once for every output.
    pub costs: Option<Costs>,
    /// Met, or what is short (targets, wells, neighbours).
    pub verdict: Verdict,
    /// The cut-off walls: quantities and the size of their solve (`None` without walls).
    pub walls: Option<WallFindings>,
}

impl<'a> CheckFindings<'a> {
    /// Every finding of `run`, each computed once.
    pub fn build(run: CheckRun<'a>, recharge: Option<RechargeSizing>) -> Self {
        let neighbours = assess_run(&run);
        let uplift = uplift::assess_run(&run);
        let section = section_of(&run, &neighbours);
        let grid = LevelGrid::for_run(&run.grid_source());
        let settlement = settlement_map(&run);
        let estimate = estimate(run.model);
        let bid = bid_of(run.model, &run);
        let sheet = lines(
            &bid,
            estimate.total_flow_m3_per_day / 86_400.0,
            run.model.units,
        );
        let verdict = of_evaluation(&run.evaluation, &neighbours);
        let walls = walls_of(&run);
        CheckFindings {
            run,
            recharge,
            neighbours,
            uplift,
            section,
            grid,
            settlement,
            estimate,
            bid,
            sheet,
            costs: None,
            verdict,
            walls,
        }
    }

    /// Every neighbour within its limits (none over).
    pub fn neighbours_ok(&self) -> bool {
        crate::findings::verdict::neighbours_over(&self.neighbours) == 0
    }
}
