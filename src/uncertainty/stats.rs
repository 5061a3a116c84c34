//! Percentiles of a sampled output.
//!
//! The p-th percentile by linear interpolation between order statistics at (n − 1)·p (Hyndman &
//! Fan 1996, "Sample quantiles in statistical packages", The American Statistician 50(4),
//! 361–365, definition 7 — NumPy's and R's default).

use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;
use serde::Serialize;

/// P10, P50 and P90 of one output (non-exceedance probabilities 10, 50 and 90 %).
#[derive(Debug, Clone, Copy, Serialize, PartialEq)]
pub struct Percentiles {
    /// 10 % of samples are at or below.
    pub p10: f64,
    /// The median.
    pub p50: f64,
    /// 90 % of samples are at or below.
    pub p90: f64,
    /// Mean.
    pub mean: f64,
    /// Lowest sample.
    pub min: f64,
    /// Highest sample.
    pub max: f64,
    /// Samples with a value.
    pub count: usize,
}

/// The `p` quantile (0 ≤ p ≤ 1) of sorted values (Hyndman & Fan definition 7).
pub fn quantile_sorted(sorted: &[f64], p: f64) -> f64 {
    if sorted.is_empty() {
        return f64::NAN;
    }
    let h = (sorted.len() - 1) as f64 * p.clamp(0.0, 1.0);
    let lo = h.floor() as usize;
    let hi = (lo + 1).min(sorted.len() - 1);
    sorted[lo] + (h - lo as f64) * (sorted[hi] - sorted[lo])
}

/// Percentiles of the finite values among `values` (`None` when there are none).
pub fn percentiles(values: impl IntoIterator<Item = f64>) -> Option<Percentiles> {
    let mut v: Vec<f64> = values.into_iter().filter(|x| x.is_finite()).collect();
    if v.is_empty() {
        return None;
    }
    v.sort_by(f64::total_cmp);
    Some(Percentiles {
        p10: quantile_sorted(&v, 0.1),
        p50: quantile_sorted(&v, 0.5),
        p90: quantile_sorted(&v, 0.9),
        mean: v.iter().sum::<f64>() / v.len() as f64,
        min: v[0],
        max: v[v.len() - 1],
        count: v.len(),
    })
}

/// How well a sampled percentile has settled: the bootstrap's 95 % interval of the `p`
/// quantile (Efron & Tibshirani 1993, *An Introduction to the Bootstrap*, ch. 13, the percentile
/// interval), as a fraction of the quantile itself.
#[derive(Debug, Clone, Copy, Serialize, PartialEq)]
pub struct Convergence {
    /// The quantile (0 … 1).
    pub p: f64,
    /// Samples with a value.
    pub samples: usize,
    /// Resamples drawn.
    pub resamples: usize,
    /// Half the width of the 95 % interval ÷ the quantile.
    pub relative_half_width: f64,
    /// The spread of the quantile over independent repeats of the whole sampling (check mode,
    /// where a repeat is cheap): the honest figure for a Latin hypercube.
    pub replicates: Option<Replicates>,
}

/// The quantile from independent Latin hypercubes of the same size (other seeds).
#[derive(Debug, Clone, Copy, Serialize, PartialEq)]
pub struct Replicates {
    /// Hypercubes, the run's own included.
    pub count: usize,
    /// Sample standard deviation of their quantiles ÷ the run's quantile.
    pub relative_sd: f64,
    /// Largest distance of one from the run's quantile ÷ the run's quantile.
    pub relative_max: f64,
}

/// The spread of `quantiles` (the run's own first) about the first, as [`Replicates`]. `None`
/// with fewer than 3 or a first of 0.
pub fn replicate_spread(quantiles: &[f64]) -> Option<Replicates> {
    let q0 = *quantiles.first()?;
    let n = quantiles.len();
    if n < 3 || q0 == 0.0 {
        return None;
    }
    let mean = quantiles.iter().sum::<f64>() / n as f64;
    let var = quantiles.iter().map(|q| (q - mean).powi(2)).sum::<f64>() / (n - 1) as f64;
    Some(Replicates {
        count: n,
        relative_sd: var.sqrt() / q0.abs(),
        relative_max: quantiles
            .iter()
            .map(|q| (q - q0).abs() / q0.abs())
            .fold(0.0, f64::max),
    })
}

