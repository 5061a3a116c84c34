//! The two LP solvers (microlp simplex, clarabel interior point) against scipy linprog (HiGHS)
//! on the committed reference problems in tests/reference/lp_reference.json.

use drydig::optimise::clarabel::solve;
use drydig::optimise::lp;
use drydig::optimise::lp_problem::Constraint;
use drydig::optimise::lp_problem::{LpStatus, RateProblem, Sense};
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
