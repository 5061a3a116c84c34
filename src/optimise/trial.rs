//! One layout tried: its row of the count table (and of the sweep), with the words for how it
//! ended, and the lengths its spacing is measured on.

use crate::check::evaluate::TARGET_TOLERANCE;
use crate::field::checkpoints::CheckPoint;
use crate::field::layout::{self, Placement};
use crate::input::error::InputError;
use crate::input::model::{LayoutKind, LayoutSpec, Model};
use crate::input::units::UnitSystem;
use crate::optimise::binding::Binding;
use crate::optimise::individual::Individual;
use crate::optimise::lp_problem::LpStatus;
use crate::optimise::one_out::one_out_report;
use crate::optimise::rates::LayoutRates;
use crate::optimise::uniform::Uniform;
use serde::Serialize;

/// One layout tried: a row of the count table and of the sweep.
#[derive(Debug, Clone, Serialize)]
pub struct Trial {
    /// Number of wells placed.
    pub count: usize,
    /// Wells per side of a trench line (`None` for rings and given layouts).
    pub per_side: Option<usize>,
    /// Spacing along the ring or line, m.
    pub spacing_m: f64,
    /// Smallest uniform rate per well that meets every target, m³/s.
    pub uniform_rate_m3_per_s: Option<f64>,
    /// The check point that sets that rate.
    pub uniform_rate_set_by: String,
    /// Total flow at that rate, m³/s.
    pub uniform_total_m3_per_s: Option<f64>,
    /// Largest uniform rate within the well limits, m³/s.
    pub uniform_limit_m3_per_s: f64,
    /// Least total flow with individual rates, m³/s (when the programme is feasible).
    pub individual_total_m3_per_s: Option<f64>,
    /// How the programme for individual rates ended; `None` when it was not run (worded by
    /// `report::design_text`).
    #[serde(skip)]
    pub individual_status: Option<LpStatus>,
    /// Lowest margin below target with every well at the largest uniform rate its limits allow,
    /// m: positive is reserve, negative a shortfall no uniform rate within the limits removes.
    pub lowest_margin_m: f64,
    /// Where that margin is.
    pub lowest_margin_at: String,
    /// The limit that caps the uniform rate.
    pub binding_limit: Binding,
    /// The uniform rate meets every target within the limits (confirmed by evaluation).
    pub uniform_met: bool,
    /// The individual rates meet every target within the limits (confirmed by evaluation).
    pub individual_met: bool,
    /// Where the first well stands and the corner option ("start 0.0 m", "corner wells").
    pub variant: String,
}

/// A trial with what the design needs to write it out.
#[derive(Debug, Clone)]
pub struct TrialRun {
    /// The table row.
    pub trial: Trial,
    /// The layout that was generated.
    pub spec: LayoutSpec,
    /// Its wells (rate 0) and paths.
    pub placement: Placement,
    /// The individual rates when solved.
    pub individual: Option<Individual>,
}

/// Evaluate one layout `spec` with the uniform rate and, when `with_lp`, individual rates.
pub fn try_layout(
    model: &Model,
    points: &[CheckPoint],
    spec: &LayoutSpec,
    per_side: Option<usize>,
    with_lp: bool,
) -> Result<TrialRun, InputError> {
    let placement = layout::generate(model, spec, 0.0)?;
    let spacing = layout_spacing(model, spec, &placement);
    Ok(try_placement(
        model,
        points,
        spec.clone(),
        placement,
        per_side,
        spacing,
        with_lp,
    ))
}

/// Both rate options of one layout as the design judges them (one well out when the design
/// file asks for it): whether one rate in every well meets, and the individual rates. `rates`
/// should be built on [`crate::optimise::search::design_points`].
pub fn judge(model: &Model, rates: &LayoutRates) -> (bool, Individual) {
    let mut uniform = rates.uniform();
    if model.design.one_well_out && !rates.wells.is_empty() {
        one_out_uniform(rates, &mut uniform, model.design.operating_margin);
    }
    (uniform.met, solve_individual(model, rates))
}

