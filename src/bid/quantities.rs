//! The quantities a bid needs for a designed layout: wells working and standby, drilling (deep
//! wells) and jetting (wellpoints) kept apart, screen, pumps by class with their head, power
//! installed and running, energy per day, flow and design flow, and for wellpoints the header
//! and its pump sets (sized for air and water in [`crate::bid::vacuum_sets`]), and the bid's
//! time ([`crate::bid::durations`]). Heads and powers are found in [`crate::optimise::pumps`].

use crate::bid::durations::{durations, Durations, Works};
use crate::bid::vacuum_sets::{choose, SetSize, AIR_PER_WELLPOINT_M3_PER_H};
use crate::check::run::CheckRun;
use crate::field::wells::Well;
use crate::input::model::{Model, WellKind};
use crate::optimise::pumps::{classes, duty_for, head, shaft_power, Head};
use crate::optimise::standby::is_standby;
use serde::Serialize;

/// Allowance below the screen base for the sump and the drill bit, m, added to every deep
/// well's drilled depth in the bid quantities (common practice (no source)); a wellpoint is
/// jetted to its tip and has no sump.
pub const SUMP_ALLOWANCE: f64 = 1.0;

/// Pumps of one class.
#[derive(Debug, Clone, Serialize)]
pub struct PumpClass {
    /// Duty each pump is bought for, L/s (a standard duty from the list).
    pub duty_l_per_s: f64,
    /// Total head at the duty, the largest of the class's wells, m.
    pub head_m: f64,
    /// Its parts (of the well with the largest total head).
    pub head_parts: Head,
    /// Working pumps of this class.
    pub count: usize,
    /// Their wells (or, for wellpoints, pump sets).
    pub wells: Vec<String>,
    /// Range of running rates, L/s.
    pub running_l_per_s: [f64; 2],
    /// Shaft power of one pump at its duty and head, kW.
    pub shaft_power_kw: f64,
    /// The rate asks for more than the largest duty in the list.
    pub above_list: bool,
}

/// The quantities a bid needs.
#[derive(Debug, Clone, Serialize)]
pub struct Bid {
    /// Deep wells or wellpoints.
    pub wellpoints: bool,
    /// Working wells (rate above zero).
    pub working_wells: usize,
    /// Standby wells placed in the layout (names).
    pub standby_placed: Vec<String>,
    /// Standby wells or pump sets asked for in the design file.
    pub standby_asked: u32,
    /// Recharge wells kept at their given rates.
    pub recharge_wells: usize,
    /// Their total injection, m³/s (a positive number).
    pub recharge_flow_m3_per_s: f64,
    /// Depth of one well (ground to screen base plus the sump allowance) or wellpoint (ground to
    /// screen base, no sump), m.
    pub depth_per_well_m: f64,
    /// Drilling for working + standby deep wells, m (0 for wellpoints).
    pub drilling_m: f64,
    /// Jetting for wellpoints, m (0 for deep wells).
    pub jetting_m: f64,
    /// Screen for working + standby wells, m.
    pub screen_m: f64,
    /// Filter (sand) column for working + standby wells, m, when the design file gives one
    /// apart from the screen (`wells.filter_top`, `filter_base`, `filter_length`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub filter_m: Option<f64>,
    /// A rolling run's quantities along the whole route (`[rolling]`); the other quantities
    /// are those of the installed length.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rolling: Option<crate::optimise::rolling::RollingBid>,
    /// Pumps by class (deep wells: one per working well; wellpoints: the header pump sets).
    pub pumps: Vec<PumpClass>,
    /// Standby pumps (one per standby well or set, of the largest class).
    pub standby_pumps: u32,
    /// Installed power: every pump (working and standby) at its duty and class head, kW.
    pub power_installed_kw: f64,
    /// Running power: every working pump at its running rate and head, kW.
    pub power_running_kw: f64,
    /// Energy per day at the running power, kWh.
    pub energy_per_day_kwh: f64,
    /// Running hours a day.
    pub hours_per_day: f64,
    /// Total flow, m³/s.
    pub total_flow_m3_per_s: f64,
    /// Design flow = total × (1 + contingency), m³/s.
    pub design_flow_m3_per_s: f64,
    /// Contingency used.
    pub contingency: f64,
    /// Header length, m (wellpoints, and the deep-well collecting main).
    pub header_length_m: f64,
    /// Wellpoint pump sets.
    pub pump_sets: Option<usize>,
    /// Design flow per 100 m of header, m³/s (wellpoints).
    pub design_flow_per_100m_m3_per_s: Option<f64>,
    /// The wellpoint pump set chosen for air and water (wellpoints).
    pub set_size: Option<SetSize>,
    /// Working wellpoints on the busiest set, and the free air they draw, m³/h.
    pub set_air: Option<(usize, f64)>,
    /// The set's air or water is above the largest set of the table.
    pub set_above_table: bool,
    /// Durations, hire, energy over the pumping, monitoring and discharge.
    pub time: Durations,
    /// How each figure was found.
    pub basis: Vec<String>,
    /// Cut-off walls: quantities only, no prices (filled by [`bid_of`]).
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub walls: Vec<crate::check::wall_quantities::WallQuantity>,
}

