//! The marks on the plan and their sizes: the well symbol (a ringed dot for pumping, a
//! triangle for recharge), its radius from the nearest spacing of wells on the page, and the
//! half-size of the cross on a failed check point from the check-point spacing.

use crate::check::run::CheckRun;
use crate::report::map::page::{RECHARGE, WELL};
use crate::report::map::text::r1;
use crate::report::map::view::View;
use svg::node::element::{Group, Path};

/// Nearest distance between any two wells, m (infinite with fewer than two). Past 4000 wells
/// only neighbours in the list are compared (layouts list wells in order along their line).
pub(super) fn nearest_well_spacing(run: &CheckRun) -> f64 {
    let pts: Vec<[f64; 2]> = run.placement.wells.iter().map(|w| w.position).collect();
    let d = |a: &[f64; 2], b: &[f64; 2]| (a[0] - b[0]).hypot(a[1] - b[1]);
    if pts.len() > 4000 {
        return pts
            .windows(2)
            .map(|w| d(&w[0], &w[1]))
            .fold(f64::INFINITY, f64::min);
    }
    let mut nearest = f64::INFINITY;
    for (i, a) in pts.iter().enumerate() {
        for b in &pts[i + 1..] {
            nearest = nearest.min(d(a, b));
        }
    }
    nearest
}

/// Half-size of the cross marking a failed check point, px: smaller where points crowd.
pub(super) fn cross_size(run: &CheckRun, view: &View) -> f64 {
    let spacing = run
        .model
        .checks
        .grid_spacing
        .min(run.model.checks.edge_spacing);
    (0.3 * spacing * view.scale).clamp(1.5, 3.5)
}

/// Well symbol radius, px: smaller where wells stand close together on the page.
pub(super) fn well_radius(run: &CheckRun, view: &View) -> f64 {
    (0.42 * nearest_well_spacing(run) * view.scale).clamp(2.0, 5.5)
}

pub(super) fn well_symbol(p: [f64; 2], r: f64, recharge: bool) -> Group {
    if recharge {
        let pts = format!(
            "M{} {}L{} {}L{} {}Z",
            r1(p[0] - r * 1.1),
            r1(p[1] - r * 0.8),
            r1(p[0] + r * 1.1),
            r1(p[1] - r * 0.8),
            r1(p[0]),
            r1(p[1] + r * 1.1)
        );
        Group::new().add(
            Path::new()
                .set("d", pts)
                .set("fill", RECHARGE)
                .set("stroke", "#0c4a39")
                .set("stroke-width", 1.2),
        )
    } else {
        Group::new()
            .add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1(r))
                    .set("fill", "#ffffff")
                    .set("stroke", WELL)
                    .set("stroke-width", if r > 3.0 { 2 } else { 1 }),
            )
            .add(
                svg::node::element::Circle::new()
                    .set("cx", r1(p[0]))
                    .set("cy", r1(p[1]))
                    .set("r", r1((r * 0.4).max(1.0)))
                    .set("fill", WELL),
            )
    }
}
