//! A second solver for the rate problem of [`crate::lp`], over the pure-Rust interior-point
//! solver `clarabel`.
//!
//! The problem is the same: minimise Σ cost_j·q_j over rates q_j (m³/s) with bounds
//! lo_j ≤ q_j ≤ hi_j and rows Σ a_ij·q_j ≥ b_i or ≤ b_i. It is handed to clarabel in conic form
//! (minimise cᵀx subject to A·x + s = b, s ≥ 0): every ≤ row as it is, every ≥ row negated, and
//! every finite bound as one more row. As in [`crate::lp`], rates are solved for in L/s and each
//! row is divided by its largest coefficient; clarabel's own equilibration does the rest.
//!
//! An interior-point answer is never exactly on a bound: rates within 1e-7 of zero relative to
//! the largest finite bound are cut to zero (when zero is within the bounds), and the answer is
//! then checked against every row with the feasibility tolerance of [`crate::lp`] (1e-5 relative
//! to the row's terms). How a solve ended is an [`LpStatus`], never an error or a panic.
//!
//! Where the optimum is not unique an interior-point method returns a point inside the optimal
//! face, where the simplex returns a vertex: the objective agrees, the rates need not.

use clarabel::algebra::CscMatrix;
use clarabel::solver::{
    DefaultSettingsBuilder, DefaultSolver, IPSolver, SolverStatus, SupportedConeT,
};

use crate::optimise::lp::{LpSolution, LpStatus, RateProblem, Sense};

/// Rates are solved for in L/s, as in [`crate::lp`].
const RATE_SCALE: f64 = 1e3;
/// Rates this small relative to the largest finite bound are taken as zero.
const CUTOFF: f64 = 1e-7;
/// The same feasibility tolerance as [`crate::lp`]: a violation relative to |rhs| + Σ|aⱼ·xⱼ|.
const FEASIBILITY_TOLERANCE: f64 = 1e-5;
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

