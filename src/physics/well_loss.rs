//! Well losses: the extra drawdown inside a pumped well over the drawdown in the aquifer just
//! outside its screen (entrance losses, turbulence in the pack and screen).
//!
//! Jacob (1947): the drawdown in the well is s_w = B·Q + C·Q², B·Q the (laminar) aquifer part
//! and C·Q² the well loss. Units: Q in m³/s, C in s²/m⁵, losses in m.

/// Jacob's well loss C·Q², m.
///
/// Units: C s²/m⁵, Q m³/s (either sign: the loss grows with the rate's magnitude) → m. Source:
/// Jacob (1947), "Drawdown test to determine effective radius of artesian well", *Trans. ASCE*
/// 112; Kruseman & de Ridder (1994), *Analysis and Evaluation of Pumping Test Data*, 2nd ed.,
/// ch. 14. C ≤ 0 or non-finite inputs give 0.
pub fn jacob_loss(c: f64, q: f64) -> f64 {
    if !(c.is_finite() && c > 0.0 && q.is_finite()) {
        return 0.0;
    }
    c * q * q
}

/// The well loss that makes `aquifer_drawdown / (aquifer_drawdown + loss)` equal the well
/// efficiency E: loss = s·(1/E − 1), m.
///
/// `aquifer_drawdown` is the well's OWN laminar drawdown at its screen face, Jacob's B·Q: the
/// drawdown its own rate makes there (what a step test of the well alone measures), not the
/// total drawdown with its neighbours' share (see [`efficiency_loss_of_rate`]).
///
/// Units: s m, E dimensionless in (0, 1] → m. Source: definition of well efficiency, Kruseman &
/// de Ridder (1994), 2nd ed., ch. 14 (common practice). E = 1 gives 0; E outside (0, 1], s < 0 or
/// non-finite inputs give 0 (the caller validates: E must be in (0, 1]).
pub fn efficiency_loss(aquifer_drawdown: f64, efficiency: f64) -> f64 {
    if !(aquifer_drawdown.is_finite()
        && aquifer_drawdown >= 0.0
        && efficiency.is_finite()
        && efficiency > 0.0
        && efficiency <= 1.0)
    {
        return 0.0;
    }
    aquifer_drawdown * (1.0 / efficiency - 1.0)
}

/// The well loss of a well of efficiency E pumping (q > 0) or recharging (q < 0) at rate q,
/// m (always ≥ 0): (1/E − 1) × the well's own drawdown (or rise) at its screen face,
/// |h₀ − h(Φ₀ + q·u)|, with u the ΔΦ per unit rate the well makes at its own face (its Thiem
/// term, its partial penetration Δ_w and its images; negative).
///
/// Jacob (1947): s_w = B·Q + C·Q², and E = B·Q / s_w. For a constant E the loss
/// C·Q² = (1/E − 1)·B·Q depends on the well's own rate only — a neighbour starting up does not
/// change the flow through this well's screen and pack (Kruseman & de Ridder 1994, 2nd ed.,
/// ch. 14; Houben 2015, *Hydrogeology Journal* 23, "Review: Hydraulics of water wells"). In a
/// recharge well the loss raises the level in the well by the same rule. In a confined layer
/// B·Q = −q·u/T exactly; in an unconfined one the own drawdown is taken through Φ = ½K·h² about
/// the initial level h₀ (its drawdown alone, no neighbours).
pub fn efficiency_loss_of_rate(
    aquifer: &crate::physics::potential::Aquifer,
    efficiency: f64,
    own_unit: f64,
    q: f64,
) -> f64 {
    if !(q.is_finite() && own_unit.is_finite()) || q == 0.0 {
        return 0.0;
    }
    let h0 = aquifer.initial_level;
    let own = aquifer
        .level(aquifer.initial_potential() + q * own_unit)
        .or_base(aquifer.base_level);
    efficiency_loss((h0 - own).abs(), efficiency)
}

/// Walton's (1962) grading of a well by its loss coefficient C.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum WaltonGrade {
    /// C < 1 900 s²/m⁵: properly designed and developed.
    Good,
    /// 1 900 ≤ C < 3 800 s²/m⁵: mild deterioration or clogging.
    MildDeterioration,
    /// C ≥ 3 800 s²/m⁵: severe deterioration or clogging (≥ 15 200 s²/m⁵ the well is hard to
    /// restore; not separated here).
    SevereDeterioration,
}

