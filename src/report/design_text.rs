//! Outputs of `design` and `sweep`: the terminal summary, `design.json`, `design.csv` (the
//! counts tried), `bid.csv` (the quantities and the comparison with the quick estimate), and the
//! sweep table (`sweep.csv`).

use super::{thousands, wrap, CAUTION};
use crate::check::run::CheckRun;
use crate::input::model::{LayoutKind, Model};
use crate::input::units::{m3s_to_gpm, UnitSystem};
use crate::optimise::bid::{bid_of, Bid};
use crate::optimise::individual::summarise_binding;
use crate::optimise::outcome::{is_met, Design, Outcome};
use crate::optimise::trial::Trial;
use serde_json::{json, Value};

const DAY: f64 = 86_400.0;

fn flow(q: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{} m³/day ({:.1} L/s)", thousands(q * DAY, 0), q * 1e3),
        UnitSystem::Us => format!(
            "{} US gpm ({} m³/day)",
            thousands(m3s_to_gpm(q), 0),
            thousands(q * DAY, 0)
        ),
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

fn trial_json(t: &Trial) -> Value {
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
        "binding_limit": t.binding_limit,
        "uniform_met": t.uniform_met,
        "individual_met": t.individual_met,
        "individual_status": t.individual_status,
        "outcome": t.outcome,
    })
}

/// `design.json`: everything about the search, the choice and the bid.
pub fn design_json(model: &Model, design: &Design, run: Option<&CheckRun>) -> Value {
    let total = run.map_or(0.0, |r| r.evaluation.total_abstraction_m3_per_s);
    let (est, ratio) = estimate_comparison(design, total);
    let bid = run.map(|r| bid_of(model, r));
    json!({
        "drydig_version": env!("CARGO_PKG_VERSION"),
        "project": model.name,
        "outcome": design.outcome,
        "met": is_met(design, run),
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
            }),
            LayoutKind::Line { spacing, both_sides, .. } => json!({
                "kind": "line",
                "spacing_m": spacing,
                "both_sides": both_sides,
                "offset_m": s.offset,
            }),
            LayoutKind::Listed => json!({"kind": "listed"}),
            LayoutKind::Csv { path } => json!({"kind": "csv", "file": path.display().to_string()}),
        }),
        "binding_constraints": design.binding,
        "comparison_with_quick_estimate": {
            "method": design.estimate.flow_method,
            "estimate_total_flow_m3_per_day": est * DAY,
            "optimised_total_flow_m3_per_day": total * DAY,
            "ratio_optimised_to_estimate": ratio,
        },
        "counts_tried": design.trials.iter().map(trial_json).collect::<Vec<_>>(),
        "bid": bid.map(|b| json!({
            "wells_in_layout": b.wells_in_layout,
            "working_wells": b.working_wells,
            "idle_wells": b.idle_wells,
            "recharge_wells": b.recharge_wells,
            "recharge_flow_m3_per_day": b.recharge_flow_m3_per_s * DAY,
            "standby_wells": b.standby_wells,
            "depth_per_well_m": b.depth_per_well_m,
            "drilling_m": b.drilling_m,
            "screen_m": b.screen_m,
            "pumps": b.pumps,
            "standby_pumps": b.standby_pumps,
            "total_flow_m3_per_day": b.total_flow_m3_per_s * DAY,
            "total_flow_l_per_s": b.total_flow_m3_per_s * 1e3,
            "design_flow_m3_per_day": b.design_flow_m3_per_s * DAY,
            "design_flow_l_per_s": b.design_flow_m3_per_s * 1e3,
            "contingency": b.contingency,
            "header_length_m": b.header_length_m,
            "design_flow_per_100m_header_l_per_s": b.design_flow_per_100m_m3_per_s.map(|q| q * 1e3),
            "basis": b.basis,
        })),
        "notes": design.notes,
        "caution": CAUTION,
    })
}

/// The counts table as CSV (used by `design.csv` and `sweep.csv`), SI units in the headers.
pub fn trials_csv(trials: &[Trial], requested: Option<&[f64]>) -> anyhow::Result<Vec<u8>> {
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
            t.binding_limit.clone(),
            t.uniform_met.to_string(),
            t.individual_met.to_string(),
            t.individual_status.clone(),
            t.outcome.clone(),
        ];
        if let Some(r) = requested {
            rec.insert(0, r.get(i).map_or(String::new(), |v| format!("{v}")));
        }
        w.write_record(&rec)?;
    }
    Ok(w.into_inner()?)
}

