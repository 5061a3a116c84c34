//! Wells as they are built, against outside values: partial penetration in the kernel (the
//! scipy table of checks.md §12), Kozeny's cross-check, Jacob's well loss (§13), the header
//! rule for wellpoint suction (§15), recharge limits, and Jacob's correction in the pumping-test
//! fit (§4).

use drydig::check::evaluate::evaluate;
use drydig::check::run::field_for;
use drydig::field::checkpoints::check_points;
use drydig::field::layout::from_model;
use drydig::input::model::{InfluenceMethod, Model};
use drydig::input::validate::file::from_str;
use std::f64::consts::PI;
use std::path::Path;

fn model(text: &str) -> Model {
    from_str(Path::new("as_built.toml"), text).unwrap_or_else(|e| panic!("{e}"))
}

/// A confined layer 0–20 m (K = 1e-4 m/s, T = 2e-3 m²/s), piezometric level 25 m, one well of
/// radius 0.15 m screened 15–20 m pumping 2 L/s (the well stays confined); the excavation's
/// target is 17.5 m, the elevation the check points are evaluated at.
fn confined_one_well(extra_wells: &str, points: &str) -> String {
    format!(
        r#"
[site]
name = "Partial penetration check"
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
screen_base = "15.0 m"
pump_intake = "15.5 m"
submergence = "0.1 m"
{extra_wells}

[layout]
kind = "listed"

[[well]]
name = "W1"
x = 0.0
y = 0.0
rate = "2 L/s"

[checks]
{points}
"#
    )
}

// checks.md §12 (scipy reference table tests/reference/partial_penetration.csv): screen 15–20 m
// in D = 20 m, r_w = 0.15 m: Δ_w = 9.9420448 in the well; at z = 17.5 m, Δ = 4.9253419 (r = 1 m),
// 1.1579813 (r = 5 m), 0.0084513 (r = 30 m). The kernel adds Q/(2πT)·Δ to Thiem's drawdown.
#[test]
fn kernel_adds_the_partial_penetration_of_the_reference_table() {
    let points = r#"
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
"#;
    let m = model(&confined_one_well("", points));
    let wells = from_model(&m, None).unwrap().wells;
    let field = field_for(&m, &wells);
    assert!(field.has_partial_penetration());
    let r_big = field.radius_of_influence();
    let (q, t) = (0.002, 2e-3);
    let unit = q / (2.0 * PI * t);
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
    assert!(
        (w.drawdown_m - expected).abs() < 1e-9 * expected,
        "well: {} vs {expected}",
        w.drawdown_m
    );
}

// Kozeny (1933), from memory (checks.md §12): Q_pp/Q_full ≈ (l/D)·[1 + 7·√(r_w/(2l))·cos(πl/(2D))]
// = 0.448 for l = 5 m, D = 20 m, r_w = 0.15 m; the series gives 0.420 with R = 200 m. The two
// methods differ by a few per cent: within 10 %.
#[test]
fn partial_penetration_agrees_with_kozeny_within_ten_per_cent() {
    let m = model(&confined_one_well("", ""));
    let wells = from_model(&m, None).unwrap().wells;
    let field = field_for(&m, &wells);
    let r_big = field.radius_of_influence();
    // the same well drawdown with R = 200 m: ratio ln(R/r_w)/(ln(R/r_w) + Δ_w), Δ_w from the kernel
    let row = field.unit_row(wells[0].position)[0];
    let delta_w = -2.0 * PI * row - (r_big / 0.15).ln();
    let ratio = (200.0_f64 / 0.15).ln() / ((200.0_f64 / 0.15).ln() + delta_w);
    let (l, d, rw) = (5.0_f64, 20.0_f64, 0.15_f64);
    let kozeny = l / d * (1.0 + 7.0 * (rw / (2.0 * l)).sqrt() * (PI * l / (2.0 * d)).cos());
    assert!((kozeny - 0.448).abs() < 1e-3, "{kozeny}");
    assert!((ratio - 0.420).abs() < 1e-3, "{ratio}");
    assert!((ratio / kozeny - 1.0).abs() < 0.10);
}

// checks.md §13: Jacob (1947), Q = 0.02 m³/s, C = 1 900 s²/m⁵ → 0.76 m of well loss, in the well
// only: the level in the well is the aquifer level at its screen face less 0.76 m.
#[test]
fn jacob_well_loss_lowers_the_level_in_the_well_only() {
    let text = confined_one_well("loss_coefficient = 1900", "")
        .replace("2 L/s", "20 L/s")
        .replace("1e-4 m/s", "1e-3 m/s");
    let m = model(&text);
    let wells = from_model(&m, None).unwrap().wells;
    let field = field_for(&m, &wells);
    let e = evaluate(&m, &field, &wells, &check_points(&m));
    let w = &e.wells[0];
    assert!((w.well_loss_m - 0.76).abs() < 1e-12, "{}", w.well_loss_m);
    let face = w.aquifer_level_m.unwrap();
    assert!((face - w.level_m.unwrap() - 0.76).abs() < 1e-9);
    // an efficiency E: drawdown in the well = aquifer drawdown / E (definition; Kruseman & de
    // Ridder 1994, ch. 14)
    let m = model(&confined_one_well("efficiency = 0.8", ""));
    let wells = from_model(&m, None).unwrap().wells;
    let field = field_for(&m, &wells);
    let e = evaluate(&m, &field, &wells, &check_points(&m));
    let w = &e.wells[0];
    let s_face = 25.0 - w.aquifer_level_m.unwrap();
    assert!((w.drawdown_m - s_face / 0.8).abs() < 1e-9);
}

