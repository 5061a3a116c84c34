//! Steady flow to a well in layered ground: N aquifers separated by aquitards (or by the
//! vertical resistance of the aquifers themselves), by the multi-aquifer method.
//!
//! Sources: Hemker, C.J. (1984), *Steady groundwater flow in leaky multiple-aquifer systems*,
//! J. Hydrology 72; Maas, C. (1986), *The use of matrix differential calculus in problems of
//! multiple-aquifer flow*, J. Hydrology 88; Bakker, M. & Strack, O.D.L. (2003), *Analytic
//! elements for multiaquifer flow*, J. Hydrology 271.
//!
//! With drawdowns s = (s₁ … s_N) and transmissivities T_i, the aquifers obey
//! T·∇²s = L·s − q, where L is the symmetric tridiagonal leakage matrix
//! (L_ii = 1/c_{i−1} + 1/c_i, L_i,i+1 = −1/c_i, c_i the resistance between aquifers i and
//! i+1 in seconds; no term across the impermeable base, nor across a confined or water-table
//! top). With W = T^{−1/2}, the symmetric matrix W·L·W = U·D·Uᵀ (nalgebra `SymmetricEigen`)
//! decouples the system into modes k with leakage factors λ_k = 1/√d_k. A well of unit rate in
//! aquifer i gives in aquifer j (the Green's function of the system)
//!
//!   s_j(r) = 1/(2π) · Σ_k U_jk·U_ik / √(T_i·T_j) · F_k(r),
//!
//! with F_k = K₀(r/λ_k) for d_k > 0 and, for the zero mode (a closed system: top not leaky),
//! F₀ = ln(R/r) with R the radius of influence (the zero mode is Thiem's solution with the
//! total transmissivity: U_i0 = √(T_i/ΣT)). With one aquifer this is Thiem exactly.
//!
//! Between two adjacent aquifers without an aquitard (one aquifer split into sublayers), the
//! resistance is c = ½·d_i/K_v,i + ½·d_{i+1}/K_v,i+1 (Hemker 1984; the same rule as timml's
//! Model3D).

use crate::physics::special::bessel_k0;
use nalgebra::{DMatrix, DVector, SymmetricEigen};
use std::f64::consts::PI;

/// Beyond this many leakage factors a mode's K₀ term is below 1e-11 and is left out.
pub const MODE_CUTOFF: f64 = 25.0;

/// The aquifers and the resistances between them, decomposed into modes.
#[derive(Debug, Clone)]
pub struct LeakageSystem {
    /// Transmissivity of each aquifer, m²/s, from the top down.
    transmissivities: Vec<f64>,
    /// Leakage factor of each mode, m; `None` for the zero mode (no leakage: Thiem).
    leakage_factors: Vec<Option<f64>>,
    /// Eigenvectors U (column k is mode k).
    vectors: DMatrix<f64>,
}

impl LeakageSystem {
    /// The system of aquifers with transmissivities `t` (m²/s, top down) and resistances `c`
    /// (s; `c[i]` between aquifer i and i+1, so `c.len() == t.len() − 1`). `None` when the
    /// lengths do not fit or a value is not positive and finite.
    pub fn new(t: &[f64], c: &[f64]) -> Option<LeakageSystem> {
        let n = t.len();
        let positive = |v: &f64| v.is_finite() && *v > 0.0;
        if n == 0 || c.len() + 1 != n || !t.iter().all(positive) || !c.iter().all(positive) {
            return None;
        }
        let mut l = DMatrix::<f64>::zeros(n, n);
        for (i, ci) in c.iter().enumerate() {
            let g = 1.0 / ci;
            l[(i, i)] += g;
            l[(i + 1, i + 1)] += g;
            l[(i, i + 1)] -= g;
            l[(i + 1, i)] -= g;
        }
        let w = DVector::from_iterator(n, t.iter().map(|ti| 1.0 / ti.sqrt()));
        let s = DMatrix::from_fn(n, n, |i, j| w[i] * l[(i, j)] * w[j]);
        let eig = SymmetricEigen::new(s);
        let largest = eig.eigenvalues.iter().fold(0.0_f64, |m, d| m.max(d.abs()));
        let leakage_factors = eig
            .eigenvalues
            .iter()
            .map(|&d| (d > 1e-10 * largest).then(|| 1.0 / d.sqrt()))
            .collect();
        Some(LeakageSystem {
            transmissivities: t.to_vec(),
            leakage_factors,
            vectors: eig.eigenvectors,
        })
    }

    /// Number of aquifers.
    pub fn aquifer_count(&self) -> usize {
        self.transmissivities.len()
    }

    /// Transmissivity of aquifer `i`, m²/s.
    pub fn transmissivity(&self, i: usize) -> f64 {
        self.transmissivities[i]
    }

