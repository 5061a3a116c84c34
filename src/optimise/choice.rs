//! The choice at the end of the count search: the layout whose rates are used (the smallest
//! count met with the rate option asked, else the other option), finished (rates set, idle
//! wells dropped, standby placed); or, when no layout met, the best one tried with its worst
//! point and shortfall, or a capacity reason no count can get past.

use crate::check::evaluate::Evaluation;
use crate::field::checkpoints::{check_points, CheckPoint};
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::optimise::binding::Binding;
use crate::optimise::design_notes::DesignNote;
use crate::optimise::outcome::{Design, Outcome};
use crate::optimise::rates::{LayoutRates, RateOption, MAX_LP_VARIABLES};
use crate::optimise::standby::{finish, is_standby};
use crate::optimise::trial::{Trial, TrialRun};
use std::collections::BTreeMap;

/// What the count search found: the cache of layouts tried, the smallest indices met, the
/// runs found below them by other placements, every trial and the notes.
pub struct Found {
    pub cache: BTreeMap<usize, TrialRun>,
    pub trials: Vec<Trial>,
    pub smallest_individual: Option<usize>,
    pub smallest_uniform: Option<usize>,
    pub run_i: Option<TrialRun>,
    pub run_u: Option<TrialRun>,
    pub notes: Vec<DesignNote>,
}

impl Found {
    /// Wells in the run at the smallest index met with individual (`true`) or uniform rates.
    pub fn count(&self, individual: bool) -> Option<usize> {
        let (n, run) = if individual {
            (self.smallest_individual, &self.run_i)
        } else {
            (self.smallest_uniform, &self.run_u)
        };
        run.as_ref()
            .or_else(|| n.and_then(|n| self.cache.get(&n)))
            .map(|t| t.trial.count)
    }

    /// The run chosen with `used` at index `n`.
    pub fn run(&self, n: usize, used: RateOption) -> Option<&TrialRun> {
        let found = match used {
            RateOption::Individual => self.run_i.as_ref(),
            RateOption::Uniform => self.run_u.as_ref(),
        };
        // (looked up lazily: `unwrap_or(&cache[&n])` would index the cache even when the run
        // was found)
        found.or_else(|| self.cache.get(&n))
    }
}

/// The layout chosen from what the search found: the rates of the chosen option, finished
/// (idle wells dropped, standby placed); or the best layout tried when none met.
pub fn choose(
    model: &Model,
    points: &[CheckPoint],
    asked: RateOption,
    found: Found,
    empty: Design,
) -> Result<Design, InputError> {
    let mut notes = empty.notes.clone();
    // A rolling run's pump sets are moved from behind the face to ahead of it, so each serves
    // in turn ahead of, beside and behind the open length: one rate in every wellpoint of the
    // set, the run-in pumping ahead to drain the ground before it is dug (common practice (no
    // source)); least-flow rates would leave the run-in idle.
    let asked = if model.rolling.is_some() {
        notes.push(DesignNote::Said("rolling run: one rate in every wellpoint of the set (each pump set serves in turn ahead of, beside and behind the open length; the run-in drains the ground before it is dug; common practice (no source))".into()));
        RateOption::Uniform
    } else {
        asked
    };
    let mut trials = found.trials.clone();
    trials.sort_by(|a, b| a.count.cmp(&b.count).then(a.variant.cmp(&b.variant)));
    crate::optimise::trial::one_row_per_placement(&mut trials);
    let (si, su) = (found.smallest_individual, found.smallest_uniform);
    let pick = match asked {
        RateOption::Individual => si
            .map(|n| (n, RateOption::Individual))
            .or(su.map(|n| (n, RateOption::Uniform))),
        RateOption::Uniform => su
            .map(|n| (n, RateOption::Uniform))
            .or(si.map(|n| (n, RateOption::Individual))),
    };
    if let Some((_, used)) = pick {
        if used != asked {
            notes.push(DesignNote::Said(format!(
                "no layout tried meets every target with {}; the design uses {} instead",
                asked.describe(),
                used.describe()
            )));
        }
    }
    if !model.boundaries.is_empty() {
        notes.push(DesignNote::Said(format!(
            "the quick estimate takes the design file's {} straight boundar{} by the first-order image of one equivalent well at the centroid; the wells on the boundary side stand nearer to it than the centroid (a river feeds them more, a barrier less), so the two flows differ by more than usual",
            model.boundaries.len(),
            if model.boundaries.len() == 1 { "y" } else { "ies" }
        )));
    }
    let (ci, cu) = (found.count(true), found.count(false));
    if su.is_none() && si.is_some() {
        if let Some(t) = found
            .cache
            .values()
            .filter(|t| t.trial.count > 0)
            .max_by(|a, b| a.trial.lowest_margin_m.total_cmp(&b.trial.lowest_margin_m))
        {
            notes.push(DesignNote::UniformShort {
                count: t.trial.count,
                limit: t.trial.binding_limit.clone(),
                point: t.trial.lowest_margin_at.clone(),
                shortfall_m: -t.trial.lowest_margin_m,
            });
        }
    }
    if let (Some(i), Some(u)) = (ci, cu) {
        if u > i {
            notes.push(DesignNote::Said(format!(
                "with one rate in every well {u} wells are needed; with individual rates {i}"
            )));
        }
    }
    let Some((used, t)) = pick.and_then(|(n, used)| found.run(n, used).map(|t| (used, t))) else {
        return not_met(model, points, &found.cache, trials, notes, empty);
    };
    Ok(met(model, points, used, t, notes, trials, (ci, cu), empty))
}

