//! A rolling run's bid quantities along the whole route (`[rolling]`,
//! [`crate::input::validate::rolling`]). The design places the set once — the open length plus
//! run-in and run-out — so the bid's wellpoints, header and pump sets are those of the
//! installed length (the equipment on hire); the set is then pulled and jetted in again ahead
//! as the face advances, so the jetting runs along the whole route:
//! - route of the line = run-out + trench + run-in (the line starts run-out behind the first
//!   open length and ends run-in past the trench end);
//! - wellpoints jetted along the route = wellpoints of the set × route ÷ installed length,
//!   rounded up; jetting = that × the depth of one wellpoint;
//! - days of digging = trench ÷ advance a day, rounded up.

use crate::input::model::Model;
use serde::Serialize;

/// The quantities of a rolling run along its whole route.
#[derive(Debug, Clone, Serialize)]
pub struct RollingBid {
    /// The whole trench, m.
    pub trench_length_m: f64,
    /// Line installed at one time (run-out + open + run-in), m.
    pub installed_length_m: f64,
    /// Route the line runs along over the job (run-out + trench + run-in), m.
    pub route_m: f64,
    /// Wellpoints (or wells) jetted along the route.
    pub installations: usize,
    /// Jetting (or drilling) along the route, m.
    pub jetting_route_m: f64,
    /// Days of digging at the advance a day.
    pub digging_days: f64,
}

/// The rolling quantities of `model` (`None` without `[rolling]`): `built` wellpoints in the
/// set, each `depth` m deep.
pub fn rolling_bid(model: &Model, built: usize, depth: f64) -> Option<RollingBid> {
    let r = model.rolling.as_ref()?;
    let installed = r.installed_length();
    let route = r.run_out + r.trench_length + r.run_in;
    let installations = (built as f64 * route / installed.max(1e-9) - 1e-9).ceil() as usize;
    Some(RollingBid {
        trench_length_m: r.trench_length,
        installed_length_m: installed,
        route_m: route,
        installations,
        jetting_route_m: installations as f64 * depth,
        digging_days: (r.trench_length / r.advance_per_day - 1e-9).ceil(),
    })
}
