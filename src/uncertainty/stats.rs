//! Percentiles of a sampled output.
//!
//! The p-th percentile by linear interpolation between order statistics at (n − 1)·p (Hyndman &
//! Fan 1996, "Sample quantiles in statistical packages", The American Statistician 50(4),
//! 361–365, definition 7 — NumPy's and R's default).

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
}
