//! The flow of an equivalent well next to straight boundaries, by its first-order images.
//!
//! A well of radius r_e in a field with radius of influence R draws ΔΦ = Q/(2π)·ln(R/r_e) alone.
//! Each straight boundary at distance a from the well adds an image at d = 2a (Ferris et al.
//! 1962, USGS WSP 1536-E): a constant-head line an image of opposite sign, a barrier one of the
//! same sign, each adding σ·Q/(2π)·ln(R/d) (nothing when d ≥ R). For the same ΔΦ the flow is
//! therefore Q_b = Q·ln(R/r_e) / (ln(R/r_e) + Σ σᵢ·ln(R/dᵢ)). In a leaky aquifer ln(R/r) becomes
//! K₀(r/B) and the well term K₀(x)/(x·K₁(x)), x = r_e/B (Hantush–Jacob, finite radius).
//! With several boundaries the images of images are left out: a first-order figure only.

use super::special::{bessel_k0, bessel_k1};

/// Ratio Q_with / Q_without of an equivalent well of radius `r_e` (m) with first-order images at
/// distances `images` (m, each with σ = +1 for a barrier, −1 for a constant head), radius of
/// influence `big_r` (m) or leakage factor `leakage` (m). Returns 1 when no image is within
/// reach; never NaN (a denominator that is not positive gives 1, the images being meaningless).
pub fn boundary_flow_factor(
    r_e: f64,
    big_r: f64,
    leakage: Option<f64>,
    images: &[(f64, f64)],
) -> f64 {
    let (own, term): (f64, Box<dyn Fn(f64) -> f64>) = match leakage {
        Some(b) => {
            let x = (r_e / b).max(1e-12);
            (
                bessel_k0(x) / (x * bessel_k1(x)),
                Box::new(move |d: f64| bessel_k0(d / b)),
            )
        }
        None => (
            (big_r / r_e).ln(),
            Box::new(move |d: f64| (big_r / d).ln().max(0.0)),
        ),
    };
    let extra: f64 = images
        .iter()
        .filter(|(d, _)| d.is_finite() && *d > 0.0)
        .map(|(d, sigma)| sigma * term(*d))
        .sum();
    let den = own + extra;
    if own.is_finite() && own > 0.0 && den.is_finite() && den > 0.0 {
        own / den
    } else {
        1.0
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // A well of radius 1 m, R = 1000 m, a constant-head line 50 m away (image at 100 m): the
    // flow is ln(R/r)/ln(d/r) = ln 1000/ln 100 = 1.5 times the flow alone (Ferris et al. 1962
    // method of images; the closed form is ln(2a/r_w) of Todd & Mays, *Groundwater Hydrology*,
    // 3rd ed. 2005, §4.10, from memory).
    #[test]
    fn constant_head_image_raises_the_flow_by_the_log_ratio() {
        let f = boundary_flow_factor(1.0, 1000.0, None, &[(100.0, -1.0)]);
        assert!((f - 1000f64.ln() / 100f64.ln()).abs() < 1e-12, "{f}");
        let b = boundary_flow_factor(1.0, 1000.0, None, &[(100.0, 1.0)]);
        assert!((b - 1000f64.ln() / (1000f64.ln() + 10f64.ln())).abs() < 1e-12);
        assert_eq!(boundary_flow_factor(1.0, 50.0, None, &[(100.0, -1.0)]), 1.0);
    }
}
