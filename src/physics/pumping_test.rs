//! Radius of influence and transmissivity from a steady pumping test's distance–drawdown data.
//!
//! Thiem: s(r) = Q/(2πT)·ln(R/r) is a straight line in ln r; a least-squares line
//! s = a − m·ln r through the observations gives T = Q/(2π·m) and the radius where the line
//! reaches zero drawdown, R = exp(a/m) (Kruseman & de Ridder, *Analysis and Evaluation of Pumping
//! Test Data*, 2nd ed. 1994, §3.2.1, Thiem's method, distance–drawdown plot).

/// Fit `s = a − m·ln r` to `(r, s)` pairs; returns `(R, m)` with R = exp(a/m) in m and m the
/// drawdown per natural-log cycle in m. `None` when fewer than two distinct distances or when
/// drawdown does not fall with distance.
pub fn distance_drawdown_fit(observations: &[(f64, f64)]) -> Option<(f64, f64)> {
    let n = observations.len() as f64;
    if observations.len() < 2 {
        return None;
    }
    let mean_x = observations.iter().map(|(r, _)| r.ln()).sum::<f64>() / n;
    let mean_y = observations.iter().map(|(_, s)| s).sum::<f64>() / n;
    let sxx: f64 = observations
        .iter()
        .map(|(r, _)| (r.ln() - mean_x).powi(2))
        .sum();
    let sxy: f64 = observations
        .iter()
        .map(|(r, s)| (r.ln() - mean_x) * (s - mean_y))
        .sum();
    if sxx <= 1e-12 {
        return None;
    }
    let slope = -sxy / sxx;
    if slope.is_nan() || slope <= 0.0 {
        return None;
    }
    let a = mean_y + slope * mean_x;
    Some(((a / slope).exp(), slope))
}

#[cfg(test)]
mod tests {
    use super::*;

    // Kruseman & de Ridder (1994) 2nd ed., Table 3.2, "Oude Korendijk", steady drawdowns,
    // Q = 788 m³/d. Two piezometers define the line exactly: 30 m and 90 m give the pairwise
    // Thiem T = 4.287e-3 m²/s (checks.md §3, tolerance 0.5 %).
    #[test]
    fn oude_korendijk_pair_gives_the_pairwise_thiem_transmissivity() {
        let q = 788.0 / 86400.0;
        let (r, m) = distance_drawdown_fit(&[(30.0, 1.088), (90.0, 0.716)]).unwrap();
        let t = q / (2.0 * std::f64::consts::PI * m);
        assert!((t / 4.287e-3 - 1.0).abs() < 5e-3, "T = {t}");
        // The line reaches zero drawdown beyond the farthest piezometer with drawdown (215 m).
        assert!(r > 215.0, "R = {r}");
    }

    // Same test, piezometers at 0.8, 30 and 90 m: the book's Thiem analysis gives
    // T ≈ 390 m²/d = 4.5e-3 m²/s; the pairwise values spread 4.29e-3 … 4.58e-3 m²/s (checks.md §3).
    #[test]
    fn oude_korendijk_three_piezometers_within_the_book_spread() {
        let q = 788.0 / 86400.0;
        let obs = [(0.8, 2.236), (30.0, 1.088), (90.0, 0.716)];
        let (_, m) = distance_drawdown_fit(&obs).unwrap();
        let t = q / (2.0 * std::f64::consts::PI * m);
        assert!((4.287e-3..=4.583e-3).contains(&t), "T = {t}");
    }

    #[test]
    fn refuses_flat_or_single_data() {
        assert!(distance_drawdown_fit(&[(10.0, 1.0)]).is_none());
        assert!(distance_drawdown_fit(&[(10.0, 1.0), (20.0, 1.5)]).is_none());
    }
}
