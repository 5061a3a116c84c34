//! Neighbours, base uplift and recharge, checked against values from outside the project:
//! `../shared/checks.md` §10 (Terzaghi one-dimensional consolidation; Das, *Principles of
//! Foundation Engineering*), the hand formula of the total-stress uplift check, the Thiem
//! equation for the effect of one recharge well, and the exit codes of the design notes (§4).

use drydig::check::run::{evaluate_placement, field_for};
use drydig::field::checkpoints::{check_points, PointKind};
use drydig::field::layout;
use drydig::input::model::{Compressibility, SoilLayer};
use drydig::input::validate::file as model;
use drydig::physics::uplift;
use drydig::safety::limit_check::LimitQuantity;
use drydig::safety::neighbours::{self, Status};
use drydig::safety::settlement::{self, StressForm};
use serde_json::Value;
use std::f64::consts::PI;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn layer(name: &str, thickness: f64, c: Compressibility) -> SoilLayer {
    SoilLayer {
        name: name.into(),
        thickness,
        compressibility: c,
        unit_weight: None,
        moist_unit_weight: None,
        drains_above_water_table: false,
        consolidation: None,
    }
}

fn drydig(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs")
}

fn text(b: &[u8]) -> String {
    String::from_utf8_lossy(b).into_owned()
}

fn tmp_dir(tag: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("drydig-neighbours-{tag}-{}", std::process::id()));
    std::fs::create_dir_all(&d).expect("temp dir");
    d
}

/// `drydig check` on a demo in layouts/ with `extra` arguments into `out`: its terminal text
/// (exit 0, or 3 when a limit is not met).
fn check_demo(name: &str, extra: &[&str], out: &std::path::Path) -> String {
    let file = layouts(name);
    let mut args = vec!["check", file.to_str().expect("utf-8")];
    args.extend_from_slice(extra);
    args.extend(["-o", out.to_str().expect("utf-8")]);
    let run = drydig(&args);
    assert!(
        matches!(run.status.code(), Some(0) | Some(3)),
        "{}",
        text(&run.stderr)
    );
    text(&run.stdout)
}

