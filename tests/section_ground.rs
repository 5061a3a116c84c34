//! The section drawing below ground: a cut-off wall stands where the section line crosses it,
//! and layered ground names each of its layers, in the run's units.
//!
//! The wall's place is computed here by plain plane geometry (the crossing of two straight
//! segments; common practice (no source)) from the wall's vertices in the demo and a section
//! line given in `[output] section`, then mapped to the drawing's x by its frame (80 to 920
//! SVG units for the line's length, as written in `src/report/section_svg.rs`).

use std::path::{Path, PathBuf};
use std::process::Command;

fn demo(name: &str) -> String {
    let path = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name);
    std::fs::read_to_string(path).expect("demo readable")
}

/// Runs `check` on `text` (written to a temporary file) and returns section.svg.
fn section_svg(text: &str) -> String {
    let dir = tempfile::tempdir().expect("temp dir");
    let file: PathBuf = dir.path().join("design.toml");
    std::fs::write(&file, text).unwrap();
    let out = dir.path().join("out");
    let run = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .arg("check")
        .arg(&file)
        .arg("-o")
        .arg(&out)
        .output()
        .expect("drydig runs");
    // 0: every target met; 3: some not met — both write the outputs
    assert!(
        matches!(run.status.code(), Some(0) | Some(3)),
        "check failed: {}",
        String::from_utf8_lossy(&run.stderr)
    );
    std::fs::read_to_string(out.join("section.svg")).expect("section.svg written")
}

/// Crossing of a–b with p–q as the fraction along a–b, when the segments meet.
fn crossing(a: [f64; 2], b: [f64; 2], p: [f64; 2], q: [f64; 2]) -> Option<f64> {
    // solve a + t (b − a) = p + u (q − p) by Cramer's rule
    let (a11, a12, a21, a22) = (b[0] - a[0], p[0] - q[0], b[1] - a[1], p[1] - q[1]);
    let (r1, r2) = (p[0] - a[0], p[1] - a[1]);
    let det = a11 * a22 - a12 * a21;
    if det.abs() < 1e-12 {
        return None;
    }
    let t = (r1 * a22 - a12 * r2) / det;
    let u = (a11 * r2 - r1 * a21) / det;
    ((0.0..=1.0).contains(&t) && (0.0..=1.0).contains(&u)).then_some(t)
}

