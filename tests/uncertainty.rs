//! `drydig uncertainty`: the sampled percentiles of a lognormal Thiem flow against scipy, the
//! fast path against the plain evaluation, the same numbers for any thread count, and errors
//! naming the field.

use drydig::input::model::Model;
use drydig::input::model_uncertainty::{InputKind, UncertainInput, Uncertainty};
use drydig::input::validate::file::{from_str, load};
use drydig::input::validate::uncertainty::parse_distribution;
use drydig::uncertainty::apply::apply;
use drydig::uncertainty::check_samples::{evaluate_sample, Layout};
use drydig::uncertainty::days_to_dig::DigStages;
use drydig::uncertainty::design_samples::{design_sample, sample_of};
use drydig::uncertainty::fast_check::FastCheck;
use drydig::uncertainty::run::{run, Mode, Settings};
use drydig::uncertainty::sampling::sample_values;
use drydig::uncertainty::stats::percentiles;
use std::path::Path;

const DEMO: &str = "layouts/riverside_basement_uncertainty.toml";

fn demo() -> Model {
    load(Path::new(DEMO)).expect("demo loads")
}

/// One equivalent well, K lognormal, R fixed: Q = 2πKDs/ln(R/r) (Thiem 1906; Kruseman & de
/// Ridder 1990, eq. 3.1) is lognormal with K's factor. The Latin hypercube percentiles of 1 000
/// samples agree with scipy.stats.lognorm's (tests/reference/uncertainty_thiem_lognormal.csv,
/// scripts/reference_uncertainty.py) to 1 %.
#[test]
fn thiem_flow_percentiles_match_scipy_lognormal() {
    let text = std::fs::read_to_string("tests/reference/uncertainty_thiem_lognormal.csv").unwrap();
    let rows: Vec<Vec<String>> = text
        .lines()
        .skip(1)
        .map(|l| l.split(',').map(String::from).collect())
        .collect();
    assert_eq!(rows.len(), 9);
    for case in rows.chunks(3) {
        let n = |i: usize| case[0][i].parse::<f64>().unwrap();
        let (k, factor, d, s, big_r, r) = (n(1), n(2), n(3), n(4), n(5), n(6));
        let written = format!("lognormal median {k:e} m/s, factor {factor}");
        let dist = parse_distribution(&written, |t| {
            drydig::input::units::parse::<drydig::input::units::ConductivityKind>(t)
        })
        .unwrap();
        let spec = Uncertainty {
            inputs: vec![UncertainInput {
                kind: InputKind::Conductivity,
                distribution: dist,
                text: written,
            }],
            rank_correlation: None,
            samples: 1000,
            seed: 7,
        };
        let flows = sample_values(&spec, 1000, 7)
            .into_iter()
            .map(|v| drydig::physics::thiem::thiem_flow(v[0] * d, s, r, big_r));
        let p = percentiles(flows).unwrap();
        for (row, got) in case.iter().zip([p.p10, p.p50, p.p90]) {
            let want: f64 = row[8].parse().unwrap();
            assert!(
                (got / want - 1.0).abs() < 0.01,
                "{}: p = {}: sampled {got:e}, scipy {want:e}",
                row[0],
                row[7]
            );
        }
    }
}

