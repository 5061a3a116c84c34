//! Neighbouring buildings: drawdown under each footprint, the pore-pressure change through each
//! soil column ([`crate::safety::pore_pressure`]), settlement by one-dimensional consolidation,
//! final and at the end of the works ([`crate::safety::settlement`]), differential settlement,
//! angular distortion and deflection ratio along each side ([`crate::safety::distortion`]), and
//! pass/fail against the building's limits.
//!
//! Each footprint is sampled at its corners, along its sides and on a small interior grid; the
//! level at every sample comes from the same superposition as the excavation ([`Field::level`]).
//! Settlement at a sample is the settlement of the soil column listed under the building (top down
//! from its foundation level, or from ground level when none is given) for the drawdown there.
//! Angular distortion along a side is β = |ρ_a − ρ_b|/L between its two corners.
//!
//! **In time.** The water stays lowered for the neighbour's `dewatering_duration`, or else the
//! programme's duration; clay layers with c_v reach U(T_v) of their final settlement by then
//! (Terzaghi), layers without c_v their final value (an upper bound, said in the notes). The
//! settlement checked, and the distortion, are those at the end of the works when a duration is
//! known (consolidation all but stops once the water is back), else the final ones.
//!
//! Where the design file gives no settlement or distortion limit, labelled rules of thumb for
//! buildings on shallow footings are used instead: 25 mm total settlement and β = 1/500 (common
//! practice (no source); 1/500 is usually credited to Bjerrum (1963), from memory). There is no
//! rule of thumb for drawdown: without `allowable_drawdown` the drawdown is reported, not checked.

use crate::check::run::CheckRun;
use crate::field::influence::Field;
use crate::input::model::{Model, Neighbour};
use crate::physics::building_damage::Category;
use crate::physics::potential::Level;
use crate::safety::distortion::{self, Side};
use crate::safety::limit_check::{LimitBasis, LimitCheck, LimitQuantity, RechargeLimitBasis};
use crate::safety::pore_pressure::{self, HeadDrop};
use crate::safety::settlement::{self, StressForm};
use geo::{BoundingRect, Contains, Point};
use serde::Serialize;

/// Rule-of-thumb total settlement for a building on shallow footings, m.
pub const RULE_OF_THUMB_SETTLEMENT: f64 = 0.025;
/// Rule-of-thumb angular distortion for a building on shallow footings.
pub const RULE_OF_THUMB_DISTORTION: f64 = 1.0 / 500.0;
/// Rule-of-thumb rise of the water above its original level under a neighbour, m, beside
/// recharge wells (common practice (no source): cellars and services were built for the old
/// level).
pub const RULE_OF_THUMB_RISE: f64 = 0.3;
/// Label of the rule-of-thumb rise above the original level.
pub const RULE_OF_THUMB_RISE_LABEL: &str =
    "rise above the original level, common practice (no source)";
/// Label carried beside every rule-of-thumb limit.
pub const RULE_OF_THUMB_LABEL: &str =
    "rule of thumb for buildings on shallow footings, common practice (no source)";
/// Utilisation (value ÷ limit) from which a passing neighbour is shown as close to its limit.
pub const CLOSE_UTILISATION: f64 = 0.8;
/// Most interior grid points per neighbour.
const MAX_INTERIOR: usize = 400;

/// Where a sample point lies on the footprint.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum SampleKind {
    /// A vertex of the footprint.
    Corner,
    /// On a side between vertices.
    Edge,
    /// Inside the footprint.
    Interior,
}

/// One sample point under a neighbour.
#[derive(Debug, Clone, Serialize)]
pub struct Sample {
    /// "corner 1", "side 2.3", "inside 14".
    pub name: String,
    /// Kind.
    pub kind: SampleKind,
    /// Position, m.
    pub position: [f64; 2],
    /// Water level after pumping, m (`None`: aquifer pumped dry here).
    pub level_m: Option<f64>,
    /// Drawdown, m (negative: the level rises, e.g. beside a recharge well).
    pub drawdown_m: f64,
    /// Settlement checked, m: at the end of the works when a duration is known, else final
    /// (`None`: no soil profile given).
    pub settlement_m: Option<f64>,
    /// Final (fully consolidated) settlement, m.
    pub settlement_final_m: Option<f64>,
}

