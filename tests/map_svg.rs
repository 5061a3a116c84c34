//! The map (`map.svg`) and the GeoJSON outputs of `drydig check`, run through the library on the
//! demo layouts and on a one-well design whose drawdown contours must be Thiem circles.
//!
//! The SVG is read back with the `svg` crate's parser, so the checks see what a viewer sees:
//! the layer groups and their order, the well symbols, the contour labels, the caution text.

use drydig::caution::CAUTION;
use drydig::check::run::{self as check, CheckRun};
use drydig::field::grid::LevelGrid;
use drydig::input::model::Model;
use drydig::input::validate::file as model;
use drydig::report::geojson_out::{contours_geojson, layout_geojson};
use drydig::report::map::render::map_svg;
use geojson::{FeatureCollection, GeometryValue};
use std::collections::HashMap;
use std::f64::consts::PI;
use std::path::{Path, PathBuf};
use svg::parser::Event;

/// The layer groups of the map, in the order they are stacked.
const LAYERS: [&str; 19] = [
    "bands",
    "far-side",
    "contours",
    "paths",
    "keep-outs",
    "neighbours",
    "excavations",
    "boundaries",
    "dry-area",
    "wells",
    "failed-points",
    "excavation-labels",
    "contour-labels",
    "frame",
    "legend",
    "scale-bar",
    "north-arrow",
    "title-block",
    "caution",
];

fn layout(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn load(path: &Path) -> Model {
    model::load(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

fn run(model: &Model) -> CheckRun<'_> {
    check::run(model, None).unwrap_or_else(|e| panic!("check: {e}"))
}

/// What the tests need from a parsed SVG.
#[derive(Default, Debug)]
struct SvgFacts {
    /// Ids of groups in document order.
    group_ids: Vec<String>,
    /// Classes of groups in document order, with the ids of the groups around them.
    group_classes: Vec<(String, Vec<String>)>,
    /// (class of the <text>, ids of the groups it sits in, its content).
    texts: Vec<(String, Vec<String>, String)>,
    /// Path data of paths by class.
    paths: Vec<(String, String)>,
    /// The root element's attributes.
    root: HashMap<String, String>,
}

fn ids_of(stack: &[String]) -> Vec<String> {
    stack.iter().filter(|s| !s.is_empty()).cloned().collect()
}

/// Well symbols in the main plan's `wells` layer.
fn well_symbols(f: &SvgFacts) -> usize {
    f.group_classes
        .iter()
        .filter(|(c, ids)| {
            (c == "well pumping" || c == "well recharge") && ids.iter().any(|i| i == "wells")
        })
        .count()
}

fn parse_svg(doc: &str) -> SvgFacts {
    let mut f = SvgFacts::default();
    let mut stack: Vec<String> = Vec::new();
    let mut in_text: Option<String> = None;
    let parser = svg::read(doc).unwrap_or_else(|e| panic!("the map does not parse: {e}"));
    for event in parser {
        match event {
            Event::Error(e) => panic!("the map does not parse: {e}"),
            Event::Tag(name, kind, attrs) => {
                let get = |k: &str| attrs.get(k).map(|v| v.to_string()).unwrap_or_default();
                match (name, kind) {
                    ("svg", svg::node::element::tag::Type::Start) => {
                        f.root = attrs
                            .iter()
                            .map(|(k, v)| (k.clone(), v.to_string()))
                            .collect();
                    }
                    ("g", svg::node::element::tag::Type::Start) => {
                        let id = get("id");
                        if !id.is_empty() {
                            f.group_ids.push(id.clone());
                        }
                        f.group_classes.push((get("class"), ids_of(&stack)));
                        stack.push(id);
                    }
                    ("g", svg::node::element::tag::Type::Empty) => {
                        let id = get("id");
                        if !id.is_empty() {
                            f.group_ids.push(id);
                        }
                        f.group_classes.push((get("class"), ids_of(&stack)));
                    }
                    ("g", svg::node::element::tag::Type::End) => {
                        stack.pop();
                    }
                    ("text", svg::node::element::tag::Type::Start) => {
                        in_text = Some(get("class"));
                    }
                    ("text", svg::node::element::tag::Type::End) => in_text = None,
                    ("path", _) => f.paths.push((get("class"), get("d"))),
                    _ => {}
                }
            }
            Event::Text(t) => {
                if let Some(class) = &in_text {
                    f.texts.push((class.clone(), ids_of(&stack), t.to_string()));
                }
            }
            _ => {}
        }
    }
    f
}

fn texts_in<'a>(f: &'a SvgFacts, group: &str) -> Vec<&'a str> {
    f.texts
        .iter()
        .filter(|t| t.1.iter().any(|g| g == group))
        .map(|t| t.2.as_str())
        .collect()
}

