//! `report.html` and `section.svg` of `drydig check`, run through the library on the demos:
//! every section present and self-contained, US units throughout a US demo (conversions by
//! NIST SP 811), the section's levels equal to the superposition at the same points, and the
//! section of one well in a confined aquifer equal to Thiem's formula.

use drydig::check::run::{self as check, CheckRun};
use drydig::check::section;
use drydig::input::import::crs::Reprojector;
use drydig::input::model::Model;
use drydig::input::validate::file as model;
use drydig::physics::potential::Level;
use drydig::report::html::page::SECTION_IDS;
use std::path::{Path, PathBuf};

fn demo(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn files_of(run: CheckRun) -> Vec<(String, Vec<u8>)> {
    let found = drydig::findings::check::CheckFindings::build(run, None);
    drydig::report::check_outputs::check_files(&found).expect("files render")
}

fn file<'a>(files: &'a [(String, Vec<u8>)], name: &str) -> &'a str {
    let (_, b) = files
        .iter()
        .find(|(n, _)| n == name)
        .unwrap_or_else(|| panic!("{name} missing"));
    std::str::from_utf8(b).expect("utf-8")
}

/// The text a reader sees: tags and inline drawings removed, entities decoded.
fn visible_text(html: &str) -> String {
    let mut out = String::new();
    let mut depth_svg = 0usize;
    let mut rest = html;
    while let Some(i) = rest.find('<') {
        if depth_svg == 0 {
            out.push_str(&rest[..i]);
        }
        let j = rest[i..].find('>').map_or(rest.len(), |j| i + j + 1);
        let tag = &rest[i..j];
        if tag.starts_with("<svg") {
            depth_svg += 1;
        } else if tag.starts_with("</svg") {
            depth_svg = depth_svg.saturating_sub(1);
        }
        rest = &rest[j..];
    }
    out.push_str(rest);
    out.replace("&amp;", "&")
        .replace("&lt;", "<")
        .replace("&gt;", ">")
        .replace("&quot;", "\"")
        .replace("&#39;", "'")
}

#[test]
fn report_has_every_section_and_nothing_external() {
    for name in [
        "riverside_basement.toml",
        "pipeline_trench.toml",
        "deep_shaft.toml",
        "leaky_underpass.toml",
    ] {
        let m = model::load(&demo(name)).unwrap();
        let run = check::run(&m, None).unwrap();
        let files = files_of(run);
        let html = file(&files, "report.html");
        for id in SECTION_IDS {
            assert!(
                html.contains(&format!("<section id=\"{id}\"")),
                "{name}: section {id} missing"
            );
        }
        assert!(html.starts_with("<!DOCTYPE html>"), "{name}");
        assert!(!html.contains("<script"), "{name}: no script");
        assert!(!html.contains("<img"), "{name}: drawings are inline");
        // The only web address is the SVG namespace name, which is never fetched.
        assert_eq!(
            html.matches("http").count(),
            html.matches("http://www.w3.org/2000/svg").count(),
            "{name}: an external reference"
        );
        assert!(!html.contains("src=\""), "{name}: no external source");
        assert!(html.contains("@page"), "{name}: print CSS");
        assert!(
            html.contains("href=\"checkpoints.csv\""),
            "{name}: link to the CSV"
        );
        assert!(
            html.contains("Dewatering check report"),
            "{name}: titled for check"
        );
        // Two drawings inline: the map and the section; ids unique over the page.
        assert!(html.matches("<svg").count() >= 2, "{name}");
        let mut ids: Vec<&str> = html
            .split(" id=\"")
            .skip(1)
            .filter_map(|s| s.split('"').next())
            .collect();
        let n = ids.len();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), n, "{name}: repeated ids");
        assert!(
            files.iter().any(|(n, _)| n == "section.svg"),
            "{name}: section.svg"
        );
        // Depths beside levels: common practice (no source) — "bgl", below ground level.
        assert!(html.contains(" bgl)"), "{name}: depths below ground");
    }
}

