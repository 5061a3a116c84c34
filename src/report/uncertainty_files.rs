//! The set of files `drydig uncertainty` writes (the text, tables, charts and report.html
//! assembled in one place).

use super::uncertainty_text::{to_csv, to_json};
use crate::findings::uncertainty::UncertaintyFindings;
use crate::input::model::Model;

/// Every file `drydig uncertainty` writes: uncertainty.csv, uncertainty.json, one chart per
/// output, the tornado, and report.html.
pub fn files(model: &Model, found: &UncertaintyFindings) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    let run = &found.run;
    let charts =
        super::uncertainty_chart::charts(&model.name, &run.series, &run.tornado, model.units);
    let mut files = vec![
        ("uncertainty.csv".to_string(), to_csv(model, run)?),
        (
            "uncertainty.json".to_string(),
            format!(
                "{}\n",
                serde_json::to_string_pretty(&to_json(model, found))?
            )
            .into_bytes(),
        ),
    ];
    let date = super::map::date::today();
    let html = super::html::uncertainty::report(model, found, &charts, &date);
    files.extend(charts.into_iter().map(|(n, s)| (n, s.into_bytes())));
    files.push(("report.html".to_string(), html.into_bytes()));
    Ok(files)
}
