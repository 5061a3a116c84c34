//! What the formulas derive from the checked inputs, checked in turn before anything is computed:
//! the distance of influence of every excavation (radial and to a line), the leakage factor, the
//! equivalent radius, the transmissivity, and the number of check points the settings would build.
//!
//! The bounds are common practice (no source): a distance of influence below 0.5 m or beyond
//! 100 km, or a leakage factor below 0.1 m, is a unit slip, and every formula that divides by one
//! of them stays finite inside these bounds.

use crate::input::error::{InputError, Reporter};
use crate::input::model::Model;
use geo::{Area, BoundingRect};

/// Smallest and largest distance of influence, m.
pub const DISTANCE_RANGE: (f64, f64) = (0.5, 1e5);
/// Smallest leakage factor B, m.
pub const MIN_LEAKAGE_FACTOR: f64 = 0.1;
/// Most check points the grid, corner and edge settings may build.
pub const MAX_CHECK_POINTS: usize = 400_000;

/// Smallest ratio of the finest length drydig resolves (well radius, a tenth of the grid spacing)
/// to the spacing of doubles at the site's coordinates: below it a result could depend on where
/// the origin is.
pub const MIN_RESOLUTION_ULPS: f64 = 1e6;

/// Refuse coordinates so far from the origin that the finest length of the design is within
/// [`MIN_RESOLUTION_ULPS`] spacings of doubles there (IEEE 754: the spacing at |x| is about
/// |x|·2⁻⁵²). The superposition itself runs on coordinates shifted to a site origin.
fn precision(rep: &Reporter, model: &Model) -> Result<(), InputError> {
    let far = model
        .excavations
        .iter()
        .flat_map(|e| e.outline.exterior().0.iter())
        .map(|c| c.x.abs().max(c.y.abs()))
        .fold(0.0, f64::max);
    let ulp = far * f64::EPSILON;
    let finest = model.wells.radius.min(0.1 * model.checks.grid_spacing);
    if finest < MIN_RESOLUTION_ULPS * ulp {
        return Err(rep.error(
            "excavation[1].outline",
            None,
            format!("coordinates near {far:e} m keep only about {ulp:e} m precision, too coarse for a {finest} m detail; shift the coordinates to a local origin"),
        ));
    }
    Ok(())
}

/// Check the derived quantities of `model`.
pub fn check(rep: &Reporter, model: &Model) -> Result<(), InputError> {
    let aq = &model.aquifer;
    let t = aq.transmissivity();
    if !(t.is_finite() && t > 0.0) {
        return Err(rep.error(
            "aquifer.conductivity",
            None,
            format!("the transmissivity K·b = {t:e} m²/s is not a positive finite number; check the conductivity and the levels"),
        ));
    }
    if let Some(b) = aq.leakage_factor() {
        if !(b.is_finite() && b >= MIN_LEAKAGE_FACTOR) {
            return Err(rep.error(
                "aquifer.leakage_factor",
                None,
                format!("the leakage factor B = {b:e} m is below {MIN_LEAKAGE_FACTOR} m; B = √(T·c) is metres to kilometres (check the unit of the aquitard resistance)"),
            ));
        }
    }
    let (lo, hi) = DISTANCE_RANGE;
    let mut points = 0.0;
    for (i, e) in model.excavations.iter().enumerate() {
        let s = (aq.initial_level - e.target_level()).max(0.1);
        for line in [false, true] {
            let l0 = model.influence.distance(aq, s, line);
            if !(l0.is_finite() && (lo..=hi).contains(&l0)) {
                return Err(rep.error(
                    "influence",
                    None,
                    format!(
                        "the distance of influence for \"{}\" comes out at {l0:e} m ({}, s = {s:.2} m), outside {lo} … {hi:e} m; check the method's inputs (conductivity, time, storage, distance)",
                        e.name,
                        model.influence.name()
                    ),
                ));
            }
        }
        let area = e.outline.unsigned_area();
        let r_e = crate::physics::equivalent::equivalent_radius_from_area(area);
        if !(r_e.is_finite() && r_e > 0.01) {
            return Err(rep.error(
                format!("excavation[{}].outline", i + 1),
                None,
                format!("the equivalent radius √(A/π) = {r_e:e} m is below 1 cm; the outline is in metres"),
            ));
        }
        let ring = e.outline.exterior();
        let perimeter: f64 = ring.lines().map(|l| l.dx().hypot(l.dy())).sum();
        let vertices = ring.0.len() as f64;
        let bbox = e.outline.bounding_rect().map_or(0.0, |b| {
            let (nx, ny) = (
                (b.width() / model.checks.grid_spacing).floor().max(1.0),
                (b.height() / model.checks.grid_spacing).floor().max(1.0),
            );
            nx * ny
        });
        points += vertices + perimeter / model.checks.edge_spacing + bbox;
    }
    precision(rep, model)?;
    if points.is_nan() || points > MAX_CHECK_POINTS as f64 {
        return Err(rep.error(
            "checks.grid_spacing",
            None,
            format!(
                "the check-point settings would build about {points:.0} points, more than the {MAX_CHECK_POINTS} drydig evaluates; give a larger checks.grid_spacing or checks.edge_spacing"
            ),
        ));
    }
    Ok(())
}
