//! The `drydig` binary end to end: every example layout runs, the JSON is complete and sane, US
//! units are honoured, `new` writes a starter that runs and is never overwritten, and one flow
//! through the command line equals a hand formula worked outside the project.

use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn drydig<I, S>(args: I) -> Output
where
    I: IntoIterator<Item = S>,
    S: AsRef<std::ffi::OsStr>,
{
    Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs")
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

fn layouts() -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts");
    let mut files: Vec<PathBuf> = std::fs::read_dir(dir)
        .expect("layouts/ exists")
        .map(|e| e.expect("entry").path())
        .filter(|p| p.extension().is_some_and(|x| x == "toml"))
        .collect();
    files.sort();
    assert!(
        files.len() >= 4,
        "expected the demo layouts, found {files:?}"
    );
    files
}

fn estimate_json(file: &Path, extra: &[&str]) -> Value {
    let mut args = vec!["estimate".as_ref(), file.as_os_str(), "--json".as_ref()];
    args.extend(extra.iter().map(|s| std::ffi::OsStr::new(*s)));
    let run = drydig(&args);
    assert_eq!(
        run.status.code(),
        Some(0),
        "{}: {}",
        file.display(),
        text(&run.stderr)
    );
    serde_json::from_slice(&run.stdout).unwrap_or_else(|e| {
        panic!(
            "{}: --json output is not JSON ({e}): {}",
            file.display(),
            text(&run.stdout)
        )
    })
}

fn number(v: &Value, key: &str) -> f64 {
    v.get(key)
        .and_then(Value::as_f64)
        .unwrap_or_else(|| panic!("key {key} missing or not a number in {v}"))
}

#[test]
fn every_layout_estimates_with_exit_0_and_the_caution() {
    for file in layouts() {
        let run = drydig(["estimate".as_ref(), file.as_os_str()]);
        let out = text(&run.stdout);
        let err = text(&run.stderr);
        assert_eq!(run.status.code(), Some(0), "{}: {err}", file.display());
        assert!(!err.contains("panicked"), "{err}");
        // The caution of design.md §4, in the words of the report.
        for part in [
            "CAUTION",
            "Confirm with site investigation and pumping tests",
            "licensed professional",
            "settle",
        ] {
            assert!(
                out.contains(part),
                "{}: no {part:?} in\n{out}",
                file.display()
            );
        }
    }
}

#[test]
fn json_has_the_flows_and_radii_of_every_excavation_within_sane_bounds() {
    for file in layouts() {
        let v = estimate_json(&file, &[]);
        let name = file.display();
        let total = number(&v, "total_flow_m3_per_day");
        let design = number(&v, "design_flow_m3_per_day");
        assert!(total > 0.0 && total < 1e6, "{name}: total {total} m³/day");
        assert!(design >= total && design < 1e6, "{name}: design {design}");
        assert!(
            v["caution"]
                .as_str()
                .is_some_and(|c| c.contains("licensed professional")),
            "{name}: no caution in the JSON"
        );
        let list = v["excavations"].as_array().expect("excavations array");
        assert!(!list.is_empty(), "{name}: no excavations");
        let mut sum = 0.0;
        for e in list {
            let q = number(e, "total_flow_m3_per_day");
            let qd = number(e, "design_flow_m3_per_day");
            let r_e = number(e, "equivalent_radius_m");
            let big_r = number(e, "radius_of_influence_m");
            assert!(q > 0.0 && q < 1e6, "{name}: flow {q} m³/day");
            assert!(qd >= q && qd < 1e6, "{name}: design flow {qd} m³/day");
            // A site is metres to a few kilometres across; R lies beyond the excavation.
            assert!(r_e > 0.0 && r_e < 5_000.0, "{name}: r_e {r_e} m");
            assert!(big_r > r_e && big_r < 50_000.0, "{name}: R {big_r} m");
            sum += q;
        }
        assert!(
            (sum - total).abs() <= 1e-9 * total,
            "{name}: excavations add to {sum}, total says {total}"
        );
    }
}

#[test]
fn units_us_prints_gallons_per_minute_and_feet() {
    // riverside_basement.toml asks for SI output; the flag must override it.
    let file = Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/riverside_basement.toml");
    let si = drydig(["estimate".as_ref(), file.as_os_str()]);
    assert_eq!(si.status.code(), Some(0));
    assert!(!text(&si.stdout).contains("gpm"), "SI output shows gpm");

    let us = drydig([
        "estimate".as_ref(),
        file.as_os_str(),
        "--units".as_ref(),
        "us".as_ref(),
    ]);
    let out = text(&us.stdout);
    assert_eq!(us.status.code(), Some(0), "{}", text(&us.stderr));
    assert!(out.contains("gpm"), "no gpm in\n{out}");
    assert!(out.contains(" ft"), "no ft in\n{out}");

    // The US numbers in the JSON follow the exact definitions (NIST SP 811, appendix B):
    // 1 US gallon = 3.785 411 784 L, 1 ft = 0.3048 m.
    let v = estimate_json(&file, &["--units", "us"]);
    let e = &v["excavations"][0];
    let l_per_s = number(e, "total_flow_l_per_s");
    let gpm = number(e, "total_flow_gpm");
    assert!((gpm - l_per_s * 60.0 / 3.785_411_784).abs() <= 1e-9 * gpm);
    let ft = number(e, "equivalent_radius_ft");
    let m = number(e, "equivalent_radius_m");
    assert!((ft * 0.3048 - m).abs() <= 1e-9 * m);
}

