//! How the programme in time relates to the steady design, and the time t* at which they agree.
//!
//! For small u = r²S/(4Tt) the Theis well function is W(u) ≈ −γ − ln u (Cooper & Jacob 1946),
//! so a well pumping Q from time 0 draws s ≈ Q/(2πT)·ln(R(t)/r) with R(t) = √(2.25·T·t/S):
//! Thiem's drawdown with a radius of influence that grows with time. The steady design uses one
//! radius R (Sichardt, Kusakin, Cooper–Jacob, a pumping test or the user's value); at
//! t* = R²·S/(2.25·T) the programme's R(t) reaches it, and the programme with every well at its
//! design rate from day 0 gives the steady levels at the check points and in the wells (partial
//! penetration and well losses are the same terms in both). They differ by the Cooper–Jacob
//! remainder Q/(4πT)·(u − u²/4 + …) of each well at the point (below 0.6 % of Q/(2πT) where
//! r < R/10) and by the wells beyond R, which Thiem cuts off and Theis does not; the difference is
//! computed and printed with t*, not assumed. After t* an unbounded aquifer keeps drawing down
//! (by Q/(4πT)·ln(t/t*) per well; a constant-head boundary or leakage levels it off), so a
//! programme longer than t* draws more than the steady design says. A leaky aquifer has no t*:
//! Hantush's W(u, r/B) levels off at the steady K₀ values, reached when u ≪ (r/B)²/4 … i.e. after
//! a few times B²·S/T.

use crate::check::consistent_radius::evaluate_consistent;
use crate::field::checkpoints::check_points;
use crate::input::model::Model;
use crate::transient::programme::{
    build_model, diffusion_parameters, image_reach, well_images, ProgrammeSetup,
};
use crate::transient::well_levels::level_in_well;
use crate::transient::{RateSchedule, TransientAquifer};

/// The programme at t* against the steady check of the same wells at their design rates.
#[derive(Debug, Clone)]
pub struct SteadyLink {
    /// Radius of influence the steady check uses, m.
    pub radius: f64,
    /// How it was found (the steady check's words).
    pub radius_basis: String,
    /// t* = R²·S/(2.25·T), s.
    pub t_star: f64,
    /// Largest |steady level − level at t*| over the check points, m, and where.
    pub point_difference: f64,
    /// The point with the largest difference.
    pub point_name: String,
    /// Largest |steady level − level at t*| over the wells (losses included), m, and which.
    pub well_difference: f64,
    /// The well with the largest difference.
    pub well_name: String,
    /// Check points compared (wet in both).
    pub points_compared: usize,
}

/// t* = R²·S/(2.25·T), s, for radius `r` (m): the time the Cooper–Jacob radius √(2.25·T·t/S)
/// reaches R (Cooper & Jacob 1946).
pub fn time_to_radius(aquifer: &TransientAquifer, r: f64) -> f64 {
    let (t, s) = diffusion_parameters(aquifer);
    r * r * s / (2.25 * t)
}

/// The steady check of the programme's wells at their design rates, and the programme with
/// every well at that rate from day 0 evaluated at t*. `None` for a leaky aquifer (no t*) or
/// wells without rates.
pub fn steady_link(model: &Model, setup: &ProgrammeSetup) -> Option<SteadyLink> {
    if matches!(setup.aquifer, TransientAquifer::Leaky { .. })
        || setup.wells.iter().all(|w| w.rate <= 0.0)
    {
        return None;
    }
    let points = check_points(model);
    let (_, steady) = evaluate_consistent(model, &setup.wells, &points);
    let radius = steady.radius_of_influence_m;
    let t_star = time_to_radius(&setup.aquifer, radius);
    if !(t_star.is_finite() && t_star > 0.0) {
        return None;
    }
    let lines: Vec<_> = model
        .boundaries
        .iter()
        .map(|b| (b.line[0], b.line[1], b.kind))
        .collect();
    let reach = image_reach(&setup.aquifer, t_star);
    let images: Vec<_> = setup
        .wells
        .iter()
        .map(|w| well_images(w.position, &lines, reach).0)
        .collect();
    let schedules: Vec<RateSchedule> = setup
        .wells
        .iter()
        .map(|w| RateSchedule::constant(0.0, w.rate))
        .collect::<Result<_, _>>()
        .ok()?;
    let tm = build_model(
        &setup.aquifer,
        setup.well_radius,
        &setup.wells,
        &schedules,
        &images,
        setup.near.clone(),
    )
    .ok()?;
    let h0 = model.aquifer.initial_level;
    let (mut point_difference, mut point_name, mut points_compared) = (0.0, String::new(), 0);
    for p in &steady.points {
        let Some(z) = p.level_m else { continue };
        let zt = h0 - tm.drawdown_at(p.point.position, t_star);
        points_compared += 1;
        if (z - zt).abs() > point_difference {
            point_difference = (z - zt).abs();
            point_name = p.point.name.clone();
        }
    }
    let (mut well_difference, mut well_name) = (0.0, String::new());
    for (j, (w, r)) in setup.wells.iter().zip(&steady.wells).enumerate() {
        let Some(z) = r.level_m else { continue };
        let zt = level_in_well(model, &tm, j, w.position, t_star);
        if (z - zt).abs() > well_difference {
            well_difference = (z - zt).abs();
            well_name = w.name.clone();
        }
    }
    Some(SteadyLink {
        radius,
        radius_basis: steady.radius_of_influence_basis,
        t_star,
        point_difference,
        point_name,
        well_difference,
        well_name,
        points_compared,
    })
}
