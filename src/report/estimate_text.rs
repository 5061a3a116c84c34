//! The quick estimate as a readable terminal table, and as JSON.

use super::format::Fmt;
use crate::caution::CAUTION;
use crate::estimate::{Estimate, EstimateNote, ExcavationEstimate, FlowMethod, InfluenceBasis};
use crate::input::units::{m3s_to_gpm, UnitSystem};
use crate::report::words::{thousands, wrap};

fn flow(m3_per_day: f64, units: UnitSystem) -> String {
    let m3s = m3_per_day / 86_400.0;
    match units {
        UnitSystem::Si => format!(
            "{} m³/day  ({:.1} L/s)",
            thousands(m3_per_day, 0),
            m3s * 1e3
        ),
        UnitSystem::Us => format!("{} US gpm", thousands(m3s_to_gpm(m3s), 0)),
    }
}

fn len(m: f64, units: UnitSystem) -> String {
    format!("{:.2} {}", units.length(m), units.length_unit())
}

fn row(out: &mut String, label: &str, value: String) {
    out.push_str(&format!("  {label:<30} {value}\n"));
}

fn excavation(out: &mut String, e: &ExcavationEstimate, units: UnitSystem) {
    let method = match e.flow_method {
        FlowMethod::EquivalentWell => "pit: equivalent-well method",
        FlowMethod::LineSlot => "trench: line-slot method with end allowance",
        FlowMethod::NoneNeeded => "no dewatering needed",
    };
    out.push_str(&format!("\nExcavation \"{}\" — {method}\n", e.name));
    out.push_str(&wrap(&format!("why: {}", e.flow_method_reason), 96, "  "));
    row(
        out,
        "plan area",
        format!(
            "{} {}",
            thousands(units.area(e.area_m2), 0),
            units.area_unit()
        ),
    );
    row(
        out,
        "length × width",
        format!(
            "{} × {}  ({})",
            len(e.length_m, units),
            len(e.width_m, units),
            e.length_basis
        ),
    );
    row(
        out,
        "equivalent radius r_e",
        format!(
            "{}  (area form; perimeter form {})",
            len(e.equivalent_radius_m, units),
            len(e.equivalent_radius_perimeter_form_m, units)
        ),
    );
    row(
        out,
        if e.relief_head {
            "formation / relief head"
        } else {
            "formation / target level"
        },
        format!(
            "{} / {}",
            len(e.formation_level_m, units),
            len(e.target_level_m, units)
        ),
    );
    row(out, "drawdown needed s", len(e.drawdown_m, units));
    if e.flow_method == FlowMethod::NoneNeeded {
        return;
    }
    let line = if e.flow_method == FlowMethod::LineSlot {
        ", to a line"
    } else {
        ""
    };
    row(
        out,
        "distance of influence L₀",
        format!(
            "{}  ({}{line}, from s)",
            len(e.distance_of_influence_m, units),
            e.influence_method
        ),
    );
    row(
        out,
        "radius of influence R₀",
        format!(
            "{}  (= r + L₀ from the centre{})",
            len(e.radius_of_influence_m, units),
            if e.flow_method == FlowMethod::LineSlot {
                " of each end"
            } else {
                ""
            }
        ),
    );
    if let (Some(sides), Some(ends)) = (e.slot_sides_flow_m3_per_day, e.slot_ends_flow_m3_per_day) {
        row(out, "flow through the long sides", flow(sides, units));
        row(out, "flow through the ends", flow(ends, units));
        if let Some(per100) = e.flow_per_100m_m3_per_day {
            match units {
                UnitSystem::Si => row(out, "flow per 100 m of trench", flow(per100, units)),
                // 100 ft = 30.48 m of trench.
                UnitSystem::Us => row(
                    out,
                    "flow per 100 ft of trench",
                    flow(per100 * 0.3048, units),
                ),
            }
        }
    }
    row(
        out,
        "steady total flow Q",
        flow(e.total_flow_m3_per_day, units),
    );
    row(
        out,
        &format!("design flow Q × (1 + {:.2})", e.contingency),
        flow(e.design_flow_m3_per_day, units),
    );
    let cap = e.well_capacity_l_per_s / 1e3 * 86_400.0;
    row(
        out,
        "capacity of one well",
        format!(
            "{}  ({}; wetted screen {})",
            flow(cap, units),
            e.well_capacity_limit,
            len(e.wetted_screen_m, units)
        ),
    );
    row(
        out,
        "rough well count",
        format!(
            "{} working + {} standby (each at {:.0} % of its capacity, as the design)",
            e.rough_well_count,
            e.standby_wells,
            e.capacity_fraction * 100.0
        ),
    );
    for n in &e.notes {
        out.push_str(&wrap(&format!("note: {}", note_words(n, units)), 96, "  "));
    }
}

