//! The limits of one well, as the optimiser's programme sees them.
//!
//! - Level in the well (pump intake + submergence; for wellpoints also header − suction limit):
//!   Φₖ ≥ Φ(lowest level), linear in the rates and exact.
//! - Capacity: the rate is at most the pump's capacity and Sichardt's capacity
//!   α·h_w (α = 2π·r_w·√K/15, h_w the wetted filter column round the screen — the screen when
//!   no filter column is given — which depends on the well's own level).
//!   h_w = min(filter top, z) − filter base is a concave function of the level, and the level is
//!   a concave function of Φ, so h_w(Φ) is concave in Φ. Its piecewise-linear interpolation
//!   through a few levels between the lowest allowed level and the initial level lies below it,
//!   and equals it at the breakpoints. The linear programme uses those chords
//!   (qₖ ≤ α·chord(Φₖ), one constraint per piece): a safe bound, never allowing more than the
//!   true capacity, and much less pessimistic than the capacity at the lowest allowed level.
//!   The uniform option uses the exact capacity (a monotone equation in q, solved by bisection).
//! - Well loss (in the well only, not in the aquifer): the face level must stay above
//!   floor + loss(q), with Jacob's loss C·q² or, for an efficiency E, (1/E − 1) × the well's own
//!   drawdown s_own(q) = z₀ − h(Φ₀ + q·u_kk) (u_kk its own ΔΦ per unit rate at its face; linear in
//!   q in a confined layer, convex in an unconfined one). In Φ that is Φₖ ≥ g(qₖ) with
//!   g(q) = Φ(floor + loss(q)) convex in q. The programme uses the chords of g
//!   between [`LOSS_PIECES`] + 1 rates from 0 to the well's capacity (one row per chord): their
//!   maximum is the piecewise-linear interpolant of g, which lies above g, so the rows are safe
//!   (never allow a rate whose loss would put the well below its floor) and equal g at the
//!   breakpoints. The answer is re-verified by plain evaluation.

use crate::field::wells::Well;
use crate::input::model::{Model, WellKind, WellLossSpec};
use crate::physics::capacity::sichardt_well_capacity;
use crate::physics::well_loss::{efficiency_loss_of_rate, jacob_loss};
use serde::Serialize;

/// Capacities used in the programme are this fraction of the true value, so that solver
/// round-off never lets a rate exceed the capacity the evaluation checks.
pub(super) const CAPACITY_SAFETY: f64 = 1.0 - 1e-6;
/// Pieces of the chord approximation of Sichardt's capacity between the lowest allowed level
/// and the initial level (plus a breakpoint at the screen top).
const CAPACITY_PIECES: usize = 8;
/// Chords of the Jacob loss floor g(q) = Φ(floor + C·q²) between zero and the well's capacity.
pub const LOSS_PIECES: usize = 8;
/// A pumping well's level is kept at least this far above the aquifer base, m, so that it never
/// reads as pumped dry.
pub(super) const DRY_GUARD: f64 = 0.01;

/// What sets the lowest level allowed in a well.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum FloorKind {
    /// Pump intake plus submergence.
    PumpIntake,
    /// Wellpoint suction limit below the header.
    Suction,
    /// The screen base: below it the screen is dry and gives nothing.
    ScreenBase,
    /// Just above the aquifer base.
    AquiferBase,
}

impl FloorKind {
    pub(super) fn describe(self) -> &'static str {
        match self {
            FloorKind::PumpIntake => "pump intake + submergence",
            FloorKind::Suction => "header − suction limit",
            FloorKind::ScreenBase => "screen base",
            FloorKind::AquiferBase => "aquifer base",
        }
    }
}

/// The limits of one well, ready for the programme.
#[derive(Debug, Clone)]
pub struct WellLimit {
    /// Lowest level allowed, m, as [`crate::check::evaluate::evaluate`] checks it.
    pub lowest_level: f64,
    /// Level the programme holds the well at or above, m: the lowest allowed, the screen base
    /// or just above the aquifer base, whichever is highest.
    pub floor_level: f64,
    /// What sets the floor.
    pub floor_kind: FloorKind,
    /// Φ at the floor.
    pub floor_potential: f64,
    /// Sichardt capacity per metre of wetted screen, α = 2π·r_w·√K/15, m³/s per m.
    pub capacity_per_metre: f64,
    /// Pump capacity, m³/s.
    pub pump: Option<f64>,
    /// Jacob's well-loss coefficient C, s²/m⁵ (0: none).
    pub loss_c: f64,
    /// Well efficiency E with the well's own ΔΦ per unit rate at its face (`None`: no
    /// efficiency given).
    pub efficiency: Option<(f64, f64)>,
    aquifer: crate::physics::potential::Aquifer,
    /// Rows of the level floor on the screen-face potential: Φₖ ≥ φ + slope·qₖ, one per chord
    /// of the Jacob loss (a single row with slope 0 without it).
    pub(super) level_pieces: Vec<(f64, f64)>,
    /// Top and base of the intake the capacity is taken over: the filter column, m.
    pub(super) screen_top: f64,
    pub(super) screen_base: f64,
    /// Chord pieces of h_w(Φ): (Φ_a, h_w at Φ_a, slope dh_w/dΦ).
    pub(super) pieces: Vec<(f64, f64, f64)>,
}

