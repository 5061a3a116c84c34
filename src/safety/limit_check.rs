//! One quantity under a neighbouring building checked against its limit: what is checked
//! ([`LimitQuantity`]), where the limit comes from ([`LimitBasis`]: the design file or a labelled
//! rule of thumb), the worst value, the utilisation (value ÷ limit) and pass or fail. Both enums
//! are written in `summary.json` by their words ("angular distortion", "design file").

use serde::Serialize;

/// What a limit check measures under a building (in `summary.json` by its words).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum LimitQuantity {
    /// The rise of the water above its original level (beside recharge wells), m.
    #[serde(rename = "rise above original level")]
    Rise,
    /// The largest drawdown, m.
    #[serde(rename = "drawdown")]
    Drawdown,
    /// The largest settlement checked, m.
    #[serde(rename = "settlement")]
    Settlement,
    /// The largest angular distortion β along a side (a ratio).
    #[serde(rename = "angular distortion")]
    AngularDistortion,
}

impl LimitQuantity {
    /// The quantity in words, as `summary.json` writes it.
    pub fn words(self) -> &'static str {
        match self {
            LimitQuantity::Rise => "rise above original level",
            LimitQuantity::Drawdown => "drawdown",
            LimitQuantity::Settlement => "settlement",
            LimitQuantity::AngularDistortion => "angular distortion",
        }
    }
}

/// Where a limit comes from: the design file, or a labelled rule of thumb (in `summary.json`
/// as "design file" or the label).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LimitBasis {
    /// Given for the building in the design file.
    DesignFile,
    /// A rule of thumb, with its label and source.
    RuleOfThumb(&'static str),
}

impl LimitBasis {
    /// "design file", or the rule of thumb's label.
    pub fn words(self) -> &'static str {
        match self {
            LimitBasis::DesignFile => "design file",
            LimitBasis::RuleOfThumb(label) => label,
        }
    }

    /// A rule of thumb stands in for a limit the design file does not give.
    pub fn is_rule_of_thumb(self) -> bool {
        matches!(self, LimitBasis::RuleOfThumb(_))
    }
}

impl Serialize for LimitBasis {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.words())
    }
}

/// One quantity against its limit.
#[derive(Debug, Clone, Serialize)]
pub struct LimitCheck {
    /// What is checked.
    pub quantity: LimitQuantity,
    /// The worst value under the building (m, or a ratio for distortion).
    pub value: f64,
    /// The limit.
    pub limit: f64,
    /// Where the limit comes from.
    pub basis: LimitBasis,
    /// value ÷ limit.
    pub utilisation: f64,
    /// Within the limit.
    pub pass: bool,
}

impl LimitCheck {
    /// `quantity` at `value` against `limit` from `basis`: utilisation value ÷ limit (0 for a nil
    /// limit), within it up to a relative 1e-9.
    pub fn new(quantity: LimitQuantity, value: f64, limit: f64, basis: LimitBasis) -> LimitCheck {
        let utilisation = if limit > 0.0 { value / limit } else { 0.0 };
        LimitCheck {
            quantity,
            value,
            limit,
            basis,
            utilisation,
            pass: value <= limit * (1.0 + 1e-9),
        }
    }
}

/// Where the drawdown limit held by recharge sizing comes from: the neighbour's allowable
/// drawdown, or the uniform drawdown that settles it by its settlement limit. Worded in the
/// run's units by [`RechargeLimitBasis::words`]; `summary.json` carries the SI words.
#[derive(Debug, Clone, PartialEq)]
pub enum RechargeLimitBasis {
    /// `allowable_drawdown` in the design file.
    AllowableDrawdown,
    /// The drawdown that settles the building by its settlement limit.
    Settlement {
        /// The settlement limit, m.
        limit_m: f64,
        /// Where that limit comes from.
        basis: LimitBasis,
    },
}

impl RechargeLimitBasis {
    /// In words, the settlement in mm or inches.
    pub fn words(&self, units: crate::input::units::UnitSystem) -> String {
        match self {
            RechargeLimitBasis::AllowableDrawdown => "allowable drawdown (design file)".into(),
            RechargeLimitBasis::Settlement { limit_m, basis } => format!(
                "drawdown that settles it by {} ({})",
                units.small_length_words(*limit_m),
                basis.words()
            ),
        }
    }
}

impl Serialize for RechargeLimitBasis {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(&self.words(crate::input::units::UnitSystem::Si))
    }
}

#[cfg(test)]
mod recharge_basis_tests {
    use super::*;
    use crate::input::units::UnitSystem;

    /// A 10 mm settlement limit reads 0.39 in (1 in = 25.4 mm exactly, NIST SP 811 (2008)
    /// App. B); the SI words are those `summary.json` has always carried.
    #[test]
    fn settlement_basis_in_inches() {
        let b = RechargeLimitBasis::Settlement {
            limit_m: 0.010,
            basis: LimitBasis::DesignFile,
        };
        assert_eq!(
            b.words(UnitSystem::Us),
            "drawdown that settles it by 0.39 in (design file)"
        );
        assert_eq!(
            serde_json::to_string(&b).unwrap(),
            "\"drawdown that settles it by 10.0 mm (design file)\""
        );
    }
}