// US units: NIST SP 811 (2008), App. B: 1 ft = 0.3048 m, 1 US gal = 3.785 411 784 L. The
// underpass demo pumps 4.5 L/s per well = 4.5e-3·60/3.785411784e-3 = 71.3 gpm; its well W01
// stands at x = −3 m = −9.8 ft, y = 21 m = 68.9 ft.
#[test]
fn us_demo_report_and_map_show_no_si_unit() {
    let m = model::load(&demo("leaky_underpass.toml")).unwrap();
    assert_eq!(m.units, drydig::input::units::UnitSystem::Us);
    let run = check::run(&m, None).unwrap();
    let files = files_of(run);
    let html = file(&files, "report.html");
    // Snapshot of the wells table's head and first row's position and rate.
    assert!(
        html.contains(
            "<th class=\"n\">x (ft)</th><th class=\"n\">y (ft)</th><th class=\"n\">rate (gpm)</th>"
        ),
        "wells head"
    );
    assert!(
        html.contains("<td>W01</td><td class=\"n\">-9.8</td><td class=\"n\">68.9</td><td class=\"n\">71.3</td>"),
        "W01 row"
    );
    // The datum is the user's own words ("0.00 m = local datum"), quoted as given.
    let body = &html[html.find("<body>").unwrap()..];
    let text = visible_text(body).replace(&m.datum, "");
    for si in ["L/s", "m³", "m/s", " m ", " m)", "m²", "kPa", " mm"] {
        assert!(
            !text.contains(si),
            "SI unit {si:?} in the US report: …{}…",
            text.find(si)
                .map(|i| &text[i.saturating_sub(60)..(i + 20).min(text.len())])
                .unwrap_or("")
        );
    }
    // The map: legend, title and well labels in feet and gpm.
    let map = file(&files, "map.svg");
    assert!(map.contains("Legend — drawdown (ft)"), "legend");
    assert!(map.contains("71.3 gpm"), "well label");
    assert!(
        !map.contains("L/s") && !map.contains("m³"),
        "no SI flow on the map"
    );
    let section = file(&files, "section.svg");
    assert!(
        section.contains("level (ft)") && !section.contains("(m)"),
        "section axes"
    );
}

#[test]
fn section_levels_equal_the_superposition_at_the_same_points() {
    let m = model::load(&demo("riverside_basement.toml")).unwrap();
    let run = check::run(&m, None).unwrap();
    let s =
        drydig::findings::section::section_of(&run, &drydig::safety::neighbours::assess_run(&run));
    assert_eq!(s.samples.len(), section::SAMPLES);
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    // Field::level is the plain R-tree sum; the section comes from Field::levels (flat arrays
    // and far-field expansion): they must agree to 1e-9 m.
    for smp in &s.samples {
        let z = match run.field.level(smp.position, &rates) {
            Level::Wet(z) => Some(z),
            Level::Dry => None,
        };
        match (z, smp.level) {
            (Some(a), Some(b)) => assert!((a - b).abs() < 1e-9, "{a} {b}"),
            (a, b) => assert_eq!(a.is_some(), b.is_some()),
        }
    }
    // The basement is crossed, and the wells near the line are on it.
    assert_eq!(s.excavations.len(), 1);
    assert!(!s.wells.is_empty());
}

// Thiem (1906), confined steady flow: s(r) = Q/(2πT)·ln(R/r); Kruseman & de Ridder, Analysis
// and Evaluation of Pumping Test Data, 2nd ed. (1994), eq. 3.1. One well, Q = 10 L/s,
// T = K·b = 1e-4 m/s · 20 m, R fixed.
#[test]
fn section_of_one_well_follows_thiem() {
    let text = r#"
[site]
name = "one well"
ground_level = "10 m"
[aquifer]
kind = "confined"
conductivity = "1e-4 m/s"
base_level = "-20 m"
top_level = "0 m"
groundwater_level = "8 m"
storativity = 1e-4
[[excavation]]
name = "pit"
outline = [[-5, -5], [5, -5], [5, 5], [-5, 5]]
formation_level = "5 m"
target_margin = "0.5 m"
[influence]
method = "fixed"
distance = "300 m"
[wells]
radius = "0.15 m"
screen_top = "0 m"      # the whole confined layer: fully penetrating, so Thiem holds
screen_base = "-20 m"
pump_intake = "-17 m"
[layout]
kind = "listed"
[[well]]
name = "W1"
x = 0
y = 0
rate = "10 L/s"
[output]
section = [[0, 0], [200, 0]]
"#;
    let m: Model = model::from_str(Path::new("one.toml"), text).unwrap();
    let run = check::run(&m, None).unwrap();
    let r0 = run.field.radius_of_influence();
    let s = section::section(&run, m.output.section.unwrap(), "given");
    let t = 1e-4 * 20.0;
    for smp in s
        .samples
        .iter()
        .filter(|p| p.chainage > 1.0 && p.chainage < r0)
    {
        let thiem = 8.0 - 0.010 / (2.0 * std::f64::consts::PI * t) * (r0 / smp.chainage).ln();
        let z = smp.level.unwrap();
        assert!(
            (z - thiem).abs() < 1e-6,
            "r = {}: {z} vs {thiem}",
            smp.chainage
        );
    }
}

