//! Trenches with a bend (`layouts/bent_trench.toml`), against geometry computed by hand:
//!
//! - the centre line is the two drawn legs, (0, 0) → (350, 0) → (350 + 250·cos 30°,
//!   250·sin 30°): 350 m + 250 m = 600 m, and the width is area / length = 1 500 m² / 600 m =
//!   2.5 m, the same as a straight trench of 600 m × 2.5 m, so the quick estimate gives the
//!   same flows for both;
//! - every wellpoint stands half the width plus the offset (1.25 + 1.0 = 2.25 m) from the
//!   centre line (run 20 m past each end), on both legs, with no gap wider than the spacing and
//!   no bunching at the bend; the line outside the bend turns at d·tan 15° past the bend point
//!   along the first leg (d = 2.25 m, a 30° turn mitred);
//! - the default section of a trench runs across it (square to the centre line);
//! - the straight demo trench keeps its wellpoints where they were: 1.5 + 1.0 = 2.5 m either side
//!   of y = 0, from x = −20 m to 420 m at 1 m.
//!
//! Plane geometry and trigonometry: common practice (no source).

use drydig::field::layout::generate;
use drydig::input::model::Model;
use drydig::input::validate::file::{from_str, load};
use std::path::{Path, PathBuf};

fn demo(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn bent() -> Model {
    load(&demo("bent_trench.toml")).expect("the bent trench demo is valid")
}

/// The same site with the trench drawn straight, 600 m × 2.5 m.
fn straight() -> Model {
    let text = std::fs::read_to_string(demo("bent_trench.toml")).unwrap();
    let start = text.find("outline = [").unwrap();
    let end = start + text[start..].find("]\n").unwrap() + 2;
    let text = format!(
        "{}outline = [[0, -1.25], [600, -1.25], [600, 1.25], [0, 1.25]]\n{}",
        &text[..start],
        &text[end..]
    );
    from_str(Path::new("straight.toml"), &text).expect("the straight variant is valid")
}

const C30: f64 = 0.866_025_403_784_438_6; // cos 30°
const S30: f64 = 0.5; // sin 30°

/// The centre line by hand, run `ext` m past each end along its leg.
fn centre(ext: f64) -> Vec<[f64; 2]> {
    let end = [350.0 + 250.0 * C30, 250.0 * S30];
    vec![
        [-ext, 0.0],
        [350.0, 0.0],
        [end[0] + ext * C30, end[1] + ext * S30],
    ]
}

fn seg_dist(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let t = (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy)).clamp(0.0, 1.0);
    (p[0] - a[0] - t * dx).hypot(p[1] - a[1] - t * dy)
}

fn line_dist(p: [f64; 2], line: &[[f64; 2]]) -> f64 {
    line.windows(2)
        .map(|w| seg_dist(p, w[0], w[1]))
        .fold(f64::INFINITY, f64::min)
}

#[test]
fn the_estimate_reads_the_bent_trench_along_its_centre_line() {
    let est = drydig::estimate::estimate(&bent());
    let e = &est.excavations[0];
    // 350 m + 250 m; the outline's corners are given to 0.1 mm.
    assert!((e.length_m - 600.0).abs() < 1e-3, "length {}", e.length_m);
    assert!((e.width_m - 2.5).abs() < 1e-4, "width {}", e.width_m);
    let s = drydig::estimate::estimate(&straight());
    let s = &s.excavations[0];
    assert!((s.length_m - 600.0).abs() < 1e-9 && (s.width_m - 2.5).abs() < 1e-9);
    assert!((e.width_m - s.width_m).abs() < 1e-4);
    // The same length and width give the same line-slot and end flows.
    let (eb, es) = (
        e.slot_ends_flow_m3_per_day.unwrap(),
        s.slot_ends_flow_m3_per_day.unwrap(),
    );
    assert!((eb - es).abs() < 1e-3 * es, "ends {eb} vs {es}");
    let (fb, fs) = (e.total_flow_m3_per_day, s.total_flow_m3_per_day);
    assert!((fb - fs).abs() < 1e-3 * fs, "total {fb} vs {fs}");
}

