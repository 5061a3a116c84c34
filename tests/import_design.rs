//! Design files that take their geometry from drawings: the DXF demo
//! (`layouts/riverside_basement_drawing.toml`), a GeoJSON round trip (the layout written by
//! `check`, read back as the outline, gives the same result), wells from a drawing, and the
//! errors for what cannot be read.

use drydig::check::run as check;
use drydig::input::validate::file as model;
use std::path::PathBuf;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn dxf() -> String {
    root()
        .join("layouts/drawings/riverside_site.dxf")
        .display()
        .to_string()
}

fn demo_text() -> String {
    std::fs::read_to_string(root().join("layouts/riverside_basement_drawing.toml")).unwrap()
}

/// The demo with its references pointed at absolute paths, one reference replaced.
fn variant(from: &str, to: &str) -> String {
    let t = demo_text().replace(
        "\"drawings/",
        &format!("\"{}/layouts/drawings/", root().display()),
    );
    assert!(t.contains(from), "{from}");
    t.replacen(from, to, 1)
}

fn load_text(text: &str) -> Result<drydig::input::model::Model, drydig::input::error::InputError> {
    let dir = tempfile::tempdir().unwrap();
    let p = dir.path().join("design.toml");
    std::fs::write(&p, text).unwrap();
    model::load(&p)
}

// The excavation in the demo drawing is the L of layouts/drawings (examples/riverside_drawing.rs):
// vertices (1000, 2000), (1040, 2000), (1040, 2015), (1020, 2015), (1020, 2030), (1000, 2030) m
// (drawn in mm). Area by hand: 40·15 + 20·15 = 900 m².
#[test]
fn demo_reads_the_site_from_the_dxf_drawing() {
    let m = model::load(&root().join("layouts/riverside_basement_drawing.toml")).unwrap();
    let e = &m.excavations[0];
    let area = geo::Area::unsigned_area(&e.outline);
    assert!((area - 900.0).abs() < 1e-6, "{area}");
    let xs: Vec<f64> = e.outline.exterior().0.iter().map(|c| c.x).collect();
    assert!(xs.iter().all(|x| (1000.0..=1040.0).contains(x)));
    assert_eq!(m.neighbours.len(), 2);
    assert_eq!(m.boundaries.len(), 1);
    // The river bank line from the drawing's first LINE: (970, 1960) to (978, 2020) m.
    let b = m.boundaries[0].line;
    assert!(
        (b[0][0] - 970.0).abs() < 1e-9 && (b[1][1] - 2020.0).abs() < 1e-9,
        "{b:?}"
    );
    // The north building's rounded corner was flattened, and the report says so.
    assert!(
        m.import_notes.iter().any(|n| n
            .words(drydig::input::units::UnitSystem::Si)
            .contains("flattened")),
        "{:?}",
        m.import_notes
    );
    assert!(
        m.import_notes.iter().any(|n| n
            .words(drydig::input::units::UnitSystem::Si)
            .contains("mm converted")),
        "{:?}",
        m.import_notes
    );
    let run = check::run(&m, None).unwrap();
    let found = drydig::findings::check::CheckFindings::build(run, None);
    let files = drydig::report::check_outputs::check_files(&found).unwrap();
    let html = &files.iter().find(|(n, _)| n == "report.html").unwrap().1;
    assert!(String::from_utf8_lossy(html).contains("flattened"));
}

#[test]
fn geojson_round_trip_gives_the_same_outline_and_result() {
    // Without a CRS, layout.geojson is written in the site grid.
    let text = variant("crs = \"+proj", "# crs = \"+proj");
    let first = load_text(&text).unwrap();
    let run1 = check::run(&first, None).unwrap();
    let gj = drydig::report::geojson_out::layout_geojson(
        &run1,
        &drydig::safety::neighbours::assess_run(&run1),
    );
    let dir = tempfile::tempdir().unwrap();
    let gj_path = dir.path().join("layout.geojson");
    std::fs::write(&gj_path, gj).unwrap();
    let from_dxf = format!(
        "outline_from = {{ file = \"{}\", layer = \"EXCAVATION\" }}",
        dxf()
    );
    let from_gj = format!(
        "outline_from = {{ file = \"{}\", property = \"kind\", value = \"excavation\" }}",
        gj_path.display()
    );
    let second = load_text(&text.replacen(&from_dxf, &from_gj, 1)).unwrap();
    let (a, b) = (
        &first.excavations[0].outline,
        &second.excavations[0].outline,
    );
    let va: Vec<_> = a.exterior().0.iter().collect();
    let vb: Vec<_> = b.exterior().0.iter().collect();
    assert_eq!(va.len(), vb.len());
    for (p, q) in va.iter().zip(&vb) {
        assert!(
            (p.x - q.x).abs() < 1e-9 && (p.y - q.y).abs() < 1e-9,
            "{p:?} {q:?}"
        );
    }
    let run2 = check::run(&second, None).unwrap();
    let (e1, e2) = (&run1.evaluation, &run2.evaluation);
    assert_eq!(e1.points.len(), e2.points.len());
    assert!((e1.total_abstraction_m3_per_s - e2.total_abstraction_m3_per_s).abs() < 1e-15);
    for (p, q) in e1.points.iter().zip(&e2.points) {
        assert!((p.drawdown_m - q.drawdown_m).abs() < 1e-9);
    }
}

