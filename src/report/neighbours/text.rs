//! The terminal section on neighbours, base uplift and recharge: the neighbours table with
//! limits and status, each building's corners, worst point, sides and checks, the uplift
//! check of each excavation, the recharge sizing, and the closing neighbours verdict; written with
//! the helpers of [`crate::report::neighbours::numbers`].

use crate::findings::check::CheckFindings;
use crate::input::units::UnitSystem;
use crate::optimise::recharge::RechargeSizing;
use crate::report::format::Fmt;
use crate::report::neighbours::numbers::{
    mm, pressure_kpa, ratio_text, rule_settlement, truncate, unit_weight,
};
use crate::report::neighbours::table::neighbours_table;
use crate::report::words::wrap;
use crate::safety::limit_check::{LimitBasis, LimitQuantity};
use crate::safety::neighbours::{
    NeighbourResult, Status, RULE_OF_THUMB_DISTORTION, RULE_OF_THUMB_LABEL, RULE_OF_THUMB_RISE,
    RULE_OF_THUMB_RISE_LABEL, RULE_OF_THUMB_SETTLEMENT,
};
use crate::safety::uplift::UpliftResult;

/// The checks of a neighbour in one line: "drawdown 1.62 of 1.50 m OVER; …", with the basis of
/// a limit that is not the design file's.
fn checks_line(r: &NeighbourResult, units: UnitSystem) -> String {
    r.checks
        .iter()
        .map(|c| {
            let v = match c.quantity {
                LimitQuantity::Drawdown | LimitQuantity::Rise => format!(
                    "{:.2} of {:.2} {}",
                    units.length(c.value),
                    units.length(c.limit),
                    units.length_unit()
                ),
                LimitQuantity::Settlement => {
                    format!("{} of {}", mm(c.value, units), mm(c.limit, units))
                }
                LimitQuantity::AngularDistortion => {
                    format!("{} of {}", ratio_text(c.value), ratio_text(c.limit))
                }
            };
            let basis = match c.basis {
                LimitBasis::DesignFile => String::new(),
                LimitBasis::RuleOfThumb(label) => format!(" [limit: {label}]"),
            };
            format!(
                "{} {v} {}{basis}",
                c.quantity.words(),
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

/// The neighbours table ([`neighbours_table`]): heading, one row per building, and the note on
/// limits not given.
fn table(results: &[NeighbourResult], units: UnitSystem) -> String {
    let mut out = String::new();
    out.push_str("\nneighbours (drawdown from superposition; settlement by 1D consolidation on the listed layers)\n");
    out.push_str(&neighbours_table(results).to_text(&Fmt::new(units, 0.0)));
    if let Some(note) = rule_of_thumb_note(results, units) {
        out.push_str(&wrap(&note, 96, "  "));
    }
    out
}

/// The footnote of the "*" limits: the rules of thumb the table uses where the design file gives
/// no limit (`None` when it uses none).
pub fn rule_of_thumb_note(results: &[NeighbourResult], units: UnitSystem) -> Option<String> {
    let ruled = |q: LimitQuantity| {
        results
            .iter()
            .flat_map(|r| &r.checks)
            .any(|c| c.quantity == q && c.basis.is_rule_of_thumb())
    };
    let mut rules = Vec::new();
    if ruled(LimitQuantity::Settlement) || ruled(LimitQuantity::AngularDistortion) {
        rules.push(format!(
            "{} — {} total settlement, angular distortion {}",
            RULE_OF_THUMB_LABEL,
            rule_settlement(RULE_OF_THUMB_SETTLEMENT, units),
            ratio_text(RULE_OF_THUMB_DISTORTION)
        ));
    }
    if ruled(LimitQuantity::Rise) {
        rules.push(format!(
            "{} — {}",
            RULE_OF_THUMB_RISE_LABEL,
            Fmt::new(units, 0.0).length(RULE_OF_THUMB_RISE)
        ));
    }
    (!rules.is_empty()).then(|| {
        format!(
            "* limit not in the design file: {}; give the building's own limits",
            rules.join("; ")
        )
    })
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
            p.basis.words(units),
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
    // Flows per well in the rate unit (L/s or gpm); in SI the net flow also as a daily total.
    let daily = match units {
        UnitSystem::Si => format!(" ({:.0} m³/day)", r.net_flow_m3_per_s * 86_400.0),
        UnitSystem::Us => String::new(),
    };
    out.push_str(&format!(
        "  abstraction {:.1} {ru}, recharge {:.1} {ru}, net flow {:.1} {ru}{daily}\n",
        f.rate_number(r.abstraction_m3_per_s),
        f.rate_number(r.recharge_m3_per_s),
        f.rate_number(r.net_flow_m3_per_s),
    ));
    if !r.binding.is_empty() {
        out.push_str(&format!(
            "  binding: {}{}\n",
            r.binding
                .iter()
                .take(4)
                .map(|b| b.words(units))
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
        out.push_str(&wrap(&format!("note: {}", n.words(units)), 96, "  "));
    }
    out
}
