//! Outputs of `design` and `sweep`: the terminal summary, `design.json`, `design.csv` (the
//! counts tried), `bid.csv` (the quantities and the comparison with the quick estimate), and the
//! sweep table (`sweep.csv`).

use crate::caution::CAUTION;
use crate::check::run::CheckRun;
use crate::findings::design::DesignFindings;
use crate::input::model::{LayoutKind, Model};
use crate::input::units::{m3s_to_gpm, UnitSystem};
use crate::optimise::binding::Binding;
use crate::optimise::lp_problem::LpStatus;
use crate::optimise::outcome::{Design, Outcome};
use crate::optimise::trial::Trial;
use crate::report::words::{thousands, wrap};
use serde_json::{json, Value};

const DAY: f64 = 86_400.0;

fn flow(q: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{} m³/day ({:.1} L/s)", thousands(q * DAY, 0), q * 1e3),
        UnitSystem::Us => format!(
            "{} US gpm ({} US gal/day)",
            thousands(m3s_to_gpm(q), 0),
            thousands(m3s_to_gpm(q) * 1440.0, 0)
        ),
    }
}

/// How the programme for individual rates of a layout ended, in words ("not run" when it was
/// not: the search for one rate needs none).
fn individual_status_words(status: &Option<LpStatus>) -> String {
    match status {
        None => "not run".into(),
        Some(LpStatus::Optimal) => "optimal".into(),
        Some(LpStatus::Infeasible) => "infeasible".into(),
        Some(LpStatus::Unbounded) => "unbounded".into(),
        Some(LpStatus::Failed(why)) => format!("solver failed: {why}"),
    }
}

fn opt(v: Option<f64>, scale: f64, decimals: usize) -> String {
    v.map_or("—".into(), |x| format!("{:.*}", decimals, x * scale))
}

/// The optimised flow against the quick estimate: (estimate m³/s, ratio optimised/estimate).
pub fn estimate_comparison(design: &Design, total: f64) -> (f64, Option<f64>) {
    let est = design.estimate.total_flow_l_per_s / 1e3;
    (est, (est > 0.0).then(|| total / est))
}

fn trial_json(t: &Trial, units: UnitSystem) -> Value {
    json!({
        "count": t.count,
        "per_side": t.per_side,
        "spacing_m": t.spacing_m,
        "uniform_rate_l_per_s": t.uniform_rate_m3_per_s.map(|q| q * 1e3),
        "uniform_rate_set_by": t.uniform_rate_set_by,
        "uniform_total_m3_per_day": t.uniform_total_m3_per_s.map(|q| q * DAY),
        "uniform_limit_l_per_s": t.uniform_limit_m3_per_s * 1e3,
        "individual_total_m3_per_day": t.individual_total_m3_per_s.map(|q| q * DAY),
        "lowest_margin_at_uniform_limit_m": t.lowest_margin_m,
        "lowest_margin_at": t.lowest_margin_at,
        "binding_limit": t.binding_limit.words(units),
        "uniform_met": t.uniform_met,
        "individual_met": t.individual_met,
        "individual_status": individual_status_words(&t.individual_status),
        "outcome": t.outcome_words(units),
        "placement": t.variant,
    })
}

