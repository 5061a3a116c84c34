//! CSV tables and the JSON summary of an evaluated layout.
//!
//! The CSV files are for spreadsheets: every number at a stated precision (levels to 1 mm in
//! wells.csv and 0.1 mm in checkpoints.csv, positions and rates that `check --wells` reads back
//! to 1e-9 m and 1e-9 L/s with trailing zeros dropped), never "dry" or another word in a numeric
//! column (an empty cell and a status column instead), headers in ASCII with the unit after the
//! quantity (`x_m`, `rate_l_per_s`, `rate_m3_per_day`).

use crate::check::run::CheckRun;
use crate::findings::check::CheckFindings;
use crate::input::model::{Model, WellLossSpec};
use crate::input::units::UnitSystem;
use crate::physics::images::BoundaryKind;
use crate::report::format::Fmt;
use crate::report::problems::well_problem;
use crate::report::table::{fixed, Cell, Column, Csv, Quantity, Table};
use serde_json::{json, Value};

/// "wet" or "dry", the state of a level whose column is left empty when dry.
fn level_state(level: Option<f64>) -> String {
    if level.is_some() { "wet" } else { "dry" }.to_string()
}

/// The wells table of a run, every output's columns: position, rate, level in the well with its
/// depth, drawdown, the lowest level allowed, capacity and status for people; for `wells.csv`
/// also the radius, screen and intake, the aquifer level beside the well, the well loss and a
/// wet/dry state, every number in SI at a stated precision (position, rate and radius to 1e-9
/// m and L/s so that `check --wells wells.csv` reproduces the run). `only` picks the wells
/// listed (by index), in that order; `None` lists all.
pub fn wells_table(run: &CheckRun, only: Option<&[usize]>) -> Table {
    use Quantity::{Length, Rate, Words};
    let col = |title, quantity, terminal, html, csv| Column {
        title,
        quantity,
        terminal,
        html,
        csv,
    };
    let columns = vec![
        col("well", Words, true, true, Csv::Name("name")),
        col("x", Length, true, true, Csv::Fine("x_m", 1.0)),
        col("y", Length, true, true, Csv::Fine("y_m", 1.0)),
        col("rate", Rate, true, true, Csv::Fine("rate_l_per_s", 1e3)),
        col(
            "",
            Words,
            false,
            false,
            Csv::Fixed("rate_m3_per_day", 86_400.0, 2),
        ),
        col("", Words, false, false, Csv::Fine("radius_m", 1.0)),
        col("", Words, false, false, Csv::Fixed("screen_top_m", 1.0, 2)),
        col("", Words, false, false, Csv::Fixed("screen_base_m", 1.0, 2)),
        col("", Words, false, false, Csv::Fixed("pump_intake_m", 1.0, 2)),
        col(
            "level in well",
            Length,
            true,
            true,
            Csv::Fixed("water_level_m", 1.0, 3),
        ),
        col("depth bgl", Length, true, true, Csv::No),
        col(
            "drawdown",
            Length,
            false,
            true,
            Csv::Fixed("drawdown_m", 1.0, 3),
        ),
        col(
            "lowest allowed",
            Length,
            true,
            true,
            Csv::Fixed("lowest_allowed_level_m", 1.0, 2),
        ),
        col("its depth bgl", Length, false, true, Csv::No),
        col(
            "capacity",
            Rate,
            true,
            true,
            Csv::Fixed("capacity_l_per_s", 1e3, 3),
        ),
        col("status", Words, true, true, Csv::Words("status")),
        col("", Words, false, false, Csv::Words("note")),
        col(
            "",
            Words,
            false,
            false,
            Csv::Fixed("aquifer_level_m", 1.0, 3),
        ),
        col("", Words, false, false, Csv::Fixed("well_loss_m", 1.0, 3)),
        col("", Words, false, false, Csv::Words("level_status")),
    ];
    let all: Vec<usize> = (0..run.evaluation.wells.len()).collect();
    let rows = only
        .unwrap_or(&all)
        .iter()
        .map(|&k| {
            let (well, r) = (&run.placement.wells[k], &run.evaluation.wells[k]);
            vec![
                Cell::Text(well.name.clone()),
                Cell::Length(well.position[0]),
                Cell::Length(well.position[1]),
                Cell::Rate(well.rate),
                Cell::Rate(well.rate),
                Cell::Length(well.radius),
                Cell::Length(well.screen_top),
                Cell::Length(well.screen_base),
                Cell::Length(well.pump_intake),
                Cell::Level(r.level_m),
                Cell::Depth(r.level_m),
                Cell::Length(r.drawdown_m),
                Cell::Length(r.lowest_allowed_level_m),
                Cell::Depth(Some(r.lowest_allowed_level_m)),
                Cell::Rate(r.capacity_m3_per_s),
                Cell::Status(r.problems.clone()),
                Cell::Text(well.note.clone().unwrap_or_default()),
                Cell::Level(r.aquifer_level_m),
                Cell::Length(r.well_loss_m),
                Cell::Text(level_state(r.level_m)),
            ]
        })
        .collect();
    Table { columns, rows }
}

