//! A small linear-programme layer for well rates, over `good_lp` with the pure-Rust `microlp`
//! solver.
//!
//! The problem is always: minimise Σ cost_j·q_j over rates q_j (m³/s) with bounds
//! lo_j ≤ q_j ≤ hi_j and linear constraints Σ a_ij·q_j ≥ b_i or ≤ b_i. Recharge wells are
//! variables with negative bounds.
//!
//! **Conditioning.** Rates in m³/s are small numbers (1e-4 … 1e-1) and potentials smaller still,
//! so the solver sees scaled quantities: each rate is solved for in L/s (q × 1000), each
//! constraint row is divided by its largest coefficient, each column by its largest coefficient
//! after that, and the costs by their largest value. Results are returned in the caller's units.
//!
//! **Robustness.** The answer is checked against every constraint before it is returned. The
//! simplex can meet a singular basis on degenerate problems (a known weakness of microlp); the
//! solve is then repeated with the right-hand sides tightened by tiny, different amounts and the
//! rows reordered, up to three times. How a solve ended is a status on the result, never an
//! error or a panic.

use crate::optimise::lp_problem::{
    check_shape, LpSolution, LpStatus, RateProblem, Sense, FEASIBILITY_TOLERANCE, RATE_SCALE,
};
use good_lp::{
    microlp, variable, Expression, ProblemVariables, ResolutionError, Solution, SolverModel,
};

/// A constraint is binding when its scaled slack is within this (relative to 1 + |rhs|).
const BINDING_TOLERANCE: f64 = 1e-7;

/// A scaled constraint row: Σ a_j·y_j (≥ or ≤) rhs with y the solver's variables (see
/// [`column_scales`]) and max |a_j| = 1.
struct Row {
    index: usize,
    terms: Vec<(usize, f64)>,
    sense: Sense,
    rhs: f64,
}

/// Scale the rows; `Err(status)` when a row without coefficients is violated.
fn scaled_rows(problem: &RateProblem) -> Result<Vec<Row>, LpStatus> {
    let mut rows = Vec::with_capacity(problem.constraints.len());
    for (i, c) in problem.constraints.iter().enumerate() {
        let big = c
            .coefficients
            .iter()
            .fold(0.0f64, |m, a| m.max(a.abs() / RATE_SCALE));
        if big == 0.0 {
            let ok = match c.sense {
                Sense::AtLeast => 0.0 >= c.rhs,
                Sense::AtMost => 0.0 <= c.rhs,
            };
            if ok {
                continue;
            }
            return Err(LpStatus::Infeasible);
        }
        let terms = c
            .coefficients
            .iter()
            .enumerate()
            .filter(|(_, a)| **a != 0.0)
            .map(|(j, a)| (j, a / RATE_SCALE / big))
            .collect();
        rows.push(Row {
            index: i,
            terms,
            sense: c.sense,
            rhs: c.rhs / big,
        });
    }
    Ok(rows)
}

/// Equilibrate the columns: each variable is solved for as y_j = x_j / c_j (x in L/s) with c_j
/// chosen so that its largest coefficient over the rows is 1, then the rows are normalised
/// again. Closely spaced wells give nearly equal columns of very different size from the
/// capacity rows; without this the simplex can meet a singular basis.
fn column_scales(rows: &mut [Row], n: usize) -> Vec<f64> {
    let mut big = vec![0.0f64; n];
    for row in rows.iter() {
        for (j, a) in &row.terms {
            big[*j] = big[*j].max(a.abs());
        }
    }
    let scales: Vec<f64> = big
        .iter()
        .map(|b| {
            if *b > 0.0 {
                (1.0 / b).clamp(1e-6, 1e6)
            } else {
                1.0
            }
        })
        .collect();
    for row in rows.iter_mut() {
        let mut m = 0.0f64;
        for (j, a) in row.terms.iter_mut() {
            *a *= scales[*j];
            m = m.max(a.abs());
        }
        if m > 0.0 {
            row.terms.iter_mut().for_each(|(_, a)| *a /= m);
            row.rhs /= m;
        }
    }
    scales
}

