//! Equivalent radius of an excavation: the radius of the single "equivalent well" that stands
//! for the whole pit in the hand method. Valid for compact shapes; long narrow pits need the
//! line-flow formulas of [`crate::physics::slot`] instead.

use std::f64::consts::PI;

/// Equivalent radius from the plan area: r_e = √(A/π) (the circle of the same area).
///
/// Units: A in m² → r_e in m. Source: common practice (no source); e.g. r_e = √(a·b/π) for a
/// rectangle a × b.
pub fn equivalent_radius_from_area(area: f64) -> f64 {
    (area / PI).sqrt()
}

/// Equivalent radius from the perimeter: r_e = P/(2π) (the circle of the same perimeter),
/// equal to (a + b)/π for a rectangle a × b.
///
/// Units: P in m → r_e in m. Source: the rectangle form (a + b)/π from memory.
pub fn equivalent_radius_from_perimeter(perimeter: f64) -> f64 {
    perimeter / (2.0 * PI)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn rectangles() {
        // checks.md §7: area form √(ab/π) (common practice) and perimeter form (a+b)/π
        // (from memory): 20×20 → 11.284 / 12.732; 40×10 → 11.284 / 15.915;
        // 100×10 → 17.841 / 35.014
        for (a, b, by_area, by_perimeter) in [
            (20.0, 20.0, 11.284, 12.732),
            (40.0, 10.0, 11.284, 15.915),
            (100.0, 10.0, 17.841, 35.014),
        ] {
            assert_relative_eq!(
                equivalent_radius_from_area(a * b),
                by_area,
                max_relative = 1e-4
            );
            assert_relative_eq!(
                equivalent_radius_from_perimeter(2.0 * (a + b)),
                by_perimeter,
                max_relative = 1e-4
            );
        }
    }
}