// The drawing's WELLS layer holds two CIRCLEs of radius 150 mm at (1010, 2008) and
// (1030, 2008) m.
#[test]
fn wells_from_a_drawing() {
    let text = variant("kind = \"ring\"", "kind = \"listed\"").replacen(
        "rate = \"7.0 L/s\"",
        &format!(
            "wells_from = {{ file = \"{}\", layer = \"WELLS\", rate = \"4 L/s\" }}",
            dxf()
        ),
        1,
    );
    let m = load_text(&text).unwrap();
    let run = check::run(&m, None).unwrap();
    let w = &run.placement.wells;
    assert_eq!(w.len(), 2);
    assert!((w[0].radius - 0.15).abs() < 1e-12);
    assert!((w[0].position[0] - 1010.0).abs() < 1e-9 && (w[1].position[0] - 1030.0).abs() < 1e-9);
    assert!(w.iter().all(|w| (w.rate - 0.004).abs() < 1e-15));
}

#[test]
fn errors_name_what_is_wrong_and_what_would_do() {
    let layer = |l: &str| variant("layer = \"EXCAVATION\" }", &format!("layer = \"{l}\" }}"));
    // Only open lines on the layer.
    let e = load_text(&layer("RIVER")).unwrap_err();
    assert!(
        e.message.contains("open lines") && e.message.contains("closed polyline"),
        "{e}"
    );
    // No such layer: the layers present are listed.
    let e = load_text(&layer("BASEMENT")).unwrap_err();
    assert!(
        e.message.contains("EXCAVATION, NEIGHBOURS, RIVER, WELLS"),
        "{e}"
    );
    // Two outlines and no name.
    let e = load_text(&layer("NEIGHBOURS")).unwrap_err();
    assert!(
        e.field.ends_with("outline_from.name") && e.message.contains("NEIGHBOURS 1"),
        "{e}"
    );
    // A name that is not there.
    let e = load_text(&variant(
        "name = \"NEIGHBOURS 2\"",
        "name = \"NEIGHBOURS 9\"",
    ))
    .unwrap_err();
    assert!(
        e.message.contains("no outline named") && e.message.contains("NEIGHBOURS 1"),
        "{e}"
    );
    // Unknown key, missing file, wrong kind of file, both outline and outline_from.
    let e = load_text(&variant(
        "layer = \"EXCAVATION\" }",
        "layr = \"EXCAVATION\" }",
    ))
    .unwrap_err();
    assert!(e.message.contains("unknown key `layr`"), "{e}");
    let e = load_text(&variant(
        "riverside_site.dxf\", layer = \"EXCAVATION\"",
        "nothere.dxf\", layer = \"EXCAVATION\"",
    ))
    .unwrap_err();
    assert!(
        e.message.contains("cannot") || e.message.contains("read"),
        "{e}"
    );
    let e = load_text(&variant(
        "riverside_site.dxf\", layer = \"EXCAVATION\"",
        "site.pdf\", layer = \"EXCAVATION\"",
    ))
    .unwrap_err();
    assert!(e.message.contains(".dxf or .geojson"), "{e}");
    let e = load_text(&variant(
        "formation_level = \"0.2 m\"",
        "outline = [[0, 0], [1, 0], [1, 1]]\nformation_level = \"0.2 m\"",
    ))
    .unwrap_err();
    assert!(
        e.message.contains("either `outline` or `outline_from`"),
        "{e}"
    );
    // A drawing unit that is not one.
    let e = load_text(&variant(
        "layer = \"EXCAVATION\" }",
        "layer = \"EXCAVATION\", units = \"furlong\" }",
    ))
    .unwrap_err();
    assert!(e.message.contains("mm, cm, m, ft, in"), "{e}");
}

// #19.4: a well listed in the design file and a well of the drawing with the same name: the
// message names the drawing, the layer and the entity the second came from, and no line of the
// text drydig rewrote internally (the design file has no line for a well from a drawing).
#[test]
fn duplicate_name_from_a_drawing_cites_the_drawing() {
    let text = variant("kind = \"ring\"", "kind = \"listed\"").replacen(
        "rate = \"7.0 L/s\"",
        &format!(
            "wells_from = {{ file = \"{}\", layer = \"WELLS\", rate = \"4 L/s\" }}",
            dxf()
        ),
        1,
    ) + "\n[[well]]\nname = \"WELLS 2\"\nx = 1020.0\ny = 2040.0\nrate = \"1 L/s\"\n";
    let e = load_text(&text).unwrap_err();
    assert!(e.field.starts_with("well["), "{e}");
    assert!(e.message.contains("riverside_site.dxf, layer WELLS"), "{e}");
    assert!(e.message.contains("handle"), "{e}");
    assert_eq!(e.line, None, "{e}");
}
