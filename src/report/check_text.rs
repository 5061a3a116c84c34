//! Terminal summary of an evaluated layout.

use super::{thousands, wrap, CAUTION};
use crate::check::run::CheckRun;
use crate::findings::check::CheckFindings;
use crate::input::units::{m3s_to_gpm, UnitSystem};

fn flow(q: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{} m³/day ({:.1} L/s)", thousands(q * 86_400.0, 0), q * 1e3),
        UnitSystem::Us => format!("{} US gpm", thousands(m3s_to_gpm(q), 0)),
    }
}

/// The walls' quantities and solve size in the chosen units (nothing without walls).
pub fn wall_lines(found: &CheckFindings, units: UnitSystem) -> Vec<String> {
    let lu = units.length_unit();
    let l1 = units.length(1.0);
    found.walls.as_ref().map_or_else(Vec::new, |w| {
        w.lines(
            |x| format!("{:.1} {lu}", units.length(x)),
            |a| format!("{} {lu}²", thousands(a * l1 * l1, 0)),
        )
    })
}

/// The summary table.
pub fn to_text(found: &CheckFindings, units: UnitSystem) -> String {
    let run = &found.run;
    let e = &run.evaluation;
    let m = run.model;
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    let mut out = format!("drydig check — {}\n", m.name);
    // The basis text is written in metres by the engine; in US units the radius and the method
    // are given instead (summary.json keeps the full basis).
    let basis = match units {
        UnitSystem::Si => e.radius_of_influence_basis.clone(),
        UnitSystem::Us if m.aquifer.leakage_factor().is_some() => format!(
            "none in a leaky aquifer: K₀(r/B) with leakage factor B = {:.1} {lu}",
            l(e.radius_of_influence_m)
        ),
        UnitSystem::Us => format!(
            "{:.1} {lu} ({})",
            l(e.radius_of_influence_m),
            m.influence.name()
        ),
    };
    out.push_str(&wrap(&format!("radius of influence: {basis}"), 96, ""));
    for line in wall_lines(found, units) {
        out.push_str(&wrap(&line, 96, ""));
    }
    out.push_str(&wrap(
        &crate::report::as_built_text::as_built_lines(run, units),
        96,
        "",
    ));
    out.push_str(&well_table(run, units));
    for n in &run.placement.notes {
        out.push_str(&wrap(&format!("note: {n}"), 96, ""));
    }
    for n in &run.model.crs_warnings {
        out.push_str(&wrap(&format!("warning: {n}"), 96, ""));
    }
    out.push('\n');
    out.push_str(&format!(
        "wells                 {}\n",
        run.placement.wells.len()
    ));
    out.push_str(&format!(
        "total flow            {}\n",
        flow(e.total_abstraction_m3_per_s, units)
    ));
    if e.total_recharge_m3_per_s > 0.0 {
        out.push_str(&format!(
            "recharge              {}\n",
            flow(e.total_recharge_m3_per_s, units)
        ));
        out.push_str(&format!(
            "net flow              {}\n",
            flow(e.net_flow_m3_per_s, units)
        ));
    }
    out.push_str(&format!(
        "design flow (+{:.0} %)  {}\n",
        m.contingency * 100.0,
        flow(e.design_flow_m3_per_s, units)
    ));
    out.push_str(&format!(
        "check points          {} ({} not met)\n",
        e.points.len(),
        e.unmet_count
    ));
    if let Some(i) = e.worst_point {
        let p = &e.points[i];
        let margin = p.margin_m.unwrap_or(0.0);
        out.push_str(&format!(
            "lowest margin         {:.2} {lu} {} target at \"{}\" ({:.1}, {:.1})\n",
            l(margin.abs()),
            if margin >= 0.0 { "below" } else { "ABOVE" },
            p.point.name,
            p.point.position[0],
            p.point.position[1]
        ));
    }
    let unmet: Vec<_> = e.points.iter().filter(|p| p.met == Some(false)).collect();
    if !unmet.is_empty() {
        out.push_str(&format!("\ntargets NOT met ({}):\n", unmet.len()));
        for p in unmet.iter().take(40) {
            out.push_str(&format!(
                "  {:<28} ({:>9.1}, {:>9.1})  level {:>7.2}  target {:>7.2}  short {:.2} {lu}\n",
                p.point.name,
                p.point.position[0],
                p.point.position[1],
                l(p.level_m.unwrap_or(f64::NAN)),
                l(p.point.target_level.unwrap_or(f64::NAN)),
                l(-p.margin_m.unwrap_or(0.0))
            ));
        }
        if unmet.len() > 40 {
            out.push_str(&format!(
                "  … and {} more (see checkpoints.csv)\n",
                unmet.len() - 40
            ));
        }
    }
    out.push_str(&super::neighbours::text::text(found, units));
    let f = super::format::Fmt::new(units, m.ground_level);
    out.push_str(&format!(
        "\nRESULT: {}\n\n",
        super::verdict::headline(&found.verdict, &f)
    ));
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// The wells table: position, rate, level in the well, the lowest level allowed, capacity and
/// status, one row per well (shared by `check` and `design`).
pub fn well_table(run: &CheckRun, units: UnitSystem) -> String {
    let e = &run.evaluation;
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    let f = super::format::Fmt::new(units, run.model.ground_level);
    let ru = f.rate_unit();
    let mut out = String::new();
    out.push_str(&format!(
        "\n{:<10} {:>11} {:>11} {:>9} {:>11} {:>9} {:>11} {:>9}  {}\n",
        "well",
        "x",
        "y",
        format!("rate {ru}"),
        &format!("level {lu}"),
        &format!("depth {lu}"),
        &format!("lowest {lu}"),
        format!("cap {ru}"),
        "status"
    ));
    for (w, r) in run.placement.wells.iter().zip(&e.wells) {
        out.push_str(&format!(
            "{:<10} {:>11.1} {:>11.1} {:>9} {:>11} {:>9} {:>11.2} {:>9}  {}\n",
            w.name,
            w.position[0],
            w.position[1],
            f.rate_value(w.rate),
            r.level_m.map_or("dry".into(), |z| format!("{:.2}", l(z))),
            r.level_m.map_or("—".into(), |z| f.depth_value(z)),
            l(r.lowest_allowed_level_m),
            f.rate_value(r.capacity_m3_per_s),
            if r.problems.is_empty() {
                "ok".to_string()
            } else {
                super::problems::well_problems(&r.problems, &f)
            }
        ));
    }
    out
}