fn shape_error(problem: &RateProblem) -> Option<String> {
    let n = problem.costs.len();
    if problem.bounds.len() != n {
        return Some(format!(
            "{} bounds for {} variables",
            problem.bounds.len(),
            n
        ));
    }
    if problem.costs.iter().any(|c| !c.is_finite()) {
        return Some("a cost is not a finite number".into());
    }
    for (j, (lo, hi)) in problem.bounds.iter().enumerate() {
        if lo.is_nan() || hi.is_nan() || *lo == f64::INFINITY || *hi == f64::NEG_INFINITY {
            return Some(format!("bounds of variable {j} are not numbers"));
        }
    }
    for c in &problem.constraints {
        if c.coefficients.len() != n {
            return Some(format!(
                "constraint \"{}\" has {} coefficients for {} variables",
                c.label,
                c.coefficients.len(),
                n
            ));
        }
        if !c.rhs.is_finite() || c.coefficients.iter().any(|a| !a.is_finite()) {
            return Some(format!(
                "constraint \"{}\" holds a value that is not finite",
                c.label
            ));
        }
    }
    None
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
    if let Some(msg) = shape_error(problem) {
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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::optimise::lp::{self, Constraint};
    use serde::Deserialize;

    #[derive(Deserialize)]
    struct Table {
        source: String,
        problems: Vec<Problem>,
    }

    #[derive(Deserialize)]
    struct Problem {
        name: String,
        costs: Vec<f64>,
        bounds: Vec<(f64, f64)>,
        rows: Vec<RowIn>,
        reference: Reference,
    }

    #[derive(Deserialize)]
    struct RowIn {
        a: Vec<f64>,
        sense: String,
        rhs: f64,
    }

    #[derive(Deserialize)]
    struct Reference {
        status: String,
        #[serde(default)]
        x: Vec<f64>,
        #[serde(default)]
        objective: f64,
        #[serde(default)]
        unique: bool,
    }

    fn table() -> Table {
        let path = concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/tests/reference/lp_reference.json"
        );
        serde_json::from_str(&std::fs::read_to_string(path).unwrap()).unwrap()
    }

    fn rate_problem(p: &Problem) -> RateProblem {
        RateProblem {
            costs: p.costs.clone(),
            bounds: p.bounds.clone(),
            constraints: p
                .rows
                .iter()
                .enumerate()
                .map(|(i, r)| Constraint {
                    coefficients: r.a.clone(),
                    sense: if r.sense == ">=" {
                        Sense::AtLeast
                    } else {
                        Sense::AtMost
                    },
                    rhs: r.rhs,
                    label: format!("row {i}"),
                })
                .collect(),
        }
    }

    // Reference: tests/reference/lp_reference.json, "library: scipy linprog HiGHS", written by
    // scripts/reference_lp.py. Objectives to 1e-7 relative; rates (where the optimum is unique)
    // to 1e-6 of the largest rate, the accuracy of an interior-point stop at 1e-10.
    #[test]
    fn clarabel_and_microlp_agree_with_scipy_linprog() {
        let t = table();
        assert_eq!(t.source, "library: scipy linprog HiGHS");
        let mut optimal = 0;
        for p in &t.problems {
            let problem = rate_problem(p);
            let runs = [
                (
                    "clarabel",
                    lp::solve_with(&problem, lp::Solver::InteriorPoint),
                ),
                ("microlp", lp::solve_with(&problem, lp::Solver::Simplex)),
                (
                    "microlp then clarabel",
                    lp::solve_with(&problem, lp::Solver::SimplexThenInteriorPoint),
                ),
            ];
            for (solver, sol) in runs {
                match p.reference.status.as_str() {
                    "optimal" => {
                        assert_eq!(sol.status, LpStatus::Optimal, "{} {solver}", p.name);
                        let obj = sol.objective(&problem);
                        let want = p.reference.objective;
                        assert!(
                            (obj - want).abs() <= 1e-7 * want.abs(),
                            "{} {solver}: objective {obj} vs scipy {want}",
                            p.name
                        );
                        if p.reference.unique {
                            let scale = p.reference.x.iter().fold(0.0f64, |m, v| m.max(v.abs()));
                            for (q, r) in sol.values.iter().zip(&p.reference.x) {
                                assert!(
                                    (q - r).abs() <= 1e-6 * scale,
                                    "{} {solver}: rates {:?} vs scipy {:?}",
                                    p.name,
                                    sol.values,
                                    p.reference.x
                                );
                            }
                        }
                    }
                    _ => assert_eq!(sol.status, LpStatus::Infeasible, "{} {solver}", p.name),
                }
            }
            // The two solvers agree with each other on which rows bind (unique optima).
            if p.reference.status == "optimal" && p.reference.unique {
                optimal += 1;
                assert_eq!(
                    solve(&problem).binding,
                    lp::solve(&problem).binding,
                    "{}",
                    p.name
                );
            }
        }
        assert!(optimal >= 4);
    }

    // Hand-checked infeasibility: x ≤ 1 mL/s by bound and x ≥ 2 mL/s by constraint (the same
    // LP as in src/lp.rs), and an unbounded objective.
    #[test]
    fn clarabel_infeasible_and_unbounded() {
        let p = RateProblem {
            costs: vec![1.0],
            bounds: vec![(0.0, 1e-3)],
            constraints: vec![Constraint {
                coefficients: vec![1.0],
                sense: Sense::AtLeast,
                rhs: 2e-3,
                label: "target".into(),
            }],
        };
        assert_eq!(solve(&p).status, LpStatus::Infeasible);
        assert_eq!(lp::solve(&p).status, LpStatus::Infeasible);
        let p = RateProblem {
            costs: vec![-1.0],
            bounds: vec![(0.0, f64::INFINITY)],
            constraints: vec![],
        };
        assert_eq!(solve(&p).status, LpStatus::Unbounded);
        let p = RateProblem {
            costs: vec![1.0, 1.0],
            bounds: vec![(0.0, 1.0)],
            constraints: vec![],
        };
        assert!(matches!(solve(&p).status, LpStatus::Failed(_)));
    }
}
