//! One layout ready for the rate options: its field, its unit rows and its well limits.
//!
//! Superposition is linear in Strack's discharge potential Φ (see [`crate::field::influence`]): the
//! potential at check point i is Φᵢ = Φ₀ + Σⱼ uᵢⱼ·qⱼ, with uᵢⱼ the change per unit rate of well j
//! (negative for pumping). A target level zₜ holds when Φᵢ ≤ Φ(zₜ) — exact, because Φ rises with
//! the level. Two rate options:
//! - **uniform** (one pump size on site, [`crate::optimise::uniform`]): the smallest q with
//!   Φ₀ + q·Σⱼuᵢⱼ ≤ Φ(zₜ) at every point, which is a ratio per point; then the limits are checked
//!   at that rate;
//! - **individual** ([`crate::optimise::individual`]): a linear programme
//!   ([`crate::optimise::lp`]) minimising Σqⱼ subject to the targets at every check point and the
//!   limits at every well ([`crate::optimise::limits`]).
//!
//! Every answer is re-evaluated by [`crate::check::evaluate::evaluate`] with the final rates and heads;
//! only a layout that passes there counts as meeting its targets.

use crate::check::evaluate::{evaluate, Evaluation};
use crate::field::checkpoints::CheckPoint;
use crate::field::influence::Field;
use crate::field::wells::Well;
use crate::input::model::Model;
use crate::optimise::limits::WellLimit;
use rayon::prelude::*;
use serde::Serialize;
use std::sync::OnceLock;

/// Most rate variables in one linear programme; above it neighbouring wells share a rate.
pub const MAX_LP_VARIABLES: usize = 120;

/// How the rates are chosen.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RateOption {
    /// The same rate in every well (one pump size on site).
    Uniform,
    /// A rate per well, minimising the total flow (linear programme).
    Individual,
}

impl RateOption {
    /// Name for reports.
    pub fn describe(self) -> &'static str {
        match self {
            RateOption::Uniform => "same rate in every well",
            RateOption::Individual => "individual rates (least total flow)",
        }
    }
}

/// One layout with its unit matrix, ready for both rate options.
///
/// Above [`MAX_LP_VARIABLES`] wells, neighbouring wells along the ring or line share one rate
/// in the linear programme (groups of consecutive wells, never across a gap): closely spaced
/// wellpoints have nearly equal columns, which both slows the simplex and makes it singular.
/// The grouped answer is feasible for every well (every well's own limits are constraints) and
/// is evaluated in full; its total can only be at or a little above the ungrouped optimum.
pub struct LayoutRates<'a> {
    pub(super) model: &'a Model,
    pub(super) points: &'a [CheckPoint],
    /// The wells (rates ignored).
    pub wells: Vec<Well>,
    /// The field they make.
    pub field: Field,
    /// Indices of the check points that carry a target.
    pub(super) targets: Vec<usize>,
    /// Φ at each target level (parallel to `targets`).
    pub(super) target_phi: Vec<f64>,
    /// Unit rows per well at the target points and at the wells, built once when first needed
    /// and shared by the rate options, the one-well-out rows and the one-well-out report.
    pub(super) unit: OnceLock<UnitRows>,
    /// The unit rows at the target points summed when the layout was built (for the row sums),
    /// kept for [`LayoutRates::unit`] instead of summed again.
    summed_rows: std::sync::Mutex<Option<Vec<Vec<f64>>>>,
    /// Unit rows per rate group at the target points and at the wells, folded from `unit` when
    /// the linear programme first needs them.
    pub(super) matrices: OnceLock<Matrices>,
    /// Positions of the target points.
    pub(super) positions: Vec<[f64; 2]>,
    /// Partial-penetration tables of each target point at its own elevation (parallel to
    /// `positions`; see [`crate::check::field_build::point_elevation`]).
    pub(super) target_tables: Vec<Option<crate::field::near_field::PointTables>>,
    /// Positions of the wells.
    pub(super) well_positions: Vec<[f64; 2]>,
    /// Row sums of the unit rows at the target points (ΔΦ per unit uniform rate).
    pub(super) a_sum: Vec<f64>,
    /// Row sums of the unit rows at the wells (summed when first needed: only the uniform
    /// option reads them).
    at_wells_sum: OnceLock<Vec<f64>>,
    /// Wells of each rate group (indices into `wells`).
    pub(super) groups: Vec<Vec<usize>>,
    /// Group of each well; `None` for a recharge well kept at its given (negative) rate.
    pub(super) group_of: Vec<Option<usize>>,
    /// Limits per well.
    pub limits: Vec<WellLimit>,
    pub(super) phi0: f64,
    /// Φ₀ plus the effect of the recharge wells at each target point.
    pub(super) base_t: Vec<f64>,
    /// Φ₀ plus the effect of the recharge wells at each well.
    pub(super) base_w: Vec<f64>,
    /// The solver of the linear programmes (the simplex, then the interior point when the
    /// simplex fails numerically, unless set otherwise for a comparison).
    pub solver: crate::optimise::lp::Solver,
    /// Cost per unit rate of each well in the least-cost programme (`None`: 1 for every well,
    /// the least total flow). The fewest-wells placement weighs each rate by 1 / capacity.
    pub well_cost: Option<Vec<f64>>,
}

