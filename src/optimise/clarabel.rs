//! A second solver for the rate problem of [`crate::optimise::lp`], over the pure-Rust interior-point
//! solver `clarabel`.
//!
//! The problem is the same: minimise Σ cost_j·q_j over rates q_j (m³/s) with bounds
//! lo_j ≤ q_j ≤ hi_j and rows Σ a_ij·q_j ≥ b_i or ≤ b_i. It is handed to clarabel in conic form
//! (minimise cᵀx subject to A·x + s = b, s ≥ 0): every ≤ row as it is, every ≥ row negated, and
//! every finite bound as one more row. As in [`crate::optimise::lp`], rates are solved for in L/s and each
//! row is divided by its largest coefficient; clarabel's own equilibration does the rest.
//!
//! An interior-point answer is never exactly on a bound: rates within 1e-7 of zero relative to
//! the largest finite bound are cut to zero (when zero is within the bounds), and the answer is
//! then checked against every row with the feasibility tolerance of [`crate::optimise::lp`] (1e-5 relative
//! to the row's terms). How a solve ended is an [`LpStatus`], never an error or a panic.
//!
//! Where the optimum is not unique an interior-point method returns a point inside the optimal
//! face, where the simplex returns a vertex: the objective agrees, the rates need not.

use clarabel::algebra::CscMatrix;
use clarabel::solver::{
    DefaultSettingsBuilder, DefaultSolver, IPSolver, SolverStatus, SupportedConeT,
};

use crate::optimise::lp_problem::{
    check_shape, LpSolution, LpStatus, RateProblem, Sense, FEASIBILITY_TOLERANCE, RATE_SCALE,
};

/// Rates this small relative to the largest finite bound are taken as zero.
const CUTOFF: f64 = 1e-7;
/// A row is binding when its scaled slack is within this of zero (relative to 1 + |rhs|). Looser
/// than the simplex's 1e-7 because the interior point stops a little inside the constraints.
const BINDING_TOLERANCE: f64 = 1e-6;

/// A scaled row Σ a_j·y_j ≤ rhs (y in L/s, ≥ rows negated), max |a_j| = 1.
struct Row {
    /// Index of the caller's constraint.
    index: usize,
    terms: Vec<(usize, f64)>,
    rhs: f64,
}

/// Solve the rate problem with clarabel. Same contract as [`crate::optimise::lp::solve`]: rates in m³/s,
/// binding rows listed, statuses for infeasible (clarabel's primal infeasibility certificate),
/// unbounded (dual infeasibility) and failure; never panics.
pub fn solve(problem: &RateProblem) -> LpSolution {
    let ended = |status| LpSolution {
        status,
        values: Vec::new(),
        binding: Vec::new(),
    };
    if let Err(msg) = check_shape(problem) {
        return ended(LpStatus::Failed(msg));
    }
    if problem.bounds.iter().any(|(lo, hi)| lo > hi) {
        return ended(LpStatus::Infeasible);
    }
    let n = problem.costs.len();
    // Scaled rows, all as ≤.
    let mut rows = Vec::new();
    for (i, c) in problem.constraints.iter().enumerate() {
        let sign = match c.sense {
            Sense::AtMost => 1.0,
            Sense::AtLeast => -1.0,
        };
        let big = c
            .coefficients
            .iter()
            .fold(0.0f64, |m, a| m.max(a.abs() / RATE_SCALE));
        if big == 0.0 {
            if sign * c.rhs >= 0.0 {
                continue;
            }
            return ended(LpStatus::Infeasible);
        }
        rows.push(Row {
            index: i,
            terms: c
                .coefficients
                .iter()
                .enumerate()
                .filter(|(_, a)| **a != 0.0)
                .map(|(j, a)| (j, sign * a / RATE_SCALE / big))
                .collect(),
            rhs: sign * c.rhs / big,
        });
    }
    if n == 0 {
        return LpSolution {
            status: LpStatus::Optimal,
            values: Vec::new(),
            binding: Vec::new(),
        };
    }
    let cost_scale = problem
        .costs
        .iter()
        .fold(0.0f64, |m, c| m.max(c.abs()))
        .max(f64::MIN_POSITIVE);
    let costs: Vec<f64> = problem.costs.iter().map(|c| c / cost_scale).collect();
    let bounds: Vec<(f64, f64)> = problem
        .bounds
        .iter()
        .map(|(lo, hi)| (lo * RATE_SCALE, hi * RATE_SCALE))
        .collect();

    let y = match std::panic::catch_unwind(|| run_clarabel(&costs, &bounds, &rows)) {
        Ok(Ok(y)) => y,
        Ok(Err(status)) => return ended(status),
        Err(_) => {
            return ended(LpStatus::Failed(
                "the interior-point solver stopped unexpectedly".into(),
            ))
        }
    };
    // Cut off the interior point's tiny rates, then clamp into the bounds.
    let reach = bounds
        .iter()
        .flat_map(|(lo, hi)| [lo.abs(), hi.abs()])
        .filter(|v| v.is_finite())
        .fold(0.0f64, f64::max);
    let reach = if reach > 0.0 {
        reach
    } else {
        y.iter().fold(0.0f64, |m, v| m.max(v.abs())).max(1.0)
    };
    let y: Vec<f64> = y
        .iter()
        .zip(&bounds)
        .map(|(v, (lo, hi))| {
            let v = if v.abs() <= CUTOFF * reach && *lo <= 0.0 && *hi >= 0.0 {
                0.0
            } else {
                *v
            };
            v.clamp(*lo, *hi)
        })
        .collect();
    if y.iter().any(|v| !v.is_finite()) {
        return ended(LpStatus::Failed(
            "the interior-point solver returned a value that is not finite".into(),
        ));
    }
    for row in &rows {
        let value: f64 = row.terms.iter().map(|(j, a)| a * y[*j]).sum();
        let size = row.rhs.abs()
            + row
                .terms
                .iter()
                .map(|(j, a)| (a * y[*j]).abs())
                .sum::<f64>();
        let violation = value - row.rhs;
        if violation > FEASIBILITY_TOLERANCE * size.max(1e-12) {
            return ended(LpStatus::Failed(format!(
                "the interior-point answer misses constraint \"{}\" by {violation:.3e} (scaled)",
                problem.constraints[row.index].label
            )));
        }
    }
    let binding = rows
        .iter()
        .filter(|row| {
            let value: f64 = row.terms.iter().map(|(j, a)| a * y[*j]).sum();
            (value - row.rhs).abs() <= BINDING_TOLERANCE * (1.0 + row.rhs.abs())
        })
        .map(|row| row.index)
        .collect();
    LpSolution {
        status: LpStatus::Optimal,
        values: y.iter().map(|v| v / RATE_SCALE).collect(),
        binding,
    }
}