/// Outcome for one neighbour.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Status {
    /// Every check within its limit and below [`CLOSE_UTILISATION`].
    Pass,
    /// Every check within its limit, one of them at [`CLOSE_UTILISATION`] or more.
    Close,
    /// Some check over its limit.
    Fail,
    /// Nothing to check against (no drawdown limit, no soil profile).
    NotChecked,
}

impl Status {
    /// Word for tables.
    pub fn word(self) -> &'static str {
        match self {
            Status::Pass => "pass",
            Status::Close => "pass (close)",
            Status::Fail => "FAIL",
            Status::NotChecked => "not checked",
        }
    }
}

/// Everything found for one neighbour.
#[derive(Debug, Clone, Serialize)]
pub struct NeighbourResult {
    /// Name.
    pub name: String,
    /// Footprint vertices, m.
    pub footprint: Vec<[f64; 2]>,
    /// Level the soil profile is counted down from, m.
    pub profile_top_m: f64,
    /// "foundation level" or "ground level (no foundation_level given)".
    pub profile_top_basis: String,
    /// "simple (γ_w·Δh)" or "buoyancy-loss".
    pub stress_change: String,
    /// Samples at the corners.
    pub corners: Vec<Sample>,
    /// The sample with the largest drawdown.
    pub worst_drawdown: Sample,
    /// The sample with the largest settlement, when a profile is given.
    pub worst_settlement: Option<Sample>,
    /// Sides between corners, when a profile is given.
    pub sides: Vec<Side>,
    /// Largest differential settlement between corners, m.
    pub max_differential_m: Option<f64>,
    /// Largest angular distortion along a side.
    pub max_distortion: Option<f64>,
    /// The checks made.
    pub checks: Vec<LimitCheck>,
    /// Overall.
    pub status: Status,
    /// Largest utilisation over the checks.
    pub utilisation: Option<f64>,
    /// The time the water stays lowered, s, and where it comes from, when known.
    pub works_duration: Option<(f64, String)>,
    /// Largest final settlement, m, when a profile is given.
    pub max_final_settlement_m: Option<f64>,
    /// Largest settlement at the end of the works, m, when a profile and a duration are given.
    pub max_end_of_works_settlement_m: Option<f64>,
    /// Some settling layer has no c_v, so the value at the end of the works is an upper bound.
    pub end_of_works_upper_bound: bool,
    /// The soil column under the worst-settling sample: pore pressure and settlement by layer.
    pub column: Vec<ColumnLayer>,
    /// Largest deflection ratio Δ/L along a side.
    pub max_deflection_ratio: Option<f64>,
    /// The worst category of damage over the sides (information), with its side and strain.
    pub damage: Option<(Category, String, f64)>,
    /// What an engineer should know about the numbers.
    pub notes: Vec<String>,
    /// How many points were sampled.
    pub sample_count: usize,
    /// Every sample (for maps and CSV).
    #[serde(skip)]
    pub samples: Vec<Sample>,
}

/// One layer of a neighbour's soil column at its worst-settling sample.
#[derive(Debug, Clone, Serialize)]
pub struct ColumnLayer {
    /// Name.
    pub name: String,
    /// Level of its top and base, m.
    pub top_m: f64,
    /// Level of its base, m.
    pub base_m: f64,
    /// Does not compress.
    pub incompressible: bool,
    /// Head drop at its top and base, m.
    pub head_drop: HeadDrop,
    /// Pore-pressure change at its top, middle and base, kPa.
    pub du_kpa: [f64; 3],
    /// Effective-stress change at mid-layer, kPa.
    pub dsigma_mid_kpa: f64,
    /// Final settlement, m.
    pub final_m: f64,
    /// Degree of consolidation at the end of the works (`None`: no c_v or no duration).
    pub degree_at_end: Option<f64>,
}

