//! Pump classes and heads for a designed layout.
//!
//! - **Class**: wells are taken from the largest running rate down; a class is opened at the
//!   largest rate left, sized to the smallest standard duty (the design file's `[pumps]
//!   duties`) at least that rate × (1 + contingency), never above the design file's pump
//!   capacity, and every well whose rate is within the class tolerance of that largest rate
//!   joins it (common practice (no source): few pump sizes on one site).
//! - **Head**: total head H = (discharge level − lowest level in the well) + riser friction +
//!   header friction, friction by Hazen–Williams ([`hazen_williams_head_loss`], checks.md §15):
//!   the riser from the pump intake to the discharge level at the pump's flow, the header main
//!   half the length of the well line (the farthest well to a discharge point at the middle)
//!   at the whole design flow — an upper bound, since the flow builds up along the header.
//! - **Power**: P = ρ·g·Q·H/η ([`pump_power`]): installed at each pump's duty and its class
//!   head, running at each well's own rate and head; energy per day E = P_running·t.

use crate::input::model::{Model, PumpSettings};
use crate::optimise::design_notes::DesignNote;
use crate::physics::pipes::{hazen_williams_head_loss, pump_power};
use crate::physics::water::{G, WATER_DENSITY};

/// The head one pump works against, m.
#[derive(Debug, Clone, Copy, serde::Serialize)]
pub struct Head {
    /// Discharge level − lowest level in the well, m.
    pub lift_m: f64,
    /// Riser friction, m.
    pub riser_m: f64,
    /// Header friction, m.
    pub header_m: f64,
}

impl Head {
    /// Total head H = lift + riser + header, m.
    pub fn total(&self) -> f64 {
        self.lift_m + self.riser_m + self.header_m
    }
}

/// Hazen–Williams friction with the design file's C, m (0 for bad values: every input here
/// has been validated, so none reaches it).
fn friction(p: &PumpSettings, length: f64, flow: f64, diameter: f64) -> f64 {
    hazen_williams_head_loss(length.max(0.0), flow.max(0.0), p.hazen_williams_c, diameter)
        .unwrap_or(0.0)
}

/// Head of one pump at `flow` (m³/s) from a well whose lowest level is `level` (m) and whose
/// pump stands at `intake` (m), with a header `header_length` m long carrying `header_flow`.
pub fn head(
    model: &Model,
    level: f64,
    intake: f64,
    flow: f64,
    header_length: f64,
    header_flow: f64,
) -> Head {
    let p = &model.design.pumps;
    Head {
        lift_m: (p.discharge_level - level).max(0.0),
        riser_m: friction(p, p.discharge_level - intake, flow, p.riser_diameter),
        header_m: friction(p, header_length, header_flow, p.header_diameter),
    }
}

/// Shaft power at `flow` (m³/s) and `head` (m) with the design file's efficiency, W.
pub fn shaft_power(model: &Model, flow: f64, head: f64) -> f64 {
    pump_power(
        flow.max(0.0),
        head.max(0.0),
        model.design.pumps.efficiency,
        WATER_DENSITY,
        G,
    )
    .unwrap_or(0.0)
}

/// The duty a running rate asks for: the smallest standard duty at least rate × (1 +
/// contingency), at most the design file's pump capacity; `(duty, above the list)`.
pub fn duty_for(model: &Model, rate: f64) -> (f64, bool) {
    let want = rate * (1.0 + model.contingency);
    let list = &model.design.pumps.duties;
    let (mut duty, over) = match list.iter().copied().find(|d| *d >= want - 1e-12) {
        Some(d) => (d, false),
        None => (list.last().copied().unwrap_or(want).max(rate), true),
    };
    if let Some(cap) = model.wells.pump_capacity {
        if duty > cap && cap >= rate {
            duty = cap;
        }
    }
    (duty, over)
}

/// Classes of `rates` (m³/s; only those above zero): for each class its duty and the indices
/// of its wells, largest rates first.
pub fn classes(model: &Model, rates: &[f64]) -> Vec<(f64, Vec<usize>)> {
    let tol = model.design.pumps.class_tolerance;
    let mut order: Vec<usize> = (0..rates.len()).filter(|&i| rates[i] > 1e-9).collect();
    order.sort_by(|&a, &b| rates[b].total_cmp(&rates[a]));
    let mut out: Vec<(f64, Vec<usize>)> = Vec::new();
    let mut i = 0;
    while i < order.len() {
        let top = rates[order[i]];
        let (duty, _) = duty_for(model, top);
        let mut members = Vec::new();
        while i < order.len() && rates[order[i]] >= top * (1.0 - tol) - 1e-12 {
            members.push(order[i]);
            i += 1;
        }
        match out.iter_mut().find(|(d, _)| (*d - duty).abs() < 1e-9) {
            Some((_, m)) => m.extend(members),
            None => out.push((duty, members)),
        }
    }
    out
}

/// One rate per class: every well of a class runs at the class's largest running rate, if the
/// layout then still keeps every well within its limits at the design's check points (more
/// pumping only lowers the water, so the targets still hold). Returns a note on what was done.
pub fn one_rate_per_class(
    model: &Model,
    points: &[crate::field::checkpoints::CheckPoint],
    wells: &mut [crate::field::wells::Well],
) -> DesignNote {
    let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();
    let mut new = rates.clone();
    for (_, members) in classes(model, &rates) {
        let top = members.iter().map(|&i| rates[i]).fold(0.0, f64::max);
        for &i in &members {
            new[i] = top;
        }
    }
    let layout = crate::optimise::rates::LayoutRates::new(model, points, wells.to_vec());
    let e = layout.evaluate(&new);
    let within = layout
        .limits
        .iter()
        .zip(&e.wells)
        .zip(&new)
        .all(|((l, w), q)| *q <= l.capacity_at(w.level_m.unwrap_or(f64::NEG_INFINITY)) + 1e-12);
    if e.targets_met && e.wells_ok && within {
        let added: f64 = new.iter().sum::<f64>() - rates.iter().sum::<f64>();
        for (w, q) in wells.iter_mut().zip(&new) {
            w.rate = *q;
        }
        DesignNote::OneRatePerClass {
            added_m3_per_s: added,
        }
    } else {
        DesignNote::Said("one rate per pump class was asked, but at the class rates a well would run past its limits; the individual rates are kept".into())
    }
}
