//! Wellpoint pump sets sized as they are hired: a set is a vacuum pump (drawing the air that
//! enters the wellpoints and the header) and a water pump on one skid. The set is the smallest
//! of a short table of sizes that moves both the set's design flow of water and its air.
//!
//! The table is this program's own round figures, common practice (no source): not a maker's
//! catalogue. Give the supplier's set when pricing.

/// One size of wellpoint pump set.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct SetSize {
    /// Name as it is hired ("150 mm set": the suction/discharge size).
    pub name: &'static str,
    /// The suction/discharge size, mm (4, 6 and 8 in in US units).
    pub size_mm: f64,
    /// Largest water flow, m³/s.
    pub water_m3_per_s: f64,
    /// Largest air flow (free air), m³/h.
    pub air_m3_per_h: f64,
    /// Vacuum pump drive, kW.
    pub vacuum_kw: f64,
    /// Water pump drive, kW.
    pub water_kw: f64,
}

/// Wellpoint pump set sizes, smallest first (common practice (no source)).
pub const SET_SIZES: [SetSize; 3] = [
    SetSize {
        name: "100 mm set",
        size_mm: 100.0,
        water_m3_per_s: 0.015,
        air_m3_per_h: 60.0,
        vacuum_kw: 2.2,
        water_kw: 5.5,
    },
    SetSize {
        name: "150 mm set",
        size_mm: 150.0,
        water_m3_per_s: 0.030,
        air_m3_per_h: 120.0,
        vacuum_kw: 4.0,
        water_kw: 11.0,
    },
    SetSize {
        name: "200 mm set",
        size_mm: 200.0,
        water_m3_per_s: 0.060,
        air_m3_per_h: 200.0,
        vacuum_kw: 7.5,
        water_kw: 18.5,
    },
];

/// Free air drawn per wellpoint on a set, m³/h (common practice (no source): leaks at the
/// swing joints and air through the filter sand; 1–2 m³/h a wellpoint).
pub const AIR_PER_WELLPOINT_M3_PER_H: f64 = 1.5;

/// The set chosen for `water` (design flow of one set, m³/s) and `air` (m³/h): the smallest
/// size that moves both, and whether the demand is above the largest size (the largest is
/// then returned).
pub fn choose(water: f64, air: f64) -> (SetSize, bool) {
    match SET_SIZES
        .iter()
        .find(|s| water <= s.water_m3_per_s + 1e-12 && air <= s.air_m3_per_h + 1e-9)
    {
        Some(s) => (*s, false),
        None => (SET_SIZES[SET_SIZES.len() - 1], true),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_smallest_set_moving_both_air_and_water_is_chosen() {
        // Table above (common practice (no source)): 12 L/s with 40 wellpoints (60 m³/h of
        // air) fits the 100 mm set; 12 L/s with 41 wellpoints (61.5 m³/h) needs the 150 mm
        // set (air decides); 31 L/s needs the 200 mm set (water decides); 70 L/s is above it.
        assert_eq!(
            choose(0.012, 40.0 * AIR_PER_WELLPOINT_M3_PER_H).0.name,
            "100 mm set"
        );
        assert_eq!(
            choose(0.012, 41.0 * AIR_PER_WELLPOINT_M3_PER_H).0.name,
            "150 mm set"
        );
        assert_eq!(choose(0.031, 10.0).0.name, "200 mm set");
        assert!(choose(0.070, 10.0).1);
    }
}