    /// The leakage factors λ_k of the modes that leak, m (largest first).
    pub fn leakage_factors(&self) -> Vec<f64> {
        let mut v: Vec<f64> = self.leakage_factors.iter().flatten().copied().collect();
        v.sort_by(|a, b| b.total_cmp(a));
        v
    }

    /// The eigenvectors U (column k is mode k).
    pub fn vectors(&self) -> &DMatrix<f64> {
        &self.vectors
    }

    /// The leakage factor of each mode in the order of [`LeakageSystem::vectors`], m (`None`:
    /// the zero mode).
    pub fn mode_leakage_factors(&self) -> &[Option<f64>] {
        &self.leakage_factors
    }

    /// Whether the system has a zero mode (no leakage to a fixed head anywhere): then the
    /// radius of influence closes the far field.
    pub fn has_zero_mode(&self) -> bool {
        self.leakage_factors.iter().any(Option::is_none)
    }

    /// Weights a_k of each mode for a unit rate in aquifer `from`, seen in aquifer `at`:
    /// s_at = Σ_k a_k·F_k(r) / (2π), a_k = U_at,k·U_from,k / √(T_at·T_from).
    pub fn mode_weights(&self, from: usize, at: usize) -> Vec<f64> {
        let root = (self.transmissivities[from] * self.transmissivities[at]).sqrt();
        (0..self.aquifer_count())
            .map(|k| self.vectors[(at, k)] * self.vectors[(from, k)] / root)
            .collect()
    }

    /// The mode functions F_k(r) at distance r (m) for radius of influence `big_r` (m), each
    /// vanishing at R, so that the drawdown is nil at R in every aquifer (the head held on a
    /// circle of radius R, as the single-aquifer radius of influence does):
    /// F_k = K₀(r/λ_k) − K₀(R/λ_k)·I₀(r/λ_k)/I₀(R/λ_k) (the correction is left out when
    /// R > 25·λ_k, below e⁻⁵⁰), or ln(R/r) for the zero mode; 0 beyond R. Without the
    /// correction a leaky mode reaching past R (λ > R: a stiff aquitard) would raise the head
    /// in the aquifer not pumped.
    pub fn mode_functions(&self, r: f64, big_r: f64) -> Vec<f64> {
        self.leakage_factors
            .iter()
            .map(|lf| match lf {
                _ if r >= big_r => 0.0,
                Some(l) if big_r > MODE_CUTOFF * l => {
                    if r < MODE_CUTOFF * l {
                        bessel_k0(r / l)
                    } else {
                        0.0
                    }
                }
                Some(l) => {
                    bessel_k0(r / l)
                        - bessel_k0(big_r / l) * bessel_i0(r / l) / bessel_i0(big_r / l)
                }
                None => (big_r / r).ln(),
            })
            .collect()
    }

    /// Drawdown in aquifer `at` at distance r (m) from a well of unit rate (1 m³/s) in aquifer
    /// `from`, for radius of influence `big_r` (m): m per m³/s.
    pub fn unit_drawdown(&self, from: usize, at: usize, r: f64, big_r: f64) -> f64 {
        let f = self.mode_functions(r, big_r);
        self.mode_weights(from, at)
            .iter()
            .zip(&f)
            .map(|(a, fk)| a * fk)
            .sum::<f64>()
            / (2.0 * PI)
    }

    /// How a well of radius `rw` (m) screened in the aquifers `screened` shares its rate among
    /// them, so that its head is the same in each (one well alone; Bakker & Strack 2003, the
    /// condition timml applies at a multi-layer well): fractions summing to 1, in the order of
    /// `screened`. Solves [G −1; 1ᵀ 0]·[q; s] = [0; 1], G_ab the unit drawdown at the screen in
    /// aquifer a from a unit rate in aquifer b.
    pub fn equal_head_shares(&self, screened: &[usize], rw: f64, big_r: f64) -> Vec<f64> {
        let m = screened.len();
        if m <= 1 {
            return vec![1.0; m];
        }
        let mut a = DMatrix::<f64>::zeros(m + 1, m + 1);
        let mut b = DVector::<f64>::zeros(m + 1);
        for (ia, &la) in screened.iter().enumerate() {
            for (ib, &lb) in screened.iter().enumerate() {
                a[(ia, ib)] = self.unit_drawdown(lb, la, rw, big_r);
            }
            a[(ia, m)] = -1.0;
            a[(m, ia)] = 1.0;
        }
        b[m] = 1.0;
        match a.lu().solve(&b) {
            Some(x) => x.iter().take(m).copied().collect(),
            None => {
                let total: f64 = screened.iter().map(|&i| self.transmissivities[i]).sum();
                screened
                    .iter()
                    .map(|&i| self.transmissivities[i] / total)
                    .collect()
            }
        }
    }
}

