//! The neighbours as one [`Table`], built once from the assessment and rendered by the terminal
//! (worst drawdown, settlement and distortion with their limits, "*" on a rule-of-thumb limit,
//! and the status with what is over), report.html (the same with the utilisation) and
//! `neighbours.csv` (every machine column in SI: positions, limit bases, settlement in time,
//! deflection ratio, damage category). The rise above the original level (beside recharge
//! wells) has its own columns for people when some building has that check.

use crate::report::table::{Cell, Column, Csv, Quantity, Table};
use crate::safety::limit_check::{LimitCheck, LimitQuantity};
use crate::safety::neighbours::NeighbourResult;

/// A column shown to people (`people`: terminal and report.html) and/or written under `csv`.
fn col(title: &'static str, quantity: Quantity, people: bool, csv: Csv) -> Column {
    Column {
        title,
        quantity,
        terminal: people,
        html: people,
        csv,
    }
}

/// The columns, in the order of `neighbours.csv`; `rise` shows the rise columns to people.
fn columns(rise: bool) -> Vec<Column> {
    use Quantity::{Days, Length, Percent, Ratio, Small, Words};
    let mut utilisation = col(
        "utilisation",
        Percent,
        true,
        Csv::Fixed("utilisation", 1.0, 3),
    );
    utilisation.terminal = false;
    vec![
        col("neighbour", Words, true, Csv::Name("name")),
        col("status", Words, false, Csv::Words("status")),
        col(
            "drawdown",
            Length,
            true,
            Csv::Fixed("max_drawdown_m", 1.0, 4),
        ),
        col("x", Length, false, Csv::Fixed("max_drawdown_x", 1.0, 2)),
        col("y", Length, false, Csv::Fixed("max_drawdown_y", 1.0, 2)),
        col(
            "limit",
            Length,
            true,
            Csv::Fixed("allowable_drawdown_m", 1.0, 3),
        ),
        col("rise", Length, rise, Csv::No),
        col("limit", Length, rise, Csv::No),
        col(
            "settlement",
            Small,
            true,
            Csv::Fixed("max_settlement_mm", 1e3, 2),
        ),
        col(
            "limit",
            Small,
            true,
            Csv::Fixed("allowable_settlement_mm", 1e3, 1),
        ),
        col("", Words, false, Csv::Words("settlement_limit_basis")),
        col(
            "differential",
            Small,
            false,
            Csv::Fixed("max_differential_mm", 1e3, 2),
        ),
        col(
            "distortion",
            Ratio,
            true,
            Csv::Sci("max_angular_distortion", 3),
        ),
        col(
            "limit",
            Ratio,
            true,
            Csv::Sci("allowable_angular_distortion", 3),
        ),
        col("", Words, false, Csv::Words("distortion_limit_basis")),
        utilisation,
        col(
            "profile top",
            Length,
            false,
            Csv::Fixed("profile_top_m", 1.0, 3),
        ),
        col("stress change", Words, false, Csv::Words("stress_change")),
        col(
            "final",
            Small,
            false,
            Csv::Fixed("final_settlement_mm", 1e3, 2),
        ),
        col(
            "end of works",
            Small,
            false,
            Csv::Fixed("end_of_works_settlement_mm", 1e3, 2),
        ),
        col(
            "works",
            Days,
            false,
            Csv::Fixed("works_duration_days", 1.0 / 86_400.0, 1),
        ),
        col("", Words, false, Csv::Words("end_of_works_upper_bound")),
        col(
            "deflection",
            Ratio,
            false,
            Csv::Sci("max_deflection_ratio", 3),
        ),
        col("damage", Words, false, Csv::Words("damage_category")),
        col("status", Words, true, Csv::No),
    ]
}

/// `value` in `cell`, or an empty cell.
fn or_empty(value: Option<f64>, cell: fn(f64) -> Cell) -> Cell {
    value.map_or(Cell::Empty, cell)
}

/// The limit of `check` in `cell`, footnoted when it is a rule of thumb; empty when unchecked.
fn limit(check: Option<&LimitCheck>, cell: fn(f64) -> Cell) -> Cell {
    match check {
        Some(c) if c.basis.is_rule_of_thumb() => Cell::Footnoted(Box::new(cell(c.limit))),
        Some(c) => cell(c.limit),
        None => Cell::Empty,
    }
}

/// Where the limit of `check` comes from, in words; empty when unchecked.
fn basis(check: Option<&LimitCheck>) -> Cell {
    check.map_or(Cell::Empty, |c| Cell::Text(c.basis.words().into()))
}

/// One row per neighbour.
fn row(r: &NeighbourResult) -> Vec<Cell> {
    let find = |q: LimitQuantity| r.checks.iter().find(|c| c.quantity == q);
    let rise = find(LimitQuantity::Rise);
    let over: Vec<LimitQuantity> = r
        .checks
        .iter()
        .filter(|c| !c.pass)
        .map(|c| c.quantity)
        .collect();
    let worst = &r.worst_drawdown;
    vec![
        Cell::Text(r.name.clone()),
        Cell::Neighbour(r.status, Vec::new()),
        Cell::Length(worst.drawdown_m),
        Cell::Length(worst.position[0]),
        Cell::Length(worst.position[1]),
        limit(find(LimitQuantity::Drawdown), Cell::Length),
        or_empty(rise.map(|c| c.value), Cell::Length),
        limit(rise, Cell::Length),
        or_empty(
            r.worst_settlement.as_ref().and_then(|s| s.settlement_m),
            Cell::Small,
        ),
        limit(find(LimitQuantity::Settlement), Cell::Small),
        basis(find(LimitQuantity::Settlement)),
        or_empty(r.max_differential_m, Cell::Small),
        or_empty(r.max_distortion, Cell::Ratio),
        limit(find(LimitQuantity::AngularDistortion), Cell::Ratio),
        basis(find(LimitQuantity::AngularDistortion)),
        or_empty(r.utilisation, Cell::Fraction),
        Cell::Length(r.profile_top_m),
        Cell::Text(r.stress_change.clone()),
        or_empty(r.max_final_settlement_m, Cell::Small),
        or_empty(r.max_end_of_works_settlement_m, Cell::Small),
        or_empty(r.works_duration.as_ref().map(|w| w.0), Cell::Duration),
        match r.max_end_of_works_settlement_m {
            Some(_) => Cell::Text(r.end_of_works_upper_bound.to_string()),
            None => Cell::Empty,
        },
        or_empty(r.max_deflection_ratio, Cell::Ratio),
        r.damage.as_ref().map_or(Cell::Empty, |(c, _, _)| {
            Cell::Text(format!("{} {}", c.number, c.name))
        }),
        Cell::Neighbour(r.status, over),
    ]
}

/// The neighbours table of an assessment, in SI (the renderers apply the units).
pub fn neighbours_table(results: &[NeighbourResult]) -> Table {
    let rise = results
        .iter()
        .any(|r| r.checks.iter().any(|c| c.quantity == LimitQuantity::Rise));
    Table {
        columns: columns(rise),
        rows: results.iter().map(row).collect(),
    }
}
