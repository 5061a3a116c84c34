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

use crate::estimate;
use crate::field::checkpoints::{check_points, CheckPoint};
use crate::field::layout;
use crate::input::error::InputError;
use crate::input::model::{LayoutKind, LayoutSpec, Model, RingCount};
use crate::optimise::choice::{choose, Found};
use crate::optimise::design_notes::DesignNote;
use crate::optimise::outcome::{Design, FreeSummary, Outcome};
use crate::optimise::placement::{self, NoFree};
use crate::optimise::precheck::impossible_before_search;
use crate::optimise::rates::{LayoutRates, RateOption};
use crate::optimise::search_range::{cap_note, seed_index};
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
            crate::work_counts::bisecting(l, hi);
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
        crate::work_counts::bisecting(0, 0);
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
    design_scoped(model, asked, false)
}

/// [`design`], and when `asked_only` with individual rates asked, one rate in every well is
/// searched only if individual rates find no layout: the layout chosen is the same (the
/// choice takes the individual count whenever there is one), only the uniform count and its
/// note are left out. For `drydig uncertainty`, which keeps the layout of each sample's design.
pub fn design_scoped(
    model: &Model,
    asked: RateOption,
    asked_only: bool,
) -> Result<Design, InputError> {
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
    let notes: Vec<DesignNote> = cap_note(model, &spec, MAX_WELLS)
        .map(DesignNote::Cap)
        .into_iter()
        .collect();
    let (search, probe) = search_words(model, &spec, &fam);
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
        search,
        notes,
        estimate: est,
        finish: Default::default(),
        free: None,
    };
    if let Some(reason) =
        impossible_before_search(model, &points, &probe_placement.paths, &fixed_points)
    {
        return Ok(Design {
            outcome: Outcome::Impossible { reason },
            ..empty
        });
    }
    // (a rolling run is always designed with one rate: see `choose`)
    let uniform_too = !(asked_only && asked == RateOption::Individual && model.rolling.is_none());
    let mut found = search_counts(
        model,
        &points,
        &spec,
        &fam,
        probe_placement,
        &empty,
        uniform_too,
    )?;
    let mut notes = empty.notes.clone();
    let free = if asked == RateOption::Individual && matches!(fam, Family::Ring { .. }) {
        spec.free
            .as_ref()
            .map(|f| free_placement(model, &points, &spec, f, &mut found, &mut notes))
    } else {
        None
    };
    notes.append(&mut found.notes);
    let empty = Design {
        notes,
        free,
        ..empty
    };
    choose(model, &points, asked, found, empty)
}

/// The search line of the design and the layout probed before it (the smallest index).
fn search_words(model: &Model, spec: &LayoutSpec, fam: &Family) -> (String, LayoutSpec) {
    let u = model.units;
    let lu = u.length_unit();
    match fam {
        Family::Ring { min, max } => (
            format!(
                "ring at {} outside \"{}\": {min} … {max} wells (spacing {:.1} … {:.1} {lu}{})",
                u.length_words(spec.offset, 1),
                model.excavations[spec.excavation].name,
                u.length(model.as_built.min_spacing),
                u.length(model.as_built.max_spacing),
                spacing_basis(model)
            ),
            spec_for(spec, fam, *min),
        ),
        Family::Line { min, max, length } => {
            let both = matches!(
                spec.kind,
                LayoutKind::Line {
                    both_sides: true,
                    ..
                }
            );
            (
                format!(
                    "trench line {} long, {} side{}: {min} … {max} wellpoints per side (spacing {:.2} … {:.2} {lu}{})",
                    u.length_words(*length, 0),
                    if both { "both" } else { "one" },
                    if both { "s" } else { "" },
                    u.length(length / (*min - 1) as f64),
                    u.length(length / (*max - 1).max(1) as f64),
                    spacing_basis(model)
                ),
                spec_for(spec, fam, *min),
            )
        }
        Family::Fixed => ("the given wells: rates only".to_string(), spec.clone()),
    }
}