#[test]
fn wellpoint_lines_follow_both_legs_at_the_stated_offset() {
    let m = bent();
    let spec = m.layout.as_ref().unwrap();
    let p = generate(&m, spec, 0.0).expect("the layout places wells");
    let line = centre(20.0);
    let d = 1.25 + 1.0;
    let mut on_leg_two = [0, 0];
    for w in &p.wells {
        let off = line_dist(w.position, &line);
        // To 1 mm: the corners are given to 0.1 mm, the arc round the bend in chords of 2°.
        assert!(
            (off - d).abs() < 1e-3,
            "{} at {:?} is {off} m off",
            w.name,
            w.position
        );
        if seg_dist(w.position, line[1], line[2]) < seg_dist(w.position, line[0], line[1]) {
            on_leg_two[usize::from(w.name.starts_with('R'))] += 1;
        }
    }
    // Leg two runs 250 m + 20 m past the end: about 270 wellpoints a side at 1 m.
    assert!(
        on_leg_two.iter().all(|&n| (262..=276).contains(&n)),
        "{on_leg_two:?}"
    );
    for side in ["L-", "R-"] {
        let pts: Vec<[f64; 2]> = p
            .wells
            .iter()
            .filter(|w| w.name.starts_with(side))
            .map(|w| w.position)
            .collect();
        let gaps: Vec<f64> = pts
            .windows(2)
            .map(|w| (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]))
            .collect();
        let (lo, hi) = gaps
            .iter()
            .fold((f64::INFINITY, 0.0f64), |(a, b), g| (a.min(*g), b.max(*g)));
        assert!(
            hi <= 1.0 + 1e-9,
            "{side}: a gap of {hi} m, more than the 1 m spacing"
        );
        assert!(lo > 0.95, "{side}: wellpoints bunched {lo} m apart");
    }
    // The line inside the bend (the left side of a left turn) turns d·tan 15° short of it.
    let inside = [350.0 - d * 15f64.to_radians().tan(), d];
    let turns = p
        .paths
        .iter()
        .flatten()
        .any(|q| (q[0] - inside[0]).hypot(q[1] - inside[1]) < 1e-3);
    assert!(turns, "no line turns at {inside:?}: {:?}", p.paths);
}

#[test]
fn the_default_section_runs_across_the_trench() {
    let m = bent();
    let run = drydig::check::run::run(&m, None).expect("the demo checks");
    let (line, basis) = drydig::check::section::default_line(&run, None);
    assert!(basis.contains("across"), "{basis}");
    // Square to the leg it crosses: the direction is the normal of leg one (0, 1) or of leg
    // two (−sin 30°, cos 30°).
    let u = [line[1][0] - line[0][0], line[1][1] - line[0][1]];
    let l = u[0].hypot(u[1]);
    let along_one = u[0].abs() / l;
    let along_two = (u[0] * C30 + u[1] * S30).abs() / l;
    assert!(along_one.min(along_two) < 1e-6, "{line:?}");
    // Its middle is on the centre line.
    let mid = [
        (line[0][0] + line[1][0]) / 2.0,
        (line[0][1] + line[1][1]) / 2.0,
    ];
    assert!(line_dist(mid, &centre(0.0)) < 1e-3, "{mid:?}");
}

#[test]
fn the_straight_trench_keeps_its_wellpoints() {
    let m = load(&demo("pipeline_trench.toml")).unwrap();
    let spec = m.layout.as_ref().unwrap();
    let p = generate(&m, spec, 0.0).unwrap();
    // 400 m + 2 × 20 m at 1 m: 441 a side, at y = ±(1.5 + 1.0), x = −20 … 420 m.
    assert_eq!(p.wells.len(), 2 * 441);
    for side in ["L-", "R-"] {
        let mut xs: Vec<i64> = Vec::new();
        let mut ys = Vec::new();
        for w in p.wells.iter().filter(|w| w.name.starts_with(side)) {
            let x = w.position[0].round();
            assert!(
                (w.position[0] - x).abs() < 1e-9,
                "{} at {:?}",
                w.name,
                w.position
            );
            assert!(
                (w.position[1].abs() - 2.5).abs() < 1e-9,
                "{} at {:?}",
                w.name,
                w.position
            );
            xs.push(x as i64);
            ys.push(w.position[1].signum());
        }
        xs.sort_unstable();
        assert_eq!(xs, (-20..=420).collect::<Vec<i64>>(), "{side}");
        assert!(ys.iter().all(|s| *s == ys[0]), "{side} on one side");
    }
}
