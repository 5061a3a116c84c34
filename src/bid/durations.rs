//! The bid's time: how long the works go in, run and come out, and what that time costs in
//! hire, energy, monitoring and discharge. Rates of work are the `[bid]` settings or their
//! labelled common-practice defaults ([`crate::input::model_bid`]).
//!
//! - install, days = built wells ÷ wells a day + collecting main ÷ main a day (deep wells), or
//!   header ÷ header a day (wellpoints: jetting and laying), rounded up to whole days (a crew is
//!   paid by the day); removal the same with the removal rates;
//! - pumping, days = `[bid] pumping_duration`, else `[programme] duration`, else a rolling
//!   run's days of digging, else one week shown (the bid says so);
//! - hire, weeks = (mobilise + install + pumping + removal) ÷ 7, rounded up (hire is charged by
//!   the week, a part week as a whole: common practice (no source)); every hired item (pumps,
//!   sets, standby, generators, header or main, tanks) is on hire for that period;
//! - energy, kWh = running power × hours a day × pumping days;
//! - generators: installed power ÷ 0.8 power factor, the next standard size up;
//! - piezometers: per excavation, perimeter ÷ spacing rounded up, at least four (one a side),
//!   plus one per neighbour;
//! - settlement tanks: design flow × retention time, in standard tanks;
//! - discharged volume = total flow × pumping hours.

use crate::input::model::Model;
use serde::Serialize;

const DAY: f64 = 86_400.0;

/// Power factor of a site generator's load (common practice (no source)).
pub const GENERATOR_POWER_FACTOR: f64 = 0.8;
/// Standard generator sizes, kVA (common practice (no source): round hire sizes).
pub const GENERATOR_SIZES_KVA: [f64; 12] = [
    20.0, 30.0, 45.0, 60.0, 100.0, 150.0, 200.0, 250.0, 350.0, 500.0, 750.0, 1000.0,
];
/// Volume of one standard settlement tank, m³ (common practice (no source): a skip-sized
/// baffled tank).
pub const STANDARD_TANK_M3: f64 = 30.0;
/// Fewest piezometers around one excavation: one a side (common practice (no source)).
pub const MIN_PIEZOMETERS_PER_EXCAVATION: usize = 4;
/// Pumping duration shown when none is given, days (the hire and running lines are then per
/// week of pumping).
pub const PUMPING_DAYS_WHEN_NOT_GIVEN: f64 = 7.0;

/// Where the pumping duration came from.
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize)]
pub enum PumpingFrom {
    /// `[bid] pumping_duration`.
    Bid,
    /// `[programme] duration`.
    Programme,
    /// A rolling run's days of digging (`[rolling]`).
    Rolling,
    /// Not given: one week shown.
    #[default]
    NotGiven,
}

/// The bid's time and what it costs.
#[derive(Debug, Clone, Default, Serialize)]
pub struct Durations {
    /// Mobilisation, days.
    pub mobilise_days: f64,
    /// Installation, whole days.
    pub install_days: f64,
    /// Pumping, days.
    pub pumping_days: f64,
    /// Where the pumping duration came from.
    pub pumping_from: PumpingFrom,
    /// Removal, whole days.
    pub removal_days: f64,
    /// Hire period of every hired item, whole weeks.
    pub hire_weeks: f64,
    /// Running hours over the pumping.
    pub pumping_hours: f64,
    /// Energy over the pumping, kWh.
    pub energy_kwh: f64,
    /// Generators on hire (running + standby), and the size of each, kVA.
    pub generators: u32,
    /// Generator size, kVA (0 when none).
    pub generator_kva: f64,
    /// Monitoring piezometers.
    pub piezometers: usize,
    /// Excavation perimeter they are counted on, m.
    pub perimeter_m: f64,
    /// Neighbours (one piezometer each).
    pub neighbours: usize,
    /// Settlement volume = design flow × retention, m³.
    pub tank_volume_m3: f64,
    /// Retention time, s.
    pub retention_s: f64,
    /// Standard settlement tanks.
    pub tanks: usize,
    /// Water discharged over the pumping, m³.
    pub discharged_m3: f64,
    /// The rates of work used: wells installed and removed a day, header or main installed and
    /// removed a day (m), perimeter per piezometer (m), running hours a day.
    pub rates: WorkRates,
}

/// The rates of work a bid used (for its basis).
#[derive(Debug, Clone, Default, Serialize)]
pub struct WorkRates {
    /// Deep wells installed a day.
    pub wells_per_day: f64,
    /// Header or main installed a day, m.
    pub header_per_day_m: f64,
    /// Deep wells removed a day.
    pub removal_wells_per_day: f64,
    /// Header or main removed a day, m.
    pub removal_header_per_day_m: f64,
    /// Perimeter per piezometer, m.
    pub piezometer_spacing_m: f64,
    /// Running hours a day.
    pub hours_per_day: f64,
}

