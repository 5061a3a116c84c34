//! The one wording of the verdict ([`Verdict`]), shared by the terminal, `report.html` and
//! `map.svg`; lengths in the user's units.

use crate::findings::verdict::{Shortfalls, Verdict};
use crate::report::format::Fmt;

fn count(n: usize, one: &str, many: &str) -> String {
    if n == 1 {
        format!("1 {one}")
    } else {
        format!("{n} {many}")
    }
}

fn shortfalls(s: &Shortfalls) -> Vec<String> {
    let mut parts = Vec::new();
    if s.points_above_target > 0 {
        parts.push(count(
            s.points_above_target,
            "check point above target",
            "check points above target",
        ));
    }
    if s.wells_over_limits > 0 {
        parts.push(count(
            s.wells_over_limits,
            "well over its limits",
            "wells over their limits",
        ));
    }
    if s.neighbours_over_limits > 0 {
        parts.push(count(
            s.neighbours_over_limits,
            "neighbour over a limit",
            "neighbours over a limit",
        ));
    }
    parts
}

/// The verdict in words, one line: what is met, or what is short.
pub fn headline(v: &Verdict, f: &Fmt) -> String {
    match v {
        Verdict::Met => "every target met; every well and every neighbour within its limits".into(),
        Verdict::NotMet(s) => {
            let parts = shortfalls(s);
            if parts.is_empty() {
                "NOT MET: the chosen layout could not be evaluated".into()
            } else {
                format!("NOT MET: {}", parts.join("; "))
            }
        }
        Verdict::NoLayoutMeets {
            count: n,
            worst_point,
            shortfall_m,
            neighbours_over_limits,
        } => {
            // Short by no more than the tolerance: the bare targets are met, the allowances are
            // not (said so, rather than "0.00 m above target").
            let mut s = if *shortfall_m <= crate::check::evaluate::TARGET_TOLERANCE {
                format!(
                    "NOT MET: no layout tried meets every target within the well limits and the design allowances; the best ({n} wells) meets every target, but not with the allowances (operating margin, capacity fraction, one well out)"
                )
            } else {
                format!(
                    "NOT MET: no layout tried meets every target within the well limits; the best ({n} wells) leaves the water {} above target at {worst_point}",
                    f.length(*shortfall_m)
                )
            };
            if *neighbours_over_limits > 0 {
                s.push_str("; ");
                s.push_str(&count(
                    *neighbours_over_limits,
                    "neighbour over a limit",
                    "neighbours over a limit",
                ));
            }
            s
        }
        Verdict::Impossible { reason } => {
            format!("IMPOSSIBLE with this kind of layout: {reason}")
        }
        Verdict::NoValueMeets => "NOT MET: no value of the range meets every target".into(),
        Verdict::ProgrammeShort {
            stages_unreached,
            well_breaches,
        } => {
            let mut parts = Vec::new();
            if *stages_unreached > 0 {
                parts.push(count(
                    *stages_unreached,
                    "stage never reached",
                    "stages never reached",
                ));
            }
            if *well_breaches > 0 {
                parts.push(count(
                    *well_breaches,
                    "well scheduled below its lowest level",
                    "wells scheduled below their lowest level",
                ));
            }
            format!("NOT MET: {}", parts.join("; "))
        }
        Verdict::DayNotMet => "NOT MET on the day".into(),
        Verdict::NoFit => "NOT MET: no method fitted the data".into(),
        Verdict::Sampled {
            fraction_met,
            reliability,
        } => {
            let met = format!(
                "every target met in {:.1} % of the samples ({:.0} % asked)",
                fraction_met * 100.0,
                reliability * 100.0
            );
            if v.is_met() {
                met
            } else {
                format!("NOT MET at the reliability asked: {met}")
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::units::UnitSystem;

    fn best(shortfall_m: f64) -> Verdict {
        Verdict::NoLayoutMeets {
            count: 40,
            worst_point: "corner 2".into(),
            shortfall_m,
            neighbours_over_limits: 0,
        }
    }

    #[test]
    fn best_layout_short_of_the_allowances_only_says_so() {
        let f = Fmt::new(UnitSystem::Si, 10.0);
        let h = headline(&best(0.0), &f);
        assert!(
            h.contains("meets every target, but not with the allowances") && !h.contains("0.00"),
            "{h}"
        );
        // a real shortfall keeps its number: 1.00 m ÷ 0.3048 m/ft = 3.28 ft (NIST SP 811
        // (2008) App. B)
        let us = headline(&best(1.0), &Fmt::new(UnitSystem::Us, 10.0));
        assert!(
            us.contains("leaves the water 3.3 ft above target at corner 2"),
            "{us}"
        );
    }
}