/// Length of the shortest network joining `points` (a minimum spanning tree, Prim's algorithm
/// in O(n²)), m: the collecting main laid from well to well. It depends on the positions only,
/// not on their order or on how the layout was given (ring, list, CSV); for a ring it is the
/// ring less its longest gap, for a line the line itself.
pub fn spanning_length(points: &[[f64; 2]]) -> f64 {
    let n = points.len();
    if n < 2 {
        return 0.0;
    }
    let mut in_tree = vec![false; n];
    let mut best = vec![f64::INFINITY; n];
    best[0] = 0.0;
    let mut total = 0.0;
    for _ in 0..n {
        let Some(k) = (0..n)
            .filter(|&i| !in_tree[i])
            .min_by(|&a, &b| best[a].total_cmp(&best[b]))
        else {
            break;
        };
        in_tree[k] = true;
        total += best[k];
        for i in 0..n {
            if !in_tree[i] {
                let d = (points[i][0] - points[k][0]).hypot(points[i][1] - points[k][1]);
                if d < best[i] {
                    best[i] = d;
                }
            }
        }
    }
    total
}

fn path_length(paths: &[Vec<[f64; 2]>]) -> f64 {
    let l: f64 = paths
        .iter()
        .map(|p| {
            p.windows(2)
                .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
                .sum::<f64>()
        })
        .sum();
    // The sum of nothing is −0.0; written out as 0.
    l + 0.0
}

/// How each bid figure is found, in words: depth, design flow, header or main length, pump
/// duty, total head and power.
fn bid_basis(model: &Model, depth: f64, from_paths: bool, built_count: usize) -> Vec<String> {
    let spec = &model.wells;
    let ps = &model.design.pumps;
    let f = model.contingency;
    let hours = ps.hours_per_day;
    let wellpoints = spec.kind == WellKind::Wellpoint;
    vec![
        if wellpoints {
            format!(
                "jetted depth per wellpoint = ground {:.2} m − screen base {:.2} m = {depth:.2} m (jetted to the tip: no sump)",
                model.ground_level, spec.screen_base
            )
        } else {
            format!(
                "depth per well = ground {:.2} m − screen base {:.2} m + {SUMP_ALLOWANCE:.1} m sump allowance = {depth:.2} m (common practice (no source))",
                model.ground_level, spec.screen_base
            )
        },
        format!("design flow = total × (1 + {f:.2}) (contingency from the design file)"),
        if from_paths {
            "header length = the layout's wellpoint line(s)".to_string()
        } else {
            format!(
                "{} length = the shortest pipe run joining the {} built {} (minimum spanning tree of their positions: the same however the wells were given)",
                if wellpoints { "header" } else { "collecting main" },
                built_count,
                if wellpoints { "wellpoints" } else { "wells" }
            )
        },
        format!(
            "pump duty = the smallest of the standard duties [{}] L/s at least the running rate × (1 + {f:.2}){}; wells within {:.0} % of a class's largest rate share its class",
            ps.duties.iter().map(|d| format!("{}", d * 1e3)).collect::<Vec<_>>().join(", "),
            if spec.pump_capacity.is_some() { ", at most the design file's pump capacity" } else { "" },
            ps.class_tolerance * 100.0
        ),
        format!(
            "total head = discharge level {:.2} m − lowest level in the well + riser friction ({:.0} mm) + header friction ({:.0} mm, half the {} length at the whole design flow), Hazen–Williams C = {:.0} (checks.md §15)",
            ps.discharge_level, ps.riser_diameter * 1e3, ps.header_diameter * 1e3,
            if wellpoints { "pump set's header" } else { "well line's" },
            ps.hazen_williams_c
        ),
        format!(
            "shaft power = ρ·g·Q·H/η with η = {:.2}; installed at each pump's duty and class head (standby included), running at each well's rate; energy per day at the running power for {hours:.0} h",
            ps.efficiency
        ),
    ]
}