/// The individual rates of `rates` as the design asks: with one well out when the design file
/// asks for it (the operating margin given back with the well out).
pub(super) fn solve_individual(model: &Model, rates: &LayoutRates) -> Individual {
    if model.design.one_well_out {
        let mut ind = rates.individual_one_out(model.design.operating_margin);
        if ind.met {
            ind.met = one_out_report(rates, &ind.rates).is_none_or(|o| {
                o.margin_without_m + model.design.operating_margin >= -TARGET_TOLERANCE
            });
        }
        ind
    } else {
        rates.individual()
    }
}

/// The uniform option with one well out: the rate rises to what the wells left running need,
/// and is met only if that rate is within the limits and the evaluation confirms it.
fn one_out_uniform(rates: &LayoutRates, uniform: &mut Uniform, relax: f64) {
    let Some(need_all) = uniform.needed_m3_per_s else {
        return;
    };
    match rates.uniform_one_out_rate(relax) {
        None => {
            uniform.needed_m3_per_s = None;
            uniform.met = false;
        }
        Some(q) if q > need_all => {
            uniform.needed_m3_per_s = Some(q);
            uniform.met = q <= uniform.limit_m3_per_s && {
                let e = rates.evaluate(&rates.uniform_rates(q));
                e.targets_met && e.wells_ok
            };
        }
        Some(_) => {}
    }
}

pub(super) fn try_placement(
    model: &Model,
    points: &[CheckPoint],
    spec: LayoutSpec,
    placement: Placement,
    per_side: Option<usize>,
    spacing: f64,
    with_lp: bool,
) -> TrialRun {
    crate::work_counts::add(&crate::work_counts::TRIALS, 1);
    let count = placement.wells.len();
    crate::work_counts::trying(count, spacing);
    let rates = LayoutRates::new(model, points, placement.wells.clone());
    let mut uniform = rates.uniform();
    if model.design.one_well_out && count > 0 {
        one_out_uniform(&rates, &mut uniform, model.design.operating_margin);
    }
    let individual = (count > 0 && with_lp).then(|| solve_individual(model, &rates));
    let variant = variant_words(model, &spec);
    let mut run = TrialRun {
        trial: trial_row(
            points,
            count,
            rates.group_of.iter().filter(|g| g.is_some()).count(),
            per_side,
            spacing,
            &uniform,
            None,
        ),
        spec,
        placement,
        individual: None,
    };
    run.trial.variant = variant;
    if let Some(ind) = individual {
        run.set_individual(ind);
    }
    run
}

/// The start position and corner option of a layout, in words.
pub fn variant_words(model: &Model, spec: &LayoutSpec) -> String {
    let start = |decimals| model.units.length_words(spec.start, decimals);
    match &spec.kind {
        LayoutKind::Ring {
            corner_wells: true, ..
        } => "corner wells".into(),
        LayoutKind::Ring { .. } => format!("first well {} along the ring", start(1)),
        LayoutKind::Line { .. } => format!("end points {} inside the line ends", start(2)),
        _ => "as given".into(),
    }
}

impl TrialRun {
    /// Record the individual-rate answer in the run and its table row.
    pub(super) fn set_individual(&mut self, ind: Individual) {
        let t = &mut self.trial;
        t.individual_met = ind.met;
        t.individual_status = Some(ind.status.clone());
        t.individual_total_m3_per_s = (ind.status == LpStatus::Optimal).then_some(ind.total);
        self.individual = Some(ind);
    }
}

impl Trial {
    /// How the layout ended, in words, quantities in `units`.
    pub fn outcome_words(&self, units: UnitSystem) -> String {
        let t = self;
        match (t.uniform_met, t.individual_met) {
            (true, true) => "met (both rate options)".to_string(),
            (false, true) => "met with individual rates only".to_string(),
            (true, false) if t.individual_status.is_none() => {
                "met with the same rate in every well".to_string()
            }
            (true, false) => "met with the same rate in every well only".to_string(),
            (false, false) => {
                if t.count == 0 {
                    "no wells placed".to_string()
                } else if t.uniform_rate_m3_per_s.is_none() {
                    "not met: a target is out of every well's reach".to_string()
                } else {
                    format!("not met: {}", t.binding_limit.words(units))
                }
            }
        }
    }
}

