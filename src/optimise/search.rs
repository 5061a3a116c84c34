//! The count search: the fewest wells of the design file's kind that meet every target within
//! every well limit (`drydig design`).
//!
//! For a ring (by count) or a trench line (by wells per side, i.e. spacing), the smallest count
//! that meets every target within the limits: counts are tried from the quick estimate's count,
//! then 1, 3, 7, 15 … below it (while they meet) or above it (until one meets), then bisected
//! between the last failure and the first success, so the count found has been tried and the
//! one below it has been tried and failed. The search for
//! individual rates solves a programme per count; the search for one rate needs none. Outcomes
//! are data ([`crate::optimise::outcome`]): met, not met (best layout, worst point, shortfall) or
//! impossible (and why).

use crate::check::evaluate::Evaluation;
use crate::estimate;
use crate::field::checkpoints::{check_points, CheckPoint};
use crate::field::layout;
use crate::input::error::InputError;
use crate::input::model::{LayoutKind, LayoutSpec, Model, RingCount};
use crate::optimise::outcome::{Design, Outcome};
use crate::optimise::precheck::impossible_before_search;
use crate::optimise::rates::{LayoutRates, RateOption, MAX_LP_VARIABLES};
use crate::optimise::search_range::{cap_note, seed_index};
use crate::optimise::standby::{finish, is_standby};
use crate::optimise::trial::{
    closed_length, line_length, solve_individual, try_layout, try_placement, Trial, TrialRun,
};
use std::collections::BTreeMap;

/// Closest spacing the count search goes to for deep wells by default, m (common practice (no
/// source): rigs and pipework need a few metres); `wells.min_spacing` sets it.
pub const MIN_SPACING_DEEP_WELL: f64 = crate::input::model::DEFAULT_MIN_SPACING_DEEP_WELL;
/// Closest spacing the count search goes to for wellpoints by default, m (common practice (no
/// source): 0.75–2 m in fine sands and silts); `wells.min_spacing` sets it.
pub const MIN_SPACING_WELLPOINT: f64 = crate::input::model::DEFAULT_MIN_SPACING_WELLPOINT;
/// Most wells the count search places, to bound the work.
pub const MAX_WELLS: usize = 2000;

/// What the search below a count found gives: the smallest index met, what was tried (in
/// words) and the run of a placement found below (none: the cached run stands).
type Fewer = (Option<usize>, Vec<String>, Option<TrialRun>);

/// The layout family the search varies.
enum Family {
    /// Ring by count, from `min` to `max` wells.
    Ring { min: usize, max: usize },
    /// Trench line by wells per side (`min`..`max`), on a line `length` m long.
    Line { min: usize, max: usize, length: f64 },
    /// The layout is given: rates only.
    Fixed,
}

fn family(model: &Model, spec: &LayoutSpec) -> Family {
    // The spacing limits of the design file (defaults: common practice (no source)).
    let min_spacing = model.as_built.min_spacing;
    let max_spacing = model.as_built.max_spacing;
    match &spec.kind {
        LayoutKind::Ring { .. } => {
            let ring =
                layout::offset_ring(&model.excavations[spec.excavation].outline, spec.offset);
            let max = ((closed_length(&ring) / min_spacing).floor() as usize).clamp(3, MAX_WELLS);
            let min = ((closed_length(&ring) / max_spacing).ceil() as usize).clamp(3, max);
            Family::Ring { min, max }
        }
        LayoutKind::Line { both_sides, .. } => {
            let length = line_length(model, spec);
            let sides = if *both_sides { 2 } else { 1 };
            let max = ((length / min_spacing).floor() as usize + 1).clamp(2, MAX_WELLS / sides);
            let min = ((length / max_spacing).ceil() as usize + 1).clamp(2, max);
            Family::Line { min, max, length }
        }
        LayoutKind::Listed | LayoutKind::Csv { .. } => Family::Fixed,
    }
}

/// Where the spacing limits come from, for the search line.
fn spacing_basis(model: &Model) -> &'static str {
    if model.as_built.spacing_default {
        "; limits: common practice (no source), set wells.min_spacing / max_spacing"
    } else {
        "; limits from the design file"
    }
}