/// Deep wells: one pump per working well, grouped in classes by duty; each class's head is the
/// largest of its wells' at the duty (header friction over `header_length` at the design flow).
/// Returns the classes and the running power, W (each well at its rate and running head).
fn deep_well_pumps(
    model: &Model,
    wells: &[Well],
    lowest: &impl Fn(usize) -> f64,
    header_length: f64,
    total: f64,
    design_flow: f64,
) -> (Vec<PumpClass>, f64) {
    let mut pumps = Vec::new();
    let mut running_w = 0.0;
    let rates: Vec<f64> = wells.iter().map(|w| w.rate.max(0.0)).collect();
    for (duty, members) in classes(model, &rates) {
        let mut worst: Option<Head> = None;
        let mut rng = [f64::INFINITY, 0.0f64];
        for &i in &members {
            let q = wells[i].rate;
            let h_duty = head(
                model,
                lowest(i),
                wells[i].pump_intake,
                duty,
                header_length,
                design_flow,
            );
            if worst.is_none_or(|w| h_duty.total() > w.total()) {
                worst = Some(h_duty);
            }
            let h_run = head(
                model,
                lowest(i),
                wells[i].pump_intake,
                q,
                header_length,
                total,
            );
            running_w += shaft_power(model, q, h_run.total());
            rng = [rng[0].min(q * 1e3), rng[1].max(q * 1e3)];
        }
        let h = worst.unwrap_or(Head {
            lift_m: 0.0,
            riser_m: 0.0,
            header_m: 0.0,
        });
        pumps.push(PumpClass {
            duty_l_per_s: duty * 1e3,
            head_m: h.total(),
            head_parts: h,
            count: members.len(),
            wells: members.iter().map(|&i| wells[i].name.clone()).collect(),
            running_l_per_s: rng,
            shaft_power_kw: shaft_power(model, duty, h.total()) / 1e3,
            above_list: members.iter().any(|&i| duty_for(model, wells[i].rate).1),
        });
    }
    (pumps, running_w)
}

/// The header pump sets of a wellpoint layout.
struct WellpointSets {
    /// Their water side as a pump class.
    class: PumpClass,
    /// How many.
    count: usize,
    /// The set size chosen for air and water, and whether the demand is above the table.
    size: (SetSize, bool),
    /// Working wellpoints on the busiest set, and their free air, m³/h.
    air: (usize, f64),
    /// Running power of every set (vacuum pump + water pump at its running rate), W.
    running_w: f64,
}

/// Wellpoints: header pump sets by length, each serving `wellpoint_set_length` m of header and
/// lifting from the lowest level in the working wellpoints `idx`; each set sized for its design
/// flow of water and the air of its wellpoints ([`crate::bid::vacuum_sets`]). `None` when
/// nothing is pumped.
fn wellpoint_sets(
    model: &Model,
    idx: &[usize],
    lowest: &impl Fn(usize) -> f64,
    line_length: f64,
    total: f64,
) -> Option<WellpointSets> {
    let spec = &model.wells;
    let ps = &model.design.pumps;
    let f = model.contingency;
    // Header pump sets by length: each serves `wellpoint_set_length` m of header.
    let n = ((line_length / ps.wellpoint_set_length).ceil() as usize).max(usize::from(total > 0.0));
    if n == 0 {
        return None;
    }
    let per_set = total / n as f64;
    let low = idx.iter().map(|&i| lowest(i)).fold(f64::INFINITY, f64::min);
    let low = if low.is_finite() {
        low
    } else {
        model.ground_level - spec.suction_limit
    };
    let (duty, above) = duty_for(model, per_set);
    let set_len = line_length / n as f64;
    let h_duty = head(
        model,
        low,
        model.ground_level,
        duty,
        0.5 * set_len,
        per_set * (1.0 + f),
    );
    let h_run = head(
        model,
        low,
        model.ground_level,
        per_set,
        0.5 * set_len,
        per_set,
    );
    let points_per_set = idx.len().div_ceil(n);
    let air = points_per_set as f64 * AIR_PER_WELLPOINT_M3_PER_H;
    let size = choose(per_set * (1.0 + f), air);
    let running_w =
        n as f64 * (size.0.vacuum_kw * 1e3 + shaft_power(model, per_set, h_run.total()));
    let class = PumpClass {
        duty_l_per_s: duty * 1e3,
        head_m: h_duty.total(),
        head_parts: h_duty,
        count: n,
        wells: (1..=n).map(|k| format!("set {k}")).collect(),
        running_l_per_s: [per_set * 1e3, per_set * 1e3],
        shaft_power_kw: shaft_power(model, duty, h_duty.total()) / 1e3,
        above_list: above,
    };
    Some(WellpointSets {
        class,
        count: n,
        size,
        air: (points_per_set, air),
        running_w,
    })
}

