//! CSV tables and the JSON summary of an evaluated layout.

use crate::check::run::CheckRun;
use crate::input::model::Model;
use crate::physics::images::BoundaryKind;
use serde_json::{json, Value};

/// `wells.csv`: one row per well, SI units in the headers.
pub fn wells_csv(run: &CheckRun) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
        "name",
        "x",
        "y",
        "rate_l_per_s",
        "rate_m3_per_day",
        "radius_m",
        "screen_top_m",
        "screen_base_m",
        "pump_intake_m",
        "water_level_m",
        "drawdown_m",
        "lowest_allowed_level_m",
        "capacity_l_per_s",
        "status",
        "note",
        "aquifer_level_m",
        "well_loss_m",
    ])?;
    for (well, r) in run.placement.wells.iter().zip(&run.evaluation.wells) {
        w.write_record([
            // Name, position, rate and radius in full (shortest round-trip) precision, so that
            // `check --wells wells.csv` reproduces the run.
            crate::field::wells_csv::csv_text(&well.name),
            format!("{}", well.position[0]),
            format!("{}", well.position[1]),
            format!("{}", well.rate * 1e3),
            format!("{:.2}", well.rate * 86_400.0),
            format!("{}", well.radius),
            format!("{:.2}", well.screen_top),
            format!("{:.2}", well.screen_base),
            format!("{:.2}", well.pump_intake),
            r.level_m.map_or("dry".into(), |z| format!("{z:.3}")),
            format!("{:.3}", r.drawdown_m),
            format!("{:.2}", r.lowest_allowed_level_m),
            format!("{:.3}", r.capacity_m3_per_s * 1e3),
            if r.problems.is_empty() {
                "ok".into()
            } else {
                r.problems.join("; ")
            },
            well.note.clone().unwrap_or_default(),
            r.aquifer_level_m
                .map_or("dry".into(), |z| format!("{z:.3}")),
            format!("{:.3}", r.well_loss_m),
        ])?;
    }
    Ok(w.into_inner()?)
}

/// `checkpoints.csv`: one row per check point.
pub fn checkpoints_csv(run: &CheckRun) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
        "name",
        "kind",
        "x",
        "y",
        "target_level_m",
        "water_level_m",
        "drawdown_m",
        "margin_below_target_m",
        "status",
    ])?;
    for p in &run.evaluation.points {
        w.write_record([
            crate::field::wells_csv::csv_text(&p.point.name),
            format!("{:?}", p.point.kind).to_lowercase(),
            format!("{:.3}", p.point.position[0]),
            format!("{:.3}", p.point.position[1]),
            p.point
                .target_level
                .map_or(String::new(), |t| format!("{t:.3}")),
            p.level_m.map_or("dry".into(), |z| format!("{z:.4}")),
            format!("{:.4}", p.drawdown_m),
            p.margin_m.map_or(String::new(), |m| format!("{m:.4}")),
            match p.met {
                Some(true) => "met",
                Some(false) => "NOT MET",
                None => "report",
            }
            .into(),
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
        "excavations": model.excavations.iter().map(|e| json!({
            "name": e.name,
            "outline_m": e.outline.exterior().0.iter().map(|c| [c.x, c.y]).collect::<Vec<_>>(),
            "formation_level_m": e.formation_level,
            "target_margin_m": e.target_margin,
            "target_level_m": e.target_level(),
        })).collect::<Vec<_>>(),
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
            "well_loss": format!("{:?}", model.as_built.loss),
            "min_spacing_m": model.as_built.min_spacing,
            "max_spacing_m": model.as_built.max_spacing,
            "injection_fraction": model.as_built.injection_fraction,
            "max_injection_level_m": model.as_built.max_injection_level,
            "partial_penetration": "near-field correction (uniform flux, cosine modes) on the saturated thickness before pumping, check points at the target level",
        },
    })
}

/// `summary.json`.
pub fn summary_json(
    run: &CheckRun,
    recharge: Option<&crate::optimise::recharge::RechargeSizing>,
) -> Value {
    let e = &run.evaluation;
    let worst = e.worst_point.map(|i| &e.points[i]);
    json!({
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
        "targets_met": e.targets_met,
        "wells_within_limits": e.wells_ok,
        "check_point_count": e.points.len(),
        "unmet_count": e.unmet_count,
        "lowest_margin_m": worst.and_then(|p| p.margin_m),
        "lowest_margin_at": worst.map(|p| json!({"name": p.point.name, "x": p.point.position[0], "y": p.point.position[1]})),
        "placement_notes": run.placement.notes,
        "well_problems": e.wells.iter().filter(|w| !w.problems.is_empty()).map(|w| json!({"well": w.name, "problems": w.problems})).collect::<Vec<_>>(),
        "neighbours": crate::safety::neighbours::assess_run(run),
        "neighbour_rules_of_thumb": super::neighbours::summary::rules_of_thumb(),
        "uplift": crate::safety::uplift::assess_run(run),
        "recharge_sizing": recharge,
        "caution": super::CAUTION,
    })
}