/// The layout settings for search index `n` of a family.
fn spec_for(spec: &LayoutSpec, fam: &Family, n: usize) -> LayoutSpec {
    let mut s = spec.clone();
    match (&mut s.kind, fam) {
        (LayoutKind::Ring { count, .. }, Family::Ring { .. }) => {
            *count = RingCount::Count(n as u32);
        }
        (LayoutKind::Line { spacing, .. }, Family::Line { length, .. }) => {
            // n wells per side at exactly length/(n − 1); the factor keeps ⌈L/s⌉ = n − 1
            // against round-off.
            *spacing = length / (n.max(2) - 1) as f64 * (1.0 + 1e-9);
        }
        _ => {}
    }
    s
}

/// The count search with its cache of layouts tried, by search index.
struct Search<'m, 'p> {
    model: &'m Model,
    points: &'p [CheckPoint],
    spec: &'p LayoutSpec,
    fam: &'p Family,
    cache: BTreeMap<usize, TrialRun>,
}

impl Search<'_, '_> {
    /// Whether search index `n` meets `ok`, trying the layout once (and solving its linear
    /// programme only when `with_lp`, once).
    fn meets(
        &mut self,
        n: usize,
        ok: fn(&Trial) -> bool,
        with_lp: bool,
    ) -> Result<bool, InputError> {
        if !self.cache.contains_key(&n) {
            let s = spec_for(self.spec, self.fam, n);
            let per_side = matches!(self.fam, Family::Line { .. }).then_some(n);
            let t = try_layout(self.model, self.points, &s, per_side, with_lp)?;
            self.cache.insert(n, t);
        }
        if let Some(t) = self.cache.get_mut(&n) {
            if with_lp && t.individual.is_none() && !t.placement.wells.is_empty() {
                let rates = LayoutRates::new(self.model, self.points, t.placement.wells.clone());
                let ind = solve_individual(self.model, &rates);
                t.set_individual(ind);
            }
        }
        Ok(self.cache.get(&n).is_some_and(|t| ok(&t.trial)))
    }

    /// Other placements of search index `n`: the first well a quarter, half and
    /// three-quarters of a spacing further round the ring (without corner wells) and the other
    /// corner option; for a trench line the end points a quarter and half a spacing inside the
    /// line ends, the same count spread between them.
    fn variants(&self, n: usize) -> Vec<LayoutSpec> {
        let base = spec_for(self.spec, self.fam, n);
        let mut out = Vec::new();
        match (&base.kind, self.fam) {
            (LayoutKind::Ring { corner_wells, .. }, Family::Ring { .. }) => {
                let ring = layout::offset_ring(
                    &self.model.excavations[self.spec.excavation].outline,
                    self.spec.offset,
                );
                let total = closed_length(&ring);
                let step = total / n.max(1) as f64;
                for f in [0.25, 0.5, 0.75] {
                    let mut v = base.clone();
                    v.start = (base.start + f * step).rem_euclid(total);
                    if let LayoutKind::Ring { corner_wells, .. } = &mut v.kind {
                        *corner_wells = false;
                    }
                    out.push(v);
                }
                let mut v = base.clone();
                if let LayoutKind::Ring {
                    corner_wells: c, ..
                } = &mut v.kind
                {
                    *c = !*corner_wells;
                }
                out.push(v);
            }
            (LayoutKind::Line { .. }, Family::Line { length, .. }) => {
                let step = length / (n.max(2) - 1) as f64;
                for f in [0.25, 0.5] {
                    let mut v = base.clone();
                    let d = (base.start + f * step).min(0.45 * length);
                    v.start = d;
                    if let LayoutKind::Line { spacing, .. } = &mut v.kind {
                        *spacing = (length - 2.0 * d) / (n.max(2) - 1) as f64 * (1.0 + 1e-9);
                    }
                    out.push(v);
                }
            }
            _ => {}
        }
        out
    }