/// The points a footprint is sampled at: corners, points along each side, an interior grid.
pub fn sample_points(footprint: &geo::Polygon<f64>) -> Vec<(String, SampleKind, [f64; 2])> {
    let ring = &footprint.exterior().0;
    let n = ring.len().saturating_sub(1);
    let mut out = Vec::new();
    for (i, c) in ring.iter().take(n).enumerate() {
        out.push((format!("corner {}", i + 1), SampleKind::Corner, [c.x, c.y]));
    }
    for (i, w) in ring.windows(2).enumerate() {
        let len = (w[1].x - w[0].x).hypot(w[1].y - w[0].y);
        let step = (len / 10.0).clamp(0.5, 2.0);
        let m = (len / step).ceil().max(1.0) as usize;
        for j in 1..m {
            let t = j as f64 / m as f64;
            out.push((
                format!("side {}.{}", i + 1, j),
                SampleKind::Edge,
                [
                    w[0].x + t * (w[1].x - w[0].x),
                    w[0].y + t * (w[1].y - w[0].y),
                ],
            ));
        }
    }
    if let Some(bb) = footprint.bounding_rect() {
        let span = bb.width().max(bb.height());
        let mut h = (span / 12.0).max(0.5);
        while (bb.width() / h + 1.0) * (bb.height() / h + 1.0) > MAX_INTERIOR as f64 {
            h *= 1.25;
        }
        let nx = (bb.width() / h).floor() as usize + 1;
        let ny = (bb.height() / h).floor() as usize + 1;
        let x0 = bb.min().x + (bb.width() - (nx - 1) as f64 * h) / 2.0;
        let y0 = bb.min().y + (bb.height() - (ny - 1) as f64 * h) / 2.0;
        let mut k = 0;
        for j in 0..ny {
            for i in 0..nx {
                let p = [x0 + i as f64 * h, y0 + j as f64 * h];
                if footprint.contains(&Point::new(p[0], p[1])) {
                    k += 1;
                    out.push((format!("inside {k}"), SampleKind::Interior, p));
                }
            }
        }
    }
    out
}

/// The form of Δσ′ a neighbour uses.
pub fn stress_form(n: &Neighbour) -> StressForm {
    if n.buoyancy_loss {
        StressForm::BuoyancyLoss
    } else {
        StressForm::Simple
    }
}

/// Level the neighbour's soil profile starts from, m, and why.
pub fn profile_top(model: &Model, n: &Neighbour) -> (f64, String) {
    match n.foundation_level {
        Some(z) => (z, "foundation level".into()),
        None => (
            model.ground_level,
            "ground level (no foundation_level given)".into(),
        ),
    }
}

/// The neighbour's soil column where the aquifer's level falls to `h1` (m): pore pressure by
/// layer from today's single aquifer, and the settlement.
pub fn column_at(model: &Model, n: &Neighbour, h1: f64) -> settlement::ColumnSettlement {
    let (top, _) = profile_top(model, n);
    let water = pore_pressure::single_aquifer(&n.layers, top, &model.aquifer, h1);
    settlement::column_with_water(&n.layers, top, &water, stress_form(n))
}

/// Final settlement (m) of the neighbour's soil column where the level falls from the initial
/// level to `h1` (`h0` is the aquifer's initial level, kept for callers).
pub fn settlement_at(model: &Model, n: &Neighbour, _h0: f64, h1: f64) -> Option<f64> {
    if n.layers.is_empty() {
        return None;
    }
    Some(column_at(model, n, h1).total)
}

/// How long the water stays lowered under `n`, s, and where that comes from.
pub fn works_duration(model: &Model, n: &Neighbour) -> Option<(f64, String)> {
    match (n.dewatering_duration, &model.programme) {
        (Some(t), _) => Some((t, "dewatering_duration (design file)".into())),
        (None, Some(p)) => Some((p.duration, "end of the programme's pumping".into())),
        (None, None) => None,
    }
}

/// The settlement limit in force (m) and its basis.
pub fn settlement_limit(n: &Neighbour) -> (f64, LimitBasis) {
    match n.allowable_settlement {
        Some(v) => (v, LimitBasis::DesignFile),
        None => (
            RULE_OF_THUMB_SETTLEMENT,
            LimitBasis::RuleOfThumb(RULE_OF_THUMB_LABEL),
        ),
    }
}

