//! The bid's time and its wellpoint sets, against hand figures: the pumping duration taken from
//! `[programme]` when `[bid]` gives none; `[bid]` values refused outside their ranges naming the
//! field; wellpoint sets sized for air and water from the common-practice table (no source) of
//! `src/bid/vacuum_sets.rs`, jetting without a sump; and `design --prices` refusing a day rate
//! on a weekly hire (exit 2, naming the prices file's line).

use drydig::bid::durations::PumpingFrom;
use drydig::bid::quantities::bid;
use drydig::bid::vacuum_sets::SET_SIZES;
use drydig::field::layout::generate;
use drydig::input::validate::file::{from_str, load};
use std::path::Path;
use std::process::Command;

#[test]
fn the_programme_gives_the_pumping_duration_when_bid_does_not() {
    let model = load(Path::new("layouts/riverside_basement_programme.toml")).expect("demo loads");
    assert!(model.bid.pumping_duration_s.is_none());
    let spec = model.layout.as_ref().expect("ring layout");
    let placed = generate(&model, spec, 0.004).expect("ring");
    let b = bid(
        &model,
        &placed.wells,
        &placed.paths,
        &vec![None; placed.wells.len()],
    );
    // [programme] duration = "150 days"; energy over it = running power × 24 h × 150 days.
    assert_eq!(b.time.pumping_from, PumpingFrom::Programme);
    assert!((b.time.pumping_days - 150.0).abs() < 1e-9);
    assert!((b.time.energy_kwh - b.power_running_kw * 24.0 * 150.0).abs() < 1e-6);
    // Hire: whole weeks covering mobilise + install + pumping + removal.
    let days = b.time.mobilise_days + b.time.install_days + 150.0 + b.time.removal_days;
    assert!(b.time.hire_weeks >= days / 7.0 && b.time.hire_weeks < days / 7.0 + 1.0);
}

#[test]
fn bid_settings_out_of_range_are_refused_naming_the_field() {
    let text = std::fs::read_to_string("layouts/deep_shaft.toml").unwrap();
    let with = |bid: &str| {
        let t = text.replace("[bid]\npumping_duration = \"120 days\"", bid);
        from_str(Path::new("shaft.toml"), &t)
    };
    let e = with("[bid]\npumping_duration = \"6 h\"").unwrap_err();
    assert!(e.field == "bid.pumping_duration" && e.line.is_some(), "{e}");
    let e = with("[bid]\ngenerators = 60").unwrap_err();
    assert!(e.field == "bid.generators", "{e}");
    let e = with("[bid]\nretention_time = \"3 days\"").unwrap_err();
    assert!(e.field == "bid.retention_time", "{e}");
    assert!(with("[bid]\nfuel = 3").is_err());
    // In feet, as the design file chose: 165 ft of header a day = 50.292 m.
    let m = with("[bid]\nheader_per_day = \"165 ft\"\ngenerators = 0").unwrap();
    assert!((m.bid.header_per_day_m - 50.292).abs() < 1e-9);
    assert_eq!(m.bid.generators, 0);
}

#[test]
fn wellpoint_sets_are_sized_for_air_and_water_and_jetting_has_no_sump() {
    let model = load(Path::new("layouts/pipeline_trench.toml")).expect("demo loads");
    let spec = model.layout.as_ref().expect("line layout");
    let placed = generate(&model, spec, 0.027e-3).expect("lines");
    let n = placed.wells.len();
    let b = bid(&model, &placed.wells, &placed.paths, &vec![None; n]);
    // Jetting: ground 12.0 − screen base 5.0 = 7.0 m a wellpoint, no sump.
    assert!((b.depth_per_well_m - 7.0).abs() < 1e-12);
    assert!((b.jetting_m - 7.0 * n as f64).abs() < 1e-9);
    // Sets: header ÷ 25 m rounded up; air = wellpoints on the busiest set × 1.5 m³/h
    // (common practice (no source)); water = the set's design flow. The smallest set of the
    // table that moves both is chosen.
    let sets = b.pump_sets.expect("sets");
    assert_eq!(sets, (b.header_length_m / 25.0).ceil() as usize);
    let (points, air) = b.set_air.unwrap();
    assert_eq!(points, n.div_ceil(sets));
    assert!((air - 1.5 * points as f64).abs() < 1e-9);
    let water = b.design_flow_m3_per_s / sets as f64;
    let want = SET_SIZES
        .iter()
        .find(|s| s.water_m3_per_s >= water && s.air_m3_per_h >= air)
        .unwrap();
    assert_eq!(b.set_size.unwrap().name, want.name);
    // Installed: every set at its vacuum + water pump drives (0.027 L/s a wellpoint is far
    // below the water pump's rating), not the shaft power of the water alone.
    let per_set = want.vacuum_kw + want.water_kw;
    assert!((b.power_installed_kw - sets as f64 * per_set).abs() < 1e-9);
    assert!(b.power_running_kw > sets as f64 * want.vacuum_kw);
}

#[test]
fn design_refuses_a_day_rate_on_a_weekly_hire_naming_the_line() {
    let dir = std::env::temp_dir().join(format!("drydig-bid-time-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let prices = dir.join("prices.csv");
    std::fs::write(
        &prices,
        "item,price,unit\ndrilling,120,m\npumps 12 L/s,20,day\n",
    )
    .unwrap();
    let out = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(["design", "layouts/deep_shaft.toml", "--prices"])
        .arg(&prices)
        .arg("-o")
        .arg(dir.join("out"))
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2), "{out:?}");
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("prices.csv:3")
            && err.contains("hired by the week")
            && err.contains("per day"),
        "{err}"
    );
    let _ = std::fs::remove_dir_all(&dir);
}