#[test]
fn an_unknown_units_flag_is_refused_as_bad_input() {
    let file = Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/deep_shaft.toml");
    let run = drydig([
        "estimate".as_ref(),
        file.as_os_str(),
        "--units".as_ref(),
        "imperial".as_ref(),
    ]);
    assert_eq!(run.status.code(), Some(2));
    assert!(run.stdout.is_empty());
    let err = text(&run.stderr);
    assert!(err.contains("si") && err.contains("us"), "{err}");
}

#[test]
fn new_writes_a_starter_that_runs_and_is_never_overwritten() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("site.toml");

    let first = drydig(["new".as_ref(), path.as_os_str()]);
    assert_eq!(first.status.code(), Some(0), "{}", text(&first.stderr));
    let written = std::fs::read(&path).expect("new wrote the file");
    assert!(!written.is_empty());

    let run = drydig(["estimate".as_ref(), path.as_os_str()]);
    assert_eq!(
        run.status.code(),
        Some(0),
        "the starter does not run unchanged: {}",
        text(&run.stderr)
    );
    assert!(text(&run.stdout).contains("CAUTION"));

    let second = drydig(["new".as_ref(), path.as_os_str()]);
    let err = text(&second.stderr);
    assert_eq!(second.status.code(), Some(2), "{err}");
    assert!(err.contains("already exists"), "{err}");
    assert!(err.contains(&path.display().to_string()), "{err}");
    assert_eq!(
        std::fs::read(&path).expect("still there"),
        written,
        "the second `new` changed the file"
    );
}

/// checks.md §4, "Single unconfined well (hand formula, library-checked)": K = 5e-4 m/s,
/// H = 10 m, h_w = 7 m, r_w = 0.15 m, R = 201.25 m → Q = πK(H² − h²)/ln(R/r_w) = 0.011124 m³/s.
///
/// Through the command line: a square pit whose area is π·0.15² (side 0.15·√π m), so r_e =
/// 0.15 m; base 0, groundwater 10 m; formation 7.5 m with a 0.5 m margin, so the target is 7 m;
/// method "fixed" with L₀ = 201.1 m, so R₀ = r_e + L₀ = 201.25 m.
#[test]
fn equivalent_well_flow_equals_the_hand_formula() {
    let side = 0.15 * std::f64::consts::PI.sqrt();
    let design = format!(
        r#"[site]
name = "Hand formula check"
ground_level = "12.0 m"

[aquifer]
kind = "unconfined"
conductivity = "5e-4 m/s"
base_level = "0.0 m"
groundwater_level = "10.0 m"

[[excavation]]
name = "Tiny pit"
outline = [[0, 0], [{side:.15}, 0], [{side:.15}, {side:.15}], [0, {side:.15}]]
formation_level = "7.5 m"
target_margin = "0.5 m"
shape = "pit"

[influence]
method = "fixed"
distance = "201.1 m"
"#
    );
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("hand_formula.toml");
    std::fs::write(&path, design).expect("write design");

    let v = estimate_json(&path, &[]);
    let e = &v["excavations"][0];
    let r_e = number(e, "equivalent_radius_m");
    let big_r = number(e, "radius_of_influence_m");
    let q = number(e, "total_flow_l_per_s");
    assert!((r_e - 0.15).abs() < 1e-9, "r_e = {r_e}");
    assert!((big_r - 201.25).abs() < 1e-9, "R = {big_r}");
    let expected = 11.124; // L/s, checks.md §4
    assert!(
        (q - expected).abs() <= 5e-4 * expected,
        "Q = {q} L/s, hand formula {expected} L/s"
    );
    // Same flow in m³/day (1 day = 86 400 s).
    assert!((number(e, "total_flow_m3_per_day") - q * 86.4).abs() <= 1e-9 * q * 86.4);
}

#[test]
fn a_long_wells_table_is_cut_at_twenty_rows_unless_verbose() {
    // Issue 17 point 4: the terminal lists at most ~20 wells and says how many more are in
    // wells.csv; -v lists every well. The trench demo has about a thousand wellpoints.
    let trench = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("layouts/pipeline_trench.toml");
    let out = tempfile::tempdir().unwrap();
    let run = |extra: &[&str]| {
        let mut args = vec!["check".to_string(), trench.display().to_string()];
        args.extend(["-o".to_string(), out.path().display().to_string()]);
        args.extend(extra.iter().map(|s| s.to_string()));
        let o = drydig(&args);
        assert!(matches!(o.status.code(), Some(0) | Some(3)), "{o:?}");
        text(&o.stdout)
    };
    let short = run(&[]);
    let csv = std::fs::read_to_string(out.path().join("wells.csv")).unwrap();
    let names: Vec<&str> = csv
        .lines()
        .skip(1)
        .map(|l| l.split(',').next().unwrap())
        .collect();
    assert!(names.len() > 100, "{} wells", names.len());
    let listed = |t: &str| {
        names
            .iter()
            .filter(|n| t.lines().any(|l| l.starts_with(&format!("{n} "))))
            .count()
    };
    assert_eq!(listed(&short), 20, "{short}");
    assert!(
        short.contains(&format!("… {} more in wells.csv", names.len() - 20)),
        "{short}"
    );
    let all = run(&["-v"]);
    assert_eq!(listed(&all), names.len());
    assert!(!all.contains("more in wells.csv"));
}
