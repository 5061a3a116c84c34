//! A natural logarithm by arithmetic only, for the kernel's inner loops.

/// Natural logarithm of a positive, finite, normal `x` by arithmetic only (so loops over it
/// vectorise): x = m·2^e with m in [√½, √2), ln m = 2·atanh(t), t = (m − 1)/(m + 1), |t| < 0.172,
/// by its series to t²¹ (truncation below 1e-17 relative).
#[inline]
pub fn ln_fast(x: f64) -> f64 {
    let bits = x.to_bits();
    let mut e = ((bits >> 52) & 0x7ff) as i64 - 1023;
    let mut m = f64::from_bits((bits & 0x000f_ffff_ffff_ffff) | 0x3ff0_0000_0000_0000);
    if m > std::f64::consts::SQRT_2 {
        m *= 0.5;
        e += 1;
    }
    let t = (m - 1.0) / (m + 1.0);
    let t2 = t * t;
    let p = 1.0 / 21.0;
    let p = p * t2 + 1.0 / 19.0;
    let p = p * t2 + 1.0 / 17.0;
    let p = p * t2 + 1.0 / 15.0;
    let p = p * t2 + 1.0 / 13.0;
    let p = p * t2 + 1.0 / 11.0;
    let p = p * t2 + 1.0 / 9.0;
    let p = p * t2 + 1.0 / 7.0;
    let p = p * t2 + 1.0 / 5.0;
    let p = p * t2 + 1.0 / 3.0;
    let p = p * t2 + 1.0;
    e as f64 * std::f64::consts::LN_2 + 2.0 * t * p
}
