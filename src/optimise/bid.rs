//! The quantities a bid needs for a designed layout: wells, drilling, screen, pumps by duty,
//! design flow and, for wellpoints, header length.

use crate::check::run::CheckRun;
use crate::field::wells::Well;
use crate::input::model::{Model, WellKind};
use serde::Serialize;
use std::collections::BTreeMap;

/// Allowance below the screen base for the sump and the drill bit, m, added to every well's
/// drilled depth in the bid quantities (common practice (no source)).
pub const SUMP_ALLOWANCE: f64 = 1.0;

/// Pumps of one duty.
#[derive(Debug, Clone, Serialize)]
pub struct PumpGroup {
    /// Duty each pump is bought for, L/s (rate × (1 + contingency), rounded up to the step).
    pub duty_l_per_s: f64,
    /// How many working wells have it.
    pub count: usize,
    /// Range of running rates of those wells, L/s.
    pub running_l_per_s: [f64; 2],
}

/// The quantities a bid needs.
#[derive(Debug, Clone, Serialize)]
pub struct Bid {
    /// Wells in the layout.
    pub wells_in_layout: usize,
    /// Wells with a rate above zero.
    pub working_wells: usize,
    /// Wells the programme left idle.
    pub idle_wells: usize,
    /// Recharge wells kept at their given rates.
    pub recharge_wells: usize,
    /// Their total injection, m³/s (a positive number).
    pub recharge_flow_m3_per_s: f64,
    /// Standby wells from the design file.
    pub standby_wells: u32,
    /// Depth of one well: ground to screen base plus the sump allowance, m.
    pub depth_per_well_m: f64,
    /// Drilling (or jetting) for working + standby wells, m.
    pub drilling_m: f64,
    /// Screen for working + standby wells, m.
    pub screen_m: f64,
    /// Pumps by duty (deep wells); empty for wellpoints.
    pub pumps: Vec<PumpGroup>,
    /// Standby pumps (one per standby well, at the largest duty).
    pub standby_pumps: u32,
    /// Total flow, m³/s.
    pub total_flow_m3_per_s: f64,
    /// Design flow = total × (1 + contingency), m³/s.
    pub design_flow_m3_per_s: f64,
    /// Contingency used.
    pub contingency: f64,
    /// Header length and flow per 100 m (wellpoints).
    pub header_length_m: Option<f64>,
    /// Design flow per 100 m of header, m³/s (wellpoints).
    pub design_flow_per_100m_m3_per_s: Option<f64>,
    /// How each figure was found.
    pub basis: Vec<String>,
}

/// Round a pump duty (L/s) up to a selection step: 0.5 L/s below 5, 1 below 20, 2.5 below 50,
/// 5 above (a convenience for grouping, not a pump catalogue).
pub fn pump_step(duty_l_per_s: f64) -> f64 {
    let step = if duty_l_per_s < 5.0 {
        0.5
    } else if duty_l_per_s < 20.0 {
        1.0
    } else if duty_l_per_s < 50.0 {
        2.5
    } else {
        5.0
    };
    ((duty_l_per_s / step) - 1e-9).ceil().max(1.0) * step
}

/// The bid quantities of a designed layout.
pub fn bid(model: &Model, wells: &[Well], paths: &[Vec<[f64; 2]>]) -> Bid {
    let spec = &model.wells;
    let working: Vec<&Well> = wells.iter().filter(|w| w.rate > 1e-9).collect();
    let total: f64 = working.iter().map(|w| w.rate).sum();
    let f = model.contingency;
    let depth = model.ground_level - spec.screen_base + SUMP_ALLOWANCE;
    let screen = spec.screen_top - spec.screen_base;
    let built = working.len() as f64 + spec.standby as f64;
    let mut basis = vec![
        format!(
            "depth per well = ground {:.2} m − screen base {:.2} m + {SUMP_ALLOWANCE:.1} m sump allowance = {depth:.2} m (common practice (no source))",
            model.ground_level, spec.screen_base
        ),
        format!("drilling and screen count working + standby wells ({} + {})", working.len(), spec.standby),
        format!("design flow = total × (1 + {f:.2}) (contingency from the design file)"),
    ];
    let mut pumps = Vec::new();
    let (mut header, mut per100) = (None, None);
    match spec.kind {
        WellKind::DeepWell => {
            let mut groups: BTreeMap<i64, PumpGroup> = BTreeMap::new();
            for w in &working {
                let want = w.rate * 1e3 * (1.0 + f);
                let duty = match spec.pump_capacity {
                    Some(p) if p * 1e3 < want => p * 1e3,
                    _ => pump_step(want),
                };
                let key = (duty * 1000.0).round() as i64;
                let g = groups.entry(key).or_insert(PumpGroup {
                    duty_l_per_s: duty,
                    count: 0,
                    running_l_per_s: [f64::INFINITY, 0.0],
                });
                g.count += 1;
                g.running_l_per_s[0] = g.running_l_per_s[0].min(w.rate * 1e3);
                g.running_l_per_s[1] = g.running_l_per_s[1].max(w.rate * 1e3);
            }
            pumps = groups.into_values().collect();
            basis.push(format!(
                "pump duty = running rate × (1 + {f:.2}), rounded up to 0.5 L/s below 5 L/s, 1 L/s below 20, 2.5 L/s below 50 (a grouping step, not a catalogue){}",
                if spec.pump_capacity.is_some() { "; never above the design file's pump capacity" } else { "" }
            ));
        }
        WellKind::Wellpoint => {
            let length: f64 = paths
                .iter()
                .map(|p| {
                    p.windows(2)
                        .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
                        .sum::<f64>()
                })
                .sum();
            if length > 0.0 {
                header = Some(length);
                per100 = Some(total * (1.0 + f) / length * 100.0);
            }
            basis.push("wellpoints share header pumps: sized on the design flow per length of header, not per wellpoint (not sized here)".into());
        }
    }
    Bid {
        wells_in_layout: wells.len(),
        working_wells: working.len(),
        idle_wells: wells
            .iter()
            .filter(|w| (0.0..=1e-9).contains(&w.rate))
            .count(),
        recharge_wells: wells.iter().filter(|w| w.rate < 0.0).count(),
        recharge_flow_m3_per_s: -wells
            .iter()
            .filter(|w| w.rate < 0.0)
            .map(|w| w.rate)
            .sum::<f64>(),
        standby_wells: spec.standby,
        depth_per_well_m: depth,
        drilling_m: depth * built,
        screen_m: screen * built,
        standby_pumps: if spec.kind == WellKind::DeepWell {
            spec.standby
        } else {
            0
        },
        pumps,
        total_flow_m3_per_s: total,
        design_flow_m3_per_s: total * (1.0 + f),
        contingency: f,
        header_length_m: header,
        design_flow_per_100m_m3_per_s: per100,
        basis,
    }
}

/// The bid quantities of the layout in `run`.
pub fn bid_of(model: &Model, run: &CheckRun) -> Bid {
    bid(model, &run.placement.wells, &run.placement.paths)
}
