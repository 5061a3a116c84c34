//! The terminal section on neighbours, base uplift and recharge: the neighbours table with
//! limits and status, each building's corners, worst point, sides and checks, the uplift
//! check of each excavation, the recharge sizing, and the closing neighbours verdict; written with
//! the helpers of [`crate::report::neighbours::numbers`].

use crate::findings::check::CheckFindings;
use crate::input::units::UnitSystem;
use crate::optimise::recharge::RechargeSizing;
use crate::report::neighbours::numbers::{
    mm, pressure_kpa, ratio_text, rule_settlement, small, truncate, unit_weight,
};
use crate::report::wrap;
use crate::safety::neighbours::{
    NeighbourResult, Status, RULE_OF_THUMB_DISTORTION, RULE_OF_THUMB_LABEL,
    RULE_OF_THUMB_SETTLEMENT,
};
use crate::safety::uplift::UpliftResult;

/// The checks of a neighbour in one line: "drawdown 1.62/1.50 m FAIL; …".
fn checks_line(r: &NeighbourResult, units: UnitSystem) -> String {
    r.checks
        .iter()
        .map(|c| {
            let v = match c.quantity.as_str() {
                "drawdown" => format!(
                    "{:.2} of {:.2} {}",
                    units.length(c.value),
                    units.length(c.limit),
                    units.length_unit()
                ),
                "settlement" => format!("{} of {}", mm(c.value, units), mm(c.limit, units)),
                _ => format!("{} of {}", ratio_text(c.value), ratio_text(c.limit)),
            };
            let basis = if c.basis == "design file" {
                String::new()
            } else {
                format!(" [limit: {}]", c.basis)
            };
            format!(
                "{} {v} {}{basis}",
                c.quantity,
                if c.pass { "ok" } else { "OVER" }
            )
        })
        .collect::<Vec<_>>()
        .join("; ")
}

/// Terminal section: neighbours table, uplift, recharge sizing, and the neighbours verdict.
pub fn text(found: &CheckFindings, units: UnitSystem) -> String {
    let mut out = String::new();
    let results = &found.neighbours;
    if !results.is_empty() {
        out.push_str(&table(results, units));
        for r in results {
            out.push_str(&building_detail(r, units));
        }
    }
    for u in &found.uplift {
        out.push_str(&uplift_text(u, units));
    }
    if let Some(rs) = found.recharge.as_ref() {
        out.push_str(&recharge_text(rs, units));
    }
    if !results.is_empty() {
        out.push_str(&verdict(results));
    }
    out
}

/// The neighbours table: heading, one row per building, and the note on limits not given.
fn table(results: &[NeighbourResult], units: UnitSystem) -> String {
    let mut out = String::new();
    let lu = units.length_unit();
    out.push_str("\nneighbours (drawdown from superposition; settlement by 1D consolidation on the listed layers)\n");
    out.push_str(&format!(
        "{:<26} {:>10} {:>9} {:>11} {:>9} {:>11} {:>9}  {}\n",
        "name",
        &format!("drawdown {lu}"),
        "limit",
        "settlement",
        "limit",
        "distortion",
        "limit",
        "status"
    ));
    for r in results {
        out.push_str(&table_row(r, units));
    }
    if results
        .iter()
        .flat_map(|r| &r.checks)
        .any(|c| c.basis != "design file")
    {
        out.push_str(&wrap(
            &format!(
                "* limit not in the design file: {} — {} total settlement, angular distortion {}; give the building's own limits",
                RULE_OF_THUMB_LABEL,
                rule_settlement(RULE_OF_THUMB_SETTLEMENT, units),
                ratio_text(RULE_OF_THUMB_DISTORTION)
            ),
            96,
            "  ",
        ));
    }
    out
}