fn number(s: &str) -> f64 {
    s.trim()
        .replace('\u{2212}', "-")
        .parse::<f64>()
        .unwrap_or_else(|e| panic!("label \"{s}\" is not a number: {e}"))
}

/// The contour interval the legend states ("contour every 0.5 m").
fn legend_interval(f: &SvgFacts) -> f64 {
    let line = texts_in(f, "legend")
        .into_iter()
        .find(|t| t.starts_with("contour every "))
        .unwrap_or_else(|| panic!("no contour interval in the legend"));
    number(
        line.trim_start_matches("contour every ")
            .trim_end_matches(" m"),
    )
}

fn is_multiple(v: f64, interval: f64) -> bool {
    let k = v / interval;
    (k - k.round()).abs() < 1e-6
}

/// Everything the demo checks need, for one layout.
struct Demo {
    facts: SvgFacts,
    wells: usize,
    unmet: usize,
}

fn demo(file: &str) -> (Demo, String, String, f64) {
    let model = load(&layout(file));
    let r = run(&model);
    let grid = LevelGrid::for_run(&r.grid_source());
    let doc = map_svg(&r, &grid, "2025-01-31");
    let facts = parse_svg(&doc);
    let d = Demo {
        facts,
        wells: r.placement.wells.len(),
        unmet: r.evaluation.unmet_count,
    };
    (
        d,
        layout_geojson(&r, &drydig::safety::neighbours::assess_run(&r)),
        contours_geojson(&r, &grid),
        grid.step,
    )
}

fn check_structure(d: &Demo, expected_wells: usize) {
    let f = &d.facts;
    // Landscape page with a view box.
    assert_eq!(
        f.root.get("viewBox").map(String::as_str),
        Some("0 0 1400 1000")
    );
    // Every layer group once, in the stacking order.
    let positions: Vec<usize> = LAYERS
        .iter()
        .map(|id| {
            let hits: Vec<usize> = f
                .group_ids
                .iter()
                .enumerate()
                .filter(|(_, g)| g == id)
                .map(|(i, _)| i)
                .collect();
            assert_eq!(
                hits.len(),
                1,
                "group id \"{id}\" must appear once: {hits:?}"
            );
            hits[0]
        })
        .collect();
    assert!(
        positions.windows(2).all(|w| w[0] < w[1]),
        "layers out of order: {:?}",
        f.group_ids
    );
    // One symbol per well, as many as the design file's layout places.
    let symbols = well_symbols(f);
    assert_eq!(symbols, d.wells);
    assert_eq!(symbols, expected_wells);
    // One cross per failed check point.
    let crosses: usize = f
        .paths
        .iter()
        .filter(|(c, _)| c == "failed-point")
        .map(|(_, d)| d.matches('M').count() / 2)
        .sum();
    assert_eq!(crosses, d.unmet);
    // The caution, whole, in its footer.
    let footer = texts_in(f, "caution").join(" ");
    let words = |s: &str| s.split_whitespace().collect::<Vec<_>>().join(" ");
    assert_eq!(words(&footer), words(&format!("CAUTION — {CAUTION}")));
    // A north arrow that says N, and a scale bar ending in metres.
    assert!(texts_in(f, "north-arrow").contains(&"N"));
    assert!(texts_in(f, "scale-bar").iter().any(|t| t.ends_with(" m")));
}