/// The count search of the design file's family (rates only for a given layout), with other
/// placements tried below the count found.
fn search_counts(
    model: &Model,
    points: &[CheckPoint],
    spec: &LayoutSpec,
    fam: &Family,
    probe_placement: layout::Placement,
    empty: &Design,
    uniform_too: bool,
) -> Result<Found, InputError> {
    let mut search_state = Search {
        model,
        points,
        spec,
        fam,
        cache: BTreeMap::new(),
    };
    let mut notes = Vec::new();
    if matches!(fam, Family::Fixed) {
        let t = try_placement(
            model,
            points,
            spec.clone(),
            probe_placement,
            None,
            0.0,
            true,
        );
        let (i, u) = (t.trial.individual_met, t.trial.uniform_met);
        search_state.cache.insert(0, t);
        let trials = search_state
            .cache
            .values()
            .map(|t| t.trial.clone())
            .collect();
        return Ok(Found {
            cache: search_state.cache,
            trials,
            smallest_individual: i.then_some(0),
            smallest_uniform: u.then_some(0),
            run_i: None,
            run_u: None,
            notes,
        });
    }
    let seed = seed_index(spec, empty.estimate.rough_well_count);
    let i = search_state.smallest(|t| t.individual_met, true, seed)?;
    let u = if uniform_too || i.is_none() {
        search_state.smallest(|t| t.uniform_met, false, seed)?
    } else {
        None
    };
    // The real fewest: below the count found with the design file's placement, other start
    // positions (and the other corner option) of the same count.
    let mut others: Vec<TrialRun> = Vec::new();
    let (i, mut tried_words, run_i) =
        search_state.fewer_by_variants(i, |t| t.individual_met, true, &mut others)?;
    let (u, wu, run_u) =
        search_state.fewer_by_variants(u, |t| t.uniform_met, false, &mut others)?;
    tried_words.extend(wu);
    if !tried_words.is_empty() {
        let mut seen = std::collections::HashSet::new();
        tried_words.retain(|w| seen.insert(w.clone()));
        notes.push(DesignNote::Said(format!(
            "below the count found with the design file's placement, also tried: {}",
            tried_words.join("; ")
        )));
    }
    let cache = search_state.cache;
    let mut trials: Vec<Trial> = cache.values().map(|t| t.trial.clone()).collect();
    trials.extend(others.iter().map(|t| t.trial.clone()));
    // The runs at the smallest indices: a placement found below, else the cached run.
    trials.extend(
        [&run_i, &run_u]
            .into_iter()
            .flatten()
            .map(|r| r.trial.clone()),
    );
    Ok(Found {
        cache,
        trials,
        smallest_individual: i,
        smallest_uniform: u,
        run_i,
        run_u,
        notes,
    })
}

/// Working wells (rate above zero) of a run's individual rates.
fn working_wells(run: &TrialRun) -> usize {
    run.individual.as_ref().map_or(run.trial.count, |i| {
        i.rates.iter().filter(|q| **q > 1e-9).count()
    })
}

/// The fewest wells on candidate positions: used in place of the evenly spaced ring when it
/// needs fewer working wells; both counts and the lower bound go to the notes.
fn free_placement(
    model: &Model,
    points: &[CheckPoint],
    spec: &LayoutSpec,
    free: &crate::input::model::FreePlacementSpec,
    found: &mut Found,
    notes: &mut Vec<DesignNote>,
) -> FreeSummary {
    let even_run = found
        .run_i
        .as_ref()
        .or_else(|| found.smallest_individual.and_then(|n| found.cache.get(&n)));
    let even_count = even_run.map(working_wells);
    let mut summary = FreeSummary {
        count: None,
        lower_bound: None,
        relaxation: None,
        even_count,
        candidates: 0,
        used: false,
    };
    let even_wells = even_run.map(|r| {
        let rates = r
            .individual
            .as_ref()
            .map(|i| i.rates.clone())
            .unwrap_or_default();
        r.placement
            .wells
            .iter()
            .zip(rates)
            .filter(|(_, q)| *q > 1e-9)
            .map(|(w, _)| w.position)
            .collect()
    });
    match placement::fewest(model, points, spec, free, even_wells) {
        Ok(f) => {
            let n = working_wells(&f.run);
            summary.count = Some(n);
            summary.lower_bound = Some(f.lower_bound);
            summary.relaxation = Some(f.relaxation);
            summary.candidates = f.candidates;
            summary.used = even_count.is_none_or(|e| n < e);
            notes.push(DesignNote::Said(format!(
                "fewest wells on {} candidate positions: {n} (no placement on them can have fewer than {} wells: LP relaxation {:.2}; found by rounding the relaxation and removing wells greedily, {} layouts judged); evenly spaced rings: {}; {}",
                f.candidates,
                f.lower_bound,
                f.relaxation,
                f.layouts_judged,
                even_count.map_or("none meets every rule".into(), |e| format!("{e} wells")),
                if summary.used {
                    "the design uses the fewest (placement = \"even\" keeps the evenly spaced ring)"
                } else {
                    "the evenly spaced ring is kept (no fewer wells)"
                }
            )));
            found.trials.push(f.run.trial.clone());
            if summary.used {
                found.run_i = Some(f.run);
                found.smallest_individual = found.smallest_individual.or(Some(0));
            }
        }
        Err(why) => {
            let (c, _) = placement::candidates(model, spec, free);
            summary.candidates = c.len();
            notes.push(DesignNote::Said(format!(
                "fewest wells on candidate positions: none found ({}); the evenly spaced ring stands",
                match why {
                    NoFree::NoCandidates => "keep-out zones cover every candidate".to_string(),
                    NoFree::Infeasible(n) =>
                        format!("even all {n} candidates together cannot meet every rule"),
                    NoFree::NotMet(why) => why,
                }
            )));
        }
    }
    summary
}