fn trial_row(
    points: &[CheckPoint],
    count: usize,
    pumping: usize,
    per_side: Option<usize>,
    spacing: f64,
    uniform: &Uniform,
    individual: Option<&Individual>,
) -> Trial {
    let ind_met = individual.is_some_and(|i| i.met);
    Trial {
        count,
        per_side,
        spacing_m: spacing,
        uniform_rate_m3_per_s: uniform.needed_m3_per_s,
        uniform_rate_set_by: uniform
            .needed_at
            .map(|i| points[i].name.clone())
            .unwrap_or_default(),
        uniform_total_m3_per_s: uniform.needed_m3_per_s.map(|q| q * pumping as f64),
        uniform_limit_m3_per_s: uniform.limit_m3_per_s,
        individual_total_m3_per_s: individual
            .filter(|i| i.status == LpStatus::Optimal)
            .map(|i| i.total),
        individual_status: individual.map(|i| i.status.clone()),
        lowest_margin_m: uniform.margin_at_limit_m,
        lowest_margin_at: uniform
            .worst_at_limit
            .map(|i| points[i].name.clone())
            .unwrap_or_default(),
        binding_limit: uniform.limit_reason.clone(),
        uniform_met: uniform.met,
        individual_met: ind_met,
        variant: String::new(),
    }
}

/// Mean spacing of a generated layout along its path, m.
fn layout_spacing(model: &Model, spec: &LayoutSpec, placement: &Placement) -> f64 {
    let n = placement.wells.len();
    match &spec.kind {
        LayoutKind::Ring { .. } => {
            let ring =
                layout::offset_ring(&model.excavations[spec.excavation].outline, spec.offset);
            closed_length(&ring) / n.max(1) as f64
        }
        LayoutKind::Line { both_sides, .. } => {
            let per_side = if *both_sides { n / 2 } else { n };
            line_length(model, spec) / (per_side.max(2) - 1) as f64
        }
        _ => 0.0,
    }
}

pub(super) fn closed_length(ring: &[[f64; 2]]) -> f64 {
    let n = ring.len();
    (0..n)
        .map(|i| {
            let (a, b) = (ring[i], ring[(i + 1) % n]);
            (b[0] - a[0]).hypot(b[1] - a[1])
        })
        .sum()
}

/// Length of the line the wellpoints stand on: the centre line extended past each end by the
/// end extension (half-width plus the offset unless the design file says otherwise), as
/// [`layout::line`] places them, m.
pub fn line_length(model: &Model, spec: &LayoutSpec) -> f64 {
    let exc = &model.excavations[spec.excavation];
    let (given, end_ext) = match &spec.kind {
        LayoutKind::Line {
            centre_line,
            end_extension,
            ..
        } => (centre_line.as_ref(), *end_extension),
        _ => (None, None),
    };
    let centre = layout::centre_line(exc, given);
    let open: f64 = centre
        .windows(2)
        .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
        .sum();
    open + 2.0 * layout::end_extension(exc, spec.offset, end_ext)
}

/// One row per placement in a list of trials sorted by count and placement: the count search
/// tries the same placement once for individual rates (with its linear programme) and again
/// for one rate (without), so the list would show it twice, once "not run". The row whose
/// linear programme ran is kept.
pub fn one_row_per_placement(trials: &mut Vec<Trial>) {
    let same = |a: &Trial, b: &Trial| {
        a.count == b.count
            && a.per_side == b.per_side
            && a.variant == b.variant
            && a.spacing_m.to_bits() == b.spacing_m.to_bits()
    };
    let mut kept: Vec<Trial> = Vec::with_capacity(trials.len());
    for t in trials.drain(..) {
        match kept
            .iter_mut()
            .rev()
            .take_while(|k| k.count == t.count)
            .find(|k| same(k, &t))
        {
            Some(k) => {
                if k.individual_status.is_none() && t.individual_status.is_some() {
                    *k = t;
                }
            }
            None => kept.push(t),
        }
    }
    *trials = kept;
}