/// The bootstrap spread of the `p` quantile of the finite `values`: `resamples` resamples of
/// the same size drawn with replacement (ChaCha8 from `seed`), the 2.5 % and 97.5 % points of
/// their quantiles. The resampling treats the samples as independent; a Latin hypercube
/// stratifies each input, so the true spread is no larger for an output that rises or falls
/// with its inputs (McKay, Beckman & Conover 1979, theorem on monotone outputs): the figure is an
/// upper bound there. `None` with fewer than 10 values or a quantile of 0.
pub fn bootstrap_convergence(
    values: &[f64],
    p: f64,
    resamples: usize,
    seed: u64,
) -> Option<Convergence> {
    let v: Vec<f64> = values.iter().copied().filter(|x| x.is_finite()).collect();
    if v.len() < 10 || resamples < 2 {
        return None;
    }
    let mut sorted = v.clone();
    sorted.sort_by(f64::total_cmp);
    let q = quantile_sorted(&sorted, p);
    if q == 0.0 {
        return None;
    }
    let mut rng = ChaCha8Rng::seed_from_u64(seed);
    let mut draw = vec![0.0; v.len()];
    let mut qs: Vec<f64> = (0..resamples)
        .map(|_| {
            for d in draw.iter_mut() {
                *d = v[rng.random_range(0..v.len())];
            }
            draw.sort_by(f64::total_cmp);
            quantile_sorted(&draw, p)
        })
        .collect();
    qs.sort_by(f64::total_cmp);
    let (lo, hi) = (quantile_sorted(&qs, 0.025), quantile_sorted(&qs, 0.975));
    Some(Convergence {
        p,
        samples: v.len(),
        resamples,
        relative_half_width: 0.5 * (hi - lo) / q.abs(),
        replicates: None,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// numpy.percentile([1, 2, 3, 4], [10, 50, 90]) = 1.3, 2.5, 3.7 (NumPy's linear method,
    /// Hyndman & Fan definition 7: h = (n − 1)·p).
    #[test]
    fn linear_percentiles() {
        let p = percentiles([4.0, 1.0, 3.0, 2.0, f64::NAN]).unwrap();
        assert!((p.p10 - 1.3).abs() < 1e-12);
        assert!((p.p50 - 2.5).abs() < 1e-12);
        assert!((p.p90 - 3.7).abs() < 1e-12);
        assert_eq!(p.count, 4);
    }

    /// numpy.percentile (default "linear", Hyndman & Fan definition 7) of
    /// x_i = exp(sin(i) + i/n) for several n and p (tests/reference/uncertainty_percentiles.csv,
    /// scripts/reference_days_to_dig.py), to 1e-12 relative.
    #[test]
    fn percentiles_match_numpy() {
        let text = include_str!("../../tests/reference/uncertainty_percentiles.csv");
        let mut rows = 0;
        for line in text.lines().skip(1) {
            let f: Vec<f64> = line.split(',').map(|x| x.parse().unwrap()).collect();
            let n = f[0] as usize;
            let mut x: Vec<f64> = (0..n)
                .map(|i| ((i as f64).sin() + i as f64 / n as f64).exp())
                .collect();
            x.sort_by(f64::total_cmp);
            let got = quantile_sorted(&x, f[1]);
            assert!(
                (got / f[2] - 1.0).abs() < 1e-12,
                "n {n} p {}: {got} vs {}",
                f[1],
                f[2]
            );
            rows += 1;
        }
        assert_eq!(rows, 24);
    }

    /// The bootstrap spread of the P90 of n iid standard lognormal-like values shrinks as 1/√n
    /// (the asymptotic variance of a sample quantile, p(1 − p)/(n·f(q)²): Cramér 1946, from
    /// memory): four times the samples, about half the spread.
    #[test]
    fn bootstrap_spread_shrinks_with_n() {
        let values = |n: usize| -> Vec<f64> {
            (0..n)
                .map(|i| (spec_math::cephes64::ndtri((i as f64 + 0.5) / n as f64)).exp())
                .collect()
        };
        let a = bootstrap_convergence(&values(250), 0.9, 2000, 1).unwrap();
        let b = bootstrap_convergence(&values(1000), 0.9, 2000, 1).unwrap();
        let ratio = a.relative_half_width / b.relative_half_width;
        assert!((1.6..2.5).contains(&ratio), "{ratio}");
        assert!(bootstrap_convergence(&values(5), 0.9, 100, 1).is_none());
    }

    /// Python's `statistics.stdev([1.0, 1.1, 0.9, 1.05])` (sample standard deviation, n − 1)
    /// = 0.08539125638299667; the largest move from the first is 0.1.
    #[test]
    fn replicate_spread_is_the_sample_standard_deviation() {
        let r = replicate_spread(&[1.0, 1.1, 0.9, 1.05]).unwrap();
        assert!((r.relative_sd - 0.08539125638299667).abs() < 1e-12, "{r:?}");
        assert!((r.relative_max - 0.1).abs() < 1e-12, "{r:?}");
        assert_eq!(r.count, 4);
        assert!(replicate_spread(&[1.0, 1.1]).is_none());
    }
}