/// The met design of run `t` with rates by `used`: rates set, one rate per pump class when
/// asked, idle wells dropped and standby wells placed.
#[allow(clippy::too_many_arguments)]
fn met(
    model: &Model,
    points: &[CheckPoint],
    used: RateOption,
    t: &TrialRun,
    mut notes: Vec<DesignNote>,
    trials: Vec<Trial>,
    (ci, cu): (Option<usize>, Option<usize>),
    empty: Design,
) -> Design {
    let (rates, binding) = match used {
        RateOption::Individual => {
            let pumping = t.placement.wells.iter().filter(|w| w.rate >= 0.0).count();
            if let Some(i) = t.individual.as_ref().filter(|i| i.groups < pumping) {
                notes.push(DesignNote::Said(format!(
                    "the {pumping} wells share {} rates in the linear programme (neighbouring wells in groups, as above {MAX_LP_VARIABLES} wells): each well is still held to its own limits, and the total may be a little above the ungrouped least flow",
                    i.groups
                )));
            }
            let ind = t.individual.clone().map(|i| (i.rates, i.binding));
            ind.unwrap_or_default()
        }
        RateOption::Uniform => {
            let q = t.trial.uniform_rate_m3_per_s.unwrap_or(0.0);
            let b = vec![
                Binding::TargetSetsRate {
                    point: t.trial.uniform_rate_set_by.clone(),
                },
                Binding::UniformLimit {
                    rate_m3_per_s: t.trial.uniform_limit_m3_per_s,
                    set_by: Box::new(t.trial.binding_limit.clone()),
                },
            ];
            let rates = t
                .placement
                .wells
                .iter()
                .map(|w| if w.rate < 0.0 { w.rate } else { q })
                .collect();
            (rates, b)
        }
    };
    let mut placement = t.placement.clone();
    for (w, q) in placement.wells.iter_mut().zip(&rates) {
        w.rate = *q;
    }
    if model.design.pumps.one_rate_per_class && used == RateOption::Individual {
        notes.push(crate::optimise::pumps::one_rate_per_class(
            model,
            points,
            &mut placement.wells,
        ));
    }
    let fin = finish(model, &mut placement.wells);
    if !fin.dropped.is_empty() {
        notes.push(DesignNote::Said(format!(
            "{} well{} the least-flow rates leave idle dropped from the layout: {}",
            fin.dropped.len(),
            if fin.dropped.len() == 1 { "" } else { "s" },
            fin.dropped.join(", ")
        )));
    }
    Design {
        used: Some(used),
        finish: fin,
        outcome: Outcome::Met {
            count: placement.wells.iter().filter(|w| !is_standby(w)).count(),
            total_flow_m3_per_s: rates.iter().filter(|q| **q > 0.0).sum(),
        },
        spec: Some(t.spec.clone()),
        placement: Some(placement),
        trials,
        smallest_uniform: cu,
        smallest_individual: ci,
        binding,
        notes,
        ..empty
    }
}