// checks.md §15 (common practice): one suction stage lifts the water about 5–6 m below the
// header, measured from the header level down to the water in the wellpoint. With the header at
// 11.8 m and a 5.5 m limit, the lowest level is 6.3 m in check, design and estimate alike.
#[test]
fn suction_is_measured_from_the_header() {
    let text = std::fs::read_to_string("layouts/pipeline_trench.toml").unwrap();
    let m = model(&text);
    assert!((m.as_built.suction_floor(m.wells.suction_limit) - 6.3).abs() < 1e-12);
    let wells = from_model(&m, None).unwrap().wells;
    let field = field_for(&m, &wells);
    let e = evaluate(&m, &field, &wells, &check_points(&m));
    assert!(e
        .wells
        .iter()
        .all(|w| (w.lowest_allowed_level_m - 6.3).abs() < 1e-12));
    let est = drydig::estimate::estimate(&m);
    assert!(est.excavations[0].notes.iter().any(|n| {
        drydig::report::estimate_text::note_words(n, drydig::input::units::UnitSystem::Si)
            .contains("6.30 m (header 11.80 m − suction limit 5.50 m)")
    }));
}

// Recharge limits (checks.md §15, common practice (no source)): an injection well takes about a
// half of what it would give; its level stays below ground. A well injecting far more than that
// is reported, with both limits.
#[test]
fn recharge_wells_are_held_to_their_capacity_and_level() {
    let text = confined_one_well("", "").replace("rate = \"2 L/s\"", "rate = \"-30 L/s\"");
    let m = model(&text);
    let wells = from_model(&m, None).unwrap().wells;
    let field = field_for(&m, &wells);
    let e = evaluate(&m, &field, &wells, &check_points(&m));
    let w = &e.wells[0];
    let inj = w.injection_capacity_m3_per_s.unwrap();
    // Sichardt on the full 5 m screen: 2π·0.15·√1e-4/15·5 = 1.5708e-3 m³/s; half of it
    assert!((inj - 0.5 * 2.0 * PI * 0.15 * 1e-2 / 15.0 * 5.0).abs() < 1e-12);
    assert!((w.highest_allowed_level_m.unwrap() - 29.0).abs() < 1e-12);
    use drydig::check::evaluate::WellProblem;
    assert!(w.problems.iter().any(|p| matches!(
        p,
        WellProblem::OverInjectionCapacity { capacity, .. } if (capacity - inj).abs() < 1e-15
    )));
    assert!(w.problems.iter().any(|p| matches!(
        p,
        WellProblem::AboveHighestRechargeLevel { highest, .. } if (highest - 29.0).abs() < 1e-12
    )));
    assert!(!e.wells_ok);
}

// checks.md §4 (anaflow 1.2.0): Dupuit–Thiem with H = 20 m, K = 1e-4 m/s, Q = 0.01 m³/s,
// R = 200 m. Exact unconfined drawdowns at 10 m and 50 m; the fitted distance of influence must
// be R = 200 m after Jacob's correction (8 % short without it) and T = K·H.
#[test]
fn pumping_test_fit_applies_jacobs_correction() {
    let (h, k, q, r_big) = (20.0_f64, 1e-4_f64, 0.01_f64, 200.0_f64);
    let s_at = |r: f64| h - (h * h - q / (PI * k) * (r_big / r).ln()).sqrt();
    assert!((s_at(10.0) - 2.54598).abs() < 1e-5);
    let text = format!(
        r#"
[site]
name = "Jacob correction"
ground_level = "21.0 m"

[aquifer]
kind = "unconfined"
conductivity = "1e-4 m/s"
base_level = "0.0 m"
groundwater_level = "20.0 m"

[[excavation]]
name = "Pit"
outline = [[0, 0], [10, 0], [10, 10], [0, 10]]
formation_level = "18.0 m"
target_margin = "0.5 m"

[influence]
method = "pumping-test"
[influence.test]
rate = "10 L/s"
[[influence.test.observation]]
distance = "10 m"
drawdown = "{:.9} m"
[[influence.test.observation]]
distance = "50 m"
drawdown = "{:.9} m"
"#,
        s_at(10.0),
        s_at(50.0)
    );
    let m = model(&text);
    let InfluenceMethod::PumpingTest {
        radius,
        transmissivity,
    } = m.influence
    else {
        panic!("not a pumping test");
    };
    assert!((radius / r_big - 1.0).abs() < 1e-6, "R = {radius}");
    assert!((transmissivity / (k * h) - 1.0).abs() < 1e-6);
}