/// Modified Bessel function I₀(x) for 0 ≤ x ≤ 25 by its power series Σ (x/2)^{2k}/(k!)²
/// (Abramowitz & Stegun 1964, eq. 9.6.10); all terms positive, so no cancellation.
fn bessel_i0(x: f64) -> f64 {
    let q = 0.25 * x * x;
    let (mut term, mut sum) = (1.0, 1.0);
    for k in 1..200 {
        term *= q / (k * k) as f64;
        sum += term;
        if term < 1e-17 * sum {
            break;
        }
    }
    sum
}

/// Resistance between two adjacent aquifer sublayers without an aquitard between them, s:
/// c = ½·d₁/K_v1 + ½·d₂/K_v2 (d thickness, m; K_v vertical conductivity, m/s).
pub fn sublayer_resistance(d1: f64, kv1: f64, d2: f64, kv2: f64) -> f64 {
    0.5 * d1 / kv1 + 0.5 * d2 / kv2
}

#[cfg(test)]
mod tests {
    use super::*;

    // One aquifer: Thiem, s = Q/(2πT)·ln(R/r) (Thiem 1906).
    #[test]
    fn one_aquifer_is_thiem() {
        let sys = LeakageSystem::new(&[1e-2], &[]).unwrap();
        let s = sys.unit_drawdown(0, 0, 10.0, 500.0);
        let thiem = (500.0_f64 / 10.0).ln() / (2.0 * PI * 1e-2);
        assert!((s - thiem).abs() < 1e-12 * thiem, "{s} vs {thiem}");
    }

    // Two aquifers, one of them with a much smaller transmissivity: when the lower one is
    // pumped, far out (r ≫ λ) both aquifers show Thiem's drawdown with the total T
    // (Hemker 1984: the far field of a closed system is the zero mode).
    #[test]
    fn far_field_is_thiem_with_total_transmissivity() {
        let sys = LeakageSystem::new(&[2e-3, 8e-3], &[86400.0 * 200.0]).unwrap();
        let lam = sys.leakage_factors()[0];
        let r = 40.0 * lam;
        let big_r = 100.0 * lam;
        for at in 0..2 {
            let s = sys.unit_drawdown(1, at, r, big_r);
            let thiem = (big_r / r).ln() / (2.0 * PI * 1e-2);
            assert!((s - thiem).abs() < 1e-9 * thiem, "{s} vs {thiem}");
        }
        // the one leaking mode has λ² = c/(1/T₁ + 1/T₂) (Hemker 1984, two aquifers)
        let expect = (86400.0_f64 * 200.0 / (1.0 / 2e-3 + 1.0 / 8e-3)).sqrt();
        assert!((lam - expect).abs() < 1e-9 * expect);
    }

    // I₀(1) = 1.2660658777520082 and I₀(10) = 2815.716628466254 (Abramowitz & Stegun 1964,
    // table 9.8 — from memory)
    #[test]
    fn bessel_i0_values() {
        assert!((bessel_i0(1.0) - 1.2660658777520082).abs() < 1e-14);
        assert!((bessel_i0(10.0) / 2815.716628466254 - 1.0).abs() < 1e-13);
    }

    // A stiff aquitard (λ ≫ R): pumping the lower aquifer never raises the upper one (a
    // maximum principle) nor draws it below the lower one, and the lower one is within 5 % of
    // Thiem with its own transmissivity (common practice (no source):
    // an aquitard that stiff separates the aquifers).
    #[test]
    fn stiff_aquitard_separates_the_aquifers() {
        let sys = LeakageSystem::new(&[1.7e-3, 1.12e-2], &[4e9]).unwrap();
        assert!(sys.leakage_factors()[0] > 2000.0);
        for r in [0.2, 5.0, 40.0, 300.0, 1200.0] {
            let upper = sys.unit_drawdown(1, 0, r, 1300.0);
            let lower = sys.unit_drawdown(1, 1, r, 1300.0);
            let thiem = (1300.0_f64 / r).ln() / (2.0 * PI * 1.12e-2);
            assert!(upper >= 0.0 && upper < lower, "r {r}: {upper} {lower}");
            assert!(
                (lower - thiem).abs() < 0.05 * thiem,
                "r {r}: {lower} vs {thiem}"
            );
        }
    }

    // The shares of a well screened in two aquifers with no resistance worth the name between
    // them go as the transmissivities (the heads are then the same everywhere).
    #[test]
    fn shares_follow_transmissivity_without_resistance() {
        let sys = LeakageSystem::new(&[1e-3, 3e-3], &[1.0]).unwrap();
        let q = sys.equal_head_shares(&[0, 1], 0.15, 500.0);
        assert!(
            (q[0] - 0.25).abs() < 1e-3 && (q[1] - 0.75).abs() < 1e-3,
            "{q:?}"
        );
    }
}