/// The check points listed in `only` (indices, in that order) whose target is not met, for
/// the terminal: name, position, level, target and shortfall below it (levels to the finer
/// precision margins need).
pub fn unmet_points_table(run: &CheckRun, only: &[usize]) -> Table {
    use Quantity::{Length, Words};
    let col = |title, quantity| Column {
        title,
        quantity,
        terminal: true,
        html: false,
        csv: Csv::No,
    };
    let columns = vec![
        col("point", Words),
        col("x", Length),
        col("y", Length),
        col("level", Length),
        col("target", Length),
        col("short", Length),
    ];
    let rows = only
        .iter()
        .map(|&i| {
            let p = &run.evaluation.points[i];
            vec![
                Cell::Text(p.point.name.clone()),
                Cell::Length(p.point.position[0]),
                Cell::Length(p.point.position[1]),
                Cell::Fine(p.level_m),
                Cell::Fine(p.point.target_level),
                Cell::Fine(p.margin_m.map(|m| -m)),
            ]
        })
        .collect();
    Table { columns, rows }
}

/// The `n` unmet check points short by most (largest shortfall first; a dry point, with no
/// margin, first of all), for a shortened terminal list.
pub fn worst_unmet_points(run: &CheckRun, n: usize) -> Vec<usize> {
    let points = &run.evaluation.points;
    let mut unmet: Vec<usize> = (0..points.len())
        .filter(|&i| points[i].met == Some(false))
        .collect();
    let margin = |i: usize| points[i].margin_m.unwrap_or(f64::NEG_INFINITY);
    unmet.sort_by(|&a, &b| margin(a).total_cmp(&margin(b)));
    unmet.truncate(n);
    unmet
}

/// `wells.csv`: one row per well, SI units in the headers; the status words (read by a person,
/// read by no tool beyond "ok") in the user's units.
pub fn wells_csv(run: &CheckRun) -> anyhow::Result<Vec<u8>> {
    let words = Fmt::new(run.model.units, run.model.ground_level);
    wells_table(run, None).to_csv(&words)
}

/// The wells with the least headroom (water level above the lowest level allowed), wells with
/// a problem first, at most `n` of them: the rows a long table lists (every well stays in
/// wells.csv).
pub fn tightest_wells(run: &CheckRun, n: usize) -> Vec<usize> {
    let all = &run.evaluation.wells;
    let headroom =
        |k: usize| all[k].level_m.unwrap_or(f64::NEG_INFINITY) - all[k].lowest_allowed_level_m;
    let mut order: Vec<usize> = (0..all.len()).collect();
    order.sort_by(|&a, &b| {
        all[a]
            .problems
            .is_empty()
            .cmp(&all[b].problems.is_empty())
            .then(headroom(a).total_cmp(&headroom(b)))
    });
    order.truncate(n);
    order
}

