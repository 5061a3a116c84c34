//! Neighbouring buildings: drawdown under each footprint, settlement by one-dimensional
//! consolidation ([`crate::safety::settlement`]), differential settlement and angular distortion along
//! each side, and pass/fail against the building's limits.
//!
//! Each footprint is sampled at its corners, along its sides and on a small interior grid; the
//! level at every sample comes from the same superposition as the excavation ([`Field::level`]).
//! Settlement at a sample is the settlement of the soil column listed under the building (top down
//! from its foundation level, or from ground level when none is given) for the drawdown there.
//! Angular distortion along a side is β = |ρ_a − ρ_b|/L between its two corners.
//!
//! Where the design file gives no settlement or distortion limit, labelled rules of thumb for
//! buildings on shallow footings are used instead: 25 mm total settlement and β = 1/500 (common
//! practice (no source); 1/500 is usually credited to Bjerrum (1963), from memory). There is no
//! rule of thumb for drawdown: without `allowable_drawdown` the drawdown is reported, not checked.

use crate::check::run::CheckRun;
use crate::field::influence::Field;
use crate::input::model::{Model, Neighbour};
use crate::physics::potential::Level;
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
    /// Settlement, m (`None`: no soil profile given).
    pub settlement_m: Option<f64>,
}

/// Settlement along one side, between its corners.
#[derive(Debug, Clone, Serialize)]
pub struct Side {
    /// "corner 1–2".
    pub name: String,
    /// Length, m.
    pub length_m: f64,
    /// Settlement at its first corner, m.
    pub settlement_from_m: f64,
    /// Settlement at its second corner, m.
    pub settlement_to_m: f64,
    /// |Δρ|, m.
    pub differential_m: f64,
    /// β = |Δρ|/L.
    pub distortion: f64,
}