// The block sum of the map (Field::levels) is a shortcut: with the partial-penetration term it
// must equal the per-point R-tree sum (Field::level) on the pipeline demo, wells among the points.
#[test]
fn map_levels_with_partial_penetration_equal_the_plain_sum() {
    // a ring of 24 wells 12 m across (every source within the radius of influence: the block
    // path), and the pipeline demo (sources beyond it: the R-tree path)
    let ring: String = (0..24)
        .map(|k| {
            let a = k as f64 * std::f64::consts::TAU / 24.0;
            format!(
                "[[well]]\nname = \"R{k}\"\nx = {:.4}\ny = {:.4}\nrate = \"0.3 L/s\"\n",
                12.0 * a.cos(),
                12.0 * a.sin()
            )
        })
        .collect();
    let ring_text = confined_one_well("", "").replace("[checks]", &format!("{ring}\n[checks]"));
    for (text, span) in [
        (ring_text, [-40.0, 80.0, -40.0, 80.0]),
        (
            std::fs::read_to_string("layouts/pipeline_trench.toml").unwrap(),
            [-30.0, 460.0, -25.0, 50.0],
        ),
    ] {
        check_map_levels(&model(&text), span);
    }
}

fn check_map_levels(m: &Model, span: [f64; 4]) {
    let wells = from_model(m, None).unwrap().wells;
    let field = field_for(m, &wells);
    assert!(field.has_partial_penetration());
    let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();
    let mut pts: Vec<[f64; 2]> = (0..3000)
        .map(|i| {
            let t = i as f64;
            [
                span[0] + (t * 0.1527 * span[1] / 460.0) % span[1],
                span[2] + (t * 7.31) % span[3],
            ]
        })
        .collect();
    pts.extend(wells.iter().take(50).map(|w| w.position));
    let fast = field.levels(&pts, &rates);
    for (p, lv) in pts.iter().zip(fast) {
        let a = lv.or_base(2.0);
        let b = field.level(*p, &rates).or_base(2.0);
        assert!((a - b).abs() < 1e-9, "{p:?}: {a} vs {b}");
    }
}

// Jacob's loss in the linear programme (checks.md §13: loss C·Q²): the chords of the loss floor
// are safe, so the least-flow rates, re-evaluated by the plain sum with the loss, keep every
// well at or above its lowest level; with a large C (a clogged well, above Walton's 3 800 s²/m⁵)
// the loss is what binds, and it costs flow against the same wells without it.
#[test]
fn well_loss_in_the_programme_is_safe_and_binds() {
    use drydig::optimise::rates::LayoutRates;
    let base = |extra: &str| {
        format!(
            r#"
[site]
name = "Loss pit"
ground_level = "1.0 m"

[aquifer]
kind = "unconfined"
conductivity = "2e-4 m/s"
base_level = "-12.0 m"
groundwater_level = "0.0 m"

[[excavation]]
name = "Pit"
outline = [[0, 0], [20, 0], [20, 12], [0, 12]]
formation_level = "-4.0 m"
target_margin = "0.5 m"

[influence]
method = "fixed"
distance = "150 m"

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "-1.0 m"
screen_base = "-12.0 m"
pump_intake = "-7.0 m"
submergence = "1.0 m"
{extra}

[layout]
kind = "ring"
offset = "2 m"
count = 10
"#
        )
    };
    let flow = |extra: &str| {
        let m = model(&base(extra));
        let points = check_points(&m);
        let placement = from_model(&m, None).unwrap();
        let rates = LayoutRates::new(&m, &points, placement.wells);
        let ind = rates.individual();
        assert!(ind.met, "{extra}: {:?}", ind.status);
        let e = rates.evaluate(&ind.rates);
        for w in &e.wells {
            assert!(
                w.level_m.unwrap() >= w.lowest_allowed_level_m - 1e-3,
                "{}",
                w.name
            );
        }
        (ind.total, ind.binding, e)
    };
    let (q0, _, _) = flow("");
    let (q1, binding, e) = flow("loss_coefficient = 100000");
    assert!(
        binding.iter().any(|b| matches!(
            b,
            drydig::optimise::binding::Binding::WellLevel {
                loss: drydig::optimise::binding::LevelLoss::Jacob,
                ..
            }
        )),
        "{binding:?}"
    );
    assert!(e.wells.iter().any(|w| w.well_loss_m > 0.5));
    assert!(q1 >= q0 - 1e-9, "{q1} vs {q0}");
}