/// Contour labels: multiples of a "nice" interval, and there are some.
fn check_labels(d: &Demo, lo: f64, hi: f64) -> Vec<f64> {
    let f = &d.facts;
    let interval = legend_interval(f);
    let mantissa = interval / 10f64.powf(interval.log10().floor());
    assert!(
        [1.0, 2.0, 2.5, 5.0]
            .iter()
            .any(|m| (m - mantissa).abs() < 1e-9),
        "interval {interval} is not 1, 2, 2.5 or 5 × 10^k"
    );
    let labels: Vec<f64> = f
        .texts
        .iter()
        .filter(|t| t.0 == "contour-label")
        .map(|t| number(&t.2))
        .collect();
    assert!(labels.len() >= 5, "only {} contour labels", labels.len());
    for v in &labels {
        assert!(
            is_multiple(*v, interval),
            "label {v} is not a multiple of {interval}"
        );
        assert!(*v > lo && *v < hi, "label {v} outside ({lo}, {hi})");
    }
    labels
}

fn parse_fc(s: &str) -> FeatureCollection {
    s.parse::<FeatureCollection>()
        .unwrap_or_else(|e| panic!("GeoJSON does not parse: {e}"))
}

fn kinds(fc: &FeatureCollection) -> HashMap<String, usize> {
    let mut m = HashMap::new();
    for f in &fc.features {
        let k = f
            .property("kind")
            .and_then(|v| v.as_str())
            .unwrap_or("?")
            .to_string();
        *m.entry(k).or_insert(0) += 1;
    }
    m
}

fn all_points(g: &GeometryValue) -> Vec<[f64; 2]> {
    let p = |c: &geojson::Position| [c.as_slice()[0], c.as_slice()[1]];
    match g {
        GeometryValue::Point { coordinates } => vec![p(coordinates)],
        GeometryValue::LineString { coordinates } => coordinates.iter().map(p).collect(),
        GeometryValue::MultiLineString { coordinates } | GeometryValue::Polygon { coordinates } => {
            coordinates.iter().flatten().map(p).collect()
        }
        _ => Vec::new(),
    }
}

#[test]
fn deep_shaft_map_structure_and_labels() {
    let (d, layout_gj, contours_gj, _) = demo("deep_shaft.toml");
    // layouts/deep_shaft.toml: a ring of `count = 6` wells.
    check_structure(&d, 6);
    // It maps the water level: labels lie between the aquifer base (−12 m) and the level
    // before pumping (17.5 m).
    let labels = check_labels(&d, -12.0, 17.5);
    // Layout GeoJSON: one excavation, six wells at the design file's 6 L/s, one ring.
    let fc = parse_fc(&layout_gj);
    let k = kinds(&fc);
    assert_eq!(k.get("excavation"), Some(&1));
    assert_eq!(k.get("well"), Some(&6));
    assert_eq!(k.get("well-line"), Some(&1));
    // The valve house beside the shaft (layouts/deep_shaft.toml).
    assert_eq!(k.get("neighbour"), Some(&1));
    // Besides those: the check points, each with its level and margin (issue 18.4).
    let points = k.get("check-point").copied().unwrap_or(0);
    assert!(points > 0);
    assert_eq!(fc.features.len() - points, 9);
    for f in fc
        .features
        .iter()
        .filter(|f| f.property("kind").and_then(|v| v.as_str()) == Some("well"))
    {
        let q = f
            .property("rate_l_per_s")
            .and_then(|v| v.as_f64())
            .unwrap_or(f64::NAN);
        assert!((q - 6.0).abs() < 1e-9, "rate {q}");
    }
    // The shaft outline is the design file's 16-point circle of radius 7 m, closed.
    let shaft = fc
        .features
        .iter()
        .find(|f| f.property("kind").and_then(|v| v.as_str()) == Some("excavation"))
        .and_then(|f| f.geometry.as_ref())
        .map(|g| all_points(&g.value))
        .unwrap_or_default();
    assert_eq!(shaft.len(), 17);
    assert_eq!(shaft.first(), shaft.last());
    for p in &shaft {
        assert!((p[0].hypot(p[1]) - 7.0).abs() < 0.01, "{p:?}");
    }
    // Contours GeoJSON: water levels, multiples of its interval, every SVG label among them.
    let fc = parse_fc(&contours_gj);
    assert!(
        fc.features.len() >= 8 && fc.features.len() <= 15,
        "{}",
        fc.features.len()
    );
    let interval = fc
        .foreign_members
        .as_ref()
        .and_then(|m| m.get("interval_m"))
        .and_then(|v| v.as_f64())
        .unwrap_or(f64::NAN);
    let values: Vec<f64> = fc
        .features
        .iter()
        .map(|f| {
            assert_eq!(
                f.property("quantity").and_then(|v| v.as_str()),
                Some("water-level")
            );
            f.property("value_m")
                .and_then(|v| v.as_f64())
                .unwrap_or(f64::NAN)
        })
        .collect();
    for v in &values {
        assert!(is_multiple(*v, interval), "{v} vs {interval}");
    }
    for l in labels {
        assert!(
            values.iter().any(|v| (v - l).abs() < 1e-9),
            "label {l} has no contour line"
        );
    }
}