/// Unit rows per well: ΔΦ per unit rate of each well.
pub struct UnitRows {
    /// At the target points.
    pub(super) at_targets: Vec<Vec<f64>>,
    /// At the wells.
    pub(super) at_wells: Vec<Vec<f64>>,
}

/// Unit rows folded by rate group.
pub(super) struct Matrices {
    /// At the target points.
    pub(super) a: Vec<Vec<f64>>,
    /// At the wells.
    pub(super) at_wells: Vec<Vec<f64>>,
}

/// Groups of consecutive wells (indices `free` into `wells`) sharing one rate, at most `max`
/// groups, never across a gap (a step more than three times the median step between
/// consecutive wells).
///
/// A closed run (a ring: its last well as near its first as neighbours are) is cut into equal
/// groups. An open run (a line) is cut into groups that grow from each end towards the middle:
/// single wells at the ends, where a line needs more than its middle (fewer neighbours draw
/// there) and where its end wells can give more before their level limit binds, and long
/// groups in the middle, where a long line is uniform. Equal groups along a long line held each
/// end group to its innermost member's limit, and a line of 400 m or more met no target at any
/// spacing (issue 20).
fn rate_groups(wells: &[Well], free: &[usize], max: usize) -> Vec<Vec<usize>> {
    let n = free.len();
    if n <= max {
        return free.iter().map(|&k| vec![k]).collect();
    }
    let (runs, closed) = runs_of(wells, free);
    if closed {
        let size = n.div_ceil(max.max(1)).max(1);
        return runs
            .into_iter()
            .flat_map(|run| {
                let g = run.len().div_ceil(size).max(1);
                let per = run.len().div_ceil(g);
                run.chunks(per).map(<[usize]>::to_vec).collect::<Vec<_>>()
            })
            .collect();
    }
    // The budget of groups shared among the runs in proportion to their wells.
    let budget = max.max(runs.len());
    runs.iter()
        .flat_map(|run| {
            let share = (budget * run.len() / n).max(1);
            graded_chunks(run.len(), share)
                .into_iter()
                .map(|(a, b)| run[a..b].to_vec())
                .collect::<Vec<_>>()
        })
        .collect()
}

