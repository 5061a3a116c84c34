//! Time-dependent drawdown by superposition in space and time (Theis, Hantush–Jacob, and the
//! unconfined case through the discharge potential).
//!
//! A well's rate is a step schedule; each change of rate at time t_k starts a new Theis (or
//! Hantush) response of the rate change ΔQ_k = Q_k − Q_{k−1} (superposition in time, Kruseman &
//! de Ridder, *Analysis and Evaluation of Pumping Test Data*, 2nd ed. 1994, §12 variable
//! discharge; Theis 1935). A well switched off is a step to rate 0. Image wells for straight
//! boundaries are sources of their own with `sign` −1 (constant head) or +1 (barrier), at the
//! mirrored positions (Ferris et al. 1962, USGS WSP 1536-E); produce them with
//! [`crate::physics::images`].
//!
//! - Confined: s = Σ ΔQ/(4πT)·W(u), u = r²S/(4T·Δt), W = E₁.
//! - Leaky: s = Σ ΔQ/(4πT)·W(u, r/B) (Hantush & Jacob 1955).
//! - Unconfined: the sum above, with S_y for S and T = K·H (H the saturated thickness before
//!   pumping), is the change of the discharge potential Φ = ½K·h² divided by K·H, i.e. the
//!   linearised potential superposition of Strack (*Groundwater Mechanics*, 1989; from memory).
//!   It is turned into the real drawdown by inverting Jacob's correction s′ = s − s²/(2H):
//!   s = H − √(H² − 2H·s′) (Jacob 1944). Assumption: the diffusivity K·H/S_y is taken constant
//!   (the saturated thickness in u is H, not the pumped one), which is good while s ≪ H; where
//!   2s′ > H the aquifer is pumped dry there and the drawdown returned is H.
//!
//! No radius of influence is used in time. The steady designs relate through the long-time
//! limit: for small u, W(u) → −γ − ln u and the Theis drawdown is Thiem's with
//! R = √(2.25·T·t/S) (Cooper & Jacob 1946; tested in `tests/programme.rs`), which is the
//! radius the steady `cooper-jacob` influence method uses for its pumping time.
//!
//! The pumping programme of the design file is set up in [`programme`], answered in
//! [`answers`]; designing for a date (the transient unit matrix in the linear programme) is in
//! [`by_date`].
//!
//! Guards: distances below the well radius use the well radius; a step contributes nothing
//! until t > t_k; a term with u > 700 (E₁ below 1e-307) is skipped; no NaN reaches an output.
//! Units SI: m, s, m³/s (positive = abstraction), m²/s.

pub mod answers;
pub mod by_date;
pub mod programme;
pub mod steady_link;
pub mod well_function;
pub mod well_levels;

use crate::physics::special::hantush_w;
use rayon::prelude::*;
use std::f64::consts::PI;
use std::sync::Arc;

pub use crate::physics::radius::cooper_jacob_radius;

/// Beyond this u the well function is below 1e-307 and the term is skipped.
pub const U_CUTOFF: f64 = 700.0;

/// Step rate schedule of one well: (start time s, rate m³/s) pairs, strictly increasing in time.
/// The rate before the first step is 0; a step to 0 switches the well off.
#[derive(Debug, Clone, PartialEq)]
pub struct RateSchedule {
    steps: Vec<(f64, f64)>,
    /// (t_k, ΔQ_k): the rate changes, precomputed for the inner loop.
    changes: Vec<(f64, f64)>,
}

