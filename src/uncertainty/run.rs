//! `drydig uncertainty`: sample the uncertain inputs (Latin hypercube), evaluate each sample —
//! the file's layout as `check` does, or the fewest-wells search as `design` does — and collect
//! the distributions, the one-at-a-time swings (tornado) and the robust design.

use crate::input::error::InputError;
use crate::input::model::Model;
use crate::input::model_uncertainty::{UncertainInput, Uncertainty};
use crate::optimise::rates::RateOption;
use crate::uncertainty::apply::apply;
use crate::uncertainty::check_samples::{evaluate_sample, CheckSample, Layout};
use crate::uncertainty::days_to_dig::DigStages;
use crate::uncertainty::design_samples::{design_sample, robust, DesignSample, Robust};
use crate::uncertainty::fast_check::FastCheck;
use crate::uncertainty::sampling::sample_values;
use crate::uncertainty::stats::{
    bootstrap_convergence, percentiles, replicate_spread, Convergence, Percentiles,
};
use rayon::prelude::*;
use serde::Serialize;

/// Resamples of the bootstrap behind the convergence figure.
pub const BOOTSTRAP_RESAMPLES: usize = 1000;

/// Further Latin hypercubes (other seeds) drawn in check mode to measure how far P90 moves.
pub const REPLICATES: usize = 7;

/// Which command's question is asked of each sample.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Mode {
    /// The file's layout at its rates.
    Check,
    /// The fewest wells and their rates.
    Design,
}

/// What an output measures (decides its unit in reports).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Measure {
    /// A flow, m³/s.
    Flow,
    /// A length or drawdown, m.
    Length,
    /// A settlement, m (shown in mm).
    Settlement,
    /// A count of wells.
    Count,
    /// A time, s (shown in days).
    Duration,
}

/// One sampled output.
#[derive(Debug, Clone, Serialize)]
pub struct Series {
    /// Machine name (CSV column stem, file name of its chart).
    pub key: String,
    /// Words for people.
    pub label: String,
    /// Its measure.
    pub measure: Measure,
    /// One value per sample (`None`: not computed for that sample).
    pub values: Vec<Option<f64>>,
    /// P10 / P50 / P90.
    pub percentiles: Option<Percentiles>,
}

impl Series {
    fn new(key: String, label: String, measure: Measure, values: Vec<Option<f64>>) -> Series {
        let percentiles = percentiles(values.iter().flatten().copied());
        Series {
            key,
            label,
            measure,
            values,
            percentiles,
        }
    }
}

/// One input's swing: the output with that input at its P10 and at its P90, the others at P50.
#[derive(Debug, Clone, Serialize)]
pub struct Swing {
    /// The input.
    pub input: String,
    /// Its P10 and P90 values (SI).
    pub input_p10: f64,
    /// P90 value.
    pub input_p90: f64,
    /// The output with the input at P10.
    pub at_p10: Option<f64>,
    /// The output with the input at P90.
    pub at_p90: Option<f64>,
}

/// Everything `drydig uncertainty` found.
#[derive(Debug, Clone)]
pub struct UncertaintyRun {
    /// Check or design.
    pub mode: Mode,
    /// The uncertain inputs.
    pub inputs: Vec<UncertainInput>,
    /// Samples.
    pub samples: usize,
    /// Seed.
    pub seed: u64,
    /// Rank correlation of K and S asked.
    pub rank_correlation: Option<f64>,
    /// Sampled values `[sample][input]`, SI.
    pub values: Vec<Vec<f64>>,
    /// The outputs.
    pub series: Vec<Series>,
    /// The output of the tornado (its key in `series`), its value with every input at P50, and
    /// the swings, largest first.
    pub tornado: (String, Option<f64>, Vec<Swing>),
    /// Per sample: every target met (check: the given rates, with every well within its limits;
    /// design: a layout meets every target).
    pub sample_met: Vec<bool>,
    /// Fraction of samples with every target met (check: the given rates; design: a layout
    /// was found that meets every target).
    pub fraction_met: f64,
    /// Fraction of samples with every well within its limits (check).
    pub fraction_wells_ok: Option<f64>,
    /// Samples in which a well breaks a limit (check; counted as not met).
    pub wells_past_limit: usize,
    /// The design with every input at its P50 (wells, flow m³/s), design mode.
    pub p50_design: Option<(usize, f64)>,
    /// The robust design (design mode).
    pub robust: Option<Robust>,
    /// The reliability asked, 0 … 1.
    pub reliability: f64,
    /// The file's contingency fraction.
    pub contingency: f64,
    /// P90 flow ÷ P50 flow of the flow output.
    pub implied_ratio: Option<f64>,
    /// How settled the P90 of the flow output is (bootstrap, [`BOOTSTRAP_RESAMPLES`]).
    pub convergence: Option<Convergence>,
    /// Names of the neighbours (check mode columns).
    pub neighbours: Vec<String>,
    /// Whether the file has a `[programme]`.
    pub has_programme: bool,
    /// Days to dig were sampled (check mode with a `[programme]` that can be set up): each
    /// stage's name and the samples in which it is not ready within the programme.
    pub days_not_ready: Option<Vec<(String, usize)>>,
}

