//! `sweep`: the same layout tried over a range of well counts (ring) or spacings (trench line),
//! each with both rate options, so an engineer sees the trade-off between wells and flow.

use crate::input::error::InputError;
use crate::input::model::{LayoutKind, LayoutSpec, Model, RingCount};
use crate::optimise::trial::{try_layout, Trial};
use rayon::prelude::*;

/// Most layouts one sweep may try.
pub const MAX_STEPS: usize = 1000;

/// What the sweep varies.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Axis {
    /// Wells on a ring.
    Count,
    /// Spacing along a trench line, m.
    Spacing,
}

/// A planned sweep: the values and the layout settings for each.
#[derive(Debug, Clone)]
pub struct Plan {
    /// Count or spacing.
    pub axis: Axis,
    /// The values asked for (counts, or spacings in m).
    pub values: Vec<f64>,
    specs: Vec<LayoutSpec>,
}

/// A finished sweep.
#[derive(Debug, Clone)]
pub struct Sweep {
    /// Count or spacing.
    pub axis: Axis,
    /// The values asked for.
    pub values: Vec<f64>,
    /// One row per value.
    pub trials: Vec<Trial>,
}

impl Sweep {
    /// One line on what was swept.
    pub fn describe(&self) -> String {
        let (a, b) = (
            self.values.first().copied().unwrap_or(0.0),
            self.values.last().copied().unwrap_or(0.0),
        );
        match self.axis {
            Axis::Count => format!(
                "ring of {a} … {b} wells ({} layouts), both rate options",
                self.values.len()
            ),
            Axis::Spacing => format!(
                "trench line at spacings {a} … {b} m ({} layouts), both rate options",
                self.values.len()
            ),
        }
    }
}

fn bad(model: &Model, field: &str, message: String) -> InputError {
    InputError {
        file: model.file.clone(),
        field: field.into(),
        line: None,
        message,
    }
}

/// Plan a sweep from `from` to `to` (inclusive) by `step`: counts for a ring, spacings (m) for
/// a trench line. Bad ranges are input errors that say what would be valid.
pub fn plan(model: &Model, from: f64, to: f64, step: Option<f64>) -> Result<Plan, InputError> {
    let Some(spec) = &model.layout else {
        return Err(bad(
            model,
            "layout",
            "sweep needs a [layout] of kind \"ring\" (counts are swept) or \"line\" (spacings are swept)".into(),
        ));
    };
    if !(from.is_finite() && to.is_finite()) || to < from {
        return Err(bad(
            model,
            "--from/--to",
            format!("the range {from} … {to} is not valid: give --from ≤ --to, both finite"),
        ));
    }
    match &spec.kind {
        LayoutKind::Ring { .. } => {
            let step = step.unwrap_or(1.0);
            let whole = |v: f64| v.fract() == 0.0;
            if !(whole(from) && whole(to) && whole(step)) || from < 3.0 || step < 1.0 {
                return Err(bad(
                    model,
                    "--from/--to/--step",
                    format!("a ring is swept by well count: give whole numbers, --from at least 3 and --step at least 1 (got {from} … {to} by {step})"),
                ));
            }
            // In f64 first: a huge range must not overflow the count.
            let steps_f = ((to - from) / step).floor() + 1.0;
            let steps = steps_f.min(usize::MAX as f64 / 2.0) as usize;
            if steps_f > MAX_STEPS as f64 || to > crate::optimise::search::MAX_WELLS as f64 {
                return Err(bad(
                    model,
                    "--from/--to/--step",
                    format!("{steps} layouts up to {to} wells is too many; at most {MAX_STEPS} layouts and {} wells", crate::optimise::search::MAX_WELLS),
                ));
            }
            let values: Vec<f64> = (0..steps).map(|i| from + step * i as f64).collect();
            let specs = values
                .iter()
                .map(|&n| {
                    let mut s = spec.clone();
                    if let LayoutKind::Ring { count, .. } = &mut s.kind {
                        *count = RingCount::Count(n as u32);
                    }
                    s
                })
                .collect();
            Ok(Plan {
                axis: Axis::Count,
                values,
                specs,
            })
        }
        LayoutKind::Line { .. } => {
            let step = step.unwrap_or(((to - from) / 10.0).max(0.01));
            if from < 0.1 || !(step > 0.0 && step.is_finite()) {
                return Err(bad(
                    model,
                    "--from/--step",
                    format!("a trench line is swept by spacing in metres: --from at least 0.1 m and --step above zero (got {from} by {step})"),
                ));
            }
            let steps_f = ((to - from) / step + 1e-9).floor() + 1.0;
            let steps = steps_f.min(usize::MAX as f64 / 2.0) as usize;
            if steps_f > MAX_STEPS as f64 {
                return Err(bad(
                    model,
                    "--step",
                    format!("{steps} layouts is too many; at most {MAX_STEPS}"),
                ));
            }
            let per_side =
                crate::optimise::trial::line_length(model, spec) / from + 2.0;
            if per_side > crate::optimise::search::MAX_WELLS as f64 {
                return Err(bad(
                    model,
                    "--from",
                    format!("a spacing of {from} m puts about {per_side:.0} wellpoints on each line; at most {} in all", crate::optimise::search::MAX_WELLS),
                ));
            }
            let values: Vec<f64> = (0..steps)
                .map(|i| ((from + step * i as f64) * 1e6).round() / 1e6)
                .collect();
            let specs = values
                .iter()
                .map(|&v| {
                    let mut s = spec.clone();
                    if let LayoutKind::Line { spacing, .. } = &mut s.kind {
                        *spacing = v;
                    }
                    s
                })
                .collect();
            Ok(Plan {
                axis: Axis::Spacing,
                values,
                specs,
            })
        }
        LayoutKind::Listed | LayoutKind::Csv { .. } => Err(bad(
            model,
            "layout.kind",
            "sweep varies a ring (count) or a trench line (spacing); a listed or CSV layout has fixed wells — use `drydig design` to find their rates".into(),
        )),
    }
}

/// Run every layout of the plan (in parallel), calling `progress` after each.
pub fn run(model: &Model, plan: &Plan, progress: &(dyn Fn() + Sync)) -> Result<Sweep, InputError> {
    // The targets as `design` works to them: less the operating margin.
    let points = crate::optimise::search::design_points(model);
    let trials = plan
        .specs
        .par_iter()
        .map(|s| {
            let t = try_layout(model, &points, s, None, true).map(|t| {
                let mut trial = t.trial;
                if let LayoutKind::Line { both_sides, .. } = &s.kind {
                    trial.per_side = Some(if *both_sides {
                        trial.count / 2
                    } else {
                        trial.count
                    });
                }
                trial
            });
            progress();
            t
        })
        .collect::<Result<Vec<_>, _>>()?;
    Ok(Sweep {
        axis: plan.axis,
        values: plan.values.clone(),
        trials,
    })
}
