//! The filter (sand) column round a screen (`wells.filter_top`, `filter_base`,
//! `filter_length`): water enters the well over the filter column, so Sichardt's capacity and
//! the partial penetration take the filter length, and the bid bills the screen and the filter
//! apart. Checked against outside values: the scipy table of checks.md §12 and Sichardt's
//! formula (checks.md §9).

use drydig::check::evaluate::evaluate;
use drydig::check::run::field_for;
use drydig::field::checkpoints::check_points;
use drydig::field::layout::from_model;
use drydig::input::model::Model;
use drydig::input::validate::file::from_str;
use std::f64::consts::PI;
use std::path::Path;

/// A confined layer 0–20 m (K = 1e-4 m/s, T = 2e-3 m²/s), piezometric level 25 m, one well of
/// radius 0.15 m pumping 2 L/s: a 1 m screen (19–20 m) in the filter column `filter`, check
/// points at 1, 5 and 30 m evaluated at 17.5 m (the excavation's target).
fn one_well(filter: &str) -> Result<Model, drydig::input::error::InputError> {
    let text = format!(
        r#"
[site]
name = "Filter column check"
ground_level = "30.0 m"

[aquifer]
kind = "confined"
conductivity = "1e-4 m/s"
base_level = "0.0 m"
top_level = "20.0 m"
groundwater_level = "25.0 m"
storativity = 1e-4

[[excavation]]
name = "Pit"
outline = [[-200, -200], [-190, -200], [-190, -190], [-200, -190]]
formation_level = "18.0 m"
target_margin = "0.5 m"

[influence]
method = "fixed"
distance = "300 m"

[wells]
radius = "0.15 m"
screen_top = "20.0 m"
screen_base = "19.0 m"
pump_intake = "15.5 m"
submergence = "0.1 m"
{filter}

[layout]
kind = "listed"

[[well]]
name = "W1"
x = 0.0
y = 0.0
rate = "2 L/s"

[checks]
[[checks.point]]
name = "r1"
x = 1.0
y = 0.0
[[checks.point]]
name = "r5"
x = 0.0
y = 5.0
[[checks.point]]
name = "r30"
x = 30.0
y = 0.0
"#
    );
    from_str(Path::new("filter.toml"), &text)
}

// checks.md §12 (scipy reference table tests/reference/partial_penetration.csv): an intake over
// 15–20 m in D = 20 m, r_w = 0.15 m: Δ = 4.9253419 (r = 1 m), 1.1579813 (r = 5 m), 0.0084513
// (r = 30 m) at z = 17.5 m and Δ_w = 9.9420448 in the well. A 1 m screen at 19–20 m in a filter
// column from 15 m (given as filter_base, or as filter_length up from it) takes water over
// 15–20 m: the table's values, not those of a 1 m intake.
#[test]
fn partial_penetration_takes_the_filter_length() {
    for filter in [
        "filter_base = \"15.0 m\"",
        "filter_base = \"15.0 m\"\nfilter_length = \"5 m\"",
    ] {
        let m = one_well(filter).unwrap_or_else(|e| panic!("{e}"));
        assert_eq!((m.wells.filter_base, m.wells.filter_top), (15.0, 20.0));
        let wells = from_model(&m, None).unwrap().wells;
        let field = field_for(&m, &wells);
        let r_big = field.radius_of_influence();
        let unit = 0.002 / (2.0 * PI * 2e-3);
        let e = evaluate(&m, &field, &wells, &check_points(&m));
        for (name, r, delta) in [
            ("r1", 1.0, 4.925_341_928_387),
            ("r5", 5.0, 1.157_981_288_097),
            ("r30", 30.0, 8.451_260_115_676e-3),
        ] {
            let p = e.points.iter().find(|p| p.point.name == name).unwrap();
            let expected = unit * ((r_big / r).ln() + delta);
            assert!(
                (p.drawdown_m - expected).abs() < 1e-6 * unit * delta.abs().max(1.0),
                "{name}: {} vs {expected}",
                p.drawdown_m
            );
        }
        let w = &e.wells[0];
        let expected = unit * ((r_big / 0.15).ln() + 9.942_044_754_707);
        assert!((w.drawdown_m - expected).abs() < 1e-9 * expected);
        // Sichardt (1928), form from memory (checks.md §9): q_max = 2π·r_w·L·√K/15 with L the
        // wetted filter column (5 m: the layer is confined, the column full):
        // 2π·0.15·5·0.01/15 = 3.1416e-3 m³/s (the 1 m screen alone would give 6.283e-4).
        assert!(
            (w.sichardt_capacity_m3_per_s - 3.1416e-3).abs() < 1e-7,
            "{}",
            w.sichardt_capacity_m3_per_s
        );
    }
}

#[test]
fn without_a_filter_column_the_screen_is_the_intake() {
    let m = one_well("").unwrap_or_else(|e| panic!("{e}"));
    assert_eq!((m.wells.filter_base, m.wells.filter_top), (19.0, 20.0));
    let wells = from_model(&m, None).unwrap().wells;
    let e = evaluate(&m, &field_for(&m, &wells), &wells, &check_points(&m));
    // Sichardt (checks.md §9) over the wetted part of the 1 m screen (19–20 m): the 1 m intake
    // draws the level at its face below the layer top — at 2 L/s below the screen itself, so
    // nothing is wetted — L = max(0, min(20, face) − 19) m; q_max = 2π·0.15·L·0.01/15
    // (6.2832e-4 m³/s per metre), where the 5 m filter column gave 3.1416e-3 m³/s
    let w = &e.wells[0];
    let face = w.aquifer_level_m.expect("wet");
    let wetted = (face.min(20.0) - 19.0).max(0.0);
    assert!(face < 19.0, "{face}");
    assert!(
        (w.sichardt_capacity_m3_per_s - 6.2832e-4 * wetted).abs() < 1e-8,
        "{} at face {face}",
        w.sichardt_capacity_m3_per_s
    );
}

#[test]
fn the_bid_bills_screen_and_filter_apart() {
    let m = one_well("filter_base = \"15.0 m\"").unwrap_or_else(|e| panic!("{e}"));
    let p = from_model(&m, None).unwrap();
    let levels = vec![None; p.wells.len()];
    let b = drydig::bid::quantities::bid(&m, &p.wells, &p.paths, &levels);
    // one well: 1 m of screen, 5 m of filter column
    assert!((b.screen_m - 1.0).abs() < 1e-12);
    assert_eq!(b.filter_m, Some(5.0));
    let lines = drydig::bid::sheet::lines(&b, 0.0, drydig::input::units::UnitSystem::Si);
    let filter = lines
        .iter()
        .find(|l| l.item == "filter column")
        .expect("line");
    assert_eq!((filter.quantity, filter.unit.as_str()), (5.0, "m"));
    assert!(lines
        .iter()
        .any(|l| l.item == "screen" && l.quantity == 1.0));
}

#[test]
fn a_filter_column_that_does_not_surround_the_screen_is_refused() {
    for (filter, field) in [
        ("filter_base = \"19.5 m\"", "wells.filter_base"),
        ("filter_top = \"19.5 m\"", "wells.filter_top"),
        ("filter_top = \"31 m\"", "wells.filter_top"),
        (
            "filter_top = \"22 m\"\nfilter_length = \"3 m\"",
            "wells.filter_length",
        ),
        ("filter_base = \"-1 m\"", "wells.filter_base"),
    ] {
        let e = one_well(filter).expect_err(filter);
        assert_eq!(e.field, field, "{filter}: {e}");
    }
}