/// `checkpoints.csv`: one row per check point.
pub fn checkpoints_csv(run: &CheckRun) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
        "name",
        "kind",
        "x_m",
        "y_m",
        "target_level_m",
        "water_level_m",
        "drawdown_m",
        "margin_below_target_m",
        "status",
        "level_status",
    ])?;
    for p in &run.evaluation.points {
        w.write_record([
            crate::field::wells_csv::csv_text(&p.point.name),
            format!("{:?}", p.point.kind).to_lowercase(),
            fixed(p.point.position[0], 3),
            fixed(p.point.position[1], 3),
            p.point.target_level.map_or(String::new(), |t| fixed(t, 3)),
            p.level_m.map_or(String::new(), |z| fixed(z, 4)),
            fixed(p.drawdown_m, 4),
            p.margin_m.map_or(String::new(), |m| fixed(m, 4)),
            match p.met {
                Some(true) => "met",
                Some(false) => "NOT MET",
                None => "report",
            }
            .into(),
            level_state(p.level_m),
        ])?;
    }
    Ok(w.into_inner()?)
}

/// The validated inputs in SI, enough to reproduce every number with `wells.csv`.
pub fn model_record(model: &Model) -> Value {
    let aq = &model.aquifer;
    json!({
        "project": model.name,
        "datum": model.datum,
        "grid": model.grid,
        "ground_level_m": model.ground_level,
        "aquifer": {
            "kind": aq.describe(),
            "conductivity_m_per_s": aq.conductivity,
            "base_level_m": aq.base_level,
            "top_level_m": aq.top_level,
            "initial_level_m": aq.initial_level,
            "transmissivity_m2_per_s": aq.transmissivity(),
            "leakage_factor_m": aq.leakage_factor(),
            "storativity": aq.storativity,
            "specific_yield": aq.specific_yield,
            "potential_formula": "Strack (1989): confined Φ = K·b·h − ½K·b² (h ≥ b), unconfined Φ = ½K·h²; h above base",
        },
        "excavations": model.excavations.iter().map(|e| {
            let design = crate::field::checkpoints::design_target(model, e);
            json!({
                "name": e.name,
                "outline_m": e.outline.exterior().0.iter().map(|c| [c.x, c.y]).collect::<Vec<_>>(),
                "formation_level_m": e.formation_level,
                "target_margin_m": e.target_margin,
                "target_level_m": design.level,
                "target_is_relief_head": design.relief,
            })
        }).collect::<Vec<_>>(),
        "boundaries": model.boundaries.iter().map(|b| json!({
            "name": b.name,
            "kind": match b.kind { BoundaryKind::ConstantHead => "constant-head", BoundaryKind::Barrier => "barrier" },
            "line_m": b.line,
        })).collect::<Vec<_>>(),
        "influence_method": model.influence.name(),
        "contingency": model.contingency,
        "wells": {
            "radius_m": model.wells.radius,
            "screen_top_m": model.wells.screen_top,
            "screen_base_m": model.wells.screen_base,
            "pump_intake_m": model.wells.pump_intake,
            "submergence_m": model.wells.submergence,
            "pump_capacity_m3_per_s": model.wells.pump_capacity,
            "suction_limit_m": model.wells.suction_limit,
            "standby": model.wells.standby,
            "header_level_m": model.as_built.header_level,
            "suction_floor_m": model.as_built.suction_floor(model.wells.suction_limit),
            "anisotropy_kv_kh": model.as_built.anisotropy,
            "well_loss": match model.as_built.loss {
                WellLossSpec::None => json!({"kind": "none"}),
                WellLossSpec::Jacob(c) => json!({"kind": "jacob", "c_s2_per_m5": c}),
                WellLossSpec::Efficiency(e) => json!({"kind": "efficiency", "efficiency": e}),
            },
            "min_spacing_m": model.as_built.min_spacing,
            "max_spacing_m": model.as_built.max_spacing,
            "injection_fraction": model.as_built.injection_fraction,
            "max_injection_level_m": model.as_built.max_injection_level,
            "partial_penetration": "near-field correction (uniform flux, cosine modes) on the saturated thickness before pumping, check points at the target level",
        },
    })
}

