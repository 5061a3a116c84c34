//! Pumps and pipes: Hazen–Williams friction loss in a discharge main, hydraulic power of a pump,
//! energy per day, and picking a standard pump duty.
//!
//! Units: Q in m³/s, lengths and heads in m, power in W, energy in J (and kWh where named),
//! density in kg/m³, g in m/s². Bad input (non-finite, zero or negative where a positive value is
//! needed) is a [`PipeInputError`] naming the field and what would be valid.

use std::fmt;

/// A pump or pipe input that cannot be used: which one, and what would be valid.
#[derive(Debug, Clone, PartialEq)]
pub struct PipeInputError {
    /// The input's name (`flow`, `diameter`, `efficiency`, …).
    pub field: &'static str,
    /// What is wrong and what would be valid.
    pub message: String,
}

impl fmt::Display for PipeInputError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}: {}", self.field, self.message)
    }
}

impl std::error::Error for PipeInputError {}

fn positive(field: &'static str, value: f64, unit: &str) -> Result<f64, PipeInputError> {
    if value.is_finite() && value > 0.0 {
        Ok(value)
    } else {
        Err(PipeInputError {
            field,
            message: format!("{value} is not usable; give a finite number greater than 0 {unit}"),
        })
    }
}

fn non_negative(field: &'static str, value: f64, unit: &str) -> Result<f64, PipeInputError> {
    if value.is_finite() && value >= 0.0 {
        Ok(value)
    } else {
        Err(PipeInputError {
            field,
            message: format!("{value} is not usable; give a finite number of 0 or more {unit}"),
        })
    }
}

/// Hazen–Williams friction head loss in a full pipe (SI form):
/// h_f = 10.67·L·Q^1.852 / (C^1.852·d^4.87).
///
/// Units: L m, Q m³/s, d (internal diameter) m, C dimensionless (about 100–150; 130 for
/// common plastics and new steel) → h_f in m. Source: Hazen & Williams (1905), *Hydraulic
/// Tables*, in the usual SI form (from memory, as quoted in checks.md §15). Q = 0 gives 0; the
/// loss is for water at ordinary temperatures in turbulent flow.
pub fn hazen_williams_head_loss(
    length: f64,
    flow: f64,
    roughness_c: f64,
    diameter: f64,
) -> Result<f64, PipeInputError> {
    let l = non_negative("length", length, "m")?;
    let q = non_negative("flow", flow, "m³/s")?;
    let c = positive(
        "roughness_c",
        roughness_c,
        "(Hazen–Williams C, about 100–150)",
    )?;
    let d = positive("diameter", diameter, "m")?;
    Ok(10.67 * l * q.powf(1.852) / (c.powf(1.852) * d.powf(4.87)))
}

/// Hydraulic (shaft) power a pump needs: P = ρ·g·Q·H/η.
///
/// Units: Q m³/s, H (total head: static lift plus friction) m, η (pump efficiency, 0 < η ≤ 1),
/// ρ kg/m³, g m/s² → P in W. Source: the definition of hydraulic power ρgQH (any fluid
/// mechanics text, e.g. Douglas, Gasiorek & Swaffield, *Fluid Mechanics*), divided by the
/// efficiency.
pub fn pump_power(
    flow: f64,
    head: f64,
    efficiency: f64,
    density: f64,
    g: f64,
) -> Result<f64, PipeInputError> {
    let q = non_negative("flow", flow, "m³/s")?;
    let h = non_negative("head", head, "m")?;
    let eta = positive("efficiency", efficiency, "(a fraction, at most 1)")?;
    if eta > 1.0 {
        return Err(PipeInputError {
            field: "efficiency",
            message: format!("{eta} is more than 1; give a fraction 0 < η ≤ 1 (0.6 = 60 %)"),
        });
    }
    let rho = positive("density", density, "kg/m³")?;
    let g = positive("g", g, "m/s²")?;
    Ok(rho * g * q * h / eta)
}