impl RateSchedule {
    /// A schedule from (start time s, rate m³/s) steps. Errors name the step and what is valid:
    /// times finite and strictly increasing, rates finite, at least one step.
    pub fn new(steps: Vec<(f64, f64)>) -> Result<Self, String> {
        if steps.is_empty() {
            return Err("rate schedule: at least one (start time, rate) step is needed".into());
        }
        let mut prev_t = f64::NEG_INFINITY;
        let mut prev_q = 0.0;
        let mut changes = Vec::with_capacity(steps.len());
        for (i, &(t, q)) in steps.iter().enumerate() {
            if !t.is_finite() {
                return Err(format!(
                    "rate schedule step {}: start time {t} s is not a finite number of seconds",
                    i + 1
                ));
            }
            if !q.is_finite() {
                return Err(format!(
                    "rate schedule step {}: rate {q} m³/s is not a finite number",
                    i + 1
                ));
            }
            if t <= prev_t {
                return Err(format!(
                    "rate schedule step {}: start time {t} s must be later than the step before ({prev_t} s)",
                    i + 1
                ));
            }
            if q != prev_q {
                changes.push((t, q - prev_q));
            }
            prev_t = t;
            prev_q = q;
        }
        Ok(RateSchedule { steps, changes })
    }

    /// One constant rate `rate` (m³/s) from time `start` (s) on.
    pub fn constant(start: f64, rate: f64) -> Result<Self, String> {
        Self::new(vec![(start, rate)])
    }

    /// The steps as given: (start time s, rate m³/s).
    pub fn steps(&self) -> &[(f64, f64)] {
        &self.steps
    }

    /// The rate at time t (m³/s): that of the last step started at or before t, 0 before.
    pub fn rate_at(&self, t: f64) -> f64 {
        self.steps
            .iter()
            .take_while(|(tk, _)| *tk <= t)
            .last()
            .map_or(0.0, |(_, q)| *q)
    }

    /// Time of the first step, s.
    pub fn start(&self) -> f64 {
        self.steps[0].0
    }

    /// True when no step lowers the rate (all changes ΔQ ≥ 0): the drawdown of a positive-sign
    /// source then never falls with time.
    pub fn is_non_decreasing(&self) -> bool {
        self.changes.iter().all(|(_, dq)| *dq >= 0.0)
    }
}

/// A point source (real or image well) with its rate schedule.
#[derive(Debug, Clone, PartialEq)]
pub struct TransientSource {
    /// Position x, m.
    pub x: f64,
    /// Position y, m.
    pub y: f64,
    /// Rate steps of the real well.
    pub schedule: RateSchedule,
    /// Multiplier of the rate: +1 real well or barrier image, −1 constant-head image.
    pub sign: f64,
}

/// The aquifer parameters for transient flow.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum TransientAquifer {
    /// Confined (Theis): transmissivity T m²/s, storativity S.
    Confined {
        /// T, m²/s.
        transmissivity: f64,
        /// S, dimensionless.
        storativity: f64,
    },
    /// Leaky (Hantush–Jacob): T m²/s, S, leakage factor B m.
    Leaky {
        /// T, m²/s.
        transmissivity: f64,
        /// S, dimensionless.
        storativity: f64,
        /// B = √(T·c), m.
        leakage_factor: f64,
    },
    /// Unconfined, linearised with T = K·H and Jacob's correction (see the module notes).
    Unconfined {
        /// K, m/s.
        conductivity: f64,
        /// H, saturated thickness before pumping, m.
        saturated_thickness: f64,
        /// S_y, dimensionless.
        specific_yield: f64,
    },
}

fn positive(name: &str, v: f64, unit: &str) -> Result<(), String> {
    if v.is_finite() && v > 0.0 {
        Ok(())
    } else {
        Err(format!(
            "{name} = {v} {unit}: must be a finite number greater than 0"
        ))
    }
}

impl TransientAquifer {
    /// Check every parameter is finite and positive; the error names the field.
    pub fn validate(&self) -> Result<(), String> {
        match *self {
            TransientAquifer::Confined {
                transmissivity,
                storativity,
            } => {
                positive("transmissivity", transmissivity, "m²/s")?;
                positive("storativity", storativity, "")
            }
            TransientAquifer::Leaky {
                transmissivity,
                storativity,
                leakage_factor,
            } => {
                positive("transmissivity", transmissivity, "m²/s")?;
                positive("storativity", storativity, "")?;
                positive("leakage_factor", leakage_factor, "m")
            }
            TransientAquifer::Unconfined {
                conductivity,
                saturated_thickness,
                specific_yield,
            } => {
                positive("conductivity", conductivity, "m/s")?;
                positive("saturated_thickness", saturated_thickness, "m")?;
                positive("specific_yield", specific_yield, "")
            }
        }
    }