/// The distortion limit in force and its basis.
pub fn distortion_limit(n: &Neighbour) -> (f64, LimitBasis) {
    match n.allowable_distortion {
        Some(v) => (v, LimitBasis::DesignFile),
        None => (
            RULE_OF_THUMB_DISTORTION,
            LimitBasis::RuleOfThumb(RULE_OF_THUMB_LABEL),
        ),
    }
}

/// The drawdown a neighbour may take everywhere under it, m, for sizing recharge: the smaller of
/// its allowable drawdown and the uniform drawdown that settles it by its settlement limit.
/// `None` when neither limits it.
pub fn drawdown_limit_for_recharge(
    model: &Model,
    n: &Neighbour,
) -> Option<(f64, RechargeLimitBasis)> {
    let h0 = model.aquifer.initial_level;
    let mut best: Option<(f64, RechargeLimitBasis)> = n
        .allowable_drawdown
        .map(|s| (s, RechargeLimitBasis::AllowableDrawdown));
    if !n.layers.is_empty() {
        let (limit, basis) = settlement_limit(n);
        let max_s = (h0 - model.aquifer.base_level).max(0.0);
        let rho = |s: f64| column_at(model, n, h0 - s).total;
        if let Some(s) = settlement::drawdown_for_settlement(rho, limit, max_s) {
            if best.as_ref().is_none_or(|(b, _)| s < *b) {
                best = Some((
                    s,
                    RechargeLimitBasis::Settlement {
                        limit_m: limit,
                        basis,
                    },
                ));
            }
        }
    }
    best
}

/// Samples under the footprint with their levels, drawdowns and settlements (final and at the
/// end of the works), the column of the worst-settling one, and whether a compressible layer
/// reaches into the dewatered zone.
fn sample_all(
    model: &Model,
    field: &Field,
    rates: &[f64],
    n: &Neighbour,
    duration: Option<f64>,
) -> (
    Vec<Sample>,
    Option<(settlement::ColumnSettlement, f64)>,
    bool,
    bool,
) {
    let aq = field.aquifer();
    let h0 = aq.initial_level;
    let pts = sample_points(&n.footprint);
    let positions: Vec<[f64; 2]> = pts.iter().map(|p| p.2).collect();
    let levels = field.levels(&positions, rates);
    let mut in_zone = false;
    let mut upper_bound = false;
    let mut worst: Option<(settlement::ColumnSettlement, f64)> = None;
    let samples = pts
        .into_iter()
        .zip(levels)
        .map(|((name, kind, position), lv)| {
            let h1 = lv.or_base(aq.base_level);
            let (settlement_m, settlement_final_m) = if n.layers.is_empty() {
                (None, None)
            } else {
                let c = column_at(model, n, h1);
                in_zone |= c.compressible_in_dewatered_zone;
                let at_end = duration.map(|t| {
                    let (v, ub) = settlement::at_time(&n.layers, &c.per_layer, t);
                    upper_bound |= ub;
                    v
                });
                let checked = at_end.unwrap_or(c.total);
                if worst
                    .as_ref()
                    .is_none_or(|(w, _)| c.total > w.total + 1e-12)
                {
                    worst = Some((c.clone(), h0 - h1));
                }
                (Some(checked), Some(c.total))
            };
            Sample {
                name,
                kind,
                position,
                level_m: match lv {
                    Level::Wet(z) => Some(z),
                    Level::Dry => None,
                },
                drawdown_m: h0 - h1,
                settlement_m,
                settlement_final_m,
            }
        })
        .collect();
    (samples, worst, in_zone, upper_bound)
}

