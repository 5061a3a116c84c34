//! Finishing a met design: wells the least-flow rates leave idle are dropped from the layout,
//! the effect of losing each working well is measured (which loss hurts most, the margin left
//! without it), and the design file's standby wells are placed where that loss hurts most.
//!
//! A standby well stands midway between the well whose loss leaves the lowest margin and the
//! one of its two nearest neighbours that is nearer the point where that margin is: it is
//! started when a well is lost, and there it replaces most of the lost drawdown (common
//! practice (no source): standby wells are spread round the ring at the most critical places).
//! On a ring the standby well stands on the ring itself, not on the chord between the two
//! wells (a chord cuts the corner, towards the excavation): at the free place on the ring
//! nearest that midpoint, out of keep-out zones and at least the minimum spacing from every
//! well and standby well already placed.

use crate::field::checkpoints::{check_points, CheckPoint};
use crate::field::wells::{Well, WellRole};
use crate::input::model::{LayoutKind, Model, WellKind};
use crate::optimise::one_out::{one_out_report, OneOut};
use crate::optimise::rates::LayoutRates;

/// Every standby well's note (shown in the wells table) starts with this.
pub const STANDBY_NOTE: &str = "standby";

/// Whether `w` is a placed standby well (its role, set where it is placed).
pub fn is_standby(w: &Well) -> bool {
    w.role == WellRole::Standby
}

/// What finishing did.
#[derive(Debug, Clone, Default)]
pub struct Finish {
    /// Names of the wells dropped because the rates leave them idle.
    pub dropped: Vec<String>,
    /// The loss of each working well at the real targets (no operating margin).
    pub one_out: Option<OneOut>,
    /// Names of the standby wells placed.
    pub standby: Vec<String>,
}

/// Drop idle wells, measure one well out at the real targets and place the standby wells.
pub fn finish(model: &Model, wells: &mut Vec<Well>) -> Finish {
    let mut out = Finish::default();
    wells.retain(|w| {
        let idle = (0.0..=1e-9).contains(&w.rate);
        if idle {
            out.dropped.push(w.name.clone());
        }
        !idle
    });
    let points: Vec<CheckPoint> = check_points(model);
    let layout = LayoutRates::new(model, &points, wells.clone());
    let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();
    out.one_out = one_out_report(&layout, &rates);
    if model.wells.kind != WellKind::DeepWell || model.wells.standby == 0 {
        return out;
    }
    // The worst losses first; one standby well per loss, in that order.
    let mut order: Vec<(String, f64)> = out
        .one_out
        .as_ref()
        .map(|o| o.by_well.clone())
        .unwrap_or_default();
    order.sort_by(|a, b| a.1.total_cmp(&b.1));
    let worst_at = out.one_out.as_ref().and_then(|o| {
        points
            .iter()
            .find(|p| p.name == o.worst_point)
            .map(|p| p.position)
    });
    let working: Vec<Well> = wells.clone();
    for (j, (name, _)) in order
        .iter()
        .cycle()
        .take(model.wells.standby as usize)
        .enumerate()
    {
        let Some(w) = working.iter().find(|w| &w.name == name) else {
            continue;
        };
        let mut near: Vec<&Well> = working
            .iter()
            .filter(|o| o.name != w.name && o.rate > 0.0)
            .collect();
        let d = |a: [f64; 2], b: [f64; 2]| (a[0] - b[0]).hypot(a[1] - b[1]);
        near.sort_by(|a, b| d(a.position, w.position).total_cmp(&d(b.position, w.position)));
        let target = worst_at.unwrap_or(w.position);
        let Some(n) = near
            .iter()
            .take(2)
            .min_by(|a, b| d(a.position, target).total_cmp(&d(b.position, target)))
        else {
            continue;
        };
        // A second standby for the same loss goes to the other side.
        let side = if j >= order.len() {
            near.get(1).copied().unwrap_or(n)
        } else {
            n
        };
        let mid = [
            0.5 * (w.position[0] + side.position[0]),
            0.5 * (w.position[1] + side.position[1]),
        ];
        let taken: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
        let p = on_ring(model, mid, &taken).unwrap_or(mid);
        let sname = format!("S{:02}", j + 1);
        let mut s = Well::from_spec(sname.clone(), p, 0.0, &model.wells);
        s.role = WellRole::Standby;
        s.note = Some(format!(
            "{STANDBY_NOTE}: between {} and {}, where the loss of {} hurts most",
            w.name, side.name, w.name
        ));
        wells.push(s);
        out.standby.push(sname);
    }
    out
}

/// The free place on the layout's ring nearest `p` (`None` when the layout is not a ring or
/// the ring has no free place).
fn on_ring(model: &Model, p: [f64; 2], taken: &[[f64; 2]]) -> Option<[f64; 2]> {
    let spec = model.layout.as_ref()?;
    if !matches!(spec.kind, LayoutKind::Ring { .. }) {
        return None;
    }
    let outline = &model.excavations.get(spec.excavation)?.outline;
    let ring = crate::field::layout::offset_ring(outline, spec.offset);
    crate::field::layout::free_on_ring(model, &ring, p, taken, model.as_built.min_spacing)
}