/// Settings of one run.
#[derive(Debug, Clone, Copy)]
pub struct Settings {
    /// Check or design.
    pub mode: Mode,
    /// Samples (overrides the file's).
    pub samples: Option<usize>,
    /// Seed (overrides the file's).
    pub seed: Option<u64>,
    /// Reliability asked for the robust design, 0 … 1.
    pub reliability: f64,
    /// Rate option of the design.
    pub rates: RateOption,
}

/// The `[uncertainty]` of `model`, or an error naming the section.
pub fn spec_of(model: &Model) -> Result<&Uncertainty, InputError> {
    model.uncertainty.as_ref().ok_or_else(|| InputError {
        file: model.file.clone(),
        field: "uncertainty".into(),
        line: None,
        message: "the design file has no [uncertainty] section: add one, e.g. [uncertainty] conductivity = \"lognormal median 2e-4 m/s, factor 3\"".into(),
    })
}

/// The model with every uncertain input at quantile `u_of(j)`.
fn at_quantiles(model: &Model, spec: &Uncertainty, u_of: impl Fn(usize) -> f64) -> Model {
    let v: Vec<f64> = spec
        .inputs
        .iter()
        .enumerate()
        .map(|(j, i)| i.distribution.quantile(u_of(j)))
        .collect();
    apply(model, spec, &v)
}

/// Run the samples of `model` with `settings`; `tick` is called once per sample evaluated.
pub fn run(
    model: &Model,
    settings: Settings,
    tick: &(dyn Fn() + Sync),
) -> Result<UncertaintyRun, InputError> {
    let spec = spec_of(model)?;
    let n = settings.samples.unwrap_or(spec.samples);
    let seed = settings.seed.unwrap_or(spec.seed);
    let values = sample_values(spec, n, seed);
    let models: Vec<Model> = values.iter().map(|v| apply(model, spec, v)).collect();
    let median = at_quantiles(model, spec, |_| 0.5);
    let swing_models: Vec<(Model, Model)> = (0..spec.inputs.len())
        .map(|j| {
            let at = |p: f64| at_quantiles(model, spec, |k| if k == j { p } else { 0.5 });
            (at(0.1), at(0.9))
        })
        .collect();
    let mut out = UncertaintyRun {
        mode: settings.mode,
        inputs: spec.inputs.clone(),
        samples: n,
        seed,
        rank_correlation: spec.rank_correlation,
        values,
        series: Vec::new(),
        tornado: (String::new(), None, Vec::new()),
        sample_met: Vec::new(),
        fraction_met: 0.0,
        fraction_wells_ok: None,
        wells_past_limit: 0,
        p50_design: None,
        robust: None,
        reliability: settings.reliability,
        contingency: model.contingency,
        implied_ratio: None,
        convergence: None,
        neighbours: model.neighbours.iter().map(|n| n.name.clone()).collect(),
        has_programme: model.programme.is_some(),
        days_not_ready: None,
    };
    let blank = out.clone();
    match settings.mode {
        Mode::Check => check_mode(model, &models, &median, &swing_models, tick, &mut out)?,
        Mode::Design => design_mode(
            model,
            &models,
            &median,
            &swing_models,
            settings,
            tick,
            &mut out,
        ),
    }
    let flow = out.series.first().and_then(|s| s.percentiles);
    out.implied_ratio = flow.filter(|p| p.p50 > 0.0).map(|p| p.p90 / p.p50);
    out.convergence = out.series.first().and_then(|s| {
        let v: Vec<f64> = s.values.iter().flatten().copied().collect();
        bootstrap_convergence(&v, 0.9, BOOTSTRAP_RESAMPLES, seed)
    });
    if let (Mode::Check, Some(c), Some(p)) = (settings.mode, out.convergence.as_mut(), flow) {
        // The same sampling repeated with other seeds: the run's P90 first, then each repeat's.
        // Only the flow's P90 is read: days to dig are left out of the repeats.
        let mut base = model.clone();
        base.programme = None;
        let mut p90s = vec![p.p90];
        for k in 1..=REPLICATES as u64 {
            let seed_k = seed.wrapping_add(k.wrapping_mul(0x9E37_79B9_7F4A_7C15));
            let mut rep = blank.clone();
            rep.values = sample_values(spec, n, seed_k);
            let models_k: Vec<Model> = rep.values.iter().map(|v| apply(&base, spec, v)).collect();
            check_mode(&base, &models_k, &median, &[], &|| {}, &mut rep)?;
            if let Some(q) = rep.series.first().and_then(|s| s.percentiles) {
                p90s.push(q.p90);
            }
        }
        c.replicates = replicate_spread(&p90s);
    }
    let names: Vec<String> = spec
        .inputs
        .iter()
        .map(|i| i.kind.field().to_string())
        .collect();
    for (s, name) in out.tornado.2.iter_mut().zip(names) {
        s.input = name;
    }
    let base = out.tornado.1;
    out.tornado.2.sort_by(|a, b| {
        let w = |s: &Swing| {
            let (l, h) = (s.at_p10.or(base), s.at_p90.or(base));
            match (l, h) {
                (Some(l), Some(h)) => (h - l).abs(),
                _ => f64::INFINITY,
            }
        };
        w(b).total_cmp(&w(a))
    });
    Ok(out)
}

