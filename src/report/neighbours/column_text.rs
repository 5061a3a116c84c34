//! The terminal lines on a neighbour's settlement in time, its distortion and damage category,
//! and its soil column with the pore-pressure change layer by layer (all in the user's units:
//! mm / m / kPa, or in / ft / psf).

use crate::input::units::UnitSystem;
use crate::report::neighbours::numbers::{mm, ratio_text, truncate};
use crate::report::words::wrap;
use crate::safety::neighbours::NeighbourResult;

/// 1 psf = 0.047 880 26 kPa (NIST SP 811 App. B).
const KPA_PER_PSF: f64 = 0.047_880_26;

/// A stress change in kPa (SI) or psf (US).
pub fn stress(kpa: f64, units: UnitSystem) -> String {
    match units {
        UnitSystem::Si => format!("{kpa:.1} kPa"),
        UnitSystem::Us => format!("{:.0} psf", kpa / KPA_PER_PSF),
    }
}

/// Final and end-of-works settlement, deflection ratio and category of damage, and the soil
/// column under the worst-settling point.
pub fn settlement_lines(r: &NeighbourResult, units: UnitSystem) -> String {
    let mut out = String::new();
    let Some(final_m) = r.max_final_settlement_m else {
        return out;
    };
    let time = match (&r.works_duration, r.max_end_of_works_settlement_m) {
        (Some((t, basis)), Some(end)) => format!(
            "; at the end of the works ({:.0} days, {basis}) {}{}",
            t / 86_400.0,
            mm(end, units),
            if r.end_of_works_upper_bound {
                " (upper bound: a layer has no c_v)"
            } else {
                ""
            }
        ),
        _ => " (upper bound: no duration for consolidation in time)".into(),
    };
    out.push_str(&wrap(
        &format!(
            "settlement: final (fully consolidated) {}{time}",
            mm(final_m, units)
        ),
        96,
        "    ",
    ));
    if let Some(dr) = r.max_deflection_ratio {
        let damage = match &r.damage {
            Some((cat, side, strain)) => format!(
                "; category of damage {} \"{}\" (tensile strain {:.3} % along {side}; Burland & Wroth 1974 beam, Boscardin & Cording 1989 table as in Burland 1995 — from memory; information, not a check)",
                cat.number,
                cat.name,
                strain * 100.0
            ),
            None => String::new(),
        };
        out.push_str(&wrap(
            &format!("deflection ratio Δ/L up to {}{damage}", ratio_text(dr)),
            96,
            "    ",
        ));
    }
    let l = |x: f64| units.length(x);
    let lu = units.length_unit();
    out.push_str("    soil column under the worst point (head drop top → base, Δu top / mid / base, Δσ′ mid, final settlement, U at end):\n");
    for c in &r.column {
        out.push_str(&format!(
            "      {:<34} {:>7.2} → {:>7.2} {lu}  Δh {:.2} → {:.2} {lu}  Δu {} / {} / {}  Δσ′ {}  ρ {}{}\n",
            truncate(&c.name, 34),
            l(c.top_m),
            l(c.base_m),
            l(c.head_drop.top),
            l(c.head_drop.base),
            stress(c.du_kpa[0], units),
            stress(c.du_kpa[1], units),
            stress(c.du_kpa[2], units),
            stress(c.dsigma_mid_kpa, units),
            if c.incompressible {
                "—".to_string()
            } else {
                mm(c.final_m, units)
            },
            c.degree_at_end
                .map_or(String::new(), |u| format!("  U {:.0} %", u * 100.0)),
        ));
    }
    out
}