    /// (T m²/s, storage coefficient, 1/B in 1/m or 0 when not leaky).
    fn diffusion(&self) -> (f64, f64, f64) {
        match *self {
            TransientAquifer::Confined {
                transmissivity,
                storativity,
            } => (transmissivity, storativity, 0.0),
            TransientAquifer::Leaky {
                transmissivity,
                storativity,
                leakage_factor,
            } => (transmissivity, storativity, 1.0 / leakage_factor),
            TransientAquifer::Unconfined {
                conductivity,
                saturated_thickness,
                specific_yield,
            } => (conductivity * saturated_thickness, specific_yield, 0.0),
        }
    }

    /// Well function term W(u) or W(u, r/B) for squared distance r² and elapsed time dt > 0,
    /// already divided by 4πT: the drawdown per unit rate, m per m³/s. 0 when u > [`U_CUTOFF`].
    #[inline]
    fn unit_term(r2: f64, dt: f64, t: f64, s: f64, inv_b: f64) -> f64 {
        let u = r2 * s / (4.0 * t * dt);
        if u > U_CUTOFF || u.is_nan() {
            return 0.0;
        }
        let w = if inv_b > 0.0 {
            hantush_w(u, r2.sqrt() * inv_b)
        } else {
            well_function::theis_w(u)
        };
        if w.is_finite() {
            w / (4.0 * PI * t)
        } else {
            0.0
        }
    }

    /// Turn the superposed (linear) drawdown s′ into the real drawdown: unchanged when confined
    /// or leaky; unconfined s = H − √(H² − 2H·s′) (inverse of Jacob's correction, Jacob 1944),
    /// H when the aquifer would be pumped dry (2s′ > H).
    pub fn real_drawdown(&self, linear: f64) -> f64 {
        match *self {
            TransientAquifer::Unconfined {
                saturated_thickness: h,
                ..
            } => {
                let disc = h * h - 2.0 * h * linear;
                if disc <= 0.0 {
                    h
                } else {
                    // cancellation-free form of H − √(H² − 2Hs′)
                    2.0 * h * linear / (h + disc.sqrt())
                }
            }
            _ => linear,
        }
    }

    /// Drawdown per unit steady rate (m per m³/s) at each point for each well group running
    /// at a constant rate from its start time, evaluated at time `t` (s). Rows are points,
    /// columns are wells: levels at time t are linear in the rates (the LP "design for a date").
    ///
    /// `wells[j]` is (start time s, members), members being (x, y, sign) of the real well
    /// (sign +1) and its images. Distances below `well_radius` use `well_radius`. For an
    /// unconfined aquifer the matrix is in the linear drawdown s′; convert a limit s on the
    /// real drawdown with [`crate::physics::thiem::jacob_correction`] before using it.
    /// Source: Theis (1935); superposition as in the module notes.
    pub fn unit_response(
        &self,
        well_radius: f64,
        points: &[[f64; 2]],
        wells: &[(f64, Vec<[f64; 3]>)],
        t: f64,
    ) -> Vec<Vec<f64>> {
        let (tr, s, inv_b) = self.diffusion();
        let rw2 = well_radius * well_radius;
        points
            .par_iter()
            .map(|p| {
                wells
                    .iter()
                    .map(|(start, members)| {
                        let dt = t - start;
                        if dt.is_nan() || dt <= 0.0 || !dt.is_finite() {
                            return 0.0;
                        }
                        members
                            .iter()
                            .map(|m| {
                                let r2 = ((p[0] - m[0]).powi(2) + (p[1] - m[1]).powi(2)).max(rw2);
                                m[2] * Self::unit_term(r2, dt, tr, s, inv_b)
                            })
                            .sum::<f64>()
                    })
                    .map(|v: f64| if v.is_finite() { v } else { 0.0 })
                    .collect()
            })
            .collect()
    }
}