#[test]
fn riverside_map_structure_boundary_and_neighbours() {
    let (d, layout_gj, contours_gj, _) = demo("riverside_basement.toml");
    // layouts/riverside_basement.toml: a ring of `count = 16` wells.
    check_structure(&d, 16);
    // Drawdown map: labels between 0 and the most the aquifer allows (3.8 − (−11) = 14.8 m).
    check_labels(&d, 0.0, 14.8);
    // The neighbours and the river are named on the map.
    let f = &d.facts;
    let neighbours = texts_in(f, "neighbours");
    assert!(neighbours.contains(&"Terrace houses 2–8"), "{neighbours:?}");
    assert!(neighbours.contains(&"Old mill warehouse"), "{neighbours:?}");
    let boundaries = texts_in(f, "boundaries");
    assert!(
        boundaries
            .iter()
            .any(|t| t.contains("River bank") && t.contains("constant head")),
        "{boundaries:?}"
    );
    // The title block names the project and the total flow (16 wells × 5.2 L/s = 83.2 L/s).
    let title = texts_in(f, "title-block").join(" ");
    assert!(title.contains("Willow Quay flats"), "{title}");
    assert!(title.contains("Total flow: 83.2 L/s"), "{title}");
    // Layout GeoJSON, in the site's own coordinates.
    let fc = parse_fc(&layout_gj);
    let k = kinds(&fc);
    assert_eq!(k.get("excavation"), Some(&1));
    assert_eq!(k.get("well"), Some(&16));
    assert_eq!(k.get("boundary"), Some(&1));
    assert_eq!(k.get("neighbour"), Some(&2));
    assert_eq!(k.get("keep-out"), None);
    let basement = fc
        .features
        .iter()
        .find(|f| f.property("kind").and_then(|v| v.as_str()) == Some("excavation"))
        .and_then(|f| f.geometry.as_ref())
        .map(|g| all_points(&g.value))
        .unwrap_or_default();
    let outline = [
        [0.0, 0.0],
        [56.0, 0.0],
        [56.0, 22.0],
        [30.0, 22.0],
        [30.0, 44.0],
        [0.0, 44.0],
    ];
    for p in outline {
        assert!(basement.contains(&p), "{p:?} missing from {basement:?}");
    }
    let river = fc
        .features
        .iter()
        .find(|f| f.property("kind").and_then(|v| v.as_str()) == Some("boundary"))
        .and_then(|f| f.geometry.as_ref())
        .map(|g| all_points(&g.value))
        .unwrap_or_default();
    assert_eq!(river, vec![[-200.0, -45.0], [300.0, -45.0]]);
    // Contour lines stay on the aquifer side of the river bank (y = −45 m).
    let fc = parse_fc(&contours_gj);
    assert!(!fc.features.is_empty());
    for f in &fc.features {
        assert_eq!(
            f.property("quantity").and_then(|v| v.as_str()),
            Some("drawdown")
        );
        for p in f
            .geometry
            .as_ref()
            .map(|g| all_points(&g.value))
            .unwrap_or_default()
        {
            assert!(
                p[1] >= -45.0 - 1e-6,
                "contour point {p:?} past the river bank"
            );
        }
    }
}

