//! Radius of influence and transmissivity from a steady pumping test's distance–drawdown data.
//!
//! Thiem: s(r) = Q/(2πT)·ln(R/r) is a straight line in ln r; a least-squares line
//! s = a − m·ln r through the observations gives T = Q/(2π·m) and the radius where the line
//! reaches zero drawdown, R = exp(a/m) (Kruseman & de Ridder, *Analysis and Evaluation of Pumping
//! Test Data*, 2nd ed. 1994, §3.2.1, Thiem's method, distance–drawdown plot).
//!
//! In an unconfined aquifer the drawdowns are first corrected with Jacob's s′ = s − s²/(2H)
//! ([`crate::physics::thiem::jacob_correction`]), which turns the Dupuit–Thiem profile into the
//! Thiem line of the equivalent confined aquifer with T = K·H ([`distance_drawdown_fit_unconfined`]).

use crate::physics::thiem::jacob_correction;

/// Fit `s = a − m·ln r` to `(r, s)` pairs; returns `(R, m)` with R = exp(a/m) in m and m the
/// drawdown per natural-log cycle in m. `None` when fewer than two distinct distances, when
/// drawdown does not fall with distance, or when it falls so little that R is not finite.
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
    // A line that falls almost not at all reaches zero beyond any finite distance: no R.
    let r = (a / slope).exp();
    (r.is_finite() && r > 0.0).then_some((r, slope))
}

/// The distance–drawdown fit of [`distance_drawdown_fit`] for an unconfined test: each observed
/// drawdown s is replaced by Jacob's corrected s′ = s − s²/(2H) before the Thiem line is fitted.
/// Returns `(R, m)` with R in m and m the corrected drawdown per natural-log cycle in m, so that
/// T = K·H = Q/(2π·m).
///
/// Units: r, s and H (initial saturated thickness above the aquifer base) in m. Source: Jacob
/// (1944); Kruseman & de Ridder (1994), 2nd ed., §5.1 (steady unconfined: Thiem's method on
/// corrected drawdowns). `None` when H is not a positive finite number, when a drawdown is
/// negative, non-finite or ≥ H (the piezometer ran dry), or for the cases of
/// [`distance_drawdown_fit`].
pub fn distance_drawdown_fit_unconfined(
    observations: &[(f64, f64)],
    saturated_thickness: f64,
) -> Option<(f64, f64)> {
    let h = saturated_thickness;
    if !(h.is_finite() && h > 0.0) {
        return None;
    }
    let mut corrected = Vec::with_capacity(observations.len());
    for &(r, s) in observations {
        if !(s.is_finite() && (0.0..h).contains(&s)) {
            return None;
        }
        corrected.push((r, jacob_correction(s, h)));
    }
    distance_drawdown_fit(&corrected)
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
        // 2 m of drawdown falling by 1e-9 m from 10 to 20 m: the line would reach zero at
        // exp(2/1.4e-9) m, beyond any number (Thiem line, hand): refused, not infinite.
        assert!(distance_drawdown_fit(&[(10.0, 2.0), (20.0, 2.0 - 1e-9)]).is_none());
    }

    /// Exact Dupuit–Thiem drawdowns s(r) = H − √(H² − Q/(πK)·ln(R/r)), H = 20 m, K = 1e-4 m/s,
    /// Q = 0.01 m³/s, R = 200 m, at r = 10, 20, 50, 100 m (checks.md §4).
    fn dupuit_thiem_data() -> Vec<(f64, f64)> {
        let (h, k, q, r_inf) = (20.0_f64, 1e-4, 0.01, 200.0_f64);
        [10.0_f64, 20.0, 50.0, 100.0]
            .iter()
            .map(|&r| {
                let s = h - (h * h - q / (std::f64::consts::PI * k) * (r_inf / r).ln()).sqrt();
                (r, s)
            })
            .collect()
    }

    // Jacob's correction makes the Dupuit–Thiem profile the Thiem line with T = K·H exactly
    // (library: anaflow 1.2.0 `thiem`, s(10 m) = 2.54598 m, s′ = 2.383928 m; checks.md §4), so the
    // corrected fit returns R = 200 m and T = K·H = 2e-3 m²/s.
    #[test]
    fn unconfined_fit_recovers_radius_and_transmissivity() {
        let obs = dupuit_thiem_data();
        // the generated data are the checks.md §4 values (library: anaflow 1.2.0)
        assert!(
            (obs[0].1 / 2.54598 - 1.0).abs() < 2e-6,
            "s(10) = {}",
            obs[0].1
        );
        assert!((jacob_correction(obs[0].1, 20.0) / 2.383928 - 1.0).abs() < 1e-6);
        let (r, m) = distance_drawdown_fit_unconfined(&obs, 20.0).unwrap();
        let t = 0.01 / (2.0 * std::f64::consts::PI * m);
        assert!((r / 200.0 - 1.0).abs() < 1e-9, "R = {r}");
        assert!((t / 2e-3 - 1.0).abs() < 1e-9, "T = {t}");
    }

    // Without the correction the same data read short: the line through the raw drawdowns
    // reaches zero at about 189 m and gives T about 8 % low (checks.md §4: summing or fitting
    // plain drawdowns in an unconfined aquifer is wrong for large drawdowns).
    #[test]
    fn uncorrected_fit_of_unconfined_data_is_short() {
        let obs = dupuit_thiem_data();
        let (r, m) = distance_drawdown_fit(&obs).unwrap();
        let t = 0.01 / (2.0 * std::f64::consts::PI * m);
        assert!(r < 0.95 * 200.0, "R = {r}");
        assert!(t < 0.95 * 2e-3, "T = {t}");
    }

    #[test]
    fn unconfined_fit_refuses_bad_input() {
        let obs = dupuit_thiem_data();
        assert!(distance_drawdown_fit_unconfined(&obs, 0.0).is_none());
        assert!(distance_drawdown_fit_unconfined(&obs, f64::NAN).is_none());
        // a drawdown of H or more: the piezometer is dry
        assert!(distance_drawdown_fit_unconfined(&[(10.0, 20.0), (50.0, 1.0)], 20.0).is_none());
        assert!(distance_drawdown_fit_unconfined(&[(10.0, -1.0), (50.0, 1.0)], 20.0).is_none());
        assert!(distance_drawdown_fit_unconfined(&[(10.0, 1.0)], 20.0).is_none());
    }
}
