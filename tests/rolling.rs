//! A rolling run (`[rolling]`): the wellpoint line is designed for the open length plus run-in
//! and run-out, not for the whole trench, and the targets along the open length are met.
//! Checked on the demo `layouts/rolling_trench.toml` through the binary, with the rates it
//! reports summed by the plain Dupuit–Thiem formula written out here.

use std::path::{Path, PathBuf};
use std::process::Command;

fn demo() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/rolling_trench.toml")
}

fn design(out: &Path) {
    let st = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(["design", "-q"])
        .arg(demo())
        .arg("-o")
        .arg(out)
        .status()
        .expect("drydig runs");
    assert_eq!(st.code(), Some(0), "the rolling demo meets every target");
}

/// Rows of a CSV file as maps from column name to text.
fn csv(path: &Path) -> Vec<std::collections::HashMap<String, String>> {
    let text = std::fs::read_to_string(path).expect("csv");
    let mut lines = text.lines();
    let head: Vec<String> = lines
        .next()
        .expect("header")
        .split(',')
        .map(str::to_string)
        .collect();
    lines
        .filter(|l| !l.trim().is_empty())
        .map(|l| {
            head.iter()
                .cloned()
                .zip(l.split(',').map(str::to_string))
                .collect()
        })
        .collect()
}

fn num(row: &std::collections::HashMap<String, String>, k: &str) -> f64 {
    row[k]
        .parse()
        .unwrap_or_else(|_| panic!("{k} = {}", row[k]))
}

#[test]
fn the_line_covers_the_open_length_with_run_in_and_run_out_and_meets_its_targets() {
    let out = std::env::temp_dir().join(format!("drydig-rolling-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&out);
    design(&out);
    // The demo: a 600 m straight trench along x, 3 m wide, open 30 m at a time, advancing
    // 15 m a day; run-in and run-out by default two and one days of advance (30 m and 15 m,
    // common practice (no source)). The set stands in the middle of the trench: the line from
    // x = 262.5 to 337.5 m (75 m installed), the open length from 277.5 to 307.5 m.
    let (line_from, line_to) = (262.5, 337.5);
    let (open_from, open_to) = (277.5, 307.5);
    let wells = csv(&out.join("wells.csv"));
    let xs: Vec<f64> = wells.iter().map(|w| num(w, "x_m")).collect();
    let lo = xs.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = xs.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    assert!(
        (lo - line_from).abs() < 1e-6 && (hi - line_to).abs() < 1e-6,
        "line {lo} … {hi} m"
    );
    // both sides, every wellpoint within the installed length (not the 600 m trench)
    assert!(wells.iter().any(|w| num(w, "y_m") > 0.0) && wells.iter().any(|w| num(w, "y_m") < 0.0));
    assert!(
        wells.len() < 2 * (75.0 / 1.5) as usize + 4,
        "{} wellpoints",
        wells.len()
    );

    // Every target point lies on the open length.
    let points = csv(&out.join("checkpoints.csv"));
    let targets: Vec<_> = points
        .iter()
        .filter(|p| !p["target_level_m"].is_empty())
        .collect();
    assert!(targets.len() > 30);
    for p in &targets {
        let x = num(p, "x_m");
        assert!(
            (open_from - 1e-6..=open_to + 1e-6).contains(&x),
            "target at x = {x}"
        );
    }

    // Plain superposition, unconfined Dupuit–Thiem (Kruseman & de Ridder, "Analysis and
    // Evaluation of Pumping Test Data", 2nd ed. 1990, §2.2 / Dupuit 1863, Thiem 1906):
    // h² = H² − Σ Qⱼ/(π·K)·ln(R/rⱼ), with the reported R and rates. The filter columns span the
    // saturated sand, so no partial-penetration term enters.
    let summary: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("summary.json")).expect("summary"))
            .expect("json");
    let r_inf = summary["radius_of_influence_m"].as_f64().expect("R");
    let (k, base, h0) = (1e-4, 3.0, 9.0 - 3.0);
    let level = |x: f64, y: f64| {
        let mut h2 = h0 * h0;
        for w in &wells {
            let q = num(w, "rate_l_per_s") * 1e-3;
            let r = (x - num(w, "x_m")).hypot(y - num(w, "y_m")).max(0.1);
            if r < r_inf {
                h2 -= q / (std::f64::consts::PI * k) * (r_inf / r).ln();
            }
        }
        base + h2.max(0.0).sqrt()
    };
    for p in &targets {
        let (x, y, t) = (num(p, "x_m"), num(p, "y_m"), num(p, "target_level_m"));
        let z = level(x, y);
        assert!(
            z <= t + 2e-3,
            "{} at ({x}, {y}): {z:.4} m above its target {t} m",
            p["name"]
        );
        // and the level drydig reports there agrees with the plain sum
        assert!(
            (z - num(p, "water_level_m")).abs() < 2e-3,
            "{}: {z} vs {}",
            p["name"],
            p["water_level_m"]
        );
    }
    // Across the whole open length, between the check points too: below formation − margin
    // (6.0 m) everywhere (the design's operating margin covers the points between).
    let mut x = open_from;
    while x <= open_to + 1e-9 {
        for y in [-1.5, -0.75, 0.0, 0.75, 1.5] {
            let z = level(x, y);
            assert!(z <= 6.0 + 1e-6, "({x}, {y}): {z:.4} m");
        }
        x += 0.25;
    }
    let _ = std::fs::remove_dir_all(&out);
}

/// The demo with `edit` applied, loaded.
fn edited(edit: impl Fn(String) -> String) -> Result<(), drydig::input::error::InputError> {
    let text = edit(std::fs::read_to_string(demo()).expect("demo"));
    drydig::input::validate::file::from_str(Path::new("rolling.toml"), &text).map(|_| ())
}

#[test]
fn what_a_rolling_run_cannot_do_is_refused_naming_the_field() {
    type Edit = Box<dyn Fn(String) -> String>;
    let cases: Vec<(Edit, &str)> = vec![
        // longer than the trench: dig it in one open run
        (
            Box::new(|t| t.replace("open_length = \"30 m\"", "open_length = \"580 m\"")),
            "rolling.open_length",
        ),
        // the line's ends are the run-in and run-out
        (
            Box::new(|t| {
                t.replace(
                    "kind = \"line\"",
                    "kind = \"line\"\nend_extension = \"5 m\"",
                )
            }),
            "layout.end_extension",
        ),
        // the programme does not yet move the set along: said, not ignored
        (
            Box::new(|t| {
                format!("{t}\n[programme]\nduration = \"40 days\"\n\n[[programme.stage]]\nname = \"Dig\"\nstart = \"0 days\"\nformation_level = \"6.5 m\"\nrate = \"as designed\"\n")
            }),
            "programme",
        ),
        (
            Box::new(|t| t.replace("advance_per_day = \"15 m\"", "advance_per_day = \"0 m\"")),
            "rolling.advance_per_day",
        ),
    ];
    for (edit, field) in cases {
        let e = edited(edit).expect_err(field);
        assert_eq!(e.field, field, "{e}");
    }
}
