//! Every neighbour output file of `check`, rendered in memory from one assessment of the run:
//! the two tables and `settlement.svg` (none when the design has no neighbours).

use crate::check::run::CheckRun;
use crate::report::neighbours::csv_tables::{neighbour_points_csv, neighbours_csv};
use crate::report::neighbours::settlement_svg::settlement_svg;
use crate::safety::neighbours;
use crate::safety::settlement_map::settlement_map;

/// Every neighbour output file (none when the design has no neighbours).
pub fn files(run: &CheckRun) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    if run.model.neighbours.is_empty() {
        return Ok(Vec::new());
    }
    let results = neighbours::assess_run(run);
    Ok(vec![
        ("neighbours.csv".into(), neighbours_csv(&results)?),
        (
            "neighbour_points.csv".into(),
            neighbour_points_csv(&results)?,
        ),
        (
            "settlement.svg".into(),
            settlement_svg(run, &results, &settlement_map(run)).into_bytes(),
        ),
    ])
}
