//! The rate problem both LP solvers take and the solution they give back: minimise Σ cost_j·q_j
//! over rates q_j (m³/s) with bounds lo_j ≤ q_j ≤ hi_j and rows Σ a_ij·q_j ≥ b_i or ≤ b_i; how a
//! solve ended is a status on the solution, never an error or a panic.

/// Rates are solved for in this unit: 1 m³/s = 1000 L/s.
pub const RATE_SCALE: f64 = 1e3;
/// A returned point that violates a scaled constraint by more than this, relative to the size of
/// the row's terms (|rhs| + Σ|aⱼ·xⱼ|), is reported as failed. The simplex works in floating point
/// on rows of many similar terms, so exact feasibility is not to be expected; callers that need
/// a hard guarantee check the answer themselves (the optimiser re-evaluates every design).
pub const FEASIBILITY_TOLERANCE: f64 = 1e-5;

/// Direction of a constraint.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Sense {
    /// Σ a_j·q_j ≥ rhs.
    AtLeast,
    /// Σ a_j·q_j ≤ rhs.
    AtMost,
}

/// One linear constraint on the rates.
#[derive(Debug, Clone)]
pub struct Constraint {
    /// a_j for each rate (same length as the costs).
    pub coefficients: Vec<f64>,
    /// ≥ or ≤.
    pub sense: Sense,
    /// Right-hand side.
    pub rhs: f64,
    /// What the constraint stands for ("target at Basement corner 2", "level in W03").
    pub label: String,
}

/// Minimise Σ cost_j·q_j subject to bounds and constraints. Rates in m³/s.
#[derive(Debug, Clone)]
pub struct RateProblem {
    /// Cost per unit rate of each variable (1 for "total flow").
    pub costs: Vec<f64>,
    /// (lower, upper) bound of each rate, m³/s; infinite values allowed.
    pub bounds: Vec<(f64, f64)>,
    /// Linear constraints.
    pub constraints: Vec<Constraint>,
}

/// How a solve ended.
#[derive(Debug, Clone, PartialEq)]
pub enum LpStatus {
    /// Solved to optimality.
    Optimal,
    /// No rates satisfy every constraint.
    Infeasible,
    /// The objective can fall without limit.
    Unbounded,
    /// Malformed problem or solver trouble, in words.
    Failed(String),
}

/// The outcome of a solve.
#[derive(Debug, Clone)]
pub struct LpSolution {
    /// How it ended.
    pub status: LpStatus,
    /// Rates, m³/s (empty unless optimal).
    pub values: Vec<f64>,
    /// Indices of the constraints that are active at the optimum (within tolerance).
    pub binding: Vec<usize>,
}

impl LpSolution {
    /// A solution with no values: how the solve ended.
    pub fn ended(status: LpStatus) -> LpSolution {
        LpSolution {
            status,
            values: Vec::new(),
            binding: Vec::new(),
        }
    }

    /// Objective value Σ cost_j·q_j of the solution (0 when there is none).
    pub fn objective(&self, problem: &RateProblem) -> f64 {
        self.values
            .iter()
            .zip(&problem.costs)
            .map(|(q, c)| q * c)
            .sum()
    }
}

/// Whether the problem is well formed: as many bounds as costs, every number finite, every row
/// as long as the rate vector. `Err` names what is wrong.
pub fn check_shape(problem: &RateProblem) -> Result<(), String> {
    let n = problem.costs.len();
    if problem.bounds.len() != n {
        return Err(format!(
            "{} bounds for {} variables",
            problem.bounds.len(),
            n
        ));
    }
    if problem.costs.iter().any(|c| !c.is_finite()) {
        return Err("a cost is not a finite number".into());
    }
    for (j, (lo, hi)) in problem.bounds.iter().enumerate() {
        if lo.is_nan() || hi.is_nan() || *lo == f64::INFINITY || *hi == f64::NEG_INFINITY {
            return Err(format!("bounds of variable {j} are not numbers"));
        }
    }
    for c in &problem.constraints {
        if c.coefficients.len() != n {
            return Err(format!(
                "constraint \"{}\" has {} coefficients for {} variables",
                c.label,
                c.coefficients.len(),
                n
            ));
        }
        if !c.rhs.is_finite() || c.coefficients.iter().any(|a| !a.is_finite()) {
            return Err(format!(
                "constraint \"{}\" holds a value that is not finite",
                c.label
            ));
        }
    }
    Ok(())
}
