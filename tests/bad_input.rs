//! Malformed design files are refused, not computed on.
//!
//! Every file in `tests/bad_inputs/` is a small variation of a valid design file with one thing
//! wrong (its first line says what). `drydig estimate` must exit with code 2 (bad input), print
//! nothing on stdout, and say on stderr which file, which field (and line, where the problem has
//! a place in the file) and what would be valid. The table below is the expectation for each
//! file; a file in the folder without a row here (or a row without its file) fails the test, so
//! the corpus and the table cannot drift apart.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

/// The smallest corpus the suite accepts, so it cannot silently shrink.
const MIN_CORPUS: usize = 100;

/// Where the field shows in the message.
#[derive(Clone, Copy, Debug)]
enum Field {
    /// In the field slot of `file:line: field: message`.
    Slot(&'static str),
    /// Named in the message text (a missing field is reported against its table).
    Named(&'static str),
    /// The whole file is at fault (empty, binary, not TOML): no field to name.
    WholeFile,
}
use Field::{Named, Slot, WholeFile};

struct Case {
    /// File name in `tests/bad_inputs/`.
    file: &'static str,
    /// The field the message must name.
    field: Field,
    /// A fragment of what would be valid (or of the fix) the message must contain.
    valid: &'static str,
    /// Text of the one line the problem stands on: the message must carry that line's number.
    line_at: Option<&'static str>,
}

const fn case(
    file: &'static str,
    field: Field,
    valid: &'static str,
    line_at: Option<&'static str>,
) -> Case {
    Case {
        file,
        field,
        valid,
        line_at,
    }
}

#[rustfmt::skip]
const CASES: &[Case] = &[
    // Units.
    case("missing_unit.toml", Slot("conductivity"), "m/s", Some("conductivity = \"2e-4\"")),
    case("bare_number_unit.toml", Slot("conductivity"), "\"2e-4 m/s\"", Some("conductivity = 2e-4")),
    case("wrong_unit_kind.toml", Slot("conductivity"), "units: m/s, cm/s", Some("conductivity = \"3 L/s\"")),
    case("unknown_unit.toml", Slot("conductivity"), "did you mean \"m/s\"?", Some("conductivity = \"2e-4 m/sec\"")),
    case("misspelt_length_unit.toml", Slot("ground_level"), "did you mean \"m\"?", Some("ground_level = ")),
    case("decimal_comma.toml", Slot("ground_level"), "\"10.5 m\"", Some("ground_level = ")),
    // Aquifer.
    case("negative_conductivity.toml", Slot("aquifer.conductivity"), "1e-9 … 1 m/s", Some("conductivity = ")),
    case("zero_conductivity.toml", Slot("aquifer.conductivity"), "1e-9 … 1 m/s", Some("conductivity = ")),
    case("groundwater_below_base.toml", Slot("aquifer.groundwater_level"), "must be above the aquifer base", Some("groundwater_level = ")),
    case("water_table_above_ground.toml", Slot("aquifer.groundwater_level"), "use kind = \"confined\"", Some("groundwater_level = ")),
    case("unconfined_with_top.toml", Slot("aquifer.top_level"), "set kind = \"confined\"", Some("top_level = ")),
    case("confined_without_top.toml", Slot("aquifer.top_level"), "needs top_level", None),
    case("leaky_without_leakage.toml", Slot("aquifer"), "leakage_factor (e.g. \"800 m\")", None),
    case("unknown_aquifer_kind.toml", Slot("aquifer.kind"), "valid: \"unconfined\", \"confined\", \"leaky\"", None),
    case("specific_yield_out_of_range.toml", Slot("aquifer.specific_yield"), "0.05 … 0.3", None),
    case("missing_aquifer.toml", Slot("aquifer"), "drydig new FILE", None),
    case("string_instead_of_table.toml", Slot("aquifer"), "[aquifer] section", Some("aquifer = \"sand and gravel\"")),
    // Excavation.
    case("formation_above_ground.toml", Slot("excavation[1].formation_level"), "must be below ground level", Some("formation_level = ")),
    case("target_below_aquifer_base.toml", Slot("excavation[1].target_margin"), "below the aquifer base (-6 m)", Some("target_margin = ")),
    case("negative_margin.toml", Slot("excavation[1].target_margin"), "0 … 5 m", Some("target_margin = ")),
    case("duplicate_excavation_names.toml", Slot("excavation[2].name"), "needs its own name", Some("[[50, 0]")),
    case("missing_outline.toml", Named("missing field `outline`"), "drydig new FILE", Some("[[excavation]]")),
    case("name_is_a_number.toml", Slot("name"), "expected a string", Some("name = 7")),
    // Outlines and points.
    case("outline_two_points.toml", Slot("excavation[1].outline"), "at least 3 distinct points", Some("outline = ")),
    case("outline_self_intersecting.toml", Slot("excavation[1].outline"), "crosses itself", Some("outline = ")),
    case("outline_collinear.toml", Slot("excavation[1].outline"), "lie on one straight line", Some("outline = ")),
    case("outline_figure_of_eight.toml", Slot("excavation[1].outline"), "crosses itself (edges 1 and 3 cross)", Some("outline = ")),
    case("excavation_single_brackets.toml", Slot("excavation"), "write [[excavation]] (double brackets)", Some("[excavation]")),
    case("centre_line_one_point.toml", Slot("excavation[1].centre_line"), "at least 2 points", Some("centre_line = ")),
    case("outline_nan_point.toml", Slot("excavation[1].outline"), "two finite numbers in metres", Some("outline = ")),
    case("point_with_three_numbers.toml", Slot("excavation[1].outline"), "must be [x, y]", Some("outline = ")),
    case("lonlat_coordinates.toml", Slot("excavation[1].outline"), "projected system", Some("outline = ")),
    case("check_point_nan.toml", Slot("checks.point[1].x"), "finite numbers in metres", None),
    // Influence.
    case("cooper_jacob_without_time.toml", Slot("influence.pumping_time"), "\"14 days\"", None),
    case("fixed_without_distance.toml", Slot("influence.distance"), "\"150 m\"", None),
    case("unknown_influence_method.toml", Slot("influence.method"), "valid: \"sichardt\"", None),
    // Allowances, wells, layout.
    case("contingency_out_of_range.toml", Slot("allowances.contingency"), "0.5 = 50 %", Some("contingency = ")),
    case("capacity_fraction_out_of_range.toml", Slot("allowances.capacity_fraction"), "0.8 = 80 %", Some("capacity_fraction = ")),
    case("relieve_without_uplift.toml", Slot("excavation[1].control"), "needs an [uplift] section", None),
    case("well_radius_too_big.toml", Slot("wells.radius"), "0.025 … 0.5 m", Some("radius = ")),
    case("screen_base_above_top.toml", Slot("wells.screen_base"), "below the screen top", Some("screen_base = ")),
    case("screen_top_above_ground.toml", Slot("wells.screen_top"), "at or below ground", Some("screen_top = ")),
    case("standby_negative.toml", Slot("standby"), "a whole number, 0 or more", Some("standby = -1")),
    case("layout_unknown_kind.toml", Slot("layout.kind"), "valid: \"ring\", \"line\", \"listed\", \"csv\"", None),
    case("layout_unknown_excavation.toml", Slot("layout.excavation"), "valid: \"Pit A\"", None),
    case("ring_too_few_wells.toml", Slot("layout.count"), "at least 3 wells", None),
    // Boundaries, neighbours, checks, uplift, output.
    case("boundary_crossing_excavation.toml", Slot("boundary[1].line"), "wholly to one side", Some("line = [[15, -100]")),
    case("boundaries_oblique.toml", Slot("boundary"), "180°/n", None),
    case("well_across_boundary.toml", Slot("well"), "beyond boundary \"River\"", None),
    case("well_in_constant_head_line.toml", Slot("well"), "at least a well radius inland", None),
    case("check_point_across_boundary.toml", Slot("checks.point[1]"), "move it to the aquifer side", None),
    case("neighbour_across_boundary.toml", Slot("neighbour[1].footprint"), "10.00 m beyond boundary", None),
    case("boundary_one_point.toml", Slot("boundary[1].line"), "two distinct points", Some("line = [[-50, -100]]")),
    case("wall_one_point.toml", Slot("wall[1].line"), "at least 2 points", Some("line = [[-10, 40]]")),
    case("wall_sealing_the_dig.toml", Slot("wall[1]"), "toe_level above the base", None),
    case("duplicate_neighbour_names.toml", Slot("neighbour[2].name"), "needs its own name", Some("[[40, 0]")),
    case("negative_distortion.toml", Slot("neighbour[1].allowable_distortion"), "\"1/500\"", Some("allowable_distortion = ")),
    case("neighbour_layer_two_compressibilities.toml", Slot("neighbour[1].layer[1]"), "give exactly one of", None),
    case("neighbour_ocr_without_cr.toml", Slot("neighbour[1].layer[1]"), "needs c_r", None),
    case("neighbour_drainage_sideways.toml", Slot("neighbour[1].layer[1].drainage"), "valid: \"both\" (default), \"top\" or \"bottom\"", None),
    case("grid_spacing_in_mm.toml", Slot("checks.grid_spacing"), "usual 1 … 5 m", Some("grid_spacing = ")),
    case("uplift_layer_above_formation.toml", Slot("uplift.layer_top"), "below the formation level", Some("layer_top = ")),
    case("unknown_output_units.toml", Slot("units"), "`si` or `us`", Some("units = \"imperial\"")),
    case("empty_site_name.toml", Slot("site.name"), "must not be empty", None),
    // Field names and file structure.
    case("unknown_field.toml", Slot("condutivity"), "did you mean `conductivity`?", Some("condutivity = ")),
    case("unknown_section.toml", Slot("drainage"), "valid fields here: site, aquifer", Some("[drainage]")),
    case("duplicate_key.toml", Slot("conductivity"), "give each field once", Some("conductivity = \"3e-4 m/s\"")),
    case("empty.toml", WholeFile, "[site], [aquifer], one [[excavation]] and [influence]", None),
    case("not_toml.toml", WholeFile, "`key = value` lines under [section] headers", Some("This is the pit")),
    case("binary_junk.bin", WholeFile, "a design file is TOML text", None),
    // Robustness (issue 9): written by scripts/gen_robustness_corpus.py.
    case("level_in_km_overflows.toml", Slot("ground_level"), "beyond the largest length", Some("ground_level = ")),
    case("conductivity_overflows_in_cm_per_s.toml", Slot("conductivity"), "beyond the largest hydraulic conductivity", Some("conductivity = ")),
    case("conductivity_below_any_soil.toml", Slot("conductivity"), "below the smallest non-zero hydraulic conductivity", Some("conductivity = ")),
    case("rate_overflows_in_m3_per_h.toml", Slot("rate"), "beyond the largest flow rate", Some("rate = \"1e300")),
    case("pumping_time_overflows_in_weeks.toml", Slot("pumping_time"), "beyond the largest duration", Some("pumping_time = ")),
    case("compressibility_absurd.toml", Slot("m_v"), "beyond the largest coefficient of volume compressibility", Some("m_v = ")),
    case("layer_thickness_1e300_m.toml", Slot("thickness"), "beyond the largest length", Some("thickness = ")),
    case("well_radius_a_nanometre.toml", Slot("radius"), "below the smallest non-zero length", Some("radius = ")),
    case("soil_weight_overflows.toml", Slot("soil_unit_weight"), "beyond the largest unit weight", Some("soil_unit_weight = ")),
    case("groundwater_level_50_km.toml", Slot("aquifer.groundwater_level"), "of the datum", Some("groundwater_level = ")),
    case("formation_level_minus_20_km.toml", Slot("excavation[1].formation_level"), "of the datum", Some("formation_level = ")),
    case("piezometric_level_far.toml", Slot("uplift.piezometric_level"), "of the datum", Some("piezometric_level = ")),
    case("sichardt_c_1e300.toml", Slot("influence.sichardt_c"), "outside what a site can have", None),
    case("storativity_infinite.toml", Slot("aquifer.storativity"), "outside what a site can have", None),
    case("trench_aspect_1e300.toml", Slot("allowances.trench_aspect_ratio"), "outside what a site can have", None),
    case("compression_index_1e300.toml", Slot("neighbour[1].layer[1].c_c"), "outside what a site can have", None),
    case("distance_of_influence_collapses.toml", Slot("influence"), "distance of influence", None),
    case("fixed_distance_a_millimetre.toml", Slot("influence"), "distance of influence", None),
    case("leakage_factor_near_zero.toml", Slot("aquifer.leakage_factor"), "below 0.1 m", None),
    case("aquitard_resistance_a_millisecond.toml", Slot("aquifer.leakage_factor"), "below 0.1 m", None),
    case("cooper_jacob_instant.toml", Slot("influence"), "distance of influence", None),
    case("ring_of_a_billion_wells.toml", Slot("layout.count"), "give a smaller count", None),
    case("standby_a_hundred_million.toml", Slot("wells.standby"), "usual 1 … 3", None),
    case("grid_of_a_kilometre_pit_at_0_1_m.toml", Slot("checks.grid_spacing"), "give a larger checks.grid_spacing", None),
    case("neighbour_with_300_layers.toml", Slot("neighbour[1].layer"), "give fewer soil layers", None),
    case("outline_at_1e300.toml", Slot("excavation[1].outline"), "beyond ±1e7 m", Some("outline = ")),
    case("outline_at_1e154.toml", Slot("excavation[1].outline"), "projected coordinates", Some("outline = ")),
    case("listed_well_at_1e154.toml", Slot("well[1].x"), "beyond ±1e7 m", None),
    case("named_point_at_1e300.toml", Slot("checks.point[1].x"), "beyond ±1e7 m", None),
    case("boundary_points_at_1e300.toml", Slot("boundary[1].line"), "beyond ±1e7 m", Some("line = [[-1e300")),
    case("footprint_far_away.toml", Slot("neighbour[1].footprint"), "beyond ±1e7 m", Some("footprint = ")),
    case("keep_out_far_away.toml", Slot("keep_out[1].outline"), "beyond ±1e7 m", Some("outline = [[1e9")),
    case("centre_line_far_away.toml", Slot("layout.centre_line"), "beyond ±1e7 m", Some("centre_line = ")),
    case("site_name_with_escape_codes.toml", Slot("site.name"), "control character", None),
    case("excavation_name_with_newline.toml", Slot("excavation[1].name"), "control character", None),
    case("well_name_with_tab.toml", Slot("well[1].name"), "control character", None),
    case("neighbour_name_with_bell.toml", Slot("neighbour[1].name"), "control character", None),
    case("layer_name_with_carriage_return.toml", Slot("neighbour[1].layer[1].name"), "control character", None),
    case("boundary_name_with_delete.toml", Slot("boundary[1].name"), "control character", None),
    case("point_name_with_nul.toml", Slot("checks.point[1].name"), "control character", None),
    case("keep_out_name_with_escape.toml", Slot("keep_out[1].name"), "control character", None),
    case("datum_with_form_feed.toml", Slot("site.datum"), "control character", None),
    case("site_name_is_nan.toml", Slot("site.name"), "choose another name", None),
    case("site_name_too_long.toml", Slot("site.name"), "shorten it", None),
    // Site CRS (issue 18.3, 19.6).
    case("crs_in_us_survey_feet.toml", Slot("site.crs"), "+units=m", None),
    case("crs_web_mercator_at_52_north.toml", Slot("site.crs"), "point scale factor is 1.624", None),
    case("crs_scale_factor_zero.toml", Slot("site.crs"), "scale factor at the origin between 0.5 and 2", None),
    case("crs_scale_factor_negative.toml", Slot("site.crs"), "scale factor at the origin between 0.5 and 2", None),
    case("crs_latitude_of_origin_95.toml", Slot("site.crs"), "a latitude within ±90°", None),
    case("crs_absurd_datum_shift.toml", Slot("site.crs"), "not a datum shift a real datum has", None),
    case("crs_gda2020_not_built_in.toml", Slot("site.crs"), "+proj=utm +zone=55 +south", None),
    case("crs_geographic.toml", Slot("site.crs"), "projected or local grid", None),
    // Programme (issue 19.2, 19.8).
    case("programme_map_times_same_file.toml", Slot("programme.map_times[2]"), "at least 0.1 day apart", None),
    case("programme_point_at_1e300.toml", Slot("programme.point[1].x"), "within ±1e7 m", None),
    case("programme_stage_named_nan.toml", Slot("programme.stage[1].name"), "choose another name", None),
    case("programme_point_name_with_escape.toml", Slot("programme.point[1].name"), "control character", None),
    // Layered ground (issue 21).
    case("layer_listed_bottom_up.toml", Slot("layer[0].base_level"), "list layers from the top down", None),
    case("layer_aquitard_at_the_bottom.toml", Slot("layer"), "no aquifer", None),
];

fn corpus_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad_inputs")
}

fn corpus_files() -> Vec<PathBuf> {
    let mut files: Vec<PathBuf> = std::fs::read_dir(corpus_dir())
        .expect("tests/bad_inputs/ exists")
        .map(|e| e.expect("readable entry").path())
        .filter(|p| p.is_file())
        .collect();
    files.sort();
    files
}

fn estimate(file: &Path) -> Output {
    Command::new(env!("CARGO_BIN_EXE_drydig"))
        .arg("estimate")
        .arg(file)
        .output()
        .expect("drydig runs")
}

/// 1-based number of the one line of `text` that contains `needle`.
fn line_containing(text: &str, needle: &str) -> Result<usize, String> {
    let hits: Vec<usize> = text
        .lines()
        .enumerate()
        .filter(|(_, l)| l.contains(needle))
        .map(|(i, _)| i + 1)
        .collect();
    match hits.as_slice() {
        [n] => Ok(*n),
        _ => Err(format!(
            "needle {needle:?} is on lines {hits:?}, not on exactly one"
        )),
    }
}

/// Everything wrong with how drydig answered one corpus file (empty when all is well).
fn problems(case: &Case, path: &Path) -> Vec<String> {
    let mut out = Vec::new();
    let bytes = std::fs::read(path).expect("corpus file readable");
    if !bytes.starts_with(b"# ") {
        out.push("does not start with a comment line saying what is wrong".into());
    }
    let run = estimate(path);
    let stderr = String::from_utf8_lossy(&run.stderr);
    let shown = path.display().to_string();
    if run.status.code() != Some(2) {
        out.push(format!("exit code {:?}, expected 2", run.status.code()));
    }
    if !run.stdout.is_empty() {
        out.push(format!(
            "stdout not empty: {:?}",
            String::from_utf8_lossy(&run.stdout)
        ));
    }
    if stderr.contains("panicked") {
        out.push("panicked".into());
    }
    if !stderr.contains(&shown) {
        out.push("stderr does not name the file".into());
    }
    // What follows the file name (and line): the field and the message.
    let after_file = stderr.split_once(&shown).map_or("", |(_, rest)| rest);
    match case.field {
        Slot(f) => {
            if !after_file.contains(&format!(": {f}: ")) {
                out.push(format!("field `{f}` not in the field slot"));
            }
        }
        Named(f) => {
            if !after_file.contains(f) {
                out.push(format!("field text {f:?} not named"));
            }
        }
        WholeFile => {}
    }
    if !after_file.contains(case.valid) {
        out.push(format!("no hint of what is valid ({:?})", case.valid));
    }
    if let Some(needle) = case.line_at {
        match line_containing(&String::from_utf8_lossy(&bytes), needle) {
            Ok(n) => {
                if !stderr.contains(&format!("{shown}:{n}:")) {
                    out.push(format!("line {n} (where {needle:?} stands) not given"));
                }
            }
            Err(e) => out.push(e),
        }
    }
    if !out.is_empty() {
        out.push(format!("stderr was: {stderr}"));
    }
    out
}

#[test]
fn every_malformed_file_is_refused_with_exit_2_and_a_helpful_message() {
    let files = corpus_files();
    let mut failures = Vec::new();
    for path in &files {
        let name = path.file_name().unwrap().to_string_lossy().to_string();
        let Some(case) = CASES.iter().find(|c| c.file == name) else {
            failures.push(format!(
                "{name}: no row in CASES; add its expected field and hint"
            ));
            continue;
        };
        for p in problems(case, path) {
            failures.push(format!("{name}: {p}"));
        }
    }
    for c in CASES {
        if !corpus_dir().join(c.file).is_file() {
            failures.push(format!("{}: row in CASES but no such file", c.file));
        }
        // Unit and outline problems have a place in the file: their rows must ask for the line.
        let placed = (c.file.contains("unit") && !c.file.contains("output_units"))
            || c.file.contains("outline")
            || c.file.contains("point_with")
            || c.file.contains("lonlat");
        if placed && c.line_at.is_none() {
            failures.push(format!(
                "{}: a unit or outline case must expect a line",
                c.file
            ));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n"));
}

#[test]
fn corpus_cannot_silently_shrink() {
    let n = corpus_files().len();
    assert!(
        n >= MIN_CORPUS,
        "tests/bad_inputs/ holds {n} files, fewer than {MIN_CORPUS}"
    );
    assert!(CASES.len() >= MIN_CORPUS);
}

#[test]
fn a_missing_file_a_folder_and_a_zero_byte_file_are_bad_input() {
    let dir = tempfile::tempdir().expect("temp dir");
    let missing = dir.path().join("no_such_design.toml");
    let zero = dir.path().join("zero_bytes.toml");
    std::fs::write(&zero, b"").expect("write");
    for (path, hint) in [
        (missing.as_path(), "cannot read"),
        (dir.path(), "not a regular file"),
        (zero.as_path(), "empty"),
    ] {
        let run = estimate(path);
        let stderr = String::from_utf8_lossy(&run.stderr);
        assert_eq!(run.status.code(), Some(2), "{}: {stderr}", path.display());
        assert!(run.stdout.is_empty());
        assert!(stderr.contains(&path.display().to_string()), "{stderr}");
        assert!(stderr.contains(hint), "{stderr}");
        assert!(!stderr.contains("panicked"), "{stderr}");
    }
}

/// A self-crossing outline read from a GeoJSON drawing (a bow-tie, whose two lobes cancel to no
/// area, and a figure of eight) is reported as crossing itself, not as "all vertices on one
/// line".
#[test]
fn a_self_crossing_drawn_outline_is_called_self_crossing() {
    let base = std::fs::read_to_string(corpus_dir().join("outline_collinear.toml")).unwrap();
    for (what, ring) in [
        (
            "bow-tie",
            "[[1000,0],[1040,30],[1040,0],[1000,30],[1000,0]]",
        ),
        (
            "figure of eight",
            "[[1000,0],[1040,30],[1040,0],[1000,20],[1000,0]]",
        ),
    ] {
        let d = tempfile::tempdir().unwrap();
        let gj = d.path().join("site.geojson");
        std::fs::write(
            &gj,
            format!(
                r#"{{"type":"FeatureCollection","features":[{{"type":"Feature","properties":{{"kind":"excavation"}},"geometry":{{"type":"Polygon","coordinates":[{ring}]}}}}]}}"#
            ),
        )
        .unwrap();
        let text = base.replace(
            "outline = [[0, 0], [10, 0], [20, 0], [30, 0]]",
            &format!(
                "outline_from = {{ file = \"{}\", property = \"kind\", value = \"excavation\" }}",
                gj.display()
            ),
        );
        let f = d.path().join("design.toml");
        std::fs::write(&f, text).unwrap();
        let out = estimate(&f);
        let err = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{what}: {err}");
        assert!(err.contains("crosses itself"), "{what}: {err}");
        assert!(!err.contains("one line"), "{what}: {err}");
    }
}