/// One well pumping Q from a confined aquifer that stays confined: the drawdown contours are
/// circles round the well at the Thiem radius r = R·exp(−2πT·s/Q), from s = Q/(2πT)·ln(R/r)
/// (Thiem 1906; Kruseman & de Ridder 1994, §3.2.1). Projected coordinates (x ≈ 512 000 m,
/// y ≈ 6 123 000 m) check that the GeoJSON keeps the site's own coordinates.
#[test]
fn single_well_contours_are_thiem_circles() {
    let (x0, y0) = (512_300.0, 6_123_400.0);
    let (wx, wy) = (x0 + 22.0, y0 + 9.0);
    let design = format!(
        r#"
[site]
name = "Thiem check"
ground_level = "12.0 m"
grid = "projected test grid"

[aquifer]
kind = "confined"
conductivity = "1e-4 m/s"
base_level = "-20.0 m"
top_level = "0.0 m"
groundwater_level = "10.0 m"
storativity = 1e-4

[[excavation]]
name = "Pit"
outline = [[{a}, {b}], [{c}, {b}], [{c}, {d}], [{a}, {d}]]
formation_level = "9.0 m"
target_margin = "0.5 m"

[influence]
method = "fixed"
distance = "200 m"

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "0.0 m"      # the whole confined thickness: fully penetrating, so Thiem holds
screen_base = "-20.0 m"
pump_intake = "-18.0 m"
submergence = "1.0 m"

[layout]
kind = "listed"

[[well]]
name = "P1"
x = {wx}
y = {wy}
rate = "5 L/s"

[output]
map = "drawdown"
"#,
        a = x0 - 5.0,
        b = y0 - 5.0,
        c = x0 + 5.0,
        d = y0 + 5.0,
    );
    let dir = tempfile::tempdir().unwrap_or_else(|e| panic!("temp dir: {e}"));
    let path = dir.path().join("thiem.toml");
    std::fs::write(&path, design).unwrap_or_else(|e| panic!("write: {e}"));
    let model = load(&path);
    let r = run(&model);
    // R = r_e + L₀: equivalent radius of the 10 m × 10 m pit, √(100/π), plus the fixed 200 m.
    let big_r = (100.0 / PI).sqrt() + 200.0;
    assert!(
        (r.evaluation.radius_of_influence_m - big_r).abs() < 1e-6,
        "R = {} m, expected {big_r} m",
        r.evaluation.radius_of_influence_m
    );
    let q = 5e-3;
    let t = 1e-4 * 20.0;
    let grid = LevelGrid::for_run(&r.grid_source());
    let fc = parse_fc(&contours_geojson(&r, &grid));
    assert!(
        fc.features.len() >= 8,
        "{} contour values",
        fc.features.len()
    );
    let mut checked = 0;
    let mut closed = 0;
    for f in &fc.features {
        let s = f
            .property("value_m")
            .and_then(|v| v.as_f64())
            .unwrap_or(f64::NAN);
        let r_thiem = big_r * (-2.0 * PI * t * s / q).exp();
        let geometry = f.geometry.as_ref().map(|g| g.value.clone());
        let parts: Vec<Vec<[f64; 2]>> = match geometry {
            Some(GeometryValue::LineString { coordinates }) => {
                vec![coordinates
                    .iter()
                    .map(|c| [c.as_slice()[0], c.as_slice()[1]])
                    .collect()]
            }
            Some(GeometryValue::MultiLineString { coordinates }) => coordinates
                .iter()
                .map(|l| {
                    l.iter()
                        .map(|c| [c.as_slice()[0], c.as_slice()[1]])
                        .collect()
                })
                .collect(),
            other => panic!("unexpected geometry {other:?}"),
        };
        for part in parts {
            if part.first() == part.last() && part.len() > 8 {
                closed += 1;
            }
            // Linear interpolation between nodes traces ln r closely once the circle spans a
            // few cells; closer in, the curvature of ln r allows up to half a step.
            let tolerance = if r_thiem > 3.0 * grid.step { 0.1 } else { 0.5 } * grid.step;
            for p in part {
                let dist = (p[0] - wx).hypot(p[1] - wy);
                assert!(
                    (dist - r_thiem).abs() <= tolerance,
                    "s = {s} m: point {p:?} is {dist:.3} m from the well, Thiem says {r_thiem:.3} m (tolerance {tolerance:.3} m)"
                );
                checked += 1;
            }
        }
    }
    assert!(closed >= 3, "only {closed} closed circles");
    assert!(checked > 200, "only {checked} contour points checked");
    // And the map of it draws one well.
    let facts = parse_svg(&map_svg(&r, &grid, "2025-01-31"));
    assert_eq!(well_symbols(&facts), 1);
}