/// ΔΦ per unit rate (m³/s per m, per m³/s) of each well at a point from the partial-penetration
/// term of the steady field (the steady kernel with partial penetration less the same kernel
/// fully penetrating; see [`crate::field::near_field`]).
pub type NearRows = Arc<dyn Fn([f64; 2]) -> Vec<f64> + Send + Sync>;

/// The partial-penetration term in time, taken as quasi-steady: at time t each well adds
/// −q(t)·ΔΦ_unit/T to the linear drawdown s′, with its rate at that time. The extra drawdown of a
/// partly penetrating screen is confined to about 1.5·D·√(K_h/K_v) of the well and settles once
/// the spreading front has passed that distance (Hantush 1961; Kruseman & de Ridder 1994, §10),
/// within minutes to hours, much less than the programme's days.
#[derive(Clone)]
pub struct NearTerm {
    /// Per-well rows at a point.
    pub rows: NearRows,
    /// T = K·D used to turn ΔΦ into s′, m²/s.
    pub transmissivity: f64,
}

impl std::fmt::Debug for NearTerm {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "NearTerm {{ transmissivity: {} }}", self.transmissivity)
    }
}

/// Aquifer, well radius and the sources (real wells and images) with their schedules.
#[derive(Debug, Clone)]
pub struct TransientModel {
    aquifer: TransientAquifer,
    well_radius: f64,
    sources: Vec<TransientSource>,
    /// The sources of each well (the real well first, then its images), when grouped.
    groups: Vec<std::ops::Range<usize>>,
    /// The partial-penetration term, when some well is partly penetrating.
    near: Option<NearTerm>,
}

impl TransientModel {
    /// A model; errors name the bad field (aquifer parameters, well radius > 0, source
    /// positions and signs finite).
    pub fn new(
        aquifer: TransientAquifer,
        well_radius: f64,
        sources: Vec<TransientSource>,
    ) -> Result<Self, String> {
        aquifer.validate()?;
        positive("well_radius", well_radius, "m")?;
        for (i, s) in sources.iter().enumerate() {
            if !(s.x.is_finite() && s.y.is_finite()) {
                return Err(format!(
                    "source {}: position ({}, {}) m is not finite",
                    i + 1,
                    s.x,
                    s.y
                ));
            }
            if !s.sign.is_finite() {
                return Err(format!(
                    "source {}: sign {} must be finite (+1 real or barrier image, −1 constant-head image)",
                    i + 1,
                    s.sign
                ));
            }
        }
        Ok(TransientModel {
            aquifer,
            well_radius,
            sources,
            groups: Vec::new(),
            near: None,
        })
    }

    /// The same model with its sources grouped by well (`groups[j]`: the sources of well j, the
    /// real well first) and the partial-penetration term `near` (per-well rows).
    pub fn with_wells(
        mut self,
        groups: Vec<std::ops::Range<usize>>,
        near: Option<NearTerm>,
    ) -> Self {
        self.groups = groups;
        self.near = near;
        self
    }

    /// The rate of well j at time t, m³/s (0 when the model is not grouped by well).
    pub fn well_rate(&self, j: usize, t: f64) -> f64 {
        self.groups
            .get(j)
            .and_then(|g| self.sources.get(g.start))
            .map_or(0.0, |s| s.schedule.rate_at(t))
    }

    /// Number of wells (groups of sources).
    pub fn well_count(&self) -> usize {
        self.groups.len()
    }

