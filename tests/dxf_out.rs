//! `design.dxf` read back by ezdxf (scripts/read_design_dxf.py): wells, excavation, set-out
//! lines and section in the drawing's unit and grid, compared with the layout drydig computed.
//! The DXF demo's drawing is in millimetres, so design.dxf must be too (same grid, × 1000);
//! a design file without a drawing gets metres.

use drydig::check::run as check;
use drydig::input::validate::file as model;
use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::Command;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// Run `drydig check` on a demo and read its design.dxf with ezdxf.
fn check_and_read(demo: &str, out: &Path) -> Value {
    let status = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .arg("check")
        .arg(root().join("layouts").join(demo))
        .arg("-o")
        .arg(out)
        .output()
        .expect("drydig runs");
    assert!(
        matches!(status.status.code(), Some(0) | Some(3)),
        "{}",
        String::from_utf8_lossy(&status.stderr)
    );
    let manifest = std::fs::read_to_string(out.join("drydig-run.json")).unwrap();
    assert!(
        manifest.contains("\"design.dxf\""),
        "design.dxf in the manifest"
    );
    let py = Command::new("python3")
        .arg(root().join("scripts/read_design_dxf.py"))
        .arg(out.join("design.dxf"))
        .output()
        .expect("python3 runs (ezdxf from scripts/requirements.txt)");
    assert!(
        py.status.success(),
        "ezdxf could not read design.dxf: {}",
        String::from_utf8_lossy(&py.stderr)
    );
    serde_json::from_slice(&py.stdout).unwrap()
}

fn compare(demo: &str, unit_code: i64, metres_per_unit: f64) {
    let dir = tempfile::tempdir().unwrap();
    let got = check_and_read(demo, dir.path());
    let m = model::load(&root().join("layouts").join(demo)).unwrap();
    let run = check::run(&m, None).unwrap();
    // $INSUNITS: 4 millimetres, 6 metres (DXF reference, HEADER section).
    assert_eq!(got["insunits"], unit_code);
    assert_eq!(got["audit_errors"], 0);
    let at = |v: &Value| {
        [
            v["x"].as_f64().unwrap() * metres_per_unit,
            v["y"].as_f64().unwrap() * metres_per_unit,
        ]
    };
    let points: Vec<&Value> = got["points"].as_array().unwrap().iter().collect();
    assert_eq!(points.len(), run.placement.wells.len());
    for w in &run.placement.wells {
        // Written to 0.1 mm.
        let p = points
            .iter()
            .find(|p| {
                let q = at(p);
                (q[0] - w.position[0]).hypot(q[1] - w.position[1]) < 1e-4
            })
            .unwrap_or_else(|| panic!("{demo}: well {} not in design.dxf", w.name));
        assert_eq!(p["layer"], "DRYDIG-WELLS");
        let named = got["texts"].as_array().unwrap().iter().any(|t| {
            t["layer"] == "DRYDIG-WELL-NAMES" && t["text"].as_str() == Some(w.name.as_str())
        });
        assert!(named, "{demo}: no name text for {}", w.name);
    }
    for c in got["circles"].as_array().unwrap() {
        let r = c["r"].as_f64().unwrap() * metres_per_unit;
        assert!((r - m.wells.radius).abs() < 1e-9, "{r}");
    }
    let polylines = got["polylines"].as_array().unwrap();
    let excavation: Vec<&Value> = polylines
        .iter()
        .filter(|p| p["layer"] == "DRYDIG-EXCAVATION")
        .collect();
    assert_eq!(excavation.len(), m.excavations.len());
    let ring = &m.excavations[0].outline.exterior().0;
    for (i, v) in excavation[0]["points"]
        .as_array()
        .unwrap()
        .iter()
        .enumerate()
    {
        let x = v[0].as_f64().unwrap() * metres_per_unit;
        let y = v[1].as_f64().unwrap() * metres_per_unit;
        assert!((x - ring[i].x).hypot(y - ring[i].y) < 1e-4, "vertex {i}");
    }
    assert!(polylines.iter().any(|p| p["layer"] == "DRYDIG-SETOUT"));
    assert!(polylines.iter().any(|p| p["layer"] == "DRYDIG-CONTOURS"));
    let section = got["lines"]
        .as_array()
        .unwrap()
        .iter()
        .find(|l| l["layer"] == "DRYDIG-SECTION")
        .expect("section line");
    let a = &section["ends"][0];
    let s =
        drydig::findings::section::section_of(&run, &drydig::safety::neighbours::assess_run(&run));
    let x = a[0].as_f64().unwrap() * metres_per_unit;
    assert!((x - s.line[0][0]).abs() < 1e-4, "{x} vs {:?}", s.line);
}

#[test]
fn design_dxf_reads_back_in_the_drawings_millimetres() {
    compare("riverside_basement_drawing.toml", 4, 0.001);
}

#[test]
fn design_dxf_reads_back_in_metres_without_a_drawing() {
    compare("riverside_basement.toml", 6, 1.0);
}