/// Neighbours coloured by status: each status given appears in the legend in words, and a
/// status list of the wrong length falls back to the plain legend entry.
#[test]
fn neighbour_statuses_reach_the_legend() {
    use drydig::report::map::options::{MapOptions, NeighbourStatus};
    use drydig::report::map::render::map_svg_with;
    let model = load(&layout("riverside_basement.toml"));
    let r = run(&model);
    let grid = LevelGrid::for_run(&r.grid_source());
    // layouts/riverside_basement.toml has two neighbours.
    let opts = MapOptions {
        neighbour_status: Some(vec![
            NeighbourStatus::OverLimit,
            NeighbourStatus::WithinLimits,
        ]),
        command: None,
        verdict: None,
    };
    let facts = parse_svg(&map_svg_with(&r, &grid, "2025-01-31", &opts));
    let legend = texts_in(&facts, "legend");
    assert!(legend.contains(&"neighbour over a limit"), "{legend:?}");
    assert!(
        legend.contains(&"neighbour within its limits"),
        "{legend:?}"
    );
    assert!(!legend.contains(&"neighbour near a limit"), "{legend:?}");
    let wrong = MapOptions {
        neighbour_status: Some(vec![NeighbourStatus::OverLimit]),
        command: None,
        verdict: None,
    };
    let facts = parse_svg(&map_svg_with(&r, &grid, "2025-01-31", &wrong));
    let legend = texts_in(&facts, "legend");
    assert!(legend.contains(&"neighbouring building"), "{legend:?}");
    assert!(!legend.contains(&"neighbour over a limit"), "{legend:?}");
}

/// The pipeline trench (hundreds of wellpoints in a thin strip) gets a larger-scale detail
/// that shows individual wellpoints: neighbouring symbols stand clear of each other there.
#[test]
fn trench_map_has_a_readable_detail() {
    let model = load(&layout("pipeline_trench.toml"));
    let r = run(&model);
    let grid = LevelGrid::for_run(&r.grid_source());
    let doc = map_svg(&r, &grid, "2025-01-31");
    let facts = parse_svg(&doc);
    assert!(
        facts.group_ids.iter().any(|g| g == "detail"),
        "no detail plan"
    );
    assert!(facts.group_ids.iter().any(|g| g == "detail-wells"));
    // Every well is drawn once on the main plan.
    assert_eq!(well_symbols(&facts), r.placement.wells.len());
    // layouts/pipeline_trench.toml: wellpoints every 1.5 m; in the detail their symbols
    // (circles) must stand at least 10 px apart, centre to centre.
    let mut centres: Vec<[f64; 2]> = Vec::new();
    let parser = svg::read(&doc).unwrap_or_else(|e| panic!("{e}"));
    let mut stack: Vec<String> = Vec::new();
    for event in parser {
        if let Event::Tag(name, kind, attrs) = event {
            use svg::node::element::tag::Type;
            match (name, kind) {
                ("g", Type::Start) => {
                    stack.push(attrs.get("id").map(|v| v.to_string()).unwrap_or_default())
                }
                ("g", Type::End) => {
                    stack.pop();
                }
                ("circle", _) if stack.iter().any(|s| s == "detail-wells") => {
                    let get = |k: &str| {
                        attrs
                            .get(k)
                            .and_then(|v| v.to_string().parse::<f64>().ok())
                            .unwrap_or(f64::NAN)
                    };
                    if attrs.get("fill").map(|v| v.to_string()).as_deref() == Some("#ffffff") {
                        centres.push([get("cx"), get("cy")]);
                    }
                }
                _ => {}
            }
        }
    }
    assert!(
        centres.len() >= 20,
        "{} wellpoints in the detail",
        centres.len()
    );
    for (i, a) in centres.iter().enumerate() {
        for b in &centres[i + 1..] {
            let d = (a[0] - b[0]).hypot(a[1] - b[1]);
            assert!(d >= 10.0, "symbols {a:?} and {b:?} only {d:.1} px apart");
        }
    }
}