/// One row of the neighbours table: worst drawdown, settlement and distortion with their
/// limits (* where the limit is the rule of thumb), and the status.
fn table_row(r: &NeighbourResult, units: UnitSystem) -> String {
    let l = |x: f64| units.length(x);
    let find = |q: &str| r.checks.iter().find(|c| c.quantity == q);
    let lim_dd = find("drawdown").map_or("—".into(), |c| format!("{:.2}", l(c.limit)));
    let (rho, lim_rho) = match (&r.worst_settlement, find("settlement")) {
        (Some(s), Some(c)) => (
            mm(s.settlement_m.unwrap_or(0.0), units),
            format!(
                "{:.*}{}",
                if units == UnitSystem::Us { 2 } else { 1 },
                small(c.limit, units).0,
                if c.basis == "design file" { "" } else { "*" }
            ),
        ),
        _ => ("—".into(), "—".into()),
    };
    let (beta, lim_beta) = match (r.max_distortion, find("angular distortion")) {
        (Some(b), Some(c)) => (
            ratio_text(b),
            format!(
                "{}{}",
                ratio_text(c.limit),
                if c.basis == "design file" { "" } else { "*" }
            ),
        ),
        _ => ("—".into(), "—".into()),
    };
    let failing: Vec<&str> = r
        .checks
        .iter()
        .filter(|c| !c.pass)
        .map(|c| c.quantity.as_str())
        .collect();
    let status = if failing.is_empty() {
        r.status.word().to_string()
    } else {
        format!("FAIL ({})", failing.join(", "))
    };
    format!(
        "{:<26} {:>10.2} {:>9} {:>11} {:>9} {:>11} {:>9}  {}\n",
        truncate(&r.name, 26),
        l(r.worst_drawdown.drawdown_m),
        lim_dd,
        rho,
        lim_rho,
        beta,
        lim_beta,
        status
    )
}

/// One building in detail: settlement profile basis, corners, worst point, sides, settlement
/// by layer, checks and notes.
fn building_detail(r: &NeighbourResult, units: UnitSystem) -> String {
    let mut out = String::new();
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    out.push_str(&format!(
        "  {} — layers from the {} at {:.2} {lu}; Δσ′ form: {}\n",
        r.name,
        r.profile_top_basis,
        l(r.profile_top_m),
        r.stress_change
    ));
    for c in &r.corners {
        out.push_str(&format!(
            "    {:<10} ({:>8.1}, {:>8.1})  drawdown {:>6.2} {lu}{}\n",
            c.name,
            l(c.position[0]),
            l(c.position[1]),
            l(c.drawdown_m),
            c.settlement_m.map_or(String::new(), |s| format!(
                "  settlement {:>9}",
                mm(s, units)
            ))
        ));
    }
    let w = &r.worst_drawdown;
    out.push_str(&format!(
        "    worst      ({:>8.1}, {:>8.1})  drawdown {:>6.2} {lu}{}  [{}, of {} points sampled]\n",
        l(w.position[0]),
        l(w.position[1]),
        l(w.drawdown_m),
        w.settlement_m.map_or(String::new(), |s| format!(
            "  settlement {:>9}",
            mm(s, units)
        )),
        w.name,
        r.sample_count
    ));
    for s in &r.sides {
        out.push_str(&format!(
            "    side {:<11} L {:>6.1} {lu}  Δρ {:>8}  β {}\n",
            s.name,
            l(s.length_m),
            mm(s.differential_m, units),
            ratio_text(s.distortion)
        ));
    }
    out.push_str(&super::column_text::settlement_lines(r, units));
    if !r.checks.is_empty() {
        out.push_str(&wrap(&checks_line(r, units), 96, "    "));
    }
    for n in &r.notes {
        out.push_str(&wrap(&format!("note: {n}"), 96, "    "));
    }
    out
}

/// The closing neighbours verdict: all within their limits, or which are over.
fn verdict(results: &[NeighbourResult]) -> String {
    let failing: Vec<&str> = results
        .iter()
        .filter(|r| r.status == Status::Fail)
        .map(|r| r.name.as_str())
        .collect();
    if failing.is_empty() {
        format!(
            "\nRESULT (neighbours): all {} within their limits\n",
            results.len()
        )
    } else {
        format!(
            "\nRESULT (neighbours): {} of {} over a limit: {}\n",
            failing.len(),
            results.len(),
            failing.join(", ")
        )
    }
}