    /// Below the smallest index `found` meeting `ok` with the design file's placement, try the
    /// other placements of each smaller index, one index at a time, while one of them meets.
    /// A placement that meets replaces the cached run of its index (the run it replaces goes to
    /// `others` with every other placement tried). Returns the smallest index met and what was
    /// tried, in words.
    fn fewer_by_variants(
        &mut self,
        found: Option<usize>,
        ok: fn(&Trial) -> bool,
        with_lp: bool,
        others: &mut Vec<TrialRun>,
    ) -> Result<Fewer, InputError> {
        let Some(mut best) = found else {
            return Ok((None, Vec::new(), None));
        };
        let min = match *self.fam {
            Family::Ring { min, .. } | Family::Line { min, .. } => min,
            Family::Fixed => return Ok((found, Vec::new(), None)),
        };
        let mut words = Vec::new();
        let mut chosen: Option<TrialRun> = None;
        while best > min {
            let m = best - 1;
            if self.cache.get(&m).is_some_and(|t| ok(&t.trial)) {
                if let Some(old) = chosen.take() {
                    others.push(old);
                }
                best = m;
                continue;
            }
            let per_side = matches!(self.fam, Family::Line { .. }).then_some(m);
            let mut winner = None;
            for v in self.variants(m) {
                let t = try_layout(self.model, self.points, &v, per_side, with_lp)?;
                words.push(format!("{} wells, {}", t.trial.count, t.trial.variant));
                if ok(&t.trial) {
                    winner = Some(t);
                    break;
                }
                others.push(t);
            }
            match winner {
                Some(t) => {
                    if let Some(old) = chosen.replace(t) {
                        others.push(old);
                    }
                    best = m;
                }
                None => break,
            }
        }
        Ok((Some(best), words, chosen))
    }

    /// Smallest index meeting `ok`, searched from `seed` (the quick estimate's count; the
    /// smallest index when none): when the seed meets, try seed − 1, seed − 3, seed − 7 …
    /// down to the smallest index until one fails; when it does not, seed + 1, seed + 3 … up to
    /// the largest until one meets; then bisect between the last failure and the first
    /// success. The index returned was tried and met; the one below it was tried and failed
    /// (or is below the range).
    fn smallest(
        &mut self,
        ok: fn(&Trial) -> bool,
        with_lp: bool,
        seed: Option<usize>,
    ) -> Result<Option<usize>, InputError> {
        let (min, max) = match *self.fam {
            Family::Ring { min, max } | Family::Line { min, max, .. } => (min, max),
            Family::Fixed => (0, 0),
        };
        let start = seed.unwrap_or(min).clamp(min, max);
        let mut lo: Option<usize> = None;
        let mut hi;
        if start > min && self.meets(start, ok, with_lp)? {
            // downwards from a seed that meets
            hi = start;
            let mut step = 1;
            while hi > min {
                let n = hi.saturating_sub(step).max(min);
                if self.meets(n, ok, with_lp)? {
                    hi = n;
                    step *= 2;
                } else {
                    lo = Some(n);
                    break;
                }
            }
        } else {
            if start > min {
                lo = Some(start);
            }
            let mut n = if start > min {
                (start + 1).min(max)
            } else {
                min
            };
            let mut step = if start > min { 2 } else { 1 };
            hi = loop {
                if lo == Some(n) {
                    return Ok(None);
                }
                if self.meets(n, ok, with_lp)? {
                    break n;
                }
                lo = Some(n);
                if n >= max {
                    return Ok(None);
                }
                n = (n + step).min(max);
                step *= 2;
            };
        }
        while let Some(l) = lo {
            if hi - l <= 1 {
                break;
            }
            let m = l + (hi - l) / 2;
            if self.meets(m, ok, with_lp)? {
                hi = m;
            } else {
                lo = Some(m);
            }
        }
        Ok(Some(hi))
    }
}

/// The check points the design works to: every target lowered by the operating margin, m.
pub fn design_points(model: &Model) -> Vec<CheckPoint> {
    let m = model.design.operating_margin;
    let mut points = check_points(model);
    for p in &mut points {
        if let Some(t) = p.target_level.as_mut() {
            *t -= m;
        }
    }
    points
}

