//! A relief excavation (`control = "relieve"`, the `deep_shaft` demo: a shaft in clay over a
//! confined sand) is designed to the relief head, not to formation − margin: the quick estimate
//! sizes for it, and the map and section show it, labelled as the relief head.
//!
//! The relief head is computed here by hand from the total-stress uplift check (CIRIA C750
//! *Groundwater control*, and the UPL limit state of EN 1997-1 — from memory): factor of safety =
//! weight of soil above the confined layer / water pressure at its top,
//! FoS = γ·(z_formation − z_top) / (γ_w·(h − z_top)), so h_req = z_top + γ·(z_f − z_top)/(γ_w·FoS).

use std::path::PathBuf;
use std::process::Command;

fn shaft() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("layouts/deep_shaft.toml")
}

/// h_req of the demo by hand: layer top 2.0 m, formation 4.5 m, γ = 20 kN/m³, γ_w = 9.81 kN/m³
/// (fresh water), FoS 1.2: 2.0 + 20·2.5/(9.81·1.2) = 6.2474 m.
const RELIEF_HEAD: f64 = 2.0 + 20.0 * 2.5 / (9.81 * 1.2);
/// Piezometric level of the confined layer before pumping (the demo's 17.5 m).
const INITIAL_HEAD: f64 = 17.5;

#[test]
fn the_estimate_sizes_a_relief_shaft_for_the_relief_head() {
    let m = drydig::input::validate::file::load(&shaft()).expect("demo loads");
    let est = drydig::estimate::estimate(&m);
    let e = &est.excavations[0];
    assert!(e.relief_head);
    assert!(
        (e.target_level_m - RELIEF_HEAD).abs() < 1e-9,
        "{}",
        e.target_level_m
    );
    // 17.5 − 6.2474 = 11.25 m, not 17.5 − (4.5 − 1.0) = 14.0 m to formation − margin.
    assert!(
        (e.drawdown_m - (INITIAL_HEAD - RELIEF_HEAD)).abs() < 1e-9,
        "{}",
        e.drawdown_m
    );
    assert!((e.drawdown_m - 11.2526).abs() < 1e-4);
}

#[test]
fn map_and_section_show_the_relief_head() {
    let dir = tempfile::tempdir().expect("temp dir");
    let out = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .arg("check")
        .arg(shaft())
        .arg("-o")
        .arg(dir.path())
        .output()
        .expect("drydig runs");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let read = |f: &str| std::fs::read_to_string(dir.path().join(f)).expect(f);
    let label = format!("{RELIEF_HEAD:.2}");
    let map = read("map.svg");
    assert!(
        map.contains(&format!("relief head ≤ {label} m")),
        "map label"
    );
    assert!(
        !map.contains("target ≤ 3.50 m"),
        "no dewatering target on the map"
    );
    let section = read("section.svg");
    assert!(
        section.contains(&format!("relief head {label} m")),
        "section label"
    );
    assert!(
        !section.contains("target 3.50 m"),
        "no dewatering target on the section"
    );
    // The machine files carry the same level: the excavation's target in layout.geojson and
    // summary.json is the relief head, flagged as such.
    let layout: serde_json::Value = serde_json::from_str(&read("layout.geojson")).expect("json");
    let exc = layout["features"]
        .as_array()
        .expect("features")
        .iter()
        .find(|f| f["properties"]["kind"] == "excavation")
        .expect("the shaft");
    let t = exc["properties"]["target_level_m"]
        .as_f64()
        .expect("target");
    assert!((t - RELIEF_HEAD).abs() < 1e-4, "layout.geojson target {t}");
    assert_eq!(exc["properties"]["target_is_relief_head"], true);
    let summary: serde_json::Value = serde_json::from_str(&read("summary.json")).expect("json");
    let t = summary["excavations"][0]["target_level_m"]
        .as_f64()
        .or_else(|| summary["inputs"]["excavations"][0]["target_level_m"].as_f64())
        .expect("summary target");
    assert!((t - RELIEF_HEAD).abs() < 1e-9, "summary.json target {t}");
}

/// Theis well function W(u) = E₁(u): for u < 1 its series −γ − ln u − Σ (−u)ᵏ/(k·k!) (Abramowitz
/// & Stegun, *Handbook of Mathematical Functions*, eq. 5.1.11), for u ≥ 1 their rational
/// approximation 5.1.56, u·eᵘ·E₁(u) = (u² + 2.334733u + 0.250621)/(u² + 3.330657u + 1.681534),
/// error below 5e-5 relative.
fn theis_w(u: f64) -> f64 {
    if u >= 1.0 {
        let ratio = (u * u + 2.334_733 * u + 0.250_621) / (u * u + 3.330_657 * u + 1.681_534);
        return ratio * (-u).exp() / u;
    }
    let mut sum = 0.0;
    let mut term = 1.0;
    for k in 1..40 {
        term *= -u / k as f64;
        sum += term / k as f64;
    }
    -0.577_215_664_901_532_9 - u.ln() - sum
}