/// `design.json`: everything about the search, the choice and the bid.
pub fn design_json(model: &Model, found: &DesignFindings) -> Value {
    let design = &found.design;
    let run = found.chosen.as_ref().map(|c| &c.run);
    let total = run.map_or(0.0, |r| r.evaluation.total_abstraction_m3_per_s);
    let (est, ratio) = estimate_comparison(design, total);
    json!({
        "drydig_version": env!("CARGO_PKG_VERSION"),
        "project": model.name,
        "outcome": design.outcome,
        "met": found.verdict.is_met(),
        "verdict": found.verdict,
        "rates_asked": design.asked,
        "rates_used": design.used,
        "search": design.search,
        "smallest_count_uniform_rate": design.smallest_uniform,
        "smallest_count_individual_rates": design.smallest_individual,
        "chosen_layout": design.spec.as_ref().map(|s| match &s.kind {
            LayoutKind::Ring { count, corner_wells } => json!({
                "kind": "ring",
                "count": match count { crate::input::model::RingCount::Count(n) => Some(*n), _ => None },
                "corner_wells": corner_wells,
                "offset_m": s.offset,
                "start_m": s.start,
            }),
            LayoutKind::Line { spacing, both_sides, .. } => json!({
                "kind": "line",
                "spacing_m": spacing,
                "both_sides": both_sides,
                "offset_m": s.offset,
                "start_m": s.start,
            }),
            LayoutKind::Listed => json!({"kind": "listed"}),
            LayoutKind::Csv { path } => json!({"kind": "csv", "file": path.display().to_string()}),
        }),
        "binding_constraints": design.binding.iter().map(|b| b.words(model.units)).collect::<Vec<_>>(),
        "comparison_with_quick_estimate": {
            "method": design.estimate.flow_method,
            "estimate_total_flow_m3_per_day": est * DAY,
            "optimised_total_flow_m3_per_day": total * DAY,
            "ratio_optimised_to_estimate": ratio,
        },
        "counts_tried": design.trials.iter().map(|t| trial_json(t, model.units)).collect::<Vec<_>>(),
        "bid": found.chosen.as_ref().map(|c| super::bid_out::bid_json(&c.bid, &c.sheet, c.costs.as_ref())),
        "design_allowances": {
            "operating_margin_m": model.design.operating_margin,
            "operating_margin_basis": "below every target with every well running (design file allowances.operating_margin; default 0.3 m, common practice (no source))",
            "capacity_fraction": model.design.capacity_fraction,
            "capacity_fraction_basis": "largest share of each well's capacity (Sichardt and pump) the design uses (allowances.capacity_fraction; default 0.8, common practice (no source))",
            "one_well_out": model.design.one_well_out,
        },
        "one_well_out": design.finish.one_out.as_ref().map(|o| json!({
            "worst_well": o.worst_well,
            "margin_without_it_m": o.margin_without_m,
            "at": o.worst_point,
            "margin_by_well_out_m": o.by_well.iter().map(|(w, m)| json!({"well": w, "margin_m": m})).collect::<Vec<_>>(),
        })),
        "standby_wells_placed": design.finish.standby,
        "idle_wells_dropped": design.finish.dropped,
        "highest_use_of_capacity": run.map(highest_use),
        "notes": design.notes.iter().map(|n| n.words(model.units)).collect::<Vec<_>>(),
        "caution": CAUTION,
    })
}

/// The counts table as CSV (used by `design.csv` and `sweep.csv`), SI units in the headers;
/// the limit and outcome in words in `units`.
pub fn trials_csv(
    trials: &[Trial],
    requested: Option<&[f64]>,
    units: UnitSystem,
) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    let mut header = vec![
        "count",
        "per_side",
        "spacing_m",
        "uniform_rate_l_per_s",
        "uniform_total_m3_per_day",
        "individual_total_m3_per_day",
        "uniform_limit_l_per_s",
        "lowest_margin_at_uniform_limit_m",
        "lowest_margin_at",
        "binding_limit",
        "uniform_met",
        "individual_met",
        "individual_status",
        "outcome",
        "placement",
    ];
    if requested.is_some() {
        header.insert(0, "requested");
    }
    w.write_record(&header)?;
    for (i, t) in trials.iter().enumerate() {
        let mut rec = vec![
            t.count.to_string(),
            t.per_side.map_or(String::new(), |n| n.to_string()),
            format!("{:.3}", t.spacing_m),
            t.uniform_rate_m3_per_s
                .map_or(String::new(), |q| format!("{:.4}", q * 1e3)),
            t.uniform_total_m3_per_s
                .map_or(String::new(), |q| format!("{:.1}", q * DAY)),
            t.individual_total_m3_per_s
                .map_or(String::new(), |q| format!("{:.1}", q * DAY)),
            format!("{:.4}", t.uniform_limit_m3_per_s * 1e3),
            format!("{:.4}", t.lowest_margin_m),
            t.lowest_margin_at.clone(),
            t.binding_limit.words(units),
            t.uniform_met.to_string(),
            t.individual_met.to_string(),
            individual_status_words(&t.individual_status),
            t.outcome_words(units),
            t.variant.clone(),
        ];
        if let Some(r) = requested {
            rec.insert(0, r.get(i).map_or(String::new(), |v| format!("{v}")));
        }
        w.write_record(&rec)?;
    }
    Ok(w.into_inner()?)
}

