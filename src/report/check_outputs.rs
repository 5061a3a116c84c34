//! Every file `check` writes (and `design` with it), rendered in memory from the findings.

use super::{dxf_out, format, html, map, neighbours, section_svg, tables};
use crate::findings::check::CheckFindings;

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
