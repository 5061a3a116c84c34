//! The quick estimate as one [`Table`]: per excavation its method, radius of influence, steady
//! and design flow and rough well count, in SI; the terminal (`estimate` with several
//! excavations) and report.html render it in the user's units.

use crate::estimate::{Estimate, FlowMethod};
use crate::report::table::{Cell, Column, Csv, Quantity, Table};

/// Seconds in a day: the estimate keeps its flows in m³/day, the table in m³/s.
const DAY: f64 = 86_400.0;

/// The method of an excavation's estimate in a few words.
pub fn method_words(method: FlowMethod) -> &'static str {
    match method {
        FlowMethod::EquivalentWell => "equivalent well",
        FlowMethod::LineSlot => "line slot",
        FlowMethod::NoneNeeded => "none needed",
    }
}

/// One row per excavation of `est`; the design flow is shown in the terminal only (report.html
/// compares the steady flow with the layout's).
pub fn estimate_table(est: &Estimate) -> Table {
    use Quantity::{Count, Flow, Length, Words};
    let col = |title, quantity, html, csv| Column {
        title,
        quantity,
        terminal: true,
        html,
        csv,
    };
    let columns = vec![
        col("excavation", Words, true, Csv::Name("excavation")),
        col("method", Words, true, Csv::Words("method")),
        col(
            "radius of influence",
            Length,
            true,
            Csv::Fixed("radius_of_influence_m", 1.0, 2),
        ),
        col(
            "steady flow",
            Flow,
            true,
            Csv::Fixed("steady_flow_m3_per_day", DAY, 1),
        ),
        col(
            "design flow",
            Flow,
            false,
            Csv::Fixed("design_flow_m3_per_day", DAY, 1),
        ),
        col(
            "rough well count",
            Count,
            true,
            Csv::Words("rough_well_count"),
        ),
    ];
    let rows = est
        .excavations
        .iter()
        .map(|x| {
            vec![
                Cell::Text(x.name.clone()),
                Cell::Text(method_words(x.flow_method).into()),
                Cell::Length(x.radius_of_influence_m),
                Cell::Flow(x.total_flow_m3_per_day / DAY),
                Cell::Flow(x.design_flow_m3_per_day / DAY),
                Cell::Count(u64::from(x.rough_well_count)),
            ]
        })
        .collect();
    Table { columns, rows }
}
