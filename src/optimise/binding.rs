//! What binds a rate programme: a target, a well's level floor, a well's capacity, a
//! neighbour's limit. Carried as data with SI numbers and worded once where it is shown, in the
//! run's units ([`Binding::words`]).

use crate::input::units::UnitSystem;
use crate::optimise::limits::FloorKind;

/// What the level floor of a well allows for besides the floor itself.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LevelLoss {
    /// Nothing: the level at the well's radius is held at the floor.
    None,
    /// The well loss C·Q² (Jacob) is added to the drawdown in the well.
    Jacob,
    /// The well efficiency raises the drawdown in the well.
    Efficiency,
}

/// One limit or target that binds at the optimum of a rate programme (or caps a uniform rate).
#[derive(Debug, Clone, PartialEq)]
pub enum Binding {
    /// The target level at a check point.
    Target {
        /// The check point's name.
        point: String,
    },
    /// The target at a check point with one well out of service.
    TargetWithWellOut {
        /// The check point's name.
        point: String,
        /// The well out.
        well: String,
    },
    /// The target at the check point that sets the uniform rate.
    TargetSetsRate {
        /// The check point's name.
        point: String,
    },
    /// The target at a check point of the recharge programme.
    RechargeTarget {
        /// The check point's name.
        point: String,
    },
    /// The level in a pumping well held at its floor.
    WellLevel {
        /// The well.
        well: String,
        /// The floor, m.
        level_m: f64,
        /// What sets the floor (pump intake, suction limit, screen base, aquifer base).
        floor: FloorKind,
        /// What the level in the well allows for besides the floor.
        loss: LevelLoss,
    },
    /// The level in an abstraction well at or above its lowest level (recharge programme).
    WellLowestLevel {
        /// The well.
        well: String,
        /// The lowest level, m.
        level_m: f64,
    },
    /// The level in a recharge well at or below its highest level.
    RechargeWellLevel {
        /// The well.
        well: String,
        /// The highest level, m.
        level_m: f64,
        /// Where that level comes from.
        basis: crate::input::model::InjectionBasis,
    },
    /// Sichardt's capacity of a well on its wetted screen.
    SichardtCapacity {
        /// The well.
        well: String,
    },
    /// The capacity of a well's pump.
    PumpCapacity {
        /// The well.
        well: String,
    },
    /// The smallest pump capacity of the layout caps the uniform rate.
    PumpRate {
        /// The pump capacity, m³/s.
        rate_m3_per_s: f64,
    },
    /// The largest uniform rate within the limits, and what sets it.
    UniformLimit {
        /// The rate, m³/s.
        rate_m3_per_s: f64,
        /// What sets it.
        set_by: Box<Binding>,
    },
    /// A protected neighbour's drawdown limit at one of its sample points.
    NeighbourDrawdown {
        /// The neighbour.
        neighbour: String,
        /// The sample point ("corner 1").
        sample: String,
        /// The limit, m.
        limit_m: f64,
    },
    /// A protected neighbour's rise limit at one of its sample points.
    NeighbourRise {
        /// The neighbour.
        neighbour: String,
        /// The sample point.
        sample: String,
        /// The limit, m.
        rise_m: f64,
    },
    /// No well limits the uniform rate.
    NoLimit,
    /// No pumping wells.
    NoWells,
}

