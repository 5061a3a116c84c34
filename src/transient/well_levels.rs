//! The water level inside each well in time, and the first time a pumped well falls below the
//! lowest level it can work at.
//!
//! Level in the well = aquifer level at its screen face (Theis/Hantush superposition with images
//! and the quasi-steady partial-penetration term, [`crate::transient::TransientModel`]) less the
//! well loss at the well's rate at that time: Jacob's C·Q² (Jacob 1947), or with an efficiency E
//! the loss (1/E − 1)·s_own, s_own the drawdown the well's own rate makes at its face (its own
//! source, images and partial penetration; Kruseman & de Ridder 1994, ch. 14). The loss lowers
//! the level in a pumped well and raises it in a recharge well; an idle well has none.
//!
//! Lowest allowed level, the same rule as the steady check: pump intake + submergence; for a
//! wellpoint the higher of that and header − suction limit. A well cannot deliver its scheduled
//! rate below it: the programme does not reduce the rate by itself, it reports the first time
//! each well gets there (found between output times by bisection to 1 s) and what it means for
//! the targets, and `programme` exits with "not met".

use crate::field::wells::Well;
use crate::input::model::{Model, WellKind, WellLossSpec};
use crate::physics::well_loss::{efficiency_loss, jacob_loss};
use crate::transient::TransientModel;

/// Tolerance on the lowest allowed level, m (as the steady check's on targets).
pub const LEVEL_TOLERANCE: f64 = 1e-3;

/// A well that falls below its lowest allowed level while it is scheduled to pump.
#[derive(Debug, Clone)]
pub struct WellBreach {
    /// Well name.
    pub well: String,
    /// First time below its lowest allowed level, s.
    pub time: f64,
    /// Scheduled rate then, m³/s.
    pub rate: f64,
    /// Lowest allowed level, m.
    pub lowest: f64,
    /// What sets it.
    pub basis: &'static str,
    /// Lowest level reached in the well while pumping (at an output time), m.
    pub lowest_reached: f64,
}

/// Lowest level allowed in a well, m, and what sets it (the steady check's rule).
pub fn lowest_allowed(model: &Model, w: &Well) -> (f64, &'static str) {
    let spec = &model.wells;
    let intake = w.pump_intake + spec.submergence;
    match w.kind {
        WellKind::DeepWell => (intake, "pump intake + submergence"),
        WellKind::Wellpoint => {
            let suction = model.as_built.suction_floor(spec.suction_limit);
            if suction >= intake {
                (suction, "header − suction limit")
            } else {
                (intake, "pump intake + submergence")
            }
        }
    }
}

/// Water level (m) inside well `j` of `tm` (at `position`) at time t: face level less the loss.
pub fn level_in_well(
    model: &Model,
    tm: &TransientModel,
    j: usize,
    position: [f64; 2],
    t: f64,
) -> f64 {
    let h0 = model.aquifer.initial_level;
    let face = h0 - tm.drawdown_at(position, t);
    let q = tm.well_rate(j, t);
    if q == 0.0 {
        return face;
    }
    let loss = match model.as_built.loss {
        WellLossSpec::Jacob(c) => jacob_loss(c, q),
        WellLossSpec::Efficiency(e) => {
            let own = tm
                .aquifer()
                .real_drawdown(tm.own_linear_drawdown(j, position, t));
            efficiency_loss(own.abs(), e)
        }
        _ => 0.0,
    };
    if q > 0.0 {
        face - loss
    } else {
        face + loss
    }
}

/// Bisection on a predicate false at `lo` and true at `hi`, to 1 s: the first time true.
pub(crate) fn first_true(mut lo: f64, mut hi: f64, ok: impl Fn(f64) -> bool) -> f64 {
    for _ in 0..200 {
        if hi - lo <= 1.0 {
            break;
        }
        let mid = 0.5 * (lo + hi);
        if ok(mid) {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    hi
}

/// Every pumped well's first time below its lowest allowed level before `end` (s), given its
/// levels at the output `times` (`levels[j][k]`, m).
pub fn breaches(
    model: &Model,
    tm: &TransientModel,
    wells: &[Well],
    times: &[f64],
    levels: &[Vec<f64>],
    end: f64,
) -> Vec<WellBreach> {
    wells
        .iter()
        .enumerate()
        .filter_map(|(j, w)| {
            let (lowest, basis) = lowest_allowed(model, w);
            // the crossing of the level itself (the tolerance only decides whether it is a breach)
            let below = |t: f64| {
                t < end
                    && tm.well_rate(j, t) > 0.0
                    && level_in_well(model, tm, j, w.position, t) < lowest
            };
            let k = (0..times.len()).find(|&k| {
                times[k] < end
                    && tm.well_rate(j, times[k]) > 0.0
                    && levels[j][k] < lowest - LEVEL_TOLERANCE
            })?;
            let time = if k == 0 {
                times[0]
            } else {
                first_true(times[k - 1], times[k], below)
            };
            let lowest_reached = (0..times.len())
                .filter(|&k| times[k] < end && tm.well_rate(j, times[k]) > 0.0)
                .map(|k| levels[j][k])
                .fold(f64::INFINITY, f64::min);
            Some(WellBreach {
                well: w.name.clone(),
                time,
                rate: tm.well_rate(j, time),
                lowest,
                basis,
                lowest_reached,
            })
        })
        .collect()
}