/// Every file `design` writes: what `check` writes for the chosen layout, plus `design.json`,
/// `design.csv` and `bid.csv`.
pub fn files(model: &Model, found: &DesignFindings) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    let design = &found.design;
    let mut out = match &found.chosen {
        Some(c) => super::check_outputs::check_files_for(c, Some(design))?,
        None => Vec::new(),
    };
    out.push((
        "design.json".into(),
        serde_json::to_vec_pretty(&design_json(model, found))?,
    ));
    out.push((
        "design.csv".into(),
        trials_csv(&design.trials, None, model.units)?,
    ));
    if let Some(c) = &found.chosen {
        let b = &c.bid;
        let lines = &c.sheet;
        out.push((
            "bid.csv".into(),
            super::bid_out::bid_csv(lines, c.costs.as_ref())?,
        ));
        out.push((
            "bid.json".into(),
            serde_json::to_vec_pretty(&super::bid_out::bid_json(b, lines, c.costs.as_ref()))?,
        ));
    }
    Ok(out)
}

fn trials_table(trials: &[Trial], units: UnitSystem, requested: Option<&[f64]>) -> String {
    let lu = units.length_unit();
    let (rate_unit, total_unit, rate_scale, total_scale) = match units {
        UnitSystem::Si => ("L/s", "m³/day", 1e3, DAY),
        UnitSystem::Us => ("gpm", "gpm", m3s_to_gpm(1.0), m3s_to_gpm(1.0)),
    };
    let mut out = String::new();
    if requested.is_some() {
        out.push_str(&format!("{:>9} ", "asked"));
    }
    out.push_str(&format!(
        "{:>6} {:>9} {:>10} {:>12} {:>12} {:>9}  {:<40} {}\n",
        "count",
        format!("spacing {lu}"),
        format!("rate {rate_unit}"),
        format!("total {total_unit}"),
        format!("LP {total_unit}"),
        format!("margin {lu}"),
        "limit on the uniform rate",
        "outcome [placement]"
    ));
    for (i, t) in trials.iter().enumerate() {
        if let Some(r) = requested {
            out.push_str(&format!(
                "{:>9} ",
                r.get(i).map_or(String::new(), |v| format!("{v}"))
            ));
        }
        let mut limit = t.binding_limit.words(units);
        if limit.chars().count() > 40 {
            limit = limit.chars().take(39).collect::<String>() + "…";
        }
        out.push_str(&format!(
            "{:>6} {:>9} {:>10} {:>12} {:>12} {:>9.2}  {:<40} {}\n",
            t.count,
            if t.spacing_m > 0.0 {
                format!("{:.2}", units.length(t.spacing_m))
            } else {
                "—".into()
            },
            opt(t.uniform_rate_m3_per_s, rate_scale, 2),
            opt(t.uniform_total_m3_per_s, total_scale, 0),
            match (t.individual_total_m3_per_s, &t.individual_status) {
                (Some(q), _) => format!("{:.0}", q * total_scale),
                (None, None) => "not run".to_string(),
                (None, Some(LpStatus::Infeasible)) => "infeasible".to_string(),
                (None, Some(_)) => "failed".to_string(),
            },
            units.length(t.lowest_margin_m),
            limit,
            if t.variant.is_empty() {
                t.outcome_words(units)
            } else {
                format!("{} [{}]", t.outcome_words(units), t.variant)
            }
        ));
    }
    out
}

