//! A small Levenberg–Marquardt least-squares solver over nalgebra (the `levenberg-marquardt`
//! crate, 0.15, is built on nalgebra 0.34 and would bring a second nalgebra).
//!
//! Minimises ½‖r(p)‖² (Levenberg 1944; Marquardt 1963; as in Madsen, Nielsen & Tingleff 2004,
//! *Methods for Non-Linear Least Squares Problems*, from memory). Step: (JᵀJ + λ·diag(JᵀJ))·δ =
//! −Jᵀr, J by central differences (h = 1e-6 in the parameter). An accepted step (lower cost)
//! divides λ by 3, a rejected one multiplies it by 4.
//!
//! Bounds: each parameter is kept in a box [lo, hi]; the start and every trial step are
//! projected onto it (a projected Levenberg–Marquardt step, as in Kanzow, Yamashita & Fukushima
//! 2004, from memory). A parameter that ends on its bound is reported in `at_bound`, so the
//! caller can say why the data do not determine it.
//!
//! Stopping rule (documented, bounded): stop as converged when an accepted step has
//! max|δᵢ| < 1e-11, or the cost is below 1e-30, or λ exceeds 1e15 (no downhill step left:
//! a stationary point); stop unconverged after `max_iter` iterations.

use nalgebra::{DMatrix, DVector};

/// Result of a fit.
pub struct LmOutcome {
    /// Best parameters.
    pub params: Vec<f64>,
    /// Residuals at the best parameters.
    pub residuals: Vec<f64>,
    /// (JᵀJ)⁻¹ at the best parameters, `None` when singular.
    pub jtj_inverse: Option<DMatrix<f64>>,
    /// Iterations used.
    pub iterations: usize,
    /// Whether a stopping test other than the iteration cap ended the search.
    pub converged: bool,
    /// Per parameter: −1 on its lower bound, +1 on its upper bound, 0 inside.
    pub at_bound: Vec<i8>,
}

fn project(p: &mut [f64], bounds: &[(f64, f64)]) {
    for (v, &(lo, hi)) in p.iter_mut().zip(bounds) {
        *v = v.clamp(lo, hi);
    }
}

fn cost(r: &[f64]) -> f64 {
    r.iter().map(|v| v * v).sum::<f64>()
}

fn eval<F: Fn(&[f64], &mut [f64])>(f: &F, p: &[f64], out: &mut [f64]) -> bool {
    f(p, out);
    out.iter().all(|v| v.is_finite())
}

fn jacobian<F: Fn(&[f64], &mut [f64])>(f: &F, p: &[f64], n: usize) -> Option<DMatrix<f64>> {
    let m = p.len();
    let mut j = DMatrix::zeros(n, m);
    let mut plus = vec![0.0; n];
    let mut minus = vec![0.0; n];
    let mut q = p.to_vec();
    for k in 0..m {
        let h = 1e-6;
        q[k] = p[k] + h;
        if !eval(f, &q, &mut plus) {
            return None;
        }
        q[k] = p[k] - h;
        if !eval(f, &q, &mut minus) {
            return None;
        }
        q[k] = p[k];
        for i in 0..n {
            j[(i, k)] = (plus[i] - minus[i]) / (2.0 * h);
        }
    }
    Some(j)
}

/// Minimise Σ rᵢ(p)² from `p0` with every parameter in `bounds` (lo ≤ hi, finite); `f(p, r)`
/// writes the `n` residuals. Never panics: a start where the residuals are not finite returns
/// `None`.
pub fn minimise<F: Fn(&[f64], &mut [f64])>(
    f: F,
    p0: &[f64],
    bounds: &[(f64, f64)],
    n: usize,
    max_iter: usize,
) -> Option<LmOutcome> {
    let mut p = p0.to_vec();
    project(&mut p, bounds);
    let mut r = vec![0.0; n];
    if !eval(&f, &p, &mut r) {
        return None;
    }
    let mut c = cost(&r);
    let mut lambda = 1e-3;
    let mut trial = vec![0.0; n];
    let mut converged = false;
    let mut iterations = 0;
    let mut j = jacobian(&f, &p, n)?;
    while iterations < max_iter {
        iterations += 1;
        if c < 1e-30 {
            converged = true;
            break;
        }
        let jtj = j.transpose() * &j;
        let g = j.transpose() * DVector::from_column_slice(&r);
        let mut a = jtj.clone();
        for k in 0..p.len() {
            a[(k, k)] += lambda * jtj[(k, k)].max(1e-12);
        }
        let Some(delta) = a.lu().solve(&(-g)) else {
            lambda *= 4.0;
            if lambda > 1e15 {
                converged = true;
                break;
            }
            continue;
        };
        let mut q: Vec<f64> = p.iter().zip(delta.iter()).map(|(a, b)| a + b).collect();
        project(&mut q, bounds);
        if eval(&f, &q, &mut trial) && cost(&trial) < c {
            let step = q
                .iter()
                .zip(&p)
                .map(|(a, b)| (a - b).abs())
                .fold(0.0, f64::max);
            p = q;
            std::mem::swap(&mut r, &mut trial);
            c = cost(&r);
            lambda = (lambda / 3.0).max(1e-12);
            if step < 1e-11 {
                converged = true;
                break;
            }
            match jacobian(&f, &p, n) {
                Some(jn) => j = jn,
                None => break,
            }
        } else {
            lambda *= 4.0;
            if lambda > 1e15 {
                converged = true;
                break;
            }
        }
    }
    let jf = jacobian(&f, &p, n).unwrap_or(j);
    let jtj_inverse = (jf.transpose() * &jf).try_inverse();
    let span = |lo: f64, hi: f64| 1e-6 * (hi - lo).max(1e-300);
    let at_bound = p
        .iter()
        .zip(bounds)
        .map(|(&v, &(lo, hi))| {
            if v <= lo + span(lo, hi) {
                -1
            } else if v >= hi - span(lo, hi) {
                1
            } else {
                0
            }
        })
        .collect();
    Some(LmOutcome {
        at_bound,
        params: p,
        residuals: r,
        jtj_inverse,
        iterations,
        converged,
    })
}
