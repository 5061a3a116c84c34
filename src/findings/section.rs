//! Which section line the outputs draw: the line of `[output] section` when given, else
//! [`crate::check::section::default_line`] towards the neighbour with the largest drawdown.

use crate::check::run::CheckRun;
use crate::check::section::{default_line, section, Section};
use crate::safety::neighbours::NeighbourResult;
use geo::Centroid;

/// The section of a run, given its neighbour assessment (in the design file's order).
pub fn section_of(run: &CheckRun, neighbours: &[NeighbourResult]) -> Section {
    if let Some(line) = run.model.output.section {
        return section(run, line, "line given in [output] section");
    }
    let worst = neighbours
        .iter()
        .zip(&run.model.neighbours)
        .max_by(|a, b| {
            a.0.worst_drawdown
                .drawdown_m
                .total_cmp(&b.0.worst_drawdown.drawdown_m)
        })
        .and_then(|(_, n)| n.footprint.centroid())
        .map(|c| [c.x(), c.y()]);
    let (line, basis) = default_line(run, worst);
    section(run, line, &basis)
}