/// The terminal summary of a design (the wells table `rows` long).
pub fn to_text(
    model: &Model,
    found: &DesignFindings,
    units: UnitSystem,
    rows: crate::report::table::Rows,
) -> String {
    let design = &found.design;
    let run = found.chosen.as_ref().map(|c| &c.run);
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    let mut out = format!("drydig design — {}\n", model.name);
    out.push_str(&wrap(&format!("search: {}", design.search), 96, ""));
    out.push_str(&format!("rates asked: {}\n", design.asked.describe()));
    if let Some(r) = run {
        out.push_str(&wrap(
            &format!(
                "radius of influence: {}",
                r.evaluation.radius_of_influence_basis
            ),
            96,
            "",
        ));
    }
    if let Some(c) = &found.chosen {
        for line in crate::report::check_text::wall_lines(c, units) {
            out.push_str(&wrap(&line, 96, ""));
        }
    }
    if !design.trials.is_empty() {
        out.push_str(
            "\nlayouts tried (rate = smallest uniform rate meeting every target; LP = least total with individual rates;\nmargin = lowest margin below target with every well at the largest uniform rate its limits allow):\n",
        );
        out.push_str(&trials_table(&design.trials, units, None));
    }
    out.push('\n');
    let f = super::format::Fmt::new(units, model.ground_level);
    out.push_str(&format!(
        "RESULT: {}\n",
        super::verdict::headline(&found.verdict, &f)
    ));
    match &design.outcome {
        Outcome::Met { count, .. } => {
            let used = design.used.unwrap_or(design.asked);
            out.push_str(&format!(
                "  chosen layout: {count} wells, {}\n",
                used.describe()
            ));
            if let Some(n) = design.smallest_individual {
                out.push_str(&format!("  smallest count with individual rates: {n}\n"));
            }
            match design.smallest_uniform {
                Some(n) => out.push_str(&format!(
                    "  smallest count with one rate in every well: {n}\n"
                )),
                None => out
                    .push_str("  no count tried meets every target with one rate in every well\n"),
            }
        }
        Outcome::NotMet {
            count,
            worst_point,
            position,
            shortfall_m,
        } => {
            if *shortfall_m <= crate::check::evaluate::TARGET_TOLERANCE {
                out.push_str(&format!(
                    "  best layout: {count} wells; every target met, the lowest margin at \"{worst_point}\" ({:.1}, {:.1}), but not with the design allowances\n",
                    l(position[0]),
                    l(position[1]),
                ));
            } else {
                out.push_str(&format!(
                    "  best layout: {count} wells; worst point \"{worst_point}\" ({:.1}, {:.1}) stays {:.2} {lu} above its target\n",
                    l(position[0]),
                    l(position[1]),
                    l(*shortfall_m)
                ));
            }
        }
        Outcome::Impossible { .. } => {}
    }
    if !design.binding.is_empty() {
        out.push_str(&wrap(
            &format!("binding: {}", summarise_binding(&design.binding, units)),
            96,
            "  ",
        ));
    }
    if let Some(r) = run {
        let e = &r.evaluation;
        out.push_str(&super::check_text::well_table(r, units, rows));
        out.push_str(&format!(
            "\ncheck points          {} ({} not met)\n",
            e.points.len(),
            e.unmet_count
        ));
        if let Some(i) = e.worst_point {
            let p = &e.points[i];
            let m = p.margin_m.unwrap_or(0.0);
            out.push_str(&format!(
                "lowest margin         {:.3} {lu} {} target at \"{}\"\n",
                l(m.abs()),
                if m >= -crate::check::evaluate::TARGET_TOLERANCE {
                    "below"
                } else {
                    "ABOVE"
                },
                p.point.name
            ));
        }
        let total = e.total_abstraction_m3_per_s;
        let (est, ratio) = estimate_comparison(design, total);
        out.push_str(&format!("total flow            {}\n", flow(total, units)));
        out.push_str(&format!(
            "quick estimate        {}{}\n",
            flow(est, units),
            ratio.map_or(String::new(), |r| format!(
                "  → this design is {r:.2} × the estimate"
            ))
        ));
        out.push_str(&allowance_text(model, design, r, units));
        let c = found.chosen.as_ref().expect("a run has findings");
        out.push_str(&super::bid_out::bid_text(&c.sheet, c.costs.as_ref()));
        for n in &r.placement.notes {
            out.push_str(&wrap(&format!("note: {}", n.words(units)), 96, ""));
        }
    }
    for n in &design.notes {
        out.push_str(&wrap(&format!("note: {}", n.words(units)), 96, ""));
    }
    for n in &model.crs_warnings {
        out.push_str(&wrap(&format!("warning: {n}"), 96, ""));
    }
    if let Some(c) = &found.chosen {
        if !c.run.model.neighbours.is_empty() || c.run.model.uplift.is_some() {
            out.push_str("\nneighbours and base uplift for the chosen layout:\n");
            out.push_str(&super::neighbours::text::text(c, units));
        }
    }
    out.push('\n');
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// One line on what was swept, spacings in the chosen length unit.
fn sweep_words(sweep: &crate::optimise::sweep::Sweep, units: UnitSystem) -> String {
    use crate::optimise::sweep::Axis;
    let (a, b) = (
        sweep.values.first().copied().unwrap_or(0.0),
        sweep.values.last().copied().unwrap_or(0.0),
    );
    match (sweep.axis, units) {
        (Axis::Spacing, UnitSystem::Us) => format!(
            "trench line at spacings {:.2} … {:.2} ft ({} layouts), both rate options",
            units.length(a),
            units.length(b),
            sweep.values.len()
        ),
        _ => sweep.describe(),
    }
}

/// The terminal table of a sweep.
pub fn sweep_text(
    model: &Model,
    sweep: &crate::optimise::sweep::Sweep,
    units: UnitSystem,
) -> String {
    let mut out = format!("drydig sweep — {}\n", model.name);
    out.push_str(&wrap(&sweep_words(sweep, units), 96, ""));
    out.push_str("rate = smallest uniform rate meeting every target; LP = least total with individual rates;\nmargin = lowest margin below target with every well at the largest uniform rate its limits allow\n");
    out.push_str(&trials_table(&sweep.trials, units, Some(&sweep.values)));
    let met: Vec<&Trial> = sweep
        .trials
        .iter()
        .filter(|t| t.uniform_met || t.individual_met)
        .collect();
    match met.iter().min_by_key(|t| t.count) {
        Some(t) => out.push_str(&format!(
            "\nfewest wells meeting every target in this sweep: {} (spacing {:.2} {})\n",
            t.count,
            units.length(t.spacing_m),
            units.length_unit()
        )),
        None => {
            out.push_str("\nno layout in this sweep meets every target within the well limits\n")
        }
    }
    out.push('\n');
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// The highest share of its capacity any working well runs at, and which.
fn highest_use(r: &CheckRun) -> Value {
    let best = r
        .evaluation
        .wells
        .iter()
        .filter(|w| w.rate_m3_per_s > 0.0 && w.capacity_m3_per_s > 0.0)
        .map(|w| (w.rate_m3_per_s / w.capacity_m3_per_s, w.name.clone()))
        .max_by(|a, b| a.0.total_cmp(&b.0));
    best.map_or(Value::Null, |(f, n)| json!({"fraction": f, "well": n}))
}

/// Margin, capacity use, one well out and standby wells, for the terminal.
fn allowance_text(model: &Model, design: &Design, r: &CheckRun, units: UnitSystem) -> String {
    let lu = units.length_unit();
    let d = &model.design;
    let mut out = format!(
        "operating margin      {:.2} {lu} below every target kept with every well running (allowances.operating_margin; common practice (no source))\n",
        units.length(d.operating_margin)
    );
    if let Value::Object(o) = highest_use(r) {
        out.push_str(&format!(
            "capacity use          at most {:.0} % allowed; highest {:.0} % ({})\n",
            d.capacity_fraction * 100.0,
            o.get("fraction").and_then(Value::as_f64).unwrap_or(0.0) * 100.0,
            o.get("well").and_then(Value::as_str).unwrap_or("")
        ));
    }
    if let Some(o) = &design.finish.one_out {
        let on = d.one_well_out;
        out.push_str(&wrap(
            &format!(
                "one well out          {}: losing {} hurts most — lowest margin without it {:.2} {lu} {} target at \"{}\"",
                if on { "planned for" } else if model.wells.kind == crate::input::model::WellKind::Wellpoint { "not planned for (off by default for wellpoints: a line is lost with its pump set, not one point at a time; common practice (no source); allowances.one_well_out = true asks for it) — for information" } else { "not planned for (allowances.one_well_out = false) — for information" },
                o.worst_well,
                units.length(o.margin_without_m.abs()),
                if o.margin_without_m >= -crate::check::evaluate::TARGET_TOLERANCE { "below" } else { "ABOVE" },
                o.worst_point
            ),
            96,
            "",
        ));
    }
    if !design.finish.standby.is_empty() {
        out.push_str(&format!(
            "standby wells         {} placed where a well's loss hurts most (rate 0, shown hollow on the map)\n",
            design.finish.standby.join(", ")
        ));
    }
    out
}

/// Short summary of binding constraints in `units`: "targets at 7 points (…); capacity of W01".
fn summarise_binding(binding: &[Binding], units: UnitSystem) -> String {
    let targets: Vec<String> = binding.iter().filter_map(Binding::target_words).collect();
    let mut parts = Vec::new();
    if !targets.is_empty() {
        let shown: Vec<&str> = targets.iter().take(3).map(String::as_str).collect();
        parts.push(format!(
            "targets at {} point{} ({}{})",
            targets.len(),
            if targets.len() == 1 { "" } else { "s" },
            shown.join(", "),
            if targets.len() > 3 { ", …" } else { "" }
        ));
    }
    let wells: Vec<String> = binding
        .iter()
        .filter(|b| b.target_words().is_none())
        .map(|b| b.words(units))
        .collect();
    if !wells.is_empty() {
        let shown: Vec<&str> = wells.iter().take(4).map(String::as_str).collect();
        parts.push(format!(
            "{}{}",
            shown.join("; "),
            if wells.len() > 4 {
                format!("; and {} more well limits", wells.len() - 4)
            } else {
                String::new()
            }
        ));
    }
    if parts.is_empty() {
        "none".into()
    } else {
        parts.join("; ")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn summary_counts_targets_and_lists_well_limits() {
        let b = vec![
            Binding::Target { point: "P1".into() },
            Binding::TargetWithWellOut {
                point: "P2".into(),
                well: "W03".into(),
            },
            Binding::PumpCapacity { well: "W01".into() },
        ];
        assert_eq!(
            summarise_binding(&b, UnitSystem::Si),
            "targets at 2 points (P1, P2 with W03 out); pump capacity of W01"
        );
        assert_eq!(summarise_binding(&[], UnitSystem::Us), "none");
        // 3.50 m ÷ 0.3048 m/ft = 11.48 ft (NIST SP 811 (2008) App. B: 1 ft = 0.3048 m exactly)
        let level = vec![Binding::WellLevel {
            well: "W01".into(),
            level_m: 3.5,
            floor: crate::optimise::limits::FloorKind::PumpIntake,
            loss: crate::optimise::binding::LevelLoss::Jacob,
        }];
        assert_eq!(
            summarise_binding(&level, UnitSystem::Us),
            "level in W01 at 11.48 ft (pump intake + submergence, with the well loss C·Q²)"
        );
    }
}