/// Wellpoints by pump set: each run of consecutive wellpoints (as in [`rate_groups`]) cut
/// into sets of `set_length` m of header, measured along the run; the wellpoints of a set
/// share one rate (one header, one vacuum: common practice (no source)).
fn set_groups(wells: &[Well], free: &[usize], set_length: f64) -> Vec<Vec<usize>> {
    if free.len() < 2 {
        return free.iter().map(|&k| vec![k]).collect();
    }
    let (runs, _) = runs_of(wells, free);
    let mut groups = Vec::new();
    for run in runs {
        let mut along = 0.0;
        let mut group: Vec<usize> = Vec::new();
        for (i, &k) in run.iter().enumerate() {
            if i > 0 {
                let (a, b) = (wells[run[i - 1]].position, wells[k].position);
                along += (b[0] - a[0]).hypot(b[1] - a[1]);
            }
            if along >= set_length && !group.is_empty() {
                groups.push(std::mem::take(&mut group));
                along = 0.0;
            }
            group.push(k);
        }
        if !group.is_empty() {
            groups.push(group);
        }
    }
    groups
}

/// Runs of consecutive wells (indices `free` into `wells`), cut at a step more than three times
/// the median step; and whether the one run is closed (its last well as near its first as
/// neighbours are).
fn runs_of(wells: &[Well], free: &[usize]) -> (Vec<Vec<usize>>, bool) {
    let n = free.len();
    let dist = |a: usize, b: usize| {
        let (a, b) = (wells[a].position, wells[b].position);
        (b[0] - a[0]).hypot(b[1] - a[1])
    };
    let step = |i: usize| dist(free[i], free[i + 1]);
    let mut steps: Vec<f64> = (0..n - 1).map(step).collect();
    steps.sort_by(f64::total_cmp);
    let median = steps.get(steps.len() / 2).copied().unwrap_or(0.0);
    let mut runs: Vec<Vec<usize>> = vec![vec![free[0]]];
    for (i, &k) in free.iter().enumerate().skip(1) {
        if step(i - 1) > 3.0 * median {
            runs.push(Vec::new());
        }
        if let Some(r) = runs.last_mut() {
            r.push(k);
        }
    }
    let closed = runs.len() == 1 && dist(free[0], free[n - 1]) <= 3.0 * median;
    (runs, closed)
}

