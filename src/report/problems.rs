//! Well problems ([`WellProblem`]) in words, each number in the chosen units: "level 6.28 m is
//! below what suction can lift (…)" or, in US units, the same in feet and gpm.

use crate::check::evaluate::WellProblem;
use crate::report::format::Fmt;

/// One problem in words.
pub fn well_problem(p: &WellProblem, f: &Fmt) -> String {
    let with_loss = |loss: f64| {
        if loss > 0.0 {
            format!(" (with a well loss of {})", f.length(loss))
        } else {
            String::new()
        }
    };
    match p {
        WellProblem::PumpedDry => "pumped dry: the rate is more than the aquifer can give here".into(),
        WellProblem::BelowPumpIntake {
            level,
            well_loss,
            lowest,
        } => format!(
            "level {}{} is below the pump intake + submergence ({})",
            f.length(*level),
            with_loss(*well_loss),
            f.length(*lowest)
        ),
        WellProblem::BelowSuctionLimit {
            level,
            well_loss,
            limit,
            header,
            suction_limit,
        } => format!(
            "level {}{} is below what suction can lift ({} = header {} − suction limit {}), by {}: one stage cannot do it — a second stage or deep wells",
            f.length(*level),
            with_loss(*well_loss),
            f.length(*limit),
            f.length(*header),
            f.length(*suction_limit),
            f.length(limit - level)
        ),
        WellProblem::AboveHighestRechargeLevel {
            level,
            highest,
            basis,
        } => format!(
            "recharge level {} is above the highest allowed {} ({}), by {}",
            f.length(*level),
            f.length(*highest),
            basis.words(f.units),
            f.length(level - highest)
        ),
        WellProblem::OverInjectionCapacity {
            rate,
            capacity,
            fraction,
            abstraction_capacity,
            default_fraction,
        } => format!(
            "injection {} exceeds its injection capacity {} ({:.0} % of the abstraction capacity {}{})",
            f.rate(*rate),
            f.rate(*capacity),
            fraction * 100.0,
            f.rate(*abstraction_capacity),
            if *default_fraction {
                "; default fraction, common practice (no source)"
            } else {
                ""
            }
        ),
        WellProblem::OverCapacity {
            rate,
            capacity,
            by_pump,
        } => format!(
            "rate {} exceeds its capacity {} ({})",
            f.rate(*rate),
            f.rate(*capacity),
            if *by_pump {
                "pump"
            } else {
                "Sichardt entrance gradient on the wetted screen"
            }
        ),
    }
}

/// Every problem of a well, joined by "; " ("" when none).
pub fn well_problems(problems: &[WellProblem], f: &Fmt) -> String {
    problems
        .iter()
        .map(|p| well_problem(p, f))
        .collect::<Vec<_>>()
        .join("; ")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::units::UnitSystem;

    #[test]
    fn a_suction_problem_reads_in_feet_in_us_units() {
        // 1 ft = 0.3048 m (NIST SP 811, App. B): 6.35 m = 20.8 ft, 7.00 m = 23.0 ft.
        let p = WellProblem::BelowSuctionLimit {
            level: 6.35,
            well_loss: 0.0,
            limit: 7.0,
            header: 13.0,
            suction_limit: 6.0,
        };
        let us = well_problem(&p, &Fmt::new(UnitSystem::Us, 15.0));
        assert!(
            us.starts_with("level 20.8 ft is below what suction can lift (23.0 ft"),
            "{us}"
        );
        assert!(!us.contains(" m "), "{us}");
        let si = well_problem(&p, &Fmt::new(UnitSystem::Si, 15.0));
        assert!(si.starts_with("level 6.35 m is below what suction can lift (7.00 m = header 13.00 m − suction limit 6.00 m), by 0.65 m"), "{si}");
    }

    #[test]
    fn a_rate_over_capacity_reads_in_gpm_in_us_units() {
        // 1 L/s = 15.850 US gpm (NIST SP 811, App. B: 1 gal = 3.785 411 784 L).
        let p = WellProblem::OverCapacity {
            rate: 0.010,
            capacity: 0.008,
            by_pump: true,
        };
        let us = well_problem(&p, &Fmt::new(UnitSystem::Us, 0.0));
        assert_eq!(us, "rate 158.5 gpm exceeds its capacity 126.8 gpm (pump)");
        let si = well_problem(&p, &Fmt::new(UnitSystem::Si, 0.0));
        assert_eq!(si, "rate 10.00 L/s exceeds its capacity 8.00 L/s (pump)");
    }
}