fn uplift_text(u: &UpliftResult, units: UnitSystem) -> String {
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    let mut out = format!(
        "\nbase uplift — {}: {:.2} {lu} of soil at {} between formation {:.2} {lu} and the confined layer top {:.2} {lu}: σ_v = {}\n",
        u.excavation,
        l(u.cover_thickness_m),
        unit_weight(u.soil_unit_weight_kn_per_m3, units),
        l(u.formation_level_m),
        l(u.layer_top_m),
        pressure_kpa(u.overburden_kpa, units)
    );
    out.push_str(&format!(
        "  before pumping: piezometric level {:.2} {lu}, water pressure {}, FoS {}\n",
        l(u.piezometric_level_m),
        pressure_kpa(u.water_pressure_kpa, units),
        u.factor_of_safety_before
            .map_or("— (no uplift pressure)".into(), |f| format!("{f:.2}"))
    ));
    out.push_str(&format!(
        "  required FoS {:.2}: head in the layer must be at or below {:.2} {lu} (drawdown ≥ {:.2} {lu})\n",
        u.factor_of_safety_required,
        l(u.required_head_m),
        l(u.required_drawdown_m)
    ));
    out.push_str(&match u.uplift_target_m {
        None => "  no relief needed: the layer's head is already low enough\n".to_string(),
        Some(t) if u.uplift_governs => format!(
            "  uplift governs: check points \"{} uplift …\" hold the pumped level at or below {:.2} {lu} (excavation target {:.2} {lu})\n",
            u.excavation, l(t), l(u.excavation_target_m)
        ),
        Some(t) => format!(
            "  fed to the check points (\"{} uplift …\") as target min({:.2}, {:.2}) {lu}: the excavation's own target is the stricter here\n",
            u.excavation, l(t), l(u.excavation_target_m)
        ),
    });
    if let Some(h) = u.head_after_m {
        out.push_str(&format!(
            "  after pumping: highest head under the excavation {:.2} {lu}, FoS {} — {}\n",
            l(h),
            u.factor_of_safety_after
                .map_or("— (no uplift pressure left)".into(), |f| format!(
                    "{f:.2}"
                )),
            if u.pass_after == Some(true) {
                "met"
            } else {
                "NOT MET"
            }
        ));
    }
    out.push_str(&wrap(&format!("method: {}", u.method), 96, "  "));
    out
}

fn recharge_text(r: &RechargeSizing, units: UnitSystem) -> String {
    let lu = units.length_unit();
    let f = crate::report::format::Fmt::new(units, 0.0);
    let ru = f.rate_unit();
    let mut out = format!("\nrecharge sizing: {}\n", r.status);
    for p in &r.protected {
        out.push_str(&format!(
            "  protect {:<24} drawdown ≤ {:.2} {lu} ({}); {:.2} {lu} without recharge\n",
            truncate(&p.name, 24),
            units.length(p.drawdown_limit_m),
            p.basis,
            units.length(p.drawdown_without_recharge_m)
        ));
    }
    for w in &r.wells {
        out.push_str(&format!(
            "  {:<10} ({:>8.1}, {:>8.1})  injects {:>6} {ru} of at most {} {ru}\n",
            w.name,
            units.length(w.position[0]),
            units.length(w.position[1]),
            f.rate_value(w.rate_m3_per_s.max(0.0)),
            f.rate_value(w.capacity_m3_per_s)
        ));
    }
    out.push_str(&format!(
        "  abstraction {:.1} L/s, recharge {:.1} L/s, net flow {:.1} L/s ({:.0} m³/day)\n",
        r.abstraction_m3_per_s * 1e3,
        r.recharge_m3_per_s * 1e3,
        r.net_flow_m3_per_s * 1e3,
        r.net_flow_m3_per_s * 86_400.0
    ));
    if !r.binding.is_empty() {
        out.push_str(&format!(
            "  binding: {}{}\n",
            r.binding
                .iter()
                .take(4)
                .cloned()
                .collect::<Vec<_>>()
                .join("; "),
            if r.binding.len() > 4 {
                format!(" … ({} in all)", r.binding.len())
            } else {
                String::new()
            }
        ));
    }
    for n in &r.notes {
        out.push_str(&wrap(&format!("note: {n}"), 96, "  "));
    }
    out
}