/// The soil column of the worst-settling sample, layer by layer.
fn column_layers(
    model: &Model,
    n: &Neighbour,
    c: &settlement::ColumnSettlement,
    drawdown: f64,
    duration: Option<f64>,
) -> Vec<ColumnLayer> {
    let (top, _) = profile_top(model, n);
    let water = pore_pressure::single_aquifer(
        &n.layers,
        top,
        &model.aquifer,
        model.aquifer.initial_level - drawdown,
    );
    let mut z = top;
    n.layers
        .iter()
        .zip(&c.layers)
        .zip(&water.drops)
        .map(|((l, ls), &drop)| {
            let layer = ColumnLayer {
                name: l.name.clone(),
                top_m: z,
                base_m: z - l.thickness,
                incompressible: matches!(
                    l.compressibility,
                    crate::input::model::Compressibility::Incompressible
                ),
                head_drop: drop,
                du_kpa: ls.du_kpa,
                dsigma_mid_kpa: ls.dsigma_mid_kpa,
                final_m: ls.final_m,
                degree_at_end: match (l.consolidation, duration) {
                    (Some(cr), Some(t)) => Some(crate::physics::consolidation::average_degree(
                        crate::physics::consolidation::time_factor(
                            cr.cv,
                            t,
                            crate::physics::consolidation::drainage_path(l.thickness, cr.drainage),
                        ),
                    )),
                    _ => None,
                },
            };
            z -= l.thickness;
            layer
        })
        .collect()
}

/// Each side of the footprint from the samples along it (corners and side points, in order).
fn footprint_sides(samples: &[Sample], corners: &[Sample], height: Option<f64>) -> Vec<Side> {
    let value = |s: &Sample| s.settlement_m.unwrap_or(0.0);
    (0..corners.len())
        .map(|i| {
            let a = &corners[i];
            let b = &corners[(i + 1) % corners.len()];
            let dist =
                |s: &Sample| (s.position[0] - a.position[0]).hypot(s.position[1] - a.position[1]);
            let prefix = format!("side {}.", i + 1);
            let mut profile = vec![(0.0, value(a))];
            profile.extend(
                samples
                    .iter()
                    .filter(|s| s.kind == SampleKind::Edge && s.name.starts_with(&prefix))
                    .map(|s| (dist(s), value(s))),
            );
            profile.push((dist(b), value(b)));
            distortion::side(
                format!("corner {}–{}", i + 1, (i + 1) % corners.len() + 1),
                &profile,
                height,
            )
        })
        .collect()
}

fn max_of(values: impl Iterator<Item = f64>) -> Option<f64> {
    values.fold(None, |acc: Option<f64>, b| {
        Some(acc.map_or(b, |a| a.max(b)))
    })
}

