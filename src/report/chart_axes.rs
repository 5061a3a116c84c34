//! Axis ticks and tick labels shared by the charts (sweep, programme hydrographs and flows).

/// Tick values from `lo` to `hi`: steps of 1, 2, 2.5 or 5 × 10ᵏ, about `n` of them.
pub fn ticks(lo: f64, hi: f64, n: usize) -> Vec<f64> {
    let span = (hi - lo).abs().max(1e-12);
    let raw = span / n.max(1) as f64;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * mag);
    let first = (lo / step).ceil() * step;
    (0..=400)
        .map(|i| first + step * i as f64)
        .take_while(|v| *v <= hi + step * 1e-9)
        .collect()
}

/// A tick label: whole numbers from 100, one decimal from 10, else up to two without trailing zeros.
pub fn label(v: f64) -> String {
    let a = v.abs();
    if a >= 100.0 || a == 0.0 {
        format!("{v:.0}")
    } else if a >= 10.0 {
        format!("{v:.1}")
    } else {
        let s = format!("{v:.2}");
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    }
}
