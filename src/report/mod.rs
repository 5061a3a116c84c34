//! Formatting results for people and programs: one file per output format.

pub mod as_built_text;
pub mod bid_out;
pub mod by_day_text;
pub mod check_text;
pub mod design_text;
pub mod dxf_out;
pub mod estimate_table;
pub mod estimate_text;
pub mod files;
pub mod format;
pub mod geojson_out;
pub mod geojson_wgs84;
pub mod html;
pub mod map;
pub mod neighbours;
pub mod plot_kit;
pub mod problems;
pub mod programme_charts;
pub mod programme_map;
pub mod programme_text;
pub mod pumping_test_chart;
pub mod pumping_test_text;
pub mod section_svg;
pub mod sweep_chart;
pub mod table;
pub mod tables;
pub mod uncertainty_chart;
pub mod uncertainty_files;
pub mod uncertainty_text;
pub mod verdict;

use crate::findings::check::CheckFindings;

/// The caution carried by every output (defined once in [`crate::caution`]).
pub use crate::caution::CAUTION;

/// Wrap text to `width` columns, each line starting with `indent`.
pub fn wrap(text: &str, width: usize, indent: &str) -> String {
    let mut out = String::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        if !line.is_empty() && indent.len() + line.len() + 1 + word.len() > width {
            out.push_str(indent);
            out.push_str(&line);
            out.push('\n');
            line.clear();
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    if !line.is_empty() {
        out.push_str(indent);
        out.push_str(&line);
        out.push('\n');
    }
    out
}

/// A number with thousands separators and `decimals` decimals ("12 345.6").
pub fn thousands(value: f64, decimals: usize) -> String {
    let s = format!("{:.*}", decimals, value.abs());
    let (int, frac) = s.split_once('.').map_or((s.as_str(), ""), |(a, b)| (a, b));
    let mut grouped = String::new();
    for (i, ch) in int.chars().enumerate() {
        if i > 0 && (int.len() - i) % 3 == 0 {
            grouped.push('\u{2009}');
        }
        grouped.push(ch);
    }
    let sign = if value < 0.0 && s.chars().any(|c| c != '0' && c != '.') {
        "-"
    } else {
        ""
    };
    if frac.is_empty() {
        format!("{sign}{grouped}")
    } else {
        format!("{sign}{grouped}.{frac}")
    }
}

/// Every file `check` writes, rendered in memory from its findings: (name, bytes).
pub fn check_files(found: &CheckFindings) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    check_files_for(found, None)
}

/// Every file `check` writes, with `report.html` titled and filled for `design` when a design
/// is given (its bid priced in the findings when the run has prices).
pub fn check_files_for(
    found: &CheckFindings,
    design: Option<&crate::optimise::outcome::Design>,
) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    let run = &found.run;
    let command = if design.is_some() { "design" } else { "check" };
    let mut files: Vec<(String, Vec<u8>)> = vec![
        (
            "summary.json".into(),
            serde_json::to_vec_pretty(&tables::summary_json(found))?,
        ),
        ("wells.csv".into(), tables::wells_csv(run)?),
        ("checkpoints.csv".into(), tables::checkpoints_csv(run)?),
    ]
    .into_iter()
    .chain(neighbours::files::files(found)?)
    .chain(map::render::files(found, command))
    .collect();
    let f = format::Fmt::new(run.model.units, run.model.ground_level);
    files.push((
        "design.dxf".into(),
        dxf_out::design_dxf(run, &found.grid, &found.section)?,
    ));
    let title = format!("Section — {}", run.model.name);
    let section_svg = section_svg::render(run.model, &found.section, &f, &title);
    let map_svg = files
        .iter()
        .find(|(n, _)| n == "map.svg")
        .map(|(_, b)| String::from_utf8_lossy(b).into_owned())
        .unwrap_or_default();
    let cx = html::context::Context {
        run,
        found,
        design,
        command,
        f,
        map_svg,
        section_svg: section_svg.clone(),
        date: map::date::today(),
    };
    files.push(("section.svg".into(), section_svg.into_bytes()));
    files.push(("report.html".into(), html::build::report(&cx).into_bytes()));
    Ok(files)
}