/// `summary.json`.
pub fn summary_json(found: &CheckFindings) -> Value {
    let run = &found.run;
    let e = &run.evaluation;
    let worst = e.worst_point.map(|i| &e.points[i]);
    let si = Fmt::new(UnitSystem::Si, run.model.ground_level);
    let mut summary = json!({
        "drydig_version": env!("CARGO_PKG_VERSION"),
        "inputs": model_record(run.model),
        "radius_of_influence_m": e.radius_of_influence_m,
        "radius_of_influence_basis": e.radius_of_influence_basis,
        "well_count": run.placement.wells.len(),
        "total_flow_m3_per_day": e.total_abstraction_m3_per_s * 86_400.0,
        "total_flow_l_per_s": e.total_abstraction_m3_per_s * 1e3,
        "recharge_flow_m3_per_day": e.total_recharge_m3_per_s * 86_400.0,
        "net_flow_m3_per_day": e.net_flow_m3_per_s * 86_400.0,
        "design_flow_m3_per_day": e.design_flow_m3_per_s * 86_400.0,
        "design_flow_l_per_s": e.design_flow_m3_per_s * 1e3,
        "verdict": found.verdict,
        "exit_code": found.verdict.exit_code(),
        "targets_met": e.targets_met,
        "wells_within_limits": e.wells_ok,
        "check_point_count": e.points.len(),
        "unmet_count": e.unmet_count,
        "lowest_margin_m": worst.and_then(|p| p.margin_m),
        "lowest_margin_at": worst.map(|p| json!({"name": p.point.name, "x": p.point.position[0], "y": p.point.position[1]})),
        "placement_notes": run.placement.notes.iter().map(|n| n.words(run.model.units)).collect::<Vec<_>>(),
        "well_problems": e.wells.iter().filter(|w| !w.problems.is_empty()).map(|w| json!({"well": w.name, "problems": w.problems.iter().map(|p| well_problem(p, &si)).collect::<Vec<_>>()})).collect::<Vec<_>>(),
        "neighbours": found.neighbours,
        "neighbour_rules_of_thumb": super::neighbours::summary::rules_of_thumb(),
        "uplift": found.uplift,
        "recharge_sizing": found.recharge,
        "caution": crate::caution::CAUTION,
    });
    // the recharge programme's binding limits and notes worded in the run's units
    if let Some(rs) = &found.recharge {
        summary["recharge_sizing"]["binding"] = json!(rs
            .binding
            .iter()
            .map(|b| b.words(run.model.units))
            .collect::<Vec<_>>());
        summary["recharge_sizing"]["notes"] = json!(rs
            .notes
            .iter()
            .map(|n| n.words(run.model.units))
            .collect::<Vec<_>>());
    }
    // cut-off walls (only when there are any): quantities without prices and the solve size
    if let Some(w) = &found.walls {
        summary["walls"] = json!({
            "walls": w.walls.iter().map(|q| json!({
                "name": q.name,
                "length_m": q.length_m,
                "toe_level_m": q.toe_level_m,
                "depth_below_ground_m": q.depth_m,
                "area_m2": q.area_m2,
                "resistance_s": q.resistance_s,
                "cuts": q.cuts,
            })).collect::<Vec<_>>(),
            "collocation_points": w.collocation_points,
            "aquifers": w.aquifers,
            "unknowns": w.unknowns,
        });
    }
    summary
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::table::fine;

    // -2.9999999999999964 is 3 − 16 ulp, the kind of value a sum of offsets leaves; to nine
    // decimals it is −3 (IEEE 754 round to nearest). common practice (no source).
    #[test]
    fn numbers_are_written_at_their_stated_precision() {
        assert_eq!(fine(-2.999_999_999_999_996_4), "-3");
        assert_eq!(fine(350.334_936_490_538_9), "350.334936491");
        assert_eq!(fine(2.5), "2.5");
        assert_eq!(fine(0.000_000_000_1), "0");
        assert_eq!(fixed(-0.000_04, 3), "0.000");
        assert_eq!(fixed(-0.0006, 3), "-0.001");
        assert_eq!(fixed(7.9, 2), "7.90");
    }
}