fn check_mode(
    model: &Model,
    models: &[Model],
    median: &Model,
    swing_models: &[(Model, Model)],
    tick: &(dyn Fn() + Sync),
    out: &mut UncertaintyRun,
) -> Result<(), InputError> {
    let placement = crate::field::layout::from_model(model, None)?;
    if placement.wells.is_empty() || placement.wells.iter().all(|w| w.rate == 0.0) {
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "uncertainty of a given layout needs wells with rates ([layout] with a rate, or listed wells); use --design to sample the design instead".into(),
        });
    }
    let layout = Layout::new(model, placement.wells);
    let fast = FastCheck::new(model, spec_of(model)?, &layout);
    let one = |m: &Model| {
        fast.as_ref()
            .and_then(|f| f.evaluate(m))
            .unwrap_or_else(|| evaluate_sample(m, &layout))
    };
    let samples: Vec<CheckSample> = models
        .par_iter()
        .map(|m| {
            let s = one(m);
            tick();
            s
        })
        .collect();
    let col = |f: &dyn Fn(&CheckSample) -> Option<f64>| samples.iter().map(f).collect::<Vec<_>>();
    out.series.push(Series::new(
        "flow_needed".into(),
        "flow the layout needs".into(),
        Measure::Flow,
        col(&|s| s.needed_flow_m3_per_s),
    ));
    out.series.push(Series::new(
        "lowest_margin".into(),
        "lowest margin at the given rates".into(),
        Measure::Length,
        col(&|s| s.lowest_margin_m),
    ));
    out.series.push(Series::new(
        "radius_of_influence".into(),
        "radius of influence".into(),
        Measure::Length,
        col(&|s| Some(s.radius_m)),
    ));
    for (k, name) in out.neighbours.clone().iter().enumerate() {
        out.series.push(Series::new(
            format!("drawdown_{}", k + 1),
            format!("drawdown at {name}"),
            Measure::Length,
            col(&|s| s.neighbours.get(k).map(|n| n.0)),
        ));
        if samples
            .iter()
            .any(|s| s.neighbours.get(k).is_some_and(|n| n.1.is_some()))
        {
            out.series.push(Series::new(
                format!("settlement_{}", k + 1),
                format!("settlement at {name}"),
                Measure::Settlement,
                col(&|s| s.neighbours.get(k).and_then(|n| n.1)),
            ));
        }
    }
    days_to_dig(model, models, out);
    // a sample is met only when the wells can also deliver their rates (the limits `check`
    // applies: capacity, lowest level, suction)
    out.sample_met = samples
        .iter()
        .map(|s| s.targets_met && s.wells_ok != Some(false))
        .collect();
    out.wells_past_limit = samples.iter().filter(|s| s.wells_ok == Some(false)).count();
    let n = samples.len().max(1) as f64;
    out.fraction_met = out.sample_met.iter().filter(|m| **m).count() as f64 / n;
    out.fraction_wells_ok = samples
        .iter()
        .map(|s| s.wells_ok)
        .collect::<Option<Vec<bool>>>()
        .map(|ok| ok.iter().filter(|o| **o).count() as f64 / n);
    let flow = |m: &Model| one(m).needed_flow_m3_per_s;
    let swings = swing_models
        .par_iter()
        .map(|(lo, hi)| Swing {
            input: String::new(),
            input_p10: 0.0,
            input_p90: 0.0,
            at_p10: flow(lo),
            at_p90: flow(hi),
        })
        .collect();
    out.tornado = ("flow_needed".into(), flow(median), swings);
    fill_swing_inputs(out);
    Ok(())
}