fn row_value(row: &Row, x: &[f64]) -> f64 {
    row.terms.iter().map(|(j, a)| a * x[*j]).sum()
}

/// Solve the rate problem. Never panics: a solver fault comes back as [`LpStatus::Failed`].
pub fn solve(problem: &RateProblem) -> LpSolution {
    if let Err(msg) = check_shape(problem) {
        return LpSolution::ended(LpStatus::Failed(msg));
    }
    if problem.bounds.iter().any(|(lo, hi)| lo > hi) {
        return LpSolution::ended(LpStatus::Infeasible);
    }
    let mut rows = match scaled_rows(problem) {
        Ok(r) => r,
        Err(status) => return LpSolution::ended(status),
    };
    let n = problem.costs.len();
    let scales = column_scales(&mut rows, n);
    if n == 0 {
        return LpSolution {
            status: LpStatus::Optimal,
            values: Vec::new(),
            binding: Vec::new(),
        };
    }
    let costs: Vec<f64> = problem
        .costs
        .iter()
        .zip(&scales)
        .map(|(c, s)| c * s)
        .collect();
    let cost_scale = costs
        .iter()
        .fold(0.0f64, |m, c| m.max(c.abs()))
        .max(f64::MIN_POSITIVE);
    let costs: Vec<f64> = costs.iter().map(|c| c / cost_scale).collect();
    let bounds: Vec<(f64, f64)> = problem
        .bounds
        .iter()
        .zip(&scales)
        .map(|((lo, hi), s)| (lo * RATE_SCALE / s, hi * RATE_SCALE / s))
        .collect();
    // microlp can meet a singular basis on degenerate problems (many constraints active at one
    // vertex, as with symmetric well lines): on failure, try again with the right-hand sides
    // tightened by tiny, different amounts (a classic anti-degeneracy perturbation; the answer
    // stays feasible for the original problem) and the rows in another order.
    let mut failure = String::new();
    for (k, (perturb, reverse)) in ATTEMPTS.iter().enumerate() {
        match attempt(&costs, &bounds, &rows, *perturb, *reverse) {
            Ok(x) => {
                if let Some(msg) = violated(problem, &rows, &x) {
                    failure = msg;
                    continue;
                }
                let tol = BINDING_TOLERANCE.max(4.0 * perturb);
                let binding = rows
                    .iter()
                    .filter(|row| {
                        (row_value(row, &x) - row.rhs).abs() <= tol * (1.0 + row.rhs.abs())
                    })
                    .map(|row| row.index)
                    .collect();
                let values = x
                    .iter()
                    .zip(&scales)
                    .map(|(y, s)| y * s / RATE_SCALE)
                    .collect();
                return LpSolution {
                    status: LpStatus::Optimal,
                    values,
                    binding,
                };
            }
            // A plain answer of infeasible or unbounded stands; after a perturbation (which
            // tightens) it may be an artefact, so keep trying.
            Err(LpStatus::Infeasible) if k == 0 => return LpSolution::ended(LpStatus::Infeasible),
            Err(LpStatus::Unbounded) if k == 0 => return LpSolution::ended(LpStatus::Unbounded),
            Err(LpStatus::Failed(msg)) => failure = msg,
            Err(other) => failure = format!("{other:?} after a perturbed retry"),
        }
    }
    LpSolution::ended(LpStatus::Failed(failure))
}

/// Tries: (relative tightening of the right-hand sides, rows in reverse order).
const ATTEMPTS: [(f64, bool); 4] = [(0.0, false), (1e-8, false), (1e-7, true), (1e-6, false)];