/// Run the design: the smallest layout of the design file's kind that meets every target
/// within every well limit, with rates by `asked`.
pub fn design(model: &Model, asked: RateOption) -> Result<Design, InputError> {
    let Some(spec) = model.layout.clone() else {
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "design needs a [layout]: kind = \"ring\" (the count is searched), \"line\" (the spacing is searched), or \"listed\"/\"csv\" (the rates are found for the given wells)".into(),
        });
    };
    let points = design_points(model);
    let est = estimate::estimate(model)
        .excavations
        .into_iter()
        .nth(spec.excavation)
        .ok_or_else(|| InputError {
            file: model.file.clone(),
            field: "layout.excavation".into(),
            line: None,
            message: "the layout's excavation does not exist".into(),
        })?;
    let fam = family(model, &spec);
    let mut notes: Vec<String> = cap_note(model, &spec, MAX_WELLS).into_iter().collect();
    let (search, probe) = match &fam {
        Family::Ring { min, max } => (
            format!(
                "ring at {:.1} m outside \"{}\": {min} … {max} wells (spacing {:.1} … {:.1} m{})",
                spec.offset,
                model.excavations[spec.excavation].name,
                model.as_built.min_spacing,
                model.as_built.max_spacing,
                spacing_basis(model)
            ),
            spec_for(&spec, &fam, *min),
        ),
        Family::Line { min, max, length } => (
            format!(
                "trench line {length:.0} m long, {} side{}: {min} … {max} wellpoints per side (spacing {:.2} … {:.2} m{})",
                if matches!(spec.kind, LayoutKind::Line { both_sides: true, .. }) { "both" } else { "one" },
                if matches!(spec.kind, LayoutKind::Line { both_sides: true, .. }) { "s" } else { "" },
                length / (*min - 1) as f64,
                length / (*max - 1).max(1) as f64,
                spacing_basis(model)
            ),
            spec_for(&spec, &fam, *min),
        ),
        Family::Fixed => ("the given wells: rates only".to_string(), spec.clone()),
    };
    let probe_placement = layout::generate(model, &probe, 0.0)?;
    let named: Vec<(&str, [f64; 2], f64)> = probe_placement
        .wells
        .iter()
        .map(|w| (w.name.as_str(), w.position, w.radius))
        .collect();
    crate::input::validate::sides::check_wells(model, &named, "layout")?;
    if matches!(fam, Family::Fixed) && probe_placement.wells.is_empty() {
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "the layout places no wells".into(),
        });
    }
    let fixed_points: Vec<[f64; 2]> = if matches!(fam, Family::Fixed) {
        probe_placement.wells.iter().map(|w| w.position).collect()
    } else {
        Vec::new()
    };
    let empty = Design {
        asked,
        used: None,
        outcome: Outcome::Impossible {
            reason: String::new(),
        },
        spec: None,
        placement: None,
        trials: Vec::new(),
        smallest_uniform: None,
        smallest_individual: None,
        binding: Vec::new(),
        search: search.clone(),
        notes: notes.clone(),
        estimate: est.clone(),
        finish: Default::default(),
    };
    if let Some(reason) =
        impossible_before_search(model, &points, &probe_placement.paths, &fixed_points)
    {
        return Ok(Design {
            outcome: Outcome::Impossible { reason },
            ..empty
        });
    }

    let mut search_state = Search {
        model,
        points: &points,
        spec: &spec,
        fam: &fam,
        cache: BTreeMap::new(),
    };
    let (smallest_individual, smallest_uniform) = if matches!(fam, Family::Fixed) {
        let t = try_placement(
            model,
            &points,
            spec.clone(),
            probe_placement,
            None,
            0.0,
            true,
        );
        let (i, u) = (t.trial.individual_met, t.trial.uniform_met);
        search_state.cache.insert(0, t);
        (i.then_some(0), u.then_some(0))
    } else {
        let seed = seed_index(&spec, est.rough_well_count);
        let i = search_state.smallest(|t| t.individual_met, true, seed)?;
        let u = search_state.smallest(|t| t.uniform_met, false, seed)?;
        (i, u)
    };
    // The real fewest: below the count found with the design file's placement, other start
    // positions (and the other corner option) of the same count.
    let mut others: Vec<TrialRun> = Vec::new();
    let mut tried_words = Vec::new();
    let (smallest_individual, smallest_uniform, run_i, run_u) = if matches!(fam, Family::Fixed) {
        (smallest_individual, smallest_uniform, None, None)
    } else {
        let (i, wi, ri) = search_state.fewer_by_variants(
            smallest_individual,
            |t| t.individual_met,
            true,
            &mut others,
        )?;
        let (u, wu, ru) = search_state.fewer_by_variants(
            smallest_uniform,
            |t| t.uniform_met,
            false,
            &mut others,
        )?;
        tried_words.extend(wi);
        tried_words.extend(wu);
        (i, u, ri, ru)
    };
    // The runs at the smallest indices: a placement found below, else the cached run.
    let mut trial_extra: Vec<Trial> = Vec::new();
    for r in [&run_i, &run_u].into_iter().flatten() {
        trial_extra.push(r.trial.clone());
    }
    if !tried_words.is_empty() {
        let mut seen = std::collections::HashSet::new();
        tried_words.retain(|w| seen.insert(w.clone()));
        notes.push(format!(
            "below the count found with the design file's placement, also tried: {}",
            tried_words.join("; ")
        ));
    }
    let cache = search_state.cache;
    let mut trials: Vec<Trial> = cache.values().map(|t| t.trial.clone()).collect();
    trials.extend(others.iter().map(|t| t.trial.clone()));
    trials.extend(trial_extra);
    trials.sort_by(|a, b| a.count.cmp(&b.count).then(a.variant.cmp(&b.variant)));
    crate::optimise::trial::one_row_per_placement(&mut trials);
    let count_of = |n: Option<usize>| n.and_then(|n| cache.get(&n)).map(|t| t.trial.count);

    let pick = match asked {
        RateOption::Individual => smallest_individual
            .map(|n| (n, RateOption::Individual))
            .or(smallest_uniform.map(|n| (n, RateOption::Uniform))),
        RateOption::Uniform => smallest_uniform
            .map(|n| (n, RateOption::Uniform))
            .or(smallest_individual.map(|n| (n, RateOption::Individual))),
    };
    if let Some((_, used)) = pick {
        if used != asked {
            notes.push(format!(
                "no layout tried meets every target with {}; the design uses {} instead",
                asked.describe(),
                used.describe()
            ));
        }
    }
    if !model.boundaries.is_empty() {
        notes.push(format!(
            "the quick estimate takes the design file's {} straight boundar{} by the first-order image of one equivalent well at the centroid; the wells on the boundary side stand nearer to it than the centroid (a river feeds them more, a barrier less), so the two flows differ by more than usual",
            model.boundaries.len(),
            if model.boundaries.len() == 1 { "y" } else { "ies" }
        ));
    }
    if smallest_uniform.is_none() && smallest_individual.is_some() {
        if let Some(t) = cache
            .values()
            .filter(|t| t.trial.count > 0)
            .max_by(|a, b| a.trial.lowest_margin_m.total_cmp(&b.trial.lowest_margin_m))
        {
            notes.push(format!(
                "with one rate in every well no count tried meets every target: at best ({} wells, every well at the most its limits allow, {}) \"{}\" stays {:.2} m above its target; individual rates give more to the wells that serve it",
                t.trial.count,
                t.trial.binding_limit,
                t.trial.lowest_margin_at,
                -t.trial.lowest_margin_m
            ));
        }
    }
    if let (Some(i), Some(u)) = (count_of(smallest_individual), count_of(smallest_uniform)) {
        if u > i {
            notes.push(format!(
                "with one rate in every well {u} wells are needed; with individual rates {i}"
            ));
        }
    }
    // The run of the chosen count: kept aside when it was found, else in the cache (looked up
    // lazily: `unwrap_or(&cache[&n])` would index the cache even when the run was found).
    let chosen = pick.and_then(|(n, used)| {
        let found = match used {
            RateOption::Individual => run_i.as_ref(),
            RateOption::Uniform => run_u.as_ref(),
        };
        found.or_else(|| cache.get(&n)).map(|t| (n, used, t))
    });
    let design = if let Some((_, used, t)) = chosen {
        let (rates, binding) = match used {
            RateOption::Individual => {
                let pumping = t.placement.wells.iter().filter(|w| w.rate >= 0.0).count();
                if let Some(i) = t.individual.as_ref().filter(|i| i.groups < pumping) {
                    notes.push(format!(
                        "the {pumping} wells share {} rates in the linear programme (neighbouring wells in groups, as above {MAX_LP_VARIABLES} wells): each well is still held to its own limits, and the total may be a little above the ungrouped least flow",
                        i.groups
                    ));
                }
                let ind = t.individual.clone().map(|i| (i.rates, i.binding));
                ind.unwrap_or_default()
            }
            RateOption::Uniform => {
                let q = t.trial.uniform_rate_m3_per_s.unwrap_or(0.0);
                let b = vec![
                    format!("target at {} (sets the rate)", t.trial.uniform_rate_set_by),
                    format!(
                        "largest uniform rate within the limits {:.2} L/s ({})",
                        t.trial.uniform_limit_m3_per_s * 1e3,
                        t.trial.binding_limit
                    ),
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
                &points,
                &mut placement.wells,
            ));
        }
        let fin = finish(model, &mut placement.wells);
        if !fin.dropped.is_empty() {
            notes.push(format!(
                "{} well{} the least-flow rates leave idle dropped from the layout: {}",
                fin.dropped.len(),
                if fin.dropped.len() == 1 { "" } else { "s" },
                fin.dropped.join(", ")
            ));
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
            smallest_uniform: count_of(smallest_uniform),
            smallest_individual: count_of(smallest_individual),
            binding,
            notes,
            ..empty
        }
    } else {
        not_met(model, &points, &cache, trials, notes, empty)?
    };
    Ok(design)
}

