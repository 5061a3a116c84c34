//! Damage to a building from the settlement profile under it: the deflection ratio Δ/L turned
//! into the largest tensile strain of a deep elastic beam (Burland & Wroth 1974, "Settlement of
//! buildings and associated damage"), and the category of damage of that strain (Boscardin &
//! Cording 1989, as tabulated by Burland 1995 — category table from memory).
//!
//! For a beam of length L, height H, E/G = 2.6 (isotropic, ν = 0.3):
//! - bending: Δ/L = (L/(12·t) + 3·I·E/(2·t·L·H·G))·ε_b;
//! - diagonal (shear): Δ/L = (1 + H·L²·G/(18·I·E))·ε_d;
//!
//! with the neutral axis at mid-height in sagging (I = H³/12, t = H/2) and at the underside in
//! hogging (I = H³/3, t = H). The strain that governs is the larger of ε_b and ε_d. Horizontal
//! strain from ground movement is not included (it is not computed for dewatering).

/// E/G of the beam (isotropic, ν = 0.3).
pub const E_OVER_G: f64 = 2.6;

/// Sagging (settles more in the middle) or hogging (less in the middle).
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Mode {
    /// Concave up.
    Sagging,
    /// Convex up.
    Hogging,
}

/// Largest tensile strain (fraction, not %) of a beam of `length` and `height` m bent to a
/// deflection ratio `deflection_ratio` = Δ/L (Burland & Wroth 1974).
pub fn tensile_strain(deflection_ratio: f64, length: f64, height: f64, mode: Mode) -> f64 {
    if !(length > 0.0 && height > 0.0) {
        return 0.0;
    }
    let (i, t) = match mode {
        Mode::Sagging => (height.powi(3) / 12.0, height / 2.0),
        Mode::Hogging => (height.powi(3) / 3.0, height),
    };
    let bending = length / (12.0 * t) + 3.0 * i * E_OVER_G / (2.0 * t * length * height);
    let diagonal = 1.0 + height * length * length / (18.0 * i * E_OVER_G);
    deflection_ratio.abs() / bending.min(diagonal)
}

/// One category of damage.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub struct Category {
    /// 0 … 5 ("4–5" is shown as 4).
    pub number: u8,
    /// "negligible", "very slight", …
    pub name: &'static str,
    /// Limiting tensile strain range, %, as printed in the table.
    pub strain_range: &'static str,
}

/// The category of damage for a limiting tensile strain `strain` (fraction): Boscardin & Cording
/// (1989), as tabulated by Burland (1995) (from memory): 0 negligible 0–0.05 %, 1 very slight
/// 0.05–0.075 %, 2 slight 0.075–0.15 %, 3 moderate 0.15–0.3 %, 4 to 5 severe to very severe
/// over 0.3 %.
pub fn category(strain: f64) -> Category {
    let pct = strain * 100.0;
    let (number, name, strain_range) = if pct < 0.05 {
        (0, "negligible", "0–0.05 %")
    } else if pct < 0.075 {
        (1, "very slight", "0.05–0.075 %")
    } else if pct < 0.15 {
        (2, "slight", "0.075–0.15 %")
    } else if pct < 0.3 {
        (3, "moderate", "0.15–0.3 %")
    } else {
        (4, "severe to very severe", "over 0.3 %")
    };
    Category {
        number,
        name,
        strain_range,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Hand values from the Burland & Wroth (1974) beam formulas (from memory), L/H = 1, sagging:
    // bending factor L/6H + 0.65·H/L = 0.8167; diagonal 1 + (L/H)²·12/(18·2.6) = 1.2564; the
    // smaller governs, so ε = (Δ/L)/0.8167. Δ/L = 5e-4 → ε = 6.122e-4 = 0.061 % → category 1.
    #[test]
    fn square_beam_sagging_by_hand() {
        let e = tensile_strain(5e-4, 10.0, 10.0, Mode::Sagging);
        assert!((e - 5e-4 / (1.0 / 6.0 + 0.65)).abs() < 1e-12, "{e}");
        assert_eq!(category(e).number, 1);
        assert_eq!(category(4e-4).name, "negligible");
        assert_eq!(category(4e-3).number, 4);
    }

    // Hogging, L/H = 4: bending 4/12 + 3·(1/3)·2.6/(2·4) = 0.3333 + 0.325 = 0.6583; diagonal
    // 1 + 16/(18·(1/3)·2.6) = 2.0256 → bending governs (hand calculation, from memory of the
    // formulas).
    #[test]
    fn long_beam_hogging_by_hand() {
        let e = tensile_strain(1e-3, 40.0, 10.0, Mode::Hogging);
        assert!((e - 1e-3 / (4.0 / 12.0 + 0.325)).abs() < 1e-12, "{e}");
    }
}
