//! The findings of the commands other than `check` and `design`: `sweep`, `programme`,
//! `design --by-day` and `pumping-test`, each with its verdict.

use crate::findings::verdict::Verdict;
use crate::optimise::sweep::Sweep;
use crate::test_analysis::{
    fit_cooper_jacob, fit_distance_drawdown, fit_hantush, fit_theis, fit_theis_recovery,
    fit_theis_unconfined, Fit, Method, PumpingTestData,
};
use crate::transient::answers::ProgrammeAnswers;
use crate::transient::by_date::DatedDesign;

/// `sweep`: met when any value of the range meets every target (with one rate or individual
/// rates).
pub fn sweep_verdict(sweep: &Sweep) -> Verdict {
    if sweep
        .trials
        .iter()
        .any(|t| t.uniform_met || t.individual_met)
    {
        Verdict::Met
    } else {
        Verdict::NoValueMeets
    }
}

/// `programme`: a stage that waits for the water is information; one never reached is not
/// met, nor is a well scheduled to pump below its lowest allowed level.
pub fn programme_verdict(answers: &ProgrammeAnswers) -> Verdict {
    let stages_unreached = answers
        .stages
        .iter()
        .filter(|s| s.earliest.is_none())
        .count();
    let well_breaches = answers.well_breaches.len();
    if stages_unreached == 0 && well_breaches == 0 {
        Verdict::Met
    } else {
        Verdict::ProgrammeShort {
            stages_unreached,
            well_breaches,
        }
    }
}

/// `design --by-day`.
pub fn by_day_verdict(d: &DatedDesign) -> Verdict {
    if d.met {
        Verdict::Met
    } else {
        Verdict::DayNotMet
    }
}

/// One method tried on the pumping-test data: its name, and its fit or why it could not be made.
pub type NamedFit = (String, Result<Fit, String>);

/// The findings of `pumping-test`.
pub struct PumpingTestFindings {
    /// The observations and the command-line values.
    pub data: PumpingTestData,
    /// Every method that applies, in order.
    pub fits: Vec<NamedFit>,
    /// Index into `fits` of the fit whose aquifer lines are printed and drawn.
    pub chosen: Option<usize>,
    /// Met when any method fitted.
    pub verdict: Verdict,
}

impl PumpingTestFindings {
    /// Fit `data` (recovery only when `recovery_after`, s of pumping, is given) and choose the
    /// fit of method `prefer`, else the first that succeeded.
    pub fn build(
        data: PumpingTestData,
        recovery_after: Option<f64>,
        prefer: Option<Method>,
    ) -> Self {
        let fits = fits(&data, recovery_after);
        let chosen = chosen(&fits, prefer);
        let verdict = if chosen.is_some() {
            Verdict::Met
        } else {
            Verdict::NoFit
        };
        PumpingTestFindings {
            data,
            fits,
            chosen,
            verdict,
        }
    }

    /// The chosen fit.
    pub fn best(&self) -> Option<&Fit> {
        self.chosen.and_then(|i| self.fits[i].1.as_ref().ok())
    }
}

/// The fits that apply to `data`: recovery only when `recovery_after` (s of pumping) is given;
/// otherwise Theis, Cooper–Jacob, Hantush, unconfined Theis (with a thickness) and
/// distance–drawdown (two or more wells). Each entry is the method's name and its fit or the
/// reason it could not be made.
pub fn fits(data: &PumpingTestData, recovery_after: Option<f64>) -> Vec<NamedFit> {
    if let Some(tp) = recovery_after {
        return vec![("Theis recovery".into(), fit_theis_recovery(data, tp, 0.0))];
    }
    let mut out = vec![
        ("Theis".to_string(), fit_theis(data)),
        ("Cooper–Jacob".to_string(), fit_cooper_jacob(data)),
        ("Hantush–Jacob (leaky)".to_string(), fit_hantush(data)),
    ];
    if data.thickness.is_some() {
        out.push((
            "Theis with Jacob's correction".into(),
            fit_theis_unconfined(data),
        ));
    }
    if data.wells.len() >= 2 {
        out.push(("distance–drawdown".into(), fit_distance_drawdown(data)));
    }
    out
}

/// The fit whose aquifer lines are printed and drawn: the one of method `prefer` when it
/// succeeded, else the first that succeeded (Theis, in the order of [`fits`]). More parameters
/// always fit closer, so the choice is the engineer's, not the least rms.
pub fn chosen(fits: &[NamedFit], prefer: Option<Method>) -> Option<usize> {
    let ok = |i: &usize| fits[*i].1.is_ok();
    (0..fits.len())
        .filter(ok)
        .find(|i| fits[*i].1.as_ref().is_ok_and(|f| Some(f.method) == prefer))
        .or((0..fits.len()).find(ok))
}