impl WaltonGrade {
    /// A short label for reports.
    pub fn label(self) -> &'static str {
        match self {
            WaltonGrade::Good => "well designed and developed",
            WaltonGrade::MildDeterioration => "mild deterioration",
            WaltonGrade::SevereDeterioration => "severe deterioration",
        }
    }
}

/// Lower bound of [`WaltonGrade::MildDeterioration`], s²/m⁵ (Walton 1962, from memory).
pub const WALTON_MILD: f64 = 1900.0;
/// Lower bound of [`WaltonGrade::SevereDeterioration`], s²/m⁵ (Walton 1962, from memory).
pub const WALTON_SEVERE: f64 = 3800.0;

/// Walton's grade of the well-loss coefficient C (s²/m⁵): < 1 900 good, 1 900–3 800 mild
/// deterioration, ≥ 3 800 severe.
///
/// Source: Walton (1962), *Selected analytical methods for well and aquifer evaluation*, Illinois
/// State Water Survey Bulletin 49 (thresholds from memory, checks.md §13). `None` for a C that is
/// negative or not finite.
pub fn walton_grade(c: f64) -> Option<WaltonGrade> {
    if !(c.is_finite() && c >= 0.0) {
        return None;
    }
    Some(if c < WALTON_MILD {
        WaltonGrade::Good
    } else if c < WALTON_SEVERE {
        WaltonGrade::MildDeterioration
    } else {
        WaltonGrade::SevereDeterioration
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn jacob_loss_value() {
        // checks.md §13: Jacob (1947) s = C·Q², Q = 0.02 m³/s, C = 1 900 s²/m⁵ → 0.76 m
        assert_relative_eq!(jacob_loss(1900.0, 0.02), 0.76, max_relative = 1e-12);
        assert_relative_eq!(jacob_loss(1900.0, -0.02), 0.76, max_relative = 1e-12);
        assert_eq!(jacob_loss(0.0, 0.02), 0.0);
        assert_eq!(jacob_loss(f64::NAN, 0.02), 0.0);
        assert_eq!(jacob_loss(1900.0, f64::INFINITY), 0.0);
    }

    #[test]
    fn efficiency_loss_gives_the_efficiency() {
        // Well efficiency = aquifer drawdown / drawdown in the well (Kruseman & de Ridder 1994,
        // 2nd ed., ch. 14; common practice (no source)): 2 m in the aquifer at E = 0.8 needs
        // 0.5 m of loss, 2 / 2.5 = 0.8.
        assert_relative_eq!(efficiency_loss(2.0, 0.8), 0.5, max_relative = 1e-12);
        for (s, e) in [(1.0, 0.5), (3.7, 0.65), (0.2, 0.99)] {
            let loss = efficiency_loss(s, e);
            assert_relative_eq!(s / (s + loss), e, max_relative = 1e-12);
        }
        assert_eq!(efficiency_loss(2.0, 1.0), 0.0);
        assert_eq!(efficiency_loss(2.0, 0.0), 0.0);
        assert_eq!(efficiency_loss(2.0, 1.5), 0.0);
        assert_eq!(efficiency_loss(f64::NAN, 0.7), 0.0);
    }

    #[test]
    fn walton_thresholds() {
        // Walton (1962), thresholds 1 900 and 3 800 s²/m⁵ (from memory, checks.md §13)
        assert_eq!(walton_grade(500.0), Some(WaltonGrade::Good));
        assert_eq!(walton_grade(1899.9), Some(WaltonGrade::Good));
        assert_eq!(walton_grade(1900.0), Some(WaltonGrade::MildDeterioration));
        assert_eq!(walton_grade(3799.0), Some(WaltonGrade::MildDeterioration));
        assert_eq!(walton_grade(3800.0), Some(WaltonGrade::SevereDeterioration));
        assert_eq!(walton_grade(-1.0), None);
        assert_eq!(walton_grade(f64::NAN), None);
        assert_eq!(WaltonGrade::MildDeterioration.label(), "mild deterioration");
    }
}