/// The shortcut (A_p tables, R a shift, the partial-penetration term interpolated over the
/// sampled groundwater level) gives what the plain evaluation gives, sample by sample: margins
/// and neighbour drawdowns to 2 mm, the flow needed to 0.2 %, R to 0.05 % (R = C·s·√K follows the produced drawdown, itself
/// within the 2 mm; the shortcut's rule:
/// tested against the plain sum, DEVELOPERS.md).
#[test]
fn fast_path_matches_plain_evaluation() {
    let model = demo();
    let spec = model.uncertainty.clone().unwrap();
    let placement = drydig::field::layout::from_model(&model, None).unwrap();
    let layout = Layout::new(&model, placement.wells);
    let fast = FastCheck::new(&model, &spec, &layout).expect("one boundary: shortcut applies");
    for v in sample_values(&spec, 6, 3) {
        let m = apply(&model, &spec, &v);
        let plain = evaluate_sample(&m, &layout);
        let quick = fast.evaluate(&m).expect("R reaches every source");
        let close = |a: f64, b: f64, tol: f64, what: &str| {
            assert!(
                (a - b).abs() <= tol,
                "{what}: fast {a}, plain {b} (sample {v:?})"
            )
        };
        close(
            quick.lowest_margin_m.unwrap(),
            plain.lowest_margin_m.unwrap(),
            2e-3,
            "margin",
        );
        let (qf, qp) = (
            quick.needed_flow_m3_per_s.unwrap(),
            plain.needed_flow_m3_per_s.unwrap(),
        );
        close(qf / qp, 1.0, 2e-3, "flow needed");
        close(quick.radius_m / plain.radius_m, 1.0, 5e-4, "radius");
        assert_eq!(
            quick.wells_ok, plain.wells_ok,
            "wells within limits ({v:?})"
        );
        for (a, b) in quick.neighbours.iter().zip(&plain.neighbours) {
            close(a.0, b.0, 2e-3, "neighbour drawdown");
            close(a.1.unwrap_or(0.0), b.1.unwrap_or(0.0), 2e-4, "settlement");
        }
    }
}

fn csv_with_threads(threads: usize) -> Vec<u8> {
    let model = demo();
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(threads)
        .build()
        .unwrap();
    pool.install(|| {
        let settings = Settings {
            mode: Mode::Check,
            samples: Some(40),
            seed: Some(11),
            reliability: 0.9,
            rates: drydig::optimise::rates::RateOption::Individual,
        };
        let r = run(&model, settings, &|| {}).unwrap();
        drydig::report::uncertainty_text::to_csv(&model, &r).unwrap()
    })
}

/// Same seed, one thread or two: byte-identical uncertainty.csv (each input draws from its own
/// stream of the seed; threads only share out the evaluations).
#[test]
fn same_numbers_for_any_thread_count() {
    let one = csv_with_threads(1);
    let two = csv_with_threads(2);
    assert!(one.len() > 1000);
    assert_eq!(one, two);
}

/// Each sample's design leaves out the search with one rate in every well when individual
/// rates find a layout: the wells and the flow equal those of the full `design` on 20 samples
/// whose fewest wells differ.
#[test]
fn sample_designs_match_full_designs() {
    let model = demo();
    let spec = model.uncertainty.clone().unwrap();
    let rates = drydig::optimise::rates::RateOption::Individual;
    let mut counts = std::collections::BTreeSet::new();
    for (i, v) in sample_values(&spec, 20, 7).iter().enumerate() {
        let m = apply(&model, &spec, v);
        let lean = design_sample(&m, rates);
        let full = sample_of(drydig::optimise::search::design(&m, rates));
        assert_eq!(lean.wells, full.wells, "sample {i}: wells");
        assert_eq!(lean.met, full.met, "sample {i}: met");
        assert_eq!(
            lean.total_flow_m3_per_s, full.total_flow_m3_per_s,
            "sample {i}: flow"
        );
        counts.insert(full.wells);
    }
    assert!(counts.len() >= 3, "the samples' counts spread: {counts:?}");
}

/// Bad `[uncertainty]` entries are refused naming the field, its line and what is valid.
#[test]
fn bad_entries_name_the_field() {
    let base = std::fs::read_to_string(DEMO).unwrap();
    let cut = base.find("[uncertainty]").unwrap();
    for (extra, field, words) in [
        (
            "conductivity = \"normal 3e-4 m/s\"",
            "uncertainty.conductivity",
            "lognormal",
        ),
        (
            "distance = \"uniform 100 .. 300 m\"",
            "uncertainty.distance",
            "fixed",
        ),
        (
            "storativity = \"uniform 1e-4 .. 1e-3\"",
            "uncertainty.storativity",
            "specific_yield",
        ),
        (
            "specific_yield = \"lognormal median 0.2, factor 2\"",
            "uncertainty.specific_yield",
            "range",
        ),
        (
            "conductivity = \"uniform 1 .. 2 m/s\"\nrank_correlation = 0.5",
            "uncertainty.rank_correlation",
            "specific_yield",
        ),
        (
            "conductivity = \"uniform 1e-4 .. 3e-4 m/s\"\nsamples = 3",
            "uncertainty.samples",
            "10",
        ),
    ] {
        let text = format!("{}[uncertainty]\n{extra}\n", &base[..cut]);
        let e = from_str(Path::new("u.toml"), &text).unwrap_err();
        assert_eq!(e.field, field, "{extra}: {e}");
        assert!(e.message.contains(words), "{extra}: {e}");
        // the error names the line of the entry, as other sections' errors do
        let key = field.trim_start_matches("uncertainty.");
        let section = text.lines().position(|l| l == "[uncertainty]").unwrap();
        let line = text
            .lines()
            .enumerate()
            .skip(section)
            .find(|(_, l)| l.starts_with(&format!("{key} =")))
            .map(|(i, _)| i + 1);
        assert!(line.is_some_and(|l| l > 100));
        assert_eq!(e.line, line, "{extra}: {e}");
        assert!(
            e.to_string().contains(&format!("u.toml:{}", line.unwrap())),
            "{e}"
        );
    }
}