/// One clarabel solve of min costs·y subject to the ≤ rows and the bounds (y in L/s).
fn run_clarabel(costs: &[f64], bounds: &[(f64, f64)], rows: &[Row]) -> Result<Vec<f64>, LpStatus> {
    let n = costs.len();
    // Columns of A: (row, value) lists.
    let mut columns: Vec<Vec<(usize, f64)>> = vec![Vec::new(); n];
    let mut b = Vec::new();
    for row in rows {
        let r = b.len();
        for (j, a) in &row.terms {
            columns[*j].push((r, *a));
        }
        b.push(row.rhs);
    }
    for (j, (lo, hi)) in bounds.iter().enumerate() {
        if hi.is_finite() {
            columns[j].push((b.len(), 1.0));
            b.push(*hi);
        }
        if lo.is_finite() {
            columns[j].push((b.len(), -1.0));
            b.push(-lo);
        }
    }
    let m = b.len();
    let mut colptr = Vec::with_capacity(n + 1);
    let mut rowval = Vec::new();
    let mut nzval = Vec::new();
    colptr.push(0);
    for col in &columns {
        for (r, a) in col {
            rowval.push(*r);
            nzval.push(*a);
        }
        colptr.push(rowval.len());
    }
    let a = CscMatrix::new(m, n, colptr, rowval, nzval);
    let p = CscMatrix::<f64>::zeros((n, n));
    let cones = [SupportedConeT::NonnegativeConeT(m)];
    let settings = DefaultSettingsBuilder::default()
        .verbose(false)
        .max_iter(200)
        .tol_gap_abs(1e-10)
        .tol_gap_rel(1e-10)
        .tol_feas(1e-10)
        .build()
        .map_err(|e| LpStatus::Failed(format!("interior-point settings: {e:?}")))?;
    let mut solver = DefaultSolver::new(&p, costs, &a, &b, &cones, settings)
        .map_err(|e| LpStatus::Failed(format!("interior-point set-up: {e}")))?;
    solver.solve();
    let solution = &solver.solution;
    match solution.status {
        SolverStatus::Solved | SolverStatus::AlmostSolved => Ok(solution.x.clone()),
        SolverStatus::PrimalInfeasible | SolverStatus::AlmostPrimalInfeasible => {
            Err(LpStatus::Infeasible)
        }
        SolverStatus::DualInfeasible | SolverStatus::AlmostDualInfeasible => {
            Err(LpStatus::Unbounded)
        }
        other => Err(LpStatus::Failed(format!(
            "the interior-point solver ended with {other:?}"
        ))),
    }
}