impl Binding {
    /// The binding in words, quantities in `units`.
    pub fn words(&self, units: UnitSystem) -> String {
        let len = |m: f64| units.length_words(m, 2);
        match self {
            Binding::Target { .. }
            | Binding::TargetWithWellOut { .. }
            | Binding::TargetSetsRate { .. }
            | Binding::RechargeTarget { .. } => {
                format!("target at {}", self.target_words().unwrap_or_default())
            }
            Binding::WellLevel {
                well,
                level_m,
                floor,
                loss,
            } => format!(
                "level in {well} at {} ({}{})",
                len(*level_m),
                floor.describe(),
                match loss {
                    LevelLoss::None => "",
                    LevelLoss::Jacob => ", with the well loss C·Q²",
                    LevelLoss::Efficiency => ", with the well efficiency",
                }
            ),
            Binding::WellLowestLevel { well, level_m } => format!(
                "level in {well} ≥ {} (pump intake + submergence; screen wet enough for its capacity)",
                len(*level_m)
            ),
            Binding::RechargeWellLevel {
                well,
                level_m,
                basis,
            } => format!(
                "level in recharge well {well} ≤ {} ({})",
                len(*level_m),
                basis.words(units)
            ),
            Binding::SichardtCapacity { well } => {
                format!("Sichardt capacity of {well} on its wetted screen")
            }
            Binding::PumpCapacity { well } => format!("pump capacity of {well}"),
            Binding::PumpRate { rate_m3_per_s } => {
                format!("pump capacity {}", units.rate_words(*rate_m3_per_s))
            }
            Binding::UniformLimit {
                rate_m3_per_s,
                set_by,
            } => format!(
                "largest uniform rate within the limits {} ({})",
                units.rate_words(*rate_m3_per_s),
                set_by.words(units)
            ),
            Binding::NeighbourDrawdown {
                neighbour,
                sample,
                limit_m,
            } => format!(
                "drawdown limit {} at \"{neighbour}\" {sample}",
                len(*limit_m)
            ),
            Binding::NeighbourRise {
                neighbour,
                sample,
                rise_m,
            } => format!("rise limit {} at \"{neighbour}\" {sample}", len(*rise_m)),
            Binding::NoLimit => "no limit".into(),
            Binding::NoWells => "no wells".into(),
        }
    }

    /// For a target, the point in words ("P3", "P3 with W02 out", "P3 (sets the rate)");
    /// `None` for a well or neighbour limit.
    pub fn target_words(&self) -> Option<String> {
        match self {
            Binding::Target { point } => Some(point.clone()),
            Binding::TargetWithWellOut { point, well } => Some(format!("{point} with {well} out")),
            Binding::TargetSetsRate { point } => Some(format!("{point} (sets the rate)")),
            Binding::RechargeTarget { point } => Some(format!("\"{point}\"")),
            _ => None,
        }
    }
}

/// In SI words (the programme's row labels, error messages).
impl std::fmt::Display for Binding {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.words(UnitSystem::Si))
    }
}

/// As its SI words.
impl serde::Serialize for Binding {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(self)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn uniform_limit_in_gpm_and_feet() {
        // 6.40 L/s = 0.0064 m³/s × 60 s/min ÷ 0.003785411784 m³/US gal = 101.44 gpm;
        // 3.50 m ÷ 0.3048 m/ft = 11.48 ft (NIST SP 811 (2008) App. B: 1 US gal =
        // 3.785411784 L, 1 ft = 0.3048 m exactly).
        let b = Binding::UniformLimit {
            rate_m3_per_s: 0.0064,
            set_by: Box::new(Binding::WellLevel {
                well: "W01".into(),
                level_m: 3.5,
                floor: FloorKind::Suction,
                loss: LevelLoss::None,
            }),
        };
        assert_eq!(
            b.words(UnitSystem::Us),
            "largest uniform rate within the limits 101.4 gpm (level in W01 at 11.48 ft (header − suction limit))"
        );
        assert_eq!(
            b.to_string(),
            "largest uniform rate within the limits 6.40 L/s (level in W01 at 3.50 m (header − suction limit))"
        );
        // 8 L/s × 60 ÷ 3.785411784 = 126.80 gpm
        assert_eq!(
            Binding::PumpRate {
                rate_m3_per_s: 0.008
            }
            .words(UnitSystem::Us),
            "pump capacity 126.8 gpm"
        );
    }

    #[test]
    fn neighbour_limit_in_feet() {
        // 0.25 m ÷ 0.3048 = 0.82 ft (NIST SP 811 (2008) App. B)
        let b = Binding::NeighbourDrawdown {
            neighbour: "Old mill".into(),
            sample: "corner 2".into(),
            limit_m: 0.25,
        };
        assert_eq!(
            b.words(UnitSystem::Us),
            "drawdown limit 0.82 ft at \"Old mill\" corner 2"
        );
        assert_eq!(
            b.to_string(),
            "drawdown limit 0.25 m at \"Old mill\" corner 2"
        );
    }
}