// A reprojection check point through the whole chain (design file → layout.geojson):
// Ordnance Survey, "A guide to coordinate systems in Great Britain", Annexe C worked example
// E 651409.903, N 313177.270; on WGS84 by the guide's Helmert transformation 52°39′28.723″N,
// 1°42′57.787″E (C. Veness, Movable Type Scripts geodesy, OsGridRef documentation example).
#[test]
fn geojson_with_a_crs_is_wgs84_lon_lat() {
    let (e, n) = (651_409.903, 313_177.270);
    let text = format!(
        r#"
[site]
name = "grid check"
ground_level = "10 m"
crs = "EPSG:27700"
[aquifer]
kind = "unconfined"
conductivity = "1e-4 m/s"
base_level = "-20 m"
groundwater_level = "8 m"
[[excavation]]
name = "pit"
outline = [[{e}, {n}], [{e2}, {n}], [{e2}, {n2}], [{e}, {n2}]]
formation_level = "6 m"
target_margin = "0.5 m"
[influence]
method = "fixed"
distance = "200 m"
[layout]
kind = "ring"
offset = "2 m"
count = 4
rate = "3 L/s"
"#,
        e2 = e + 10.0,
        n2 = n + 10.0
    );
    let m = model::from_str(Path::new("grid.toml"), &text).unwrap();
    let run = check::run(&m, None).unwrap();
    let fc: geojson::FeatureCollection = drydig::report::geojson_out::layout_geojson(
        &run,
        &drydig::safety::neighbours::assess_run(&run),
    )
    .parse()
    .unwrap();
    let first = fc
        .features
        .iter()
        .find(|f| f.property("kind").and_then(|k| k.as_str()) == Some("excavation"))
        .unwrap();
    let geojson::GeometryValue::Polygon { coordinates } = &first.geometry.as_ref().unwrap().value
    else {
        panic!("polygon")
    };
    let (lon, lat) = (coordinates[0][0][0], coordinates[0][0][1]);
    let dms = |d: f64, m: f64, s: f64| d + m / 60.0 + s / 3600.0;
    let m_per_deg = 111_195.0;
    let dy = (lat - dms(52.0, 39.0, 28.723)) * m_per_deg;
    let dx = (lon - dms(1.0, 42.0, 57.787)) * m_per_deg * lat.to_radians().cos();
    assert!(dx.hypot(dy) < 0.1, "{lon} {lat}: {dx} m, {dy} m off");
    assert_eq!(
        fc.foreign_members.as_ref().unwrap()["coordinate_system"],
        "WGS84 longitude/latitude (RFC 7946)"
    );
    // The CSVs keep the grid coordinates.
    let csv = String::from_utf8(drydig::report::tables::checkpoints_csv(&run).unwrap()).unwrap();
    assert!(
        csv.contains("651409.9") || csv.contains("651410"),
        "grid metres in the CSV"
    );
    // Same value as the reprojector alone.
    let (l2, b2) = Reprojector::new("EPSG:27700")
        .unwrap()
        .to_wgs84(e, n)
        .unwrap();
    assert!((l2 - lon).abs() < 1e-8 && (b2 - lat).abs() < 1e-8);
}

// The default map reaches the 0.5 m drawdown contour (common practice (no source): the edge of
// the cone asked about for neighbours and services), or the radius of influence.
#[test]
fn default_map_reaches_half_a_metre_of_drawdown() {
    let m = model::load(&demo("riverside_basement.toml")).unwrap();
    let run = check::run(&m, None).unwrap();
    let grid = drydig::field::grid::LevelGrid::for_run(&run.grid_source());
    let dd = grid.drawdowns();
    let mut edge_max: f64 = 0.0;
    for j in 0..grid.ny {
        for i in 0..grid.nx {
            let border = i == 0 || j == 0 || i == grid.nx - 1 || j == grid.ny - 1;
            if border && grid.on_aquifer_side(grid.node(i, j)) {
                edge_max = edge_max.max(dd[j * grid.nx + i]);
            }
        }
    }
    assert!(edge_max < 0.6, "drawdown at the map edge {edge_max} m");
}

#[test]
fn output_settings_are_used_and_checked() {
    let base = std::fs::read_to_string(demo("riverside_basement.toml")).unwrap();
    let text = base.replace(
        "map = \"drawdown\"",
        "map = \"drawdown\"\ncontour_interval = \"0.25 m\"\nmap_extent = \"40 m\"",
    );
    let m = model::from_str(Path::new("x.toml"), &text).unwrap();
    assert_eq!(m.output.contour_interval, Some(0.25));
    let run = check::run(&m, None).unwrap();
    let grid = drydig::field::grid::LevelGrid::for_run(&run.grid_source());
    let set = grid.contours(m.map_quantity);
    assert_eq!(set.interval, 0.25);
    // 40 m beyond the feature box (the basement, wells and neighbours span x −4 … 90 m).
    let b = grid.bounds();
    assert!(b[0] < -43.0 && b[0] > -60.0, "{b:?}");
    for (bad, field) in [
        ("section = [[0, 0]]", "output.section"),
        ("section = [[0, 0], [0.5, 0]]", "output.section"),
        ("contour_interval = \"-1 m\"", "output.contour_interval"),
        ("map_extent = \"0 m\"", "output.map_extent"),
    ] {
        let t = base.replace("map = \"drawdown\"", &format!("map = \"drawdown\"\n{bad}"));
        let e = model::from_str(Path::new("x.toml"), &t).unwrap_err();
        assert_eq!(e.field, field, "{e}");
    }
    let t = base.replace(
        "grid = \"local site grid\"",
        "grid = \"local site grid\"\ncrs = \"EPSG:4326\"",
    );
    let e = model::from_str(Path::new("x.toml"), &t).unwrap_err();
    assert!(
        e.field == "site.crs" && e.message.contains("projected"),
        "{e}"
    );
}
