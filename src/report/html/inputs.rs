//! The first parts of `report.html`: summary and result, inputs with their units and sources,
//! methods and assumptions with each formula's source.

use super::context::Context;
use super::page::{facts, table, Part};
use crate::input::model::{InfluenceMethod, WellKind, DEFAULT_CONTINGENCY};
use crate::physics::potential::AquiferKind;
use crate::report::format::esc;

/// Summary and result: met or not, flows, well count, the worst check point.
pub fn summary(cx: &Context) -> Part {
    let run = cx.run;
    let e = &run.evaluation;
    let f = &cx.f;
    let mut body = String::new();
    let verdict = format!(
        "Result: {}",
        crate::report::verdict::headline(&cx.found.verdict, f)
    );
    let ok = cx.found.verdict.is_met();
    body.push_str(&format!(
        "<p class=\"result{}\">{}</p>\n",
        if ok { "" } else { " bad" },
        esc(&verdict)
    ));
    let working = run.placement.wells.iter().filter(|w| w.rate > 0.0).count();
    let mut rows = vec![
        ("command", format!("drydig {}", cx.command)),
        (
            "wells",
            format!(
                "{} in the layout, {working} pumping",
                run.placement.wells.len()
            ),
        ),
        ("total abstraction", f.flow(e.total_abstraction_m3_per_s)),
        (
            "design flow (with contingency)",
            f.flow(e.design_flow_m3_per_s),
        ),
        (
            "radius of influence used",
            match f.units {
                // The basis text is written in metres by the engine.
                crate::input::units::UnitSystem::Si => format!(
                    "{} ({})",
                    f.length(e.radius_of_influence_m),
                    e.radius_of_influence_basis
                ),
                crate::input::units::UnitSystem::Us => format!(
                    "{} ({})",
                    f.length(e.radius_of_influence_m),
                    run.model.influence.name()
                ),
            },
        ),
    ];
    if e.total_recharge_m3_per_s > 0.0 {
        rows.push(("recharge", f.flow(e.total_recharge_m3_per_s)));
    }
    if let Some(i) = e.worst_point {
        let p = &e.points[i];
        rows.push((
            "lowest-margin check point",
            format!(
                "{}: water at {}, margin {}",
                p.point.name,
                p.level_m
                    .map_or("dry (aquifer base)".into(), |z| f.level(z)),
                p.margin_m.map_or("—".into(), |m| f.length(m))
            ),
        ));
    }
    body.push_str(&facts(&rows));
    Part::new("summary", "Summary and result", body)
}

/// The inputs, each in the chosen units with where it came from.
pub fn inputs(cx: &Context) -> Part {
    let m = cx.run.model;
    let f = &cx.f;
    let aq = &m.aquifer;
    let mut rows: Vec<Vec<String>> = Vec::new();
    let mut add = |item: &str, value: String, source: &str| {
        rows.push(vec![esc(item), esc(&value), esc(source)]);
    };
    add("site", m.name.clone(), "[site] name");
    add("datum", m.datum.clone(), "[site] datum");
    add(
        "coordinate system",
        m.crs.clone().unwrap_or_else(|| m.grid.clone()),
        if m.crs.is_some() {
            "[site] crs"
        } else {
            "[site] grid"
        },
    );
    add(
        "ground level",
        f.length(m.ground_level),
        "[site] ground_level",
    );
    add("aquifer", aq.describe().to_string(), "[aquifer] kind");
    add(
        "hydraulic conductivity",
        f.conductivity(aq.conductivity),
        "[aquifer] conductivity",
    );
    add(
        "groundwater level before pumping",
        f.level(aq.initial_level),
        "[aquifer] groundwater_level",
    );
    add(
        "aquifer base",
        f.level(aq.base_level),
        "[aquifer] base_level",
    );
    if let Some(t) = aq.top_level {
        add("aquifer top", f.level(t), "[aquifer] top_level");
    }
    if let AquiferKind::Leaky { .. } = aq.kind {
        if let Some(b) = aq.leakage_factor() {
            add(
                "leakage factor B",
                f.length(b),
                "[aquifer] leakage_factor / aquitard_resistance",
            );
        }
    }
    for e in &m.excavations {
        add(
            &format!("{}: plan area", e.name),
            f.area(geo::Area::unsigned_area(&e.outline)),
            "[[excavation]] outline",
        );
        add(
            &format!("{}: formation", e.name),
            f.level(e.formation_level),
            "[[excavation]] formation_level",
        );
        match crate::field::checkpoints::design_target(m, e) {
            crate::field::checkpoints::DesignTarget {
                level: Some(t),
                relief: true,
            } => add(
                &format!("{}: relief head (confined layer)", e.name),
                f.level(t),
                "[uplift]: layer top + soil weight above / (γ_w · factor_of_safety)",
            ),
            crate::field::checkpoints::DesignTarget { level: None, .. } => add(
                &format!("{}: relief head (confined layer)", e.name),
                "none needed".to_string(),
                "[uplift]",
            ),
            _ => add(
                &format!("{}: target water level", e.name),
                f.level(e.target_level()),
                "formation − target_margin",
            ),
        }
    }
    add(
        "influence method",
        m.influence.name().to_string(),
        "[influence] method",
    );
    add(
        "contingency on flow",
        format!("{:.0} %", m.contingency * 100.0),
        if (m.contingency - DEFAULT_CONTINGENCY).abs() < 1e-12 {
            "default (common practice)"
        } else {
            "[allowances] contingency"
        },
    );
    let w = &m.wells;
    add(
        "wells",
        match w.kind {
            WellKind::DeepWell => "deep wells with submersible pumps".into(),
            WellKind::Wellpoint => "wellpoints on a suction header".to_string(),
        },
        "[wells] kind",
    );
    add("well radius", f.length(w.radius), "[wells] radius");
    add("screen top", f.level(w.screen_top), "[wells] screen_top");
    add("screen base", f.level(w.screen_base), "[wells] screen_base");
    add("pump intake", f.level(w.pump_intake), "[wells] pump_intake");
    if let Some(c) = w.pump_capacity {
        add("pump capacity", f.rate(c), "[wells] pump_capacity");
    }
    for b in &m.boundaries {
        add(
            &format!("boundary: {}", b.name),
            match b.kind {
                crate::physics::images::BoundaryKind::ConstantHead => {
                    "constant head (image recharge well)".to_string()
                }
                crate::physics::images::BoundaryKind::Barrier => {
                    "barrier (image pumping well)".to_string()
                }
            },
            "[[boundary]]",
        );
    }
    for n in &m.import_notes {
        add(
            "drawing import",
            n.words(m.units),
            "outline read from a drawing",
        );
    }
    let mut body = table(&["item", "value", "source"], &rows);
    body.push_str(&format!(
        "<p class=\"note\">Levels are above {}; depths (bgl) are below the ground level given.</p>",
        esc(&m.datum)
    ));
    Part::new("inputs", "Inputs", body).on_new_page()
}

