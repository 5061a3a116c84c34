//! The fewest wells on candidate positions (`placement = "fewest"`, the default for rings)
//! against the evenly spaced rings (`placement = "even"`), on the invented riverside pit
//! (`layouts/riverside_pit.toml`), where the river feeds the wells on its side far more than
//! those inland.
//!
//! Every rule is re-verified here by plain superposition, the way `drydig check` evaluates a
//! layout (`check::run::evaluate_placement`: the levels summed well by well, with the radius
//! at the drawdown produced), not by the programme that chose the rates: the operating margin,
//! the capacity fraction, any one well out, the lowest level in each well, the minimum spacing,
//! keep-out zones, standby wells on the ring.

use drydig::check::run::evaluate_placement;
use drydig::field::layout::{generate, offset_ring, Placement};
use drydig::input::model::Model;
use drydig::optimise::outcome::{Design, Outcome};
use drydig::optimise::rates::RateOption;
use drydig::optimise::search::design;
use drydig::optimise::standby::is_standby;
use geo::{Contains, Point};
use std::path::Path;

/// Round-off allowed in a re-verified level, m.
const TOL: f64 = 1e-6;

fn load(name: &str) -> Model {
    let path = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name);
    drydig::input::validate::file::load(&path).unwrap_or_else(|e| panic!("{e}"))
}

fn working(d: &Design) -> usize {
    match d.outcome {
        Outcome::Met { count, .. } => count,
        _ => panic!("not met: {:?}", d.outcome),
    }
}

/// Distance from `p` to the closed polyline `ring`, m.
fn to_ring(ring: &[[f64; 2]], p: [f64; 2]) -> f64 {
    (0..ring.len())
        .map(|i| {
            let (a, b) = (ring[i], ring[(i + 1) % ring.len()]);
            let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
            let t =
                (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy)).clamp(0.0, 1.0);
            (a[0] + t * dx - p[0]).hypot(a[1] + t * dy - p[1])
        })
        .fold(f64::INFINITY, f64::min)
}

/// Every rule of the design, re-verified by plain superposition on `placement`.
fn verify_every_rule(m: &Model, placement: &Placement) {
    let margin = m.design.operating_margin;
    // Every well running: every target with the operating margin, every well within its
    // limits (lowest level in the well, capacity) and at most the capacity fraction.
    let run = evaluate_placement(m, placement.clone());
    let e = &run.evaluation;
    assert!(
        e.targets_met && e.wells_ok,
        "{} targets not met",
        e.unmet_count
    );
    for p in e.points.iter().filter(|p| p.met.is_some()) {
        let got = p.margin_m.expect("a target point has a margin");
        assert!(
            got >= margin - TOL,
            "{}: margin {got:.3} m < {margin} m",
            p.point.name
        );
    }
    for w in &e.wells {
        assert!(
            w.rate_m3_per_s <= m.design.capacity_fraction * w.capacity_m3_per_s * (1.0 + 1e-6),
            "{} runs at {:.2} L/s, above {:.0} % of {:.2} L/s",
            w.name,
            w.rate_m3_per_s * 1e3,
            m.design.capacity_fraction * 100.0,
            w.capacity_m3_per_s * 1e3
        );
        if let Some(z) = w.level_m {
            assert!(
                z >= w.lowest_allowed_level_m - TOL,
                "{} below its lowest level",
                w.name
            );
        }
    }
    // Any one well out: every target still met (the margin given back).
    for k in (0..placement.wells.len()).filter(|&k| placement.wells[k].rate > 0.0) {
        let mut out = placement.clone();
        out.wells[k].rate = 0.0;
        let e = evaluate_placement(m, out).evaluation;
        assert!(
            e.targets_met,
            "{} out: {} targets not met",
            placement.wells[k].name, e.unmet_count
        );
    }
    // Minimum spacing between every pair (standby wells too), nothing in the excavation.
    let w = &placement.wells;
    for i in 0..w.len() {
        for j in i + 1..w.len() {
            let d =
                (w[i].position[0] - w[j].position[0]).hypot(w[i].position[1] - w[j].position[1]);
            assert!(
                d >= m.as_built.min_spacing - TOL,
                "{} and {} {d:.2} m apart",
                w[i].name,
                w[j].name
            );
        }
        let p = Point::new(w[i].position[0], w[i].position[1]);
        assert!(
            !m.excavations.iter().any(|x| x.outline.contains(&p)),
            "{} in the pit",
            w[i].name
        );
    }
    // Standby wells on the ring, not on a chord.
    let spec = m.layout.as_ref().expect("a ring");
    let ring = offset_ring(&m.excavations[spec.excavation].outline, spec.offset);
    for s in w.iter().filter(|w| is_standby(w)) {
        let d = to_ring(&ring, s.position);
        assert!(d < 1e-6, "standby {} is {d:.2} m off the ring", s.name);
    }
}