/// What the bid's time is worked out from: the quantities of the layout.
#[derive(Debug, Clone, Copy)]
pub struct Works {
    /// Wellpoints (header) or deep wells (wells and collecting main).
    pub wellpoints: bool,
    /// Wells built, working + standby.
    pub built: usize,
    /// Header or collecting main, m.
    pub header_length_m: f64,
    /// Installed power, kW.
    pub power_installed_kw: f64,
    /// Running power, kW.
    pub power_running_kw: f64,
    /// Design flow, m³/s.
    pub design_flow_m3_per_s: f64,
    /// Total flow, m³/s.
    pub total_flow_m3_per_s: f64,
    /// A rolling run's days of digging, when `[rolling]` is given.
    pub digging_days: Option<f64>,
}

/// Whole days of `days`, rounded up (a small tolerance keeps 2.0000001 at 2).
fn whole(days: f64) -> f64 {
    (days - 1e-9).ceil().max(0.0)
}

/// The exterior length of every excavation outline, m.
fn perimeters(model: &Model) -> Vec<f64> {
    model
        .excavations
        .iter()
        .map(|e| {
            e.outline
                .exterior()
                .lines()
                .map(|l| (l.end.x - l.start.x).hypot(l.end.y - l.start.y))
                .sum()
        })
        .collect()
}

/// The bid's time for the quantities `b` of `model`.
pub fn durations(model: &Model, b: &Works) -> Durations {
    let s = &model.bid;
    let built = b.built as f64;
    let (install, removal) = if b.wellpoints {
        (
            b.header_length_m / s.header_per_day_m,
            b.header_length_m / s.removal_header_per_day_m,
        )
    } else {
        (
            built / s.wells_per_day + b.header_length_m / s.header_per_day_m,
            built / s.removal_wells_per_day + b.header_length_m / s.removal_header_per_day_m,
        )
    };
    let (pumping_s, pumping_from) = match (s.pumping_duration_s, &model.programme, b.digging_days) {
        (Some(d), _, _) => (d, PumpingFrom::Bid),
        (None, Some(p), _) => (p.duration, PumpingFrom::Programme),
        (None, None, Some(days)) => (days * DAY, PumpingFrom::Rolling),
        (None, None, None) => (PUMPING_DAYS_WHEN_NOT_GIVEN * DAY, PumpingFrom::NotGiven),
    };
    let mobilise_days = s.mobilise_s / DAY;
    let (install_days, removal_days) = (whole(install), whole(removal));
    let pumping_days = pumping_s / DAY;
    let hire_weeks = whole((mobilise_days + install_days + pumping_days + removal_days) / 7.0);
    let pumping_hours = pumping_days * model.design.pumps.hours_per_day;
    let kva = b.power_installed_kw / GENERATOR_POWER_FACTOR;
    let generator_kva = if s.generators == 0 || kva <= 0.0 {
        0.0
    } else {
        GENERATOR_SIZES_KVA
            .iter()
            .copied()
            .find(|&g| g >= kva)
            .unwrap_or_else(|| (kva / 100.0).ceil() * 100.0)
    };
    let perimeter = perimeters(model);
    let piezometers = perimeter
        .iter()
        .map(|p| {
            ((p / s.piezometer_spacing_m - 1e-9).ceil() as usize)
                .max(MIN_PIEZOMETERS_PER_EXCAVATION)
        })
        .sum::<usize>()
        + model.neighbours.len();
    let tank_volume = b.design_flow_m3_per_s * s.retention_s;
    let energy = b.power_running_kw * pumping_hours;
    Durations {
        mobilise_days,
        install_days,
        pumping_days,
        pumping_from,
        removal_days,
        hire_weeks,
        pumping_hours,
        energy_kwh: if energy.is_finite() { energy } else { 0.0 },
        generators: if generator_kva > 0.0 { s.generators } else { 0 },
        generator_kva,
        piezometers,
        perimeter_m: perimeter.iter().sum(),
        neighbours: model.neighbours.len(),
        tank_volume_m3: tank_volume,
        retention_s: s.retention_s,
        tanks: (tank_volume / STANDARD_TANK_M3 - 1e-9).ceil().max(0.0) as usize,
        discharged_m3: b.total_flow_m3_per_s * pumping_hours * 3600.0,
        rates: WorkRates {
            wells_per_day: s.wells_per_day,
            header_per_day_m: s.header_per_day_m,
            removal_wells_per_day: s.removal_wells_per_day,
            removal_header_per_day_m: s.removal_header_per_day_m,
            piezometer_spacing_m: s.piezometer_spacing_m,
            hours_per_day: model.design.pumps.hours_per_day,
        },
    }
}