/// Time to flood for a relief shaft is the time to factor of safety 1.0 against uplift. Checked by
/// hand: with every pump stopped at the failure moment t_f after pumping Q from day 0, Theis
/// recovery (superposition of a recharge well from t_f; Theis 1935) leaves at the point
/// s′ = Σ Q/(4πT)·[W(r²S/(4T(t_f+Δ))) − W(r²S/(4TΔ))]; at the reported Δ the head h₀ − s′ must
/// give FoS = γ·(z_f − z_top)/(γ_w·(h − z_top)) = 1.0.
#[test]
fn time_to_flood_of_a_relief_shaft_is_the_time_to_uplift_factor_one() {
    let text = std::fs::read_to_string(shaft()).expect("demo") + PROGRAMME;
    let m = drydig::input::validate::file::from_str(std::path::Path::new("shaft.toml"), &text)
        .expect("demo with a programme loads");
    let setup = drydig::transient::programme::setup(&m).expect("programme set up");
    let a = drydig::transient::answers::answer(&m, &setup);
    let f = a.flood.expect("a failure moment");
    assert!(f.relief);
    // The head at FoS 1.0 by hand: 2.0 + 20·2.5/9.81 = 7.0968 m (initial level = piezometric).
    let h1 = 2.0 + 20.0 * 2.5 / 9.81;
    assert!(
        (f.formation_level - h1).abs() < 1e-9,
        "{}",
        f.formation_level
    );
    let dt = f.all_off.expect("the base would lift within the search");
    let points = drydig::field::checkpoints::check_points(&m);
    let p = points
        .iter()
        .find(|p| p.name == f.point)
        .expect("the point")
        .position;
    // T = K·(top − base) = 1e-4·14 m²/s, S = 2e-4, Q = 6 L/s per well, six wells.
    let (t, s) = (1e-4 * 14.0, 2e-4);
    let residual = |delta: f64| -> f64 {
        setup
            .wells
            .iter()
            .map(|w| {
                let r2 = (w.position[0] - p[0]).powi(2) + (w.position[1] - p[1]).powi(2);
                let u = |time: f64| r2 * s / (4.0 * t * time);
                0.006 / (4.0 * std::f64::consts::PI * t)
                    * (theis_w(u(f.moment + delta)) - theis_w(u(delta)))
            })
            .sum()
    };
    // The hand time to FoS 1.0: the residual falls to h₀ − h₁ (bisection on the formula above).
    let (mut lo, mut hi) = (1e-3_f64, 30.0 * 86_400.0_f64);
    for _ in 0..200 {
        let mid = (lo * hi).sqrt();
        if residual(mid) > INITIAL_HEAD - h1 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    let fos = |delta: f64| 20.0 * 2.5 / (9.81 * (INITIAL_HEAD - residual(delta) - 2.0));
    // The programme finds crossings by bisection to 1 s; a confined layer of S = 2e-4 recovers
    // within seconds, so the shaft's base would lift a few seconds after the pumps stop.
    assert!(
        (dt - hi).abs() <= 1.0,
        "programme {dt:.2} s, by hand {hi:.2} s (FoS there {:.4}), failure on day {:.3}",
        fos(dt),
        f.moment / 86_400.0
    );
    assert!((fos(hi) - 1.0).abs() < 1e-6);
}

const PROGRAMME: &str = r#"
[programme]
start_date = "2027-03-01"
duration = "10 days"
output_step = "1 day"
recovery = "2 days"

[[programme.stage]]
name = "Sink to formation"
start = "0 days"
formation_level = "4.5 m"
rate = "6 L/s"
"#;

/// `control = "both"` in time: the stage floods at the lower of formation and the head at uplift
/// FoS 1.0 (as a field level), as the steady design takes the lower of the two targets. With the
/// confined layer's piezometric level 7.5 m above the pumped aquifer's water level (an artesian
/// layer, invented), the uplift level h₁ = 2.0 + 20·2.5/9.81 = 7.0968 m lies at
/// 17.5 − (25.0 − 7.0968) = −0.4032 m as a field level, below formation (4.5 m), so uplift
/// governs the flood (hand computation with the formula in the module docs).
#[test]
fn a_both_controlled_stage_floods_at_the_lower_of_formation_and_uplift() {
    let text = std::fs::read_to_string(shaft())
        .expect("demo")
        .replace("control = \"relieve\"", "control = \"both\"")
        .replace(
            "piezometric_level = \"17.5 m\"",
            "piezometric_level = \"25.0 m\"",
        )
        + PROGRAMME;
    let m = drydig::input::validate::file::from_str(std::path::Path::new("shaft.toml"), &text)
        .expect("demo with a programme loads");
    let setup = drydig::transient::programme::setup(&m).expect("programme set up");
    let a = drydig::transient::answers::answer(&m, &setup);
    let f = a.flood.expect("a failure moment");
    let h1_field = INITIAL_HEAD - (25.0 - (2.0 + 20.0 * 2.5 / 9.81));
    assert!(f.relief, "uplift governs");
    assert!(
        (f.formation_level - h1_field).abs() < 1e-9,
        "flood level {} m, by hand {h1_field} m",
        f.formation_level
    );
}