/// The methods used, each formula named with its published source, and the assumptions.
pub fn methods(cx: &Context) -> Part {
    let m = cx.run.model;
    let mut rows: Vec<[&str; 2]> = Vec::new();
    match m.aquifer.kind {
        AquiferKind::Unconfined => rows.push([
            "Dupuit–Thiem steady flow, superposed on Strack's discharge potential Φ = ½K·h²",
            "Strack, Groundwater Mechanics (1989), ch. 8; Thiem (1906)",
        ]),
        AquiferKind::Confined => rows.push([
            "Thiem steady flow (Φ = K·b·h, unconfined form where drawn below the top)",
            "Thiem (1906); Strack, Groundwater Mechanics (1989), ch. 8",
        ]),
        AquiferKind::Leaky { .. } => rows.push([
            "Hantush–Jacob leaky aquifer, steady K₀(r/B)",
            "Hantush & Jacob (1955); Hantush (1956)",
        ]),
    }
    rows.push(match m.influence {
        InfluenceMethod::Sichardt { .. } => [
            "radius of influence, Sichardt R = C·s·√K",
            "Sichardt (1928), reviewed by Houben (2021), Grundwasser",
        ],
        InfluenceMethod::Kusakin => ["radius of influence, Kusakin R = 575·s·√(H·K)", "Kusakin (1935)"],
        InfluenceMethod::CooperJacob { .. } => [
            "radius of influence, Cooper–Jacob R = √(2.25·T·t/S)",
            "Cooper & Jacob (1946)",
        ],
        InfluenceMethod::Fixed { .. } => ["radius of influence given in the design file", "design file"],
        InfluenceMethod::PumpingTest { .. } => [
            "radius of influence and T from the pumping test's distance–drawdown line",
            "Kruseman & de Ridder, Analysis and Evaluation of Pumping Test Data, 2nd ed. (1994) §3.2",
        ],
    });
    rows.push([
        "quick estimate: equivalent well r_e = √(A/π), or flow to a line slot for trenches",
        "one-dimensional Darcy/Dupuit; US Army TM 5-818-5",
    ]);
    rows.push([
        "well capacity by the entrance gradient i = 1/(15·√K)",
        "Sichardt (1928)",
    ]);
    if !m.boundaries.is_empty() {
        rows.push([
            "straight boundaries by image wells",
            "Ferris et al. (1962), USGS Water-Supply Paper 1536-E",
        ]);
    }
    if !m.neighbours.is_empty() {
        rows.push([
            "settlement: one-dimensional consolidation, Δσ′ = γ_w·Δh (or the buoyancy-loss form)",
            "Terzaghi; Das, Principles of Foundation Engineering",
        ]);
    }
    if m.uplift.is_some() {
        rows.push([
            "base uplift: FoS = σ_v / (γ_w·(h − z_top))",
            "total-stress uplift check as in EN 1997-1 (UPL) and CIRIA C750",
        ]);
    }
    if cx.design.is_some() {
        rows.push([
            "well rates by linear programme on the discharge potential",
            "superposition is linear in Φ (Strack 1989)",
        ]);
    }
    let rows: Vec<Vec<String>> = rows.iter().map(|[a, b]| vec![esc(a), esc(b)]).collect();
    let mut body = table(&["method", "source"], &rows);
    body.push_str("<h3>Assumptions</h3>\n<p>Homogeneous, isotropic ground of constant thickness; steady flow; straight boundaries; wells fully effective over their screens. Real ground is layered and variable: confirm by site investigation and pumping tests, and monitor during the works.</p>\n");
    Part::new("methods", "Methods and assumptions", body)
}
