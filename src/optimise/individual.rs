//! The individual rate option: a rate per well, least total flow, by linear programme.
//!
//! # Size of the linear programme
//! A layout has hundreds of check points but only a few bind. The programme starts with the
//! points that need the most from a uniform rate (and, for each well, the neediest point it
//! serves most), solves, checks every point and well against the full unit matrix, adds the most
//! violated rows (a bounded number per round) and solves again, until nothing is violated. The
//! answer is the optimum of the full programme (a relaxation whose optimum is feasible for the
//! whole). Above [`crate::optimise::rates::MAX_LP_VARIABLES`] wells, neighbouring wells share a rate (see
//! [`LayoutRates`]).

use crate::optimise::binding::{Binding, LevelLoss};
use crate::optimise::limits::CAPACITY_SAFETY;
use crate::optimise::lp;
use crate::optimise::lp_problem::{Constraint, LpSolution, LpStatus, RateProblem, Sense};
use crate::optimise::rates::{LayoutRates, Matrices};

/// Most rounds of adding violated constraints before the full programme is used.
const MAX_ROUNDS: usize = 40;
/// Relative tolerance on a violated constraint when adding rows, on the potential scale.
const ROW_TOLERANCE: f64 = 1e-9;

/// The individual-rate answer for one layout.
#[derive(Debug, Clone)]
pub struct Individual {
    /// How the programme ended.
    pub status: LpStatus,
    /// Rates, m³/s (empty unless solved).
    pub rates: Vec<f64>,
    /// Σ rates, m³/s.
    pub total: f64,
    /// Constraints that bind at the optimum.
    pub binding: Vec<Binding>,
    /// Solved, and the evaluation confirms every target and limit.
    pub met: bool,
    /// Rounds of adding violated constraints.
    pub rounds: usize,
    /// Rate variables in the programme (the number of pumping wells unless neighbouring wells
    /// share a rate).
    pub groups: usize,
}

/// A row given per well: Σₖ cₖ·qₖ ≥ rhs, qₖ the rate of well k (m³/s).
#[derive(Debug, Clone)]
pub struct WellRow {
    /// cₖ for every well of the layout.
    pub per_well: Vec<f64>,
    /// Right-hand side.
    pub rhs: f64,
    /// What it stands for.
    pub label: Binding,
}

/// Which constraint a programme row stands for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum RowRef {
    Target(usize),
    Level(usize, usize),
    Capacity(usize, usize),
}

/// The rows a programme was last solved with: carried into the next solve of the same layout
/// (the next round of one-well-out rows), so that row generation does not start again.
#[derive(Debug, Clone, Default)]
pub struct CarriedRows(Vec<RowRef>);

/// A solve of the rate programme ([`LayoutRates::solve_carried`]): optimal and not yet judged,
/// or final.
#[derive(Debug)]
pub struct Pending(PendingKind);

#[derive(Debug)]
enum PendingKind {
    /// Optimal; the rows it was solved with and the rates per well.
    Solved {
        sol: LpSolution,
        rows: Vec<RowRef>,
        rounds: usize,
        rates: Vec<f64>,
    },
    /// The answer as it stands (not optimal, or solved on coarser rate groups and judged).
    Judged(Individual),
}

impl Pending {
    /// How the programme ended.
    pub fn status(&self) -> LpStatus {
        match &self.0 {
            PendingKind::Solved { .. } => LpStatus::Optimal,
            PendingKind::Judged(ind) => ind.status.clone(),
        }
    }

    /// Rates per well, m³/s (empty unless solved).
    pub fn rates(&self) -> &[f64] {
        match &self.0 {
            PendingKind::Solved { rates, .. } => rates,
            PendingKind::Judged(ind) => &ind.rates,
        }
    }

    /// The answer, judged on `layout` (the layout it was solved for).
    pub fn judge(self, layout: &LayoutRates) -> Individual {
        match self.0 {
            PendingKind::Solved {
                sol,
                rows,
                rounds,
                rates,
            } => layout.judged(sol, rows, rounds, rates),
            PendingKind::Judged(ind) => ind,
        }
    }
}

