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
}