    /// Linear drawdown s′ (m) at `point` and time t from well j alone (its own sources and its
    /// partial-penetration term): what its own rate does, for a loss given by an efficiency.
    pub fn own_linear_drawdown(&self, j: usize, point: [f64; 2], t: f64) -> f64 {
        let Some(g) = self.groups.get(j) else {
            return 0.0;
        };
        let mut total = self.sources_drawdown(&self.sources[g.clone()], point, t);
        if let Some(n) = &self.near {
            let row = (n.rows)(point);
            total -= self.well_rate(j, t) * row.get(j).copied().unwrap_or(0.0) / n.transmissivity;
        }
        if total.is_finite() {
            total
        } else {
            0.0
        }
    }

    /// The aquifer.
    pub fn aquifer(&self) -> &TransientAquifer {
        &self.aquifer
    }

    /// The sources.
    pub fn sources(&self) -> &[TransientSource] {
        &self.sources
    }

    /// Superposed linear drawdown s′ = Σ_sources Σ_k sign·ΔQ_k/(4πT)·W(u(t − t_k)), m, plus the
    /// quasi-steady partial-penetration term −Σ_j q_j(t)·ΔΦ_j/T when there is one.
    pub fn linear_drawdown(&self, point: [f64; 2], t: f64) -> f64 {
        let mut total = self.sources_drawdown(&self.sources, point, t);
        if let Some(n) = &self.near {
            if t.is_finite() {
                let row = (n.rows)(point);
                let d: f64 = row
                    .iter()
                    .enumerate()
                    .map(|(j, v)| self.well_rate(j, t) * v)
                    .sum();
                total -= d / n.transmissivity;
            }
        }
        if total.is_finite() {
            total
        } else {
            0.0
        }
    }

    /// Σ over `sources` of sign·ΔQ_k/(4πT)·W(u(t − t_k)), m.
    fn sources_drawdown(&self, sources: &[TransientSource], point: [f64; 2], t: f64) -> f64 {
        if !(t.is_finite() && point[0].is_finite() && point[1].is_finite()) {
            return 0.0;
        }
        let (tr, s, inv_b) = self.aquifer.diffusion();
        let rw2 = self.well_radius * self.well_radius;
        let mut total = 0.0;
        for src in sources {
            let r2 = ((point[0] - src.x).powi(2) + (point[1] - src.y).powi(2)).max(rw2);
            for &(tk, dq) in &src.schedule.changes {
                let dt = t - tk;
                if dt <= 0.0 {
                    break; // changes are in time order
                }
                total += src.sign * dq * TransientAquifer::unit_term(r2, dt, tr, s, inv_b);
            }
        }
        if total.is_finite() {
            total
        } else {
            0.0
        }
    }

    /// Drawdown at `point` (x, y in m) and time `t` (s), m; positive = lowering.
    ///
    /// Confined s = Σ ΔQ/(4πT)·W(u), u = r²S/(4T·(t − t_k)) (Theis 1935); leaky with
    /// W(u, r/B) (Hantush & Jacob 1955); unconfined through Jacob's correction (module notes).
    /// Non-finite `point` or `t` gives 0.
    pub fn drawdown_at(&self, point: [f64; 2], t: f64) -> f64 {
        let s = self.aquifer.real_drawdown(self.linear_drawdown(point, t));
        if s.is_finite() {
            s
        } else {
            0.0
        }
    }