/// The bid quantities of a designed layout; `levels` are the water levels in the wells at
/// their rates (m; `None` where a well was not evaluated or is dry: its lowest allowed level
/// is used).
pub fn bid(model: &Model, wells: &[Well], paths: &[Vec<[f64; 2]>], levels: &[Option<f64>]) -> Bid {
    let spec = &model.wells;
    let ps = &model.design.pumps;
    let idx: Vec<usize> = (0..wells.len()).filter(|&i| wells[i].rate > 1e-9).collect();
    let standby_placed: Vec<String> = wells
        .iter()
        .filter(|w| is_standby(w))
        .map(|w| w.name.clone())
        .collect();
    let total: f64 = idx.iter().map(|&i| wells[i].rate).sum();
    let f = model.contingency;
    let design_flow = total * (1.0 + f);
    let wellpoints = spec.kind == WellKind::Wellpoint;
    let sump = if wellpoints { 0.0 } else { SUMP_ALLOWANCE };
    let depth = model.ground_level - spec.screen_base + sump;
    let screen = spec.screen_top - spec.screen_base;
    // Deep wells: the collecting main joins the built wells (working and standby), whatever
    // way the layout was given. Wellpoints: the header runs along the layout's line, or from
    // wellpoint to wellpoint when the wells were listed.
    let built_positions: Vec<[f64; 2]> = wells
        .iter()
        .filter(|w| w.rate > 1e-9 || is_standby(w))
        .map(|w| w.position)
        .collect();
    let line_length = if wellpoints && !paths.is_empty() {
        path_length(paths)
    } else {
        spanning_length(&built_positions)
    };
    let lowest = |i: usize| {
        let floor = wells[i].pump_intake + spec.submergence;
        levels.get(i).copied().flatten().unwrap_or(floor)
    };
    let hours = ps.hours_per_day;
    let mut basis = bid_basis(
        model,
        depth,
        wellpoints && !paths.is_empty(),
        built_positions.len(),
    );
    let mut pumps = Vec::new();
    let mut running_w = 0.0;
    let (mut sets, mut per100) = (None, None);
    let (mut set_size, mut set_air) = (None, None);
    let standby_pumps;
    if !wellpoints {
        let header_length = 0.5 * line_length;
        (pumps, running_w) =
            deep_well_pumps(model, wells, &lowest, header_length, total, design_flow);
        standby_pumps = standby_placed.len().max(spec.standby as usize) as u32;
    } else {
        if let Some(w) = wellpoint_sets(model, &idx, &lowest, line_length, total) {
            running_w = w.running_w;
            pumps.push(w.class);
            sets = Some(w.count);
            set_size = Some(w.size);
            set_air = Some(w.air);
            per100 = (line_length > 0.0).then(|| design_flow / line_length * 100.0);
            basis.push(format!(
                "wellpoint pump sets = header length {line_length:.0} m ÷ {:.0} m per set, rounded up; each set lifts from the lowest level in its wellpoints (common practice (no source))",
                ps.wellpoint_set_length
            ));
            basis.push(format!(
                "set size = the smallest of {} moving the set's design flow and its air ({} wellpoints × {AIR_PER_WELLPOINT_M3_PER_H} m³/h free air); installed = vacuum pump + water pump drive, running = vacuum pump + water shaft power at the running rate (common practice (no source))",
                crate::bid::vacuum_sets::SET_SIZES.iter().map(|s| format!("{} ({:.0} L/s, {:.0} m³/h, {} + {} kW)", s.name, s.water_m3_per_s * 1e3, s.air_m3_per_h, s.vacuum_kw, s.water_kw)).collect::<Vec<_>>().join(", "),
                w.air.0
            ));
        }
        standby_pumps = spec.standby;
    }
    let largest = pumps
        .iter()
        .max_by(|a, b| a.duty_l_per_s.total_cmp(&b.duty_l_per_s));
    // A wellpoint set is installed at its drives (vacuum + water pump, the water pump at least
    // the shaft power its duty asks); a deep-well pump at its shaft power.
    let unit_kw = |p: &PumpClass| match set_size {
        Some((s, _)) => s.vacuum_kw + s.water_kw.max(p.shaft_power_kw),
        None => p.shaft_power_kw,
    };
    let installed_w: f64 = pumps
        .iter()
        .map(|p| p.count as f64 * unit_kw(p) * 1e3)
        .sum::<f64>()
        + standby_pumps as f64 * largest.map_or(0.0, |p| unit_kw(p) * 1e3);
    let built = idx.len() as f64 + standby_placed.len() as f64;
    let energy = running_w * hours / 1e3;
    let mut b = Bid {
        wellpoints,
        working_wells: idx.len(),
        standby_placed,
        standby_asked: spec.standby,
        recharge_wells: wells.iter().filter(|w| w.rate < 0.0).count(),
        recharge_flow_m3_per_s: -wells
            .iter()
            .filter(|w| w.rate < 0.0)
            .map(|w| w.rate)
            .sum::<f64>(),
        depth_per_well_m: depth,
        drilling_m: if wellpoints { 0.0 } else { depth * built },
        jetting_m: if wellpoints { depth * built } else { 0.0 },
        screen_m: screen * built,
        filter_m: filter_m(model, built),
        rolling: crate::optimise::rolling::rolling_bid(model, built as usize, depth),
        pumps,
        standby_pumps,
        power_installed_kw: installed_w / 1e3,
        power_running_kw: running_w / 1e3,
        energy_per_day_kwh: if energy.is_finite() { energy } else { 0.0 },
        hours_per_day: hours,
        total_flow_m3_per_s: total,
        design_flow_m3_per_s: design_flow,
        contingency: f,
        header_length_m: line_length,
        pump_sets: sets,
        design_flow_per_100m_m3_per_s: per100,
        set_size: set_size.map(|s| s.0),
        set_air,
        set_above_table: set_size.is_some_and(|s| s.1),
        time: Durations::default(),
        walls: Vec::new(),
        basis,
    };
    b.time = durations(
        model,
        &Works {
            wellpoints,
            built: b.working_wells + b.standby_placed.len(),
            header_length_m: b.header_length_m,
            power_installed_kw: b.power_installed_kw,
            power_running_kw: b.power_running_kw,
            design_flow_m3_per_s: b.design_flow_m3_per_s,
            total_flow_m3_per_s: b.total_flow_m3_per_s,
            digging_days: b.rolling.as_ref().map(|r| r.digging_days),
        },
    );
    b
}