fn design_mode(
    model: &Model,
    models: &[Model],
    median: &Model,
    swing_models: &[(Model, Model)],
    settings: Settings,
    tick: &(dyn Fn() + Sync),
    out: &mut UncertaintyRun,
) {
    let designs: Vec<DesignSample> = models
        .par_iter()
        .map(|m| {
            let d = design_sample(m, settings.rates);
            tick();
            d
        })
        .collect();
    out.series.push(Series::new(
        "design_flow".into(),
        "flow of the fewest-wells design".into(),
        Measure::Flow,
        designs
            .iter()
            .map(|d| d.total_flow_m3_per_s.filter(|_| d.met))
            .collect(),
    ));
    out.series.push(Series::new(
        "design_wells".into(),
        "fewest wells".into(),
        Measure::Count,
        designs
            .iter()
            .map(|d| d.wells.filter(|_| d.met).map(|w| w as f64))
            .collect(),
    ));
    out.sample_met = designs.iter().map(|d| d.met).collect();
    out.fraction_met =
        designs.iter().filter(|d| d.met).count() as f64 / designs.len().max(1) as f64;
    let d50 = design_sample(median, settings.rates);
    out.p50_design = d50.wells.zip(d50.total_flow_m3_per_s).filter(|_| d50.met);
    let swings = swing_models
        .par_iter()
        .map(|(lo, hi)| {
            let f = |m: &Model| {
                let d = design_sample(m, settings.rates);
                d.total_flow_m3_per_s.filter(|_| d.met)
            };
            Swing {
                input: String::new(),
                input_p10: 0.0,
                input_p90: 0.0,
                at_p10: f(lo),
                at_p90: f(hi),
            }
        })
        .collect();
    out.tornado = ("design_flow".into(), out.p50_design.map(|d| d.1), swings);
    fill_swing_inputs(out);
    out.robust = robust(model, models, &designs, settings.reliability);
}

/// Days to dig of each stage on every sample (a file with a `[programme]`): one series per
/// stage, in seconds (`None` where the stage is not ready within the programme).
fn days_to_dig(model: &Model, models: &[Model], out: &mut UncertaintyRun) {
    let Some(dig) = DigStages::new(model) else {
        return;
    };
    let per_sample: Vec<Option<Vec<Option<f64>>>> =
        models.par_iter().map(|m| dig.earliest(m)).collect();
    let mut not_ready = Vec::new();
    for (k, name) in dig.names().into_iter().enumerate() {
        let values: Vec<Option<f64>> = per_sample
            .iter()
            .map(|s| s.as_ref().and_then(|v| v.get(k).copied().flatten()))
            .collect();
        not_ready.push((name.clone(), values.iter().filter(|v| v.is_none()).count()));
        out.series.push(Series::new(
            format!("days_to_dig_{}", k + 1),
            format!("days to dig: {name}"),
            Measure::Duration,
            values,
        ));
    }
    out.days_not_ready = Some(not_ready);
}

/// Each swing's input values at P10 and P90 (the swings are in the order of the inputs here).
fn fill_swing_inputs(out: &mut UncertaintyRun) {
    for (s, i) in out.tornado.2.iter_mut().zip(&out.inputs) {
        s.input_p10 = i.distribution.quantile(0.1);
        s.input_p90 = i.distribution.quantile(0.9);
    }
}
