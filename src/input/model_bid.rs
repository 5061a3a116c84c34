//! The bid's time settings (`[bid]`), in SI: how fast the works go in and come out, how long
//! the pumps run, the settlement tank's retention and the monitoring rule. Every default is a
//! common-practice figure (no source) of this program, printed in the bid's basis; give your
//! own in `[bid]` with units.

/// Default mobilisation (plant delivered, site set up), s: 2 days (common practice (no source)).
pub const DEFAULT_MOBILISE_DAYS: f64 = 2.0;
/// Default deep wells drilled, installed and developed per day by one rig (common practice (no
/// source): one 15–25 m well a day).
pub const DEFAULT_WELLS_PER_DAY: f64 = 1.0;
/// Default wellpoint header jetted and laid per day by one gang, m (common practice (no source):
/// 40–60 wellpoints at about 1–1.5 m).
pub const DEFAULT_WELLPOINT_HEADER_PER_DAY: f64 = 50.0;
/// Default deep-well collecting main laid per day, m (common practice (no source)).
pub const DEFAULT_MAIN_PER_DAY: f64 = 200.0;
/// Default deep wells cleared (pump out, well grouted) per day (common practice (no source)).
pub const DEFAULT_REMOVAL_WELLS_PER_DAY: f64 = 4.0;
/// Default wellpoint header pulled and cleared per day, m (common practice (no source)).
pub const DEFAULT_WELLPOINT_REMOVAL_PER_DAY: f64 = 150.0;
/// Default collecting main cleared per day, m (common practice (no source)).
pub const DEFAULT_MAIN_REMOVAL_PER_DAY: f64 = 400.0;
/// Default retention time of the settlement tank at the design flow, s: 15 minutes (common
/// practice (no source): 10–30 min lets fine sand settle).
pub const DEFAULT_RETENTION_MIN: f64 = 15.0;
/// Default generators: one running and one standby on changeover (common practice (no source)
/// for continuous pumping; 0 with a mains supply).
pub const DEFAULT_GENERATORS: u32 = 2;
/// Default excavation perimeter per monitoring piezometer, m (common practice (no source): one
/// every 50 m of perimeter, at least one per side of the dig).
pub const DEFAULT_PIEZOMETER_SPACING: f64 = 50.0;

/// The bid's time settings.
#[derive(Debug, Clone, PartialEq)]
pub struct BidSettings {
    /// Pumping duration given in `[bid]`, s (otherwise the programme's duration, if any).
    pub pumping_duration_s: Option<f64>,
    /// Mobilisation, s.
    pub mobilise_s: f64,
    /// Deep wells installed per day.
    pub wells_per_day: f64,
    /// Header (wellpoints) or collecting main (deep wells) installed per day, m.
    pub header_per_day_m: f64,
    /// Deep wells removed per day.
    pub removal_wells_per_day: f64,
    /// Header or main removed per day, m.
    pub removal_header_per_day_m: f64,
    /// Settlement tank retention at the design flow, s.
    pub retention_s: f64,
    /// Generators on hire (running + standby).
    pub generators: u32,
    /// Excavation perimeter per monitoring piezometer, m.
    pub piezometer_spacing_m: f64,
}

impl BidSettings {
    /// Every default, for deep wells or wellpoints.
    pub fn defaults(wellpoints: bool) -> BidSettings {
        BidSettings {
            pumping_duration_s: None,
            mobilise_s: DEFAULT_MOBILISE_DAYS * 86_400.0,
            wells_per_day: DEFAULT_WELLS_PER_DAY,
            header_per_day_m: if wellpoints {
                DEFAULT_WELLPOINT_HEADER_PER_DAY
            } else {
                DEFAULT_MAIN_PER_DAY
            },
            removal_wells_per_day: DEFAULT_REMOVAL_WELLS_PER_DAY,
            removal_header_per_day_m: if wellpoints {
                DEFAULT_WELLPOINT_REMOVAL_PER_DAY
            } else {
                DEFAULT_MAIN_REMOVAL_PER_DAY
            },
            retention_s: DEFAULT_RETENTION_MIN * 60.0,
            generators: DEFAULT_GENERATORS,
            piezometer_spacing_m: DEFAULT_PIEZOMETER_SPACING,
        }
    }
}