/// One solve of the scaled problem, right-hand sides tightened by up to `perturb` (relative).
fn attempt(
    costs: &[f64],
    bounds: &[(f64, f64)],
    rows: &[Row],
    perturb: f64,
    reverse: bool,
) -> Result<Vec<f64>, LpStatus> {
    let mut tight: Vec<Row> = rows
        .iter()
        .enumerate()
        .map(|(i, r)| {
            // Golden-ratio sequence: a different, deterministic amount for every row.
            let e =
                perturb * ((i as f64 * 0.618_033_988_749_895).fract() + 0.5) * (1.0 + r.rhs.abs());
            Row {
                index: r.index,
                terms: r.terms.clone(),
                sense: r.sense,
                rhs: match r.sense {
                    Sense::AtLeast => r.rhs + e,
                    Sense::AtMost => r.rhs - e,
                },
            }
        })
        .collect();
    if reverse {
        tight.reverse();
    }
    // The solver is third-party code: contain any panic as a failed solve.
    match std::panic::catch_unwind(|| run_solver(costs, bounds, &tight)) {
        Ok(Ok(x)) => Ok(x),
        Ok(Err(ResolutionError::Infeasible)) => Err(LpStatus::Infeasible),
        Ok(Err(ResolutionError::Unbounded)) => Err(LpStatus::Unbounded),
        Ok(Err(e)) => Err(LpStatus::Failed(e.to_string())),
        Err(_) => Err(LpStatus::Failed(
            "the LP solver stopped unexpectedly".into(),
        )),
    }
}

/// The first original constraint the solver's answer misses, in words.
fn violated(problem: &RateProblem, rows: &[Row], x: &[f64]) -> Option<String> {
    for row in rows {
        let v = row_value(row, x);
        let violation = match row.sense {
            Sense::AtLeast => row.rhs - v,
            Sense::AtMost => v - row.rhs,
        };
        let size: f64 = row.rhs.abs()
            + row
                .terms
                .iter()
                .map(|(j, a)| (a * x[*j]).abs())
                .sum::<f64>();
        if violation > FEASIBILITY_TOLERANCE * size.max(1e-12) {
            return Some(format!(
                "the solver's answer misses constraint \"{}\" by {violation:.3e} (scaled)",
                problem.constraints[row.index].label
            ));
        }
    }
    None
}

/// Solve min Σ cost_j·y_j over the scaled variables with good_lp + microlp.
fn run_solver(
    costs: &[f64],
    bounds: &[(f64, f64)],
    rows: &[Row],
) -> Result<Vec<f64>, ResolutionError> {
    let mut vars = ProblemVariables::new();
    let x: Vec<_> = bounds
        .iter()
        .map(|(lo, hi)| {
            let mut def = variable();
            if lo.is_finite() {
                def = def.min(*lo);
            }
            if hi.is_finite() {
                def = def.max(*hi);
            }
            vars.add(def)
        })
        .collect();
    let mut objective = Expression::with_capacity(x.len());
    for (v, c) in x.iter().zip(costs) {
        if *c != 0.0 {
            objective.add_mul(*c, *v);
        }
    }
    let mut model = vars.minimise(objective).using(microlp);
    for row in rows {
        let mut e = Expression::with_capacity(row.terms.len());
        for (j, a) in &row.terms {
            e.add_mul(*a, x[*j]);
        }
        model.add_constraint(match row.sense {
            Sense::AtLeast => e.geq(row.rhs),
            Sense::AtMost => e.leq(row.rhs),
        });
    }
    let solution = model.solve()?;
    Ok(x.iter().map(|v| solution.value(*v)).collect())
}

/// Which solver [`solve_with`] uses.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Solver {
    /// The simplex (microlp) with its perturbed retries: [`solve`].
    Simplex,
    /// The interior-point solver clarabel: [`crate::optimise::clarabel::solve`].
    InteriorPoint,
    /// The simplex first; only when every simplex attempt ended in [`LpStatus::Failed`]
    /// (numerical trouble, not infeasible or unbounded), the interior-point solver.
    SimplexThenInteriorPoint,
}