/// One quantity against its limit.
#[derive(Debug, Clone, Serialize)]
pub struct LimitCheck {
    /// "drawdown", "settlement" or "angular distortion".
    pub quantity: String,
    /// The worst value under the building (m, or a ratio for distortion).
    pub value: f64,
    /// The limit.
    pub limit: f64,
    /// "design file", or the rule-of-thumb label.
    pub basis: String,
    /// value ÷ limit.
    pub utilisation: f64,
    /// Within the limit.
    pub pass: bool,
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
    /// What an engineer should know about the numbers.
    pub notes: Vec<String>,
    /// How many points were sampled.
    pub sample_count: usize,
    /// Every sample (for maps and CSV).
    #[serde(skip)]
    pub samples: Vec<Sample>,
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

/// Settlement (m) of the neighbour's soil column for a water level falling from `h0` to `h1`.
pub fn settlement_at(model: &Model, n: &Neighbour, h0: f64, h1: f64) -> Option<f64> {
    if n.layers.is_empty() {
        return None;
    }
    let (top, _) = profile_top(model, n);
    Some(settlement::column(&n.layers, top, h0, h1, stress_form(n)).total)
}

/// The settlement limit in force (m) and its basis.
pub fn settlement_limit(n: &Neighbour) -> (f64, String) {
    match n.allowable_settlement {
        Some(v) => (v, "design file".into()),
        None => (RULE_OF_THUMB_SETTLEMENT, RULE_OF_THUMB_LABEL.into()),
    }
}

/// The distortion limit in force and its basis.
pub fn distortion_limit(n: &Neighbour) -> (f64, String) {
    match n.allowable_distortion {
        Some(v) => (v, "design file".into()),
        None => (RULE_OF_THUMB_DISTORTION, RULE_OF_THUMB_LABEL.into()),
    }
}

/// The drawdown a neighbour may take everywhere under it, m, for sizing recharge: the smaller of
/// its allowable drawdown and the uniform drawdown that settles it by its settlement limit.
/// `None` when neither limits it.
pub fn drawdown_limit_for_recharge(model: &Model, n: &Neighbour) -> Option<(f64, String)> {
    let h0 = model.aquifer.initial_level;
    let mut best: Option<(f64, String)> = n
        .allowable_drawdown
        .map(|s| (s, "allowable drawdown (design file)".to_string()));
    if !n.layers.is_empty() {
        let (top, _) = profile_top(model, n);
        let (limit, basis) = settlement_limit(n);
        let max_s = (h0 - model.aquifer.base_level).max(0.0);
        if let Some(s) =
            settlement::drawdown_for_settlement(&n.layers, top, h0, limit, max_s, stress_form(n))
        {
            if best.as_ref().is_none_or(|(b, _)| s < *b) {
                best = Some((
                    s,
                    format!(
                        "drawdown that settles it by {:.1} mm ({basis})",
                        limit * 1e3
                    ),
                ));
            }
        }
    }
    best
}

fn check(quantity: &str, value: f64, limit: f64, basis: String) -> LimitCheck {
    let utilisation = if limit > 0.0 { value / limit } else { 0.0 };
    LimitCheck {
        quantity: quantity.into(),
        value,
        limit,
        basis,
        utilisation,
        pass: value <= limit * (1.0 + 1e-9),
    }
}

/// Assess one neighbour for the wells of `field` at `rates` (m³/s).
pub fn assess_one(model: &Model, field: &Field, rates: &[f64], n: &Neighbour) -> NeighbourResult {
    let aq = field.aquifer();
    let h0 = aq.initial_level;
    let (top, top_basis) = profile_top(model, n);
    let pts = sample_points(&n.footprint);
    let positions: Vec<[f64; 2]> = pts.iter().map(|p| p.2).collect();
    let levels = field.levels(&positions, rates);
    let mut in_zone = false;
    let samples: Vec<Sample> = pts
        .into_iter()
        .zip(levels)
        .map(|((name, kind, position), lv)| {
            let h1 = lv.or_base(aq.base_level);
            let settlement_m = if n.layers.is_empty() {
                None
            } else {
                let c = settlement::column(&n.layers, top, h0, h1, stress_form(n));
                in_zone |= c.compressible_in_dewatered_zone;
                Some(c.total)
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
            }
        })
        .collect();
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
    let mut sides = Vec::new();
    if !n.layers.is_empty() {
        for i in 0..corners.len() {
            let a = &corners[i];
            let b = &corners[(i + 1) % corners.len()];
            let len = (b.position[0] - a.position[0]).hypot(b.position[1] - a.position[1]);
            let (ra, rb) = (a.settlement_m.unwrap_or(0.0), b.settlement_m.unwrap_or(0.0));
            let diff = (ra - rb).abs();
            sides.push(Side {
                name: format!("corner {}–{}", i + 1, (i + 1) % corners.len() + 1),
                length_m: len,
                settlement_from_m: ra,
                settlement_to_m: rb,
                differential_m: diff,
                distortion: if len > 0.0 { diff / len } else { 0.0 },
            });
        }
    }
    let max_differential_m = corners
        .iter()
        .filter_map(|c| c.settlement_m)
        .fold(None, |acc: Option<(f64, f64)>, r| {
            Some(acc.map_or((r, r), |(lo, hi)| (lo.min(r), hi.max(r))))
        })
        .map(|(lo, hi)| hi - lo);
    let max_distortion = sides
        .iter()
        .map(|s| s.distortion)
        .fold(None, |acc: Option<f64>, b| {
            Some(acc.map_or(b, |a| a.max(b)))
        });

    let mut checks = Vec::new();
    let mut notes = Vec::new();
    let worst_rise = samples
        .iter()
        .map(|s| -s.drawdown_m)
        .fold(0.0_f64, f64::max);
    if worst_rise > 1e-6 || n.allowable_rise.is_some() {
        let (limit, basis) = match n.allowable_rise {
            Some(v) => (v, "design file".to_string()),
            None => (
                RULE_OF_THUMB_RISE,
                "rise above the original level, common practice (no source)".to_string(),
            ),
        };
        checks.push(check("rise above original level", worst_rise, limit, basis));
    }
    match n.allowable_drawdown {
        Some(limit) => checks.push(check(
            "drawdown",
            worst_drawdown.drawdown_m,
            limit,
            "design file".into(),
        )),
        None => notes.push(
            "no allowable_drawdown given: drawdown is reported, not checked (there is no general rule of thumb for it)"
                .into(),
        ),
    }
    if let Some(ws) = &worst_settlement {
        let (limit, basis) = settlement_limit(n);
        checks.push(check(
            "settlement",
            ws.settlement_m.unwrap_or(0.0),
            limit,
            basis,
        ));
        if let Some(beta) = max_distortion {
            let (limit, basis) = distortion_limit(n);
            checks.push(check("angular distortion", beta, limit, basis));
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
            StressForm::Simple => "a compressible layer reaches into the dewatered zone (between the old and the lowered water level): there Δσ′ is taken as the pore pressure lost, γ_w·(h₀ − z); the full γ_w·Δh is used only for the part that stays below the lowered level (simple form; a layer kept saturated by suction could take up to γ_w·Δh, one that drains and loses weight takes less — stress_change = \"buoyancy-loss\")".into(),
            StressForm::BuoyancyLoss => "a compressible layer reaches into the dewatered zone: Δσ′ there is the pore pressure lost less the weight the drained soil loses (buoyancy-loss form)".into(),
        });
    }
    if samples.iter().any(|s| s.drawdown_m < 0.0) {
        notes.push("the water level rises above its initial level under part of the building (recharge): heave and wetting are not assessed; settlement there is taken as zero".into());
    }
    let utilisation = checks
        .iter()
        .map(|c| c.utilisation)
        .fold(None, |acc: Option<f64>, u| {
            Some(acc.map_or(u, |a| a.max(u)))
        });
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
        notes,
        sample_count: samples.len(),
        samples,
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