/// Assess one neighbour for the wells of `field` at `rates` (m³/s).
pub fn assess_one(model: &Model, field: &Field, rates: &[f64], n: &Neighbour) -> NeighbourResult {
    let h0 = field.aquifer().initial_level;
    let (top, top_basis) = profile_top(model, n);
    let works = works_duration(model, n);
    let duration = works.as_ref().map(|w| w.0);
    let (samples, worst_column, in_zone, upper_bound) =
        sample_all(model, field, rates, n, duration);
    let corners: Vec<Sample> = samples
        .iter()
        .filter(|s| s.kind == SampleKind::Corner)
        .cloned()
        .collect();
    let worst_drawdown = samples
        .iter()
        .max_by(|a, b| a.drawdown_m.total_cmp(&b.drawdown_m))
        .cloned()
        .unwrap_or(Sample {
            name: "none".into(),
            kind: SampleKind::Corner,
            position: [0.0, 0.0],
            level_m: Some(h0),
            drawdown_m: 0.0,
            settlement_m: None,
            settlement_final_m: None,
        });
    let worst_settlement = samples
        .iter()
        .filter(|s| s.settlement_m.is_some())
        .max_by(|a, b| {
            // Settlements within a micrometre count as equal; then the larger drawdown wins.
            let (ra, rb) = (a.settlement_m.unwrap_or(0.0), b.settlement_m.unwrap_or(0.0));
            if (ra - rb).abs() < 1e-6 {
                a.drawdown_m.total_cmp(&b.drawdown_m)
            } else {
                ra.total_cmp(&rb)
            }
        })
        .cloned();
    let sides = if n.layers.is_empty() {
        Vec::new()
    } else {
        footprint_sides(&samples, &corners, n.height)
    };
    let max_differential_m = corners
        .iter()
        .filter_map(|c| c.settlement_m)
        .fold(None, |acc: Option<(f64, f64)>, r| {
            Some(acc.map_or((r, r), |(lo, hi)| (lo.min(r), hi.max(r))))
        })
        .map(|(lo, hi)| hi - lo);
    let max_distortion = max_of(sides.iter().map(|s| s.distortion));
    let max_deflection_ratio = max_of(sides.iter().map(|s| s.deflection_ratio));
    let damage = sides
        .iter()
        .filter_map(|s| Some((s.damage?, s.name.clone(), s.tensile_strain?)))
        .max_by(|a, b| a.2.total_cmp(&b.2));
    let max_final_settlement_m = max_of(samples.iter().filter_map(|s| s.settlement_final_m));
    let max_end_of_works_settlement_m =
        duration.and(max_of(samples.iter().filter_map(|s| s.settlement_m)));
    let column = worst_column
        .map(|(c, s)| column_layers(model, n, &c, s, duration))
        .unwrap_or_default();
    let (checks, notes) = checks_and_notes(
        model,
        n,
        &samples,
        &worst_drawdown,
        worst_settlement.as_ref(),
        max_distortion,
        &top_basis,
        in_zone,
    );
    let mut notes = notes;
    time_notes(n, &works, upper_bound, &mut notes);
    if !n.layers.is_empty() && n.height.is_none() {
        notes.push("no height given: the deflection ratio is reported without a tensile strain or category of damage (give height = \"…\" for the Burland & Wroth / Boscardin & Cording information line)".into());
    }
    let utilisation = max_of(checks.iter().map(|c| c.utilisation));
    let status = if checks.is_empty() {
        Status::NotChecked
    } else if checks.iter().any(|c| !c.pass) {
        Status::Fail
    } else if utilisation.unwrap_or(0.0) >= CLOSE_UTILISATION {
        Status::Close
    } else {
        Status::Pass
    };
    NeighbourResult {
        name: n.name.clone(),
        footprint: n
            .footprint
            .exterior()
            .0
            .iter()
            .map(|c| [c.x, c.y])
            .collect(),
        profile_top_m: top,
        profile_top_basis: top_basis,
        stress_change: match stress_form(n) {
            StressForm::Simple => "simple (γ_w·Δh)".into(),
            StressForm::BuoyancyLoss => "buoyancy-loss (Δh·(γ_w − (γ_sat − γ_moist)))".into(),
        },
        corners,
        worst_drawdown,
        worst_settlement,
        sides,
        max_differential_m,
        max_distortion,
        checks,
        status,
        utilisation,
        works_duration: works,
        max_final_settlement_m,
        max_end_of_works_settlement_m,
        end_of_works_upper_bound: upper_bound,
        column,
        max_deflection_ratio,
        damage,
        notes,
        sample_count: samples.len(),
        samples,
    }
}

/// What the notes say about time: the duration used and whether the value is an upper bound.
fn time_notes(
    n: &Neighbour,
    works: &Option<(f64, String)>,
    upper_bound: bool,
    notes: &mut Vec<String>,
) {
    if n.layers.is_empty() {
        return;
    }
    let any_cv = n.layers.iter().any(|l| l.consolidation.is_some());
    match works {
        Some((t, basis)) => {
            let days = t / 86_400.0;
            notes.push(format!("settlement checked at the end of the works, {days:.0} days ({basis}); the final value is also given"));
            if upper_bound {
                notes.push("a settling layer has no c_v: it is taken as fully consolidated by the end of the works, so the value is an upper bound (give c_v for consolidation in time)".into());
            }
        }
        None if any_cv => notes.push("c_v given but no duration (no [programme], no dewatering_duration): the final settlement is checked, an upper bound".into()),
        None => notes.push("no c_v and no duration: the final (fully consolidated) settlement is checked, an upper bound".into()),
    }
}