/// `bid.csv`: item, quantity, unit, basis — with the comparison against the quick estimate.
pub fn bid_csv(design: &Design, bid: &Bid) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record(["item", "quantity", "unit", "basis"])?;
    let row = |w: &mut csv::Writer<Vec<u8>>, item: &str, q: String, unit: &str, basis: &str| {
        w.write_record([item, &q, unit, basis])
    };
    row(
        &mut w,
        "working wells",
        bid.working_wells.to_string(),
        "no.",
        "wells with a rate above zero",
    )?;
    if bid.idle_wells > 0 {
        row(
            &mut w,
            "idle wells in the layout",
            bid.idle_wells.to_string(),
            "no.",
            "the least-flow rates leave them at zero: omit or keep as spare",
        )?;
    }
    row(
        &mut w,
        "standby wells",
        bid.standby_wells.to_string(),
        "no.",
        "design file wells.standby",
    )?;
    if bid.recharge_wells > 0 {
        row(
            &mut w,
            "recharge wells",
            bid.recharge_wells.to_string(),
            "no.",
            &format!(
                "kept at their given rates, {:.1} m³/day in all",
                bid.recharge_flow_m3_per_s * DAY
            ),
        )?;
    }
    row(
        &mut w,
        "drilling",
        format!("{:.1}", bid.drilling_m),
        "m",
        bid.basis.first().map_or("", |s| s),
    )?;
    row(
        &mut w,
        "screen",
        format!("{:.1}", bid.screen_m),
        "m",
        "screen top − screen base, working + standby wells",
    )?;
    for p in &bid.pumps {
        row(
            &mut w,
            &format!("pumps of {:.1} L/s duty", p.duty_l_per_s),
            p.count.to_string(),
            "no.",
            &format!(
                "running {:.2}–{:.2} L/s",
                p.running_l_per_s[0], p.running_l_per_s[1]
            ),
        )?;
    }
    if bid.standby_pumps > 0 {
        row(
            &mut w,
            "standby pumps",
            bid.standby_pumps.to_string(),
            "no.",
            "one per standby well, of the largest duty",
        )?;
    }
    if let (Some(l), Some(q)) = (bid.header_length_m, bid.design_flow_per_100m_m3_per_s) {
        row(
            &mut w,
            "wellpoint header",
            format!("{l:.0}"),
            "m",
            "along the wellpoint lines",
        )?;
        row(
            &mut w,
            "design flow per 100 m of header",
            format!("{:.2}", q * 1e3),
            "L/s",
            "header pumps are sized on this",
        )?;
    }
    row(
        &mut w,
        "total flow",
        format!("{:.1}", bid.total_flow_m3_per_s * DAY),
        "m³/day",
        "sum of the well rates",
    )?;
    row(
        &mut w,
        "total flow",
        format!("{:.2}", bid.total_flow_m3_per_s * 1e3),
        "L/s",
        "sum of the well rates",
    )?;
    row(
        &mut w,
        "design flow",
        format!("{:.1}", bid.design_flow_m3_per_s * DAY),
        "m³/day",
        &format!("total × (1 + {:.2})", bid.contingency),
    )?;
    row(
        &mut w,
        "design flow",
        format!("{:.2}", bid.design_flow_m3_per_s * 1e3),
        "L/s",
        &format!("total × (1 + {:.2})", bid.contingency),
    )?;
    let (est, ratio) = estimate_comparison(design, bid.total_flow_m3_per_s);
    row(
        &mut w,
        "quick estimate total flow",
        format!("{:.1}", est * DAY),
        "m³/day",
        "drydig estimate (equivalent well or line slot)",
    )?;
    if let Some(r) = ratio {
        row(
            &mut w,
            "optimised / estimate",
            format!("{r:.2}"),
            "ratio",
            "total flow of this design over the quick estimate",
        )?;
    }
    Ok(w.into_inner()?)
}

/// Every file `design` writes: what `check` writes for the chosen layout, plus `design.json`,
/// `design.csv` and `bid.csv`.
pub fn files(
    model: &Model,
    design: &Design,
    run: Option<&CheckRun>,
) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    let mut out = match run {
        Some(r) => super::check_files_for(r, None, Some(design))?,
        None => Vec::new(),
    };
    out.push((
        "design.json".into(),
        serde_json::to_vec_pretty(&design_json(model, design, run))?,
    ));
    out.push(("design.csv".into(), trials_csv(&design.trials, None)?));
    if let Some(r) = run {
        out.push(("bid.csv".into(), bid_csv(design, &bid_of(model, r))?));
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
        "outcome"
    ));
    for (i, t) in trials.iter().enumerate() {
        if let Some(r) = requested {
            out.push_str(&format!(
                "{:>9} ",
                r.get(i).map_or(String::new(), |v| format!("{v}"))
            ));
        }
        let mut limit = t.binding_limit.clone();
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
            match (t.individual_total_m3_per_s, t.individual_status.as_str()) {
                (Some(q), _) => format!("{:.0}", q * total_scale),
                (None, "not run") => "not run".to_string(),
                (None, "infeasible") => "infeasible".to_string(),
                (None, _) => "failed".to_string(),
            },
            units.length(t.lowest_margin_m),
            limit,
            t.outcome
        ));
    }
    out
}