/// Cut `len` consecutive wells into at most `groups` ranges whose sizes grow geometrically from
/// each end towards the middle (1, ρ, ρ², … rounded), ρ the least ratio that fits.
fn graded_chunks(len: usize, groups: usize) -> Vec<(usize, usize)> {
    if len <= groups {
        return (0..len).map(|i| (i, i + 1)).collect();
    }
    let half = len / 2;
    // Ranges from one end covering `h` wells with ratio ρ: boundaries ⌊(ρⁱ − 1)/(ρ − 1)⌋.
    let cut = |rho: f64, h: usize| -> Vec<usize> {
        let mut b = vec![0usize];
        let mut i = 1;
        while *b.last().unwrap_or(&h) < h {
            let edge = (rho.powi(i) - 1.0) / (rho - 1.0);
            let e = (edge.floor() as usize).min(h);
            if e > *b.last().unwrap_or(&0) {
                b.push(e);
            }
            i += 1;
        }
        b
    };
    let count = |rho: f64| cut(rho, half).len() + cut(rho, len - half).len() - 2;
    let (mut lo, mut hi) = (1.0f64, 2.0f64);
    while count(hi) > groups.max(2) {
        hi *= 2.0;
    }
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if count(mid) > groups.max(2) {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    let first = cut(hi, half);
    let second = cut(hi, len - half);
    let mut out: Vec<(usize, usize)> = first.windows(2).map(|w| (w[0], w[1])).collect();
    // The other half, mirrored: its single wells at the far end.
    let mut tail: Vec<(usize, usize)> = second
        .windows(2)
        .map(|w| (len - w[1], len - w[0]))
        .collect();
    tail.reverse();
    out.extend(tail);
    out
}

impl<'a> LayoutRates<'a> {
    /// Build the field and the unit matrix of `wells` (their rates are ignored) at `points`.
    pub fn new(model: &'a Model, points: &'a [CheckPoint], wells: Vec<Well>) -> LayoutRates<'a> {
        Self::with_groups(model, points, wells, MAX_LP_VARIABLES)
    }

    /// As [`LayoutRates::new`], with at most `max_groups` rate variables in the programme.
    pub fn with_groups(
        model: &'a Model,
        points: &'a [CheckPoint],
        wells: Vec<Well>,
        max_groups: usize,
    ) -> LayoutRates<'a> {
        Self::build(model, points, wells, max_groups, None)
    }

    /// As [`LayoutRates::with_groups`], the unit rows taken from `from` instead of summed
    /// again: `from` holds the unit rows of a larger set of wells at the same `points` (built
    /// alike, no recharge well), and well i of `wells` is well `columns[i]` of that set. ΔΦ per
    /// unit rate of one well at one point does not depend on the other wells, so the rows of
    /// `wells` are those columns (the same numbers: tested against rows summed afresh).
    pub fn with_unit_rows(
        model: &'a Model,
        points: &'a [CheckPoint],
        wells: Vec<Well>,
        max_groups: usize,
        from: &UnitRows,
        columns: &[usize],
    ) -> LayoutRates<'a> {
        let pick = |row: &[f64]| -> Vec<f64> { columns.iter().map(|&c| row[c]).collect() };
        let rows = UnitRows {
            at_targets: from.at_targets.iter().map(|r| pick(r)).collect(),
            at_wells: columns.iter().map(|&c| pick(&from.at_wells[c])).collect(),
        };
        Self::build(model, points, wells, max_groups, Some(rows))
    }

    /// The unit rows of this layout (built now if not yet), to be shared by the layouts of
    /// [`LayoutRates::with_unit_rows`].
    pub fn into_unit_rows(self) -> UnitRows {
        self.unit();
        self.unit.into_inner().unwrap_or(UnitRows {
            at_targets: Vec::new(),
            at_wells: Vec::new(),
        })
    }

    fn build(
        model: &'a Model,
        points: &'a [CheckPoint],
        wells: Vec<Well>,
        max_groups: usize,
        given_rows: Option<UnitRows>,
    ) -> LayoutRates<'a> {
        let field = crate::check::run::field_for(model, &wells);
        let aq = &model.aquifer;
        let targets: Vec<usize> = points
            .iter()
            .enumerate()
            .filter(|(_, p)| p.target_level.is_some())
            .map(|(i, _)| i)
            .collect();
        let target_phi = targets
            .iter()
            .map(|&i| aq.potential(points[i].target_level.unwrap_or(f64::NAN)))
            .collect();
        // A negative rate marks a recharge well: it keeps its rate; every other rate is found.
        let free: Vec<usize> = (0..wells.len()).filter(|&k| wells[k].rate >= 0.0).collect();
        let groups = if model.wells.kind == crate::input::model::WellKind::Wellpoint
            && model.design.pumps.rates_per_set
        {
            let sets = set_groups(&wells, &free, model.design.pumps.wellpoint_set_length);
            if sets.len() <= max_groups {
                sets
            } else {
                rate_groups(&wells, &free, max_groups)
            }
        } else {
            rate_groups(&wells, &free, max_groups)
        };
        let mut group_of = vec![None; wells.len()];
        for (g, members) in groups.iter().enumerate() {
            for &k in members {
                group_of[k] = Some(g);
            }
        }
        let phi0 = aq.initial_potential();
        // Row sums (ΔΦ per unit uniform rate) and the recharge wells' effect, without the
        // matrix: the uniform option needs nothing more.
        let free_ones: Vec<f64> = wells
            .iter()
            .map(|w| if w.rate >= 0.0 { 1.0 } else { 0.0 })
            .collect();
        let fixed: Vec<f64> = wells.iter().map(|w| w.rate.min(0.0)).collect();
        let any_fixed = fixed.iter().any(|q| *q < 0.0);
        let positions: Vec<[f64; 2]> = targets.iter().map(|&i| points[i].position).collect();
        let target_points: Vec<CheckPoint> = targets.iter().map(|&i| points[i].clone()).collect();
        let target_tables = crate::check::field_build::point_tables(model, &field, &target_points);
        // the target points at their own elevations (the rows summed here are kept for
        // `unit`)
        let summed: Option<Vec<Vec<f64>>> = given_rows.is_none().then(|| {
            positions
                .par_iter()
                .zip(&target_tables)
                .map(|(p, t)| field.unit_row_at(*p, t.as_ref()))
                .collect()
        });
        let (a_sum, base_t): (Vec<f64>, Vec<f64>) = given_rows
            .as_ref()
            .map_or_else(|| summed.as_deref().unwrap_or_default(), |r| &r.at_targets)
            .par_iter()
            .map(|row| {
                let dot = |q: &[f64]| row.iter().zip(q).map(|(a, b)| a * b).sum::<f64>();
                (
                    dot(&free_ones),
                    phi0 + if any_fixed { dot(&fixed) } else { 0.0 },
                )
            })
            .unzip();
        let well_positions: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
        // Φ₀ and the recharge wells' effect at each well; the row sums at the wells when first
        // needed (with recharge wells, now: one kernel sum gives both)
        let at_wells_sum = OnceLock::new();
        let base_w: Vec<f64> = if any_fixed {
            let (sums, base): (Vec<f64>, Vec<f64>) = well_positions
                .par_iter()
                .map(|p| {
                    (
                        field.delta_potential(*p, &free_ones),
                        phi0 + field.delta_potential(*p, &fixed),
                    )
                })
                .unzip();
            let _ = at_wells_sum.set(sums);
            base
        } else {
            vec![phi0 + 0.0; well_positions.len()]
        };
        // The design runs each well at no more than the design file's capacity fraction.
        let fraction = model.design.capacity_fraction;
        let efficiency = matches!(
            model.as_built.loss,
            crate::input::model::WellLossSpec::Efficiency(_)
        );
        let limits = wells
            .iter()
            .enumerate()
            .map(|(k, w)| {
                // a well efficiency needs the well's own ΔΦ per unit rate at its face
                let own = if efficiency {
                    field.unit_row(w.position)[k]
                } else {
                    0.0
                };
                let mut l = WellLimit::new(model, w, own);
                l.capacity_per_metre *= fraction;
                l.pump = l.pump.map(|p| p * fraction);
                l
            })
            .collect();
        let unit = OnceLock::new();
        if let Some(rows) = given_rows {
            let _ = unit.set(rows);
        }
        LayoutRates {
            model,
            points,
            wells,
            field,
            targets,
            target_phi,
            unit,
            summed_rows: std::sync::Mutex::new(summed),
            matrices: OnceLock::new(),
            positions,
            target_tables,
            well_positions,
            a_sum,
            at_wells_sum,
            groups,
            group_of,
            limits,
            phi0,
            base_t,
            base_w,
            solver: crate::optimise::lp::Solver::SimplexThenInteriorPoint,
            well_cost: None,
        }
    }

    /// The unit rows per well at the targets and at the wells, built once (a kernel sum per
    /// point); every later call reuses them.
    pub(super) fn unit(&self) -> &UnitRows {
        use crate::work_counts::{add, UNIT_MATRIX_BUILDS, UNIT_MATRIX_REUSES};
        let mut built = false;
        let rows = self.unit.get_or_init(|| {
            built = true;
            add(&UNIT_MATRIX_BUILDS, 1);
            UnitRows {
                at_targets: self
                    .summed_rows
                    .lock()
                    .ok()
                    .and_then(|mut r| r.take())
                    .unwrap_or_else(|| {
                        self.positions
                            .par_iter()
                            .zip(&self.target_tables)
                            .map(|(p, t)| self.field.unit_row_at(*p, t.as_ref()))
                            .collect()
                    }),
                at_wells: self.field.unit_matrix(&self.well_positions),
            }
        });
        if !built {
            add(&UNIT_MATRIX_REUSES, 1);
        }
        rows
    }

    /// Row sums of the unit rows at the wells: ΔΦ at each well per unit rate in every pumping
    /// well (a kernel sum per well, once).
    pub(super) fn at_wells_sum(&self) -> &[f64] {
        self.at_wells_sum.get_or_init(|| {
            let ones: Vec<f64> = self
                .wells
                .iter()
                .map(|w| if w.rate >= 0.0 { 1.0 } else { 0.0 })
                .collect();
            self.well_positions
                .par_iter()
                .map(|p| self.field.delta_potential(*p, &ones))
                .collect()
        })
    }

    /// The unit rows per rate group (ΔΦ per unit rate of each group), folded once from
    /// [`LayoutRates::unit`].
    pub(super) fn matrices(&self) -> &Matrices {
        self.matrices.get_or_init(|| {
            let unit = self.unit();
            let fold = |rows: &[Vec<f64>]| -> Vec<Vec<f64>> {
                rows.par_iter()
                    .map(|r| {
                        self.groups
                            .iter()
                            .map(|m| m.iter().map(|&k| r[k]).sum())
                            .collect::<Vec<f64>>()
                    })
                    .collect::<Vec<Vec<f64>>>()
            };
            Matrices {
                a: fold(&unit.at_targets),
                at_wells: fold(&unit.at_wells),
            }
        })
    }

    /// Evaluate the layout at `rates` with the plain solver.
    pub fn evaluate(&self, rates: &[f64]) -> Evaluation {
        crate::work_counts::add(&crate::work_counts::EVALUATIONS, 1);
        let wells = self.with_rates(rates);
        evaluate(self.model, &self.field, &wells, self.points)
    }

    /// The wells with `rates`.
    pub fn with_rates(&self, rates: &[f64]) -> Vec<Well> {
        self.wells
            .iter()
            .zip(rates)
            .map(|(w, q)| Well {
                rate: *q,
                ..w.clone()
            })
            .collect()
    }

    pub(super) fn level_of(&self, phi: f64) -> f64 {
        let aq = &self.model.aquifer;
        aq.level(phi).or_base(aq.base_level)
    }

    /// Rate `q` in every pumping well (recharge wells keep theirs).
    pub fn uniform_rates(&self, q: f64) -> Vec<f64> {
        self.group_of
            .iter()
            .zip(&self.wells)
            .map(|(g, w)| if g.is_some() { q } else { w.rate })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::{graded_chunks, rate_groups};
    use crate::field::wells::Well;

    fn well(x: f64, y: f64) -> Well {
        Well {
            name: String::new(),
            position: [x, y],
            rate: 0.0,
            radius: 0.05,
            screen_top: 0.0,
            screen_base: -1.0,
            filter_top: 0.0,
            filter_base: -1.0,
            pump_intake: -1.0,
            kind: crate::input::model::WellKind::Wellpoint,
            note: None,
            role: crate::field::wells::WellRole::Duty,
        }
    }

    // Invariants of the grouping (no reference needed: a partition): every pumping well in
    // exactly one group, groups of consecutive wells, at most `max` groups, single wells at
    // both ends of an open line and the largest group in its middle.
    #[test]
    fn graded_groups_partition_a_line_with_single_wells_at_its_ends() {
        for len in [121, 200, 577, 1000, 2000] {
            for groups in [16, 60, 120] {
                let c = graded_chunks(len, groups);
                assert!(
                    c.len() <= groups,
                    "{len} wells, {groups}: {} groups",
                    c.len()
                );
                assert_eq!(c[0], (0, 1));
                assert_eq!(c[c.len() - 1], (len - 1, len));
                for w in c.windows(2) {
                    assert_eq!(w[0].1, w[1].0, "consecutive");
                }
                // the largest group in the middle half of the line
                let (big, _) = c
                    .iter()
                    .enumerate()
                    .max_by_key(|(_, r)| r.1 - r.0)
                    .expect("groups");
                let at = (c[big].0 + c[big].1) as f64 / 2.0 / len as f64;
                assert!(
                    (0.25..=0.75).contains(&at),
                    "{len}, {groups}: largest at {at}"
                );
            }
        }
        // two lines (both sides of a trench) and a ring
        let mut wells: Vec<Well> = (0..300).map(|i| well(i as f64, -2.5)).collect();
        wells.extend((0..300).map(|i| well(i as f64, 2.5)));
        let free: Vec<usize> = (0..wells.len()).collect();
        let g = rate_groups(&wells, &free, 120);
        assert!(g.len() <= 120);
        let mut seen: Vec<usize> = g.iter().flatten().copied().collect();
        seen.sort_unstable();
        assert_eq!(seen, free);
        assert!(g
            .iter()
            .all(|m| m.iter().all(|&k| (k < 300) == (m[0] < 300))));
        assert_eq!(g[0], vec![0]);
        let ring: Vec<Well> = (0..400)
            .map(|i| {
                let a = i as f64 / 400.0 * std::f64::consts::TAU;
                well(100.0 * a.cos(), 100.0 * a.sin())
            })
            .collect();
        let free: Vec<usize> = (0..400).collect();
        let g = rate_groups(&ring, &free, 120);
        assert!(
            g.len() <= 120
                && g.iter()
                    .all(|m| m.len() == g[0].len() || m.len() < g[0].len())
        );
    }

    // The fewest-wells search takes a layout's unit rows as columns of the rows of every
    // candidate (`with_unit_rows`). Checked against the plain all-pairs sum of the kernel
    // (every source of every well, no R-tree) for the subset, and against the rows the subset
    // sums itself: the riverside pit (a constant-head river image and partial penetration).
    #[test]
    fn candidate_columns_are_the_subsets_own_rows() {
        use super::LayoutRates;
        use crate::field::wells::Well;
        let model =
            crate::input::validate::file::load(std::path::Path::new("layouts/riverside_pit.toml"))
                .expect("demo loads");
        let points = crate::field::checkpoints::check_points(&model);
        let all: Vec<Well> = (0..24)
            .map(|i| {
                let a = i as f64 / 24.0 * std::f64::consts::TAU;
                let p = [20.0 + 25.0 * a.cos(), 8.0 + 13.0 * a.sin()];
                Well::from_spec(format!("C{i}"), p, 0.0, &model.wells)
            })
            .collect();
        let cols = [3usize, 7, 8, 15, 22];
        let sub: Vec<Well> = cols.iter().map(|&c| all[c].clone()).collect();
        let rows = LayoutRates::with_groups(&model, &points, all, usize::MAX).into_unit_rows();
        let taken =
            LayoutRates::with_unit_rows(&model, &points, sub.clone(), usize::MAX, &rows, &cols);
        let fresh = LayoutRates::with_groups(&model, &points, sub, usize::MAX);
        let (t, f) = (taken.unit(), fresh.unit());
        assert_eq!(t.at_targets, f.at_targets, "rows at the targets");
        assert_eq!(t.at_wells, f.at_wells, "rows at the wells");
        assert_eq!(taken.a_sum, fresh.a_sum);
        // the plain sum at the wells (the target rows read each point's own elevation)
        for (k, w) in fresh.wells.iter().enumerate() {
            let plain = fresh.field.unit_row_all_pairs(w.position);
            for (a, b) in t.at_wells[k].iter().zip(&plain) {
                assert!(
                    (a - b).abs() <= 1e-12 * b.abs().max(1e-3),
                    "{a} vs plain {b}"
                );
            }
        }
    }
}