/// The checks against limits and the notes on the assumptions.
#[allow(clippy::too_many_arguments)]
fn checks_and_notes(
    model: &Model,
    n: &Neighbour,
    samples: &[Sample],
    worst_drawdown: &Sample,
    worst_settlement: Option<&Sample>,
    max_distortion: Option<f64>,
    top_basis: &str,
    in_zone: bool,
) -> (Vec<LimitCheck>, Vec<String>) {
    let mut checks = Vec::new();
    let mut notes = Vec::new();
    let worst_rise = samples
        .iter()
        .map(|s| -s.drawdown_m)
        .fold(0.0_f64, f64::max);
    if worst_rise > 1e-6 || n.allowable_rise.is_some() {
        let (limit, basis) = match n.allowable_rise {
            Some(v) => (v, LimitBasis::DesignFile),
            None => (
                RULE_OF_THUMB_RISE,
                LimitBasis::RuleOfThumb(RULE_OF_THUMB_RISE_LABEL),
            ),
        };
        checks.push(LimitCheck::new(
            LimitQuantity::Rise,
            worst_rise,
            limit,
            basis,
        ));
    }
    match n.allowable_drawdown {
        Some(limit) => checks.push(LimitCheck::new(
            LimitQuantity::Drawdown,
            worst_drawdown.drawdown_m,
            limit,
            LimitBasis::DesignFile,
        )),
        None => notes.push(
            "no allowable_drawdown given: drawdown is reported, not checked (there is no general rule of thumb for it)"
                .into(),
        ),
    }
    if let Some(ws) = worst_settlement {
        let (limit, basis) = settlement_limit(n);
        checks.push(LimitCheck::new(
            LimitQuantity::Settlement,
            ws.settlement_m.unwrap_or(0.0),
            limit,
            basis,
        ));
        if let Some(beta) = max_distortion {
            let (limit, basis) = distortion_limit(n);
            checks.push(LimitCheck::new(
                LimitQuantity::AngularDistortion,
                beta,
                limit,
                basis,
            ));
        }
    } else {
        notes.push(
            "no soil profile ([[neighbour.layer]]) given: settlement and distortion not computed"
                .into(),
        );
    }
    if top_basis != "foundation level" {
        notes.push("layers counted down from ground level: no foundation_level given".into());
    }
    if in_zone {
        notes.push(match stress_form(n) {
            StressForm::Simple => "a compressible layer reaches into the dewatered zone (between the old and the lowered water level): a layer kept saturated by suction (the default for compressible layers) takes the whole γ_w·Δh there; one marked above_water_table = \"drains\" only the pore pressure it had, γ_w·(h₀ − z) (simple form; stress_change = \"buoyancy-loss\" also takes off the weight the drained soil loses)".into(),
            StressForm::BuoyancyLoss => "a compressible layer reaches into the dewatered zone: Δσ′ there is the pore pressure lost less the weight the drained soil above loses (buoyancy-loss form)".into(),
        });
    }
    if let Some(z_t) = confining_top(model) {
        if !n.layers.is_empty() {
            notes.push(format!("confined aquifer (top at {}): the clay above it loses pore pressure linearly, from nothing at its top (the water table above is not pumped) to the aquifer's head drop at its base (steady seepage); layers above the clay are unchanged", model.units.length_words(z_t, 2)));
        }
    }
    if samples.iter().any(|s| s.drawdown_m < 0.0) {
        notes.push("the water level rises above its initial level under part of the building (recharge): heave and wetting are not assessed; settlement there is taken as zero".into());
    }
    (checks, notes)
}

/// The top of a confined or leaky aquifer, m.
fn confining_top(model: &Model) -> Option<f64> {
    match model.aquifer.kind {
        crate::physics::potential::AquiferKind::Unconfined => None,
        _ => model.aquifer.top_level,
    }
}

/// Assess every neighbour of `model` for the wells of `field` at `rates`.
pub fn assess(model: &Model, field: &Field, rates: &[f64]) -> Vec<NeighbourResult> {
    model
        .neighbours
        .iter()
        .map(|n| assess_one(model, field, rates, n))
        .collect()
}

/// Assess every neighbour for an evaluated layout.
pub fn assess_run(run: &CheckRun) -> Vec<NeighbourResult> {
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    assess(run.model, &run.field, &rates)
}

/// Status of each neighbour (name, status, largest utilisation), for maps.
pub fn neighbour_status(run: &CheckRun) -> Vec<(String, Status, Option<f64>)> {
    assess_run(run)
        .into_iter()
        .map(|r| (r.name, r.status, r.utilisation))
        .collect()
}

/// True when no neighbour fails a limit.
pub fn all_pass(run: &CheckRun) -> bool {
    assess_run(run).iter().all(|r| r.status != Status::Fail)
}