/// A length with `d` decimals and its unit, m or ft.
fn length_d(m: f64, d: usize, units: UnitSystem) -> String {
    format!("{:.d$} {}", units.length(m), units.length_unit())
}

/// A rate (m³/s) as "59.84 L/s" or "948.5 gpm".
fn rate_words(q: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{:.2} L/s", q * 1e3),
        UnitSystem::Us => format!("{:.1} gpm", m3s_to_gpm(q)),
    }
}

fn influence_words(distance: f64, basis: &InfluenceBasis, units: UnitSystem) -> String {
    let l0 = length_d(distance, 1, units);
    match basis {
        InfluenceBasis::AtDrawdown { method, drawdown } => format!(
            "distance of influence L₀ = {l0} by {method} at the target drawdown s = {}",
            length_d(*drawdown, 2, units)
        ),
        InfluenceBasis::PumpingTest { jacob } => format!(
            "distance of influence L₀ = {l0} from the pumping test's distance–drawdown line (no design drawdown enters it{})",
            if *jacob {
                "; unconfined: Jacob's correction s′ = s − s²/(2H) applied first"
            } else {
                ""
            }
        ),
        InfluenceBasis::Fixed { method } => {
            format!("distance of influence L₀ = {l0} by {method} (independent of drawdown)")
        }
    }
}

fn suction_words(
    floor: f64,
    header: f64,
    header_is_ground: bool,
    limit: f64,
    target: f64,
    units: UnitSystem,
) -> String {
    let l = |v: f64| length_d(v, 2, units);
    let header = format!(
        "header {}{}",
        l(header),
        if header_is_ground {
            " (ground level, the default)"
        } else {
            ""
        }
    );
    if target < floor {
        format!("wellpoint suction: the lowest level a wellpoint holds is {} ({header} − suction limit {}), {} above the target {}: one stage cannot do it — a second stage, ejectors or deep wells (common practice (no source))", l(floor), l(limit), l(floor - target), l(target))
    } else {
        format!("wellpoint suction: lowest level in a wellpoint {} ({header} − suction limit {}), {} below the target {}", l(floor), l(limit), l(target - floor), l(target))
    }
}

/// A note of the estimate in words, in `units`.
pub fn note_words(n: &EstimateNote, units: UnitSystem) -> String {
    let l = |v: f64, d: usize| length_d(v, d, units);
    match n {
        EstimateNote::ReliefHead { head, factor_of_safety, formation_less_margin } => format!(
            "sized for the relief head {} (base uplift, [uplift]: factor of safety {factor_of_safety:.2}), not formation − margin ({})",
            l(*head, 2),
            l(*formation_less_margin, 2)
        ),
        EstimateNote::Influence { distance, basis } => influence_words(*distance, basis, units),
        EstimateNote::Boundaries { equivalent_radius, boundaries, with, without, factor } => format!(
            "boundaries: {} taken by the image of the equivalent well (r_e = {} at the centroid): flow {} with them, {} without (× {factor:.2}); wells on the boundary side stand nearer to it than the centroid, so a layout's flow can be a third or more above this{}",
            boundaries
                .iter()
                .map(|(name, d)| format!("\"{name}\" {} away", l(*d, 0)))
                .collect::<Vec<_>>()
                .join(", "),
            l(*equivalent_radius, 1),
            rate_words(*with, units),
            rate_words(*without, units),
            if boundaries.len() > 1 {
                " — SEVERAL BOUNDARIES: first-order images only (images of images left out), so this is rough; use `check`/`design` for the flow"
            } else {
                ""
            }
        ),
        EstimateNote::ShortTrench { length, distance, equivalent_well_flow } => format!(
            "the trench ({}) is shorter than twice its distance of influence ({}): much of the inflow is radial, so the line-slot figure is rough; the equivalent-well figure for comparison is {}",
            l(*length, 0),
            l(*distance, 0),
            match units {
                UnitSystem::Si => format!("{:.0} m³/day", equivalent_well_flow * 86_400.0),
                UnitSystem::Us => format!("{:.0} gpm", m3s_to_gpm(*equivalent_well_flow)),
            }
        ),
        EstimateNote::SensitiveLogarithm { radius, equivalent_radius } => format!(
            "the radius of influence ({}) is less than 1.5 × the equivalent radius ({}): the logarithm is very sensitive here; check L₀ against a pumping test",
            l(*radius, 0),
            l(*equivalent_radius, 0)
        ),
        EstimateNote::Leaky { leakage_factor } => format!(
            "leaky aquifer: the leakage factor B = {} replaces the radius of influence in the flow",
            l(*leakage_factor, 0)
        ),
        EstimateNote::BelowConfiningTop { target, top } => format!(
            "the target ({}) is below the confining top ({}): the aquifer turns unconfined near the excavation (handled through the discharge potential)",
            l(*target, 2),
            l(*top, 2)
        ),
        EstimateNote::LowContingency { contingency } => format!(
            "contingency {:.0} % is below the usual 50–100 % (common practice (no source))",
            contingency * 100.0
        ),
        EstimateNote::NoScreenBelowTarget => {
            "no screen lies below the target level, so a well here has no capacity: lower screen_base".into()
        }
        EstimateNote::Suction { floor, header, header_is_ground, suction_limit, target } => {
            suction_words(*floor, *header, *header_is_ground, *suction_limit, *target, units)
        }
    }
}

