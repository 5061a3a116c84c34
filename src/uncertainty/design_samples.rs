//! `design` on one sampled ground: the fewest wells and their flow; and the robust design — the
//! design of the ground at the chosen reliability, verified on every sample.
//!
//! The robust design: the samples' designs are ranked by (wells, flow); the design at rank
//! ⌈reliability·N⌉ is the one sized for the P-reliability ground. Its wells, at its rates, are
//! then evaluated on every sample's ground (as `check` would) and the fraction of samples in which
//! every target is met is counted. Where that fraction falls short of the reliability asked
//! (fixed rates on a more permeable ground draw less), the next design up the ranking is tried,
//! up to [`MAX_ROBUST_TRIES`] designs; the one reaching the fraction, or the best fraction found,
//! is reported with its fraction beside it.

use crate::field::wells::Well;
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::optimise::outcome::Design;
use crate::optimise::outcome::Outcome;
use crate::optimise::rates::RateOption;
use crate::uncertainty::check_samples::{evaluate_sample, Layout};
use crate::uncertainty::fast_check::FastCheck;
use rayon::prelude::*;
use serde::Serialize;

/// Most designs verified on every sample when looking for the robust one.
pub const MAX_ROBUST_TRIES: usize = 4;

/// The design found on one sample's ground.
#[derive(Debug, Clone, Serialize)]
pub struct DesignSample {
    /// Wells in the chosen (or best) layout (`None`: no layout of this kind can work).
    pub wells: Option<usize>,
    /// Their total flow, m³/s.
    pub total_flow_m3_per_s: Option<f64>,
    /// Every target met within every limit.
    pub met: bool,
    /// The chosen wells with their rates (not written out).
    #[serde(skip)]
    pub layout: Vec<Well>,
}

/// The design of `model` with `rates` (with individual rates, one rate in every well is
/// searched only when individual rates find no layout: the layout is the full design's).
pub fn design_sample(model: &Model, rates: RateOption) -> DesignSample {
    sample_of(crate::optimise::search::design_scoped(model, rates, true))
}

/// The wells, flow and layout of a design.
pub fn sample_of(design: Result<Design, InputError>) -> DesignSample {
    let Ok(d) = design else {
        return DesignSample {
            wells: None,
            total_flow_m3_per_s: None,
            met: false,
            layout: Vec::new(),
        };
    };
    let layout = d.placement.map(|p| p.wells).unwrap_or_default();
    let met = matches!(d.outcome, Outcome::Met { .. });
    let flow: f64 = layout.iter().map(|w| w.rate.max(0.0)).sum();
    DesignSample {
        wells: (!layout.is_empty()).then_some(layout.len()),
        total_flow_m3_per_s: (!layout.is_empty()).then_some(flow),
        met,
        layout,
    }
}

/// The robust design and how often it meets every target.
#[derive(Debug, Clone, Serialize)]
pub struct Robust {
    /// The sample whose design it is.
    pub sample: usize,
    /// Its wells.
    pub wells: usize,
    /// Its total flow, m³/s.
    pub total_flow_m3_per_s: f64,
    /// The fraction of samples in which every target is met with it (fixed rates).
    pub fraction_met: f64,
    /// The designs verified before it (sample, fraction met).
    pub tried: Vec<(usize, f64)>,
}

/// The robust design for `reliability` (0 … 1) from the samples' designs; `models[i]` is sample
/// i's ground, `base` gives the check points.
pub fn robust(
    base: &Model,
    models: &[Model],
    designs: &[DesignSample],
    reliability: f64,
) -> Option<Robust> {
    let spec = base.uncertainty.as_ref();
    let mut ranked: Vec<usize> = (0..designs.len())
        .filter(|&i| designs[i].met && designs[i].wells.is_some())
        .collect();
    if ranked.is_empty() {
        return None;
    }
    let key = |i: usize| {
        (
            designs[i].wells.unwrap_or(usize::MAX),
            designs[i].total_flow_m3_per_s.unwrap_or(f64::MAX),
        )
    };
    ranked.sort_by(|&a, &b| {
        let (ka, kb) = (key(a), key(b));
        ka.0.cmp(&kb.0).then(ka.1.total_cmp(&kb.1)).then(a.cmp(&b))
    });
    // rank in all samples (an unmet sample counts as needing more than any met one)
    let want = ((reliability * designs.len() as f64).ceil() as usize).max(1);
    let start = want.saturating_sub(1).min(ranked.len() - 1);
    let mut tried = Vec::new();
    let mut best: Option<(usize, f64)> = None;
    for &i in ranked[start..].iter().take(MAX_ROBUST_TRIES) {
        let layout = Layout::new(base, designs[i].layout.clone());
        let fast = spec.and_then(|s| FastCheck::new(base, s, &layout));
        let met = models
            .par_iter()
            .map(|m| {
                let s = fast.as_ref().and_then(|f| f.evaluate(m));
                s.unwrap_or_else(|| evaluate_sample(m, &layout)).targets_met as usize
            })
            .sum::<usize>();
        let fraction = met as f64 / models.len() as f64;
        tried.push((i, fraction));
        if best.is_none_or(|(_, f)| fraction > f) {
            best = Some((i, fraction));
        }
        if fraction + 1e-12 >= reliability {
            break;
        }
    }
    let (i, fraction_met) = best?;
    tried.retain(|(j, _)| *j != i);
    Some(Robust {
        sample: i,
        wells: designs[i].wells.unwrap_or(0),
        total_flow_m3_per_s: designs[i].total_flow_m3_per_s.unwrap_or(0.0),
        fraction_met,
        tried,
    })
}