/// No layout met: the best one tried, its worst point and shortfall — or a capacity reason.
fn not_met(
    model: &Model,
    points: &[CheckPoint],
    cache: &BTreeMap<usize, TrialRun>,
    trials: Vec<Trial>,
    mut notes: Vec<String>,
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
                            "well capacity: even {} wells (the closest spacing tried, {:.2} m) can give at most {:.2} L/s together (each at its full capacity before any drawdown), less than the {:.2} L/s the targets need with no limits at all",
                            l.trial.count,
                            l.trial.spacing_m,
                            all_cap * 1e3,
                            f * 1e3
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
    notes.push(format!(
        "the best layout tried has {} wells; shown with {}",
        n,
        match option {
            RateOption::Uniform => "every well at the largest rate its limits allow",
            RateOption::Individual =>
                "rates that make the largest shortfall least within the limits",
        }
    ));
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
fn allowance_note(model: &Model, wells: &[crate::field::wells::Well]) -> String {
    let d = &model.design;
    let mut bare = model.clone();
    bare.design.operating_margin = 0.0;
    bare.design.capacity_fraction = 1.0;
    bare.design.one_well_out = false;
    let points = check_points(&bare);
    let plain = LayoutRates::new(&bare, &points, wells.to_vec()).individual();
    format!(
        "the design keeps {:.2} m below every target with every well running, uses at most {:.0} % of each well's capacity{} (allowances.operating_margin, capacity_fraction, one_well_out); {}",
        d.operating_margin,
        d.capacity_fraction * 100.0,
        if d.one_well_out { " and plans for any one well out" } else { "" },
        if plain.met {
            "without these allowances the same wells meet every target, with no reserve: add wells, or relax an allowance if the engineer accepts less reserve"
        } else {
            "the same wells do not meet every target even without them"
        }
    )
}