/// Solve the rate problem with the chosen solver. The one hook between this module and the
/// second solver; [`solve`] itself is unchanged.
pub fn solve_with(problem: &RateProblem, solver: Solver) -> LpSolution {
    crate::work_counts::add(&crate::work_counts::LP_SOLVES, 1);
    match solver {
        Solver::Simplex => solve(problem),
        Solver::InteriorPoint => crate::optimise::clarabel::solve(problem),
        Solver::SimplexThenInteriorPoint => match solve(problem) {
            LpSolution {
                status: LpStatus::Failed(_),
                ..
            } => crate::optimise::clarabel::solve(problem),
            done => done,
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::optimise::lp_problem::Constraint;

    fn c(coefficients: Vec<f64>, sense: Sense, rhs: f64) -> Constraint {
        Constraint {
            coefficients,
            sense,
            rhs,
            label: String::new(),
        }
    }

    // Hand-solvable LP (vertex enumeration, worked by hand): minimise x + y with x + 2y ≥ 4,
    // 3x + y ≥ 6, x, y ≥ 0. Vertices (0, 6), (1.6, 1.2), (4, 0): objective 6, 2.8, 4 → 2.8 at
    // (1.6, 1.2), both constraints binding. Values in m³/s of the order of real well rates.
    #[test]
    fn small_lp_matches_hand_vertex_enumeration() {
        let s = 1e-3;
        let p = RateProblem {
            costs: vec![1.0, 1.0],
            bounds: vec![(0.0, f64::INFINITY); 2],
            constraints: vec![
                c(vec![1.0, 2.0], Sense::AtLeast, 4.0 * s),
                c(vec![3.0, 1.0], Sense::AtLeast, 6.0 * s),
            ],
        };
        let sol = solve(&p);
        assert_eq!(sol.status, LpStatus::Optimal);
        assert!((sol.values[0] - 1.6e-3).abs() < 1e-12);
        assert!((sol.values[1] - 1.2e-3).abs() < 1e-12);
        assert_eq!(sol.binding, vec![0, 1]);
    }

    #[test]
    fn infeasible_and_unbounded_are_statuses() {
        // x ≤ 1 mL/s by bound, but x ≥ 2 mL/s by constraint: no solution.
        let p = RateProblem {
            costs: vec![1.0],
            bounds: vec![(0.0, 1e-3)],
            constraints: vec![c(vec![1.0], Sense::AtLeast, 2e-3)],
        };
        assert_eq!(solve(&p).status, LpStatus::Infeasible);
        // Minimise −x with x unbounded above.
        let p = RateProblem {
            costs: vec![-1.0],
            bounds: vec![(0.0, f64::INFINITY)],
            constraints: vec![],
        };
        assert_eq!(solve(&p).status, LpStatus::Unbounded);
        // A row with no coefficients that cannot hold.
        let p = RateProblem {
            costs: vec![1.0],
            bounds: vec![(0.0, 1.0)],
            constraints: vec![c(vec![0.0], Sense::AtLeast, 1.0)],
        };
        assert_eq!(solve(&p).status, LpStatus::Infeasible);
    }

    #[test]
    fn malformed_problem_fails_without_panic() {
        let p = RateProblem {
            costs: vec![1.0, 1.0],
            bounds: vec![(0.0, 1.0)],
            constraints: vec![],
        };
        assert!(matches!(solve(&p).status, LpStatus::Failed(_)));
        let p = RateProblem {
            costs: vec![1.0],
            bounds: vec![(0.0, 1.0)],
            constraints: vec![c(vec![f64::NAN], Sense::AtMost, 1.0)],
        };
        assert!(matches!(solve(&p).status, LpStatus::Failed(_)));
    }

    // Recharge: negative bounds. Minimise q1 + q2 with q2 ∈ [−2, 0] mL/s, q1 ∈ [0, 5], q1 + 0.5·q2 ≥ 1 → q2 = −2 would need
    // q1 ≥ 2: objective 0; q2 = 0 → q1 = 1, objective 1. Optimum q2 = −2, q1 = 2 (by hand).
    #[test]
    fn negative_bounds_for_recharge_wells() {
        let m = 1e-3;
        let p = RateProblem {
            costs: vec![1.0, 1.0],
            bounds: vec![(0.0, 5.0 * m), (-2.0 * m, 0.0)],
            constraints: vec![c(vec![1.0, 0.5], Sense::AtLeast, 1.0 * m)],
        };
        let sol = solve(&p);
        assert_eq!(sol.status, LpStatus::Optimal);
        assert!((sol.values[0] - 2.0 * m).abs() < 1e-12);
        assert!((sol.values[1] + 2.0 * m).abs() < 1e-12);
    }
}
