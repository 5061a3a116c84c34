//! The neighbour tables: `neighbours.csv`, one row per building with its worst drawdown,
//! settlement (checked, final, at the end of the works), distortion, deflection ratio, damage
//! category, limits and their basis (the CSV columns of [`neighbours_table`]), and `neighbour_points.csv`, the corners and
//! worst points of every building with level, drawdown and settlement. Names beginning with
//! `=`, `+`, `-`, `@` or `#` get a leading apostrophe, as in the wells CSV, so a spreadsheet does
//! not read them as a formula.

use crate::field::wells_csv::csv_text;
use crate::input::units::UnitSystem;
use crate::report::format::Fmt;
use crate::report::neighbours::table::neighbours_table;
use crate::safety::neighbours::{NeighbourResult, Sample};

/// `neighbours.csv`: one row per neighbour, the CSV columns of the neighbours table (SI).
pub fn neighbours_csv(results: &[NeighbourResult]) -> anyhow::Result<Vec<u8>> {
    // The table's CSV columns are SI whatever the run's units.
    neighbours_table(results).to_csv(&Fmt::new(UnitSystem::Si, 0.0))
}

/// `neighbour_points.csv`: corners and the worst points of every neighbour.
pub fn neighbour_points_csv(results: &[NeighbourResult]) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
        "neighbour",
        "point",
        "x",
        "y",
        "water_level_m",
        "drawdown_m",
        "settlement_mm",
    ])?;
    for r in results {
        let mut rows: Vec<(String, &Sample)> =
            r.corners.iter().map(|c| (c.name.clone(), c)).collect();
        rows.push((
            format!("worst drawdown ({})", r.worst_drawdown.name),
            &r.worst_drawdown,
        ));
        if let Some(s) = &r.worst_settlement {
            rows.push((format!("worst settlement ({})", s.name), s));
        }
        for (label, s) in rows {
            w.write_record([
                csv_text(&r.name),
                csv_text(&label),
                format!("{:.3}", s.position[0]),
                format!("{:.3}", s.position[1]),
                s.level_m.map_or("dry".into(), |z| format!("{z:.4}")),
                format!("{:.4}", s.drawdown_m),
                s.settlement_m
                    .map_or(String::new(), |v| format!("{:.2}", v * 1e3)),
            ])?;
        }
    }
    Ok(w.into_inner()?)
}