fn layouts(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn summary(out: &Path) -> Value {
    let bytes = std::fs::read(out.join("summary.json")).expect("summary.json written");
    serde_json::from_slice(&bytes).expect("summary.json is JSON")
}

// ------------------------------------------------------------------ checks.md §10 settlement

// checks.md §10 (Terzaghi 1D consolidation, from memory): m_v = 5e-4 1/kPa, H = 4 m of clay,
// Δh = 3 m, γ_w = 9.81 kN/m³ → Δσ′ = 29.43 kPa, ρ = 58.9 mm.
#[test]
fn mv_form_matches_checks_md_section_10() {
    let dsigma = settlement::stress_increase_simple(3.0);
    assert!((dsigma - 29.43).abs() < 1e-9, "Δσ′ = {dsigma}");
    let rho = settlement::settlement_mv(5e-4, dsigma, 4.0);
    assert!((rho * 1e3 - 58.9).abs() < 0.05, "ρ = {} mm", rho * 1e3);
    // The same clay as a soil column wholly below the lowered water level (layer from −3 m to
    // −7 m, water from 0 m to −3 m): the column integration gives the same 58.9 mm.
    let col = settlement::column(
        &[layer("clay", 4.0, Compressibility::Mv(5e-4))],
        -3.0,
        0.0,
        -3.0,
        StressForm::Simple,
    );
    assert!(
        (col.total * 1e3 - 58.9).abs() < 0.05,
        "column ρ = {} mm",
        col.total * 1e3
    );
}

// checks.md §10 (Terzaghi; C_c form, from memory): C_c = 0.3, e₀ = 0.9, σ′₀ = 60 kPa, H = 4 m,
// Δσ′ = 29.43 kPa → ρ = C_c·H/(1 + e₀)·log₁₀((σ′₀ + Δσ′)/σ′₀) = 109.5 mm.
#[test]
fn cc_form_matches_checks_md_section_10() {
    let rho = settlement::settlement_cc(0.3, 0.9, 60.0, 29.43, 4.0);
    assert!((rho * 1e3 - 109.5).abs() < 0.05, "ρ = {} mm", rho * 1e3);
    let col = settlement::column(
        &[layer(
            "soft clay",
            4.0,
            Compressibility::Cc {
                cc: 0.3,
                e0: 0.9,
                sigma0: 60.0,
                sigma_p: 60.0,
                cr: 0.0,
            },
        )],
        -3.0,
        0.0,
        -3.0,
        StressForm::Simple,
    );
    assert!(
        (col.total * 1e3 - 109.5).abs() < 0.05,
        "column ρ = {} mm",
        col.total * 1e3
    );
}

// checks.md §10, Das, *Principles of Foundation Engineering* (library-computed answer): 10 m of
// sand over clay, water table lowered from 1 m to 3 m below ground, γ_moist = 17, γ_sat = 20
// kN/m³ → Δσ′ at the top of the clay 13.62 kPa with the buoyancy loss, 19.62 kPa from γ_w·Δh.
#[test]
fn das_buoyancy_loss_case() {
    assert!((settlement::stress_increase_buoyancy_loss(2.0, 20.0, 17.0) - 13.62).abs() < 1e-9);
    assert!((settlement::stress_increase_simple(2.0) - 19.62).abs() < 1e-9);
    // The same profile through the column: ground at 0, sand 10 m (incompressible), then a thin
    // clay layer whose settlement divided by m_v·Δz is the Δσ′ at the top of the clay.
    let sand = SoilLayer {
        name: "sand".into(),
        thickness: 10.0,
        compressibility: Compressibility::Incompressible,
        unit_weight: Some(20.0),
        moist_unit_weight: Some(17.0),
        drains_above_water_table: true,
        consolidation: None,
    };
    let clay = SoilLayer {
        name: "clay".into(),
        thickness: 0.01,
        compressibility: Compressibility::Mv(1e-3),
        unit_weight: Some(19.0),
        moist_unit_weight: Some(19.0),
        drains_above_water_table: false,
        consolidation: None,
    };
    let profile = [sand, clay];
    for (form, expected) in [
        (StressForm::BuoyancyLoss, 13.62),
        (StressForm::Simple, 19.62),
    ] {
        let col = settlement::column(&profile, 0.0, -1.0, -3.0, form);
        let dsigma = col.total / (1e-3 * 0.01);
        assert!(
            (dsigma - expected).abs() < 1e-6,
            "{form:?}: Δσ′ = {dsigma} kPa, expected {expected}"
        );
    }
}

// ------------------------------------------------------------------ base uplift

const SHAFT_SOURCE: &str = "hand formula of the total-stress uplift check, FoS = γ·D/(γ_w·(h_p − z_top)), h_req = z_top + γ·D/(γ_w·FoS_req) (CIRIA C750 Groundwater control, and the UPL check of EN 1997-1 — from memory)";

// deep_shaft.toml: formation 4.5 m, confined layer top 2.0 m, γ = 20 kN/m³, h_p = 17.5 m,
// FoS_req = 1.2. By hand: σ_v = 20 × 2.5 = 50 kPa; u = 9.81 × 15.5 = 152.055 kPa;
// FoS = 50/152.055 = 0.32883; h_req = 2.0 + 50/(9.81 × 1.2) = 6.24737 m.
#[test]
fn uplift_of_the_shaft_by_hand_formula() {
    let sigma = uplift::overburden(20.0, 4.5, 2.0);
    assert!((sigma - 50.0).abs() < 1e-12, "{SHAFT_SOURCE}");
    let fos = uplift::factor_of_safety(sigma, 17.5, 2.0).expect("pressure above the layer top");
    assert!((fos - 0.32883).abs() < 1e-5, "FoS {fos}: {SHAFT_SOURCE}");
    let h = uplift::required_head(sigma, 2.0, 1.2);
    assert!((h - 6.24737).abs() < 1e-5, "h_req {h}: {SHAFT_SOURCE}");
    // No pressure at all when the head is at the layer top.
    assert!(uplift::factor_of_safety(sigma, 2.0, 2.0).is_none());

    // Through the binary: summary.json carries the same numbers.
    let out = tmp_dir("shaft");
    let run = drydig(&[
        "check",
        layouts("deep_shaft.toml").to_str().expect("utf-8 path"),
        "-o",
        out.to_str().expect("utf-8 path"),
    ]);
    assert!(
        matches!(run.status.code(), Some(0) | Some(3)),
        "{}",
        text(&run.stderr)
    );
    let s = summary(&out);
    let u = &s["uplift"][0];
    let get = |k: &str| u[k].as_f64().unwrap_or(f64::NAN);
    assert!(
        (get("factor_of_safety_before") - 0.32883).abs() < 1e-5,
        "{u}"
    );
    assert!((get("required_head_m") - 6.24737).abs() < 1e-5, "{u}");
    assert!((get("overburden_kpa") - 50.0).abs() < 1e-9, "{u}");
    let stdout = text(&run.stdout);
    assert!(stdout.contains("base uplift"), "{stdout}");
    assert!(stdout.contains("6.25"), "{stdout}");
}

// Where h_req is the stricter target it reaches the check points (and so the optimiser).
// Hand values: γ = 18 kN/m³, D = 4.5 − 2.0 = 2.5 m, FoS_req = 2.0 → h_req = 2.0 + 45/19.62 =
// 4.29358 m, below the excavation target 4.4 m ({SHAFT_SOURCE}).
#[test]
fn uplift_head_becomes_the_check_point_target_where_it_governs() {
    let text = include_str!("../layouts/deep_shaft.toml")
        .replace(
            "soil_unit_weight = \"20 kN/m3\"",
            "soil_unit_weight = \"18 kN/m3\"",
        )
        .replace("factor_of_safety = 1.2", "factor_of_safety = 2.0")
        .replace("target_margin = \"1.0 m\"", "target_margin = \"0.1 m\"");
    let m = model::from_str(Path::new("uplift_governs.toml"), &text).expect("valid design");
    let pts = check_points(&m);
    let up: Vec<_> = pts.iter().filter(|p| p.kind == PointKind::Uplift).collect();
    assert!(!up.is_empty(), "uplift points added");
    let h_req: f64 = 2.0 + 18.0 * 2.5 / (9.81 * 2.0);
    assert!((h_req - 4.29358).abs() < 1e-5);
    for p in &up {
        let t = p.target_level.expect("uplift points carry a target");
        assert!((t - h_req).abs() < 1e-9, "{}: {t}", p.name);
    }
    // Every excavation point has an uplift twin at the same place.
    let exc = pts
        .iter()
        .filter(|p| p.excavation == Some(0) && p.kind != PointKind::Uplift)
        .count();
    assert!(up.len() >= exc, "{} uplift points for {exc}", up.len());
}

// ------------------------------------------------------------------ recharge by superposition

/// A confined aquifer (head stays above its top, so head is linear in the rates and Thiem holds
/// exactly): T = K·b = 1e-4 × 20 = 2e-3 m²/s. Fixed distance of influence L₀ = 300 m; the group
/// radius R = r_e + L₀ with r_e = √(A/π) = √(400/π) = 11.2838 m for the 20 m × 20 m pit
/// (common practice (no source) for the group radius; r_e is the area form of checks.md §7).
fn confined_design(recharge_rate: &str, extra_neighbour: &str) -> String {
    format!(
        r#"
[site]
name = "Recharge superposition test"
ground_level = "12 m"

[aquifer]
kind = "confined"
conductivity = "1e-4 m/s"
base_level = "-20 m"
top_level = "0 m"
groundwater_level = "10 m"
storativity = 1e-4

[[excavation]]
name = "Pit"
outline = [[0, 0], [20, 0], [20, 20], [0, 20]]
formation_level = "8.5 m"
target_margin = "0.5 m"

[influence]
method = "fixed"
distance = "300 m"

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "0 m"        # the whole confined thickness: fully penetrating, so Thiem holds
screen_base = "-20 m"
pump_intake = "-18 m"
submergence = "1 m"

[layout]
kind = "listed"

[[well]]
name = "A1"
x = -2
y = -2
rate = "4 L/s"

[[well]]
name = "A2"
x = 22
y = -2
rate = "4 L/s"

[[well]]
name = "A3"
x = 22
y = 22
rate = "4 L/s"

[[well]]
name = "A4"
x = -2
y = 22
rate = "4 L/s"

[[well]]
name = "R1"
x = 33
y = 10
rate = "{recharge_rate}"

[[neighbour]]
name = "House"
footprint = [[36, 4], [46, 4], [46, 16], [36, 16]]
foundation_level = "11 m"
allowable_drawdown = "2.0 m"
protect_with_recharge = true
{extra_neighbour}
"#
    )
}

const T: f64 = 1e-4 * 20.0;

fn radius_of_influence() -> f64 {
    (400.0f64 / PI).sqrt() + 300.0
}

/// Thiem (1906), the form of design.md §2 / checks.md §3: the drawdown change one well of rate
/// Q (negative: recharge) makes at distance r, s = Q/(2πT)·ln(R/r).
fn thiem(q: f64, r: f64) -> f64 {
    q / (2.0 * PI * T) * (radius_of_influence() / r).ln()
}

// Recharge wells reduce drawdown at the protected building exactly as superposition says: the
// change at every corner equals the Thiem drawdown of the recharge well alone at that corner.
#[test]
fn recharge_reduces_drawdown_by_the_thiem_amount() {
    let m = model::from_str(
        Path::new("recharge_test.toml"),
        &confined_design("-3 L/s", ""),
    )
    .expect("valid design");
    let placement = layout::from_model(&m, None).expect("listed wells");
    let with: Vec<f64> = placement.wells.iter().map(|w| w.rate).collect();
    let without: Vec<f64> = placement.wells.iter().map(|w| w.rate.max(0.0)).collect();
    let field = field_for(&m, &placement.wells);
    assert!((field.radius_of_influence() - radius_of_influence()).abs() < 1e-6);
    let a = neighbours::assess(&m, &field, &without);
    let b = neighbours::assess(&m, &field, &with);
    let q_r = -3e-3;
    let r1 = [33.0, 10.0];
    for (ca, cb) in a[0].corners.iter().zip(&b[0].corners) {
        let r = (ca.position[0] - r1[0]).hypot(ca.position[1] - r1[1]);
        let expected = thiem(q_r, r);
        let change = cb.drawdown_m - ca.drawdown_m;
        assert!(change < 0.0, "recharge must reduce drawdown at {}", ca.name);
        assert!(
            (change - expected).abs() < 1e-9,
            "{}: change {change} m, Thiem {expected} m",
            ca.name
        );
    }
}

// `check --size-recharge` sizes R1 so the house keeps within 0.45 m while the pit meets its
// target; the house's corner drawdowns with and without the sized recharge differ by the Thiem
// drawdown of R1 alone at its reported rate.
#[test]
fn sized_recharge_holds_the_house_and_follows_thiem() {
    let dir = tmp_dir("sized");
    let design = dir.join("design.toml");
    std::fs::write(&design, confined_design("-6 L/s", "")).expect("write design");
    let d = design.to_str().expect("utf-8 path");
    let plain_out = dir.join("plain");
    let sized_out = dir.join("sized");
    // Listed rates as they stand (6 L/s of recharge): computed; exit 0 or 3 depending on targets.
    let plain = drydig(&["check", d, "-o", plain_out.to_str().expect("utf-8")]);
    assert!(
        matches!(plain.status.code(), Some(0) | Some(3)),
        "{}",
        text(&plain.stderr)
    );
    let sized = drydig(&[
        "check",
        d,
        "--size-recharge",
        "-o",
        sized_out.to_str().expect("utf-8"),
    ]);
    assert_eq!(
        sized.status.code(),
        Some(0),
        "{}\n{}",
        text(&sized.stdout),
        text(&sized.stderr)
    );
    let s = summary(&sized_out);
    let rs = &s["recharge_sizing"];
    assert_eq!(rs["feasible"], Value::Bool(true), "{rs}");
    let q = rs["wells"][0]["rate_m3_per_s"].as_f64().expect("rate");
    assert!(q > 0.0 && q <= 6e-3 + 1e-12, "injection {q}");
    let net = rs["net_flow_m3_per_s"].as_f64().expect("net flow");
    assert!((net - (16e-3 - q)).abs() < 1e-9, "net flow {net}");
    let house = &s["neighbours"][0];
    let worst = house["worst_drawdown"]["drawdown_m"]
        .as_f64()
        .expect("drawdown");
    assert!(worst <= 2.0 + 1e-3, "house drawdown {worst}");
    assert_eq!(house["status"], Value::String("close".into()), "{house}");
    // Plain run, recharge at 6 L/s: the difference at each corner is Thiem for 6 − q L/s.
    let p = summary(&plain_out);
    let pc = p["neighbours"][0]["corners"].as_array().expect("corners");
    let sc = house["corners"].as_array().expect("corners");
    for (a, b) in pc.iter().zip(sc) {
        let x = a["position"][0].as_f64().expect("x");
        let y = a["position"][1].as_f64().expect("y");
        let r = (x - 33.0).hypot(y - 10.0);
        let expected = thiem(-(6e-3 - q), r);
        let change = a["drawdown_m"].as_f64().expect("dd") - b["drawdown_m"].as_f64().expect("dd");
        assert!(
            (change - expected).abs() < 1e-6,
            "corner ({x}, {y}): change {change}, Thiem {expected}"
        );
    }
}

// Asking for sizing without a recharge well is bad input naming the field (design.md §4: 2).
#[test]
fn size_recharge_without_recharge_wells_is_bad_input() {
    let dir = tmp_dir("norecharge");
    let design = dir.join("design.toml");
    std::fs::write(&design, confined_design("2 L/s", "")).expect("write");
    let run = drydig(&[
        "check",
        design.to_str().expect("utf-8"),
        "--size-recharge",
        "-o",
        dir.join("out").to_str().expect("utf-8"),
    ]);
    assert_eq!(run.status.code(), Some(2));
    let err = text(&run.stderr);
    assert!(
        err.contains(": well:") && err.contains("negative rate"),
        "{err}"
    );
}

// ------------------------------------------------------------------ limits and exit codes

// Without limits in the design file, the labelled rules of thumb apply: 25 mm and 1/500
// (common practice (no source)); drawdown is reported, not checked.
#[test]
fn missing_limits_use_labelled_rules_of_thumb() {
    let extra = r#"
[[neighbour]]
name = "Shed"
footprint = [[-30, 0], [-20, 0], [-20, 10], [-30, 10]]
[[neighbour.layer]]
name = "clay"
thickness = "3 m"
m_v = "1e-4 1/kPa"
"#;
    let m = model::from_str(Path::new("rules.toml"), &confined_design("-1 L/s", extra))
        .expect("valid design");
    let run = evaluate_placement(&m, layout::from_model(&m, None).expect("wells"));
    let r = neighbours::assess_run(&run);
    let shed = r.iter().find(|n| n.name == "Shed").expect("shed assessed");
    assert!(shed
        .checks
        .iter()
        .all(|c| c.quantity != LimitQuantity::Drawdown));
    let set = shed
        .checks
        .iter()
        .find(|c| c.quantity == LimitQuantity::Settlement)
        .expect("settlement checked");
    assert_eq!(set.limit, 0.025);
    assert!(set.basis.words().contains("common practice (no source)"));
    let dist = shed
        .checks
        .iter()
        .find(|c| c.quantity == LimitQuantity::AngularDistortion)
        .expect("distortion checked");
    assert!((dist.limit - 1.0 / 500.0).abs() < 1e-15);
    assert!(dist.basis.is_rule_of_thumb());
    assert!(dist.basis.words().contains("rule of thumb"));
}

// design.md §4: exit code 3 when computed but a limit is not met. The confined test design
// with 1 L/s of recharge meets every target with every well within its limits (so only the
// neighbour decides the code), and the house is over its 2.0 m allowable drawdown (about 2.9 m
// by the Thiem sum of the four wells less the recharge well) → 3. With the limit raised out of
// reach the same run exits 0.
#[test]
fn failing_neighbours_set_exit_code_3() {
    let dir = tmp_dir("exit");
    let failing = dir.join("failing.toml");
    let base = confined_design("-1 L/s", "");
    std::fs::write(&failing, &base).expect("write");
    let out = dir.join("out_fail");
    let run = drydig(&[
        "check",
        failing.to_str().expect("utf-8"),
        "-o",
        out.to_str().expect("utf-8"),
    ]);
    let stdout = text(&run.stdout);
    assert!(
        stdout.contains("RESULT: NOT MET: 1 neighbour over a limit"),
        "{stdout}"
    );
    assert!(
        stdout.contains("RESULT (neighbours): 1 of 1 over a limit"),
        "{stdout}"
    );
    assert_eq!(run.status.code(), Some(3), "{stdout}");
    let s = summary(&out);
    assert_eq!(s["neighbours"][0]["status"], "fail");
    for f in ["neighbours.csv", "neighbour_points.csv", "settlement.svg"] {
        assert!(out.join(f).exists(), "{f} written");
    }

    let passing = dir.join("passing.toml");
    std::fs::write(
        &passing,
        base.replace(
            "allowable_drawdown = \"2.0 m\"",
            "allowable_drawdown = \"20 m\"",
        ),
    )
    .expect("write");
    let run = drydig(&[
        "check",
        passing.to_str().expect("utf-8"),
        "-o",
        dir.join("out_pass").to_str().expect("utf-8"),
    ]);
    assert_eq!(run.status.code(), Some(0), "{}", text(&run.stdout));
}

// A neighbour named like a formula is written to both neighbour CSVs with a leading apostrophe,
// as the wells CSV does, so a spreadsheet shows the name instead of evaluating it (OWASP, "CSV
// Injection": prefix cells beginning with =, +, -, @ with an apostrophe).
#[test]
fn neighbour_names_are_not_read_as_spreadsheet_formulas() {
    let dir = tmp_dir("formula");
    let design = dir.join("formula.toml");
    let base = confined_design("-1 L/s", "");
    assert!(base.contains("name = \"House\""));
    std::fs::write(
        &design,
        base.replace("name = \"House\"", "name = \"=1+House\""),
    )
    .expect("write");
    let out = dir.join("out");
    let run = drydig(&[
        "check",
        design.to_str().expect("utf-8"),
        "-o",
        out.to_str().expect("utf-8"),
    ]);
    assert!(
        matches!(run.status.code(), Some(0 | 3)),
        "{}",
        text(&run.stderr)
    );
    for f in ["neighbours.csv", "neighbour_points.csv"] {
        let csv = std::fs::read_to_string(out.join(f)).expect("csv written");
        let rows: Vec<&str> = csv.lines().skip(1).collect();
        assert!(!rows.is_empty(), "{f}: {csv}");
        for row in rows {
            assert!(row.starts_with("'=1+House,"), "{f}: {row}");
        }
    }
}

// The recharge demo brings the failing warehouse within its allowable drawdown (2.0 m): over it
// without recharge in riverside_basement.toml, within it with the sized recharge line.
#[test]
fn recharge_demo_brings_the_warehouse_within_its_limit() {
    let dir = tmp_dir("demo");
    let before = drydig(&[
        "check",
        layouts("riverside_basement.toml").to_str().expect("utf-8"),
        "-o",
        dir.join("before").to_str().expect("utf-8"),
    ]);
    assert_eq!(before.status.code(), Some(3));
    let s = summary(&dir.join("before"));
    let wh = |s: &Value| -> Value {
        s["neighbours"]
            .as_array()
            .expect("neighbours")
            .iter()
            .find(|n| n["name"] == "Old mill warehouse")
            .cloned()
            .expect("warehouse")
    };
    assert_eq!(wh(&s)["status"], "fail");
    let after = drydig(&[
        "check",
        layouts("riverside_basement_recharge.toml")
            .to_str()
            .expect("utf-8"),
        "--size-recharge",
        "-o",
        dir.join("after").to_str().expect("utf-8"),
    ]);
    assert!(matches!(after.status.code(), Some(0) | Some(3)));
    let s = summary(&dir.join("after"));
    let w = wh(&s);
    assert_ne!(w["status"], "fail", "{w}");
    let dd = w["worst_drawdown"]["drawdown_m"]
        .as_f64()
        .expect("drawdown");
    assert!(dd <= 2.0 + 1e-3, "warehouse drawdown {dd}");
    assert_eq!(s["targets_met"], Value::Bool(true));
    assert_eq!(s["recharge_sizing"]["feasible"], Value::Bool(true));
    assert!(
        s["recharge_sizing"]["recharge_m3_per_s"]
            .as_f64()
            .expect("recharge")
            > 0.0
    );
}

// A stress_change that is not one of the two forms is refused, naming the field.
#[test]
fn unknown_stress_change_names_the_field() {
    let extra = r#"
[[neighbour]]
name = "Shed"
footprint = [[-30, 0], [-20, 0], [-20, 10], [-30, 10]]
stress_change = "exact"
"#;
    let err = model::from_str(Path::new("bad.toml"), &confined_design("-1 L/s", extra))
        .expect_err("refused");
    assert_eq!(err.field, "neighbour[2].stress_change");
    let extra = r#"
[[neighbour]]
name = "Shed"
footprint = [[-30, 0], [-20, 0], [-20, 10], [-30, 10]]
stress_change = "buoyancy-loss"
[[neighbour.layer]]
name = "clay"
thickness = "3 m"
m_v = "1e-4 1/kPa"
"#;
    let err = model::from_str(Path::new("bad.toml"), &confined_design("-1 L/s", extra))
        .expect_err("refused");
    assert_eq!(err.field, "neighbour[2].layer[1]");
    assert!(err.message.contains("moist_unit_weight"));
}

// Status words are data, not panics, for every neighbour of both demos.
#[test]
fn statuses_are_reported_for_the_demo_neighbours() {
    let m = model::load(&layouts("riverside_basement.toml")).expect("demo loads");
    let run = drydig::check::run::run(&m, None).expect("demo runs");
    let st = neighbours::neighbour_status(&run);
    assert_eq!(st.len(), 2);
    assert!(st.iter().all(|(_, s, _)| *s == Status::Fail));
}

// ------------------------------------------------------------------ clay over the confined aquifer, through the binary

// Hand integral (checks.md §16: linear steady seepage through the clay, no source needed): the
// house of `confined_design` on 11 m of clay (m_v = 3e-4 1/kPa) from its foundation at 11 m down
// to the aquifer top at 0 m; the aquifer's head drop s at the worst point reaches the clay's base,
// nothing its top; the water table before pumping is at 10 m, so the top metre has no pore
// pressure to lose: ρ = m_v·γ_w·(s/11)·∫₀¹⁰ (11 − z) dz = m_v·γ_w·s·60/11. With c_v = 2 m²/year
// draining both faces for 60 days, T_v = 2·(60/365.25)/5.5² and U = √(4T_v/π) (Terzaghi).
#[test]
fn confined_clay_settles_by_the_linear_profile_through_the_binary() {
    let extra = r#"dewatering_duration = "60 days"
[[neighbour.layer]]
name = "clay"
thickness = "11 m"
m_v = "3e-4 1/kPa"
c_v = "2 m2/year"
"#;
    let dir = tmp_dir("confined-clay");
    let design = dir.join("design.toml");
    std::fs::write(&design, confined_design("-1 L/s", extra)).expect("write design");
    let out = dir.join("out");
    let run = drydig(&[
        "check",
        design.to_str().expect("utf-8"),
        "-o",
        out.to_str().expect("utf-8"),
    ]);
    assert!(
        matches!(run.status.code(), Some(0) | Some(3)),
        "{}",
        text(&run.stderr)
    );
    let s = summary(&out);
    let house = &s["neighbours"][0];
    let col = house["column"].as_array().expect("soil column");
    let s_base = col[0]["head_drop"]["base"].as_f64().expect("drop");
    assert_eq!(col[0]["head_drop"]["top"].as_f64(), Some(0.0), "{house}");
    let hand = 3e-4 * 9.81 * s_base * 60.0 / 11.0;
    let final_m = house["max_final_settlement_m"].as_f64().expect("final");
    assert!(
        (final_m - hand).abs() < 1e-4 * hand,
        "final {final_m}, hand {hand}"
    );
    let tv: f64 = 2.0 * (60.0 / 365.25) / (5.5 * 5.5);
    let u = (4.0 * tv / PI).sqrt();
    let end = house["max_end_of_works_settlement_m"]
        .as_f64()
        .expect("end");
    assert!(
        (end - u * hand).abs() < 1e-4 * hand,
        "end {end}, hand {}",
        u * hand
    );
    let stdout = text(&run.stdout);
    assert!(stdout.contains("soil column"), "{stdout}");
    assert!(
        stdout.contains("at the end of the works (60 days"),
        "{stdout}"
    );
}

// US output: the valve house of deep_shaft.toml in inches, feet and psf (units = "us").
#[test]
fn valve_house_in_us_units() {
    let text_in =
        include_str!("../layouts/deep_shaft.toml").replace("units = \"si\"", "units = \"us\"");
    let dir = tmp_dir("valve-us");
    let design = dir.join("design.toml");
    std::fs::write(&design, text_in).expect("write design");
    let out = dir.join("out");
    let run = drydig(&[
        "check",
        design.to_str().expect("utf-8"),
        "-o",
        out.to_str().expect("utf-8"),
    ]);
    assert!(
        matches!(run.status.code(), Some(0) | Some(3)),
        "{}",
        text(&run.stderr)
    );
    let stdout = text(&run.stdout);
    assert!(stdout.contains(" in; at the end of the works"), "{stdout}");
    assert!(stdout.contains(" psf"), "{stdout}");
    let html = std::fs::read_to_string(out.join("report.html")).expect("report");
    assert!(
        html.contains("<h3>Settlement</h3>") && html.contains(" psf"),
        "report"
    );
}

// The neighbours table is built once and rendered in the run's units: with `--units us` the
// terminal table and report.html's table carry feet and inches and no metres, while
// neighbours.csv keeps its SI machine columns. Riverside basement's warehouse has an allowable
// drawdown of 2.0 m and settlement of 0.015 m, the terrace 0.010 m: by hand (NIST SP 811 (2008)
// App. B, 1 ft = 0.3048 m, 1 in = 0.0254 m) 2.0 m = 6.56 ft → "6.6", 0.015 m = 0.591 in →
// "0.59", 0.010 m = 0.394 in → "0.39".
#[test]
fn neighbours_table_in_us_units_carries_feet_and_inches() {
    let out = tmp_dir("table-us");
    let stdout = check_demo("riverside_basement.toml", &["--units", "us"], &out);
    let table: Vec<&str> = stdout
        .lines()
        .skip_while(|l| !l.starts_with("neighbours ("))
        .skip(1)
        .take(3)
        .collect();
    assert!(
        table[0].contains("drawdown ft") && table[0].contains("settlement in"),
        "{table:?}"
    );
    let row = |name: &str| -> Vec<&str> {
        let line = table
            .iter()
            .find(|l| l.starts_with(name))
            .unwrap_or_else(|| panic!("{name} in {table:?}"));
        line[name.len()..].split_whitespace().collect()
    };
    // warehouse: drawdown, limit, settlement, limit, distortion, limit, status
    let warehouse = row("Old mill warehouse");
    assert_eq!(
        (warehouse[1], warehouse[3]),
        ("6.6", "0.59"),
        "{warehouse:?}"
    );
    assert_eq!(warehouse[5], "1/500", "{warehouse:?}");
    let terrace = row("Terrace houses 2–8");
    assert_eq!((terrace[1], terrace[3]), ("—", "0.39"), "{terrace:?}");
    for line in &table {
        let words: Vec<&str> = line.split_whitespace().collect();
        assert!(
            !words.iter().any(|w| ["m", "mm"].contains(w)),
            "SI in the US table: {line}"
        );
    }
    let html = std::fs::read_to_string(out.join("report.html")).expect("report");
    assert!(
        html.contains("<th class=\"n\">drawdown (ft)</th>")
            && html.contains("<th class=\"n\">settlement (in)</th>")
            && html.contains("<td class=\"n\">0.59</td>"),
        "report.html neighbours table in ft and in"
    );
    // The CSV stays in SI: 2.000 m and 15.0 mm, as the design file gives them.
    let csv = std::fs::read_to_string(out.join("neighbours.csv")).expect("neighbours.csv");
    let head: Vec<&str> = csv.lines().next().expect("header").split(',').collect();
    let warehouse = csv
        .lines()
        .find(|l| l.starts_with("Old mill warehouse"))
        .expect("warehouse row");
    let cells: Vec<&str> = warehouse.split(',').collect();
    let at = |h: &str| cells[head.iter().position(|c| *c == h).expect("column")];
    assert_eq!(at("allowable_drawdown_m"), "2.000");
    assert_eq!(at("allowable_settlement_mm"), "15.0");
    assert_eq!(at("settlement_limit_basis"), "design file");
}

// `check --size-recharge --units us` words the recharge flows in gpm: the abstraction, recharge
// and net flow of riverside_basement_recharge, 104.5, 36.8 and 67.7 L/s in an SI run, read by
// hand (NIST SP 811 (2008) App. B, 1 US gal = 3.785411784 L; q gpm = q L/s × 60 ÷ 3.785411784)
// as 1656.4, 583.3 and 1073.1 gpm; the SI text rounds to 0.05 L/s, i.e. ±0.8 gpm. The exact
// figures come from summary.json's m³/s. The recharge part of the text carries no "L/s".
#[test]
fn sized_recharge_flows_in_us_units_read_in_gpm() {
    let dir = tmp_dir("recharge-us");
    let out = dir.join("us");
    let stdout = check_demo(
        "riverside_basement_recharge.toml",
        &["--size-recharge", "--units", "us"],
        &out,
    );
    let from = stdout.find("recharge sizing:").expect("recharge section");
    let to = stdout[from..]
        .find("RESULT (neighbours)")
        .map_or(stdout.len(), |i| from + i);
    let part = &stdout[from..to];
    assert!(!part.contains("L/s"), "{part}");
    assert!(!part.contains("m³/day"), "{part}");
    // The notes too: the highest recharge level is ground (6.20 m) − the default 1.00 m margin,
    // 17.06 ft (ground − 3.28 ft), and the default rise 0.30 m is 0.98 ft (1 ft = 0.3048 m,
    // NIST SP 811 (2008) App. B); no length in metres is left in the section.
    let flat = part.split_whitespace().collect::<Vec<_>>().join(" ");
    assert!(
        flat.contains("at or below 17.06 ft (ground − 3.28 ft (default margin"),
        "{flat}"
    );
    assert!(flat.contains("(default 0.98 ft,"), "{flat}");
    assert!(
        !flat.contains(" m ") && !flat.contains(" m)") && !flat.contains(" m;"),
        "{flat}"
    );
    let line = part
        .lines()
        .find(|l| l.trim_start().starts_with("abstraction "))
        .expect("flow line");
    // "abstraction 1656.4 gpm, recharge 583.3 gpm, net flow 1073.1 gpm"
    let numbers: Vec<f64> = line
        .split(|c: char| c == ',' || c.is_whitespace())
        .filter_map(|w| w.parse::<f64>().ok())
        .collect();
    assert_eq!(numbers.len(), 3, "{line}");
    assert_eq!(line.matches(" gpm").count(), 3, "{line}");
    let gal_l = 3.785411784;
    for (shown, si_l_per_s) in numbers.iter().zip([104.5, 36.8, 67.7]) {
        let by_hand = si_l_per_s * 60.0 / gal_l;
        assert!((shown - by_hand).abs() <= 0.8, "{shown} gpm vs {by_hand}");
    }
    let rs = &summary(&out)["recharge_sizing"];
    for (shown, key) in numbers.iter().zip([
        "abstraction_m3_per_s",
        "recharge_m3_per_s",
        "net_flow_m3_per_s",
    ]) {
        let gpm = rs[key].as_f64().expect(key) * 1e3 * 60.0 / gal_l;
        assert!(
            (shown - gpm).abs() <= 0.05 + 1e-9,
            "{key}: {shown} vs {gpm}"
        );
    }
    assert!(part.contains("binding: "), "{part}");
}