/// Energy used in a day of running at power P for `hours` hours: E = P·t.
///
/// Units: P W, hours h (0–24) → E in kWh. Source: definition of energy (power × time).
pub fn energy_per_day_kwh(power: f64, hours: f64) -> Result<f64, PipeInputError> {
    let p = non_negative("power", power, "W")?;
    let t = non_negative("hours", hours, "h")?;
    if t > 24.0 {
        return Err(PipeInputError {
            field: "hours",
            message: format!("{t} h is more than a day; give 0 to 24 hours of running a day"),
        });
    }
    Ok(p * t / 1000.0)
}

/// The smallest standard pump duty (rate) in `duties` that is at least `rate`.
///
/// Units: the same for `rate` and `duties` (m³/s inside). Returns the duty and its index in
/// `duties`; `None` when every duty is smaller than the rate (a larger pump or several pumps are
/// needed). Bad values in the list or a bad rate are an error. Common practice (no source):
/// pumps are chosen from a maker's list of sizes, the next size up.
pub fn smallest_duty_at_least(
    rate: f64,
    duties: &[f64],
) -> Result<Option<(usize, f64)>, PipeInputError> {
    let rate = non_negative("rate", rate, "m³/s")?;
    for d in duties {
        positive("duties", *d, "m³/s for every pump duty")?;
    }
    Ok(duties
        .iter()
        .copied()
        .enumerate()
        .filter(|(_, d)| *d >= rate)
        .min_by(|a, b| a.1.total_cmp(&b.1)))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::water::{G, WATER_DENSITY};

    // checks.md §15 "Hazen–Williams head loss (SI, from memory)": L = 100 m, Q = 0.01 m³/s,
    // C = 130, d = 0.10 m → 1.9017 m.
    #[test]
    fn pipes_hazen_williams_checks_md_15() {
        let h = hazen_williams_head_loss(100.0, 0.01, 130.0, 0.10).unwrap();
        assert!((h - 1.9017).abs() < 5e-5, "{h}");
        assert_eq!(
            hazen_williams_head_loss(100.0, 0.0, 130.0, 0.1).unwrap(),
            0.0
        );
    }

    // checks.md §15 "Hydraulic power P = ρ·g·Q·H/η": Q = 0.01 m³/s, H = 25 m, η = 0.6,
    // ρ = 1000, g = 9.81 → 4.0875 kW.
    #[test]
    fn pipes_pump_power_checks_md_15() {
        let p = pump_power(0.01, 25.0, 0.6, WATER_DENSITY, G).unwrap();
        assert!((p - 4087.5).abs() < 1e-9, "{p}");
        // Definition of energy: 4.0875 kW for 24 h = 98.1 kWh.
        let e = energy_per_day_kwh(p, 24.0).unwrap();
        assert!((e - 98.1).abs() < 1e-9, "{e}");
    }

    #[test]
    fn pipes_bad_input_names_the_field() {
        let e = hazen_williams_head_loss(100.0, 0.01, 130.0, 0.0).unwrap_err();
        assert_eq!(e.field, "diameter");
        let e = pump_power(0.01, 25.0, 1.5, WATER_DENSITY, G).unwrap_err();
        assert_eq!(e.field, "efficiency");
        let e = pump_power(f64::NAN, 25.0, 0.5, WATER_DENSITY, G).unwrap_err();
        assert_eq!(e.field, "flow");
        assert_eq!(energy_per_day_kwh(1.0, 25.0).unwrap_err().field, "hours");
        assert_eq!(
            smallest_duty_at_least(1.0, &[0.0]).unwrap_err().field,
            "duties"
        );
    }

    // Common practice (no source): the next pump size up is chosen.
    #[test]
    fn pipes_smallest_duty() {
        let duties = [0.020, 0.005, 0.010, 0.040];
        assert_eq!(
            smallest_duty_at_least(0.008, &duties).unwrap(),
            Some((2, 0.010))
        );
        assert_eq!(
            smallest_duty_at_least(0.010, &duties).unwrap(),
            Some((2, 0.010))
        );
        assert_eq!(smallest_duty_at_least(0.05, &duties).unwrap(), None);
    }
}