/// The estimate as a terminal table.
pub fn to_text(est: &Estimate, units: UnitSystem) -> String {
    let mut out = String::new();
    out.push_str(&format!("drydig quick estimate — {}\n", est.project));
    let (k, t) = match units {
        UnitSystem::Si => (
            format!("{:.2e} m/s", est.conductivity_m_per_s),
            format!("{:.2e} m²/s", est.transmissivity_m2_per_s),
        ),
        UnitSystem::Us => {
            let f = Fmt::new(units, 0.0);
            (
                f.conductivity(est.conductivity_m_per_s),
                f.transmissivity(est.transmissivity_m2_per_s),
            )
        }
    };
    out.push_str(&format!(
        "aquifer: {}; K = {k}; T = {t}; groundwater {}; base {}\n",
        est.aquifer,
        len(est.groundwater_level_m, units),
        len(est.aquifer_base_level_m, units)
    ));
    for e in &est.excavations {
        excavation(&mut out, e, units);
    }
    if est.excavations.len() > 1 {
        out.push_str(
            "\nAll excavations (each computed alone; shared influence is not subtracted)\n",
        );
        let table = super::estimate_table::estimate_table(est).to_text(&Fmt::new(units, 0.0));
        for line in table.lines() {
            out.push_str(&format!("  {line}\n"));
        }
        row(
            &mut out,
            "steady total flow",
            flow(est.total_flow_m3_per_day, units),
        );
        row(
            &mut out,
            "design flow",
            flow(est.design_flow_m3_per_day, units),
        );
    }
    out.push('\n');
    out.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, ""));
    out
}

/// The estimate as one JSON object. Keys are SI with the unit in the name; with US units the
/// main figures are repeated in feet and US gpm. The notes are in words, in `units`.
pub fn to_json(est: &Estimate, units: UnitSystem) -> serde_json::Value {
    let mut v = serde_json::to_value(est).unwrap_or(serde_json::Value::Null);
    if let Some(list) = v.get_mut("excavations").and_then(|l| l.as_array_mut()) {
        for (e, src) in list.iter_mut().zip(&est.excavations) {
            e["notes"] = src
                .notes
                .iter()
                .map(|n| serde_json::Value::from(note_words(n, units)))
                .collect();
        }
    }
    if units == UnitSystem::Us {
        if let Some(list) = v.get_mut("excavations").and_then(|l| l.as_array_mut()) {
            for (e, src) in list.iter_mut().zip(&est.excavations) {
                let gpm = |m3d: f64| m3s_to_gpm(m3d / 86_400.0);
                e["total_flow_gpm"] = gpm(src.total_flow_m3_per_day).into();
                e["design_flow_gpm"] = gpm(src.design_flow_m3_per_day).into();
                e["equivalent_radius_ft"] = units.length(src.equivalent_radius_m).into();
                e["radius_of_influence_ft"] = units.length(src.radius_of_influence_m).into();
                e["drawdown_ft"] = units.length(src.drawdown_m).into();
            }
        }
    }
    v
}
