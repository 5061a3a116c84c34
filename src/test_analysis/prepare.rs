//! Observations made ready for a fit, and the bounds a fitted aquifer must keep.
//!
//! - **Long records** (logger data, more than [`BIN_ABOVE`] readings in all) are averaged in
//!   bins of 1/[`BINS_PER_DECADE`] log-cycle of time per observation well: each bin is one point
//!   at the geometric mean of its times and the mean of its drawdowns, weighted by its count
//!   (a weighted least-squares fit of the means is the fit of the readings, less the scatter
//!   inside each bin about its own straight line in ln t, which the rms adds back). The fits then cost O(bins), the reading O(rows).
//!   Common practice (no source): loggers oversample; a fit needs tens of points per log-cycle.
//! - **Bounds**: a fit is offered only with T in [`T_RANGE`] and S in [`S_RANGE`]; outside, the
//!   data do not describe an aquifer a well can drain (a flat record drives T to infinity and S
//!   to 0), and the fit is refused with the reason. The least-squares search itself works in a
//!   box a decade wider ([`T_SEARCH`], [`S_SEARCH`]), so a refusal is never a search artefact.

use super::Fit;
use std::collections::BTreeMap;

/// Readings above which records are averaged in log-time bins.
pub const BIN_ABOVE: usize = 400;
/// Bins per log-cycle of time (per observation well).
pub const BINS_PER_DECADE: f64 = 50.0;
/// Transmissivity a fit may offer, m²/s: 1e-9 (the design file's lowest conductivity, 1e-9
/// m/s, over a metre) to 10 (1 m/s, the highest, over 10 m; common practice (no source)).
pub const T_RANGE: (f64, f64) = (1e-9, 10.0);
/// Storativity or specific yield a fit may offer: 1e-7 (a stiff confined layer) to 0.5 (more
/// than any soil's drainable pore space; the design file's limit). Common practice (no source).
pub const S_RANGE: (f64, f64) = (1e-7, 0.5);
/// The least-squares box for log10 T.
pub const T_SEARCH: (f64, f64) = (-10.0, 2.0);
/// The least-squares box for log10 S.
pub const S_SEARCH: (f64, f64) = (-8.0, 0.0);

/// One fitting point: r² (m²), t (s), s (m), and the readings it stands for.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Point {
    /// Squared distance, m².
    pub r2: f64,
    /// Time, s.
    pub t: f64,
    /// Drawdown (or its corrected form), m.
    pub s: f64,
    /// Weight: the number of readings averaged.
    pub w: f64,
}

/// The points of a fit.
#[derive(Debug, Clone)]
pub struct Prepared {
    /// Points, ordered by distance and time when binned.
    pub points: Vec<Point>,
    /// Readings in the record.
    pub readings: usize,
    /// Σ (reading − its bin mean)², m² (0 when not binned).
    pub within_ss: f64,
}

impl Prepared {
    /// A note saying how the record was reduced, when it was.
    pub fn note(&self) -> Option<String> {
        (self.points.len() < self.readings).then(|| {
            format!(
                "{} readings averaged in {} bins of 1/{BINS_PER_DECADE:.0} log-cycle of time per well (long record); the rms includes the scatter inside the bins",
                self.readings,
                self.points.len()
            )
        })
    }

    /// Root mean square of the readings' residuals, m, from the weighted bin residuals
    /// `weighted` (√w·(model − mean)) and the scatter inside the bins.
    pub fn rms(&self, weighted: &[f64]) -> f64 {
        let ss: f64 = weighted.iter().map(|v| v * v).sum::<f64>() + self.within_ss;
        (ss / self.readings.max(1) as f64).sqrt()
    }
}

/// The points (r², t, s) of all wells, binned when the record is long.
pub fn prepare(raw: Vec<(f64, f64, f64)>) -> Prepared {
    let readings = raw.len();
    if readings <= BIN_ABOVE {
        return Prepared {
            points: raw
                .into_iter()
                .map(|(r2, t, s)| Point { r2, t, s, w: 1.0 })
                .collect(),
            readings,
            within_ss: 0.0,
        };
    }
    // (r² bits, bin) → [n, Σx, Σs, Σx², Σxs, Σs²] with x = ln t − the bin's lower edge;
    // r² > 0, so its bits sort as the number does.
    let mut bins: BTreeMap<(u64, i64), [f64; 6]> = BTreeMap::new();
    let edge = |k: i64| k as f64 / BINS_PER_DECADE * std::f64::consts::LN_10;
    for (r2, t, s) in raw {
        let k = (t.log10() * BINS_PER_DECADE).floor() as i64;
        let x = t.ln() - edge(k);
        let e = bins.entry((r2.to_bits(), k)).or_insert([0.0; 6]);
        e[0] += 1.0;
        e[1] += x;
        e[2] += s;
        e[3] += x * x;
        e[4] += x * s;
        e[5] += s * s;
    }
    let mut within_ss = 0.0;
    let points = bins
        .into_iter()
        .map(|((r2, k), [n, sx, ss, sxx, sxs, s2])| {
            // scatter about the bin's own straight line in ln t (the curve's rise across a
            // bin is not misfit): Syy − Sxy²/Sxx, centred sums
            let cyy = (s2 - ss * ss / n).max(0.0);
            let cxx = sxx - sx * sx / n;
            let cxy = sxs - sx * ss / n;
            within_ss += if cxx > 1e-18 {
                (cyy - cxy * cxy / cxx).max(0.0)
            } else {
                cyy
            };
            Point {
                r2: f64::from_bits(r2),
                t: (sx / n + edge(k)).exp(),
                s: ss / n,
                w: n,
            }
        })
        .collect();
    Prepared {
        points,
        readings,
        within_ss,
    }
}

/// The fit when its T and S are ones an aquifer can have; otherwise why not.
pub fn plausible(fit: Fit) -> Result<Fit, String> {
    let name = fit.method.name();
    let t = fit.transmissivity.value;
    if !(t.is_finite() && t <= T_RANGE.1) {
        return Err(format!(
            "{name}: data too flat to fit T: the drawdown hardly grows with time (or falls too little with distance), so T would exceed {:e} m²/s, more than any aquifer transmits; check the drawdown column and its unit",
            T_RANGE.1
        ));
    }
    if t < T_RANGE.0 {
        return Err(format!(
            "{name}: T would be {t:.2e} m²/s, below {:e} (ground that wells cannot drain); check the rate and the drawdown unit",
            T_RANGE.0
        ));
    }
    if let Some(s) = fit.storativity.map(|e| e.value) {
        if !(s.is_finite() && s <= S_RANGE.1) {
            return Err(format!(
                "{name}: S would be {s:.3e}, above {} (more than any soil's pore space); check the distances and the time unit",
                S_RANGE.1
            ));
        }
        if s < S_RANGE.0 {
            return Err(format!(
                "{name}: data too flat to fit T and S: S would be {s:.3e}, below {:e} (stiffer than any aquifer); a drawdown that hardly grows with time drives S to 0, a wrong distance or time unit too",
                S_RANGE.0
            ));
        }
    }
    Ok(fit)
}
