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
use crate::field::near_field::PointTables;
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
    /// Unit rows per rate group at the target points and at the wells, built when the linear
    /// programme first needs them.
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
    /// Row sums of the unit rows at the wells.
    pub(super) at_wells_sum: Vec<f64>,
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
fn rate_groups(wells: &[Well], free: &[usize], max: usize) -> Vec<Vec<usize>> {
    let n = free.len();
    if n <= max {
        return free.iter().map(|&k| vec![k]).collect();
    }
    let step = |i: usize| {
        let (a, b) = (wells[free[i]].position, wells[free[i + 1]].position);
        (b[0] - a[0]).hypot(b[1] - a[1])
    };
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
    let size = n.div_ceil(max.max(1)).max(1);
    runs.into_iter()
        .flat_map(|run| {
            let g = run.len().div_ceil(size).max(1);
            let per = run.len().div_ceil(g);
            run.chunks(per).map(<[usize]>::to_vec).collect::<Vec<_>>()
        })
        .collect()
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
        let groups = rate_groups(&wells, &free, max_groups);
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
        let sums = |pts: &[[f64; 2]]| -> (Vec<f64>, Vec<f64>) {
            pts.par_iter()
                .map(|p| {
                    let base = if any_fixed {
                        field.delta_potential(*p, &fixed)
                    } else {
                        0.0
                    };
                    (field.delta_potential(*p, &free_ones), phi0 + base)
                })
                .unzip()
        };
        let positions: Vec<[f64; 2]> = targets.iter().map(|&i| points[i].position).collect();
        let target_points: Vec<CheckPoint> = targets.iter().map(|&i| points[i].clone()).collect();
        let target_tables = crate::check::field_build::point_tables(model, &field, &target_points);
        // the target points at their own elevations
        let (a_sum, base_t): (Vec<f64>, Vec<f64>) = positions
            .par_iter()
            .zip(&target_tables)
            .map(|(p, t)| {
                let row = field.unit_row_at(*p, t.as_ref());
                let dot = |q: &[f64]| row.iter().zip(q).map(|(a, b)| a * b).sum::<f64>();
                (
                    dot(&free_ones),
                    phi0 + if any_fixed { dot(&fixed) } else { 0.0 },
                )
            })
            .unzip();
        let well_positions: Vec<[f64; 2]> = wells.iter().map(|w| w.position).collect();
        let (at_wells_sum, base_w) = sums(&well_positions);
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
        LayoutRates {
            model,
            points,
            wells,
            field,
            targets,
            target_phi,
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
        }
    }

    /// The unit rows per rate group (ΔΦ per unit rate of each group), built once.
    pub(super) fn matrices(&self) -> &Matrices {
        self.matrices.get_or_init(|| {
            let fold = |pts: &[[f64; 2]], tables: Option<&[Option<PointTables>]>| {
                pts.par_iter()
                    .enumerate()
                    .map(|(i, p)| {
                        let t = tables.and_then(|t| t[i].as_ref());
                        let r = self.field.unit_row_at(*p, t);
                        self.groups
                            .iter()
                            .map(|m| m.iter().map(|&k| r[k]).sum())
                            .collect::<Vec<f64>>()
                    })
                    .collect::<Vec<Vec<f64>>>()
            };
            Matrices {
                a: fold(&self.positions, Some(&self.target_tables)),
                at_wells: fold(&self.well_positions, None),
            }
        })
    }

    /// Evaluate the layout at `rates` with the plain solver.
    pub fn evaluate(&self, rates: &[f64]) -> Evaluation {
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