/// Filter column of `built` wells, m, when it is not the screen.
fn filter_m(model: &Model, built: f64) -> Option<f64> {
    let w = &model.wells;
    let apart =
        (w.filter_top - w.screen_top).abs() > 1e-9 || (w.filter_base - w.screen_base).abs() > 1e-9;
    apart.then_some((w.filter_top - w.filter_base) * built)
}

/// The bid quantities of the layout in `run`, with the levels it computed in the wells.
pub fn bid_of(model: &Model, run: &CheckRun) -> Bid {
    let levels: Vec<Option<f64>> = run.evaluation.wells.iter().map(|w| w.level_m).collect();
    let mut b = bid(model, &run.placement.wells, &run.placement.paths, &levels);
    b.walls = crate::check::wall_quantities::wall_quantities(model);
    b
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::validate::file::load;
    use std::path::Path;

    #[test]
    fn spanning_length_of_hand_cases() {
        // Hand geometry: four wells on the corners of a 10 m square are joined by three sides
        // (30 m); five on a 40 m line 10 m apart by the line (40 m); one well needs no main.
        let square = [[0.0, 0.0], [10.0, 0.0], [10.0, 10.0], [0.0, 10.0]];
        assert!((spanning_length(&square) - 30.0).abs() < 1e-12);
        let line: Vec<[f64; 2]> = (0..5).rev().map(|i| [10.0 * i as f64, 3.0]).collect();
        assert!((spanning_length(&line) - 40.0).abs() < 1e-12);
        assert_eq!(spanning_length(&[[1.0, 2.0]]), 0.0);
    }

    #[test]
    fn the_same_wells_give_the_same_bid_as_a_ring_or_a_list() {
        // Issue: listed or CSV wells (no layout path) lost the collecting main. The wells of the
        // ring demo, given without their path and in reverse order, must bid the same main,
        // header head and installed power.
        let model = load(Path::new("layouts/riverside_basement.toml")).expect("demo loads");
        let spec = model.layout.as_ref().expect("ring layout");
        let placed = crate::field::layout::generate(&model, spec, 0.004).expect("ring");
        let levels = vec![None; placed.wells.len()];
        let ring = bid(&model, &placed.wells, &placed.paths, &levels);
        let mut listed_wells = placed.wells.clone();
        listed_wells.reverse();
        let listed = bid(&model, &listed_wells, &[], &levels);
        assert!(ring.header_length_m > 0.0);
        assert!((ring.header_length_m - listed.header_length_m).abs() < 1e-9);
        assert!((ring.power_installed_kw - listed.power_installed_kw).abs() < 1e-9);
        assert!(listed.pumps.iter().all(|p| p.head_parts.header_m > 0.0));
    }
}