/// One well outside a small pit in a confined aquifer, with a one-stage programme (the geometry
/// of scripts/reference_days_to_dig.py); K is sampled.
const DIG: &str = r#"
[site]
name = "Days-to-dig check pit"
datum = "0.00 m = test datum"
ground_level = "6.0 m"
grid = "local"

[aquifer]
kind = "confined"
conductivity = "1e-4 m/s"
top_level = "0.0 m"
base_level = "-10.0 m"
groundwater_level = "5.0 m"
storativity = 1e-3

[[excavation]]
name = "Pit"
outline = [[20, -5], [30, -5], [30, 5], [20, 5]]
formation_level = "2.5 m"
target_margin = "0.5 m"

[influence]
method = "sichardt"
sichardt_c = 3000

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "0.0 m"
screen_base = "-10.0 m"
pump_intake = "-9.0 m"
submergence = "1.0 m"
pump_capacity = "8 L/s"

[layout]
kind = "listed"
excavation = "Pit"

[[well]]
name = "W1"
x = 0.0
y = 0.0
rate = "5 L/s"

[programme]
start_date = "2027-03-01"
duration = "60 days"
output_step = "1 day"
recovery = "5 days"

[[programme.stage]]
name = "Dig to formation"
start = "0 days"
formation_level = "2.5 m"
rate = "as designed"

[uncertainty]
conductivity = "lognormal median 1.1e-4 m/s, factor 1.2"
samples = 20
seed = 3
"#;

fn dig_model() -> Model {
    from_str(Path::new("dig.toml"), DIG).expect("the pit file loads")
}

/// Days to dig on a sampled K: the time a single Theis well (Theis 1935) draws the pit's farthest
/// corner down 3.0 m, from scipy.special.exp1 and brentq (tests/reference/uncertainty_days_to_dig.csv,
/// scripts/reference_days_to_dig.py), to the programme's 1 s bisection (2 s allowed); a K too
/// high for the rate never gets there within the 60 days.
#[test]
fn days_to_dig_match_scipy_theis_times() {
    let model = dig_model();
    let spec = model.uncertainty.clone().unwrap();
    let dig = DigStages::new(&model).expect("the programme sets up");
    assert_eq!(dig.names(), vec!["Dig to formation".to_string()]);
    let text = std::fs::read_to_string("tests/reference/uncertainty_days_to_dig.csv").unwrap();
    let mut never = 0;
    for line in text.lines().skip(1) {
        let (k, t) = line.split_once(',').unwrap();
        let k: f64 = k.parse().unwrap();
        let got = dig.earliest(&apply(&model, &spec, &[k])).unwrap()[0];
        match t.parse::<f64>() {
            Ok(want) => {
                let got = got.expect("ready within the programme");
                assert!(
                    (got - want).abs() <= 2.0,
                    "K {k:e}: {got} s, scipy {want} s"
                );
            }
            Err(_) => {
                assert_eq!(got, None, "K {k:e}: not ready within 60 days");
                never += 1;
            }
        }
    }
    assert_eq!(never, 1);
}