    /// Drawdowns at every point (rows) for every time (columns), m; points in parallel.
    ///
    /// The same sum as [`TransientModel::drawdown_at`]; for Theis (not leaky) the squared
    /// distances are taken once per point for every output time, S/(4T) and 1/(4πT) once, and
    /// W(u) is called only below its cut-off ([`well_function::W_CUTOFF_U`]).
    pub fn drawdowns(&self, points: &[[f64; 2]], times: &[f64]) -> Vec<Vec<f64>> {
        let (tr, s, inv_b) = self.aquifer.diffusion();
        if inv_b > 0.0 {
            return points
                .par_iter()
                .map(|p| times.iter().map(|t| self.drawdown_at(*p, *t)).collect())
                .collect();
        }
        let rw2 = self.well_radius * self.well_radius;
        let u_per_r2 = s / (4.0 * tr);
        let per_w = 1.0 / (4.0 * PI * tr);
        points
            .par_iter()
            .map(|p| {
                if !(p[0].is_finite() && p[1].is_finite()) {
                    return vec![self.aquifer.real_drawdown(0.0); times.len()];
                }
                let a: Vec<f64> = self
                    .sources
                    .iter()
                    .map(|src| {
                        ((p[0] - src.x).powi(2) + (p[1] - src.y).powi(2)).max(rw2) * u_per_r2
                    })
                    .collect();
                times
                    .iter()
                    .map(|&t| {
                        let mut total = 0.0;
                        if t.is_finite() {
                            for (src, &a) in self.sources.iter().zip(&a) {
                                let mut w_sum = 0.0;
                                for &(tk, dq) in &src.schedule.changes {
                                    let dt = t - tk;
                                    if dt <= 0.0 {
                                        break; // changes are in time order
                                    }
                                    let u = a / dt;
                                    if u < well_function::W_CUTOFF_U {
                                        let w = well_function::theis_w(u);
                                        if w.is_finite() {
                                            w_sum += dq * w;
                                        }
                                    }
                                }
                                total += src.sign * w_sum;
                            }
                        }
                        let linear = total * per_w;
                        let d = self.aquifer.real_drawdown(if linear.is_finite() {
                            linear
                        } else {
                            0.0
                        });
                        if d.is_finite() {
                            d
                        } else {
                            0.0
                        }
                    })
                    .collect()
            })
            .collect()
    }

    /// Drawdown per unit rate of every point for each source (columns), at time t, each source
    /// taken as running 1 m³/s from the start of its schedule: see
    /// [`TransientAquifer::unit_response`]. Sources are columns of their own here (an image is
    /// not grouped with its well); use the aquifer method to group them.
    pub fn unit_response(&self, points: &[[f64; 2]], t: f64) -> Vec<Vec<f64>> {
        let wells: Vec<(f64, Vec<[f64; 3]>)> = self
            .sources
            .iter()
            .map(|s| (s.schedule.start(), vec![[s.x, s.y, s.sign]]))
            .collect();
        self.aquifer
            .unit_response(self.well_radius, points, &wells, t)
    }

    /// First time (s) at which the drawdown at `point` reaches `target` (m), searched up to
    /// `t_max` (s); `None` if it is not reached by then (or the input is not finite).
    ///
    /// Method: the drawdown is sampled at 400 times spaced geometrically after the first rate
    /// change, the first sample at or above the target brackets the crossing, and bisection
    /// (at most 200 halvings, to a relative width of 1e-13) finds it. For a schedule that never
    /// lowers the rate and sources of positive sign the drawdown is monotone in time and the
    /// answer is exact; otherwise a crossing narrower than the sampling could be missed.
    pub fn time_to_reach(&self, point: [f64; 2], target: f64, t_max: f64) -> Option<f64> {
        if !(target.is_finite() && t_max.is_finite()) {
            return None;
        }
        let t0 = self
            .sources
            .iter()
            .filter_map(|s| s.schedule.changes.first().map(|c| c.0))
            .fold(f64::INFINITY, f64::min);
        if !t0.is_finite() || t_max <= t0 {
            return None;
        }
        let span = t_max - t0;
        let n: i32 = 400;
        let ratio = 1e12_f64.powf(1.0 / n as f64);
        let mut lo = t0;
        let mut hi = None;
        for i in 0..=n {
            let t = t0 + span * 1e-12 * ratio.powi(i);
            let t = if i == n { t_max } else { t.min(t_max) };
            if self.drawdown_at(point, t) >= target {
                hi = Some(t);
                break;
            }
            lo = t;
        }
        let mut hi = hi?;
        for _ in 0..200 {
            if hi - lo <= 1e-13 * hi.abs().max(1.0) {
                break;
            }
            let mid = 0.5 * (lo + hi);
            if self.drawdown_at(point, mid) >= target {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        Some(hi)
    }
}

#[cfg(test)]
mod tests;