/// The terminal summary of a design.
pub fn to_text(
    model: &Model,
    design: &Design,
    run: Option<&CheckRun>,
    units: UnitSystem,
) -> String {
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
    if !design.trials.is_empty() {
        out.push_str(
            "\nlayouts tried (rate = smallest uniform rate meeting every target; LP = least total with individual rates;\nmargin = lowest margin below target with every well at the largest uniform rate its limits allow):\n",
        );
        out.push_str(&trials_table(&design.trials, units, None));
    }
    out.push('\n');
    match &design.outcome {
        Outcome::Met { count, .. } => {
            let used = design.used.unwrap_or(design.asked);
            out.push_str(&format!(
                "RESULT: targets met with {count} wells, {}\n",
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
            out.push_str(&format!(
                "RESULT: NOT MET — no layout tried meets every target within the well limits.\n  best layout: {count} wells; worst point \"{worst_point}\" ({:.1}, {:.1}) stays {:.2} {lu} above its target\n",
                position[0],
                position[1],
                l(*shortfall_m)
            ));
        }
        Outcome::Impossible { reason } => {
            out.push_str("RESULT: IMPOSSIBLE with this kind of layout\n");
            out.push_str(&wrap(&format!("reason: {reason}"), 96, "  "));
        }
    }
    if !design.binding.is_empty() {
        out.push_str(&wrap(
            &format!("binding: {}", summarise_binding(&design.binding)),
            96,
            "  ",
        ));
    }
    if let Some(r) = run {
        let e = &r.evaluation;
        out.push_str(&super::check_text::well_table(r, units));
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
        let b = bid_of(model, r);
        out.push_str("\nbid quantities\n");
        out.push_str(&format!(
            "  wells               {} working + {} standby{}\n",
            b.working_wells,
            b.standby_wells,
            if b.idle_wells > 0 {
                format!(
                    " ({} more in the layout left idle by the least-flow rates)",
                    b.idle_wells
                )
            } else {
                String::new()
            }
        ));
        if b.recharge_wells > 0 {
            out.push_str(&format!(
                "  recharge wells      {} at their given rates ({} in all; not in the drilling below)\n",
                b.recharge_wells,
                flow(b.recharge_flow_m3_per_s, units)
            ));
        }
        out.push_str(&format!(
            "  drilling            {:.0} {lu} ({:.2} {lu} per well incl. {:.1} m sump allowance)\n",
            l(b.drilling_m),
            l(b.depth_per_well_m),
            crate::optimise::bid::SUMP_ALLOWANCE
        ));
        out.push_str(&format!(
            "  screen              {:.0} {lu}\n",
            l(b.screen_m)
        ));
        for p in &b.pumps {
            out.push_str(&format!(
                "  pumps               {} × {:.1} L/s duty (running {:.2}–{:.2} L/s)\n",
                p.count, p.duty_l_per_s, p.running_l_per_s[0], p.running_l_per_s[1]
            ));
        }
        if b.standby_pumps > 0 {
            out.push_str(&format!("  standby pumps       {}\n", b.standby_pumps));
        }
        if let (Some(len), Some(q)) = (b.header_length_m, b.design_flow_per_100m_m3_per_s) {
            out.push_str(&format!(
                "  wellpoint header    {:.0} {lu}, design flow {:.2} L/s per 100 m (header pumps sized on it)\n",
                l(len),
                q * 1e3
            ));
        }
        out.push_str(&format!(
            "  total flow          {}\n",
            flow(b.total_flow_m3_per_s, units)
        ));
        out.push_str(&format!(
            "  design flow (+{:.0} %) {}\n",
            b.contingency * 100.0,
            flow(b.design_flow_m3_per_s, units)
        ));
        for n in &r.placement.notes {
            out.push_str(&wrap(&format!("note: {n}"), 96, ""));
        }
    }
    for n in &design.notes {
        out.push_str(&wrap(&format!("note: {n}"), 96, ""));
    }
    if let Some(r) = run {
        if !r.model.neighbours.is_empty() || r.model.uplift.is_some() {
            out.push_str("\nneighbours and base uplift for the chosen layout:\n");
            out.push_str(&super::neighbours::text::text(r, None, units));
        }
    }
    out.push('\n');
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// The terminal table of a sweep.
pub fn sweep_text(
    model: &Model,
    sweep: &crate::optimise::sweep::Sweep,
    units: UnitSystem,
) -> String {
    let mut out = format!("drydig sweep — {}\n", model.name);
    out.push_str(&wrap(&sweep.describe(), 96, ""));
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
