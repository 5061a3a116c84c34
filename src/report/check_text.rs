//! Terminal summary of an evaluated layout.

use crate::caution::CAUTION;
use crate::check::run::CheckRun;
use crate::findings::check::CheckFindings;
use crate::input::units::{m3s_to_gpm, UnitSystem};
use crate::report::table::{Rows, TERMINAL_ROWS};
use crate::report::words::{thousands, wrap};

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

/// The terminal text of `check`: the wells table ([`well_table`], `rows` long), flows, check
/// points, neighbours and the verdict.
pub fn to_text(found: &CheckFindings, units: UnitSystem, rows: Rows) -> String {
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
    out.push_str(&well_table(run, units, rows));
    for n in &run.placement.notes {
        out.push_str(&wrap(&format!("note: {}", n.words(units)), 96, ""));
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
            l(p.point.position[0]),
            l(p.point.position[1])
        ));
    }
    out.push_str(&unmet_points(run, units, rows));
    out.push_str(&super::neighbours::text::text(found, units));
    let f = super::format::Fmt::new(units, m.ground_level);
    out.push_str(&format!(
        "\nRESULT: {}\n\n",
        super::verdict::headline(&found.verdict, &f)
    ));
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// The wells table: position, rate, level in the well with its depth, the lowest level
/// allowed, capacity and status (shared by `check` and `design`). A long table lists the
/// [`TERMINAL_ROWS`] wells with the least headroom and points to wells.csv, unless `rows` asks
/// for all.
pub fn well_table(run: &CheckRun, units: UnitSystem, rows: Rows) -> String {
    let f = super::format::Fmt::new(units, run.model.ground_level);
    let n = run.evaluation.wells.len();
    let short = rows == Rows::Short && n > TERMINAL_ROWS;
    let only = short.then(|| super::tables::tightest_wells(run, TERMINAL_ROWS));
    let mut out = String::from("\n");
    if short {
        out.push_str(&format!(
            "the {TERMINAL_ROWS} of {n} wells with the least headroom above their lowest allowed level, problems first:\n"
        ));
    }
    out.push_str(&super::tables::wells_table(run, only.as_deref()).to_text(&f));
    if short {
        out.push_str(&format!(
            "… {} more in wells.csv (-v lists every well here)\n",
            n - TERMINAL_ROWS
        ));
    }
    out
}

/// The check points whose target is not met: name, position, level, target and shortfall. A
/// long list shows the [`TERMINAL_ROWS`] points short by most and points to checkpoints.csv,
/// unless `rows` asks for all (then in the order of the design file).
fn unmet_points(run: &CheckRun, units: UnitSystem, rows: Rows) -> String {
    let unmet: Vec<usize> = (0..run.evaluation.points.len())
        .filter(|&i| run.evaluation.points[i].met == Some(false))
        .collect();
    let n = unmet.len();
    if n == 0 {
        return String::new();
    }
    let short = rows == Rows::Short && n > TERMINAL_ROWS;
    let only = short.then(|| super::tables::worst_unmet_points(run, TERMINAL_ROWS));
    let f = super::format::Fmt::new(units, run.model.ground_level);
    let mut out = format!("\ntargets NOT met ({n}):\n");
    if short {
        out.push_str(&format!(
            "the {TERMINAL_ROWS} of {n} points short by most:\n"
        ));
    }
    let table = super::tables::unmet_points_table(run, only.as_deref().unwrap_or(&unmet));
    for line in table.to_text(&f).lines() {
        out.push_str(&format!("  {line}\n"));
    }
    if short {
        out.push_str(&format!(
            "  … {} more in checkpoints.csv (-v lists every point here)\n",
            n - TERMINAL_ROWS
        ));
    }
    out
}
