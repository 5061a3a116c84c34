//! The radius of influence used for superposition: the group radius R₀ = r_e + L₀ of a pit, or
//! R = π·L₀/2 for a trench line, with L₀ from the design file's method (Sichardt, Kusakin,
//! Cooper–Jacob, a pumping test, or the user's own value).

use crate::input::model::Model;

/// Radius of influence used for superposition, m, and how it was found.
///
/// Each well is given the group radius R₀ = r_e + L₀ of the excavation it serves, with L₀ from the
/// design file's method at the drawdown the design produces there: the target drawdown plus the
/// operating margin the design keeps (common practice (no source)).
pub fn design_radius(model: &Model) -> (f64, String) {
    radius_at(model, design_drawdown(model))
}

/// The drawdown a design produces at its served excavation, m: initial level − (target −
/// operating margin).
pub fn design_drawdown(model: &Model) -> f64 {
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    let e = &model.excavations[idx];
    model.aquifer.initial_level - e.target_level() + model.design.operating_margin
}

/// Whether the served excavation is treated as a trench (R = π·L₀/2).
pub fn serves_trench(model: &Model) -> bool {
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    crate::field::shape::is_trench(model, &model.excavations[idx])
}

/// Whether the radius of influence depends on the drawdown (Sichardt, Kusakin) — and so should
/// be taken at the drawdown the wells actually produce (see [`radius_at`]).
pub fn depends_on_drawdown(model: &Model) -> bool {
    model.aquifer.leakage_factor().is_none()
        && matches!(
            model.influence,
            crate::input::model::InfluenceMethod::Sichardt { .. }
                | crate::input::model::InfluenceMethod::Kusakin
        )
}

/// Radius of influence used for superposition at drawdown `s` (m) at the served excavation, m,
/// and how it was found: as [`design_radius`], with `s` in place of the target drawdown.
pub fn radius_at(model: &Model, s: f64) -> (f64, String) {
    let idx = model.layout.as_ref().map_or(0, |l| l.excavation);
    let e = &model.excavations[idx];
    let aq = &model.aquifer;
    let s = s.max(0.1);
    let r_e = crate::physics::equivalent::equivalent_radius_from_area(geo::Area::unsigned_area(
        &e.outline,
    ));
    let trench = crate::field::shape::is_trench(model, e);
    let u = model.units;
    if let Some(b) = aq.leakage_factor() {
        let mut text = format!(
            "leaky aquifer: K₀(r/B) with B = {} (no radius of influence; cut off at 25 B)",
            u.length_words(b, 1)
        );
        if let crate::input::model::InfluenceMethod::PumpingTest { transmissivity, .. } =
            model.influence
        {
            // The steady distance–drawdown line of a leaky test does not give R; its slope gives
            // T only where r ≪ B. Report how it compares with the aquifer inputs.
            let t_in = aq.transmissivity();
            text.push_str(&format!(
                "; the pumping test's Thiem line gives T = {} against K·D = {} from the aquifer inputs ({:+.0} %), and K·D is used{}",
                u.transmissivity_words(transmissivity),
                u.transmissivity_words(t_in),
                (transmissivity / t_in - 1.0) * 100.0,
                if (transmissivity / t_in - 1.0).abs() > 0.2 {
                    " — THEY DISAGREE by more than 20 %: check K, the thickness or the test (`drydig test` fits T, S and B from a time series)"
                } else {
                    ""
                }
            ));
        }
        return (b, text);
    }
    if trench {
        // A long line of wells with Thiem cut-off R draws ΔΦ = q′·R/π at the line (q′ per metre,
        // from ∫₋R^R ln(R/|x|) dx = 2R); the line slot from both sides draws ΔΦ = q′·L₀/2.
        // They agree when R = π·L₀/2.
        let l0 = model.influence.distance(aq, s, true);
        let r = std::f64::consts::FRAC_PI_2 * l0;
        return (r, format!(
            "trench: R = π·L₀/2 = {}, so a long line of wells matches the line-slot flow (L₀ = {}, {} to a line at s = {} for \"{}\")",
            u.length_words(r, 1),
            u.length_words(l0, 1),
            model.influence.name(),
            u.length_words(s, 2),
            e.name
        ));
    }
    let l0 = model.influence.distance(aq, s, false);
    let text = format!(
        "R₀ = r_e + L₀ = {:.1} + {:.1} = {} ({} at s = {} for \"{}\")",
        u.length(r_e),
        u.length(l0),
        u.length_words(r_e + l0, 1),
        model.influence.name(),
        u.length_words(s, 2),
        e.name
    );
    (r_e + l0, text)
}