#[test]
fn fewest_beats_the_even_ring_beside_the_river_and_meets_every_rule() {
    let m = load("riverside_pit.toml");
    let fewest = design(&m, RateOption::Individual).unwrap_or_else(|e| panic!("{e}"));
    let mut even_model = m.clone();
    if let Some(l) = even_model.layout.as_mut() {
        l.free = None;
    }
    let even = design(&even_model, RateOption::Individual).unwrap_or_else(|e| panic!("{e}"));
    let (n_free, n_even) = (working(&fewest), working(&even));
    assert!(n_free < n_even, "fewest {n_free} wells, even ring {n_even}");
    let summary = fewest.free.clone().expect("the fewest placement ran");
    assert!(summary.used);
    assert_eq!(summary.count, Some(n_free));
    assert_eq!(summary.even_count, Some(n_even));
    // The LP relaxation bounds the answer below.
    let lb = summary.lower_bound.expect("a lower bound");
    assert!(lb <= n_free, "lower bound {lb} above the {n_free} found");
    verify_every_rule(&m, fewest.placement.as_ref().expect("wells"));
    verify_every_rule(&even_model, even.placement.as_ref().expect("wells"));
    // Uneven: the river (south) side holds more wells than the land (north) side (common
    // practice (no source): a recharge boundary feeds the wells nearest it, which must draw
    // more to hold the levels on that side).
    let wells = &fewest.placement.as_ref().expect("wells").wells;
    let south = wells
        .iter()
        .filter(|w| !is_standby(w) && w.position[1] < 0.0)
        .count();
    let north = wells
        .iter()
        .filter(|w| !is_standby(w) && w.position[1] > 16.0)
        .count();
    assert!(south > north, "south {south}, north {north}");
}

#[test]
fn even_placement_keeps_the_evenly_spaced_ring() {
    let text = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/riverside_pit.toml"),
    )
    .expect("demo");
    let text = text.replace("candidate_step = \"2 m\"", "placement = \"even\"");
    let m = drydig::input::validate::file::from_str(Path::new("pit.toml"), &text)
        .unwrap_or_else(|e| panic!("{e}"));
    assert!(m.layout.as_ref().is_some_and(|l| l.free.is_none()));
    let d = design(&m, RateOption::Individual).unwrap_or_else(|e| panic!("{e}"));
    assert!(d.free.is_none());
    // The wells stand where the ring of that count puts them.
    let spec = d.spec.clone().expect("spec");
    let ring = generate(&m, &spec, 0.0).expect("ring");
    let placed = d.placement.expect("wells");
    for w in placed.wells.iter().filter(|w| !is_standby(w)) {
        assert!(
            ring.wells.iter().any(|r| r.position == w.position),
            "{} is not on the evenly spaced ring",
            w.name
        );
    }
}

#[test]
fn unknown_placement_is_refused_naming_the_field() {
    let text = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/riverside_pit.toml"),
    )
    .expect("demo");
    let text = text.replace("candidate_step = \"2 m\"", "placement = \"random\"");
    let err =
        drydig::input::validate::file::from_str(Path::new("pit.toml"), &text).expect_err("refused");
    assert_eq!(err.field, "layout.placement");
    assert!(err.message.contains("\"even\""), "{}", err.message);
}
