//! Wellpoints on one pump set share its rate (`pumps.rates = "per-set"`, the default): a header
//! runs its wellpoints at one vacuum, so the design may not give each wellpoint of a set a rate
//! of its own (common practice (no source): one wellpoint pump set per length of header, its
//! wellpoints drawing together; a rate per wellpoint needs a valve on each).

use drydig::input::model::Model;
use drydig::optimise::outcome::Outcome;
use drydig::optimise::rates::RateOption;
use drydig::optimise::search::design;
use std::path::Path;

fn load(name: &str) -> Model {
    let path = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name);
    drydig::input::validate::file::load(&path).unwrap_or_else(|e| panic!("{e}"))
}

#[test]
fn the_pipeline_trench_runs_one_rate_per_pump_set() {
    let m = load("pipeline_trench.toml");
    assert!(m.design.pumps.rates_per_set);
    let set = m.design.pumps.wellpoint_set_length;
    let d = design(&m, RateOption::Individual).unwrap_or_else(|e| panic!("{e}"));
    assert!(matches!(d.outcome, Outcome::Met { .. }), "{:?}", d.outcome);
    let wells = d.placement.expect("wells").wells;
    // Each side's line in the order it was laid, cut into sets of `set` m from its first
    // wellpoint.
    let mut distinct: Vec<f64> = Vec::new();
    for north in [true, false] {
        let side: Vec<_> = wells
            .iter()
            .filter(|w| (w.position[1] > 0.0) == north && w.rate > 0.0)
            .collect();
        assert!(!side.is_empty());
        let mut first = side[0];
        for w in &side {
            if (w.position[0] - first.position[0]).abs() >= set - 1e-9 {
                first = w;
            }
            // the same rate as the first wellpoint of its set (to round-off)
            assert!(
                (w.rate - first.rate).abs() <= 1e-9 * first.rate,
                "{} at {:.4} L/s, its set's first {} at {:.4} L/s",
                w.name,
                w.rate * 1e3,
                first.name,
                first.rate * 1e3
            );
            if !distinct.iter().any(|q| (q - w.rate).abs() <= 1e-9 * q) {
                distinct.push(w.rate);
            }
        }
    }
    // At most one rate per set of header.
    let header: f64 = 2.0
        * (wells.iter().map(|w| w.position[0]).fold(f64::MIN, f64::max)
            - wells.iter().map(|w| w.position[0]).fold(f64::MAX, f64::min));
    let sets = (header / set).ceil() as usize + 2;
    assert!(
        distinct.len() <= sets,
        "{} rates for about {sets} sets",
        distinct.len()
    );
}

#[test]
fn an_unknown_rates_option_is_refused_naming_the_field() {
    let text = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/pipeline_trench.toml"),
    )
    .expect("demo");
    let text = text.replace("[pumps]\n", "[pumps]\nrates = \"per-header\"\n");
    let err = drydig::input::validate::file::from_str(Path::new("trench.toml"), &text)
        .expect_err("refused");
    assert_eq!(err.field, "pumps.rates");
    assert!(err.message.contains("\"per-well\""), "{}", err.message);
}