/// No layout met: the best one tried, its worst point and shortfall — or a capacity reason.
fn not_met(
    model: &Model,
    points: &[CheckPoint],
    cache: &BTreeMap<usize, TrialRun>,
    trials: Vec<Trial>,
    mut notes: Vec<DesignNote>,
    empty: Design,
) -> Result<Design, InputError> {
    let Some(best) = cache
        .values()
        .filter(|t| t.trial.count > 0)
        .max_by(|a, b| a.trial.lowest_margin_m.total_cmp(&b.trial.lowest_margin_m))
    else {
        return Ok(Design {
            outcome: Outcome::Impossible {
                reason: "no layout tried placed any wells (keep-out zones cover the well line)"
                    .into(),
            },
            trials,
            ..empty
        });
    };
    let ctx = LayoutRates::new(model, points, best.placement.wells.clone());
    let n = ctx.wells.len();
    // Candidates: every well at the largest uniform rate, and the least-shortfall programme.
    let mut candidates = vec![(
        ctx.uniform_rates(best.trial.uniform_limit_m3_per_s),
        RateOption::Uniform,
    )];
    if let Some(r) = ctx.least_shortfall() {
        candidates.push((r, RateOption::Individual));
    }
    let mut chosen: Option<(Vec<f64>, RateOption, Evaluation)> = None;
    for (rates, option) in candidates {
        let e = ctx.evaluate(&rates);
        let m = e
            .worst_point
            .and_then(|i| e.points[i].margin_m)
            .unwrap_or(f64::NEG_INFINITY);
        let better = chosen.as_ref().is_none_or(|(_, _, c)| {
            m > c
                .worst_point
                .and_then(|i| c.points[i].margin_m)
                .unwrap_or(f64::NEG_INFINITY)
        });
        if better {
            chosen = Some((rates, option, e));
        }
    }
    let Some((rates, option, e)) = chosen else {
        return Ok(Design { trials, ..empty });
    };
    // Capacity: with no limits the targets need F; if all wells together cannot give F even
    // at the closest spacing tried, no count of this kind can work.
    let largest = cache.values().max_by_key(|t| t.trial.count);
    if let Some(l) = largest {
        let lctx = LayoutRates::new(model, points, l.placement.wells.clone());
        let all_cap: f64 = (0..lctx.wells.len())
            .filter(|&k| lctx.wells[k].rate >= 0.0)
            .map(|k| lctx.limits[k].capacity_at(model.aquifer.initial_level))
            .sum();
        if let Some(f) = lctx.flow_without_limits() {
            if all_cap < f {
                return Ok(Design {
                    outcome: Outcome::Impossible {
                        reason: format!(
                            "well capacity: even {} wells (the closest spacing tried, {}) can give at most {} together (each at its full capacity before any drawdown), less than the {} the targets need with no limits at all",
                            l.trial.count,
                            model.units.length_words(l.trial.spacing_m, 2),
                            model.units.rate_words(all_cap),
                            model.units.rate_words(f)
                        ),
                    },
                    trials,
                    notes,
                    ..empty
                });
            }
        }
    }
    let worst = e.worst_point.map(|i| &e.points[i]);
    notes.push(allowance_note(model, &best.placement.wells));
    notes.push(DesignNote::Said(format!(
        "the best layout tried has {} wells; shown with {}",
        n,
        match option {
            RateOption::Uniform => "every well at the largest rate its limits allow",
            RateOption::Individual =>
                "rates that make the largest shortfall least within the limits",
        }
    )));
    let mut placement = best.placement.clone();
    for (w, q) in placement.wells.iter_mut().zip(&rates) {
        w.rate = *q;
    }
    Ok(Design {
        used: Some(option),
        outcome: Outcome::NotMet {
            count: n,
            worst_point: worst.map(|p| p.point.name.clone()).unwrap_or_default(),
            position: worst.map_or([0.0, 0.0], |p| p.point.position),
            shortfall_m: worst
                .and_then(|p| p.margin_m)
                .map_or(0.0, |m| (-m).max(0.0)),
        },
        spec: Some(best.spec.clone()),
        placement: Some(placement),
        binding: vec![best.trial.binding_limit.clone()],
        trials,
        notes,
        ..empty
    })
}

/// Why a layout that is not met may still be close: the design's allowances in words, and
/// whether the same wells meet every target without them (then the layout has no reserve).
fn allowance_note(model: &Model, wells: &[crate::field::wells::Well]) -> DesignNote {
    let d = &model.design;
    let mut bare = model.clone();
    bare.design.operating_margin = 0.0;
    bare.design.capacity_fraction = 1.0;
    bare.design.one_well_out = false;
    let points = check_points(&bare);
    let plain = LayoutRates::new(&bare, &points, wells.to_vec()).individual();
    DesignNote::Allowances {
        margin_m: d.operating_margin,
        capacity_fraction: d.capacity_fraction,
        one_well_out: d.one_well_out,
        met_without: plain.met,
    }
}
