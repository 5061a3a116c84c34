//! A placed well: where it is, how it is built and what it pumps.

use crate::input::model::{WellKind, WellSpec};
use serde::Serialize;

/// What a placed well is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum WellRole {
    /// It pumps (or recharges) in the design.
    #[default]
    Duty,
    /// It stands by at rate 0, started when a duty well is lost (placed by
    /// [`crate::optimise::standby::finish`]).
    Standby,
}

/// One well or wellpoint in a layout. Levels in m above datum, rate in m³/s (negative: recharge).
#[derive(Debug, Clone, Serialize)]
pub struct Well {
    /// Name ("W01", "N-012").
    pub name: String,
    /// Position [x, y], m in the site grid.
    pub position: [f64; 2],
    /// Radius, m.
    pub radius: f64,
    /// Rate, m³/s; positive pumps out, negative recharges.
    pub rate: f64,
    /// Deep well or wellpoint.
    #[serde(skip)]
    pub kind: WellKind,
    /// Screen top level, m.
    pub screen_top: f64,
    /// Screen base level, m.
    pub screen_base: f64,
    /// Top of the filter column round the screen, m (water enters over the filter column).
    pub filter_top: f64,
    /// Base of the filter column, m.
    pub filter_base: f64,
    /// Pump intake level, m.
    pub pump_intake: f64,
    /// Why it stands where it stands, when it was moved.
    pub note: Option<String>,
    /// Duty or standby.
    #[serde(skip)]
    pub role: WellRole,
}

impl Well {
    /// A well built to `spec` at `position` pumping `rate`.
    pub fn from_spec(name: String, position: [f64; 2], rate: f64, spec: &WellSpec) -> Well {
        Well {
            name,
            position,
            radius: spec.radius,
            rate,
            kind: spec.kind,
            screen_top: spec.screen_top,
            screen_base: spec.screen_base,
            filter_top: spec.filter_top,
            filter_base: spec.filter_base,
            pump_intake: spec.pump_intake,
            note: None,
            role: WellRole::Duty,
        }
    }
}
