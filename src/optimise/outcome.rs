//! How a design ended (met, not met, impossible), the layout it chose, and what is decided from
//! it afterwards: the layout evaluated as `check` evaluates it, and whether every target is met.

use crate::check::run::CheckRun;
use crate::estimate::ExcavationEstimate;
use crate::field::layout::Placement;
use crate::input::model::{LayoutSpec, Model};
use crate::optimise::rates::RateOption;
use crate::optimise::standby::Finish;
use crate::optimise::trial::Trial;
use serde::Serialize;

/// How a design ended.
#[derive(Debug, Clone, Serialize)]
#[serde(tag = "status", rename_all = "kebab-case")]
pub enum Outcome {
    /// Every target met within every limit.
    Met {
        /// Wells in the chosen layout.
        count: usize,
        /// Total flow, m³/s.
        total_flow_m3_per_s: f64,
    },
    /// Computed, but no layout tried meets every target within the limits.
    NotMet {
        /// Wells in the best layout found.
        count: usize,
        /// Its worst check point.
        worst_point: String,
        /// Where.
        position: [f64; 2],
        /// How far the water stays above the target there, m.
        shortfall_m: f64,
    },
    /// No layout of this kind can work, and why.
    Impossible {
        /// In words.
        reason: String,
    },
}

/// The result of `design`.
#[derive(Debug, Clone)]
pub struct Design {
    /// The rate option asked for.
    pub asked: RateOption,
    /// The rate option of the chosen layout.
    pub used: Option<RateOption>,
    /// How it ended.
    pub outcome: Outcome,
    /// Chosen (or best) layout settings.
    pub spec: Option<LayoutSpec>,
    /// Chosen (or best) wells with their rates, and paths.
    pub placement: Option<Placement>,
    /// Every layout tried, by count.
    pub trials: Vec<Trial>,
    /// Smallest count meeting every target with one rate in every well.
    pub smallest_uniform: Option<usize>,
    /// Smallest count meeting every target with individual rates.
    pub smallest_individual: Option<usize>,
    /// Binding constraints of the chosen rates.
    pub binding: Vec<crate::optimise::binding::Binding>,
    /// What was searched, in words.
    pub search: String,
    /// What an engineer should know (SI numbers; worded with
    /// [`crate::optimise::design_notes::DesignNote::words`] in the run's units where shown).
    pub notes: Vec<crate::optimise::design_notes::DesignNote>,
    /// The quick estimate of the layout's excavation.
    pub estimate: ExcavationEstimate,
    /// Idle wells dropped, one well out, standby wells placed (met designs).
    pub finish: Finish,
    /// The fewest-wells placement on candidate positions, when it ran.
    pub free: Option<FreeSummary>,
}

/// What the fewest-wells placement found, beside the evenly spaced rings.
#[derive(Debug, Clone, serde::Serialize)]
pub struct FreeSummary {
    /// Working wells it found (`None`: it found no layout meeting every rule).
    pub count: Option<usize>,
    /// No placement on the candidates has fewer wells (⌈LP relaxation⌉).
    pub lower_bound: Option<usize>,
    /// The LP relaxation's value Σ qⱼ / Cⱼ.
    pub relaxation: Option<f64>,
    /// Working wells of the best evenly spaced ring (`None`: none met).
    pub even_count: Option<usize>,
    /// Candidate positions.
    pub candidates: usize,
    /// The design uses the free placement.
    pub used: bool,
}

/// The layout evaluated for the outputs (chosen or best), as `check` evaluates it.
pub fn final_run<'a>(model: &'a Model, design: &Design) -> Option<CheckRun<'a>> {
    design
        .placement
        .clone()
        .map(|p| crate::check::run::evaluate_placement(model, p))
}

/// Whether the design met every target (exit code 0).
pub fn is_met(design: &Design, run: Option<&CheckRun>) -> bool {
    matches!(design.outcome, Outcome::Met { .. })
        && run.is_some_and(|r| r.evaluation.targets_met && r.evaluation.wells_ok)
}