impl WellLimit {
    /// `own_unit`: ΔΦ per unit rate the well makes at its own face (its diagonal entry of the
    /// unit matrix), used by a well efficiency.
    pub(super) fn new(model: &Model, well: &Well, own_unit: f64) -> WellLimit {
        let aq = &model.aquifer;
        let spec = &model.wells;
        // The same rule as evaluate().
        let intake = well.pump_intake + spec.submergence;
        let (lowest, mut kind) = match well.kind {
            WellKind::DeepWell => (intake, FloorKind::PumpIntake),
            WellKind::Wellpoint => {
                let suction = model.as_built.suction_floor(spec.suction_limit);
                if suction >= intake {
                    (suction, FloorKind::Suction)
                } else {
                    (intake, FloorKind::PumpIntake)
                }
            }
        };
        // the floor on the level at the screen face (outside the well) at zero rate; the loss
        // raises it with the rate (`face_floor`)
        let mut floor = lowest;
        if well.screen_base > floor {
            floor = well.screen_base;
            kind = FloorKind::ScreenBase;
        }
        // in layered ground, the base of the aquifer the screen reaches lowest into
        let base = model.layers.as_ref().map_or(aq.base_level, |g| {
            g.aquifers[g.aquifer_at(well.screen_base + DRY_GUARD)]
                .aquifer
                .base_level
        });
        if base + DRY_GUARD > floor {
            floor = base + DRY_GUARD;
            kind = FloorKind::AquiferBase;
        }
        let mut limit = WellLimit {
            lowest_level: lowest,
            floor_level: floor,
            floor_kind: kind,
            floor_potential: aq.potential(floor),
            capacity_per_metre: sichardt_well_capacity(well.radius, 1.0, aq.conductivity),
            pump: spec.pump_capacity,
            loss_c: match model.as_built.loss {
                WellLossSpec::Jacob(c) => c,
                _ => 0.0,
            },
            efficiency: match model.as_built.loss {
                WellLossSpec::Efficiency(e) if e < 1.0 => Some((e, own_unit)),
                _ => None,
            },
            aquifer: aq.clone(),
            level_pieces: Vec::new(),
            // Sichardt over the filter column round the screen (the screen when none given)
            screen_top: well.filter_top,
            screen_base: well.filter_base,
            pieces: Vec::new(),
        };
        let top = aq.initial_level;
        if top > floor {
            let mut levels: Vec<f64> = (0..=CAPACITY_PIECES)
                .map(|i| floor + (top - floor) * i as f64 / CAPACITY_PIECES as f64)
                .collect();
            if well.filter_top > floor && well.filter_top < top {
                levels.push(well.filter_top);
            }
            levels.sort_by(f64::total_cmp);
            levels.dedup_by(|a, b| (*a - *b).abs() < 1e-9);
            for w in levels.windows(2) {
                let (pa, pb) = (aq.potential(w[0]), aq.potential(w[1]));
                if pb > pa {
                    let (ha, hb) = (limit.wetted(w[0]), limit.wetted(w[1]));
                    limit.pieces.push((pa, ha, (hb - ha) / (pb - pa)));
                }
            }
        }
        limit.level_pieces = vec![(limit.floor_potential, 0.0)];
        let q_hi = limit.capacity_at(top);
        if limit.has_rate_loss() && q_hi > 0.0 {
            let g = |q: f64| aq.potential(limit.face_floor(q));
            limit.level_pieces = (0..LOSS_PIECES)
                .map(|i| {
                    let (qa, qb) = (
                        q_hi * i as f64 / LOSS_PIECES as f64,
                        q_hi * (i + 1) as f64 / LOSS_PIECES as f64,
                    );
                    let slope = (g(qb) - g(qa)) / (qb - qa);
                    (g(qa) - slope * qa, slope)
                })
                .collect();
        }
        limit
    }

    /// Lowest level allowed at the screen face (outside the well) at rate `q`, m: the lowest level
    /// in the well plus its well loss at that rate, Jacob's C·q² or the efficiency's
    /// (1/E − 1)·s_own(q) (Jacob 1947; see [`crate::physics::well_loss`]).
    pub fn face_floor(&self, q: f64) -> f64 {
        (self.lowest_level + self.loss_at(q)).max(self.floor_level)
    }

    /// The well loss at rate `q`, m.
    pub fn loss_at(&self, q: f64) -> f64 {
        let eff = self.efficiency.map_or(0.0, |(e, u)| {
            efficiency_loss_of_rate(&self.aquifer, e, u, q)
        });
        jacob_loss(self.loss_c, q) + eff
    }

    /// Whether the well loss grows with the rate (Jacob's C or an efficiency below 1).
    pub fn has_rate_loss(&self) -> bool {
        self.loss_c > 0.0 || self.efficiency.is_some()
    }

    /// The safe (chord) floor on the screen-face potential at rate `q`: the largest of the rows,
    /// Φ, and the row that sets it.
    pub(super) fn chord_floor(&self, q: f64) -> (f64, usize) {
        self.level_pieces
            .iter()
            .enumerate()
            .map(|(i, (phi, slope))| (phi + slope * q, i))
            .max_by(|a, b| a.0.total_cmp(&b.0))
            .unwrap_or((self.floor_potential, 0))
    }

    /// Wetted screen length at level `z`, m.
    pub fn wetted(&self, z: f64) -> f64 {
        (self.screen_top.min(z) - self.screen_base).max(0.0)
    }

    /// True capacity at level `z`: the lower of Sichardt's and the pump's, m³/s.
    pub fn capacity_at(&self, z: f64) -> f64 {
        let s = self.capacity_per_metre * self.wetted(z);
        self.pump.map_or(s, |p| p.min(s))
    }

    /// The safe (chord) Sichardt capacity at potential `phi`, m³/s.
    pub(super) fn chord_capacity(&self, phi: f64) -> (f64, usize) {
        self.pieces
            .iter()
            .enumerate()
            .map(|(s, (pa, ha, slope))| (self.capacity_per_metre * (ha + slope * (phi - pa)), s))
            .min_by(|a, b| a.0.total_cmp(&b.0))
            .unwrap_or((0.0, 0))
    }
}