/// The same quantity `drydig programme` reports: on the file's own ground the sampled rule gives
/// the programme's earliest day to the second, and `uncertainty` writes a days column and its
/// percentiles.
#[test]
fn days_to_dig_sampled_in_uncertainty() {
    let model = dig_model();
    let setup = drydig::transient::programme::setup(&model).unwrap();
    let answers = drydig::transient::answers::answer(&model, &setup);
    let dig = DigStages::new(&model).unwrap();
    let quick = dig.earliest(&model).unwrap()[0].unwrap();
    let full = answers.stages[0].earliest.unwrap();
    assert!((quick - full).abs() <= 1.0, "{quick} vs {full}");
    let settings = Settings {
        mode: Mode::Check,
        samples: None,
        seed: None,
        reliability: 0.9,
        rates: drydig::optimise::rates::RateOption::Individual,
    };
    let r = run(&model, settings, &|| {}).unwrap();
    let days = r
        .series
        .iter()
        .find(|s| s.key == "days_to_dig_1")
        .expect("a days series");
    let p = days.percentiles.unwrap();
    // a lower K draws the pit down sooner (9 days at 1e-4 m/s, 47 at 1.25e-4 m/s: the scipy
    // times); the samples of high K not ready within the 60 days are left out and counted
    assert!(p.p10 > 86_400.0 && p.p90 < 60.0 * 86_400.0, "{p:?}");
    let not_ready = r.days_not_ready.as_ref().unwrap()[0].1;
    assert_eq!(not_ready, 20 - p.count);
    assert!(not_ready > 0 && not_ready < 20);
    assert!(p.p10 < p.p50 && p.p50 < p.p90);
    let csv =
        String::from_utf8(drydig::report::uncertainty_text::to_csv(&model, &r).unwrap()).unwrap();
    assert!(csv.lines().next().unwrap().contains("days_to_dig_1"));
}

/// A well past its limit makes a sample not met. The pit's well alone, R fixed at 300 m, its
/// pump intake raised so the lowest allowed level is 3.0 m (2.0 m below the rest level): by
/// Thiem (1906; Kruseman & de Ridder 1994, eq. 3.1; confined, b = 10 m, r_w = 0.15 m), the
/// drawdown at the well face s_w = Q/(2πKb)·ln(R/r_w) is 3.02 m at K = 2e-4 m/s (level 1.98 m,
/// below 3.0 m: past the limit) and 0.60 m at K = 1e-3 m/s (within it; Sichardt's capacity
/// 2π·0.15·10·√K/15 = 8.9 L/s and more, above the 5 L/s).
#[test]
fn a_well_below_its_lowest_level_makes_a_sample_not_met() {
    let text = DIG
        .replace(
            "method = \"sichardt\"\nsichardt_c = 3000",
            "method = \"fixed\"\ndistance = \"300 m\"",
        )
        .replace("pump_intake = \"-9.0 m\"", "pump_intake = \"2.0 m\"");
    let model = from_str(Path::new("limits.toml"), &text).expect("loads");
    let spec = model.uncertainty.clone().unwrap();
    let placement = drydig::field::layout::from_model(&model, None).unwrap();
    let layout = Layout::new(&model, placement.wells);
    let fast = FastCheck::new(&model, &spec, &layout).expect("shortcut applies");
    let thiem = |k: f64| 0.005 / (2.0 * std::f64::consts::PI * k * 10.0) * (300.0_f64 / 0.15).ln();
    assert!((thiem(2e-4) - 3.02).abs() < 0.01 && (thiem(1e-3) - 0.60).abs() < 0.01);
    for (k, ok) in [(2e-4, false), (1e-3, true)] {
        let m = apply(&model, &spec, &[k]);
        let quick = fast.evaluate(&m).expect("R reaches the pit");
        let plain = evaluate_sample(&m, &layout);
        assert_eq!(quick.wells_ok, Some(ok), "K {k:e}: fast");
        assert_eq!(plain.wells_ok, Some(ok), "K {k:e}: plain");
    }
    // 20 samples of K around 1.1e-4 m/s: s_w ≈ 5.5 m, every one past the limit and not met
    let settings = Settings {
        mode: Mode::Check,
        samples: None,
        seed: None,
        reliability: 0.9,
        rates: drydig::optimise::rates::RateOption::Individual,
    };
    let r = run(&model, settings, &|| {}).unwrap();
    assert_eq!(r.wells_past_limit, 20);
    assert_eq!(r.fraction_wells_ok, Some(0.0));
    assert!(r.sample_met.iter().all(|m| !m));
}