/// The x1 of every `<line class="wall" …>` in the drawing.
fn wall_xs(svg: &str) -> Vec<f64> {
    svg.split(r#"<line class="wall" x1=""#)
        .skip(1)
        .map(|rest| rest.split('"').next().unwrap().parse().unwrap())
        .collect()
}

/// The wall vertices of walled_basement.toml, read from its `line = [[x, y], …]`.
fn wall_vertices(text: &str) -> Vec<[f64; 2]> {
    let table: toml::Table = text.parse().expect("demo is TOML");
    table["wall"].as_array().unwrap()[0]["line"]
        .as_array()
        .unwrap()
        .iter()
        .map(|v| {
            let xy = v.as_array().unwrap();
            let num = |x: &toml::Value| x.as_float().or(x.as_integer().map(|i| i as f64)).unwrap();
            [num(&xy[0]), num(&xy[1])]
        })
        .collect()
}

#[test]
fn walled_demo_section_shows_the_wall_where_the_line_crosses_it() {
    let text = demo("walled_basement.toml");
    let (a, b) = ([0.0, 0.0], [100.0, 100.0]);
    let with_line = text.replace(
        "[output]\n",
        "[output]\nsection = [[0.0, 0.0], [100.0, 100.0]]\n",
    );
    assert_ne!(with_line, text, "the demo has an [output] table");
    let vertices = wall_vertices(&text);
    let expected: Vec<f64> = vertices
        .windows(2)
        .filter_map(|w| crossing(a, b, w[0], w[1]))
        .map(|t| 80.0 + 840.0 * t)
        .collect();
    assert_eq!(expected.len(), 1, "the chosen line crosses the wall once");
    let svg = section_svg(&with_line);
    let drawn = wall_xs(&svg);
    assert_eq!(drawn.len(), 1, "one wall bar drawn: {drawn:?}");
    assert!(
        (drawn[0] - expected[0]).abs() < 0.15,
        "wall drawn at x = {}, the line crosses it at x = {}",
        drawn[0],
        expected[0]
    );
    assert!(
        svg.contains("Terrace sheet piles: toe -12.00 m"),
        "wall named with its toe"
    );
}

/// Page x of every well drawn (its casing line, 1.2 px) and of the wall label's baseline.
fn well_and_label_xs(svg: &str) -> (Vec<f64>, Vec<f64>) {
    let wells = svg
        .split("<line x1=\"")
        .skip(1)
        .filter(|rest| {
            rest.split('>')
                .next()
                .unwrap()
                .contains(r##"stroke="#222" stroke-width="1.2""##)
        })
        .map(|rest| rest.split('"').next().unwrap().parse().unwrap())
        .collect();
    let labels = svg
        .split(r#"<line class="wall""#)
        .skip(1)
        .map(|rest| {
            let after = rest.split("rotate(-90 ").nth(1).unwrap();
            after.split(' ').next().unwrap().parse().unwrap()
        })
        .collect();
    (wells, labels)
}

// A section line through well W14 of the ring, (15, 47) m, and the wall 1 m north of it at
// y = 48 m: the wall's name, written up beside the wall (11 px text: about 10 px left of its
// baseline to 3 px right), must not cross the well's casing, screen or intake (±6 px).
#[test]
fn the_wall_label_keeps_clear_of_a_well_beside_the_wall() {
    let text = demo("walled_basement.toml").replace(
        "[output]\n",
        "[output]\nsection = [[15.0, -20.0], [15.0, 90.0]]\n",
    );
    let svg = section_svg(&text);
    let (wells, labels) = well_and_label_xs(&svg);
    let wall = wall_xs(&svg);
    // the line crosses the wall 68 m along its 110 m: x = 80 + 840 · 68/110
    assert!(
        (wall[0] - (80.0 + 840.0 * 68.0 / 110.0)).abs() < 0.15,
        "{wall:?}"
    );
    let near: Vec<f64> = wells
        .iter()
        .copied()
        .filter(|w| (w - wall[0]).abs() < 20.0)
        .collect();
    assert!(!near.is_empty(), "a well drawn beside the wall: {wells:?}");
    let (lo, hi) = (labels[0] - 10.0, labels[0] + 3.0);
    for w in &wells {
        assert!(
            hi < w - 6.0 || lo > w + 6.0,
            "label at {} crosses the well at {w}",
            labels[0]
        );
    }
}

#[test]
fn walled_demo_in_us_units_gives_the_toe_in_feet() {
    let text = demo("walled_basement.toml")
        .replace(
            "[output]\n",
            "[output]\nsection = [[0.0, 0.0], [100.0, 100.0]]\n",
        )
        .replace("units = \"si\"", "units = \"us\"");
    let svg = section_svg(&text);
    // −12.00 m = −39.37 ft (1 ft = 0.3048 m exactly, by definition), written to 0.1 ft
    assert!(
        svg.contains("Terrace sheet piles: toe -39.4 ft"),
        "toe level in feet"
    );
}

#[test]
fn layered_demo_section_names_each_layer() {
    let text = demo("layered_shaft.toml");
    let svg = section_svg(&text);
    let table: toml::Table = text.parse().unwrap();
    for layer in table["layer"].as_array().unwrap() {
        let name = layer["name"].as_str().unwrap();
        assert!(svg.contains(name), "section names the layer {name}");
    }
    // the sand's water table barely moves behind the clay while the gravel is relieved: two
    // level lines, each named
    assert!(svg.contains("level in sandy gravel"));
    assert!(svg.contains("level in aquifer"));
    let us = section_svg(&text.replace("units = \"si\"", "units = \"us\""));
    assert!(us.contains("stiff clay (aquitard)") && us.contains("level (ft)"));
}