/// What the programme minimises.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Goal {
    /// Total flow, within every limit.
    MinFlow,
    /// The largest shortfall (in Φ) over the targets, within every limit.
    MinShortfall,
    /// Total flow with no well limits at all (a lower bound on the flow a layout needs).
    TargetsOnly,
}

/// Which rows the programme already holds: target points, and per well its level and capacity
/// pieces.
struct HaveRows {
    /// Per target point.
    target: Vec<bool>,
    /// Per well, per piece of the level floor.
    level: Vec<Vec<bool>>,
    /// Per well, per piece of the capacity.
    cap: Vec<Vec<bool>>,
}

/// Violated rows with their relative violation, most violated first: (target points, well rows).
type Violations = (Vec<(f64, usize)>, Vec<(f64, RowRef)>);

fn dot(row: &[f64], x: &[f64]) -> f64 {
    row.iter().zip(x).map(|(a, b)| a * b).sum()
}

impl LayoutRates<'_> {
    /// Rates per well from the programme's values per group (recharge wells keep theirs).
    fn well_rates(&self, values: &[f64]) -> Vec<f64> {
        self.group_of
            .iter()
            .zip(&self.wells)
            .map(|(g, w)| match g {
                Some(g) => values.get(*g).copied().unwrap_or(0.0).max(0.0),
                None => w.rate,
            })
            .collect()
    }

    /// Option (b): a rate per well, least total flow, by linear programme.
    ///
    /// If the solver fails numerically (not an infeasible answer: a fault), the programme is
    /// solved again with half as many rate groups: coarser, but still within every well's own
    /// limits and evaluated in full.
    pub fn individual(&self) -> Individual {
        self.individual_with(&[])
    }

    /// As [`LayoutRates::individual`], with `extra` rows Σₖ cₖ·qₖ ≥ b given per well (folded
    /// into the rate groups here), present from the first round: the rows for one well out
    /// ([`crate::optimise::one_out`]).
    pub fn individual_with(&self, extra: &[WellRow]) -> Individual {
        self.individual_carried(extra, &mut CarriedRows::default())
    }

    /// As [`LayoutRates::individual_with`], starting from the rows in `carried` (those of an
    /// earlier solve of this layout) and leaving there the rows this solve ended with. The
    /// optimum is the same (row generation stops only when no row of the full programme is
    /// violated); fewer rounds lead to it.
    pub fn individual_carried(&self, extra: &[WellRow], carried: &mut CarriedRows) -> Individual {
        self.solve_carried(extra, carried).judge(self)
    }

    /// [`LayoutRates::individual_carried`] before its rates are judged (binding rows named,
    /// the layout evaluated at them): for a round whose rates are looked at only for rows still
    /// violated (one well out), judged only when it is the last.
    pub fn solve_carried(&self, extra: &[WellRow], carried: &mut CarriedRows) -> Pending {
        let (sol, rows, rounds) = self.solve(Goal::MinFlow, extra, &carried.0);
        if matches!(sol.status, LpStatus::Failed(_)) && self.groups.len() >= 16 {
            let mut coarser = LayoutRates::with_groups(
                self.model,
                self.points,
                self.wells.clone(),
                self.groups.len() / 2,
            );
            coarser.solver = self.solver;
            coarser.well_cost.clone_from(&self.well_cost);
            // the rows refer to this layout's rate groups: the coarser one starts afresh
            carried.0.clear();
            return Pending(PendingKind::Judged(coarser.individual_with(extra)));
        }
        carried.0.clone_from(&rows);
        if sol.status != LpStatus::Optimal {
            return Pending(PendingKind::Judged(Individual {
                status: sol.status,
                rates: Vec::new(),
                total: 0.0,
                binding: Vec::new(),
                met: false,
                rounds,
                groups: self.groups.len(),
            }));
        }
        let rates = self.well_rates(&sol.values);
        Pending(PendingKind::Solved {
            sol,
            rows,
            rounds,
            rates,
        })
    }

    /// The answer of a solved programme: its binding rows in words, and whether the evaluation
    /// at its rates confirms every target and limit.
    fn judged(
        &self,
        sol: LpSolution,
        rows: Vec<RowRef>,
        rounds: usize,
        rates: Vec<f64>,
    ) -> Individual {
        let binding = self.binding_labels(&sol, &rows, &rates);
        let e = self.evaluate(&rates);
        Individual {
            status: LpStatus::Optimal,
            total: rates.iter().filter(|q| **q > 0.0).sum(),
            rates,
            binding,
            met: e.targets_met && e.wells_ok,
            rounds,
            groups: self.groups.len(),
        }
    }

    /// Rates within every limit that make the largest shortfall (in Φ) over the targets as
    /// small as it can be: the best this layout can do when it cannot meet every target.
    pub fn least_shortfall(&self) -> Option<Vec<f64>> {
        let (sol, _, _) = self.solve(Goal::MinShortfall, &[], &[]);
        (sol.status == LpStatus::Optimal).then(|| self.well_rates(&sol.values))
    }

    /// Least total flow to meet the targets with no well limits at all, m³/s (a lower bound on
    /// what the layout needs).
    pub fn flow_without_limits(&self) -> Option<f64> {
        let (sol, _, _) = self.solve(Goal::TargetsOnly, &[], &[]);
        (sol.status == LpStatus::Optimal).then(|| {
            self.well_rates(&sol.values)
                .iter()
                .filter(|q| **q > 0.0)
                .sum()
        })
    }

    fn row(&self, r: RowRef, goal: Goal) -> Constraint {
        let g = self.groups.len();
        let width = g + usize::from(goal == Goal::MinShortfall);
        let mut coefficients = vec![0.0; width];
        match r {
            RowRef::Target(t) => {
                for (c, u) in coefficients.iter_mut().zip(&self.matrices().a[t]) {
                    *c = -u;
                }
                if goal == Goal::MinShortfall {
                    coefficients[g] = 1.0;
                }
                Constraint {
                    coefficients,
                    sense: Sense::AtLeast,
                    rhs: self.base_t[t] - self.target_phi[t],
                    label: self.binding_of(r).words(self.model.units),
                }
            }
            RowRef::Level(k, i) => {
                coefficients[..g].copy_from_slice(&self.matrices().at_wells[k]);
                let lim = &self.limits[k];
                let (phi, slope) = lim.level_pieces[i];
                if let Some(gk) = self.group_of[k] {
                    coefficients[gk] -= slope;
                }
                Constraint {
                    coefficients,
                    sense: Sense::AtLeast,
                    rhs: phi - self.base_w[k],
                    label: self.binding_of(r).words(self.model.units),
                }
            }
            RowRef::Capacity(k, s) => {
                let lim = &self.limits[k];
                let (pa, ha, slope) = lim.pieces[s];
                let f = CAPACITY_SAFETY * lim.capacity_per_metre;
                for (c, u) in coefficients.iter_mut().zip(&self.matrices().at_wells[k]) {
                    *c = -f * slope * u;
                }
                if let Some(g) = self.group_of[k] {
                    coefficients[g] += 1.0;
                }
                Constraint {
                    coefficients,
                    sense: Sense::AtMost,
                    rhs: f * (ha + slope * (self.base_w[k] - pa)),
                    label: self.binding_of(r).words(self.model.units),
                }
            }
        }
    }

    /// The cost of each rate group (the wells' costs, or their number) and its rate bounds
    /// (capped by the wells' capacity unless only targets count); with a shortfall variable
    /// appended when the goal is the least shortfall.
    fn costs_and_bounds(&self, goal: Goal) -> (Vec<f64>, Vec<(f64, f64)>) {
        let limits_on = goal != Goal::TargetsOnly;
        let aq_initial = self.model.aquifer.initial_level;
        let mut costs: Vec<f64> = self
            .groups
            .iter()
            .map(|m| match &self.well_cost {
                Some(c) => m.iter().map(|&k| c.get(k).copied().unwrap_or(1.0)).sum(),
                None => m.len() as f64,
            })
            .collect();
        let mut bounds: Vec<(f64, f64)> = self
            .groups
            .iter()
            .map(|m| {
                let hi = if limits_on {
                    m.iter()
                        .map(|&k| self.limits[k].capacity_at(aq_initial) * CAPACITY_SAFETY)
                        .fold(f64::INFINITY, f64::min)
                } else {
                    f64::INFINITY
                };
                (0.0, hi)
            })
            .collect();
        if goal == Goal::MinShortfall {
            // Shortfall first; a little weight on the flow picks the leanest of equal answers.
            costs.iter_mut().for_each(|c| *c *= 1e-4);
            costs.push(1.0);
            bounds.push((0.0, f64::INFINITY));
        }
        (costs, bounds)
    }

    /// The target points, neediest first: by the uniform rate each asks for.
    fn neediest_first(&self) -> Vec<(f64, usize)> {
        let mut order: Vec<(f64, usize)> = self
            .a_sum
            .iter()
            .enumerate()
            .map(|(t, &s)| {
                let deficit = self.base_t[t] - self.target_phi[t];
                let need = if s < 0.0 {
                    deficit / -s
                } else if deficit > 0.0 {
                    f64::INFINITY
                } else {
                    f64::NEG_INFINITY
                };
                (need, t)
            })
            .collect();
        order.sort_by(|a, b| b.0.total_cmp(&a.0));
        order
    }

    /// The first rows: the ten neediest points, and for each rate group the neediest point it
    /// serves most (largest |ΔΦ per unit rate|), so that the first programme sees the whole
    /// layout; then the rows carried from an earlier solve of this layout (`start`).
    fn seed_rows(
        &self,
        mats: &Matrices,
        start: &[RowRef],
        limits_on: bool,
    ) -> (Vec<RowRef>, HaveRows) {
        let order = self.neediest_first();
        let mut best_of_group: Vec<Option<usize>> = vec![None; self.groups.len()];
        for (_, t) in &order {
            let row = &mats.a[*t];
            if let Some((h, _)) = row
                .iter()
                .enumerate()
                .min_by(|a, b| a.1.total_cmp(b.1))
                .filter(|(_, u)| **u < 0.0)
            {
                if best_of_group[h].is_none() {
                    best_of_group[h] = Some(*t);
                }
            }
        }
        let mut rows: Vec<RowRef> = order
            .iter()
            .take(10)
            .map(|(_, t)| RowRef::Target(*t))
            .collect();
        for t in best_of_group.into_iter().flatten() {
            if !rows
                .iter()
                .any(|r| matches!(r, RowRef::Target(u) if *u == t))
            {
                rows.push(RowRef::Target(t));
            }
        }
        let mut have = HaveRows {
            target: vec![false; mats.a.len()],
            level: self
                .limits
                .iter()
                .map(|l| vec![false; l.level_pieces.len()])
                .collect(),
            cap: self
                .limits
                .iter()
                .map(|l| vec![false; l.pieces.len()])
                .collect(),
        };
        for r in &rows {
            if let RowRef::Target(t) = r {
                have.target[*t] = true;
            }
        }
        // The rows carried from an earlier solve of this layout, after the seeds.
        for &r in start {
            let slot = match r {
                RowRef::Target(t) => have.target.get_mut(t),
                RowRef::Level(k, i) => have.level.get_mut(k).and_then(|v| v.get_mut(i)),
                RowRef::Capacity(k, s) => have.cap.get_mut(k).and_then(|v| v.get_mut(s)),
            };
            if let Some(h) = slot {
                if !*h && (limits_on || matches!(r, RowRef::Target(_))) {
                    *h = true;
                    rows.push(r);
                }
            }
        }
        (rows, have)
    }

    /// Every row: all target points, and with limits on every level and capacity piece of
    /// each pumped well (the last round, when adding rows has not converged).
    fn all_rows(&self, n_targets: usize, limits_on: bool) -> Vec<RowRef> {
        let mut rows: Vec<RowRef> = (0..n_targets).map(RowRef::Target).collect();
        if limits_on {
            for k in (0..self.wells.len()).filter(|&k| self.group_of[k].is_some()) {
                for i in 0..self.limits[k].level_pieces.len() {
                    rows.push(RowRef::Level(k, i));
                }
                for s in 0..self.limits[k].pieces.len() {
                    rows.push(RowRef::Capacity(k, s));
                }
            }
        }
        rows
    }

    /// The rows not yet held that the group rates `x` (with `shortfall`) violate by more than
    /// `tol`, each kind most violated first (relative to Φ₀ for levels and targets, to the
    /// capacity for rates): (target rows, well rows).
    fn violated_rows(
        &self,
        mats: &Matrices,
        x: &[f64],
        shortfall: f64,
        tol: f64,
        have: &HaveRows,
        limits_on: bool,
    ) -> Violations {
        let mut target_viol: Vec<(f64, usize)> = mats
            .a
            .iter()
            .enumerate()
            .filter(|(t, _)| !have.target[*t])
            .filter_map(|(t, row)| {
                let v = self.base_t[t] + dot(row, x) - shortfall - self.target_phi[t];
                (v > tol).then_some((v / self.phi0.abs().max(1e-30), t))
            })
            .collect();
        let mut well_viol: Vec<(f64, RowRef)> = Vec::new();
        if limits_on {
            for k in 0..self.wells.len() {
                let Some(gk) = self.group_of[k] else {
                    continue;
                };
                let phi = self.base_w[k] + dot(&mats.at_wells[k], x);
                let lim = &self.limits[k];
                let (floor_phi, i) = lim.chord_floor(x[gk]);
                if !have.level[k][i] && phi < floor_phi - tol {
                    let v = (floor_phi - phi) / self.phi0.abs().max(1e-30);
                    well_viol.push((v, RowRef::Level(k, i)));
                }
                let (cap, s) = lim.chord_capacity(phi);
                if !lim.pieces.is_empty()
                    && !have.cap[k][s]
                    && x[gk] > CAPACITY_SAFETY * cap + 1e-12
                {
                    let v = (x[gk] - cap) / cap.abs().max(1e-12);
                    well_viol.push((v, RowRef::Capacity(k, s)));
                }
            }
        }
        target_viol.sort_by(|a, b| b.0.total_cmp(&a.0));
        well_viol.sort_by(|a, b| b.0.total_cmp(&a.0));
        (target_viol, well_viol)
    }

    /// Solve by adding violated rows until none is left. Returns the solution (values per
    /// group, then the shortfall when asked for), the rows it was solved with and the rounds.
    fn solve(
        &self,
        goal: Goal,
        extra: &[WellRow],
        start: &[RowRef],
    ) -> (LpSolution, Vec<RowRef>, usize) {
        let g = self.groups.len();
        let limits_on = goal != Goal::TargetsOnly;
        let (costs, bounds) = self.costs_and_bounds(goal);
        let mats = self.matrices();
        let (mut rows, mut have) = self.seed_rows(mats, start, limits_on);
        let tol = ROW_TOLERANCE * self.phi0.abs().max(1e-30);
        let mut rounds = 0;
        loop {
            rounds += 1;
            let full = rounds > MAX_ROUNDS;
            if full {
                rows = self.all_rows(mats.a.len(), limits_on);
            }
            let mut constraints: Vec<Constraint> =
                rows.iter().map(|r| self.row(*r, goal)).collect();
            constraints.extend(extra.iter().map(|e| self.fold_row(e, costs.len())));
            let problem = RateProblem {
                costs: costs.clone(),
                bounds: bounds.clone(),
                constraints,
            };
            // The simplex, and the interior point when the simplex fails numerically: a solver
            // fault must not count as a layout that cannot work.
            let sol = lp::solve_with(&problem, self.solver);
            if sol.status != LpStatus::Optimal || full {
                return (sol, rows, rounds);
            }
            let x = &sol.values[..g];
            let shortfall = if goal == Goal::MinShortfall {
                sol.values.get(g).copied().unwrap_or(0.0)
            } else {
                0.0
            };
            // At most `per_round` violated rows of each kind are added per round so that each
            // programme stays small and far from degenerate.
            let per_round = g.max(20);
            let (target_viol, well_viol) =
                self.violated_rows(mats, x, shortfall, tol, &have, limits_on);
            let added = !target_viol.is_empty() || !well_viol.is_empty();
            for (_, t) in target_viol.into_iter().take(per_round) {
                have.target[t] = true;
                rows.push(RowRef::Target(t));
            }
            for (_, r) in well_viol.into_iter().take(per_round) {
                match r {
                    RowRef::Level(k, i) => have.level[k][i] = true,
                    RowRef::Capacity(k, s) => have.cap[k][s] = true,
                    RowRef::Target(_) => {}
                }
                rows.push(r);
            }
            if !added {
                return (sol, rows, rounds);
            }
        }
    }

    /// A per-well row folded into the rate groups (recharge wells kept at their rates move
    /// their term to the right-hand side).
    fn fold_row(&self, e: &WellRow, width: usize) -> Constraint {
        let mut coefficients = vec![0.0; width];
        let mut rhs = e.rhs;
        for (k, c) in e.per_well.iter().enumerate() {
            match self.group_of.get(k).copied().flatten() {
                Some(g) => coefficients[g] += c,
                None => rhs -= c * self.wells.get(k).map_or(0.0, |w| w.rate),
            }
        }
        Constraint {
            coefficients,
            sense: Sense::AtLeast,
            rhs,
            label: e.label.words(self.model.units),
        }
    }

    /// What programme row `r` stands for.
    fn binding_of(&self, r: RowRef) -> Binding {
        match r {
            RowRef::Target(t) => Binding::Target {
                point: self.points[self.targets[t]].name.clone(),
            },
            RowRef::Level(k, _) => {
                let lim = &self.limits[k];
                Binding::WellLevel {
                    well: self.wells[k].name.clone(),
                    level_m: lim.lowest_level,
                    floor: lim.floor_kind,
                    loss: if lim.loss_c > 0.0 {
                        LevelLoss::Jacob
                    } else if lim.efficiency.is_some() {
                        LevelLoss::Efficiency
                    } else {
                        LevelLoss::None
                    },
                }
            }
            RowRef::Capacity(k, _) => Binding::SichardtCapacity {
                well: self.wells[k].name.clone(),
            },
        }
    }

    fn binding_labels(&self, sol: &LpSolution, rows: &[RowRef], rates: &[f64]) -> Vec<Binding> {
        let mut out = Vec::new();
        let mut targets = Vec::new();
        for &i in &sol.binding {
            match rows.get(i) {
                Some(RowRef::Target(t)) => targets.push(self.binding_of(RowRef::Target(*t))),
                Some(r) => out.push(self.binding_of(*r)),
                None => {}
            }
        }
        for (k, q) in rates.iter().enumerate() {
            if self.group_of[k].is_none() {
                continue;
            }
            if let Some(p) = self.limits[k].pump {
                if *q >= p * CAPACITY_SAFETY * (1.0 - 1e-7) {
                    out.push(Binding::PumpCapacity {
                        well: self.wells[k].name.clone(),
                    });
                }
            }
        }
        // in the order of their words, as the summary lists them
        out.sort_by_cached_key(|b| b.words(self.model.units));
        out.dedup();
        targets.extend(out);
        targets
    }
}
