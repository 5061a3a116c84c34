//! Drawings and input files drydig must refuse with a clear message naming the user's file:
//! the DXF corpus in `tests/bad_inputs/drawings/` (written by scripts/dxf_fixtures.py with
//! ezdxf; each file's first DXF comment says what is wrong), and non-regular files (a FIFO,
//! `/dev/zero`, a folder) given to every reader, made at test time.

use drydig::input::import::dxf_in::{self, DxfOptions};
use std::path::{Path, PathBuf};
use std::process::Command;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// (file, layer, fragment the message must hold).
const CASES: &[(&str, &str, &str)] = &[
    ("nan_bulge.dxf", "PIT", "bulge of vertex 2 is NaN"),
    ("tilted_circle.dxf", "WELLS", "tilted plane"),
    (
        "duplicate_well_names.dxf",
        "WELLS",
        "two wells are named \"W1\"",
    ),
    ("spline_outline.dxf", "PIT", "SPLINE"),
    ("block_inserts_itself.dxf", "WELLS", "inserts itself"),
];

#[test]
fn bad_drawings_are_refused_naming_the_drawing_and_entity() {
    let dir = root().join("tests/bad_inputs/drawings");
    let mut files: Vec<String> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    files.sort();
    let mut listed: Vec<String> = CASES.iter().map(|c| c.0.to_string()).collect();
    listed.sort();
    assert_eq!(
        files, listed,
        "every corpus drawing has a case and every case its drawing"
    );
    for (file, layer, fragment) in CASES {
        let path = dir.join(file);
        let text = std::fs::read_to_string(&path).unwrap();
        assert!(
            text.starts_with("999\n"),
            "{file}: no comment saying what is wrong"
        );
        let e = dxf_in::read(&path, &DxfOptions::layer(*layer))
            .expect_err(&format!("{file} must be refused"));
        assert_eq!(e.file, path, "{file}: the message names the drawing");
        assert!(e.message.contains(fragment), "{file}: {e}");
        assert!(e.field.contains("handle"), "{file}: names the entity: {e}");
    }
}

fn drydig(args: &[&str]) -> (Option<i32>, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs");
    (
        out.status.code(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

/// A design file (the DXF demo) whose excavation outline is read from `drawing`.
fn design_reading(dir: &Path, drawing: &Path) -> PathBuf {
    let text = std::fs::read_to_string(root().join("layouts/riverside_basement_drawing.toml"))
        .unwrap()
        .replace(
            "\"drawings/",
            &format!("\"{}/layouts/drawings/", root().display()),
        )
        .replacen(
            &format!("{}/layouts/drawings/riverside_site.dxf", root().display()),
            &drawing.display().to_string(),
            1,
        );
    let p = dir.join("design.toml");
    std::fs::write(&p, text).unwrap();
    p
}

// #19.3: a FIFO hangs a blocking reader, /dev/zero never ends, a folder is no file: every reader
// refuses each at once (exit 2) naming the path. The FIFO has no writer: a blocking open would
// hang this test.
#[test]
fn every_reader_refuses_non_regular_files() {
    let dir = tempfile::tempdir().unwrap();
    let fifo = dir.path().join("pipe");
    rustix::fs::mkfifoat(
        rustix::fs::CWD,
        &fifo,
        rustix::fs::Mode::from_raw_mode(0o600),
    )
    .unwrap();
    let demo = root().join("layouts/riverside_basement.toml");
    let demo = demo.to_str().unwrap();
    let out = dir.path().join("out");
    let out = out.to_str().unwrap();
    for bad in [fifo.as_path(), Path::new("/dev/zero"), dir.path()] {
        let b = bad.to_str().unwrap();
        let runs: Vec<(&str, Vec<&str>)> = vec![
            ("design file", vec!["estimate", b]),
            ("wells CSV", vec!["check", demo, "-o", out, "--wells", b]),
            ("prices", vec!["design", demo, "-o", out, "--prices", b]),
            (
                "pumping test",
                vec![
                    "pumping-test",
                    b,
                    "--rate",
                    "5 L/s",
                    "--distance",
                    "10 m",
                    "-o",
                    out,
                ],
            ),
        ];
        for (what, args) in runs {
            let (code, err) = drydig(&args);
            assert_eq!(code, Some(2), "{what} {b}: {err}");
            assert!(
                err.contains(b) && err.contains("not a regular file"),
                "{what} {b}: {err}"
            );
        }
        // The drawings a design file names: a DXF and a GeoJSON path.
        for ext in ["dxf", "geojson"] {
            let link = dir.path().join(format!("site_{}.{ext}", b.len()));
            std::os::unix::fs::symlink(bad, &link).unwrap();
            let design = design_reading(&dir.path().join(""), &link);
            let design = if ext == "geojson" {
                let t = std::fs::read_to_string(&design).unwrap().replacen(
                    "layer = \"EXCAVATION\"",
                    "layer = \"excavation\"",
                    1,
                );
                std::fs::write(&design, t).unwrap();
                design
            } else {
                design
            };
            let (code, err) = drydig(&["estimate", design.to_str().unwrap()]);
            assert_eq!(code, Some(2), "{ext} {b}: {err}");
            assert!(
                err.contains(link.to_str().unwrap()) && err.contains("not a regular file"),
                "{ext} {b}: {err}"
            );
        }
    }
}
